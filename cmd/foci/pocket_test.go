package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// pocketCase is one "foci pocket" command line with the ellipse it cuts.
type pocketCase struct {
	name              string
	args              []string
	w, h, cx, cy, rot float64
	tool, depth, tol  float64
	safeZ             float64
}

// pocketCases: the operation tests' round, ordinary and flat (b/a = 0.1)
// shapes, in mm and in inches, with arcs and with lines.
func pocketCases() []pocketCase {
	var cases []pocketCase
	for _, units := range []string{"mm", "inch"} {
		k, tol, safe := 1.0, 0.05, 5.0
		if units == "inch" {
			k, tol, safe = 1/25.4, 0.002, 0.2
		}
		for _, sh := range shapes {
			w, h, cx, cy := sh.w*k, sh.h*k, sh.cx*k, sh.cy*k
			g := fmt.Sprint
			tool, depth := 6*k, 10*k
			base := append([]string{"pocket"}, shapeArgs(w, h, cx, cy, sh.rot, units)...)
			base = append(base, "-tool", g(tool), "-depth", g(depth), "-stepdown", g(4*k))
			c := pocketCase{units + "/" + sh.name, base, w, h, cx, cy, sh.rot, tool, depth, tol, safe}
			cases = append(cases, c)
			c.name += "/lines,conventional,stepover 5,no allowance"
			c.args = with(base, "-geometry", "lines", "-direction", "conventional", "-stepover", g(5*k), "-allowance", "0")
			cases = append(cases, c)
		}
	}
	return cases
}

// pocketReportFile is the part of the -report JSON the tests read.
type pocketReportFile struct {
	CutLength    float64 `json:"cut_length"`
	MaxDeviation float64 `json:"max_deviation"`
	Measured     int     `json:"measured_moves"`
	Pocket       struct {
		Levels     []float64 `json:"levels"`
		Rings      []float64 `json:"rings"`
		StepOver   float64   `json:"stepover"`
		Allowance  float64   `json:"allowance"`
		Trimmed    bool      `json:"wall_trimmed"`
		Entry      string    `json:"entry"`
		LowerBound float64   `json:"cut_lower_bound"`
		CutRatio   float64   `json:"cut_ratio"`
	} `json:"pocket"`
}

