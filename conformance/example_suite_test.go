package conformance_test

import (
	"errors"
	"fmt"
	"math"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

func ExampleTestGenerator() {
	// A lid of 120 × 80 mm cut within ±0.05 mm, and the path of the
	// centre of a 6 mm tool round it, 3 mm outward, never inside.
	lid, _ := ellipse.FromSize(120, 80, ellipse.Point{}, 0)
	tool, _ := lid.Parallel(3)
	cases := []conformance.Case{
		{Name: "lid edge", Curve: lid.Curve(), Zone: toolpath.Band, Tol: 0.05},
		{Name: "tool centre", Curve: tool, Zone: toolpath.Outside, Tol: 0.05},
	}
	fmt.Println(conformance.TestGenerator(conformance.Polyline{}, cases...))

	// A generator that ignores the zone is caught on the second case.
	sloppy := conformance.GeneratorFunc(func(dst toolpath.Path, c ellipse.Parallel, _ toolpath.Zone, tol float64) (toolpath.Path, error) {
		return conformance.Polyline{}.Generate(dst, c, toolpath.Band, tol)
	})
	err := conformance.TestGenerator(sloppy, cases...)
	var f *conformance.Fault
	if errors.As(err, &f) {
		fmt.Println(f.Subject+":", f.Operation)
	}
	fmt.Println(errors.Is(err, conformance.ErrOutsideZone))
	// Output:
	// <nil>
	// tool centre: segment 0 deviation
	// true
}

func ExamplePolyline() {
	// The outline of a 300 × 200 mm mirror, kept outside the curve by at
	// most 0.02 mm.
	mirror, _ := ellipse.FromSize(300, 200, ellipse.Point{X: 150, Y: 100}, 0)
	p, err := conformance.Polyline{}.Generate(nil, mirror.Curve(), toolpath.Outside, 0.02)
	if err != nil {
		fmt.Println(err)
		return
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, s := range p {
		l, h := conformance.SegmentDeviation(mirror.Curve(), s)
		lo, hi = math.Min(lo, l), math.Max(hi, h)
	}
	fmt.Printf("%d lines, deviation %.4f to %.4f mm\n", len(p), lo, hi)
	// Output:
	// 193 lines, deviation 0.0001 to 0.0200 mm
}

func ExampleSegmentDeviation() {
	// A chord across a round table top of radius 500 mm, 100 mm long:
	// its middle lies r − √(r² − 50²) ≈ 2.5063 mm inside the edge.
	top, _ := ellipse.New(ellipse.Point{}, 500, 500, 0)
	y := math.Sqrt(500*500 - 50*50)
	chord := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut,
		Start: toolpath.Point{X: -50, Y: y}, End: toolpath.Point{X: 50, Y: y}}
	lo, hi := conformance.SegmentDeviation(top.Curve(), chord)
	fmt.Printf("%.4f %.4f\n", lo, hi)
	// Output:
	// -2.5063 0.0000
}
