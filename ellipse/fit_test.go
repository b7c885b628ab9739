package ellipse_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// fitMustNew builds a test ellipse or stops the test.
func fitMustNew(t testing.TB, c ellipse.Point, semiX, semiY, rot float64) ellipse.Ellipse {
	t.Helper()
	e, err := ellipse.New(c, semiX, semiY, rot)
	if err != nil {
		t.Fatalf("New(%v, %v, %v, %v): %v", c, semiX, semiY, rot, err)
	}
	return e
}

// fitParamsEven returns n parameters spread evenly over [from, from+span),
// the last one at the end of the span when it is not the whole turn.
func fitParamsEven(n int, from, span float64) []float64 {
	ts := make([]float64, n)
	for i := range ts {
		if span >= 2*math.Pi {
			ts[i] = from + span*float64(i)/float64(n)
		} else {
			ts[i] = from + span*float64(i)/float64(n-1)
		}
	}
	return ts
}

// fitOn returns the points of e at the parameters ts.
func fitOn(e ellipse.Ellipse, ts []float64) []ellipse.Point {
	pts := make([]ellipse.Point, len(ts))
	for i, t := range ts {
		pts[i] = e.PointAt(t)
	}
	return pts
}

// fitAngleDiff returns the difference of two axis directions modulo π,
// in [0, π/2].
func fitAngleDiff(a, b float64) float64 {
	return math.Abs(math.Remainder(a-b, math.Pi))
}

// TestFitExactPointsComeBack fits points that lie exactly on known
// ellipses (constructed with New, so the truth is the construction) and
// requires the centre, semi-axes and major-axis direction back to 1e-9
// relative to the semi-major axis, including very flat and nearly round
// ones, partial arcs, far-off centres and extreme scales.
func TestFitExactPointsComeBack(t *testing.T) {
	tests := []struct {
		name          string
		center        ellipse.Point
		semiX, semiY  float64
		rot           float64
		ts            []float64
		rotDetermined bool
		rotTol        float64 // radians
		coverageWarn  bool
	}{
		{"ordinary", ellipse.Point{X: 12, Y: -7}, 50, 30, 0.4, fitParamsEven(20, 0, 2*math.Pi), true, 1e-9, false},
		{"major along own y", ellipse.Point{X: -3, Y: 8}, 20, 45, 2.5, fitParamsEven(16, 0.3, 2*math.Pi), true, 1e-9, false},
		{"flat b/a 0.01", ellipse.Point{X: 5, Y: 5}, 200, 2, 1.1, fitParamsEven(40, 0, 2*math.Pi), true, 1e-9, false},
		{"flat b/a 0.001", ellipse.Point{X: 0, Y: 0}, 200, 0.2, -0.6, fitParamsEven(60, 0.01, 2*math.Pi), true, 1e-9, false},
		{"round to 1e-6", ellipse.Point{X: 1, Y: 2}, 80, 80 * (1 - 1e-6), 0.9, fitParamsEven(24, 0, 2*math.Pi), true, 1e-6, false},
		{"round to 1e-12", ellipse.Point{X: 1, Y: 2}, 80, 80 * (1 - 1e-12), 0.9, fitParamsEven(24, 0, 2*math.Pi), false, 0, false},
		{"circle", ellipse.Point{X: -40, Y: 40}, 25, 25, 0, fitParamsEven(12, 0.2, 2*math.Pi), false, 0, false},
		{"third of the curve", ellipse.Point{X: 100, Y: 50}, 60, 35, 0.3, fitParamsEven(25, 1, 2*math.Pi/3), true, 1e-9, true},
		{"tenth of the curve", ellipse.Point{X: 0, Y: 0}, 60, 35, 0.3, fitParamsEven(25, 4, 2*math.Pi/10), true, 1e-9, true},
		{"far from the origin", ellipse.Point{X: 2.5e6, Y: -1.5e6}, 300, 120, 1.3, fitParamsEven(30, 0, 2*math.Pi), true, 1e-9, false},
		{"micrometre scale", ellipse.Point{X: 3e-6, Y: 1e-6}, 2e-6, 1.5e-6, 0.2, fitParamsEven(18, 0, 2*math.Pi), true, 1e-9, false},
		{"kilometre scale", ellipse.Point{X: 3e5, Y: 1e5}, 2e5, 1.5e5, 0.2, fitParamsEven(18, 0, 2*math.Pi), true, 1e-9, false},
		{"five points", ellipse.Point{X: 1, Y: 1}, 10, 4, 0.7, []float64{0, 1.1, 2.9, 4, 5.5}, true, 1e-9, false},
		{"uneven spacing", ellipse.Point{X: 0, Y: 0}, 10, 6, 2, []float64{0, 0.05, 0.07, 1.3, 2.0, 2.02, 3.5, 4.4, 4.41, 5.9}, true, 1e-9, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			truth := fitMustNew(t, tc.center, tc.semiX, tc.semiY, tc.rot)
			res, err := ellipse.Fit(fitOn(truth, tc.ts))
			if err != nil {
				t.Fatal(err)
			}
			got := res.Ellipse
			a := truth.SemiMajor()
			c, gc := truth.Center(), got.Center()
			if d := math.Hypot(gc.X-c.X, gc.Y-c.Y) / a; d > 1e-9 {
				t.Errorf("centre %v, want %v (relative error %.3g)", gc, c, d)
			}
			if d := math.Abs(got.SemiMajor()-a) / a; d > 1e-9 {
				t.Errorf("semi-major %.17g, want %.17g (relative error %.3g)", got.SemiMajor(), a, d)
			}
			if d := math.Abs(got.SemiMinor()-truth.SemiMinor()) / a; d > 1e-9 {
				t.Errorf("semi-minor %.17g, want %.17g (relative error %.3g)", got.SemiMinor(), truth.SemiMinor(), d)
			}
			if got.SemiX() < got.SemiY() {
				t.Errorf("semi-axis along own x %g < along own y %g; want the major along own x", got.SemiX(), got.SemiY())
			}
			if r := got.Rotation(); !(r >= 0 && r < math.Pi) {
				t.Errorf("rotation %g outside [0, π)", r)
			}
			if res.RotationDetermined != tc.rotDetermined {
				t.Errorf("RotationDetermined = %v, want %v", res.RotationDetermined, tc.rotDetermined)
			}
			if tc.rotDetermined {
				if d := fitAngleDiff(got.MajorAngle(), truth.MajorAngle()); d > tc.rotTol {
					t.Errorf("major axis at %.17g, want %.17g (error %.3g rad)", got.MajorAngle(), truth.MajorAngle(), d)
				}
			} else {
				if got.Rotation() != 0 && got.Rotation() != math.Pi/2 {
					t.Errorf("undetermined rotation reported as %g, want the axes along x and y", got.Rotation())
				}
				if !fitHasWarning(res, "nearly round") {
					t.Errorf("no warning about the rotation in %q", res.Warnings)
				}
			}
			if res.RMS > 1e-9*a || res.MaxResidual > 1e-9*a {
				t.Errorf("rms %g, max %g residual on exact points", res.RMS, res.MaxResidual)
			}
			if len(res.Residuals) != len(tc.ts) {
				t.Errorf("%d residuals for %d points", len(res.Residuals), len(tc.ts))
			}
			if got := fitHasWarning(res, "span only"); got != tc.coverageWarn {
				t.Errorf("coverage warning %v, want %v (coverage %.3f, warnings %q)", got, tc.coverageWarn, res.Coverage, res.Warnings)
			}
		})
	}
}