// Every pocket program, read back, passes every router rule (rapids only
// at the safe height, spindle on before cutting, program end), and the
// geometry rules against the wall pass's curve where it is a parallel
// curve short of the fold; it cuts at the levels asked down to exactly
// -depth; no cutting move comes nearer the wall than the tool radius less
// the tolerance (exact signed distance, Eberly); the report agrees.
func TestPocketProgramsPassEveryCheck(t *testing.T) {
	cases := pocketCases()
	if testing.Short() {
		cases = cases[:len(cases)/2]
	}
	for _, c := range cases {
		repFile := filepath.Join(t.TempDir(), "r.json")
		src, res := runToFile(t, append(c.args, "-report", repFile)...)
		if !strings.Contains(res.stderr, "times the least for the area") {
			t.Errorf("%s: no pocket summary on stderr: %q", c.name, res.stderr)
		}
		var rep pocketReportFile
		data, err := os.ReadFile(repFile)
		if err != nil {
			t.Fatal(err)
		}
		if err := json.Unmarshal(data, &rep); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		el, err := ellipse.FromSize(c.w, c.h, ellipse.Point{X: c.cx, Y: c.cy}, c.rot*math.Pi/180)
		if err != nil {
			t.Fatal(err)
		}
		r := c.tool / 2
		rules := conformance.Rules{Machine: conformance.Router, SafeZ: c.safeZ}
		if r+3*c.tol < el.MinRadiusOfCurvature() {
			rules.Shape = &conformance.Shape{Curve: curveOf(t, c.w, c.h, c.cx, c.cy, c.rot, -r), Zone: toolpath.Inside, Tol: c.tol}
		}
		cr := checkProgram(t, c.name, src, rules)
		if rules.Shape != nil && cr.Summary.Contour == 0 {
			t.Errorf("%s: no move was checked against the wall pass's curve", c.name)
		}
		if (rules.Shape != nil) == rep.Pocket.Trimmed {
			t.Errorf("%s: the report says the wall is trimmed: %v", c.name, rep.Pocket.Trimmed)
		}
		if !rep.Pocket.Trimmed && (rep.Measured == 0 || rep.MaxDeviation > c.tol) {
			t.Errorf("%s: report deviation %g over %d moves, want within the tolerance", c.name, rep.MaxDeviation, rep.Measured)
		}
		// Levels.
		n, step := toolpath.DepthPasses(c.depth, flagValue(t, c.args, "stepdown"))
		got := zLevels(t, src)
		if len(got) != n || len(rep.Pocket.Levels) != n {
			t.Errorf("%s: levels %v (report %v), want %d of %g", c.name, got, rep.Pocket.Levels, n, step)
		}
		for i, z := range got {
			if want := -float64(n-i) * step; math.Abs(z-want) > 1e-4*c.depth {
				t.Errorf("%s: levels %v, want steps of %g", c.name, got, step)
				break
			}
		}
		if low := lowestZ(t, src); math.Abs(low+c.depth) > 1e-4*c.depth {
			t.Errorf("%s: the program cuts down to Z %g, want exactly -depth", c.name, low)
		}
		// No gouge, read back.
		prog, _ := conformance.Read(src, conformance.ReadOptions{})
		for i, s := range prog.Path {
			if s.Motion != toolpath.Cut || math.Min(s.Start.Z, s.End.Z) >= 0 {
				continue
			}
			for j := 0; j <= 16; j++ {
				q := s.At(float64(j) / 16)
				if d := -el.SignedDistance(ellipse.Point{X: q.X, Y: q.Y}); d < r-c.tol {
					t.Errorf("%s: line %d comes %g inside the wall, less than the tool radius %g less the tolerance", c.name, prog.Moves[i].Line, d, r)
					break
				}
			}
		}
		// The report's lengths are the program's; the bound is as stated.
		if d := math.Abs(rep.CutLength - cr.Summary.CutLength); d > 1e-3*rep.CutLength {
			t.Errorf("%s: report cut length %g, the program cuts %g", c.name, rep.CutLength, cr.Summary.CutLength)
		}
		if want := float64(n) * math.Pi * c.w * c.h / 4 / rep.Pocket.StepOver; math.Abs(rep.Pocket.LowerBound-want) > 1e-9*want ||
			math.Abs(rep.Pocket.CutRatio-rep.CutLength/want) > 1e-9 {
			t.Errorf("%s: lower bound %g, ratio %g; want levels·πab/step-over = %g", c.name, rep.Pocket.LowerBound, rep.Pocket.CutRatio, want)
		}
	}
}

func TestPocketRefusesBadInput(t *testing.T) {
	p := func(extra ...string) []string {
		return append([]string{"pocket", "-size", "300x200", "-tool", "6", "-depth", "6"}, extra...)
	}
	testRefusals(t, []refusal{
		{[]string{"pocket", "-tool", "6", "-depth", "6"}, "size"},
		{[]string{"pocket", "-size", "300x200", "-depth", "6"}, "tool"},
		{[]string{"pocket", "-size", "300x200", "-tool", "6"}, "depth"},
		{p("-tool", "0"), "tool"},
		{p("-tool", "-6"), "tool"},
		{p("-tool", "200", "-stepover", "50"), "tool"},    // as wide as the minor axis
		{p("-tool", "250", "-stepover", "50"), "tool"},    // wider
		{p("-tool", "199.9", "-stepover", "50"), "tool"},  // no room to enter: at most 200 − 3·0.05
		{p("-tool", "0.05", "-stepover", "0.05"), "tool"}, // below twice the tolerance
		{p("-depth", "0"), "depth"},
		{p("-depth", "-2"), "depth"},
		{p("-depth", "NaN"), "depth"},
		{p("-stepdown", "0"), "stepdown"},
		{p("-stepover", "0"), "stepover"},
		{p("-stepover", "-1"), "stepover"},
		{p("-stepover", "6.5"), "stepover"}, // above the tool diameter
		{p("-stepover", "0.01"), "stepover"},
		{p("-allowance", "0.1"), "allowance"}, // below three tolerances
		{p("-allowance", "3"), "allowance"},   // above the default step-over 2.4
		{p("-allowance", "-0.2"), "allowance"},
		{p("-ramp", "0"), "ramp"},
		{p("-ramp", "90"), "ramp"},
		{p("-direction", "sideways"), "direction"},
		{p("-tol", "0"), "tol"},
		{p("-geometry", "spline"), "geometry"},
		{p("-feed", "0"), "feed"},
		{p("-plunge", "0"), "plunge"},
		{p("-rpm", "0"), "rpm"},
		{p("-safe-z", "0"), "safe-z"},
		{p("-travel", "0,0,100,100"), "travel"},
		{p("-units", "furlong"), "units"},
	})
	// Another machine's flags are not offered at all.
	for _, f := range []string{"-machine", "-power", "-kerf", "-pen-up"} {
		if r := runFoci(t, p(f, "1")...); r.code != 2 || !strings.Contains(r.stderr, "flag provided but not defined: "+f) {
			t.Errorf("pocket %s: exit %d, %q", f, r.code, r.stderr)
		}
	}
}

