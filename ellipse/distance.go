package ellipse

import "math"

// SignedDistance returns the distance from p to the nearest point of the
// ellipse: positive outside, negative inside, zero on the curve.
//
// The method is Eberly's (D. Eberly, "Distance from a Point to an Ellipse,
// an Ellipsoid, or a Hyperellipsoid", Geometric Tools, 2013): reflect p into
// the first quadrant of the ellipse's own frame, write the foot point as a
// function of one variable s, and find the root of the convex, decreasing
//
//	F(s) = (r0·z0/(s + r0))² + (z1/(s + 1))² − 1,  r0 = (a/b)², z = p/(a, b)
//
// in Eberly's bracket, here in the variable u = s + 1 so that roots near
// the pole s = −1 (points near the centre, or near the major axis inside
// the evolute) keep their digits. Newton steps from u = 1 (the root for
// points on the curve) are kept inside the bracket; a step that leaves it
// is replaced by a bisection in log u. Points on either axis and at the
// centre take Eberly's closed forms. The result is exact to a few ulps of
// the larger of |d| and the semi-major axis.
//
// Special cases are:
//
//	SignedDistance(p) = NaN if p has a NaN or infinite coordinate
func (e Ellipse) SignedDistance(p Point) float64 {
	_, d := e.Nearest(p)
	return d
}

// Nearest returns the parameter t of the point of the ellipse nearest to p
// and the signed distance from p to it (as [Ellipse.SignedDistance]). At
// the centre of a non-circular ellipse, and anywhere on the major axis
// inside the evolute, two feet are equally near; Nearest returns the one
// with the non-negative own coordinate.
func (e Ellipse) Nearest(p Point) (t, d float64) {
	lx, ly := e.toLocal(p)
	if math.IsNaN(lx) || math.IsNaN(ly) || math.IsInf(lx, 0) || math.IsInf(ly, 0) {
		return math.NaN(), math.NaN()
	}
	// Work in the frame where e0 ≥ e1 are the semi-axes along (y0, y1).
	swap := e.ry > e.rx
	y0, y1 := math.Abs(lx), math.Abs(ly)
	e0, e1 := e.rx, e.ry
	if swap {
		y0, y1 = y1, y0
		e0, e1 = e1, e0
	}
	x0, x1, dist := eberlyFoot(e0, e1, y0, y1)
	z0, z1 := y0/e0, y1/e1
	if z0*z0+z1*z1 < 1 {
		dist = -dist
	}
	// Back to the own frame with the original signs.
	fx, fy := x0, x1
	if swap {
		fx, fy = x1, x0
	}
	fx = math.Copysign(fx, lx)
	fy = math.Copysign(fy, ly)
	return math.Atan2(fy/e.ry, fx/e.rx), dist
}

// eberlyFoot returns the foot point (x0, x1) and the unsigned distance for
// a point (y0, y1) in the first quadrant of the ellipse with semi-axes
// e0 ≥ e1 along the coordinate axes.
func eberlyFoot(e0, e1, y0, y1 float64) (x0, x1, dist float64) {
	// A coordinate below 1e-150 of its semi-axis moves the distance by far
	// less than an ulp, but squared or divided it runs into the subnormal
	// numbers, which carry fewer digits (a point 1e-310 off the major axis
	// near the centre lost ten of them): take it as on the axis.
	if y0 < 1e-150*e0 {
		y0 = 0
	}
	if y1 < 1e-150*e1 {
		y1 = 0
	}
	if y1 > 0 {
		if y0 > 0 {
			z0, z1 := y0/e0, y1/e1
			g := float64(z0*z0) + float64(z1*z1) - 1
			if g == 0 {
				return y0, y1, 0
			}
			r := e0 / e1
			r0 := r * r
			r0m1 := float64((e0-e1)*(e0+e1)) / float64(e1*e1) // r0 − 1 without cancellation
			u := eberlyRoot(r0, r0m1, z0, z1, g)
			x0 = r0 * y0 / (u + r0m1)
			x1 = y1 / u
			return x0, x1, math.Hypot(x0-y0, x1-y1)
		}
		return 0, e1, math.Abs(y1 - e1)
	}
	numer0 := e0 * y0
	denom0 := (e0 - e1) * (e0 + e1)
	if numer0 < denom0 {
		xde0 := numer0 / denom0
		x0 = e0 * xde0
		x1 = e1 * math.Sqrt((1-xde0)*(1+xde0))
		return x0, x1, math.Hypot(x0-y0, x1)
	}
	return e0, 0, math.Abs(y0 - e0)
}

// eberlyRoot returns u = s + 1 at the root s of F (see SignedDistance)
// for z0, z1 > 0, g = z0² + z1² − 1. In Eberly's variable s the root of a
// point near the centre or near the major axis inside the evolute lies
// just above the pole s = −1, where a double resolves s + 1 only to 1e-16
// absolutely; in u the pole is at 0 and the root keeps its relative
// precision:
//
//	F(u) = S(u) − 1,  S(u) = (r0·z0/(u + r0 − 1))² + (z1/u)²,
//
// decreasing for u > 0, with F(z1) ≥ 0 ≥ F(1) inside and
// F(1) ≥ 0 ≥ F(√((r0·z0)² + z1²)) outside. Newton's method is applied not
// to F, whose inverse-square shape makes steps from the left creep by a
// factor 1.5, but to the increasing Ψ(u) = S^(−1/2) − 1, which is linear
// in u for a circle and nearly so elsewhere: its step is
// S·(√S − 1)/(p²/(u + r0 − 1) + q²/u) with p, q the two terms' roots.
func eberlyRoot(r0, r0m1, z0, z1, g float64) float64 {
	n0 := r0 * z0
	lo, hi := z1, 1.0 // inside: F(lo) ≥ 0 ≥ F(hi)
	if g > 0 {
		lo, hi = 1, math.Hypot(n0, z1)
	}
	u := 1.0 // the root for points on the curve
	for i := 0; i < 200; i++ {
		p := n0 / (u + r0m1)
		q := z1 / u
		sum := float64(p*p) + float64(q*q)
		if sum == 1 {
			return u
		}
		if sum > 1 {
			lo = u
		} else {
			hi = u
		}
		d := float64(p*p)/(u+r0m1) + float64(q*q)/u
		next := u + sum*(math.Sqrt(sum)-1)/d
		if !(next > lo && next < hi) {
			// Bisect in log u, the scale near the pole (each root
			// separately: lo·hi may underflow).
			next = math.Sqrt(lo) * math.Sqrt(hi)
			if !(next > lo && next < hi) {
				next = lo + (hi-lo)/2
			}
		}
		if next == u || hi-lo <= 0x1p-52*hi || math.Abs(next-u) <= 0x1p-53*u {
			return next
		}
		u = next
	}
	return u
}
