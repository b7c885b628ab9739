package toolpath_test

import (
	"fmt"
	"slices"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Cut an oval cheese board 300 mm by 200 mm out of 18 mm oak with a 6 mm
// cutter: passes of equal depth no deeper than 5 mm, four holding tabs
// 8 mm wide and 6 mm tall, climb milling.
func ExampleProfile() {
	board, err := ellipse.FromSize(300, 200, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	path, err := toolpath.Profile(nil, toolpath.ProfileSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.02, Geometry: toolpath.Arcs, SafeZ: 5, PlungeFeed: 300},
		Ellipse: board,
		Tool:    6, Depth: 18, StepDown: 5,
		Tabs: 4, TabWidth: 8, TabHeight: 6,
	})
	if err != nil {
		panic(err)
	}
	var levels []float64
	leads, tabTops := 0, 0
	for _, s := range path {
		switch {
		case s.Role == toolpath.Contour && s.Motion == toolpath.Cut && s.Start.Z == s.End.Z && !slices.Contains(levels, s.Start.Z):
			levels = append(levels, s.Start.Z)
		case s.Role == toolpath.LeadIn || s.Role == toolpath.LeadOut:
			leads++
		case s.Role == toolpath.Tab && s.Start.Z == s.End.Z && s.Start.Z == -12:
			tabTops++
		}
	}
	n, step := toolpath.DepthPasses(18, 5)
	fmt.Printf("%d passes of %g mm, at Z %v\n", n, step, levels)
	fmt.Println("lead arcs:", leads)
	fmt.Println("raised stretches at the tab top Z -12 on the last two passes:", tabTops > 0)
	last := path[len(path)-1]
	fmt.Printf("ends with a %v move up to Z %g\n", map[toolpath.Motion]string{toolpath.Travel: "travel", toolpath.Cut: "cut"}[last.Motion], last.End.Z)
	// Output:
	// 4 passes of 4.5 mm, at Z [-4.5 -9 -13.5 -18]
	// lead arcs: 8
	// raised stretches at the tab top Z -12 on the last two passes: true
	// ends with a travel move up to Z 5
}

// Six shelf-pin holes 8 mm deep, pecked 3 mm at a time, at equal arc
// length on a line 20 mm inside a 400 by 250 mm oval tabletop. (The
// positions agree with an independent 30-digit mpmath quadrature of the
// parallel curve's arc length, (1 − 20κ)·|p'| dt, and root finding.)
func ExampleDrill() {
	top, err := ellipse.FromSize(400, 250, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	path, err := toolpath.Drill(nil, toolpath.DrillSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.02, SafeZ: 5},
		Ellipse: top, Offset: -20, Count: 6,
		Depth: 8, Peck: 3, PeckRetract: 1,
	})
	if err != nil {
		panic(err)
	}
	for _, s := range path {
		if s.Role == toolpath.Hole && s.End.Z == -8 {
			fmt.Printf("hole at (%.3f, %.3f)\n", s.End.X, s.End.Y)
		}
	}
	// Output:
	// hole at (180.000, 0.000)
	// hole at (74.892, 95.227)
	// hole at (-74.892, 95.227)
	// hole at (-180.000, 0.000)
	// hole at (-74.892, -95.227)
	// hole at (74.892, -95.227)
}

// A dashed fold line for a card: dashes of 4 and gaps of 2 along a
// 120 by 80 ellipse, scaled so that a whole number of them closes. (The
// perimeter agrees with Ramanujan's second approximation, 317.3088, whose
// error at this eccentricity is far below the digits shown.)
func ExampleDashPattern() {
	card, err := ellipse.FromSize(120, 80, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	n, dash, gap := toolpath.DashPattern(card.Perimeter(), 4, 2)
	fmt.Printf("perimeter %.4f: %d dashes of %.4f with gaps of %.4f\n", card.Perimeter(), n, dash, gap)
	// Output:
	// perimeter 317.3088: 53 dashes of 3.9913 with gaps of 1.9957
}

// A program that would leave the machine's travel is refused, naming the
// axis and by how much: four marks on a 620 by 400 mm ellipse on a laser
// bed 600 mm square.
func ExampleEnvelope_Check() {
	tray, err := ellipse.FromSize(620, 400, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	path, err := toolpath.Drill(nil, toolpath.DrillSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Laser, Tol: 0.05},
		Ellipse: tray, Count: 4, MarkSeconds: 0.2,
	})
	if err != nil {
		panic(err)
	}
	bed := toolpath.Envelope{MinX: -300, MinY: -300, MaxX: 300, MaxY: 300}
	fmt.Println(bed.Check(path))
	// Output:
	// toolpath: X reaches -310, 10 beyond the lower travel limit -300: outside the machine's travel
	// toolpath: X reaches 310, 10 beyond the upper travel limit 300: outside the machine's travel
}

// The time estimate of a single straight cut with acceleration: 100 mm at
// 600 mm/min with 500 mm/s² takes 10 s at speed plus v/A = 0.02 s for
// speeding up and slowing down.
func ExampleSummarize() {
	path := toolpath.Path{
		{Kind: toolpath.Line, Motion: toolpath.Cut, Start: toolpath.Point{X: 0, Y: 0, Z: 0}, End: toolpath.Point{X: 100, Y: 0, Z: 0}},
	}
	r := toolpath.Summarize(path, toolpath.Rates{Feed: 600, Rapid: 5000, Accel: 500})
	fmt.Printf("cut %g mm in %.2f s, %d stop(s)\n", r.CutLength, r.Seconds, r.Stops)
	// Output:
	// cut 100 mm in 10.02 s, 1 stop(s)
}
