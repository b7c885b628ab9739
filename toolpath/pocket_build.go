package toolpath

import "math"

// build appends the whole pocket path to dst: travel to the entry at
// SafeZ, feed down to Z0, then each level (entry, spine pass, rings from
// the innermost out, and at the last level the wall pass), then the
// retract.
func (p *pocketPlan) build(dst Path) (Path, error) {
	s := &p.s
	side := 1.0
	start := p.entryStart(side)
	dst = travelXY(dst, start.x, start.y, s.SafeZ)
	dst = p.feedDown(dst, 0)
	top := 0.0
	last := len(p.Levels) - 1
	var err error
	for k, z := range p.Levels {
		if k > 0 {
			dst = p.link(dst, p.entryStart(side))
		}
		var at float64
		if p.HelixRadius > 0 {
			dst, at = p.helix(dst, side, top, z)
		} else {
			dst, at = p.ramp(dst, side, top, z)
		}
		dst, side = p.spinePass(dst, at, z)
		for i := len(p.Rings) - 1; i >= 0; i-- {
			if dst, err = p.ring(dst, p.Rings[i], side, z); err != nil {
				return dst, err
			}
		}
		if k == last && (len(p.Rings) == 0 || p.Rings[0] != p.Wall) {
			if dst, err = p.ring(dst, p.Wall, side, z); err != nil {
				return dst, err
			}
		}
		top = z
	}
	return travelZ(dst, s.SafeZ, Retract), nil
}

// entryStart returns where the entry into a level starts on the given
// side of the centre: the end of the spine, or the helix's start on the
// major axis.
func (p *pocketPlan) entryStart(side float64) vec {
	if p.HelixRadius > 0 {
		return p.g.axis(side * p.HelixRadius)
	}
	return p.g.axis(side * p.Spine)
}

// feedDown appends a straight feed move down to z (Role Plunge) at the
// plunge feed; the pocket uses it only above the stock, to Z0.
func (p *pocketPlan) feedDown(dst Path, z float64) Path {
	at := dst[len(dst)-1].End
	return append(dst, Segment{Kind: Line, Motion: Cut, Role: Plunge, Start: at, End: Point{at.X, at.Y, z}, Feed: p.s.plungeFeed()})
}

// lineTo appends a cutting line from the end of dst to q at height z,
// unless the path is there already.
func (p *pocketPlan) lineTo(dst Path, q vec, z float64, role Role) Path {
	at := dst[len(dst)-1].End
	if at.X == q.x && at.Y == q.y && at.Z == z {
		return dst
	}
	return append(dst, Segment{Kind: Line, Motion: Cut, Role: role, Start: at, End: Point{q.x, q.y, z}})
}

// ramp appends the zig-zag ramp from the spine's end on side, at top, down
// to z: legs of [pocketPlan.rampRun] along the major axis, as many as keep
// the slope within the ramp angle, each descending by the same height.
// It returns where the ramp ends, as a position along the major axis.
func (p *pocketPlan) ramp(dst Path, side, top, z float64) (Path, float64) {
	run := p.rampRun()
	drop := top - z
	legs := max(1, int(math.Ceil(drop/(run*p.slope)-1e-9)))
	x0 := side * p.Spine
	x1 := x0 - side*run
	x := x0
	for i := 1; i <= legs; i++ {
		zb := top - drop*float64(i)/float64(legs)
		if i == legs {
			zb = z
		}
		next := x1
		if x == x1 {
			next = x0
		}
		dst = p.lineTo(dst, p.g.axis(next), zb, Ramp)
		x = next
	}
	return dst, x
}

// helix appends the helical entry about the centre from its start on
// side, at top, down to z, in half turns that keep the slope within the
// ramp angle and descend by the same height, then a whole turn at z. It
// returns where it ends, as a position along the major axis.
func (p *pocketPlan) helix(dst Path, side, top, z float64) (Path, float64) {
	rho := p.HelixRadius
	c := p.g.axis(0)
	drop := top - z
	half := max(1, int(math.Ceil(drop/(math.Pi*rho*p.slope)-1e-9)))
	dir := 1.0
	if p.cw {
		dir = -1
	}
	ang := math.Atan2(p.g.f.sin, p.g.f.cos)
	if side < 0 {
		ang += math.Pi
	}
	arc := func(dst Path, zb float64, role Role) Path {
		at := dst[len(dst)-1].End
		ang += dir * math.Pi
		sn, cs := math.Sincos(ang)
		end := Point{c.x + rho*cs, c.y + rho*sn, zb}
		return append(dst, Segment{Kind: Arc, Motion: Cut, Role: role, Start: at, End: end,
			CenterX: c.x, CenterY: c.y, Radius: rho, Clockwise: p.cw})
	}
	for i := 1; i <= half; i++ {
		zb := top - drop*float64(i)/float64(half)
		if i == half {
			zb = z
		}
		dst = arc(dst, zb, Ramp)
	}
	from := dst[len(dst)-1].End
	dst = arc(dst, z, Contour)
	dst = arc(dst, z, Contour)
	dst[len(dst)-1].End = from
	if half%2 == 1 {
		side = -side
	}
	return dst, side * rho
}

// spinePass appends the pass along the spine at z from position x on the
// major axis: to the nearer end of the spine, then to the other end (for
// a circle: to the centre). It returns the side of the centre the pass
// ends on, where the rings start.
func (p *pocketPlan) spinePass(dst Path, x, z float64) (Path, float64) {
	near := p.Spine
	if x < 0 {
		near = -near
	}
	dst = p.lineTo(dst, p.g.axis(near), z, Contour)
	if p.Spine == 0 {
		return dst, 1
	}
	dst = p.lineTo(dst, p.g.axis(-near), z, Contour)
	return dst, -math.Copysign(1, near)
}
