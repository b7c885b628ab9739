package toolpath

import "math"

// stepModel is the first-order model of one step of the arc chain, used
// to guess the step's length before measuring it (see arcState.search).
//
// Along the intended curve, by arc length s from the current point, the
// deviation δ of an arc of curvature k obeys δ″ = κ − k to first order in
// δ (see endDeviation). With the curve's κ changing at a steady κ′ = c,
// the start's deviation u₀ and slope v₀ (both off the middle of the zone)
// and the end deviation u₁ the deadbeat rule picks for the length L,
//
//	δ(s) = u₀ + v₀·s + A·s²/2 + c·s³/6,   A = 2(u₁ − u₀ − v₀L − cL³/6)/L²,
//
// a cubic whose extremes on [0, L] are at its ends or at the roots of
// δ′(s) = v₀ + A·s + c·s²/2. The use of the zone is the larger of
// max δ and −min δ over the half-width w.
type stepModel struct {
	u0, v0, c, w float64
	fixed        bool // the end deviation is u1, not the deadbeat rule's
	u1           float64
	iw, i2c      float64 // 1/w and 2/c, for ratio
}

// newStepModel returns the model of a step from deviation u0 and slope
// v0 along a curve whose κ′ is c, in a zone of half-width w, with the end
// deviation by the deadbeat rule (set fixed and u1 for another).
func newStepModel(u0, v0, c, w float64) stepModel {
	return stepModel{u0: u0, v0: v0, c: c, w: w, iw: 1 / w, i2c: 2 / c}
}

// ratio returns the model's use of the zone by a step of length l.
func (m *stepModel) ratio(l float64) float64 {
	u1 := m.u1
	if !m.fixed {
		u1 = deadbeat(m.u0, m.v0-m.c*l*l/12, l, endLimit*m.w)
	}
	a := 2 * (u1 - m.u0 - m.v0*l - m.c*l*l*l/6) / (l * l)
	hi, lo := max(m.u0, u1), min(m.u0, u1)
	// the roots of δ′ = v₀ + a·s + (c/2)·s², stably
	qa, qb, qc := m.c/2, a, m.v0
	r1, r2 := math.NaN(), math.NaN()
	if qa == 0 {
		if qb != 0 {
			r1 = -qc / qb
		}
	} else if disc := qb*qb - 4*qa*qc; disc >= 0 {
		q := -0.5 * (qb + math.Copysign(math.Sqrt(disc), qb))
		if q != 0 {
			r1, r2 = q*m.i2c, qc/q
		}
	}
	if r1 > 0 && r1 < l {
		d := m.u0 + r1*(m.v0+r1*(a/2+r1*m.c/6))
		hi, lo = max(hi, d), min(lo, d)
	}
	if r2 > 0 && r2 < l {
		d := m.u0 + r2*(m.v0+r2*(a/2+r2*m.c/6))
		hi, lo = max(hi, d), min(lo, d)
	}
	return max(hi, -lo) * m.iw
}

// span returns a length near l0 at which the model's use of the zone
// crosses target, within about 1%, given r0, the use at l0. The first
// guess takes the use to grow from the start's own |u₀|/w as l³; the
// crossing is then bracketed by steps of 1.3 and narrowed by regula falsi
// on l³ (the Illinois variant), in which the use grows about linearly.
// ok is false where no crossing lies within a factor of about 8 of l0.
func (m *stepModel) span(target, l0, r0 float64) (l float64, ok bool) {
	if !(l0 > 0) {
		return 0, false
	}
	a, fa := l0, r0-target
	if fa == 0 {
		return l0, true
	}
	// the guess, within a factor of two of l0
	base := math.Abs(m.u0) / m.w
	k := 2.0
	if fa > 0 {
		k = 0.5
	}
	if g := (target - base) / (r0 - base); g > 0 && !math.IsInf(g, 0) {
		k = max(0.5, min(2, math.Cbrt(g)))
	}
	b := a * k
	fb := m.ratio(b) - target
	// Longer steps use more of the zone: step on towards the crossing.
	k = 1.3
	if fb > 0 {
		k = 1 / 1.3
	}
	for i := 0; (fb > 0) == (fa > 0); i++ {
		if i == 8 {
			return 0, false
		}
		a, fa = b, fb
		b = a * k
		fb = m.ratio(b) - target
	}
	a3, b3 := a*a*a, b*b*b
	for i := 0; i < 6; i++ {
		c3 := b3 - fb*(b3-a3)/(fb-fa)
		c := cbrtNear(c3, b3, b)
		if math.Abs(c-b) <= 0.003*b {
			return c, true
		}
		fc := m.ratio(c) - target
		if fc == 0 {
			return c, true
		}
		if (fc > 0) != (fb > 0) {
			a3, fa = b3, fb
		} else {
			fa /= 2 // Illinois: the end kept twice counts half
		}
		b, b3, fb = c, c3, fc
	}
	return b, true
}

// cbrtNear returns the cube root of x given b, the cube root of b3 = b³,
// near it: within 10 % by a second-order series in x/b3 − 1 (error below
// 1e-4, well inside span's 0.3 %), else by math.Cbrt.
func cbrtNear(x, b3, b float64) float64 {
	if e := x/b3 - 1; e > -0.1 && e < 0.1 {
		return b * (1 + e/3*(1-e/3))
	}
	return math.Cbrt(x)
}
