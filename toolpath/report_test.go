package toolpath

import (
	"errors"
	"math"
	"testing"
)

// A path worked by hand: feeds 600/min = 10 per second, rapids 6000/min =
// 100 per second, plunges 300/min = 5 per second, acceleration 1000 per
// second squared. A run reaches full speed v when its length is at least
// v²/A (0.1 for cuts, 10 for rapids, 0.025 for plunges), taking D/v + v/A.
func TestSummarizeByHand(t *testing.T) {
	p := Path{
		// Rapid 100: 1 + 0.1 s.
		{Kind: Line, Motion: Travel, Start: Point{0, 0, 5}, End: Point{100, 0, 5}},
		// Plunge 5 at the plunge feed: 1 + 0.005 s.
		{Kind: Line, Motion: Cut, Role: Plunge, Start: Point{100, 0, 5}, End: Point{100, 0, 0}},
		// Line 30, then a colinear line 20 and a quarter arc of radius 10
		// leaving tangentially: one run of 50 + 5π, (50 + 5π)/10 + 0.01 s.
		{Kind: Line, Motion: Cut, Start: Point{100, 0, 0}, End: Point{130, 0, 0}},
		{Kind: Line, Motion: Cut, Start: Point{130, 0, 0}, End: Point{150, 0, 0}},
		{Kind: Arc, Motion: Cut, Start: Point{150, 0, 0}, End: Point{160, 10, 0}, CenterX: 150, CenterY: 10, Radius: 10},
		// A sharp turn back (180°): a run of 10, 1 + 0.01 s.
		{Kind: Line, Motion: Cut, Start: Point{160, 10, 0}, End: Point{160, 0, 0}},
		// A dwell of 2 s.
		{Kind: Dwell, Motion: Cut, Start: Point{160, 0, 0}, End: Point{160, 0, 0}, Seconds: 2},
		// A cut of 0.02 at its own feed 300 (5 per second), too short to
		// reach it (v²/A = 0.025): a triangle, 2·√(0.02/1000) s.
		{Kind: Line, Motion: Cut, Start: Point{160, 0, 0}, End: Point{160.02, 0, 0}, Feed: 300},
		// Retract 5 straight up: a rapid of its own, 2·√(5/1000) s.
		{Kind: Line, Motion: Travel, Role: Retract, Start: Point{160.02, 0, 0}, End: Point{160.02, 0, 5}},
	}
	r := Rates{Feed: 600, PlungeFeed: 300, Rapid: 6000, Accel: 1000}
	got := Summarize(p, r)
	want := 1.1 + 1.005 + (50+5*math.Pi)/10 + 0.01 + 1.01 + 2 + 2*math.Sqrt(0.02/1000) + 2*math.Sqrt(5.0/1000)
	if math.Abs(got.Seconds-want) > 1e-12 {
		t.Errorf("Seconds = %.15g, want %.15g", got.Seconds, want)
	}
	if got.Stops != 6 { // the dwell is no run
		t.Errorf("Stops = %d, want 6", got.Stops)
	}
	if got.DwellSeconds != 2 || got.Segments != len(p) {
		t.Errorf("DwellSeconds %g, Segments %d", got.DwellSeconds, got.Segments)
	}
	if want := 5 + 50 + 5*math.Pi + 10 + 0.02; math.Abs(got.CutLength-want) > 1e-12 {
		t.Errorf("CutLength = %g, want %g", got.CutLength, want)
	}
	if want := 105.0; math.Abs(got.TravelLength-want) > 1e-12 {
		t.Errorf("TravelLength = %g, want %g", got.TravelLength, want)
	}
	if got.MinX != 0 || got.MaxX != 160.02 || got.MinY != 0 || got.MaxY != 10 || got.MinZ != 0 || got.MaxZ != 5 {
		t.Errorf("box %g..%g × %g..%g × %g..%g", got.MinX, got.MaxX, got.MinY, got.MaxY, got.MinZ, got.MaxZ)
	}
	// A corner just inside the default 10° joins the run; just outside
	// it stops.
	bend := func(deg float64) Path {
		s, c := math.Sincos(deg * math.Pi / 180)
		return Path{
			{Kind: Line, Motion: Cut, Start: Point{0, 0, 0}, End: Point{10, 0, 0}},
			{Kind: Line, Motion: Cut, Start: Point{10, 0, 0}, End: Point{10 + 10*c, 10 * s, 0}},
		}
	}
	if n := Summarize(bend(9.9), r).Stops; n != 1 {
		t.Errorf("9.9° corner: %d runs, want 1", n)
	}
	if n := Summarize(bend(10.1), r).Stops; n != 2 {
		t.Errorf("10.1° corner: %d runs, want 2", n)
	}
}

// Without acceleration the estimate is cut length over feed plus travel
// length over the rapid rate plus the dwells: the same number reached by
// a second route, for real paths of every operation.
func TestSummarizeWithoutAccelerationIsLengthOverRate(t *testing.T) {
	e := opsShapes(t)["tray"]
	paths := map[string]Path{}
	add := func(name string, p Path, err error) {
		if err != nil {
			t.Fatal(err)
		}
		paths[name] = p
	}
	p, err := Profile(nil, ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.02}, Ellipse: e, Kerf: 0.2, Passes: 2})
	add("laser", p, err)
	p, err = Dash(nil, DashSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, Ellipse: e, On: 10, Off: 5})
	add("dash", p, err)
	p, err = Drill(nil, DrillSpec{Setup: Setup{Machine: Laser, Tol: 0.02}, Ellipse: e, Count: 8, MarkSeconds: 0.5})
	add("marks", p, err)
	r := Rates{Feed: 1200, Rapid: 9000}
	for name, p := range paths {
		got := Summarize(p, r)
		dwell := 0.0
		for _, g := range p {
			dwell += g.Seconds
		}
		cut, travel := p.Lengths()
		want := cut/20 + travel/150 + dwell
		if math.Abs(got.Seconds-want) > 1e-9*want {
			t.Errorf("%s: %g s, want %g", name, got.Seconds, want)
		}
		// Acceleration only ever adds time.
		if slow := Summarize(p, Rates{Feed: 1200, Rapid: 9000, Accel: 500}); slow.Seconds <= got.Seconds {
			t.Errorf("%s: with acceleration %g s, not more than %g", name, slow.Seconds, got.Seconds)
		}
	}
}

func TestRatesValidate(t *testing.T) {
	cases := []struct {
		r     Rates
		field string
		err   error
	}{
		{Rates{Rapid: 100}, "Feed", ErrNotPositive},
		{Rates{Feed: 100}, "Rapid", ErrNotPositive},
		{Rates{Feed: 100, Rapid: 100, Accel: -1}, "Accel", ErrNegative},
		{Rates{Feed: 100, Rapid: 100, PlungeFeed: math.NaN()}, "PlungeFeed", ErrNotFinite},
		{Rates{Feed: 100, Rapid: 100, CornerAngle: 4}, "CornerAngle", ErrChoice},
	}
	for _, c := range cases {
		err := c.r.Validate()
		var oe *OpError
		if !errors.As(err, &oe) || oe.Field != c.field || !errors.Is(err, c.err) {
			t.Errorf("%+v: got %v, want %s %v", c.r, err, c.field, c.err)
		}
		if s := Summarize(Path{{Kind: Line, Motion: Cut, End: Point{1, 0, 0}}}, c.r).Seconds; s != 0 {
			t.Errorf("%+v: invalid rates gave %g s", c.r, s)
		}
	}
	if err := (Rates{Feed: 1, Rapid: 1}).Validate(); err != nil {
		t.Errorf("valid rates: %v", err)
	}
}
