package ellipse

import (
	"math"
	"slices"
)

// The geometric fit: Levenberg–Marquardt on the five parameters (centre x,
// centre y, semi-axis along the own x axis, semi-axis along the own y axis,
// rotation) minimising the sum of squared orthogonal distances, each found
// exactly by [Ellipse.Nearest].
//
// The Jacobian is analytic. With q(t) the foot point of p and n the outward
// unit normal there, the signed distance is d = n·(p − q(t)). Differentiating
// at the foot, the change of t does not count (p − q is normal to the
// curve, q'(t) is tangent) and neither does the change of n (it is a unit
// vector and p − q is parallel to it), so for every parameter θ
//
//	∂d/∂θ = −n·∂q/∂θ  at fixed t
//
// with ∂q/∂cx = (1, 0), ∂q/∂cy = (0, 1), ∂q/∂rx = R(rot)·(cos t, 0),
// ∂q/∂ry = R(rot)·(0, sin t) and ∂q/∂rot = the quarter-turned q − centre
// (S. J. Ahn, W. Rauh and H.-J. Warnecke, "Least-squares orthogonal
// distances fitting of circle, sphere, ellipse, hyperbola, and parabola",
// Pattern Recognition 34, 2001, derive the same from the implicit foot
// point equations). The damping is Marquardt's scaled diagonal (D. W.
// Marquardt, SIAM J. Appl. Math. 11, 1963), floored at 1e-9 of its largest
// entry so that the rotation of a nearly round ellipse, on which the
// distances hardly depend, stays regular.

// fitParams are the five parameters in the normalised frame: centre x,
// centre y, semi-axis along the own x axis, along the own y axis, rotation.
type fitParams [5]float64

// fitMaxSize bounds the semi-axes in the normalised frame (where the
// points have unit root-mean-square coordinate): a fit that wants to grow
// beyond it is chasing a parabola or hyperbola.
const fitMaxSize = 1e4

func (p fitParams) ellipse() (Ellipse, bool) {
	if !(p[2] > 0 && p[3] > 0) {
		return Ellipse{}, false
	}
	e, err := New(Point{p[0], p[1]}, p[2], p[3], p[4])
	return e, err == nil
}

// fitNormal is the state of the normal equations at one set of parameters.
type fitNormal struct {
	a     fitMat5 // JᵀJ
	g     fitVec5 // Jᵀr
	cost  float64 // Σr²
	noise float64 // bound on the rounding of cost
}

// fitEvaluate stores the signed distances and foot parameters of pts from e
// in r and ts and returns the normal equations. A point whose distance
// cannot be computed makes the cost infinite.
func fitEvaluate(e Ellipse, pts []Point, r, ts []float64) fitNormal {
	var ne fitNormal
	rx, ry, size := e.SemiX(), e.SemiY(), e.SemiMajor()
	sin, cos := math.Sincos(e.Rotation())
	for i, p := range pts {
		t, d := e.Nearest(p)
		if math.IsNaN(d) {
			ne.cost = math.Inf(1)
			return ne
		}
		r[i], ts[i] = d, t
		st, ct := math.Sincos(t)
		// Outward normal in the own frame, ∝ (ry·cos t, rx·sin t).
		lx, ly := ry*ct, rx*st
		h := math.Hypot(lx, ly)
		lx, ly = lx/h, ly/h
		nx, ny := cos*lx-sin*ly, sin*lx+cos*ly
		j := fitVec5{-nx, -ny, -lx * ct, -ly * st, lx*ry*st - ly*rx*ct}
		for a := range 5 {
			for b := a; b < 5; b++ {
				ne.a[a][b] += j[a] * j[b]
			}
			ne.g[a] += j[a] * d
		}
		ne.cost += d * d
		// d carries rounding of a few ulps of the coordinates.
		ne.noise += 2 * math.Abs(d) * 8e-16 * (math.Abs(p.X) + math.Abs(p.Y) + size)
	}
	for a := range 5 {
		for b := range a {
			ne.a[a][b] = ne.a[b][a]
		}
	}
	return ne
}

// fitRefinement is the outcome of the geometric fit.
type fitRefinement struct {
	p          fitParams
	normal     fitNormal // at p
	iterations int
	converged  bool
	runaway    bool // the minimum lies beyond fitMaxSize
}

