package toolpath

import (
	"errors"

	"github.com/focitools/foci/ellipse"
)

// PocketSpec describes a pocket: an elliptical recess cleared to a flat
// floor by a router, the wall finished by a last pass at full depth.
//
// Lengths are in one unit, whatever the caller uses; angles in radians.
type PocketSpec struct {
	// Setup must name the Router; Tol, Geometry, Decimals, SafeZ and
	// PlungeFeed are used as for a profile.
	Setup
	// Ellipse is the outline of the recess: the wall.
	Ellipse ellipse.Ellipse
	// Direction is climb (the default: counter-clockwise, as round any
	// inside contour with a clockwise spindle) or conventional
	// (clockwise); every ring and the wall pass run the same way.
	Direction Direction
	// Tool is the cutter diameter: at least 2·Tol (see
	// [ErrPocketToolTooSmall]) and narrower than the minor axis by at
	// least three tolerances (see [ErrPocketToolTooWide]).
	Tool float64
	// Depth is the depth of the floor below Z0 (greater than zero);
	// StepDown the deepest a level may go below the one before (greater
	// than zero). The levels are equal, see [DepthPasses].
	Depth, StepDown float64
	// StepOver is the largest distance between neighbouring rings, and so
	// the widest cut a ring takes beside the one before it (greater than
	// zero, at least Tol, at most Tool). Common practice, no published
	// source: 40 to 50 per cent of the tool diameter in wood and plastics.
	StepOver float64
	// Allowance is the finishing allowance: the skin left on the wall by
	// the clearing rings and removed by the wall pass at full depth. Zero
	// means none (the outermost ring is then the wall pass, at every
	// level). A non-zero allowance must be at least 3·Tol and at most the
	// step-over (and Tool − Tol); see [ErrPocketAllowance].
	Allowance float64
	// RampAngle (radians, below π/2) is the steepest slope of the entry
	// into each level; 0 chooses [PocketRampAngle].
	RampAngle float64
}

// PocketRampAngle is the default entry slope of a pocket, 3 degrees.
// Common practice for flat end mills, no published source: 2 to 5 degrees.
const PocketRampAngle = 3 * 3.14159265358979323846 / 180

// Errors returned by [Pocket] and [PlanPocket], wrapped in an [*OpError]
// that names the field and the limit.
var (
	// ErrPocketMachine reports a machine other than the router.
	ErrPocketMachine = errors.New("a pocket is cut by a router only")
	// ErrPocketToolTooWide reports a tool that leaves no room in the
	// pocket: the tool centre must keep its radius from the wall, and
	// enters each level down a helix about the centre where there is no
	// room for a ramp, so the tool must be narrower than the minor axis
	// 2b by at least 3·Tol. The limit given is 2b − 3·Tol.
	ErrPocketToolTooWide = errors.New("too wide for the pocket: it must be narrower than the minor axis, with room to enter; the limit is the largest diameter")
	// ErrPocketToolTooSmall reports a tool narrower than twice the
	// tolerance: neighbouring rings must be less than Tool − Tol apart
	// for the bands they sweep to meet, and at least Tol apart to be
	// worth cutting. The limit given is 2·Tol.
	ErrPocketToolTooSmall = errors.New("too narrow for the tolerance: the limit is the smallest diameter")
	// ErrPocketStepOver reports a step-over above the tool diameter
	// (the rings would leave ridges between them) or below the tolerance
	// (rings closer than the path's own accuracy).
	ErrPocketStepOver = errors.New("step-over out of range: at least the tolerance and at most the tool diameter")
	// ErrPocketAllowance reports a finishing allowance out of range: a
	// non-zero allowance must be at least three times the tolerance, so
	// that the clearing rings, each held within Tol inside its own curve,
	// stay more than Tol clear of the wall pass's zone and the wall is
	// formed by the finishing pass alone; and at most the step-over (and
	// the tool diameter less the tolerance), so that the wall pass takes
	// no wider cut than a ring and meets the cleared floor.
	ErrPocketAllowance = errors.New("finishing allowance out of range: zero, or at least three times the tolerance and at most the step-over")
)

