package ellipse

import "math"

// Carlson's symmetric elliptic integrals of the first and second kind by
// the duplication algorithm:
//
//	B. C. Carlson, "Numerical computation of real or complex elliptic
//	integrals", Numer. Algorithms 10 (1995) 13–26, doi:10.1007/BF02198293,
//	§2 (R_F) and §4 (R_D); NIST DLMF 19.36.1 and 19.36.2.
//
// Both integrals at the same arguments share the duplication steps, so one
// loop computes the pair. The truncation of the Taylor series after the
// fifth-order terms leaves a relative error below r when the loop stops at
// 4⁻ⁿ·Q < |Aₙ| with Q = (3r)^(-1/6)·max|A₀ − ·| for R_F and
// (r/4)^(-1/6)·max|A₀ − ·| for R_D (Carlson 1995, eqs. 2.2 and 4.2).
// Here r = 1e-16 (about half an ulp), so the series error is below
// rounding.

// Stopping factors (3r)^(-1/6) and (r/4)^(-1/6) for r = 1e-16.
const (
	carlsonQF = 387.0 // (3e-16)^(-1/6) = 386.6…, rounded up
	carlsonQD = 583.0 // (2.5e-17)^(-1/6) = 582.1…, rounded up
)

// rfrd returns R_F(x, y, z) and R_D(x, y, z) for x, y ≥ 0 (at most one of
// them zero) and z > 0.
//
// Special cases are:
//
//	rfrd(x, y, z) = NaN, NaN if any argument is NaN or negative
//	rfrd(0, 0, z) = +Inf, +Inf
func rfrd(x, y, z float64) (rf, rd float64) {
	switch {
	case !(x >= 0 && y >= 0 && z > 0): // also catches NaN
		return math.NaN(), math.NaN()
	case x+y == 0:
		return math.Inf(1), math.Inf(1)
	}
	af0 := (x + y + z) / 3
	ad0 := (x + y + 3*z) / 5
	qf := carlsonQF * math.Max(math.Abs(af0-x), math.Max(math.Abs(af0-y), math.Abs(af0-z)))
	qd := carlsonQD * math.Max(math.Abs(ad0-x), math.Max(math.Abs(ad0-y), math.Abs(ad0-z)))
	af, ad := af0, ad0
	fac, sum := 1.0, 0.0
	xm, ym, zm := x, y, z
	for fac*qf >= math.Abs(af) || fac*qd >= math.Abs(ad) {
		sx, sy, sz := math.Sqrt(xm), math.Sqrt(ym), math.Sqrt(zm)
		lam := sx*sy + sy*sz + sz*sx
		sum += fac / (sz * (zm + lam))
		fac *= 0.25
		xm, ym, zm = (xm+lam)*0.25, (ym+lam)*0.25, (zm+lam)*0.25
		af, ad = (af+lam)*0.25, (ad+lam)*0.25
	}
	return rfSeries(af0, af, fac, x, y), rdSeries(ad0, ad, fac, sum, x, y)
}

