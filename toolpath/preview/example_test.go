package preview_test

import (
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/preview"
)

// A pen plotter drawing an oval label outline 80 × 50 mm as 64 lines, with
// the intended ellipse as reference.
func ExampleRender() {
	e, err := ellipse.FromSize(80, 50, ellipse.Point{}, 0)
	if err != nil {
		panic(err)
	}
	var p toolpath.Path
	prev := toolpath.Point{X: 40, Y: 0, Z: 0}
	p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Start: toolpath.Point{Z: 3}, End: toolpath.Point{X: 40, Z: 3}})
	p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: toolpath.Point{X: 40, Z: 3}, End: prev})
	for k := 1; k <= 64; k++ {
		q := e.PointAt(2 * math.Pi * float64(k) / 64)
		next := toolpath.Point{X: q.X, Y: q.Y}
		p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: prev, End: next})
		prev = next
	}
	img, err := preview.Render(p, preview.Options{Width: 800, Height: 500, Title: "Label outline", Intended: []ellipse.Parallel{e.Curve()}})
	if err != nil {
		panic(err)
	}
	fmt.Println(img.Bounds().Dx(), "x", img.Bounds().Dy(), "pixels")

	_, err = preview.Render(p, preview.Options{Width: 100})
	fmt.Println(err)
	// Output:
	// 800 x 500 pixels
	// preview: Width 100: out of range (480 to 12000)
}
