package toolpath_test

import (
	"fmt"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// A 600 x 400 mm tabletop, its edge approximated within ±0.05 mm by
// tangent-continuous arcs and by lines: arcs need far fewer segments.
func ExampleApproximate() {
	top, err := ellipse.FromSize(600, 400, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	for _, g := range []toolpath.Geometry{toolpath.Arcs, toolpath.Lines} {
		path, err := toolpath.Approximate(nil, toolpath.Spec{
			Curve:    top.Curve(),
			Zone:     toolpath.Band,
			Tol:      0.05,
			Geometry: g,
		})
		if err != nil {
			panic(err)
		}
		nstar := toolpath.LowerBound(top.Curve(), g, toolpath.Band, 0.05, 0, 0)
		fmt.Printf("%s: %d segments (lower bound %.1f)\n", g, len(path), nstar)
	}
	// Output:
	// arcs: 28 segments (lower bound 16.2)
	// lines: 110 segments (lower bound 109.1)
}

// Streaming: an Approximator hands out one segment at a time and
// allocates nothing, which is how a controller would consume it.
func ExampleApproximator_Next() {
	gasket, _ := ellipse.FromSize(120, 80, ellipse.Point{X: 10, Y: 10}, 0)
	// The tool centre of a 6 mm cutter outside the part: the parallel
	// curve 3 mm out, never inside it.
	centre, _ := gasket.Parallel(3)
	a, err := toolpath.NewApproximator(toolpath.Spec{Curve: centre, Zone: toolpath.Outside, Tol: 0.02, Geometry: toolpath.Arcs})
	if err != nil {
		panic(err)
	}
	n := 0
	for seg, ok := a.Next(); ok; seg, ok = a.Next() {
		if n == 0 {
			fmt.Printf("first: %s from (%.3f, %.3f)\n", seg.Kind, seg.Start.X, seg.Start.Y)
		}
		n++
	}
	fmt.Println("segments:", n, "decimals:", a.Decimals(), "error:", a.Err())
	// Output:
	// first: arc from (73.010, 10.000)
	// segments: 28 decimals: 4 error: <nil>
}
