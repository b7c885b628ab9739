package toolpath

import (
	"math"
	"slices"
)

// The tool-centre path of a profile is walked by position u: arc length
// along the tool-centre curve from the entry point, in the direction of
// the cut. Position u is at arc length s0 + σ·u from the curve's parameter
// 0 (σ = −1 for a clockwise cut), whose parameter the curve's inverse arc
// length gives; the same u always gives the same parameter, so pieces
// approximated separately join exactly.

// level is the height plan of one walk: from top at u0 down to bottom
// over a ramp of length ramp (0: at bottom throughout).
type level struct {
	u0, top, bottom, ramp float64
}

// base returns the height at u before tabs.
func (lv *level) base(u float64) float64 {
	if lv.ramp > 0 && u < lv.u0+lv.ramp {
		f := (u - lv.u0) / lv.ramp
		return lv.top + f*(lv.bottom-lv.top)
	}
	return lv.bottom
}

// sigma returns +1 for a counter-clockwise cut, −1 for a clockwise one.
func (p *profilePlan) sigma() float64 {
	if p.cw {
		return -1
	}
	return 1
}

// param returns the curve parameter at walk position u.
func (p *profilePlan) param(u float64) float64 {
	return p.curve.ParamAtArcLength(p.s0 + p.sigma()*u)
}

// inTab reports whether walk position u lies over a tab.
func (p *profilePlan) inTab(u float64) bool {
	n := len(p.tabs)
	if n == 0 {
		return false
	}
	l := p.length
	s := math.Mod(p.s0+p.sigma()*u, l)
	if s < 0 {
		s += l
	}
	j := int(s * float64(n) / l)
	for _, k := range [3]int{j - 1, j, j + 1} {
		c := p.tabs[(k%n+n)%n]
		d := math.Remainder(s-c, l)
		if math.Abs(d) < p.tabHalf {
			return true
		}
	}
	return false
}

// walk appends the tool-centre path from walk position u0 to u1 at the
// heights of lv, raised over the tabs where it would go below their top.
func (p *profilePlan) walk(dst Path, u1 float64, lv level) (Path, error) {
	u0 := lv.u0
	l := p.length
	bps := append(p.scratch[:0], u1)
	if lv.ramp > 0 && u0+lv.ramp < u1 {
		bps = append(bps, u0+lv.ramp)
	}
	tabs := len(p.tabs) > 0 && math.Min(lv.top, lv.bottom) < p.tabTop
	if tabs {
		sg := p.sigma()
		for _, c := range p.tabs {
			for _, e := range [2]float64{c - p.tabHalf, c + p.tabHalf} {
				ue := sg * (e - p.s0)
				for k := math.Ceil((u0 - ue) / l); ue+k*l < u1; k++ {
					if v := ue + k*l; v > u0 {
						bps = append(bps, v)
					}
				}
			}
		}
		if lv.ramp > 0 && lv.top > p.tabTop && p.tabTop > lv.bottom {
			bps = append(bps, u0+lv.ramp*(lv.top-p.tabTop)/(lv.top-lv.bottom))
		}
	}
	slices.Sort(bps)
	p.scratch = bps
	eps := 1e-9 * l
	a := u0
	for i, b := range bps {
		if b-a <= eps || (i < len(bps)-1 && u1-b <= eps) {
			continue
		}
		in := tabs && p.inTab(0.5*(a+b))
		za, zb := lv.base(a), lv.base(b)
		role := Contour
		if lv.ramp > 0 && a < u0+lv.ramp {
			role = Ramp
		}
		if in {
			// Over a tab nothing goes below its top; a ramp end that
			// rounds to within a hair of it (the crossing point) is
			// taken as on it.
			hair := 1e-12 * (1 + math.Abs(p.tabTop))
			raise := func(z float64) float64 {
				if z < p.tabTop+hair {
					return p.tabTop
				}
				return z
			}
			if ra, rb := raise(za), raise(zb); ra != za || rb != zb {
				za, zb = ra, rb
				if za == p.tabTop && zb == p.tabTop {
					role = Tab
				}
			}
		}
		var err error
		if dst, err = p.piece(dst, a, b, za, zb, role); err != nil {
			return dst, err
		}
		a = b
	}
	return dst, nil
}

