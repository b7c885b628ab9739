package ellipse

import "math"

// DivisionPoint is one point of an equal arc-length division.
type DivisionPoint struct {
	Point
	T float64 // the ellipse parameter, radians, increasing from 0
	S float64 // arc length from the first point
}

// Divider streams the N points of an equal arc-length division of a
// closed curve: point k lies at arc length k·L/N from the point at t = 0
// (the end of the ellipse's own +x semi-axis), counter-clockwise. Each
// point is found by Halley steps started from the previous one, so the
// whole division costs O(N) and no point depends on rounding carried from
// the one before. The zero Divider yields nothing; it allocates nothing.
type Divider struct {
	c      Parallel
	n, k   int
	step   float64 // L/N, scaled by 1/a
	dn     float64 // offset scaled by 1/a
	half   float64 // half length, scaled
	prev   float64 // reduced parameter of the previous point
	prevK  float64 // its half-turn count
	length float64
}

// NewDivider returns a Divider for n points on c. n must be at least 1.
func NewDivider(c Parallel, n int) (Divider, error) {
	if n < 1 {
		return Divider{}, &Error{Field: "count", Value: float64(n), Limit: 1, HasLimit: true, Err: ErrCount}
	}
	l := c.Length()
	a := c.e.a
	return Divider{c: c, n: n, step: l / a / float64(n), dn: c.d / a,
		half: 2*c.e.quarter + c.d/a*math.Pi, length: l}, nil
}

// Length returns the length of the divided curve.
func (d *Divider) Length() float64 { return d.length }

// Spacing returns the arc length between neighbouring points.
func (d *Divider) Spacing() float64 { return d.length / float64(d.n) }

// Next returns the next point and true, or false after the last.
func (d *Divider) Next() (DivisionPoint, bool) {
	if d.k >= d.n {
		return DivisionPoint{}, false
	}
	k := d.k
	d.k++
	e := d.c.e
	if k == 0 {
		d.prev, d.prevK = 0, 0
		return DivisionPoint{Point: d.c.PointAt(0), T: 0, S: 0}, true
	}
	w := float64(k) * d.step
	hk := math.Round(w / d.half)
	res := math.FMA(-hk, d.half, w)
	// Start from the previous point advanced by the step over the local
	// speed, in the reduced range of this point.
	guess := d.prev + (hk-d.prevK)*(-math.Pi)
	s, c := math.Sincos(d.prev)
	v := math.Sqrt(e.speed2(s, c))
	guess += d.step / (v + d.dn*e.ux*e.uy/(v*v))
	if !(guess > -math.Pi/2 && guess < math.Pi/2) {
		guess = e.guess(res / (d.half / 2))
	}
	r := e.solveReduced(res, d.dn, guess)
	d.prev, d.prevK = r, hk
	t := hk*math.Pi + r
	return DivisionPoint{Point: d.c.PointAt(t), T: t, S: w * e.a}, true
}

// Divide appends the n points of the equal arc-length division of c to dst
// and returns the extended slice (see [Divider]). It allocates only when dst
// lacks capacity.
func (c Parallel) Divide(dst []DivisionPoint, n int) ([]DivisionPoint, error) {
	d, err := NewDivider(c, n)
	if err != nil {
		return dst, err
	}
	for p, ok := d.Next(); ok; p, ok = d.Next() {
		dst = append(dst, p)
	}
	return dst, nil
}

// Divide appends the n points of the equal arc-length division of the
// ellipse itself to dst; see [Parallel.Divide].
func (e Ellipse) Divide(dst []DivisionPoint, n int) ([]DivisionPoint, error) {
	return Parallel{e: e}.Divide(dst, n)
}

// Curve returns the ellipse as a Parallel at offset 0, for code that
// handles both.
func (e Ellipse) Curve() Parallel { return Parallel{e: e} }
