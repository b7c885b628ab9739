package conformance

import (
	"math"
	"strconv"

	"github.com/focitools/foci/toolpath"
)

// limitSlack is the rounding allowed in comparisons of coordinates against
// limits: parsed numbers are exact to a few ulps, sums of incremental moves
// a little less.
func limitSlack(limit float64) float64 { return 1e-9 * math.Max(1, math.Abs(limit)) }

// unitName is the unit of a program's lengths for messages.
func unitName(p *Program) string { return " " + p.Units.String() }

// checkOrder applies units-before-motion, feed-before-cut, program-end and
// after-end.
func checkOrder(p *Program, c *collector) {
	for _, m := range p.Moves {
		if m.Code > 3 {
			continue
		}
		if p.UnitsLine == 0 || p.UnitsLine > m.Line {
			msg := "a move comes before any G20 or G21, so its lengths were read as " + m.Units.String()
			if p.UnitsLine == 0 {
				msg = "the program moves without ever giving G20 or G21; its lengths were read as " + m.Units.String()
			}
			c.add(Violation{RuleUnitsBeforeMotion, m.Line, msg})
		}
		break
	}
	for _, m := range p.Moves {
		if m.Code < 1 || m.Code > 3 || m.Feed > 0 {
			continue
		}
		if c.full(RuleFeedBeforeCut) {
			c.skip(RuleFeedBeforeCut, m.Line)
			continue
		}
		c.add(Violation{RuleFeedBeforeCut, m.Line, "G" + strconv.Itoa(int(m.Code)) + " feed move with no positive feed rate in force: give F first"})
	}
	if p.EndLine == 0 {
		c.add(Violation{RuleProgramEnd, p.Lines, "the program does not end with M2 or M30"})
	}
	for i, line := range p.AfterEnd {
		msg := "code after the program end (line " + strconv.Itoa(p.EndLine) + ") is never run"
		if i == 0 && p.AfterEndCount > len(p.AfterEnd) {
			msg += "; " + strconv.Itoa(p.AfterEndCount) + " such lines in all"
		}
		c.add(Violation{RuleAfterEnd, line, msg})
	}
}

// checkArcs applies arc-radius-mismatch and arc-r-near-half.
func checkArcs(p *Program, c *collector) {
	for i := range p.Path {
		s := &p.Path[i]
		if s.Kind != toolpath.Arc {
			continue
		}
		m := &p.Moves[i]
		if m.Flags&MoveRadiusForm != 0 {
			sweep := math.Abs(s.Sweep())
			if d := math.Abs(sweep - math.Pi); d < RNearHalfDegrees*math.Pi/180 {
				c.add(Violation{RuleArcRNearHalf, m.Line, "a radius-form arc sweeps " + strconv.FormatFloat(sweep*180/math.Pi, 'f', 3, 64) +
					"°, within " + msgNum(RNearHalfDegrees) + "° of half a turn, where its centre is ill-conditioned; write it with I and J"})
			}
			continue
		}
		end := math.Hypot(s.End.X-s.CenterX, s.End.Y-s.CenterY)
		tol := arcTolerance(m.Units, p.Units)
		if d := math.Abs(end - s.Radius); d > tol+limitSlack(s.Radius) {
			if c.full(RuleArcRadiusMismatch) {
				c.skip(RuleArcRadiusMismatch, m.Line)
				continue
			}
			c.add(Violation{RuleArcRadiusMismatch, m.Line, "the start radius " + msgNum(s.Radius) + " and end radius " + msgNum(end) +
				" differ by " + msgNum(d) + unitName(p) + ", more than the " + msgNum(tol) + unitName(p) + " allowed"})
		}
	}
}

