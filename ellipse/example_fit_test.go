package ellipse_test

import (
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
)

// A worn oval gasket from an inspection hatch, laid flat and measured at
// fourteen points with calipers against a square, to 0.01 mm. The fit
// gives the ellipse to cut a new one to, how far each measurement lies
// from it, and how well the numbers are known.
func ExampleFit() {
	measured := []ellipse.Point{
		{X: 338.83, Y: 155.46}, {X: 324.39, Y: 179.49}, {X: 296.77, Y: 195.05},
		{X: 256.93, Y: 200.51}, {X: 221.58, Y: 194.78}, {X: 184.30, Y: 175.77},
		{X: 165.66, Y: 153.96}, {X: 160.37, Y: 129.92}, {X: 173.61, Y: 102.54},
		{X: 197.93, Y: 86.98}, {X: 239.27, Y: 79.44}, {X: 274.91, Y: 84.15},
		{X: 313.10, Y: 102.29}, {X: 334.64, Y: 126.53},
	}
	res, err := ellipse.Fit(measured)
	if err != nil {
		fmt.Println(err)
		return
	}
	e, u := res.Ellipse, res.Uncertainty
	c := e.Center()
	fmt.Printf("size %.2f x %.2f mm, centre (%.2f, %.2f), major axis at %.1f°\n",
		2*e.SemiMajor(), 2*e.SemiMinor(), c.X, c.Y, e.MajorAngle()*180/math.Pi)
	fmt.Printf("uncertainty: centre ±%.2f mm, semi-axes ±%.2f mm, rotation ±%.2f°\n",
		math.Max(u.Center.X, u.Center.Y), math.Max(u.SemiMajor, u.SemiMinor), u.Rotation*180/math.Pi)
	fmt.Printf("residuals: rms %.2f mm, largest %.2f mm at point %d\n", res.RMS, res.MaxResidual, res.MaxIndex)
	fmt.Printf("coverage %.0f%%, warnings %d\n", 100*res.Coverage, len(res.Warnings))
	// Output:
	// size 180.47 x 119.60 mm, centre (250.02, 140.01), major axis at 8.0°
	// uncertainty: centre ±0.02 mm, semi-axes ±0.02 mm, rotation ±0.03°
	// residuals: rms 0.04 mm, largest 0.07 mm at point 12
	// coverage 92%, warnings 0
}
