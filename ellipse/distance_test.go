package ellipse

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"testing"
)

// vectorFile is the part of a conformance vector file
// (conformance/testdata/vectors/*.json, written by generate_vectors.py
// with mpmath; the version is in its "source" field) that these tests use.
type vectorFile struct {
	Source  string
	Ellipse struct {
		Center   [2]float64
		SemiAxes [2]float64 `json:"semi_axes"`
		Rotation float64    `json:"rotation_rad"`
	}
	Distances []struct{ X, Y, D float64 } `json:"signed_distances"`
	Division  struct {
		Count  int
		Offset float64
		Length float64
		TolAbs float64 `json:"tol_abs"`
		TolT   float64 `json:"tol_t"`
		Points []struct{ T, S, X, Y float64 }
	}
	DivisionOffset struct {
		Count  int
		Offset float64
		Length float64
		TolAbs float64 `json:"tol_abs"`
		TolT   float64 `json:"tol_t"`
		Points []struct{ T, S, X, Y float64 }
	} `json:"division_offset"`
}

func loadVectors(t *testing.T) map[string]vectorFile {
	t.Helper()
	names, err := filepath.Glob(filepath.Join("..", "conformance", "testdata", "vectors", "*.json"))
	if err != nil || len(names) < 4 {
		t.Fatalf("conformance vectors: found %d files (%v)", len(names), err)
	}
	out := make(map[string]vectorFile)
	for _, n := range names {
		raw, err := os.ReadFile(n)
		if err != nil {
			t.Fatal(err)
		}
		var v vectorFile
		if err := json.Unmarshal(raw, &v); err != nil {
			t.Fatalf("%s: %v", n, err)
		}
		if len(v.Distances) == 0 {
			t.Fatalf("%s: no signed distances", n)
		}
		out[filepath.Base(n)] = v
	}
	return out
}

// TestSignedDistanceMatchesMpmath checks the signed distances of the
// conformance vectors (mpmath at 30 digits plus 50 guard digits, see the
// vectors' README): points on the curve, just inside and outside, far
// outside, at the centre, on and just off both axes, near the evolute
// cusps and at centres of curvature, for a circle, ordinary, flat and
// nearly flat (b/a = 1e-4) ellipses, one moved and turned. The tolerance
// is 1e-12·max(|d|, a): a point is a pair of doubles, and rounding it into
// the ellipse's frame moves it by ulps of its coordinates.
func TestSignedDistanceMatchesMpmath(t *testing.T) {
	for name, v := range loadVectors(t) {
		e := mustNew(t, Point{v.Ellipse.Center[0], v.Ellipse.Center[1]}, v.Ellipse.SemiAxes[0], v.Ellipse.SemiAxes[1], v.Ellipse.Rotation)
		for _, c := range v.Distances {
			p := Point{c.X, c.Y}
			got := e.SignedDistance(p)
			if tol := 1e-12 * math.Max(math.Abs(c.D), e.a); math.Abs(got-c.D) > tol {
				t.Errorf("%s: SignedDistance(%v) = %.17g, mpmath %.17g (diff %.1e, allowed %.1e)", name, p, got, c.D, got-c.D, tol)
			}
			// The foot point reported by Nearest is at that distance.
			ft, d := e.Nearest(p)
			q := e.PointAt(ft)
			if dist := math.Hypot(q.X-p.X, q.Y-p.Y); math.Abs(dist-math.Abs(d)) > 1e-12*math.Max(math.Abs(d), e.a) {
				t.Errorf("%s: Nearest(%v) = t %.17g, d %.17g, but PointAt(t) is %.17g away", name, p, ft, d, dist)
			}
		}
	}
}

// TestDivideMatchesMpmath checks Divide against the division vectors
// (mpmath, within the tolerances the files carry).
func TestDivideMatchesMpmath(t *testing.T) {
	for name, v := range loadVectors(t) {
		e := mustNew(t, Point{v.Ellipse.Center[0], v.Ellipse.Center[1]}, v.Ellipse.SemiAxes[0], v.Ellipse.SemiAxes[1], v.Ellipse.Rotation)
		type division = struct {
			Count  int
			Offset float64
			Length float64
			TolAbs float64 `json:"tol_abs"`
			TolT   float64 `json:"tol_t"`
			Points []struct{ T, S, X, Y float64 }
		}
		for _, dv := range []division{v.Division, v.DivisionOffset} {
			if dv.Count == 0 {
				continue
			}
			p, err := e.Parallel(dv.Offset)
			if err != nil {
				t.Fatalf("%s: Parallel(%g): %v", name, dv.Offset, err)
			}
			pts, err := p.Divide(nil, dv.Count)
			if err != nil || len(pts) != len(dv.Points) {
				t.Fatalf("%s: Divide(%d) gave %d points, %v", name, dv.Count, len(pts), err)
			}
			if got := p.Length(); math.Abs(got-dv.Length) > dv.TolAbs {
				t.Errorf("%s d=%g: Length() = %.17g, mpmath %.17g", name, dv.Offset, got, dv.Length)
			}
			for i, w := range dv.Points {
				g := pts[i]
				if math.Abs(g.T-w.T) > dv.TolT || math.Abs(g.S-w.S) > dv.TolAbs ||
					math.Abs(g.X-w.X) > dv.TolAbs || math.Abs(g.Y-w.Y) > dv.TolAbs {
					t.Errorf("%s d=%g: point %d = %+v, mpmath %+v", name, dv.Offset, i, g, w)
				}
			}
		}
	}
}

