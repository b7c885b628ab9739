package toolpath

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/google/go-cmp/cmp"
	"pgregory.net/rapid"
)

// deviationRange measures the signed deviation of segment s from curve c
// with the exact signed distance (ellipse.SignedDistance less the offset):
// 16 even samples, then a golden-section search around the extreme
// samples, which puts the measured extremes within far less than 1% of
// the true ones for the smooth deviation of a segment along a convex curve.
func deviationRange(c ellipse.Parallel, s Segment) (lo, hi float64) {
	e := c.Ellipse()
	dev := func(u float64) float64 {
		p := s.At(u)
		return e.SignedDistance(ellipse.Point{X: p.X, Y: p.Y}) - c.Offset()
	}
	const n = 16
	var v [n + 1]float64
	jlo, jhi := 0, 0
	for j := 0; j <= n; j++ {
		v[j] = dev(float64(j) / n)
		if v[j] < v[jlo] {
			jlo = j
		}
		if v[j] > v[jhi] {
			jhi = j
		}
	}
	refine := func(j int, sign float64) float64 {
		a := math.Max(0, float64(j-1)/n)
		b := math.Min(1, float64(j+1)/n)
		best := sign * v[j]
		for i := 0; i < 24; i++ {
			m1 := a + (b-a)*0.381966
			m2 := a + (b-a)*0.618034
			f1, f2 := sign*dev(m1), sign*dev(m2)
			best = math.Max(best, math.Max(f1, f2))
			if f1 > f2 {
				b = m2
			} else {
				a = m1
			}
		}
		return sign * best
	}
	return refine(jlo, -1), refine(jhi, 1)
}

// roundSeg rounds the coordinates of s as a writer with the given decimals
// would, keeping an arc's radius as the distance from the rounded start to
// the rounded centre (At interpolates the radius from start to end); a
// negative count leaves s as it is.
func roundSeg(s Segment, decimals int) Segment {
	if decimals < 0 {
		return s // exact coordinates (Spec.Decimals < 0)
	}
	p := math.Pow(10, float64(decimals))
	r := func(x float64) float64 { return math.Round(x*p) / p }
	s.Start.X, s.Start.Y = r(s.Start.X), r(s.Start.Y)
	s.End.X, s.End.Y = r(s.End.X), r(s.End.Y)
	if s.Kind == Arc {
		s.CenterX, s.CenterY = r(s.CenterX), r(s.CenterY)
		s.Radius = math.Hypot(s.Start.X-s.CenterX, s.Start.Y-s.CenterY)
	}
	return s
}

// randomSpec draws a spec over the ranges the approximators promise:
// semi-major 0.05 mm to 2.5 m, b/a from 1e-3 to 1, any rotation and centre,
// tolerance 1e-4 to 1e-1 of the semi-minor axis (and at most 1), offsets
// from well inside the fold limit to a semi-major outward, every zone and
// geometry.
func randomSpec(t *rapid.T) Spec {
	a := math.Pow(10, rapid.Float64Range(math.Log10(0.05), math.Log10(2500)).Draw(t, "log a"))
	ratio := math.Pow(10, rapid.Float64Range(-3, 0).Draw(t, "log b/a"))
	b := a * ratio
	rot := rapid.Float64Range(-4, 4).Draw(t, "rotation")
	cx := rapid.Float64Range(-1000, 1000).Draw(t, "cx")
	cy := rapid.Float64Range(-1000, 1000).Draw(t, "cy")
	swap := rapid.Bool().Draw(t, "major along own y")
	rx, ry := a, b
	if swap {
		rx, ry = b, a
	}
	e, err := ellipse.New(ellipse.Point{X: cx, Y: cy}, rx, ry, rot)
	if err != nil {
		t.Fatalf("New: %v", err)
	}
	tol := math.Min(1, b*math.Pow(10, rapid.Float64Range(-4, -1).Draw(t, "log tol/b")))
	tol = math.Max(tol, 1e-4)
	lim := e.MinRadiusOfCurvature()
	var d float64
	switch rapid.IntRange(0, 2).Draw(t, "offset kind") {
	case 1:
		d = rapid.Float64Range(0, a).Draw(t, "outward")
	case 2:
		d = -rapid.Float64Range(0, 0.8).Draw(t, "inward fraction") * math.Max(0, lim-2*tol)
	}
	c, err := e.Parallel(d)
	if err != nil {
		t.Fatalf("Parallel(%g): %v", d, err)
	}
	zone := Zone(rapid.IntRange(0, 2).Draw(t, "zone"))
	if zone != Outside && -(d-1.05*tol) >= lim {
		// The zone's inner edge would fold: only an outside zone is sound.
		zone = Outside
	}
	return Spec{
		Curve:    c,
		Zone:     zone,
		Tol:      tol,
		Geometry: Geometry(rapid.IntRange(0, 1).Draw(t, "geometry")),
		From:     rapid.Float64Range(-7, 7).Draw(t, "from"),
	}
}

