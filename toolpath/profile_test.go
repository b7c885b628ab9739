package toolpath

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// Shapes of our own: a serving tray, a round coaster, a long flat
// shelf-bracket slot, a small nearly round knob, a tilted mirror frame
// off the origin.
func opsShapes(t *testing.T) map[string]ellipse.Ellipse {
	t.Helper()
	mk := func(w, h, cx, cy, rot float64) ellipse.Ellipse {
		e, err := ellipse.FromSize(w, h, ellipse.Point{X: cx, Y: cy}, rot)
		if err != nil {
			t.Fatal(err)
		}
		return e
	}
	return map[string]ellipse.Ellipse{
		"tray":    mk(420, 280, 0, 0, 0),
		"coaster": mk(95, 95, 0, 0, 0),
		"slot":    mk(240, 60, 10, -5, 0),
		"knob":    mk(30, 28, 0, 0, 0),
		"mirror":  mk(500, 350, 320, 260, 0.35),
	}
}

func TestProfileRouterKeepsEveryPromise(t *testing.T) {
	shapes := opsShapes(t)
	router := Setup{Machine: Router, Tol: 0.02, SafeZ: 5, PlungeFeed: 300}
	arcs := router
	arcs.Geometry = Arcs
	cases := []struct {
		name  string
		shape string
		spec  ProfileSpec
	}{
		{"outside plain", "tray", ProfileSpec{Setup: router, Tool: 6, Depth: 18, StepDown: 3}},
		{"outside tabs arcs", "tray", ProfileSpec{Setup: arcs, Tool: 6, Depth: 18, StepDown: 3.5, Tabs: 6, TabWidth: 8, TabHeight: 6}},
		{"outside tabs above the last pass", "mirror", ProfileSpec{Setup: router, Tool: 6.35, Depth: 12, StepDown: 5, Tabs: 4, TabWidth: 5, TabHeight: 5}},
		{"outside conventional", "coaster", ProfileSpec{Setup: router, Tool: 3, Depth: 6, StepDown: 1.5, Direction: Conventional}},
		{"outside ramp angle", "tray", ProfileSpec{Setup: arcs, Tool: 6, Depth: 12, StepDown: 4, RampAngle: 3 * math.Pi / 180}},
		{"outside ramp length tabs", "mirror", ProfileSpec{Setup: router, Tool: 8, Depth: 19, StepDown: 4, RampLength: 120, Tabs: 5, TabWidth: 10, TabHeight: 7}},
		{"outside no lead", "knob", ProfileSpec{Setup: router, Tool: 3.175, Depth: 4, StepDown: 1, NoLead: true}},
		{"outside lead radius start", "slot", ProfileSpec{Setup: arcs, Tool: 6, Depth: 9, StepDown: 3, LeadRadius: 15, Start: 2}},
		{"inside", "tray", ProfileSpec{Setup: router, Side: SideInside, Tool: 6, Depth: 10, StepDown: 2.5, Tabs: 3, TabWidth: 6, TabHeight: 3}},
		{"inside arcs ramp", "coaster", ProfileSpec{Setup: arcs, Side: SideInside, Tool: 6, Depth: 8, StepDown: 2, RampAngle: 0.04}},
		{"inside slot default lead shrinks", "slot", ProfileSpec{Setup: router, Side: SideInside, Tool: 12, Depth: 6, StepDown: 3}},
		{"inside conventional", "mirror", ProfileSpec{Setup: router, Side: SideInside, Direction: Conventional, Tool: 10, Depth: 5, StepDown: 5}},
		{"on the line", "tray", ProfileSpec{Setup: router, Side: SideOn, Tool: 2, Depth: 1, StepDown: 0.5}},
		{"on the line with lead", "coaster", ProfileSpec{Setup: arcs, Side: SideOn, Tool: 2, Depth: 1, StepDown: 1, LeadRadius: 4}},
		{"one pass exactly", "knob", ProfileSpec{Setup: router, Tool: 2, Depth: 3, StepDown: 3}},
		{"stepdown not a divisor", "tray", ProfileSpec{Setup: router, Tool: 6, Depth: 10, StepDown: 3}},
		{"tabs with ramp through them", "coaster", ProfileSpec{Setup: router, Tool: 3, Depth: 9, StepDown: 2, RampLength: 200, Tabs: 8, TabWidth: 4, TabHeight: 5}},
		{"start on a tab", "tray", ProfileSpec{Setup: router, Tool: 6, Depth: 9, StepDown: 3, Tabs: 4, TabWidth: 10, TabHeight: 4, Start: math.Pi / 4}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := c.spec
			s.Ellipse = shapes[c.shape]
			p, err := Profile(nil, s)
			if err != nil {
				t.Fatal(err)
			}
			checkProfile(t, s, p)
		})
	}
}

