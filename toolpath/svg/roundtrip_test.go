package svg

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"math"
	"testing"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
	"pgregory.net/rapid"
)

// readGroup reads back every path of g as segments, in order.
func readGroup(g groupXML) (toolpath.Path, error) {
	var got toolpath.Path
	for _, e := range g.Paths {
		s, err := readSegments(e.D)
		if err != nil {
			return nil, fmt.Errorf("group %s: %v", g.ID, err)
		}
		got = append(got, s...)
	}
	return got, nil
}

// comparePieces checks that got draws the segments of p whose class
// satisfies keep, in order: each line one L, each arc ⌈|sweep|/(π/2)⌉
// pieces, skipping what rounds to nothing at dec decimals. It compares
// nine points along every piece and returns the largest distance, or an
// error when the pieces do not match up.
func comparePieces(got, p toolpath.Path, keep func(plan.Class) bool, dec int) (float64, error) {
	cls := plan.Classify(nil, p)
	step := math.Pow(10, -float64(dec))
	worst, k := 0.0, 0
	for i := range p {
		s := &p[i]
		if !keep(cls[i]) {
			continue
		}
		n := 1
		if s.Kind == toolpath.Arc {
			if math.Abs(s.Sweep())*s.Radius < step {
				continue
			}
			n = int(math.Ceil(math.Abs(s.Sweep())/(math.Pi/2) - 1e-9))
		} else if math.Hypot(s.End.X-s.Start.X, s.End.Y-s.Start.Y) < step/2 {
			continue
		}
		for j := 0; j < n; j++ {
			if k >= len(got) {
				return worst, fmt.Errorf("%d pieces read back, want more (segment %d)", len(got), i)
			}
			q := &got[k]
			k++
			if q.Kind != s.Kind {
				return worst, fmt.Errorf("piece %d: %v, want %v (segment %d)", k-1, q.Kind, s.Kind, i)
			}
			for m := 0; m <= 8; m++ {
				u := float64(m) / 8
				a := s.At((float64(j) + u) / float64(n))
				b := q.At(u)
				worst = math.Max(worst, math.Hypot(a.X-b.X, a.Y-b.Y))
			}
		}
	}
	if k != len(got) {
		return worst, fmt.Errorf("%d pieces read back, want %d", len(got), k)
	}
	return worst, nil
}

func TestRoundTripWithinTheRounding(t *testing.T) {
	p := fixture()
	for _, dec := range []int{2, 4, 6} {
		var buf bytes.Buffer
		if err := Write(&buf, p, Options{Decimals: dec}); err != nil {
			t.Fatal(err)
		}
		doc := parse(t, buf.Bytes())
		// Rounding moves each written number by half a step; a quarter
		// arc's centre by a few steps (package doc).
		tol := 3 * math.Pow(10, -float64(dec))
		for _, g := range []struct {
			id   string
			keep func(plan.Class) bool
		}{{"cut", plan.Class.Cuts}, {"travel", func(c plan.Class) bool { return c == plan.Travel }}} {
			got, err := readGroup(group(t, doc, g.id))
			if err != nil {
				t.Fatal(err)
			}
			w, err := comparePieces(got, p, g.keep, dec)
			if err != nil {
				t.Errorf("%d decimals, group %s: %v", dec, g.id, err)
			}
			if w > tol {
				t.Errorf("%d decimals, group %s: read back %.3g from the path, want within %.3g", dec, g.id, w, tol)
			}
			t.Logf("%d decimals, group %s: read back within %.2g", dec, g.id, w)
		}
	}
}

func TestRoundTripOfAnyArcs(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 6).Draw(t, "n")
		var p toolpath.Path
		for i := 0; i < n; i++ {
			r := rapid.Float64Range(0.01, 2000).Draw(t, "r")
			sweep := rapid.Float64Range(-2*math.Pi, 2*math.Pi).Draw(t, "sweep")
			if sweep == 0 {
				sweep = 1
			}
			if rapid.Bool().Draw(t, "full") {
				sweep = math.Copysign(2*math.Pi, sweep)
			}
			s := arc(rapid.Float64Range(-1000, 1000).Draw(t, "cx"), rapid.Float64Range(-1000, 1000).Draw(t, "cy"), r,
				rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "a0"), sweep, -1)
			if math.Abs(sweep) == 2*math.Pi {
				s.End = s.Start
			}
			p = append(p, s)
		}
		var buf bytes.Buffer
		if err := Write(&buf, p, Options{}); err != nil {
			t.Fatal(err)
		}
		var doc docXML
		if err := xml.Unmarshal(buf.Bytes(), &doc); err != nil {
			t.Fatal(err)
		}
		var cut groupXML
		for _, g := range doc.Groups {
			if g.ID == "cut" {
				cut = g
			}
		}
		got, err := readGroup(cut)
		if err != nil {
			t.Fatal(err)
		}
		// 4 decimals: half a step is 5e-5; the centre of a quarter-turn
		// piece moves by a few steps at most.
		w, err := comparePieces(got, p, plan.Class.Cuts, 4)
		if err != nil {
			t.Fatal(err)
		}
		if w > 3e-4 {
			t.Fatalf("read back %.3g from the arcs, want within 3e-4", w)
		}
	})
}
