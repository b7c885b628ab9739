package toolpath

import "math"

// PocketPlan is what a [PocketSpec] works out to before any path is made:
// the depth levels, the rings, the middle and the entry. Offsets are
// distances inward from the wall.
type PocketPlan struct {
	// Levels are the heights of the depth levels, equal steps down to
	// exactly −Depth (see [DepthPasses]).
	Levels []float64
	// Rings are the offsets of the clearing rings, outermost first: the
	// tool radius plus the allowance, then equal steps of Spacing.
	// Empty when the tool and allowance leave no room for a ring (the
	// spine pass and the wall pass then clear the pocket).
	Rings []float64
	// Spacing is the step between neighbouring rings (0 with one ring).
	Spacing float64
	// Wall is the offset of the wall pass: the tool radius.
	Wall float64
	// Fold is b²/a, the least radius of curvature: rings at or beyond
	// Fold − Tol are trimmed (see [Pocket]).
	Fold float64
	// Spine is the half length of the spine pass along the major axis
	// (0 for a circle, where the middle is the centre).
	Spine float64
	// HelixRadius is the radius of the helical entry, or 0 when each
	// level is entered down a ramp along the spine.
	HelixRadius float64
	// RampAngle is the entry's steepest slope (radians).
	RampAngle float64
}

// PlanPocket validates s and returns its plan.
func PlanPocket(s PocketSpec) (PocketPlan, error) {
	p, err := s.plan()
	if err != nil {
		return PocketPlan{}, err
	}
	return p.PocketPlan, nil
}

// pocketPlan is a validated PocketSpec with everything derived from it.
type pocketPlan struct {
	PocketPlan
	s     PocketSpec
	g     pocketGeom
	cw    bool    // the rings run clockwise
	r     float64 // tool radius
	round float64 // rounding allowance of the written coordinates
	slope float64 // tan of the ramp angle
	ap    Approximator
}

// plan validates s and lays out the pocket.
func (s PocketSpec) plan() (*pocketPlan, error) {
	if err := s.Setup.check(); err != nil {
		return nil, err
	}
	if s.Machine != Router {
		return nil, opErr("Machine", float64(s.Machine), ErrPocketMachine)
	}
	e := s.Ellipse
	if !(e.SemiMajor() > 0) {
		return nil, opErr("Ellipse", 0, ErrNotPositive)
	}
	if s.Direction > Conventional {
		return nil, opErr("Direction", float64(s.Direction), ErrChoice)
	}
	if err := firstErr(checkPositive("Tool", s.Tool), checkPositive("Depth", s.Depth), checkPositive("StepDown", s.StepDown),
		checkPositive("StepOver", s.StepOver), checkNonNegative("Allowance", s.Allowance), checkNonNegative("RampAngle", s.RampAngle)); err != nil {
		return nil, err
	}
	tol := s.Tol
	// The tolerance and decimals are checked as any approximation checks
	// them (the outside zone of the wall never meets the fold).
	if _, err := NewApproximator(Spec{Curve: e.Curve(), Zone: Outside, Tol: tol, Geometry: s.Geometry, Decimals: s.Decimals}); err != nil {
		return nil, err
	}
	g, err := newPocketGeom(e)
	if err != nil {
		return nil, &OpError{Field: "Ellipse", Err: err}
	}
	b := g.b
	if !(s.Tool >= 2*tol) {
		return nil, opLimit("Tool", s.Tool, 2*tol, ErrPocketToolTooSmall)
	}
	if lim := 2*b - 3*tol; !(s.Tool <= lim) {
		return nil, opLimit("Tool", s.Tool, math.Max(lim, 0), ErrPocketToolTooWide)
	}
	if !(s.StepOver <= s.Tool) {
		return nil, opLimit("StepOver", s.StepOver, s.Tool, ErrPocketStepOver)
	}
	if !(s.StepOver >= tol) {
		return nil, opLimit("StepOver", s.StepOver, tol, ErrPocketStepOver)
	}
	if s.Allowance > 0 {
		if !(s.Allowance >= 3*tol) {
			return nil, opLimit("Allowance", s.Allowance, 3*tol, ErrPocketAllowance)
		}
		if lim := math.Min(s.StepOver, s.Tool-tol); !(s.Allowance <= lim) {
			return nil, opLimit("Allowance", s.Allowance, lim, ErrPocketAllowance)
		}
	}
	angle := s.RampAngle
	if angle == 0 {
		angle = PocketRampAngle
	}
	if !(angle < math.Pi/2) {
		return nil, opLimit("RampAngle", s.RampAngle, math.Pi/2, ErrChoice)
	}
	p := &pocketPlan{s: s, g: g, r: s.Tool / 2, cw: clockwise(SideInside, s.Direction), slope: math.Tan(angle)}
	p.RampAngle = angle
	dec := s.Decimals
	if dec == 0 {
		dec = DecimalsFor(tol)
	}
	p.round = RoundingAllowance(dec)
	p.Wall = p.r
	p.Fold = e.MinRadiusOfCurvature()
	if err := p.planLevels(); err != nil {
		return nil, err
	}
	if err := p.planRings(); err != nil {
		return nil, err
	}
	return p, p.planEntry()
}

