package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

type ellipsePoint = ellipse.Point

// Arcs: a chain of circular arcs with a common tangent at every join
// (G1). Each arc starts where the last ended, with its tangent, and ends
// on the parallel curve in the middle of the zone at the farthest curve
// parameter for which the whole arc stays in the zone. Along a curve whose
// curvature changes steadily, such arcs settle into the pattern of
// deviation that swings across the whole zone inside every arc, which is
// what lets them beat interpolating biarcs.
//
// The deviation of an arc is measured exactly and cheaply through the
// curve's normals: the point where the normal line at curve parameter t
// meets the arc lies at signed distance λ(t) from the curve, with λ the
// root of |q(t) + λn(t) − C|² = R² nearest zero; as t runs over the arc's
// feet these points run over the whole arc. λ is sampled at arcSamples
// points and its extremes refined by a parabola through the neighbours.
//
// Where an arc would be too flat to write soundly (radius above
// arcMaxRadius semi-major axes, or a rise over its chord below the rounding
// allowance), a line along the current tangent is used instead; it keeps
// the chain tangent-continuous. The chain is closed (or ended) by
// interpolating biarcs onto the curve's own tangent.

const (
	arcSamples   = 8
	maxSamples   = 96
	devMiss      = 0.002
	arcTarget    = 0.997 // aim at this fraction of the usable half-width
	arcAccept    = 0.985 // accept anything in [arcAccept, 1]
	arcMaxRadius = 100   // in semi-major axes
	arcMaxSteps  = 10
)

// arcState holds the arc approximator's state between segments: O(1).
type arcState struct {
	lastDt float64 // parameter span of the last step (also used by lines)
	p, tan vec     // current point and unit tangent (direction of travel)
	tp     float64 // parameter of the current point's foot
	dev    float64 // its deviation
	// Closing: n biarcs onto the end, piece i, second half pending.
	closing bool
	n, i    int
	half    bool
	second  Segment
	t0End   float64 // parameter where closing started
	p0, t0  vec     // the point and tangent the path must end with
}

// mid returns the middle of the usable zone.
func (a *Approximator) mid() float64 { return 0.5 * (a.lo + a.hi) }

func (s *arcState) start(a *Approximator) {
	f := &a.f
	m := a.mid()
	p, tg, _ := f.at(a.spec.From, f.d+m)
	*s = arcState{p: p, tan: tg.scale(a.sigma), tp: a.spec.From, dev: m}
	q, tq, _ := f.at(a.tEnd, f.d+m)
	if a.spec.To == a.spec.From {
		q = p
	}
	s.p0, s.t0 = q, tq.scale(a.sigma)
}

// circleDev returns λ(t) for the circle through p with tangent tg and
// signed curvature k (or the line when k == 0), measured from the intended
// curve; NaN when the normal line misses the circle.
func (f *frame) circleDev(t float64, p, tg vec, k float64) float64 {
	q, _, n := f.at(t, f.d)
	nl := tg.left()
	if k == 0 {
		den := n.dot(nl)
		if den == 0 {
			return math.NaN()
		}
		return p.sub(q).dot(nl) / den
	}
	c := p.addScaled(nl, 1/k)
	r := math.Abs(1 / k)
	w := q.sub(c)
	b := n.dot(w)
	wl := w.norm()
	cc := (wl - r) * (wl + r)
	disc := b*b - cc
	if disc < 0 {
		return math.NaN()
	}
	return -cc / (b + math.Copysign(math.Sqrt(disc), b))
}

