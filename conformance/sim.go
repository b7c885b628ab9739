package conformance

import (
	"math"
	"strconv"

	"github.com/focitools/foci/toolpath"
)

// simulator holds the modal state of the machine while a program is read.
// Lengths are kept in the path's units (s.p.Units once decided).
type simulator struct {
	p           *Program
	maxProblems int
	line        int
	blk         block

	pathUnitsSet bool  // s.p.Units is decided
	active       Units // G20/G21 in force, UnitsUnset before any
	scale        float64

	pos                 toolpath.Point
	knownX, knownY      bool // the program has given X, Y
	knownZ              bool // the program has given Z
	motion              int16
	incremental         bool
	feed, speed         float64
	spindle             Spindle
	tool                int
	ended               bool
	firstMotionReported bool
}

func newSimulator(opts ReadOptions) *simulator {
	s := &simulator{p: &Program{}, maxProblems: opts.MaxProblems, motion: -1, tool: -1, scale: 1}
	if s.maxProblems <= 0 {
		s.maxProblems = defaultMaxProblems
	}
	if opts.Units != UnitsUnset {
		s.p.Units, s.pathUnitsSet = opts.Units, true
	}
	return s
}

// decideUnits fixes the path's unit the first time a length is needed.
func (s *simulator) decideUnits() {
	if s.pathUnitsSet {
		return
	}
	s.pathUnitsSet = true
	s.p.Units = s.active
	if s.p.Units == UnitsUnset {
		s.p.Units = Millimeters
	}
	s.scale = unitFactor(s.lineUnits(), s.p.Units)
}

// lineUnits is the unit numbers on the current line are written in.
func (s *simulator) lineUnits() Units {
	if s.active == UnitsUnset {
		if s.pathUnitsSet {
			return s.p.Units
		}
		return Millimeters
	}
	return s.active
}

// runLine lexes and runs one source line.
func (s *simulator) runLine(line []byte) {
	if s.ended {
		s.afterEnd(line)
		return
	}
	if !s.lex(line) {
		return
	}
	b := &s.blk
	if !b.words {
		return
	}
	// Units first: a units word applies to the whole line it is on.
	if b.units >= 0 {
		u := Millimeters
		if b.units == 200 {
			u = Inches
		}
		if s.p.Declared == UnitsUnset {
			s.p.Declared, s.p.UnitsLine = u, s.line
		}
		s.active = u
		s.decideUnits()
		s.scale = unitFactor(u, s.p.Units)
	}
	if !s.checkWords() {
		return
	}
	// The order of execution of RS274NGC (NISTIR 6556 §3.8, table 8):
	// feed, speed, tool, spindle, dwell, plane, units (done above),
	// distance mode, motion, stop.
	if b.has&bitF != 0 {
		s.decideUnits()
		s.feed = b.val['F'-'A'] * s.scale
	}
	if b.has&bitS != 0 {
		s.speed = b.val['S'-'A']
	}
	if b.has&bitT != 0 {
		s.tool = int(b.val['T'-'A'])
	}
	switch b.spindle {
	case 30:
		s.spindle = SpindleClockwise
	case 40:
		s.spindle = SpindleCounterClockwise
	case 50:
		s.spindle = SpindleOff
	}
	if b.dwell >= 0 {
		s.dwell(b.val['P'-'A'])
	}
	switch b.distance {
	case 900:
		s.incremental = false
	case 910:
		s.incremental = true
	}
	if b.motion >= 0 {
		s.motion = b.motion
	}
	if b.has&bitsAxis != 0 || b.motion >= 20 && b.has&(bitI|bitJ|bitR) != 0 {
		s.move()
	}
	if b.stop >= 0 {
		s.ended = true
		s.p.EndLine = s.line
	}
}

// checkWords reports words that are wrong where they stand, returning
// false when the line cannot run.
func (s *simulator) checkWords() bool {
	b := &s.blk
	bad := func(msg string) bool {
		s.problem(RuleBadWord, msg)
		return false
	}
	if b.has&bitF != 0 && b.val['F'-'A'] < 0 {
		return bad("F (feed) " + msgNum(b.val['F'-'A']) + " is negative")
	}
	if b.has&bitS != 0 && b.val['S'-'A'] < 0 {
		return bad("S (speed or power) " + msgNum(b.val['S'-'A']) + " is negative")
	}
	if b.has&bitT != 0 {
		if t := b.val['T'-'A']; t < 0 || t != math.Trunc(t) || t > 1e9 {
			return bad("T (tool) " + msgNum(t) + " is not a whole number, zero or more")
		}
	}
	if b.dwell >= 0 {
		if b.has&bitP == 0 {
			return bad("G4 (dwell) needs a P word: the pause in seconds")
		}
		if b.val['P'-'A'] < 0 {
			return bad("G4 P " + msgNum(b.val['P'-'A']) + " is negative")
		}
	} else if b.has&bitP != 0 {
		return bad("P word without G4")
	}
	motion := s.motion
	if b.motion >= 0 {
		motion = b.motion
	}
	arc := motion == 20 || motion == 30
	if b.has&(bitI|bitJ|bitR) != 0 && !arc {
		return bad("I, J or R word without an arc (G2 or G3) in force")
	}
	if b.has&bitsAxis != 0 && motion < 0 {
		s.problem(RuleModal, "axis words with no motion mode in force (give G0, G1, G2 or G3)")
		return false
	}
	return true
}

