package main

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// markPoint is a hole, mark or dot read back from a program: where it is,
// the lowest Z it reached, the feeds down it took and the dwell there.
type markPoint struct {
	x, y, low float64
	downs     []float64 // the Z each feed move down ended at
	seconds   float64
	speed     float64
}

// marksOf reads the holes, marks or dots of a program back: router and
// plotter feed moves straight down, laser dwells with the beam on.
func marksOf(t *testing.T, src []byte, m conformance.Machine) []markPoint {
	t.Helper()
	p, err := conformance.Read(src, conformance.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var pts []markPoint
	for i, s := range p.Path {
		mv := p.Moves[i]
		var at bool
		switch m {
		case conformance.Laser:
			at = s.Kind == toolpath.Dwell && mv.Spindle != conformance.SpindleOff && mv.Speed > 0
		default:
			at = s.Kind == toolpath.Line && mv.Code == 1 && s.Start.X == s.End.X && s.Start.Y == s.End.Y && s.End.Z < s.Start.Z
		}
		if !at {
			continue
		}
		if n := len(pts); n == 0 || pts[n-1].x != s.End.X || pts[n-1].y != s.End.Y {
			pts = append(pts, markPoint{x: s.End.X, y: s.End.Y, low: math.Inf(1)})
		}
		q := &pts[len(pts)-1]
		q.low = math.Min(q.low, s.End.Z)
		if s.Kind == toolpath.Dwell {
			q.seconds += s.Seconds
			q.speed = mv.Speed
		} else {
			q.downs = append(q.downs, s.End.Z)
		}
	}
	return pts
}

// checkSpacing checks that pts lie on curve (within slack) at equal arc
// length L/n, the first at the curve's parameter 0, counter-clockwise.
func checkSpacing(t *testing.T, name string, pts []markPoint, curve ellipse.Parallel, n int, slack float64) {
	t.Helper()
	if len(pts) != n {
		t.Errorf("%s: %d points, want %d", name, len(pts), n)
		return
	}
	el := curve.Ellipse()
	want := curve.Length() / float64(n)
	p0 := curve.PointAt(0)
	if math.Hypot(pts[0].x-p0.X, pts[0].y-p0.Y) > slack {
		t.Errorf("%s: the first point is (%g, %g), want the end of the own +x semi-axis (%g, %g)", name, pts[0].x, pts[0].y, p0.X, p0.Y)
	}
	ts := make([]float64, n)
	for i, p := range pts {
		foot, d := el.Nearest(ellipse.Point{X: p.x, Y: p.y})
		if dev := d - curve.Offset(); math.Abs(dev) > slack {
			t.Errorf("%s: point %d at (%g, %g) is %g off the curve", name, i, p.x, p.y, dev)
		}
		ts[i] = foot
	}
	for i := range ts {
		a, b := ts[i], ts[(i+1)%n]
		for b <= a {
			b += 2 * math.Pi
		}
		if n == 1 {
			break
		}
		if got := curve.ArcLength(a, b); math.Abs(got-want) > 4*slack {
			t.Errorf("%s: points %d and %d are %g apart along the curve, want %g", name, i, (i+1)%n, got, want)
		}
	}
}

func TestDrillProgramsPassTheChecksAndSpaceThePoints(t *testing.T) {
	for _, units := range []string{"mm", "inch"} {
		k, safe, up := 1.0, 5.0, 3.0
		if units == "inch" {
			k, safe, up = 1/25.4, 0.2, 0.12
		}
		for _, sh := range shapes {
			for _, off := range []float64{0, 8, -1.5} {
				w, h, cx, cy := sh.w*k, sh.h*k, sh.cx*k, sh.cy*k
				curve := curveOf(t, w, h, cx, cy, sh.rot, off*k)
				base := append(append([]string{"drill"}, shapeArgs(w, h, cx, cy, sh.rot, units)...), "-offset", fmt.Sprint(off*k), "-count", "7")
				g := fmt.Sprint
				for _, c := range []struct {
					machine string
					cm      conformance.Machine
					safeZ   float64
					extra   []string
					pecks   int
				}{
					{"router", conformance.Router, safe, []string{"-depth", g(6 * k)}, 1},
					{"router", conformance.Router, safe, []string{"-depth", g(6 * k), "-peck", g(2.5 * k), "-retract", g(1 * k)}, 3},
					{"laser", conformance.Laser, 0, []string{"-power", "250", "-dwell", "0.3"}, 0},
					{"plotter", conformance.Plotter, up, nil, 1},
				} {
					args := append(with(base, "-machine", c.machine), c.extra...)
					name := strings.Join(args[1:], " ")
					src, _ := runToFile(t, args...)
					checkProgram(t, name, src, conformance.Rules{Machine: c.cm, SafeZ: c.safeZ})
					pts := marksOf(t, src, c.cm)
					u, _ := parseUnits(units)
					unit := math.Pow(10, -float64(programDecimals(0.05*k, u))) // the last written place
					checkSpacing(t, name, pts, curve, 7, 2*unit)
					for i, p := range pts {
						switch c.cm {
						case conformance.Router:
							if math.Abs(p.low+6*k) > unit/2 || len(p.downs) != c.pecks {
								t.Errorf("%s: hole %d reaches %g in %d feeds, want %g in %d", name, i, p.low, len(p.downs), -6*k, c.pecks)
							}
						case conformance.Laser:
							if p.seconds != 0.3 || p.speed != 250 {
								t.Errorf("%s: mark %d: %g s at S%g, want 0.3 s at S250", name, i, p.seconds, p.speed)
							}
						case conformance.Plotter:
							if p.low != 0 {
								t.Errorf("%s: dot %d down to %g, want the paper at 0", name, i, p.low)
							}
						}
					}
				}
			}
		}
	}
}

func TestDrillRefusesBadInput(t *testing.T) {
	r := []string{"drill", "-machine", "router", "-size", "300x200", "-count", "6", "-depth", "5"}
	l := []string{"drill", "-machine", "laser", "-size", "300x200", "-count", "6", "-power", "200"}
	p := []string{"drill", "-machine", "plotter", "-size", "300x200", "-count", "6"}
	testRefusals(t, []refusal{
		{[]string{"drill", "-size", "300x200", "-count", "6"}, "machine"},
		{[]string{"drill", "-machine", "mill", "-size", "300x200", "-count", "6"}, "machine"},
		{[]string{"drill", "-machine", "plotter", "-size", "300x200"}, "count"},
		{with(p, "-count", "0"), "count"},
		{with(p, "-count", "-3"), "count"},
		{with(p, "-count", "2000000"), "count"},
		{with(p, "-offset", "-70"), "offset"}, // b²/a = 66.7
		{with(p, "-offset", "NaN"), "offset"},
		{[]string{"drill", "-machine", "router", "-size", "300x200", "-count", "6"}, "depth"},
		{with(r, "-depth", "0"), "depth"},
		{with(r, "-depth", "-2"), "depth"},
		{with(r, "-peck", "0"), "peck"},
		{with(r, "-peck", "-1"), "peck"},
		{with(r, "-retract", "9"), "retract"}, // above the 5 safe height
		{with(r, "-tool", "0"), "tool"},
		{with(r, "-feed", "0"), "feed"},
		{with(r, "-plunge", "-5"), "plunge"},
		{with(r, "-travel", "-100,-100,100,100"), "travel"},
		{with(l, "-dwell", "0"), "dwell"},
		{with(l, "-power", "0"), "power"},
		{with(r, "-dwell", "1"), "dwell"},
		{with(r, "-power", "1"), "power"},
		{with(r, "-pen-up", "1"), "pen-up"},
		{with(l, "-depth", "1"), "depth"},
		{with(l, "-peck", "1"), "peck"},
		{with(l, "-tool", "1"), "tool"},
		{with(l, "-rpm", "1"), "rpm"},
		{with(p, "-depth", "1"), "depth"},
		{with(p, "-dwell", "1"), "dwell"},
		{with(p, "-safe-z", "1"), "safe-z"},
	})
}
