package ellipse_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/focitools/foci/ellipse"
)

// The bound on the errors of a fit to noisy points.
//
// Let the points be p_i = q(t_i) + ε_i, with q(t) the true ellipse and ε_i
// independent, of spread σ in each coordinate. To first order in σ the
// orthogonal-distance estimate is unbiased with covariance σ²·(JᵀJ)⁻¹,
// where J_ik = ∂d_i/∂θ_k is the derivative of the signed distance of point
// i with respect to parameter k at the truth (the Gauss–Markov result for
// linearised least squares; Seber & Wild, Nonlinear Regression, 1989,
// §2.1). So each parameter's error has standard deviation
//
//	sd_k = σ·√((JᵀJ)⁻¹_kk) = g_k·σ/√n
//
// where the geometry factor g_k depends only on the shape and on where
// the points lie, not on σ or on n for a given spread of parameters. For
// a circle with n even points it is closed-form: the distance derivatives
// are −cos t, −sin t (centre) and cos²t, sin²t (the semi-axes along x and
// y, rotation held), JᵀJ = n·diag(½, ½) ⊕ n·[[3/8, 1/8], [1/8, 3/8]], so
// g = √2 for each centre coordinate and √3 for each semi-axis.
//
// The tests below compute J independently of the fit (central differences
// of SignedDistance, inverted with gonum), draw K seeded noisy point sets,
// and require every error within 5·sd_k and the root-mean-square error of
// each parameter within [0.8, 1.25]·sd_k: with K = 300 draws an RMS
// estimate has a relative spread of 1/√(2K) ≈ 4%, so the band is about five
// of those wide either way. A fit that were biased, or noisier than least
// squares allows, or whose bound were computed wrong, fails.

// fitTruth is an ellipse with its parameters in the order of the covariance.
type fitTruth struct {
	cx, cy, a, b, rot float64 // a along the own x axis, a ≥ b
}

func (tr fitTruth) ellipse(t testing.TB) ellipse.Ellipse {
	return fitMustNew(t, ellipse.Point{X: tr.cx, Y: tr.cy}, tr.a, tr.b, tr.rot)
}

// fitPredictedSD returns sd_k/σ for the parameters (cx, cy, a, b, rot),
// or for the first four with the rotation held when holdRotation.
func fitPredictedSD(t *testing.T, tr fitTruth, ts []float64, holdRotation bool) []float64 {
	t.Helper()
	truth := tr.ellipse(t)
	pts := fitOn(truth, ts)
	k := 5
	if holdRotation {
		k = 4
	}
	base := []float64{tr.cx, tr.cy, tr.a, tr.b, tr.rot}
	steps := []float64{1e-6 * tr.a, 1e-6 * tr.a, 1e-6 * tr.a, 1e-6 * tr.a, 1e-6}
	jac := mat.NewDense(len(pts), k, nil)
	for j := range k {
		plus := append([]float64{}, base...)
		minus := append([]float64{}, base...)
		plus[j] += steps[j]
		minus[j] -= steps[j]
		ep := fitMustNew(t, ellipse.Point{X: plus[0], Y: plus[1]}, plus[2], plus[3], plus[4])
		em := fitMustNew(t, ellipse.Point{X: minus[0], Y: minus[1]}, minus[2], minus[3], minus[4])
		for i, p := range pts {
			jac.Set(i, j, (ep.SignedDistance(p)-em.SignedDistance(p))/(2*steps[j]))
		}
	}
	var jtj mat.SymDense
	jtj.SymOuterK(1, jac.T())
	var chol mat.Cholesky
	if !chol.Factorize(&jtj) {
		t.Fatalf("JᵀJ is singular")
	}
	var inv mat.SymDense
	if err := chol.InverseTo(&inv); err != nil {
		t.Fatal(err)
	}
	sd := make([]float64, k)
	for j := range sd {
		sd[j] = math.Sqrt(inv.At(j, j))
	}
	return sd
}

// fitNoisy returns the points of truth at ts with seeded Gaussian noise of
// spread sigma in each coordinate.
func fitNoisy(truth ellipse.Ellipse, ts []float64, sigma float64, rng *rand.Rand) []ellipse.Point {
	pts := fitOn(truth, ts)
	for i := range pts {
		pts[i].X += sigma * rng.NormFloat64()
		pts[i].Y += sigma * rng.NormFloat64()
	}
	return pts
}

