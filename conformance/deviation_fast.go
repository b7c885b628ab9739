package conformance

import "math"

// Bounded search for SegmentDeviation: the extremes of the deviation
// located by samples that carry the slope as well as the value, with an
// interval dropped as soon as a lower (upper) bound built from the slope and
// the bound on f″ shows that it cannot hold a value more than 1% of the
// range beyond the best found.

// devSearchCap is the most samples the bounded search takes before it
// hands the segment to the dense pass.
const devSearchCap = 40

// devSample is one sample of the bounded search: fraction u along the
// segment, deviation f, its derivative g = df/du and the foot parameter t.
type devSample struct{ u, f, g, t float64 }

// slope returns df/du at fraction u, for the foot last found: the
// gradient of the signed distance is the unit outward normal at the foot,
// so df/du = L·n·d with d the unit direction of the segment.
//
// It also returns dt/du, the rate at which the foot moves: a point
// p(t) + λ·n(t) moves by (1 + λκ)|p′| per unit of t along the tangent, so
// dt/du = L·d·p′/(|p′|²(1 + λκ)), with λ the signed distance f + offset.
func (v *devEval) slope(u, f float64) (g, rate float64) {
	ux, uy := v.direction(u)
	sn, cs := v.footSin, v.footCos
	// the direction in the own frame
	dx, dy := v.cos*ux+v.sin*uy, -v.sin*ux+v.cos*uy
	nx, ny := v.ry*cs, v.rx*sn // own-frame outward normal, |n| = |p′|
	s2 := nx*nx + ny*ny
	s := math.Sqrt(s2)
	g = v.length * (dx*nx + dy*ny) / s
	k := v.rx * v.ry / (s2 * s)
	rate = v.length * (-dx*v.rx*sn + dy*v.ry*cs) / (s2 * (1 + (f+v.d)*k))
	return g, rate
}

// lowerBound returns a lower bound on f over [a.u, b.u] for a function
// with f″ ≥ −c there (c ≥ 0), and the fraction where the bound is reached.
// Each end gives a concave minorant, ℓa(x) = fa + ga·(x − a) − c(x − a)²/2
// and likewise ℓb; for any split m, f ≥ ℓa on [a, m] and f ≥ ℓb on [m, b],
// and a concave function is smallest at an end of an interval, so f ≥
// min(fa, ℓa(m), ℓb(m), fb). The best split is where the minorants cross;
// their difference is linear in x.
func lowerBound(a, b devSample, c float64) (lb, at float64) {
	h := b.u - a.u
	s := h / 2
	num := a.f - b.f + b.g*h + c*h*h/2
	if den := a.g - b.g - c*h; den != 0 {
		if r := -num / den; r > 0 && r < h {
			s = r
		}
	}
	la := a.f + a.g*s - c*s*s/2
	lb = b.f + b.g*(s-h) - c*(s-h)*(s-h)/2
	return min(a.f, b.f, la, lb), a.u + s
}

// search returns the extremes of the deviation from the five coarse
// samples (fraction i/4, deviation fs, slope gs, foot ts) and bend, the
// bound on |f″| in length units; for a line, whose deviation is convex,
// bend is nil: its maximum is then at a sample and the minorants need no
// curvature term.
// It reports false when it would need more than devSearchCap samples.
func (v *devEval) search(fs, gs, ts *[devFirst + 1]float64, bend *devBend) (lo, hi float64, ok bool) {
	var ss [devSearchCap]devSample
	var bs [devSearchCap]devBounds // bs[i]: of the interval from ss[i] to ss[i+1]
	n := devFirst + 1
	lo, hi = fs[0], fs[0]
	for i := range n {
		ss[i] = devSample{u: float64(i) / devFirst, f: fs[i], g: gs[i], t: ts[i]}
		lo, hi = min(lo, fs[i]), max(hi, fs[i])
	}
	l2 := v.length * v.length // f″ in u is L² times f″ in length
	// bounds returns the bounds over the interval from a to b.
	bounds := func(a, b devSample) devBounds {
		var r devBounds
		if bend == nil {
			r.lo, r.loAt = lowerBound(a, b, 0)
			r.hi, r.hiAt = max(a.f, b.f), (a.u+b.u)/2
			return r
		}
		c := bend.c * l2
		r.lo, r.loAt = lowerBound(a, b, c)
		a.f, a.g, b.f, b.g = -a.f, -a.g, -b.f, -b.g
		r.hi, r.hiAt = lowerBound(a, b, c)
		r.hi = -r.hi
		return r
	}
	for i := 0; i+1 < n; i++ {
		bs[i] = bounds(ss[i], ss[i+1])
	}
	for {
		tol := devMissShare * math.Max(hi-lo, devFloor*v.size)
		worst, at, x := 0.0, -1, 0.0
		for i, b := range bs[:n-1] {
			if e := lo - tol - b.lo; e > worst {
				worst, at, x = e, i, b.loAt
			}
			if e := b.hi - hi - tol; e > worst {
				worst, at, x = e, i, b.hiAt
			}
		}
		if at < 0 {
			return lo, hi, true
		}
		if n == len(ss) || math.IsNaN(worst) {
			return 0, 0, false
		}
		a, b := ss[at], ss[at+1]
		h := b.u - a.u
		x = math.Min(math.Max(x, a.u+0.1*h), b.u-0.1*h)
		w := (x - a.u) / h
		guess := a.t + w*math.Remainder(b.t-a.t, 2*math.Pi)
		ref, du := a.f, x-a.u
		if w > 0.5 {
			ref, du = b.f, b.u-x
		}
		f, t := v.track(x, guess, du, ref)
		g, _ := v.slope(x, f)
		m := devSample{u: x, f: f, g: g, t: t}
		copy(ss[at+2:n+1], ss[at+1:n])
		copy(bs[at+2:n], bs[at+1:n-1])
		ss[at+1] = m
		bs[at] = bounds(a, m)
		bs[at+1] = bounds(m, b)
		n++
		lo, hi = min(lo, f), max(hi, f)
	}
}

