package ellipse

import (
	"math"
	"testing"
)

func TestDividerBasics(t *testing.T) {
	var zero Divider
	if _, ok := zero.Next(); ok {
		t.Error("the zero Divider yielded a point")
	}
	e := mustNew(t, Point{X: 2, Y: 3}, 4, 1, 0.5)
	one, err := e.Divide(nil, 1)
	if err != nil || len(one) != 1 || one[0].T != 0 || one[0].S != 0 || one[0].Point != e.PointAt(0) {
		t.Errorf("Divide(1) = %+v, %v; want the single point at t = 0", one, err)
	}
	// Divide appends and keeps what dst held.
	dst := []DivisionPoint{{T: -1}}
	dst, err = e.Divide(dst, 4)
	if err != nil || len(dst) != 5 || dst[0].T != -1 || dst[1].T != 0 {
		t.Fatalf("Divide(dst, 4) = %+v, %v", dst, err)
	}
	// Four points of an ellipse centred at its axes fall on the axis ends
	// only for a circle; here they are symmetric: t, π − t, π + t.
	if math.Abs(dst[3].T-math.Pi) > 1e-15 || math.Abs(dst[2].T+dst[4].T-2*math.Pi) > 1e-14 {
		t.Errorf("Divide(4) parameters %g %g %g %g are not symmetric", dst[1].T, dst[2].T, dst[3].T, dst[4].T)
	}
	d, err := NewDivider(e.Curve(), 7)
	if err != nil {
		t.Fatal(err)
	}
	if relErr(d.Length(), e.Perimeter()) > 0 || relErr(d.Spacing(), e.Perimeter()/7) > 1e-16 {
		t.Errorf("Length %g Spacing %g, want %g and %g", d.Length(), d.Spacing(), e.Perimeter(), e.Perimeter()/7)
	}
	n := 0
	for _, ok := d.Next(); ok; _, ok = d.Next() {
		n++
	}
	if n != 7 {
		t.Errorf("Divider yielded %d points, want 7", n)
	}
	if _, ok := d.Next(); ok {
		t.Error("Divider yielded a point after the last")
	}
}

// TestDivideCostPerPoint: each point after the first starts from its
// neighbour, so the number of length evaluations per point stays bounded
// as N grows (it falls towards one, where the second-order prediction is
// already within the stopping bound), which makes the division O(N).
func TestDivideCostPerPoint(t *testing.T) {
	for _, sz := range [][2]float64{{300, 200}, {200, 300}, {1, 1e-6}, {1e-3, 1}, {5, 5}} {
		e := mustNew(t, Point{}, sz[0], sz[1], 0)
		for _, d := range []float64{0, 0.5 * e.MinRadiusOfCurvature() * -1, 0.1 * e.a} {
			p, err := e.Parallel(d)
			if err != nil {
				t.Fatal(err)
			}
			for _, n := range []int{10, 100, 1000, 10000, 100000} {
				if testing.Short() && n > 1000 {
					continue
				}
				dv, _ := NewDivider(p, n)
				for _, ok := dv.Next(); ok; _, ok = dv.Next() {
				}
				per := float64(dv.evals) / float64(n-1)
				limit := 3.0
				if n <= 10 {
					limit = 4 // neighbours a tenth of the curve apart
				}
				if d > 0 && e.b <= 1e-3*e.a && n <= 100 {
					limit = 5 // the end caps of an outward parallel of a flat ellipse
				}
				if n >= 10000 {
					limit = 1.2
				}
				if per > limit {
					t.Errorf("rx=%g ry=%g d=%g N=%d: %.2f evaluations per point, want at most %g", sz[0], sz[1], d, n, per, limit)
				}
			}
		}
	}
}

// TestParamAtArcLengthEvaluationCount: from the starting guess, Halley's
// method with the cubic stopping rule needs at most three evaluations of
// the length (one duplication loop each) on the ellipse itself, for every
// axis ratio and every point of the half turn.
func TestParamAtArcLengthEvaluationCount(t *testing.T) {
	for _, k := range []float64{1e-6, 1e-4, 1e-3, 0.01, 0.1, 0.3, 0.5, 0.7, 0.9, 0.99, 0.999, 1} {
		e := mustNew(t, Point{}, 1, k, 0)
		total, worst := 0, 0
		const n = 2000
		for i := 0; i <= n; i++ {
			u := -1 + 2*float64(i)/n
			_, evals := e.solveReduced(u*e.quarter, 0, e.guess(u, 0))
			total += evals
			worst = max(worst, evals)
		}
		if mean := float64(total) / (n + 1); worst > 3 || mean > 2.7 {
			t.Errorf("b/a=%g: %d evaluations at worst, %.2f on average; want at most 3 and 2.7", k, worst, mean)
		}
		// Parallel curves, out to 3a and in to 0.9 of the limit b²/a:
		// a few more at worst, where the offset outruns the curvature.
		for _, dn := range []float64{0.01, 0.1, 1, 3, -0.5 * k * k, -0.9 * k * k} {
			qd := e.quarter + dn*math.Pi/2
			total, worst = 0, 0
			for i := 0; i <= n; i++ {
				u := -1 + 2*float64(i)/n
				_, evals := e.solveReduced(u*qd, dn, e.guess(u, dn))
				total += evals
				worst = max(worst, evals)
			}
			if mean := float64(total) / (n + 1); worst > 6 || mean > 3 {
				t.Errorf("b/a=%g d/a=%g: %d evaluations at worst, %.2f on average; want at most 6 and 3", k, dn, worst, mean)
			}
		}
	}
}
