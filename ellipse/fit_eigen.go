package ellipse

import "math"

// Small dense linear algebra for the ellipse fit: a 3x3 eigen solver for
// the non-symmetric reduced matrix of the direct fit, a 3x3 symmetric
// Jacobi solver, and Gaussian elimination and Cholesky solves. All work on
// fixed-size arrays and allocate nothing.

// fitMat3 is a 3x3 matrix, row-major.
type fitMat3 [3][3]float64

// fitVec3 is a vector of three.
type fitVec3 [3]float64

// fitEigen3 returns the real eigenvalues of m, with unit right
// eigenvectors, in vals[:n] and vecs[:n].
//
// The matrix of the direct ellipse fit, M = C1⁻¹·(S1 − S2·S3⁻¹·S2ᵀ), is not
// symmetric, but it is similar to a symmetric matrix whenever the reduced
// scatter is positive definite, so its eigenvalues are real in exact
// arithmetic. The method is the characteristic cubic followed by inverse
// iteration:
//
//  1. m is scaled by its largest entry, so the cubic's coefficients are of
//     order one whatever the units.
//  2. The roots of det(λI − m) come from the trigonometric form of the
//     depressed cubic when all three are real; when rounding has pushed a
//     close pair off the real axis, Cardano's form gives the real root and
//     the pair's common real part stands for the (nearly) double root. Each
//     root is polished by Newton steps on the cubic that stop as soon as
//     the residual no longer shrinks.
//  3. The eigenvector of each root starts as the largest cross product of
//     two rows of m − λI (the null vector of a rank-2 matrix) and is then
//     refined by two steps of inverse iteration, solved by Gaussian
//     elimination with partial pivoting and a shift of a few ulps so the
//     system is never exactly singular. Inverse iteration converges in one
//     step from an eigenvalue good to rounding, so the vector is accurate
//     to rounding divided by the gap to the nearest other eigenvalue, as
//     for any backward-stable method.
//
// A zero or non-finite matrix has no eigenvalues here (n = 0).
func fitEigen3(m fitMat3) (vals fitVec3, vecs [3]fitVec3, n int) {
	s := 0.0
	for i := range 3 {
		for j := range 3 {
			s = math.Max(s, math.Abs(m[i][j]))
		}
	}
	if s == 0 || math.IsInf(s, 0) || math.IsNaN(s) {
		return vals, vecs, 0
	}
	var a fitMat3
	for i := range 3 {
		for j := range 3 {
			a[i][j] = m[i][j] / s
		}
	}
	// det(λI − a) = λ³ + c2·λ² + c1·λ + c0.
	tr := a[0][0] + a[1][1] + a[2][2]
	minors := a[0][0]*a[1][1] - a[0][1]*a[1][0] +
		a[0][0]*a[2][2] - a[0][2]*a[2][0] +
		a[1][1]*a[2][2] - a[1][2]*a[2][1]
	c2, c1, c0 := -tr, minors, -fitDet3(a)
	roots, nr := fitCubicRoots(c2, c1, c0)
	for k := range nr {
		lam := fitPolishRoot(c2, c1, c0, roots[k])
		v, ok := fitNullVector(a, lam)
		if !ok {
			continue
		}
		vals[n], vecs[n] = lam*s, v
		n++
	}
	return vals, vecs, n
}

// fitDet3 returns the determinant of a by cofactors of the first row.
func fitDet3(a fitMat3) float64 {
	return a[0][0]*(a[1][1]*a[2][2]-a[1][2]*a[2][1]) -
		a[0][1]*(a[1][0]*a[2][2]-a[1][2]*a[2][0]) +
		a[0][2]*(a[1][0]*a[2][1]-a[1][1]*a[2][0])
}

