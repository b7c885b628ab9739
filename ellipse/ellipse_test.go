package ellipse

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestConstructorsRejectBadInput: every bad input is an *Error that names
// the field, carries the value, wraps the right sentinel and states the
// limit when there is one.
func TestConstructorsRejectBadInput(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	o := Point{}
	circle := func() Ellipse { e, _ := New(o, 2, 1, 0); return e }
	tests := []struct {
		name  string
		build func() error
		field string
		value float64
		err   error
		limit float64 // 0: no limit stated
	}{
		{"New NaN x", func() error { _, err := New(o, nan, 1, 0); return err }, "semi-axis x", nan, ErrNotFinite, 0},
		{"New +Inf y", func() error { _, err := New(o, 1, inf, 0); return err }, "semi-axis y", inf, ErrNotFinite, 0},
		{"New −Inf x", func() error { _, err := New(o, -inf, 1, 0); return err }, "semi-axis x", -inf, ErrNotFinite, 0},
		{"New zero x", func() error { _, err := New(o, 0, 1, 0); return err }, "semi-axis x", 0, ErrNotPositive, 0},
		{"New negative y", func() error { _, err := New(o, 1, -2, 0); return err }, "semi-axis y", -2, ErrNotPositive, 0},
		{"New huge x", func() error { _, err := New(o, 1e200, 1e200, 0); return err }, "semi-axis x", 1e200, ErrOverflow, 1e100},
		{"New tiny y", func() error { _, err := New(o, 1e-120, 1e-120, 0); return err }, "semi-axis x", 1e-120, ErrTooSmall, 1e-100},
		{"New flat y", func() error { _, err := New(o, 1, 1e-10, 0); return err }, "semi-axis y", 1e-10, ErrTooFlat, 1e-9},
		{"New flat x", func() error { _, err := New(o, 1e-12, 1e-2, 0); return err }, "semi-axis x", 1e-12, ErrTooFlat, 1e-11},
		{"New NaN centre", func() error { _, err := New(Point{nan, 0}, 1, 1, 0); return err }, "center x", nan, ErrNotFinite, 0},
		{"New Inf centre", func() error { _, err := New(Point{0, inf}, 1, 1, 0); return err }, "center y", inf, ErrNotFinite, 0},
		{"New NaN rotation", func() error { _, err := New(o, 1, 1, nan); return err }, "rotation", nan, ErrNotFinite, 0},
		{"FromSize zero width", func() error { _, err := FromSize(0, 4, o, 0); return err }, "width", 0, ErrNotPositive, 0},
		{"FromSize negative height", func() error { _, err := FromSize(4, -1, o, 0); return err }, "height", -1, ErrNotPositive, 0},
		{"FromSize NaN height", func() error { _, err := FromSize(4, nan, o, 0); return err }, "height", nan, ErrNotFinite, 0},
		{"FromSize huge width", func() error { _, err := FromSize(3e100, 1e100, o, 0); return err }, "width", 3e100, ErrOverflow, 2e100},
		{"FromSize max float", func() error { _, err := FromSize(math.MaxFloat64, 1, o, 0); return err }, "width", math.MaxFloat64, ErrOverflow, 2e100},
		{"FromSize tiny height", func() error { _, err := FromSize(1e-150, 1e-150, o, 0); return err }, "width", 1e-150, ErrTooSmall, 2e-100},
		{"FromSize flat", func() error { _, err := FromSize(600, 1e-8, o, 0); return err }, "height", 1e-8, ErrTooFlat, 6e-7},
		{"FromSize Inf centre", func() error { _, err := FromSize(1, 1, Point{-inf, 0}, 0); return err }, "center x", -inf, ErrNotFinite, 0},
		{"FromSize Inf rotation", func() error { _, err := FromSize(1, 1, o, inf); return err }, "rotation", inf, ErrNotFinite, 0},
		{"FromFoci short", func() error { _, err := FromFoci(Point{-3, 0}, Point{3, 0}, 6); return err }, "major axis", 6, ErrFociTooFar, 6},
		{"FromFoci negative", func() error { _, err := FromFoci(o, o, -1); return err }, "major axis", -1, ErrNotPositive, 0},
		{"FromFoci NaN focus", func() error { _, err := FromFoci(Point{0, nan}, o, 5); return err }, "focus 1 y", nan, ErrNotFinite, 0},
		{"FromFoci Inf focus", func() error { _, err := FromFoci(o, Point{inf, 0}, 5); return err }, "focus 2 x", inf, ErrNotFinite, 0},
		{"FromFoci NaN length", func() error { _, err := FromFoci(o, Point{1, 0}, nan); return err }, "major axis", nan, ErrNotFinite, 0},
		{"FromFoci flat", func() error { _, err := FromFoci(Point{-1, 0}, Point{1, 0}, 2+1e-20); return err }, "major axis", 2, ErrFociTooFar, 2},
		{"FromBoundingBox inverted", func() error { _, err := FromBoundingBox(5, 0, 1, 3); return err }, "width", -4, ErrNotPositive, 0},
		{"FromBoundingBox empty", func() error { _, err := FromBoundingBox(0, 2, 4, 2); return err }, "height", 0, ErrNotPositive, 0},
		{"FromBoundingBox NaN", func() error { _, err := FromBoundingBox(0, 0, nan, 1); return err }, "max x", nan, ErrNotFinite, 0},
		{"FromBoundingBox overflow", func() error { _, err := FromBoundingBox(-1e308, 0, 1e308, 1); return err }, "width", inf, ErrNotFinite, 0},
		{"Parallel NaN", func() error { _, err := circle().Parallel(nan); return err }, "offset", nan, ErrNotFinite, 0},
		{"Parallel at limit", func() error { _, err := circle().Parallel(-0.5); return err }, "offset", -0.5, ErrOffsetLimit, -0.5},
		{"Parallel beyond limit", func() error { _, err := circle().Parallel(-3); return err }, "offset", -3, ErrOffsetLimit, -0.5},
		{"Parallel huge", func() error { _, err := circle().Parallel(1e120); return err }, "offset", 1e120, ErrOverflow, 1e100},
		{"NewDivider zero", func() error { _, err := NewDivider(circle().Curve(), 0); return err }, "count", 0, ErrCount, 1},
		{"Divide negative", func() error { _, err := circle().Divide(nil, -5); return err }, "count", -5, ErrCount, 1},
	}
	for _, tt := range tests {
		err := tt.build()
		if err == nil {
			t.Errorf("%s: no error", tt.name)
			continue
		}
		var ee *Error
		if !errors.As(err, &ee) {
			t.Errorf("%s: error %v is %T, not *Error", tt.name, err, err)
			continue
		}
		if !errors.Is(err, tt.err) {
			t.Errorf("%s: error %v does not wrap %v", tt.name, err, tt.err)
		}
		sameValue := ee.Value == tt.value || (math.IsNaN(ee.Value) && math.IsNaN(tt.value))
		if ee.Field != tt.field || !sameValue {
			t.Errorf("%s: field %q value %g, want %q %g", tt.name, ee.Field, ee.Value, tt.field, tt.value)
		}
		if tt.limit != 0 && (!ee.HasLimit || relErr(ee.Limit, tt.limit) > 1e-15) {
			t.Errorf("%s: limit %g (stated %v), want %g", tt.name, ee.Limit, ee.HasLimit, tt.limit)
		}
		if tt.limit == 0 && ee.HasLimit {
			t.Errorf("%s: states a limit %g, want none", tt.name, ee.Limit)
		}
		msg := err.Error()
		if !strings.HasPrefix(msg, "ellipse: "+tt.field+" ") || !strings.Contains(msg, tt.err.Error()) {
			t.Errorf("%s: message %q does not name %q and say %q", tt.name, msg, tt.field, tt.err)
		}
	}
}