// fitErrors returns the errors of the fitted centre, semi-axes and major
// axis direction.
func fitErrors(tr fitTruth, got ellipse.Ellipse) [5]float64 {
	c := got.Center()
	return [5]float64{c.X - tr.cx, c.Y - tr.cy, got.SemiMajor() - tr.a, got.SemiMinor() - tr.b,
		math.Remainder(got.MajorAngle()-tr.rot, math.Pi)}
}

var fitParamNames = [5]string{"centre x", "centre y", "semi-major", "semi-minor", "rotation"}

// TestFitNoisyErrorsWithinTheLinearisedBound runs the Monte Carlo check
// described above on whole curves, uneven points and partial arcs.
func TestFitNoisyErrorsWithinTheLinearisedBound(t *testing.T) {
	const trials = 300
	tests := []struct {
		name  string
		tr    fitTruth
		ts    func(rng *rand.Rand) []float64 // the same for every trial
		sigma float64
		// maxG caps the geometry factors g_k (rotation times a) of the
		// scenario: about 2–4 for the whole curve, growing to 10 for half
		// of it and 60 for a third, so that on a third of the curve the
		// axes are some 15 times less certain than on the whole.
		maxG float64
	}{
		{"whole curve, 60 even points", fitTruth{120, -35, 50, 30, 0.4}, func(*rand.Rand) []float64 { return fitParamsEven(60, 0.1, 2*math.Pi) }, 0.05, 4},
		{"whole curve, 24 scattered points, b/a 0.3", fitTruth{0, 0, 40, 12, 2.2}, func(rng *rand.Rand) []float64 {
			ts := make([]float64, 24)
			for i := range ts {
				ts[i] = 2 * math.Pi * rng.Float64()
			}
			return ts
		}, 0.02, 4},
		{"half the curve, 30 points", fitTruth{10, 10, 50, 30, 1.2}, func(*rand.Rand) []float64 { return fitParamsEven(30, 0.5, math.Pi) }, 0.02, 15},
		{"a third of the curve, 40 points", fitTruth{-200, 75, 50, 30, 0.3}, func(*rand.Rand) []float64 { return fitParamsEven(40, 1, 2*math.Pi/3) }, 0.005, 70},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			rng := rand.New(rand.NewPCG(7, 11))
			ts := tc.ts(rng)
			sd := fitPredictedSD(t, tc.tr, ts, false)
			n := float64(len(ts))
			for k := range sd {
				g := sd[k] * math.Sqrt(n)
				if k == 4 {
					g *= tc.tr.a // rotation times a: a length, like the others
				}
				t.Logf("%-10s sd %.4g·σ, geometry factor %.3g", fitParamNames[k], sd[k], g)
				if g > tc.maxG {
					t.Errorf("%s: geometry factor %.3g exceeds the scenario's %g", fitParamNames[k], g, tc.maxG)
				}
			}
			truth := tc.tr.ellipse(t)
			var sumSq, maxZ, sumUnc [5]float64
			for trial := range trials {
				pts := fitNoisy(truth, ts, tc.sigma, rng)
				res, err := ellipse.Fit(pts)
				if err != nil {
					t.Fatalf("trial %d: %v", trial, err)
				}
				if !res.Converged || !res.RotationDetermined {
					t.Fatalf("trial %d: converged %v, rotation determined %v", trial, res.Converged, res.RotationDetermined)
				}
				e := fitErrors(tc.tr, res.Ellipse)
				u := res.Uncertainty
				unc := [5]float64{u.Center.X, u.Center.Y, u.SemiMajor, u.SemiMinor, u.Rotation}
				for k := range e {
					sumSq[k] += e[k] * e[k]
					maxZ[k] = math.Max(maxZ[k], math.Abs(e[k])/(sd[k]*tc.sigma))
					sumUnc[k] += unc[k]
				}
			}
			for k := range sd {
				rmsRatio := math.Sqrt(sumSq[k]/trials) / (sd[k] * tc.sigma)
				uncRatio := sumUnc[k] / trials / (sd[k] * tc.sigma)
				t.Logf("%-10s rms error %.3f·sd, largest %.2f·sd, reported uncertainty %.3f·sd", fitParamNames[k], rmsRatio, maxZ[k], uncRatio)
				if rmsRatio < 0.8 || rmsRatio > 1.25 {
					t.Errorf("%s: rms error %.3f times the predicted sd, want within [0.8, 1.25]", fitParamNames[k], rmsRatio)
				}
				if maxZ[k] > 5 {
					t.Errorf("%s: an error of %.2f predicted sd, want at most 5", fitParamNames[k], maxZ[k])
				}
				if uncRatio < 0.85 || uncRatio > 1.15 {
					t.Errorf("%s: reported uncertainty %.3f times the predicted sd, want within [0.85, 1.15]", fitParamNames[k], uncRatio)
				}
			}
		})
	}
}

