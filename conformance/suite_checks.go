package conformance

import (
	"fmt"
	"math"

	"github.com/focitools/foci/toolpath"
)

// The geometric properties TestGenerator checks on one path.

// checkSegments checks each segment, each join, the closure and the
// properties of the whole loop.
func (r *caseRun) checkSegments(path toolpath.Path) {
	c := r.c
	e := c.Curve.Ellipse()
	ctr := e.Center()
	extent := e.SemiMajor() + math.Abs(c.Curve.Offset()) + math.Abs(ctr.X) + math.Abs(ctr.Y)
	joinEps := JoinLimit * extent
	// Coordinates of this size are known to about 2^-52 of it; a direction
	// taken from a vector of length L is then known to about that over L.
	r.resolution = 4 * 0x1p-52 * extent
	devEps := 1e-12 * extent
	zlo, zhi := c.Zone.Limits(c.Tol)

	loop := loopSums{cx: ctr.X, cy: ctr.Y}
	mlo, mhi := math.Inf(1), math.Inf(-1)
	prev, first := -1, -1 // usable segments, for joins and closure
	for i := range path {
		s := &path[i]
		if !segmentFinite(s) {
			r.fail(ErrSegment, fmt.Sprintf("segment %d", i), s.Kind.String()+" with a coordinate that is not finite", "finite coordinates")
			continue
		}
		if s.Kind != toolpath.Line && s.Kind != toolpath.Arc {
			r.fail(ErrSegment, fmt.Sprintf("segment %d kind", i), s.Kind.String(), "line or arc")
			continue
		}
		if s.Motion != toolpath.Cut {
			r.fail(ErrMotion, fmt.Sprintf("segment %d motion", i), "travel", "cut")
		}
		if s.Kind == toolpath.Arc {
			r0 := math.Hypot(s.Start.X-s.CenterX, s.Start.Y-s.CenterY)
			r1 := math.Hypot(s.End.X-s.CenterX, s.End.Y-s.CenterY)
			lim := RadiusLimit * s.Radius
			if !(s.Radius > 0) || !(math.Abs(r0-s.Radius) <= lim) || !(math.Abs(r1-s.Radius) <= lim) {
				r.fail(ErrArcRadius, fmt.Sprintf("segment %d arc radius", i),
					fmt.Sprintf("Radius %.12g, start %.12g and end %.12g from the centre", s.Radius, r0, r1),
					fmt.Sprintf("all three equal within %g relative", RadiusLimit))
			}
		}
		lo, hi := SegmentDeviation(c.Curve, *s)
		mlo, mhi = math.Min(mlo, lo), math.Max(mhi, hi)
		if !(lo >= zlo-devEps) || !(hi <= zhi+devEps) {
			r.fail(ErrOutsideZone, fmt.Sprintf("segment %d deviation", i),
				fmt.Sprintf("[%.9g, %.9g]", lo, hi), fmt.Sprintf("within [%.9g, %.9g] (%v zone, tol %g)", zlo, zhi, c.Zone, c.Tol))
		}
		if prev >= 0 {
			op := fmt.Sprintf("join of segments %d and %d", prev, i)
			r.checkJoin(op, &path[prev], s, joinEps, ErrGap)
		} else {
			first = i
		}
		loop.add(s)
		prev = i
	}
	if first < 0 {
		return // nothing usable: already reported
	}
	closed := r.checkJoin(fmt.Sprintf("closure from segment %d back to segment %d", prev, first), &path[prev], &path[first], joinEps, ErrNotClosed)
	if closed {
		loop.closeWith(&path[first])
	}
	r.checkLoop(&loop, closed, mlo, mhi)
}

