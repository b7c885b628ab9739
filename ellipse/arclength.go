package ellipse

import "math"

// Arc length of the ellipse and of its parallel curves.
//
// For the ellipse with semi-axes rx (own x) and ry (own y) the arc length
// from 0 to t ∈ [−π/2, π/2] is Legendre's E written with Carlson's
// integrals (DLMF 19.25.7, with both sides scaled by ry² through the
// homogeneity of R_F and R_D, DLMF 19.16.E and 19.20):
//
//	s(0, t) = ry²·sin t·[R_F(X, Y, Z) + (rx² − ry²)/3 · sin²t · R_D(X, Y, Z)]
//	X = ry²cos²t,  Y = ry²cos²t + rx²sin²t,  Z = ry²
//
// which needs no case split on which axis is the major one: when rx > ry
// both terms are positive, and when ry > rx the difference loses at most
// log(4a/b) ulps (about 4 digits... at b/a = 1e-6 it is a factor of 15,
// which leaves 1e-15 relative). Any other t is reduced modulo π with a
// three-part π (Cody and Waite), using s(t + nπ) = s(t) + n·P/2
// (equivalently E(φ + nπ|m) = E(φ|m) + 2n·E(m), DLMF 19.2.10).
//
// Lengths are computed for the ellipse scaled to a semi-major axis of 1
// and multiplied back, so that no intermediate overflows.

// π = piA + piB + piC to 1.7e-31; piA and piB have 24 significant bits so
// that n·piA and n·piB are exact for |n| < 2^29.
const (
	piA = 3.1415927410125732
	piB = -8.742277657347586e-08
	piC = -3.4302489988857658e-15
)

// reduce returns n and r with t = n·π + r and r ∈ [−π/2, π/2].
func reduce(t float64) (n, r float64) {
	n = math.Round(t / math.Pi)
	r = ((t - n*piA) - n*piB) - n*piC
	return n, r
}

// quarterLength returns the quarter perimeter of the ellipse with
// semi-axes 1 and k ≤ 1, written with the major axis as rx so that both
// terms are positive.
func quarterLength(k float64) float64 {
	k2 := k * k
	rf, rd := rfrd(0, 1, k2)
	return k2 * (rf + (1-k2)/3*rd)
}

// lengthTerms returns the scaled arc length from 0 to r ∈ [−π/2, π/2] of
// the unit-major ellipse given its Carlson values at that r.
func (e Ellipse) lengthTerms(s, rf, rd float64) float64 {
	uy2 := e.uy * e.uy
	return uy2 * s * (rf + (e.ux*e.ux-uy2)/3*s*s*rd)
}

// carlsonArgs returns X and Y for r with sine s and cosine c (Z = uy²).
func (e Ellipse) carlsonArgs(s, c float64) (x, y float64) {
	x = e.uy * e.uy * c * c
	return x, x + e.ux*e.ux*s*s
}

// turn returns ν(r) = atan2(ux·sin r, uy·cos r), the angle of the outward
// normal less its value at r = 0, for r ∈ [−π/2, π/2]. The tangent turns by
// ν(t1) − ν(t0) (plus π per half turn) between two parameters.
func (e Ellipse) turn(s, c float64) float64 {
	return math.Atan2(e.ux*s, e.uy*c)
}

// scaledLength returns s_d(0, t)/a for the parallel curve at scaled
// distance dn = d/a (dn = 0 for the ellipse itself).
func (e Ellipse) scaledLength(t, dn float64) float64 {
	n, r := reduce(t)
	s, c := math.Sincos(r)
	x, y := e.carlsonArgs(s, c)
	rf, rd := rfrd(x, y, e.uy*e.uy)
	l := e.lengthTerms(s, rf, rd) + n*2*e.quarter
	if dn != 0 {
		l += dn * (e.turn(s, c) + n*math.Pi)
	}
	return l
}

// scaledArc returns (s_d(0, t1) − s_d(0, t0))/a with both ends in one
// duplication loop.
func (e Ellipse) scaledArc(t0, t1, dn float64) float64 {
	n0, r0 := reduce(t0)
	n1, r1 := reduce(t1)
	s0, c0 := math.Sincos(r0)
	s1, c1 := math.Sincos(r1)
	x0, y0 := e.carlsonArgs(s0, c0)
	x1, y1 := e.carlsonArgs(s1, c1)
	z := e.uy * e.uy
	rf0, rd0, rf1, rd1 := rfrdPair(x0, y0, z, x1, y1, z)
	dl := e.lengthTerms(s1, rf1, rd1) - e.lengthTerms(s0, rf0, rd0)
	l := (n1-n0)*2*e.quarter + dl
	if dn != 0 {
		l += dn * ((n1-n0)*math.Pi + e.turn(s1, c1) - e.turn(s0, c0))
	}
	return l
}

