package ellipse

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mathext"
)

func TestLegendreESpecialCases(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		phi, m, want float64
	}{
		{nan, 0.5, nan},
		{1, nan, nan},
		{inf, 0.5, nan},
		{-inf, 0.5, nan},
		{1, 1.5, nan},
		{1, -inf, nan},
		{1, inf, nan},
		{0.7, 0, 0.7},
		{-12345.678, 0, -12345.678},
		{0, 0.5, 0},
		{0.3, 1, math.Sin(0.3)},
		{math.Pi / 2, 1, 1},
		{math.Pi, 1, 2},
		{-3 * math.Pi / 2, 1, -3},
	}
	for _, tt := range tests {
		got := LegendreE(tt.phi, tt.m)
		ok := got == tt.want || (math.IsNaN(got) && math.IsNaN(tt.want)) || relErr(got, tt.want) <= 4e-16
		if !ok {
			t.Errorf("LegendreE(%g, %g) = %.17g, want %.17g", tt.phi, tt.m, got, tt.want)
		}
	}
}

// TestLegendreEMatchesGonum compares with gonum.org/v1/gonum/mathext.
// Gonum's EllipticE(φ, m) takes the parameter m = k² (its doc:
// E(φ,m) = ∫₀^φ √(1 − m·sin²θ) dθ, with k = √m named as the modulus), the
// same convention as LegendreE, and does no range reduction, so only
// |φ| ≤ π/2 is compared. Its formula is the plain difference
// sin φ·R_F − (m/3)·sin³φ·R_D, which loses digits as m → 1 near φ = π/2,
// so the tolerance grows with log(1/(1 − m)) there. CompleteE(m) uses
// Fukushima's piecewise minimax approximations, independent of Carlson's
// method.
func TestLegendreEMatchesGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	ms := []float64{-1e6, -100, -3, -0.5, 0, 1e-10, 0.1, 0.5, 0.9, 0.99, 0.999999, 1 - 1e-12}
	for i := 0; i < 4000; i++ {
		m := ms[i%len(ms)]
		phi := (rng.Float64()*2 - 1) * math.Pi / 2
		got, want := LegendreE(phi, m), mathext.EllipticE(phi, m)
		tol := 2e-15
		if m > 0 {
			tol *= 1 + math.Log(1/(1-m))
		}
		if relErr(got, want) > tol {
			t.Errorf("LegendreE(%.17g, %g) = %.17g, gonum EllipticE %.17g (rel %.1e)", phi, m, got, want, relErr(got, want))
		}
	}
	for _, m := range []float64{0, 1e-10, 0.1, 0.5, 0.75, 0.9, 0.99, 0.999999, 1 - 1e-12, 1} {
		got, want := LegendreE(math.Pi/2, m), mathext.CompleteE(m)
		if relErr(got, want) > 2e-15 {
			t.Errorf("LegendreE(π/2, %g) = %.17g, gonum CompleteE %.17g (rel %.1e)", m, got, want, relErr(got, want))
		}
	}
}

// TestLegendreEReduction checks the quasi-periodicity
// E(φ + nπ|m) = E(φ|m) + 2n·E(m) (DLMF 19.2.10) and oddness, which the
// range reduction must reproduce for any φ.
func TestLegendreEReduction(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for i := 0; i < 2000; i++ {
		m := 1 - math.Pow(10, 8*rng.Float64()-6) // from 1 − 100 to 1 − 1e-6
		n := float64(rng.IntN(20001) - 10000)
		phi := (rng.Float64()*2 - 1) * math.Pi / 2
		full := n*math.Pi + phi
		want := LegendreE(phi, m) + 2*n*LegendreE(math.Pi/2, m)
		got := LegendreE(full, m)
		// full differs from nπ + φ by its rounding and by n·(π − math.Pi);
		// E moves by that times its speed, at most √max(1, 1 − m). Both
		// sides are also rounded a few times at the size of the result.
		shift := 0x1p-53*math.Abs(full) + math.Abs(n)*1.3e-16
		tol := 1e-15*math.Abs(want) + math.Sqrt(math.Max(1, 1-m))*shift
		if math.Abs(got-want) > tol {
			t.Errorf("LegendreE(%.17g, %g) = %.17g, want E(φ) + 2n·E(m) = %.17g", full, m, got, want)
		}
		if got, want := LegendreE(-full, m), -got; got != want {
			t.Errorf("LegendreE(%.17g, %g) = %.17g, want %.17g (odd)", -full, m, got, want)
		}
	}
}

// TestLegendreEIsTheEllipseArc ties LegendreE to ArcLength: the arc of the
// ellipse with semi-axes √(1 − m) along x and 1 along y from 0 to t is
// E(t|m) (for m ≤ 1 either axis may be the longer). ArcLength computes it
// in another frame and, for short arcs, by quadrature.
func TestLegendreEIsTheEllipseArc(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for _, m := range []float64{-1e6, -3, -0.5, 0.3, 0.9, 0.999999, 1 - 1e-12} {
		e := mustNew(t, Point{}, math.Sqrt(1-m), 1, 0)
		for i := 0; i < 200; i++ {
			phi := (rng.Float64()*2 - 1) * math.Pi * math.Pow(10, 4*rng.Float64())
			got, want := LegendreE(phi, m), e.ArcLength(0, phi)
			if relErr(got, want) > 4e-15 {
				t.Errorf("m=%g: LegendreE(%.17g) = %.17g, ArcLength = %.17g (rel %.1e)", m, phi, got, want, relErr(got, want))
			}
		}
	}
}
