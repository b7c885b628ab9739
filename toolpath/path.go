// Package toolpath turns ellipses into machine paths: sequences of straight
// and circular segments in the XY plane with a Z height at each end, each
// marked as cutting or travel.
//
// # The path model
//
// A [Path] is a slice of [Segment] values. A segment is a [Line], an [Arc]
// (a circular arc in XY, helical when Z changes along it) or a [Dwell]
// (a pause in place). Its [Motion] says whether the tool cuts (feed move,
// spindle running, beam or pen down) or travels (rapid, beam off, pen up).
// A path knows nothing of G-code words; package gcodeout writes it.
//
// # Approximation
//
// [Approximator] streams the segments of an ellipse, an elliptical arc or a
// parallel curve (offset) of either within a tolerance [Zone], as lines or as
// tangent-continuous arcs, holding O(1) state and allocating nothing per
// segment.
//
// # Operations
//
// [Profile] cuts a part out or a hole in it (tool or kerf offset to the
// waste side, equal depth passes, holding tabs, lead arcs, ramps),
// [Drill] puts holes or marks at equal arc length, [Dash] draws a dashed
// outline that closes evenly, and [Pocket] clears an elliptical recess.
// [Envelope.Check] refuses a path that leaves the machine's travel and
// [Summarize] reports lengths and an estimated time.
//
// The core works in one length unit, whatever the caller uses; angles are
// radians.
package toolpath

import "math"

// Point is a position in machine space. Z is height: Z0 is the top of the
// stock (router) or the paper (plotter), cuts are at negative Z.
type Point struct{ X, Y, Z float64 }

// Kind says what shape a segment has.
type Kind uint8

const (
	// Line is a straight move from Start to End.
	Line Kind = iota
	// Arc is a circular arc in XY from Start to End about Center, in the
	// direction given by Clockwise; Z changes linearly along it (a helix)
	// when Start.Z != End.Z.
	Arc
	// Dwell is a pause of Seconds at Start (Start == End).
	Dwell
)

// String returns "line", "arc" or "dwell".
func (k Kind) String() string {
	switch k {
	case Line:
		return "line"
	case Arc:
		return "arc"
	case Dwell:
		return "dwell"
	}
	return "unknown"
}

// Motion says whether a segment cuts or travels.
type Motion uint8

const (
	// Travel is a non-cutting move: a rapid at safe height with the beam off
	// or the pen up.
	Travel Motion = iota
	// Cut is a feed move with the tool engaged: spindle running, beam on or
	// pen down.
	Cut
)

// Role tags what a segment is for, so that pictures and checks can tell a
// holding tab from the contour. It never changes the geometry.
type Role uint8

const (
	// Contour is the curve itself (the default).
	Contour Role = iota
	// LeadIn is the approach arc or line onto the contour.
	LeadIn
	// LeadOut is the departure from the contour.
	LeadOut
	// Ramp is a sloped entry along the contour.
	Ramp
	// Plunge is a straight vertical feed into the stock.
	Plunge
	// Tab is a stretch lifted to leave a holding tab.
	Tab
	// Hole is a drilled hole or a mark at one point.
	Hole
	// Link joins two rings or passes inside cleared material.
	Link
	// Retract is a move up out of the stock.
	Retract
)

// Segment is one move of a path.
//
// For an Arc, Center is the centre in XY and Radius its distance from Start
// (and, within rounding, from End); a full circle has Start == End. For a
// Dwell, Seconds is the pause and Start == End.
type Segment struct {
	Kind      Kind
	Motion    Motion
	Role      Role
	Start     Point
	End       Point
	CenterX   float64 // arc centre X
	CenterY   float64 // arc centre Y
	Radius    float64 // arc radius
	Clockwise bool    // arc direction seen from +Z
	// Feed is a feed rate for this move alone (a plunge, say); zero means the
	// program's cutting feed.
	Feed float64
	// Seconds is the pause of a Dwell.
	Seconds float64
}

// Path is a sequence of segments, in order.
type Path []Segment

