package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

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
// feet these points run over the whole arc. λ is sampled just densely
// enough to find its extremes, which are then polished by successive
// parabolas until two agree within a fraction of devMiss.
//
// Where an arc would be too flat to write soundly (a rise over its chord
// below the rounding allowance, or a radius above arcMaxRadius times the largest radius of curvature of the
// curve), a line along the current tangent is used instead; it keeps
// the chain tangent-continuous. The chain is closed (or ended) by
// interpolating biarcs onto the curve's own tangent; near the end a step
// is chosen, where one exists, after which a single biarc closes.
//
// Curves whose radius of curvature ranges over more than
// lookCurvatureRatio (flat ellipses and their parallel curves) plan
// backwards where the curvature falls ahead, and short paths round them
// (coarse tolerances: fewer than lookSegments arcs by N*) also look
// ahead, because there each arc spans a several-fold change of curvature
// and the greedy chain loses up to half the zone:
//
//   - Backward planning: where the curvature falls ahead (from an end of
//     the major axis to the next end of the minor axis), greedy arcs
//     start where the curve turns fastest with their tangent already
//     fixed, and are short; on a flat gasket they fall into a cycle of
//     four steps, one of them a third as long as the others. Run the
//     other way the same stretch is one of rising curvature, where the
//     chain does well; so the stretch is built backwards, from the
//     curve's own tangent at its far end to a closing onto the current
//     state, into a buffer of planMax segments in the Approximator, and
//     emitted reversed. Where the arcs look ahead the forward chain is
//     run over the stretch as well and kept when it takes no more arcs.
//     Paths of more than planSegments arcs by N* do not plan: a quarter
//     of them would not fit the buffer.
//   - Look-ahead: each step also tries ends at five fixed deviations
//     and keeps the one whose step, followed by the next step by
//     the deadbeat rule, reaches farthest.
//
// On the count test's shapes that look ahead, the two save a fifth of
// the arcs for about five times the work per arc; planning alone saves
// arcs and trials both (README, DEVELOPERS.md).

const (
	// arcSamples is the fewest interior samples of a trial's deviation;
	// devRange takes more where the spacing it needs is finer. Four
	// rather than six: the same counts over 10 000 draws and about 3 %
	// less time (DEVELOPERS.md).
	arcSamples = 4
	maxSamples = 128
	devMiss    = 0.002
	// A join on the steady pattern commits the next arc to humps as high
	// as the last one's: steps aimed at the edge of the zone leave the
	// next step no room once the curvature changes a little faster, so
	// the chain aims lower and accepts a wide window. Measured: aiming at
	// 0.987 cost more segments than 0.92 and twice the trials; accepting
	// from 0.72 rather than 0.8 saves a fifth of the trials on coarse
	// tolerances for about 1% more arcs on fine ones, and from 0.6 the
	// worst counts pass 2.0·N* + 4 for b/a ≥ 0.1.
	arcTarget = 0.92 // aim at this fraction of the usable half-width
	arcAccept = 0.72 // accept anything in [arcAccept, arcLimit]
	// arcLimit keeps 1% of the half-width for what the sampled extremes
	// may miss (devMiss is the estimate; the rest is margin).
	arcLimit     = 0.99
	arcMaxRadius = 4 // times the curve's largest radius of curvature
	arcMaxSteps  = 10
	fanSamples   = 48 // points along an arc where the normals fan out
	// Short paths round curves whose curvature changes more than
	// twentyfold look ahead and plan backwards (see arcState.start).
	lookSegments       = 60
	lookCurvatureRatio = 20
	planMax            = 64 // segments of a stretch planned backwards
	// planSegments is the most arcs by N* of a path that plans: a
	// quarter of the path at 1.6 times N* is 0.4·N*, within planMax.
	planSegments = 160
	// The deadbeat rule's end deviation stays within these shares of the
	// half-width off the middle (see endDeviation); the second where the
	// normals fan out across the zone.
	endLimit    = 0.8
	endLimitFan = 0.3
	// The endgame skips steps whose model (see stepModel) uses more than
	// this share of the zone.
	endgameModelMax = 1.3
	// aimSegments is the fewest arcs by N* of a path that aims longer:
	// on shorter ones (a dozen arcs) it cost the arc that breaks
	// 2.0·N* + 4 in one draw of 30 000.
	aimSegments = 15
)

// arcState holds the arc approximator's state between segments: O(1).
type arcState struct {
	lastDt    float64 // parameter span of the last step
	corr      float64 // the last step over its predicted span (0: none yet)
	p, tan    vec     // current point and unit tangent (direction of travel)
	tp        float64 // parameter of the current point's foot
	foot      foot    // and what the search needs there
	dslope    float64 // the deviation's slope there, once haveSlope
	haveSlope bool
	dev       float64 // its deviation
	// Closing: n biarcs onto the end, piece i, second half pending.
	closing bool
	n, i    int
	half    bool
	second  Segment // the second arc of a biarc, pending
	pending bool    // second is due next (a rescue, not the closing)
	t0End   float64 // parameter where closing started
	p0, t0  vec     // the point and tangent the path must end with
	leg     float64 // closing biarcs' first leg over the equal-leg length
	dev0    float64 // the deviation the path must end with
	// A stretch planned backwards (see planExit): nPlan segments left in
	// a.plan, emitted last first, ending at planT (the path's end when
	// planEnd); noPlan is the end of the last stretch planned. Where the
	// forward chain did better, its nFwd segments are in a.fwd (iFwd
	// emitted so far), and a.fwdState is the state it ended in.
	nFwd    int
	iFwd    int
	nPlan   int
	planT   float64
	planEnd bool
	noPlan  float64
	full    bool // the whole closed curve is one full circle
	circle  Segment
}

// mid returns the middle of the usable zone.
func (a *Approximator) mid() float64 { return 0.5 * (a.lo + a.hi) }

func (s *arcState) start(a *Approximator) {
	f := &a.f
	m := a.mid()
	p, tg, n := f.at(a.spec.From, f.d+m)
	tan := tg.scale(a.sigma)
	// Start on the steady pattern: crossing the middle of the zone with
	// slope g = κ′L²/12 (see endDeviation), L from the single-arc model.
	// Not where the arcs look ahead: there the path's start is where its
	// closing must end, often round a cap, and a steep start there left
	// the closing biarcs no room (four of them round one cap); the
	// curve's own tangent did not.
	ke, dke := f.ellipseCurvature(a.spec.From)
	g1 := 1 + f.d*ke
	kp := a.sigma * dke / (g1 * g1 * g1)
	e := f.e
	kr := (e.MaxRadiusOfCurvature() + f.d) / (e.MinRadiusOfCurvature() + f.d)
	look := a.nEst < lookSegments && kr > lookCurvatureRatio
	if kp != 0 && !look {
		l := math.Cbrt(62 * (a.hi - a.lo) / math.Abs(kp))
		l = min(l, math.Pi/4*f.speed(a.spec.From, f.d))
		g := kp * l * l / 12
		g = max(-0.5, min(0.5, g))
		tan = tan.add(n.scale(g)).scale(1 / math.Hypot(1, g))
	}
	*s = arcState{p: p, tan: tan, tp: a.spec.From, dev: m, foot: a.footAt(a.spec.From)}
	a.look = look
	a.plans = look || (kr > lookCurvatureRatio && a.nEst <= planSegments)
	q, tq, _ := f.at(a.tEnd, f.d+m)
	s.p0, s.t0, s.dev0 = q, tq.scale(a.sigma), m
	s.noPlan = math.NaN()
	if !a.spec.Open {
		s.p0, s.t0 = p, tan
		s.fullCircle(a)
	}
}

// fullCircle checks whether one full circle about the centre stays in the
// zone of a nearly round curve, and if so prepares it as the whole path.
func (s *arcState) fullCircle(a *Approximator) {
	f := &a.f
	e := f.e
	r := 0.5*(e.SemiMajor()+e.SemiMinor()) + f.d + a.mid()
	c := vec{f.cx, f.cy}
	if (e.SemiMajor()-e.SemiMinor())/2 > a.hi-a.lo {
		return
	}
	q, _, _ := f.at(a.spec.From, f.d)
	u := q.sub(c)
	u = u.scale(1 / u.norm())
	start := c.addScaled(u, r)
	g := arcGeom{c: c, r: r, lc: f.local(c), sv: f.localDir(start.sub(c)), dir: a.sigma, sweep: 2 * math.Pi, wide: math.Inf(1)}
	d0 := f.circleDev(a.spec.From, &g)
	f0, fm, f1 := a.footAt(a.spec.From), a.footAt(0.5*(a.spec.From+a.tEnd)), a.footAt(a.tEnd)
	lo, hi := a.devRange(&f0, &fm, &f1, d0, d0, &g)
	if !a.fits(lo, hi) {
		return
	}
	s.full = true
	s.circle = Segment{Kind: Arc, Start: Point{X: start.x, Y: start.y}, End: Point{X: start.x, Y: start.y},
		CenterX: c.x, CenterY: c.y, Radius: r, Clockwise: a.sigma < 0}
}

