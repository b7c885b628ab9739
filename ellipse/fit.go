package ellipse

import (
	"errors"
	"math"
	"strconv"
)

// Sentinel errors of [Fit], wrapped by [*FitError]; test for them with
// errors.Is. A non-finite coordinate wraps [ErrNotFinite].
var (
	// ErrTooFewPoints reports fewer than five points: an ellipse has five
	// parameters.
	ErrTooFewPoints = errors.New("at least 5 points are needed")
	// ErrDuplicatePoint reports two points with the same coordinates.
	ErrDuplicatePoint = errors.New("duplicate point")
	// ErrCollinear reports points that all lie on one straight line.
	ErrCollinear = errors.New("all points lie on one straight line")
	// ErrNotEllipse reports points that a conic fits only as a hyperbola
	// or a parabola, or whose fit grows without bound.
	ErrNotEllipse = errors.New("the points fit a hyperbola or parabola, not an ellipse")
	// ErrFitOption reports an option of Fit out of its range.
	ErrFitOption = errors.New("fit option out of range")
)

// FitError records why [Fit] refused its points.
type FitError struct {
	Err    error  // one of the sentinel errors
	Index  int    // the index of the point concerned, or −1
	Other  int    // the index of its duplicate, or −1
	Detail string // what was found, for the message
}

// Error returns a message of the form
// "ellipse: fit: points 3 and 8 at (12.5, 4): duplicate point".
func (e *FitError) Error() string {
	return "ellipse: fit: " + e.Detail + ": " + e.Err.Error()
}

// Unwrap returns the sentinel error.
func (e *FitError) Unwrap() error { return e.Err }

// FitOption changes how [Fit] works.
type FitOption func(*fitSettings)

type fitSettings struct {
	maxIter       int
	algebraicOnly bool
	minCoverage   float64
}

// FitMaxIterations sets the most Levenberg–Marquardt iterations (default
// 200; at least 1). A fit that has not settled by then returns its best
// parameters with Converged false and a warning.
func FitMaxIterations(n int) FitOption { return func(s *fitSettings) { s.maxIter = n } }

// FitAlgebraicOnly skips the geometric refinement and returns the direct
// least-squares ellipse, with its orthogonal residuals. A nearly round
// result whose rotation is not determined has its rotation set to 0
// without a refit.
func FitAlgebraicOnly() FitOption { return func(s *fitSettings) { s.algebraicOnly = true } }

// FitMinCoverage sets the fraction of the curve, in [0, 1], below which
// the result carries a coverage warning (default 0.5, half the curve).
func FitMinCoverage(fraction float64) FitOption {
	return func(s *fitSettings) { s.minCoverage = fraction }
}

// FitResult is an ellipse fitted to points with what is known of its
// quality.
type FitResult struct {
	// Ellipse has the major semi-axis along its own x axis (SemiX ≥
	// SemiY) and a rotation in [0, π), the direction of the major axis.
	Ellipse Ellipse
	// Residuals are the signed orthogonal distances of the points from
	// Ellipse, in their order: positive outside, negative inside.
	Residuals []float64
	// RMS is the root mean square of the residuals.
	RMS float64
	// MaxResidual is the largest |residual|, at point MaxIndex.
	MaxResidual float64
	MaxIndex    int
	// Coverage is the fraction of the curve the points span: one less the
	// largest gap between the ellipse parameters of neighbouring foot
	// points, over 2π. Points evenly round the curve give 1 − 1/n; points
	// on a third of it, about 1/3.
	Coverage float64
	// RotationDetermined is false when the fit is so nearly round that
	// the points do not fix its rotation: a − b is at most three of its
	// standard errors, or at most 1e-9·a. The axes are then taken along x
	// and y (rotation 0 or π/2) and the centre and semi-axes fitted with
	// that rotation held.
	RotationDetermined bool
	// Uncertainty holds one standard error of each parameter.
	Uncertainty FitUncertainty
	// Iterations counts the geometric fit's iterations; Converged says
	// whether it settled.
	Iterations int
	Converged  bool
	// Warnings say, in words, what limits the result: a coverage below
	// the minimum, an undetermined rotation, five points only, an
	// unsettled fit.
	Warnings []string
}

// FitUncertainty holds one standard error of each fitted parameter, the
// linearised estimate s·√diag((JᵀJ)⁻¹) with s² = Σr²/(n − 5) and J the
// Jacobian of the distances at the solution. It assumes independent
// measuring errors of equal spread along the normal and is meaningful when
// they are small against the radius of curvature. With five points every
// entry is NaN; the rotation of a fit whose rotation is not determined has
// +Inf.
type FitUncertainty struct {
	Center               Point
	SemiMajor, SemiMinor float64
	Rotation             float64 // radians
}

