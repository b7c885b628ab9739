package ellipse

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mathext"
)

// TestPerimeterPublishedValues checks values known in closed form or
// quoted to 20 digits.
func TestPerimeterPublishedValues(t *testing.T) {
	tests := []struct {
		name   string
		rx, ry float64
		want   float64
		tol    float64
		source string
	}{
		// 4·E(0.75) for a = 1, b = 0.5, quoted to 20 digits.
		{"a=1 b=0.5", 1, 0.5, 4.8442241102738380992, 4e-16, "mpmath ellipe(0.75)·4 at 30 digits"},
		{"a=0.5 b=1", 0.5, 1, 4.8442241102738380992, 4e-16, "the same ellipse turned a quarter"},
		{"circle r=1", 1, 1, 2 * math.Pi, 2e-16, "2πr"},
		{"circle r=600", 600, 600, 1200 * math.Pi, 2e-16, "2πr"},
		{"circle r=1e-90", 1e-90, 1e-90, 2e-90 * math.Pi, 2e-16, "2πr"},
		{"circle r=1e90", 1e90, 1e90, 2e90 * math.Pi, 2e-16, "2πr"},
		// As b → 0 the ellipse is a doubled segment of length 2a: the
		// perimeter tends to 4a, plus 2(b²/a)·(ln(4a/b) − 1/2) from
		// E(k) ≈ 1 + (k'²/2)·(ln(4/k') − 1/2) (DLMF 19.12.2, from memory);
		// the next term is of order (b/a)⁴·ln(a/b), below rounding here.
		{"a=1 b=1e-5", 1, 1e-5, 4 + 2e-10*(math.Log(4e5)-0.5), 5e-16, "DLMF 19.12.2"},
		{"a=1 b=1e-9", 1, 1e-9, 4 + 2e-18*(math.Log(4e9)-0.5), 5e-16, "DLMF 19.12.2"},
	}
	for _, tt := range tests {
		e := mustNew(t, Point{}, tt.rx, tt.ry, 0)
		if got := e.Perimeter(); relErr(got, tt.want) > tt.tol {
			t.Errorf("%s: Perimeter() = %.17g, want %.17g (%s)", tt.name, got, tt.want, tt.source)
		}
	}
}

// ramanujan2 is Ramanujan's second approximation to the perimeter,
// π(a+b)·(1 + 3h/(10 + √(4 − 3h))), h = ((a − b)/(a + b))².
func ramanujan2(a, b float64) float64 {
	h := (a - b) / (a + b)
	h *= h
	return math.Pi * (a + b) * (1 + 3*h/(10+math.Sqrt(4-3*h)))
}

// TestPerimeterAboveRamanujan: Ramanujan's second approximation always
// underestimates the perimeter, by a relative amount that grows from
// O(h⁵) for near circles to 1 − 14π/44 ≈ 4.07e-4 as b/a → 0 (Villarino,
// "Ramanujan's perimeter of an ellipse", JIPAM 7(2) 2006; the limit is the
// formula itself at h = 1 against the perimeter 4a). Where the true gap
// is below rounding (b/a above about 0.6) only "not below by more than
// rounding" (a few ulps of both) can be checked.
func TestPerimeterAboveRamanujan(t *testing.T) {
	limit := 1 - 14*math.Pi/44
	for _, k := range []float64{1e-9, 1e-6, 1e-4, 1e-3, 0.01, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 0.9, 0.99, 1} {
		for _, a := range []float64{1, 600, 1e-3} {
			e := mustNew(t, Point{}, a, a*k, 0)
			p, r := e.Perimeter(), ramanujan2(a, a*k)
			gap := (p - r) / p
			switch {
			case k <= 0.5 && !(gap > 0):
				t.Errorf("b/a=%g a=%g: perimeter %.17g not above Ramanujan's %.17g", k, a, p, r)
			case gap < -1e-15:
				t.Errorf("b/a=%g a=%g: perimeter %.17g below Ramanujan's %.17g by %.1e", k, a, p, r, -gap)
			case gap > limit:
				t.Errorf("b/a=%g a=%g: Ramanujan's is %.3e low, beyond the b → 0 limit %.3e", k, a, gap, limit)
			}
		}
	}
	// Near b = 0 the gap approaches its limit.
	e := mustNew(t, Point{}, 1, 1e-9, 0)
	if gap := 1 - ramanujan2(1, 1e-9)/e.Perimeter(); math.Abs(gap-limit) > 1e-7 {
		t.Errorf("b/a=1e-9: Ramanujan's gap %.6e, want about %.6e", gap, limit)
	}
}

// TestArcLengthMatchesGonum compares with differences of
// gonum.org/v1/gonum/mathext.EllipticE: for an ellipse whose own y axis is
// the major one, s(t0, t1) = a·(E(t1|m) − E(t0|m)) with m = 1 − b²/a²,
// inside |t| ≤ π/2 where gonum applies. Gonum's difference cancels, so the
// tolerance is relative to |E(t0)| + |E(t1)|.
func TestArcLengthMatchesGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	for _, k := range []float64{1e-6, 1e-3, 0.1, 0.5, 0.9, 0.999999} {
		a := 250.0
		e := mustNew(t, Point{X: 3, Y: -4}, a*k, a, 0.3)
		m := (1 - k) * (1 + k)
		for i := 0; i < 300; i++ {
			t0 := (rng.Float64()*2 - 1) * math.Pi / 2
			t1 := (rng.Float64()*2 - 1) * math.Pi / 2
			e0, e1 := mathext.EllipticE(t0, m), mathext.EllipticE(t1, m)
			want := a * (e1 - e0)
			got := e.ArcLength(t0, t1)
			tol := 4e-15 * (1 + math.Log(1/k)) * a * (math.Abs(e0) + math.Abs(e1))
			if math.Abs(got-want) > tol {
				t.Errorf("b/a=%g: ArcLength(%.17g, %.17g) = %.17g, gonum %.17g", k, t0, t1, got, want)
			}
		}
	}
}

