package toolpath

// Each builder first walks the contour of a pass into the plan's buffer,
// then appends to the path the moves that reach its first point (travel,
// plunge, lead-in), the buffered contour, and the moves that leave its
// last point, so that the leads meet the contour exactly where its
// approximation starts and ends.

// build appends the whole profile path to dst.
func (p *profilePlan) build(dst Path) (Path, error) {
	switch p.s.Machine {
	case Router:
		if p.rampLen > 0 {
			return p.buildRamped(dst)
		}
		return p.buildPlunged(dst)
	case Laser:
		return p.buildLaser(dst)
	}
	return p.buildPlotter(dst)
}

// passZ returns the height of router pass k of p.passes (1-based): equal
// steps, the last exactly at −Depth.
func (p *profilePlan) passZ(k int) float64 {
	if k >= p.passes {
		return -p.s.Depth
	}
	return -float64(k) * p.step
}

// contour walks from u0 to u1 at the heights of lv into the plan's
// buffer and returns it with its first point and the point the lead-in
// (if any) starts from.
func (p *profilePlan) contour(u1 float64, lv level) (Path, Point, vec, error) {
	if p.buf == nil {
		p.buf = make(Path, 0, p.loopSize)
	}
	buf, err := p.walk(p.buf[:0], u1, lv)
	p.buf = buf
	if err != nil {
		return nil, Point{}, vec{}, err
	}
	if len(buf) == 0 {
		return nil, Point{}, vec{}, &SpecError{Field: "Tol", Value: p.s.Tol, Err: ErrStalled}
	}
	first := buf[0].Start
	start := vec{first.X, first.Y}
	if p.lead > 0 {
		start, _ = p.leadGeometry(start, p.param(lv.u0), true)
	}
	return buf, first, start, nil
}

// enter appends the lead-in from the end of dst to first (if there is a
// lead), and the contour.
func (p *profilePlan) enter(dst Path, first Point, u0 float64, buf Path) Path {
	if p.lead > 0 {
		dst = append(dst, p.leadArc(dst[len(dst)-1].End, vec{first.X, first.Y}, p.param(u0), true))
	}
	return appendJoined(dst, buf)
}

// leave appends the lead-out from the end of dst, the contour having
// ended at walk position u1.
func (p *profilePlan) leave(dst Path, u1 float64) Path {
	if p.lead == 0 {
		return dst
	}
	at := dst[len(dst)-1].End
	return append(dst, p.leadArc(at, vec{at.X, at.Y}, p.param(u1), false))
}

// buildPlunged: each pass plunges at the start (of the lead-in), runs the
// lead-in, the loop and the lead-out, and links back through the waste.
func (p *profilePlan) buildPlunged(dst Path) (Path, error) {
	for k := 1; k <= p.passes; k++ {
		z := p.passZ(k)
		buf, first, start, err := p.contour(p.length, level{top: z, bottom: z})
		if err != nil {
			return dst, err
		}
		if k == 1 {
			dst = travelXY(dst, start.x, start.y, p.s.SafeZ)
		} else if p.lead > 0 {
			at := dst[len(dst)-1].End
			dst = append(dst, Segment{Kind: Line, Motion: Cut, Role: Link, Start: at, End: Point{start.x, start.y, at.Z}})
		}
		// The walk starts raised if the entry lies on a tab.
		dst = p.moveZ(dst, first.Z, Plunge)
		dst = p.enter(dst, first, 0, buf)
		dst = p.leave(dst, p.length)
	}
	return travelZ(dst, p.s.SafeZ, Retract), nil
}

