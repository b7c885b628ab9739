package ellipse

import "math"

// Inverting the arc length: the parameter at a given length.

// guess returns a starting parameter in [−π/2, π/2] of the internal frame
// for the reduced, normalised length u ∈ [−1, 1] (a fraction of the
// quarter of the curve at scaled offset dn). For the ellipse itself it
// blends, by the axis ratio k, the circle (r ∝ u) and the flat limit
// (speed |sin r|, so u = 1 − cos r). A parallel curve adds dn·ν(r), ν the
// turn of the normal, whose inverse is exact: r = atan2(k·sin ν, cos ν).
// The two are blended by the share of the turn term in the quarter
// length, except for the outward parallels of flat ellipses, which are
// split into an end cap and a flat side instead.
func (e Ellipse) guess(u, dn float64) float64 {
	u = math.Max(-1, math.Min(1, u))
	circle := u * (math.Pi / 2)
	flat := math.Copysign(math.Acos(1-math.Abs(u)), u)
	r := e.k*circle + (1-e.k)*flat
	if dn > e.k2 && e.k < 0.2 {
		// A flat ellipse's outward parallel at more than the smallest
		// radius of curvature b²/a is nearly a stadium: from the end of
		// the major axis (r = 0) the first d·π/2 of the quarter is an end
		// cap, where the normal turns and the ellipse hardly advances,
		// and the rest is the flat side, where the ellipse's own length
		// accrues.
		w := math.Abs(u) * (e.quarter + dn*(math.Pi/2))
		if cap := dn * (math.Pi / 2); w < cap {
			sn, cn := math.Sincos(w / dn)
			r = math.Atan2(e.k*sn, cn)
		} else {
			v := math.Min(1, (w-cap)/e.quarter)
			r = e.k*v*(math.Pi/2) + (1-e.k)*math.Acos(1-v)
		}
		return math.Copysign(r, u)
	}
	if dn != 0 {
		alpha := dn * (math.Pi / 2) / (e.quarter + dn*(math.Pi/2))
		sn, cn := math.Sincos(circle)
		turn := math.Atan2(e.k*sn, cn)
		r = math.Max(-math.Pi/2, math.Min(math.Pi/2, r+alpha*(turn-r)))
	}
	return r
}

// cubicStop bounds the last Halley step, relative to the local length
// scale, after which the iteration stops without another evaluation:
// Halley's error is cubic, e_{n+1} ≈ K·e_n³ with K of order 1/ρ² for a
// length scale ρ over which the speed changes, so a step h ≤ 1e-6·ρ leaves
// an error of order 1e-18·ρ, below rounding. For results near 0 two more
// conditions matter: h³/ρ² must be below half an ulp of the result, and
// h at most 1e-3 of it, because a step computed at r carries the rounding
// of the length there, an ulp of r, into the next iterate. The scaled
// speed itself serves as ρ: near the ends of the major axis of a flat
// ellipse both shrink to b/a, and elsewhere ρ is at least the speed. For a
// parallel curve the smaller of that and its own speed is used.
const cubicStop = 1e-6

// solveReduced returns r ∈ [−π/2, π/2] with L_d(r) = w in the internal
// frame, starting at r0, and the number of length evaluations it took.
// L_d is increasing (its derivative, the speed of the parallel curve, is
// positive for admissible offsets), so a bracket is kept and a Halley step
// that leaves it, or whose denominator is not positive, is replaced by
// bisection. The bracket is [−π/2, π/2], narrowed for the ellipse itself
// by the bounds k ≤ speed ≤ 1: r lies between w and w/k.
func (e Ellipse) solveReduced(w, dn, r0 float64) (float64, int) {
	lo, hi := -math.Pi/2, math.Pi/2
	if dn == 0 {
		if w >= 0 {
			lo, hi = math.Min(w, hi), math.Min(w/e.k, hi)
		} else {
			lo, hi = math.Max(w/e.k, lo), math.Max(w, lo)
		}
		// The bounds are exact up to rounding; widen them by a few ulps.
		lo -= 0x1p-50 * math.Abs(lo)
		hi += 0x1p-50 * math.Abs(hi)
		if !(r0 > lo && r0 < hi) {
			r0 = lo + (hi-lo)/2
		}
	}
	r := r0
	for i := 1; i <= 100; i++ {
		s, c := math.Sincos(r)
		x, y := e.argsX(s, c)
		v := math.Sqrt(y) // scaled speed √(sin²r + k²cos²r)
		rf, rd := rfrdRoots(x, y, e.k2, e.k*math.Abs(c), v, e.k)
		f := e.lengthX(s, rf, rd)
		dv := float64(e.m1*s) * c / v
		fp, fpp, q := v, dv, 0.0
		if dn != 0 {
			f += dn * e.turnX(s, c)
			q = dn * e.k / (float64(v*v) * v) // d·κ: the parallel curve runs 1 + q times as fast
			fp = v + float64(q*v)
			fpp = dv * (1 - 2*q)
		}
		g := f - w
		if g == 0 {
			return r, i
		}
		if g < 0 {
			lo = r
		} else {
			hi = r
		}
		var next float64
		var done bool
		if q > 1 {
			next, done = e.turnStep(r, s, c, v, dv, fp, fpp, g, lo, hi)
		} else {
			next, done = paramStep(r, v, fp, fpp, g, lo, hi)
		}
		if done || next == r || hi-lo <= 0x1p-52*math.Max(math.Abs(lo), math.Abs(hi)) {
			return next, i
		}
		r = next
	}
	return r, 100
}