// checkSafety applies rapid-below-safe, rapid-beam-on and cut-spindle-off.
func checkSafety(p *Program, r Rules, c *collector) {
	for i := range p.Path {
		s := &p.Path[i]
		m := &p.Moves[i]
		if s.Kind == toolpath.Dwell {
			continue
		}
		low := math.Min(s.Start.Z, s.End.Z)
		switch {
		case m.Code == 0 && r.Machine == Laser:
			if m.Spindle != SpindleOff && m.Speed > 0 {
				c.add(Violation{RuleRapidBeamOn, m.Line, "a rapid with the beam on (" + m.Spindle.String() + " S" + msgNum(m.Speed) + "): turn it off (M5 or S0) before G0"})
			}
		case m.Code == 0:
			// A first move from an unknown place moves in XY although
			// its recorded ends agree.
			xy := s.Start.X != s.End.X || s.Start.Y != s.End.Y || m.Flags&(MoveFromUnknownXY|MoveGivesXY) == MoveFromUnknownXY|MoveGivesXY
			switch {
			case m.Flags&MoveXYBeforeZ != 0:
				c.add(Violation{RuleRapidBelowSafe, m.Line, "a rapid moves in X or Y before the program gives any Z: the tool travels at whatever height it was left; raise it to the safe height first"})
			case xy && low < r.SafeZ-limitSlack(r.SafeZ):
				if c.full(RuleRapidBelowSafe) {
					c.skip(RuleRapidBelowSafe, m.Line)
					continue
				}
				c.add(Violation{RuleRapidBelowSafe, m.Line, "a rapid moves in X or Y at Z " + msgNum(low) + ", below the safe height " + msgNum(r.SafeZ) + unitName(p)})
			case !xy && r.Machine == Router && s.End.Z < s.Start.Z && s.End.Z < -limitSlack(0):
				c.add(Violation{RuleRapidBelowSafe, m.Line, "a rapid plunges to Z " + msgNum(s.End.Z) + ", into the stock (below Z0); feed into the stock with G1"})
			}
		case r.Machine == Router && low < -limitSlack(0) && (m.Spindle == SpindleOff || m.Speed <= 0):
			if c.full(RuleCutSpindleOff) {
				c.skip(RuleCutSpindleOff, m.Line)
				continue
			}
			why := "the spindle is off (M5, or no M3 or M4 yet)"
			if m.Spindle != SpindleOff {
				why = "the spindle speed is 0 (" + m.Spindle.String() + " with no positive S)"
			}
			c.add(Violation{RuleCutSpindleOff, m.Line, "a feed move cuts to Z " + msgNum(low) + " while " + why})
		}
	}
}

// checkTravel applies travel-limit.
func checkTravel(p *Program, box Box, c *collector) {
	for i := range p.Path {
		minX, minY, maxX, maxY, _ := p.Path[i : i+1].Bounds()
		s := &p.Path[i]
		minZ, maxZ := math.Min(s.Start.Z, s.End.Z), math.Max(s.Start.Z, s.End.Z)
		full := c.full(RuleTravelLimit)
		bad := false
		msg := ""
		over := func(axis string, lo, hi, min, max float64) {
			if lo < min-limitSlack(min) {
				bad = true
				if !full {
					msg = joinMsg(msg, axis+" reaches "+msgNum(lo)+", "+msgNum(min-lo)+unitName(p)+" below the limit "+msgNum(min))
				}
			}
			if hi > max+limitSlack(max) {
				bad = true
				if !full {
					msg = joinMsg(msg, axis+" reaches "+msgNum(hi)+", "+msgNum(hi-max)+unitName(p)+" beyond the limit "+msgNum(max))
				}
			}
		}
		over("X", minX, maxX, box.MinX, box.MaxX)
		over("Y", minY, maxY, box.MinY, box.MaxY)
		if box.HasZ {
			over("Z", minZ, maxZ, box.MinZ, box.MaxZ)
		}
		if bad {
			c.add(Violation{RuleTravelLimit, p.Moves[i].Line, msg})
		}
	}
}

func joinMsg(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}
