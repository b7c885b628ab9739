package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// frame evaluates an ellipse and its parallel curves quickly: one Sincos
// per parameter gives the point, the unit tangent and the outward normal.
// It is the approximators' view of the curve.
type frame struct {
	cx, cy   float64 // centre
	rx, ry   float64 // semi-axes along the own axes
	cos, sin float64 // of the rotation
	d        float64 // offset of the intended curve (+ outward)
	e        ellipse.Ellipse
}

func newFrame(c ellipse.Parallel) frame {
	e := c.Ellipse()
	ctr := e.Center()
	s, co := math.Sincos(e.Rotation())
	return frame{cx: ctr.X, cy: ctr.Y, rx: e.SemiX(), ry: e.SemiY(), cos: co, sin: s, d: c.Offset(), e: e}
}

// vec is a plane vector.
type vec struct{ x, y float64 }

func (a vec) add(b vec) vec                  { return vec{a.x + b.x, a.y + b.y} }
func (a vec) sub(b vec) vec                  { return vec{a.x - b.x, a.y - b.y} }
func (a vec) scale(k float64) vec            { return vec{a.x * k, a.y * k} }
func (a vec) dot(b vec) float64              { return a.x*b.x + a.y*b.y }
func (a vec) cross(b vec) float64            { return a.x*b.y - a.y*b.x }
func (a vec) norm() float64                  { return math.Sqrt(a.x*a.x + a.y*a.y) }
func (a vec) left() vec                      { return vec{-a.y, a.x} }
func (a vec) addScaled(b vec, k float64) vec { return vec{a.x + k*b.x, a.y + k*b.y} }

// at returns, for parameter t, the point of the parallel curve at offset
// off (absolute, from the ellipse), the unit counter-clockwise tangent and
// the unit outward normal.
func (f *frame) at(t, off float64) (p, tan, nrm vec) {
	s, c := math.Sincos(t)
	return f.atSC(s, c, off)
}

// atSC is at given sin t and cos t.
func (f *frame) atSC(s, c, off float64) (p, tan, nrm vec) {
	lx, ly := f.rx*c, f.ry*s
	tx, ty := -f.rx*s, f.ry*c
	ih := 1 / math.Sqrt(tx*tx+ty*ty) // semi-axes are at most 1e100
	tx, ty = tx*ih, ty*ih
	nx, ny := ty, -tx
	lx += off * nx
	ly += off * ny
	p = vec{f.cx + f.cos*lx - f.sin*ly, f.cy + f.sin*lx + f.cos*ly}
	tan = vec{f.cos*tx - f.sin*ty, f.sin*tx + f.cos*ty}
	nrm = vec{tan.y, -tan.x}
	return p, tan, nrm
}

// ellipseCurvature returns the ellipse's curvature κ at t and its
// derivative with respect to arc length, dκ/ds = −3·rx·ry·(rx² − ry²)·sin t·cos t / v⁶
// with v = |p'(t)|.
func (f *frame) ellipseCurvature(t float64) (k, dk float64) {
	s, c := math.Sincos(t)
	v2 := f.rx*f.rx*s*s + f.ry*f.ry*c*c
	v := math.Sqrt(v2)
	k = f.rx * f.ry / (v2 * v)
	dk = -3 * f.rx * f.ry * (f.rx*f.rx - f.ry*f.ry) * s * c / (v2 * v2 * v2)
	return k, dk
}

// speed returns |dq/dt| of the parallel curve at offset off.
func (f *frame) speed(t, off float64) float64 {
	s, c := math.Sincos(t)
	v2 := f.rx*f.rx*s*s + f.ry*f.ry*c*c
	v := math.Sqrt(v2)
	return v + off*f.rx*f.ry/v2
}

// chordTouch returns the parameter in (t0, t1) (either order) where the
// ellipse's tangent is parallel to the world direction dir: the point of a
// parallel curve farthest from a chord of that direction. By the affine
// image of the circle, tan t = −ry·u_x/(rx·u_y) with u = dir in the own
// frame; of the solutions t + kπ the one nearest the middle is taken.
func (f *frame) chordTouch(t0, t1 float64, dir vec) float64 {
	ux := f.cos*dir.x + f.sin*dir.y
	uy := -f.sin*dir.x + f.cos*dir.y
	base := math.Atan2(-f.ry*ux, f.rx*uy)
	mid := 0.5 * (t0 + t1)
	return base + math.Pi*math.Round((mid-base)/math.Pi)
}

// curvature returns the curvature at t of the parallel curve at offset off,
// κ/(1 + off·κ), and the ellipse's dκ/ds.
func (f *frame) curvature(t, off float64) (k, dk float64) {
	ke, dke := f.ellipseCurvature(t)
	return ke / (1 + off*ke), dke
}