// piece appends the approximation of the walk from a to b, its height
// going linearly (by length) from za to zb, after a straight move in Z to
// za if the path is not there. Every piece is approximated as open arcs of
// at most half a turn, whose ends lie at the parameters of a and b, so
// that pieces meeting at one position join exactly.
func (p *profilePlan) piece(dst Path, a, b, za, zb float64, role Role) (Path, error) {
	if n := len(dst); n > 0 && dst[n-1].End.Z != za {
		dst = p.moveZ(dst, za, Tab)
	}
	n0 := len(dst)
	halves := 1
	if b-a > p.length/2 {
		halves = 2
	}
	from := p.param(a)
	for h := 1; h <= halves; h++ {
		to := p.param(b)
		if h < halves {
			to = p.param(0.5 * (a + b))
		}
		spec := Spec{Curve: p.curve, Zone: p.zone, Tol: p.s.Tol, Geometry: p.s.Geometry, Decimals: p.s.Decimals,
			From: from, Open: true, To: to, Z: za}
		n1 := len(dst)
		var err error
		if dst, err = Approximate(dst, spec); err != nil {
			return dst[:n0], err
		}
		for i := n1; i < len(dst); i++ {
			dst[i].Role = role
		}
		dst = joinAt(dst, n1)
		from = to
	}
	if za != zb {
		slope(dst[n0:], za, zb)
	}
	return dst, nil
}

// joinAt makes dst[i] start exactly where dst[i−1] ends: a gap of
// rounding size is closed by moving the start, a larger one (which the
// approximation's exact ends should never leave) by a Cut line.
func joinAt(dst Path, i int) Path {
	if i == 0 || i >= len(dst) {
		return dst
	}
	prev, s := dst[i-1].End, dst[i].Start
	if prev == s {
		return dst
	}
	scale := 1 + math.Abs(prev.X) + math.Abs(prev.Y) + math.Abs(prev.Z)
	if math.Abs(prev.X-s.X)+math.Abs(prev.Y-s.Y)+math.Abs(prev.Z-s.Z) <= 1e-9*scale {
		dst[i].Start = prev
		return dst
	}
	dst = append(dst, Segment{})
	copy(dst[i+1:], dst[i:])
	dst[i] = Segment{Kind: Line, Motion: Cut, Role: Link, Start: prev, End: s}
	return dst
}

// slope gives the segments heights going from za to zb in proportion to
// their length in XY.
func slope(segs Path, za, zb float64) {
	total := 0.0
	for i := range segs {
		total += lengthXY(&segs[i])
	}
	run := 0.0
	for i := range segs {
		segs[i].Start.Z = za + (zb-za)*run/total
		run += lengthXY(&segs[i])
		segs[i].End.Z = za + (zb-za)*run/total
	}
	if n := len(segs); n > 0 {
		segs[0].Start.Z, segs[n-1].End.Z = za, zb
	}
}

// lengthXY returns the length of a segment in the XY plane.
func lengthXY(s *Segment) float64 {
	switch s.Kind {
	case Line:
		return math.Hypot(s.End.X-s.Start.X, s.End.Y-s.Start.Y)
	case Arc:
		return math.Abs(s.Sweep()) * s.Radius
	}
	return 0
}

// moveZ appends a straight Cut move in Z from the end of dst to z: down
// moves carry the plunge feed.
func (p *profilePlan) moveZ(dst Path, z float64, role Role) Path {
	at := dst[len(dst)-1].End
	s := Segment{Kind: Line, Motion: Cut, Role: role, Start: at, End: Point{at.X, at.Y, z}}
	if z < at.Z {
		s.Feed = p.s.plungeFeed()
	}
	return append(dst, s)
}

// travelZ appends a Travel move straight up or down to z.
func travelZ(dst Path, z float64, role Role) Path {
	at := dst[len(dst)-1].End
	return append(dst, Segment{Kind: Line, Motion: Travel, Role: role, Start: at, End: Point{at.X, at.Y, z}})
}

// travelXY appends a Travel move to (x, y) at height z. The first segment
// of a path starts where it ends (the machine's position is unknown).
func travelXY(dst Path, x, y, z float64) Path {
	end := Point{x, y, z}
	start := end
	if n := len(dst); n > 0 {
		start = dst[n-1].End
	}
	return append(dst, Segment{Kind: Line, Motion: Travel, Role: Link, Start: start, End: end})
}

// appendJoined appends segs to dst, joining the first exactly to the end
// of dst.
func appendJoined(dst, segs Path) Path {
	n := len(dst)
	return joinAt(append(dst, segs...), n)
}