// rfrdPair evaluates rfrd at two argument triples (x0, y0, z0) and
// (x1, y1, z1) in one loop. The two duplication chains are independent, so
// a pipelined processor overlaps their square roots and the pair costs
// little more than one. Arguments must be valid for rfrd.
func rfrdPair(x0, y0, z0, x1, y1, z1 float64) (rf0, rd0, rf1, rd1 float64) {
	if !(x0+y0 > 0 && x1+y1 > 0) {
		rf0, rd0 = rfrd(x0, y0, z0)
		rf1, rd1 = rfrd(x1, y1, z1)
		return
	}
	af0 := (x0 + y0 + z0) / 3
	ad0 := (x0 + y0 + 3*z0) / 5
	af1 := (x1 + y1 + z1) / 3
	ad1 := (x1 + y1 + 3*z1) / 5
	qf0 := carlsonQF * math.Max(math.Abs(af0-x0), math.Max(math.Abs(af0-y0), math.Abs(af0-z0)))
	qd0 := carlsonQD * math.Max(math.Abs(ad0-x0), math.Max(math.Abs(ad0-y0), math.Abs(ad0-z0)))
	qf1 := carlsonQF * math.Max(math.Abs(af1-x1), math.Max(math.Abs(af1-y1), math.Abs(af1-z1)))
	qd1 := carlsonQD * math.Max(math.Abs(ad1-x1), math.Max(math.Abs(ad1-y1), math.Abs(ad1-z1)))
	fa, da, fb, db := af0, ad0, af1, ad1
	fac, sum0, sum1 := 1.0, 0.0, 0.0
	xa, ya, za := x0, y0, z0
	xb, yb, zb := x1, y1, z1
	for fac*qf0 >= math.Abs(fa) || fac*qd0 >= math.Abs(da) || fac*qf1 >= math.Abs(fb) || fac*qd1 >= math.Abs(db) {
		sxa, sya, sza := math.Sqrt(xa), math.Sqrt(ya), math.Sqrt(za)
		sxb, syb, szb := math.Sqrt(xb), math.Sqrt(yb), math.Sqrt(zb)
		la := sxa*sya + sya*sza + sza*sxa
		lb := sxb*syb + syb*szb + szb*sxb
		sum0 += fac / (sza * (za + la))
		sum1 += fac / (szb * (zb + lb))
		fac *= 0.25
		xa, ya, za = (xa+la)*0.25, (ya+la)*0.25, (za+la)*0.25
		xb, yb, zb = (xb+lb)*0.25, (yb+lb)*0.25, (zb+lb)*0.25
		fa, da = (fa+la)*0.25, (da+la)*0.25
		fb, db = (fb+lb)*0.25, (db+lb)*0.25
	}
	rf0 = rfSeries(af0, fa, fac, x0, y0)
	rd0 = rdSeries(ad0, da, fac, sum0, x0, y0)
	rf1 = rfSeries(af1, fb, fac, x1, y1)
	rd1 = rdSeries(ad1, db, fac, sum1, x1, y1)
	return
}

// rfSeries is the closing Taylor series of R_F (Carlson 1995, eq. 2.3).
// The subtractions are written with explicit float64 conversions so that
// no fused multiply-add changes the last bit on some architectures.
func rfSeries(a0, an, fac, x, y float64) float64 {
	d := an / fac // 4ⁿ·Aₙ
	X := (a0 - x) / d
	Y := (a0 - y) / d
	Z := -X - Y
	e2 := float64(X*Y) - float64(Z*Z)
	e3 := X * Y * Z
	return (1 - e2/10 + e3/14 + float64(e2*e2)/24 - 3*float64(e2*e3)/44) / math.Sqrt(an)
}

// rdSeries is the closing Taylor series of R_D (Carlson 1995, eq. 4.5).
func rdSeries(a0, an, fac, sum, x, y float64) float64 {
	d := an / fac // 4ⁿ·Aₙ
	X := (a0 - x) / d
	Y := (a0 - y) / d
	Z := -(X + Y) / 3
	xy := float64(X * Y)
	zz := float64(Z * Z)
	e2 := xy - 6*zz
	e3 := float64(3*xy-8*zz) * Z
	e4 := 3 * float64(xy-zz) * zz
	e5 := xy * Z * zz
	s := 1 - 3*e2/14 + e3/6 + 9*float64(e2*e2)/88 - 3*e4/22 - 9*float64(e2*e3)/52 + 3*e5/26
	return fac*s/(an*math.Sqrt(an)) + 3*sum
}

// CarlsonRF returns Carlson's symmetric integral of the first kind
// R_F(x, y, z) = ½∫₀^∞ dt / √((t+x)(t+y)(t+z)) (DLMF 19.16.1), by the
// duplication algorithm (Carlson 1995).
//
// Special cases are:
//
//	CarlsonRF(x, y, z) = NaN if any argument is negative or NaN
//	CarlsonRF(x, y, z) = +Inf if two arguments are zero
func CarlsonRF(x, y, z float64) float64 {
	// Order so that the largest is z > 0 for rfrd.
	if x > z {
		x, z = z, x
	}
	if y > z {
		y, z = z, y
	}
	if !(x >= 0 && y >= 0 && z >= 0) {
		return math.NaN()
	}
	if z == 0 {
		return math.Inf(1)
	}
	rf, _ := rfrd(x, y, z)
	return rf
}

// CarlsonRD returns Carlson's degenerate integral of the third kind
// R_D(x, y, z) = (3/2)∫₀^∞ dt / ((t+z)√((t+x)(t+y)(t+z))) (DLMF 19.16.5),
// by the duplication algorithm (Carlson 1995).
//
// Special cases are:
//
//	CarlsonRD(x, y, z) = NaN if x or y is negative, z ≤ 0, or any is NaN
//	CarlsonRD(0, 0, z) = +Inf
func CarlsonRD(x, y, z float64) float64 {
	_, rd := rfrd(x, y, z)
	return rd
}