// paramStep returns the Halley step from r for the residual g, or a
// bisection of [lo, hi] when that step leaves the bracket, and whether
// the iteration may stop (see cubicStop).
func paramStep(r, v, fp, fpp, g, lo, hi float64) (next float64, done bool) {
	den := float64(2*fp*fp) - float64(g*fpp)
	step := -2 * g * fp / den
	next = r + step
	if den > 0 && next == r {
		return r, true // the step is below half an ulp: converged
	}
	if !(den > 0 && next > lo && next < hi) {
		return lo + (hi-lo)/2, false
	}
	return next, stopCubic(math.Abs(step), next, math.Min(v, fp))
}

// stopCubic reports whether a Halley step h to next, on the length scale
// rho, leaves an error below rounding (see cubicStop).
func stopCubic(h, next, rho float64) bool {
	return h <= cubicStop*rho && h <= 1e-3*math.Abs(next) &&
		float64(h*h)*h <= 0x1p-54*math.Abs(next)*float64(rho*rho)
}

// turnStep is the Halley step taken in the angle ν of the normal instead
// of in r, for an outward parallel curve where the offset d exceeds the
// radius of curvature (q = dκ > 1): there most of the length is d·ν, and
// on the end caps of a flat ellipse, where ν turns through almost π over
// a parameter range of order b/a, the length is a steep step in r but
// nearly linear in ν. With ν′ = dν/dr = k/v², the length as a function of
// ν has the derivatives F′ = f′/ν′ (the radius of curvature plus d) and
// F″ = (f″ + 2f′v′/v)/ν′², and ν's own length scale is k/v (the dual of
// the speed v). A step that leaves the bracket falls back to paramStep.
func (e Ellipse) turnStep(r, s, c, v, dv, fp, fpp, g, lo, hi float64) (next float64, done bool) {
	nup := e.k / float64(v*v)
	Fp := fp / nup
	Fpp := (fpp + float64(2*fp)*dv/v) / float64(nup*nup)
	den := float64(2*Fp*Fp) - float64(g*Fpp)
	h := -2 * g * Fp / den
	nu := e.turnX(s, c)
	nn := nu + h
	if den > 0 && nn > -math.Pi/2 && nn < math.Pi/2 {
		sn, cn := math.Sincos(nn)
		next = math.Atan2(e.k*sn, cn)
		if next == r {
			return r, true
		}
		if next > lo && next < hi {
			return next, stopCubic(math.Abs(h), nn, e.k/v)
		}
	}
	return paramStep(r, v, fp, fpp, g, lo, hi)
}

// polishNearStart refines a parameter t found in the internal frame when
// that frame starts a quarter turn away (own y axis the major one): there
// the reduced length w − qd has lost the digits of a short w, leaving an
// absolute error of order 1e-16 in t. If the arc from 0 to t is short
// enough to be integrated directly, Newton steps on that arc restore them.
// Each step leaves about an ulp of its starting point (the arc is exact
// only to its own ulps), so a tiny t starts instead from w over the speed
// at 0, where the speed is stationary and that guess is already close.
func (e Ellipse) polishNearStart(t, w, dn float64) float64 {
	_, r0 := e.reduceFrame(0)
	span := e.quadSpan(r0 + t/2)
	if math.Abs(t) > span {
		return t
	}
	speed := func(t float64) float64 {
		s, c := math.Sincos(t)
		v := math.Sqrt(e.speed2(s, c))
		return v + dn*e.k/float64(v*v)
	}
	if lin := w / speed(0); math.Abs(lin) < 1e-3*span {
		t = lin
	}
	for i := 0; i < 4; i++ {
		g := e.scaledArc(0, t, dn) - w
		step := g / speed(t)
		t -= step
		if math.Abs(step) <= 0x1p-54*math.Abs(t) {
			break
		}
	}
	return t
}
