package conformance

import (
	"math"
	"strconv"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// levelEps is how far apart two heights may be and still be one depth
// level, in the path's unit.
const levelEps = 1e-6

// geometry is the state of the geometry rules while they walk a program.
type geometry struct {
	p        *Program
	r        Rules
	c        *collector
	sum      *Summary
	curve    ellipse.Parallel
	el       ellipse.Ellipse
	zlo, zhi float64 // the zone
	tol      float64
	tiny     float64 // rounding allowed at the zone's edges
	length   float64 // of the curve

	// the foot of the last end point measured, reused as the next start
	lastX, lastY, lastT, lastD float64
	haveLast                   bool

	deepest  float64 // lowest Z of any contour move (not laser)
	cover    []span  // final-pass coverage in program order
	contours []contourMove
}

// contourMove is what the coverage and loop rules need of a contour move.
type contourMove struct {
	index   int     // into the path
	t0, dt  float64 // foot parameter of the start and the turn to the end
	low     float64 // lowest Z
	flat    bool    // Start.Z == End.Z
	runID   int
	lineNum int
}

// span is a stretch of the curve parameter cut by one or more moves.
type span struct {
	t0, dt float64
	line   int // the line of the last move in it
}

// checkGeometry applies deviation, closed-loop and coverage.
func checkGeometry(p *Program, r Rules, c *collector, sum *Summary) {
	sh := r.Shape
	el := sh.Curve.Ellipse()
	if !(sh.Tol > 0) || math.IsInf(sh.Tol, 0) || !(el.SemiMajor() > 0) {
		c.add(Violation{RuleDeviation, 0, "the intended shape has no valid curve or tolerance, so the geometry rules did not run"})
		return
	}
	g := &geometry{p: p, r: r, c: c, sum: sum, curve: sh.Curve, el: el, tol: sh.Tol, length: sh.Curve.Length(), deepest: math.Inf(1)}
	g.zlo, g.zhi = sh.Zone.Limits(sh.Tol)
	g.tiny = 1e-9 * (el.SemiMajor() + math.Abs(sh.Curve.Offset()))
	sum.Geometry = true
	sum.DeviationLo, sum.DeviationHi = math.Inf(1), math.Inf(-1)
	g.contours = make([]contourMove, 0, sum.Cut)
	g.walk()
	if sum.DeviationLo > sum.DeviationHi {
		sum.DeviationLo, sum.DeviationHi = 0, 0
	}
	sum.MaxDeviation = math.Max(math.Abs(sum.DeviationLo), math.Abs(sum.DeviationHi))
	g.loops()
	g.coverage()
}

// atDepth reports whether segment i cuts: router below Z0, plotter at or
// below Z0, laser with the beam on.
func (g *geometry) atDepth(i int) bool {
	s := &g.p.Path[i]
	m := &g.p.Moves[i]
	if s.Motion != toolpath.Cut || s.Kind == toolpath.Dwell {
		return false
	}
	switch g.r.Machine {
	case Laser:
		return m.Spindle != SpindleOff && m.Speed > 0
	case Plotter:
		return math.Min(s.Start.Z, s.End.Z) <= levelEps
	}
	return math.Min(s.Start.Z, s.End.Z) < -levelEps
}

// foot returns the foot parameter and deviation of a point, reusing the
// last one measured when it is the same point.
func (g *geometry) foot(x, y float64) (t, d float64) {
	if g.haveLast && x == g.lastX && y == g.lastY {
		return g.lastT, g.lastD
	}
	t, d = g.el.Nearest(ellipse.Point{X: x, Y: y})
	d -= g.curve.Offset()
	g.remember(x, y, t, d)
	return t, d
}

// remember keeps the foot parameter t and deviation d of the point (x, y)
// for foot.
func (g *geometry) remember(x, y, t, d float64) {
	g.lastX, g.lastY, g.lastT, g.lastD, g.haveLast = x, y, t, d, true
}

// outside reports whether a deviation breaks the zone.
func (g *geometry) outside(d float64) bool { return d < g.zlo-g.tiny || d > g.zhi+g.tiny || d != d }

// away reports whether a deviation lies farther than tol outside the zone.
func (g *geometry) away(d float64) bool { return d < g.zlo-g.tol || d > g.zhi+g.tol }

// walk classifies every move at cutting depth, checks the contour moves
// against the zone and records what the loop and coverage rules need.
func (g *geometry) walk() {
	p := g.p
	run := -1
	inRun := false
	for i := range p.Path {
		s := &p.Path[i]
		if s.Kind == toolpath.Dwell {
			continue // a pause moves nothing and breaks no cut
		}
		if !g.atDepth(i) {
			inRun = false
			continue
		}
		if !inRun {
			inRun = true
			run++
			g.sum.Runs++
		}
		if s.Kind == toolpath.Line && s.Start.X == s.End.X && s.Start.Y == s.End.Y {
			continue // a plunge or a lift inside the cut: joins, measures nothing
		}
		t0, d0 := g.foot(s.Start.X, s.Start.Y)
		var d1, lo, hi float64
		measured := false
		if !g.outside(d0) {
			// A move from within the zone is measured first, its end on
			// the way (see endsDeviation); only an end outside the zone
			// is taken again by the exact method, for the rules below.
			var t1 float64
			lo, hi, t1, d1 = endsDeviation(g.curve, *s, t0)
			if measured = !g.outside(d1); measured {
				g.remember(s.End.X, s.End.Y, t1, d1)
			}
		}
		if !measured {
			_, d1 = g.foot(s.End.X, s.End.Y)
		}
		lead := false
		if (g.away(d0) || g.away(d1)) && g.r.Shape.Zone != toolpath.Band {
			// The deviation changes no faster than the distance along
			// the move, so d ≥ (d0 + d1 − L)/2 everywhere on it: often
			// enough to place a lead in the waste without measuring.
			l := s.Length()
			if g.r.Shape.Zone == toolpath.Outside {
				lead = (d0+d1-l)/2 >= g.zlo
			} else {
				lead = (d0+d1+l)/2 <= g.zhi
			}
			if !lead {
				lo, hi = SegmentDeviation(g.curve, *s)
				measured = true
				if g.r.Shape.Zone == toolpath.Outside {
					lead = lo >= g.zlo-g.tiny
				} else {
					lead = hi <= g.zhi+g.tiny
				}
			}
		}
		if lead {
			g.sum.Lead++
			continue
		}
		rough := false
		if !measured {
			if g.outside(d0) || g.outside(d1) {
				// An end already breaks the zone: the move fails
				// whatever lies between, and nine samples say by how
				// much (within 2% of the range for a move that bends
				// away from the curve like a parabola) without the
				// dense measure, which is costly far from the curve.
				lo, hi = g.roughDeviation(s, d0, d1)
				rough = true
			} else {
				lo, hi = SegmentDeviation(g.curve, *s)
			}
		}
		dt := g.turn(s, t0)
		g.sum.Contour++
		if lo == lo && hi == hi {
			g.sum.DeviationLo = math.Min(g.sum.DeviationLo, lo)
			g.sum.DeviationHi = math.Max(g.sum.DeviationHi, hi)
		}
		if lo < g.zlo-g.tiny || hi > g.zhi+g.tiny || lo != lo || hi != hi {
			g.deviation(i, lo, hi, rough)
		}
		cm := contourMove{index: i, t0: t0, dt: dt, runID: run, lineNum: p.Moves[i].Line,
			low: math.Min(s.Start.Z, s.End.Z), flat: math.Abs(s.Start.Z-s.End.Z) <= levelEps}
		if g.r.Machine == Laser {
			cm.low, cm.flat = 0, true // the beam cuts through: one level
		}
		g.deepest = math.Min(g.deepest, cm.low)
		g.contours = append(g.contours, cm)
	}
}

// roughDeviation samples the deviation of a move at its ends and seven
// points between: a lower bound on its range.
func (g *geometry) roughDeviation(s *toolpath.Segment, d0, d1 float64) (lo, hi float64) {
	lo, hi = math.Min(d0, d1), math.Max(d0, d1)
	for k := 1; k < 8; k++ {
		q := s.At(float64(k) / 8)
		_, d := g.el.Nearest(ellipse.Point{X: q.X, Y: q.Y})
		d -= g.curve.Offset()
		lo, hi = math.Min(lo, d), math.Max(hi, d)
	}
	return lo, hi
}

// deviation reports a contour move outside the zone; rough says its
// extremes come from a few samples only.
func (g *geometry) deviation(i int, lo, hi float64, rough bool) {
	line := g.p.Moves[i].Line
	if g.c.full(RuleDeviation) {
		g.c.skip(RuleDeviation, line)
		return
	}
	u := unitName(g.p)
	verb := "the move deviates from "
	if rough {
		verb = "the move deviates from about "
	}
	msg := verb + fmtDev(lo) + " to " + fmtDev(hi) + u + " from the curve; the " +
		g.r.Shape.Zone.String() + " zone allows " + fmtDev(g.zlo) + " to " + fmtDev(g.zhi) + u
	switch {
	case lo != lo || hi != hi:
		msg = "the move's deviation from the curve cannot be measured (it is not finite)"
	case hi > g.zhi+g.tiny && lo < g.zlo-g.tiny:
		msg += " (outside by " + fmtDev(math.Max(hi-g.zhi, g.zlo-lo)) + u + ")"
	case hi > g.zhi+g.tiny:
		msg += " (" + fmtDev(hi-g.zhi) + u + " too far out)"
	default:
		msg += " (" + fmtDev(g.zlo-lo) + u + " too far in)"
	}
	g.c.add(Violation{RuleDeviation, line, msg})
}

// fmtDev formats a deviation briefly: six significant digits.
func fmtDev(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// turn returns the signed change of the foot parameter along a move from
// the foot t0 of its start, following the move with enough samples that
// no step between them can be mistaken for more than half a turn.
func (g *geometry) turn(s *toolpath.Segment, t0 float64) float64 {
	n := 1
	if l := s.Length(); g.length > 0 && l > g.length/16 {
		n = int(math.Min(256, math.Ceil(l/(g.length/16))))
	}
	if s.Kind == toolpath.Arc {
		if k := math.Ceil(math.Abs(s.Sweep()) / (math.Pi / 8)); k > float64(n) {
			n = int(math.Min(256, k))
		}
	}
	total, prev := 0.0, t0
	for k := 1; k <= n; k++ {
		var t float64
		if k == n {
			t, _ = g.foot(s.End.X, s.End.Y)
		} else {
			q := s.At(float64(k) / float64(n))
			t, _ = g.el.Nearest(ellipse.Point{X: q.X, Y: q.Y})
		}
		total += math.Remainder(t-prev, 2*math.Pi)
		prev = t
	}
	return total
}
