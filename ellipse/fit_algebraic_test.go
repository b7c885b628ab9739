package ellipse

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// The algebraic step against gonum (gonum.org/v1/gonum/mat, an outside
// implementation of the LAPACK eigen solvers), on random data of three
// kinds: noisy points of random ellipses, exact points of random ellipses
// (where the wanted eigenvalue is zero) and random clouds.

// fitRandomPointSets returns seeded point sets, already normalised.
func fitRandomPointSets(t *testing.T, count int) [][]Point {
	rng := rand.New(rand.NewPCG(2024, 7))
	var sets [][]Point
	for k := range count {
		n := 6 + rng.IntN(40)
		pts := make([]Point, n)
		switch k % 3 {
		case 0, 1:
			a := 1 + 100*rng.Float64()
			b := a * (0.05 + 0.95*rng.Float64())
			e, err := New(Point{200 * (rng.Float64() - 0.5), 200 * (rng.Float64() - 0.5)}, a, b, math.Pi*rng.Float64())
			if err != nil {
				t.Fatal(err)
			}
			from, span := 2*math.Pi*rng.Float64(), math.Pi/2+1.5*math.Pi*rng.Float64()
			sigma := 0.0
			if k%3 == 1 {
				sigma = 0.02 * b * rng.Float64()
			}
			for i := range pts {
				p := e.PointAt(from + span*rng.Float64())
				pts[i] = Point{p.X + sigma*rng.NormFloat64(), p.Y + sigma*rng.NormFloat64()}
			}
		case 2:
			for i := range pts {
				pts[i] = Point{rng.Float64(), rng.Float64()}
			}
		}
		f := fitNewFrame(pts)
		for i := range pts {
			pts[i] = f.to(pts[i])
		}
		sets = append(sets, pts)
	}
	return sets
}

func fitDenseOf(m fitMat3) *mat.Dense {
	return mat.NewDense(3, 3, []float64{m[0][0], m[0][1], m[0][2], m[1][0], m[1][1], m[1][2], m[2][0], m[2][1], m[2][2]})
}

func fitMaxAbs(m fitMat3) float64 {
	s := 0.0
	for i := range 3 {
		for j := range 3 {
			s = math.Max(s, math.Abs(m[i][j]))
		}
	}
	return s
}

// TestFitEigen3AgreesWithGonum compares every eigenvalue and eigenvector
// of the reduced matrix with gonum's mat.Eigen. Eigenvalues must agree to
// 1e-10 of the matrix norm and vectors to 1e-10 divided by the relative gap
// to the nearest other eigenvalue (the conditioning of an eigenvector).
func TestFitEigen3AgreesWithGonum(t *testing.T) {
	worstVal, worstVec := 0.0, 0.0
	defer func() {
		t.Logf("worst eigenvalue difference %.3g of the norm; worst eigenvector angle %.3g of its allowance", worstVal, worstVec)
	}()
	for k, pts := range fitRandomPointSets(t, 300) {
		sc, ok := fitNewScatter(pts)
		if !ok {
			t.Fatalf("set %d: singular scatter", k)
		}
		m := sc.reduced()
		norm := fitMaxAbs(m)
		var eig mat.Eigen
		if !eig.Factorize(fitDenseOf(m), mat.EigenRight) {
			t.Fatalf("set %d: gonum did not factorize", k)
		}
		gv := eig.Values(nil)
		var gvec mat.CDense
		eig.VectorsTo(&gvec)
		vals, vecs, n := fitEigen3(m)
		if n != 3 {
			t.Errorf("set %d: %d eigenvalues, gonum %v", k, n, gv)
			continue
		}
		for j, g := range gv {
			if math.Abs(imag(g)) > 1e-10*norm {
				t.Errorf("set %d: gonum eigenvalue %v is not real", k, g)
				continue
			}
			best := 0
			for i := 1; i < 3; i++ {
				if math.Abs(vals[i]-real(g)) < math.Abs(vals[best]-real(g)) {
					best = i
				}
			}
			worstVal = math.Max(worstVal, math.Abs(vals[best]-real(g))/norm)
			if d := math.Abs(vals[best] - real(g)); d > 1e-10*norm {
				t.Errorf("set %d: eigenvalue %.17g, gonum %.17g (difference %.3g of the norm)", k, vals[best], real(g), d/norm)
			}
			gap := math.Inf(1)
			for i, h := range gv {
				if i != j {
					gap = math.Min(gap, cmplx.Abs(h-g))
				}
			}
			var w fitVec3
			for i := range 3 {
				w[i] = real(gvec.At(i, j))
			}
			w = fitScale3(w, 1/fitNorm3(w))
			// The angle between the lines, from the nearer of v − w and
			// v + w (1 − dot² would lose half the digits).
			v := vecs[best]
			diff := fitNorm3(fitVec3{v[0] - w[0], v[1] - w[1], v[2] - w[2]})
			sum := fitNorm3(fitVec3{v[0] + w[0], v[1] + w[1], v[2] + w[2]})
			sinAngle := math.Min(diff, sum)
			worstVec = math.Max(worstVec, sinAngle/(1e-10*norm/gap))
			if tol := 1e-10 * norm / gap; sinAngle > tol {
				t.Errorf("set %d: eigenvector %v, gonum %v (angle %.3g, allowed %.3g)", k, vecs[best], w, sinAngle, tol)
			}
		}
	}
}