// buildRamped: feed down to Z0, lead in, then every pass ramps down from
// the level above and completes a loop at its own level.
func (p *profilePlan) buildRamped(dst Path) (Path, error) {
	buf := make(Path, 0, p.loopSize*p.passes)
	u, top := 0.0, 0.0
	for k := 1; k <= p.passes; k++ {
		z := p.passZ(k)
		end := u + p.rampLen + p.length
		var err error
		if buf, err = p.walk(buf, end, level{u0: u, top: top, bottom: z, ramp: p.rampLen}); err != nil {
			return dst, err
		}
		u, top = end, z
	}
	p.buf = buf
	if len(buf) == 0 {
		return dst, &SpecError{Field: "Tol", Value: p.s.Tol, Err: ErrStalled}
	}
	first := buf[0].Start
	start := vec{first.X, first.Y}
	if p.lead > 0 {
		start, _ = p.leadGeometry(start, p.param(0), true)
	}
	dst = travelXY(dst, start.x, start.y, p.s.SafeZ)
	dst = p.moveZ(dst, first.Z, Plunge)
	dst = p.enter(dst, first, 0, buf)
	dst = p.leave(dst, u)
	return travelZ(dst, p.s.SafeZ, Retract), nil
}

// buildLaser: passes at FocusZ, each with its leads; a Travel move back
// to the start of the lead-in between passes.
func (p *profilePlan) buildLaser(dst Path) (Path, error) {
	fz := p.s.FocusZ
	buf, first, start, err := p.contour(p.length, level{top: fz, bottom: fz})
	if err != nil {
		return dst, err
	}
	for k := 1; k <= p.passes; k++ {
		if k == 1 || p.lead > 0 {
			dst = travelXY(dst, start.x, start.y, fz)
		}
		dst = p.enter(dst, first, 0, buf)
		dst = p.leave(dst, p.length)
	}
	return dst, nil
}

// buildPlotter: pen down at the start, lead-in, loop, lead-out, pen up.
func (p *profilePlan) buildPlotter(dst Path) (Path, error) {
	s := &p.s
	buf, first, start, err := p.contour(p.length, level{top: s.PenDown, bottom: s.PenDown})
	if err != nil {
		return dst, err
	}
	dst = travelXY(dst, start.x, start.y, s.PenUp)
	dst = p.moveZ(dst, s.PenDown, Plunge)
	dst = p.enter(dst, first, 0, buf)
	dst = p.leave(dst, p.length)
	return travelZ(dst, s.PenUp, Retract), nil
}

// leadGeometry returns, for the contour point q at parameter t, the far
// end of the lead arc (the start of a lead-in, the end of a lead-out) and
// the arc's centre. The arc is a quarter circle of radius p.lead tangent
// to the cut direction T at q, its centre C = q + R·W on the waste side
// (W the unit normal towards the waste: outward except for an inside
// cut); a lead-in starts at C − R·T, a lead-out ends at C + R·T.
func (p *profilePlan) leadGeometry(q vec, t float64, in bool) (far, centre vec) {
	tg := p.curve.Tangent(t)
	nr := p.curve.Normal(t)
	T := vec{tg.X, tg.Y}.scale(p.sigma())
	W := vec{nr.X, nr.Y}
	if p.side == SideInside {
		W = W.scale(-1)
	}
	centre = q.addScaled(W, p.lead)
	if in {
		return centre.addScaled(T, -p.lead), centre
	}
	return centre.addScaled(T, p.lead), centre
}

// leadArc returns the lead-in arc from at to the contour point q (in), or
// the lead-out arc from q = at (out), at the height of at.
func (p *profilePlan) leadArc(at Point, q vec, t float64, in bool) Segment {
	far, c := p.leadGeometry(q, t, in)
	tg := p.curve.Tangent(t)
	T := vec{tg.X, tg.Y}.scale(p.sigma())
	// Counter-clockwise about C when the radius to q turns left into T.
	cw := q.sub(c).cross(T) < 0
	s := Segment{Kind: Arc, Motion: Cut, CenterX: c.x, CenterY: c.y, Radius: p.lead, Clockwise: cw}
	if in {
		s.Role, s.Start, s.End = LeadIn, at, Point{q.x, q.y, at.Z}
	} else {
		s.Role, s.Start, s.End = LeadOut, at, Point{far.x, far.y, at.Z}
	}
	return s
}
