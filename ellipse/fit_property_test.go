package ellipse_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"pgregory.net/rapid"

	"github.com/focitools/foci/ellipse"
)

// fitScene is a drawn measuring job: an ellipse, where the points were
// taken and how noisy they are.
type fitScene struct {
	truth ellipse.Ellipse
	pts   []ellipse.Point
}

// fitDrawScene draws points of a clearly oval ellipse (b/a in [0.2, 0.8])
// over at least half of it, with noise up to 1% of the minor semi-axis,
// so that every fit is well posed and its rotation determined.
func fitDrawScene(t *rapid.T) fitScene {
	a := rapid.Float64Range(1, 500).Draw(t, "a")
	ratio := rapid.Float64Range(0.2, 0.8).Draw(t, "b/a")
	rot := rapid.Float64Range(0, math.Pi).Draw(t, "rotation")
	cx := rapid.Float64Range(-1000, 1000).Draw(t, "cx")
	cy := rapid.Float64Range(-1000, 1000).Draw(t, "cy")
	n := rapid.IntRange(8, 40).Draw(t, "n")
	from := rapid.Float64Range(0, 2*math.Pi).Draw(t, "from")
	span := rapid.Float64Range(math.Pi, 2*math.Pi).Draw(t, "span")
	noise := rapid.Float64Range(0, 0.01).Draw(t, "noise/b")
	seed := rapid.Uint64().Draw(t, "seed")
	e, err := ellipse.New(ellipse.Point{X: cx, Y: cy}, a, a*ratio, rot)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(seed, 1))
	sigma := noise * a * ratio
	pts := make([]ellipse.Point, n)
	for i := range pts {
		p := e.PointAt(from + span*float64(i)/float64(n))
		pts[i] = ellipse.Point{X: p.X + sigma*rng.NormFloat64(), Y: p.Y + sigma*rng.NormFloat64()}
	}
	return fitScene{e, pts}
}

// fitSimilarity maps points by p ↦ k·R(φ)·p + (dx, dy).
type fitSimilarity struct{ k, phi, dx, dy float64 }

func (s fitSimilarity) apply(p ellipse.Point) ellipse.Point {
	sn, cs := math.Sincos(s.phi)
	return ellipse.Point{X: s.k*(cs*p.X-sn*p.Y) + s.dx, Y: s.k*(sn*p.X+cs*p.Y) + s.dy}
}

// fitCheckCommutes fits the scene's points and their image under s and
// requires the second fit to be the image of the first: centre mapped,
// semi-axes times k, major axis turned by φ, residuals times k. The
// tolerance, 1e-10 of the semi-major axis, is far below any measuring
// error and far above rounding.
func fitCheckCommutes(t *rapid.T, sc fitScene, s fitSimilarity) {
	before, err := ellipse.Fit(sc.pts)
	moved := make([]ellipse.Point, len(sc.pts))
	for i, p := range sc.pts {
		moved[i] = s.apply(p)
	}
	after, err2 := ellipse.Fit(moved)
	if err != nil || err2 != nil {
		var fe *ellipse.FitError
		if !errors.As(err, &fe) || !errors.Is(err2, fe.Err) {
			t.Fatalf("errors differ: %v, then %v", err, err2)
		}
		return
	}
	e0, e1 := before.Ellipse, after.Ellipse
	tol := 1e-10 * e0.SemiMajor() * s.k
	wantC := s.apply(e0.Center())
	if d := math.Hypot(e1.Center().X-wantC.X, e1.Center().Y-wantC.Y); d > tol {
		t.Fatalf("centre %v, want %v (off by %g)", e1.Center(), wantC, d)
	}
	if d := math.Abs(e1.SemiMajor() - s.k*e0.SemiMajor()); d > tol {
		t.Fatalf("semi-major %.15g, want %.15g", e1.SemiMajor(), s.k*e0.SemiMajor())
	}
	if d := math.Abs(e1.SemiMinor() - s.k*e0.SemiMinor()); d > tol {
		t.Fatalf("semi-minor %.15g, want %.15g", e1.SemiMinor(), s.k*e0.SemiMinor())
	}
	if before.RotationDetermined != after.RotationDetermined {
		t.Fatalf("rotation determined %v, then %v", before.RotationDetermined, after.RotationDetermined)
	}
	if before.RotationDetermined {
		// An angle error δ moves the curve by up to (a − b)·δ.
		tolAng := 1e-10 * e0.SemiMajor() / (e0.SemiMajor() - e0.SemiMinor())
		if d := fitAngleDiff(e1.MajorAngle(), e0.MajorAngle()+s.phi); d > tolAng {
			t.Fatalf("major axis at %.15g, want %.15g", e1.MajorAngle(), math.Mod(e0.MajorAngle()+s.phi, math.Pi))
		}
	}
	for i := range before.Residuals {
		if d := math.Abs(after.Residuals[i] - s.k*before.Residuals[i]); d > tol {
			t.Fatalf("residual %d: %g, want %g", i, after.Residuals[i], s.k*before.Residuals[i])
		}
	}
	if math.Abs(after.Coverage-before.Coverage) > 1e-6 {
		t.Fatalf("coverage %g, then %g", before.Coverage, after.Coverage)
	}
}

