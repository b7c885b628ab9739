package conformance

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

func TestPolylineRefusesWhatItCannotMeet(t *testing.T) {
	ord := mustEllipse(t, ellipse.Point{}, 60, 40, 0)
	flat := mustEllipse(t, ellipse.Point{}, 100, 0.1, 0)
	lim := ord.MinRadiusOfCurvature()
	tests := []struct {
		name  string
		curve ellipse.Parallel
		zone  toolpath.Zone
		tol   float64
		want  error
	}{
		{"zero", ord.Curve(), toolpath.Band, 0, ErrBadTolerance},
		{"negative", ord.Curve(), toolpath.Band, -0.1, ErrBadTolerance},
		{"NaN", ord.Curve(), toolpath.Band, math.NaN(), ErrBadTolerance},
		{"infinite", ord.Curve(), toolpath.Band, math.Inf(1), ErrBadTolerance},
		{"below the coordinates' resolution", ord.Curve(), toolpath.Band, 1e-12, ErrBadTolerance},
		// M = 100 + 5·(3·100² − 2·0.1²)/0.1² ≈ 1.5e7; N = 2π/√(8·2e-7/M) ≈ 1.9e7
		{"too many segments", mustParallel(t, flat, 5), toolpath.Band, 1e-7, ErrTooManySegments},
		// the vertices would sit just inside a curve that is itself at the fold
		{"vertex curve folds", mustParallel(t, ord, -(lim - 1e-9)), toolpath.Inside, 1, ellipse.ErrOffsetLimit},
	}
	for _, tt := range tests {
		dst := toolpath.Path{{Kind: toolpath.Dwell, Seconds: 1}}
		got, err := Polyline{}.Generate(dst, tt.curve, tt.zone, tt.tol)
		if !errors.Is(err, tt.want) {
			t.Errorf("%s: got error %v, want %v", tt.name, err, tt.want)
		}
		if len(got) != 1 || got[0] != dst[0] {
			t.Errorf("%s: dst changed to %d segments", tt.name, len(got))
		}
	}
}

// TestPolylineOnACircle checks the polygon against elementary geometry: on
// a circle of radius r the vertices lie on the circle of radius
// R = r + hi − μ and a regular N-gon inscribed in it dips R·(1 − cos(π/N))
// below it at the middle of each side. The zone must hold and, since the
// bound M = R is exact to fourth order for a circle, be nearly all used.
func TestPolylineOnACircle(t *testing.T) {
	for _, r := range []float64{0.05, 25, 2500} {
		for _, zone := range []toolpath.Zone{toolpath.Band, toolpath.Outside, toolpath.Inside} {
			for _, rel := range []float64{1e-3, 1e-6} {
				tol := rel * r
				e := mustEllipse(t, ellipse.Point{X: 3 * r, Y: -r}, r, r, 0.5)
				p, err := Polyline{}.Generate(nil, e.Curve(), zone, tol)
				if err != nil {
					t.Fatal(err)
				}
				lo, hi := zone.Limits(tol)
				mu := 1e-3 * (hi - lo)
				R := r + hi - mu
				n := float64(len(p))
				dip := R * (1 - math.Cos(math.Pi/n))
				used := dip / (hi - lo - 2*mu)
				if !(hi-mu-dip >= lo+mu) || used < 0.95 {
					t.Errorf("r %g %v tol %g: %d sides dip %.6g below the vertices: %.4f of the usable zone, want at most 1 and at least 0.95",
						r, zone, tol, len(p), dip, used)
				}
			}
		}
	}
}

// TestPolylineShape checks the promises of the doc comment: lines, cutting
// moves at Z 0, counter-clockwise from parameter 0, closing exactly on the
// first point, appended after what dst holds, vertices on the parallel
// curve at hi − μ.
func TestPolylineShape(t *testing.T) {
	e := mustEllipse(t, ellipse.Point{X: -20, Y: 7}, 40, 60, 0.3)
	c := mustParallel(t, e, 2)
	dst := toolpath.Path{{Kind: toolpath.Dwell, Seconds: 2}}
	p, err := Polyline{}.Generate(dst, c, toolpath.Inside, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if p[0] != dst[0] {
		t.Fatalf("dst's segment replaced: %+v", p[0])
	}
	seg := p[1:]
	v0 := mustParallel(t, e, 2-1e-5).PointAt(0)
	if seg[0].Start.X != v0.X || seg[0].Start.Y != v0.Y {
		t.Errorf("first vertex %+v, want %+v", seg[0].Start, v0)
	}
	area := 0.0
	for i, s := range seg {
		if s.Kind != toolpath.Line || s.Motion != toolpath.Cut || s.Start.Z != 0 || s.End.Z != 0 {
			t.Fatalf("segment %d: %+v", i, s)
		}
		if s.End != seg[(i+1)%len(seg)].Start {
			t.Fatalf("segment %d ends at %+v, next starts at %+v", i, s.End, seg[(i+1)%len(seg)].Start)
		}
		dev := e.SignedDistance(ellipse.Point{X: s.End.X, Y: s.End.Y}) - c.Offset()
		if math.Abs(dev-(-1e-5)) > 1e-12 {
			t.Fatalf("vertex %d deviates %.15g, want −1e-5 (hi − μ)", i, dev)
		}
		area += s.Start.X*s.End.Y - s.Start.Y*s.End.X
	}
	if area <= 0 {
		t.Errorf("signed area %g: not counter-clockwise", area/2)
	}
}
