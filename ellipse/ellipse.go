package ellipse

import "math"

// Point is a position or a vector in the plane.
type Point struct{ X, Y float64 }

// Size limits. A semi-axis above maxSize is refused because the curvature
// needs its cube; a minor semi-axis below minRatio times the major is
// refused because the curve is then a doubled line to double precision.
const (
	maxSize  = 1e100
	minSize  = 1e-100
	minRatio = 1e-9
)

// Ellipse is an ellipse anywhere in the plane. Build one with [New],
// [FromSize], [FromFoci] or [FromBoundingBox]; the zero value is not a
// valid ellipse. An Ellipse is a small immutable value, safe to copy and to
// share between goroutines. It caches the complete elliptic integral so
// that arc lengths cost one duplication loop.
type Ellipse struct {
	cx, cy   float64 // centre
	rx, ry   float64 // semi-axes along the own x and y axes
	rot      float64 // rotation of the own x axis, radians counter-clockwise
	cos, sin float64 // of rot
	a, b     float64 // semi-major, semi-minor
	ux, uy   float64 // rx/a, ry/a: the semi-axes scaled to a major of 1
	quarter  float64 // quarter perimeter divided by a
	// The internal frame of arclength.go: major axis along x, parameter
	// τ = t − phase·π/2.
	k, k2 float64 // b/a and its square
	m1    float64 // 1 − k², computed as (1 − k)(1 + k)
	atk   float64 // atanh(k), +Inf for a circle: the branch points of the speed
	phase float64 // 0 if the own x axis is the major one, 1 if the own y axis is
}

// New returns the ellipse with the given centre, semi-axis semiX along its
// own x axis, semi-axis semiY along its own y axis (either may be the
// larger) and rotation of its own x axis (radians, counter-clockwise).
// The semi-axes must be finite, in [1e-100, 1e100], and the smaller at least
// 1e-9 times the larger; the centre and rotation must be finite.
func New(center Point, semiX, semiY, rotation float64) (Ellipse, error) {
	if err := checkSize("semi-axis x", semiX); err != nil {
		return Ellipse{}, err
	}
	if err := checkSize("semi-axis y", semiY); err != nil {
		return Ellipse{}, err
	}
	if err := checkFinite("center x", center.X); err != nil {
		return Ellipse{}, err
	}
	if err := checkFinite("center y", center.Y); err != nil {
		return Ellipse{}, err
	}
	if err := checkFinite("rotation", rotation); err != nil {
		return Ellipse{}, err
	}
	if math.Min(semiX, semiY) < minRatio*math.Max(semiX, semiY) {
		field, v := "semi-axis y", semiY
		if semiX < semiY {
			field, v = "semi-axis x", semiX
		}
		return Ellipse{}, &Error{Field: field, Value: v, Limit: minRatio * math.Max(semiX, semiY), HasLimit: true, Err: ErrTooFlat}
	}
	e := Ellipse{cx: center.X, cy: center.Y, rx: semiX, ry: semiY, rot: rotation}
	e.sin, e.cos = math.Sincos(rotation)
	e.a, e.b = math.Max(semiX, semiY), math.Min(semiX, semiY)
	e.ux, e.uy = semiX/e.a, semiY/e.a
	e.k = e.b / e.a
	e.k2 = e.k * e.k
	e.m1 = (1 - e.k) * (1 + e.k)
	e.atk = math.Atanh(e.k)
	if semiY > semiX {
		e.phase = 1
	}
	e.quarter = quarterLength(e.k)
	return e, nil
}

// FromSize returns the ellipse of full width (along its own x axis) and
// full height (along its own y axis) centred at center and rotated
// counter-clockwise by rotation radians. Field names in errors are
// "width" and "height".
func FromSize(width, height float64, center Point, rotation float64) (Ellipse, error) {
	if err := checkFull("width", width); err != nil {
		return Ellipse{}, err
	}
	if err := checkFull("height", height); err != nil {
		return Ellipse{}, err
	}
	e, err := New(center, width/2, height/2, rotation)
	if err != nil {
		if ee, ok := err.(*Error); ok {
			switch ee.Field {
			case "semi-axis x":
				ee.Field, ee.Value, ee.Limit = "width", width, 2*ee.Limit
			case "semi-axis y":
				ee.Field, ee.Value, ee.Limit = "height", height, 2*ee.Limit
			}
		}
	}
	return e, err
}

