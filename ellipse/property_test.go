package ellipse

import (
	"math"
	"testing"

	"pgregory.net/rapid"
)

// Property tests. Run longer with -rapid.checks=10000.

// drawEllipse draws an ellipse with semi-major axis from 1e-3 to 1e4,
// axis ratio from 1e-6 to 1 (log-uniform, the ends included), either axis
// the major one, anywhere in a 2000-unit square, at any rotation.
func drawEllipse(t *rapid.T) Ellipse {
	a := math.Pow(10, rapid.Float64Range(-3, 4).Draw(t, "log10 a"))
	k := math.Pow(10, rapid.Float64Range(-6, 0).Draw(t, "log10 b/a"))
	rx, ry := a, a*k
	if rapid.Bool().Draw(t, "y major") {
		rx, ry = ry, rx
	}
	c := Point{rapid.Float64Range(-1e3, 1e3).Draw(t, "cx"), rapid.Float64Range(-1e3, 1e3).Draw(t, "cy")}
	rot := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "rotation")
	e, err := New(c, rx, ry, rot)
	if err != nil {
		t.Fatalf("New(%v, %g, %g, %g): %v", c, rx, ry, rot, err)
	}
	return e
}

// drawParam draws a parameter near 0, within a few turns, or anywhere
// within ±1e4 turns.
func drawParam(t *rapid.T, label string) float64 {
	scale := rapid.SampledFrom([]float64{1e-3, 1, 2 * math.Pi, 20 * math.Pi, 2e4 * math.Pi}).Draw(t, label+" scale")
	return scale * rapid.Float64Range(-1, 1).Draw(t, label)
}

// drawOffset draws an offset from 0.9 of the inward limit b²/a to 3a
// outward, or 0.
func drawOffset(t *rapid.T, e Ellipse) float64 {
	u := rapid.Float64Range(-0.9, 1).Draw(t, "offset fraction")
	if u < 0 {
		return u * e.MinRadiusOfCurvature()
	}
	return 3 * u * e.a
}

func TestArcLengthIsAdditive(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		t0, t1, t2 := drawParam(t, "t0"), drawParam(t, "t1"), drawParam(t, "t2")
		s01, s12, s02 := e.ArcLength(t0, t1), e.ArcLength(t1, t2), e.ArcLength(t0, t2)
		// Each arc is within a few ulps of itself.
		if tol := 4e-15 * (math.Abs(s01) + math.Abs(s12)); math.Abs(s01+s12-s02) > tol {
			t.Fatalf("s(t0,t1) + s(t1,t2) = %.17g + %.17g = %.17g, s(t0,t2) = %.17g", s01, s12, s01+s12, s02)
		}
		if got := e.ArcLength(t1, t0); got != -s01 {
			t.Fatalf("s(t1,t0) = %.17g, want −s(t0,t1) = %.17g", got, -s01)
		}
	})
}

func TestArcLengthIsMonotonic(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		t0 := drawParam(t, "t0")
		d1 := math.Abs(drawParam(t, "d1"))
		d2 := math.Abs(drawParam(t, "d2"))
		if d1 > d2 {
			d1, d2 = d2, d1
		}
		t1, t2 := t0+d1, t0+d2
		s1, s2 := e.ArcLength(t0, t1), e.ArcLength(t0, t2)
		if s1 < 0 || s2 < s1*(1-4e-16) {
			t.Fatalf("t0=%.17g t1=%.17g t2=%.17g: s(t0,t1) = %.17g, s(t0,t2) = %.17g", t0, t1, t2, s1, s2)
		}
		// The length grows at least as fast as b and at most as fast as a.
		if lo, hi := e.b*(t2-t0), e.a*(t2-t0); s2 < lo*(1-1e-15) || s2 > hi*(1+1e-15) {
			t.Fatalf("s(%.17g, %.17g) = %.17g outside [b·Δt, a·Δt] = [%g, %g]", t0, t2, s2, lo, hi)
		}
	})
}