// arcGeom is a candidate arc (or line) ready for deviation sampling.
// Sampling works in the ellipse's own frame (centre at the origin, axes
// along x and y), which saves a rotation per sample.
type arcGeom struct {
	line    bool
	p, nl   vec     // start and its left normal (lines)
	q       vec     // end
	cw      vec     // start − centre, in the world
	c       vec     // centre
	lp, lnl vec     // p and nl in the own frame
	lc      vec     // c in the own frame
	r       float64 // radius
	sv      vec     // start − centre, in the own frame
	dir     float64 // +1 counter-clockwise, −1 clockwise
	sweep   float64 // turning from start to end, in (0, 2π] (0: not yet known, see sweepOf)
	wide    float64 // radius above which the near crossing is the arc's
	fan     bool    // the normals fan out across the zone: always check
	nu      bool    // devRange samples on the normal-angle grid
}

// local returns the world point v in the ellipse's own frame.
func (f *frame) local(v vec) vec {
	return f.localDir(vec{v.x - f.cx, v.y - f.cy})
}

// localDir returns the world direction v in the ellipse's own frame.
func (f *frame) localDir(v vec) vec {
	return vec{f.cos*v.x + f.sin*v.y, -f.sin*v.x + f.cos*v.y}
}

// newArcGeom describes into g the arc from p with tangent tg and signed
// curvature k that ends at q (k == 0: the line from p along tg).
func (a *Approximator) newArcGeom(g *arcGeom, p, tg vec, k float64, q vec) {
	*g = arcGeom{p: p, nl: tg.left(), wide: 16 * (a.hi - a.lo + math.Abs(a.lo) + math.Abs(a.hi))}
	f := &a.f
	g.q = q
	if k == 0 {
		g.line = true
		g.lp, g.lnl = f.local(p), f.localDir(g.nl)
		return
	}
	rk := 1 / k
	g.c = p.addScaled(g.nl, rk)
	g.lc = f.local(g.c)
	g.r = math.Abs(rk)
	g.cw = p.sub(g.c)
	g.sv = f.localDir(g.cw)
	g.dir = math.Copysign(1, k)
	// g.sweep is left for sweepOf: most arcs are far wider than the zone
	// and never need it.
}

// sweepOf returns the turning of the arc g from its start to its end, in
// (0, 2π], computing it on first use.
func (f *frame) sweepOf(g *arcGeom) float64 {
	if g.sweep == 0 {
		g.sweep = g.angle(f.localDir(g.q.sub(g.c)))
		if g.sweep == 0 {
			g.sweep = 2 * math.Pi
		}
	}
	return g.sweep
}

// angle returns the turning from the start to the direction w (in the
// own frame) about the centre, in the arc's direction, in [0, 2π).
func (g *arcGeom) angle(w vec) float64 {
	a := g.dir * math.Atan2(g.sv.cross(w), g.sv.dot(w))
	if a < 0 {
		a += 2 * math.Pi
	}
	return a
}

// circleDev returns λ(t): where the normal line of the intended curve at
// t meets the arc (or line), as a signed distance from the curve; NaN when
// the normal misses the arc. Of the two crossings with the full circle the
// one on the arc is taken (nearest the curve if both are).
func (f *frame) circleDev(t float64, g *arcGeom) float64 {
	s, c := math.Sincos(t)
	return f.circleDevSC(s, c, g)
}

// circleDevSC is circleDev given the sine and cosine of t.
func (f *frame) circleDevSC(s, c float64, g *arcGeom) float64 {
	// The curve's point and outward normal in the own frame.
	n := vec{f.ry * c, f.rx * s}
	n = n.scale(1 / math.Sqrt(n.x*n.x+n.y*n.y))
	return f.crossing(vec{f.rx*c + f.d*n.x, f.ry*s + f.d*n.y}, n, g)
}

// circleDevNu is circleDev given the cosine and sine of the normal angle
// ν (see normalAngle) rather than of t: the unit normal is (cos ν, sin ν)
// and the ellipse's point (rx²·cos ν, ry²·sin ν)/|(rx·cos ν, ry·sin ν)|,
// one square root fewer than through t.
func (f *frame) circleDevNu(cn, sn float64, g *arcGeom) float64 {
	a, b := f.rx*cn, f.ry*sn
	ih := 1 / math.Sqrt(a*a+b*b)
	return f.crossing(vec{f.rx*a*ih + f.d*cn, f.ry*b*ih + f.d*sn}, vec{cn, sn}, g)
}

// crossing returns λ where the normal line through q with unit direction
// n (the intended curve's point and outward normal, in the own frame)
// meets the arc or line g (see circleDev).
func (f *frame) crossing(q, n vec, g *arcGeom) float64 {
	if g.line {
		den := n.dot(g.lnl)
		if den == 0 {
			return math.NaN()
		}
		return g.lp.sub(q).dot(g.lnl) / den
	}
	w := q.sub(g.lc)
	b := n.dot(w)
	// |w|² − r² loses no more than (|w| − r)(|w| + r) would: both carry
	// the rounding of the centre, a few ulps of r.
	cc := w.dot(w) - g.r*g.r
	disc := b*b - cc
	if disc < 0 {
		return math.NaN()
	}
	sq := math.Sqrt(disc)
	l1 := -cc / (b + math.Copysign(sq, b)) // nearest zero
	if g.r > g.wide && !g.fan {
		// A circle far larger than the zone meets the normal once near
		// the curve: that crossing is on the arc. Not so where the
		// normals fan out (round a needle's tip a wide arc's circle meets
		// them on both sides, and the near crossing may be off the arc).
		return l1
	}
	l2 := -b - math.Copysign(sq, b) // the other crossing
	sweep := f.sweepOf(g) + 1e-9    // a little slack
	if g.angle(w.addScaled(n, l1)) <= sweep {
		return l1
	}
	if g.angle(w.addScaled(n, l2)) <= sweep {
		return l2
	}
	return math.NaN()
}

// foot holds what the arc search needs at one curve parameter t, from
// one Sincos and one Atan2: the intended curve's curvature, the normal
// angle ν (see normalAngle) and the speeds |dq/dt| of the zone's outer
// edge and of its middle.
type foot struct {
	t, k, nu, vEdge, vMid float64
	v, kp                 float64 // speed and dκ/ds of the intended curve
	sn, cs                float64 // sin t and cos t
}

// footAt returns the foot at t.
func (a *Approximator) footAt(t float64) foot {
	sn, cs := math.Sincos(t)
	return a.footAtSC(t, sn, cs)
}

// stepFeet returns the feet at t1 and halfway to it from the current
// point's foot x, from one Sincos: the sine and cosine of the half step
// turn x's into the middle's and the middle's into the end's.
func (a *Approximator) stepFeet(x *foot, t1 float64) (f1, fm foot) {
	tm := 0.5 * (x.t + t1)
	sh, ch := math.Sincos(t1 - tm)
	sm, cm := x.sn*ch+x.cs*sh, x.cs*ch-x.sn*sh
	s1, c1 := sm*ch+cm*sh, cm*ch-sm*sh
	return a.footAtSC(t1, s1, c1), a.footAtSC(tm, sm, cm)
}

// footAtSC is footAt given sin t and cos t.
func (a *Approximator) footAtSC(t, sn, cs float64) foot {
	f := &a.f
	n := math.Round(t / math.Pi)
	// sin and cos of t − nπ, which keeps the normal angle continuous
	s, c := sn, cs
	if int64(n)&1 != 0 {
		s, c = -s, -c
	}
	v2, v, ke, kp := f.footBase(s, c)
	edge := max(math.Abs(a.lo), math.Abs(a.hi))
	// the speed at offset o is v + o·rx·ry/v2
	u := f.rx * f.ry / v2
	return foot{
		t:     t,
		k:     ke / (1 + f.d*ke),
		nu:    math.Atan2(f.rx*s, f.ry*c) + n*math.Pi,
		vEdge: v + (f.d+edge)*u,
		vMid:  v + (f.d+a.mid())*u,
		v:     v + f.d*u,
		kp:    kp,
		sn:    sn,
		cs:    cs,
	}
}

// footBase returns, from the sine and cosine of t (or of t less a
// multiple of π, which keeps their product), the ellipse's |p′(t)|² and
// |p′(t)|, its curvature κ and the intended curve's dκ/ds: the ellipse's
// −3·rx·ry·(rx² − ry²)·sin t·cos t / |p′|⁶ (frame.ellipseCurvature) over
// (1 + d·κ)³.
func (f *frame) footBase(s, c float64) (v2, v, ke, kp float64) {
	v2 = f.rx*f.rx*s*s + f.ry*f.ry*c*c
	v = math.Sqrt(v2)
	iv := 1 / (v2 * v) // 1/|p′|³, whose square is 1/|p′|⁶
	ke = f.rx * f.ry * iv
	g1 := 1 + f.d*ke
	dke := -3 * f.rx * f.ry * (f.rx*f.rx - f.ry*f.ry) * s * c * (iv * iv)
	return v2, v, ke, dke / (g1 * g1 * g1)
}

