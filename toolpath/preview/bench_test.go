package preview

import (
	"io"
	"math"
	"testing"

	"github.com/focitools/foci/toolpath"
)

// BenchmarkRenderMillionLines draws the serving board sampled as 333 334
// lines per pass: three passes, a million segments, with the tool band.
func BenchmarkRenderMillionLines(b *testing.B) {
	p, e := servingBoard(b, 333334)
	b.ReportMetric(float64(len(p)), "segments")
	o := Options{ToolWidth: 6, Title: "a million lines"}
	o.Intended = append(o.Intended, e.Curve())
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := WritePNG(io.Discard, p, o); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRenderMillionArcs draws a million short arcs: a spiral of 100
// turns, 10 000 arcs a turn, stepping down as it goes, with the tool band.
func BenchmarkRenderMillionArcs(b *testing.B) {
	p := spiral(100, 10000)
	b.ReportMetric(float64(len(p)), "segments")
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := WritePNG(io.Discard, p, Options{ToolWidth: 3}); err != nil {
			b.Fatal(err)
		}
	}
}

// spiral is a spiral of short arcs from radius 10 to 200 about the
// origin, turns × per arcs, going from Z 0 down to Z -10.
func spiral(turns, per int) toolpath.Path {
	n := turns * per
	p := make(toolpath.Path, 0, n)
	prev := toolpath.Point{X: 10, Z: 0}
	for k := 1; k <= n; k++ {
		a := 2 * math.Pi * float64(k) / float64(per)
		r := 10 + 190*float64(k)/float64(n)
		q := toolpath.Point{X: r * math.Cos(a), Y: r * math.Sin(a), Z: -10 * float64(k) / float64(n)}
		p = append(p, toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: prev, End: q, Radius: math.Hypot(prev.X, prev.Y)})
		prev = q
	}
	return p
}
