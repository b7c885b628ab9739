package preview

import (
	"math"
	"strconv"
)

// layout maps path coordinates to pixels: equal scale on both axes, y up
// in the path and down in the picture, the drawing centred in the area
// left free by the margins, the title strip and the legend strip.
type layout struct {
	width, height int
	unit          float64 // size of one design unit in pixels (fonts, strokes)
	// drawing area in pixels
	areaX0, areaY0, areaX1, areaY1 float64
	// scale in pixels per path unit, and the pixel position of path (0, 0)
	scale  float64
	ox, oy float64
	// the path box that is drawn
	minX, minY, maxX, maxY float64
}

// pixelLimit bounds pixel coordinates handed to the rasterizer, whose
// fixed-point numbers would overflow far outside the picture.
const pixelLimit = 1e5

// px returns the pixel position of path point (x, y), held within
// ±pixelLimit.
func (l *layout) px(x, y float64) (float64, float64) {
	return clampPixel(l.ox + x*l.scale), clampPixel(l.oy - y*l.scale)
}

func clampPixel(v float64) float64 {
	if v > pixelLimit {
		return pixelLimit
	}
	if v < -pixelLimit {
		return -pixelLimit
	}
	return v
}

// designUnit returns the size of one design unit in pixels for a picture
// of w × h: 1 at 1600 × 1000, never below 0.7 so that text stays legible.
func designUnit(w, h int) float64 {
	u := math.Min(float64(w)/1600, float64(h)/1000)
	return math.Max(0.7, math.Min(u, 4))
}

// newLayout fits the box (minX, minY)–(maxX, maxY) into a w × h picture
// with top and bottom strips of the given heights.
func newLayout(w, h int, top, bottom float64, minX, minY, maxX, maxY float64) *layout {
	l := &layout{width: w, height: h, unit: designUnit(w, h)}
	m := 28 * l.unit
	l.areaX0, l.areaX1 = m, float64(w)-m
	l.areaY0, l.areaY1 = top+m*0.6, float64(h)-bottom-m*0.6
	if l.areaY1-l.areaY0 < 20 {
		l.areaY1 = l.areaY0 + 20
	}
	// A point, a vertical or a horizontal line still gets a frame.
	span := math.Max(maxX-minX, maxY-minY)
	if span == 0 || math.IsInf(span, 0) || math.IsNaN(span) {
		span = 1
	}
	pad := span * 1e-3
	if maxX-minX < pad {
		c := (minX + maxX) / 2
		minX, maxX = c-pad, c+pad
	}
	if maxY-minY < pad {
		c := (minY + maxY) / 2
		minY, maxY = c-pad, c+pad
	}
	l.minX, l.minY, l.maxX, l.maxY = minX, minY, maxX, maxY
	aw, ah := l.areaX1-l.areaX0, l.areaY1-l.areaY0
	l.scale = math.Min(aw/(maxX-minX), ah/(maxY-minY))
	cx, cy := (l.areaX0+l.areaX1)/2, (l.areaY0+l.areaY1)/2
	l.ox = cx - (minX+maxX)/2*l.scale
	l.oy = cy + (minY+maxY)/2*l.scale
	return l
}

// frameBox returns the box the picture must show: the whole path (travel
// included) and the intended shapes.
func frameBox(an *analysis, r *resolved) (minX, minY, maxX, maxY float64) {
	minX, minY, maxX, maxY = an.minX, an.minY, an.maxX, an.maxY
	for _, c := range r.intended {
		const n = 256
		for k := 0; k < n; k++ {
			q := c.PointAt(2 * math.Pi * float64(k) / n)
			minX, maxX = math.Min(minX, q.X), math.Max(maxX, q.X)
			minY, maxY = math.Min(minY, q.Y), math.Max(maxY, q.Y)
		}
	}
	// The tool band reaches half the tool width beyond the path.
	h := r.toolWidth / 2
	return minX - h, minY - h, maxX + h, maxY + h
}

// roundLength returns the largest length of the form 1, 2 or 5 × 10^k not
// above v (v > 0).
func roundLength(v float64) float64 {
	if !(v > 0) || math.IsInf(v, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(v)))
	for _, m := range [...]float64{5, 2, 1} {
		if m*p <= v*(1+1e-12) {
			return m * p
		}
	}
	return p
}

// formatLength formats a length for a label with about four significant
// digits relative to ref (the size of the drawing), without a trailing
// ".0" run.
func formatLength(v, ref float64) string {
	dec := 0
	if ref > 0 {
		dec = 3 - int(math.Floor(math.Log10(ref)))
	}
	dec = max(0, min(dec, 6))
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if dec > 0 {
		for s[len(s)-1] == '0' {
			s = s[:len(s)-1]
		}
		if s[len(s)-1] == '.' {
			s = s[:len(s)-1]
		}
	}
	if s == "-0" {
		s = "0"
	}
	return s
}