// devRange returns the extremes of the deviation of the arc g over the
// feet from f0 to f1 (fm halfway in t), given the deviations d0 and d1 at
// the ends.
//
// The number of samples follows from the curve: along the arc the
// deviation δ has δ″ ≈ κ − k (κ the curve's, k the arc's) and δ‴ ≈ κ′.
// With samples h apart in arc length the miss of the best sample is
// about |κ − k|·h²/8; h keeps it below a quarter of the half-width, so
// the samples find the neighbourhood of every extreme, and polish then
// refines each extreme with new evaluations until successive parabolas
// agree within devMiss/4 of the half-width (first halving the bracket
// about the best sample, where the first parabola's vertex falls on it
// and |κ′|·h³/24 exceeds eight times devMiss of the half-width: there
// the check at the vertex would only repeat the sample). Where the zone
// is wide beside the radius of curvature (above 5%) the normals fan out
// across it and λ is not smooth enough to polish; there h also keeps the
// one-parabola miss |κ′|·h³/24 below devMiss of the half-width. Uniform
// steps in the parameter t crowd the flat stretches of a flat ellipse and
// starve its tips, and uniform steps in the normal angle do the opposite:
// the samples come from whichever grid needs fewest, or from both merged
// in order.
func (a *Approximator) devRange(f0, fm, f1 *foot, d0, d1 float64, g *arcGeom) (lo, hi float64) {
	f := &a.f
	t0, t1 := f0.t, f1.t
	k := 0.0
	if !g.line {
		k = 1 / g.r
	}
	kmin, kmax := f.curvatureRange(f0, f1)
	dd := max(math.Abs(kmax-k), math.Abs(kmin-k))
	// The arc's points sit on the curve's normals up to the zone's edge,
	// where a step along the curve covers (1 + |edge|·κ) times the length.
	edge := max(math.Abs(a.lo), math.Abs(a.hi))
	// Length of the zone's outer edge over the interval, cheaply and from
	// above enough: Simpson on its speed, or its turning times the largest
	// radius there, whichever is larger (the first misses a tight tip
	// between the nodes, the second a flat stretch).
	v0, vm, v1 := f0.vEdge, fm.vEdge, f1.vEdge
	length := math.Abs(t1-t0) * (v0 + 4*vm + v1) / 6
	nu0, nu1 := f0.nu, f1.nu
	if kmin > 0 {
		length = max(length, math.Abs(nu1-nu0)*(1/kmin+edge))
	}
	// |κ′| over the interval, bounded from the curvature change over it.
	dk := 4 * (kmax - kmin) / max(length, 1e-300)
	miss := devMiss * 0.5 * (a.hi - a.lo)
	h := math.Inf(1)
	// Polishing the extremes needs them smooth and found; where the zone
	// is wide against the radius of curvature the normals fan out across
	// it and the deviation along them is not, so sample densely instead.
	polish := !a.fans(kmax)
	g.fan = !polish
	if dk > 0 && !polish {
		h = math.Cbrt(24 * miss / dk)
	}
	if dd > 0 {
		h = min(h, math.Sqrt(8*0.25*0.5*(a.hi-a.lo)/dd))
	}
	// The grid: uniform in t, whose widest spacing on the outer edge is
	// where its speed peaks (at the ends, the middle or a vertex inside;
	// a quarter more is allowed between them), uniform in the normal
	// angle, whose widest spacing is where the radius peaks, or both
	// merged (the first crowds the flanks of a flat ellipse and starves
	// its tips, the second the opposite), whichever needs the fewest
	// samples for the spacing h; the merged grid costs more a sample.
	nT := math.Abs(t1-t0) * 1.25 * f.edgeSpeedMax(t0, t1, a.f.d+edge, max(v0, vm, v1)) / h
	nN := math.Inf(1)
	if kmin > 0 {
		nN = math.Abs(nu1-nu0) * (1/kmin + edge) / h
	}
	nM := 2 * length / h
	mode := gridT
	x := nT
	switch {
	case nT <= nN && nT <= 1.5*nM:
	case nN <= 1.5*nM:
		mode, x = gridNu, nN
	default:
		mode, x = gridMerged, nM
	}
	n := arcSamples
	if mode == gridMerged {
		n = 2 * arcSamples // at least arcSamples from each grid
	}
	if x > float64(n) {
		n = int(min(x+1, maxSamples))
	}
	ts, v, grid := a.ts[:], a.vs[:], a.grid[:]
	var m int
	switch mode {
	case gridT:
		m = f.mergedGrid(f0, t1, nu1, n, grid[:0], false)
	case gridNu:
		m = f.normalGrid(f0, nu1, n, grid[:0])
	default:
		m = f.mergedGrid(f0, t1, nu1, n/2, grid[:0], true)
	}
	g.nu = mode == gridNu
	for j := 0; j < m; j++ {
		ts[j] = grid[j].t // the abscissa: ν on the normal-angle grid
	}
	lo, hi = min(d0, d1), max(d0, d1)
	v[0], v[m-1] = d0, d1
	for j := 1; j < m-1; j++ {
		var x float64
		if mode == gridNu {
			x = f.circleDevNu(grid[j].c, grid[j].s, g)
		} else {
			x = f.circleDevSC(grid[j].s, grid[j].c, g)
		}
		if math.IsNaN(x) {
			return math.Inf(-1), math.Inf(1)
		}
		v[j] = x
	}
	jmax, jmin := 0, 0
	for j := 1; j < m; j++ {
		if v[j] > v[jmax] {
			jmax = j
		}
		if v[j] < v[jmin] {
			jmin = j
		}
	}
	if polish {
		// Halvings of the bracket before polishing (see polish), while
		// the one-parabola miss |κ′|·h³/24 of the spacing h exceeds
		// eight times devMiss of the half-width.
		halve := 0
		if dk > 0 {
			// h > 2·(24·miss/dk)^(1/3), by cubes
			for ; halve < 6 && h*h*h*dk > 192*miss; h /= 2 {
				halve++
			}
		}
		// No sample misses its neighbourhood's extreme by more than a
		// quarter of the half-width (the spacing h above; half of it is
		// allowed here, for merged grids that space unevenly), so only
		// the extreme that decides the ratio needs polishing, and the
		// other one too only if that bound could overtake it.
		mid, miss4 := a.mid(), 0.5*(a.hi-a.lo)/2
		if v[jmax]-mid >= mid-v[jmin] {
			hi = max(hi, f.polish(g, ts[:m], v[:m], jmax, 1, 0.5*miss, halve))
			if mid-(v[jmin]-miss4) > hi-mid {
				lo = min(lo, f.polish(g, ts[:m], v[:m], jmin, -1, 0.5*miss, halve))
			} else {
				lo = min(lo, v[jmin]-miss4)
			}
		} else {
			lo = min(lo, f.polish(g, ts[:m], v[:m], jmin, -1, 0.5*miss, halve))
			if v[jmax]+miss4-mid > mid-lo {
				hi = max(hi, f.polish(g, ts[:m], v[:m], jmax, 1, 0.5*miss, halve))
			} else {
				hi = max(hi, v[jmax]+miss4)
			}
		}
		return lo, hi
	}
	lo = min(lo, refineExtreme(ts[:m], v[:m], jmin))
	hi = max(hi, refineExtreme(ts[:m], v[:m], jmax))
	// Where the normals fan out a stretch of the arc may have its feet
	// outside [t0, t1] (round a needle's tip), which no normal above
	// reaches: there the arc's own points are measured as well.
	plo, phi := a.pointRange(g)
	return min(lo, plo), max(hi, phi)
}

// pointRange returns the extremes of the exact signed distance from the
// intended curve of fanSamples points evenly spaced along the arc or
// line g, each refined by a parabola through its neighbours. It costs a
// foot search per point and serves only where the normals fan out.
func (a *Approximator) pointRange(g *arcGeom) (lo, hi float64) {
	f := &a.f
	var x, v [fanSamples + 1]float64
	for j := 0; j <= fanSamples; j++ {
		u := float64(j) / fanSamples
		var p vec
		if g.line {
			p = g.p.add(g.q.sub(g.p).scale(u))
		} else {
			s, c := math.Sincos(g.dir * f.sweepOf(g) * u)
			w := g.cw.scale(c).add(g.cw.left().scale(s * g.dir))
			p = g.c.add(w)
		}
		x[j], v[j] = u, f.e.SignedDistance(ptOf(p))-f.d
	}
	jmin, jmax := 0, 0
	for j := range v {
		if v[j] < v[jmin] {
			jmin = j
		}
		if v[j] > v[jmax] {
			jmax = j
		}
	}
	return refineExtreme(x[:], v[:], jmin), refineExtreme(x[:], v[:], jmax)
}

