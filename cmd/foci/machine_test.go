package main

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// result is what one command line did.
type result struct {
	code           int
	stdout, stderr string
}

// runFoci runs one command line with buffers for its streams.
func runFoci(t *testing.T, args ...string) result {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}, args)
	return result{code, out.String(), errb.String()}
}

// runToFile runs the command with -o FILE in a fresh directory and returns
// the program written there.
func runToFile(t *testing.T, args ...string) ([]byte, result) {
	t.Helper()
	file := filepath.Join(t.TempDir(), "out.gcode")
	r := runFoci(t, append(args, "-o", file)...)
	if r.code != 0 {
		t.Fatalf("foci %s: exit %d, stderr %q", strings.Join(args, " "), r.code, r.stderr)
	}
	if r.stdout != "" {
		t.Errorf("foci %s -o FILE printed %q to stdout", strings.Join(args, " "), r.stdout)
	}
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	return src, r
}

// checkProgram reads src back with the conformance reader, applies the
// rules and fails the test for every violation. It returns the report.
func checkProgram(t *testing.T, name string, src []byte, rules conformance.Rules) conformance.Report {
	t.Helper()
	p, err := conformance.Read(src, conformance.ReadOptions{})
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	rep := conformance.CheckReport(p, rules)
	for _, v := range rep.Violations {
		t.Errorf("%s: %v", name, v)
	}
	if t.Failed() {
		t.Logf("%s: program:\n%s", name, firstLines(src, 40))
	}
	return rep
}

// firstLines returns the first n lines of a program, for failure logs.
func firstLines(src []byte, n int) string {
	lines := strings.SplitAfter(string(src), "\n")
	if len(lines) > n {
		lines = append(lines[:n], "...\n")
	}
	return strings.Join(lines, "")
}

