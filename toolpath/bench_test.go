package toolpath

import (
	"os"
	"testing"
	"time"

	"github.com/focitools/foci/ellipse"
)

// benchSpec returns a shape the approximation benchmarks run on, in mm:
// an ordinary tabletop, a flat gasket and a nearly round mirror traced
// on the line (off 0, band), and a slot cut on its waste side (a 300 x 4
// ellipse, a 2 mm tool radius outward, the outside zone), short and
// strongly varying, where the arcs look ahead and plan backwards.
func benchSpec(b *testing.B, w, h, off, tol float64, g Geometry) Spec {
	e, err := ellipse.FromSize(w, h, ellipse.Point{X: 10, Y: 20}, 0.3)
	if err != nil {
		b.Fatal(err)
	}
	c, err := e.Parallel(off)
	if err != nil {
		b.Fatal(err)
	}
	z := Band
	if off != 0 {
		z = Outside
	}
	return Spec{Curve: c, Zone: z, Tol: tol, Geometry: g}
}

// BenchmarkApproximate reports ns per segment, segments per second, the
// ratio of the count to the lower bound N*, and the cost per segment in
// arc-length evaluations ("evals/segment"): after every path, with the
// timer stopped, refBlock arc-length evaluations on the 600 x 400
// tabletop are timed as well, so that both share whatever else the
// machine is doing (separate runs seconds apart disagreed by up to a
// fifth on a busy machine). arclength-reference times the evaluation
// alone. FOCI_NOREF=1 leaves the block out (for counting instructions,
// which a stopped timer does not stop: see DEVELOPERS.md).
func BenchmarkApproximate(b *testing.B) {
	for _, c := range []struct {
		name           string
		w, h, off, tol float64
		g              Geometry
	}{
		{"lines/600x400/0.01", 600, 400, 0, 0.01, Lines},
		{"arcs/600x400/0.01", 600, 400, 0, 0.01, Arcs},
		{"lines/600x60/0.001", 600, 60, 0, 0.001, Lines},
		{"arcs/600x60/0.001", 600, 60, 0, 0.001, Arcs},
		{"lines/600x400/1e-5", 600, 400, 0, 1e-5, Lines},
		{"arcs/600x400/1e-5", 600, 400, 0, 1e-5, Arcs},
		{"arcs/slot300x4+2/0.05", 300, 4, 2, 0.05, Arcs},
	} {
		b.Run(c.name, func(b *testing.B) {
			s := benchSpec(b, c.w, c.h, c.off, c.tol, c.g)
			var a Approximator
			segs := 0
			var ref time.Duration
			sum := 0.0
			withRef := os.Getenv("FOCI_NOREF") == ""
			ref0 := refEllipse(b)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				if err := a.Reset(s); err != nil {
					b.Fatal(err)
				}
				for _, ok := a.Next(); ok; _, ok = a.Next() {
					segs++
				}
				if !withRef {
					continue
				}
				b.StopTimer()
				t0 := time.Now()
				for k := range refBlock {
					sum += ref0.ArcLength(0.1+float64((i*refBlock+k)&255)*0.01, 2.5)
				}
				ref += time.Since(t0)
				b.StartTimer()
			}
			b.StopTimer()
			sink = sum
			per := float64(b.Elapsed().Nanoseconds()) / float64(segs)
			b.ReportMetric(per, "ns/segment")
			b.ReportMetric(1e9/per, "segments/s")
			n := float64(segs) / float64(b.N)
			b.ReportMetric(n/a.EstimateSegments(), "N/N*")
			if withRef {
				b.ReportMetric(per/(float64(ref.Nanoseconds())/float64(refBlock*b.N)), "evals/segment")
			}
		})
	}
	b.Run("arclength-reference", func(b *testing.B) {
		e := refEllipse(b)
		sum := 0.0
		for i := 0; i < b.N; i++ {
			sum += e.ArcLength(0.1+float64(i&255)*0.01, 2.5)
		}
		sink = sum
	})
}

// refBlock is how many arc-length evaluations BenchmarkApproximate times
// after each path.
const refBlock = 64

// refEllipse returns the ellipse the reference arc lengths are on.
func refEllipse(b *testing.B) ellipse.Ellipse {
	e, err := ellipse.FromSize(600, 400, ellipse.Point{}, 0.3)
	if err != nil {
		b.Fatal(err)
	}
	return e
}

var sink float64
