package conformance

import (
	"math"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Sampling limits of SegmentDeviation.
const (
	// devMissShare is the share of the deviation range by which a sampled
	// extreme may fall short of the true one.
	devMissShare = 0.01
	// devFirst is the number of intervals of the first, coarse sampling.
	devFirst = 4
	// devMaxIntervals caps the dense sampling of one segment.
	devMaxIntervals = 4096
	// devRefine is the number of extra evaluations spent refining each
	// sampled extreme.
	devRefine = 4
	// devFloor is the smallest deviation range, in semi-major axes plus
	// offset, that the sampling density is sized for: differences below it
	// are at the level of rounding in the distance itself.
	devFloor = 1e-12
)

// SegmentDeviation returns the smallest and largest signed deviation of the
// segment s from curve in the XY plane (Z is ignored): the signed distance
// from the curve, positive outward, of every point of the line or arc.
//
// # Distance to a parallel curve
//
// For the ellipse E with filled region K and a parallel curve at offset d
// (admissible: d > −b²/a, which [ellipse.Ellipse.Parallel] enforces), the
// signed distance to the parallel curve is sd_E(p) − d for every point p,
// with sd_E the exact signed distance to the ellipse
// ([ellipse.Ellipse.Nearest], Eberly's method). Outward (d ≥ 0) the
// parallel curve bounds K grown by a disc of radius d, and for a convex set
// the distance to that boundary is the distance to ∂K less d, inside and
// out. Inward (d < 0) it bounds K shrunk by |d|; points outside K or deeper
// than |d| follow from convexity and the triangle inequality, and points
// between the two curves from the reach of ∂K, which is b²/a (Federer,
// "Curvature measures", Trans. AMS 93, 1959): a point at depth less than
// the reach has a unique nearest point, the foot of its normal. So the
// value is exact everywhere. It is smooth, which the sampling below relies
// on, everywhere except on the segment of the major axis between the two
// centres of curvature of its ends (the medial axis of K), whose points lie
// at depth b²/a or more below the ellipse. A segment that stays less than
// the reach below the ellipse (in practice: any segment near the curve)
// meets the bound below; one that crosses the medial axis still gets exact
// values at its samples, but the bound on missed extremes no longer holds.
//
// # Sampling density
//
// Along the segment, parameterised by length u, let f(u) be the deviation.
// Its second derivative is
//
//	f″ = κₑ·cos²θ − κₛ·cosθ,   κₑ = κ/(1 + f·κ)
//
// where κ is the curvature of the intended curve at the foot, κₑ that of
// the level curve of the distance through the point (the Hessian of the
// signed distance is κₑ·t·tᵀ along the curve tangent t), θ the angle
// between the segment and the curve tangent, and κₛ the curvature of the
// segment (0 for a line, 1/Radius for an arc, positive when it bends the
// way the curve does). Near an interior extreme f is a parabola of
// curvature at most c = max|f″|, so the extreme lies within h/2 of the
// nearest of samples spaced h apart and the sample misses it by at most
// c·(h/2)²/2 = c·h²/8. A chord of length L across a curve of curvature κ
// has c ≈ κ and a range κL²/8; an arc has c ≈ |κ − κₛ|.
//
// SegmentDeviation first samples f at five evenly spaced points, bounding
// c from them: κ over the span of their feet
// (curvature is extreme only at the ends of the axes, so the range of κ
// over an interval of parameters is that at its ends and at any axis end
// inside; a span over a quarter turn takes the whole curve's range), κₑ
// over the sampled deviations widened by their own range, cosθ over the
// sampled angles widened by the most the angle can turn between samples.
// It then runs the bounded search below; where that gives up, the dense
// pass takes n intervals with c·(L/n)²/8 ≤ 1% of the sampled range R
// (never less than 1e-12 of the curve's size), that is
// n = ⌈L·√(c/(0.08·R))⌉ rounded up to a multiple of 4 (so the first
// samples are reused) and capped at 4096. The sampled range can only grow
// with more samples, so the true extremes are within 1% of the true range
// of the sampled ones. Each sampled extreme is then refined by up to four
// steps of successive parabolic interpolation inside the bracket of its
// neighbours, keeping the better value; refinement never lowers the
// accuracy.
//
// # Bounded search
//
// Most segments never reach the dense pass. Each sample also carries the
// slope df/du, which is L·n·d for the unit outward normal n at the foot
// and the unit direction d of the segment (the gradient of the signed
// distance is n). With f″ bounded by c, each end of an interval between
// samples gives a concave minorant f(a) + f′(a)(u − a) − c(u − a)²/2 (in
// units of u, c·L²), and the larger of the two bounds f from below over
// the interval; likewise from above. An interval is split, at the point
// where its bound is reached, only while that bound lies more than 1% of
// the sampled range beyond the best sample; when no interval does, the
// sampled extremes are within 1% of the true range of the true ones, the
// same guarantee as the dense pass. For a line the deviation is convex, so
// the minorants are its tangents (c = 0) and the maximum is at an end.
// After 40 samples, or for a segment that crosses the medial axis or has
// no useful bound on f″, the dense pass below takes over.
//
// # Finding the feet
//
// Every sample finds its foot by Newton's method on the foot parameter,
// the first from the parameter of the point scaled onto a circle, the
// others from the foot of a neighbouring sample moved on by the rate at
// which the foot travels, and these converge in one to three steps for
// points near the curve. A root found is the nearest point: the point lies
// on the normal there, and a point on the outward normal of a convex
// curve, or on the inward one less deep than the reach, has the foot of
// that normal as its nearest point. A step that fails to settle or jumps,
// a value that breaks the 1-Lipschitz bound of the distance, or a point
// deeper inside than half the reach falls back to the exact method
// ([ellipse.Ellipse.Nearest]).
//
// The signed distance to a convex set is a convex function of the point,
// with a kink only on the medial axis. Along a line the deviation is
// therefore convex: its maximum is at an end (taken as sampled), and its
// minimum lies between the neighbours of the smallest sample. Where a line
// or arc crosses the medial axis, or passes deep inside a circle near its
// centre, the deviation has a kink or a very sharp bend; that point is
// sampled exactly as well, and the density bound holds on either side of
// it. Only near the two ends of the medial axis, the cusps of the evolute
// at depth b²/a behind the sharp ends, does the bound on f″ grow without
// limit; there the sampling is capped at 4096 intervals.
//
// Arcs are taken as toolpath does in [toolpath.Segment.At]: centre, start
// angle, Radius and [toolpath.Segment.Sweep] (a Radius that is not positive
// is replaced by the distance from Start to the centre). A dwell or a line
// of zero length reports the deviation of its point. SegmentDeviation
// allocates nothing; a segment near the curve costs five to fifteen Newton
// solves and rarely an exact distance.
//
// Special cases are:
//
//	SegmentDeviation(c, s) = NaN, NaN if a coordinate of s is NaN or infinite
func SegmentDeviation(curve ellipse.Parallel, s toolpath.Segment) (lo, hi float64) {
	var ev devEval
	lo, hi = ev.deviation(curve, s, 0, false)
	return lo, hi
}

// endsDeviation is SegmentDeviation given the foot parameter t0 of the
// segment's start (from the exact method), which seeds the first Newton
// solve, and it also returns the deviation f1 of End as written and its
// foot t1: Newton's method from the foot of the segment's own end (for an
// arc the point its centre, radius and sweep put there, which the rounding
// of the written numbers may move a little off End), or the exact method
// where that does not settle. The geometry rules use it to measure each
// end once.
func endsDeviation(curve ellipse.Parallel, s toolpath.Segment, t0 float64) (lo, hi, t1, f1 float64) {
	var ev devEval
	lo, hi = ev.deviation(curve, s, t0, true)
	if lo != lo || hi != hi {
		return lo, hi, math.NaN(), math.NaN()
	}
	qx, qy := ev.local(s.End.X, s.End.Y)
	if f, t, ok := ev.newton(qx, qy, ev.tEnd); ok {
		return lo, hi, t, f
	}
	t, sd := ev.e.Nearest(ellipse.Point{X: s.End.X, Y: s.End.Y})
	return lo, hi, t, sd - ev.d
}

// deviation is SegmentDeviation in v, the first foot from the
// parameter t0 when seeded; it leaves in v.tEnd the foot of the segment's
// end (as its centre, radius and sweep put it, for an arc).
func (v *devEval) deviation(curve ellipse.Parallel, s toolpath.Segment, t0 float64, seeded bool) (lo, hi float64) {
	if !finite(s.Start.X) || !finite(s.Start.Y) || !finite(s.End.X) || !finite(s.End.Y) ||
		(s.Kind == toolpath.Arc && (!finite(s.CenterX) || !finite(s.CenterY))) {
		return math.NaN(), math.NaN()
	}
	v.init(curve, s)
	if !(v.length > 0) {
		f, t := v.exact(0)
		v.tEnd = t
		return f, f
	}

	// Coarse pass: five points, the first by the exact distance and the
	// rest tracked from it.
	var fs, ts, ks, gs [devFirst + 1]float64
	// A line needs no bound on f″ (its deviation is convex), so the
	// curvatures and angles at the samples are taken for an arc only, or
	// for a line that goes on to the dense pass.
	var maxTan float64 // largest tan θ at the samples
	if seeded {
		fs[0], ts[0] = v.startFrom(t0)
	} else {
		fs[0], ts[0] = v.start()
	}
	var rate float64
	gs[0], rate = v.slope(0, fs[0])
	flo, fhi := fs[0], fs[0]
	if v.arc {
		ks[0], maxTan = v.kappa(), v.misalignment(0)
	}
	for i := 1; i <= devFirst; i++ {
		u := float64(i) / devFirst
		fs[i], ts[i] = v.track(u, ts[i-1]+rate/devFirst, 1.0/devFirst, fs[i-1])
		gs[i], rate = v.slope(u, fs[i])
		flo, fhi = math.Min(flo, fs[i]), math.Max(fhi, fs[i])
		if v.arc {
			ks[i], maxTan = v.kappa(), math.Max(maxTan, v.misalignment(u))
		}
	}
	v.tEnd = ts[devFirst]
	us, k := v.medialCrossings()
	if !v.arc {
		if k == 0 {
			if lo, hi, ok := v.search(&fs, &gs, &ts, nil); ok {
				return lo, hi
			}
		}
		maxTan = v.shape(&ts, &ks)
	}
	if k == 0 && v.arc {
		if b, ok := v.bendBound(&ts, &ks, flo, fhi, maxTan); ok {
			if lo, hi, ok := v.search(&fs, &gs, &ts, &b); ok {
				return lo, hi
			}
		}
	}
	n := v.intervals(&ts, &ks, flo, fhi, maxTan)

	// Dense pass, tracking the foot from sample to sample.
	var x extremes
	step := n / devFirst
	h := 1 / float64(n)
	var f, t, tPrev float64
	for i := 0; i <= n; i++ {
		if i%step == 0 {
			f, tPrev, t = fs[i/step], t, ts[i/step]
		} else {
			guess := t
			if i > 1 {
				guess += t - tPrev
			}
			tPrev = t
			f, t = v.track(float64(i)*h, guess, h, f)
		}
		x.add(i, f, t)
	}
	hi = x.maxF // a line's maximum is at an end: the deviation is convex
	if v.arc {
		hi = v.refine(x.maxI, n, x.maxF, x.maxT, x.maxL, x.maxR, 1)
	}
	lo = -v.refine(x.minI, n, -x.minF, x.minT, -x.minL, -x.minR, -1)
	for _, u := range us[:k] {
		f, _ := v.exact(u)
		lo, hi = math.Min(lo, f), math.Max(hi, f)
	}
	return lo, hi
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// devEval evaluates the deviation along one segment. It lives on the
// caller's stack.
type devEval struct {
	// the ellipse, in its own frame
	cx, cy, cos, sin float64
	rx, ry           float64
	d                float64 // offset of the intended curve
	reach            float64 // b²/a
	size             float64 // a + |d|
	e                ellipse.Ellipse
	footSin, footCos float64 // of the foot parameter last found
	tEnd             float64 // the foot of the segment's end (see deviation)
	// the segment
	arc          bool
	sx, sy       float64 // start
	dx, dy       float64 // line: end − start
	ccx, ccy, r  float64 // arc centre and radius
	a0, sweep    float64 // arc start angle and signed sweep
	ox, oy, k    float64 // arc: Start − centre, and Radius/|Start − centre|
	length       float64
	bendsInward  int8 // arc: +1 bends as the curve does, −1 against, 0 unclear
	kappaSegment float64
}

func (v *devEval) init(curve ellipse.Parallel, s toolpath.Segment) {
	e := curve.Ellipse()
	v.e = e
	c := e.Center()
	v.cx, v.cy = c.X, c.Y
	v.sin, v.cos = math.Sincos(e.Rotation())
	v.rx, v.ry = e.SemiX(), e.SemiY()
	v.d = curve.Offset()
	v.reach = e.MinRadiusOfCurvature()
	v.size = e.SemiMajor() + math.Abs(v.d)
	v.sx, v.sy = s.Start.X, s.Start.Y
	switch s.Kind {
	case toolpath.Line:
		v.dx, v.dy = s.End.X-s.Start.X, s.End.Y-s.Start.Y
		v.length = math.Hypot(v.dx, v.dy)
	case toolpath.Arc:
		v.arc = true
		v.ccx, v.ccy = s.CenterX, s.CenterY
		v.r = s.Radius
		if !(v.r > 0) || math.IsInf(v.r, 0) {
			v.r = math.Hypot(s.Start.X-s.CenterX, s.Start.Y-s.CenterY)
		}
		v.ox, v.oy = s.Start.X-s.CenterX, s.Start.Y-s.CenterY
		v.k = 1
		if h := math.Hypot(v.ox, v.oy); h > 0 {
			v.k = v.r / h
		}
		v.a0 = math.Atan2(v.oy, v.ox)
		v.sweep = s.Sweep()
		v.length = math.Abs(v.sweep) * v.r
		if v.r > 0 {
			v.kappaSegment = 1 / v.r
		}
	}
}

// point returns the point at fraction u of the segment. An arc point is
// Start plus the turn of the radius vector, (k·R(φ) − I)·(Start − centre)
// with φ = u·sweep and k·cos φ − 1 = (k − 1) − 2k·sin²(φ/2): adding a
// small step to Start rather than a long radius to the centre keeps the
// digits of flat arcs, whose centres lie far away.
func (v *devEval) point(u float64) (x, y float64) {
	if v.arc {
		phi := u * v.sweep
		sn := math.Sin(phi)
		h := math.Sin(phi / 2)
		c := (v.k - 1) - 2*v.k*h*h
		sn *= v.k
		return v.sx + (c*v.ox - sn*v.oy), v.sy + (c*v.oy + sn*v.ox)
	}
	return v.sx + u*v.dx, v.sy + u*v.dy
}

// direction returns the unit tangent of the segment at fraction u.
func (v *devEval) direction(u float64) (x, y float64) {
	if v.arc {
		sn, cs := math.Sincos(v.a0 + u*v.sweep)
		if v.sweep < 0 {
			return sn, -cs
		}
		return -sn, cs
	}
	return v.dx / v.length, v.dy / v.length
}

// local maps a world point into the ellipse's own frame.
func (v *devEval) local(x, y float64) (lx, ly float64) {
	dx, dy := x-v.cx, y-v.cy
	return v.cos*dx + v.sin*dy, -v.sin*dx + v.cos*dy
}

// exact returns the deviation at fraction u and the foot parameter, by the
// exact signed distance.
func (v *devEval) exact(u float64) (f, t float64) {
	x, y := v.point(u)
	t, sd := v.e.Nearest(ellipse.Point{X: x, Y: y})
	v.footSin, v.footCos = math.Sincos(t)
	return sd - v.d, t
}

// track returns the deviation at fraction u and its foot, by Newton's
// method on the foot parameter from the guess t0 (the foot of a point du
// of the segment away, whose deviation is fRef, or a prediction from it).
// g(t) = (q − p(t))·p′(t) vanishes at the foot; g′ = −(q − p)·p − |p′|²
// in the own frame (p″ = −p) is kept below −|p′|²/4 so that the root is a
// clear local minimum of the distance. Near the foot the signed distance
// (q − p(t))·n(t) is wrong only in the second order of the error δ in t:
// by ½·κ|p′|²·(1 + g·κ)·δ² for a point at distance g from the ellipse
// (expand p and n to second order; n·n″ = −|n′|²), so once the next step
// δ makes that negligible the iteration ends without another evaluation.
// The
// answer must be within du·L of fRef (the signed distance is 1-Lipschitz);
// anything else, or a point deep inside or far outside, falls back to the
// exact method.
func (v *devEval) track(u, t0, du, fRef float64) (f, t float64) {
	x, y := v.point(u)
	qx, qy := v.local(x, y)
	if f, t, ok := v.newton(qx, qy, t0); ok && math.Abs(f-fRef) <= du*v.length*(1+1e-9)+1e-13*v.size {
		return f, t
	}
	f, t = v.exact(u)
	return f, t0 + math.Remainder(t-t0, 2*math.Pi)
}

// misalignment returns |tan θ|, θ the angle between the segment at u and
// the curve tangent at the foot last found (as lines, whatever their
// directions).
func (v *devEval) misalignment(u float64) float64 {
	ux, uy := v.direction(u)
	sn, cs := v.footSin, v.footCos
	lx, ly := -v.rx*sn, v.ry*cs // own-frame tangent
	tx, ty := v.cos*lx-v.sin*ly, v.sin*lx+v.cos*ly
	cross := math.Abs(ux*ty - uy*tx)
	dot := math.Abs(ux*tx + uy*ty)
	if dot == 0 {
		return math.Inf(1)
	}
	return cross / dot
}

// kappa returns the curvature of the intended curve at the foot last
// found.
func (v *devEval) kappa() float64 {
	sn, cs := v.footSin, v.footCos
	s2 := v.rx*v.rx*sn*sn + v.ry*v.ry*cs*cs
	k := v.rx * v.ry / (s2 * math.Sqrt(s2))
	return k / (1 + v.d*k)
}

// kappaVertex returns the curvature at the axis end t = k·π/2.
func (v *devEval) kappaVertex(k float64) float64 {
	var c float64
	if math.Mod(math.Abs(k), 2) == 0 {
		c = v.rx / (v.ry * v.ry)
	} else {
		c = v.ry / (v.rx * v.rx)
	}
	return c / (1 + v.d*c)
}