func TestProfileLaserAndPlotterKeepEveryPromise(t *testing.T) {
	shapes := opsShapes(t)
	laser := Setup{Machine: Laser, Tol: 0.01}
	plotter := Setup{Machine: Plotter, Tol: 0.05, PenUp: 4, PenDown: -0.5}
	cases := []struct {
		name  string
		shape string
		spec  ProfileSpec
	}{
		{"laser outside", "tray", ProfileSpec{Setup: laser, Kerf: 0.2}},
		{"laser passes", "mirror", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.01, FocusZ: 2, Geometry: Arcs}, Kerf: 0.15, Passes: 3}},
		{"laser inside", "knob", ProfileSpec{Setup: laser, Kerf: 0.3, Side: SideInside, Passes: 2}},
		{"laser on no lead", "coaster", ProfileSpec{Setup: laser, Kerf: 0.1, Side: SideOn, Passes: 2}},
		{"laser passes no lead", "slot", ProfileSpec{Setup: laser, Kerf: 0.25, NoLead: true, Passes: 2}},
		{"plotter default on", "tray", ProfileSpec{Setup: plotter}},
		{"plotter outside pen width", "slot", ProfileSpec{Setup: plotter, Side: SideOutside, Tool: 0.5}},
		{"plotter inside arcs", "coaster", ProfileSpec{Setup: Setup{Machine: Plotter, Tol: 0.02, PenUp: 2, Geometry: Arcs}, Side: SideInside, Tool: 0.3, LeadRadius: 3}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := c.spec
			s.Ellipse = shapes[c.shape]
			p, err := Profile(nil, s)
			if err != nil {
				t.Fatal(err)
			}
			checkProfile(t, s, p)
		})
	}
}

