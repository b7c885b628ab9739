package conformance

import "math"

// Sampling density and refinement for SegmentDeviation.

// intervals returns the number of intervals of the dense pass (see
// SegmentDeviation) from the coarse samples: their feet ts and the
// curvatures kappas there, the range [flo, fhi] of their deviations and the
// largest tan θ among them.
func (v *devEval) intervals(ts, kappas *[devFirst + 1]float64, flo, fhi, maxTan float64) int {
	b, ok := v.bendBound(ts, kappas, flo, fhi, maxTan)
	if !ok {
		return devMaxIntervals
	}
	r := math.Max(fhi-flo, devFloor*v.size)
	nf := math.Ceil(v.length * math.Sqrt(b.c/(8*devMissShare*r)) / devFirst)
	if !(nf < devMaxIntervals/devFirst) {
		return devMaxIntervals
	}
	return max(1, int(nf)) * devFirst
}

// devBend is the bound on |f″| along a segment (f the deviation,
// parameterised by length) described in SegmentDeviation.
type devBend struct {
	c float64 // the bound over the whole segment
}

// bendBound returns the bound on |f″| along the whole segment from the
// coarse samples: their feet ts and the curvatures kappas there, the
// range [flo, fhi] of their deviations and the largest tan θ among them.
// It reports false near the medial axis, where there is no useful bound.
func (v *devEval) bendBound(ts, kappas *[devFirst + 1]float64, flo, fhi, maxTan float64) (devBend, bool) {
	// Curvature range of the intended curve over the span of the feet.
	kl, kh := math.Inf(1), math.Inf(-1)
	for i := 0; i <= devFirst; i++ {
		k := kappas[i]
		kl, kh = math.Min(kl, k), math.Max(kh, k)
		if i == devFirst {
			break
		}
		dt := math.Remainder(ts[i+1]-ts[i], 2*math.Pi)
		if math.Abs(dt) > math.Pi/2 {
			k0, k1 := v.kappaVertex(0), v.kappaVertex(1)
			kl, kh = math.Min(k0, k1), math.Max(k0, k1)
			break
		}
		a, b := math.Min(ts[i], ts[i]+dt), math.Max(ts[i], ts[i]+dt)
		for q := math.Ceil(a / (math.Pi / 2)); q*(math.Pi/2) <= b; q++ {
			k := v.kappaVertex(q)
			kl, kh = math.Min(kl, k), math.Max(kh, k)
		}
	}
	// Level-curve curvature over the deviations, widened by their range.
	r1 := fhi - flo
	den := 1 + (flo-r1)*kh
	den2 := 1 + (fhi+r1)*kl
	if !(den > 0.05) || !(den2 > 0.05) {
		return devBend{}, false // near the medial axis: no useful bound
	}
	keh, kel := kh/den, kl/den2
	// Which way an arc bends relative to the curve, seen at its middle.
	ks, sure := 0.0, true
	if v.arc {
		ks = v.kappaSegment
		x, y := v.point(0.5)
		sn, cs := math.Sincos(ts[devFirst/2])
		lx, ly := v.ry*cs, v.rx*sn // own-frame outward normal
		h := math.Hypot(lx, ly)
		nx, ny := (v.cos*lx-v.sin*ly)/h, (v.sin*lx+v.cos*ly)/h
		switch dot := ((v.ccx-x)*nx + (v.ccy-y)*ny) / v.r; {
		case dot < -0.5:
		case dot > 0.5:
			ks = -ks
		default:
			sure = false
		}
	}
	// Angle between segment and curve: the sampled largest, plus the most
	// it can turn at rate ω (|dθ/du| = |κₑ·cosθ − κₛ|) over the distance
	// to the nearest coarse sample, at most L/8.
	theta := math.Atan(maxTan)
	var omega float64
	if sure {
		omega = math.Max(math.Abs(keh-ks), math.Abs(kel-ks)) + keh*(1-math.Cos(theta))
	} else {
		omega = keh + math.Abs(ks)
	}
	theta += v.length / (2 * devFirst) * omega
	cmin := math.Cos(math.Min(theta, math.Pi/2))
	c := curvatureBound(kel, keh, ks, cmin)
	if !sure {
		c = math.Max(c, curvatureBound(kel, keh, -ks, cmin))
	}
	return devBend{c: c}, true
}

// curvatureBound returns max |k·c² − ks·c| over k in [kl, kh] and c in
// [cmin, 1]: the bound on |f″| of SegmentDeviation. The expression is
// linear in k and a parabola in c, so the maximum is at a corner or at the
// vertex c = ks/(2k).
func curvatureBound(kl, kh, ks, cmin float64) float64 {
	m := 0.0
	for _, k := range [2]float64{kl, kh} {
		cv := cmin
		if k > 0 {
			cv = math.Min(1, math.Max(cmin, ks/(2*k)))
		}
		for _, c := range [3]float64{cmin, 1, cv} {
			m = math.Max(m, math.Abs(k*c*c-ks*c))
		}
	}
	return m
}

// extremes follows the largest and smallest sample of the dense pass with
// their feet and the values of their neighbours (NaN when there is none).
type extremes struct {
	maxI, minI             int
	maxF, minF, maxT, minT float64
	maxL, maxR, minL, minR float64
	prev                   float64
}

