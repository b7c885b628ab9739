package toolpath

import (
	"errors"
	"math"
	"strconv"

	"github.com/focitools/foci/ellipse"
)

// Spec says what to approximate and how closely.
type Spec struct {
	// Curve is the intended curve: the ellipse (e.Curve()) or a parallel
	// curve of it (e.Parallel(d)).
	Curve ellipse.Parallel
	// Zone and Tol bound the deviation of every point of the path from
	// Curve (signed distance, + outward).
	Zone Zone
	Tol  float64
	// Geometry chooses lines or tangent-continuous arcs.
	Geometry Geometry
	// Decimals is the number of decimals the writer will print
	// coordinates with: the rounding is taken out of the tolerance so the
	// zone still holds for the written numbers. 0 chooses [DecimalsFor];
	// a negative value assumes exact coordinates.
	Decimals int
	// From is the curve parameter (radians) where the path starts. The
	// whole closed curve is approximated unless Open is set.
	From float64
	// Open approximates only the arc from From to To (clockwise when
	// To < From, at most one turn) instead of the closed curve.
	Open bool
	To   float64
	// Clockwise runs a closed curve clockwise instead of counter-clockwise.
	Clockwise bool
	// Z is the height given to every segment.
	Z float64
}

// MaxSegments bounds the size of one approximation: a tolerance that would
// need more segments is refused rather than allowed to exhaust memory or
// the machine's buffer.
const MaxSegments = 20_000_000

// Errors returned by [NewApproximator], wrapped in a [*SpecError].
var (
	ErrTolerance = errors.New("tolerance must be a finite number greater than zero")
	ErrTooFine   = errors.New("tolerance too fine")
	ErrDecimals  = errors.New("too few decimals for the tolerance")
	ErrInvalid   = errors.New("invalid curve")
	ErrRange     = errors.New("parameter range must be finite, not empty, and at most one turn")
	ErrStalled   = errors.New("approximation stopped: far more segments than the tolerance needs (please report the shape)")
	ErrNoFit     = errors.New("approximation stopped: no tangent-continuous arc from the last join stays in the zone (please report the shape; lines, a smaller tolerance or the band zone may do)")
	ErrOffset    = errors.New("the zone reaches inward past the minimum radius of curvature, where the parallel curves fold: use a smaller tolerance, a smaller inward offset or the outside zone")
)

// SpecError reports a rejected Spec field.
type SpecError struct {
	Field string  // "Tol", "Decimals", "From", "Curve"
	Value float64 // the rejected value
	Limit float64 // the limit passed, or a count for ErrTooFine
	Err   error
}

// Error returns a message naming the field, its value and the limit.
func (e *SpecError) Error() string {
	b := []byte("toolpath: ")
	b = append(b, e.Field...)
	b = append(b, ' ')
	b = strconv.AppendFloat(b, e.Value, 'g', 6, 64)
	b = append(b, ": "...)
	b = append(b, e.Err.Error()...)
	switch e.Err {
	case ErrTooFine:
		b = append(b, " (would need about "...)
		b = strconv.AppendFloat(b, e.Limit, 'g', 3, 64)
		b = append(b, " segments; the limit is "...)
		b = strconv.AppendInt(b, MaxSegments, 10)
		b = append(b, ')')
	case ErrDecimals, ErrOffset:
		b = append(b, " (limit "...)
		b = strconv.AppendFloat(b, e.Limit, 'g', 6, 64)
		b = append(b, ')')
	}
	return string(b)
}

// Unwrap returns the sentinel.
func (e *SpecError) Unwrap() error { return e.Err }

// roundingShare is the fraction of the tolerance that DecimalsFor lets
// coordinate rounding take.
const roundingShare = 0.01

// DecimalsFor returns the number of decimals (at least 3, at most 12) for
// which the rounding allowance of [RoundingAllowance] is at most 1% of tol.
func DecimalsFor(tol float64) int {
	if !(tol > 0) || math.IsInf(tol, 0) {
		return 3
	}
	n := int(math.Ceil(math.Log10(math.Sqrt2 / (roundingShare * tol))))
	return min(max(n, 3), 12)
}

