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
// in Eberly's bracket. Newton steps from s = 0 (the root for points on the
// curve) are kept inside the bracket; a step that leaves it is replaced by
// a bisection in log(s + 1), which copes with points close to the major
// axis where the root sits near the pole. Points on either axis and at the
// centre take Eberly's closed forms. The result is exact to a few ulps of
// the larger of |d| and b·1e-3.
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
	if y1 > 0 {
		if y0 > 0 {
			z0, z1 := y0/e0, y1/e1
			g := z0*z0 + z1*z1 - 1
			if g == 0 {
				return y0, y1, 0
			}
			r0 := (e0 / e1) * (e0 / e1)
			s := eberlyRoot(r0, z0, z1, g)
			x0 = r0 * y0 / (s + r0)
			x1 = y1 / (s + 1)
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

// eberlyRoot returns the root of F (see SignedDistance) for z0, z1 > 0.
func eberlyRoot(r0, z0, z1, g float64) float64 {
	n0 := r0 * z0
	lo := z1 - 1 // F(lo) ≥ 0
	hi := 0.0    // F(hi) ≤ 0 when g < 0
	if g > 0 {
		lo = 0
		hi = math.Hypot(n0, z1) - 1
	}
	s := 0.0
	for i := 0; i < 200; i++ {
		a := n0 / (s + r0)
		b := z1 / (s + 1)
		f := a*a + b*b - 1
		if f == 0 {
			return s
		}
		if f > 0 {
			lo = s
		} else {
			hi = s
		}
		fp := -2 * (a*a/(s+r0) + b*b/(s+1))
		next := s - f/fp
		if !(next > lo && next < hi) {
			// Bisect in log(s + 1): the scale near the pole at −1.
			next = -1 + math.Sqrt((lo+1)*(hi+1))
			if !(next > lo && next < hi) {
				next = lo + (hi-lo)/2
			}
		}
		if next == s || hi-lo <= 4e-16*(math.Abs(s)+1) {
			return next
		}
		if math.Abs(next-s) <= 1e-16*(math.Abs(s)+1) {
			return next
		}
		s = next
	}
	return s
}
