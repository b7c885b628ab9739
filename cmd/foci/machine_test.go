package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

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
		// 10^-d·√2 ≤ tol/100 (toolpath.DecimalsFor), at least 3 for mm
		// and 5 for inch (gcodeout.MinDecimals), at most 8.
		{0.05, unitsMM, 4},
		{0.5, unitsMM, 3},
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
