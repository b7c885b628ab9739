package toolpath

import "math"

// Lines: every vertex lies on the parallel curve at the zone's upper
// limit hi, and each chord is made as long as its sag below that curve
// allows (hi − lo). Because the path's points are then between the
// vertex curve and its inward parallel at hi − lo, and the signed
// distance to the intended curve of a point on the normal at distance λ
// from a parallel curve is λ plus that curve's offset, every point of the
// path deviates within [lo, hi]. The sag of a chord is found exactly:
// the farthest point of a parallel curve from a chord is where its
// tangent is parallel to the chord, which for an ellipse parameter has a
// closed form (see frame.chordTouch). Greedy longest chords reach the
// asymptotic minimum ∫√(κ/(8w)) ds to within the final short chord.

// lineTarget is the fraction of the allowed sag a chord aims at; the
// iteration accepts anything in [lineAccept, 1].
const (
	lineTarget = 0.9985
	lineAccept = 0.993
)

// sag returns how far the vertex curve (offset off) bulges beyond the chord
// between parameters t0 and t1, with the chord's ends.
func (f *frame) sag(t0, t1, off float64) float64 {
	p0, _, _ := f.at(t0, off)
	p1, _, _ := f.at(t1, off)
	d := p1.sub(p0)
	l := d.norm()
	if l == 0 {
		return 0
	}
	d = d.scale(1 / l)
	tm := f.chordTouch(t0, t1, d)
	if (tm-t0)*(tm-t1) > 0 {
		tm = 0.5 * (t0 + t1)
	}
	pm, _, _ := f.at(tm, off)
	return math.Abs(d.cross(pm.sub(p0)))
}

// nextLine returns the next chord.
func (a *Approximator) nextLine() (Segment, bool) {
	if a.sigma*(a.tEnd-a.t) <= 0 {
		return Segment{}, false
	}
	f := &a.f
	off := f.d + a.hi
	h := a.hi - a.lo
	t0 := a.t
	// First guess: the previous step, else the local chord length
	// √(8h/κ) over the speed.
	dt := a.lineDt
	if dt == 0 {
		k, _ := f.curvature(t0, off)
		dt = math.Sqrt(8*h/k) / f.speed(t0, off)
	}
	remaining := math.Abs(a.tEnd - t0)
	dt = math.Min(dt, math.Min(remaining, math.Pi/2))
	// Longest step whose sag fits: model steps (sag ∝ step²) kept inside
	// a bracket [feasible, infeasible], with bisection when the model
	// leaves it (the sag is far from quadratic where a flat stretch meets
	// a tight tip).
	best, bad := 0.0, math.Inf(1)
	// widths of the bracket over the last two steps: where the model's
	// steps stop halving it (the sag grows far faster than the square
	// where a chord runs from a flat stretch into a tight tip, and the
	// model then jumps from one end to the other), the step bisects.
	w1, w2 := math.Inf(1), math.Inf(1)
	for i := 0; i < 16; i++ {
		r := f.sag(t0, t0+a.sigma*dt, off) / h
		if r <= 1 {
			best = dt
			if r >= lineAccept || dt >= remaining {
				break
			}
		} else {
			bad = dt
		}
		next := dt * math.Sqrt(lineTarget/math.Max(r, 1e-12))
		next = math.Min(next, math.Min(remaining, math.Pi/2))
		w := bad - best
		stalled := !math.IsInf(w, 1) && w > 0.5*w2
		w2, w1 = w1, w
		if !(next > best && next < bad) || stalled {
			switch {
			case math.IsInf(bad, 1):
				next = math.Min(2*dt, math.Min(remaining, math.Pi/2))
			case best > 0 && bad > 4*best:
				next = math.Sqrt(best * bad) // the sag grows as a power
			default:
				next = 0.5 * (best + bad)
			}
		}
		if next == dt {
			break
		}
		dt = next
	}
	if best == 0 {
		// Shrink until it fits: the sag falls with the square of the step.
		dt = bad * 0.5
		for f.sag(t0, t0+a.sigma*dt, off) > h {
			dt *= 0.5
		}
		best = dt
	}
	a.lineDt = best
	t1 := t0 + a.sigma*best
	if best >= remaining || math.Abs(a.tEnd-t1) < 1e-15*math.Max(1, math.Abs(t1)) {
		t1 = a.tEnd
	}
	p0, _, _ := f.at(t0, off)
	p1, _, _ := f.at(t1, off)
	if !a.spec.Open && t1 == a.tEnd {
		// Close exactly on the first vertex.
		p1, _, _ = f.at(a.spec.From, off)
	}
	a.t = t1
	return Segment{Kind: Line, Start: Point{X: p0.x, Y: p0.y}, End: Point{X: p1.x, Y: p1.y}}, true
}
