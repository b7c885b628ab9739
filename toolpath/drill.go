package toolpath

import (
	"github.com/focitools/foci/ellipse"
)

// DrillSpec describes a row of holes (router), marks (laser) or dots
// (plotter) at equal arc length along an ellipse or one of its parallel
// curves. Lengths are in one unit, whatever the caller uses. A field the
// machine does not use must be left at zero: it is refused, not ignored.
type DrillSpec struct {
	Setup
	// Ellipse is the ellipse the points are spaced along.
	Ellipse ellipse.Ellipse
	// Offset puts the points on the parallel curve at this signed
	// distance from the ellipse (+ outward); an inward offset must stay
	// below the minimum radius of curvature b²/a.
	Offset float64
	// Count is the number of points, at least 1. Point k is at arc length
	// k·L/Count from the curve's parameter 0 (the end of the ellipse's own
	// +x semi-axis), counter-clockwise, L the length of the curve.
	Count int
	// Clockwise visits the points clockwise from point 0 (0, Count−1,
	// Count−2, ...) instead of counter-clockwise.
	Clockwise bool

	// Depth is the router's hole depth below Z0 (greater than zero).
	Depth float64
	// Peck is the router's peck depth: each hole is fed down in equal
	// pecks no deeper than Peck (see [DepthPasses]), the tool retracting
	// to PeckRetract between pecks to clear the chips. Zero feeds each
	// hole to Depth in one move.
	Peck float64
	// PeckRetract is the height above Z0 the router retracts to between
	// pecks and comes down to before the first; zero means SafeZ. It must
	// be greater than zero and not above SafeZ.
	PeckRetract float64

	// MarkSeconds is how long the laser beam stays on at each mark
	// (greater than zero).
	MarkSeconds float64
}

// Drill appends the path of s to dst and returns it. On error dst is
// returned unchanged with an [*OpError] naming the field.
//
// Router: for each hole a Travel move at SafeZ to above it, a Travel move
// straight down to PeckRetract (if below SafeZ), then for each peck a Cut
// line straight down (Role [Hole], Feed = PlungeFeed) from the current
// height to the next peck depth and, between pecks, a Travel move straight
// up to PeckRetract; after the last peck a Travel move up to SafeZ (Role
// [Retract]). Feeding back down from PeckRetract keeps every rapid above
// Z0, at the cost of feeding through the part of the hole already cut.
//
// Laser: for each mark a Travel move to it and a Cut [Dwell] of
// MarkSeconds there (Role Hole), which the writer turns into beam on,
// pause, and beam off at the next travel.
//
// Plotter: for each dot a Travel move at PenUp, a Cut line down to
// PenDown (Role Hole) and a Travel line back up to PenUp.
func Drill(dst Path, s DrillSpec) (Path, error) {
	c, pecks, err := s.plan()
	if err != nil {
		return dst, err
	}
	d, err := ellipse.NewDivider(c, s.Count)
	if err != nil {
		return dst, &OpError{Field: "Count", Value: float64(s.Count), Err: err}
	}
	pts := make([]ellipse.DivisionPoint, 0, s.Count)
	for pt, ok := d.Next(); ok; pt, ok = d.Next() {
		pts = append(pts, pt)
	}
	for i := range pts {
		k := i
		if s.Clockwise && i > 0 {
			k = len(pts) - i
		}
		dst = s.Setup.mark(dst, pts[k].X, pts[k].Y, markSpec{depth: s.Depth, pecks: pecks, retract: s.PeckRetract, seconds: s.MarkSeconds})
	}
	return dst, nil
}

// plan validates s and returns the curve and the number of pecks.
func (s *DrillSpec) plan() (ellipse.Parallel, int, error) {
	if err := s.Setup.check(); err != nil {
		return ellipse.Parallel{}, 0, err
	}
	if !(s.Ellipse.SemiMajor() > 0) {
		return ellipse.Parallel{}, 0, opErr("Ellipse", 0, ErrNotPositive)
	}
	if s.Count < 1 || s.Count > MaxCount {
		return ellipse.Parallel{}, 0, opLimit("Count", float64(s.Count), boundFor(s.Count), countErr(s.Count))
	}
	c, err := s.Ellipse.Parallel(s.Offset)
	if err != nil {
		return ellipse.Parallel{}, 0, &OpError{Field: "Offset", Value: s.Offset, Err: err}
	}
	pecks, err := s.Setup.checkMark("Peck", s.Depth, s.Peck, s.PeckRetract, s.MarkSeconds)
	if err != nil {
		return ellipse.Parallel{}, 0, err
	}
	if float64(pecks)*float64(s.Count) > MaxSegments/3 {
		return ellipse.Parallel{}, 0, opLimit("Peck", s.Peck, s.Depth*float64(s.Count)*3/MaxSegments, ErrTooMany)
	}
	return c, pecks, nil
}