// TestFitDirectAgreesWithGonumPipeline builds the whole Halíř–Flusser
// reduction with gonum (the 6x6 scatter DᵀD, T = −S3⁻¹S2ᵀ by mat.Solve,
// M = C1⁻¹·(S1 + S2·T), mat.Eigen, the eigenvector with 4AC − B² > 0) and
// compares the conic, scaled to unit length, with the package's direct fit.
func TestFitDirectAgreesWithGonumPipeline(t *testing.T) {
	worst := 0.0
	defer func() { t.Logf("worst conic coefficient difference %.3g", worst) }()
	for k, pts := range fitRandomPointSets(t, 300) {
		d := mat.NewDense(len(pts), 6, nil)
		for i, p := range pts {
			d.SetRow(i, []float64{p.X * p.X, p.X * p.Y, p.Y * p.Y, p.X, p.Y, 1})
		}
		var s mat.Dense
		s.Mul(d.T(), d)
		s1 := s.Slice(0, 3, 0, 3)
		s2 := s.Slice(0, 3, 3, 6)
		s3 := s.Slice(3, 6, 3, 6)
		var tm mat.Dense
		if err := tm.Solve(s3, s2.T()); err != nil {
			t.Fatalf("set %d: %v", k, err)
		}
		tm.Scale(-1, &tm)
		var red, m mat.Dense
		red.Mul(s2, &tm)
		red.Add(s1, &red)
		c1inv := mat.NewDense(3, 3, []float64{0, 0, 0.5, 0, -1, 0, 0.5, 0, 0})
		m.Mul(c1inv, &red)
		var eig mat.Eigen
		if !eig.Factorize(&m, mat.EigenRight) {
			t.Fatalf("set %d: gonum did not factorize", k)
		}
		var vecs mat.CDense
		eig.VectorsTo(&vecs)
		var want []float64
		for j := range 3 {
			v := []float64{real(vecs.At(0, j)), real(vecs.At(1, j)), real(vecs.At(2, j))}
			if 4*v[0]*v[2]-v[1]*v[1] > 0 {
				var a2 mat.VecDense
				a2.MulVec(&tm, mat.NewVecDense(3, v))
				want = append(v, a2.RawVector().Data...)
			}
		}
		if want == nil {
			t.Fatalf("set %d: gonum found no eigenvector with 4AC − B² > 0", k)
		}
		sc, ok := fitNewScatter(pts)
		if !ok {
			t.Fatalf("set %d: singular scatter", k)
		}
		got, ok := sc.direct()
		if !ok {
			t.Fatalf("set %d: no direct fit", k)
		}
		fitUnitSigned(want)
		fitUnitSigned(got[:])
		for i := range got {
			worst = math.Max(worst, math.Abs(got[i]-want[i]))
			if math.Abs(got[i]-want[i]) > 1e-9 {
				t.Errorf("set %d: conic %v, gonum %v", k, got, want)
				break
			}
		}
	}
}

