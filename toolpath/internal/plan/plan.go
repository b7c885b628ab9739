// Package plan reads a path the way a picture shows it, seen from above:
// which moves cut or travel in the XY plane, which cutting moves leave a
// holding tab, and where holes and marks are. Packages preview and svg
// share it so that the PNG and the SVG agree.
package plan

import (
	"math"

	"github.com/focitools/foci/toolpath"
)

// Class says how one segment appears in plan view.
type Class uint8

const (
	// Hidden moves do not move in XY: plunges, retracts, dwells.
	Hidden Class = iota
	// Travel is a travel move in XY.
	Travel
	// Cut is a cutting move in XY.
	Cut
	// Tab is a cutting move in XY that leaves a holding tab.
	Tab
)

// Cuts reports whether c cuts in XY (Cut or Tab).
func (c Class) Cuts() bool { return c == Cut || c == Tab }

// Point is a position in the XY plane.
type Point struct{ X, Y float64 }

// MovesXY reports whether s moves in the XY plane: a line whose ends
// differ in X or Y, or an arc of positive radius (a full circle ends where
// it starts).
func MovesXY(s *toolpath.Segment) bool {
	switch s.Kind {
	case toolpath.Line:
		return s.Start.X != s.End.X || s.Start.Y != s.End.Y
	case toolpath.Arc:
		return s.Radius > 0
	}
	return false
}

// Height returns the height a segment is shaded and compared by: the
// middle of its Z range.
func Height(s *toolpath.Segment) float64 { return (s.Start.Z + s.End.Z) / 2 }

// Classify returns the class of every segment of p, appended to dst[:0].
//
// A cutting move is a Tab when its Role is [toolpath.Tab], or when it is
// raised above both an earlier and a later cutting move in XY of the same
// unbroken run of cuts: the tool climbed, moved on, and went back down.
// Passes that step down, a ramp into the cut and a final climb out are
// not tabs.
func Classify(dst []Class, p toolpath.Path) []Class {
	dst = dst[:0]
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := range p {
		s := &p[i]
		c := Hidden
		if MovesXY(s) {
			c = Travel
			if s.Motion == toolpath.Cut {
				c = Cut
				z := Height(s)
				lo, hi = math.Min(lo, z), math.Max(hi, z)
			}
		}
		dst = append(dst, c)
	}
	if lo > hi {
		return dst
	}
	eps := 1e-9 * (1 + math.Abs(lo) + math.Abs(hi))
	// The lowest cutting height later in the same run, walking back; a
	// travel move ends a run.
	later := make([]float64, len(p))
	low := math.Inf(1)
	for i := len(p) - 1; i >= 0; i-- {
		later[i] = low
		s := &p[i]
		if s.Motion != toolpath.Cut {
			low = math.Inf(1)
		} else if dst[i] == Cut {
			low = math.Min(low, Height(s))
		}
	}
	low = math.Inf(1)
	for i := range p {
		s := &p[i]
		if s.Motion != toolpath.Cut {
			low = math.Inf(1)
			continue
		}
		if dst[i] != Cut {
			continue
		}
		z := Height(s)
		if s.Role == toolpath.Tab || (z > low+eps && z > later[i]+eps) {
			dst[i] = Tab
		}
		low = math.Min(low, z)
	}
	return dst
}

// Holes returns the positions of holes and marks in p, each once, in the
// order first met: a cutting move with [toolpath.Hole], a dwell while
// cutting, and a vertical feed downwards that is not followed by cutting
// in XY (a drilled hole, a pen dot). Repeats at one XY (peck drilling)
// count once.
func Holes(p toolpath.Path) []Point {
	var out []Point
	seen := map[Point]bool{}
	add := func(x, y float64) {
		q := Point{x, y}
		if !seen[q] {
			seen[q] = true
			out = append(out, q)
		}
	}
	for i := range p {
		s := &p[i]
		if s.Motion != toolpath.Cut {
			continue
		}
		switch {
		case s.Role == toolpath.Hole:
			add(s.End.X, s.End.Y)
		case s.Kind == toolpath.Dwell:
			add(s.Start.X, s.Start.Y)
		case s.Kind == toolpath.Line && !MovesXY(s) && s.End.Z < s.Start.Z && !cutsNext(p, i+1):
			add(s.End.X, s.End.Y)
		}
	}
	return out
}

// cutsNext reports whether the first segment from i on that is not a
// dwell or a further vertical feed downwards is a cutting move in XY.
func cutsNext(p toolpath.Path, i int) bool {
	for ; i < len(p); i++ {
		s := &p[i]
		if s.Kind == toolpath.Dwell {
			continue
		}
		if MovesXY(s) {
			return s.Motion == toolpath.Cut
		}
		if s.Motion != toolpath.Cut || s.End.Z >= s.Start.Z {
			return false
		}
	}
	return false
}