// A tool too wide is refused with the limit 2b − 3·tol in the message.
func TestPocketNamesTheWidestTool(t *testing.T) {
	res := runFoci(t, "pocket", "-size", "300x40", "-tool", "39.9", "-stepover", "10", "-depth", "3", "-o", filepath.Join(t.TempDir(), "p.gcode"))
	if res.code != 2 || !strings.Contains(res.stderr, "-tool: 39.9") || !strings.Contains(res.stderr, "(limit 39.85)") {
		t.Errorf("exit %d, %q: want -tool named with the limit 39.85", res.code, res.stderr)
	}
}

// The defaults: a step-down of half the tool, a step-over of 40% of it,
// an allowance of 0.2 mm (at least three tolerances, none when the
// step-over is smaller), a 3 degree ramp, climb milling.
func TestPocketDefaults(t *testing.T) {
	for _, c := range []struct {
		args      []string
		levels    int
		stepover  float64
		allowance float64
	}{
		{[]string{"-tool", "6", "-depth", "9"}, 3, 2.4, 0.2},
		{[]string{"-tool", "6", "-depth", "9", "-tol", "0.1"}, 3, 2.4, 0.3},
		{[]string{"-tool", "0.4", "-depth", "0.5", "-tol", "0.01"}, 3, 0.16, 0},
		{[]string{"-tool", "0.25", "-depth", "0.25", "-units", "inch", "-size", "8x5"}, 2, 0.1, 0.008},
	} {
		args := append([]string{"pocket", "-size", "120x80"}, c.args...)
		rep := filepath.Join(t.TempDir(), "r.json")
		src, _ := runToFile(t, append(args, "-report", rep)...)
		var r pocketReportFile
		data, _ := os.ReadFile(rep)
		if err := json.Unmarshal(data, &r); err != nil {
			t.Fatal(err)
		}
		if len(r.Pocket.Levels) != c.levels || math.Abs(r.Pocket.StepOver-c.stepover) > 1e-12 || math.Abs(r.Pocket.Allowance-c.allowance) > 1e-12 {
			t.Errorf("%v: %d levels, step-over %g, allowance %g; want %d, %g, %g", c.args, len(r.Pocket.Levels), r.Pocket.StepOver, r.Pocket.Allowance, c.levels, c.stepover, c.allowance)
		}
		if !bytes.Contains(src, []byte("climb milling, counter-clockwise")) || !bytes.Contains(src, []byte("at most 3 deg")) {
			t.Errorf("%v: the header does not say climb and 3 deg:\n%s", c.args, firstLines(src, 16))
		}
	}
}

