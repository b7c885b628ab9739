package conformance

import (
	"cmp"
	"math"
	"slices"
	"strconv"
)

// loops applies closed-loop. A run is a continuous cut: moves at cutting
// depth one after another, joined by plunges, lifts and pauses that stay
// at depth, ended by anything else (a rapid, a rise out of the stock, the
// beam going off). A depth level of a run is a height at which its level
// contour moves go at least half way round; tabs are shorter and do not
// count. A run must go once round the curve for each of its levels (at
// least once), within tol of arc length.
func (g *geometry) loops() {
	cs := g.contours
	type level struct{ z, turn float64 }
	var levels []level
	for i := 0; i < len(cs); {
		j := i
		w := 0.0
		levels = levels[:0]
		for ; j < len(cs) && cs[j].runID == cs[i].runID; j++ {
			w += cs[j].dt
			if !cs[j].flat {
				continue
			}
			k := 0
			for k < len(levels) && math.Abs(levels[k].z-cs[j].low) > levelEps {
				k++
			}
			if k == len(levels) {
				levels = append(levels, level{z: cs[j].low})
			}
			levels[k].turn += math.Abs(cs[j].dt)
		}
		n := 0
		for _, l := range levels {
			if l.turn >= math.Pi {
				n++
			}
		}
		need := 2 * math.Pi * float64(max(n, 1))
		if missing := need - math.Abs(w); missing > 0 {
			end := cs[j-1].t0 + cs[j-1].dt
			if gap := math.Abs(g.curve.ArcLength(end, end+missing)); gap > g.tol+g.tiny {
				levelsText := "1 depth level"
				if n > 1 {
					levelsText = strconv.Itoa(n) + " depth levels"
				}
				g.c.add(Violation{RuleClosedLoop, cs[i].lineNum, "the cut from line " + strconv.Itoa(cs[i].lineNum) + " to line " +
					strconv.Itoa(cs[j-1].lineNum) + " goes " + strconv.FormatFloat(math.Abs(w)/(2*math.Pi), 'f', 3, 64) +
					" times round the curve at " + levelsText + "; it must close a loop at each level (" + fmtDev(gap) + unitName(g.p) + " of the curve is missing)"})
			}
		}
		i = j
	}
}

// interval is a stretch [lo, hi] of the curve parameter, lo in [0, 2π).
type interval struct {
	lo, hi float64
	line   int
}

