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

	pathUnitsSet bool    // s.p.Units is decided
	active       Units   // G20/G21 in force, UnitsUnset before any
	written      Units   // the unit the current line is written in
	scale        float64 // turns the current line's lengths into the path's

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
	s := &simulator{p: &Program{}, maxProblems: opts.MaxProblems, motion: -1, tool: -1, scale: 1, written: Millimeters}
	if s.maxProblems <= 0 {
		s.maxProblems = defaultMaxProblems
	}
	if opts.Units != UnitsUnset {
		s.p.Units, s.pathUnitsSet = opts.Units, true
	}
	return s
}

// decideUnits fixes the path's unit the first time a length is needed:
// the unit the line is written in, else millimetres.
func (s *simulator) decideUnits(written Units) {
	if s.pathUnitsSet {
		return
	}
	s.pathUnitsSet = true
	s.p.Units = written
	if s.p.Units == UnitsUnset {
		s.p.Units = Millimeters
	}
}

// runLine lexes and runs one source line. Everything that can refuse the
// line is settled before any state changes, so a refused line leaves no
// trace but its problem.
func (s *simulator) runLine(line []byte) {
	if s.ended {
		s.afterEnd(line)
		return
	}
	if !s.lex(line) {
		return
	}
	b := &s.blk
	if !b.words || !s.checkWords() {
		return
	}
	// The unit the line is written in: a units word applies to the whole
	// line it is on.
	written := s.active
	if b.units >= 0 {
		written = Millimeters
		if b.units == 200 {
			written = Inches
		}
	}
	if b.units >= 0 || b.has&(bitF|bitsAxis|bitI|bitJ|bitR) != 0 || b.dwell >= 0 {
		s.decideUnits(written)
	}
	if written == UnitsUnset {
		written = s.p.Units // no units word yet: the path's, once decided
		if !s.pathUnitsSet {
			written = Millimeters
		}
	}
	s.written = written
	s.scale = unitFactor(written, s.p.Units)
	incremental := s.incremental
	switch b.distance {
	case 900:
		incremental = false
	case 910:
		incremental = true
	}
	motion := s.motion
	if b.motion >= 0 {
		motion = b.motion
	}
	moves := b.has&bitsAxis != 0 || motion >= 20 && b.has&(bitI|bitJ|bitR) != 0
	var seg toolpath.Segment
	var flags uint8
	if moves {
		var ok bool
		if seg, flags, ok = s.plan(motion, incremental); !ok {
			return
		}
	}
	// Run the line in the order of execution of RS274NGC (NISTIR 6556
	// §3.8, table 8): feed, speed, tool, spindle, dwell, plane, units,
	// distance mode, motion, stop.
	if b.has&bitF != 0 {
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
		s.emit(toolpath.Segment{Kind: toolpath.Dwell, Motion: toolpath.Travel, Start: s.pos, End: s.pos, Seconds: b.val['P'-'A']}, 4, 0)
	}
	if b.units >= 0 {
		if s.p.Declared == UnitsUnset {
			s.p.Declared, s.p.UnitsLine = written, s.line
		}
		s.active = written
	}
	s.incremental = incremental
	s.motion = motion
	if moves {
		s.commit(seg, flags, uint8(motion/10))
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

// plan works out the segment of the line's move in the given motion mode
// and distance mode, without changing any state. An axis the program has
// not given before starts where this line sends it (absolute mode) or at
// 0 (incremental mode).
func (s *simulator) plan(motion int16, incremental bool) (toolpath.Segment, uint8, bool) {
	b := &s.blk
	start, end := s.pos, s.pos
	var flags uint8
	axis := func(bit uint32, letter byte, known bool, start, end *float64) {
		if b.has&bit == 0 {
			return
		}
		v := b.val[letter-'A'] * s.scale
		if incremental {
			v += *start
		} else if !known {
			*start = v
		}
		*end = v
	}
	axis(bitX, 'X', s.knownX, &start.X, &end.X)
	axis(bitY, 'Y', s.knownY, &start.Y, &end.Y)
	axis(bitZ, 'Z', s.knownZ, &start.Z, &end.Z)
	if !s.knownX || !s.knownY {
		flags |= MoveFromUnknownXY
	}
	if b.has&(bitX|bitY) != 0 {
		flags |= MoveGivesXY
	}
	if !s.knownZ {
		flags |= MoveFromUnknownZ
		if b.has&(bitX|bitY) != 0 && b.has&bitZ == 0 {
			flags |= MoveXYBeforeZ
		}
	}
	switch motion {
	case 0, 10:
		seg := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Start: start, End: end}
		if motion == 10 {
			seg.Motion = toolpath.Cut
		}
		return seg, flags, true
	}
	if !s.knownX || !s.knownY {
		s.problem(RuleArcInvalid, "arc from an unknown position: give X and Y with a straight move first")
		return toolpath.Segment{}, 0, false
	}
	if b.has&bitR != 0 {
		flags |= MoveRadiusForm
	}
	seg, ok := s.arc(start, end, motion == 20)
	return seg, flags, ok
}

// commit makes a planned move: axes given for the first time become known
// (and every earlier segment, which started nowhere known, is put where
// the axis first is), the position moves, the segment is recorded.
func (s *simulator) commit(seg toolpath.Segment, flags, code uint8) {
	b := &s.blk
	learn := func(known *bool, bit uint32, v float64, axis func(*toolpath.Point) *float64) {
		if *known || b.has&bit == 0 {
			return
		}
		*known = true
		if s.incremental {
			return // counted from 0, where the earlier segments are
		}
		for i := range s.p.Path {
			e := &s.p.Path[i]
			*axis(&e.Start), *axis(&e.End) = v, v
		}
	}
	learn(&s.knownX, bitX, seg.Start.X, func(p *toolpath.Point) *float64 { return &p.X })
	learn(&s.knownY, bitY, seg.Start.Y, func(p *toolpath.Point) *float64 { return &p.Y })
	learn(&s.knownZ, bitZ, seg.Start.Z, func(p *toolpath.Point) *float64 { return &p.Z })
	s.pos = seg.End
	s.emit(seg, code, flags)
}

// emit appends a segment and its move record.
func (s *simulator) emit(seg toolpath.Segment, code, flags uint8) {
	s.p.Path = append(s.p.Path, seg)
	s.p.Moves = append(s.p.Moves, Move{
		Line: s.line, Code: code, Flags: flags, Units: s.written,
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
