package ellipse

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mathext"
)

// Published check values: B. C. Carlson, "Numerical computation of real
// or complex elliptic integrals", Numer. Algorithms 10 (1995), §3, given
// there to 14 significant digits.
func TestCarlsonPublishedValues(t *testing.T) {
	tests := []struct {
		name    string
		f       func(x, y, z float64) float64
		x, y, z float64
		want    float64
	}{
		{"RF", CarlsonRF, 1, 2, 0, 1.3110287771461},
		{"RF", CarlsonRF, 2, 3, 4, 0.58408284167715},
		{"RD", CarlsonRD, 0, 2, 1, 1.7972103521034},
		{"RD", CarlsonRD, 2, 3, 4, 0.16510527294261},
	}
	for _, tt := range tests {
		got := tt.f(tt.x, tt.y, tt.z)
		// 14 digits published: allow half a unit in the 14th.
		if math.Abs(got-tt.want) > 0.5e-13*math.Abs(tt.want) {
			t.Errorf("Carlson%s(%g, %g, %g) = %.15g, want %.14g (Carlson 1995, §3)", tt.name, tt.x, tt.y, tt.z, got, tt.want)
		}
	}
}

func TestCarlsonSpecialCases(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		name    string
		f       func(x, y, z float64) float64
		x, y, z float64
		want    float64
	}{
		{"RF", CarlsonRF, -1, 1, 1, nan},
		{"RF", CarlsonRF, 1, -1, 1, nan},
		{"RF", CarlsonRF, 1, 1, -1, nan},
		{"RF", CarlsonRF, nan, 1, 1, nan},
		{"RF", CarlsonRF, 1, nan, 1, nan},
		{"RF", CarlsonRF, 1, 1, nan, nan},
		{"RF", CarlsonRF, 0, 0, 1, inf},
		{"RF", CarlsonRF, 0, 1, 0, inf},
		{"RF", CarlsonRF, 1, 0, 0, inf},
		{"RF", CarlsonRF, 0, 0, 0, inf},
		{"RD", CarlsonRD, -1, 1, 1, nan},
		{"RD", CarlsonRD, 1, -1, 1, nan},
		{"RD", CarlsonRD, 1, 1, 0, nan},
		{"RD", CarlsonRD, 1, 1, -1, nan},
		{"RD", CarlsonRD, nan, 1, 1, nan},
		{"RD", CarlsonRD, 1, 1, nan, nan},
		{"RD", CarlsonRD, 0, 0, 1, inf},
		// Closed forms listed in DLMF §19.20 (equation numbers from
		// memory: 19.20.1, 19.20.18, 19.20.19): R_F(x,x,x) = x^(-1/2),
		// R_D(x,x,x) = x^(-3/2), R_F(0,1,1) = π/2, R_D(0,1,1) = 3π/4.
		{"RF", CarlsonRF, 4, 4, 4, 0.5},
		{"RD", CarlsonRD, 4, 4, 4, 0.125},
		{"RF", CarlsonRF, 0, 1, 1, math.Pi / 2},
		{"RD", CarlsonRD, 0, 1, 1, 3 * math.Pi / 4},
	}
	for _, tt := range tests {
		got := tt.f(tt.x, tt.y, tt.z)
		ok := got == tt.want || (math.IsNaN(got) && math.IsNaN(tt.want)) ||
			relErr(got, tt.want) <= 2e-16
		if !ok {
			t.Errorf("Carlson%s(%g, %g, %g) = %g, want %g", tt.name, tt.x, tt.y, tt.z, got, tt.want)
		}
	}
}

// randomTriple returns three non-negative arguments spread over many
// orders of magnitude, at most one of them zero.
func randomTriple(rng *rand.Rand) (x, y, z float64) {
	v := func() float64 { return math.Pow(10, 12*rng.Float64()-6) * rng.Float64() }
	x, y, z = v(), v(), v()
	switch rng.IntN(6) {
	case 0:
		x = 0
	case 1:
		y = 0
	}
	return x, y, z
}