// fitCubicRoots returns the real roots of x³ + c2·x² + c1·x + c0, or, when
// the discriminant says one real root and a complex pair, the real root
// and the pair's real part (the double root that rounding split).
func fitCubicRoots(c2, c1, c0 float64) (r fitVec3, n int) {
	shift := c2 / 3
	p := c1 - c2*shift                 // c1 − c2²/3
	q := (2*shift*shift-c1)*shift + c0 // 2c2³/27 − c1c2/3 + c0
	if p == 0 && q == 0 {
		return fitVec3{-shift}, 1
	}
	p3 := p / 3
	disc := (q/2)*(q/2) + p3*p3*p3
	if disc <= 0 && p < 0 {
		// Three real roots: y = 2√(−p/3)·cos((φ − 2πk)/3).
		rad := math.Sqrt(-p3)
		c := -q / (2 * rad * rad * rad)
		c = math.Max(-1, math.Min(1, c))
		phi := math.Acos(c)
		for k := range 3 {
			r[k] = 2*rad*math.Cos((phi-2*math.Pi*float64(k))/3) - shift
		}
		return r, 3
	}
	// One real root by Cardano, the cube root taken of the larger term so
	// that nothing cancels.
	w := -q/2 - math.Copysign(math.Sqrt(disc), q)
	u := math.Cbrt(w)
	y := u
	if u != 0 {
		y = u - p3/u
	}
	return fitVec3{y - shift, -y/2 - shift}, 2
}

// fitPolishRoot improves a root of x³ + c2·x² + c1·x + c0 by Newton steps
// for as long as they reduce the residual.
func fitPolishRoot(c2, c1, c0, x float64) float64 {
	f := ((x+c2)*x+c1)*x + c0
	for range 6 {
		if f == 0 {
			return x
		}
		d := (3*x+2*c2)*x + c1
		if d == 0 {
			return x
		}
		xn := x - f/d
		fn := ((xn+c2)*xn+c1)*xn + c0
		if !(math.Abs(fn) < math.Abs(f)) {
			return x
		}
		x, f = xn, fn
	}
	return x
}

// fitNullVector returns a unit vector v with (a − λI)·v ≈ 0: the largest
// cross product of two rows, refined by inverse iteration.
func fitNullVector(a fitMat3, lam float64) (fitVec3, bool) {
	var b fitMat3
	for i := range 3 {
		for j := range 3 {
			b[i][j] = a[i][j]
		}
		b[i][i] -= lam
	}
	best, bestNorm := fitVec3{}, 0.0
	for _, pr := range [3][2]int{{0, 1}, {0, 2}, {1, 2}} {
		c := fitCross(b[pr[0]], b[pr[1]])
		if nm := fitNorm3(c); nm > bestNorm {
			best, bestNorm = c, nm
		}
	}
	if bestNorm == 0 || math.IsNaN(bestNorm) || math.IsInf(bestNorm, 0) {
		// λ has a two-dimensional eigenspace (or b is zero): any vector
		// orthogonal to the largest row is an eigenvector.
		big, bigNorm := 0, 0.0
		for i := range 3 {
			if nm := fitNorm3(b[i]); nm > bigNorm {
				big, bigNorm = i, nm
			}
		}
		if bigNorm == 0 {
			return fitVec3{1, 0, 0}, true
		}
		r := b[big]
		// The axis least aligned with r, crossed with r.
		axis := fitVec3{}
		k := 0
		for i := 1; i < 3; i++ {
			if math.Abs(r[i]) < math.Abs(r[k]) {
				k = i
			}
		}
		axis[k] = 1
		best = fitCross(r, axis)
		bestNorm = fitNorm3(best)
	}
	v := fitScale3(best, 1/bestNorm)
	// Inverse iteration with a shift of a few ulps of the matrix scale.
	shift := 4 * 0x1p-52 * (1 + math.Abs(lam))
	for i := range 3 {
		b[i][i] -= shift
	}
	for range 2 {
		w, ok := fitSolve3(b, v)
		if !ok {
			break
		}
		nm := fitNorm3(w)
		if nm == 0 || math.IsNaN(nm) || math.IsInf(nm, 0) {
			break
		}
		v = fitScale3(w, 1/nm)
	}
	return v, true
}

// fitSolve3 solves a·x = b by Gaussian elimination with partial pivoting.
// It reports false when a pivot is exactly zero.
func fitSolve3(a fitMat3, b fitVec3) (fitVec3, bool) {
	for col := range 3 {
		p := col
		for r := col + 1; r < 3; r++ {
			if math.Abs(a[r][col]) > math.Abs(a[p][col]) {
				p = r
			}
		}
		if a[p][col] == 0 {
			return fitVec3{}, false
		}
		a[col], a[p] = a[p], a[col]
		b[col], b[p] = b[p], b[col]
		for r := col + 1; r < 3; r++ {
			f := a[r][col] / a[col][col]
			for c := col; c < 3; c++ {
				a[r][c] -= f * a[col][c]
			}
			b[r] -= f * b[col]
		}
	}
	var x fitVec3
	for r := 2; r >= 0; r-- {
		s := b[r]
		for c := r + 1; c < 3; c++ {
			s -= a[r][c] * x[c]
		}
		x[r] = s / a[r][r]
	}
	return x, true
}