// boundFor returns the limit a count broke: 1 below, MaxCount above.
func boundFor(n int) float64 {
	if n < 1 {
		return 1
	}
	return MaxCount
}

// countErr returns the sentinel for a count out of range.
func countErr(n int) error {
	if n < 1 {
		return ErrCount
	}
	return ErrTooMany
}

// markSpec says how to make one hole, mark or dot.
type markSpec struct {
	depth   float64 // router hole depth
	pecks   int     // router: number of equal pecks
	retract float64 // router: height between pecks (0: SafeZ)
	seconds float64 // laser dwell
}

// checkMark validates the fields of a hole, mark or dot for the machine
// and returns the number of pecks (1 without pecking).
func (s *Setup) checkMark(peckField string, depth, peck, retract, seconds float64) (int, error) {
	if err := firstErr(checkNonNegative("Depth", depth), checkNonNegative(peckField, peck),
		checkNonNegative("PeckRetract", retract), checkNonNegative("MarkSeconds", seconds)); err != nil {
		return 0, err
	}
	switch s.Machine {
	case Router:
		if err := firstErr(checkPositive("Depth", depth), checkUnused("MarkSeconds", seconds)); err != nil {
			return 0, err
		}
		if retract > s.SafeZ {
			return 0, opLimit("PeckRetract", retract, s.SafeZ, ErrAboveSafe)
		}
		if peck == 0 {
			return 1, nil
		}
		n, _ := DepthPasses(depth, peck)
		if n > MaxCount {
			return 0, opLimit(peckField, peck, depth/MaxCount, ErrTooMany)
		}
		return n, nil
	case Laser:
		if err := firstErr(checkPositive("MarkSeconds", seconds), checkUnused("Depth", depth),
			checkUnused(peckField, peck), checkUnused("PeckRetract", retract)); err != nil {
			return 0, err
		}
		return 1, nil
	}
	return 1, firstErr(checkUnused("Depth", depth), checkUnused(peckField, peck),
		checkUnused("PeckRetract", retract), checkUnused("MarkSeconds", seconds))
}

// mark appends one hole, mark or dot at (x, y).
func (s *Setup) mark(dst Path, x, y float64, m markSpec) Path {
	switch s.Machine {
	case Router:
		dst = travelXY(dst, x, y, s.SafeZ)
		r := m.retract
		if r == 0 {
			r = s.SafeZ
		}
		if r < s.SafeZ {
			dst = travelZ(dst, r, Link)
		}
		for k := 1; k <= m.pecks; k++ {
			z := -m.depth
			if k < m.pecks {
				z = -m.depth * float64(k) / float64(m.pecks)
			}
			if k > 1 {
				dst = travelZ(dst, r, Retract)
			}
			at := dst[len(dst)-1].End
			dst = append(dst, Segment{Kind: Line, Motion: Cut, Role: Hole, Start: at, End: Point{x, y, z}, Feed: s.PlungeFeed})
		}
		return travelZ(dst, s.SafeZ, Retract)
	case Laser:
		dst = travelXY(dst, x, y, s.FocusZ)
		at := Point{x, y, s.FocusZ}
		return append(dst, Segment{Kind: Dwell, Motion: Cut, Role: Hole, Start: at, End: at, Seconds: m.seconds})
	}
	dst = travelXY(dst, x, y, s.PenUp)
	dst = append(dst, Segment{Kind: Line, Motion: Cut, Role: Hole, Start: Point{x, y, s.PenUp}, End: Point{x, y, s.PenDown}, Feed: s.PlungeFeed})
	return travelZ(dst, s.PenUp, Retract)
}
