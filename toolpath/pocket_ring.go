package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// pocketGeom is the pocket's ellipse seen along its major axis: the same
// curve with its own x axis on the major axis, so that a ≥ b, the
// parameter t = 0 is the +x end of the major axis and the medial axis
// lies on the own x axis.
type pocketGeom struct {
	e    ellipse.Ellipse
	f    frame
	a, b float64
	w    float64 // (a² − b²)/a: half the medial axis
	fold float64 // b²/a
}

func newPocketGeom(e ellipse.Ellipse) (pocketGeom, error) {
	a, b := e.SemiMajor(), e.SemiMinor()
	m, err := ellipse.New(e.Center(), a, b, e.MajorAngle())
	if err != nil {
		return pocketGeom{}, err
	}
	return pocketGeom{e: m, f: newFrame(m.Curve()), a: a, b: b, w: (a - b) * (a + b) / a, fold: m.MinRadiusOfCurvature()}, nil
}

// crossing returns the parameter t* in [0, π/2] where the inward parallel
// curve at distance delta meets the major axis beyond the fold:
// sin² t* = (δ²a²/b² − b²)/(a² − b²) (see [Pocket]); 0 up to the fold
// b²/a and π/2 from b on.
func (g *pocketGeom) crossing(delta float64) float64 {
	if !(delta > g.fold) {
		return 0
	}
	q := delta * g.a / g.b
	num := (q - g.b) * (q + g.b)
	den := (g.a - g.b) * (g.a + g.b)
	if !(num < den) {
		return math.Pi / 2
	}
	return math.Asin(math.Sqrt(num / den))
}

// cornerX returns where the inward parallel curve at delta meets the
// positive major axis, measured from the centre: its tip a − δ up to the
// fold, the corner (a² − b²)/a · cos t* of the trimmed curve beyond it.
// The two agree at the fold.
func (g *pocketGeom) cornerX(delta float64) float64 {
	if !(delta > g.fold) {
		return g.a - delta
	}
	return g.w * math.Cos(g.crossing(delta))
}

// spineHalf returns the half length of the part of the medial axis whose
// points are at least delta from the wall: the point at x = w·cos t is
// b·N(t)/a from it, so the whole axis up to the fold and w·cos t* beyond.
func (g *pocketGeom) spineHalf(delta float64) float64 {
	if !(delta > g.fold) {
		return g.w
	}
	return g.w * math.Cos(g.crossing(delta))
}

// axis returns the world point x along the major axis from the centre.
func (g *pocketGeom) axis(x float64) vec {
	return vec{g.f.cx + g.f.cos*x, g.f.cy + g.f.sin*x}
}

// trimmed reports whether the ring at offset delta is built here as lines
// rather than by the approximator: when its zone reaches the fold.
func (p *pocketPlan) trimmed(delta float64) bool { return !(delta+p.s.Tol < p.Fold) }

// ring appends a link from the end of dst to the start of the ring at
// offset delta and the ring itself, at height z, starting at the end of
// the major axis on side (+1: the +x end, −1: the −x end).
func (p *pocketPlan) ring(dst Path, delta, side, z float64) (Path, error) {
	if p.trimmed(delta) {
		return p.trimmedRing(dst, delta, side, z)
	}
	c, err := p.g.e.Parallel(-delta)
	if err != nil {
		return dst, err
	}
	from := 0.0
	if side < 0 {
		from = math.Pi
	}
	a := &p.ap
	if err := a.Reset(Spec{Curve: c, Zone: Inside, Tol: p.s.Tol, Geometry: p.s.Geometry, Decimals: p.s.Decimals,
		From: from, Clockwise: p.cw, Z: z}); err != nil {
		return dst, err
	}
	first, ok := a.Next()
	if !ok {
		return dst, a.Err()
	}
	dst = p.link(dst, vec{first.Start.X, first.Start.Y})
	dst = append(dst, first)
	for s, ok := a.Next(); ok; s, ok = a.Next() {
		dst = append(dst, s)
	}
	return dst, a.Err()
}

// pocketArc is a stretch of a ring between two parameters, from the
// point from to the point to.
type pocketArc struct {
	t0, t1   float64
	from, to vec
}

func (r pocketArc) reversed() pocketArc { return pocketArc{r.t1, r.t0, r.to, r.from} }

