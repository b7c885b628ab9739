package gcodeout_test

import (
	"io"
	"math"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// countingWriter counts the bytes written to it.
type countingWriter struct{ n int64 }

func (c *countingWriter) Write(p []byte) (int, error) { c.n += int64(len(p)); return len(p), nil }

// loopPath returns n segments going once round a 300 × 200 mm ellipse at
// Z −2 (lines), or n arcs round a circle of radius 120 mm, or alternating
// laser cuts and travels; the loop closes on itself so it can be repeated.
func loopPath(kind string, n int) toolpath.Path {
	p := make(toolpath.Path, 0, n)
	pt := func(k int) toolpath.Point {
		a := 2 * math.Pi * float64(k%n) / float64(n)
		if kind == "arcs" {
			return toolpath.Point{X: 120 * math.Cos(a), Y: 120 * math.Sin(a), Z: -2}
		}
		return toolpath.Point{X: 150 * math.Cos(a), Y: 100 * math.Sin(a), Z: -2}
	}
	for k := 0; k < n; k++ {
		s := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: pt(k), End: pt(k + 1)}
		switch kind {
		case "arcs":
			s.Kind, s.Radius = toolpath.Arc, 120
		case "laser":
			s.Start.Z, s.End.Z = 0, 0
			if k%2 == 1 {
				s.Motion = toolpath.Travel
			}
		}
		p = append(p, s)
	}
	return p
}

func BenchmarkWriteSegment(b *testing.B) {
	router := validRouter()
	router.Tolerance = 0.01
	laser := gcodeout.Config{Machine: gcodeout.Laser, Feed: 900, Power: 40, Tolerance: 0.01}
	for _, bc := range []struct {
		name string
		cfg  gcodeout.Config
	}{{"lines", router}, {"arcs", router}, {"laser", laser}} {
		b.Run(bc.name, func(b *testing.B) {
			path := loopPath(bc.name, 1000)
			lead := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel,
				Start: toolpath.Point{Z: path[0].Start.Z}, End: path[0].Start}
			if bc.name != "laser" {
				lead.Start.Z = router.SafeZ
			}
			// Bytes per segment, measured on one loop.
			var c countingWriter
			w, err := gcodeout.NewWriter(&c, bc.cfg)
			if err != nil {
				b.Fatal(err)
			}
			if err := w.WriteSegment(lead); err != nil {
				b.Fatal(err)
			}
			w.Close()
			before := c.n
			w.Reset(&c)
			w.WriteSegment(lead)
			for _, s := range path {
				if err := w.WriteSegment(s); err != nil {
					b.Fatal(err)
				}
			}
			w.Close()
			b.SetBytes((c.n - before) / int64(len(path)))

			w.Reset(io.Discard)
			w.WriteSegment(lead)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				if err := w.WriteSegment(path[i%len(path)]); err != nil {
					b.Fatal(err)
				}
			}
			b.StopTimer()
			b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "segments/s")
		})
	}
}
