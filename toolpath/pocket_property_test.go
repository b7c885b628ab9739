package toolpath_test

import (
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
	"pgregory.net/rapid"
)

// drawPocket draws a pocket over random shapes (b/a from 0.1 to 1, any
// rotation and centre), tools from the narrowest to the widest that fits, step-overs from
// a fifth of the tool to all of it, with or without an allowance, either
// direction, lines or arcs, one to three levels.
func drawPocket(t *rapid.T) toolpath.PocketSpec {
	a := rapid.Float64Range(10, 300).Draw(t, "a")
	b := a * rapid.Float64Range(0.1, 1).Draw(t, "b/a")
	rot := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "rotation")
	cx := rapid.Float64Range(-500, 500).Draw(t, "cx")
	cy := rapid.Float64Range(-500, 500).Draw(t, "cy")
	e, err := ellipse.New(ellipse.Point{X: cx, Y: cy}, a, b, rot)
	if err != nil {
		t.Fatal(err)
	}
	tol := rapid.Float64Range(0.01, 0.1).Draw(t, "tol")
	widest := 2*b - 3*tol
	// At least a 25th of the widest, so that a case has tens of rings, not
	// thousands; small ellipses still reach the narrowest tool, 2·Tol.
	narrowest := math.Max(2*tol, widest/25)
	// The widest itself is refused (the limit is strict): stay a hair below.
	tool := narrowest + (widest-narrowest)*rapid.Float64Range(0, 1).Draw(t, "tool share")*(1-1e-9)
	stepOver := math.Max(tol, tool*rapid.Float64Range(0.2, 1).Draw(t, "stepover/tool"))
	allowance := 0.0
	if rapid.Bool().Draw(t, "allowance") {
		if hi := math.Min(stepOver, tool-tol); hi >= 3*tol {
			allowance = rapid.Float64Range(3*tol, hi).Draw(t, "allowance size")
		}
	}
	depth := rapid.Float64Range(0.5, 20).Draw(t, "depth")
	levels := rapid.IntRange(1, 3).Draw(t, "levels")
	geom := rapid.SampledFrom([]toolpath.Geometry{toolpath.Lines, toolpath.Arcs}).Draw(t, "geometry")
	dir := rapid.SampledFrom([]toolpath.Direction{toolpath.Climb, toolpath.Conventional}).Draw(t, "direction")
	return toolpath.PocketSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: tol, Geometry: geom, SafeZ: 5},
		Ellipse: e, Direction: dir, Tool: tool, Depth: depth, StepDown: depth / float64(levels),
		StepOver: stepOver, Allowance: allowance,
		RampAngle: rapid.SampledFrom([]float64{0, 0.02, 0.2}).Draw(t, "ramp"),
	}
}

// Over random shapes and settings every pocket keeps every promise: the
// floor the tool can reach is covered at the final depth (on a grid and
// along the wall's normals), no tool-centre position comes nearer the wall
// than the tool radius, the wall pass stays in its zone, the levels are
// as asked, every entry is a ramp or helix and the only travels are at
// the safe height.
func TestPocketPropertyEveryPromiseKept(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := drawPocket(t)
		p, err := toolpath.Pocket(nil, s)
		if err != nil {
			t.Fatalf("refused a valid pocket: %v", err)
		}
		checkPocket(t, s, p, 1200)
	})
}