func TestProfileRefusals(t *testing.T) {
	e := opsShapes(t)["tray"] // a = 210, b = 140: b²/a = 93.33
	router := Setup{Machine: Router, Tol: 0.05, SafeZ: 5}
	ok := ProfileSpec{Setup: router, Ellipse: e, Tool: 6, Depth: 12, StepDown: 3}
	with := func(f func(*ProfileSpec)) ProfileSpec {
		s := ok
		f(&s)
		return s
	}
	cases := []struct {
		name  string
		spec  ProfileSpec
		field string
		err   error
		limit float64 // NaN: no limit; +Inf: some limit
	}{
		{"zero tool", with(func(s *ProfileSpec) { s.Tool = 0 }), "Tool", ErrNotPositive, math.NaN()},
		{"negative tool", with(func(s *ProfileSpec) { s.Tool = -3 }), "Tool", ErrNegative, math.NaN()},
		{"NaN tool", with(func(s *ProfileSpec) { s.Tool = math.NaN() }), "Tool", ErrNotFinite, math.NaN()},
		{"zero depth", with(func(s *ProfileSpec) { s.Depth = 0 }), "Depth", ErrNotPositive, math.NaN()},
		{"negative stepdown", with(func(s *ProfileSpec) { s.StepDown = -1 }), "StepDown", ErrNegative, math.NaN()},
		{"zero stepdown", with(func(s *ProfileSpec) { s.StepDown = 0 }), "StepDown", ErrNotPositive, math.NaN()},
		{"stepdown far too small", with(func(s *ProfileSpec) { s.StepDown = 1e-9 }), "StepDown", ErrTooMany, 12.0 / MaxCount},
		{"path too long", with(func(s *ProfileSpec) { s.StepDown = 12.0 / 500000 }), "StepDown", ErrTooMany, math.Inf(1)},
		{"laser passes too many", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Kerf: 0.2, Passes: 900000}, "Passes", ErrTooMany, math.Inf(1)},
		{"tabs as tall as the depth", with(func(s *ProfileSpec) { s.Tabs, s.TabWidth, s.TabHeight = 4, 6, 12 }), "TabHeight", ErrTabTooTall, 12},
		{"tabs without width", with(func(s *ProfileSpec) { s.Tabs, s.TabHeight = 4, 3 }), "TabWidth", ErrNotPositive, math.NaN()},
		{"tabs overlapping", with(func(s *ProfileSpec) { s.Tabs, s.TabWidth, s.TabHeight = 100, 20, 3 }), "TabWidth", ErrTabsOverlap, e.Perimeter()/100 + 2*math.Pi*3/100 - 6},
		{"tool too large inside", with(func(s *ProfileSpec) { s.Side, s.Tool = SideInside, 190 }), "Tool", ErrToolTooLarge, 2 * (140.0*140/210 - 0.05)},
		{"lead too large inside", with(func(s *ProfileSpec) { s.Side, s.LeadRadius = SideInside, 100 }), "LeadRadius", ErrLeadTooLarge, 140.0*140/210 - 3 - 0.05},
		{"lead below the tolerance", with(func(s *ProfileSpec) { s.LeadRadius = 0.01 }), "LeadRadius", ErrLeadTooSmall, 0.05},
		{"band past the fold", ProfileSpec{Setup: Setup{Machine: Plotter, Tol: 8, PenUp: 3}, Ellipse: opsShapes(t)["slot"]}, "Tol", ErrOffset, 7.5},
		{"lead and no lead", with(func(s *ProfileSpec) { s.LeadRadius, s.NoLead = 5, true }), "LeadRadius", ErrBoth, math.NaN()},
		{"ramp angle and length", with(func(s *ProfileSpec) { s.RampAngle, s.RampLength = 0.1, 50 }), "RampLength", ErrBoth, math.NaN()},
		{"ramp too long", with(func(s *ProfileSpec) { s.RampLength = 5000 }), "RampLength", ErrRampTooLong, e.Perimeter() + 2*math.Pi*3},
		{"ramp too shallow", with(func(s *ProfileSpec) { s.RampAngle = 1e-5 }), "RampAngle", ErrRampTooLong, math.Atan(3 / (e.Perimeter() + 2*math.Pi*3))},
		{"ramp vertical", with(func(s *ProfileSpec) { s.RampAngle = math.Pi / 2 }), "RampAngle", ErrChoice, math.Pi / 2},
		{"kerf on a router", with(func(s *ProfileSpec) { s.Kerf = 0.2 }), "Kerf", ErrNotForMachine, math.NaN()},
		{"passes on a router", with(func(s *ProfileSpec) { s.Passes = 2 }), "Passes", ErrNotForMachine, math.NaN()},
		{"no machine", with(func(s *ProfileSpec) { s.Machine = 0 }), "Machine", ErrMachine, math.NaN()},
		{"no safe height", with(func(s *ProfileSpec) { s.SafeZ = 0 }), "SafeZ", ErrNotPositive, math.NaN()},
		{"zero tolerance", with(func(s *ProfileSpec) { s.Tol = 0 }), "Tol", ErrNotPositive, math.NaN()},
		{"unknown side", with(func(s *ProfileSpec) { s.Side = 9 }), "Side", ErrChoice, math.NaN()},
		{"no ellipse", with(func(s *ProfileSpec) { s.Ellipse = ellipse.Ellipse{} }), "Ellipse", ErrNotPositive, math.NaN()},
		{"laser without kerf", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e}, "Kerf", ErrNotPositive, math.NaN()},
		{"laser with depth", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Kerf: 0.2, Depth: 3}, "Depth", ErrNotForMachine, math.NaN()},
		{"laser with tool", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Kerf: 0.2, Tool: 3}, "Tool", ErrNotForMachine, math.NaN()},
		{"laser with safe height", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.05, SafeZ: 5}, Ellipse: e, Kerf: 0.2}, "SafeZ", ErrNotForMachine, math.NaN()},
		{"laser kerf too large inside", ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.05}, Ellipse: e, Kerf: 200, Side: SideInside}, "Kerf", ErrToolTooLarge, 2 * (140.0*140/210 - 0.05)},
		{"plotter pen heights", ProfileSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 0}, Ellipse: e}, "PenUp", ErrPenHeights, 0},
		{"plotter with tabs", ProfileSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, Ellipse: e, Tabs: 2}, "Tabs", ErrNotForMachine, math.NaN()},
		{"plotter with passes", ProfileSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, Ellipse: e, Passes: 2}, "Passes", ErrNotForMachine, math.NaN()},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dst := Path{{Kind: Dwell}}
			got, err := Profile(dst, c.spec)
			if len(got) != 1 {
				t.Errorf("refused spec changed dst to %d segments", len(got))
			}
			var oe *OpError
			if !errors.As(err, &oe) {
				t.Fatalf("error %v is not an *OpError", err)
			}
			if oe.Field != c.field || !errors.Is(err, c.err) {
				t.Errorf("got %q (field %s), want field %s and %v", err, oe.Field, c.field, c.err)
			}
			if math.IsInf(c.limit, 1) {
				if !oe.HasLimit {
					t.Errorf("no limit in %q", err)
				}
			} else if math.IsNaN(c.limit) {
				if oe.HasLimit {
					t.Errorf("unexpected limit %g in %q", oe.Limit, err)
				}
			} else if !oe.HasLimit || math.Abs(oe.Limit-c.limit) > 1e-9*math.Max(1, math.Abs(c.limit)) {
				t.Errorf("limit %g (has %v), want %g", oe.Limit, oe.HasLimit, c.limit)
			}
			if msg := err.Error(); len(msg) < 10 || msg[:10] != "toolpath: " {
				t.Errorf("message %q lacks the package prefix", msg)
			}
		})
	}
}