// Sweep returns the signed angle an arc turns through, in radians: positive
// counter-clockwise, in (-2π, 2π]; a full circle (Start == End in XY) gives
// ±2π. It returns 0 for other kinds.
func (s Segment) Sweep() float64 {
	if s.Kind != Arc {
		return 0
	}
	a0 := math.Atan2(s.Start.Y-s.CenterY, s.Start.X-s.CenterX)
	a1 := math.Atan2(s.End.Y-s.CenterY, s.End.X-s.CenterX)
	d := a1 - a0
	if s.Clockwise {
		for d >= 0 {
			d -= 2 * math.Pi
		}
		for d < -2*math.Pi {
			d += 2 * math.Pi
		}
	} else {
		for d <= 0 {
			d += 2 * math.Pi
		}
		for d > 2*math.Pi {
			d -= 2 * math.Pi
		}
	}
	return d
}

// Length returns the length of the segment in space (a helix counts its
// rise); a Dwell has length 0.
func (s Segment) Length() float64 {
	dz := s.End.Z - s.Start.Z
	switch s.Kind {
	case Line:
		return math.Sqrt((s.End.X-s.Start.X)*(s.End.X-s.Start.X) + (s.End.Y-s.Start.Y)*(s.End.Y-s.Start.Y) + dz*dz)
	case Arc:
		l := math.Abs(s.Sweep()) * s.Radius
		return math.Hypot(l, dz)
	}
	return 0
}

// At returns the point at fraction u in [0, 1] along the segment.
func (s Segment) At(u float64) Point {
	z := s.Start.Z + u*(s.End.Z-s.Start.Z)
	switch s.Kind {
	case Arc:
		a0 := math.Atan2(s.Start.Y-s.CenterY, s.Start.X-s.CenterX)
		a := a0 + u*s.Sweep()
		return Point{s.CenterX + s.Radius*math.Cos(a), s.CenterY + s.Radius*math.Sin(a), z}
	case Line:
		return Point{s.Start.X + u*(s.End.X-s.Start.X), s.Start.Y + u*(s.End.Y-s.Start.Y), z}
	}
	return s.Start
}

// Bounds returns the XY bounding box of the path, arcs included exactly,
// and false for an empty path. Dwells count as their point.
func (p Path) Bounds() (minX, minY, maxX, maxY float64, ok bool) {
	minX, minY = math.Inf(1), math.Inf(1)
	maxX, maxY = math.Inf(-1), math.Inf(-1)
	grow := func(x, y float64) {
		minX, maxX = math.Min(minX, x), math.Max(maxX, x)
		minY, maxY = math.Min(minY, y), math.Max(maxY, y)
	}
	for _, s := range p {
		grow(s.Start.X, s.Start.Y)
		grow(s.End.X, s.End.Y)
		if s.Kind != Arc {
			continue
		}
		a0 := math.Atan2(s.Start.Y-s.CenterY, s.Start.X-s.CenterX)
		sw := s.Sweep()
		// Axis extremes the arc passes through.
		for k := 0; k < 4; k++ {
			q := float64(k) * math.Pi / 2
			d := math.Remainder(q-a0, 2*math.Pi)
			if sw > 0 && d < 0 {
				d += 2 * math.Pi
			}
			if sw < 0 && d > 0 {
				d -= 2 * math.Pi
			}
			if (sw > 0 && d <= sw) || (sw < 0 && d >= sw) {
				grow(s.CenterX+s.Radius*math.Cos(q), s.CenterY+s.Radius*math.Sin(q))
			}
		}
	}
	return minX, minY, maxX, maxY, len(p) > 0
}

// ZRange returns the lowest and highest Z the path reaches, and false for an
// empty path.
func (p Path) ZRange() (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, s := range p {
		lo = math.Min(lo, math.Min(s.Start.Z, s.End.Z))
		hi = math.Max(hi, math.Max(s.Start.Z, s.End.Z))
	}
	return lo, hi, len(p) > 0
}

// Lengths returns the total length of cutting and of travel moves.
func (p Path) Lengths() (cut, travel float64) {
	for _, s := range p {
		if s.Motion == Cut {
			cut += s.Length()
		} else {
			travel += s.Length()
		}
	}
	return cut, travel
}
