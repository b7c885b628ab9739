package preview

import (
	"image"
	"image/color"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// drawn renders p and returns the picture with its layout, so that tests
// can look up the pixel of a path point.
func drawn(t *testing.T, p toolpath.Path, o Options) (*image.RGBA, *layout) {
	t.Helper()
	r, err := resolve(o)
	if err != nil {
		t.Fatal(err)
	}
	if err := checkPath(p); err != nil {
		t.Fatal(err)
	}
	pic := newPicture(p, &r)
	pic.draw()
	return pic.dc.Image().(*image.RGBA), pic.lay
}

// rgbAt returns the colour of the pixel that holds path point (x, y).
func rgbAt(img *image.RGBA, l *layout, x, y float64) color.RGBA {
	px, py := l.px(x, y)
	return img.RGBAAt(int(math.Floor(px)), int(math.Floor(py)))
}

// luma is the Rec. 601 lightness of c in [0, 255]: what a grey print shows.
func luma(c color.RGBA) float64 {
	return 0.299*float64(c.R) + 0.587*float64(c.G) + 0.114*float64(c.B)
}

func isWhite(c color.RGBA) bool { return c.R > 245 && c.G > 245 && c.B > 245 }

// square appends a closed square of side d with its lower left corner at
// (x, y), cut at height z, reached by a travel move from the current end.
func square(p toolpath.Path, x, y, d, z float64) toolpath.Path {
	from := toolpath.Point{X: x, Y: y, Z: 5}
	if len(p) > 0 {
		from = p[len(p)-1].End
	}
	b := &builder{p: p, pos: from}
	b.rapid(x, y, 5)
	b.feed(x, y, z)
	b.feed(x+d, y, z)
	b.feed(x+d, y+d, z)
	b.feed(x, y+d, z)
	b.feed(x, y, z)
	b.rapid(x, y, 5)
	return b.p
}

func TestCutLinesWhereTheMovesAreAndNowhereElse(t *testing.T) {
	p := square(nil, 0, 0, 100, -2)
	img, l := drawn(t, p, Options{})
	// Middles of the four sides, away from the arrows and the start mark.
	for _, q := range [][2]float64{{30, 0}, {100, 70}, {70, 100}, {0, 30}} {
		c := rgbAt(img, l, q[0], q[1])
		if luma(c) > 120 || c.B <= c.R {
			t.Errorf("cut line at %v: pixel %v, want dark blue", q, c)
		}
	}
	for _, q := range [][2]float64{{50, 50}, {25, 75}, {80, 20}, {10, 90}} {
		if c := rgbAt(img, l, q[0], q[1]); !isWhite(c) {
			t.Errorf("inside the square at %v: pixel %v, want paper", q, c)
		}
	}
	// Just outside the square, two line widths away.
	d := 6 * l.unit / l.scale
	for _, q := range [][2]float64{{50, -d}, {100 + d, 50}, {50, 100 + d}, {-d, 50}} {
		if c := rgbAt(img, l, q[0], q[1]); !isWhite(c) {
			t.Errorf("outside the square at %v: pixel %v, want paper", q, c)
		}
	}
}

func TestTravelIsDashed(t *testing.T) {
	b := &builder{pos: toolpath.Point{Z: 5}}
	b.rapid(300, 0, 5)
	b.feed(300, 0, -1)
	b.feed(300, 100, -1)
	img, l := drawn(t, b.p, Options{})
	on, off := 0, 0
	for x := 20.0; x < 280; x += 0.25 {
		c := rgbAt(img, l, x, 0)
		switch {
		case isWhite(c):
			off++
		case c.R > 150 && c.B < 120:
			on++ // vermillion
		}
	}
	frac := float64(on) / float64(on+off)
	if on == 0 || off == 0 || frac < 0.35 || frac > 0.8 {
		t.Errorf("travel line: %d coloured and %d paper samples (%.2f), want dashes with gaps", on, off, frac)
	}
}

func TestDeeperCutsAreDarker(t *testing.T) {
	p := square(nil, 0, 0, 100, -2)
	p = square(p, 150, 0, 100, -6)
	p = square(p, 300, 0, 100, -12)
	img, l := drawn(t, p, Options{})
	var prev float64 = 256
	for i, x := range []float64{0, 150, 300} {
		c := rgbAt(img, l, x+100, 50)
		if y := luma(c); y >= prev-10 {
			t.Errorf("square %d (deeper): lightness %.0f, want clearly below %.0f", i, y, prev)
		} else {
			prev = y
		}
	}
}

func TestEqualScaleOnBothAxes(t *testing.T) {
	// A wide picture and a circle: the circle must stay round. On the
	// circle every pixel is drawn (line, arrow or start mark); 9 px inside
	// and outside, beyond the largest mark, none is.
	b := &builder{pos: toolpath.Point{X: 50, Z: 5}}
	b.feed(50, 0, -1)
	b.arc(0, 0, 50, 0, -1, false)
	for _, size := range [][2]int{{1800, 700}, {500, 1400}} {
		img, l := drawn(t, b.p, Options{Width: size[0], Height: size[1]})
		cx, cy := l.px(0, 0)
		r := 50 * l.scale
		for k := 0; k < 16; k++ {
			a := 2 * math.Pi * float64(k) / 16
			at := func(rr float64) color.RGBA {
				return img.RGBAAt(int(math.Floor(cx+rr*math.Cos(a))), int(math.Floor(cy-rr*math.Sin(a))))
			}
			if c := at(r); isWhite(c) {
				t.Errorf("%v: circle at %.0f°, %.0f px from the centre: paper, want the cut", size, 22.5*float64(k), r)
			}
			if c := at(r - 9); !isWhite(c) {
				t.Errorf("%v: %.0f px inside the circle at %.0f°: %v, want paper", size, 9.0, 22.5*float64(k), c)
			}
			if c := at(r + 9); !isWhite(c) {
				t.Errorf("%v: %.0f px outside the circle at %.0f°: %v, want paper", size, 9.0, 22.5*float64(k), c)
			}
		}
	}
}

func TestToolBandIsTheToolWidth(t *testing.T) {
	b := &builder{pos: toolpath.Point{Z: 5}}
	b.feed(0, 0, -3)
	b.feed(200, 0, -3)
	b.feed(200, 100, -3)
	const tool = 12.0
	img, l := drawn(t, b.p, Options{ToolWidth: tool})
	in := rgbAt(img, l, 100, 0.4*tool)
	if isWhite(in) || in.B <= in.R {
		t.Errorf("inside the band: pixel %v, want a faint blue", in)
	}
	if luma(in) < 200 {
		t.Errorf("inside the band: lightness %.0f, want faint (above 200)", luma(in))
	}
	out := rgbAt(img, l, 100, 0.5*tool+3/l.scale)
	if !isWhite(out) {
		t.Errorf("beyond the band: pixel %v, want paper", out)
	}
	// Without ToolWidth there is no band.
	img, l = drawn(t, b.p, Options{})
	if c := rgbAt(img, l, 100, 0.4*tool); !isWhite(c) {
		t.Errorf("no tool width: pixel %v beside the cut, want paper", c)
	}
}

func TestIntendedShapeIsAThinLine(t *testing.T) {
	e, err := ellipse.FromSize(200, 100, ellipse.Point{}, 0)
	if err != nil {
		t.Fatal(err)
	}
	// The path is a rectangle around the ellipse; the ellipse is drawn
	// from Intended alone.
	p := square(nil, -110, -110, 220, -1)
	img, l := drawn(t, p, Options{Intended: []ellipse.Parallel{e.Curve()}})
	for _, q := range [][2]float64{{0, 50}, {0, -50}, {-100, 0}, {100, 0}} {
		// look within a pixel for the 1.2 px line
		px, py := l.px(q[0], q[1])
		if v := darkest(img, px, py); v > 100 {
			t.Errorf("intended shape at %v: lightest %.0f, want a dark pixel", q, v)
		}
	}
	if c := rgbAt(img, l, 0, 25); !isWhite(c) {
		t.Errorf("inside the intended shape: pixel %v, want paper", c)
	}
}

// rgba converts a colour without alpha to color.RGBA.
func rgba(c color.NRGBA) color.RGBA { return color.RGBA{c.R, c.G, c.B, 255} }

func TestBandDoesNotDarkenWherePassesOverlap(t *testing.T) {
	// A circle of 12000 lines (more than one stroke chunk) cut once, and
	// three times over: the band beside the cut must look the same.
	circle := func(passes int) toolpath.Path {
		b := &builder{pos: toolpath.Point{X: 100, Z: 5}}
		for k := 0; k < passes; k++ {
			z := -2 * float64(k+1)
			b.feed(100, 0, z)
			for i := 1; i <= 12000; i++ {
				a := 2 * math.Pi * float64(i) / 12000
				b.feed(100*math.Cos(a), 100*math.Sin(a), z)
			}
		}
		return b.p
	}
	one, l1 := drawn(t, circle(1), Options{ToolWidth: 10})
	three, l3 := drawn(t, circle(3), Options{ToolWidth: 10})
	for _, deg := range []float64{10, 100, 200, 300} {
		a := deg * math.Pi / 180
		x, y := 103.5*math.Cos(a), 103.5*math.Sin(a)
		c1, c3 := rgbAt(one, l1, x, y), rgbAt(three, l3, x, y)
		if isWhite(c1) || math.Abs(luma(c1)-luma(c3)) > 2 {
			t.Errorf("band at %v°: one pass %v, three passes %v, want the same faint colour", deg, c1, c3)
		}
	}
}