// checkJoin checks that b starts where a ends (reporting err if not) and,
// for a generator that claims tangent continuity, that the direction does
// not jump there. It reports whether the ends meet.
func (r *caseRun) checkJoin(op string, a, b *toolpath.Segment, eps float64, err error) bool {
	gap := math.Hypot(b.Start.X-a.End.X, b.Start.Y-a.End.Y)
	if !(gap <= eps) {
		r.fail(err, op, fmt.Sprintf("end (%.12g, %.12g), start (%.12g, %.12g): %.3g apart", a.End.X, a.End.Y, b.Start.X, b.Start.Y, gap),
			fmt.Sprintf("at most %.3g apart", eps))
		return false
	}
	if r.smooth {
		ax, ay, ok1 := endDirection(a)
		bx, by, ok2 := startDirection(b)
		if ok1 && ok2 {
			lim := KinkLimit + r.resolution*(1/directionBase(a)+1/directionBase(b))
			if k := math.Atan2(ax*by-ay*bx, ax*bx+ay*by); !(math.Abs(k) <= lim) {
				r.fail(ErrKink, op+" direction", fmt.Sprintf("a turn of %.3g rad", k), fmt.Sprintf("at most %.3g rad (tangent continuity)", lim))
			}
		}
	}
	return true
}

// directionBase returns the length over which rounding of a segment's
// coordinates tilts its direction at an end: a line's length, and for an
// arc the shorter of its radius and its chord (an arc fitted between two
// given points and a tangent, as a closing biarc is, turns at its far end
// by about the rounding over the chord).
func directionBase(s *toolpath.Segment) float64 {
	chord := math.Hypot(s.End.X-s.Start.X, s.End.Y-s.Start.Y)
	if s.Kind == toolpath.Arc && s.Radius < chord {
		return s.Radius
	}
	return chord
}

// checkLoop checks winding, turning, enclosed area and length of a path
// whose deviation from the curve lies in [mlo, mhi].
func (r *caseRun) checkLoop(l *loopSums, closed bool, mlo, mhi float64) {
	c := r.c
	if !closed {
		return // winding and area mean nothing for an open path
	}
	w := math.Round(l.winding / (2 * math.Pi))
	if !(math.Abs(w) == 1) || !(math.Abs(l.winding-2*math.Pi*w) <= 1e-6) {
		r.fail(ErrWinding, "winding number about the centre", fmt.Sprintf("%.9g turns", l.winding/(2*math.Pi)), "exactly 1 or −1")
		return
	}
	turns := l.turning / (2 * math.Pi)
	if !(math.Abs(turns-w) <= 1e-6) {
		r.fail(ErrWinding, "total turning of the direction", fmt.Sprintf("%.9g turns", turns), fmt.Sprintf("%g, as the winding", w))
	}
	// The path encloses the parallel curve at its smallest deviation and,
	// turning one way only, lies inside the one at its largest: its area
	// and length are between theirs (Steiner's formulas for the parallel
	// bodies of a convex set). SegmentDeviation may fall short of an
	// extreme by 1% of the range, so widen by that.
	e := c.Curve.Ellipse()
	spread := mhi - mlo
	glo := c.Curve.Offset() + mlo - 0.01*spread
	ghi := c.Curve.Offset() + mhi + 0.01*spread
	p := e.Perimeter()
	a0 := e.Area()
	area := func(g float64) float64 {
		if g <= -e.MinRadiusOfCurvature() {
			return 0
		}
		return a0 + p*g + math.Pi*g*g
	}
	length := func(g float64) float64 {
		if g <= -e.MinRadiusOfCurvature() {
			return 0
		}
		return p + 2*math.Pi*g
	}
	const rel = 1e-10
	alo, ahi := area(glo)*(1-rel), area(ghi)*(1+rel)
	if got := l.area * w; !(got >= alo && got <= ahi) {
		r.fail(ErrWinding, "enclosed area", fmt.Sprintf("%.12g", l.area),
			fmt.Sprintf("%g × [%.12g, %.12g], the areas of the parallel curves at the smallest and largest deviation", w, alo, ahi))
	}
	llo, lhi := length(glo)*(1-rel), length(ghi)*(1+rel)
	if !(l.length >= llo && l.length <= lhi) {
		r.fail(ErrLength, "path length", fmt.Sprintf("%.12g", l.length),
			fmt.Sprintf("within [%.12g, %.12g], the lengths of the parallel curves at the smallest and largest deviation", llo, lhi))
	}
}

