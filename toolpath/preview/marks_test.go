package preview

import (
	"image/color"
	"math"
	"testing"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
)

func TestLoopsCloseOnThemselves(t *testing.T) {
	p := square(nil, 0, 0, 10, -1) // segments 0..6: rapid, plunge, 4 sides, rapid
	p = square(p, 20, 0, 10, -1)   // 7..13
	an := analyse(p)
	want := []span{{2, 6}, {9, 13}}
	if len(an.loops) != len(want) {
		t.Fatalf("loops %v, want %v", an.loops, want)
	}
	for i := range want {
		if an.loops[i] != want[i] {
			t.Errorf("loop %d is %v, want %v", i, an.loops[i], want[i])
		}
	}
	if !an.hasStart || an.start != (plan.Point{}) {
		t.Errorf("start %v (%v), want (0, 0)", an.start, an.hasStart)
	}
}

func TestMarksAreDrawn(t *testing.T) {
	p, _ := servingBoard(t, 720)
	img, l := drawn(t, p, Options{ToolWidth: 6})
	u := l.unit
	an := analyse(p)
	// A tab: hollow, paper in the middle of the cut line, ink on its edge.
	var tab *toolpath.Segment
	for i := range p {
		if an.classes[i] == plan.Tab && p[i].Kind == toolpath.Line {
			tab = &p[i]
			break
		}
	}
	if tab == nil {
		t.Fatal("no tab found in the serving board")
	}
	m := tab.At(0.5)
	if c := rgbAt(img, l, m.X, m.Y); !isWhite(c) {
		t.Errorf("tab middle: %v, want the hollow (paper)", c)
	}
	dx, dy := direction(tab, 0.5)
	px, py := l.px(m.X, m.Y)
	edge := img.RGBAAt(int(px-dy*3.6*u), int(py-dx*3.6*u))
	if luma(edge) > 60 {
		t.Errorf("tab edge: %v, want ink", edge)
	}
	// A hole: ink at the centre (the cross), paper between cross and ring,
	// ink on the ring.
	for _, h := range [][2]float64{{-60, 70}, {60, 70}} {
		x, y := l.px(h[0], h[1])
		d := 1 / math.Sqrt2
		if c := img.RGBAAt(int(x), int(y)); luma(c) > 80 {
			t.Errorf("hole %v centre: %v, want ink", h, c)
		}
		if c := img.RGBAAt(int(x+3.5*u*d), int(y+3.5*u*d)); !isWhite(c) {
			t.Errorf("hole %v inside the ring: %v, want paper", h, c)
		}
		if v := darkest(img, x+6.5*u*d, y+6.5*u*d); v > 60 {
			t.Errorf("hole %v ring: lightness %.0f, want ink", h, v)
		}
	}
	// The start: the orange dot.
	s := p[1].End
	if c := rgbAt(img, l, s.X, s.Y); c.R < 200 || c.G < 130 || c.G > 190 || c.B > 40 {
		t.Errorf("start: %v, want orange", c)
	}
	// Arrows: orange pixels along the first loop, away from the start.
	orange := 0
	b := img.Bounds()
	sx, sy := l.px(s.X, s.Y)
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			if math.Hypot(float64(x)-sx, float64(y)-sy) < 20*u || float64(y) > l.areaY1 {
				continue
			}
			c := img.RGBAAt(x, y)
			if c.R > 200 && c.G > 130 && c.G < 190 && c.B < 40 {
				orange++
			}
		}
	}
	if orange < 200 {
		t.Errorf("%d orange pixels away from the start, want arrows along the loop", orange)
	}
}

func TestDrawingStaysClearOfTheStrips(t *testing.T) {
	p, _ := servingBoard(t, 200)
	for _, size := range [][2]int{{1600, 1000}, {800, 800}, {480, 320}, {3000, 1200}} {
		img, l := drawn(t, p, Options{Width: size[0], Height: size[1], Title: "clear of the strips"})
		minX, minY, maxX, maxY, _ := p.Bounds()
		x0, y0 := l.px(minX, maxY)
		x1, y1 := l.px(maxX, minY)
		if x0 < l.areaX0-0.5 || x1 > l.areaX1+0.5 || y0 < l.areaY0-0.5 || y1 > l.areaY1+0.5 {
			t.Errorf("%v: path box (%.0f,%.0f)-(%.0f,%.0f) outside the drawing area (%.0f,%.0f)-(%.0f,%.0f)", size, x0, y0, x1, y1, l.areaX0, l.areaY0, l.areaX1, l.areaY1)
		}
		// Text: something dark in the title strip and in the legend strip.
		if !anyDark(img, 0, 0, size[0], int(l.areaY0)-4) {
			t.Errorf("%v: nothing drawn in the title strip", size)
		}
		if !anyDark(img, 0, int(l.areaY1)+4, size[0], size[1]) {
			t.Errorf("%v: nothing drawn in the legend strip", size)
		}
	}
}