func TestApproximationStaysInZoneClosedTangentContinuous(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) { checkApproximation(t, randomSpec(t)) })
}

// fataler is what checkApproximation needs of *testing.T and *rapid.T.
type fataler interface {
	Fatal(args ...any)
	Fatalf(format string, args ...any)
	Skip(args ...any)
}

// checkApproximation approximates s and checks every promise of the
// approximators: each segment (as computed and as rounded to the writer's
// decimals) stays in the zone, the path is continuous and closed, arcs
// join tangentially and wind once in the asked direction.
func checkApproximation(t fataler, s Spec) {
	a, err := NewApproximator(s)
	if err != nil {
		if errors.Is(err, ErrTooFine) {
			t.Skip("too fine")
		}
		t.Fatalf("NewApproximator(%+v): %v", s, err)
	}
	var path Path
	for seg, ok := a.Next(); ok; seg, ok = a.Next() {
		path = append(path, seg)
	}
	if err := a.Err(); err != nil {
		t.Fatalf("after %d segments: %v", len(path), err)
	}
	if len(path) == 0 {
		t.Fatal("no segments")
	}
	lo, hi := s.Zone.Limits(s.Tol)
	scale := s.Curve.Ellipse().SemiMajor() + math.Abs(s.Curve.Offset())
	joinTol := 1e-9 * scale
	turning := 0.0
	for i, seg := range path {
		if seg.Motion != Cut {
			t.Fatalf("segment %d: motion %v", i, seg.Motion)
		}
		for _, sg := range []Segment{seg, roundSeg(seg, a.Decimals())} {
			dlo, dhi := deviationRange(s.Curve, sg)
			if dlo < lo || dhi > hi {
				t.Fatalf("segment %d of %d (%v): deviation [%g, %g] outside zone [%g, %g] (tol %g)", i, len(path), sg.Kind, dlo, dhi, lo, hi, s.Tol)
			}
		}
		next := path[(i+1)%len(path)]
		if d := math.Hypot(seg.End.X-next.Start.X, seg.End.Y-next.Start.Y); d > joinTol {
			t.Fatalf("segment %d ends %g away from the next start", i, d)
		}
		if seg.Kind == Arc {
			r0 := math.Hypot(seg.Start.X-seg.CenterX, seg.Start.Y-seg.CenterY)
			r1 := math.Hypot(seg.End.X-seg.CenterX, seg.End.Y-seg.CenterY)
			rtol := 1e-9*seg.Radius + 8*0x1p-52*(math.Abs(seg.CenterX)+math.Abs(seg.CenterY)+seg.Radius)
			if math.Abs(r0-seg.Radius) > rtol || math.Abs(r1-seg.Radius) > rtol {
				t.Fatalf("segment %d: radius %g, start %g, end %g", i, seg.Radius, r0, r1)
			}
			turning += seg.Sweep()
		}
		// Turning at the join and, for arcs, tangent continuity.
		_, t1 := segTangents(seg)
		t0n, _ := segTangents(next)
		kink := math.Atan2(t1.cross(t0n), t1.dot(t0n))
		turning += kink
		// The tangents are read back from float64 ends and centres, so a
		// small arc far from the origin carries a representation error of
		// a few ulps of the coordinates over its radius.
		kinkTol := 1e-9
		for _, sg := range []Segment{seg, next} {
			if sg.Kind == Arc {
				kinkTol += 8 * 0x1p-52 * (math.Abs(sg.CenterX) + math.Abs(sg.CenterY) + sg.Radius) / sg.Radius
			}
			// The ends themselves fix the direction of a short piece
			// (a line's, or the chord an arc was built on) to a few
			// ulps of the coordinates over its length.
			l := math.Hypot(sg.End.X-sg.Start.X, sg.End.Y-sg.Start.Y)
			kinkTol += 8 * 0x1p-52 * (math.Abs(sg.Start.X) + math.Abs(sg.Start.Y)) / l
		}
		if s.Geometry == Arcs && math.Abs(kink) > kinkTol {
			t.Fatalf("join after segment %d of %d: tangent kink %g rad", i, len(path), kink)
		}
	}
	if math.Abs(math.Abs(turning)-2*math.Pi) > 1e-6 {
		t.Fatalf("total turning %g, want ±2π (winds once)", turning)
	}
	if (turning < 0) != s.Clockwise {
		t.Fatalf("turning %g with Clockwise %v", turning, s.Clockwise)
	}
}