func fitHasWarning(res ellipse.FitResult, part string) bool {
	for _, w := range res.Warnings {
		if strings.Contains(w, part) {
			return true
		}
	}
	return false
}

// TestFitCoverageMeasuresTheSpan checks Coverage against the spans the
// points were placed on: n even points round the whole curve span
// 1 − 1/n of it, points from t0 to t0 + span span span/2π (the foot points
// of exact points are the points themselves).
func TestFitCoverageMeasuresTheSpan(t *testing.T) {
	truth := fitMustNew(t, ellipse.Point{X: 3, Y: 4}, 40, 25, 0.8)
	tests := []struct {
		ts   []float64
		want float64
	}{
		{fitParamsEven(8, 0, 2*math.Pi), 7.0 / 8},
		{fitParamsEven(40, 0.5, 2*math.Pi), 39.0 / 40},
		{fitParamsEven(15, 5, math.Pi), 0.5},
		{fitParamsEven(15, -1, 2*math.Pi/3), 1.0 / 3},
		{fitParamsEven(15, 2, 0.3*2*math.Pi), 0.3},
	}
	for _, tc := range tests {
		res, err := ellipse.Fit(fitOn(truth, tc.ts))
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(res.Coverage-tc.want) > 1e-9 {
			t.Errorf("points at %.3f…%.3f: coverage %.12f, want %.12f", tc.ts[0], tc.ts[len(tc.ts)-1], res.Coverage, tc.want)
		}
	}
	// The warning threshold follows the option.
	res, err := ellipse.Fit(fitOn(truth, fitParamsEven(15, 0, 0.6*2*math.Pi)), ellipse.FitMinCoverage(0.7))
	if err != nil {
		t.Fatal(err)
	}
	if !fitHasWarning(res, "span only 60% of the curve") || !fitHasWarning(res, "below 70%") {
		t.Errorf("60%% coverage under a 70%% minimum: warnings %q", res.Warnings)
	}
}