func TestArcLengthSpecialCases(t *testing.T) {
	e := mustNew(t, Point{}, 3, 2, 0)
	nan, inf := math.NaN(), math.Inf(1)
	for _, tt := range [][2]float64{{nan, 0}, {0, nan}, {inf, 0}, {0, inf}, {-inf, 0}, {0, -inf}, {inf, inf}} {
		if got := e.ArcLength(tt[0], tt[1]); !math.IsNaN(got) {
			t.Errorf("ArcLength(%g, %g) = %g, want NaN", tt[0], tt[1], got)
		}
	}
	for _, s := range []float64{nan, inf, -inf} {
		if got := e.ParamAtArcLength(s); !math.IsNaN(got) {
			t.Errorf("ParamAtArcLength(%g) = %g, want NaN", s, got)
		}
	}
	if got := e.ArcLength(1.25, 1.25); got != 0 {
		t.Errorf("ArcLength(1.25, 1.25) = %g, want 0", got)
	}
	if got := e.ParamAtArcLength(0); got != 0 {
		t.Errorf("ParamAtArcLength(0) = %g, want 0", got)
	}
	// Whole turns are whole perimeters, exactly as Perimeter reports them.
	for _, n := range []float64{1, 2, -3, 1000} {
		if got, want := e.ArcLength(0, n*2*math.Pi), n*e.Perimeter(); relErr(got, want) > 2e-16 {
			t.Errorf("ArcLength(0, %g·2π) = %.17g, want %.17g", n, got, want)
		}
	}
}

// TestGaussLegendreRule checks the constants of the 8-point rule: the
// nodes are roots of the Legendre polynomial P₈, the weights are
// 2/((1 − x²)·P₈'(x)²) (Abramowitz and Stegun 25.4.29), and the rule
// integrates x^j exactly for j ≤ 15.
func TestGaussLegendreRule(t *testing.T) {
	xs := []float64{glX0, glX1, glX2, glX3}
	ws := []float64{glW0, glW1, glW2, glW3}
	legendre := func(x float64) (p, dp float64) {
		p0, p1 := 1.0, x
		for n := 2; n <= 8; n++ {
			p0, p1 = p1, (float64(2*n-1)*x*p1-float64(n-1)*p0)/float64(n)
		}
		return p1, 8 * (x*p1 - p0) / (x*x - 1)
	}
	for i, x := range xs {
		p, dp := legendre(x)
		if math.Abs(p) > 1e-15 {
			t.Errorf("P₈(%.17g) = %g, want 0", x, p)
		}
		if w := 2 / ((1 - x*x) * dp * dp); relErr(ws[i], w) > 1e-15 {
			t.Errorf("weight at %.17g = %.17g, want %.17g", x, ws[i], w)
		}
	}
	for j := 0; j <= 15; j++ {
		sum := 0.0
		for i, x := range xs {
			sum += ws[i] * (math.Pow(x, float64(j)) + math.Pow(-x, float64(j)))
		}
		want := 0.0
		if j%2 == 0 {
			want = 2 / float64(j+1)
		}
		if math.Abs(sum-want) > 1e-15 {
			t.Errorf("∫x^%d: rule gives %.17g, want %.17g", j, sum, want)
		}
	}
}

// TestShortArcMethodsAgree checks that the two ways of computing an arc
// agree where both apply, around the span at which ArcLength switches
// from quadrature to the difference of Carlson forms.
func TestShortArcMethodsAgree(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 16))
	for _, k := range []float64{1e-6, 1e-3, 0.1, 0.5, 0.9, 1} {
		e := mustNew(t, Point{}, 1, k, 0)
		for i := 0; i < 400; i++ {
			r0 := (rng.Float64()*2 - 1) * math.Pi / 2
			span := e.quadSpan(r0)
			delta := span * (0.5 + 0.5*rng.Float64())
			quad := e.quadArc(r0, delta, 0)
			s0, c0 := math.Sincos(r0)
			_, r1 := reduce(r0 + delta)
			n1 := math.Round((r0 + delta) / math.Pi)
			s1, c1 := math.Sincos(r1)
			x0, y0 := e.argsX(s0, c0)
			x1, y1 := e.argsX(s1, c1)
			f0, d0 := rfrd(x0, y0, e.k2)
			f1, d1 := rfrd(x1, y1, e.k2)
			diff := n1*2*e.quarter + e.lengthX(s1, f1, d1) - e.lengthX(s0, f0, d0)
			if relErr(quad, diff) > 1e-14 {
				t.Errorf("b/a=%g r0=%.17g delta=%.3g: quadrature %.17g, Carlson %.17g (rel %.1e)", k, r0, delta, quad, diff, relErr(quad, diff))
			}
		}
	}
}
