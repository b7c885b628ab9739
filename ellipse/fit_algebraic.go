package ellipse

import "math"

// The direct least-squares fit constrained to ellipses (A. Fitzgibbon,
// M. Pilu and R. B. Fisher, "Direct least square fitting of ellipses",
// IEEE TPAMI 21(5), 1999) in the numerically stable form of R. Halíř and
// J. Flusser ("Numerically stable direct least squares fitting of
// ellipses", WSCG 1998).
//
// The conic A·x² + B·xy + C·y² + D·x + E·y + F = 0 with coefficient vector
// a = (a1; a2), a1 = (A, B, C), a2 = (D, E, F), minimises ‖D1·a1 + D2·a2‖²
// under the ellipse constraint 4AC − B² = 1, where the rows of D1 are
// (x², xy, y²) and those of D2 are (x, y, 1). With the scatter blocks
// S1 = D1ᵀD1, S2 = D1ᵀD2, S3 = D2ᵀD2, the optimal a2 for a given a1 is
// T·a1 with T = −S3⁻¹·S2ᵀ, which leaves the 3x3 problem
//
//	M·a1 = λ·a1,  M = C1⁻¹·(S1 + S2·T),  C1 = [[0 0 2] [0 −1 0] [2 0 0]]
//
// whose solution is the eigenvector with 4AC − B² > 0. Halíř and Flusser
// pick it by that sign rather than by the sign of λ, which for exact data
// is zero and may come out with either sign. Among eigenvectors that
// satisfy the constraint (in exact arithmetic there is exactly one) the one
// with the least algebraic cost a1ᵀ·Mr·a1 / (4AC − B²) is taken.
//
// Before any of this the points are moved to their centroid and scaled to
// unit root-mean-square coordinate (common practice for conditioning, as
// in Hartley's normalisation for the eight-point algorithm), so the
// fourth-power sums in S1 stay of order n whatever the position and size
// of the part.

// fitFrame is the normalisation: x' = (x − mx)/s.
type fitFrame struct{ mx, my, s float64 }

func (f fitFrame) to(p Point) Point { return Point{(p.X - f.mx) / f.s, (p.Y - f.my) / f.s} }

// fitScatter holds what the algebraic step derives from the scatter.
type fitScatter struct {
	t  fitMat3 // a2 = t·a1
	mr fitMat3 // reduced scatter S1 + S2·T, symmetric positive semi-definite
}

// fitNewScatter builds the reduced scatter of normalised points. It
// reports false when S3 is singular (all points on one line).
func fitNewScatter(pts []Point) (fitScatter, bool) {
	var s [6][6]float64
	for _, p := range pts {
		d := [6]float64{p.X * p.X, p.X * p.Y, p.Y * p.Y, p.X, p.Y, 1}
		for i := range 6 {
			for j := i; j < 6; j++ {
				s[i][j] += d[i] * d[j]
			}
		}
	}
	for i := range 6 {
		for j := range i {
			s[i][j] = s[j][i]
		}
	}
	var s1, s2, s3 fitMat3
	for i := range 3 {
		for j := range 3 {
			s1[i][j] = s[i][j]
			s2[i][j] = s[i][j+3]
			s3[i][j] = s[i+3][j+3]
		}
	}
	var sc fitScatter
	// T = −S3⁻¹·S2ᵀ, one column at a time.
	for j := range 3 {
		col, ok := fitSolve3(s3, fitVec3{s2[j][0], s2[j][1], s2[j][2]})
		if !ok {
			return sc, false
		}
		for i := range 3 {
			sc.t[i][j] = -col[i]
		}
	}
	for i := range 3 {
		for j := range 3 {
			v := s1[i][j]
			for k := range 3 {
				v += s2[i][k] * sc.t[k][j]
			}
			sc.mr[i][j] = v
		}
	}
	for i := range 3 {
		for j := range i {
			m := (sc.mr[i][j] + sc.mr[j][i]) / 2
			sc.mr[i][j], sc.mr[j][i] = m, m
		}
	}
	return sc, true
}

// reduced returns M = C1⁻¹·Mr, with C1⁻¹ = [[0 0 ½] [0 −1 0] [½ 0 0]].
func (sc fitScatter) reduced() fitMat3 {
	var m fitMat3
	for j := range 3 {
		m[0][j] = sc.mr[2][j] / 2
		m[1][j] = -sc.mr[1][j]
		m[2][j] = sc.mr[0][j] / 2
	}
	return m
}

// conic returns the six conic coefficients for a1.
func (sc fitScatter) conic(a1 fitVec3) [6]float64 {
	var c [6]float64
	c[0], c[1], c[2] = a1[0], a1[1], a1[2]
	for i := range 3 {
		c[3+i] = sc.t[i][0]*a1[0] + sc.t[i][1]*a1[1] + sc.t[i][2]*a1[2]
	}
	return c
}

// cost returns a1ᵀ·Mr·a1, the algebraic residual ‖D·a‖² of a1 with its
// optimal a2.
func (sc fitScatter) cost(a1 fitVec3) float64 {
	s := 0.0
	for i := range 3 {
		for j := range 3 {
			s += a1[i] * sc.mr[i][j] * a1[j]
		}
	}
	return s
}