// TestParamAtArcLengthInvertsArcLength: inverse(forward(t)) = t to what
// the conditioning allows (an ulp of the length moves t by that over the
// speed), and forward(inverse(s)) = s to 1e-13 of |s|.
func TestParamAtArcLengthInvertsArcLength(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		d := drawOffset(t, e)
		p, err := e.Parallel(d)
		if err != nil {
			t.Fatalf("Parallel(%g): %v", d, err)
		}
		tt := drawParam(t, "t")
		s := p.ArcLength(0, tt)
		back := p.ParamAtArcLength(s)
		scale := math.Max(math.Abs(s), p.Length()/4)
		if tol := 1e-13*math.Max(1, math.Abs(tt)) + 1e-14*scale/p.Speed(tt); math.Abs(back-tt) > tol {
			t.Fatalf("d=%g: ParamAtArcLength(ArcLength(0, %.17g) = %.17g) = %.17g (diff %.1e, allowed %.1e)", d, tt, s, back, back-tt, tol)
		}
		s = rapid.Float64Range(-1, 1).Draw(t, "s fraction") * p.Length() * rapid.SampledFrom([]float64{1e-9, 1, 1e4}).Draw(t, "s turns")
		if math.Abs(s) < 1e-280*e.a {
			s = 0 // parameters this small would be subnormal, with fewer digits
		}
		u := p.ParamAtArcLength(s)
		got := p.ArcLength(0, u)
		// The parameter is a double: rounding it moves the length by up
		// to the speed times half an ulp of u.
		if tol := 1e-13*math.Abs(s) + p.Speed(u)*0x1p-53*math.Abs(u); math.Abs(got-s) > tol {
			t.Fatalf("d=%g: ArcLength(0, ParamAtArcLength(%.17g) = %.17g) = %.17g (rel %.1e)", d, s, u, got, relErr(got, s))
		}
	})
}

func TestPerimeterIsBetweenClassicalBounds(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		a, b := e.a, e.b
		p := e.Perimeter()
		// π(a + b) ≤ P ≤ π√(2(a² + b²)), equal for a circle.
		lo := math.Pi * (a + b)
		hi := math.Pi * math.Sqrt(2*(a*a+b*b))
		if p < lo*(1-4e-16) || p > hi*(1+4e-16) {
			t.Fatalf("a=%g b=%g: perimeter %.17g outside [%.17g, %.17g]", a, b, p, lo, hi)
		}
		if p < ramanujan2(a, b)*(1-1e-15) {
			t.Fatalf("a=%g b=%g: perimeter %.17g below Ramanujan's II %.17g", a, b, p, ramanujan2(a, b))
		}
	})
}

// TestOffsetPointHasSignedDistanceOffset: the point p(t) + d·n(t) lies at
// signed distance d, outward for any d > 0 and inward for −d below b²/a
// (which keeps it short of the medial axis, so p(t) stays its nearest
// point). The point itself is rounded to the coordinates' ulps, so the
// check is relative to max(|d|, a, |centre|).
func TestOffsetPointHasSignedDistanceOffset(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		d := drawOffset(t, e)
		tt := drawParam(t, "t")
		p, err := e.Parallel(d)
		if err != nil {
			t.Fatalf("Parallel(%g): %v", d, err)
		}
		q := p.PointAt(tt)
		got := e.SignedDistance(q)
		scale := math.Max(math.Abs(d), math.Max(e.a, math.Max(math.Abs(e.cx), math.Abs(e.cy))))
		if math.Abs(got-d) > 1e-12*scale {
			t.Fatalf("t=%.17g d=%.17g: SignedDistance(%v) = %.17g (diff %.1e, scale %g)", tt, d, q, got, got-d, scale)
		}
	})
}