// devBounds holds the bounds of the deviation over one interval of the
// bounded search and the fractions where they are reached.
type devBounds struct{ lo, loAt, hi, hiAt float64 }

// newton returns the deviation at the own-frame point (qx, qy) and its
// foot, by Newton's method on the foot parameter from t0, or false.
// g(t) = (q − p(t))·p′(t) vanishes at the foot; g′ = −(q − p)·p − |p′|²
// in the own frame (p″ = −p) is kept below −|p′|²/4 so that the root is a
// clear local minimum of the distance. Near the foot the signed distance
// (q − p(t))·n(t) is wrong only in the second order of the error δ in t:
// by ½·κ|p′|²·(1 + g·κ)·δ² for a point at distance g from the ellipse
// (expand p and n to second order; n·n″ = −|n′|²), so once the next step
// δ makes that negligible the iteration ends without another evaluation;
// the foot is still moved by that step (its sine and cosine turned), for
// the normal there is only first-order right and the slopes of the
// bounded search use it.
//
// A root found is the nearest point whatever the start: the point is
// q = p(t) + λ·n(t) with λ its signed distance along the normal, and a
// point on the outward normal of a convex curve (λ ≥ 0), or on the inward
// one less deep than the reach b²/a, has the foot of that normal as its
// unique nearest point (Federer 1959). Only answers with λ above half the
// reach below the curve are accepted.
//
// Small steps turn the sine and cosine of the parameter by the angle-sum
// formulas with short Taylor series (|δ| < 1e-3: the first terms left
// out, δ⁷/5040 for the sine and δ⁶/720 for the cosine, are below 1e-20)
// instead of calling math.Sincos again.
func (v *devEval) newton(qx, qy, t0 float64) (f, t float64, ok bool) {
	t = t0
	sn, cs := math.Sincos(t)
	for k := 0; k < 8; k++ {
		px, py := v.rx*cs, v.ry*sn
		vx, vy := -v.rx*sn, v.ry*cs
		wx, wy := qx-px, qy-py
		g := wx*vx + wy*vy
		speed2 := vx*vx + vy*vy
		gp := -(wx*px + wy*py) - speed2
		if !(gp < -0.25*speed2) {
			return 0, 0, false // too deep inside: the foot is not well defined here
		}
		step := g / gp
		if math.Abs(step) < 1e-6 {
			nx, ny := v.ry*cs, v.rx*sn
			speed := math.Sqrt(nx*nx + ny*ny)
			sd := (wx*nx + wy*ny) / speed
			kv2 := v.rx * v.ry / speed // κ·|p′|²
			if 0.5*kv2*math.Abs(1+sd*kv2/speed2)*step*step <= 1e-17*v.size {
				if !(sd > -0.5*v.reach) {
					return 0, 0, false
				}
				// The distance is settled, but the foot may still be
				// off by the step (up to a few 1e-9), and the slope
				// (see slope) takes the normal there: one more step
				// turns the foot to within the square of that.
				sn, cs = turnSmall(sn, cs, -step)
				t -= step
				v.footSin, v.footCos = sn, cs
				return sd - v.d, t, true
			}
		}
		if math.Abs(step) > 0.5 {
			return 0, 0, false
		}
		t -= step
		if math.Abs(step) < 1e-3 {
			sn, cs = turnSmall(sn, cs, -step)
		} else {
			sn, cs = math.Sincos(t)
		}
	}
	return 0, 0, false
}

// turnSmall returns the sine and cosine of an angle whose sine and cosine
// are sn and cs, plus a small d (|d| < 1e-3: the series' first terms left
// out, d⁷/5040 and d⁶/720, are below 1e-20).
func turnSmall(sn, cs, d float64) (float64, float64) {
	d2 := d * d
	sd := d * (1 - d2/6*(1-d2/20))
	cd := 1 - d2/2*(1-d2/12)
	return sn*cd + cs*sd, cs*cd - sn*sd
}

// start returns the deviation at the start of the segment and its foot:
// Newton's method from the parameter of the point scaled onto a circle,
// which lies close to the foot for a point near the curve, or the exact
// method when that does not settle.
func (v *devEval) start() (f, t float64) {
	x, y := v.point(0)
	qx, qy := v.local(x, y)
	return v.startFrom(math.Atan2(qy*v.rx, qx*v.ry))
}

// startFrom is start from the guess t0 of the foot parameter (the known
// foot, from the exact method, settles at once).
func (v *devEval) startFrom(t0 float64) (f, t float64) {
	x, y := v.point(0)
	qx, qy := v.local(x, y)
	if f, t, ok := v.newton(qx, qy, t0); ok {
		return f, t
	}
	return v.exact(0)
}

// shape fills ks with the curvature of the intended curve at the feet ts
// of the coarse samples and returns the largest tan θ among them.
func (v *devEval) shape(ts, ks *[devFirst + 1]float64) (maxTan float64) {
	for i, t := range ts {
		v.footSin, v.footCos = math.Sincos(t)
		ks[i] = v.kappa()
		maxTan = math.Max(maxTan, v.misalignment(float64(i)/devFirst))
	}
	return maxTan
}