// devRange returns the extremes of the deviation of the circle (p, tg, k)
// over feet in [t0, t1], given the deviations d0 and d1 at the ends.
//
// The number of samples follows from the curvature: along the arc the
// deviation δ has δ” ≈ κ − k (κ the curve's, k the arc's), so between
// samples h apart a missed extreme is at most |κ − k|·h²/8. Samples are
// placed so that this is below devMiss of the zone's half-width, between
// arcSamples and maxSamples of them, and the extremes are then refined by
// a parabola through the neighbours.
func (a *Approximator) devRange(t0, t1, d0, d1 float64, p, tg vec, k float64) (lo, hi float64) {
	f := &a.f
	var v [maxSamples + 2]float64
	km, _ := f.curvature(0.5*(t0+t1), f.d)
	k0, _ := f.curvature(t0, f.d)
	k1, _ := f.curvature(t1, f.d)
	ak := math.Abs(k)
	dd := math.Max(math.Abs(km-ak), math.Max(math.Abs(k0-ak), math.Abs(k1-ak)))
	length := math.Abs(t1-t0) * f.speed(0.5*(t0+t1), f.d)
	half := 0.5 * (a.hi - a.lo)
	n := arcSamples
	if dd > 0 {
		h := math.Sqrt(8 * devMiss * half / dd)
		if x := length / h; x > float64(n) {
			n = int(math.Min(x+1, maxSamples))
		}
	}
	v[0], v[n+1] = d0, d1
	step := (t1 - t0) / float64(n+1)
	lo, hi = math.Min(d0, d1), math.Max(d0, d1)
	for j := 1; j <= n; j++ {
		x := f.circleDev(t0+float64(j)*step, p, tg, k)
		if math.IsNaN(x) {
			return math.Inf(-1), math.Inf(1)
		}
		v[j] = x
	}
	jmax, jmin := 0, 0
	for j := 1; j <= n+1; j++ {
		if v[j] > v[jmax] {
			jmax = j
		}
		if v[j] < v[jmin] {
			jmin = j
		}
	}
	lo = math.Min(lo, refineExtreme(v[:n+2], jmin))
	hi = math.Max(hi, refineExtreme(v[:n+2], jmax))
	return lo, hi
}

// refineExtreme returns the extreme of the parabola through the sample at
// j and its neighbours (or the sample itself at an end).
func refineExtreme(v []float64, j int) float64 {
	if j == 0 || j == len(v)-1 {
		return v[j]
	}
	a, b, c := v[j-1], v[j], v[j+1]
	den := a - 2*b + c
	if den == 0 {
		return b
	}
	x := 0.5 * (a - c) / den // vertex offset in samples, |x| ≤ 1/2
	return b - 0.25*(a-c)*x
}

// arcTo returns the signed curvature of the arc from p with tangent tg
// through q, and its end tangent (tg reflected in the chord).
func arcTo(p, tg, q vec) (k float64, end vec) {
	ch := q.sub(p)
	l2 := ch.dot(ch)
	if l2 == 0 {
		return 0, tg
	}
	k = 2 * tg.cross(ch) / l2
	u := ch.scale(1 / math.Sqrt(l2))
	end = u.scale(2 * u.dot(tg)).sub(tg)
	return k, end
}

// trial is one candidate step.
type trial struct {
	k      float64
	end    vec
	q      vec
	dev1   float64
	ratio  float64 // worst use of the half-width; ≤ 1 fits
	t1     float64
	isLine bool
}

// try builds and measures the step to foot parameter t1.
func (a *Approximator) try(s *arcState, t1 float64) trial {
	f := &a.f
	m := a.mid()
	// End deviation by the deadbeat rule (see endDeviation).
	e1 := a.endDeviation(s, t1)
	q, _, n := f.at(t1, f.d+e1)
	k, end := arcTo(s.p, s.tan, q)
	tr := trial{k: k, end: end, q: q, dev1: e1, t1: t1}
	chord := q.sub(s.p).norm()
	if k == 0 || math.Abs(1/k) > arcMaxRadius*f.e.SemiMajor() || chord*chord*math.Abs(k)/8 < a.round {
		// Too flat to write as an arc: a line along the tangent to the
		// normal at t1 (solve p + u·tan = q + λ·n).
		den := s.tan.cross(n)
		if den == 0 {
			tr.ratio = math.Inf(1)
			return tr
		}
		lam := s.tan.cross(s.p.sub(q)) / den
		q = q.addScaled(n, lam)
		tr = trial{k: 0, end: s.tan, q: q, dev1: e1 + lam, t1: t1, isLine: true}
		if q.sub(s.p).dot(s.tan) <= 0 {
			tr.ratio = math.Inf(1)
			return tr
		}
	}
	lo, hi := a.devRange(s.tp, t1, s.dev, tr.dev1, s.p, s.tan, tr.k)
	tr.ratio = math.Max((hi-m)/(a.hi-m), (m-lo)/(m-a.lo))
	return tr
}

// segment returns the arc or line of a trial from the current state.
func (s *arcState) segment(tr trial) Segment {
	if tr.k == 0 {
		return Segment{Kind: Line, Start: Point{X: s.p.x, Y: s.p.y}, End: Point{X: tr.q.x, Y: tr.q.y}}
	}
	c := s.p.addScaled(s.tan.left(), 1/tr.k)
	return Segment{Kind: Arc, Start: Point{X: s.p.x, Y: s.p.y}, End: Point{X: tr.q.x, Y: tr.q.y},
		CenterX: c.x, CenterY: c.y, Radius: math.Abs(1 / tr.k), Clockwise: tr.k < 0}
}

