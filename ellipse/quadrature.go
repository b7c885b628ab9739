package ellipse

import "math"

// Short arcs by Gauss–Legendre quadrature.
//
// The difference L(r1) − L(r0) of a short arc cancels the digits the two
// ends share. The speed √(k² + (1 − k²)·sin²r) is analytic except at its
// branch points r = nπ ± i·atanh(k), so on an interval of half-length h
// whose midpoint lies at distance D from the nearest of them, the n-point
// Gauss–Legendre rule errs by about ρ^(−2n) relative, ρ ≈ 2D/h the
// parameter of the largest Bernstein ellipse free of singularities: the
// bound is (64/15)·M·ρ^(−2n)/(ρ² − 1), M the largest |speed| inside it
// (Trefethen, "Is Gauss quadrature better than Clenshaw–Curtis?", SIAM
// Review 50 (2008); the constant quoted from memory). With n = 8 and
// h ≤ D/8, ρ ≥ 16 and ρ^(−16) < 1e-19. Arcs up to D/4 long (and at most 1
// radian) are therefore integrated directly; beyond that the difference
// of L loses at most a few ulps of the arc, because the arc is then long
// against the scale on which L changes. The tests check both methods
// against each other around the switch and against mpmath.

// Nodes ±glX and weights glW of the 8-point Gauss–Legendre rule on
// [−1, 1] (Abramowitz and Stegun, Table 25.4; these digits recomputed as
// the roots of P₈ with mpmath at 40 digits and checked in the tests).
const (
	glX0 = 0.1834346424956498
	glX1 = 0.525532409916329
	glX2 = 0.7966664774136267
	glX3 = 0.9602898564975363
	glW0 = 0.362683783378362
	glW1 = 0.31370664587788727
	glW2 = 0.22238103445337448
	glW3 = 0.10122853629037626
)

// quadSpan returns the longest parameter span integrated directly around
// the reduced midpoint rm (internal frame): min(1, D/4) with D the
// distance from rm to the nearest branch point of the speed (1 for a
// circle, whose speed is constant).
func (e Ellipse) quadSpan(rm float64) float64 {
	if rm > math.Pi/2 {
		rm -= math.Pi
	} else if rm < -math.Pi/2 {
		rm += math.Pi
	}
	// atk is +Inf for a circle, and then so is the distance.
	d := math.Sqrt(float64(rm*rm) + float64(e.atk*e.atk))
	if d >= 4 {
		return 1
	}
	return d / 4
}

// quadArc returns s_d/a over the internal-frame interval [r0, r0 + delta]
// (0 ≤ delta ≤ 1) by the 8-point rule, plus dn times the turn of the
// normal over it.
func (e Ellipse) quadArc(r0, delta, dn float64) float64 {
	h := delta / 2
	sm, cm := math.Sincos(r0 + h)
	sum := e.nodePair(sm, cm, h*glX3, glW3)
	sum += e.nodePair(sm, cm, h*glX2, glW2)
	sum += e.nodePair(sm, cm, h*glX1, glW1)
	sum += e.nodePair(sm, cm, h*glX0, glW0)
	l := h * sum
	if dn != 0 {
		// The normals at the ends are (k·cos r, sin r); the angle between
		// them from their cross and dot products, free of cancellation
		// in the cross product: k·sin(r1 − r0).
		s0, c0 := math.Sincos(r0)
		s1, c1 := math.Sincos(r0 + delta)
		l += dn * math.Atan2(e.k*math.Sin(delta), float64(float64(e.k2*c0)*c1)+float64(s0*s1))
	}
	return l
}

// nodePair returns w·(v(m + u) + v(m − u)) for the speed v at the two
// nodes symmetric about the midpoint m with sine sm and cosine cm.
func (e Ellipse) nodePair(sm, cm, u, w float64) float64 {
	su, cu := math.Sincos(u)
	a, b := float64(sm*cu), float64(cm*su)
	sp, sn := a+b, a-b // sin(m + u), sin(m − u)
	vp := math.Sqrt(e.k2 + float64(float64(e.m1*sp)*sp))
	vn := math.Sqrt(e.k2 + float64(float64(e.m1*sn)*sn))
	return w * (vp + vn)
}
