package toolpath

// build appends the whole profile path to dst.
func (p *profilePlan) build(dst Path) (Path, error) {
	entry, err := p.pointAt(0)
	if err != nil {
		return dst, err
	}
	start := entry
	if p.lead > 0 {
		start, _ = p.leadGeometry(entry, p.param(0), true)
	}
	s := &p.s
	dst = travelXY(dst, start.x, start.y, s.travelZ())
	switch s.Machine {
	case Router:
		if p.rampLen > 0 {
			return p.buildRamped(dst, entry, start)
		}
		return p.buildPlunged(dst, entry, start)
	case Laser:
		return p.buildLaser(dst, entry, start)
	}
	dst = p.moveZ(dst, s.PenDown, Plunge)
	dst, err = p.loopWithLeads(dst, entry, level{top: s.PenDown, bottom: s.PenDown})
	if err != nil {
		return dst, err
	}
	return travelZ(dst, s.PenUp, Retract), nil
}

// passZ returns the height of router pass k of p.passes (1-based): equal
// steps, the last exactly at −Depth.
func (p *profilePlan) passZ(k int) float64 {
	if k >= p.passes {
		return -p.s.Depth
	}
	return -float64(k) * p.step
}

// buildPlunged: each pass plunges at the start (of the lead-in), runs the
// lead-in, the loop and the lead-out, and links back through the waste.
func (p *profilePlan) buildPlunged(dst Path, entry, start vec) (Path, error) {
	var err error
	for k := 1; k <= p.passes; k++ {
		z := p.passZ(k)
		lv := level{top: z, bottom: z}
		// Where the walk starts, raised over a tab if the entry is on one.
		zw := z
		if p.inTab(0) && z < p.tabTop {
			zw = p.tabTop
		}
		dst = p.moveZ(dst, zw, Plunge)
		if dst, err = p.loopWithLeads(dst, entry, lv); err != nil {
			return dst, err
		}
		if k < p.passes && p.lead > 0 {
			at := dst[len(dst)-1].End
			dst = append(dst, Segment{Kind: Line, Motion: Cut, Role: Link, Start: at, End: Point{start.x, start.y, at.Z}})
		}
	}
	return travelZ(dst, p.s.SafeZ, Retract), nil
}

// buildRamped: feed down to Z0, lead in, then every pass ramps down from
// the level above and completes a loop at its own level.
func (p *profilePlan) buildRamped(dst Path, entry, start vec) (Path, error) {
	dst = p.moveZ(dst, 0, Plunge)
	if p.lead > 0 {
		dst = append(dst, p.leadArc(dst[len(dst)-1].End, entry, p.param(0), true))
	}
	u, top := 0.0, 0.0
	var err error
	for k := 1; k <= p.passes; k++ {
		z := p.passZ(k)
		end := u + p.rampLen + p.length
		if dst, err = p.walk(dst, end, level{u0: u, top: top, bottom: z, ramp: p.rampLen}); err != nil {
			return dst, err
		}
		u, top = end, z
	}
	if p.lead > 0 {
		at := dst[len(dst)-1].End
		dst = append(dst, p.leadArc(at, vec{at.X, at.Y}, p.param(u), false))
	}
	return travelZ(dst, p.s.SafeZ, Retract), nil
}

// buildLaser: passes at FocusZ, each with its leads; a Travel move back
// to the start of the lead-in between passes.
func (p *profilePlan) buildLaser(dst Path, entry, start vec) (Path, error) {
	fz := p.s.FocusZ
	var err error
	for k := 1; k <= p.passes; k++ {
		if k > 1 && p.lead > 0 {
			dst = travelXY(dst, start.x, start.y, fz)
		}
		if dst, err = p.loopWithLeads(dst, entry, level{top: fz, bottom: fz}); err != nil {
			return dst, err
		}
	}
	return dst, nil
}

// loopWithLeads appends the lead-in (if any) from the end of dst, one
// whole loop at the heights of lv, and the lead-out.
func (p *profilePlan) loopWithLeads(dst Path, entry vec, lv level) (Path, error) {
	t0 := p.param(0)
	if p.lead > 0 {
		at := dst[len(dst)-1].End
		dst = append(dst, p.leadArc(at, entry, t0, true))
	}
	dst, err := p.walk(dst, p.length, lv)
	if err != nil {
		return dst, err
	}
	if p.lead > 0 {
		at := dst[len(dst)-1].End
		dst = append(dst, p.leadArc(at, vec{at.X, at.Y}, p.param(p.length), false))
	}
	return dst, nil
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