// TestFitNoisyCircleMatchesTheClosedForm fits noisy points of a circle:
// the rotation must be reported as undetermined in nearly every trial,
// and with it held the errors of the centre and of the semi-axis along x
// must have the closed-form spreads σ√(2/n) and σ√(3/n) derived above;
// the finite-difference bound must agree with them too.
func TestFitNoisyCircleMatchesTheClosedForm(t *testing.T) {
	const trials, n, sigma, r = 300, 40, 0.05, 25.0
	tr := fitTruth{30, 40, r, r, 0}
	ts := fitParamsEven(n, 0.05, 2*math.Pi)
	wantC, wantR := math.Sqrt(2.0/n), math.Sqrt(3.0/n)
	sd := fitPredictedSD(t, tr, ts, true)
	for k, want := range []float64{wantC, wantC, wantR, wantR} {
		if math.Abs(sd[k]-want) > 1e-6*want {
			t.Errorf("%s: finite-difference sd %.9g·σ, closed form %.9g·σ", fitParamNames[k], sd[k], want)
		}
	}
	rng := rand.New(rand.NewPCG(3, 5))
	truth := tr.ellipse(t)
	undetermined := 0
	var sumSq [3]float64
	for trial := range trials {
		res, err := ellipse.Fit(fitNoisy(truth, ts, sigma, rng))
		if err != nil {
			t.Fatal(err)
		}
		if res.RotationDetermined {
			continue
		}
		undetermined++
		e := res.Ellipse
		alongX := e.SemiX()
		if e.Rotation() != 0 {
			alongX = e.SemiY()
		}
		c := e.Center()
		for k, d := range []float64{c.X - tr.cx, c.Y - tr.cy, alongX - r} {
			sumSq[k] += d * d
		}
		if math.IsInf(res.Uncertainty.Rotation, 1) == false {
			t.Fatalf("trial %d: rotation uncertainty %g, want +Inf when undetermined", trial, res.Uncertainty.Rotation)
		}
	}
	// a − b of a free fit to a circle is the length of a 2-D Gaussian
	// vector; it passes three standard errors with probability e^(−9/2),
	// about 1%.
	if undetermined < trials*9/10 {
		t.Fatalf("rotation undetermined in %d of %d trials on a circle, want at least 90%%", undetermined, trials)
	}
	for k, want := range []float64{wantC, wantC, wantR} {
		ratio := math.Sqrt(sumSq[k]/float64(undetermined)) / (want * sigma)
		t.Logf("%s: rms error %.3f times the closed form", []string{"centre x", "centre y", "semi-axis along x"}[k], ratio)
		if ratio < 0.8 || ratio > 1.25 {
			t.Errorf("%s: rms error %.3f times σ√(%d/n)", []string{"centre x", "centre y", "semi-axis along x"}[k], ratio, []int{2, 2, 3}[k])
		}
	}
}

// TestFitRotationDeterminedWhenSignificant: a slightly oval part with its
// a − b twenty standard errors clear of zero has its rotation found.
func TestFitRotationDeterminedWhenSignificant(t *testing.T) {
	tr := fitTruth{0, 0, 25.5, 24.5, 1.0}
	ts := fitParamsEven(40, 0, 2*math.Pi)
	rng := rand.New(rand.NewPCG(9, 9))
	truth := tr.ellipse(t)
	for trial := range 50 {
		res, err := ellipse.Fit(fitNoisy(truth, ts, 0.05, rng))
		if err != nil {
			t.Fatal(err)
		}
		if !res.RotationDetermined {
			t.Fatalf("trial %d: rotation undetermined for a − b = 1 with σ = 0.05", trial)
		}
		if d := fitAngleDiff(res.Ellipse.MajorAngle(), tr.rot); d > 5*res.Uncertainty.Rotation {
			t.Errorf("trial %d: rotation off by %.3g rad, uncertainty %.3g", trial, d, res.Uncertainty.Rotation)
		}
	}
}