// FromFoci returns the ellipse with foci f1 and f2 whose points have focal
// distances summing to majorLength (the full major axis, 2a). majorLength
// must be greater than the distance between the foci. The own x axis runs
// from f1 towards f2; equal foci give a circle of diameter majorLength.
func FromFoci(f1, f2 Point, majorLength float64) (Ellipse, error) {
	for _, v := range []struct {
		name string
		v    float64
	}{{"focus 1 x", f1.X}, {"focus 1 y", f1.Y}, {"focus 2 x", f2.X}, {"focus 2 y", f2.Y}} {
		if err := checkFinite(v.name, v.v); err != nil {
			return Ellipse{}, err
		}
	}
	if err := checkFull("major axis", majorLength); err != nil {
		return Ellipse{}, err
	}
	dx, dy := f2.X-f1.X, f2.Y-f1.Y
	c2 := math.Hypot(dx, dy) // 2c
	if !(majorLength > c2) {
		return Ellipse{}, &Error{Field: "major axis", Value: majorLength, Limit: c2, HasLimit: true, Err: ErrFociTooFar}
	}
	a := majorLength / 2
	c := c2 / 2
	b := math.Sqrt((a - c) * (a + c))
	rot := 0.0
	if c2 > 0 {
		rot = math.Atan2(dy, dx)
	}
	e, err := New(Point{(f1.X + f2.X) / 2, (f1.Y + f2.Y) / 2}, a, b, rot)
	if err != nil {
		if ee, ok := err.(*Error); ok && ee.Err == ErrTooFlat {
			ee.Field, ee.Value, ee.Limit = "major axis", majorLength, c2*(1+minRatio*minRatio/2)
		}
	}
	return e, err
}

// FromBoundingBox returns the axis-aligned ellipse inscribed in the box
// from (minX, minY) to (maxX, maxY).
func FromBoundingBox(minX, minY, maxX, maxY float64) (Ellipse, error) {
	for _, v := range []struct {
		name string
		v    float64
	}{{"min x", minX}, {"min y", minY}, {"max x", maxX}, {"max y", maxY}} {
		if err := checkFinite(v.name, v.v); err != nil {
			return Ellipse{}, err
		}
	}
	return FromSize(maxX-minX, maxY-minY, Point{minX/2 + maxX/2, minY/2 + maxY/2}, 0)
}

func checkFinite(field string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &Error{Field: field, Value: v, Err: ErrNotFinite}
	}
	return nil
}

// checkFull checks a full length (twice a semi-axis) and reports the
// value and limits as full lengths.
func checkFull(field string, v float64) error {
	err := checkSize(field, v/2)
	if ee, ok := err.(*Error); ok {
		ee.Value = v
		ee.Limit *= 2
	}
	return err
}

func checkSize(field string, v float64) error {
	if err := checkFinite(field, v); err != nil {
		return err
	}
	if !(v > 0) {
		return &Error{Field: field, Value: v, Err: ErrNotPositive}
	}
	if v > maxSize {
		return &Error{Field: field, Value: v, Limit: maxSize, HasLimit: true, Err: ErrOverflow}
	}
	if v < minSize {
		return &Error{Field: field, Value: v, Limit: minSize, HasLimit: true, Err: ErrTooSmall}
	}
	return nil
}

// Center returns the centre.
func (e Ellipse) Center() Point { return Point{e.cx, e.cy} }

// SemiX returns the semi-axis along the ellipse's own x axis.
func (e Ellipse) SemiX() float64 { return e.rx }

// SemiY returns the semi-axis along the ellipse's own y axis.
func (e Ellipse) SemiY() float64 { return e.ry }

// Rotation returns the angle of the own x axis, radians counter-clockwise.
func (e Ellipse) Rotation() float64 { return e.rot }

// SemiMajor returns a, the larger semi-axis.
func (e Ellipse) SemiMajor() float64 { return e.a }

// SemiMinor returns b, the smaller semi-axis.
func (e Ellipse) SemiMinor() float64 { return e.b }