// curveOf returns the parallel curve at d of the ellipse with semi-axes
// rx, ry along its own x and y, centred at c and turned by rot.
func curveOf(t *testing.T, c ellipse.Point, rx, ry, rot, d float64) ellipse.Parallel {
	e, err := ellipse.New(c, rx, ry, rot)
	if err != nil {
		t.Fatal(err)
	}
	p, err := e.Parallel(d)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// Shapes that once broke a promise, found by the property test above
// (the rapid fail files are not kept in the repository).
func TestApproximationRegressions(t *testing.T) {
	for _, c := range []struct {
		name string
		s    Spec
	}{
		// A wide arc over a needle's tip: its circle met the fanned-out
		// normals on the far side, off the arc, and the deviation of
		// 0.012 went unseen.
		{"wide arc over a needle's tip", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, math.Pow(10, -0.830078125)*1e-3, math.Pow(10, -0.830078125), 1, 0), Zone: Outside, Tol: 1e-4, Geometry: Arcs, From: 0.0005207061767578125}},
		// A closing biarc whose join sat on the zone's edge, with the
		// arc dipping 8e-7 past it between the last sample and the end.
		// Round the tip of a needle thinner than the zone an arc ended
		// near the zone's edge with its tangent leading out: no single
		// arc went on, and a step of 1e-12 that left the zone was taken.
		{"no way on round a needle's tip", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, 0.05*1e-3, 0.05, 1, 0), Zone: Outside, Tol: 1e-4, Geometry: Arcs, From: 0.921875}},
		// A flat ellipse's wide parallel curve: round its cap the t and
		// normal-angle grids gave two samples each, and polishing found
		// a hump 1% of the width short.
		{"samples round a wide offset's cap", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, math.Pow(10, 3.0517578125e-05), math.Pow(10, 3.0517578125e-05)*math.Pow(10, -2.97906494140625), 1, 0.7666015625), Zone: Outside, Tol: 1e-4, Geometry: Arcs, From: 1.44140625}},
		// A needle far from the origin: a biarc's short first arc fixed
		// the join's tangent to 1e-9 only, and building the second arc
		// forwards carried that kink to the start of the path.
		{"needle at y = 1000", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1000}, math.Pow(10, 3.814697265625e-06), math.Pow(10, 3.814697265625e-06)*1e-3, -4, 0), Zone: Outside, Tol: 1e-4, Geometry: Arcs, From: 0.1875}},
		// Lines round a needle with an offset as large as the needle
		// is long: the segment-count guard, estimated on panels evenly
		// spaced in t, missed the caps (a sixth of the count) and
		// stopped a sound approximation as stalled.
		{"count guard on a stadium (lines)", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, math.Pow(10, 1.25), math.Pow(10, 1.25)*1e-3, 1, 17.78279410038923), Zone: Band, Tol: 1e-4, Geometry: Lines, From: 1}},
		// A stretch planned backwards ended at an end of the minor axis
		// 1.5e-5 short of the path's end: the forward chain closed the
		// gap with arcs of no length, which read as full circles.
		{"planned stretch just short of the end", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, math.Pow(10, 0.265625)*0.1, math.Pow(10, 0.265625), 1, 0), Zone: Outside, Tol: math.Pow(10, 0.265625) * 0.1 * 0.1, Geometry: Arcs, From: 1.52587890625e-05}},
		{"closing join on the zone's edge", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, math.Pow(10, 0.8241424560546875)*math.Pow(10, -1.2688522338867188), math.Pow(10, 0.8241424560546875), 1, 0.7862548828125), Zone: Outside, Tol: 1e-4, Geometry: Arcs, From: 7}},
	} {
		t.Run(c.name, func(t *testing.T) { checkApproximation(t, c.s) })
	}
}

