package preview

import (
	"math"
	"sort"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
	"github.com/fogleman/gg"
)

// drawTabs draws the tab stretches hollow: a wide black line with a white
// core, read as "the cut does not go through here".
func (pic *picture) drawTabs() {
	if !pic.an.hasTab {
		return
	}
	pl := pic.collect(func(i int) bool { return pic.an.classes[i] == plan.Tab })
	u := pic.lay.unit
	pic.dc.SetColor(inkColor)
	pic.strokeLayer(pl, 9*u)
	pic.dc.SetColor(paperColor)
	pic.strokeLayer(pl, 4.5*u)
}

// drawHoleMark draws a circled cross centred at pixel (x, y).
func drawHoleMark(dc *gg.Context, x, y, u float64) {
	r := 6.5 * u
	dc.SetColor(paperColor)
	dc.DrawCircle(x, y, r)
	dc.Fill()
	dc.SetColor(inkColor)
	dc.SetLineWidth(1.8 * u)
	dc.DrawCircle(x, y, r)
	dc.Stroke()
	dc.DrawLine(x-r*1.5, y, x+r*1.5, y)
	dc.Stroke()
	dc.DrawLine(x, y-r*1.5, x, y+r*1.5)
	dc.Stroke()
}

// drawHoles marks every hole or mark position.
func (pic *picture) drawHoles() {
	for _, h := range pic.an.holes {
		x, y := pic.lay.px(h.X, h.Y)
		drawHoleMark(pic.dc, x, y, pic.lay.unit)
	}
}

// drawStartMark draws the ringed dot that marks where cutting starts.
func drawStartMark(dc *gg.Context, x, y, u float64) {
	dc.SetColor(inkColor)
	dc.DrawCircle(x, y, 8*u)
	dc.Fill()
	dc.SetColor(markColor)
	dc.DrawCircle(x, y, 5.5*u)
	dc.Fill()
}

// drawArrow draws a filled arrowhead centred at pixel (x, y) pointing
// along the unit pixel direction (dx, dy).
func drawArrow(dc *gg.Context, x, y, dx, dy, u float64) {
	l, w := 19*u, 13*u
	nx, ny := -dy, dx
	tx, ty := x+dx*l/2, y+dy*l/2
	bx, by := x-dx*l/2, y-dy*l/2
	dc.MoveTo(tx, ty)
	dc.LineTo(bx+nx*w/2, by+ny*w/2)
	dc.LineTo(bx-nx*w/2, by-ny*w/2)
	dc.ClosePath()
	dc.SetColor(markColor)
	dc.FillPreserve()
	dc.SetColor(inkColor)
	dc.SetLineWidth(1.4 * u)
	dc.Stroke()
}

// planLength returns the length of s in the XY plane.
func planLength(s *toolpath.Segment) float64 {
	switch s.Kind {
	case toolpath.Line:
		return math.Hypot(s.End.X-s.Start.X, s.End.Y-s.Start.Y)
	case toolpath.Arc:
		return math.Abs(s.Sweep()) * s.Radius
	}
	return 0
}

// arrowSpacing is the distance between direction arrows on the first loop
// in design units.
const arrowSpacing = 170

// drawDirection marks the start of the first cut, puts arrows at equal
// plan length along the first cut loop and two arrows on every later
// closed loop (an inside contour may run the other way), leaving out
// those that repeat an arrow of an earlier pass.
func (pic *picture) drawDirection() {
	an := pic.an
	if !an.hasStart {
		return
	}
	u := pic.lay.unit
	tabs := pic.tabPoints()
	var drawn []arrowMark
	var w loopWalk
	for k, lp := range an.loops {
		w.reset(pic, lp)
		pxLen := w.total * pic.lay.scale
		n := 2
		if k == 0 {
			n = max(2, min(int(math.Round(pxLen/(arrowSpacing*u))), 14))
		}
		if pxLen < 60*u {
			if k > 0 {
				continue
			}
			n = 1
		}
		drawn = pic.arrowsAlong(&w, n, tabs, drawn, k > 0)
	}
	x, y := pic.lay.px(an.start.X, an.start.Y)
	drawStartMark(pic.dc, x, y, u)
}

// loopWalk finds points by plan length along one cut loop.
type loopWalk struct {
	pic   *picture
	segs  []int     // the cutting segments of the loop
	cum   []float64 // plan length at the end of each
	total float64
}