func (x *extremes) add(i int, f, t float64) {
	if i == 0 {
		nan := math.NaN()
		*x = extremes{maxF: f, minF: f, maxT: t, minT: t, maxL: nan, maxR: nan, minL: nan, minR: nan, prev: f}
		return
	}
	if i-1 == x.maxI {
		x.maxR = f
	}
	if i-1 == x.minI {
		x.minR = f
	}
	if f > x.maxF {
		x.maxI, x.maxF, x.maxT, x.maxL, x.maxR = i, f, t, x.prev, math.NaN()
	}
	if f < x.minF {
		x.minI, x.minF, x.minT, x.minL, x.minR = i, f, t, x.prev, math.NaN()
	}
	x.prev = f
}

// refine improves the largest value of sgn·f found at sample i of n
// intervals (value fb, foot tb, neighbours fl and fr, all times sgn) by
// successive parabolic interpolation inside the bracket of its neighbours.
// An extreme at an end of the segment is probed once inside the end
// interval first. It returns the best value of sgn·f seen.
func (v *devEval) refine(i, n int, fb, tb, fl, fr, sgn float64) float64 {
	h := 1 / float64(n)
	b := float64(i) * h
	var a, c, fa, fc float64
	switch {
	case i > 0 && i < n:
		a, c, fa, fc = b-h, b+h, fl, fr
	case i == 0:
		a, fa, c, fc = b, fb, b+h, fr
		m := b + h/2
		fm, tm := v.track(m, tb, h/2, sgn*fb)
		if fm *= sgn; !(fm > fb) {
			return fb
		}
		b, fb, tb = m, fm, tm
	default:
		a, fa, c, fc = b-h, fl, b, fb
		m := b - h/2
		fm, tm := v.track(m, tb, h/2, sgn*fb)
		if fm *= sgn; !(fm > fb) {
			return fb
		}
		b, fb, tb = m, fm, tm
	}
	for k := 0; k < devRefine; k++ {
		p := (b - a) * (fb - fc)
		q := (b - c) * (fb - fa)
		den := 2 * (p - q)
		if den == 0 {
			break
		}
		x := b - ((b-a)*p-(b-c)*q)/den
		if !(x > a && x < c) || x == b {
			break
		}
		fx, tx := v.track(x, tb, math.Abs(x-b), sgn*fb)
		fx *= sgn
		moved := math.Abs(x - b)
		if fx > fb {
			if x < b {
				c, fc = b, fb
			} else {
				a, fa = b, fb
			}
			b, fb, tb = x, fx, tx
		} else if x < b {
			a, fa = x, fx
		} else {
			c, fc = x, fx
		}
		if moved < 1e-3*h {
			break
		}
	}
	return fb
}

// medialCrossings returns the fractions (at most two) at which the segment
// crosses the medial axis of the ellipse, the segment of its major axis
// between the centres of curvature of its ends, where the distance has a
// kink. For a circle, whose medial axis is its centre, it returns the
// point of closest approach to the centre when that lies deeper than half
// the radius.
func (v *devEval) medialCrossings() (us [2]float64, n int) {
	// Own frame; major axis along the first coordinate.
	swap := v.ry > v.rx
	maj, mnr := v.rx, v.ry
	if swap {
		maj, mnr = mnr, maj
	}
	m := maj - mnr*mnr/maj // half-length of the medial axis
	own := func(x, y float64) (float64, float64) {
		lx, ly := v.local(x, y)
		if swap {
			return ly, lx
		}
		return lx, ly
	}
	circle := v.rx == v.ry
	if !v.arc {
		x0, y0 := own(v.sx, v.sy)
		x1, y1 := own(v.sx+v.dx, v.sy+v.dy)
		if circle {
			dx, dy := x1-x0, y1-y0
			u := -(x0*dx + y0*dy) / (dx*dx + dy*dy)
			if u > 0 && u < 1 && math.Hypot(x0+u*dx, y0+u*dy) < 0.5*maj {
				us[0], n = u, 1
			}
			return us, n
		}
		if (y0 < 0) != (y1 < 0) && y0 != y1 {
			u := y0 / (y0 - y1)
			if x := x0 + u*(x1-x0); math.Abs(x) < m && u > 0 && u < 1 {
				us[0], n = u, 1
			}
		}
		return us, n
	}
	qx, qy := own(v.ccx, v.ccy)
	sx, sy := own(v.sx, v.sy)
	a0 := math.Atan2(sy-qy, sx-qx)
	sweep := v.sweep
	if swap {
		sweep = -sweep // swapping the axes mirrors the plane
	}
	frac := func(phi float64) float64 {
		d := math.Mod(phi-a0, 2*math.Pi)
		if sweep < 0 {
			d = -d
		}
		if d < 0 {
			d += 2 * math.Pi
		}
		return d / math.Abs(sweep)
	}
	if circle {
		if h := math.Hypot(qx, qy); h > 0 && math.Abs(h-v.r) < 0.5*maj {
			if u := frac(math.Atan2(-qy, -qx)); u > 0 && u < 1 {
				us[0], n = u, 1
			}
		}
		return us, n
	}
	if w := v.r*v.r - qy*qy; w > 0 {
		w = math.Sqrt(w)
		for _, x := range [2]float64{qx - w, qx + w} {
			if math.Abs(x) >= m {
				continue
			}
			if u := frac(math.Atan2(-qy, x-qx)); u > 0 && u < 1 && n < 2 {
				us[n] = u
				n++
			}
		}
	}
	return us, n
}
