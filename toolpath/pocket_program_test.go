package toolpath_test

import (
	"bytes"
	"math"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// Pockets written by package gcodeout and read back by package
// conformance pass every rule for a router: rapids only at the safe
// height, the spindle on before cutting, feed and units set first, the
// program end last, arcs whose radii agree (NISTIR 6556 §3.5.3); and,
// where the wall pass follows a parallel curve short of the fold, the
// geometry rules against it (every move near it in its zone, one closed
// loop, the final pass covering it). Read back, the program cuts at the
// levels asked, and no cutting move comes nearer the wall than the tool
// radius less the tolerance.
func TestPocketProgramsPassConformance(t *testing.T) {
	for _, units := range []gcodeout.Units{gcodeout.MM, gcodeout.Inch} {
		k, safe := 1.0, 5.0
		if units == gcodeout.Inch {
			k, safe = 1/25.4, 0.2
		}
		for _, sh := range pocketShapes {
			e, err := ellipse.FromSize(sh.w*k, sh.h*k, ellipse.Point{X: sh.cx * k, Y: sh.cy * k}, sh.rot*math.Pi/180)
			if err != nil {
				t.Fatal(err)
			}
			tol := 0.05 * k
			cfg := gcodeout.Config{Machine: gcodeout.Router, Units: units, Tolerance: tol, Feed: 1200 * k, PlungeFeed: 300 * k, RPM: 18000, SafeZ: safe, Title: "pocket " + sh.name}
			wr, err := gcodeout.NewWriter(&bytes.Buffer{}, cfg)
			if err != nil {
				t.Fatal(err)
			}
			s := toolpath.PocketSpec{
				Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: tol, Geometry: toolpath.Arcs, Decimals: wr.Decimals(), SafeZ: safe},
				Ellipse: e, Tool: 6 * k, Depth: 9 * k, StepDown: 3 * k, StepOver: 2.5 * k, Allowance: 0.3 * k,
			}
			name := sh.name + " " + units.String()
			path, err := toolpath.Pocket(nil, s)
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			var buf bytes.Buffer
			if err := gcodeout.WritePath(&buf, cfg, path); err != nil {
				t.Fatalf("%s: the writer refuses the path: %v", name, err)
			}
			prog, err := conformance.Read(buf.Bytes(), conformance.ReadOptions{})
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			rules := conformance.Rules{Machine: conformance.Router, SafeZ: safe}
			r := s.Tool / 2
			if r+3*tol < e.MinRadiusOfCurvature() {
				wall, err := e.Parallel(-r)
				if err != nil {
					t.Fatal(err)
				}
				rules.Shape = &conformance.Shape{Curve: wall, Zone: toolpath.Inside, Tol: tol}
			}
			rep := conformance.CheckReport(prog, rules)
			for _, v := range rep.Violations {
				t.Errorf("%s: %v", name, v)
			}
			if rules.Shape != nil && (!rep.Summary.Geometry || rep.Summary.Contour == 0) {
				t.Errorf("%s: no move was checked against the wall pass's curve: %+v", name, rep.Summary)
			}
			// Levels, read back.
			n, step := toolpath.DepthPasses(s.Depth, s.StepDown)
			seen := map[int]bool{}
			for i, g := range prog.Path {
				if g.Motion == toolpath.Cut && g.Start.Z == g.End.Z && g.End.Z < 0 && pocketMovesXY(g) {
					seen[int(math.Round(-g.End.Z/step))] = true
				}
				if g.Motion == toolpath.Cut && math.Min(g.Start.Z, g.End.Z) < 0 && pocketMovesXY(g) {
					if lo := pocketLeastDistance(e, g); lo < r-tol {
						t.Errorf("%s: line %d comes %g inside the wall, less than the tool radius %g less the tolerance", name, prog.Moves[i].Line, lo, r)
					}
				}
			}
			if len(seen) != n {
				t.Errorf("%s: the program cuts at %d levels, want %d", name, len(seen), n)
			}
			if lo, _, _ := prog.Path.ZRange(); math.Abs(lo+s.Depth) > 1e-4*k {
				t.Errorf("%s: the program goes down to Z %g, want -%g", name, lo, s.Depth)
			}
			cut, _ := path.Lengths()
			if got, _ := prog.Path.Lengths(); math.Abs(got-cut) > 1e-3*cut {
				t.Errorf("%s: the program cuts %g, the path %g", name, got, cut)
			}
		}
	}
}