// fitRefine runs Levenberg–Marquardt from p on the normalised points. With
// fixRotation the rotation stays at p[4]. The four slices are scratch of
// len(pts).
func fitRefine(pts []Point, p fitParams, fixRotation bool, maxIter int, r, ts, rTrial, tsTrial []float64) fitRefinement {
	out := fitRefinement{p: p}
	e, ok := p.ellipse()
	if !ok {
		return out
	}
	out.normal = fitEvaluate(e, pts, r, ts)
	if math.IsInf(out.normal.cost, 0) {
		return out
	}
	mu := 1e-3
	const flatLimit = 4
	flatSteps := 0
	for out.iterations < maxIter {
		cur := out.normal
		if cur.cost == 0 {
			out.converged = true
			break
		}
		out.iterations++
		a := cur.a
		g := cur.g
		if fixRotation {
			for k := range 5 {
				a[4][k], a[k][4] = 0, 0
			}
			a[4][4], g[4] = 1, 0
		}
		dmax := 0.0
		for k := range 5 {
			dmax = math.Max(dmax, a[k][k])
		}
		size := math.Max(out.p[2], out.p[3])
		accepted := false
		for !accepted {
			h := a
			for k := range 5 {
				h[k][k] += mu * math.Max(a[k][k], 1e-9*dmax)
			}
			step := fitVec5{}
			l, ok := fitCholesky(h)
			if ok {
				neg := fitVec5{-g[0], -g[1], -g[2], -g[3], -g[4]}
				step = fitCholeskySolve(l, neg)
			}
			stepSize := math.Sqrt(step[0]*step[0] + step[1]*step[1] + step[2]*step[2] + step[3]*step[3] + step[4]*step[4]*size*size)
			tiny := stepSize <= 1e-12*size
			var trial fitParams
			for k := range 5 {
				trial[k] = out.p[k] + step[k]
			}
			te, ok2 := trial.ellipse()
			var tn fitNormal
			if ok && ok2 {
				tn = fitEvaluate(te, pts, rTrial, tsTrial)
			}
			// Near the minimum the cost changes by δᵀ·JᵀJ·δ, which sinks
			// below the rounding of the distances (a few ulps of the
			// coordinates each, so a relative ε·a/σ of the cost) long
			// before δ reaches rounding, while the gradient Jᵀr still
			// points the way. A step whose cost rises by no more than that
			// rounding is therefore taken too, at most flatLimit in a row,
			// and the fit ends on a step of 1e-12 of the size.
			flat := ok && ok2 && tn.cost >= cur.cost && tn.cost-cur.cost <= 4*(tn.noise+cur.noise)
			if ok && ok2 && (tn.cost < cur.cost || flat) {
				if math.Max(trial[2], trial[3]) > fitMaxSize {
					out.runaway = true
					return out
				}
				accepted = true
				out.p, out.normal = trial, tn
				copy(r, rTrial)
				copy(ts, tsTrial)
				mu = math.Max(mu/10, 1e-15)
				if flat {
					flatSteps++
				} else {
					flatSteps = 0
				}
				if tiny || flatSteps >= flatLimit || tn.cost == 0 {
					out.converged = true
					return out
				}
				continue
			}
			if tiny && ok {
				// No descent left at the resolution of the parameters.
				out.converged = true
				return out
			}
			mu *= 10
			if mu > 1e20 {
				out.converged = true
				return out
			}
		}
	}
	return out
}

// fitCovariance returns the covariance of the five parameters, s²·(JᵀJ)⁻¹
// with s² = cost/(n − 5), the usual linearised estimate (for example
// Seber & Wild, Nonlinear Regression, Wiley 1989, §2.1). When JᵀJ is
// singular in the rotation (a circle), the rotation is held fixed, its
// variance is +Inf and the others are conditional on it. With five points
// there are no degrees of freedom left and every entry is NaN.
func fitCovariance(ne fitNormal, n int, fixRotation bool) fitMat5 {
	var cov fitMat5
	if n <= 5 {
		for i := range 5 {
			for j := range 5 {
				cov[i][j] = math.NaN()
			}
		}
		return cov
	}
	s2 := ne.cost / float64(n-5)
	a := ne.a
	rotFixed := fixRotation
	l, ok := fitCholesky(a)
	if !ok || fixRotation {
		for k := range 5 {
			a[4][k], a[k][4] = 0, 0
		}
		a[4][4] = 1
		l, ok = fitCholesky(a)
		rotFixed = true
	}
	if !ok {
		for i := range 5 {
			for j := range 5 {
				cov[i][j] = math.NaN()
			}
		}
		return cov
	}
	for j := range 5 {
		var e fitVec5
		e[j] = 1
		col := fitCholeskySolve(l, e)
		for i := range 5 {
			cov[i][j] = s2 * col[i]
		}
	}
	if rotFixed {
		for k := range 5 {
			cov[4][k], cov[k][4] = 0, 0
		}
		cov[4][4] = math.Inf(1)
	}
	return cov
}

// fitCoverage returns the fraction of the curve spanned by the foot
// parameters ts: one less the largest gap between neighbours (round the
// end) over 2π. It sorts ts.
func fitCoverage(ts []float64) float64 {
	if len(ts) == 0 {
		return 0
	}
	for i, t := range ts {
		t = math.Mod(t, 2*math.Pi)
		if t < 0 {
			t += 2 * math.Pi
		}
		ts[i] = t
	}
	slices.Sort(ts)
	gap := ts[0] + 2*math.Pi - ts[len(ts)-1]
	for i := 1; i < len(ts); i++ {
		gap = math.Max(gap, ts[i]-ts[i-1])
	}
	return math.Max(0, 1-gap/(2*math.Pi))
}