func (s *arcState) next(a *Approximator) (Segment, bool) {
	if s.closing {
		return s.nextClosing(a)
	}
	f := &a.f
	remaining := math.Abs(a.tEnd - s.tp)
	if remaining <= 0 {
		return Segment{}, false
	}
	dt := s.lastDt
	if dt == 0 {
		_, dk := f.curvature(s.tp, f.d)
		l := math.Cbrt(62 * (a.hi - a.lo) / math.Max(math.Abs(dk), 1e-300))
		dt = l / f.speed(s.tp, f.d)
	}
	dt = math.Min(dt, math.Pi)
	// Near the end, close with biarcs if a few will do.
	if remaining <= 2.5*dt {
		for n := 1; n <= 4; n++ {
			if s.closeFits(a, n) {
				s.closing, s.n, s.i, s.half = true, n, 0, false
				s.t0End = s.tp
				return s.nextClosing(a)
			}
		}
	}
	var best trial
	best.ratio = math.Inf(1)
	bestDt := 0.0
	for i := 0; i < arcMaxSteps; i++ {
		dt = math.Min(dt, remaining)
		tr := a.try(s, s.tp+a.sigma*dt)
		if tr.ratio <= 1 && dt > bestDt {
			best, bestDt = tr, dt
			if tr.ratio >= arcAccept || dt >= remaining {
				break
			}
		}
		r := tr.ratio
		var next float64
		switch {
		case math.IsInf(r, 0) || math.IsNaN(r):
			next = dt * 0.5
		case r <= 0:
			next = dt * 2
		default:
			next = dt * math.Cbrt(arcTarget/r)
			next = math.Max(math.Min(next, dt*2), dt*0.5)
		}
		if r > 1 {
			next = math.Min(next, dt*0.995)
		}
		if bestDt > 0 && next <= bestDt {
			break
		}
		dt = next
	}
	for bestDt == 0 {
		dt *= 0.5
		tr := a.try(s, s.tp+a.sigma*dt)
		if tr.ratio <= 1 || dt < 1e-12 {
			best, bestDt = tr, dt
		}
	}
	seg := s.segment(best)
	s.lastDt = bestDt
	s.p, s.tan, s.tp, s.dev = best.q, best.end, best.t1, best.dev1
	return seg, true
}

// endDeviation returns the deviation an arc ending at foot t1 should end
// with. In the local model the deviation δ obeys δ” = κ − k along an arc
// of curvature k, so with κ changing at κ' per unit length the chain of
// arcs of length L that uses the zone best is periodic: it crosses the
// middle m of the zone at every join with slope g = κ'L²/12, and swings to
// ±κ'L³/(72√3) inside each arc (1.15 times the single-arc bound). With
// u = δ − m and v = δ' − g at a join, an arc ending at u₁ gives
// v₁ = −v₀ + 2(u₁ − u₀)/L, and the choice u₁ = u₀/2 + L·v₀/4 brings both to
// zero in two arcs (both eigenvalues of the step are zero).
func (a *Approximator) endDeviation(s *arcState, t1 float64) float64 {
	f := &a.f
	m := a.mid()
	_, tc, n := f.at(s.tp, f.d)
	tau := tc.scale(a.sigma)
	slope := s.tan.dot(n) / math.Max(s.tan.dot(tau), 1e-3)
	ke, dke := f.ellipseCurvature(s.tp)
	g1 := 1 + f.d*ke
	kp := a.sigma * dke / (g1 * g1 * g1)
	l := math.Abs(t1-s.tp) * f.speed(s.tp, f.d)
	g := kp * l * l / 12
	u1 := (s.dev-m)/2 + l*(slope-g)/4
	lim := 0.8 * (a.hi - m)
	return m + math.Max(-lim, math.Min(lim, u1))
}