// polish returns the extreme (the largest when sign > 0, the smallest
// when sign < 0) of the deviation near sample j: the vertex of the
// parabola through the sample and its neighbours is evaluated and the
// parabola refitted around the better point, until the prediction and the
// evaluation agree within tol (each round shrinks the miss of a smooth
// extreme by about the cube of the bracket's shrinking).
func (f *frame) polish(g *arcGeom, x, v []float64, j int, sign, tol float64, halve int) float64 {
	m := len(v)
	if m < 3 {
		return v[j]
	}
	var x0, x1, x2, y0, y1, y2 float64
	switch j {
	case 0, m - 1:
		// An extreme at an end sample may still dip between it and its
		// neighbour (the end values are given, not sampled, and a
		// closing biarc's join may sit on the zone's edge): sample
		// halfway to the neighbour and polish from there when it is
		// further out, or when the parabola through the end, the new
		// sample and the neighbour has its vertex further out between.
		i := 1
		if j == m-1 {
			i = m - 2
		}
		xh := 0.5 * (x[j] + x[i])
		yh := f.devAt(xh, g)
		if math.IsNaN(yh) {
			return sign * math.Inf(1)
		}
		if sign*yh > sign*v[j] {
			x0, x1, x2 = x[j], xh, x[i]
			y0, y1, y2 = v[j], yh, v[i]
			break
		}
		xv, yv, ok := parabolaVertex(x[j], xh, x[i], v[j], yh, v[i])
		if !ok || (xv-x[j])*(xh-xv) <= 0 || sign*yv <= sign*v[j] {
			return v[j]
		}
		y := f.devAt(xv, g)
		if math.IsNaN(y) {
			return sign * math.Inf(1)
		}
		if sign*y <= sign*v[j] {
			return v[j] // the fit promised a dip the curve has not
		}
		x0, x1, x2 = x[j], xv, xh
		y0, y1, y2 = v[j], y, yh
	default:
		x0, x1, x2 = x[j-1], x[j], x[j+1]
		y0, y1, y2 = v[j-1], v[j], v[j+1]
	}
	// Where the curvature changes fast beside the sample spacing, a
	// parabola through the best sample and its neighbours can put its
	// vertex on the sample while the extreme lies between it and a
	// neighbour, and the check at the vertex then only repeats the
	// sample: there the bracket is halved first, about the best of the
	// sample and the two midpoints.
	if halve > 0 {
		xv, _, ok := parabolaVertex(x0, x1, x2, y0, y1, y2)
		if ok && math.Abs(xv-x1) >= 0.25*min(math.Abs(x1-x0), math.Abs(x2-x1)) {
			halve = 0 // the vertex is away from the samples: its check is real
		}
	}
	for ; halve > 0; halve-- {
		xa, xb := 0.5*(x0+x1), 0.5*(x1+x2)
		ya, yb := f.devAt(xa, g), f.devAt(xb, g)
		if math.IsNaN(ya) || math.IsNaN(yb) {
			return sign * math.Inf(1)
		}
		switch {
		case sign*ya > sign*y1 && sign*ya >= sign*yb:
			x1, x2, y1, y2 = xa, x1, ya, y1
		case sign*yb > sign*y1:
			x0, x1, y0, y1 = x1, xb, y1, yb
		default:
			x0, x2, y0, y2 = xa, xb, ya, yb
		}
	}
	best := y1
	for it := 0; it < 5; it++ {
		xv, yv, ok := parabolaVertex(x0, x1, x2, y0, y1, y2)
		if !ok {
			return best
		}
		y := f.devAt(xv, g)
		if math.IsNaN(y) {
			return sign * math.Inf(1)
		}
		if math.Abs(y-yv) <= tol {
			return sign * max(sign*y, max(sign*yv, sign*best))
		}
		if sign*y > sign*best {
			best = y
			if xv < x1 == (x0 < x2) {
				x2, y2 = x1, y1
			} else {
				x0, y0 = x1, y1
			}
			x1, y1 = xv, y
		} else if xv < x1 == (x0 < x2) {
			x0, y0 = xv, y
		} else {
			x2, y2 = xv, y
		}
	}
	return best
}

// parabolaVertex returns the vertex of the parabola through three points
// when it lies between the outer two.
func parabolaVertex(x0, x1, x2, y0, y1, y2 float64) (xv, yv float64, ok bool) {
	// y = y1 + b·u + c·u² with u = x − x1; with u0, u2 the outer points'
	// u and e0, e2 their y − y1, b·D = e0·u2² − e2·u0² and
	// c·D = e2·u0 − e0·u2 for D = u0·u2·(u2 − u0): the vertex is at
	// u = −b/(2c), which D cancels from, and lies b·u/2 above y1.
	u0, u2 := x0-x1, x2-x1
	e0, e2 := y0-y1, y2-y1
	bd, cd := e0*u2*u2-e2*u0*u0, e2*u0-e0*u2
	d := u0 * u2 * (u2 - u0)
	if cd == 0 || d == 0 {
		return 0, 0, false
	}
	h := -bd / (2 * cd)
	xv = x1 + h
	if !(xv > min(x0, x2) && xv < max(x0, x2)) || xv == x1 {
		return 0, 0, false
	}
	return xv, y1 + 0.5*h*(bd/d), true
}

// curvatureRange returns the smallest and largest curvature of the
// intended curve between two feet (either order): the ellipse's curvature is
// monotone between its vertices at multiples of π/2, so the ends and the
// vertices inside decide.
func (f *frame) curvatureRange(f0, f1 *foot) (lo, hi float64) {
	t0, t1 := f0.t, f1.t
	if t1 < t0 {
		t0, t1 = t1, t0
	}
	lo, hi = min(f0.k, f1.k), max(f0.k, f1.k)
	for q := math.Ceil(t0 / (math.Pi / 2)); q*(math.Pi/2) <= t1 && q < math.Ceil(t0/(math.Pi/2))+5; q++ {
		kq, _ := f.curvature(q*(math.Pi/2), f.d)
		lo, hi = min(lo, kq), max(hi, kq)
	}
	return lo, hi
}

// normalAngle returns the continuous angle ν(t) of the ellipse's normal in
// its own frame: tan ν = (rx/ry)·tan t, ν(t + π) = ν(t) + π.
func (f *frame) normalAngle(t float64) float64 {
	n := math.Round(t / math.Pi)
	r := t - n*math.Pi
	s, c := math.Sincos(r)
	return math.Atan2(f.rx*s, f.ry*c) + n*math.Pi
}

// paramAtNormal inverts normalAngle.
func (f *frame) paramAtNormal(nu float64) float64 {
	n := math.Round(nu / math.Pi)
	r := nu - n*math.Pi
	s, c := math.Sincos(r)
	return math.Atan2(f.ry*s, f.rx*c) + n*math.Pi
}

// sample is a grid point: the curve parameter and its sine and cosine,
// or, on the normal-angle grid, the normal angle and its sine and
// cosine.
type sample struct{ t, s, c float64 }

// The grids devRange samples on.
const (
	gridT      = iota // uniform in t
	gridNu            // uniform in the normal angle ν, which is the abscissa
	gridMerged        // both, merged in order of t
)

// normalSC returns cos ν and sin ν, ν the normal angle at the foot x:
// the unit vector along (ry·cos t, rx·sin t), from the foot's own sine and
// cosine.
func (f *frame) normalSC(x *foot) (cn, sn float64) {
	cn, sn = f.ry*x.cs, f.rx*x.sn
	h := math.Hypot(cn, sn)
	return cn / h, sn / h
}

// normalGrid appends to dst ν0 = ν(x.t), n steps uniform in the normal
// angle and ν1, with the sines and cosines of those angles (by rotation,
// from the normal at x and recomputed every reseed steps; not set at the
// ends), and returns the count.
func (f *frame) normalGrid(x *foot, nu1 float64, n int, dst []sample) int {
	nu0 := x.nu
	dst = append(dst, sample{t: nu0})
	hn := (nu1 - nu0) / float64(n+1)
	shN, chN := math.Sincos(hn)
	cn, sn := f.normalSC(x)
	for j := 1; j <= n; j++ {
		if (j-1)%reseed == 0 && j > 1 {
			sn, cn = math.Sincos(nu0 + float64(j)*hn)
		} else {
			sn, cn = sn*chN+cn*shN, cn*chN-sn*shN
		}
		dst = append(dst, sample{t: nu0 + float64(j)*hn, s: sn, c: cn})
	}
	dst = append(dst, sample{t: nu1})
	return len(dst)
}

// devAt returns λ at the abscissa x of g's grid: the parameter t, or the
// normal angle on the normal-angle grid.
func (f *frame) devAt(x float64, g *arcGeom) float64 {
	if !g.nu {
		return f.circleDev(x, g)
	}
	s, c := math.Sincos(x)
	return f.circleDevNu(c, s, g)
}

// edgeSpeedMax returns the largest of vmax and the speeds at offset off of
// the vertices (multiples of π/2) strictly between t0 and t1.
func (f *frame) edgeSpeedMax(t0, t1, off, vmax float64) float64 {
	if t1 < t0 {
		t0, t1 = t1, t0
	}
	for q := math.Floor(t0/(math.Pi/2)) + 1; q*(math.Pi/2) < t1; q++ {
		v := f.ry // at t = 0 or π
		if int64(q)&1 != 0 {
			v = f.rx
		}
		vmax = max(vmax, v+off*f.rx*f.ry/(v*v))
		if q > math.Floor(t0/(math.Pi/2))+4 {
			break
		}
	}
	return vmax
}

// reseed is how many steps the sine and cosine are carried by rotation
// before being computed afresh (the rounding grows by a few ulps a step).
const reseed = 16