// RoundingAllowance returns how far a written segment can lie from the
// computed one when every coordinate (ends and arc centre) is rounded to
// the given decimals: √2·10^−decimals, twice the half-unit diagonal, since
// an arc moves with its ends and its centre. Negative decimals give 0.
func RoundingAllowance(decimals int) float64 {
	if decimals < 0 {
		return 0
	}
	return math.Sqrt2 * math.Pow(10, -float64(decimals))
}

// Approximator streams the segments of a Spec. It holds O(1) state and
// allocates nothing per segment; create it with [NewApproximator] and call
// [Approximator.Next] until it reports false.
//
// The work per call is bounded but uneven where the arcs plan a stretch
// backwards (curves whose radius of curvature ranges over more than
// twentyfold, on paths of up to 160 arcs by N*): the call that reaches
// such a stretch builds all of it, up to 64 segments, and the following
// calls return them: on the benchmark machine the slowest call took
// 0.16 ms on the flat gasket (95 arcs) and 1.4 ms on the 19-arc slot,
// which also looks ahead, against 47 µs on the tabletop. The state, two
// segment buffers for this and the sample grids, is about 25 KB.
type Approximator struct {
	spec   Spec
	f      frame
	lo     float64 // usable deviation range after the rounding allowance
	hi     float64
	round  float64 // rounding allowance
	sigma  float64 // +1 counter-clockwise, −1 clockwise
	t      float64 // current parameter
	tEnd   float64
	span   float64 // |tEnd − From|
	done   bool
	n      int     // segments emitted
	lineDt float64 // parameter span of the last chord
	limit  int     // segments allowed before the approximation counts as stalled
	nEst   float64 // the guard's estimate of N*
	look   bool    // the arc chain looks one arc ahead (see arcState.start)
	plans  bool    // and plans backwards where the curvature falls
	// planning: the arc chain is building a stretch backwards (see
	// arcState.planExit) into plan.
	planning bool
	plan     [planMax]Segment
	fwd      [planMax + 1]Segment
	fwdState arcState
	err      error
	arcs     arcState
	// Scratch space of the arc approximator's deviation measure, kept
	// here so that no call clears 10 kB of stack.
	grid [2*maxSamples + 2]sample
	ts   [2*maxSamples + 2]float64
	vs   [2*maxSamples + 2]float64
}

// NewApproximator validates s and returns an Approximator positioned at its
// start.
func NewApproximator(s Spec) (*Approximator, error) {
	a := new(Approximator)
	if err := a.Reset(s); err != nil {
		return nil, err
	}
	return a, nil
}

// Reset reuses a for a new Spec.
func (a *Approximator) Reset(s Spec) error {
	if !(s.Tol > 0) || math.IsInf(s.Tol, 0) {
		return &SpecError{Field: "Tol", Value: s.Tol, Err: ErrTolerance}
	}
	e := s.Curve.Ellipse()
	if !(e.SemiMajor() > 0) {
		return &SpecError{Field: "Curve", Err: ErrInvalid}
	}
	if math.IsNaN(s.From) || math.IsInf(s.From, 0) || math.IsNaN(s.To) || math.IsInf(s.To, 0) || (s.Open && (s.To == s.From || math.Abs(s.To-s.From) > 2*math.Pi*(1+1e-12))) {
		return &SpecError{Field: "From", Value: s.From, Err: ErrRange}
	}
	if s.Decimals == 0 {
		s.Decimals = DecimalsFor(s.Tol)
	}
	round := RoundingAllowance(s.Decimals)
	lo, hi := s.Zone.Limits(s.Tol)
	lo += round
	hi -= round
	if s.Geometry == Arcs {
		// A too-flat arc written as a line moves by up to another
		// allowance (see arcs.go).
		lo += round
		hi -= round
	}
	if !(hi-lo > 0.05*s.Tol) {
		return &SpecError{Field: "Decimals", Value: float64(s.Decimals), Limit: float64(DecimalsFor(s.Tol)), Err: ErrDecimals}
	}
	*a = Approximator{spec: s, f: newFrame(s.Curve), lo: lo, hi: hi, round: round}
	// The innermost curve the path may touch must not fold.
	if lim := e.MinRadiusOfCurvature(); -(a.f.d + lo) >= lim {
		return &SpecError{Field: "Curve", Value: a.f.d, Limit: -lim + s.Tol, Err: ErrOffset}
	}
	a.sigma = 1
	a.t = s.From
	switch {
	case !s.Open:
		a.tEnd = s.From + 2*math.Pi
		if s.Clockwise {
			a.sigma = -1
			a.tEnd = s.From - 2*math.Pi
		}
	default:
		a.tEnd = s.To
		if s.To < s.From {
			a.sigma = -1
		}
	}
	a.span = math.Abs(a.tEnd - s.From)
	n := a.quickEstimate()
	if n > MaxSegments {
		return &SpecError{Field: "Tol", Value: s.Tol, Limit: n, Err: ErrTooFine}
	}
	// A guard against a stepping bug running away: eight times the
	// asymptotic minimum is far beyond what either approximator needs.
	a.limit = int(8*n) + 256
	a.nEst = n
	if s.Geometry == Arcs {
		a.arcs.start(a)
	}
	return nil
}

