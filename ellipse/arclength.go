package ellipse

import "math"

// Arc length of the ellipse and of its parallel curves.
//
// All lengths are computed for the ellipse scaled to a semi-major axis of
// 1, so that no intermediate overflows, and in an internal frame where the
// major axis is the x axis: the parameter τ = t for an ellipse whose own x
// axis is the major one, and τ = t − π/2 when its own y axis is (the speed
// √(semiX²sin²t + semiY²cos²t) is then that of the ellipse with the axes
// exchanged, at τ). In that frame, with k = b/a, the length from 0 to
// r ∈ [−π/2, π/2] is Legendre's E written with Carlson's integrals (DLMF
// 19.25.7, scaled by the homogeneity of R_F and R_D):
//
//	L(r) = k²·sin r·[R_F(X, Y, k²) + (1 − k²)/3 · sin²r · R_D(X, Y, k²)]
//	X = k²cos²r,  Y = X + sin²r
//
// whose two terms are both positive, so L is exact to a few ulps for every
// axis ratio; L(π/2) is the quarter perimeter E(1 − k²). The ends of the
// major axis, where a flat ellipse turns sharply, sit at r = 0, where
// floating point is densest. Any τ is reduced to n·π + r with a three-part
// π (Cody and Waite) and s(τ + nπ) = s(τ) + n·P/2 (equivalently
// E(φ + nπ|m) = E(φ|m) + 2n·E(m), DLMF 19.2.10); the shift by π/2 is part
// of the same exact reduction.
//
// Arcs shorter than a quarter of the distance from their midpoint to the
// nearest complex singularity of the speed are integrated directly (see
// quadrature.go), which keeps their digits; longer arcs are differences of
// L at their two ends, from one interleaved duplication loop.

// π = piA + piB + piC to 1.7e-31; piA and piB have 24 significant bits so
// that h·piA and h·piB are exact for h with at most 29 significant bits
// (|h| < 2^28 for the half-integers used below).
const (
	piA = 3.1415927410125732
	piB = -8.742277657347586e-08
	piC = -3.4302489988857658e-15
)

// reduce returns n and r with t = n·π + r and r ∈ [−π/2, π/2].
func reduce(t float64) (n, r float64) {
	return reduceHalf(t, 0)
}

// reduceFrame returns n and r with τ = n·π + r for the internal parameter
// τ = t − phase·π/2 (see the top of this file), r ∈ [−π/2, π/2].
func (e Ellipse) reduceFrame(t float64) (n, r float64) {
	return reduceHalf(t, e.phase)
}

// reduceHalf returns n and r with t − phase·π/2 = n·π + r, r ∈ [−π/2, π/2],
// for phase 0 or 1. The quotient t/π is rounded, so n may be one off near
// the ends of the range; r is then moved back by π, because the Carlson
// form of L is even in cos r and would continue on the wrong branch.
func reduceHalf(t, phase float64) (n, r float64) {
	off := phase / 2
	n = math.Round(t/math.Pi - off)
	h := n + off // exact: at most 29 significant bits for |n| < 2^28
	r = ((t - h*piA) - h*piB) - float64(h*piC)
	switch {
	case r > math.Pi/2:
		n++
		h++
		r = ((t - h*piA) - h*piB) - float64(h*piC)
	case r < -math.Pi/2:
		n--
		h--
		r = ((t - h*piA) - h*piB) - float64(h*piC)
	}
	return n, r
}

// fromFrame returns t for the half-turn count n and reduced parameter r,
// the inverse of reduceFrame: t = h·π + r with h = n + phase/2, summed
// with the three-part π so that t is correctly rounded (h·math.Pi alone
// would be off by h·1.2e-16, which on the end caps of a parallel curve
// of a flat ellipse is a visible length).
func (e Ellipse) fromFrame(n, r float64) float64 {
	h := n + e.phase/2
	return h*piA + (h*piB + (float64(h*piC) + r))
}

// quarterLength returns the quarter perimeter of the ellipse with
// semi-axes 1 and k ≤ 1: L(π/2) = k²·[R_F(0, 1, k²) + (1 − k²)/3·R_D(0, 1, k²)].
func quarterLength(k float64) float64 {
	k2 := k * k
	rf, rd := rfrd(0, 1, k2)
	m1 := (1 - k) * (1 + k)
	return k2 * (rf + float64(m1/3)*rd)
}

// argsX returns the Carlson arguments X and Y at the reduced parameter
// with sine s and cosine c (Z = k²).
func (e Ellipse) argsX(s, c float64) (x, y float64) {
	x = float64(e.k2*c) * c
	return x, x + float64(s*s)
}

// lengthX returns L(r) from sin r and the Carlson values at r.
func (e Ellipse) lengthX(s, rf, rd float64) float64 {
	return float64(e.k2*s) * (rf + float64(float64(e.m1/3)*float64(s*s))*rd)
}