// TestCarlsonIdentities checks, to about 4 ulps, identities the algorithm does not use
// directly: symmetry, homogeneity by exact powers of 4 (degree −1/2 for
// R_F and −3/2 for R_D, from the integrals DLMF 19.16.1 and 19.16.5 with
// t = λu), and the duplication
// theorem itself, R_F(x,y,z) = 2·R_F(x+λ, y+λ, z+λ) and
// R_D(x,y,z) = 2·R_D(x+λ, y+λ, z+λ) + 3/(√z·(z+λ)) with
// λ = √x√y + √y√z + √z√x (Carlson 1995, §2 and §4): the right-hand sides
// start one step further on, so a truncation error on the left would show.
func TestCarlsonIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 2000; i++ {
		x, y, z := randomTriple(rng)
		rf := CarlsonRF(x, y, z)
		for _, p := range [][3]float64{{y, z, x}, {z, x, y}, {y, x, z}} {
			if got := CarlsonRF(p[0], p[1], p[2]); relErr(got, rf) > 1e-15 {
				t.Errorf("R_F not symmetric: R_F(%g,%g,%g) = %.17g but R_F(%g,%g,%g) = %.17g", x, y, z, rf, p[0], p[1], p[2], got)
			}
		}
		if got := CarlsonRF(4*x, 4*y, 4*z); relErr(2*got, rf) > 1e-15 {
			t.Errorf("R_F(4·(%g,%g,%g)) = %.17g, want R_F/2 = %.17g", x, y, z, got, rf/2)
		}
		sx, sy, sz := math.Sqrt(x), math.Sqrt(y), math.Sqrt(z)
		lam := sx*sy + sy*sz + sz*sx
		if got := 2 * CarlsonRF(x+lam, y+lam, z+lam); relErr(got, rf) > 1e-15 {
			t.Errorf("R_F duplication at (%g,%g,%g): %.17g vs %.17g (rel %.1e)", x, y, z, got, rf, relErr(got, rf))
		}
		if z == 0 {
			continue
		}
		rd := CarlsonRD(x, y, z)
		if got := CarlsonRD(y, x, z); relErr(got, rd) > 1e-15 {
			t.Errorf("R_D(%g,%g,%g) = %.17g but R_D(%g,%g,%g) = %.17g", x, y, z, rd, y, x, z, got)
		}
		if got := CarlsonRD(x/4, y/4, z/4); relErr(got, 8*rd) > 1e-15 {
			t.Errorf("R_D((%g,%g,%g)/4) = %.17g, want 8·R_D = %.17g", x, y, z, got, 8*rd)
		}
		dup := 2*CarlsonRD(x+lam, y+lam, z+lam) + 3/(sz*(z+lam))
		if relErr(dup, rd) > 1.5e-15 {
			t.Errorf("R_D duplication at (%g,%g,%g): %.17g vs %.17g (rel %.1e)", x, y, z, dup, rd, relErr(dup, rd))
		}
	}
}

// TestCarlsonMatchesGonum compares with gonum.org/v1/gonum/mathext
// EllipticRF and EllipticRD (an independent implementation of Carlson's
// algorithm after TOMS 577, with its own series and stopping rule) over
// arguments within gonum's documented range.
func TestCarlsonMatchesGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	var worstF, worstD float64
	for i := 0; i < 5000; i++ {
		x, y, z := randomTriple(rng)
		if got, want := CarlsonRF(x, y, z), mathext.EllipticRF(x, y, z); relErr(got, want) > 2e-15 {
			t.Errorf("CarlsonRF(%g, %g, %g) = %.17g, gonum %.17g", x, y, z, got, want)
		} else {
			worstF = math.Max(worstF, relErr(got, want))
		}
		if z == 0 {
			continue
		}
		if got, want := CarlsonRD(x, y, z), mathext.EllipticRD(x, y, z); relErr(got, want) > 2e-15 {
			t.Errorf("CarlsonRD(%g, %g, %g) = %.17g, gonum %.17g", x, y, z, got, want)
		} else {
			worstD = math.Max(worstD, relErr(got, want))
		}
	}
	t.Logf("largest relative difference from gonum: R_F %.1e, R_D %.1e", worstF, worstD)
}

// TestCarlsonPairMatchesSingle checks that the interleaved loop agrees
// with two separate loops to rounding (the chain that converges first runs
// on with the other, so the last bits may differ).
func TestCarlsonPairMatchesSingle(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for i := 0; i < 1000; i++ {
		x0, y0, z0 := randomTriple(rng)
		x1, y1, z1 := randomTriple(rng)
		z0, z1 = z0+1e-3, z1+1e-3
		if x0+y0 == 0 || x1+y1 == 0 {
			continue
		}
		f0, d0, f1, d1 := rfrdPair(x0, y0, z0, x1, y1, z1)
		g0, e0 := rfrd(x0, y0, z0)
		g1, e1 := rfrd(x1, y1, z1)
		if relErr(f0, g0) > 1e-15 || relErr(d0, e0) > 1e-15 || relErr(f1, g1) > 1e-15 || relErr(d1, e1) > 1e-15 {
			t.Errorf("pair (%g,%g,%g), (%g,%g,%g): %v %v %v %v; single %v %v %v %v",
				x0, y0, z0, x1, y1, z1, f0, d0, f1, d1, g0, e0, g1, e1)
		}
	}
}
