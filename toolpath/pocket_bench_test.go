package toolpath_test

import (
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// BenchmarkPocket builds pockets and reports, besides the time, the
// segments and the cutting length against the simple lower bound: at each
// level a tool clearing a band step-over wide must travel at least the
// pocket's area divided by the step-over, so levels · πab / step-over.
// The cut counted is everything the tool feeds along: rings, spine, links,
// ramps and the wall pass. The step-over is 40% of a 6 mm tool.
func BenchmarkPocket(b *testing.B) {
	for _, c := range []struct {
		name   string
		w, h   float64
		levels int
	}{
		{"round 300/1 level", 300, 300, 1},
		{"ordinary 400x250/1 level", 400, 250, 1},
		{"ordinary 400x250/4 levels", 400, 250, 4},
		{"flat 400x40/1 level", 400, 40, 1},
		{"flat 400x40/4 levels", 400, 40, 4},
	} {
		b.Run(c.name, func(b *testing.B) {
			e, err := ellipse.FromSize(c.w, c.h, ellipse.Point{}, 0.3)
			if err != nil {
				b.Fatal(err)
			}
			s := toolpath.PocketSpec{
				Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.02, Geometry: toolpath.Arcs, SafeZ: 5},
				Ellipse: e, Tool: 6, Depth: 3 * float64(c.levels), StepDown: 3, StepOver: 2.4, Allowance: 0.3,
			}
			var p toolpath.Path
			b.ReportAllocs()
			for b.Loop() {
				p, err = toolpath.Pocket(p[:0], s)
				if err != nil {
					b.Fatal(err)
				}
			}
			cut, _ := p.Lengths()
			bound := float64(c.levels) * e.Area() / s.StepOver
			b.ReportMetric(float64(len(p)), "segments")
			b.ReportMetric(cut/bound, "cut/bound")
		})
	}
}