// Spec returns the Spec with Decimals resolved.
func (a *Approximator) Spec() Spec { return a.spec }

// Decimals returns the number of decimals the writer must use for the zone
// to hold.
func (a *Approximator) Decimals() int { return a.spec.Decimals }

// EstimateSegments returns the asymptotic minimum number of segments N*
// for the Spec (see [LowerBound]) computed on the usable range after the
// rounding allowance.
func (a *Approximator) EstimateSegments() float64 {
	return lowerBound(&a.f, a.spec.Geometry, a.hi-a.lo, a.spec.From, a.tEnd)
}

// quickEstimate is a cheap N* for the segment-count guard: two-point
// Gauss on at most 16 panels (see lowerBoundFixed), measured against
// [LowerBound] at 0.94 to 1.0 of it for b/a ≥ 0.1 and down to 0.54 for
// lines round a needle (b/a = 0.001) with an offset as long as it is; the
// guard has a wide margin.
func (a *Approximator) quickEstimate() float64 {
	return lowerBoundFixed(&a.f, a.spec.Geometry, a.hi-a.lo, a.spec.From, a.tEnd)
}

// Next returns the next segment and true, or false when the path is
// complete. Segments are Cut motion at height Spec.Z.
func (a *Approximator) Next() (Segment, bool) {
	if a.done {
		return Segment{}, false
	}
	if a.n >= a.limit {
		a.done = true
		a.err = &SpecError{Field: "Tol", Value: a.spec.Tol, Err: ErrStalled}
		return Segment{}, false
	}
	var s Segment
	var ok bool
	if a.spec.Geometry == Arcs {
		s, ok = a.arcs.next(a)
	} else {
		s, ok = a.nextLine()
	}
	if !ok {
		a.done = true
		return Segment{}, false
	}
	s.Motion = Cut
	s.Start.Z, s.End.Z = a.spec.Z, a.spec.Z
	a.n++
	return s, true
}

// Err returns nil, or the error that ended the stream early (a
// [*SpecError] wrapping [ErrStalled] or [ErrNoFit]); check it after Next
// reports false.
func (a *Approximator) Err() error { return a.err }

// Approximate appends the whole approximation of s to dst.
func Approximate(dst Path, s Spec) (Path, error) {
	var a Approximator
	if err := a.Reset(s); err != nil {
		return dst, err
	}
	for seg, ok := a.Next(); ok; seg, ok = a.Next() {
		dst = append(dst, seg)
	}
	return dst, a.Err()
}

// LowerBound returns the asymptotic minimum segment count N* for
// approximating the parameter range [from, to] of curve (to == from: the
// whole closed curve) within the zone of half-width or width tol:
//
//	lines: N* = ∫ √(κ/(8w)) ds
//	arcs:  N* = ∫ (|dκ/ds|/(96w))^(1/3) ds
//
// with w the total width of the zone (2·tol for a band, tol one-sided),
// which gives ∫√(κ/(16·tol)) ds and ∫(|κ'|/(192·tol))^(1/3) ds for a band.
// The chord error κL²/8 gives the line bounds; the best single arc
// against a curve whose curvature changes at κ' per unit length misses by
// κ'L³/192 either side (Chebyshev on the cubic term), so no arc spline can
// do better than the arc bound. κ is the curvature of the curve actually
// followed: for the parallel curve at d, κ_d = κ/(1 + dκ) and
// dκ_d/ds_d = κ'/(1 + dκ)³.
func LowerBound(curve ellipse.Parallel, g Geometry, zone Zone, tol, from, to float64) float64 {
	f := newFrame(curve)
	if to == from {
		to = from + 2*math.Pi
	}
	w := tol
	if zone == Band {
		w = 2 * tol
	}
	return lowerBound(&f, g, w, from, to)
}

