package ellipse

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The reference values in testdata/mpmath_reference.json were computed by
// testdata/generate_reference.py with mpmath (the version is recorded in
// the file's "source" and "mpmath_version" fields; 1.2.1 from Debian's
// python3-mpmath when this test was written) at 30 significant digits and
// written with 20. The generator cross-checks its own values by
// quadrature, by a plain duplication loop and by a 50-digit recompute, so
// they are an outside reference that this package's code did not produce.

type refCarlson struct {
	X, Y, Z   float64
	RF, RD    *float64
	Published *struct {
		RF, RD *float64
		Source string
	}
}

type refEllipse struct {
	RX        float64 `json:"rx"`
	RY        float64 `json:"ry"`
	Perimeter float64
	Arcs      []struct{ T0, T1, S float64 }
	Inverse   []struct{ S, T float64 }
	Offsets   []struct {
		D, T0, T1 float64
		SD        float64 `json:"s_d"`
	}
	Curvature []struct{ T, Kappa float64 }
}

type reference struct {
	Source        string
	MpmathVersion string `json:"mpmath_version"`
	DPS           int
	Checks        map[string]float64
	Carlson       []refCarlson
	LegendreE     []struct{ Phi, M, E float64 } `json:"legendre_e"`
	LegendreEComp []struct{ M, E float64 }      `json:"legendre_e_complete"`
	Ellipses      []refEllipse
}

// loadReference reads the mpmath reference file, failing the test if it is
// missing, unreadable or suspiciously empty.
func loadReference(t *testing.T) *reference {
	t.Helper()
	raw, err := os.ReadFile(filepath.Join("testdata", "mpmath_reference.json"))
	if err != nil {
		t.Fatalf("reference data: %v", err)
	}
	var r reference
	if err := json.Unmarshal(raw, &r); err != nil {
		t.Fatalf("reference data: %v", err)
	}
	if !strings.HasPrefix(r.Source, "mpmath ") || r.DPS < 30 {
		t.Fatalf("reference data: unexpected source %q at %d digits", r.Source, r.DPS)
	}
	if len(r.Carlson) < 4 || len(r.LegendreE) < 10 || len(r.Ellipses) < 10 {
		t.Fatalf("reference data: too few entries (%d Carlson, %d E, %d ellipses)",
			len(r.Carlson), len(r.LegendreE), len(r.Ellipses))
	}
	return &r
}

// relErr returns |got − want| / |want|, or |got| when want is 0.
func relErr(got, want float64) float64 {
	if got == want {
		return 0
	}
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// within reports whether got is within tol·scale of want (scale > 0).
func within(got, want, tol, scale float64) bool {
	return math.Abs(got-want) <= tol*scale
}

// fataler is what mustNew needs of a *testing.T, *testing.B or *rapid.T.
type fataler interface {
	Helper()
	Fatalf(format string, args ...any)
}

// mustNew builds an ellipse for a test, failing the test on error.
func mustNew(t fataler, c Point, rx, ry, rot float64) Ellipse {
	t.Helper()
	e, err := New(c, rx, ry, rot)
	if err != nil {
		t.Fatalf("New(%v, %g, %g, %g): %v", c, rx, ry, rot, err)
	}
	return e
}

// The ellipses in the reference file have their centre at the origin and
// no rotation; the parameter conventions are those of this package (the
// generator's docstring states them: p(t) = c + R(θ)(rx cos t, ry sin t),
// lengths counter-clockwise, negative when t1 < t0).

func TestPerimeterMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	for _, re := range ref.Ellipses {
		e := mustNew(t, Point{}, re.RX, re.RY, 0)
		// Source: mpmath ellipe via generate_reference.py, 30 digits.
		if got := e.Perimeter(); relErr(got, re.Perimeter) > 1e-14 {
			t.Errorf("rx=%g ry=%g: Perimeter() = %.17g, mpmath %.17g (rel %.1e)", re.RX, re.RY, got, re.Perimeter, relErr(got, re.Perimeter))
		}
	}
}