// TestFitRefusesBadPoints checks each refusal: its sentinel, the indexes
// it names and that the message says what was found.
func TestFitRefusesBadPoints(t *testing.T) {
	var parabola, hyperbola, bothBranches, line []ellipse.Point
	for i := range 15 {
		x := -1 + 2*float64(i)/14
		parabola = append(parabola, ellipse.Point{X: x, Y: x*x/4 + 3})
		line = append(line, ellipse.Point{X: x, Y: 2*x + 1})
		u := 0.5 + float64(i)/7
		hyperbola = append(hyperbola, ellipse.Point{X: u, Y: 1 / u})
	}
	for i := range 8 {
		x := 0.5 + float64(i)/4
		bothBranches = append(bothBranches, ellipse.Point{X: x, Y: 1 / x}, ellipse.Point{X: -x, Y: -1 / x})
	}
	sq := []ellipse.Point{{X: 0, Y: 0}, {X: 1, Y: 0}, {X: 1, Y: 1}, {X: 0, Y: 1}, {X: 0.5, Y: 1.4}}
	tests := []struct {
		name         string
		pts          []ellipse.Point
		want         error
		index, other int
		msg          string
	}{
		{"none", nil, ellipse.ErrTooFewPoints, -1, -1, "0 points"},
		{"four", sq[:4], ellipse.ErrTooFewPoints, -1, -1, "4 points"},
		{"NaN", append(append([]ellipse.Point{}, sq[:3]...), ellipse.Point{X: 2, Y: math.NaN()}, sq[4]), ellipse.ErrNotFinite, 3, -1, "point 3 y NaN"},
		{"infinite", append([]ellipse.Point{{X: math.Inf(-1), Y: 0}}, sq...), ellipse.ErrNotFinite, 0, -1, "point 0 x -Inf"},
		{"huge", append([]ellipse.Point{{X: 1, Y: 2e100}}, sq...), ellipse.ErrOverflow, 0, -1, "point 0 y 2e+100"},
		{"duplicate", []ellipse.Point{{X: 0, Y: 0}, {X: 2, Y: 0}, {X: 3, Y: 1}, {X: 2, Y: 2}, {X: 0, Y: 3}, {X: 3, Y: 1}}, ellipse.ErrDuplicatePoint, 2, 5, "points 2 and 5 at (3, 1)"},
		{"several duplicates", []ellipse.Point{{X: 9, Y: 9}, {X: 0, Y: 0}, {X: 1, Y: 0}, {X: 0, Y: 1}, {X: 1, Y: 0}, {X: 2, Y: 2}, {X: 0, Y: 0}, {X: 0, Y: 0}}, ellipse.ErrDuplicatePoint, 1, 6, "points 1 and 6 at (0, 0) (and 2 more repeats)"},
		{"collinear", line, ellipse.ErrCollinear, -1, -1, "15 points"},
		{"parabola", parabola, ellipse.ErrNotEllipse, -1, -1, "a parabola"},
		{"hyperbola arc", hyperbola, ellipse.ErrNotEllipse, -1, -1, "a hyperbola"},
		{"both branches", bothBranches, ellipse.ErrNotEllipse, -1, -1, "a hyperbola"},
		{"five on a hyperbola", []ellipse.Point{{X: 1, Y: 1}, {X: 2, Y: 0.5}, {X: 4, Y: 0.25}, {X: -1, Y: -1}, {X: -2, Y: -0.5}}, ellipse.ErrNotEllipse, -1, -1, "a hyperbola"},
		{"two crossing lines", []ellipse.Point{{X: 0, Y: 0}, {X: 1, Y: 1}, {X: 2, Y: 2}, {X: 3, Y: 3}, {X: 1, Y: -1}, {X: 2, Y: -2}, {X: 3, Y: -3}}, ellipse.ErrNotEllipse, -1, -1, "a hyperbola"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ellipse.Fit(tc.pts)
			if !errors.Is(err, tc.want) {
				t.Fatalf("error %v, want %v", err, tc.want)
			}
			var fe *ellipse.FitError
			if !errors.As(err, &fe) {
				t.Fatalf("error %T, want *ellipse.FitError", err)
			}
			if fe.Index != tc.index || fe.Other != tc.other {
				t.Errorf("indexes %d, %d, want %d, %d", fe.Index, fe.Other, tc.index, tc.other)
			}
			if msg := err.Error(); !strings.HasPrefix(msg, "ellipse: fit: ") || !strings.Contains(msg, tc.msg) {
				t.Errorf("message %q, want it to contain %q", msg, tc.msg)
			}
		})
	}
}

