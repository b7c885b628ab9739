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

// A router pecks one 3 mm deep hole in two steps, writing segment by
// segment. The path gives every move, pecks and retracts included; the
// writer adds only the start and end blocks.
func ExampleNewWriter() {
	cfg := gcodeout.Config{
		Machine: gcodeout.Router, Units: gcodeout.MM,
		Feed: 800, PlungeFeed: 150, RPM: 16000, SafeZ: 4,
		Title:  "Peck test",
		Header: gcodeout.Header{ZeroZ: "top of the test board"},
	}
	w, err := gcodeout.NewWriter(os.Stdout, cfg)
	if err != nil {
		panic(err)
	}
	at := toolpath.Point{Z: 4}
	move := func(m toolpath.Motion, x, y, z float64) {
		end := toolpath.Point{X: x, Y: y, Z: z}
		if err := w.WriteSegment(toolpath.Segment{Kind: toolpath.Line, Motion: m, Start: at, End: end}); err != nil {
			panic(err)
		}
		at = end
	}
	move(toolpath.Travel, 25, 12.5, 4)
	move(toolpath.Cut, 25, 12.5, -1.5)   // first peck
	move(toolpath.Travel, 25, 12.5, 0.5) // clear the chips
	move(toolpath.Travel, 25, 12.5, -1.3)
	move(toolpath.Cut, 25, 12.5, -3) // second peck
	if err := w.Close(); err != nil {
		panic(err)
	}
	// Output:
	// (program: Peck test)
	// (machine: router, units: mm, coordinates to 3 decimals)
	// (Z0: top of the test board)
	// (CAUTION - before running it for real:)
	// (- dry-run it first: cut air with the tool raised clear of the stock)
	// (- check work zero X Y Z, the clamping and the tool and its holder)
	// (- keep the guards in place and wear eye and hearing protection)
	// (- follow the machine maker's instructions and local safety rules)
	// G21 G17 G90 G94
	// G0 Z4
	// M3 S16000
	// G0 X25 Y12.5
	// G1 Z-1.5 F150
	// G0 Z0.5
	// G0 Z-1.3
	// G1 Z-3
	// G0 Z4
	// M5
	// M2
}
