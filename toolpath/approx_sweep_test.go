package toolpath

import (
	"math"
	"os"
	"testing"

	"github.com/focitools/foci/ellipse"
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