// trimmedRing builds the ring at offset delta as lines. Every vertex lies
// on the parallel curve at delta plus the rounding allowance and every
// chord sags at most Tol less two allowances below it, so that the
// written path stays between delta and delta + Tol from the wall: the
// points at least a distance d from the wall form a convex set bounded by
// the trimmed curve at d, which holds every chord between its points, and
// a point of a chord is within its sag of the curve. The two arcs (above
// and below the major axis) meet in corners computed on the axis itself.
func (p *pocketPlan) trimmedRing(dst Path, delta, side, z float64) (Path, error) {
	g := &p.g
	d := delta + p.round
	h := p.s.Tol - 2*p.round
	ts := g.crossing(d)
	xc := g.cornerX(d)
	plus, minus := g.axis(xc), g.axis(-xc)
	upper := pocketArc{ts, math.Pi - ts, plus, minus}
	lower := pocketArc{math.Pi + ts, 2*math.Pi - ts, minus, plus}
	runs := [2]pocketArc{upper, lower}
	if side < 0 {
		runs = [2]pocketArc{lower, upper}
	}
	if p.cw {
		runs = [2]pocketArc{runs[1].reversed(), runs[0].reversed()}
	}
	dst = p.link(dst, runs[0].from)
	n0 := len(dst)
	for _, r := range runs {
		dst = p.chords(dst, r, -d, h, z)
		if len(dst)-n0 > MaxSegments {
			return dst, &SpecError{Field: "Tol", Value: p.s.Tol, Limit: float64(len(dst) - n0), Err: ErrTooFine}
		}
	}
	return dst, nil
}

// chords appends the greedy longest chords of the arc r of the parallel
// curve at offset off whose sag is at most h, at height z.
func (p *pocketPlan) chords(dst Path, r pocketArc, off, h, z float64) Path {
	f := &p.g.f
	sigma := 1.0
	if r.t1 < r.t0 {
		sigma = -1
	}
	t, prev, guess := r.t0, r.from, 0.0
	n0 := len(dst)
	for n := 0; n <= MaxSegments; n++ {
		remaining := math.Abs(r.t1 - t)
		if !(remaining > 1e-14) {
			break
		}
		step := f.chordStep(t, remaining, sigma, off, h, guess)
		next, q := t+sigma*step, vec{}
		if step >= remaining {
			next, q = r.t1, r.to
		} else {
			q, _, _ = f.at(next, off)
		}
		dst = append(dst, Segment{Kind: Line, Motion: Cut, Start: Point{prev.x, prev.y, z}, End: Point{q.x, q.y, z}})
		prev, t, guess = q, next, step
	}
	if prev != r.to {
		// What is left is too short to step (within 1e-14 of the end):
		// end on the corner exactly.
		if len(dst) > n0 {
			dst[len(dst)-1].End = Point{r.to.x, r.to.y, z}
		} else {
			dst = append(dst, Segment{Kind: Line, Motion: Cut, Start: Point{prev.x, prev.y, z}, End: Point{r.to.x, r.to.y, z}})
		}
	}
	return dst
}

// chordStep returns the longest parameter step (at most remaining) from t
// in the direction sigma whose chord on the parallel curve at off sags at
// most h: model steps (the sag grows with the square of the step) kept
// inside a bracket [fits, too long], bisecting when the model leaves it.
func (f *frame) chordStep(t, remaining, sigma, off, h, guess float64) float64 {
	limit := math.Min(remaining, math.Pi/2)
	dt := guess
	if !(dt > 0) {
		k, _ := f.curvature(t, off)
		v := f.speed(t, off)
		dt = limit
		if k > 0 && v > 0 {
			dt = math.Sqrt(8*h/k) / v
		}
	}
	dt = math.Min(dt, limit)
	best, bad := 0.0, math.Inf(1)
	for i := 0; i < 40; i++ {
		r := f.sag(t, t+sigma*dt, off) / h
		if r <= 1 {
			best = dt
			if r >= 0.99 || dt >= limit {
				break
			}
		} else {
			bad = dt
		}
		next := math.Min(dt*math.Sqrt(0.996/math.Max(r, 1e-12)), limit)
		if !(next > best && next < bad) {
			if math.IsInf(bad, 1) {
				next = math.Min(2*dt, limit)
			} else {
				next = 0.5 * (best + bad)
			}
		}
		if next == dt {
			break
		}
		dt = next
	}
	if best == 0 {
		dt = 0.5 * math.Min(bad, dt)
		for dt > 1e-15 && f.sag(t, t+sigma*dt, off) > h {
			dt *= 0.5
		}
		best = dt
	}
	return best
}

// link appends a straight cutting move (Role Link) from the end of dst to
// q at the same height, unless the path is there already.
func (p *pocketPlan) link(dst Path, q vec) Path {
	at := dst[len(dst)-1].End
	if at.X == q.x && at.Y == q.y {
		return dst
	}
	return append(dst, Segment{Kind: Line, Motion: Cut, Role: Link, Start: at, End: Point{q.x, q.y, at.Z}})
}