// MajorAngle returns the direction of the major axis, radians
// counter-clockwise in [0, π). A circle reports its own x axis.
func (e Ellipse) MajorAngle() float64 {
	ang := e.rot
	if e.ry > e.rx {
		ang += math.Pi / 2
	}
	ang = math.Mod(ang, math.Pi)
	if ang < 0 {
		ang += math.Pi
	}
	return ang
}

// Eccentricity returns e = √(1 − b²/a²), computed as √((a−b)(a+b))/a so
// that nearly round ellipses keep their digits.
func (e Ellipse) Eccentricity() float64 {
	return math.Sqrt((e.a-e.b)*(e.a+e.b)) / e.a
}

// FocalDistance returns 2ae, the distance between the foci.
func (e Ellipse) FocalDistance() float64 {
	return 2 * math.Sqrt((e.a-e.b)*(e.a+e.b))
}

// Foci returns the two foci in world coordinates, the first on the
// negative side of the major axis. A circle returns its centre twice.
func (e Ellipse) Foci() (Point, Point) {
	c := math.Sqrt((e.a - e.b) * (e.a + e.b))
	var lx, ly float64
	if e.rx >= e.ry {
		lx = c
	} else {
		ly = c
	}
	return e.toWorld(-lx, -ly), e.toWorld(lx, ly)
}

// Area returns πab.
func (e Ellipse) Area() float64 { return math.Pi * e.a * e.b }

// Perimeter returns the length of the ellipse, 4a·E(m) with m = 1 − b²/a²,
// exact to a few units in the last place (Carlson's R_F and R_D; see the
// package documentation).
func (e Ellipse) Perimeter() float64 { return 4 * e.a * e.quarter }

// toWorld maps a point of the ellipse's own frame to world coordinates.
func (e Ellipse) toWorld(lx, ly float64) Point {
	return Point{e.cx + e.cos*lx - e.sin*ly, e.cy + e.sin*lx + e.cos*ly}
}

// toLocal maps a world point into the ellipse's own frame.
func (e Ellipse) toLocal(p Point) (float64, float64) {
	dx, dy := p.X-e.cx, p.Y-e.cy
	return e.cos*dx + e.sin*dy, -e.sin*dx + e.cos*dy
}

// PointAt returns the point at parameter t:
// centre + R(rotation)·(semiX·cos t, semiY·sin t).
func (e Ellipse) PointAt(t float64) Point {
	s, c := math.Sincos(t)
	return e.toWorld(e.rx*c, e.ry*s)
}

// Tangent returns the unit tangent at parameter t, in the direction of
// increasing t (counter-clockwise).
func (e Ellipse) Tangent(t float64) Point {
	s, c := math.Sincos(t)
	tx, ty := -e.rx*s, e.ry*c
	h := math.Hypot(tx, ty)
	return Point{(e.cos*tx - e.sin*ty) / h, (e.sin*tx + e.cos*ty) / h}
}

// Normal returns the unit outward normal at parameter t: the tangent turned
// a quarter turn clockwise.
func (e Ellipse) Normal(t float64) Point {
	tg := e.Tangent(t)
	return Point{tg.Y, -tg.X}
}

// speed2 returns |p'(t)|²/a² for the scaled ellipse.
func (e Ellipse) speed2(s, c float64) float64 {
	return e.ux*e.ux*s*s + e.uy*e.uy*c*c
}

// Curvature returns κ(t) = semiX·semiY / |p'(t)|³, always positive.
func (e Ellipse) Curvature(t float64) float64 {
	s, c := math.Sincos(t)
	v := math.Sqrt(e.speed2(s, c))
	return e.ux * e.uy / (v * v * v) / e.a
}

// RadiusOfCurvature returns 1/κ(t).
func (e Ellipse) RadiusOfCurvature(t float64) float64 {
	s, c := math.Sincos(t)
	v := math.Sqrt(e.speed2(s, c))
	return v * v * v / (e.ux * e.uy) * e.a
}

// MinRadiusOfCurvature returns b²/a, the radius of curvature at the ends of
// the major axis. Inward offsets fold at this distance.
func (e Ellipse) MinRadiusOfCurvature() float64 { return e.b * (e.b / e.a) }

// MaxRadiusOfCurvature returns a²/b, the radius of curvature at the ends of
// the minor axis.
func (e Ellipse) MaxRadiusOfCurvature() float64 { return e.a * (e.a / e.b) }
