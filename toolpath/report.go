package toolpath

import "math"

// Rates are the speeds a time estimate assumes, in the path's length unit
// per minute (feeds) and per second squared (acceleration).
type Rates struct {
	// Feed is the cutting feed of segments whose Feed is 0; greater than
	// zero.
	Feed float64
	// PlungeFeed is the feed of moves into the stock whose Feed is 0
	// (Role Plunge or Hole, or a Cut line straight down); 0 means Feed.
	PlungeFeed float64
	// Rapid is the speed of Travel moves; greater than zero.
	Rapid float64
	// Accel is the acceleration and deceleration of every axis move, the
	// same for all; 0 means none is modelled (moves at full speed from
	// the start).
	Accel float64
	// CornerAngle (radians) is the change of direction above which the
	// machine comes to a stop between two moves; 0 means 10°, a modelling
	// choice (no published source) between a machine that blends every
	// join and one that stops at each.
	CornerAngle float64
}

// Validate returns an *OpError naming the first bad field of r.
func (r Rates) Validate() error {
	return firstErr(checkPositive("Feed", r.Feed), checkNonNegative("PlungeFeed", r.PlungeFeed),
		checkPositive("Rapid", r.Rapid), checkNonNegative("Accel", r.Accel), r.checkAngle())
}

func (r Rates) checkAngle() error {
	if err := checkNonNegative("CornerAngle", r.CornerAngle); err != nil {
		return err
	}
	if r.CornerAngle > math.Pi {
		return opLimit("CornerAngle", r.CornerAngle, math.Pi, ErrChoice)
	}
	return nil
}

// Report summarises a path.
type Report struct {
	// CutLength and TravelLength are the lengths of the Cut and Travel
	// moves (helices count their rise).
	CutLength, TravelLength float64
	// Seconds is the estimated running time (see [Summarize]); 0 when
	// the Rates do not pass Validate.
	Seconds float64
	// DwellSeconds is the part of Seconds spent in dwells.
	DwellSeconds float64
	// Segments counts the segments; Stops the times the machine is
	// assumed to come to rest (the runs of the estimate).
	Segments, Stops int
	// MinX, MinY, MaxX, MaxY is the XY bounding box, arcs included
	// exactly, and MinZ, MaxZ the Z range; all zero for an empty path.
	MinX, MinY, MaxX, MaxY float64
	MinZ, MaxZ             float64
}

// Summarize returns the lengths, segment count, bounding box and an
// estimated running time of p.
//
// The estimate splits the path into runs at every stop: before and after
// each Travel move (each is a run of its own, at Rapid), at each dwell
// (whose Seconds are added), where the feed changes, and at each join
// where the direction of motion in space turns by more than CornerAngle.
// A run of length D at speed v (the feed over 60) with acceleration A
// follows a trapezoidal velocity profile from rest to rest: D/v + v/A
// when D ≥ v²/A (it reaches v), else 2·√(D/A) (a triangle); with A = 0
// simply D/v. Joins within a run are taken at full speed and the
// centripetal limit on arcs is not modelled, so the estimate is a lower
// bound for a machine with that acceleration; a real controller that
// slows at every small join takes longer.
func Summarize(p Path, r Rates) Report {
	var rep Report
	rep.Segments = len(p)
	rep.CutLength, rep.TravelLength = p.Lengths()
	if x0, y0, x1, y1, ok := p.Bounds(); ok {
		rep.MinX, rep.MinY, rep.MaxX, rep.MaxY = x0, y0, x1, y1
		rep.MinZ, rep.MaxZ, _ = p.ZRange()
	}
	if r.Validate() != nil {
		return rep
	}
	corner := r.CornerAngle
	if corner == 0 {
		corner = math.Pi / 18
	}
	cosCorner := math.Cos(corner)
	var (
		runLen, runRate float64
		runEnd          vec3
		inRun           bool
	)
	flush := func() {
		if inRun {
			rep.Seconds += trapezoid(runLen, runRate/60, r.Accel)
			rep.Stops++
		}
		inRun, runLen = false, 0
	}
	for i := range p {
		s := &p[i]
		if s.Kind == Dwell {
			flush()
			rep.Seconds += s.Seconds
			rep.DwellSeconds += s.Seconds
			continue
		}
		l := s.Length()
		if !(l > 0) {
			continue
		}
		rate := r.Rapid
		if s.Motion == Cut {
			rate = cutRate(s, r)
		}
		d0, d1 := s.directions()
		if !inRun || s.Motion == Travel || rate != runRate || d0.dot(runEnd) < cosCorner {
			flush()
		}
		inRun, runRate = true, rate
		runLen += l
		runEnd = d1
		if s.Motion == Travel {
			flush()
		}
	}
	flush()
	return rep
}

// cutRate returns the feed of a cutting move.
func cutRate(s *Segment, r Rates) float64 {
	if s.Feed > 0 {
		return s.Feed
	}
	down := s.Kind == Line && s.Start.X == s.End.X && s.Start.Y == s.End.Y && s.End.Z < s.Start.Z
	if (s.Role == Plunge || s.Role == Hole || down) && r.PlungeFeed > 0 {
		return r.PlungeFeed
	}
	return r.Feed
}

// trapezoid returns the time to move d from rest to rest at top speed v
// with acceleration a (a = 0: no acceleration limit).
func trapezoid(d, v, a float64) float64 {
	if a == 0 {
		return d / v
	}
	if d >= v*v/a {
		return d/v + v/a
	}
	return 2 * math.Sqrt(d/a)
}

// vec3 is a direction in space.
type vec3 struct{ x, y, z float64 }

func (a vec3) dot(b vec3) float64 { return a.x*b.x + a.y*b.y + a.z*b.z }

// directions returns the unit directions of motion in space at the start
// and end of a line or arc of positive length.
func (s *Segment) directions() (d0, d1 vec3) {
	dz := s.End.Z - s.Start.Z
	if s.Kind == Line {
		l := s.Length()
		d := vec3{(s.End.X - s.Start.X) / l, (s.End.Y - s.Start.Y) / l, dz / l}
		return d, d
	}
	sw := s.Sweep()
	lxy := math.Abs(sw) * s.Radius
	tan := func(x, y float64) vec3 {
		rx, ry := x-s.CenterX, y-s.CenterY
		h := math.Hypot(rx, ry)
		if h == 0 {
			return vec3{0, 0, math.Copysign(1, dz)}
		}
		// Unit tangent in XY, counter-clockwise or clockwise.
		tx, ty := -ry/h, rx/h
		if sw < 0 {
			tx, ty = -tx, -ty
		}
		n := math.Hypot(lxy, dz)
		return vec3{tx * lxy / n, ty * lxy / n, dz / n}
	}
	return tan(s.Start.X, s.Start.Y), tan(s.End.X, s.End.Y)
}