// The largest inside tool accepted is just below 2·(b²/a − Tol).
func TestProfileInsideToolLimitIsSharp(t *testing.T) {
	e := opsShapes(t)["slot"] // a = 120, b = 30: b²/a = 7.5
	tol := 0.05
	lim := MaxInsideTool(e, tol)
	if want := 2 * (30.0*30/120 - tol); math.Abs(lim-want) > 1e-12 {
		t.Fatalf("MaxInsideTool = %g, want %g", lim, want)
	}
	s := ProfileSpec{Setup: Setup{Machine: Router, Tol: tol, SafeZ: 5}, Ellipse: e, Side: SideInside, Depth: 3, StepDown: 3}
	s.Tool = lim * (1 - 1e-6)
	p, err := Profile(nil, s)
	if err != nil {
		t.Fatalf("tool just below the limit refused: %v", err)
	}
	checkProfile(t, s, p)
	s.Tool = lim
	if _, err := Profile(nil, s); !errors.Is(err, ErrToolTooLarge) {
		t.Errorf("tool at the limit: %v, want ErrToolTooLarge", err)
	}
}

func TestDepthPasses(t *testing.T) {
	cases := []struct {
		depth, step float64
		n           int
	}{
		{12, 3, 4}, {12, 5, 3}, {10, 3, 4}, {3, 3, 1}, {0.9, 0.3, 3}, {0.3, 0.1, 3}, {1, 2, 1}, {7, 0.7, 10}, {1e3, 1e-9, MaxCount + 1},
	}
	for _, c := range cases {
		n, step := DepthPasses(c.depth, c.step)
		if n != c.n {
			t.Errorf("DepthPasses(%g, %g) = %d passes, want %d", c.depth, c.step, n, c.n)
		}
		if n <= MaxCount && (step > c.step*(1+1e-9) || math.Abs(step*float64(n)-c.depth) > 1e-12*c.depth) {
			t.Errorf("DepthPasses(%g, %g) step %g", c.depth, c.step, step)
		}
	}
}

// Appending to a path that already holds segments continues from its end.
func TestProfileAppends(t *testing.T) {
	e := opsShapes(t)["knob"]
	s := ProfileSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, Ellipse: e}
	first, err := Profile(nil, s)
	if err != nil {
		t.Fatal(err)
	}
	both, err := Profile(first, s)
	if err != nil {
		t.Fatal(err)
	}
	if len(both) != 2*len(first) {
		t.Fatalf("appended %d segments to %d, want as many again", len(both)-len(first), len(first))
	}
	checkContinuous(t, both)
}