func segmentFinite(s *toolpath.Segment) bool {
	for _, v := range [...]float64{s.Start.X, s.Start.Y, s.End.X, s.End.Y} {
		if !finite(v) {
			return false
		}
	}
	return s.Kind != toolpath.Arc || (finite(s.CenterX) && finite(s.CenterY) && finite(s.Radius))
}

// startDirection returns the unit direction of travel at the start of s,
// and false for a line of zero length.
func startDirection(s *toolpath.Segment) (x, y float64, ok bool) {
	if s.Kind == toolpath.Arc {
		return arcDirection(s, s.Start)
	}
	dx, dy := s.End.X-s.Start.X, s.End.Y-s.Start.Y
	h := math.Hypot(dx, dy)
	return dx / h, dy / h, h > 0
}

// endDirection returns the unit direction of travel at the end of s.
func endDirection(s *toolpath.Segment) (x, y float64, ok bool) {
	if s.Kind == toolpath.Arc {
		return arcDirection(s, s.End)
	}
	return startDirection(s)
}

// arcDirection returns the direction of travel of arc s at its point p:
// the radius vector turned a quarter turn the way the arc runs.
func arcDirection(s *toolpath.Segment, p toolpath.Point) (x, y float64, ok bool) {
	rx, ry := p.X-s.CenterX, p.Y-s.CenterY
	h := math.Hypot(rx, ry)
	if s.Clockwise {
		return ry / h, -rx / h, h > 0
	}
	return -ry / h, rx / h, h > 0
}

// loopSums accumulates, segment by segment, the angle the path sweeps
// about the centre (cx, cy), the turning of its direction, the signed area
// it encloses (taken about the centre, to keep the digits of off-centre
// paths) and its length in XY.
type loopSums struct {
	cx, cy  float64
	winding float64
	turning float64
	area    float64
	length  float64
	// direction at the end of the last segment of non-zero length
	dx, dy float64
	hasDir bool
}

func (l *loopSums) add(s *toolpath.Segment) {
	sx, sy := s.Start.X-l.cx, s.Start.Y-l.cy
	ex, ey := s.End.X-l.cx, s.End.Y-l.cy
	switch s.Kind {
	case toolpath.Line:
		l.winding += math.Atan2(sx*ey-sy*ex, sx*ex+sy*ey)
		l.length += math.Hypot(ex-sx, ey-sy)
		l.area += 0.5 * (sx*ey - sy*ex)
	case toolpath.Arc:
		sweep := s.Sweep()
		// Subtended angle piece by piece: at most π/8 of the arc at a time
		// so that no piece passes round the centre unseen.
		n := int(math.Ceil(math.Abs(sweep) / (math.Pi / 8)))
		ox, oy := s.Start.X-s.CenterX, s.Start.Y-s.CenterY
		px, py := sx, sy
		for k := 1; k <= n; k++ {
			qx, qy := ex, ey
			if k < n {
				sn, cs := math.Sincos(sweep * float64(k) / float64(n))
				qx = s.CenterX - l.cx + cs*ox - sn*oy
				qy = s.CenterY - l.cy + sn*ox + cs*oy
			}
			l.winding += math.Atan2(px*qy-py*qx, px*qx+py*qy)
			px, py = qx, qy
		}
		l.turning += sweep
		l.length += math.Abs(sweep) * s.Radius
		l.area += 0.5*(sx*ey-sy*ex) + 0.5*s.Radius*s.Radius*(sweep-math.Sin(sweep))
	}
	x0, y0, ok := startDirection(s)
	if !ok {
		return
	}
	if l.hasDir {
		l.turning += math.Atan2(l.dx*y0-l.dy*x0, l.dx*x0+l.dy*y0)
	}
	l.dx, l.dy, _ = endDirection(s)
	l.hasDir = true
}

// closeWith adds the turn from the last direction into the first segment.
func (l *loopSums) closeWith(first *toolpath.Segment) {
	x0, y0, ok := startDirection(first)
	if ok && l.hasDir {
		l.turning += math.Atan2(l.dx*y0-l.dy*x0, l.dx*x0+l.dy*y0)
	}
}
