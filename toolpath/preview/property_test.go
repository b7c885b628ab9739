package preview

import (
	"math"
	"testing"

	"github.com/focitools/foci/toolpath"
	"pgregory.net/rapid"
)

// genSegment draws any segment, consistent or not: readers of foreign
// programs hand over arcs whose radius disagrees with their ends.
func genSegment(t *rapid.T, label string) toolpath.Segment {
	coord := rapid.OneOf(
		rapid.Float64Range(-500, 500),
		rapid.Float64Range(-1e9, 1e9),
		rapid.SampledFrom([]float64{0, 1e-12, -1e-12, 1e9, -1e9}),
	)
	pt := func(name string) toolpath.Point {
		return toolpath.Point{X: coord.Draw(t, name+"x"), Y: coord.Draw(t, name+"y"), Z: rapid.Float64Range(-50, 50).Draw(t, name+"z")}
	}
	s := toolpath.Segment{
		Kind:   toolpath.Kind(rapid.IntRange(0, 2).Draw(t, label+"kind")),
		Motion: toolpath.Motion(rapid.IntRange(0, 1).Draw(t, label+"motion")),
		Role:   toolpath.Role(rapid.IntRange(0, 8).Draw(t, label+"role")),
		Start:  pt(label + "start"),
	}
	switch rapid.IntRange(0, 2).Draw(t, label+"end") {
	case 0:
		s.End = s.Start
	case 1:
		s.End = toolpath.Point{X: s.Start.X, Y: s.Start.Y, Z: rapid.Float64Range(-50, 50).Draw(t, label+"endz")}
	default:
		s.End = pt(label + "end")
	}
	if s.Kind == toolpath.Arc {
		s.CenterX, s.CenterY = coord.Draw(t, label+"cx"), coord.Draw(t, label+"cy")
		s.Radius = math.Hypot(s.Start.X-s.CenterX, s.Start.Y-s.CenterY)
		if rapid.Bool().Draw(t, label+"badradius") {
			s.Radius = rapid.Float64Range(0, 1e9).Draw(t, label+"radius")
		}
		if s.Radius > MaxCoordinate {
			s.Radius = MaxCoordinate
		}
		s.Clockwise = rapid.Bool().Draw(t, label+"cw")
	}
	return s
}

func TestRenderNeverPanicsAndKeepsTheSize(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 12).Draw(t, "n")
		p := make(toolpath.Path, n)
		for i := range p {
			p[i] = genSegment(t, "s")
		}
		tool := rapid.SampledFrom([]float64{0, 0.2, 6, 1e6}).Draw(t, "tool")
		img, err := Render(p, Options{Width: MinWidth, Height: MinHeight, ToolWidth: tool, Title: "any path"})
		if err != nil {
			t.Fatalf("valid path refused: %v", err)
		}
		if b := img.Bounds(); b.Dx() != MinWidth || b.Dy() != MinHeight {
			t.Fatalf("picture %v, want %dx%d", b, MinWidth, MinHeight)
		}
	})
}