// curveOf builds the intended curve of a test case.
func curveOf(t *testing.T, w, h, cx, cy, rotDeg, offset float64) ellipse.Parallel {
	t.Helper()
	el, err := ellipse.FromSize(w, h, ellipse.Point{X: cx, Y: cy}, rotDeg*3.141592653589793/180)
	if err != nil {
		t.Fatal(err)
	}
	c, err := el.Parallel(offset)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// refusal is a command line that must be refused with exit 2 and a
// message naming flag.
type refusal struct {
	args []string
	flag string
}

// testRefusals runs every refusal twice: once writing to a new file, which
// must not appear, and once over an existing file, which must be left as
// it was. Nothing may reach stdout.
func testRefusals(t *testing.T, cases []refusal) {
	t.Helper()
	for _, c := range cases {
		name := strings.Join(c.args, " ")
		dir := t.TempDir()
		fresh := filepath.Join(dir, "new.gcode")
		r := runFoci(t, append(c.args, "-o", fresh)...)
		if r.code != 2 {
			t.Errorf("foci %s: exit %d, want 2 (stderr %q)", name, r.code, r.stderr)
		}
		if !strings.Contains(r.stderr, "-"+c.flag+":") {
			t.Errorf("foci %s: message %q does not name -%s", name, r.stderr, c.flag)
		}
		if _, err := os.Stat(fresh); err == nil {
			t.Errorf("foci %s: wrote %s despite the error", name, fresh)
		}
		old := filepath.Join(dir, "old.gcode")
		const before = "(an earlier program)\nM2\n"
		if err := os.WriteFile(old, []byte(before), 0o644); err != nil {
			t.Fatal(err)
		}
		r = runFoci(t, append(c.args, "-o", old)...)
		if got, _ := os.ReadFile(old); string(got) != before || r.code != 2 {
			t.Errorf("foci %s -o existing: exit %d, file now %q", name, r.code, got)
		}
		if entries, _ := os.ReadDir(dir); len(entries) != 1 {
			t.Errorf("foci %s: left %d files behind in the output directory, want only the old one", name, len(entries))
		}
		if r.stdout != "" {
			t.Errorf("foci %s: printed %q to stdout", name, r.stdout)
		}
	}
}

// headerDecimals returns N from the header line "coordinates to N
// decimals", or -1.
func headerDecimals(src []byte) int {
	_, rest, ok := strings.Cut(string(src), "coordinates to ")
	if !ok {
		return -1
	}
	n := 0
	for _, c := range rest {
		if c < '0' || c > '9' {
			break
		}
		n = 10*n + int(c-'0')
	}
	return n
}

func TestProgramDecimalsCoverTheToleranceAndTheWriterMinimum(t *testing.T) {
	for _, c := range []struct {
		tol   float64
		units Units
		want  int
	}{
		// 10^-d·√2 ≤ tol/100 (toolpath.DecimalsFor), at least 4 for mm
		// and 5 for inch (arc radii within the limit by rounding alone),
		// at most 8 (gcodeout.MaxDecimals).
		{0.05, unitsMM, 4},
		{0.5, unitsMM, 4},
		{0.0051, unitsMM, 5},
		{0.001, unitsMM, 6},
		{0.002, unitsInch, 5},
		{0.02, unitsInch, 5},
		{0.0001, unitsInch, 7},
		{1e-9, unitsMM, 8},
	} {
		if got := programDecimals(c.tol, c.units); got != c.want {
			t.Errorf("programDecimals(%g, %s) = %d, want %d", c.tol, c.units, got, c.want)
		}
		if d := programDecimals(c.tol, c.units); d < 8 && toolpath.RoundingAllowance(d) > 0.01*c.tol*(1+1e-12) {
			t.Errorf("programDecimals(%g, %s) = %d: rounding %g is more than 1%% of the tolerance", c.tol, c.units, d, toolpath.RoundingAllowance(d))
		}
	}
}

// Pictures and the report are written with the program; when one of them
// cannot be written, the program is not written either.
func TestOperationsWritePicturesAndReportsBeforeTheProgram(t *testing.T) {
	for _, cmd := range [][]string{
		{"path", "-size", "120x80"},
		{"profile", "-machine", "router", "-size", "120x80", "-tool", "6", "-depth", "3", "-tabs", "2"},
		{"drill", "-machine", "laser", "-size", "120x80", "-count", "5", "-power", "100"},
		{"dash", "-machine", "plotter", "-size", "120x80", "-dash", "8,4"},
	} {
		dir := t.TempDir()
		prog, png, svg := filepath.Join(dir, "p.gcode"), filepath.Join(dir, "p.png"), filepath.Join(dir, "p.svg")
		r := runFoci(t, append(cmd, "-o", prog, "-png", png, "-svg", svg)...)
		if r.code != 0 {
			t.Fatalf("%v: exit %d: %s", cmd, r.code, r.stderr)
		}
		if b, _ := os.ReadFile(png); !bytes.HasPrefix(b, []byte("\x89PNG")) {
			t.Errorf("%v: %s is not a PNG", cmd, png)
		}
		if b, _ := os.ReadFile(svg); !bytes.Contains(b, []byte("<svg")) {
			t.Errorf("%v: %s is not an SVG", cmd, svg)
		}
		missing := filepath.Join(dir, "no such dir")
		bad := [][]string{{"-png", filepath.Join(missing, "p.png")}, {"-svg", filepath.Join(missing, "p.svg")}}
		if cmd[0] != "path" {
			bad = append(bad, []string{"-report", filepath.Join(missing, "r.json")})
		}
		for _, b := range bad {
			fresh := filepath.Join(dir, "fresh.gcode")
			r := runFoci(t, append(append([]string{}, cmd...), append(b, "-o", fresh)...)...)
			if r.code != 2 {
				t.Errorf("%v %v: exit %d, want 2", cmd, b, r.code)
			}
			if _, err := os.Stat(fresh); err == nil {
				t.Errorf("%v %v: the program was written although %s could not be", cmd, b, b[1])
			}
		}
	}
}

// Over random shapes, machines and settings, every operation command
// either writes a program that passes every check, or refuses with exit 2
// and a message naming a flag; it never panics and never exits otherwise.
func TestOperationsWriteCheckedProgramsOrNameTheFlag(t *testing.T) {
	flagNamed := regexp.MustCompile(`foci [a-z]+: -[a-z-]+: `)
	rapid.Check(t, func(rt *rapid.T) {
		inch := rapid.Bool().Draw(rt, "inch")
		k, units := 1.0, "mm"
		if inch {
			k, units = 1/25.4, "inch"
		}
		num := func(label string, lo, hi float64) float64 {
			v := rapid.Float64Range(lo, hi).Draw(rt, label)
			return float64(float32(v)) // short numbers, as a user types them
		}
		w := num("width", 5, 2000) * k
		h := w * num("aspect", 0.02, 1)
		cx, cy, rot := num("cx", -500, 500)*k, num("cy", -500, 500)*k, num("rotate", -180, 180)
		tol := num("tol", 0.005, 0.5) * k
		machine := rapid.SampledFrom([]string{"router", "laser", "plotter"}).Draw(rt, "machine")
		cmd := rapid.SampledFrom([]string{"profile", "drill", "dash"}).Draw(rt, "command")
		g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
		args := append([]string{cmd, "-machine", machine}, shapeArgs(w, h, cx, cy, rot, units)...)
		var offset float64
		zone := toolpath.Band
		switch cmd {
		case "profile":
			args = append(args, "-tol", g(tol))
			side := rapid.SampledFrom([]string{"outside", "inside", "on"}).Draw(rt, "side")
			args = append(args, "-side", side)
			r := 0.0
			switch machine {
			case "router":
				tool, depth := num("tool", 0.5, 25)*k, num("depth", 0.5, 30)*k
				r = tool / 2
				passes := rapid.IntRange(1, 5).Draw(rt, "passes")
				args = append(args, "-tool", g(tool), "-depth", g(depth), "-stepdown", g(depth/float64(passes)))
				// The checker counts a height as a depth level once its
				// moves go half way round, tabs included: keep the raised
				// stretches of all passes well short of that.
				n, tw := rapid.IntRange(0, 6).Draw(rt, "tabs"), num("tab width", 1, 12)*k
				if perimeter := math.Pi * (w + h) / 2; n > 0 && float64(n*passes)*(tw+tool) < perimeter/4 {
					args = append(args, "-tabs", strconv.Itoa(n), "-tab-width", g(tw))
				}
			case "laser":
				kerf := num("kerf", 0.05, 0.5) * k
				r = kerf / 2
				args = append(args, "-kerf", g(kerf), "-power", "500", "-passes", strconv.Itoa(rapid.IntRange(1, 3).Draw(rt, "passes")))
			}
			if side != "on" {
				// The checker tells a lead from the contour by its far end
				// lying more than the tolerance beyond the zone, so leads
				// are either none or over twice the tolerance in radius, and
				// small beside the curve's radius so that their ends stand
				// off by nearly their radius.
				lead := "0"
				if r := tol * num("lead/tol", 2.2, 6); rapid.Bool().Draw(rt, "lead") && 10*r < (h/2)*(h/2)/(w/2) {
					lead = g(r)
				}
				args = append(args, "-lead", lead)
			}
			switch side {
			case "outside":
				offset, zone = r, toolpath.Outside
			case "inside":
				offset, zone = -r, toolpath.Inside
			default:
				offset = 0
			}
		case "drill", "dash":
			offset = num("offset", -50, 50) * k
			args = append(args, "-offset", g(offset))
			if cmd == "drill" {
				args = append(args, "-count", strconv.Itoa(rapid.IntRange(1, 40).Draw(rt, "count")))
			} else {
				args = append(args, "-tol", g(tol), "-dash", g(num("on", 0, 50)*k)+","+g(num("off", 0.5, 50)*k))
			}
			switch machine {
			case "router":
				args = append(args, "-depth", g(num("depth", 0.5, 10)*k))
			case "laser":
				args = append(args, "-power", "300")
			}
		}
		dir := t.TempDir()
		file := filepath.Join(dir, "p.gcode")
		res := runFoci(t, append(args, "-o", file)...)
		switch res.code {
		case 2:
			if !flagNamed.MatchString(res.stderr) {
				rt.Fatalf("foci %s: refused without naming a flag: %q", strings.Join(args, " "), res.stderr)
			}
			if _, err := os.Stat(file); err == nil {
				rt.Fatalf("foci %s: refused but wrote %s", strings.Join(args, " "), file)
			}
			return
		case 0:
		default:
			rt.Fatalf("foci %s: exit %d: %s", strings.Join(args, " "), res.code, res.stderr)
		}
		src, err := os.ReadFile(file)
		if err != nil {
			rt.Fatal(err)
		}
		cm, _ := conformance.ParseMachine(machine)
		safe := map[string]float64{"router": 5 * k, "laser": 0, "plotter": 3 * k}[machine]
		if inch {
			safe = map[string]float64{"router": 0.2, "laser": 0, "plotter": 0.12}[machine]
		}
		rules := conformance.Rules{Machine: cm, SafeZ: safe}
		if cmd == "profile" {
			el, err := ellipse.FromSize(w, h, ellipse.Point{X: cx, Y: cy}, rot*math.Pi/180)
			if err != nil {
				rt.Fatal(err)
			}
			curve, err := el.Parallel(offset)
			if err != nil {
				rt.Fatal(err)
			}
			rules.Shape = &conformance.Shape{Curve: curve, Zone: zone, Tol: tol}
		}
		p, err := conformance.Read(src, conformance.ReadOptions{})
		if err != nil {
			rt.Fatal(err)
		}
		if vs := conformance.Check(p, rules); len(vs) > 0 {
			rt.Fatalf("foci %s: %d violations, the first: %v", strings.Join(args, " "), len(vs), vs[0])
		}
	})
}
