package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// ProfileSpec describes a profile cut: the tool runs around an ellipse,
// offset to the waste side, to cut a part out (SideOutside), cut a hole
// (SideInside) or follow the line itself (SideOn).
//
// Lengths are in one unit, whatever the caller uses; angles in radians.
// A field the machine does not use must be left at zero: it is refused,
// not ignored.
type ProfileSpec struct {
	Setup
	// Ellipse is the outline of the part (SideOutside), of the hole
	// (SideInside) or the line to follow (SideOn).
	Ellipse ellipse.Ellipse
	// Side is the side of the waste (SideDefault: outside for a router
	// or laser, on for a plotter).
	Side Side
	// Direction is climb (the default) or conventional; see [Direction].
	Direction Direction
	// Start is the ellipse parameter (radians) where the cut meets the
	// outline; 0, the default, is the end of the ellipse's own +x
	// semi-axis.
	Start float64

	// Tool is the cutter diameter of a router (greater than zero) or the
	// pen width of a plotter (zero or more; with SideOn it does not move
	// the path). The tool centre runs Tool/2 from the outline on the
	// waste side. A laser uses Kerf instead.
	Tool float64
	// Kerf is the width a laser burns away (greater than zero); the beam
	// runs Kerf/2 from the outline on the waste side. Common practice for
	// a CO2 laser: 0.1 to 0.3 mm.
	Kerf float64

	// Depth is the router's depth of cut below Z0 (greater than zero).
	// StepDown is the deepest a pass may go below the one before
	// (greater than zero); the passes are equal, see [DepthPasses].
	// Common practice in wood: a step-down about half the tool diameter.
	Depth, StepDown float64
	// Passes is the number of laser passes, all at FocusZ (0 means 1).
	Passes int

	// Tabs is the number of holding tabs (router only), centred at equal
	// arc length along the tool-centre path (see [Profile]). TabWidth is
	// the width of material each tab leaves, measured along the
	// tool-centre path, and TabHeight its height above the bottom of the
	// cut (less than Depth). Common practice, no published source: tabs 3
	// to 10 mm wide leaving about a third of the stock.
	Tabs                int
	TabWidth, TabHeight float64

	// LeadRadius is the radius of the tangent lead-in and lead-out arcs
	// on the waste side. Zero chooses the default: the tool diameter for
	// a router, ten kerfs for a laser, the pen width for a plotter (a
	// plotter's SideOn, and every SideOn, has no lead by default),
	// reduced to fit an inside cut; a default below Tol means no lead.
	// An explicit radius must be at least Tol. NoLead leaves the leads
	// out.
	LeadRadius float64
	NoLead     bool

	// RampAngle (radians, in (0, π/2)) or RampLength (greater than zero),
	// but not both, asks for a ramped entry along the path instead of a
	// straight plunge (router only): each pass descends from the level
	// above along the tool-centre path, over RampLength or over the
	// length at which the slope is RampAngle.
	RampAngle, RampLength float64
}