// segTangents returns the unit tangents at the start and end of s.
func segTangents(s Segment) (vec, vec) {
	if s.Kind == Line {
		d := vec{s.End.X - s.Start.X, s.End.Y - s.Start.Y}
		d = d.scale(1 / d.norm())
		return d, d
	}
	sign := 1.0
	if s.Clockwise {
		sign = -1
	}
	r0 := vec{s.Start.X - s.CenterX, s.Start.Y - s.CenterY}.left().scale(sign / s.Radius)
	r1 := vec{s.End.X - s.CenterX, s.End.Y - s.CenterY}.left().scale(sign / s.Radius)
	return r0, r1
}

// countSpec draws a spec for the count test: randomSpec with exact
// coordinates, offsets within the semi-minor axis and tolerances at most
// 1 % of the tightest radius of the curve followed.
func countSpec(t *rapid.T) Spec {
	s := randomSpec(t)
	s.Decimals = -1 // compare the algorithm with the bound, not the rounding
	// N* is asymptotic (tol → 0): hold it to the bound where the
	// tolerance is small beside the tightest radius of the curve.
	// Outward offsets far larger than the semi-minor axis turn a flat
	// ellipse into a near-stadium whose curvature jumps at four
	// points, where an integral of |κ'|^(1/3) no longer counts arcs:
	// the count test keeps to offsets within the semi-minor axis.
	if e := s.Curve.Ellipse(); s.Curve.Offset() > e.SemiMinor() {
		c, err := e.Parallel(e.SemiMinor())
		if err != nil {
			t.Fatal(err)
		}
		s.Curve = c
	}
	if rho := s.Curve.Ellipse().MinRadiusOfCurvature() + s.Curve.Offset(); s.Tol > 0.01*rho {
		s.Tol = 0.01 * rho
	}
	return s
}

func TestSegmentCountsNearTheLowerBound(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := countSpec(t)
		p, err := Approximate(nil, s)
		if err != nil {
			t.Skip(err.Error())
		}
		nstar := LowerBound(s.Curve, s.Geometry, s.Zone, s.Tol, 0, 0)
		n := float64(len(p))
		limit := 1.03*nstar + 3
		if s.Geometry == Arcs {
			// The target; the measured worst cases are in the
			// README (TestArcCountRandom).
			limit = 2.0*nstar + 4
		}
		if n > limit {
			t.Fatalf("%v %v tol %g: %d segments, N* = %.2f, limit %.2f", s.Geometry, s.Zone, s.Tol, len(p), nstar, limit)
		}
	})
}