// TestConstructorsAgree builds the same ellipse four ways.
func TestConstructorsAgree(t *testing.T) {
	// A 600 × 400 tabletop centred at (300, 200), not rotated; its foci
	// are at 300 ± √(300² − 200²) on the line y = 200.
	c := math.Sqrt(300*300 - 200*200)
	byNew := mustNew(t, Point{300, 200}, 300, 200, 0)
	bySize, err1 := FromSize(600, 400, Point{300, 200}, 0)
	byBox, err2 := FromBoundingBox(0, 0, 600, 400)
	byFoci, err3 := FromFoci(Point{300 - c, 200}, Point{300 + c, 200}, 600)
	if err := errors.Join(err1, err2, err3); err != nil {
		t.Fatal(err)
	}
	for name, e := range map[string]Ellipse{"FromSize": bySize, "FromBoundingBox": byBox, "FromFoci": byFoci} {
		if relErr(e.SemiMajor(), 300) > 1e-15 || relErr(e.SemiMinor(), 200) > 1e-15 ||
			e.Center() != byNew.Center() || math.Abs(e.MajorAngle()) > 1e-15 ||
			relErr(e.Perimeter(), byNew.Perimeter()) > 1e-15 {
			t.Errorf("%s: a=%g b=%g centre %v angle %g perimeter %g; New gives %g %g %v %g %g", name,
				e.SemiMajor(), e.SemiMinor(), e.Center(), e.MajorAngle(), e.Perimeter(),
				byNew.SemiMajor(), byNew.SemiMinor(), byNew.Center(), byNew.MajorAngle(), byNew.Perimeter())
		}
	}
	// Foci given the other way round give the same curve turned half a turn.
	flipped, err := FromFoci(Point{300 + c, 200}, Point{300 - c, 200}, 600)
	if err != nil || math.Abs(flipped.Rotation()-math.Pi) > 1e-15 || math.Abs(flipped.MajorAngle()) > 1e-15 {
		t.Errorf("flipped foci: rotation %g, major angle %g, %v", flipped.Rotation(), flipped.MajorAngle(), err)
	}
	// Equal foci give a circle.
	if e, err := FromFoci(Point{1, 2}, Point{1, 2}, 10); err != nil || e.SemiMajor() != 5 || e.SemiMinor() != 5 {
		t.Errorf("equal foci: %v %v", e, err)
	}
}