// mergedGrid appends to dst the parameter t0, then n steps uniform in t
// merged in order (when normals is set) with n steps uniform in the normal
// angle (ν0 = ν(t0) to ν1 = ν(t1)), then t1, and returns the count. The
// sines and cosines of the steps come by rotation, not one Sincos each;
// those of the two ends are not set.
func (f *frame) mergedGrid(x0 *foot, t1, nu1 float64, n int, dst []sample, normals bool) int {
	t0, nu0 := x0.t, x0.nu
	dst = append(dst, sample{t: t0})
	ht := (t1 - t0) / float64(n+1)
	hn := (nu1 - nu0) / float64(n+1)
	i, j := 1, 1
	if !normals {
		j = n + 1 // no normal-angle samples
	}
	up := t1 > t0
	var st, ct, sn, cn float64 // sine and cosine of the next t and ν steps
	shT, chT := math.Sincos(ht)
	var shN, chN float64
	if normals {
		shN, chN = math.Sincos(hn)
		// the first normal-angle step from the normal at t0
		c0, s0 := f.normalSC(x0)
		sn, cn = s0*chN+c0*shN, c0*chN-s0*shN
	}
	// the first t step from the foot's own sine and cosine
	st, ct = x0.sn*chT+x0.cs*shT, x0.cs*chT-x0.sn*shT
	var nx sample
	haveN := false
	for i <= n || j <= n {
		if !haveN && j <= n {
			if (j-1)%reseed == 0 && j > 1 {
				sn, cn = math.Sincos(nu0 + float64(j)*hn)
			}
			// The foot whose normal has angle ν: (cos t, sin t) lies
			// along (rx·cos ν, ry·sin ν).
			a, b := f.rx*cn, f.ry*sn
			h := math.Sqrt(a*a + b*b)
			k := math.Round((nu0 + float64(j)*hn) / math.Pi)
			sg := float64(1 - 2*(int64(k)&1)) // (−1)^k
			nx = sample{t: math.Atan2(sg*b, sg*a) + k*math.Pi, s: b / h, c: a / h}
			sn, cn = sn*chN+cn*shN, cn*chN-sn*shN
			haveN = true
		}
		if (i-1)%reseed == 0 && i > 1 && i <= n {
			st, ct = math.Sincos(t0 + float64(i)*ht)
		}
		tt := t0 + float64(i)*ht
		var x sample
		if j > n || (i <= n && (tt < nx.t) == up) {
			x = sample{t: tt, s: st, c: ct}
			st, ct = st*chT+ct*shT, ct*chT-st*shT
			i++
		} else {
			x = nx
			j++
			haveN = false
			if (nx.t-t0)*(t1-nx.t) <= 0 {
				continue
			}
		}
		// Skip a sample crowding the last one (the two grids coincide on
		// a circle): the parabola through near-equal positions is noise.
		if math.Abs(x.t-dst[len(dst)-1].t) > 0.25*math.Abs(ht) || len(dst) == 1 && math.Abs(x.t-t0) > 1e-3*math.Abs(ht) {
			dst = append(dst, x)
		}
	}
	if math.Abs(t1-dst[len(dst)-1].t) < 0.25*math.Abs(ht) && len(dst) > 1 {
		dst = dst[:len(dst)-1]
	}
	dst = append(dst, sample{t: t1})
	return len(dst)
}

// refineExtreme returns the extreme of the parabola through the sample at
// j and its neighbours (or the sample itself at an end); x holds the
// sample positions.
func refineExtreme(x, v []float64, j int) float64 {
	if j == 0 || j == len(v)-1 {
		return v[j]
	}
	x0, x1, x2 := x[j-1]-x[j], 0.0, x[j+1]-x[j]
	y0, y1, y2 := v[j-1], v[j], v[j+1]
	// Divided differences: p(x) = y1 + b·x + c·x².
	d01 := (y1 - y0) / (x1 - x0)
	d12 := (y2 - y1) / (x2 - x1)
	c := (d12 - d01) / (x2 - x0)
	b := d01 - c*x0 // derivative at x1 = 0: d01 + c·(x1 − x0) with x1 = 0
	if c == 0 || math.IsNaN(c) || math.IsInf(c, 0) {
		return y1
	}
	xv := -b / (2 * c)
	if xv < min(x0, x2) || xv > max(x0, x2) {
		return y1 // the vertex is outside the neighbours: no extreme there
	}
	return y1 + b*xv + c*xv*xv
}

// arcTo returns the signed curvature of the arc from p with tangent tg
// through q, and its end tangent (tg reflected in the chord).
func arcTo(p, tg, q vec) (k float64, end vec) {
	ch := q.sub(p)
	l2 := ch.dot(ch)
	if l2 == 0 {
		return 0, tg
	}
	il2 := 1 / l2
	k = 2 * tg.cross(ch) * il2
	// the tangent reflected in the chord
	end = ch.scale(2 * ch.dot(tg) * il2).sub(tg)
	// Renormalised: over thousands of joins the reflections' rounding
	// would let the tangent's length drift, and a circle of radius R
	// built on it would miss its own start by R times the drift.
	return k, end.scale(1 / end.norm())
}

// trial is one candidate step.
type trial struct {
	k     float64
	end   vec
	q     vec
	dev1  float64
	ratio float64 // worst use of the half-width; ≤ 1 fits
	t1    float64
	foot  foot // at t1
}

// try builds and measures the step to foot parameter t1.
func (a *Approximator) try(s *arcState, t1 float64, tr *trial) {
	// End deviation by the deadbeat rule (see endDeviation).
	f1, fm := a.stepFeet(&s.foot, t1)
	a.tryEnd(s, &fm, &f1, a.endDeviation(s, &fm, &f1), tr)
}

// slope returns the slope of the deviation at the current point, δ′: the
// tangent's rise over the curve's own tangent (computed once a step).
func (s *arcState) slope(a *Approximator) float64 {
	if !s.haveSlope {
		f := &a.f
		_, tc, n := f.atSC(s.foot.sn, s.foot.cs, f.d)
		tau := tc.scale(a.sigma)
		s.dslope = s.tan.dot(n) / max(s.tan.dot(tau), 1e-3)
		s.haveSlope = true
	}
	return s.dslope
}

// tryEnd builds and measures, into tr, the step to foot parameter t1
// ending at deviation e1, and returns the extremes of its deviation.
func (a *Approximator) tryEnd(s *arcState, fm, f1 *foot, e1 float64, tr *trial) (lo, hi float64) {
	f := &a.f
	t1 := f1.t
	m := a.mid()
	q, _, n := f.atSC(f1.sn, f1.cs, f.d+e1)
	k, end := arcTo(s.p, s.tan, q)
	tr.k, tr.end, tr.q, tr.dev1, tr.t1 = k, end, q, e1, t1
	ch := q.sub(s.p)
	if ak := math.Abs(k); ak*arcMaxRadius*(f.e.MaxRadiusOfCurvature()+math.Abs(f.d)) < 1 || ch.dot(ch)*ak < 8*a.round {
		// Too flat to write as an arc: a line along the tangent to the
		// normal at t1 (solve p + u·tan = q + λ·n).
		den := s.tan.cross(n)
		if den == 0 {
			tr.ratio = math.Inf(1)
			return 0, 0
		}
		lam := s.tan.cross(s.p.sub(q)) / den
		q = q.addScaled(n, lam)
		tr.k, tr.end, tr.q, tr.dev1 = 0, s.tan, q, e1+lam
		if q.sub(s.p).dot(s.tan) <= 0 {
			tr.ratio = math.Inf(1)
			return 0, 0
		}
	}
	var g arcGeom
	a.newArcGeom(&g, s.p, s.tan, tr.k, tr.q)
	tr.foot = *f1
	lo, hi = a.devRange(&s.foot, fm, f1, s.dev, tr.dev1, &g)
	tr.ratio = max((hi-m)/(a.hi-m), (m-lo)/(m-a.lo))
	return lo, hi
}

// segment returns the arc or line of a trial from the current state.
func (s *arcState) segment(tr *trial) Segment {
	if tr.k == 0 {
		return Segment{Kind: Line, Start: Point{X: s.p.x, Y: s.p.y}, End: Point{X: tr.q.x, Y: tr.q.y}}
	}
	c := s.p.addScaled(s.tan.left(), 1/tr.k)
	return Segment{Kind: Arc, Start: Point{X: s.p.x, Y: s.p.y}, End: Point{X: tr.q.x, Y: tr.q.y},
		CenterX: c.x, CenterY: c.y, Radius: math.Abs(1 / tr.k), Clockwise: tr.k < 0}
}

func (s *arcState) next(a *Approximator) (Segment, bool) {
	if s.full {
		if s.closing {
			return Segment{}, false
		}
		s.closing, s.n = true, 0
		return s.circle, true
	}
	if s.closing {
		return s.nextClosing(a)
	}
	if s.pending {
		s.pending = false
		return s.second, true
	}
	if s.nPlan > 0 {
		return s.nextPlanned(a), true
	}
	if s.iFwd < s.nFwd {
		return s.nextForward(a), true
	}
	if a.plans && !a.planning && s.falling(a) && s.planExit(a) {
		if s.nPlan > 0 {
			return s.nextPlanned(a), true
		}
		return s.nextForward(a), true
	}
	remaining := math.Abs(a.tEnd - s.tp)
	if remaining <= 0 {
		return Segment{}, false
	}
	// First guess (see guess).
	pred, dt, typical := s.guess(a)
	// Near the end, close with one biarc when it fits; when little is
	// left, with the fewest biarcs that fit. Unequal legs give the join
	// a second chance where the equal-leg biarc leaves the zone. What is
	// "little" goes by the steps actually taken: the first guess runs
	// far ahead where κ′ vanishes, at the vertices.
	if remaining <= 3*typical {
		for n := 1; n <= 4; n++ {
			if n > 1 && remaining > 0.8*typical {
				break
			}
			for i, leg := range [...]float64{1, 0.6, 1.6, 0.35, 2.8} {
				if i > 0 && remaining > 2.2*typical {
					break // unequal legs only for the last chances
				}
				if s.leg = leg; s.closeFits(a, n) {
					s.startClosing(n, leg)
					return s.nextClosing(a)
				}
			}
		}
	}
	if remaining <= 3*typical {
		if seg, ok := s.endgame(a, remaining, pred); ok {
			return seg, true
		}
	}
	// A step never reaches the end, which is the closing biarcs' job, and
	// leaves them about one step.
	maxDt := max(0.5*remaining, remaining-typical)
	best, bestDt, hi, dt := s.search(a, dt, maxDt, 0, false)
	if bestDt > 0 && a.look {
		score := bestDt + s.secondStep(a, best, bestDt, pred, remaining)
		m, w := a.mid(), 0.8*(a.hi-a.mid())
		// End deviations, in fractions of 0.8 of the half-width off the
		// middle, tried besides the deadbeat rule's.
		for _, x := range [...]float64{-1, -0.5, 0, 0.5, 1} {
			tr, d, _, _ := s.search(a, bestDt, maxDt, m+x*w, true)
			if d == 0 {
				continue
			}
			if sc := d + s.secondStep(a, tr, d, pred, remaining); sc > score {
				best, bestDt, score = tr, d, sc
			}
		}
	}
	if bestDt == 0 {
		// No single arc fits (round a needle's tip whose zone is wider
		// than the needle, the last join may leave the tangent pointing
		// out of it): a biarc back onto the middle of the zone has a
		// join to spare.
		if math.IsInf(hi, 1) {
			hi = dt
		}
		for _, x := range [...]float64{2, 1, 0.5} {
			if x*hi < remaining {
				if seg, ok := s.rescue(a, s.tp+a.sigma*x*hi); ok {
					return seg, true
				}
			}
		}
	}
	for bestDt == 0 {
		dt *= 0.5
		if !(dt >= 1e-12*a.span) {
			a.err = &SpecError{Field: "Tol", Value: a.spec.Tol, Err: ErrNoFit}
			return Segment{}, false
		}
		var tr trial
		a.try(s, s.tp+a.sigma*dt, &tr)
		if tr.ratio <= arcLimit {
			best, bestDt = tr, dt
		}
	}
	seg := s.commit(&best, bestDt, pred)
	if !a.look && a.nEst >= aimSegments {
		s.aimLonger(best.ratio)
	}
	return seg, true
}

