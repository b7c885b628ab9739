package conformance

import (
	"cmp"
	"slices"
	"strconv"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Rule names. Every [Violation] carries one.
const (
	// RuleSyntax: the text is not RS-274: an unexpected character, a
	// letter without a number, an exponent, a repeated word, an unclosed
	// comment, a number beyond ±1e12. The line is not run.
	RuleSyntax = "syntax"
	// RuleUnsupported: valid RS-274 outside the subset the reader knows
	// (another plane, canned cycles, M6, axes other than X Y Z, block
	// delete). It is reported and ignored; the rest of the line runs.
	RuleUnsupported = "unsupported"
	// RuleModal: two codes of one modal group on a line (NISTIR 6556
	// §3.4), or axis words with no motion mode in force. The line is not
	// run.
	RuleModal = "modal"
	// RuleBadWord: a word with a value it may not have (negative F or S, a
	// T that is no whole number, G4 without P) or where it means nothing
	// (I, J or R without an arc, P without G4). The line is not run.
	RuleBadWord = "bad-word"
	// RuleArcInvalid: G2 or G3 that makes no arc: no centre given, both
	// forms given, radius zero, R shorter than half the chord, an R-form
	// full circle, an arc from an unknown position. The line is not run.
	RuleArcInvalid = "arc-invalid"
	// RuleArcRadiusMismatch: a centre-form arc whose start and end radius
	// differ by more than 0.002 mm (0.0002 in when written in inches),
	// the limit of NISTIR 6556 §3.5.3.
	RuleArcRadiusMismatch = "arc-radius-mismatch"
	// RuleArcRNearHalf: a radius-form arc whose sweep is within
	// [RNearHalfDegrees] of half a turn. There the centre moves by about
	// 1/(2·sin(δ/2)) times any error of the end point (δ the distance of
	// the sweep from 180°): 57 times at 1°, so the rounding of a 3-decimal
	// program can shift the centre by 0.03 mm. NISTIR 6556 §3.5.3.1 warns
	// against such arcs; use I and J.
	RuleArcRNearHalf = "arc-r-near-half"
	// RuleUnitsBeforeMotion: a move before any G20 or G21; the reader
	// then assumed millimetres.
	RuleUnitsBeforeMotion = "units-before-motion"
	// RuleFeedBeforeCut: a feed move (G1, G2, G3) with no positive F in
	// force.
	RuleFeedBeforeCut = "feed-before-cut"
	// RuleRapidBelowSafe (router, plotter): a G0 that moves in X or Y
	// while below the safe height at either end, or before any Z has been
	// given; and (router) a G0 straight down into the stock, below Z0. A
	// pure Z rapid up, or down to a height at or above Z0, is fine.
	RuleRapidBelowSafe = "rapid-below-safe"
	// RuleRapidBeamOn (laser): a G0 while M3 or M4 is in force with S > 0.
	RuleRapidBeamOn = "rapid-beam-on"
	// RuleCutSpindleOff (router): a feed move that reaches below Z0 while
	// the spindle is off (M5, no M3 or M4 yet, or S 0). The laser has no
	// such rule: a feed move with the beam off (M5 or S 0) is a slow
	// travel and harms nothing. The plotter's pen is down by height alone.
	RuleCutSpindleOff = "cut-spindle-off"
	// RuleProgramEnd: no M2 or M30. Its line is the last line.
	RuleProgramEnd = "program-end"
	// RuleAfterEnd: code after the first M2 or M30 (comments, blank lines
	// and % are fine). It is not run.
	RuleAfterEnd = "after-end"
	// RuleTravelLimit: a point of a move outside [Rules.Travel]; the
	// message names the axis and by how much.
	RuleTravelLimit = "travel-limit"
	// RuleDeviation: a move at cutting depth that leaves the tolerance
	// zone around the intended curve, measured with [SegmentDeviation].
	// Lead moves are exempt: see [Rules.Shape].
	RuleDeviation = "deviation"
	// RuleClosedLoop: a continuous cut that does not go once round the
	// curve for every depth level it works at.
	RuleClosedLoop = "closed-loop"
	// RuleCoverage: a stretch of the curve longer than the tolerance that
	// the final pass does not cut.
	RuleCoverage = "coverage"
	// RuleTooMany: more problems than ReadOptions.MaxProblems were found;
	// the rest are counted, not listed.
	RuleTooMany = "too-many-problems"
)

// RNearHalfDegrees is how close to half a turn, in degrees, a radius-form
// arc may come before [RuleArcRNearHalf] flags it.
const RNearHalfDegrees = 1.0

// Violation is one broken rule at one line of a program. Line 0 means the
// program as a whole.
type Violation struct {
	Rule    string // one of the Rule constants
	Line    int    // 1-based source line, 0 for the whole program
	Message string
}

// Error returns "line 12: deviation: message".
func (v Violation) Error() string {
	return "line " + strconv.Itoa(v.Line) + ": " + v.Rule + ": " + v.Message
}

// Machine is the kind of machine a program is checked for: the same type
// as [toolpath.Machine] and [gcodeout.Machine], so one value goes from the
// operation to the writer to the checker. What cuts:
//
//   - Router: a spindle cuts below Z0, the top of the stock.
//   - Laser: the beam cuts while M3 or M4 is on with S > 0; Z is focus.
//   - Plotter: the pen draws at or below Z0, the paper.
//
// In [Rules] the zero Machine means Router.
type Machine = toolpath.Machine

// The machine kinds, as in package toolpath.
const (
	Router  = toolpath.Router
	Laser   = toolpath.Laser
	Plotter = toolpath.Plotter
)

// ParseMachine returns the machine named s ("router", "laser", "plotter").
func ParseMachine(s string) (Machine, bool) { return toolpath.ParseMachine(s) }

// Box is the travel of a machine: the limits every point must stay
// within. The Z limits apply only when HasZ.
type Box struct {
	MinX, MinY, MaxX, MaxY float64
	HasZ                   bool
	MinZ, MaxZ             float64
}

// Shape is the intended curve of a program.
//
// Moves at cutting depth (router: below Z0; plotter: at or below Z0;
// laser: beam on) with some XY motion are measured against Curve. A move
// is a lead move (lead-in, lead-out, or any cut in the waste) when one of
// its ends lies farther than Tol outside the zone and the whole move lies
// on the waste side: outward for the Outside zone, inward for Inside.
// The Band zone has no waste side, so it has no lead moves. Lead moves are
// not held to the zone and do not count for coverage; every other move at
// cutting depth is a contour move.
type Shape struct {
	Curve ellipse.Parallel
	Zone  toolpath.Zone
	Tol   float64
}

// Rules chooses the rules [Check] applies. The zero value checks a router
// program with a safe height of 0 and no travel limits or shape. Every
// length (SafeZ, Travel, Shape) is in the unit of the program's path,
// [Program.Units]: read the program with [ReadOptions.Units] to choose it.
type Rules struct {
	Machine Machine
	// SafeZ is the height rapids that move in X or Y must keep (router,
	// plotter).
	SafeZ float64
	// Travel, when set, are the machine's limits.
	Travel *Box
	// Shape, when set, turns on the geometry rules.
	Shape *Shape
	// MaxPerRule bounds the violations listed for each rule; the rest
	// are summed up in one last violation of that rule. 0 means 20.
	MaxPerRule int
}

// Summary counts the moves of a program and the largest deviation.
type Summary struct {
	Segments, Cut, Travel, Arcs, Lines, Dwells int
	// CutLength and TravelLength are in the program's units.
	CutLength, TravelLength float64
	// Geometry reports whether a Shape was checked; then DeviationLo and
	// DeviationHi bound the signed deviation of the contour moves and
	// MaxDeviation is the larger of their magnitudes.
	Geometry                               bool
	DeviationLo, DeviationHi, MaxDeviation float64
	// Contour and Lead count the moves at cutting depth by kind; Runs
	// counts the continuous cuts.
	Contour, Lead, Runs int
}

// Report is what [CheckReport] finds.
type Report struct {
	Violations []Violation
	Summary    Summary
}

// Check applies the rules to a program read by [Read] and returns every
// violation, reading problems included, in line order.
func Check(p *Program, r Rules) []Violation { return CheckReport(p, r).Violations }

// CheckReport is [Check] with a [Summary] of the program.
func CheckReport(p *Program, r Rules) Report {
	if r.Machine == 0 {
		r.Machine = Router
	}
	c := newCollector(r.MaxPerRule)
	for _, v := range p.Problems {
		c.add(v)
	}
	if p.ProblemsDropped > 0 {
		c.add(Violation{RuleTooMany, 0, strconv.Itoa(p.ProblemsDropped) + " more reading problems were found and not listed"})
	}
	var sum Summary
	countMoves(p, &sum)
	checkOrder(p, c)
	checkArcs(p, c)
	checkSafety(p, r, c)
	if r.Travel != nil {
		checkTravel(p, *r.Travel, c)
	}
	if r.Shape != nil {
		checkGeometry(p, r, c, &sum)
	}
	return Report{Violations: c.done(), Summary: sum}
}

func countMoves(p *Program, sum *Summary) {
	sum.Segments = len(p.Path)
	for i := range p.Path {
		s := &p.Path[i]
		switch s.Kind {
		case toolpath.Line:
			sum.Lines++
		case toolpath.Arc:
			sum.Arcs++
		case toolpath.Dwell:
			sum.Dwells++
			continue
		}
		if s.Motion == toolpath.Cut {
			sum.Cut++
			sum.CutLength += s.Length()
		} else {
			sum.Travel++
			sum.TravelLength += s.Length()
		}
	}
}

// collector gathers violations, listing at most max of each rule.
type collector struct {
	max    int
	list   []Violation
	counts map[string]int
	first  map[string]int // line of the first violation not listed
}

func newCollector(max int) *collector {
	if max <= 0 {
		max = 20
	}
	return &collector{max: max, counts: map[string]int{}, first: map[string]int{}}
}

func (c *collector) add(v Violation) {
	n := c.counts[v.Rule]
	c.counts[v.Rule] = n + 1
	if n < c.max {
		c.list = append(c.list, v)
		return
	}
	if n == c.max {
		c.first[v.Rule] = v.Line
	}
}

// full reports whether rule has listed as many violations as it may, so a
// caller can skip building messages no one will read.
func (c *collector) full(rule string) bool { return c.counts[rule] >= c.max }

// skip counts a violation of a full rule without a message.
func (c *collector) skip(rule string, line int) { c.add(Violation{Rule: rule, Line: line}) }

func (c *collector) done() []Violation {
	for rule, n := range c.counts {
		if n > c.max {
			c.list = append(c.list, Violation{rule, c.first[rule],
				strconv.Itoa(n-c.max) + " more " + rule + " violations from this line on are not listed"})
		}
	}
	slices.SortStableFunc(c.list, func(a, b Violation) int {
		if a.Line != b.Line {
			return cmp.Compare(a.Line, b.Line)
		}
		return cmp.Compare(a.Rule, b.Rule)
	})
	return c.list
}