// fitSymEigen3 returns the eigenvalues of the symmetric matrix a in
// ascending order with orthonormal eigenvectors (vecs[k] belongs to
// vals[k]), by cyclic Jacobi rotations (Golub & Van Loan, Matrix
// Computations, §8.5), which are accurate to rounding relative to the norm
// of a and always converge.
func fitSymEigen3(a fitMat3) (vals fitVec3, vecs [3]fitVec3) {
	v := fitMat3{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
	for range 50 {
		off := a[0][1]*a[0][1] + a[0][2]*a[0][2] + a[1][2]*a[1][2]
		diag := a[0][0]*a[0][0] + a[1][1]*a[1][1] + a[2][2]*a[2][2]
		if off <= 1e-34*diag || off == 0 {
			break
		}
		for _, pq := range [3][2]int{{0, 1}, {0, 2}, {1, 2}} {
			p, q := pq[0], pq[1]
			if a[p][q] == 0 {
				continue
			}
			theta := (a[q][q] - a[p][p]) / (2 * a[p][q])
			t := math.Copysign(1, theta) / (math.Abs(theta) + math.Sqrt(theta*theta+1))
			if math.IsInf(theta, 0) {
				t = 0
			}
			c := 1 / math.Sqrt(t*t+1)
			s := t * c
			for k := range 3 {
				akp, akq := a[k][p], a[k][q]
				a[k][p] = c*akp - s*akq
				a[k][q] = s*akp + c*akq
			}
			for k := range 3 {
				apk, aqk := a[p][k], a[q][k]
				a[p][k] = c*apk - s*aqk
				a[q][k] = s*apk + c*aqk
			}
			for k := range 3 {
				vkp, vkq := v[k][p], v[k][q]
				v[k][p] = c*vkp - s*vkq
				v[k][q] = s*vkp + c*vkq
			}
		}
	}
	idx := [3]int{0, 1, 2}
	for i := 1; i < 3; i++ {
		for j := i; j > 0 && a[idx[j]][idx[j]] < a[idx[j-1]][idx[j-1]]; j-- {
			idx[j], idx[j-1] = idx[j-1], idx[j]
		}
	}
	for k, c := range idx {
		vals[k] = a[c][c]
		vecs[k] = fitVec3{v[0][c], v[1][c], v[2][c]}
	}
	return vals, vecs
}

func fitCross(a, b fitVec3) fitVec3 {
	return fitVec3{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}

func fitNorm3(a fitVec3) float64 { return math.Sqrt(a[0]*a[0] + a[1]*a[1] + a[2]*a[2]) }

func fitScale3(a fitVec3, s float64) fitVec3 { return fitVec3{a[0] * s, a[1] * s, a[2] * s} }

// fitMat5 and fitVec5 hold the normal equations of the geometric fit.
type (
	fitMat5 [5][5]float64
	fitVec5 [5]float64
)

// fitCholesky returns the lower Cholesky factor of the symmetric matrix a,
// or false when a is not positive definite to working precision.
func fitCholesky(a fitMat5) (fitMat5, bool) {
	var l fitMat5
	for j := range 5 {
		d := a[j][j]
		for k := range j {
			d -= l[j][k] * l[j][k]
		}
		if !(d > 0) || math.IsInf(d, 0) {
			return l, false
		}
		l[j][j] = math.Sqrt(d)
		for i := j + 1; i < 5; i++ {
			s := a[i][j]
			for k := range j {
				s -= l[i][k] * l[j][k]
			}
			l[i][j] = s / l[j][j]
		}
	}
	return l, true
}

// fitCholeskySolve solves l·lᵀ·x = b.
func fitCholeskySolve(l fitMat5, b fitVec5) fitVec5 {
	var y, x fitVec5
	for i := range 5 {
		s := b[i]
		for k := range i {
			s -= l[i][k] * y[k]
		}
		y[i] = s / l[i][i]
	}
	for i := 4; i >= 0; i-- {
		s := y[i]
		for k := i + 1; k < 5; k++ {
			s -= l[k][i] * x[k]
		}
		x[i] = s / l[i][i]
	}
	return x
}