// TestGeometryIsInvariantUnderRigidMotion: moving and turning the ellipse
// moves its points and keeps distances and lengths; relabelling the axes
// (semiX, semiY, θ) → (semiY, semiX, θ + π/2) gives the same curve with
// the parameter shifted by π/2, which exercises both internal frames.
func TestGeometryIsInvariantUnderRigidMotion(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		shift := Point{rapid.Float64Range(-100, 100).Draw(t, "dx"), rapid.Float64Range(-100, 100).Draw(t, "dy")}
		turn := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "turn")
		c := e.Center()
		moved := mustNew(t, Point{c.X + shift.X, c.Y + shift.Y}, e.rx, e.ry, e.rot+turn)
		relabelled := mustNew(t, c, e.ry, e.rx, e.rot+math.Pi/2)
		sn, cs := math.Sincos(turn)
		motion := func(p Point) Point {
			dx, dy := p.X-c.X, p.Y-c.Y
			return Point{c.X + shift.X + cs*dx - sn*dy, c.Y + shift.Y + sn*dx + cs*dy}
		}
		tt := drawParam(t, "t")
		size := e.a + math.Abs(c.X) + math.Abs(c.Y) + 200
		p, pm := e.PointAt(tt), moved.PointAt(tt)
		if m := motion(p); math.Hypot(m.X-pm.X, m.Y-pm.Y) > 1e-13*size {
			t.Fatalf("moved PointAt(%g) = %v, want %v", tt, pm, m)
		}
		pr := relabelled.PointAt(tt - math.Pi/2)
		if math.Hypot(pr.X-p.X, pr.Y-p.Y) > 1e-13*size*math.Max(1, math.Abs(tt)) {
			t.Fatalf("relabelled PointAt(%g − π/2) = %v, want %v", tt, pr, p)
		}
		q := Point{rapid.Float64Range(-2, 2).Draw(t, "qx")*e.a + c.X, rapid.Float64Range(-2, 2).Draw(t, "qy")*e.a + c.Y}
		d := e.SignedDistance(q)
		if dm := moved.SignedDistance(motion(q)); math.Abs(dm-d) > 1e-12*size {
			t.Fatalf("SignedDistance(%v) = %.17g but after the motion %.17g", q, d, dm)
		}
		if dr := relabelled.SignedDistance(q); math.Abs(dr-d) > 1e-12*size {
			t.Fatalf("SignedDistance(%v) = %.17g but relabelled %.17g", q, d, dr)
		}
		t0, t1 := drawParam(t, "t0"), drawParam(t, "t1")
		s := e.ArcLength(t0, t1)
		if sm := moved.ArcLength(t0, t1); sm != s {
			t.Fatalf("moved ArcLength = %.17g, want %.17g", sm, s)
		}
		// t − π/2 is rounded: allow the speed times an ulp of t at each end.
		slack := e.a * 0x1p-52 * (math.Abs(t0) + math.Abs(t1) + 4)
		if sr := relabelled.ArcLength(t0-math.Pi/2, t1-math.Pi/2); math.Abs(sr-s) > 4e-15*math.Abs(s)+slack {
			t.Fatalf("relabelled ArcLength(%g, %g) = %.17g, want %.17g", t0, t1, sr, s)
		}
		if relErr(relabelled.Perimeter(), e.Perimeter()) > 0 {
			t.Fatalf("relabelled perimeter %.17g, want %.17g", relabelled.Perimeter(), e.Perimeter())
		}
	})
}