// TestSignedDistanceClosedForms checks points where the distance is known
// in closed form (Eberly's paper derives them; they follow from the
// normal-line condition): on the major axis inside the evolute cusp
// |x| < (a² − b²)/a the nearest points are off the axis and
// d = −b·√(1 − x²/(a² − b²)); beyond it, and everywhere on the minor
// axis, the nearest point is the vertex on the same side. Each point is
// also moved off its axis by a tiny amount, which must not change the
// distance by more than the move.
func TestSignedDistanceClosedForms(t *testing.T) {
	type pt struct{ x, y, d float64 }
	for _, sz := range []struct{ a, b float64 }{{1, 1}, {2, 1}, {40, 25}, {1, 1e-3}, {600, 6e-4}, {1, 0.999999}} {
		a, b := sz.a, sz.b
		c2 := (a - b) * (a + b) // a² − b²
		cusp := c2 / a
		var pts []pt
		for _, f := range []float64{0, 0.25, 0.5, 0.9, 0.999, 1} {
			x := f * cusp
			pts = append(pts, pt{x, 0, -b * math.Sqrt(math.Max(0, 1-x*x/c2))})
		}
		for _, x := range []float64{cusp + (a-cusp)/2, a * 0.999999, a, a * 1.5, a * 1e6} {
			if x >= cusp {
				pts = append(pts, pt{x, 0, x - a})
			}
		}
		for _, y := range []float64{0, 0.3 * b, b, 2 * b, 1e6 * a} {
			pts = append(pts, pt{0, y, y - b})
		}
		for _, rot := range []float64{0, 0.7} {
			e := mustNew(t, Point{X: 5, Y: -3}, a, b, rot)
			for _, q := range pts {
				for _, sx := range []float64{1, -1} {
					for _, sy := range []float64{1, -1} {
						for _, eps := range []float64{0, 1e-300, 1e-14 * a} {
							lx, ly := sx*q.x, sy*q.y
							if q.y == 0 {
								ly = sy * eps
							} else {
								lx = sx * eps
							}
							p := e.toWorld(lx, ly)
							got := e.SignedDistance(p)
							tol := 1e-12*math.Max(math.Abs(q.d), a) + eps
							if math.Abs(got-q.d) > tol {
								t.Errorf("a=%g b=%g rot=%g: SignedDistance at own (%.17g, %.17g) = %.17g, want %.17g", a, b, rot, lx, ly, got, q.d)
							}
						}
					}
				}
			}
		}
	}
}

// TestSignedDistanceNearTheCentreWithSubnormals: a point a hair off the
// centre, one own coordinate subnormal (found by the rigid-motion property
// test: the foot search lost ten digits there), is −b away.
func TestSignedDistanceNearTheCentreWithSubnormals(t *testing.T) {
	for _, sz := range []struct{ a, b float64 }{{5623.413251903491, 562.3413251903491}, {1, 1e-3}, {2, 1}} {
		for _, swap := range []bool{false, true} {
			rx, ry := sz.a, sz.b
			if swap {
				rx, ry = ry, rx
			}
			e := mustNew(t, Point{}, rx, ry, 0) // own frame = world frame
			for _, q := range []struct{ x, y float64 }{{8.7e-311, 1.3e-51}, {1.3e-51, 8.7e-311}, {1e-200, 4e-320}, {4e-320, 1e-160}} {
				p := Point{X: q.x, Y: q.y}
				if got := e.SignedDistance(p); math.Abs(got+sz.b) > 1e-12*sz.a {
					t.Errorf("a=%g b=%g swap %v: SignedDistance at own (%g, %g) = %.17g, want %.17g", sz.a, sz.b, swap, q.x, q.y, got, -sz.b)
				}
			}
		}
	}
}

// TestSignedDistanceOfCircle compares with |p − c| − r at points spread
// over the plane, including the centre and points near it.
func TestSignedDistanceOfCircle(t *testing.T) {
	e := mustNew(t, Point{X: 1e3, Y: -2e3}, 25, 25, 0.4)
	for _, r := range []float64{0, 1e-300, 1e-12, 1e-3, 10, 24.999999, 25, 25.000001, 40, 1e9} {
		for k := 0; k < 16; k++ {
			ang := float64(k) * math.Pi / 8
			p := Point{1e3 + r*math.Cos(ang), -2e3 + r*math.Sin(ang)}
			want := math.Hypot(p.X-1e3, p.Y+2e3) - 25
			if got := e.SignedDistance(p); math.Abs(got-want) > 1e-12*math.Max(math.Abs(want), 25) {
				t.Errorf("circle: SignedDistance(%v) = %.17g, want %.17g", p, got, want)
			}
		}
	}
}

func TestSignedDistanceSpecialCases(t *testing.T) {
	e := mustNew(t, Point{}, 3, 2, 0)
	nan, inf := math.NaN(), math.Inf(1)
	for _, p := range []Point{{nan, 0}, {0, nan}, {inf, 0}, {0, -inf}} {
		if d := e.SignedDistance(p); !math.IsNaN(d) {
			t.Errorf("SignedDistance(%v) = %g, want NaN", p, d)
		}
		if ft, d := e.Nearest(p); !math.IsNaN(ft) || !math.IsNaN(d) {
			t.Errorf("Nearest(%v) = %g, %g, want NaN, NaN", p, ft, d)
		}
	}
	// At the centre of a non-circular ellipse the nearest points are the
	// ends of the minor axis; Nearest reports the one on the positive side.
	if ft, d := e.Nearest(Point{}); ft != math.Pi/2 || d != -2 {
		t.Errorf("Nearest(centre) = %g, %g, want π/2, −2", ft, d)
	}
}
