package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/toolpath"
)

// opCase is one operation command line with what its program must be.
type opCase struct {
	name    string
	args    []string
	machine conformance.Machine
	safeZ   float64 // the rapid height: -safe-z, -pen-up, 0 for a laser
	// The intended tool-centre curve: the ellipse -size w x h at -center
	// cx,cy rotated rot degrees, offset by offset, held to zone and tol.
	w, h, cx, cy, rot, offset float64
	zone                      toolpath.Zone
	tol                       float64
}

// shapeArgs returns the shape flags of a case.
func shapeArgs(w, h, cx, cy, rot float64, units string) []string {
	return []string{"-size", fmt.Sprintf("%gx%g", w, h), "-center", fmt.Sprintf("%g,%g", cx, cy), "-rotate", fmt.Sprint(rot), "-units", units}
}

// shapes are the outlines the operation tests run on: round, ordinary
// (rotated, off centre) and flat, in mm and scaled to inches.
var shapes = []struct {
	name              string
	w, h, cx, cy, rot float64
}{
	{"round", 150, 150, 0, 0, 0},
	{"ordinary", 420, 260, 250, 180, 25},
	{"flat", 400, 40, -30, 10, -60},
}

// profileCases builds the profile cases: every machine and side on every
// shape, in mm and in inches.
func profileCases() []opCase {
	var cases []opCase
	for _, units := range []string{"mm", "inch"} {
		k := 1.0
		tol := 0.05
		if units == "inch" {
			k, tol = 1/25.4, 0.002
		}
		for _, sh := range shapes {
			w, h, cx, cy := sh.w*k, sh.h*k, sh.cx*k, sh.cy*k
			base := append([]string{"profile"}, shapeArgs(w, h, cx, cy, sh.rot, units)...)
			tool, kerf := 6*k, 0.2*k
			depth := 12 * k
			name := units + "/" + sh.name
			safe, up := 5*k, 3*k
			if units == "inch" {
				safe, up = 0.2, 0.12
			}
			g := fmt.Sprint
			for _, side := range []string{"outside", "inside"} {
				sign := 1.0
				zone := toolpath.Outside
				if side == "inside" {
					sign, zone = -1, toolpath.Inside
				}
				st := tool
				if side == "inside" && sh.name == "flat" {
					st = 3 * k // b²/a = 2 mm: a 6 mm tool would not fit
				}
				router := with(base, "-machine", "router", "-side", side, "-tool", g(st), "-depth", g(depth), "-stepdown", g(depth/3))
				cases = append(cases,
					opCase{name + "/router/" + side, router, conformance.Router, safe, w, h, cx, cy, sh.rot, sign * st / 2, zone, tol},
					opCase{name + "/router/" + side + "/tabs+ramp+lines", with(router, "-tabs", "3", "-tab-width", g(8*k), "-tab-height", g(4*k), "-ramp", "4", "-geometry", "lines", "-direction", "conventional"),
						conformance.Router, safe, w, h, cx, cy, sh.rot, sign * st / 2, zone, tol},
					opCase{name + "/laser/" + side, with(base, "-machine", "laser", "-side", side, "-kerf", g(kerf), "-power", "800", "-passes", "2", "-dwell", "0.1"),
						conformance.Laser, 0, w, h, cx, cy, sh.rot, sign * kerf / 2, zone, tol},
				)
			}
			cases = append(cases,
				opCase{name + "/router/on", with(base, "-machine", "router", "-side", "on", "-tool", g(tool), "-depth", g(1*k)), conformance.Router, safe, w, h, cx, cy, sh.rot, 0, toolpath.Band, tol},
				opCase{name + "/plotter", with(base, "-machine", "plotter"), conformance.Plotter, up, w, h, cx, cy, sh.rot, 0, toolpath.Band, tol},
				opCase{name + "/plotter/outside/lines", with(base, "-machine", "plotter", "-side", "outside", "-geometry", "lines", "-tol", g(2*tol)), conformance.Plotter, up, w, h, cx, cy, sh.rot, 0, toolpath.Outside, 2 * tol},
			)
		}
	}
	return cases
}

