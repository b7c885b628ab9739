package gcodeout

import (
	"math"

	"github.com/focitools/foci/toolpath"
)

func (w *Writer) arc(i int, s *toolpath.Segment) error {
	if err := w.checkStart(i, s); err != nil {
		return err
	}
	if !w.xyKnown {
		return &SegmentError{Index: i, Field: "Start.X", Value: s.Start.X, Err: ErrArcUnknownStart}
	}
	t, err := w.end(i, s)
	if err != nil {
		return err
	}
	cx, err := w.coord(i, "CenterX", s.CenterX)
	if err != nil {
		return err
	}
	cy, err := w.coord(i, "CenterY", s.CenterY)
	if err != nil {
		return err
	}
	if !t.moveXY && math.Abs(s.Sweep()) <= math.Pi {
		// A short arc whose ends round to one point: only Z can move.
		return w.move(i, s, &t)
	}
	cx, cy, ok := arcCenter(w.x, w.y, t.x, t.y, cx, cy, w.limit)
	if !ok {
		return &SegmentError{Index: i, Field: "Radius", Value: s.Radius, Err: ErrArcRadius}
	}
	// A travel arc is unusual but legal: G0 has no arc form, so it is
	// written as a feed move like a cut (for a laser, with the beam off).
	feed, err := w.feedFor(i, s, &t)
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
	t.moveXY = true // a full circle repeats X Y
	b = w.appendAxes(b, &t)
	b = append(b, " I"...)
	b = appendFixed(b, cx-w.x, w.dec)
	b = append(b, " J"...)
	b = appendFixed(b, cy-w.y, w.dec)
	b = w.appendFeed(b, feed)
	w.buf = append(b, '\n')
	w.moved(s, &t)
	return nil
}

// arcCenter chooses the grid centre to write for an arc from grid point
// (sx, sy) to (ex, ey) whose rounded true centre is (cx, cy). It keeps
// (cx, cy) when the start and end radii agree within half the limit
// (limit is in grid units); otherwise it takes, among the nine grid points
// within one unit of it, the one where they agree best. It reports false
// when the radius is zero or no candidate agrees within the limit.
//
// Worst case without the search: start, end and centre each off by half a
// unit in X and Y make the radii differ by up to 2√2 units, more than the
// 2 units the limit allows at 3 mm decimals. The radius difference changes
// by |u_e − u_s| = 2·sin(sweep/2) ≤ 2 units per unit the centre moves, so
// one of the nine candidates always brings it within √2 units.
func arcCenter(sx, sy, ex, ey, cx, cy int64, limit float64) (int64, int64, bool) {
	best := radiusMismatch(sx, sy, ex, ey, cx, cy)
	bx, by := cx, cy
	if !(best <= limit/2) {
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
