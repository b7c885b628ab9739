package preview

import (
	"flag"
	"math"
	"os"
	"path/filepath"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// -preview.out writes the test pictures to a directory for a person to
// look at: go test ./toolpath/preview -run Scene -preview.out /tmp/pv
var outDir = flag.String("preview.out", "", "write test pictures to this `directory`")

// save writes img-producing render of p to the -preview.out directory.
func save(t *testing.T, name string, p toolpath.Path, o Options) {
	t.Helper()
	if *outDir == "" {
		return
	}
	f, err := os.Create(filepath.Join(*outDir, name+".png"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if err := WritePNG(f, p, o); err != nil {
		t.Fatal(err)
	}
}

// builder appends moves to a path, keeping the current point.
type builder struct {
	p   toolpath.Path
	pos toolpath.Point
}

func (b *builder) move(m toolpath.Motion, role toolpath.Role, x, y, z float64) {
	q := toolpath.Point{X: x, Y: y, Z: z}
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Line, Motion: m, Role: role, Start: b.pos, End: q})
	b.pos = q
}

func (b *builder) rapid(x, y, z float64) { b.move(toolpath.Travel, toolpath.Contour, x, y, z) }
func (b *builder) feed(x, y, z float64)  { b.move(toolpath.Cut, toolpath.Contour, x, y, z) }

// arc appends a cutting arc about (cx, cy) to (x, y) at height z.
func (b *builder) arc(cx, cy, x, y, z float64, cw bool) {
	q := toolpath.Point{X: x, Y: y, Z: z}
	r := math.Hypot(b.pos.X-cx, b.pos.Y-cy)
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: b.pos, End: q, CenterX: cx, CenterY: cy, Radius: r, Clockwise: cw})
	b.pos = q
}

// servingBoard is a scene of our own: an oval serving board 380 × 240 mm
// cut from 20 mm stock with a 6 mm tool on the outside, in three passes,
// four holding tabs 10 mm long and 4 mm high in the last pass, then two
// hanging holes drilled 10 mm deep. The curve is sampled as n lines.
func servingBoard(t testing.TB, n int) (toolpath.Path, ellipse.Ellipse) {
	e, err := ellipse.FromSize(380, 240, ellipse.Point{}, 0)
	if err != nil {
		t.Fatal(err)
	}
	c, err := e.Parallel(3)
	if err != nil {
		t.Fatal(err)
	}
	b := &builder{pos: toolpath.Point{X: -230, Y: -160, Z: 5}}
	p0 := c.PointAt(0)
	b.rapid(p0.X, p0.Y, 5)
	for _, z := range []float64{-7, -14, -20} {
		b.feed(p0.X, p0.Y, z)
		for k := 1; k <= n; k++ {
			tt := 2 * math.Pi * float64(k) / float64(n)
			q := c.PointAt(tt)
			zz := z
			if z == -20 && inTab(tt) {
				zz = -16
			}
			if zz != b.pos.Z {
				b.feed(b.pos.X, b.pos.Y, zz)
			}
			b.feed(q.X, q.Y, zz)
		}
		if b.pos.Z != z {
			b.feed(b.pos.X, b.pos.Y, z)
		}
	}
	b.rapid(b.pos.X, b.pos.Y, 5)
	for _, h := range [][2]float64{{-60, 70}, {60, 70}} {
		b.rapid(h[0], h[1], 5)
		b.feed(h[0], h[1], -10)
		b.rapid(h[0], h[1], 5)
	}
	return b.p, e
}

// inTab reports whether parameter t lies in one of the four tabs, centred
// at 45°, 135°, 225° and 315° and about 0.05 rad wide.
func inTab(t float64) bool {
	for k := 0; k < 4; k++ {
		c := math.Pi/4 + float64(k)*math.Pi/2
		if math.Abs(t-c) < 0.025 {
			return true
		}
	}
	return false
}

// coasters is a scene of our own: three round coasters of radius 45 mm
// cut as full-circle arcs at one depth, counter-clockwise, with travel
// between them.
func coasters() toolpath.Path {
	b := &builder{pos: toolpath.Point{Z: 5}}
	for i, cx := range []float64{0, 110, 220} {
		b.rapid(cx+45, 0, 5)
		b.feed(cx+45, 0, -3)
		b.arc(cx, 0, cx+45, 0, -3, i == 1)
		b.rapid(cx+45, 0, 5)
	}
	return b.p
}

func TestSceneServingBoard(t *testing.T) {
	p, e := servingBoard(t, 720)
	save(t, "board", p, Options{Title: "Oval serving board, 6 mm tool, outside cut", ToolWidth: 6, Intended: []ellipse.Parallel{e.Curve()}})
	save(t, "board-small", p, Options{Width: MinWidth, Height: MinHeight, Title: "Serving board with a title far too long for a small picture", ToolWidth: 6, Intended: []ellipse.Parallel{e.Curve()}})
	save(t, "board-inch", p, Options{Width: 1000, Height: 1000, Units: "inch", Title: "Same numbers read as inches"})
	save(t, "coasters", coasters(), Options{Title: "Three coasters"})
	save(t, "spiral", spiral(20, 200), Options{Title: "Spiral, 20 turns of arcs", ToolWidth: 3})
}