// planLevels lays out the depth levels.
func (p *pocketPlan) planLevels() error {
	s := &p.s
	n, step := DepthPasses(s.Depth, s.StepDown)
	if n > MaxCount {
		return opLimit("StepDown", s.StepDown, s.Depth/MaxCount, ErrTooMany)
	}
	p.Levels = make([]float64, n)
	for k := range p.Levels {
		p.Levels[k] = -float64(k+1) * step
	}
	p.Levels[n-1] = -s.Depth
	return nil
}

// planRings lays out the rings: the first at the tool radius plus the
// allowance, the innermost at b − h so that no normal's stretch between
// it and the spine is wider than a step h, with h the step-over or, if
// less, Tool − Tol, and equal steps between.
//
// Along the inward normal at t, whose points from the wall to the medial
// axis are at distances 0 to S(t) = b·N(t)/a from the wall (all with the
// same nearest wall point), a ring at offset δ < S(t) crosses the normal
// between δ and δ + Tol and so cuts the stretch [δ + Tol − r, δ + r]; the
// spine cuts [S − r, S] and the wall pass [Tol, 2r]. Neighbours at most
// Tool − Tol apart leave no gap, and where a trimmed ring misses a normal
// the ring outside it and the spine close it the same way.
func (p *pocketPlan) planRings() error {
	s := &p.s
	hmax := math.Min(s.StepOver, s.Tool-s.Tol)
	first := p.r + s.Allowance
	b := p.g.b
	if !(first+p.round < b) {
		return nil
	}
	last := b - hmax
	k := 0
	if last > first {
		k = int(math.Ceil((last-first)/hmax - 1e-9))
	}
	if k >= MaxCount {
		return opLimit("StepOver", s.StepOver, (last-first)/MaxCount, ErrTooMany)
	}
	p.Rings = make([]float64, k+1)
	if k > 0 {
		p.Spacing = (last - first) / float64(k)
	}
	for i := range p.Rings {
		p.Rings[i] = first + float64(i)*p.Spacing
	}
	if k > 0 {
		p.Rings[k] = last
	}
	return nil
}

// planEntry chooses the spine and the entry: a ramp along the spine when
// it is at least a tool diameter long, else a helix about the centre.
func (p *pocketPlan) planEntry() error {
	s := &p.s
	p.Spine = p.g.spineHalf(p.r + s.Tol/2)
	if 2*p.Spine < s.Tool {
		p.HelixRadius = math.Min(math.Max(p.r/2, s.Tol), p.g.b-p.r-s.Tol/2)
	}
	// Bound the legs or turns of each entry.
	run := p.rampRun()
	if p.HelixRadius > 0 {
		run = math.Pi * p.HelixRadius
	}
	n, _ := DepthPasses(s.Depth, s.StepDown)
	if legs := (s.Depth / float64(n)) / (run * p.slope); !(legs <= MaxCount) {
		return opLimit("RampAngle", p.RampAngle, math.Atan(s.Depth/float64(n)/(MaxCount*run)), ErrTooMany)
	}
	return nil
}

// rampRun returns the length of one leg of the zig-zag ramp: the run that
// descends a whole level at the ramp slope, at least a tool diameter and
// at most the whole spine.
func (p *pocketPlan) rampRun() float64 {
	step := -p.Levels[0]
	return math.Min(2*p.Spine, math.Max(p.s.Tool, step/p.slope))
}
