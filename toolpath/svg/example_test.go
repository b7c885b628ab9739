package svg_test

import (
	"os"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/svg"
)

// A coaster of radius 45 mm cut as one full circle, with a pen dot at its
// centre, drawn at true size.
func ExampleWrite() {
	edge := toolpath.Point{X: 45, Y: 0, Z: -3}
	p := toolpath.Path{
		{Kind: toolpath.Line, Motion: toolpath.Travel, Start: toolpath.Point{Z: 5}, End: toolpath.Point{X: 45, Z: 5}},
		{Kind: toolpath.Line, Motion: toolpath.Cut, Start: toolpath.Point{X: 45, Z: 5}, End: edge},
		{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: edge, End: edge, Radius: 45},
		{Kind: toolpath.Line, Motion: toolpath.Travel, Start: edge, End: toolpath.Point{Z: 5}},
		{Kind: toolpath.Line, Motion: toolpath.Cut, Start: toolpath.Point{Z: 5}, End: toolpath.Point{Z: -0.5}},
	}
	if err := svg.Write(os.Stdout, p, svg.Options{Title: "Coaster", Decimals: 2}); err != nil {
		panic(err)
	}
	// Output:
	// <?xml version="1.0" encoding="UTF-8"?>
	// <svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="90.1mm" height="90.1mm" viewBox="-45.05 -45.05 90.1 90.1">
	// <title>Coaster</title>
	// <desc>Seen from above; y is negated so that the drawing is not mirrored. Units: mm.</desc>
	// <g id="travel" fill="none" stroke="#d55e00" stroke-width="0.1" stroke-linecap="round" stroke-linejoin="round" stroke-dasharray="2 1.5">
	// <path d="M 0 0
	// L 45 0
	// L 0 0"/>
	// </g>
	// <g id="cut" fill="none" stroke="#08306b" stroke-width="0.1" stroke-linecap="round" stroke-linejoin="round">
	// <path d="M 45 0
	// A 45 45 0 0 0 0 -45
	// A 45 45 0 0 0 -45 0
	// A 45 45 0 0 0 0 45
	// A 45 45 0 0 0 45 0"/>
	// </g>
	// <g id="marks" fill="none" stroke="#000000" stroke-width="0.1">
	// <circle cx="0" cy="0" r="1"/>
	// </g>
	// </svg>
}