// TestDivisionPointsAreEquallySpaced checks Divide with ArcLength between
// neighbours (and the closing gap back to the first point).
func TestDivisionPointsAreEquallySpaced(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		d := drawOffset(t, e)
		n := rapid.IntRange(1, 2000).Draw(t, "n")
		p, err := e.Parallel(d)
		if err != nil {
			t.Fatalf("Parallel(%g): %v", d, err)
		}
		pts, err := p.Divide(nil, n)
		if err != nil {
			t.Fatalf("Divide(%d): %v", n, err)
		}
		if len(pts) != n || pts[0].T != 0 || pts[0].S != 0 {
			t.Fatalf("Divide(%d): %d points, first %+v", n, len(pts), pts[0])
		}
		spacing := p.Length() / float64(n)
		vmax := p.Speed(0) + p.Speed(math.Pi/2) // at least the largest speed
		for i := range pts {
			t0 := pts[i].T
			t1 := 2 * math.Pi
			if i+1 < n {
				t1 = pts[i+1].T
			}
			if !(t1 > t0) {
				t.Fatalf("n=%d d=%g: T[%d] = %.17g, T[%d] = %.17g not increasing", n, d, i, t0, i+1, t1)
			}
			gap := p.ArcLength(t0, t1)
			// A point's length from t = 0 is known to a few ulps of the
			// ellipse's length plus |d| times the turn (for an inward
			// offset the curve is the difference of the two, and the
			// quarter length q + dπ/2 carries the ulps of q into every
			// half turn), and its parameter to an ulp.
			tol := 1e-13*spacing + 1e-15*(e.Perimeter()+2*math.Pi*math.Abs(d)) + vmax*0x1p-51*(2*math.Pi)
			if math.Abs(gap-spacing) > tol {
				t.Fatalf("n=%d d=%g: arc from point %d to %d = %.17g, spacing %.17g (diff %.1e, allowed %.1e)", n, d, i, i+1, gap, spacing, gap-spacing, tol)
			}
			if want := float64(i) * spacing; math.Abs(pts[i].S-want) > 1e-15*p.Length() {
				t.Fatalf("S[%d] = %.17g, want %.17g", i, pts[i].S, want)
			}
			if q := p.PointAt(t0); q != pts[i].Point {
				t.Fatalf("point %d = %v, PointAt(T) = %v", i, pts[i].Point, q)
			}
		}
	})
}

// bruteDistance returns the signed distance from p by dense sampling of
// the curve and a golden-section refinement of the best sample: slow, but
// independent of Eberly's method. The distance is stationary at the foot
// point, so the refinement's 1e-9 rad in t leaves it exact to rounding.
func bruteDistance(e Ellipse, p Point) float64 {
	d2 := func(t float64) float64 {
		q := e.PointAt(t)
		return (q.X-p.X)*(q.X-p.X) + (q.Y-p.Y)*(q.Y-p.Y)
	}
	const n = 8192
	best, bt := math.Inf(1), 0.0
	for i := 0; i < n; i++ {
		t := 2 * math.Pi * float64(i) / n
		if v := d2(t); v < best {
			best, bt = v, t
		}
	}
	lo, hi := bt-2*math.Pi/n, bt+2*math.Pi/n
	const g = 0.6180339887498949
	for hi-lo > 1e-12 {
		m1, m2 := hi-g*(hi-lo), lo+g*(hi-lo)
		if d2(m1) < d2(m2) {
			hi = m2
		} else {
			lo = m1
		}
	}
	d := math.Sqrt(d2((lo + hi) / 2))
	lx, ly := e.toLocal(p)
	if lx*lx/(e.rx*e.rx)+ly*ly/(e.ry*e.ry) < 1 {
		d = -d
	}
	return d
}

// TestSignedDistanceNearEvoluteMatchesBruteForce: points near the centre
// of curvature p(t) − R(t)·n(t), where the nearest point jumps between
// branches and Eberly's root is hardest to find, get the distance a dense
// search finds. Axis ratios down to 1e-2 keep the search's samples finer
// than the tips.
func TestSignedDistanceNearEvoluteMatchesBruteForce(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		a := math.Pow(10, rapid.Float64Range(-1, 3).Draw(t, "log10 a"))
		k := math.Pow(10, rapid.Float64Range(-2, 0).Draw(t, "log10 b/a"))
		rx, ry := a, a*k
		if rapid.Bool().Draw(t, "y major") {
			rx, ry = ry, rx
		}
		e := mustNew(t, Point{X: 3, Y: -2}, rx, ry, rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "rotation"))
		tt := rapid.Float64Range(0, 2*math.Pi).Draw(t, "t")
		f := rapid.Float64Range(0.9, 1.1).Draw(t, "fraction of R")
		q, n := e.PointAt(tt), e.Normal(tt)
		r := f * e.RadiusOfCurvature(tt)
		p := Point{q.X - r*n.X, q.Y - r*n.Y}
		got, want := e.SignedDistance(p), bruteDistance(e, p)
		if tol := 1e-12 * math.Max(math.Abs(want), e.a); math.Abs(got-want) > tol {
			t.Fatalf("SignedDistance(%v) = %.17g, dense search %.17g (diff %.1e)", p, got, want, got-want)
		}
	})
}