// Shapes whose count once broke the count test's limit.
func TestCountRegressions(t *testing.T) {
	needle := math.Pow(10, 1.88232421875) // semi-major, mm
	for _, c := range []struct {
		name string
		s    Spec
	}{
		// A needle's parallel curve at b starting just past a cap: the
		// start's steep pattern tangent left the closing four biarcs
		// round the cap, 33 arcs against a limit of 32.6.
		{"arcs: start just past a cap", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, 10, 0.01, 1, 0.01), Zone: Band, Tol: 1.001e-4, Geometry: Arcs, Decimals: -1, From: 3.16162109375}},
		// A needle's parallel curve at b, a near-stadium: where a chord
		// ran from the flank into the cap the sag grew far faster than
		// the square of the step, the search's model steps jumped from
		// one end of its bracket to the other without narrowing it, and
		// four chords stopped at 1% to 70% of the allowed sag: 115
		// chords against a limit of 114.93 (109 now).
		{"lines: chord into a stadium's cap", Spec{Curve: curveOf(t, ellipse.Point{X: 1, Y: 1}, needle*1e-3, needle, 1, needle*1e-3), Zone: Band, Tol: 1e-4, Geometry: Lines, Decimals: -1, From: -3.6171875}},
	} {
		t.Run(c.name, func(t *testing.T) {
			p, err := Approximate(nil, c.s)
			if err != nil {
				t.Fatal(err)
			}
			nstar := LowerBound(c.s.Curve, c.s.Geometry, c.s.Zone, c.s.Tol, 0, 0)
			limit := 1.03*nstar + 3
			if c.s.Geometry == Arcs {
				limit = 2.0*nstar + 4
			}
			if float64(len(p)) > limit {
				t.Errorf("%d segments, N* = %.2f, limit %.2f", len(p), nstar, limit)
			}
		})
	}
}

func TestApproximationIsDeterministicAndResettable(t *testing.T) {
	e, err := ellipse.FromSize(640, 440, ellipse.Point{X: 5, Y: -3}, 0.4)
	if err != nil {
		t.Fatal(err)
	}
	c, _ := e.Parallel(3)
	for _, g := range []Geometry{Lines, Arcs} {
		s := Spec{Curve: c, Zone: Outside, Tol: 0.02, Geometry: g, From: 1.2}
		first, err := Approximate(nil, s)
		if err != nil {
			t.Fatal(err)
		}
		// A reused Approximator after another spec gives the same path.
		var a Approximator
		if err := a.Reset(Spec{Curve: e.Curve(), Zone: Band, Tol: 0.5, Geometry: Arcs}); err != nil {
			t.Fatal(err)
		}
		for _, ok := a.Next(); ok; _, ok = a.Next() {
		}
		if err := a.Reset(s); err != nil {
			t.Fatal(err)
		}
		var second Path
		for seg, ok := a.Next(); ok; seg, ok = a.Next() {
			second = append(second, seg)
		}
		if d := cmp.Diff(first, second); d != "" {
			t.Errorf("%v: second run differs (-first +second):\n%s", g, d)
		}
	}
}

func TestApproximatorAllocatesNothingPerSegment(t *testing.T) {
	e, _ := ellipse.FromSize(600, 400, ellipse.Point{}, 0.2)
	// A slot 300 x 4 with a 2 mm offset at 0.05: short and strongly
	// varying, so the arcs look ahead and plan stretches backwards.
	slot, _ := ellipse.FromSize(300, 4, ellipse.Point{}, 0.2)
	slotCurve, _ := slot.Parallel(2)
	for _, s := range []Spec{
		{Curve: e.Curve(), Zone: Band, Tol: 0.001, Geometry: Lines},
		{Curve: e.Curve(), Zone: Band, Tol: 0.001, Geometry: Arcs},
		{Curve: slotCurve, Zone: Outside, Tol: 0.05, Geometry: Arcs},
	} {
		g := s.Geometry
		var a Approximator
		allocs := testing.AllocsPerRun(5, func() {
			if err := a.Reset(s); err != nil {
				t.Fatal(err)
			}
			for _, ok := a.Next(); ok; _, ok = a.Next() {
			}
		})
		if allocs != 0 {
			t.Errorf("%v: %v allocations per run, want 0", g, allocs)
		}
	}
}