func TestFitPropertyInvariantUnderTranslation(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		sc := fitDrawScene(t)
		dx := rapid.Float64Range(-1e4, 1e4).Draw(t, "dx")
		dy := rapid.Float64Range(-1e4, 1e4).Draw(t, "dy")
		fitCheckCommutes(t, sc, fitSimilarity{1, 0, dx, dy})
	})
}

func TestFitPropertyInvariantUnderRotation(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		sc := fitDrawScene(t)
		phi := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "phi")
		fitCheckCommutes(t, sc, fitSimilarity{1, phi, 0, 0})
	})
}

func TestFitPropertyInvariantUnderUniformScaling(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		sc := fitDrawScene(t)
		k := math.Pow(10, rapid.Float64Range(-4, 4).Draw(t, "log10 k"))
		fitCheckCommutes(t, sc, fitSimilarity{k, 0, 0, 0})
	})
}

// TestFitPropertyExactPointsRoundTrip: points taken exactly on any
// ellipse (b/a from 0.01 to 1) over at least a third of it come back to
// 1e-9 of the semi-major axis.
func TestFitPropertyExactPointsRoundTrip(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		a := rapid.Float64Range(1e-3, 1e4).Draw(t, "a")
		ratio := rapid.Float64Range(0.01, 1).Draw(t, "b/a")
		rot := rapid.Float64Range(-10, 10).Draw(t, "rotation")
		// The centre within 100·a: exact points still carry the rounding
		// of their coordinates, which a third of the curve amplifies some
		// fifty times (the geometry factors of the noise tests), so a
		// centre far off against a would spend the 1e-9 on rounding.
		c := ellipse.Point{X: a * rapid.Float64Range(-100, 100).Draw(t, "cx/a"), Y: a * rapid.Float64Range(-100, 100).Draw(t, "cy/a")}
		n := rapid.IntRange(6, 50).Draw(t, "n")
		from := rapid.Float64Range(-10, 10).Draw(t, "from")
		span := rapid.Float64Range(2*math.Pi/3, 2*math.Pi).Draw(t, "span")
		truth, err := ellipse.New(c, a, a*ratio, rot)
		if err != nil {
			t.Fatal(err)
		}
		res, err := ellipse.Fit(fitOn(truth, fitParamsEven(n, from, span)))
		if err != nil {
			t.Fatal(err)
		}
		got := res.Ellipse
		tol := 1e-9 * a
		if d := math.Hypot(got.Center().X-c.X, got.Center().Y-c.Y); d > tol {
			t.Fatalf("centre %v, want %v", got.Center(), c)
		}
		if math.Abs(got.SemiMajor()-truth.SemiMajor()) > tol || math.Abs(got.SemiMinor()-truth.SemiMinor()) > tol {
			t.Fatalf("semi-axes %.15g, %.15g, want %.15g, %.15g", got.SemiMajor(), got.SemiMinor(), truth.SemiMajor(), truth.SemiMinor())
		}
		if res.RotationDetermined {
			tolAng := tol / (truth.SemiMajor() - truth.SemiMinor())
			if d := fitAngleDiff(got.MajorAngle(), truth.MajorAngle()); d > tolAng {
				t.Fatalf("major axis at %.15g, want %.15g", got.MajorAngle(), truth.MajorAngle())
			}
		}
	})
}

// TestFitPropertyNeverPanicsAndKeepsItsPromises: on any finite points Fit
// returns either a *FitError or an ellipse with the major axis along its
// own x, a rotation in [0, π), finite residuals of the right number and a
// coverage in [0, 1].
func TestFitPropertyNeverPanicsAndKeepsItsPromises(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(0, 14).Draw(t, "n")
		coord := rapid.OneOf(rapid.Float64Range(-1e6, 1e6), rapid.Float64Range(-1, 1), rapid.SampledFrom([]float64{0, 1, -1, 2}))
		pts := make([]ellipse.Point, n)
		for i := range pts {
			pts[i] = ellipse.Point{X: coord.Draw(t, "x"), Y: coord.Draw(t, "y")}
		}
		res, err := ellipse.Fit(pts)
		if err != nil {
			var fe *ellipse.FitError
			if !errors.As(err, &fe) {
				t.Fatalf("error %T %v, want *ellipse.FitError", err, err)
			}
			return
		}
		e := res.Ellipse
		if e.SemiX() < e.SemiY() || !(e.Rotation() >= 0 && e.Rotation() < math.Pi) {
			t.Fatalf("semi-axes %g, %g, rotation %g", e.SemiX(), e.SemiY(), e.Rotation())
		}
		if len(res.Residuals) != n || math.IsNaN(res.RMS) || math.IsInf(res.RMS, 0) {
			t.Fatalf("%d residuals for %d points, rms %g", len(res.Residuals), n, res.RMS)
		}
		if !(res.Coverage >= 0 && res.Coverage <= 1) {
			t.Fatalf("coverage %g", res.Coverage)
		}
	})
}