// majorEnd returns the parameter of an end of the major axis, 0 or π/2
// (the other is π later).
func (f *frame) majorEnd() float64 {
	if f.rx < f.ry {
		return math.Pi / 2
	}
	return 0
}

// guess returns the first guess of the next step: the steady pattern's
// span pred for the curvature change at the middle of the step, the span
// dt to try first (pred times what the prediction missed by on the last
// step) and the typical step by the steps actually taken.
func (s *arcState) guess(a *Approximator) (pred, dt, typical float64) {
	pred = a.patternStep(s.tp + a.sigma*0.5*a.patternStepAt(&s.foot))
	corr := s.corr
	if corr == 0 {
		corr = 1
	}
	dt = corr * pred
	if s.lastDt > 0 {
		dt = min(dt, 4*s.lastDt)
	} else if a.nEst > 0 {
		// The first step, often from a vertex where κ′ vanishes and the
		// guess runs far: no more than twice the average step of N*.
		dt = min(dt, 2*a.span/a.nEst)
	}
	dt = min(dt, math.Pi)
	typical = dt
	if s.lastDt > 0 {
		typical = min(dt, 1.5*s.lastDt)
	}
	return pred, dt, typical
}

// falling reports whether the curvature falls ahead of the current
// point: between the end of a major axis and the next end of the minor
// axis, in the direction of travel.
func (s *arcState) falling(a *Approximator) bool {
	u := math.Mod(a.sigma*(s.tp-a.f.majorEnd()), math.Pi)
	if u < 0 {
		u += math.Pi
	}
	return u < math.Pi/2*(1-1e-9)
}

// planExit builds the stretch ahead along which the curvature falls, up
// to the next end of a minor axis or the path's end, backwards: from its
// far end, toward the current state, which the backward chain closes
// onto. Greedy steps from a given tangent waste the zone where the
// curvature falls fast beneath them (each arc starts where the curve
// turns fastest, with its tangent fixed); run the other way, the same
// stretch is one where the curvature rises, which the chain covers with
// nearly the fewest arcs. Where the arcs look ahead the forward chain is
// run over the stretch as well and kept if it takes no more arcs (without
// look-ahead the backward chain did better on 10 000 draws: its closing
// costs an arc where the forward chain's cycle wastes one every four
// steps). It reports whether the stretch was done (the backward chain
// must fit in a.plan and close); else the chain goes on forward.
func (s *arcState) planExit(a *Approximator) bool {
	f := &a.f
	base := f.majorEnd() + math.Pi/2 // an end of the minor axis
	var tT float64
	if a.sigma > 0 {
		tT = base + math.Pi*(math.Floor((s.tp-base)/math.Pi)+1)
	} else {
		tT = base + math.Pi*(math.Ceil((s.tp-base)/math.Pi)-1)
	}
	if tT == s.noPlan {
		return false
	}
	s.noPlan = tT
	// A stretch that would end short of the path's end by less than half
	// an average step runs to the end.
	toEnd := (a.tEnd-tT)*a.sigma < 0.5*a.span/max(a.nEst, 1)
	if toEnd {
		tT = a.tEnd
	}
	if math.Abs(tT-s.tp) < 1e-9*math.Pi {
		return false
	}
	m := a.mid()
	var p, tn vec
	dev := m
	if toEnd {
		p, tn, dev = s.p0, s.t0, s.dev0
	} else {
		q, tg, _ := f.at(tT, f.d+m)
		p, tn = q, tg.scale(a.sigma)
	}
	bs := arcState{p: p, tan: tn.scale(-1), tp: tT, dev: dev, foot: a.footAt(tT)}
	bs.p0, bs.t0, bs.dev0 = s.p, s.tan.scale(-1), s.dev
	bs.noPlan = math.NaN()
	sig, end := a.sigma, a.tEnd
	a.sigma, a.tEnd, a.planning = -sig, s.tp, true
	n, ok := 0, true
	for {
		seg, more := bs.next(a)
		if !more {
			break
		}
		if n == len(a.plan) {
			ok = false
			break
		}
		a.plan[n] = seg
		n++
	}
	a.sigma, a.tEnd = sig, end
	if a.err != nil || !bs.closing || n == 0 {
		a.err = nil
		ok = false
	}
	if !ok {
		a.planning = false
		return false
	}
	// Where the arcs look ahead, the forward chain over the same
	// stretch, kept: the plan is used only where it saves arcs, else
	// these are.
	fs := *s
	nf := 0
	for a.look && nf <= n && (tT-fs.tp)*a.sigma > 0 {
		seg, more := fs.next(a)
		if !more {
			break
		}
		a.fwd[nf] = seg
		nf++
	}
	a.planning = false
	if a.err == nil && nf <= n && nf > 0 {
		a.fwdState = fs
		s.nFwd, s.iFwd = nf, 0
		return true
	}
	a.err = nil
	s.nPlan, s.planT, s.planEnd = n, tT, toEnd
	return true
}

// nextForward returns the next segment of the forward chain's run over a
// stretch (see planExit); after the last, the state is where it ended.
func (s *arcState) nextForward(a *Approximator) Segment {
	seg := a.fwd[s.iFwd]
	s.iFwd++
	if s.iFwd == s.nFwd {
		*s = a.fwdState
	}
	return seg
}

// nextPlanned returns the next segment of a planned stretch: the backward
// chain's segments last first, each reversed.
func (s *arcState) nextPlanned(a *Approximator) Segment {
	s.nPlan--
	seg := a.plan[s.nPlan]
	seg.Start, seg.End = seg.End, seg.Start
	seg.Clockwise = !seg.Clockwise
	if s.nPlan > 0 {
		return seg
	}
	if s.planEnd {
		s.closing, s.n, s.i, s.half = true, 0, 0, false
		return seg
	}
	f := &a.f
	q, tg, _ := f.at(s.planT, f.d+a.mid())
	s.p, s.tan, s.tp, s.dev, s.foot = q, tg.scale(a.sigma), s.planT, a.mid(), a.footAt(s.planT)
	s.haveSlope, s.lastDt, s.corr = false, 0, 0
	return seg
}

// startClosing makes the rest of the path n closing biarcs with first leg
// ratio leg, from the current state.
func (s *arcState) startClosing(n int, leg float64) {
	s.closing, s.n, s.i, s.half, s.leg = true, n, 0, false, leg
	s.t0End = s.tp
}

// commit moves the state to the end of the trial tr of span dt and
// returns its segment; pred is the span the first guess predicted.
func (s *arcState) commit(tr *trial, dt, pred float64) Segment {
	seg := s.segment(tr)
	s.lastDt = dt
	s.corr = max(0.25, min(4, dt/pred))
	s.p, s.tan, s.tp, s.dev, s.foot = tr.q, tr.end, tr.t1, tr.dev1, tr.foot
	// afresh, so that the feet's turning by rotation (stepFeet) does not
	// drift over many steps
	s.foot.sn, s.foot.cs = math.Sincos(tr.t1)
	s.haveSlope = false
	return seg
}

// aimLonger lengthens the next first guess after a step that used only
// the share r of the zone, less than arcTarget: the use grows about as the
// cube of the step, so the step could have been (arcTarget/r)^(1/3)
// longer. Only a damped share of that is taken, the power 1/8 (three
// square roots, cheaper than a power): the deadbeat rule moves the next
// end deviation, and a guess that overshoots costs more than one that
// falls short. Measured on 10 000 draws of the count test's generator
// (DEVELOPERS.md), before planning without look-ahead: powers 0, 0.05,
// 0.12, 0.2 and 1/3 gave N/N* 1.488, 1.463, 1.458, 1.508 and 1.553, the
// gain in the flattest ellipses. Not where the arcs look ahead (there it
// cost arcs), nor on paths of fewer than aimSegments arcs by N*.
func (s *arcState) aimLonger(r float64) {
	if r > 0.3 && r < arcTarget {
		x := math.Sqrt(math.Sqrt(math.Sqrt(arcTarget / r)))
		s.corr = max(0.25, min(4, s.corr*x))
	}
}