func TestBadSpecsAreRefusedNamingTheField(t *testing.T) {
	e, _ := ellipse.FromSize(600, 400, ellipse.Point{}, 0)
	thin, _ := ellipse.FromSize(600, 20, ellipse.Point{}, 0) // b²/a = 0.333…
	for _, c := range []struct {
		name  string
		s     Spec
		field string
		err   error
	}{
		{"zero tol", Spec{Curve: e.Curve()}, "Tol", ErrTolerance},
		{"negative tol", Spec{Curve: e.Curve(), Tol: -1}, "Tol", ErrTolerance},
		{"NaN tol", Spec{Curve: e.Curve(), Tol: math.NaN()}, "Tol", ErrTolerance},
		{"infinite tol", Spec{Curve: e.Curve(), Tol: math.Inf(1)}, "Tol", ErrTolerance},
		{"too fine", Spec{Curve: e.Curve(), Tol: 1e-12, Decimals: -1}, "Tol", ErrTooFine},
		{"decimals", Spec{Curve: e.Curve(), Tol: 0.001, Decimals: 3}, "Decimals", ErrDecimals},
		{"zero curve", Spec{Tol: 1}, "Curve", ErrInvalid},
		{"band past the fold", Spec{Curve: thin.Curve(), Tol: 0.5}, "Curve", ErrOffset},
		{"empty open arc", Spec{Curve: e.Curve(), Tol: 1, Open: true, From: 1, To: 1}, "From", ErrRange},
		{"more than a turn", Spec{Curve: e.Curve(), Tol: 1, Open: true, To: 7}, "From", ErrRange},
	} {
		_, err := NewApproximator(c.s)
		var se *SpecError
		if !errors.As(err, &se) || !errors.Is(err, c.err) || se.Field != c.field {
			t.Errorf("%s: got %v, want a *SpecError on %s wrapping %v", c.name, err, c.field, c.err)
		}
	}
}

// TestPlanningSavesArcsWithoutLookAhead: on flat shapes whose paths are
// too long to look ahead, planning the falling stretches backwards (see
// arcState.planExit) takes fewer arcs than the greedy chain, whose steps
// there fall into a cycle with one short step in four. Both paths are
// measured here, the second with planning switched off after Reset.
func TestPlanningSavesArcsWithoutLookAhead(t *testing.T) {
	e, err := ellipse.FromSize(600, 60, ellipse.Point{X: 10, Y: 20}, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	curve, err := e.Parallel(0)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []float64{0.001, 1e-4} { // the flat gasket benchmark's tolerance, and finer
		s := Spec{Curve: curve, Zone: Band, Tol: c, Geometry: Arcs}
		count := func(plan bool) int {
			var a Approximator
			if err := a.Reset(s); err != nil {
				t.Fatal(err)
			}
			if a.look || !a.plans {
				t.Fatalf("%v: look %v, plans %v: not the case under test", c, a.look, a.plans)
			}
			a.plans = plan
			n := 0
			for _, ok := a.Next(); ok; _, ok = a.Next() {
				n++
			}
			if err := a.Err(); err != nil {
				t.Fatal(err)
			}
			return n
		}
		planned, greedy := count(true), count(false)
		t.Logf("%v: %d arcs planned, %d greedy", c, planned, greedy)
		if planned >= greedy {
			t.Errorf("%v: %d arcs with planning, %d without", c, planned, greedy)
		}
	}
}
