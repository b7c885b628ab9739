package toolpath

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"pgregory.net/rapid"
)

func TestDashPattern(t *testing.T) {
	cases := []struct {
		length, on, off float64
		n               int
		scale           float64
	}{
		{100, 3, 2, 20, 1},             // fits exactly
		{101, 3, 2, 20, 1.01},          // 20.2 periods: stretched
		{99, 3, 2, 20, 0.99},           // 19.8 periods: shrunk
		{102.6, 3, 2, 21, 102.6 / 105}, // 20.52 periods: one more, shrunk
		{50, 40, 40, 1, 50.0 / 80},     // a period longer than the curve
		{10, 0, 1, 10, 1},              // dots
		{10, 0, 0.3, 33, 10 / 9.9},     // 33.3 dots
	}
	for _, c := range cases {
		n, dash, gap := DashPattern(c.length, c.on, c.off)
		if n != c.n {
			t.Errorf("DashPattern(%g, %g, %g): %d periods, want %d", c.length, c.on, c.off, n, c.n)
			continue
		}
		if math.Abs(dash-c.on*c.scale) > 1e-12*c.length || math.Abs(gap-c.off*c.scale) > 1e-12*c.length {
			t.Errorf("DashPattern(%g, %g, %g) = %g, %g; want scale %g", c.length, c.on, c.off, dash, gap, c.scale)
		}
		if math.Abs(float64(n)*(dash+gap)-c.length) > 1e-12*c.length {
			t.Errorf("DashPattern(%g, %g, %g): %d periods of %g do not close the length", c.length, c.on, c.off, n, dash+gap)
		}
	}
}

// strokes splits a path into its runs of cutting moves in XY.
func strokes(p Path) [][]Segment {
	var out [][]Segment
	var cur []Segment
	for _, g := range p {
		if g.Motion == Cut && movesXY(g) {
			cur = append(cur, g)
			continue
		}
		if len(cur) > 0 {
			out = append(out, cur)
			cur = nil
		}
	}
	if len(cur) > 0 {
		out = append(out, cur)
	}
	return out
}

func TestDashKeepsThePattern(t *testing.T) {
	shapes := opsShapes(t)
	cases := []struct {
		name  string
		shape string
		spec  DashSpec
	}{
		{"plotter dashes", "tray", DashSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, On: 12, Off: 6}},
		{"plotter clockwise offset", "mirror", DashSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3, Geometry: Arcs}, On: 20, Off: 10, Offset: 15, Clockwise: true}},
		{"laser dashes inward", "coaster", DashSpec{Setup: Setup{Machine: Laser, Tol: 0.01}, On: 5, Off: 2.5, Offset: -5}},
		{"router score", "slot", DashSpec{Setup: Setup{Machine: Router, Tol: 0.02, SafeZ: 4}, On: 8, Off: 4, Depth: 0.5}},
		{"long period", "knob", DashSpec{Setup: Setup{Machine: Plotter, Tol: 0.02, PenUp: 2}, On: 50, Off: 50}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := c.spec
			e := shapes[c.shape]
			s.Ellipse = e
			p, err := Dash(nil, s)
			if err != nil {
				t.Fatal(err)
			}
			checkContinuous(t, p)
			checkTravels(t, s.Setup, p)
			curve, _ := e.Parallel(s.Offset)
			l := curve.Length()
			n, dash, _ := DashPattern(l, s.On, s.Off)
			st := strokes(p)
			if len(st) != n {
				t.Fatalf("%d dashes, want %d", len(st), n)
			}
			z := -s.Depth
			switch s.Machine {
			case Plotter:
				z = s.PenDown
			case Laser:
				z = s.FocusZ
			}
			// Each dash: within the band, at the cutting height, and
			// k·L/n to k·L/n + dash along the curve.
			period := l / float64(n)
			for k, d := range st {
				for i, g := range d {
					lo, hi := deviationRange(curve, g)
					if lo < -s.Tol || hi > s.Tol {
						t.Errorf("dash %d segment %d deviates %g..%g, outside ±%g", k, i, lo, hi, s.Tol)
					}
					if g.Start.Z != z || g.End.Z != z {
						t.Errorf("dash %d segment %d at Z %g..%g, want %g", k, i, g.Start.Z, g.End.Z, z)
					}
				}
				ta, tb := footParam(e, d[0].Start), footParam(e, d[len(d)-1].End)
				idx := k
				if s.Clockwise {
					ta, tb = tb, ta
					idx = n - 1 - k
				}
				s0 := math.Mod(curve.ArcLength(0, ta)+l, l)
				if idx == 0 && s0 > l/2 {
					s0 -= l
				}
				if want := float64(idx) * period; math.Abs(s0-want) > 1e-9*l {
					t.Errorf("dash %d starts at %g along the curve, want %g", k, s0, want)
				}
				length := curve.ArcLength(ta, ta+math.Mod(tb-ta+4*math.Pi, 2*math.Pi))
				if math.Abs(length-dash) > 1e-9*l {
					t.Errorf("dash %d is %g long, want %g", k, length, dash)
				}
			}
		})
	}
}