// TestFitOptions checks the options' limits and effects.
func TestFitOptions(t *testing.T) {
	truth := fitMustNew(t, ellipse.Point{X: 0, Y: 0}, 40, 25, 0.8)
	pts := fitOn(truth, fitParamsEven(12, 0, 2*math.Pi))
	for _, opt := range []ellipse.FitOption{ellipse.FitMaxIterations(0), ellipse.FitMinCoverage(-0.1), ellipse.FitMinCoverage(1.5), ellipse.FitMinCoverage(math.NaN())} {
		if _, err := ellipse.Fit(pts, opt); !errors.Is(err, ellipse.ErrFitOption) {
			t.Errorf("bad option: error %v, want ErrFitOption", err)
		}
	}
	// Perturb the points so that the algebraic and geometric fits differ.
	noisy := append([]ellipse.Point{}, pts...)
	for i := range noisy {
		noisy[i].X += 0.3 * math.Sin(float64(7*i))
		noisy[i].Y += 0.3 * math.Cos(float64(5*i))
	}
	alg, err := ellipse.Fit(noisy, ellipse.FitAlgebraicOnly())
	if err != nil {
		t.Fatal(err)
	}
	geo, err := ellipse.Fit(noisy)
	if err != nil {
		t.Fatal(err)
	}
	if alg.Iterations != 0 || geo.Iterations == 0 {
		t.Errorf("iterations: algebraic %d, geometric %d", alg.Iterations, geo.Iterations)
	}
	if !(geo.RMS < alg.RMS) {
		t.Errorf("the geometric fit (rms %g) should beat the algebraic one (rms %g) on orthogonal distance", geo.RMS, alg.RMS)
	}
	one, err := ellipse.Fit(noisy, ellipse.FitMaxIterations(1))
	if err != nil {
		t.Fatal(err)
	}
	if one.Iterations != 1 || one.Converged || !fitHasWarning(one, "did not settle in 1 iterations") {
		t.Errorf("one iteration: %d iterations, converged %v, warnings %q", one.Iterations, one.Converged, one.Warnings)
	}
}

// TestFitResidualsAreSignedDistances checks the residuals against
// SignedDistance of the fitted ellipse, their RMS and maximum, and that a
// point moved outward by h shows a residual near +h.
func TestFitResidualsAreSignedDistances(t *testing.T) {
	truth := fitMustNew(t, ellipse.Point{X: 10, Y: 20}, 30, 18, 0.25)
	ts := fitParamsEven(30, 0, 2*math.Pi)
	pts := fitOn(truth, ts)
	const h = 0.05
	n := truth.Normal(ts[7])
	pts[7] = ellipse.Point{X: pts[7].X + h*n.X, Y: pts[7].Y + h*n.Y}
	res, err := ellipse.Fit(pts)
	if err != nil {
		t.Fatal(err)
	}
	sum, maxAbs := 0.0, 0.0
	for i, p := range pts {
		d := res.Ellipse.SignedDistance(p)
		if math.Abs(res.Residuals[i]-d) > 1e-12 {
			t.Errorf("residual %d = %g, SignedDistance %g", i, res.Residuals[i], d)
		}
		sum += d * d
		maxAbs = math.Max(maxAbs, math.Abs(d))
	}
	if rms := math.Sqrt(sum / float64(len(pts))); math.Abs(rms-res.RMS) > 1e-12 {
		t.Errorf("RMS %g, want %g", res.RMS, rms)
	}
	if res.MaxIndex != 7 || math.Abs(res.MaxResidual-maxAbs) > 1e-15 {
		t.Errorf("max residual %g at %d, want %g at 7", res.MaxResidual, res.MaxIndex, maxAbs)
	}
	// One point out of 30 moved by h pulls the curve by about h/30 and
	// keeps most of its offset: at least half of it, and positive.
	if r := res.Residuals[7]; !(r > h/2 && r < h) {
		t.Errorf("residual of the moved point %g, want in (%g, %g)", r, h/2, h)
	}
}
