package toolpath

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestEnvelopeCheck(t *testing.T) {
	// A half circle of radius 10 about the origin, counter-clockwise from
	// (0, −10) to (0, 10): it bulges to X = 10 between ends at X = 0.
	bulge := Path{
		{Kind: Line, Motion: Travel, Start: Point{0, -10, 5}, End: Point{0, -10, 5}},
		{Kind: Line, Motion: Cut, Start: Point{0, -10, 5}, End: Point{0, -10, -3}},
		{Kind: Arc, Motion: Cut, Start: Point{0, -10, -3}, End: Point{0, 10, -3}, Radius: 10},
		{Kind: Line, Motion: Travel, Start: Point{0, 10, -3}, End: Point{0, 10, 5}},
	}
	type want struct {
		axis  string
		max   bool
		value float64
		over  float64
	}
	cases := []struct {
		name string
		env  Envelope
		want []want
	}{
		{"inside", Envelope{MinX: -1, MinY: -10, MaxX: 10, MaxY: 10, MinZ: -3, MaxZ: 5, HasZ: true}, nil},
		{"arc bulges past X", Envelope{MinX: -1, MinY: -20, MaxX: 8, MaxY: 20}, []want{{"X", true, 10, 2}}},
		{"below Y and above Y", Envelope{MinX: -1, MinY: -9.5, MaxX: 20, MaxY: 9}, []want{{"Y", false, -10, 0.5}, {"Y", true, 10, 1}}},
		{"Z ignored without HasZ", Envelope{MinX: -1, MinY: -20, MaxX: 20, MaxY: 20, MinZ: 0, MaxZ: 1}, nil},
		{"too deep and too high", Envelope{MinX: -1, MinY: -20, MaxX: 20, MaxY: 20, MinZ: -2, MaxZ: 4, HasZ: true}, []want{{"Z", false, -3, 1}, {"Z", true, 5, 1}}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := c.env.Check(bulge)
			if len(c.want) == 0 {
				if err != nil {
					t.Errorf("unexpected %v", err)
				}
				return
			}
			if !errors.Is(err, ErrEnvelope) {
				t.Fatalf("got %v, want ErrEnvelope", err)
			}
			var first *EnvelopeError
			if !errors.As(err, &first) || first.Axis != c.want[0].axis {
				t.Fatalf("errors.As gives %v, want the %s axis first", first, c.want[0].axis)
			}
			joined, ok := err.(interface{ Unwrap() []error })
			if !ok {
				t.Fatalf("%T does not join its errors", err)
			}
			errs := joined.Unwrap()
			if len(errs) != len(c.want) {
				t.Fatalf("%d errors (%v), want %d", len(errs), err, len(c.want))
			}
			for i, w := range c.want {
				ee := errs[i].(*EnvelopeError)
				if ee.Axis != w.axis || ee.Max != w.max || math.Abs(ee.Value-w.value) > 1e-12 || math.Abs(ee.Over()-w.over) > 1e-12 {
					t.Errorf("error %d: %+v (over %g), want %+v", i, ee, ee.Over(), w)
				}
				if msg := ee.Error(); !strings.HasPrefix(msg, "toolpath: "+w.axis+" reaches ") || !strings.Contains(msg, " beyond the ") {
					t.Errorf("message %q does not name the axis and the excess", msg)
				}
			}
		})
	}
}

func TestEnvelopeMessage(t *testing.T) {
	p := Path{{Kind: Line, Motion: Cut, Start: Point{-312.5, 0, -1}, End: Point{0, 0, -1}}}
	err := Envelope{MinX: -300, MinY: -300, MaxX: 300, MaxY: 300}.Check(p)
	const want = "toolpath: X reaches -312.5, 12.5 beyond the lower travel limit -300: outside the machine's travel"
	if err == nil || err.Error() != want {
		t.Errorf("got %q, want %q", err, want)
	}
}

func TestEnvelopeRefusesABadBox(t *testing.T) {
	p := Path{{Kind: Line, Start: Point{0, 0, 0}, End: Point{1, 1, 0}}}
	cases := []struct {
		env Envelope
		err error
	}{
		{Envelope{MinX: 10, MaxX: 0, MaxY: 1}, ErrLimitOrder},
		{Envelope{MinX: math.NaN(), MaxX: 1, MaxY: 1}, ErrNotFinite},
		{Envelope{MaxX: 1, MaxY: math.Inf(1)}, ErrNotFinite},
		{Envelope{MaxX: 1, MaxY: 1, HasZ: true, MinZ: 2, MaxZ: 1}, ErrLimitOrder},
	}
	for _, c := range cases {
		if err := c.env.Check(p); !errors.Is(err, c.err) {
			t.Errorf("%+v: got %v, want %v", c.env, err, c.err)
		}
	}
	if err := (Envelope{}).Check(nil); err != nil {
		t.Errorf("empty path: %v", err)
	}
}

// A profile's own bounds pass an envelope that is exactly its box and
// fail one a hair smaller on each side, by that hair.
func TestEnvelopeAroundAProfile(t *testing.T) {
	e := opsShapes(t)["mirror"]
	p, err := Profile(nil, ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.02, SafeZ: 5, Geometry: Arcs}, Ellipse: e, Tool: 6, Depth: 6, StepDown: 3})
	if err != nil {
		t.Fatal(err)
	}
	x0, y0, x1, y1, _ := p.Bounds()
	z0, z1, _ := p.ZRange()
	box := Envelope{MinX: x0, MinY: y0, MaxX: x1, MaxY: y1, MinZ: z0, MaxZ: z1, HasZ: true}
	if err := box.Check(p); err != nil {
		t.Errorf("its own box: %v", err)
	}
	const h = 0.125
	small := Envelope{MinX: x0 + h, MinY: y0 + h, MaxX: x1 - h, MaxY: y1 - h, MinZ: z0 + h, MaxZ: z1 - h, HasZ: true}
	errs := small.Check(p).(interface{ Unwrap() []error }).Unwrap()
	if len(errs) != 6 {
		t.Fatalf("%d errors, want 6", len(errs))
	}
	for _, err := range errs {
		if ee := err.(*EnvelopeError); math.Abs(ee.Over()-h) > 1e-9 {
			t.Errorf("%v: over by %g, want %g", ee, ee.Over(), h)
		}
	}
}