// endgame looks, near the end, for a step after which one biarc closes
// the path: a few spans and end deviations, the first that fits.
func (s *arcState) endgame(a *Approximator, remaining, pred float64) (Segment, bool) {
	m, w := a.mid(), 0.4*(a.hi-a.mid())
	for _, fr := range [...]float64{0.7, 0.5, 0.35} {
		t1 := s.tp + a.sigma*fr*remaining
		md, v, useModel := s.model(a, fr*remaining, 0, false)
		for i := 0; i < 4; i++ {
			// A step the model puts well outside the zone is not tried.
			if useModel {
				md.fixed, md.u1 = i > 0, float64(i-2)*w
				if md.ratio(fr*remaining*v) > endgameModelMax {
					continue
				}
			}
			var tr trial
			switch i {
			case 0:
				a.try(s, t1, &tr)
			default:
				s.tryStep(a, t1, m+float64(i-2)*w, true, &tr)
			}
			if !(tr.ratio <= arcLimit) {
				continue
			}
			s2 := *s
			s2.commit(&tr, fr*remaining, pred)
			for _, leg := range [...]float64{1, 0.6, 1.6} {
				if s2.leg = leg; s2.closeFits(a, 1) {
					seg := s.commit(&tr, fr*remaining, pred)
					s.startClosing(1, leg)
					return seg, true
				}
			}
		}
	}
	return Segment{}, false
}

// secondStep returns the span of the step that would follow the trial tr
// of span dt1.
func (s *arcState) secondStep(a *Approximator, tr trial, dt1, pred, remaining float64) float64 {
	s2 := *s
	s2.commit(&tr, dt1, pred)
	rem := remaining - dt1
	_, d, typical := s2.guess(a)
	if rem <= 3*typical {
		return min(rem, typical)
	}
	_, d2, _, _ := s2.search(a, d, max(0.5*rem, rem-typical), 0, false)
	return d2
}

// search finds the step from the current state: the longest found whose
// arc fits, stopping at the first that uses at least arcAccept of the
// zone. The end deviation is e1 when fixed, else the deadbeat rule's. It
// returns the best trial and its span (0 if none fits), the shortest
// span seen not to fit and the last span tried.
func (s *arcState) search(a *Approximator, dt, maxDt, e1 float64, fixed bool) (best trial, bestDt, hi, last float64) {
	best.ratio = math.Inf(1)
	// The ratio grows from the start's own use of the zone, r0, about as
	// the cube of the step: search the step by regula falsi on that model
	// between the longest step that fits and the shortest that does not.
	m := a.mid()
	r0 := max((s.dev-m)/(a.hi-m), (m-s.dev)/(m-a.lo))
	lo, rlo := 0.0, r0
	hi, rhi := math.Inf(1), math.Inf(1)
	// After a trial outside the accepted window, the step model (see
	// stepModel), scaled by what the trial measured against it, proposes
	// the next span; the first guess stays the caller's, which keeps the
	// chain on its rhythm (the model's own first guesses cost arcs).
	var md stepModel
	var v float64
	haveModel, useModel := false, false
	var tr trial
	for i := 0; i < arcMaxSteps; i++ {
		dt = min(dt, maxDt)
		s.tryStep(a, s.tp+a.sigma*dt, e1, fixed, &tr)
		r := tr.ratio
		if r <= arcLimit {
			if dt > bestDt {
				best, bestDt = tr, dt
			}
			if r >= arcAccept || dt >= maxDt {
				break
			}
			if dt > lo {
				lo, rlo = dt, r
			}
		} else if dt < hi {
			// A shorter step that does worse than a longer one meets the
			// hump the last join committed the chain to (see arcTarget):
			// steps shrink past it only well below the hump's place,
			// about a fifth of the way in, so jump there.
			knife := r > rhi && !math.IsInf(rhi, 0)
			hi, rhi = dt, r
			if knife {
				dt = max(0.3*dt, 1.01*lo)
				continue
			}
		}
		var next float64
		modelNext := false
		if !haveModel {
			md, v, useModel = s.model(a, dt, e1, fixed)
			haveModel = true
		}
		if useModel && r > 0 && !math.IsInf(r, 0) {
			if rm := md.ratio(dt * v); rm > 0 {
				if l, ok := md.span(arcTarget*rm/r, dt*v, rm); ok && l/v > lo && l/v < hi {
					next, modelNext = l/v, true
				}
			}
		}
		switch {
		case modelNext:
		case math.IsInf(hi, 1):
			next = 2 * lo
			if rlo > r0 {
				next = min(next, lo*math.Cbrt((arcTarget-r0)/(rlo-r0)))
			}
			next = max(next, 1.01*lo)
		case math.IsInf(rhi, 0) || math.IsNaN(rhi) || rhi <= rlo:
			next = 0.5 * (lo + hi)
		default:
			l3, h3 := lo*lo*lo, hi*hi*hi
			next = math.Cbrt(l3 + (arcTarget-rlo)*(h3-l3)/(rhi-rlo))
			next = max(lo+0.1*(hi-lo), min(hi-0.1*(hi-lo), next))
		}
		if bestDt > 0 && hi-lo < 0.003*hi {
			break
		}
		dt = next
	}
	return best, bestDt, hi, dt
}

// model returns the step model from the current state for a step of
// about dt (end deviation e1 when fixed, else the deadbeat rule's), the
// speed of the middle of the zone that turns its lengths into spans, and
// whether it applies: not where the normals fan out across the zone
// (see endDeviation).
func (s *arcState) model(a *Approximator, dt, e1 float64, fixed bool) (md stepModel, v float64, ok bool) {
	f := &a.f
	m := a.mid()
	if a.fans(s.foot.k) || !(dt > 0) {
		return md, 0, false
	}
	sn, cn := math.Sincos(s.tp + a.sigma*0.5*dt)
	v2, v, _, kp := f.footBase(sn, cn)
	v += (f.d + m) * f.rx * f.ry / v2
	md = newStepModel(s.dev-m, s.slope(a), a.sigma*kp, a.hi-m)
	if fixed {
		md.fixed, md.u1 = true, e1-m
	}
	return md, v, true
}

// tryStep is try with the end deviation e1 when fixed.
func (s *arcState) tryStep(a *Approximator, t1, e1 float64, fixed bool, tr *trial) {
	if !fixed {
		a.try(s, t1, tr)
		return
	}
	f1, fm := a.stepFeet(&s.foot, t1)
	a.tryEnd(s, &fm, &f1, e1, tr)
}

// patternStep returns the parameter span of the steady pattern's arc at
// t, whose humps reach arcTarget of the half-width (see endDeviation):
// L = (72√3·w/|κ′|)^(1/3) for the half-width w.
func (a *Approximator) patternStep(t float64) float64 {
	f := &a.f
	s, c := math.Sincos(t)
	v2, v, _, kp := f.footBase(s, c)
	x := foot{v: v + f.d*f.rx*f.ry/v2, kp: kp}
	return a.patternStepAt(&x)
}

// patternStepAt is patternStep at a foot.
func (a *Approximator) patternStepAt(x *foot) float64 {
	l := math.Cbrt(36 * math.Sqrt(3) * (a.hi - a.lo) * arcTarget / max(math.Abs(x.kp), 1e-300))
	return min(l/x.v, math.Pi)
}

// patternSlope returns the slope g of the deviation at the joins of the
// periodic pattern over the arc between the feet f0 and f1, with fm the
// foot halfway in t: g = (1/L)∫(s − L/2)κ ds and the length L, both along
// the middle of the zone. With φ(s) the turning from the start,
// g = φ(L)/2 − mean φ, by Simpson's rule in t: on the three feet where
// speed and turning are nearly even over the arc, else on four panels
// (the long arcs of a coarse tolerance on a flat ellipse). For κ changing
// at a steady κ′ it is κ′L²/12.
func (a *Approximator) patternSlope(f0, fm, f1 *foot) (g, l float64) {
	turn := func(x *foot) float64 { return a.sigma * (x.nu - f0.nu) }
	phi, phim := turn(f1), turn(fm)
	vlo := min(f0.vMid, min(fm.vMid, f1.vMid))
	vhi := max(f0.vMid, max(fm.vMid, f1.vMid))
	if vhi <= 1.2*vlo && math.Abs(2*phim-phi) <= 0.2*math.Abs(phi) {
		sl := f0.vMid + 4*fm.vMid + f1.vMid
		si := 4*phim*fm.vMid + phi*f1.vMid
		if sl == 0 {
			return 0, 0
		}
		return phi/2 - si/sl, sl * math.Abs(f1.t-f0.t) / 6
	}
	q1, q3 := a.footAt(0.75*f0.t+0.25*f1.t), a.footAt(0.25*f0.t+0.75*f1.t)
	sl := f0.vMid + 4*q1.vMid + 2*fm.vMid + 4*q3.vMid + f1.vMid
	si := 4*turn(&q1)*q1.vMid + 2*phim*fm.vMid + 4*turn(&q3)*q3.vMid + phi*f1.vMid
	if sl == 0 {
		return 0, 0
	}
	return phi/2 - si/sl, sl * math.Abs(f1.t-f0.t) / 12
}

