// Package ellipse is the geometry and numerics of the ellipse
// x²/a² + y²/b² = 1 placed anywhere in the plane: its derived quantities,
// exact arc length and its inverse, parallel (offset) curves, equal
// arc-length division and the signed distance of a point.
//
// # The ellipse value
//
// An [Ellipse] has a centre, a semi-axis along its own x axis, a semi-axis
// along its own y axis (either may be the larger) and a rotation of its own
// axes, counter-clockwise in radians. Build one with [New], [FromSize],
// [FromFoci] or [FromBoundingBox]; they validate and return an [*Error]
// naming the bad field. The zero Ellipse is not valid.
//
// A point is addressed by the parameter t (radians):
//
//	p(t) = centre + R(rotation)·(semiX·cos t, semiY·sin t)
//
// so t = 0 is the end of the own +x semi-axis and t increases
// counter-clockwise. The parameter is not the polar angle.
//
// # Arc length
//
// The speed |p'(t)| = √(semiX²·sin²t + semiY²·cos²t) integrates to
// Legendre's incomplete elliptic integral of the second kind: with the
// major semi-axis a and m = 1 − b²/a², s(0, t) = a·E(t | m) when the major
// axis is the own y axis and a·(E(t − π/2 | m) + E(m)) when it is the own x
// axis. Internally every ellipse is measured with its major axis along x,
// where E takes a form whose two Carlson terms are both positive, so no
// axis ratio loses digits; R_F and R_D come from one duplication loop
// (Carlson 1995; DLMF 19.36) with range reduction for any argument (DLMF
// 19.25.7 and E(φ + nπ|m) = E(φ|m) + 2n·E(m)). Arcs short against the
// local length scale are integrated directly by Gauss–Legendre
// quadrature, so [Ellipse.ArcLength] is within a few ulps of the arc's own
// length, however short and however many turns from t = 0;
// [Ellipse.ParamAtArcLength] inverts it by Halley's method in a bracket,
// usually in two or three evaluations. Neither allocates. [LegendreE],
// [CarlsonRF] and [CarlsonRD] expose the special functions themselves.
//
// # Parallel curves
//
// The parallel curve at signed distance d (+ outward) is not an ellipse.
// Its arc element is (1 + dκ)·ds, so its length from t0 to t1 is
// s(t0, t1) + d·(ψ(t1) − ψ(t0)) with ψ the turning angle of the tangent.
// Inward it folds once −d reaches the minimum radius of curvature b²/a;
// [Ellipse.Parallel] refuses such distances.
//
// # Distance
//
// [Ellipse.SignedDistance] follows Eberly, "Distance from a Point to an
// Ellipse, an Ellipsoid, or a Hyperellipsoid" (Geometric Tools): the foot
// point is the root of a monotone function in one variable, found here by
// Newton steps kept inside a bisection bracket, in a variable that keeps
// its digits for points near the centre and near the major axis. It is
// exact to about 1e-15 of the larger of |d| and the semi-major axis.
package ellipse
