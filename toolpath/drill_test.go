package toolpath

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"pgregory.net/rapid"
)

// holeSites returns the XY position of every hole, mark or dot of a Drill
// path, once each, in order: where a Cut move with Role Hole happens.
func holeSites(p Path) []Point {
	var out []Point
	for _, g := range p {
		if g.Motion != Cut || g.Role != Hole || movesXY(g) {
			continue
		}
		q := Point{g.End.X, g.End.Y, 0}
		if n := len(out); n > 0 && out[n-1] == q {
			continue // the next peck of the same hole
		}
		out = append(out, q)
	}
	return out
}

// checkSpacing checks that sites lie on curve c, the first at parameter 0,
// and follow each other at arc length L/n (counter-clockwise, or clockwise
// when cw).
func checkSpacing(t opsTB, c ellipse.Parallel, sites []Point, n int, cw bool) {
	t.Helper()
	e := c.Ellipse()
	l := c.Length()
	if len(sites) != n {
		t.Fatalf("%d sites, want %d", len(sites), n)
	}
	slack := 1e-9 * (e.SemiMajor() + math.Abs(c.Offset()))
	for i, q := range sites {
		if d := e.SignedDistance(ellipse.Point{X: q.X, Y: q.Y}) - c.Offset(); math.Abs(d) > slack {
			t.Errorf("site %d is %g off the curve", i, d)
		}
	}
	if p0 := c.PointAt(0); math.Hypot(sites[0].X-p0.X, sites[0].Y-p0.Y) > slack {
		t.Errorf("first site %+v is not at parameter 0 %+v", sites[0], p0)
	}
	for i := 1; i < len(sites); i++ {
		ta := footParam(e, sites[i-1])
		tb := footParam(e, sites[i])
		d := math.Mod(tb-ta+4*math.Pi, 2*math.Pi)
		if cw {
			d = math.Mod(ta-tb+4*math.Pi, 2*math.Pi)
		}
		var s float64
		if cw {
			s = c.ArcLength(tb, tb+d)
		} else {
			s = c.ArcLength(ta, ta+d)
		}
		if math.Abs(s-l/float64(n)) > 1e-9*l {
			t.Errorf("sites %d and %d are %g apart along the curve, want %g", i-1, i, s, l/float64(n))
		}
	}
}

func TestDrillRouterPecks(t *testing.T) {
	e := opsShapes(t)["mirror"]
	cases := []struct {
		name string
		spec DrillSpec
	}{
		{"pecks to safe height", DrillSpec{Count: 12, Depth: 10, Peck: 3}},
		{"pecks to just above", DrillSpec{Count: 7, Depth: 9, Peck: 3, PeckRetract: 1, Offset: 20}},
		{"one feed", DrillSpec{Count: 5, Depth: 4, Clockwise: true, Offset: -40}},
		{"one hole", DrillSpec{Count: 1, Depth: 2, Peck: 0.5}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := c.spec
			s.Setup = Setup{Machine: Router, Tol: 0.02, SafeZ: 5, PlungeFeed: 250}
			s.Ellipse = e
			p, err := Drill(nil, s)
			if err != nil {
				t.Fatal(err)
			}
			checkContinuous(t, p)
			checkTravels(t, s.Setup, p)
			curve, _ := e.Parallel(s.Offset)
			checkSpacing(t, curve, holeSites(p), s.Count, s.Clockwise)
			retract := s.PeckRetract
			if retract == 0 {
				retract = s.SafeZ
			}
			wantPecks := 1
			if s.Peck > 0 {
				wantPecks = int(math.Ceil(s.Depth/s.Peck - 1e-9))
			}
			// Walk each hole: feeds straight down, each deeper than the
			// last by the same step, none by more than Peck, the last at
			// −Depth, the tool back at PeckRetract between pecks.
			pecks, bottom := 0, 0.0
			for i, g := range p {
				switch {
				case g.Motion == Cut:
					if movesXY(g) || g.Kind != Line || g.End.Z >= g.Start.Z || g.Role != Hole {
						t.Fatalf("segment %d is not a feed straight down: %+v", i, g)
					}
					if g.Feed != 250 {
						t.Errorf("peck %d at feed %g, want the plunge feed 250", i, g.Feed)
					}
					if g.Start.Z != retract {
						t.Errorf("peck %d starts at Z %g, not at the retract height %g", i, g.Start.Z, retract)
					}
					step := bottom - g.End.Z
					if want := s.Depth / float64(wantPecks); math.Abs(step-want) > 1e-9*s.Depth {
						t.Errorf("peck %d steps %g, want %g", i, step, want)
					}
					pecks++
					bottom = g.End.Z
				case g.End.Z == s.SafeZ && g.Start.Z < s.SafeZ && !movesXY(g) && (i == len(p)-1 || p[i+1].Motion == Travel):
					// Leaving the hole.
					if pecks != wantPecks || bottom != -s.Depth {
						t.Errorf("hole left after %d pecks at Z %g, want %d to %g", pecks, bottom, wantPecks, -s.Depth)
					}
					pecks, bottom = 0, 0
				}
			}
		})
	}
}

