package ellipse

import "math"

// LegendreE returns Legendre's incomplete elliptic integral of the second
// kind,
//
//	E(φ|m) = ∫₀^φ √(1 − m·sin²θ) dθ,
//
// for any real φ and any parameter m ≤ 1. The argument is the parameter
// m = k², not the modulus k. E is odd in φ and quasi-periodic:
// E(φ + nπ|m) = E(φ|m) + 2n·E(m) (DLMF 19.2.10), which reduces φ to
// r ∈ [−π/2, π/2] with a three-part π (exact for |φ| < 2²⁹π ≈ 1.7e9;
// beyond that the reduction error grows to about one ulp of φ).
//
// The reduced integral is Carlson's form (DLMF 19.25.5 and 19.25.7 with
// c = csc²r, scaled by the homogeneity of R_F and R_D):
//
//	E(r|m) = sin r·R_F(cos²r, 1 − m·sin²r, 1) − (m/3)·sin³r·R_D(cos²r, 1 − m·sin²r, 1)
//
// For m ≤ 0 both terms are positive. For 0 < m < 1 and |r| > π/4, where
// the difference would lose digits as m → 1, it uses instead the
// complement E(r|m) = E(m) − ∫_r^{π/2} √(1 − m·sin²θ) dθ, the integral
// written as the arc of the ellipse with semi-axes 1 and k' = √(1 − m)
// from the end of its minor axis, whose two Carlson terms are again both
// positive; the subtraction then loses at most a factor of 2. E(m) is
// the quarter perimeter of that ellipse, k'²·[R_F(0, 1, k'²) +
// (m/3)·R_D(0, 1, k'²)]. The integrals come from the shared duplication
// loop, two argument triples at once when E(m) is needed. The result is
// within a few ulps; very negative m (below about −1e300) overflows.
//
// Special cases are:
//
//	LegendreE(φ, 0) = φ
//	LegendreE(φ, 1) = 2n + sin r, for φ = nπ + r
//	LegendreE(φ, m) = NaN if m > 1, or φ or m is NaN or infinite
func LegendreE(phi, m float64) float64 {
	switch {
	case math.IsNaN(phi) || math.IsInf(phi, 0) || !(m <= 1) || math.IsInf(m, 0):
		return math.NaN()
	case m == 0:
		return phi
	}
	n, r := reduce(phi)
	if m == 1 {
		return 2*n + math.Sin(r)
	}
	s, c := math.Sincos(r)
	if m < 0 {
		x, y := c*c, 1-float64(m*s)*s
		if n == 0 {
			rf, rd := rfrd(x, y, 1)
			return legendreDirect(s, m, rf, rd)
		}
		rf, rd, cf, cd := rfrdPair(x, y, 1, 0, 1-m, 1)
		em := cf - float64(m/3)*cd // E(m), both terms positive
		return float64(2*n)*em + legendreDirect(s, m, rf, rd)
	}
	kc2 := 1 - m // k'², exact for m ≥ 1/2 (Sterbenz) and within an ulp below
	if math.Abs(r) <= math.Pi/4 {
		x, y := c*c, 1-float64(m*s)*s
		if n == 0 {
			rf, rd := rfrd(x, y, 1)
			return legendreDirect(s, m, rf, rd)
		}
		rf, rd, cf, cd := rfrdPair(x, y, 1, 0, 1, kc2)
		em := kc2 * (cf + float64(m/3)*cd)
		return float64(2*n)*em + legendreDirect(s, m, rf, rd)
	}
	// Complement: with σ = |sin r| and γ = cos r ≥ 0, the arc of the
	// ellipse (1, k') from its minor-axis end to the point at r is
	// k'²·γ·[R_F(X, Y, k'²) + (m/3)·γ²·R_D(X, Y, k'²)] with X = k'²σ²,
	// Y = X + γ², and E(r|m) = sign(r)·(E(m) − that arc).
	sg := math.Abs(s)
	x := float64(kc2*sg) * sg
	y := x + float64(c*c)
	rf, rd, cf, cd := rfrdPair(x, y, kc2, 0, 1, kc2)
	em := kc2 * (cf + float64(m/3)*cd)
	arc := float64(kc2*c) * (rf + float64(float64(m/3)*float64(c*c))*rd)
	return float64(2*n)*em + math.Copysign(em-arc, s)
}

// legendreDirect is sin r·R_F − (m/3)·sin³r·R_D.
func legendreDirect(s, m, rf, rd float64) float64 {
	return s * (rf - float64(float64(m/3)*float64(s*s))*rd)
}