// TestArcLengthMatchesMpmath checks every arc of the reference file,
// among them arcs across ±1e4 turns, arcs of 1e-3 rad placed anywhere
// within those turns and arcs across the ends of the axes, to 1e-14 of
// the arc's own length (no allowance for short arcs is needed: they are
// integrated directly).
func TestArcLengthMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	n := 0
	for _, re := range ref.Ellipses {
		e := mustNew(t, Point{}, re.RX, re.RY, 0)
		for _, a := range re.Arcs {
			n++
			// Source: mpmath ellipe(φ, m) differences via generate_reference.py.
			got := e.ArcLength(a.T0, a.T1)
			if relErr(got, a.S) > 1e-14 {
				t.Errorf("rx=%g ry=%g: ArcLength(%.17g, %.17g) = %.17g, mpmath %.17g (rel %.1e)",
					re.RX, re.RY, a.T0, a.T1, got, a.S, relErr(got, a.S))
			}
		}
	}
	if n < 100 {
		t.Fatalf("only %d reference arcs", n)
	}
}

// TestParallelArcLengthMatchesMpmath checks the lengths of parallel curves
// at offsets 0.01a, 0.5a and 3a outward and half and 0.9 of the limit
// b²/a inward, to 1e-14 of their own length.
func TestParallelArcLengthMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	for _, re := range ref.Ellipses {
		e := mustNew(t, Point{}, re.RX, re.RY, 0)
		for _, o := range re.Offsets {
			p, err := e.Parallel(o.D)
			if err != nil {
				t.Errorf("rx=%g ry=%g: Parallel(%g): %v", re.RX, re.RY, o.D, err)
				continue
			}
			// Source: s(t0,t1) + d·(ψ(t1) − ψ(t0)) in mpmath via generate_reference.py.
			got := p.ArcLength(o.T0, o.T1)
			if relErr(got, o.SD) > 1e-14 {
				t.Errorf("rx=%g ry=%g d=%g: ArcLength(%.17g, %.17g) = %.17g, mpmath %.17g (rel %.1e)",
					re.RX, re.RY, o.D, o.T0, o.T1, got, o.SD, relErr(got, o.SD))
			}
		}
	}
}

// TestParamAtArcLengthMatchesMpmath checks the inverse two ways. The round
// trip ArcLength(0, ParamAtArcLength(s)) must return s to 1e-13 of itself.
// The parameter must match mpmath's root to 1e-13·max(1, |t|) plus what
// the conditioning allows: a length is known to an ulp or so of the larger
// of |s| and the quarter perimeter q, which moves the parameter by that
// over the speed |p'(t)|; at the ends of the major axis of a flat ellipse
// that speed is b, and a half perimeter rounded to a double already sits
// 1e-10 rad away from t = π when b/a = 1e-6.
func TestParamAtArcLengthMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	for _, re := range ref.Ellipses {
		e := mustNew(t, Point{}, re.RX, re.RY, 0)
		q := e.Perimeter() / 4
		for _, v := range re.Inverse {
			got := e.ParamAtArcLength(v.S)
			back := e.ArcLength(0, got)
			if !within(back, v.S, 1e-13, math.Abs(v.S)) {
				t.Errorf("rx=%g ry=%g: ArcLength(0, ParamAtArcLength(%.17g)) = %.17g (rel %.1e)",
					re.RX, re.RY, v.S, back, relErr(back, v.S))
			}
			// Source: mpmath findroot on ellipe via generate_reference.py.
			speed := e.a * math.Sqrt(e.speed2(math.Sin(v.T), math.Cos(v.T)))
			tol := 1e-13*math.Max(1, math.Abs(v.T)) + 1e-14*math.Max(math.Abs(v.S), q)/speed
			if math.Abs(got-v.T) > tol {
				t.Errorf("rx=%g ry=%g: ParamAtArcLength(%.17g) = %.17g, mpmath %.17g (diff %.1e, allowed %.1e)",
					re.RX, re.RY, v.S, got, v.T, got-v.T, tol)
			}
		}
	}
}

func TestCurvatureMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	for _, re := range ref.Ellipses {
		e := mustNew(t, Point{}, re.RX, re.RY, 0)
		for _, c := range re.Curvature {
			// Source: rx·ry/|p'|³ in mpmath via generate_reference.py.
			if got := e.Curvature(c.T); relErr(got, c.Kappa) > 1e-13 {
				t.Errorf("rx=%g ry=%g: Curvature(%.17g) = %.17g, mpmath %.17g (rel %.1e)",
					re.RX, re.RY, c.T, got, c.Kappa, relErr(got, c.Kappa))
			}
		}
	}
}

func TestCarlsonMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	for _, c := range ref.Carlson {
		// Source: mpmath elliprf and elliprd, cross-checked in the
		// generator by a 45-digit duplication loop.
		if c.RF != nil {
			if got := CarlsonRF(c.X, c.Y, c.Z); relErr(got, *c.RF) > 1e-15 {
				t.Errorf("CarlsonRF(%g, %g, %g) = %.17g, mpmath %.17g (rel %.1e)", c.X, c.Y, c.Z, got, *c.RF, relErr(got, *c.RF))
			}
		}
		if c.RD != nil {
			if got := CarlsonRD(c.X, c.Y, c.Z); relErr(got, *c.RD) > 1e-15 {
				t.Errorf("CarlsonRD(%g, %g, %g) = %.17g, mpmath %.17g (rel %.1e)", c.X, c.Y, c.Z, got, *c.RD, relErr(got, *c.RD))
			}
		}
	}
}

// TestLegendreEMatchesMpmath covers φ from 1e-8 to ±1e4 turns and m from 0
// to 1 − 1e-12; the negative parameters come from the ellipse entries
// below.
func TestLegendreEMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	for _, c := range ref.LegendreE {
		// Source: mpmath ellipe(φ, m), checked in the generator by
		// quasi-periodicity and by quadrature.
		if got := LegendreE(c.Phi, c.M); relErr(got, c.E) > 1e-14 {
			t.Errorf("LegendreE(%.17g, %g) = %.17g, mpmath %.17g (rel %.1e)", c.Phi, c.M, got, c.E, relErr(got, c.E))
		}
	}
	for _, c := range ref.LegendreEComp {
		if got := LegendreE(math.Pi/2, c.M); relErr(got, c.E) > 1e-14 {
			t.Errorf("LegendreE(π/2, %g) = %.17g, mpmath E(m) %.17g (rel %.1e)", c.M, got, c.E, relErr(got, c.E))
		}
	}
}

// TestLegendreENegativeParameterMatchesMpmath uses the reference arcs
// from t = 0 of ellipses whose own x axis is the longer: the generator
// computed them as ry·E(t|m) with m = 1 − rx²/ry² < 0, so E(t|m) = s/ry.
// m is rounded to a double here, which moves E by at most
// |m·∂E/∂m|·2⁻⁵³ ≤ E·2⁻⁵³; the tolerance stays 1e-14.
func TestLegendreENegativeParameterMatchesMpmath(t *testing.T) {
	ref := loadReference(t)
	n := 0
	for _, re := range ref.Ellipses {
		if !(re.RX > re.RY) {
			continue
		}
		m := (re.RY - re.RX) * (re.RY + re.RX) / (re.RY * re.RY)
		check := func(phi, s float64) {
			n++
			want := s / re.RY
			if got := LegendreE(phi, m); relErr(got, want) > 1e-14 {
				t.Errorf("LegendreE(%.17g, %g) = %.17g, mpmath %.17g (rel %.1e)", phi, m, got, want, relErr(got, want))
			}
		}
		for _, a := range re.Arcs {
			if a.T0 == 0 {
				check(a.T1, a.S)
			}
		}
		for _, v := range re.Inverse {
			if v.S != 0 {
				check(v.T, v.S)
			}
		}
	}
	if n < 50 {
		t.Fatalf("only %d negative-parameter checks", n)
	}
}
