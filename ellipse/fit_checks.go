package ellipse

import (
	"math"
	"slices"
	"strconv"
)

// The checks Fit makes of its points before fitting, and the
// normalisation it fits in.

// fitCheckPoints refuses non-finite, oversized and duplicate points.
func fitCheckPoints(points []Point) error {
	for i, p := range points {
		for _, c := range [2]struct {
			name string
			v    float64
		}{{"x", p.X}, {"y", p.Y}} {
			if math.IsNaN(c.v) || math.IsInf(c.v, 0) {
				return &FitError{Err: ErrNotFinite, Index: i, Other: -1, Detail: "point " + strconv.Itoa(i) + " " + c.name + " " + fitNum(c.v)}
			}
			if math.Abs(c.v) > maxSize {
				return &FitError{Err: ErrOverflow, Index: i, Other: -1, Detail: "point " + strconv.Itoa(i) + " " + c.name + " " + fitNum(c.v) + " (limit 1e100)"}
			}
		}
	}
	idx := make([]int, len(points))
	for i := range idx {
		idx[i] = i
	}
	slices.SortFunc(idx, func(i, j int) int {
		a, b := points[i], points[j]
		switch {
		case a.X < b.X:
			return -1
		case a.X > b.X:
			return 1
		case a.Y < b.Y:
			return -1
		case a.Y > b.Y:
			return 1
		}
		return i - j
	})
	// Equal points sit together, each run in index order; the pair
	// reported is the run with the lowest first index.
	first, other, repeats := -1, -1, 0
	for k := 1; k < len(idx); k++ {
		if points[idx[k]] != points[idx[k-1]] {
			continue
		}
		repeats++
		runStart := k == 1 || points[idx[k-1]] != points[idx[k-2]]
		if runStart && (first < 0 || idx[k-1] < first) {
			first, other = idx[k-1], idx[k]
		}
	}
	more := repeats - 1
	if first < 0 {
		return nil
	}
	p := points[first]
	d := "points " + strconv.Itoa(first) + " and " + strconv.Itoa(other) + " at (" + fitNum(p.X) + ", " + fitNum(p.Y) + ")"
	if more > 0 {
		d += " (and " + strconv.Itoa(more) + " more repeats)"
	}
	return &FitError{Err: ErrDuplicatePoint, Index: first, Other: other, Detail: d}
}

// fitNewFrame returns the centroid and the root-mean-square coordinate
// spread s = √(Σ|p − m|²/(2n)).
func fitNewFrame(points []Point) fitFrame {
	var mx, my float64
	for _, p := range points {
		mx += p.X
		my += p.Y
	}
	n := float64(len(points))
	mx, my = mx/n, my/n
	s := 0.0
	for _, p := range points {
		dx, dy := p.X-mx, p.Y-my
		s += dx*dx + dy*dy
	}
	return fitFrame{mx, my, math.Sqrt(s / (2 * n))}
}

// fitCollinear reports whether the normalised points deviate from their
// principal line by less than 1e-10 of their spread along it.
func fitCollinear(pts []Point) bool {
	var sxx, sxy, syy float64
	for _, p := range pts {
		sxx += p.X * p.X
		sxy += p.X * p.Y
		syy += p.Y * p.Y
	}
	ang := math.Atan2(2*sxy, sxx-syy) / 2
	s, c := math.Sincos(ang)
	var along, across float64
	for _, p := range pts {
		u := c*p.X + s*p.Y
		v := -s*p.X + c*p.Y
		along += u * u
		across += v * v
	}
	return !(across > 1e-20*along)
}
