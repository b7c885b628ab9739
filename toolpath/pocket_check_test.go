package toolpath_test

import (
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// This file holds the checks the pocket tests apply to the paths they get.
// Each works from the spec and the path alone, with the exact signed
// distance of package ellipse (Eberly's method), not from the pocket's own
// geometry (its crossing parameters and trimmed rings).

// pocketTB is what the checks need of *testing.T and *rapid.T.
type pocketTB interface {
	Helper()
	Errorf(format string, args ...any)
	Fatalf(format string, args ...any)
}

// pocketDistance returns the least and greatest distance inside the wall
// e (positive inside) of the points of segment s. The signed distance to
// a convex set is a convex function, so along a line the least distance
// inside is at an end and the greatest is found by golden-section search;
// along an arc, 24 even samples and a golden-section search about the
// extreme ones find the extremes to far better than the slacks the checks
// allow, the distance being smooth there.
func pocketDistance(e ellipse.Ellipse, s toolpath.Segment) (lo, hi float64) {
	depth := func(u float64) float64 {
		q := s.At(u)
		return -e.SignedDistance(ellipse.Point{X: q.X, Y: q.Y})
	}
	golden := func(a, b, sign, best float64) float64 {
		for i := 0; i < 40; i++ {
			m1, m2 := a+(b-a)*0.381966011250105, a+(b-a)*0.618033988749895
			f1, f2 := sign*depth(m1), sign*depth(m2)
			best = math.Max(best, math.Max(f1, f2))
			if f1 > f2 {
				b = m2
			} else {
				a = m1
			}
		}
		return sign * best
	}
	if s.Kind == toolpath.Line {
		d0, d1 := depth(0), depth(1)
		return math.Min(d0, d1), golden(0, 1, 1, math.Max(d0, d1))
	}
	const n = 24
	var v [n + 1]float64
	jlo, jhi := 0, 0
	for j := 0; j <= n; j++ {
		v[j] = depth(float64(j) / n)
		if v[j] < v[jlo] {
			jlo = j
		}
		if v[j] > v[jhi] {
			jhi = j
		}
	}
	around := func(j int, sign float64) float64 {
		return golden(math.Max(0, float64(j-1)/n), math.Min(1, float64(j+1)/n), sign, sign*v[j])
	}
	return around(jlo, -1), around(jhi, 1)
}

// pocketLeastDistance returns how close to the wall e segment s comes:
// at an end for a line (see pocketDistance), else by search.
func pocketLeastDistance(e ellipse.Ellipse, s toolpath.Segment) float64 {
	if s.Kind == toolpath.Line {
		d0 := -e.SignedDistance(ellipse.Point{X: s.Start.X, Y: s.Start.Y})
		d1 := -e.SignedDistance(ellipse.Point{X: s.End.X, Y: s.End.Y})
		return math.Min(d0, d1)
	}
	lo, _ := pocketDistance(e, s)
	return lo
}

// pocketMovesXY reports whether s moves in the XY plane.
func pocketMovesXY(s toolpath.Segment) bool {
	return s.Kind == toolpath.Arc || (s.Kind == toolpath.Line && (s.Start.X != s.End.X || s.Start.Y != s.End.Y))
}

// checkPocket applies every check to a pocket path: travel, continuity,
// levels and ramps, no gouge, the wall pass, and floor coverage on a grid
// of about gridPoints points.
func checkPocket(t pocketTB, s toolpath.PocketSpec, p toolpath.Path, gridPoints int) {
	t.Helper()
	if len(p) < 3 {
		t.Fatalf("pocket: only %d segments", len(p))
	}
	checkPocketMotion(t, s, p)
	checkPocketLevels(t, s, p)
	checkPocketGouge(t, s, p)
	checkPocketWall(t, s, p)
	checkPocketFloor(t, s, p, gridPoints)
}

// checkPocketMotion: the path starts with a travel at SafeZ and ends with
// a travel straight up to SafeZ, has no other travel, and every segment
// starts where the one before it ends.
func checkPocketMotion(t pocketTB, s toolpath.PocketSpec, p toolpath.Path) {
	t.Helper()
	first, last := p[0], p[len(p)-1]
	if first.Motion != toolpath.Travel || first.End.Z != s.SafeZ {
		t.Errorf("pocket: the first move is %+v, want a travel at SafeZ %g", first, s.SafeZ)
	}
	if last.Motion != toolpath.Travel || last.Role != toolpath.Retract || last.End.Z != s.SafeZ || pocketMovesXY(last) {
		t.Errorf("pocket: the last move is %+v, want a travel straight up to SafeZ %g", last, s.SafeZ)
	}
	for i := 1; i < len(p); i++ {
		if p[i].Start != p[i-1].End {
			t.Errorf("pocket: segment %d starts at %v, the one before ends at %v", i, p[i].Start, p[i-1].End)
		}
		if i < len(p)-1 && p[i].Motion == toolpath.Travel {
			t.Errorf("pocket: segment %d is a travel inside the program: %+v", i, p[i])
		}
	}
}

// checkPocketLevels: the level cutting heights are the equal steps of
// DepthPasses down to exactly −Depth; nothing goes lower; every move down
// into the stock is a ramp or helix no steeper than the ramp angle; no
// ramp passes below the level it leads to.
func checkPocketLevels(t pocketTB, s toolpath.PocketSpec, p toolpath.Path) {
	t.Helper()
	n, step := toolpath.DepthPasses(s.Depth, s.StepDown)
	want := map[int]bool{}
	for k := 1; k <= n; k++ {
		want[k] = false
	}
	angle := s.RampAngle
	if angle == 0 {
		angle = toolpath.PocketRampAngle
	}
	lo, _, _ := p.ZRange()
	if lo != -s.Depth {
		t.Errorf("pocket: the lowest Z is %.17g, want exactly -Depth %g", lo, -s.Depth)
	}
	for i, g := range p {
		if g.Motion != toolpath.Cut {
			continue
		}
		if g.Start.Z == g.End.Z && g.End.Z < 0 && pocketMovesXY(g) {
			k := int(math.Round(-g.End.Z / step))
			if _, ok := want[k]; !ok || math.Abs(-g.End.Z-float64(k)*step) > 1e-9*s.Depth {
				t.Errorf("pocket: segment %d cuts at Z %g, not a level (steps of %g)", i, g.End.Z, step)
				continue
			}
			want[k] = true
		}
		if g.End.Z < g.Start.Z && g.End.Z < 0 {
			xy := math.Hypot(g.End.X-g.Start.X, g.End.Y-g.Start.Y)
			if g.Kind == toolpath.Arc {
				xy = math.Abs(g.Sweep()) * g.Radius
			}
			if g.Role != toolpath.Ramp || !(g.Start.Z-g.End.Z <= xy*math.Tan(angle)*(1+1e-9)) {
				t.Errorf("pocket: segment %d goes down from Z %g to %g over %g in XY (role %d): steeper than the ramp angle %g°",
					i, g.Start.Z, g.End.Z, xy, g.Role, angle*180/math.Pi)
			}
			// The level below the start.
			next := -step * math.Ceil((-g.Start.Z+1e-9*s.Depth)/step)
			if g.End.Z < math.Max(next, -s.Depth)-1e-9*s.Depth {
				t.Errorf("pocket: segment %d ramps from Z %g to %g, below the level %g", i, g.Start.Z, g.End.Z, next)
			}
		}
	}
	for k, ok := range want {
		if !ok {
			t.Errorf("pocket: no cutting at level %d (Z %g)", k, -float64(k)*step)
		}
	}
}

// checkPocketGouge: every point of every cutting move below Z0 is at
// least the tool radius inside the wall.
func checkPocketGouge(t pocketTB, s toolpath.PocketSpec, p toolpath.Path) {
	t.Helper()
	r := s.Tool / 2
	slack := 1e-9 * s.Ellipse.SemiMajor()
	for i, g := range p {
		if g.Motion != toolpath.Cut || math.Min(g.Start.Z, g.End.Z) >= 0 || !pocketMovesXY(g) {
			continue
		}
		if lo := pocketLeastDistance(s.Ellipse, g); lo < r-slack {
			t.Errorf("pocket: segment %d (role %d, Z %g) comes %g inside the wall, less than the tool radius %g: a gouge of %g",
				i, g.Role, g.End.Z, lo, r, r-lo)
			return
		}
	}
}

// checkPocketWall: the wall pass is one closed loop at −Depth running
// climb (counter-clockwise) or conventional (clockwise) once round the
// centre, every point of it within [r, r + Tol] of the wall.
func checkPocketWall(t pocketTB, s toolpath.PocketSpec, p toolpath.Path) {
	t.Helper()
	w := toolpath.PocketWall(p)
	if len(w) == 0 {
		t.Fatalf("pocket: no wall pass")
	}
	r := s.Tool / 2
	slack := 1e-9 * s.Ellipse.SemiMajor()
	area, turn := 0.0, 0.0
	for i, g := range w {
		if g.Start.Z != -s.Depth || g.End.Z != -s.Depth {
			t.Errorf("pocket: wall segment %d at Z %g..%g, want -Depth", i, g.Start.Z, g.End.Z)
		}
		lo, hi := pocketDistance(s.Ellipse, g)
		if lo < r-slack || hi > r+s.Tol+slack {
			t.Errorf("pocket: wall segment %d lies %g to %g inside the wall, outside [%g, %g]", i, lo, hi, r, r+s.Tol)
		}
		area += g.Start.X*g.End.Y - g.End.X*g.Start.Y
		if g.Kind == toolpath.Arc {
			// The circular segment beyond the chord.
			sw := g.Sweep()
			area += g.Radius * g.Radius * (sw - math.Sin(sw))
		}
		// The turn about the centre, in steps short enough for the
		// remainder to be the turn (a full circle is one arc).
		const k = 8
		ctr := s.Ellipse.Center()
		prev := math.Atan2(g.Start.Y-ctr.Y, g.Start.X-ctr.X)
		for j := 1; j <= k; j++ {
			q := g.At(float64(j) / k)
			aj := math.Atan2(q.Y-ctr.Y, q.X-ctr.X)
			turn += math.Remainder(aj-prev, 2*math.Pi)
			prev = aj
		}
	}
	if w[0].Start != w[len(w)-1].End {
		t.Errorf("pocket: the wall pass does not close: from %v to %v", w[0].Start, w[len(w)-1].End)
	}
	ccw := s.Direction == toolpath.Climb
	if (area > 0) != ccw {
		t.Errorf("pocket: the wall pass runs with signed area %g, want counter-clockwise %v for %v", area, ccw, s.Direction)
	}
	if math.Abs(math.Abs(turn)-2*math.Pi) > 1e-6 {
		t.Errorf("pocket: the wall pass turns %g about the centre, want once round", turn)
	}
}

// pocketCells indexes the tool-centre moves at one height by square cells,
// for the distance from a floor point to the nearest of them.
type pocketCells struct {
	x0, y0, size float64
	nx, ny       int
	cells        [][]int
	segs         []toolpath.Segment
}

func newPocketCells(segs []toolpath.Segment, minX, minY, maxX, maxY, size, reach float64) *pocketCells {
	c := &pocketCells{x0: minX, y0: minY, size: size, segs: segs}
	c.nx = int((maxX-minX)/size) + 1
	c.ny = int((maxY-minY)/size) + 1
	c.cells = make([][]int, c.nx*c.ny)
	for i := range segs {
		x0, y0, x1, y1, _ := toolpath.Path(segs[i : i+1]).Bounds()
		for ix := c.ix(x0 - reach); ix <= c.ix(x1+reach); ix++ {
			for iy := c.iy(y0 - reach); iy <= c.iy(y1+reach); iy++ {
				k := iy*c.nx + ix
				c.cells[k] = append(c.cells[k], i)
			}
		}
	}
	return c
}

func (c *pocketCells) ix(x float64) int { return min(max(int((x-c.x0)/c.size), 0), c.nx-1) }
func (c *pocketCells) iy(y float64) int { return min(max(int((y-c.y0)/c.size), 0), c.ny-1) }

// nearest returns the distance from (x, y) to the nearest indexed move
// whose cells hold the point (+Inf when none does).
func (c *pocketCells) nearest(x, y float64) float64 {
	best := math.Inf(1)
	for _, i := range c.cells[c.iy(y)*c.nx+c.ix(x)] {
		best = math.Min(best, pocketPointSegment(x, y, &c.segs[i]))
	}
	return best
}

// pocketPointSegment returns the distance in XY from (x, y) to the
// segment s, exactly.
func pocketPointSegment(x, y float64, s *toolpath.Segment) float64 {
	ax, ay, bx, by := s.Start.X, s.Start.Y, s.End.X, s.End.Y
	ends := math.Min(math.Hypot(x-ax, y-ay), math.Hypot(x-bx, y-by))
	if s.Kind == toolpath.Line {
		dx, dy := bx-ax, by-ay
		l2 := dx*dx + dy*dy
		if l2 == 0 {
			return ends
		}
		u := ((x-ax)*dx + (y-ay)*dy) / l2
		if u <= 0 || u >= 1 {
			return ends
		}
		return math.Abs((x-ax)*dy-(y-ay)*dx) / math.Sqrt(l2)
	}
	// An arc: the nearest point is on the radius through (x, y) when that
	// lies within the sweep, else an end.
	a0 := math.Atan2(ay-s.CenterY, ax-s.CenterX)
	aq := math.Atan2(y-s.CenterY, x-s.CenterX)
	sw := s.Sweep()
	d := math.Remainder(aq-a0, 2*math.Pi)
	if sw > 0 && d < 0 {
		d += 2 * math.Pi
	}
	if sw < 0 && d > 0 {
		d -= 2 * math.Pi
	}
	if (sw > 0 && d <= sw) || (sw < 0 && d >= sw) {
		return math.Abs(math.Hypot(x-s.CenterX, y-s.CenterY) - s.Radius)
	}
	return ends
}

// checkPocketFloor: every point of the floor the tool can reach is within
// the tool radius of some tool-centre position at the final depth. The
// floor is sampled on a square grid of about n points over the ellipse,
// less the points within Tol of the wall (the wall pass's own zone) and
// the points no tool can reach: a point counts when the disk of radius
// r + Tol touching the wall at the point's nearest wall point fits inside
// the wall (by the exact signed distance of its centre), so that only the
// tight ends of a very flat ellipse, narrower than the tool, are left out.
func checkPocketFloor(t pocketTB, s toolpath.PocketSpec, p toolpath.Path, n int) {
	t.Helper()
	missed, first, sampled := pocketFloorGaps(s, p, n)
	// With a tool no wider than the minor semi-axis, the disk of radius b
	// about the centre is reachable floor: a share b/a of the ellipse.
	roomy := s.Tool <= s.Ellipse.SemiMinor()
	if share := s.Ellipse.SemiMinor() / s.Ellipse.SemiMajor(); roomy && float64(sampled) < 0.5*share*float64(n) {
		t.Errorf("pocket floor: only %d of about %d grid points are on the reachable floor", sampled, n)
	}
	if missed > 0 {
		t.Errorf("pocket floor: %d of %d grid points are farther than the tool radius %g from every tool-centre position at the final depth, e.g. %v",
			missed, sampled, s.Tool/2, first)
	}
	normals := n / 4
	gaps, where, checked := pocketNormalGaps(s, p, normals)
	if roomy && checked < normals/8 {
		t.Errorf("pocket floor: only %d of %d normals reach the floor", checked, normals)
	}
	if gaps > 0 {
		t.Errorf("pocket floor: %d of %d normals of the wall are not covered from Tol inside to the major axis, first %s", gaps, checked, where)
	}
}

// pocketFloorGaps returns how many floor grid points are not covered, the
// first of them, and how many were sampled.
func pocketFloorGaps(s toolpath.PocketSpec, p toolpath.Path, n int) (missed int, first ellipse.Point, sampled int) {
	e := s.Ellipse
	r := s.Tool / 2
	var final []toolpath.Segment
	for _, g := range p {
		if g.Motion == toolpath.Cut && g.Start.Z == -s.Depth && g.End.Z == -s.Depth && pocketMovesXY(g) {
			final = append(final, g)
		}
	}
	minX, minY, maxX, maxY, ok := toolpath.Path(final).Bounds()
	if !ok {
		return 0, first, 0
	}
	minX, minY, maxX, maxY = minX-r, minY-r, maxX+r, maxY+r
	cells := newPocketCells(final, minX, minY, maxX, maxY, r, r)
	h := math.Sqrt(e.Area() / float64(n))
	slack := 1e-9 * e.SemiMajor()
	ctr := e.Center()
	a := e.SemiMajor()
	for x := ctr.X - a + h/2; x < ctr.X+a; x += h {
		for y := ctr.Y - a + h/2; y < ctr.Y+a; y += h {
			q := ellipse.Point{X: x, Y: y}
			tq, d := e.Nearest(q)
			if d > -s.Tol {
				continue
			}
			f, nr := e.PointAt(tq), e.Normal(tq)
			reach := r + s.Tol
			c := ellipse.Point{X: f.X - reach*nr.X, Y: f.Y - reach*nr.Y}
			if e.SignedDistance(c) > -reach+slack {
				continue
			}
			sampled++
			if cells.nearest(x, y) > r+slack {
				if missed == 0 {
					first = q
				}
				missed++
			}
		}
	}
	return missed, first, sampled
}

// pocketNormalGaps checks the floor along n inward normals of the wall,
// exactly: on the normal at t, from Tol inside the wall to where it meets
// the major axis (past which the points are nearer the other half of the
// wall), the parts within the tool radius of each tool-centre move at the
// final depth are found exactly (see pocketCover), and their union must
// cover it. A normal is skipped where the tool cannot reach (as in
// checkPocketFloor). Thin uncovered slivers, which run along the rings
// and would slip between the points of a grid, cross the normals and are
// found. It returns the normals that are not covered, the first gap, and
// the normals checked.
func pocketNormalGaps(s toolpath.PocketSpec, p toolpath.Path, n int) (missed int, gap string, checked int) {
	e := s.Ellipse
	r := s.Tool / 2
	var segs []toolpath.Segment
	for _, g := range p {
		if g.Motion == toolpath.Cut && g.Start.Z == -s.Depth && g.End.Z == -s.Depth && pocketMovesXY(g) {
			segs = append(segs, g)
		}
	}
	minX, minY, maxX, maxY, ok := toolpath.Path(segs).Bounds()
	if !ok {
		return n, "no moves at the final depth", 0
	}
	cells := newPocketCells(segs, minX-r, minY-r, maxX+r, maxY+r, r, r)
	stamp := make([]int, len(segs))
	ctr := e.Center()
	mx, my := math.Cos(e.MajorAngle()), math.Sin(e.MajorAngle())
	slack := 1e-9 * e.SemiMajor()
	var ivs [][2]float64
	for i := 0; i < n; i++ {
		t := 2 * math.Pi * (float64(i) + 0.5) / float64(n)
		f, nr := e.PointAt(t), e.Normal(t)
		nx, ny := -nr.X, -nr.Y // inward
		reach := r + s.Tol
		if e.SignedDistance(ellipse.Point{X: f.X + reach*nx, Y: f.Y + reach*ny}) > -reach+slack {
			continue
		}
		// Where the normal meets the major axis: (f + u·N − c) × m = 0.
		den := nx*my - ny*mx
		if math.Abs(den) < 1e-12 {
			continue
		}
		umax := ((ctr.X-f.X)*my - (ctr.Y-f.Y)*mx) / den
		checked++
		ivs = ivs[:0]
		// Candidate moves: those indexed in the cells along the normal.
		for u := 0.0; ; u += r / 2 {
			u = math.Min(u, umax)
			x, y := f.X+u*nx, f.Y+u*ny
			for _, j := range cells.cells[cells.iy(y)*cells.nx+cells.ix(x)] {
				if stamp[j] != i+1 {
					stamp[j] = i + 1
					ivs = pocketCover(ivs, f.X, f.Y, nx, ny, &segs[j], r*(1+1e-12))
				}
			}
			if u >= umax {
				break
			}
		}
		// Is [Tol, umax] inside the union?
		need := s.Tol
		for changed := true; changed && need < umax-slack; {
			changed = false
			for _, v := range ivs {
				if v[0] <= need+slack && v[1] > need {
					need, changed = v[1], true
				}
			}
		}
		if need < umax-slack {
			if missed == 0 {
				q := ellipse.Point{X: f.X + need*nx, Y: f.Y + need*ny}
				gap = fmt.Sprintf("on the normal at t = %.6f, %.6g inside the wall at %v (the normal meets the axis %.6g in)", t, need, q, umax)
			}
			missed++
		}
	}
	return missed, gap, checked
}

// pocketCover appends to ivs the intervals of u for which the point
// (px, py) + u·(nx, ny) (a unit direction) lies within rad of the move g.
// The boundary of the points within rad of a line or an arc is made of
// circles (round the ends, and for an arc round its centre at R ± rad)
// and, for a line, the two lines at ±rad beside it; so whether a point of
// the line is within rad changes only where it crosses one of these, and
// between those crossings it is decided by the exact distance at the
// middle (pocketPointSegment).
func pocketCover(ivs [][2]float64, px, py, nx, ny float64, g *toolpath.Segment, rad float64) [][2]float64 {
	var cuts [12]float64
	k := 0
	circle := func(cx, cy, rr float64) {
		if rr < 0 {
			return
		}
		wx, wy := px-cx, py-cy
		bq := nx*wx + ny*wy
		disc := bq*bq - (wx*wx + wy*wy - rr*rr)
		if disc < 0 {
			return
		}
		sq := math.Sqrt(disc)
		cuts[k], cuts[k+1] = -bq-sq, -bq+sq
		k += 2
	}
	circle(g.Start.X, g.Start.Y, rad)
	circle(g.End.X, g.End.Y, rad)
	if g.Kind == toolpath.Arc {
		circle(g.CenterX, g.CenterY, g.Radius+rad)
		circle(g.CenterX, g.CenterY, g.Radius-rad)
	} else if dx, dy := g.End.X-g.Start.X, g.End.Y-g.Start.Y; dx != 0 || dy != 0 {
		l := math.Hypot(dx, dy)
		dx, dy = dx/l, dy/l
		// (p + u n − a) × d = ±rad
		c0 := (px-g.Start.X)*dy - (py-g.Start.Y)*dx
		c1 := nx*dy - ny*dx
		if c1 != 0 {
			cuts[k], cuts[k+1] = (rad-c0)/c1, (-rad-c0)/c1
			k += 2
		}
	}
	if k == 0 {
		return ivs
	}
	c := cuts[:k]
	n0 := len(ivs)
	for i := 1; i < len(c); i++ { // insertion sort: at most 8
		for j := i; j > 0 && c[j] < c[j-1]; j-- {
			c[j], c[j-1] = c[j-1], c[j]
		}
	}
	for i := 0; i+1 < len(c); i++ {
		a, b := c[i], c[i+1]
		if b <= a {
			continue
		}
		m := 0.5 * (a + b)
		if pocketPointSegment(px+m*nx, py+m*ny, g) <= rad {
			if n := len(ivs); n > n0 && ivs[n-1][1] >= a {
				ivs[n-1][1] = math.Max(ivs[n-1][1], b)
			} else {
				ivs = append(ivs, [2]float64{a, b})
			}
		}
	}
	return ivs
}