// Fit returns the ellipse through measured points that minimises the sum
// of squared orthogonal distances, found in two steps:
//
//  1. the direct least-squares fit constrained to ellipses (Fitzgibbon,
//     Pilu & Fisher, TPAMI 21(5) 1999) in the stable form of Halíř &
//     Flusser (WSCG 1998), on coordinates moved to the centroid and
//     scaled, with the reduced 3x3 eigenproblem solved in this package;
//  2. Levenberg–Marquardt on centre, semi-axes and rotation from there,
//     using the exact distance of [Ellipse.Nearest] and its analytic
//     Jacobian.
//
// The result is invariant under translation, rotation and uniform scaling
// of the points. Errors, all [*FitError]: fewer than five points
// ([ErrTooFewPoints]), a NaN or infinite coordinate or one beyond 1e100 in
// size ([ErrNotFinite], [ErrOverflow]), two equal points
// ([ErrDuplicatePoint], naming both indexes), points on one line within
// 1e-10 of their spread ([ErrCollinear]), and points that a conic fits only
// as a hyperbola or parabola ([ErrNotEllipse]): the best conic of any kind
// is not an ellipse and the nearest ellipse leaves residuals more than
// twice as large, or the fit grows past 10⁴ times the spread of the points.
func Fit(points []Point, opts ...FitOption) (FitResult, error) {
	set := fitSettings{maxIter: 200, minCoverage: 0.5}
	for _, o := range opts {
		if o != nil {
			o(&set)
		}
	}
	if set.maxIter < 1 {
		return FitResult{}, &Error{Field: "max iterations", Value: float64(set.maxIter), Limit: 1, HasLimit: true, Err: ErrFitOption}
	}
	if !(set.minCoverage >= 0 && set.minCoverage <= 1) {
		return FitResult{}, &Error{Field: "min coverage", Value: set.minCoverage, Limit: 1, HasLimit: true, Err: ErrFitOption}
	}
	n := len(points)
	if n < 5 {
		return FitResult{}, &FitError{Err: ErrTooFewPoints, Index: -1, Other: -1, Detail: strconv.Itoa(n) + " points"}
	}
	if err := fitCheckPoints(points); err != nil {
		return FitResult{}, err
	}
	frame := fitNewFrame(points)
	norm := make([]Point, n)
	for i, p := range points {
		norm[i] = frame.to(p)
	}
	if fitCollinear(norm) {
		return FitResult{}, &FitError{Err: ErrCollinear, Index: -1, Other: -1, Detail: strconv.Itoa(n) + " points"}
	}
	sc, ok := fitNewScatter(norm)
	if !ok {
		return FitResult{}, &FitError{Err: ErrCollinear, Index: -1, Other: -1, Detail: strconv.Itoa(n) + " points"}
	}
	free := sc.free()
	conic, ok := sc.direct()
	var p fitParams
	if ok {
		p, ok = fitConicEllipse(conic)
	}
	if !ok {
		// Rounding can leave no eigenvector inside the constraint when
		// the points hardly bend; the best free conic, if it is a real
		// ellipse, is as good a start.
		conic = free
		p, ok = fitConicEllipse(free)
	}
	if !ok {
		return FitResult{}, fitNotEllipse(free, "no ellipse satisfies the constraint 4AC − B² > 0")
	}
	scratch := make([]float64, 4*n)
	r, ts, r2, ts2 := scratch[:n], scratch[n:2*n], scratch[2*n:3*n], scratch[3*n:]
	res := FitResult{Converged: true}
	var ne fitNormal
	if set.algebraicOnly {
		e, ok := p.ellipse()
		if !ok {
			return FitResult{}, fitNotEllipse(free, "the direct fit is degenerate")
		}
		ne = fitEvaluate(e, norm, r, ts)
	} else {
		ref := fitRefine(norm, p, false, set.maxIter, r, ts, r2, ts2)
		if ref.runaway {
			return FitResult{}, fitNotEllipse(free, "the fit grows past 10000 times the spread of the points")
		}
		p, ne, res.Iterations, res.Converged = ref.p, ref.normal, ref.iterations, ref.converged
	}
	cov := fitCovariance(ne, n, false)
	res.RotationDetermined = fitRotationDetermined(p, cov)
	if !res.RotationDetermined {
		// Hold the rotation at 0 from a round start and fit the rest.
		mean := (p[2] + p[3]) / 2
		start := fitParams{p[0], p[1], mean, mean, 0}
		if set.algebraicOnly {
			start = fitParams{p[0], p[1], p[2], p[3], 0}
			if e, ok := start.ellipse(); ok {
				ne = fitEvaluate(e, norm, r, ts)
			}
		} else {
			ref := fitRefine(norm, start, true, set.maxIter, r, ts, r2, ts2)
			start, ne = ref.p, ref.normal
			res.Iterations += ref.iterations
			res.Converged = res.Converged && ref.converged
		}
		p = start
		cov = fitCovariance(ne, n, true)
	}
	e, err := fitWorldEllipse(p, frame)
	if err != nil {
		return FitResult{}, fitNotEllipse(free, "the fitted ellipse cannot be built ("+err.Error()+")")
	}
	res.Ellipse = e
	res.Uncertainty = fitWorldUncertainty(cov, p, frame)
	res.Residuals = make([]float64, n)
	sum := 0.0
	for i, pt := range points {
		t, d := e.Nearest(pt)
		res.Residuals[i], ts[i] = d, t
		sum += d * d
		if math.Abs(d) > res.MaxResidual || i == 0 {
			res.MaxResidual, res.MaxIndex = math.Abs(d), i
		}
	}
	res.RMS = math.Sqrt(sum / float64(n))
	res.Coverage = fitCoverage(ts)
	if kind := fitConicKind(free); kind != "ellipse" {
		other := fitConicDistanceRMS(free, norm) * frame.s
		rms := res.RMS
		if set.algebraicOnly {
			rms = fitConicDistanceRMS(conic, norm) * frame.s
		}
		if rms > 2*other+1e-9*frame.s {
			return FitResult{}, &FitError{Err: ErrNotEllipse, Index: -1, Other: -1,
				Detail: "the best conic through the points is " + fitArticle(kind) + " (rms distance " + fitNum(other) +
					") and the nearest ellipse leaves rms " + fitNum(rms)}
		}
	}
	res.Warnings = fitWarnings(&res, set, n)
	return res, nil
}

