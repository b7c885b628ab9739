package gcodeout_test

import (
	"os"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// A plotter draws a 20 mm circle as two half-circle arcs, having travelled
// to its start with the pen up.
func Example() {
	up, down := 3.0, 0.0
	path := toolpath.Path{
		{Kind: toolpath.Line, Motion: toolpath.Travel, Start: toolpath.Point{X: 0, Y: 0, Z: up}, End: toolpath.Point{X: 10, Y: 0, Z: up}},
		{Kind: toolpath.Line, Motion: toolpath.Cut, Start: toolpath.Point{X: 10, Y: 0, Z: up}, End: toolpath.Point{X: 10, Y: 0, Z: down}, Role: toolpath.Plunge},
		{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: toolpath.Point{X: 10, Y: 0}, End: toolpath.Point{X: -10, Y: 0}, Radius: 10},
		{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: toolpath.Point{X: -10, Y: 0}, End: toolpath.Point{X: 10, Y: 0}, Radius: 10},
		{Kind: toolpath.Line, Motion: toolpath.Travel, Start: toolpath.Point{X: 10, Y: 0, Z: down}, End: toolpath.Point{X: 10, Y: 0, Z: up}},
	}
	cfg := gcodeout.Config{
		Machine: gcodeout.Plotter, Units: gcodeout.MM, Tolerance: 0.05,
		Feed: 1500, PlungeFeed: 600, PenUp: up, PenDown: down,
		Title: "Test circle (20 mm)",
	}
	if err := gcodeout.WritePath(os.Stdout, cfg, path); err != nil {
		panic(err)
	}
	// Output:
	// (program: Test circle [20 mm])
	// (machine: plotter, units: mm, coordinates to 3 decimals)
	// (tolerance: 0.05 mm)
	// (Z0: the paper surface)
	// (CAUTION - before running it for real:)
	// (- dry-run it with the pen lifted clear of the paper)
	// (- check work zero, that the paper is held flat and the pen)
	// (- keep the guards in place, hands clear, and wear eye protection)
	// (- follow the machine maker's instructions and local safety rules)
	// G21 G17 G90 G94
	// G0 Z3
	// G0 X10 Y0
	// G1 Z0 F600
	// G3 X-10 Y0 I-10 J0 F1500
	// G3 X10 Y0 I10 J0
	// G0 Z3
	// M2
}