// anyDark reports whether a pixel darker than mid grey lies in the box.
func anyDark(img interface {
	RGBAAt(x, y int) color.RGBA
}, x0, y0, x1, y1 int) bool {
	for y := y0; y < y1; y++ {
		for x := x0; x < x1; x++ {
			if luma(img.RGBAAt(x, y)) < 128 {
				return true
			}
		}
	}
	return false
}

// darkest returns the lowest lightness in the 3 × 3 pixels around (x, y),
// for thin anti-aliased lines.
func darkest(img interface {
	RGBAAt(x, y int) color.RGBA
}, x, y float64) float64 {
	v := 255.0
	for dy := -1; dy <= 1; dy++ {
		for dx := -1; dx <= 1; dx++ {
			v = math.Min(v, luma(img.RGBAAt(int(x)+dx, int(y)+dy)))
		}
	}
	return v
}

// arrowsOf draws the picture of p and returns n arrows along its first
// loop, as drawDirection places them.
func arrowsOf(t *testing.T, p toolpath.Path, n int) ([]arrowMark, *picture) {
	t.Helper()
	r, err := resolve(Options{})
	if err != nil {
		t.Fatal(err)
	}
	pic := newPicture(p, &r)
	if len(pic.an.loops) == 0 {
		t.Fatal("no loop found")
	}
	var w loopWalk
	w.reset(pic, pic.an.loops[0])
	return pic.arrowsAlong(&w, n, nil, nil, false), pic
}

func TestArrowsPointTheWayTheToolGoes(t *testing.T) {
	for _, cw := range []bool{false, true} {
		b := &builder{pos: toolpath.Point{X: 50, Z: 5}}
		b.feed(50, 0, -1)
		b.arc(0, 0, 50, 0, -1, cw)
		marks, pic := arrowsOf(t, b.p, 6)
		if len(marks) != 6 {
			t.Fatalf("clockwise %v: %d arrows, want 6", cw, len(marks))
		}
		cx, cy := pic.lay.px(0, 0)
		for _, m := range marks {
			// In pixels (y down) a counter-clockwise turn about the centre
			// goes along (oy, -ox) at offset (ox, oy).
			ox, oy := m.x-cx, m.y-cy
			r := math.Hypot(ox, oy)
			tx, ty := oy/r, -ox/r
			if cw {
				tx, ty = -tx, -ty
			}
			if m.dx*tx+m.dy*ty < 0.98 {
				t.Errorf("clockwise %v: arrow at (%.0f, %.0f) points (%.2f, %.2f), want (%.2f, %.2f)", cw, m.x, m.y, m.dx, m.dy, tx, ty)
			}
		}
	}
}

func TestArrowsFollowTheCutNotItsWiggles(t *testing.T) {
	// A cut along +x made of steps 0.1 forward and 0.05 back, each with a
	// sideways wiggle: every other segment runs backwards.
	b := &builder{pos: toolpath.Point{Z: 5}}
	b.feed(0, 0, -1)
	for x := 0.0; x < 200; x += 0.05 {
		b.feed(x+0.1, 0.01, -1)
		b.feed(x+0.05, -0.01, -1)
	}
	marks, _ := arrowsOf(t, b.p, 5)
	for _, m := range marks {
		if m.dx < 0.95 {
			t.Errorf("arrow at (%.0f, %.0f) points (%.2f, %.2f), want along +x", m.x, m.y, m.dx, m.dy)
		}
	}
	if len(marks) != 5 {
		t.Errorf("%d arrows, want 5", len(marks))
	}
}

// direction returns the unit direction of travel of s at fraction u, in
// path coordinates.
func direction(s *toolpath.Segment, u float64) (float64, float64) {
	if s.Kind == toolpath.Arc {
		sw := s.Sweep()
		a := math.Atan2(s.Start.Y-s.CenterY, s.Start.X-s.CenterX) + u*sw
		if sw > 0 {
			return -math.Sin(a), math.Cos(a)
		}
		return math.Sin(a), -math.Cos(a)
	}
	dx, dy := s.End.X-s.Start.X, s.End.Y-s.Start.Y
	d := math.Hypot(dx, dy)
	if d == 0 {
		return 1, 0
	}
	return dx / d, dy / d
}
