package toolpath

import (
	"math"
	"os"
	"strconv"
	"testing"

	"github.com/focitools/foci/ellipse"
	"pgregory.net/rapid"
)

// TestArcCountSweep measures the arc counts against N* on a fixed grid of
// shapes, for the README's performance section and for work on the arc
// approximator. It is a measurement, not a check: run it with
//
//	FOCI_SWEEP=1 go test ./toolpath -run ArcCountSweep -v
//
// It prints, per ratio b/a, the worst (N − 4)/N* over offsets {0, 0.1b,
// b, −0.5·b²/a}, tolerances {1e-4, 1e-3, 1e-2} of the tightest radius of
// the curve followed, and the three zones. Time is measured by
// BenchmarkApproximate, not here.
func TestArcCountSweep(t *testing.T) {
	if os.Getenv("FOCI_SWEEP") == "" {
		t.Skip("set FOCI_SWEEP=1 to run the measurement")
	}
	var segs int
	for _, r := range []float64{0.001, 0.003, 0.01, 0.03, 0.1, 0.2, 0.3, 0.5, 0.7, 0.9, 0.95} {
		worst, at := 0.0, ""
		for _, off := range []float64{0, 0.1, 1, -0.5} {
			for _, rel := range []float64{1e-4, 1e-3, 1e-2} {
				for _, z := range []Zone{Band, Outside, Inside} {
					e, err := ellipse.New(ellipse.Point{X: 3, Y: 4}, 100, 100*r, 0.3)
					if err != nil {
						t.Fatal(err)
					}
					d := off * e.SemiMinor()
					if off < 0 {
						d = off * e.MinRadiusOfCurvature()
					}
					c, err := e.Parallel(d)
					if err != nil {
						t.Fatal(err)
					}
					s := Spec{Curve: c, Zone: z, Tol: rel * (e.MinRadiusOfCurvature() + d), Geometry: Arcs, Decimals: -1}
					p, err := Approximate(nil, s)
					if err != nil {
						t.Fatalf("b/a %g offset %g tol %g %v: %v", r, d, s.Tol, z, err)
					}
					segs += len(p)
					nstar := LowerBound(s.Curve, Arcs, z, s.Tol, 0, 0)
					q := (float64(len(p)) - 4) / nstar
					if math.IsNaN(q) || math.IsInf(q, 0) {
						t.Fatalf("b/a %g offset %g %v: N* = %g", r, d, z, nstar)
					}
					if q > worst {
						worst, at = q, z.String()
					}
				}
			}
		}
		t.Logf("b/a %-6g worst (N-4)/N* = %.2f (%s)", r, worst, at)
	}
	t.Logf("%d segments in all", segs)
}

// TestArcCountRandom measures the worst arc counts against N* over many
// draws of the count test's generator (countSpec), for the README: run it
// with the number of draws as rapid's checks,
//
//	FOCI_RANDOM=1 go test ./toolpath -run ArcCountRandom -v -rapid.checks=30000
//
// It prints, per range of b/a, the worst (N − 4)/N* and its shape, and
// the count over all draws against the sum of N*.
func TestArcCountRandom(t *testing.T) {
	if os.Getenv("FOCI_RANDOM") == "" {
		t.Skip("set FOCI_RANDOM=1 to run the measurement")
	}
	edges := [...]float64{0.1, 0.03, 0.01, 0}
	var worst [len(edges)]float64
	var at [len(edges)]string
	var sumN, sumStar float64
	ok := t.Run("draws", func(t *testing.T) {
		rapid.Check(t, func(rt *rapid.T) {
			s := countSpec(rt)
			s.Geometry = Arcs
			p, err := Approximate(nil, s)
			if err != nil {
				rt.Fatalf("%+v: %v", s, err)
			}
			nstar := LowerBound(s.Curve, Arcs, s.Zone, s.Tol, 0, 0)
			sumN += float64(len(p))
			sumStar += nstar
			e := s.Curve.Ellipse()
			r := e.SemiMinor() / e.SemiMajor()
			i := 0
			for r < edges[i] {
				i++
			}
			if q := (float64(len(p)) - 4) / nstar; q > worst[i] {
				worst[i] = q
				at[i] = "b/a " + strconv.FormatFloat(r, 'g', 3, 64) + ", offset " +
					strconv.FormatFloat(s.Curve.Offset()/e.SemiMinor(), 'f', 2, 64) + "·b, tol " +
					strconv.FormatFloat(s.Tol, 'g', 3, 64) + ", " + s.Zone.String() + ": " +
					strconv.Itoa(len(p)) + " arcs, N* " + strconv.FormatFloat(nstar, 'f', 2, 64)
			}
		})
	})
	if !ok {
		t.Fatal("a draw failed")
	}
	for i, lo := range edges {
		t.Logf("b/a ≥ %-5g worst (N-4)/N* = %.2f (%s)", lo, worst[i], at[i])
	}
	t.Logf("all draws: N/N* = %.3f", sumN/sumStar)
}
