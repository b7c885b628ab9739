package toolpath

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// The crossing of a folded inward parallel curve with the major axis, in
// closed form, against two routes that do not use it: bisection for the
// parameter where p(t) − δ·n(t) reaches the axis (package ellipse's point
// and normal), and the exact distance of the corner from the wall
// (Eberly's method), which must be δ since the corner's nearest wall
// points are the two feet t* and −t*.
func TestPocketCrossingOnTheMajorAxis(t *testing.T) {
	for _, c := range []struct {
		w, h, rot float64
		deltas    []float64 // as fractions of the way from b²/a to b
	}{
		{400, 40, 0, []float64{0.001, 0.1, 0.5, 0.9, 0.999}},
		{260, 420, 0.4, []float64{0.01, 0.3, 0.7, 0.99}}, // the major axis on the own y axis
		{300, 200, -1, []float64{0.05, 0.5, 0.95}},
		{200, 192, 0.2, []float64{0.2, 0.8}}, // nearly round
	} {
		e, err := ellipse.FromSize(c.w, c.h, ellipse.Point{X: 12, Y: -7}, c.rot)
		if err != nil {
			t.Fatal(err)
		}
		g, err := newPocketGeom(e)
		if err != nil {
			t.Fatal(err)
		}
		a, b := e.SemiMajor(), e.SemiMinor()
		fold := b * b / a
		m := g.e
		for _, u := range c.deltas {
			d := fold + u*(b-fold)
			// Signed height above the major axis of the parallel point.
			height := func(t float64) float64 {
				p, n := m.PointAt(t), m.Normal(t)
				q := ellipse.Point{X: p.X - d*n.X, Y: p.Y - d*n.Y}
				ctr := m.Center()
				ang := m.MajorAngle()
				return -math.Sin(ang)*(q.X-ctr.X) + math.Cos(ang)*(q.Y-ctr.Y)
			}
			lo, hi := 1e-12, math.Pi/2 // below the axis near 0, above at π/2
			for i := 0; i < 200 && hi-lo > 1e-15; i++ {
				mid := 0.5 * (lo + hi)
				if height(mid) < 0 {
					lo = mid
				} else {
					hi = mid
				}
			}
			ts := g.crossing(d)
			if math.Abs(ts-lo) > 1e-9 {
				t.Errorf("%gx%g, δ %g: t* = %.12g, bisection %.12g", c.w, c.h, d, ts, lo)
			}
			x := g.cornerX(d)
			corner := g.axis(x)
			if got := -e.SignedDistance(ellipse.Point{X: corner.x, Y: corner.y}); math.Abs(got-d) > 1e-9*a {
				t.Errorf("%gx%g, δ %g: the corner at x = %g is %.12g from the wall, want δ", c.w, c.h, d, x, got)
			}
		}
		// The ends of the medial axis are the centres of curvature of the
		// ends of the major axis: b²/a from the wall.
		end := g.axis(g.spineHalf(0))
		if got := -e.SignedDistance(ellipse.Point{X: end.x, Y: end.y}); math.Abs(got-fold) > 1e-9*a {
			t.Errorf("%gx%g: the end of the medial axis is %.12g from the wall, want b²/a = %.12g", c.w, c.h, got, fold)
		}
		// Special cases: nothing folds up to b²/a; the curve shrinks to
		// the centre at b.
		if g.crossing(fold) != 0 || g.crossing(0.5*fold) != 0 || g.crossing(b) != math.Pi/2 || math.Abs(g.cornerX(b)) > 1e-9*a {
			t.Errorf("%gx%g: crossing(b²/a) %g, crossing(b) %g, corner at b %g", c.w, c.h, g.crossing(fold), g.crossing(b), g.cornerX(b))
		}
		if math.Abs(g.cornerX(fold)-g.spineHalf(0)) > 1e-12*a {
			t.Errorf("%gx%g: at the fold the tip %g and the end of the medial axis %g differ", c.w, c.h, g.cornerX(fold), g.spineHalf(0))
		}
	}
}

