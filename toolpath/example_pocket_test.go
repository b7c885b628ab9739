package toolpath_test

import (
	"fmt"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Clear a recess 6 mm deep for an oval mirror 240 by 160 mm in a walnut
// panel with a 6 mm cutter: levels no deeper than 2.5 mm, rings at most
// 2.4 mm apart, 0.3 mm left on the wall for the finishing pass.
func ExamplePocket() {
	recess, err := ellipse.FromSize(240, 160, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	spec := toolpath.PocketSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.02, Geometry: toolpath.Arcs, SafeZ: 5},
		Ellipse: recess,
		Tool:    6, Depth: 6, StepDown: 2.5, StepOver: 2.4, Allowance: 0.3,
	}
	plan, err := toolpath.PlanPocket(spec)
	if err != nil {
		panic(err)
	}
	fmt.Printf("levels at Z %.4g\n", plan.Levels)
	fmt.Printf("%d rings from %g to %.4g mm in from the wall, %.4g mm apart\n",
		len(plan.Rings), plan.Rings[0], plan.Rings[len(plan.Rings)-1], plan.Spacing)
	fmt.Printf("spine pass %.4g mm long; ramp at %.3g degrees\n", 2*plan.Spine, plan.RampAngle*180/3.141592653589793)

	path, err := toolpath.Pocket(nil, spec)
	if err != nil {
		panic(err)
	}
	wall := toolpath.PocketWall(path)
	first, last := wall[0].Start, wall[len(wall)-1].End
	fmt.Printf("wall pass: %d segments at Z %g, from (%.4f, %.4f) back to (%.4f, %.4f)\n",
		len(wall), first.Z, first.X, first.Y, last.X, last.Y)
	// The rings: b = 80 less a step of 2.4 is 77.6, reached from 3.3 in
	// 31 equal steps; the spine is the medial axis, 2·(a² − b²)/a long.
	// The wall pass starts at the −x end of the major axis, 117 mm out
	// less the middle of its 0.02 mm zone.
	end := path[len(path)-1]
	fmt.Printf("ends with a retract to Z %g\n", end.End.Z)
	// Output:
	// levels at Z [-2 -4 -6]
	// 32 rings from 3.3 to 77.6 mm in from the wall, 2.397 mm apart
	// spine pass 133.3 mm long; ramp at 3 degrees
	// wall pass: 34 segments at Z -6, from (-116.9900, 0.0000) back to (-116.9900, 0.0000)
	// ends with a retract to Z 5
}