// countDensity returns the integrand of N* in the parameter t.
func countDensity(f *frame, g Geometry, w float64) func(float64) float64 {
	return func(t float64) float64 {
		// κ, dκ/ds of the curve followed and its speed from one Sincos
		// (frame.ellipseCurvature and frame.speed each take one).
		s, c := math.Sincos(t)
		v2, ve, ke, kp := f.footBase(s, c)
		v := ve + f.d*f.rx*f.ry/v2
		if g == Lines {
			return math.Sqrt(ke/(1+f.d*ke)/(8*w)) * v
		}
		return math.Cbrt(math.Abs(kp)/(96*w)) * v
	}
}

func lowerBoundFixed(f *frame, g Geometry, w float64, from, to float64) float64 {
	if to < from {
		from, to = to, from
	}
	integrand := countDensity(f, g, w)
	// Panel ends evenly spaced in t and, merged with them, evenly spaced
	// in the normal angle: the first alone misses the density's spike
	// round the tip of a flat ellipse (the whole cap of a wide offset
	// lies within a thousandth of a radian of t), the second the flanks.
	const panels = 8
	var ends [2*panels + 2]float64
	n := 0
	nu0, nu1 := f.normalAngle(from), f.normalAngle(to)
	for i, j := 0, 1; i <= panels || j < panels; {
		tt := from + float64(i)*(to-from)/panels
		tn := math.Inf(1)
		if j < panels {
			tn = f.paramAtNormal(nu0 + float64(j)*(nu1-nu0)/panels)
		}
		if i <= panels && tt <= tn {
			ends[n], i = tt, i+1
		} else {
			ends[n], j = tn, j+1
		}
		if n == 0 || ends[n] > ends[n-1] {
			n++
		}
	}
	sum := 0.0
	for k := 1; k < n; k++ {
		// Two-point Gauss–Legendre: the guard needs no more.
		m, h := 0.5*(ends[k-1]+ends[k]), 0.5*(ends[k]-ends[k-1])
		const x = 0.5773502691896258 // 1/√3
		sum += h * (integrand(m-x*h) + integrand(m+x*h))
	}
	return sum
}

func lowerBound(f *frame, g Geometry, w float64, from, to float64) float64 {
	if to < from {
		from, to = to, from
	}
	integrand := countDensity(f, g, w)
	// Adaptive Gauss–Legendre on each stretch between the vertices (the
	// integrand is smooth there but sharply peaked at the tips of a flat
	// ellipse).
	sum := 0.0
	q := math.Floor(from / (math.Pi / 2))
	for lo := from; lo < to; q++ {
		hi := math.Min(to, (q+1)*math.Pi/2)
		if hi > lo {
			whole := gauss4(integrand, lo, hi)
			// An absolute tolerance from a first estimate: the arc
			// integrand has cube-root corners at the vertices, where a
			// relative test would recurse to the bottom.
			sum += adaptiveGauss(integrand, lo, hi, whole, 1e-6*math.Abs(whole)+1e-12, 40)
		}
		lo = hi
	}
	return sum
}

// gauss4 is the 4-point Gauss–Legendre rule on [a, b] (A&S 25.4.30).
func gauss4(f func(float64) float64, a, b float64) float64 {
	const (
		x1, x2 = 0.8611363115940526, 0.3399810435848563
		w1, w2 = 0.3478548451374538, 0.6521451548625461
	)
	m, h := 0.5*(a+b), 0.5*(b-a)
	return h * (w1*(f(m-x1*h)+f(m+x1*h)) + w2*(f(m-x2*h)+f(m+x2*h)))
}

// adaptiveGauss refines whole, the integral over [a, b], until its two
// halves agree with it to the absolute tolerance tol (halved at each
// level).
func adaptiveGauss(f func(float64) float64, a, b, whole, tol float64, depth int) float64 {
	m := 0.5 * (a + b)
	l, r := gauss4(f, a, m), gauss4(f, m, b)
	if depth <= 0 || math.Abs(l+r-whole) <= tol {
		return l + r
	}
	return adaptiveGauss(f, a, m, l, tol/2, depth-1) + adaptiveGauss(f, m, b, r, tol/2, depth-1)
}