// ArcLength returns the length of the ellipse from parameter t0 to t1,
// counter-clockwise, for any real t0 and t1 and any number of turns; it is
// negative when t1 < t0. Exact to a few units in the last place of the
// larger of the result and the quarter perimeter (one duplication loop for
// both ends; no allocation).
//
// Special cases are:
//
//	ArcLength(t0, t1) = NaN if t0 or t1 is NaN or infinite
func (e Ellipse) ArcLength(t0, t1 float64) float64 {
	return e.a * e.scaledArc(t0, t1, 0)
}

// ParamAtArcLength returns the parameter t with ArcLength(0, t) = s, for
// any real s (several turns, negative too). It solves by Halley's method
// kept inside a bracket, after reducing s modulo half the perimeter; the
// round trip ArcLength(0, ParamAtArcLength(s)) returns s to about 1e-15
// relative of the larger of s and the perimeter.
//
// Special cases are:
//
//	ParamAtArcLength(s) = NaN if s is NaN or infinite
func (e Ellipse) ParamAtArcLength(s float64) float64 {
	return e.paramAt(s/e.a, 0)
}

// paramAt inverts scaledLength for scaled length w and scaled offset dn.
func (e Ellipse) paramAt(w, dn float64) float64 {
	if math.IsNaN(w) || math.IsInf(w, 0) {
		return math.NaN()
	}
	half := 2*e.quarter + dn*math.Pi // scaled half length
	k := math.Round(w / half)
	res := math.FMA(-k, half, w)
	qd := half / 2
	if res > qd {
		res = qd
	} else if res < -qd {
		res = -qd
	}
	r := e.solveReduced(res, dn, e.guess(res/qd))
	return k*math.Pi + r
}

// guess returns a starting parameter in [−π/2, π/2] for the reduced,
// normalised length u ∈ [−1, 1] (a fraction of the quarter): a blend, by
// the axis ratio, of the circle (t ∝ u) and of the flat limits (the
// speed tends to |sin t| when the own x axis is the major one, and to
// |cos t| when the own y axis is).
func (e Ellipse) guess(u float64) float64 {
	kc := e.b / e.a
	circle := u * math.Pi / 2
	var flat float64
	if e.ux >= e.uy {
		flat = math.Copysign(math.Acos(1-math.Min(1, math.Abs(u))), u)
	} else {
		flat = math.Asin(math.Max(-1, math.Min(1, u)))
	}
	return kc*circle + (1-kc)*flat
}

// solveReduced returns r ∈ [−π/2, π/2] with s_d(0, r)/a = w, starting at
// r0. The function is increasing (its derivative, the speed of the
// parallel curve, is positive for admissible offsets), so the bracket
// [−π/2, π/2] is kept and a Halley step that leaves it is replaced by
// bisection.
func (e Ellipse) solveReduced(w, dn, r0 float64) float64 {
	lo, hi := -math.Pi/2, math.Pi/2
	r := r0
	z := e.uy * e.uy
	uxy := e.ux * e.uy
	diff := e.ux*e.ux - z
	for i := 0; i < 60; i++ {
		s, c := math.Sincos(r)
		x, y := e.carlsonArgs(s, c)
		rf, rd := rfrd(x, y, z)
		f := e.lengthTerms(s, rf, rd)
		v := math.Sqrt(y) // speed of the scaled ellipse: √(ux²sin² + uy²cos²)
		dv := diff * s * c / v
		fp, fpp := v, dv
		if dn != 0 {
			f += dn * e.turn(s, c)
			v3 := v * v * v
			fp = v + dn*uxy/(v*v)
			fpp = dv * (1 - 2*dn*uxy/v3)
		}
		g := f - w
		if g == 0 {
			return r
		}
		if g < 0 {
			lo = r
		} else {
			hi = r
		}
		step := -2 * g * fp / (2*fp*fp - g*fpp)
		next := r + step
		if !(next > lo && next < hi) {
			next = lo + (hi-lo)/2
			step = next - r
		}
		if math.Abs(step) <= 2e-16*math.Max(1, math.Abs(r)) || next == r {
			return next
		}
		r = next
	}
	return r
}
