package ellipse

import "math"

// Parallel is the parallel (offset) curve of an ellipse at a signed
// distance: every point of the ellipse moved along its outward normal by
// Offset (positive outward, negative inward). It is not an ellipse. Its
// parameter is that of the ellipse point it comes from. Build one with
// [Ellipse.Parallel]; an Offset of 0 is the ellipse itself.
type Parallel struct {
	e Ellipse
	d float64
}

// Parallel returns the parallel curve at signed distance d (+ outward).
// An inward distance at or beyond the minimum radius of curvature b²/a is
// refused with an [*Error] wrapping [ErrOffsetLimit] that states the limit:
// there the curve develops cusps and folds over itself.
func (e Ellipse) Parallel(d float64) (Parallel, error) {
	if err := checkFinite("offset", d); err != nil {
		return Parallel{}, err
	}
	if lim := e.MinRadiusOfCurvature(); -d >= lim {
		return Parallel{}, &Error{Field: "offset", Value: d, Limit: -lim, HasLimit: true, Err: ErrOffsetLimit}
	}
	if math.Abs(d) > maxSize {
		return Parallel{}, &Error{Field: "offset", Value: d, Limit: maxSize, HasLimit: true, Err: ErrOverflow}
	}
	return Parallel{e: e, d: d}, nil
}

// Ellipse returns the ellipse the curve is parallel to.
func (p Parallel) Ellipse() Ellipse { return p.e }

// Offset returns the signed distance from the ellipse (+ outward).
func (p Parallel) Offset() float64 { return p.d }

// PointAt returns p(t) + Offset·n(t).
func (p Parallel) PointAt(t float64) Point {
	q := p.e.PointAt(t)
	if p.d == 0 {
		return q
	}
	n := p.e.Normal(t)
	return Point{q.X + p.d*n.X, q.Y + p.d*n.Y}
}

// Tangent returns the unit tangent at t, the same as the ellipse's.
func (p Parallel) Tangent(t float64) Point { return p.e.Tangent(t) }

// Normal returns the unit outward normal at t, the same as the ellipse's.
func (p Parallel) Normal(t float64) Point { return p.e.Normal(t) }

// Curvature returns κ/(1 + Offset·κ), the curvature of the parallel curve
// at t (κ the ellipse's curvature there).
func (p Parallel) Curvature(t float64) float64 {
	k := p.e.Curvature(t)
	return k / (1 + p.d*k)
}

// Speed returns |dq/dt| = |p'(t)|·(1 + Offset·κ(t)), the rate at which
// arc length grows with the parameter.
func (p Parallel) Speed(t float64) float64 {
	s, c := math.Sincos(t)
	v := math.Sqrt(p.e.speed2(s, c))
	return p.e.a * (v + p.d/p.e.a*p.e.ux*p.e.uy/(v*v))
}

// Length returns the length of the closed curve: the perimeter plus 2π·Offset.
func (p Parallel) Length() float64 { return p.e.Perimeter() + 2*math.Pi*p.d }

// ArcLength returns the length of the parallel curve from t0 to t1:
// s(t0, t1) + Offset·(ψ(t1) − ψ(t0)) with ψ the tangent angle, since the
// arc element is (1 + Offset·κ)·ds. Negative when t1 < t0.
func (p Parallel) ArcLength(t0, t1 float64) float64 {
	return p.e.a * p.e.scaledArc(t0, t1, p.d/p.e.a)
}

// ParamAtArcLength returns the parameter t with ArcLength(0, t) = s, for
// any real s (see [Ellipse.ParamAtArcLength]). On the end caps of an
// outward parallel of a flat ellipse the curve runs fast in t (up to
// b + Offset·a/b per radian), so there the round trip holds to that speed
// times an ulp of t.
func (p Parallel) ParamAtArcLength(s float64) float64 {
	return p.e.paramAt(s/p.e.a, p.d/p.e.a)
}