// coverage applies coverage. The final pass is, in each run that reaches
// the deepest level of all contour moves, the contour moves from the first
// that reaches it to the end of the run; when they go less than once
// round, the moves just before them are taken in too, until they do, but
// never a level stretch that goes more than a quarter of the way round
// (that is an upper pass, not a tab). So a tab (a stretch cut at a raised Z
// inside the stock) counts as cut wherever it lies, even across the start
// of the pass, and so does a ramp the pass needs to close its lap; a
// lead-out does not (it is no contour move). For the laser every contour move is final. The stretches of the
// curve that none of these moves reaches (by the feet of their points),
// longer than tol, are reported; how far a contour move strays from the
// curve is the deviation rule's business.
func (g *geometry) coverage() {
	cs := g.contours
	if len(cs) == 0 {
		depth := "a router cuts below Z0"
		switch g.r.Machine {
		case Laser:
			depth = "a laser cuts with the beam on: M3 or M4 with S > 0"
		case Plotter:
			depth = "a plotter draws at or below Z0"
		}
		g.c.add(Violation{RuleCoverage, 0, "no move follows the curve at cutting depth (" + depth + "), so none of it is cut"})
		return
	}
	// Spans in program order, joined while each move starts where the
	// last ended and turns the same way.
	var spans []span
	for i := 0; i < len(cs); {
		j := i
		first := -1
		for ; j < len(cs) && cs[j].runID == cs[i].runID; j++ {
			if first < 0 && cs[j].low <= g.deepest+levelEps {
				first = j
			}
		}
		if first < 0 {
			i = j
			continue
		}
		turn := 0.0
		for k := first; k < j; k++ {
			turn += math.Abs(cs[k].dt)
		}
		for first > i && turn < 2*math.Pi {
			k := first - 1
			if cs[k].flat && g.levelStretch(k, i) > math.Pi/2 {
				break // an upper pass, not a tab
			}
			first = k
			turn += math.Abs(cs[first].dt)
		}
		for k := first; k < j; k++ {
			m := &cs[k]
			if n := len(spans); n > 0 {
				sp := &spans[n-1]
				if math.Abs(math.Remainder(sp.t0+sp.dt-m.t0, 2*math.Pi)) < 1e-9 && (sp.dt >= 0) == (m.dt >= 0) {
					sp.dt += m.dt
					sp.line = m.lineNum
					continue
				}
			}
			spans = append(spans, span{t0: m.t0, dt: m.dt, line: m.lineNum})
		}
		i = j
	}
	var ivs []interval
	for _, sp := range spans {
		lo, hi := sp.t0, sp.t0+sp.dt
		if sp.dt < 0 {
			lo, hi = hi, lo
		}
		if hi-lo >= 2*math.Pi {
			return // one stretch goes all the way round
		}
		shift := math.Floor(lo/(2*math.Pi)) * 2 * math.Pi
		lo, hi = lo-shift, hi-shift
		ivs = append(ivs, interval{lo, math.Min(hi, 2*math.Pi), sp.line})
		if hi > 2*math.Pi {
			ivs = append(ivs, interval{0, hi - 2*math.Pi, sp.line})
		}
	}
	slices.SortFunc(ivs, func(a, b interval) int { return cmp.Compare(a.lo, b.lo) })
	// Walk round once from the first covered point.
	if len(ivs) == 0 {
		g.c.add(Violation{RuleCoverage, 0, "the final pass has no move within the zone, so the curve is not cut to depth"})
		return
	}
	reach, line := ivs[0].hi, ivs[0].line
	for _, iv := range ivs[1:] {
		if iv.lo > reach {
			g.gap(reach, iv.lo, line)
		}
		if iv.hi > reach {
			reach, line = iv.hi, iv.line
		}
	}
	if end := ivs[0].lo + 2*math.Pi; end > reach {
		g.gap(reach, end, line)
	}
}

// levelStretch returns how far round the curve the stretch of level
// contour moves at the height of cs[k] goes: the moves at that Z that
// follow one another directly around k, from the run's first contour move i
// on.
func (g *geometry) levelStretch(k, i int) float64 {
	cs := g.contours
	z := cs[k].low
	same := func(m *contourMove) bool {
		return m.runID == cs[k].runID && m.flat && math.Abs(m.low-z) <= levelEps
	}
	// A plunge or a lift between two moves (a tab's side) ends a stretch.
	turn := math.Abs(cs[k].dt)
	for a := k - 1; a >= i && same(&cs[a]) && cs[a].index+1 == cs[a+1].index; a-- {
		turn += math.Abs(cs[a].dt)
	}
	for b := k + 1; b < len(cs) && same(&cs[b]) && cs[b-1].index+1 == cs[b].index; b++ {
		turn += math.Abs(cs[b].dt)
	}
	return turn
}

// gap reports the stretch of parameters from a to b when it is longer
// than tol.
func (g *geometry) gap(a, b float64, line int) {
	l := g.curve.ArcLength(a, b)
	if !(l > g.tol+g.tiny) {
		return
	}
	p, q := g.curve.PointAt(a), g.curve.PointAt(b)
	u := unitName(g.p)
	g.c.add(Violation{RuleCoverage, line, "the final pass leaves " + fmtDev(l) + u + " of the curve uncut, from (" +
		fmtDev(p.X) + ", " + fmtDev(p.Y) + ") to (" + fmtDev(q.X) + ", " + fmtDev(q.Y) + ")"})
}
