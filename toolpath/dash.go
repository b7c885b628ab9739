package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// DashSpec describes a dashed or dotted outline along an ellipse or one of
// its parallel curves. Lengths are in one unit, whatever the caller uses.
// A field the machine does not use must be left at zero: it is refused,
// not ignored.
type DashSpec struct {
	Setup
	// Ellipse is the ellipse the pattern runs along.
	Ellipse ellipse.Ellipse
	// Offset puts the pattern on the parallel curve at this signed
	// distance from the ellipse (+ outward); an inward offset must stay
	// below the minimum radius of curvature b²/a.
	Offset float64
	// On and Off are the lengths of a dash and of the gap after it,
	// measured along the curve, before they are scaled to close evenly
	// (see [DashPattern]). Off must be greater than zero; On = 0 asks for
	// dots: a mark (see [Drill]) at the start of every period; otherwise
	// On must be at least Tol.
	On, Off float64
	// Clockwise runs the pattern clockwise: the same dashes, visited in
	// the other order and each cut from its other end.
	Clockwise bool

	// Depth is the router's depth of each dash, or of each dot's hole,
	// below Z0 (greater than zero); a dash is cut in one pass.
	Depth float64
	// MarkSeconds is the laser's dwell at each dot (greater than zero for
	// laser dots, unset otherwise).
	MarkSeconds float64
}

// DashPattern returns how a pattern of dashes on and gaps off fits a
// closed curve of the given length: n = round(length/(on + off)) whole
// periods, at least 1, and the dash and gap scaled by the same factor
// length/(n·(on + off)) so that the n periods fill the length exactly and
// the pattern closes evenly (the last gap is as long as the others). For
// n ≥ 2 the scale lies in [1 − 1/(2n), 1 + 1/(2n)); a period longer than
// two thirds of the curve gives n = 1, the scale being length/(on + off).
// Arguments must be finite, length and off greater than zero, on at least
// zero; a count above [MaxCount] is returned as it is and refused by
// [Dash].
func DashPattern(length, on, off float64) (n int, dash, gap float64) {
	period := on + off
	q := math.Round(length / period)
	if !(q <= MaxCount) {
		return MaxCount + 1, on, off
	}
	n = max(1, int(q))
	k := length / (float64(n) * period)
	return n, on * k, off * k
}

// Dash appends the path of s to dst and returns it. On error dst is
// returned unchanged with an [*OpError] naming the field, or the
// [*SpecError] of the approximation.
//
// Dash k covers the arc length [k·P, k·P + dash] of the curve from its
// parameter 0 (P = dash + gap after scaling, see [DashPattern]), found
// with the curve's equal arc-length division and its inverse arc length,
// and is cut as the approximation of that open arc within the [Band] of
// Tol about the curve. Before each dash: a Travel move to its start at
// the travel height (SafeZ, PenUp, or FocusZ for a laser, where the writer
// switches the beam off for it), then for a router a Cut line down to
// −Depth (Role [Plunge]) and for a plotter one down to PenDown. After
// each dash the router and the plotter rise straight up to the travel
// height by a Travel line (Role [Retract]).
func Dash(dst Path, s DashSpec) (Path, error) {
	if err := s.Setup.check(); err != nil {
		return dst, err
	}
	if !(s.Ellipse.SemiMajor() > 0) {
		return dst, opErr("Ellipse", 0, ErrNotPositive)
	}
	if err := firstErr(checkNonNegative("On", s.On), checkPositive("Off", s.Off)); err != nil {
		return dst, err
	}
	c, err := s.Ellipse.Parallel(s.Offset)
	if err != nil {
		return dst, &OpError{Field: "Offset", Value: s.Offset, Err: err}
	}
	// The band reaches Tol inside the curve, which must not pass the fold
	// of the inward parallel curves.
	if lim := s.Ellipse.MinRadiusOfCurvature(); !(s.Tol-s.Offset < lim) {
		return dst, opLimit("Offset", s.Offset, s.Tol-lim, ErrOffset)
	}
	n, on, _ := DashPattern(c.Length(), s.On, s.Off)
	if n > MaxCount {
		return dst, opLimit("Off", s.Off, c.Length()/MaxCount, ErrTooMany)
	}
	if s.On > 0 && s.On < s.Tol {
		return dst, opLimit("On", s.On, s.Tol, ErrDashTooShort)
	}
	if s.On == 0 {
		if _, err := s.Setup.checkMark("Peck", s.Depth, 0, 0, s.MarkSeconds); err != nil {
			return dst, err
		}
		return Drill(dst, DrillSpec{Setup: s.Setup, Ellipse: s.Ellipse, Offset: s.Offset, Count: n,
			Clockwise: s.Clockwise, Depth: s.Depth, MarkSeconds: s.MarkSeconds})
	}
	switch s.Machine {
	case Router:
		err = firstErr(checkPositive("Depth", s.Depth), checkUnused("MarkSeconds", s.MarkSeconds))
	default:
		err = firstErr(checkUnused("Depth", s.Depth), checkUnused("MarkSeconds", s.MarkSeconds))
	}
	if err != nil {
		return dst, err
	}
	d, err := ellipse.NewDivider(c, n)
	if err != nil {
		return dst, &OpError{Field: "Off", Value: s.Off, Err: err}
	}
	starts := make([]ellipse.DivisionPoint, 0, n)
	for pt, ok := d.Next(); ok; pt, ok = d.Next() {
		starts = append(starts, pt)
	}
	n0 := len(dst)
	for i := range starts {
		k := i
		if s.Clockwise {
			k = n - 1 - i
		}
		from, to := starts[k].T, c.ParamAtArcLength(starts[k].S+on)
		if s.Clockwise {
			from, to = to, from
		}
		if dst, err = s.dash(dst, c, from, to); err != nil {
			return dst[:n0], err
		}
	}
	return dst, nil
}

// dash appends one dash: the travel to its start, the move down, the open
// arc from parameter from to to, and the move up.
func (s *DashSpec) dash(dst Path, c ellipse.Parallel, from, to float64) (Path, error) {
	z := s.cutZ()
	tz := s.travelZ()
	// The travel and the move down go before the arc, whose first point
	// they must meet: reserve them and fill them in afterwards.
	i := len(dst)
	dst = travelXY(dst, 0, 0, tz)
	engage := s.Machine != Laser
	if engage {
		dst = append(dst, Segment{Kind: Line, Motion: Cut, Role: Plunge, Feed: s.PlungeFeed})
	}
	j := len(dst)
	dst, err := Approximate(dst, Spec{Curve: c, Zone: Band, Tol: s.Tol, Geometry: s.Geometry,
		Decimals: s.Decimals, From: from, Open: true, To: to, Z: z})
	if err != nil {
		return dst, err
	}
	if len(dst) == j {
		return dst[:i], nil
	}
	first := dst[j].Start
	if i == 0 {
		dst[i].Start = Point{first.X, first.Y, tz}
	}
	dst[i].End = Point{first.X, first.Y, tz}
	if engage {
		dst[i+1].Start, dst[i+1].End = dst[i].End, Point{first.X, first.Y, z}
	}
	if engage {
		dst = travelZ(dst, tz, Retract)
	}
	return dst, nil
}

// cutZ returns the height a dash is cut at.
func (s *DashSpec) cutZ() float64 {
	switch s.Machine {
	case Router:
		return -s.Depth
	case Plotter:
		return s.PenDown
	}
	return s.FocusZ
}
