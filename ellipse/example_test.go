package ellipse_test

import (
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
)

// An oval dining tabletop 1800 mm long and 1000 mm wide gets a solid
// wood edge band glued round it. The band is cut 1% long to allow for the
// joint and trimming. (Values checked with mpmath: P = 4488.45711985 mm.)
func ExampleEllipse_Perimeter() {
	top, err := ellipse.FromSize(1800, 1000, ellipse.Point{}, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	p := top.Perimeter()
	fmt.Printf("edge length %.2f mm\n", p)
	fmt.Printf("band to cut %.0f mm\n", math.Ceil(p*1.01))
	// A quarter of the edge, from the end of the long axis to the end of
	// the short one, for marking the joints of a four-piece band.
	fmt.Printf("quarter     %.2f mm\n", top.ArcLength(0, math.Pi/2))
	// Output:
	// edge length 4488.46 mm
	// band to cut 4534 mm
	// quarter     1122.11 mm
}

// An elliptical mirror frame 700 mm wide and 500 mm tall hangs from six
// cords, so six holes go through it at equal spacing along a line 20 mm
// in from its outer edge, starting at the middle of the right-hand side.
// (Positions checked with mpmath by solving s_d(0, t) = k·L/6.)
func ExampleParallel_Divide() {
	frame, err := ellipse.FromSize(700, 500, ellipse.Point{X: 350, Y: 250}, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	line, err := frame.Parallel(-20) // 20 mm inward
	if err != nil {
		fmt.Println(err)
		return
	}
	holes, err := line.Divide(nil, 6)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("hole spacing %.2f mm along the line\n", line.Length()/6)
	for i, h := range holes {
		fmt.Printf("hole %d at (%6.2f, %6.2f)\n", i+1, h.X, h.Y)
	}
	// Output:
	// hole spacing 295.40 mm along the line
	// hole 1 at (680.00, 250.00)
	// hole 2 at (495.13, 456.41)
	// hole 3 at (204.87, 456.41)
	// hole 4 at ( 20.00, 250.00)
	// hole 5 at (204.87,  43.59)
	// hole 6 at (495.13,  43.59)
}

// After cutting an oval opening 420 mm by 260 mm for a basin, three
// points of the cut edge are probed. The signed distance says how far
// each lies outside (+) or inside (−) the intended edge. (The third
// checked with mpmath by minimising the distance: 0.43892119 mm.)
func ExampleEllipse_SignedDistance() {
	opening, err := ellipse.FromSize(420, 260, ellipse.Point{X: 0, Y: 0}, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	probes := []ellipse.Point{{X: 210.4, Y: 0}, {X: 0, Y: 129.7}, {X: 150, Y: 91.5}}
	for _, p := range probes {
		d := opening.SignedDistance(p)
		fmt.Printf("(%5.1f, %5.1f): %+.3f mm\n", p.X, p.Y, d)
	}
	// Output:
	// (210.4,   0.0): +0.400 mm
	// (  0.0, 129.7): -0.300 mm
	// (150.0,  91.5): +0.439 mm
}