// A trimmed ring is a simple closed convex polygon: every vertex lies on
// the parallel curve at δ plus the rounding allowance, measured by the
// exact distance from the wall, every chord stays within [δ, δ + Tol] of
// the wall, and the polygon turns once, always the same way.
func TestPocketTrimmedRingIsSimpleAndInItsZone(t *testing.T) {
	e, err := ellipse.FromSize(300, 60, ellipse.Point{X: 5, Y: 5}, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	for _, cw := range []bool{false, true} {
		for _, side := range []float64{1, -1} {
			p, err := PocketSpec{Setup: Setup{Machine: Router, Tol: 0.05, SafeZ: 5}, Ellipse: e, Tool: 6, Depth: 1, StepDown: 1, StepOver: 2, Direction: map[bool]Direction{false: Climb, true: Conventional}[cw]}.plan()
			if err != nil {
				t.Fatal(err)
			}
			for _, d := range []float64{p.Fold - 0.02, p.Fold + 0.5, 10, 25, 29.5} {
				start := Path{{Kind: Line, End: Point{X: 5, Y: 5, Z: -1}}}
				ring, err := p.trimmedRing(start, d, side, -1)
				if err != nil {
					t.Fatal(err)
				}
				ring = ring[1:]
				if ring[0].Role == Link {
					ring = ring[1:]
				}
				turn := 0.0
				for i, s := range ring {
					for _, q := range []Point{s.Start, s.End} {
						got := -e.SignedDistance(ellipse.Point{X: q.X, Y: q.Y})
						if got < d-1e-9 || got > d+p.round+1e-9 {
							t.Errorf("cw %v side %g δ %g: vertex %d is %.9g from the wall, want δ + %g", cw, side, d, i, got, p.round)
						}
					}
					mid := s.At(0.5)
					if got := -e.SignedDistance(ellipse.Point{X: mid.X, Y: mid.Y}); got < d || got > d+p.s.Tol {
						t.Errorf("cw %v side %g δ %g: chord %d's middle is %.9g from the wall, outside [δ, δ + Tol]", cw, side, d, i, got)
					}
					next := ring[(i+1)%len(ring)]
					a := math.Atan2(s.End.Y-s.Start.Y, s.End.X-s.Start.X)
					b := math.Atan2(next.End.Y-next.Start.Y, next.End.X-next.Start.X)
					dt := math.Remainder(b-a, 2*math.Pi)
					if (dt < -1e-12) != cw && math.Abs(dt) > 1e-12 {
						t.Errorf("cw %v side %g δ %g: the polygon turns %g at vertex %d, the wrong way", cw, side, d, dt, i)
					}
					turn += dt
				}
				if math.Abs(math.Abs(turn)-2*math.Pi) > 1e-9 {
					t.Errorf("cw %v side %g δ %g: the polygon turns %g in all, want once", cw, side, d, turn)
				}
				if ring[0].Start != ring[len(ring)-1].End {
					t.Errorf("cw %v side %g δ %g: the ring does not close", cw, side, d)
				}
				want := p.g.axis(side * p.g.cornerX(d+p.round))
				if ring[0].Start.X != want.x || ring[0].Start.Y != want.y {
					t.Errorf("cw %v side %g δ %g: starts at %v, want the corner %v", cw, side, d, ring[0].Start, want)
				}
			}
		}
	}
}

func TestPocketPlanLayout(t *testing.T) {
	e, err := ellipse.FromSize(300, 200, ellipse.Point{}, 0)
	if err != nil {
		t.Fatal(err)
	}
	base := PocketSpec{Setup: Setup{Machine: Router, Tol: 0.05, SafeZ: 5}, Ellipse: e, Tool: 6, Depth: 10, StepDown: 4, StepOver: 2.4, Allowance: 0.3}
	for _, c := range []struct {
		name   string
		change func(s *PocketSpec)
		levels []float64
		first  float64
		hmax   float64
	}{
		// 10 at most 4 a level: 3 levels of 10/3.
		{"default", func(s *PocketSpec) {}, []float64{-10.0 / 3, -20.0 / 3, -10}, 3.3, 2.4},
		// 12 at 3: exactly 4.
		{"exact levels, no allowance", func(s *PocketSpec) { s.Depth, s.StepDown, s.Allowance = 12, 3, 0 }, []float64{-3, -6, -9, -12}, 3, 2.4},
		// The full diameter is capped at Tool − Tol.
		{"full step-over", func(s *PocketSpec) { s.StepOver = 6 }, []float64{-10.0 / 3, -20.0 / 3, -10}, 3.3, 5.95},
	} {
		s := base
		c.change(&s)
		p, err := PlanPocket(s)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if len(p.Levels) != len(c.levels) {
			t.Errorf("%s: levels %v, want %v", c.name, p.Levels, c.levels)
		}
		for i := range p.Levels {
			if i < len(c.levels) && math.Abs(p.Levels[i]-c.levels[i]) > 1e-12 {
				t.Errorf("%s: levels %v, want %v", c.name, p.Levels, c.levels)
			}
		}
		if p.Levels[len(p.Levels)-1] != -s.Depth {
			t.Errorf("%s: the last level is %.17g, not exactly -Depth", c.name, p.Levels[len(p.Levels)-1])
		}
		if p.Rings[0] != c.first {
			t.Errorf("%s: the first ring is at %g, want the tool radius plus the allowance %g", c.name, p.Rings[0], c.first)
		}
		last := p.Rings[len(p.Rings)-1]
		if math.Abs(last-(100-c.hmax)) > 1e-9 {
			t.Errorf("%s: the last ring is at %g, want b less a step, %g", c.name, last, 100-c.hmax)
		}
		for i := 1; i < len(p.Rings); i++ {
			if d := p.Rings[i] - p.Rings[i-1]; d > c.hmax*(1+1e-12) || math.Abs(d-p.Spacing) > 1e-9 {
				t.Errorf("%s: rings %d and %d are %g apart, want equal steps %g of at most %g", c.name, i-1, i, d, p.Spacing, c.hmax)
			}
		}
		// One ring fewer would need a wider step.
		if n := len(p.Rings) - 1; n > 1 && (last-c.first)/float64(n-1) <= c.hmax {
			t.Errorf("%s: %d rings where %d would do", c.name, n+1, n)
		}
		if p.Wall != 3 || math.Abs(p.Fold-100.0*100/150) > 1e-12 || math.Abs(p.Spine-(150*150-100*100)/150.0) > 1e-12 || p.HelixRadius != 0 {
			t.Errorf("%s: wall %g, fold %g, spine %g, helix %g", c.name, p.Wall, p.Fold, p.Spine, p.HelixRadius)
		}
	}
	// A circle has no spine to ramp along: a helix of half the tool
	// radius about the centre.
	round, _ := ellipse.FromSize(100, 100, ellipse.Point{}, 0)
	s := base
	s.Ellipse = round
	if p, err := PlanPocket(s); err != nil || p.Spine != 0 || p.HelixRadius != 1.5 {
		t.Errorf("circle: spine %g, helix %g, %v", p.Spine, p.HelixRadius, err)
	}
}

func TestPocketRefusals(t *testing.T) {
	e, err := ellipse.FromSize(300, 200, ellipse.Point{}, 0)
	if err != nil {
		t.Fatal(err)
	}
	base := PocketSpec{Setup: Setup{Machine: Router, Tol: 0.05, SafeZ: 5}, Ellipse: e, Tool: 6, Depth: 10, StepDown: 4, StepOver: 2.4, Allowance: 0.3}
	for _, c := range []struct {
		name   string
		change func(s *PocketSpec)
		field  string
		err    error
		limit  float64 // NaN: no limit
	}{
		{"laser", func(s *PocketSpec) { s.Machine, s.SafeZ = Laser, 0 }, "Machine", ErrPocketMachine, math.NaN()},
		{"no tool", func(s *PocketSpec) { s.Tool = 0 }, "Tool", ErrNotPositive, math.NaN()},
		{"tool below two tolerances", func(s *PocketSpec) { s.Tool, s.StepOver = 0.09, 0.05 }, "Tool", ErrPocketToolTooSmall, 0.1},
		// The minor axis is 200: at most 200 − 3·0.05.
		{"tool as wide as the minor axis", func(s *PocketSpec) { s.Tool, s.StepOver = 200, 50 }, "Tool", ErrPocketToolTooWide, 199.85},
		{"tool just too wide", func(s *PocketSpec) { s.Tool, s.StepOver = 199.9, 50 }, "Tool", ErrPocketToolTooWide, 199.85},
		{"zero depth", func(s *PocketSpec) { s.Depth = 0 }, "Depth", ErrNotPositive, math.NaN()},
		{"negative depth", func(s *PocketSpec) { s.Depth = -3 }, "Depth", ErrNotPositive, math.NaN()},
		{"NaN depth", func(s *PocketSpec) { s.Depth = math.NaN() }, "Depth", ErrNotFinite, math.NaN()},
		{"zero step-down", func(s *PocketSpec) { s.StepDown = 0 }, "StepDown", ErrNotPositive, math.NaN()},
		{"zero step-over", func(s *PocketSpec) { s.StepOver = 0 }, "StepOver", ErrNotPositive, math.NaN()},
		{"step-over above the diameter", func(s *PocketSpec) { s.StepOver = 6.01 }, "StepOver", ErrPocketStepOver, 6},
		{"step-over below the tolerance", func(s *PocketSpec) { s.StepOver = 0.04 }, "StepOver", ErrPocketStepOver, 0.05},
		{"allowance below three tolerances", func(s *PocketSpec) { s.Allowance = 0.1 }, "Allowance", ErrPocketAllowance, 0.15},
		{"allowance above the step-over", func(s *PocketSpec) { s.Allowance = 2.5 }, "Allowance", ErrPocketAllowance, 2.4},
		{"negative allowance", func(s *PocketSpec) { s.Allowance = -1 }, "Allowance", ErrNegative, math.NaN()},
		{"vertical ramp", func(s *PocketSpec) { s.RampAngle = math.Pi / 2 }, "RampAngle", ErrChoice, math.Pi / 2},
		{"too shallow a ramp", func(s *PocketSpec) { s.RampAngle = 1e-12 }, "RampAngle", ErrTooMany, math.NaN()},
		{"too many levels", func(s *PocketSpec) { s.StepDown = 1e-6 }, "StepDown", ErrTooMany, math.NaN()},
		{"unknown direction", func(s *PocketSpec) { s.Direction = 7 }, "Direction", ErrChoice, math.NaN()},
		{"no safe height", func(s *PocketSpec) { s.SafeZ = 0 }, "SafeZ", ErrNotPositive, math.NaN()},
		{"no ellipse", func(s *PocketSpec) { s.Ellipse = ellipse.Ellipse{} }, "Ellipse", ErrNotPositive, math.NaN()},
	} {
		s := base
		c.change(&s)
		dst := Path{{Kind: Line}}
		out, err := Pocket(dst, s)
		var oe *OpError
		if !errors.As(err, &oe) || oe.Field != c.field || !errors.Is(err, c.err) {
			t.Errorf("%s: %v, want %s: %v", c.name, err, c.field, c.err)
			continue
		}
		if !math.IsNaN(c.limit) && (!oe.HasLimit || math.Abs(oe.Limit-c.limit) > 1e-12*math.Max(1, c.limit)) {
			t.Errorf("%s: limit %g (%v), want %g", c.name, oe.Limit, oe.HasLimit, c.limit)
		}
		if len(out) != 1 {
			t.Errorf("%s: dst changed to %d segments", c.name, len(out))
		}
	}
	// A tolerance too fine for the decimals is the approximation's error.
	s := base
	s.Tol, s.Decimals = 1e-4, 3
	if _, err := Pocket(nil, s); !errors.Is(err, ErrDecimals) {
		t.Errorf("tolerance 1e-4 at 3 decimals: %v, want ErrDecimals", err)
	}
}

// Pocket appends to dst and leaves what was there.
func TestPocketAppends(t *testing.T) {
	e, _ := ellipse.FromSize(120, 80, ellipse.Point{}, 0)
	s := PocketSpec{Setup: Setup{Machine: Router, Tol: 0.05, SafeZ: 5}, Ellipse: e, Tool: 6, Depth: 3, StepDown: 3, StepOver: 3}
	alone, err := Pocket(nil, s)
	if err != nil {
		t.Fatal(err)
	}
	head := Path{{Kind: Line, Motion: Travel, End: Point{Z: 5}}}
	both, err := Pocket(head, s)
	if err != nil {
		t.Fatal(err)
	}
	if len(both) != len(alone)+1 || both[0] != head[0] || both[1].Start != head[0].End {
		t.Fatalf("appended %d segments after 1, want %d, starting from the end of dst", len(both), len(alone)+1)
	}
	for i := 2; i < len(both); i++ {
		if both[i] != alone[i-1] {
			t.Fatalf("segment %d differs when appended: %+v vs %+v", i, both[i], alone[i-1])
		}
	}
}