func TestDrillLaserMarksAndPlotterDots(t *testing.T) {
	e := opsShapes(t)["tray"]
	laser := DrillSpec{Setup: Setup{Machine: Laser, Tol: 0.01, FocusZ: 1.5}, Ellipse: e, Count: 9, MarkSeconds: 0.3, Offset: -10}
	p, err := Drill(nil, laser)
	if err != nil {
		t.Fatal(err)
	}
	checkContinuous(t, p)
	checkTravels(t, laser.Setup, p)
	curve, _ := e.Parallel(-10)
	checkSpacing(t, curve, holeSites(p), 9, false)
	for i, g := range p {
		if g.Motion == Cut && (g.Kind != Dwell || g.Seconds != 0.3 || g.Role != Hole) {
			t.Errorf("laser segment %d cuts but is not a 0.3 s mark: %+v", i, g)
		}
		if g.Kind == Dwell && (i == 0 || p[i-1].Motion != Travel) {
			t.Errorf("mark %d not reached by a travel", i)
		}
		if g.Start.Z != 1.5 || g.End.Z != 1.5 {
			t.Errorf("laser segment %d leaves the focus height", i)
		}
	}

	plotter := DrillSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, Ellipse: e, Count: 16, Clockwise: true}
	p, err = Drill(nil, plotter)
	if err != nil {
		t.Fatal(err)
	}
	checkContinuous(t, p)
	checkTravels(t, plotter.Setup, p)
	checkSpacing(t, e.Curve(), holeSites(p), 16, true)
	for i, g := range p {
		if g.Motion == Cut && (movesXY(g) || g.End.Z != 0 || g.Start.Z != 3) {
			t.Errorf("plotter segment %d draws but is not a dot: %+v", i, g)
		}
		if g.Motion == Cut && p[i+1].End.Z != 3 {
			t.Errorf("pen not lifted after dot %d", i)
		}
	}
}

func TestDrillRefusals(t *testing.T) {
	e := opsShapes(t)["slot"] // b²/a = 7.5
	router := Setup{Machine: Router, Tol: 0.05, SafeZ: 5}
	cases := []struct {
		name  string
		spec  DrillSpec
		field string
		err   error
	}{
		{"no holes", DrillSpec{Setup: router, Ellipse: e, Count: 0, Depth: 3}, "Count", ErrCount},
		{"too many holes", DrillSpec{Setup: router, Ellipse: e, Count: MaxCount + 1, Depth: 3}, "Count", ErrTooMany},
		{"no depth", DrillSpec{Setup: router, Ellipse: e, Count: 3}, "Depth", ErrNotPositive},
		{"negative peck", DrillSpec{Setup: router, Ellipse: e, Count: 3, Depth: 3, Peck: -1}, "Peck", ErrNegative},
		{"retract above safe", DrillSpec{Setup: router, Ellipse: e, Count: 3, Depth: 3, Peck: 1, PeckRetract: 6}, "PeckRetract", ErrAboveSafe},
		{"mark time on a router", DrillSpec{Setup: router, Ellipse: e, Count: 3, Depth: 3, MarkSeconds: 1}, "MarkSeconds", ErrNotForMachine},
		{"offset past the fold", DrillSpec{Setup: router, Ellipse: e, Count: 3, Depth: 3, Offset: -8}, "Offset", ellipse.ErrOffsetLimit},
		{"laser without mark time", DrillSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Count: 3}, "MarkSeconds", ErrNotPositive},
		{"laser with depth", DrillSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Count: 3, MarkSeconds: 1, Depth: 2}, "Depth", ErrNotForMachine},
		{"plotter with peck", DrillSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 2}, Ellipse: e, Count: 3, Peck: 1}, "Peck", ErrNotForMachine},
		{"plotter pen heights", DrillSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: -1}, Ellipse: e, Count: 3}, "PenUp", ErrPenHeights},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := Drill(nil, c.spec)
			if len(p) != 0 {
				t.Errorf("refused spec gave %d segments", len(p))
			}
			var oe *OpError
			if !errors.As(err, &oe) || oe.Field != c.field || !errors.Is(err, c.err) {
				t.Errorf("got %v, want field %s and %v", err, c.field, c.err)
			}
		})
	}
}

// Over random shapes, offsets, counts and machines, the holes lie on the
// curve at equal arc length from parameter 0, every travel in XY is at
// the travel height, and the path is continuous.
func TestDrillPropertySpacingAndSafety(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		off := rapid.Float64Range(-0.9, 3).Draw(t, "offsetShare") * e.MinRadiusOfCurvature()
		s := DrillSpec{Ellipse: e, Offset: off, Count: rapid.IntRange(1, 60).Draw(t, "count"), Clockwise: rapid.Bool().Draw(t, "cw")}
		s.Tol = 0.05
		switch s.Machine = Machine(rapid.IntRange(1, 3).Draw(t, "machine")); s.Machine {
		case Router:
			s.SafeZ = rapid.Float64Range(1, 20).Draw(t, "safeZ")
			s.Depth = rapid.Float64Range(0.1, 40).Draw(t, "depth")
			if rapid.Bool().Draw(t, "pecking") {
				s.Peck = s.Depth * rapid.Float64Range(0.02, 1.2).Draw(t, "peckShare")
			}
			s.PeckRetract = s.SafeZ * rapid.Float64Range(0, 1).Draw(t, "retractShare")
		case Laser:
			s.MarkSeconds = rapid.Float64Range(0.01, 5).Draw(t, "seconds")
		default:
			s.PenUp = rapid.Float64Range(0.5, 10).Draw(t, "penUp")
		}
		p, err := Drill(nil, s)
		if err != nil {
			t.Fatalf("valid spec refused: %v", err)
		}
		checkContinuous(t, p)
		checkTravels(t, s.Setup, p)
		c, _ := e.Parallel(off)
		checkSpacing(t, c, holeSites(p), s.Count, s.Clockwise)
		if s.Machine == Router {
			if lo, _, _ := p.ZRange(); lo != -s.Depth {
				t.Errorf("deepest point %g, want %g", lo, -s.Depth)
			}
		}
	})
}