// closeFits reports whether n interpolating biarcs from the current state
// to the end, through the middle curve with its own tangent at n − 1
// evenly spaced interior parameters, stay in the zone.
func (s *arcState) closeFits(a *Approximator, n int) bool {
	p, tg, tp, dev := s.p, s.tan, s.tp, s.dev
	h := (a.tEnd - tp) / float64(n)
	for i := 0; i < n; i++ {
		t1 := tp + h
		q, tq := s.piece(a, i, n, t1)
		a1, a2, j, tj, ok := a.biarc(p, tg, q, tq, tp)
		if !ok {
			return false
		}
		devJ := a.f.e.SignedDistance(ptOf(j)) - a.f.d
		lo1, hi1 := a.devRange(tp, tj, dev, devJ, p, tg, a1)
		_, jt := arcEndTangent(p, tg, a1, j)
		lo2, hi2 := a.devRange(tj, t1, devJ, a.mid(), j, jt, a2)
		if math.Min(lo1, lo2) < a.lo || math.Max(hi1, hi2) > a.hi {
			return false
		}
		p, tg, tp, dev = q, tq, t1, a.mid()
	}
	return true
}

// piece returns the end point and tangent of closing piece i of n.
func (s *arcState) piece(a *Approximator, i, n int, t1 float64) (vec, vec) {
	if i == n-1 {
		return s.p0, s.t0
	}
	q, tq, _ := a.f.at(t1, a.f.d+a.mid())
	return q, tq.scale(a.sigma)
}

func ptOf(v vec) ellipsePoint { return ellipsePoint{X: v.x, Y: v.y} }

// arcEndTangent returns the end point and tangent of the arc from p with
// tangent tg and curvature k that ends at q.
func arcEndTangent(p, tg vec, k float64, q vec) (vec, vec) {
	_, end := arcTo(p, tg, q)
	return q, end
}

// biarc returns the curvatures of the two arcs of the equal-tangent-length
// biarc from (p0, t0) to (p1, t1), the join point and the foot parameter
// of the join, unwrapped next to ref (Bolton 1975: the join lies where the two tangent legs of
// equal length α meet, |p0 + αt0 − (p1 − αt1)| = 2α).
func (a *Approximator) biarc(p0, t0, p1, t1 vec, ref float64) (k1, k2 float64, j vec, tj float64, ok bool) {
	v := p1.sub(p0)
	tt := t0.add(t1)
	vt := v.dot(tt)
	c := t0.dot(t1)
	vv := v.dot(v)
	var alpha float64
	if den := 2 * (1 - c); den < 1e-12 {
		if vt <= 0 {
			return 0, 0, vec{}, 0, false
		}
		alpha = vv / (2 * vt)
	} else {
		disc := vt*vt + den*vv
		alpha = (-vt + math.Sqrt(disc)) / (-den)
		if alpha <= 0 {
			alpha = (vt + math.Sqrt(disc)) / den
		}
	}
	if !(alpha > 0) || math.IsInf(alpha, 0) {
		return 0, 0, vec{}, 0, false
	}
	a1 := p0.addScaled(t0, alpha)
	a2 := p1.addScaled(t1, -alpha)
	j = a1.add(a2).scale(0.5)
	k1, _ = arcTo(p0, t0, j)
	_, tjv := arcTo(p0, t0, j)
	k2, _ = arcTo(j, tjv, p1)
	tj, _ = a.f.e.Nearest(ptOf(j))
	// Unwrap the join's foot next to the current parameter.
	tj = unwrapNear(tj, ref)
	return k1, k2, j, tj, true
}

// unwrapNear returns t + 2πk nearest to ref.
func unwrapNear(t, ref float64) float64 {
	return t + 2*math.Pi*math.Round((ref-t)/(2*math.Pi))
}

// nextClosing emits the closing biarcs one arc at a time.
func (s *arcState) nextClosing(a *Approximator) (Segment, bool) {
	if s.half {
		s.half = false
		s.i++
		return s.second, true
	}
	if s.i >= s.n {
		return Segment{}, false
	}
	h := (a.tEnd - s.t0End) / float64(s.n)
	t1 := s.t0End + h*float64(s.i+1)
	q, tq := s.piece(a, s.i, s.n, t1)
	k1, k2, j, _, ok := a.biarc(s.p, s.tan, q, tq, s.tp)
	if !ok {
		return Segment{}, false
	}
	first := s.segment(trial{k: k1, q: j})
	_, jt := arcEndTangent(s.p, s.tan, k1, j)
	mid := arcState{p: j, tan: jt}
	s.second = mid.segment(trial{k: k2, q: q})
	s.half = true
	s.p, s.tan, s.tp, s.dev = q, tq, t1, a.mid()
	return first, true
}