// TestDerivedQuantities checks the closed forms of the derived quantities
// for a spread of shapes in both orientations.
func TestDerivedQuantities(t *testing.T) {
	for _, sz := range [][2]float64{{300, 200}, {200, 300}, {1, 1}, {1, 1e-6}, {1e-6, 1}, {5e3, 4.95e3}} {
		rx, ry := sz[0], sz[1]
		e := mustNew(t, Point{-7, 11}, rx, ry, 0.9)
		a, b := math.Max(rx, ry), math.Min(rx, ry)
		c := math.Sqrt((a - b) * (a + b)) // a² − b² without cancellation
		checks := []struct {
			name      string
			got, want float64
		}{
			{"SemiMajor", e.SemiMajor(), a},
			{"SemiMinor", e.SemiMinor(), b},
			{"Eccentricity", e.Eccentricity(), c / a},
			{"FocalDistance", e.FocalDistance(), 2 * c},
			{"Area", e.Area(), math.Pi * a * b},
			{"MinRadiusOfCurvature", e.MinRadiusOfCurvature(), b * b / a},
			{"MaxRadiusOfCurvature", e.MaxRadiusOfCurvature(), a * a / b},
			// At t = 0 the curve is at the end of the own x semi-axis,
			// where κ = rx/ry².
			{"Curvature(0)", e.Curvature(0), rx / (ry * ry)},
			{"Curvature(π/2)", e.Curvature(math.Pi / 2), ry / (rx * rx)},
			{"RadiusOfCurvature(0)", e.RadiusOfCurvature(0), ry * ry / rx},
		}
		for _, ck := range checks {
			if relErr(ck.got, ck.want) > 2e-15 {
				t.Errorf("rx=%g ry=%g: %s = %.17g, want %.17g", rx, ry, ck.name, ck.got, ck.want)
			}
		}
		f1, f2 := e.Foci()
		for _, tt := range []float64{0, 0.3, 1, 2, 4, -2.5} {
			p := e.PointAt(tt)
			// Sum of focal distances is 2a at every point.
			if sum := math.Hypot(p.X-f1.X, p.Y-f1.Y) + math.Hypot(p.X-f2.X, p.Y-f2.Y); relErr(sum, 2*a) > 1e-14 {
				t.Errorf("rx=%g ry=%g: focal distances at t=%g sum to %.17g, want %.17g", rx, ry, tt, sum, 2*a)
			}
			tg, n := e.Tangent(tt), e.Normal(tt)
			if math.Abs(math.Hypot(tg.X, tg.Y)-1) > 1e-15 || math.Abs(tg.X*n.X+tg.Y*n.Y) > 1e-15 {
				t.Errorf("rx=%g ry=%g: tangent %v and normal %v at t=%g not orthonormal", rx, ry, tg, n, tt)
			}
			// The normal points outward: a step h along it lands at
			// signed distance h (the curve is convex).
			h := 1e-3 * a
			if d := e.SignedDistance(Point{p.X + h*n.X, p.Y + h*n.Y}); math.Abs(d-h) > 1e-12*a {
				t.Errorf("rx=%g ry=%g: a step %g along the normal at t=%g lands at distance %g", rx, ry, h, tt, d)
			}
			// The tangent is the direction of increasing t.
			q := e.PointAt(tt + 1e-7)
			if (q.X-p.X)*tg.X+(q.Y-p.Y)*tg.Y <= 0 {
				t.Errorf("rx=%g ry=%g: tangent at t=%g points backwards", rx, ry, tt)
			}
		}
	}
}