// fitEllipseConstraint returns 4AC − B² of a1 divided by |a1|².
func fitEllipseConstraint(a1 fitVec3) float64 {
	n2 := a1[0]*a1[0] + a1[1]*a1[1] + a1[2]*a1[2]
	return (4*a1[0]*a1[2] - a1[1]*a1[1]) / n2
}

// direct returns the ellipse-constrained conic, or false when no
// eigenvector of the reduced matrix satisfies 4AC − B² > 0.
func (sc fitScatter) direct() ([6]float64, bool) {
	_, vecs, n := fitEigen3(sc.reduced())
	best, bestCost, found := fitVec3{}, math.Inf(1), false
	for k := range n {
		v := vecs[k]
		c := fitEllipseConstraint(v)
		if !(c > 0) {
			continue
		}
		cost := math.Abs(sc.cost(v)) / c
		if !found || cost < bestCost {
			best, bestCost, found = v, cost, true
		}
	}
	if !found {
		return [6]float64{}, false
	}
	return sc.conic(best), true
}

// free returns the best conic of any kind under |a1| = 1: the eigenvector
// of the smallest eigenvalue of the symmetric reduced scatter (Bookstein's
// family of normalisations, here the rotation-invariant A² + B² + C² = 1,
// restricted to the quadratic part).
func (sc fitScatter) free() [6]float64 {
	_, vecs := fitSymEigen3(sc.mr)
	return sc.conic(vecs[0])
}

// fitConicKind names the kind of a real conic from 4AC − B²: "ellipse",
// "parabola" (within rounding of zero) or "hyperbola".
func fitConicKind(c [6]float64) string {
	d := 4*c[0]*c[2] - c[1]*c[1]
	scale := c[0]*c[0] + c[1]*c[1] + c[2]*c[2]
	switch {
	case math.Abs(d) <= 1e-12*scale:
		return "parabola"
	case d > 0:
		return "ellipse"
	}
	return "hyperbola"
}

// fitConicDistanceRMS returns the root mean square of a lower bound on
// the distance of each point from the conic. Along any unit direction u,
// Q(p + r·u) differs from Q(p) by at most |∇Q|·r + ½·h·r², h the largest
// |eigenvalue| of the Hessian of Q (exact: Q is quadratic), so the conic is
// no nearer than the root r = 2|Q| / (|∇Q| + √(|∇Q|² + 2h|Q|)). Where the
// gradient is large this is Sampson's first-order distance |Q|/|∇Q|
// (P. D. Sampson, Computer Graphics and Image Processing 18, 1982); unlike
// it, it stays finite at the crossing of a line pair, where ∇Q = 0.
func fitConicDistanceRMS(c [6]float64, pts []Point) float64 {
	// Hessian [[2A, B], [B, 2C]]: eigenvalues A + C ± √((A − C)² + B²).
	h := math.Abs(c[0]+c[2]) + math.Hypot(c[0]-c[2], c[1])
	s := 0.0
	for _, p := range pts {
		q := math.Abs(c[0]*p.X*p.X + c[1]*p.X*p.Y + c[2]*p.Y*p.Y + c[3]*p.X + c[4]*p.Y + c[5])
		if q == 0 {
			continue
		}
		g := math.Hypot(2*c[0]*p.X+c[1]*p.Y+c[3], c[1]*p.X+2*c[2]*p.Y+c[4])
		r := 2 * q / (g + math.Sqrt(g*g+2*h*q))
		s += r * r
	}
	return math.Sqrt(s / float64(len(pts)))
}

// fitConicEllipse returns the parameters (centre, major semi-axis along
// the own x axis, minor along own y, rotation) of the ellipse with conic
// coefficients c, or false when c is not a real ellipse.
//
// The centre solves ∇Q = 0; Q at the centre is F0 = F + (D·x0 + E·y0)/2;
// the semi-axes are √(−F0/λ) for the eigenvalues λ of the quadratic form
// [[A, B/2], [B/2, C]], the smaller λ giving the major axis; the
// eigenvector of the larger λ lies at ½·atan2(B, A − C).
func fitConicEllipse(c [6]float64) (p fitParams, ok bool) {
	if c[0]+c[2] < 0 {
		for i := range c {
			c[i] = -c[i]
		}
	}
	A, B, C, D, E, F := c[0], c[1], c[2], c[3], c[4], c[5]
	den := 4*A*C - B*B
	if !(den > 0) {
		return p, false
	}
	x0 := (B*E - 2*C*D) / den
	y0 := (B*D - 2*A*E) / den
	f0 := F + (D*x0+E*y0)/2
	mean := (A + C) / 2
	rad := math.Hypot((A-C)/2, B/2)
	lmax := mean + rad
	lmin := (den / 4) / lmax // AC − B²/4 = λmin·λmax, without cancellation
	if !(f0 < 0) || !(lmin > 0) {
		return p, false
	}
	a := math.Sqrt(-f0 / lmin)
	b := math.Sqrt(-f0 / lmax)
	rot := math.Atan2(B, A-C)/2 + math.Pi/2
	p = fitParams{x0, y0, a, b, rot}
	for _, v := range p {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return p, false
		}
	}
	return p, true
}