// fitNotEllipse returns the ErrNotEllipse error with what was found.
func fitNotEllipse(free [6]float64, why string) error {
	if kind := fitConicKind(free); kind != "ellipse" {
		why += "; the best conic through the points is " + fitArticle(kind)
	} else {
		why += "; the points bend too little to fix an ellipse"
	}
	return &FitError{Err: ErrNotEllipse, Index: -1, Other: -1, Detail: why}
}

// fitRotationDetermined reports whether a − b exceeds three of its
// standard errors and 1e-9·a. A NaN standard error (five points) leaves
// only the second test.
func fitRotationDetermined(p fitParams, cov fitMat5) bool {
	a, b := math.Max(p[2], p[3]), math.Min(p[2], p[3])
	diff := a - b
	if !(diff > 1e-9*a) {
		return false
	}
	v := cov[2][2] + cov[3][3] - 2*cov[2][3]
	return !(diff <= 3*math.Sqrt(math.Max(v, 0)))
}

// fitWorldEllipse maps normalised parameters to the world ellipse with the
// major semi-axis along its own x axis and rotation in [0, π).
func fitWorldEllipse(p fitParams, f fitFrame) (Ellipse, error) {
	rx, ry, rot := p[2], p[3], p[4]
	if ry > rx {
		rx, ry, rot = ry, rx, rot+math.Pi/2
	}
	rot = math.Mod(rot, math.Pi)
	if rot < 0 {
		rot += math.Pi
	}
	if rot >= math.Pi {
		rot = 0
	}
	return New(Point{f.mx + f.s*p[0], f.my + f.s*p[1]}, f.s*rx, f.s*ry, rot)
}

// fitWorldUncertainty maps the covariance of normalised parameters to
// world standard errors, the major axis first.
func fitWorldUncertainty(cov fitMat5, p fitParams, f fitFrame) FitUncertainty {
	sd := func(k int) float64 {
		if math.IsNaN(cov[k][k]) || math.IsInf(cov[k][k], 0) {
			return cov[k][k]
		}
		return math.Sqrt(math.Max(cov[k][k], 0))
	}
	u := FitUncertainty{
		Center:    Point{f.s * sd(0), f.s * sd(1)},
		SemiMajor: f.s * sd(2),
		SemiMinor: f.s * sd(3),
		Rotation:  sd(4),
	}
	if p[3] > p[2] {
		u.SemiMajor, u.SemiMinor = u.SemiMinor, u.SemiMajor
	}
	return u
}

// fitWarnings says in words what limits the result.
func fitWarnings(res *FitResult, set fitSettings, n int) []string {
	w := []string{}
	if res.Coverage < set.minCoverage {
		w = append(w, "the points span only "+fitPercent(res.Coverage)+" of the curve (in the ellipse parameter); below "+
			fitPercent(set.minCoverage)+" the semi-axes are poorly determined: measure round more of it")
	}
	if !res.RotationDetermined {
		a, b := res.Ellipse.SemiMajor(), res.Ellipse.SemiMinor()
		w = append(w, "the fit is nearly round (a − b = "+fitNum(a-b)+"): the points do not determine its rotation, so its axes are taken along x and y")
	}
	if n == 5 {
		w = append(w, "5 points fix an ellipse exactly: the residuals are zero whatever the measuring error and no uncertainty can be given; measure more points")
	}
	if !res.Converged {
		w = append(w, "the geometric fit did not settle in "+strconv.Itoa(res.Iterations)+" iterations; the result is the best found")
	}
	return w
}

// fitArticle puts "a" or "an" before the name of a conic.
func fitArticle(kind string) string {
	if kind == "ellipse" {
		return "an ellipse"
	}
	return "a " + kind
}

func fitNum(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

func fitPercent(f float64) string { return strconv.FormatFloat(100*f, 'f', 0, 64) + "%" }
