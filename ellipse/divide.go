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
	qd     float64 // quarter length, scaled
	prev   float64 // reduced parameter of the previous point (internal frame)
	prevK  float64 // its half-turn count
	length float64
	evals  int // length evaluations so far, for tests of the cost
}

// NewDivider returns a Divider for n points on c. n must be at least 1.
func NewDivider(c Parallel, n int) (Divider, error) {
	if n < 1 {
		return Divider{}, &Error{Field: "count", Value: float64(n), Limit: 1, HasLimit: true, Err: ErrCount}
	}
	l := c.Length()
	a := c.e.a
	dn := c.d / a
	return Divider{c: c, n: n, step: l / a / float64(n), dn: dn,
		qd: c.e.quarter + dn*(math.Pi/2), length: l}, nil
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
		d.prevK, d.prev = e.reduceFrame(0)
		return DivisionPoint{Point: d.c.PointAt(0), T: 0, S: 0}, true
	}
	w := float64(k) * d.step
	w1 := w - e.phase*d.qd // see paramAt
	half := 2 * d.qd
	hk := math.Round(w1 / half)
	res := math.FMA(-hk, half, w1)
	if res > d.qd {
		res = d.qd
	} else if res < -d.qd {
		res = -d.qd
	}
	// Start from the previous point advanced by the inverse Taylor
	// polynomial of the length to second order, Δr ≈ h/f' − f''h²/(2f'³),
	// in the reduced range of this point.
	s, c := math.Sincos(d.prev)
	v := e.speedX(s, c)
	fp, fpp := v, float64(e.m1*s)*c/v
	if d.dn != 0 {
		q := d.dn * e.k / (float64(v*v) * v)
		fp, fpp = v+float64(q*v), fpp*(1-2*q)
	}
	h := d.step / fp
	guess := d.prev + (d.prevK-hk)*math.Pi + (h - float64(fpp*h)*h/(2*fp))
	// Far from the previous point the prediction is poorer than the
	// global starting guess.
	if !(guess > -math.Pi/2 && guess < math.Pi/2) || math.Abs(h) > 0.02 {
		guess = e.guess(res/d.qd, d.dn)
	}
	r, n := e.solveReduced(res, d.dn, guess)
	d.evals += n
	d.prev, d.prevK = r, hk
	t := e.fromFrame(hk, r)
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
