package conformance

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// The language-neutral vectors under testdata/vectors, checked against our
// own ellipse package: every value in them was computed with mpmath 1.2.1
// at 30 digits (the "source" line of each file names the version and the
// script; see testdata/vectors/README.md for the meaning of every field),
// and every entry carries the tolerance it is meant to be checked with.

type vectorFile struct {
	Source  string `json:"source"`
	Ellipse struct {
		Center   [2]float64 `json:"center"`
		SemiAxes [2]float64 `json:"semi_axes"`
		Rotation float64    `json:"rotation_rad"`
	} `json:"ellipse"`
	Perimeter struct {
		Value  float64 `json:"value"`
		TolRel float64 `json:"tol_rel"`
	} `json:"perimeter"`
	ArcLengths []struct {
		T0, T1 float64
		S      float64 `json:"s"`
		TolRel float64 `json:"tol_rel"`
	} `json:"arc_lengths"`
	Params []struct {
		S      float64 `json:"s"`
		T      float64 `json:"t"`
		TolAbs float64 `json:"tol_abs"`
	} `json:"params_at_arc_length"`
	Division       vectorDivision `json:"division"`
	DivisionOffset vectorDivision `json:"division_offset"`
	Distances      []struct {
		X, Y   float64
		D      float64 `json:"d"`
		TolAbs float64 `json:"tol_abs"`
	} `json:"signed_distances"`
}

type vectorDivision struct {
	Count  int     `json:"count"`
	Offset float64 `json:"offset"`
	Length float64 `json:"length"`
	TolAbs float64 `json:"tol_abs"`
	TolT   float64 `json:"tol_t"`
	Points []struct {
		T, S, X, Y float64
	} `json:"points"`
}

func loadVectors(t *testing.T) map[string]*vectorFile {
	t.Helper()
	names, err := filepath.Glob(filepath.Join("testdata", "vectors", "*.json"))
	if err != nil {
		t.Fatal(err)
	}
	if len(names) == 0 {
		t.Fatal("no vector files under testdata/vectors")
	}
	out := make(map[string]*vectorFile)
	for _, name := range names {
		b, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		v := new(vectorFile)
		dec := json.NewDecoder(strings.NewReader(string(b)))
		dec.DisallowUnknownFields()
		if err := dec.Decode(v); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if !strings.HasPrefix(v.Source, "mpmath ") {
			t.Fatalf("%s: source %q does not name the mpmath version", name, v.Source)
		}
		out[strings.TrimSuffix(filepath.Base(name), ".json")] = v
	}
	return out
}

// withinRel reports |got − want| ≤ tol·|want|.
func withinRel(got, want, tol float64) bool { return math.Abs(got-want) <= tol*math.Abs(want) }

// withinAbs reports |got − want| ≤ tol.
func withinAbs(got, want, tol float64) bool { return math.Abs(got-want) <= tol }

func TestVectors(t *testing.T) {
	for name, v := range loadVectors(t) {
		t.Run(name, func(t *testing.T) {
			src := v.Source // named in every failure: the values are mpmath's
			e, err := ellipse.New(ellipse.Point{X: v.Ellipse.Center[0], Y: v.Ellipse.Center[1]},
				v.Ellipse.SemiAxes[0], v.Ellipse.SemiAxes[1], v.Ellipse.Rotation)
			if err != nil {
				t.Fatal(err)
			}
			if got := e.Perimeter(); !withinRel(got, v.Perimeter.Value, v.Perimeter.TolRel) {
				t.Errorf("Perimeter() = %.17g, want %.17g within %g relative (%s)", got, v.Perimeter.Value, v.Perimeter.TolRel, src)
			}
			for _, a := range v.ArcLengths {
				if got := e.ArcLength(a.T0, a.T1); !withinRel(got, a.S, a.TolRel) {
					t.Errorf("ArcLength(%v, %v) = %.17g, want %.17g within %g relative (%s)", a.T0, a.T1, got, a.S, a.TolRel, src)
				}
			}
			for _, p := range v.Params {
				if got := e.ParamAtArcLength(p.S); !withinAbs(got, p.T, p.TolAbs) {
					t.Errorf("ParamAtArcLength(%v) = %.17g, want %.17g within %g (%s)", p.S, got, p.T, p.TolAbs, src)
				}
			}
			for _, div := range []vectorDivision{v.Division, v.DivisionOffset} {
				checkDivision(t, e, div, src)
			}
			for _, d := range v.Distances {
				if got := e.SignedDistance(ellipse.Point{X: d.X, Y: d.Y}); !withinAbs(got, d.D, d.TolAbs) {
					t.Errorf("SignedDistance(%v, %v) = %.17g, want %.17g within %g (%s)", d.X, d.Y, got, d.D, d.TolAbs, src)
				}
			}
		})
	}
}

func checkDivision(t *testing.T, e ellipse.Ellipse, div vectorDivision, src string) {
	t.Helper()
	c, err := e.Parallel(div.Offset)
	if err != nil {
		t.Fatal(err)
	}
	if got := c.Length(); !withinAbs(got, div.Length, div.TolAbs) {
		t.Errorf("offset %v: Length() = %.17g, want %.17g within %g (%s)", div.Offset, got, div.Length, div.TolAbs, src)
	}
	pts, err := c.Divide(nil, div.Count)
	if err != nil {
		t.Fatal(err)
	}
	if len(pts) != len(div.Points) {
		t.Fatalf("offset %v: Divide(%d) gave %d points, the file %d", div.Offset, div.Count, len(pts), len(div.Points))
	}
	bad := 0
	for k, want := range div.Points {
		got := pts[k]
		if !withinAbs(got.T, want.T, div.TolT) || !withinAbs(got.S, want.S, div.TolAbs) ||
			!withinAbs(got.X, want.X, div.TolAbs) || !withinAbs(got.Y, want.Y, div.TolAbs) {
			if bad++; bad <= 5 {
				t.Errorf("offset %v: point %d of %d = t %.17g s %.17g (%.17g, %.17g), want t %.17g within %g, s %.17g (%.17g, %.17g) within %g (%s)",
					div.Offset, k, div.Count, got.T, got.S, got.X, got.Y, want.T, div.TolT, want.S, want.X, want.Y, div.TolAbs, src)
			}
		}
	}
	if bad > 5 {
		t.Errorf("offset %v: %d more points out of tolerance", div.Offset, bad-5)
	}
}
