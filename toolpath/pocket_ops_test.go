package toolpath_test

import (
	"fmt"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// pocketShape is a named outline the pocket tests run on.
type pocketShape struct {
	name              string
	w, h, cx, cy, rot float64 // full sizes, centre, degrees
}

// pocketShapes: round, nearly round, ordinary (rotated, off centre, the
// major axis along the own y axis) and very flat (b/a = 0.1 and 0.15).
var pocketShapes = []pocketShape{
	{"round", 150, 150, 0, 0, 0},
	{"nearly round", 200, 192, 10, -5, 10},
	{"ordinary", 260, 420, 250, 180, 25},
	{"flat", 400, 40, -30, 10, -60},
	{"flat tray", 300, 45, 0, 0, 90},
}

func (sh pocketShape) ellipse(t testing.TB) ellipse.Ellipse {
	t.Helper()
	e, err := ellipse.FromSize(sh.w, sh.h, ellipse.Point{X: sh.cx, Y: sh.cy}, sh.rot*math.Pi/180)
	if err != nil {
		t.Fatal(err)
	}
	return e
}

func TestPocketKeepsEveryPromise(t *testing.T) {
	for _, sh := range pocketShapes {
		for _, c := range []struct {
			name string
			spec func(s *toolpath.PocketSpec)
		}{
			{"6 mm tool, 40%, allowance", func(s *toolpath.PocketSpec) {}},
			{"lines, conventional, no allowance", func(s *toolpath.PocketSpec) {
				s.Geometry, s.Direction, s.Allowance = toolpath.Lines, toolpath.Conventional, 0
			}},
			{"12 mm tool, full step-over", func(s *toolpath.PocketSpec) { s.Tool, s.StepOver, s.Allowance = 12, 12, 0.5 }},
			{"3 mm tool, steep ramp", func(s *toolpath.PocketSpec) { s.Tool, s.StepOver, s.RampAngle = 3, 1.5, 0.3 }},
		} {
			e := sh.ellipse(t)
			s := toolpath.PocketSpec{
				Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.05, Geometry: toolpath.Arcs, SafeZ: 5},
				Ellipse: e, Tool: 6, Depth: 10, StepDown: 4, StepOver: 2.4, Allowance: 0.3,
			}
			c.spec(&s)
			if lim := 2*e.SemiMinor() - 3*s.Tol; s.Tool > lim {
				continue
			}
			p, err := toolpath.Pocket(nil, s)
			if err != nil {
				t.Errorf("%s, %s: %v", sh.name, c.name, err)
				continue
			}
			checkPocket(namedTB{t, sh.name + ", " + c.name}, s, p, 4000)
		}
	}
}

// namedTB prefixes every message with a case name.
type namedTB struct {
	testing.TB
	name string
}

func (n namedTB) Errorf(format string, args ...any) {
	n.TB.Helper()
	n.TB.Errorf("%s: %s", n.name, fmt.Sprintf(format, args...))
}

func (n namedTB) Fatalf(format string, args ...any) {
	n.TB.Helper()
	n.TB.Fatalf("%s: %s", n.name, fmt.Sprintf(format, args...))
}
