package toolpath_test

import (
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// This file holds the floor-coverage check of the pocket tests: on a grid
// of points and, exactly, along the wall's normals.

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
