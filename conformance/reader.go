package conformance

import (
	"bytes"
	"errors"
	"fmt"

	"github.com/focitools/foci/toolpath"
)

// Units is the length unit of a program or a path.
type Units uint8

const (
	// UnitsUnset means no unit was chosen.
	UnitsUnset Units = iota
	// Millimeters is G21.
	Millimeters
	// Inches is G20.
	Inches
)

// String returns "mm", "inch" or "unset".
func (u Units) String() string {
	switch u {
	case Millimeters:
		return "mm"
	case Inches:
		return "inch"
	}
	return "unset"
}

// perMillimeter returns how many of u make a millimetre (1 for mm,
// 1/25.4 for inches; the inch is 25.4 mm exactly by the 1959 agreement).
func (u Units) perMillimeter() float64 {
	if u == Inches {
		return 1 / 25.4
	}
	return 1
}

// unitFactor returns the factor that turns lengths in from into lengths in to.
func unitFactor(from, to Units) float64 {
	if from == to || from == UnitsUnset || to == UnitsUnset {
		return 1
	}
	if from == Inches {
		return 25.4
	}
	return 1 / 25.4
}

// Spindle is the state of the spindle, the laser beam or the pen servo, as
// set by M3, M4 and M5.
type Spindle uint8

const (
	// SpindleOff is M5, and the state before any M3 or M4.
	SpindleOff Spindle = iota
	// SpindleClockwise is M3.
	SpindleClockwise
	// SpindleCounterClockwise is M4.
	SpindleCounterClockwise
)

// String returns "off", "M3" or "M4".
func (s Spindle) String() string {
	switch s {
	case SpindleClockwise:
		return "M3"
	case SpindleCounterClockwise:
		return "M4"
	}
	return "off"
}

// Move flags.
const (
	// MoveRadiusForm marks an arc given with R instead of I and J.
	MoveRadiusForm uint8 = 1 << iota
	// MoveFromUnknownXY marks a move that starts before the program has
	// given any X and Y: its start is taken to be where the program first
	// sends the tool.
	MoveFromUnknownXY
	// MoveFromUnknownZ marks a move that starts before the program has
	// given any Z: its height is taken to be the first Z the program gives.
	MoveFromUnknownZ
	// MoveXYBeforeZ marks a move that gives X or Y, but no Z, before the
	// program has given any Z: the tool moves at whatever height it was
	// left.
	MoveXYBeforeZ
	// MoveGivesXY marks a move whose line gives X or Y. With
	// MoveFromUnknownXY it moves in XY even though its recorded start and
	// end agree.
	MoveGivesXY
)

// Move is what the program said about one segment of [Program.Path].
type Move struct {
	// Line is the 1-based source line.
	Line int
	// Code is the G code that made the segment: 0, 1, 2, 3, or 4 for a
	// dwell.
	Code uint8
	// Flags holds the Move flags (MoveRadiusForm, ...).
	Flags uint8
	// Units is the unit the line was written in (G20 or G21 in force);
	// the segment itself is in [Program.Units].
	Units Units
	// Spindle is the M3/M4/M5 state during the move.
	Spindle Spindle
	// Feed is the F value in force, in Program.Units per minute; 0 when
	// none has been set.
	Feed float64
	// Speed is the S value in force (spindle speed or laser power); 0
	// when none has been set.
	Speed float64
	// Tool is the last T number, or -1 when none was given.
	Tool int
}

// Program is a program read back by [Read].
type Program struct {
	// Path holds the segments: G0 as Travel lines, G1 as Cut lines, G2 and
	// G3 as Cut arcs, G4 as Dwell segments. Lengths are in Units.
	Path toolpath.Path
	// Moves[i] describes Path[i].
	Moves []Move
	// Units is the unit of every length in Path and of Feed: the one
	// asked for in [ReadOptions.Units], else the program's first G20 or
	// G21 (when it comes before the first length), else millimetres.
	Units Units
	// Declared is the program's first G20 or G21, or UnitsUnset.
	Declared Units
	// UnitsLine is the line of the first G20 or G21, 0 if there is none.
	UnitsLine int
	// EndLine is the line of the first M2 or M30, 0 if there is none.
	EndLine int
	// AfterEnd lists lines after the end that hold code (not only
	// comments, blanks or %), at most ReadOptions.MaxProblems of them;
	// AfterEndCount counts them all.
	AfterEnd      []int
	AfterEndCount int
	// Lines is the number of source lines.
	Lines int
	// Problems are the reading problems, in line order, at most
	// ReadOptions.MaxProblems; ProblemsDropped counts the rest.
	Problems        []Violation
	ProblemsDropped int
}

// ReadOptions adjusts [Read]. The zero value is ready to use.
type ReadOptions struct {
	// Units, when set, is the unit the path is returned in: lengths the
	// program writes in the other unit are converted (1 in = 25.4 mm). It
	// is also the unit assumed for lines before any G20 or G21.
	Units Units
	// MaxProblems bounds the problems (and after-end lines) kept;
	// 0 means 1000.
	MaxProblems int
	// MaxBytes refuses larger sources with [ErrTooLarge]; 0 means 1 GiB.
	MaxBytes int
}

// ErrTooLarge is returned by [Read] for a source above ReadOptions.MaxBytes.
var ErrTooLarge = errors.New("conformance: program too large")

const (
	defaultMaxProblems = 1000
	defaultMaxBytes    = 1 << 30
)

// Read reads an RS-274 program and simulates it (see the package
// documentation for the subset). It returns an error only when the source
// is larger than opts.MaxBytes; every other problem is recorded in
// [Program.Problems] and reading goes on. A line with a syntax or modal
// error is not run; an unsupported word or code is reported and the rest
// of its line runs. Read never panics.
//
// The tool starts at an unknown position: until the program gives an axis
// a value, moves are taken to start where that axis is first sent (and
// flagged in [Move.Flags]); an incremental move on an axis not yet known
// counts from 0.
func Read(src []byte, opts ReadOptions) (*Program, error) {
	maxBytes := opts.MaxBytes
	if maxBytes <= 0 {
		maxBytes = defaultMaxBytes
	}
	if len(src) > maxBytes {
		return nil, fmt.Errorf("%w: %d bytes, the limit is %d", ErrTooLarge, len(src), maxBytes)
	}
	r := newSimulator(opts)
	// One segment per line at most, save full lines of several codes:
	// size the path once so a long program does not regrow it.
	if n := bytes.Count(src, []byte{'\n'}) + 1; n > 0 {
		r.p.Path = make(toolpath.Path, 0, n)
		r.p.Moves = make([]Move, 0, n)
	}
	for len(src) > 0 {
		line := src
		if i := bytes.IndexByte(src, '\n'); i >= 0 {
			line, src = src[:i], src[i+1:]
		} else {
			src = nil
		}
		r.line++
		r.runLine(line)
	}
	r.finish()
	return r.p, nil
}

// problem records a reading problem unless the list is full.
func (s *simulator) problem(rule, msg string) {
	if len(s.p.Problems) >= s.maxProblems {
		s.p.ProblemsDropped++
		return
	}
	s.p.Problems = append(s.p.Problems, Violation{Rule: rule, Line: s.line, Message: msg})
}
