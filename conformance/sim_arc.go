package conformance

import (
	"math"

	"github.com/focitools/foci/toolpath"
)

// Arc radius tolerances of RS274NGC: the start and end radius of a centre
// form arc may differ by at most 0.002 mm or 0.0002 in (NISTIR 6556
// §3.5.3). The same margin is allowed for a radius-form arc whose R is a
// little short of half its chord.
const (
	arcToleranceMM   = 0.002
	arcToleranceInch = 0.0002
)

// arcTolerance returns the radius tolerance for a line written in the
// unit written, expressed in the unit of the path.
func arcTolerance(written, path Units) float64 {
	if written == Inches {
		return arcToleranceInch * unitFactor(Inches, path)
	}
	return arcToleranceMM * unitFactor(Millimeters, path)
}

// arc builds the G2 or G3 segment from start to end, recording an
// arc-invalid problem and returning false when the words make no arc.
func (s *simulator) arc(start, end toolpath.Point, cw bool) (toolpath.Segment, bool) {
	b := &s.blk
	seg := toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: start, End: end, Clockwise: cw}
	hasIJ := b.has&(bitI|bitJ) != 0
	hasR := b.has&bitR != 0
	switch {
	case hasIJ && hasR:
		s.problem(RuleArcInvalid, "an arc has both R and I or J; give one form")
		return seg, false
	case !hasIJ && !hasR:
		s.problem(RuleArcInvalid, "an arc needs I and J (centre form) or R (radius form)")
		return seg, false
	case hasIJ:
		// I and J are offsets from the start in both distance modes
		// (NISTIR 6556 §3.5.3.2).
		seg.CenterX = start.X + b.val['I'-'A']*s.scale
		seg.CenterY = start.Y + b.val['J'-'A']*s.scale
		seg.Radius = math.Hypot(start.X-seg.CenterX, start.Y-seg.CenterY)
		if !(seg.Radius > 0) {
			s.problem(RuleArcInvalid, "an arc has radius zero: I and J put the centre on the start point")
			return seg, false
		}
		return seg, true
	}
	r := b.val['R'-'A'] * s.scale
	if r == 0 {
		s.problem(RuleArcInvalid, "R 0 makes no arc")
		return seg, false
	}
	dx, dy := end.X-start.X, end.Y-start.Y
	d := math.Hypot(dx, dy)
	if d == 0 {
		s.problem(RuleArcInvalid, "a radius-form arc cannot end where it starts: the centre is undefined (use I and J for a full circle)")
		return seg, false
	}
	half := d / 2
	h2 := (math.Abs(r) - half) * (math.Abs(r) + half)
	if h2 < 0 {
		if half-math.Abs(r) > arcTolerance(s.written, s.p.Units) {
			s.problem(RuleArcInvalid, "R "+msgNum(math.Abs(r))+" is less than half the chord "+msgNum(half)+": no circle of that radius joins the two points")
			return seg, false
		}
		h2 = 0
	}
	h := math.Sqrt(h2)
	// The centre lies on the chord's left for a counter-clockwise arc of at
	// most half a turn (R > 0), on its right for more than half a turn
	// (R < 0), and the other way round for a clockwise arc
	// (NISTIR 6556 §3.5.3.1).
	nx, ny := -dy/d, dx/d
	side := 1.0
	if cw != (r < 0) {
		side = -1
	}
	seg.CenterX = start.X + dx/2 + side*h*nx
	seg.CenterY = start.Y + dy/2 + side*h*ny
	seg.Radius = math.Hypot(start.X-seg.CenterX, start.Y-seg.CenterY)
	return seg, true
}
