package gcodeout

import (
	"math"

	"github.com/focitools/foci/toolpath"
)

// arcPlan is an arc ready to write: its end and centre in grid units, or
// the decision to write it as a straight move.
type arcPlan struct {
	t      target
	cx, cy int64
	line   bool // write as a straight move to t (or nothing if t does not move)
}

func (w *Writer) arc(i int, s *toolpath.Segment) error {
	if err := w.checkStart(i, s); err != nil {
		return err
	}
	if !w.xyKnown {
		return &SegmentError{Index: i, Field: "Start.X", Value: s.Start.X, Err: ErrArcUnknownStart}
	}
	p, split, err := w.planArc(i, s, w.x, w.y, w.z)
	if err != nil {
		return err
	}
	if !split {
		return w.emitArc(i, s, &p)
	}
	// Nearly a full circle, with ends so close that rounding makes them
	// cross: written as two half arcs of the same circle, split at the
	// middle, so that no turn is lost. Both halves are planned before
	// either is written.
	first, second := *s, *s
	first.End = s.At(0.5)
	second.Start = first.End
	p1, _, err := w.planArc(i, &first, w.x, w.y, w.z)
	if err != nil {
		return err
	}
	p2, _, err := w.planArc(i, &second, p1.t.x, p1.t.y, p1.t.z)
	if err != nil {
		return err
	}
	if err := w.emitArc(i, &first, &p1); err != nil {
		return err
	}
	return w.emitArc(i, &second, &p2)
}

// planArc plans arc s from grid point (sx, sy, sz). It reports split when
// the arc turns more than half a circle but its rounded ends cross, so
// that it must be written in two parts. An arc of at most half a turn that
// rounding would collapse (ends on one grid point) or turn inside out
// (printed sweep off by more than a quarter turn: its length is then a few
// units in the last place) is planned as a straight move.
func (w *Writer) planArc(i int, s *toolpath.Segment, sx, sy, sz int64) (p arcPlan, split bool, err error) {
	t := &p.t
	if t.x, err = w.coord(i, "X", s.End.X); err != nil {
		return p, false, err
	}
	if t.y, err = w.coord(i, "Y", s.End.Y); err != nil {
		return p, false, err
	}
	t.moveXY = t.x != sx || t.y != sy
	if w.cfg.Machine != Laser {
		if t.z, err = w.coord(i, "Z", s.End.Z); err != nil {
			return p, false, err
		}
		t.moveZ = t.z != sz
	}
	sweep := math.Abs(s.Sweep())
	if !t.moveXY && sweep <= math.Pi {
		p.line = true
		return p, false, nil
	}
	cx, err := w.coord(i, "CenterX", s.CenterX)
	if err != nil {
		return p, false, err
	}
	cy, err := w.coord(i, "CenterY", s.CenterY)
	if err != nil {
		return p, false, err
	}
	cx, cy, ok := arcCenter(sx, sy, t.x, t.y, cx, cy, w.limit)
	if !ok {
		return p, false, &SegmentError{Index: i, Field: "Radius", Value: s.Radius, Err: ErrArcRadius}
	}
	if t.moveXY && math.Abs(printedSweep(sx, sy, t.x, t.y, cx, cy, s.Clockwise)-sweep) > math.Pi/2 {
		if sweep <= math.Pi {
			p.line = true
			return p, false, nil
		}
		return p, true, nil
	}
	p.cx, p.cy = cx, cy
	return p, false, nil
}

// emitArc writes a planned arc (or its straight move).
func (w *Writer) emitArc(i int, s *toolpath.Segment, p *arcPlan) error {
	if p.line {
		return w.move(i, s, &p.t)
	}
	// A travel arc is unusual but legal: G0 has no arc form, so it is
	// written as a feed move like a cut (for a laser, with the beam off).
	feed, err := w.feedFor(i, s, &p.t)
	if err != nil {
		return err
	}
	w.engage(s.Motion)
	b := w.buf
	if s.Clockwise {
		b = append(b, "G2"...)
	} else {
		b = append(b, "G3"...)
	}
	p.t.moveXY = true // a full circle repeats X Y
	b = w.appendAxes(b, &p.t)
	b = append(b, " I"...)
	b = appendFixed(b, p.cx-w.x, w.dec)
	b = append(b, " J"...)
	b = appendFixed(b, p.cy-w.y, w.dec)
	b = w.appendFeed(b, feed)
	w.buf = append(b, '\n')
	w.moved(s, &p.t)
	return nil
}

// printedSweep returns the angle, in (0, 2π], that the arc from grid
// point (sx, sy) to (ex, ey) about (cx, cy) turns through in its
// direction, as a reader of the text computes it. The conversions keep
// the products unfused (see radiusMismatch).
func printedSweep(sx, sy, ex, ey, cx, cy int64, clockwise bool) float64 {
	ax, ay := float64(sx-cx), float64(sy-cy)
	bx, by := float64(ex-cx), float64(ey-cy)
	cross := float64(ax*by) - float64(ay*bx)
	dot := float64(ax*bx) + float64(ay*by)
	a := math.Atan2(cross, dot)
	if clockwise {
		a = -a
	}
	if a <= 0 {
		a += 2 * math.Pi
	}
	return a
}

// arcCenter chooses the grid centre to write for an arc from grid point
// (sx, sy) to (ex, ey) whose rounded true centre is (cx, cy). It keeps
// (cx, cy) when the start and end radii agree within three quarters of the
// limit (limit is in grid units); otherwise it takes, among the nine grid
// points within one unit of it, the one where they agree best. It reports
// false when the radius is zero or no candidate agrees within the limit.
//
// Rounding the ends alone can make the radii differ by up to √2 units
// whatever the sweep, so the threshold of ¾ of the limit (1.5 units at 3
// mm decimals) leaves the centre alone unless its own rounding matters,
// which needs a large sweep; at 4 or more mm decimals, and in inches at 5
// or more, the limit is 20 units or more and the centre is never moved.
//
// Worst case without the search: start, end and centre each off by half a
// unit in X and Y make the radii differ by up to 2√2 units, more than the
// 2 units the limit allows at 3 mm decimals. The radius difference changes
// by |u_e − u_s| = 2·sin(sweep/2) ≤ 2 units per unit the centre moves, so
// (to first order in unit/radius) one of the nine candidates always
// brings it within √2 units.
func arcCenter(sx, sy, ex, ey, cx, cy int64, limit float64) (int64, int64, bool) {
	best := radiusMismatch(sx, sy, ex, ey, cx, cy)
	bx, by := cx, cy
	if !(best <= 0.75*limit) {
		for dy := int64(-1); dy <= 1; dy++ {
			for dx := int64(-1); dx <= 1; dx++ {
				if m := radiusMismatch(sx, sy, ex, ey, cx+dx, cy+dy); m < best {
					best, bx, by = m, cx+dx, cy+dy
				}
			}
		}
	}
	if (bx == sx && by == sy) || (bx == ex && by == ey) || !(best <= limit) {
		return 0, 0, false
	}
	return bx, by, true
}

// radiusMismatch returns |‖s−c‖ − ‖e−c‖| in grid units. The explicit
// float64 conversions keep the sums of squares from being fused into
// multiply-adds, so the choice of centre, and the output, is the same on
// every architecture.
func radiusMismatch(sx, sy, ex, ey, cx, cy int64) float64 {
	return math.Abs(gridDistance(sx-cx, sy-cy) - gridDistance(ex-cx, ey-cy))
}

func gridDistance(dx, dy int64) float64 {
	x, y := float64(dx), float64(dy)
	return math.Sqrt(float64(x*x) + float64(y*y))
}