// Profile appends the path of a profile cut to dst and returns it. On
// error dst is returned unchanged (its length; the tail past it may have
// been written) with an [*OpError] naming the field, or the [*SpecError]
// of the approximation.
//
// # Tool-centre path
//
// The tool centre follows the parallel curve of the ellipse at the tool
// radius r (Tool/2, or Kerf/2 for a laser) on the waste side, approximated
// within Tol in the zone that keeps it off the part: [Outside] of the
// outward parallel curve for SideOutside, [Inside] of the inward one for
// SideInside, and the [Band] about the ellipse for SideOn. So for
// SideOutside and SideInside every cutting point, leads and links
// included, lies at least r from the part, on the waste side.
//
// # Router
//
// The path starts with a Travel line at SafeZ to above the entry point
// (the start of the lead-in arc, or the contour's entry point when there
// is no lead); on an empty dst it starts where it ends, since the
// machine's position before is unknown. There are n passes of equal step
// depth/n (see [DepthPasses]), the last exactly at −Depth.
//
// Without a ramp each pass feeds straight down at the entry point (a Cut
// line with Role [Plunge]), runs the lead-in arc, the whole loop of the
// contour and the lead-out arc, then a straight Cut line (Role [Link])
// through the waste back to the start of the lead-in, where the next pass
// plunges; with no leads the next pass plunges where the loop closed.
//
// With a ramp the tool feeds down to Z0 at the entry point, runs the
// lead-in (if any) at Z0, and then descends continuously: each pass ramps
// down from the level above along the contour (Role [Ramp]) and completes
// a whole loop at its level from the end of the ramp, so the next ramp
// starts where the loop ended; the lead-out leaves from the end of the
// last loop.
//
// Either way the path ends with a Travel line straight up to SafeZ (Role
// [Retract]).
//
// Tabs are centred at the odd points of the equal arc-length division of
// the tool-centre curve into 2·Tabs parts ([ellipse.NewDivider], which
// counts from the curve's parameter 0 counter-clockwise): they sit at
// equal arc length, symmetric about the ellipse's own x axis (and about
// both axes when Tabs is even), and the default entry point (Start 0)
// lies midway between two of them.
// Over each tab the tool-centre path is raised to Z = −Depth + TabHeight
// along a stretch TabWidth + Tool long, so that the bridge left between
// the two ends is TabWidth wide along the tool-centre path; at each end
// the tool moves straight up or down in Z (Cut lines with Role [Tab]; the
// raised stretch has Role Tab too). Every pass that would go below the top
// of the tabs is raised over them, not only the last.
//
// # Laser
//
// Every segment is at Z = FocusZ. There are Passes passes; each runs the
// lead-in, the loop and the lead-out, and a Travel move returns to the
// start of the lead-in for the next pass (with no leads the passes follow
// each other without a break). The writer switches the beam on for the
// Cut moves and off for every Travel move.
//
// # Plotter
//
// The pen travels at PenUp to the entry point, is lowered to PenDown by a
// Cut line (Role Plunge), draws the lead-in, the loop and the lead-out at
// PenDown, and is lifted to PenUp by a Travel line (Role Retract).
//
// # Refusals
//
// Besides fields out of range or not used by the machine: an inside cut
// with a tool (or kerf) of at least [MaxInsideTool], 2·(b²/a − Tol);
// tabs at least as tall as the depth, or so wide for their number that
// they would meet (the limit is the widest TabWidth); an explicit lead
// radius that does not fit an inside cut (b²/a − r − Tol) or is below
// Tol; a ramp longer than one turn; a band (SideOn) reaching past b²/a;
// and a path that would pass [MaxSegments].
func Profile(dst Path, s ProfileSpec) (Path, error) {
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

// profilePlan is a validated ProfileSpec with everything derived from it.
type profilePlan struct {
	s        ProfileSpec
	side     Side
	cw       bool             // the cut runs clockwise
	radius   float64          // offset of the tool-centre path (signed: + outward)
	curve    ellipse.Parallel // the tool-centre curve
	zone     Zone
	length   float64 // length of the tool-centre curve
	s0       float64 // arc length of the entry point from t = 0
	passes   int
	step     float64 // depth of each pass
	lead     float64 // lead radius, 0 for none
	rampLen  float64 // ramp length, 0 for a plunge
	tabTop   float64 // Z of the top of the tabs
	tabHalf  float64 // half the raised length of a tab
	tabs     []float64
	widthCut float64   // the diameter of what cuts: tool, kerf or pen
	scratch  []float64 // breakpoints of a walk
	buf      Path      // the contour of a pass, before the leads go round it
	loopSize int       // a generous estimate of the segments of one loop
}

// plan validates s and derives the plan.
func (s ProfileSpec) plan() (*profilePlan, error) {
	if err := s.Setup.check(); err != nil {
		return nil, err
	}
	e := s.Ellipse
	if !(e.SemiMajor() > 0) {
		return nil, opErr("Ellipse", 0, ErrNotPositive)
	}
	if err := checkFinite("Start", s.Start); err != nil {
		return nil, err
	}
	p := &profilePlan{s: s, side: s.Side}
	if p.side > SideOn {
		return nil, opErr("Side", float64(s.Side), ErrChoice)
	}
	if s.Direction > Conventional {
		return nil, opErr("Direction", float64(s.Direction), ErrChoice)
	}
	if p.side == SideDefault {
		p.side = SideOutside
		if s.Machine == Plotter {
			p.side = SideOn
		}
	}
	if err := s.checkMachineFields(); err != nil {
		return nil, err
	}
	p.widthCut = s.Tool
	if s.Machine == Laser {
		p.widthCut = s.Kerf
	}
	width := "Tool"
	if s.Machine == Laser {
		width = "Kerf"
	}
	r := p.widthCut / 2
	switch p.side {
	case SideOutside:
		p.radius, p.zone = r, Outside
	case SideInside:
		if lim := MaxInsideTool(e, s.Tol); !(p.widthCut < lim) {
			return nil, opLimit(width, p.widthCut, math.Max(lim, 0), ErrToolTooLarge)
		}
		p.radius, p.zone = -r, Inside
	default:
		// The band reaches Tol inside the ellipse, which must not pass
		// the fold of its inward parallel curves.
		if lim := e.MinRadiusOfCurvature(); !(s.Tol < lim) {
			return nil, opLimit("Tol", s.Tol, lim, ErrOffset)
		}
		p.zone = Band
	}
	c, err := e.Parallel(p.radius)
	if err != nil {
		return nil, &OpError{Field: width, Value: p.widthCut, Err: err}
	}
	p.curve = c
	p.cw = clockwise(p.side, s.Direction)
	p.length = c.Length()
	p.s0 = c.ArcLength(0, s.Start)
	if err := p.planDepth(); err != nil {
		return nil, err
	}
	if err := p.planLead(); err != nil {
		return nil, err
	}
	if err := p.planTabs(); err != nil {
		return nil, err
	}
	if err := p.checkSize(); err != nil {
		return nil, err
	}
	return p, nil
}
