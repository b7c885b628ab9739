package toolpath_test

import (
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
