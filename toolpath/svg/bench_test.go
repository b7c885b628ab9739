package svg

import (
	"io"
	"math"
	"testing"

	"github.com/focitools/foci/toolpath"
)

// BenchmarkWriteMillionSegments writes a million alternating lines and
// quarter arcs along a spiral.
func BenchmarkWriteMillionSegments(b *testing.B) {
	const n = 1000000
	p := make(toolpath.Path, 0, n)
	prev := toolpath.Point{X: 10, Z: -1}
	for k := 1; k <= n; k++ {
		a := 2 * math.Pi * float64(k) / 1000
		r := 10 + 300*float64(k)/n
		q := toolpath.Point{X: r * math.Cos(a), Y: r * math.Sin(a), Z: -1}
		s := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: prev, End: q}
		if k%2 == 0 {
			s.Kind, s.Radius = toolpath.Arc, math.Hypot(prev.X, prev.Y)
		}
		p = append(p, s)
		prev = q
	}
	b.ReportMetric(n, "segments")
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := Write(io.Discard, p, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