// afterEnd records a line after the program end that holds code.
func (s *simulator) afterEnd(line []byte) {
	i := skipBlanks(line, 0)
	for i < len(line) {
		switch c := line[i]; {
		case isBlank(c) || c == '%':
			i++
			continue
		case c == ';':
			return
		case c == '(':
			for i < len(line) && line[i] != ')' {
				i++
			}
			i++
			continue
		}
		s.p.AfterEndCount++
		if len(s.p.AfterEnd) < s.maxProblems {
			s.p.AfterEnd = append(s.p.AfterEnd, s.line)
		}
		return
	}
}

// dwell appends a G4 pause at the current position.
func (s *simulator) dwell(seconds float64) {
	s.decideUnits()
	s.emit(toolpath.Segment{Kind: toolpath.Dwell, Motion: toolpath.Travel, Start: s.pos, End: s.pos, Seconds: seconds}, 4, 0)
}

// target returns the end point of a move from the axis words on the line.
func (s *simulator) target() toolpath.Point {
	b := &s.blk
	end := s.pos
	axis := func(bit uint32, letter byte, cur *float64, out *float64) {
		if b.has&bit == 0 {
			return
		}
		v := b.val[letter-'A'] * s.scale
		if s.incremental {
			v += *cur
		}
		*out = v
	}
	axis(bitX, 'X', &s.pos.X, &end.X)
	axis(bitY, 'Y', &s.pos.Y, &end.Y)
	axis(bitZ, 'Z', &s.pos.Z, &end.Z)
	return end
}

// move runs the motion of the line in the motion mode in force.
func (s *simulator) move() {
	s.decideUnits()
	b := &s.blk
	start := s.pos
	end := s.target()
	var flags uint8
	if !s.knownX || !s.knownY {
		flags |= MoveFromUnknownXY
	}
	if !s.knownZ {
		flags |= MoveFromUnknownZ
		if b.has&(bitX|bitY) != 0 && b.has&bitZ == 0 {
			flags |= MoveXYBeforeZ
		}
	}
	if s.motion >= 20 && (!s.knownX || !s.knownY) {
		s.problem(RuleArcInvalid, "arc from an unknown position: give X and Y with a straight move first")
		return
	}
	// An axis first given on this line: an absolute move starts there,
	// and so did every earlier segment.
	s.learn(&s.knownX, bitX, &start.X, end.X, func(p *toolpath.Point) *float64 { return &p.X })
	s.learn(&s.knownY, bitY, &start.Y, end.Y, func(p *toolpath.Point) *float64 { return &p.Y })
	s.learn(&s.knownZ, bitZ, &start.Z, end.Z, func(p *toolpath.Point) *float64 { return &p.Z })
	var seg toolpath.Segment
	switch s.motion {
	case 0, 10:
		seg = toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Start: start, End: end}
		if s.motion == 10 {
			seg.Motion = toolpath.Cut
		}
	case 20, 30:
		var ok bool
		if seg, ok = s.arc(start, end); !ok {
			return
		}
		if b.has&bitR != 0 {
			flags |= MoveRadiusForm
		}
	}
	s.pos = end
	s.emit(seg, uint8(s.motion/10), flags)
}

// learn marks an axis known the first time the line gives it. In absolute
// mode the move, and every segment before it, is taken to start at the
// given value; in incremental mode it counts from 0.
func (s *simulator) learn(known *bool, bit uint32, start *float64, v float64, axis func(*toolpath.Point) *float64) {
	if *known || s.blk.has&bit == 0 {
		return
	}
	*known = true
	if s.incremental {
		return
	}
	*start = v
	for i := range s.p.Path {
		seg := &s.p.Path[i]
		*axis(&seg.Start), *axis(&seg.End) = v, v
	}
}

// emit appends a segment and its move record.
func (s *simulator) emit(seg toolpath.Segment, code, flags uint8) {
	s.p.Path = append(s.p.Path, seg)
	s.p.Moves = append(s.p.Moves, Move{
		Line: s.line, Code: code, Flags: flags, Units: s.lineUnits(),
		Spindle: s.spindle, Feed: s.feed, Speed: s.speed, Tool: s.tool,
	})
}

// finish closes the program. Segments on an axis the program never
// gives keep 0 there.
func (s *simulator) finish() {
	s.p.Lines = s.line
	if !s.pathUnitsSet {
		s.p.Units = Millimeters
	}
}

// msgNum formats a number for a message.
func msgNum(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }
