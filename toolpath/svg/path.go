package svg

import (
	"bufio"
	"math"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
)

// group writes one <g> with the segments whose class satisfies keep, as
// <path> elements: one per unbroken chain, a new one where the chain
// breaks or changes between tab and plain cut. An empty group is still
// written, so that importers find every id.
func (d *drawing) group(w *bufio.Writer, id, colour string, width float64, dashed bool, keep func(plan.Class) bool) {
	d.buf = append(d.buf, `<g id="`...)
	d.buf = append(d.buf, id...)
	d.buf = append(d.buf, `" fill="none" stroke="`...)
	d.buf = append(d.buf, colour...)
	d.buf = append(d.buf, `" stroke-width="`...)
	d.num(width)
	d.buf = append(d.buf, `" stroke-linecap="round" stroke-linejoin="round"`...)
	if dashed {
		d.buf = append(d.buf, ` stroke-dasharray="`...)
		d.num(2 * d.s.mm)
		d.buf = append(d.buf, ' ')
		d.num(1.5 * d.s.mm)
		d.buf = append(d.buf, '"')
	}
	d.buf = append(d.buf, ">\n"...)
	open, openTab := false, false
	var lx, ly float64 // last point written, rounded
	for i := range d.p {
		c := d.classes[i]
		if !keep(c) {
			continue
		}
		seg := &d.p[i]
		sx, sy := d.round(seg.Start.X), d.round(seg.Start.Y)
		if d.zeroLength(seg, sx, sy) {
			continue
		}
		tab := c == plan.Tab
		if !open || tab != openTab || sx != lx || sy != ly {
			if open {
				d.buf = append(d.buf, "\"/>\n"...)
			}
			d.buf = append(d.buf, "<path "...)
			if tab {
				d.buf = append(d.buf, `class="tab" `...)
			}
			d.buf = append(d.buf, `d="M `...)
			d.point(sx, sy)
			open, openTab = true, tab
		}
		lx, ly = d.segment(seg)
		d.flushTo(w, false)
	}
	if open {
		d.buf = append(d.buf, "\"/>\n"...)
	}
	d.buf = append(d.buf, "</g>\n"...)
}

// zeroLength reports whether seg draws nothing once rounded: a line whose
// ends round to one point, or an arc shorter than the last decimal.
func (d *drawing) zeroLength(seg *toolpath.Segment, sx, sy float64) bool {
	if seg.Kind == toolpath.Arc {
		return math.Abs(seg.Sweep())*seg.Radius < 1/d.scale || d.round(seg.Radius) == 0
	}
	return d.round(seg.End.X) == sx && d.round(seg.End.Y) == sy
}

// segment appends the commands of one line or arc and returns the
// rounded end written.
func (d *drawing) segment(seg *toolpath.Segment) (float64, float64) {
	ex, ey := d.round(seg.End.X), d.round(seg.End.Y)
	if seg.Kind != toolpath.Arc {
		d.buf = append(d.buf, "\nL "...)
		d.point(ex, ey)
		return ex, ey
	}
	sweep := seg.Sweep()
	// Pieces of at most a quarter turn (see the package doc): the centre
	// of an arc given by its ends and radius is well placed then.
	n := int(math.Ceil(math.Abs(sweep)/(math.Pi/2) - 1e-9))
	a0 := math.Atan2(seg.Start.Y-seg.CenterY, seg.Start.X-seg.CenterX)
	for k := 1; k < n; k++ {
		a := a0 + sweep*float64(k)/float64(n)
		mx := d.round(seg.CenterX + seg.Radius*math.Cos(a))
		my := d.round(seg.CenterY + seg.Radius*math.Sin(a))
		d.arc(seg.Radius, sweep > 0, mx, my)
	}
	d.arc(seg.Radius, sweep > 0, ex, ey)
	return ex, ey
}

// arc appends an A command of radius r to (x, y) in path coordinates. A
// counter-clockwise turn in the path stays counter-clockwise on screen
// after y is negated, which SVG calls the negative-angle direction:
// sweep-flag 0.
func (d *drawing) arc(r float64, ccw bool, x, y float64) {
	d.buf = append(d.buf, "\nA "...)
	d.num(r)
	d.buf = append(d.buf, ' ')
	d.num(r)
	if ccw {
		d.buf = append(d.buf, " 0 0 0 "...)
	} else {
		d.buf = append(d.buf, " 0 0 1 "...)
	}
	d.point(x, y)
}

// marks writes the holes and marks as circles.
func (d *drawing) marks() {
	d.buf = append(d.buf, `<g id="marks" fill="none" stroke="#000000" stroke-width="`...)
	d.num(d.s.thinW)
	d.buf = append(d.buf, "\">\n"...)
	for _, h := range d.holes {
		d.buf = append(d.buf, `<circle cx="`...)
		d.num(h.X)
		d.buf = append(d.buf, `" cy="`...)
		d.num(-h.Y)
		d.buf = append(d.buf, `" r="`...)
		d.num(d.s.holeR)
		d.buf = append(d.buf, "\"/>\n"...)
	}
	d.buf = append(d.buf, "</g>\n"...)
}