// Pocket appends the path of a pocket to dst and returns it. On error dst
// is returned unchanged with an [*OpError] naming the field, or the
// [*SpecError] of an approximation.
//
// # Rings
//
// At each depth level the tool centre follows rings inside the wall: the
// inward parallel curves of the ellipse at the offsets [PocketPlan].Rings,
// from the tool radius plus the allowance inward in equal steps no wider
// than the step-over (nor than Tool − Tol, the widest at which the bands
// two neighbouring rings sweep still meet), the innermost no more than a
// step from the middle. Every ring is held in the zone [Inside] of its
// curve, so no tool-centre position comes nearer the wall than the ring's
// offset.
//
// An inward parallel curve at a distance δ beyond the least radius of
// curvature b²/a folds over itself near the ends of the major axis (a
// swallowtail) and crosses itself on the major axis. Such a ring is
// trimmed there: it is the two arcs of the parallel curve between the
// parameters where it meets the major axis, t* and π − t* above it and
// their mirror images below, which meet in corners on the axis. With the
// curve p(t) − δ·n(t) of the ellipse (a cos t, b sin t) and
// N(t) = √(b² cos² t + a² sin² t), the point on the inward normal at
// distance δ lies on the major axis where N(t) = δa/b, so
//
//	sin² t* = (δ²a²/b² − b²)/(a² − b²),  corner at x = ±(a² − b²)/a · cos t*,
//
// real for b²/a ≤ δ ≤ b. The trimmed ring bounds the points at least δ
// from the wall, which form a convex set. The ellipse and package
// ellipse's parallel curves stop short of the fold, so a ring whose zone
// would reach it (δ + Tol ≥ b²/a) is built here as lines: vertices on the
// parallel curve at δ plus the rounding allowance, each chord as long as
// its sag (found exactly where the tangent is parallel to the chord)
// allows within the zone, corners exact. Other rings use [Approximate]
// with the Setup's geometry.
//
// # The middle
//
// Every inward normal of the ellipse at parameter t meets the major axis
// at x = (a² − b²)/a · cos t, a distance b·N(t)/a from the wall: the
// medial axis is the segment |x| ≤ a − b²/a of the major axis, between the
// centres of curvature of its ends. After the entry each level is
// finished along it (the spine pass), trimmed where the tool would come
// within its radius plus Tol/2 of the wall, so that what the innermost
// rings leave around it is cut.
//
// # Entry, links and order
//
// The path starts at SafeZ above the entry point and feeds down to Z0.
// Each level is entered down a ramp along the spine, zig-zagging at no
// more than RampAngle, where the spine is at least a tool diameter long;
// otherwise down a helix about the centre (radius half the tool, at most
// what keeps Tol/2 clear of the wall), finished by a whole turn at the
// level. Then come the spine pass and the rings from the innermost out,
// each starting at the end of the major axis where the last pass ended,
// joined by short cutting moves (Role [Link]) along the major axis; the
// next level is entered from where the outermost ring ended, by a link
// along the cleared major axis. No link leaves the points at least a tool
// radius from the wall, which are convex, so the tool never retracts
// inside the pocket. After the rings of the last level the wall pass runs
// once round the inward parallel curve at the tool radius, held in its
// zone [Inside] (trimmed as above when that offset reaches the fold, where
// the tool cannot reach into the ends of the ellipse), and the path ends
// with a Travel move up to SafeZ (Role [Retract]).
//
// Rings, the spine pass and the wall pass have Role [Contour], the ramps
// and helices Role [Ramp]; the wall pass is the last run of Contour
// segments before the retract, see [PocketWall].
func Pocket(dst Path, s PocketSpec) (Path, error) {
	p, err := s.plan()
	if err != nil {
		return dst, err
	}
	n0 := len(dst)
	out, err := p.build(dst)
	if err != nil {
		return out[:n0], err
	}
	return out, nil
}

// PocketWall returns the wall pass of a path made by [Pocket]: the last
// run of Contour segments before the final retract. It returns nil when
// the path does not end that way.
func PocketWall(p Path) Path {
	n := len(p)
	if n == 0 || p[n-1].Role != Retract {
		return nil
	}
	i := n - 1
	for i > 0 && p[i-1].Role == Contour && p[i-1].Motion == Cut {
		i--
	}
	if i == n-1 {
		return nil
	}
	return p[i : n-1]
}