// The header says what the program does; a round pocket enters down a
// helix, an elongated one down a ramp along the major axis.
func TestPocketHeaderDescribesTheCut(t *testing.T) {
	for _, c := range []struct {
		args []string
		want []string
	}{
		{[]string{"-size", "150x150", "-tool", "8", "-depth", "12", "-stepdown", "4", "-allowance", "0"},
			[]string{"pocket 12 mm deep in 3 levels of 4 mm", "entry: helix of radius 2 mm about the centre", "middle at the centre", "no allowance"}},
		{[]string{"-size", "400x40", "-tool", "6", "-depth", "3", "-direction", "conventional", "-ramp", "4"},
			[]string{"pocket 3 mm deep in 1 level of 3 mm", "conventional milling, clockwise", "trimmed on the major axis, past 2 mm in",
				"entry: ramp along the major axis, at most 4 deg", "allowance 0.2 mm on the wall"}},
	} {
		src, _ := runToFile(t, append([]string{"pocket"}, c.args...)...)
		for _, w := range c.want {
			if !bytes.Contains(src, []byte(w)) {
				t.Errorf("%v: the header lacks %q:\n%s", c.args, w, firstLines(src, 16))
			}
		}
	}
}

// Pictures and the report are written before the program; when one of
// them cannot be written the program is not written either.
func TestPocketWritesPicturesAndReportFirst(t *testing.T) {
	dir := t.TempDir()
	cmd := []string{"pocket", "-size", "120x80", "-tool", "6", "-depth", "3"}
	prog, png, svg, rep := filepath.Join(dir, "p.gcode"), filepath.Join(dir, "p.png"), filepath.Join(dir, "p.svg"), filepath.Join(dir, "r.json")
	if r := runFoci(t, append(cmd, "-o", prog, "-png", png, "-svg", svg, "-report", rep)...); r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	if b, _ := os.ReadFile(png); !bytes.HasPrefix(b, []byte("\x89PNG")) {
		t.Errorf("%s is not a PNG", png)
	}
	if b, _ := os.ReadFile(svg); !bytes.Contains(b, []byte("<svg")) {
		t.Errorf("%s is not an SVG", svg)
	}
	if b, _ := os.ReadFile(rep); !bytes.Contains(b, []byte(`"cut_ratio"`)) {
		t.Errorf("%s has no cut_ratio", rep)
	}
	missing := filepath.Join(dir, "no such dir")
	for _, b := range []string{"-png", "-svg", "-report"} {
		fresh := filepath.Join(dir, "fresh.gcode")
		r := runFoci(t, append(cmd, b, filepath.Join(missing, "x"), "-o", fresh)...)
		if _, err := os.Stat(fresh); r.code != 2 || err == nil {
			t.Errorf("%s into a missing directory: exit %d, program written %v", b, r.code, err == nil)
		}
	}
}

// The command's cut length is the library's for the same settings.
func TestPocketCommandMatchesTheLibrary(t *testing.T) {
	rep := filepath.Join(t.TempDir(), "r.json")
	runToFile(t, "pocket", "-size", "200x120", "-rotate", "15", "-tool", "5", "-depth", "4", "-stepover", "2", "-allowance", "0.3", "-report", rep)
	var r pocketReportFile
	data, _ := os.ReadFile(rep)
	if err := json.Unmarshal(data, &r); err != nil {
		t.Fatal(err)
	}
	el, _ := ellipse.FromSize(200, 120, ellipse.Point{}, 15*math.Pi/180)
	p, err := toolpath.Pocket(nil, toolpath.PocketSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.05, Geometry: toolpath.Arcs, Decimals: programDecimals(0.05, unitsMM), SafeZ: 5},
		Ellipse: el, Tool: 5, Depth: 4, StepDown: 2.5, StepOver: 2, Allowance: 0.3, RampAngle: 3 * math.Pi / 180,
	})
	if err != nil {
		t.Fatal(err)
	}
	cut, _ := p.Lengths()
	if math.Abs(cut-r.CutLength) > 1e-9*cut {
		t.Errorf("the command cuts %s, the library %s", strconv.FormatFloat(r.CutLength, 'g', -1, 64), strconv.FormatFloat(cut, 'g', -1, 64))
	}
}