// fitUnitSigned scales v to unit length with its largest entry positive.
func fitUnitSigned(v []float64) {
	s, big := 0.0, 0.0
	for _, x := range v {
		s += x * x
		if math.Abs(x) > math.Abs(big) {
			big = x
		}
	}
	f := math.Copysign(1/math.Sqrt(s), big)
	for i := range v {
		v[i] *= f
	}
}

// TestFitSymEigen3AgreesWithGonum checks the Jacobi solver against
// gonum's EigenSym on random symmetric matrices, including reduced
// scatters.
func TestFitSymEigen3AgreesWithGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	var ms []fitMat3
	for range 200 {
		var m fitMat3
		for i := range 3 {
			for j := i; j < 3; j++ {
				m[i][j] = rng.NormFloat64() * math.Pow(10, float64(rng.IntN(7)-3))
				m[j][i] = m[i][j]
			}
		}
		ms = append(ms, m)
	}
	for _, pts := range fitRandomPointSets(t, 60) {
		sc, _ := fitNewScatter(pts)
		ms = append(ms, sc.mr)
	}
	for k, m := range ms {
		sym := mat.NewSymDense(3, []float64{m[0][0], m[0][1], m[0][2], m[1][0], m[1][1], m[1][2], m[2][0], m[2][1], m[2][2]})
		var es mat.EigenSym
		if !es.Factorize(sym, true) {
			t.Fatalf("matrix %d: gonum did not factorize", k)
		}
		want := es.Values(nil) // ascending
		vals, vecs := fitSymEigen3(m)
		norm := fitMaxAbs(m)
		for i := range 3 {
			if math.Abs(vals[i]-want[i]) > 1e-13*norm {
				t.Errorf("matrix %d: eigenvalues %v, gonum %v", k, vals, want)
				break
			}
			// m·v = λ·v to rounding.
			for r := range 3 {
				mv := m[r][0]*vecs[i][0] + m[r][1]*vecs[i][1] + m[r][2]*vecs[i][2]
				if math.Abs(mv-vals[i]*vecs[i][r]) > 1e-13*norm {
					t.Errorf("matrix %d: residual of eigenpair %d is %g", k, i, mv-vals[i]*vecs[i][r])
				}
			}
		}
	}
}

// TestFitCubicRoots checks the cubic solver on polynomials built from
// their roots, including a triple root, a double root (which rounding may
// split into a complex pair) and a complex pair.
func TestFitCubicRoots(t *testing.T) {
	tests := []struct {
		name  string
		roots []float64 // real roots, with multiplicity
		pair  complex128
	}{
		{"three distinct", []float64{1, 2, 3}, 0},
		{"wide spread", []float64{-1e3, 1e-3, 7}, 0},
		{"triple", []float64{2, 2, 2}, 0},
		{"double", []float64{-2, 1, 1}, 0},
		{"zero and two", []float64{0, -0.5, 4}, 0},
		{"complex pair", []float64{1}, complex(0.5, 2)},
	}
	for _, tc := range tests {
		// Expand (x − r1)(x − r2)(x − r3).
		var c2, c1, c0 float64
		if len(tc.roots) == 3 {
			r := tc.roots
			c2 = -(r[0] + r[1] + r[2])
			c1 = r[0]*r[1] + r[0]*r[2] + r[1]*r[2]
			c0 = -r[0] * r[1] * r[2]
		} else {
			r, z := tc.roots[0], tc.pair
			s, p := 2*real(z), real(z)*real(z)+imag(z)*imag(z) // x² − s·x + p
			c2, c1, c0 = -(s + r), p+r*s, -r*p
		}
		got, n := fitCubicRoots(c2, c1, c0)
		for i := range n {
			got[i] = fitPolishRoot(c2, c1, c0, got[i])
		}
		for _, want := range tc.roots {
			best := math.Inf(1)
			for i := range n {
				best = math.Min(best, math.Abs(got[i]-want))
			}
			// A root of multiplicity m is determined to ε^(1/m).
			tol := 1e-12 * (1 + math.Abs(want))
			if tc.name == "triple" {
				tol = 1e-4
			} else if tc.name == "double" {
				tol = 1e-7
			}
			if best > tol {
				t.Errorf("%s: roots %v, none within %g of %g", tc.name, got[:n], tol, want)
			}
		}
	}
}