// turnX returns ν(r) = atan2(sin r, k·cos r), the angle of the outward
// normal in the internal frame, for r ∈ [−π/2, π/2]. Between two
// parameters the tangent turns by the difference of ν plus π per half
// turn.
func (e Ellipse) turnX(s, c float64) float64 {
	return math.Atan2(s, e.k*c)
}

// speedX returns the scaled speed √(sin²r + k²cos²r) in the internal frame.
func (e Ellipse) speedX(s, c float64) float64 {
	return math.Sqrt(float64(s*s) + float64(float64(e.k2*c)*c))
}

// scaledArc returns s_d(t0, t1)/a for the parallel curve at scaled
// distance dn = d/a (dn = 0 for the ellipse itself).
func (e Ellipse) scaledArc(t0, t1, dn float64) float64 {
	if t1 < t0 {
		return -e.scaledArc(t1, t0, dn)
	}
	// Here t1 ≥ t0, or one of them is NaN. For a short arc the difference
	// is exact (Sterbenz), or rounded once when the ends straddle 0.
	delta := t1 - t0
	n0, r0 := e.reduceFrame(t0)
	if delta <= e.quadSpan(r0+delta/2) {
		return e.quadArc(r0, delta, dn)
	}
	n1, r1 := e.reduceFrame(t1)
	s0, c0 := math.Sincos(r0)
	s1, c1 := math.Sincos(r1)
	x0, y0 := e.argsX(s0, c0)
	x1, y1 := e.argsX(s1, c1)
	// √X = k·|cos r| and √Z = k need no square root; Y > 0 always
	// (|sin r| and cos r are not both 0).
	rf0, rd0, rf1, rd1 := rfrdPairRoots(x0, y0, e.k2, e.k*math.Abs(c0), math.Sqrt(y0), e.k,
		x1, y1, e.k2, e.k*math.Abs(c1), math.Sqrt(y1), e.k)
	dl := e.lengthX(s1, rf1, rd1) - e.lengthX(s0, rf0, rd0)
	l := float64((n1-n0)*2*e.quarter) + dl
	if dn != 0 {
		l += dn * (float64((n1-n0)*math.Pi) + (e.turnX(s1, c1) - e.turnX(s0, c0)))
	}
	return l
}

// ArcLength returns the length of the ellipse from parameter t0 to t1,
// counter-clockwise, for any real t0 and t1 and any number of turns; it is
// negative when t1 < t0. It allocates nothing.
//
// The result is within a few ulps of the exact length of the arc between
// the two given (exactly represented) parameters, measured against
// mpmath to 2e-15 of the arc's own length from b/a = 1e-6 to 1 and out to
// ±1e4 turns: arcs shorter than a quarter of the local length scale
// (about b/a radians near the ends of the major axis, up to 1 radian
// elsewhere) are integrated directly, and longer ones come from Carlson's
// integrals at both ends, whose difference can then cancel only a few
// ulps.
//
// Special cases are:
//
//	ArcLength(t0, t1) = NaN if t0 or t1 is NaN or infinite
func (e Ellipse) ArcLength(t0, t1 float64) float64 {
	return e.a * e.scaledArc(t0, t1, 0)
}

// ParamAtArcLength returns the parameter t with ArcLength(0, t) = s, for
// any real s (several turns, negative too). It reduces s modulo half the
// perimeter and solves by Halley's method kept inside a bracket, from a
// starting point that leaves at most three evaluations of the length;
// the round trip ArcLength(0, ParamAtArcLength(s)) returns s to a few
// ulps of itself, short arcs from t = 0 included. The parameter itself
// is as exact as the length allows: near the ends of the major axis of a
// flat ellipse, where the curve moves only b per radian, an ulp of s
// moves t by an ulp of s over b. It allocates nothing.
//
// Special cases are:
//
//	ParamAtArcLength(s) = NaN if s is NaN or infinite
func (e Ellipse) ParamAtArcLength(s float64) float64 {
	return e.paramAt(s/e.a, 0)
}

// paramAt inverts s_d(0, t)/a = w for scaled length w and scaled offset dn.
func (e Ellipse) paramAt(w, dn float64) float64 {
	if math.IsNaN(w) || math.IsInf(w, 0) {
		return math.NaN()
	}
	qd := e.quarter + dn*(math.Pi/2) // scaled quarter length of the curve
	half := 2 * qd
	// In the internal frame the curve starts at τ = −phase·π/2, where the
	// length measured from τ = 0 is −phase·qd.
	w1 := w - e.phase*qd
	k := math.Round(w1 / half)
	res := math.FMA(-k, half, w1)
	if res > qd {
		res = qd
	} else if res < -qd {
		res = -qd
	}
	r, _ := e.solveReduced(res, dn, e.guess(res/qd, dn))
	t := e.fromFrame(k, r)
	if e.phase != 0 {
		t = e.polishNearStart(t, w, dn)
	}
	return t
}