// with returns a copy of base with extra appended.
func with(base []string, extra ...string) []string {
	return append(append([]string{}, base...), extra...)
}

// checkOpCase runs one case and checks its program against every rule,
// returning the program and its report.
func checkOpCase(t *testing.T, c opCase) ([]byte, programReport) {
	t.Helper()
	dir := t.TempDir()
	repFile := filepath.Join(dir, "report.json")
	src, r := runToFile(t, append(c.args, "-report", repFile)...)
	var rep programReport
	data, err := os.ReadFile(repFile)
	if err != nil {
		t.Fatalf("%s: %v", c.name, err)
	}
	if err := json.Unmarshal(data, &rep); err != nil {
		t.Fatalf("%s: report: %v", c.name, err)
	}
	if !strings.Contains(r.stderr, "segments, coordinates to") {
		t.Errorf("%s: no summary on stderr: %q", c.name, r.stderr)
	}
	curve := curveOf(t, c.w, c.h, c.cx, c.cy, c.rot, c.offset)
	rules := conformance.Rules{Machine: c.machine, SafeZ: c.safeZ, Shape: &conformance.Shape{Curve: curve, Zone: c.zone, Tol: c.tol}}
	cr := checkProgram(t, c.name, src, rules)
	s := cr.Summary
	if !s.Geometry || s.Contour == 0 {
		t.Errorf("%s: no contour moves checked: %+v", c.name, s)
	}
	lo, hi := c.zone.Limits(c.tol)
	if rep.DeviationRange[0] < lo || rep.DeviationRange[1] > hi || rep.MaxDeviation > c.tol {
		t.Errorf("%s: report deviation %v (max %g) outside the zone [%g, %g]", c.name, rep.DeviationRange, rep.MaxDeviation, lo, hi)
	}
	// The report's lengths are the program's, within rounding.
	if d := math.Abs(rep.CutLength - s.CutLength); d > 1e-3*rep.CutLength {
		t.Errorf("%s: report cut length %g, the program cuts %g", c.name, rep.CutLength, s.CutLength)
	}
	if rep.TimeEstimate < rep.CutLength/rep.TimeModel.Feed*60*0.999 {
		t.Errorf("%s: time estimate %g s is less than the cut length at the feed, %g s", c.name, rep.TimeEstimate, rep.CutLength/rep.TimeModel.Feed*60)
	}
	return src, rep
}

func TestProfileProgramsPassEveryCheck(t *testing.T) {
	cases := profileCases()
	if testing.Short() {
		cases = cases[:len(cases)/2]
	}
	for _, c := range cases {
		src, _ := checkOpCase(t, c)
		switch c.machine {
		case conformance.Laser:
			if regexp.MustCompile(`(?m)^[^(].*Z`).Match(src) {
				t.Errorf("%s: a laser program without -focus-z moves in Z", c.name)
			}
			if got := strings.Count(string(src), "\nM3 S800"); got < 2 {
				t.Errorf("%s: the beam goes on %d times for two passes", c.name, got)
			}
			if !strings.Contains(string(src), "\nG4 P0.1\n") {
				t.Errorf("%s: no pierce dwell", c.name)
			}
		case conformance.Router:
			if i, j := strings.Index(string(src), "\nM3 S18000"), strings.Index(string(src), "\nG1 "); i < 0 || j < i {
				t.Errorf("%s: the spindle does not start before the first feed move", c.name)
			}
			depth := flagValue(t, c.args, "depth")
			if low := lowestZ(t, src); math.Abs(low+depth) > 1e-4*depth {
				t.Errorf("%s: the program cuts down to Z %g, want exactly -depth %g", c.name, low, -depth)
			}
		}
	}
}

// flagValue returns the number after -name in args.
func flagValue(t *testing.T, args []string, name string) float64 {
	t.Helper()
	for i, a := range args[:len(args)-1] {
		if a == "-"+name {
			v, err := strconv.ParseFloat(args[i+1], 64)
			if err != nil {
				t.Fatal(err)
			}
			return v
		}
	}
	t.Fatalf("no -%s in %v", name, args)
	return 0
}