// reset prepares w for loop lp, reusing its buffers.
func (w *loopWalk) reset(pic *picture, lp span) {
	w.pic, w.segs, w.cum, w.total = pic, w.segs[:0], w.cum[:0], 0
	for i := lp.from; i < lp.to; i++ {
		if pic.an.classes[i].Cuts() {
			w.total += planLength(&pic.path[i])
			w.segs = append(w.segs, i)
			w.cum = append(w.cum, w.total)
		}
	}
}

// at returns the pixel position at plan length d (held within the loop)
// and the index of the segment there.
func (w *loopWalk) at(d float64) (x, y float64, seg int) {
	d = math.Max(0, math.Min(d, w.total))
	j := sort.SearchFloat64s(w.cum, d)
	j = min(j, len(w.segs)-1)
	s := &w.pic.path[w.segs[j]]
	l := planLength(s)
	start := w.cum[j] - l
	f := 0.0
	if l > 0 {
		f = math.Max(0, math.Min(1, (d-start)/l))
	}
	q := s.At(f)
	x, y = w.pic.lay.px(q.X, q.Y)
	return x, y, w.segs[j]
}

// arrowMark is an arrow drawn: its pixel position and direction.
type arrowMark struct{ x, y, dx, dy float64 }

// repeats reports whether an arrow at (x, y) pointing along (dx, dy)
// would repeat one of drawn: pointing the same way within half the arrow
// spacing, as on a later pass over the same line.
func repeats(drawn []arrowMark, x, y, dx, dy, u float64) bool {
	r := arrowSpacing / 2 * u
	for _, a := range drawn {
		if (a.x-x)*(a.x-x)+(a.y-y)*(a.y-y) < r*r && a.dx*dx+a.dy*dy > 0.7 {
			return true
		}
	}
	return false
}

// arrowsAlong draws n arrows at the middles of n equal parts of the loop,
// each moved on along the loop where it would cover a tab mark. An arrow
// points along the chord between the points 8 design units before and
// after it, so that it shows the direction of the cut, not of a segment
// smaller than the arrow. With sparse, an arrow that repeats one already
// drawn is left out. It returns drawn with the new arrows added.
func (pic *picture) arrowsAlong(w *loopWalk, n int, tabs []plan.Point, drawn []arrowMark, sparse bool) []arrowMark {
	u := pic.lay.unit
	if len(w.segs) == 0 || w.total <= 0 {
		return drawn
	}
	step := 6 * u / pic.lay.scale
	half := 8 * u / pic.lay.scale
	for k := 0; k < n; k++ {
		base := w.total * (float64(k) + 0.5) / float64(n)
		for shift := 0.0; shift < w.total/float64(2*n); shift += step {
			d := base + shift
			x, y, i := w.at(d)
			if pic.an.classes[i] == plan.Tab || nearAny(tabs, x, y, 20*u) {
				continue
			}
			x0, y0, _ := w.at(d - half)
			x1, y1, _ := w.at(d + half)
			dx, dy := x1-x0, y1-y0
			l := math.Hypot(dx, dy)
			if l == 0 {
				break
			}
			dx, dy = dx/l, dy/l
			if !sparse || !repeats(drawn, x, y, dx, dy, u) {
				drawArrow(pic.dc, x, y, dx, dy, u)
				drawn = append(drawn, arrowMark{x, y, dx, dy})
			}
			break
		}
	}
	return drawn
}

// tabPoints returns pixel points along the tab stretches, about every
// 8 design units, so that arrows can keep clear of them.
func (pic *picture) tabPoints() []plan.Point {
	if !pic.an.hasTab {
		return nil
	}
	var pts []plan.Point
	step := 8 * pic.lay.unit
	for i := range pic.path {
		if pic.an.classes[i] != plan.Tab || len(pts) > 20000 {
			continue
		}
		s := &pic.path[i]
		n := int(math.Min(planLength(s)*pic.lay.scale/step, 1000)) + 1
		for k := 0; k <= n; k++ {
			q := s.At(float64(k) / float64(n))
			x, y := pic.lay.px(q.X, q.Y)
			pts = append(pts, plan.Point{X: x, Y: y})
		}
	}
	return pts
}

// nearAny reports whether (x, y) lies within r of one of pts.
func nearAny(pts []plan.Point, x, y, r float64) bool {
	for _, q := range pts {
		if (q.X-x)*(q.X-x)+(q.Y-y)*(q.Y-y) < r*r {
			return true
		}
	}
	return false
}