func TestDashDots(t *testing.T) {
	e := opsShapes(t)["coaster"]
	s := DashSpec{Setup: Setup{Machine: Laser, Tol: 0.01}, Ellipse: e, Off: 7, MarkSeconds: 0.2}
	p, err := Dash(nil, s)
	if err != nil {
		t.Fatal(err)
	}
	n, _, _ := DashPattern(e.Perimeter(), 0, 7)
	checkSpacing(t, e.Curve(), holeSites(p), n, false)
	r := DashSpec{Setup: Setup{Machine: Router, Tol: 0.01, SafeZ: 3}, Ellipse: e, Off: 10, Depth: 1}
	if p, err = Dash(nil, r); err != nil {
		t.Fatal(err)
	}
	n, _, _ = DashPattern(e.Perimeter(), 0, 10)
	checkSpacing(t, e.Curve(), holeSites(p), n, false)
	checkTravels(t, r.Setup, p)
}

func TestDashRefusals(t *testing.T) {
	e := opsShapes(t)["slot"]
	plotter := Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}
	cases := []struct {
		name  string
		spec  DashSpec
		field string
		err   error
	}{
		{"no gap", DashSpec{Setup: plotter, Ellipse: e, On: 5}, "Off", ErrNotPositive},
		{"negative dash", DashSpec{Setup: plotter, Ellipse: e, On: -5, Off: 2}, "On", ErrNegative},
		{"NaN gap", DashSpec{Setup: plotter, Ellipse: e, On: 5, Off: math.NaN()}, "Off", ErrNotFinite},
		{"too many dashes", DashSpec{Setup: plotter, Ellipse: e, On: 1e-7, Off: 1e-7}, "Off", ErrTooMany},
		{"dash shorter than the tolerance", DashSpec{Setup: plotter, Ellipse: e, On: 0.01, Off: 2}, "On", ErrDashTooShort},
		{"dash of 1e-16", DashSpec{Setup: plotter, Ellipse: e, On: 1e-16, Off: 2}, "On", ErrDashTooShort},
		{"depth on a plotter", DashSpec{Setup: plotter, Ellipse: e, On: 5, Off: 2, Depth: 1}, "Depth", ErrNotForMachine},
		{"router without depth", DashSpec{Setup: Setup{Machine: Router, Tol: 0.05, SafeZ: 3}, Ellipse: e, On: 5, Off: 2}, "Depth", ErrNotPositive},
		{"laser dots without time", DashSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Off: 2}, "MarkSeconds", ErrNotPositive},
		{"offset past the fold", DashSpec{Setup: plotter, Ellipse: e, On: 5, Off: 2, Offset: -7.5}, "Offset", ellipse.ErrOffsetLimit},
		{"band past the fold", DashSpec{Setup: plotter, Ellipse: e, On: 5, Off: 2, Offset: -7.46}, "Offset", ErrOffset},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := Dash(nil, c.spec)
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

// Over random shapes, offsets, patterns and machines, a dash path has the
// number of dashes DashPattern gives, each within the band about the
// curve, with travels at the travel height.
func TestDashPropertyPattern(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		rho := e.MinRadiusOfCurvature()
		s := DashSpec{Ellipse: e, Clockwise: rapid.Bool().Draw(t, "cw")}
		s.Tol = math.Min(0.05, 0.2*rho)
		s.Geometry = Geometry(rapid.IntRange(0, 1).Draw(t, "arcs"))
		s.Offset = rapid.Float64Range(-0.7, 2).Draw(t, "offsetShare") * rho
		c, _ := e.Parallel(s.Offset)
		l := c.Length()
		s.Off = l * rapid.Float64Range(0.005, 0.5).Draw(t, "offShare")
		s.On = l * rapid.Float64Range(0.002, 0.5).Draw(t, "onShare")
		s.On = math.Max(s.On, s.Tol) // shorter dashes are refused (TestDashRefusals)
		switch s.Machine = Machine(rapid.IntRange(1, 3).Draw(t, "machine")); s.Machine {
		case Router:
			s.SafeZ, s.Depth = 5, rapid.Float64Range(0.05, 3).Draw(t, "depth")
		case Plotter:
			s.PenUp = 2
		}
		p, err := Dash(nil, s)
		if err != nil {
			t.Fatalf("valid spec refused: %v", err)
		}
		checkContinuous(t, p)
		checkTravels(t, s.Setup, p)
		n, _, _ := DashPattern(l, s.On, s.Off)
		st := strokes(p)
		if len(st) != n {
			t.Fatalf("%d dashes, want %d", len(st), n)
		}
		for k, d := range st {
			for _, g := range d {
				if lo, hi := deviationRange(c, g); lo < -s.Tol || hi > s.Tol {
					t.Fatalf("dash %d deviates %g..%g, outside ±%g", k, lo, hi, s.Tol)
				}
			}
		}
	})
}