// lowestZ returns the lowest Z a program reaches, read back.
func lowestZ(t *testing.T, src []byte) float64 {
	t.Helper()
	p, err := conformance.Read(src, conformance.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	lo, _, _ := p.Path.ZRange()
	return lo
}

// A ramped entry descends at one steady slope from one level to the next
// and never goes below the pass it leads to, so no pass cuts deeper than
// asked.
func TestProfileRampsDescendSteadilyToEachPass(t *testing.T) {
	for _, c := range []struct {
		size string
		ramp []string
	}{
		{"180x110", []string{"-ramp", "3"}},
		{"180x110", []string{"-ramp", "10", "-geometry", "lines"}},
		{"150x150", []string{"-ramp", "4", "-geometry", "lines"}},
		{"180x110", []string{"-ramp-length", "40"}},
	} {
		args := append([]string{"profile", "-machine", "router", "-size", c.size, "-tool", "6", "-depth", "9", "-stepdown", "3"}, c.ramp...)
		name := strings.Join(args[1:], " ")
		src, _ := runToFile(t, args...)
		if low := lowestZ(t, src); math.Abs(low+9) > 1e-4 {
			t.Errorf("%s: the program cuts down to Z %g, want -9", name, low)
		}
		p, _ := conformance.Read(src, conformance.ReadOptions{})
		var slopes []float64 // of the current ramp
		flush := func(line int) {
			if len(slopes) < 2 {
				slopes = slopes[:0]
				return
			}
			lo, hi := slices.Min(slopes), slices.Max(slopes)
			// Rounding Z to 4 decimals over moves a few mm long moves a
			// slope by well under 1%.
			if hi-lo > 0.01*hi {
				t.Errorf("%s: the ramp ending at line %d descends at slopes from %.4f to %.4f, not steadily", name, line, lo, hi)
			}
			if c.ramp[0] == "-ramp" {
				deg, _ := strconv.ParseFloat(c.ramp[1], 64)
				if want := math.Tan(deg * math.Pi / 180); math.Abs(lo-want) > 0.01*want || math.Abs(hi-want) > 0.01*want {
					t.Errorf("%s: the ramp ending at line %d descends at slopes %.4f to %.4f, want tan %g° = %.4f", name, line, lo, hi, deg, want)
				}
			}
			slopes = slopes[:0]
		}
		for i, s := range p.Path {
			xy := math.Hypot(s.End.X-s.Start.X, s.End.Y-s.Start.Y)
			if s.Kind == toolpath.Arc {
				xy = math.Abs(s.Sweep()) * s.Radius
			}
			if s.Motion != toolpath.Cut || s.End.Z >= s.Start.Z || xy < 0.5 {
				flush(p.Moves[i].Line)
				continue
			}
			slopes = append(slopes, (s.Start.Z-s.End.Z)/xy)
			// It must not pass below the next level under its start.
			next := -3 * math.Ceil((-s.Start.Z+1e-6)/3)
			if s.End.Z < next-1e-4 {
				t.Errorf("%s: line %d ramps from Z %g to %g, below the pass level %g", name, p.Moves[i].Line, s.Start.Z, s.End.Z, next)
			}
		}
	}
}

// zLevels returns the distinct Z heights of the feed moves that stay
// level, read back from the program.
func zLevels(t *testing.T, src []byte) []float64 {
	t.Helper()
	p, err := conformance.Read(src, conformance.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	seen := map[float64]bool{}
	for i, s := range p.Path {
		if s.Motion == toolpath.Cut && s.Kind != toolpath.Dwell && s.Start.Z == s.End.Z && p.Moves[i].Code != 0 {
			seen[s.End.Z] = true
		}
	}
	var zs []float64
	for z := range seen {
		zs = append(zs, z)
	}
	sort.Float64s(zs)
	return zs
}

func TestProfileDepthsAndTabsAreAsAsked(t *testing.T) {
	for _, c := range []struct {
		args []string
		want []float64 // level cutting heights, lowest first
	}{
		// 10 deep at most 4 a pass: 3 equal passes of 10/3, tabs 3 high.
		{[]string{"-depth", "10", "-stepdown", "4", "-tabs", "4", "-tab-height", "3"}, []float64{-10, -7, -20.0 / 3, -10.0 / 3}},
		// 12 deep at 3 a pass: exactly 4 passes; tabs default to a third.
		{[]string{"-depth", "12", "-stepdown", "3", "-tabs", "2"}, []float64{-12, -9, -8, -6, -3}},
		// The default step-down is half the tool: 6 deep with a 6 tool.
		{[]string{"-depth", "6"}, []float64{-6, -3}},
	} {
		args := append([]string{"profile", "-machine", "router", "-size", "300x200", "-tool", "6"}, c.args...)
		src, _ := runToFile(t, args...)
		got := zLevels(t, src)
		if len(got) != len(c.want) {
			t.Errorf("%v: levels %v, want %v", c.args, got, c.want)
			continue
		}
		for i := range got {
			if math.Abs(got[i]-c.want[i]) > 1e-4 {
				t.Errorf("%v: levels %v, want %v", c.args, got, c.want)
				break
			}
		}
	}
}

func TestProfileReportHasTheFields(t *testing.T) {
	dir := t.TempDir()
	rep := filepath.Join(dir, "r.json")
	_, _ = runToFile(t, "profile", "-machine", "laser", "-size", "90x60", "-kerf", "0.15", "-power", "700", "-report", rep, "-travel", "-100,-100,100,100")
	var m map[string]any
	data, err := os.ReadFile(rep)
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(data, &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"cut_length", "travel_length", "time_estimate_s", "segments", "max_deviation", "bounding_box"} {
		if _, ok := m[k]; !ok {
			t.Errorf("the report lacks %q: %s", k, data)
		}
	}
	bb := m["bounding_box"].(map[string]any)
	// The kerf centre runs 0.075 outside the 45 x 30 semi-axes, at most
	// 0.05 further out.
	if x := bb["max_x"].(float64); x < 45.075 || x > 45.075+0.05+0.15*10*2 {
		t.Errorf("bounding box max_x %g, want the kerf path's extent", x)
	}
}

func TestProfileRefusesFlagsForOtherMachines(t *testing.T) {
	router := []string{"profile", "-machine", "router", "-size", "300x200", "-tool", "6", "-depth", "6"}
	laser := []string{"profile", "-machine", "laser", "-size", "300x200", "-kerf", "0.2", "-power", "500"}
	plotter := []string{"profile", "-machine", "plotter", "-size", "300x200"}
	var cases []refusal
	for _, f := range []string{"kerf", "passes", "power", "dwell", "focus-z", "pen-up"} {
		cases = append(cases, refusal{with(router, "-"+f, "1"), f})
	}
	for _, f := range []string{"tool", "depth", "stepdown", "tabs", "tab-width", "tab-height", "ramp", "ramp-length", "rpm", "spin-up", "safe-z", "plunge", "pen-up"} {
		cases = append(cases, refusal{with(laser, "-"+f, "1"), f})
	}
	cases = append(cases, refusal{with(laser, "-direction", "climb"), "direction"})
	for _, f := range []string{"tool", "depth", "kerf", "rpm", "safe-z", "power", "passes", "tabs"} {
		cases = append(cases, refusal{with(plotter, "-"+f, "1"), f})
	}
	testRefusals(t, cases)
}

func TestProfileRefusesBadInput(t *testing.T) {
	r := func(extra ...string) []string {
		return append([]string{"profile", "-machine", "router", "-size", "300x200", "-tool", "6", "-depth", "6"}, extra...)
	}
	l := func(extra ...string) []string {
		return append([]string{"profile", "-machine", "laser", "-size", "300x200", "-kerf", "0.2", "-power", "500"}, extra...)
	}
	testRefusals(t, []refusal{
		{[]string{"profile", "-size", "300x200"}, "machine"},
		{[]string{"profile", "-machine", "lathe", "-size", "300x200"}, "machine"},
		{[]string{"profile", "-machine", "router", "-size", "300x200", "-depth", "6"}, "tool"},
		{[]string{"profile", "-machine", "router", "-size", "300x200", "-tool", "6"}, "depth"},
		{r("-tool", "0"), "tool"},
		{r("-tool", "-6"), "tool"},
		{r("-depth", "0"), "depth"},
		{r("-depth", "-3"), "depth"},
		{r("-stepdown", "0"), "stepdown"},
		{r("-stepdown", "-1"), "stepdown"},
		{r("-feed", "0"), "feed"},
		{r("-feed", "-100"), "feed"},
		{r("-plunge", "0"), "plunge"},
		{r("-rpm", "0"), "rpm"},
		{r("-safe-z", "0"), "safe-z"},
		{r("-tabs", "2", "-tab-height", "6"), "tab-height"}, // as tall as the depth
		{r("-tabs", "2", "-tab-height", "8"), "tab-height"}, // taller
		{r("-tabs", "200", "-tab-width", "6"), "tab-width"}, // they would overlap
		{r("-tab-width", "5"), "tab-width"},                 // no tabs
		{r("-tabs", "-1"), "tabs"},
		{r("-side", "inside", "-tool", "300"), "tool"}, // b²/a = 66.7: at most 133.2
		{r("-side", "inside", "-lead", "80"), "lead"},  // no room for the lead arc
		{r("-side", "middle"), "side"},
		{r("-direction", "sideways"), "direction"},
		{r("-ramp", "90"), "ramp"},
		{r("-ramp", "3", "-ramp-length", "20"), "ramp-length"},
		{r("-ramp-length", "1e6"), "ramp-length"}, // longer than a turn
		{r("-lead", "-2"), "lead"},
		{r("-tol", "0"), "tol"},
		{r("-tol", "NaN"), "tol"},
		{r("-geometry", "spline"), "geometry"},
		{r("-start", "NaN"), "start"},
		{r("-travel", "0,0,100,100"), "travel"},            // the part is 300 wide about 0,0
		{r("-travel", "-400,-300,400,300,0,10"), "travel"}, // cuts to Z-6, below Z0
		{r("-travel", "1,2,3"), "travel"},
		{r("-travel", "400,300,-400,-300"), "travel"},
		{l("-kerf", "0"), "kerf"},
		{l("-kerf", "-0.2"), "kerf"},
		{l("-power", "0"), "power"},
		{l("-power", "-5"), "power"},
		{l("-passes", "0"), "passes"},
		{l("-feed", "0"), "feed"},
		{l("-dwell", "-1"), "dwell"},
		{[]string{"profile", "-machine", "laser", "-size", "300x200", "-power", "500"}, "kerf"},
		{[]string{"profile", "-machine", "laser", "-size", "300x200", "-kerf", "0.2"}, "power"},
		{[]string{"profile", "-machine", "plotter", "-size", "300x200", "-pen-up", "0"}, "pen-up"},
		{[]string{"profile", "-machine", "plotter", "-size", "300x10", "-side", "inside", "-tol", "0.5"}, "tol"}, // b²/a = 0.167
		{[]string{"profile", "-machine", "plotter", "-size", "300x200", "-feed", "0"}, "feed"},
	})
}

// A tool too large for an inside cut is refused with the limit
// 2·(b²/a − tol) in the message.
func TestProfileNamesTheLargestInsideTool(t *testing.T) {
	// 300 x 200: a = 150, b = 100, b²/a = 66.67; less the 0.05 tolerance,
	// times two: 133.2333.
	res := runFoci(t, "profile", "-machine", "router", "-size", "300x200", "-side", "inside", "-tool", "140", "-depth", "5")
	want := 2 * (100.0*100/150 - 0.05)
	if res.code != 2 || !strings.Contains(res.stderr, "-tool:") || !strings.Contains(res.stderr, strconv.FormatFloat(want, 'g', 10, 64)[:7]) {
		t.Errorf("exit %d, %q: want -tool named with the limit %.7g", res.code, res.stderr, want)
	}
}
