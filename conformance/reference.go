package conformance

import (
	"errors"
	"math"
	"slices"
	"strconv"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Errors returned by [Polyline.Generate].
var (
	// ErrBadTolerance reports a tolerance that is not a finite number
	// greater than zero, or one too fine for the coordinates to resolve.
	ErrBadTolerance = errors.New("tolerance must be a finite number greater than zero and above the resolution of the coordinates")
	// ErrTooManySegments reports a tolerance that would need more than
	// [MaxPolylineSegments] lines.
	ErrTooManySegments = errors.New("tolerance needs too many segments")
)

// MaxPolylineSegments bounds the size of one [Polyline] path.
const MaxPolylineSegments = 10_000_000

// Polyline is the reference [Generator]: a closed polygon with vertices at
// equal steps of the ellipse parameter, so plain that its correctness can
// be checked by hand. It is slow to converge (it spends as many vertices on
// the flat sides as at the sharp ends) and meant as a test double and a
// worked example, not for machining. The zero value is ready to use.
//
// # Why the zone holds
//
// Let the zone be [lo, hi] (see [toolpath.Zone.Limits]) of width W, and
// μ = W/1000 a margin for rounding. The vertices are placed on the
// parallel curve C′ at offset δ = hi − μ from the intended curve C (itself
// at offset d from the ellipse, so C′ is at offset d + δ from the
// ellipse), at parameters t_k = 2πk/N, and joined by chords.
//
//   - A chord of a closed convex curve lies inside it, and C′ is convex
//     (a parallel of an ellipse at an offset above −b²/a is): every chord
//     point has signed distance to C′ at most 0.
//   - With q(t) the point of C′ at parameter t and M ≥ |q″(t)|, the chord
//     from q(t_k) to q(t_{k+1}), taken at the same fraction as t, misses
//     q(t) by at most M·Δt²/8 (the error of linear interpolation, applied
//     to w·(chord − q) for the unit vector w along the miss). This is the
//     chord bound κ·L²/8 written for the ellipse parameter instead of arc
//     length. So every chord point lies within e = M·Δt²/8 of C′.
//   - The signed distance to C is the signed distance to C′ plus δ, for
//     any point (both are parallels of the ellipse; see
//     [SegmentDeviation]).
//
// Hence every point of the polygon deviates from C by an amount in
// [δ − e, δ], which lies in [lo + μ, hi − μ] when e ≤ W − 2μ. N is the
// smallest count with M·(2π/N)²/8 ≤ W − 2μ, and at least 3.
//
// The bound M: q = p + g·n with g = d + δ, p the ellipse and n its unit
// normal. |p″| = |p − centre| ≤ a. The normal turns with the tangent T,
// |T′| = κ·v (v = |p′|), so |n″| = |T″| ≤ |(κv)′| + (κv)². Here
// κv = ab/v² with b ≤ v ≤ a, and |v′| = (a² − b²)·|sin t·cos t|/v ≤
// (a² − b²)/a, so |(κv)′| = 2ab·|v′|/v³ ≤ 2(a² − b²)/b² and
// (κv)² ≤ a²/b². Altogether
//
//	M = a + |g|·(3a² − 2b²)/b²
//
// which is a for the ellipse itself and grows for offsets of flat
// ellipses, where equal parameter steps crowd round the sharp ends.
//
// The path starts at parameter 0 (the end of the ellipse's own +x
// semi-axis), runs counter-clockwise, closes exactly on its first point,
// is made of [toolpath.Line] segments marked [toolpath.Cut] at Z = 0, and
// is appended to dst.
type Polyline struct{}

// Generate appends the polygon for curve, zone and tol to dst. It returns
// an error wrapping [ErrBadTolerance] or [ErrTooManySegments] for a
// tolerance it cannot meet, or the error of [ellipse.Ellipse.Parallel] if
// the vertex curve would fold.
func (Polyline) Generate(dst toolpath.Path, curve ellipse.Parallel, zone toolpath.Zone, tol float64) (toolpath.Path, error) {
	e := curve.Ellipse()
	a, b := e.SemiMajor(), e.SemiMinor()
	c := e.Center()
	extent := a + math.Abs(curve.Offset()) + math.Abs(c.X) + math.Abs(c.Y)
	lo, hi := zone.Limits(tol)
	width := hi - lo
	mu := 1e-3 * width
	if !(tol > 0) || math.IsInf(tol, 0) || !(mu > 1e-13*extent) {
		return dst, polylineError("tolerance", tol, ErrBadTolerance)
	}
	delta := hi - mu
	g := curve.Offset() + delta
	vertices, err := e.Parallel(g)
	if err != nil {
		return dst, err
	}
	m := a + math.Abs(g)*(3*a*a-2*b*b)/(b*b)
	dt := math.Sqrt(8 * (width - 2*mu) / m)
	nf := math.Max(3, math.Ceil(2*math.Pi/dt))
	if !(nf <= MaxPolylineSegments) {
		return dst, polylineError("tolerance", tol, ErrTooManySegments)
	}
	n := int(nf)
	dst = slices.Grow(dst, n)
	first := vertices.PointAt(0)
	prev := first
	for k := 1; k <= n; k++ {
		q := first
		if k < n {
			q = vertices.PointAt(2 * math.Pi * float64(k) / float64(n))
		}
		dst = append(dst, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut,
			Start: toolpath.Point{X: prev.X, Y: prev.Y}, End: toolpath.Point{X: q.X, Y: q.Y}})
		prev = q
	}
	return dst, nil
}

// polylineError returns an error naming the field, its value and the
// sentinel.
func polylineError(field string, v float64, err error) error {
	return &wrapped{msg: "conformance: Polyline: " + field + " " + strconv.FormatFloat(v, 'g', -1, 64) + ": " + err.Error(), err: err}
}

// wrapped is an error with its own message that unwraps to a sentinel.
type wrapped struct {
	msg string
	err error
}

func (w *wrapped) Error() string { return w.msg }
func (w *wrapped) Unwrap() error { return w.err }