// endDeviation returns the deviation an arc ending at foot t1 should end
// with. To first order in the deviation δ, δ″ = κ − k along an arc of
// curvature k, so with κ changing at κ′ per unit length the chain of arcs
// of length L that uses the zone best is periodic: it crosses the middle m
// of the zone at every join with slope g = κ′L²/12, and swings to
// ±κ′L³/(72√3) inside each arc (1.15 times the single-arc bound). For any
// κ(s) over the arc the same holds with g = (1/L)∫(s − L/2)κ ds (see
// patternSlope), which is what is used: on the long arcs of a coarse
// tolerance κ′ is far from steady. With u = δ − m and v = δ′ − g at a
// join, an arc ending at u₁ gives v₁ = −v₀ + 2(u₁ − u₀)/L, and the choice
// u₁ = u₀/2 + L·v₀/4 brings both to zero in two arcs (both eigenvalues of
// the step are zero). That choice is scaled by 0.8, which moves one
// eigenvalue to −0.2: a little slower to settle in the model, and less
// thrown when the pattern slope changes from one arc to the next
// (measured on the count sweep: 4% fewer arcs, and fewer in the worst
// case of every shape but the roundest).
func (a *Approximator) endDeviation(s *arcState, fm, f1 *foot) float64 {
	m := a.mid()
	g, l := a.patternSlope(&s.foot, fm, f1)
	lim := endLimit
	if a.fans(max(s.foot.k, f1.k)) {
		// Where the normals fan out the model means little, and an end
		// near the edge round a needle's tip can leave no way on.
		lim = endLimitFan
	}
	return m + deadbeat(s.dev-m, s.slope(a)-g, l, lim*(a.hi-m))
}

// deadbeat returns the end deviation (off the middle of the zone) of the
// deadbeat rule for a step of length l from deviation u0 and slope v
// off the pattern's, within ±lim (see endDeviation).
func deadbeat(u0, v, l, lim float64) float64 {
	return max(-lim, min(lim, 0.8*(u0/2+l*v/4)))
}

// fans reports whether the curve's normals fan out across the zone where
// its curvature is k (above 5% of the radius: see devRange).
func (a *Approximator) fans(k float64) bool {
	edge := max(math.Abs(a.lo), math.Abs(a.hi))
	return (a.hi-a.lo+edge)*k > 0.05
}

// rescue tries biarcs from the current state to the middle of the zone at
// foot t1 with the curve's own tangent; on the first that fits it returns
// the first arc and keeps the second for the next call.
func (s *arcState) rescue(a *Approximator, t1 float64) (Segment, bool) {
	q, tq, _ := a.f.at(t1, a.f.d+a.mid())
	tq = tq.scale(a.sigma)
	// Short first legs first: a rescue follows a start whose own tangent
	// leaves no single arc room, and a short first arc turns it soonest
	// (on the coarse tabletop the 0.35 leg fitted after three others
	// failed).
	f1 := a.footAt(t1)
	for _, leg := range [...]float64{0.35, 0.6, 1, 1.6, 2.8} {
		if !a.biarcFits(s.p, s.tan, &s.foot, s.dev, q, tq, &f1, a.mid(), leg) {
			continue
		}
		k1, _, j, _, _ := biarc(s.p, s.tan, q, tq, leg)
		first := s.segment(&trial{k: k1, q: j})
		s.second, s.pending = secondArc(j, q, tq), true
		s.lastDt = math.Abs(t1 - s.tp)
		s.p, s.tan, s.tp, s.dev = q, tq, t1, a.mid()
		s.foot, s.haveSlope = f1, false
		return first, true
	}
	return Segment{}, false
}

// biarcFits reports whether the biarc with first leg ratio leg (see
// biarc) from p with tangent tg, foot fp and deviation dev to q with
// tangent tq, foot f1 and deviation dev1 stays in the zone.
func (a *Approximator) biarcFits(p, tg vec, fp *foot, dev float64, q, tq vec, f1 *foot, dev1, leg float64) bool {
	a1, a2, j, jt, ok := biarc(p, tg, q, tq, leg)
	if !ok {
		return false
	}
	// The join's foot, unwrapped next to the start's, and its deviation.
	tj, dj := a.f.e.Nearest(ptOf(j))
	tj = unwrapNear(tj, fp.t)
	devJ := dj - a.f.d
	// The join, then each arc in turn: the first outside the zone decides.
	if !a.fits(devJ, devJ) {
		return false
	}
	var g1, g2 arcGeom
	a.newArcGeom(&g1, p, tg, a1, j)
	fj, fm1 := a.footAt(tj), a.footAt(0.5*(fp.t+tj))
	if !a.fits(a.devRange(fp, &fm1, &fj, dev, devJ, &g1)) {
		return false
	}
	fm2 := a.footAt(0.5 * (tj + f1.t))
	a.newArcGeom(&g2, j, jt, a2, q)
	return a.fits(a.devRange(&fj, &fm2, f1, devJ, dev1, &g2))
}

// fits reports whether deviations from lo to hi stay within arcLimit of
// the usable half-width about its middle, as every accepted arc must.
func (a *Approximator) fits(lo, hi float64) bool {
	m, w := a.mid(), arcLimit*0.5*(a.hi-a.lo)
	return lo >= m-w && hi <= m+w
}

// closeFits reports whether n interpolating biarcs from the current state
// to the end, through the middle curve with its own tangent at n − 1
// evenly spaced interior parameters, stay in the zone.
func (s *arcState) closeFits(a *Approximator, n int) bool {
	p, tg, fp, dev := s.p, s.tan, s.foot, s.dev
	h := (a.tEnd - s.tp) / float64(n)
	for i := 0; i < n; i++ {
		t1 := s.tp + float64(i+1)*h
		q, tq := s.piece(a, i, n, t1)
		dev1 := a.mid()
		if i == n-1 {
			dev1 = s.dev0
		}
		f1 := a.footAt(t1)
		if !a.biarcFits(p, tg, &fp, dev, q, tq, &f1, dev1, s.leg) {
			return false
		}
		p, tg, fp, dev = q, tq, f1, a.mid()
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

// ptOf converts to the ellipse package's point.
func ptOf(v vec) ellipse.Point { return ellipse.Point{X: v.x, Y: v.y} }

// biarc returns the curvatures of the two arcs of the equal-tangent-length
// biarc from (p0, t0) to (p1, t1), the join point and the tangent there
// (Bolton 1975: the join lies where the two tangent legs of equal length
// α meet, |p0 + αt0 − (p1 − αt1)| = 2α); leg ≠ 1 makes the first leg
// leg·α.
func biarc(p0, t0, p1, t1 vec, leg float64) (k1, k2 float64, j, tj vec, ok bool) {
	v := p1.sub(p0)
	tt := t0.add(t1)
	vt := v.dot(tt)
	c := t0.dot(t1)
	vv := v.dot(v)
	// α solves 2(1 − t0·t1)α² + 2(v·(t0+t1))α − v·v = 0; the positive root,
	// rationalised so that parallel tangents (t0·t1 = 1) need no case.
	den := 2 * (1 - c)
	alpha := vv / (vt + math.Sqrt(vt*vt+den*vv))
	if !(alpha > 0) || math.IsInf(alpha, 0) {
		return 0, 0, vec{}, vec{}, false
	}
	beta := alpha
	if leg != 1 {
		// Unequal legs: |v − α·t0 − β·t1| = α + β gives
		// β = (v·v − 2α·v·t0) / (2·v·t1 + 2α(1 − t0·t1)).
		alpha *= leg
		beta = (vv - 2*alpha*v.dot(t0)) / (2*v.dot(t1) + alpha*den)
		if !(beta > 0) || math.IsInf(beta, 0) {
			return 0, 0, vec{}, vec{}, false
		}
	}
	a1 := p0.addScaled(t0, alpha)
	a2 := p1.addScaled(t1, -beta)
	// The join divides the line between the legs' ends as α to β.
	j = a1.scale(beta / (alpha + beta)).add(a2.scale(alpha / (alpha + beta)))
	k1, tj = arcTo(p0, t0, j)
	k2, _ = arcTo(j, tj, p1)
	return k1, k2, j, tj, true
}

// secondArc returns the arc from j that ends at q with tangent tq, built
// backwards from q: so the chain goes on from q with exactly tq, and the
// rounding of a short first arc's chord (a few ulps of the coordinates
// over its length) shows as a kink at the join j rather than carried on.
func secondArc(j, q, tq vec) Segment {
	kb, _ := arcTo(q, tq.scale(-1), j) // the arc run backwards from q
	if kb == 0 {
		return Segment{Kind: Line, Start: Point{X: j.x, Y: j.y}, End: Point{X: q.x, Y: q.y}}
	}
	c := q.addScaled(tq.scale(-1).left(), 1/kb)
	return Segment{Kind: Arc, Start: Point{X: j.x, Y: j.y}, End: Point{X: q.x, Y: q.y},
		CenterX: c.x, CenterY: c.y, Radius: math.Abs(1 / kb), Clockwise: kb > 0}
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
	k1, _, j, _, ok := biarc(s.p, s.tan, q, tq, s.leg)
	if !ok {
		return Segment{}, false
	}
	first := s.segment(&trial{k: k1, q: j})
	s.second = secondArc(j, q, tq)
	s.half = true
	s.p, s.tan, s.tp, s.dev = q, tq, t1, a.mid()
	s.foot, s.haveSlope = a.footAt(t1), false
	return first, true
}
