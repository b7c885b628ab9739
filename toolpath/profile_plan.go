package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// checkMachineFields refuses fields the machine does not use and checks
// the ranges of those it does.
func (s *ProfileSpec) checkMachineFields() error {
	if err := checkNonNegative("LeadRadius", s.LeadRadius); err != nil {
		return err
	}
	if s.NoLead && s.LeadRadius != 0 {
		return opErr("LeadRadius", s.LeadRadius, ErrBoth)
	}
	for _, f := range []struct {
		name string
		v    float64
	}{{"Tool", s.Tool}, {"Kerf", s.Kerf}, {"Depth", s.Depth}, {"StepDown", s.StepDown},
		{"TabWidth", s.TabWidth}, {"TabHeight", s.TabHeight}, {"RampAngle", s.RampAngle}, {"RampLength", s.RampLength}} {
		if err := checkNonNegative(f.name, f.v); err != nil {
			return err
		}
	}
	if s.Passes < 0 || s.Passes > MaxCount {
		return opLimit("Passes", float64(s.Passes), MaxCount, ErrTooMany)
	}
	if s.Tabs < 0 || s.Tabs > MaxCount {
		return opLimit("Tabs", float64(s.Tabs), MaxCount, ErrTooMany)
	}
	switch s.Machine {
	case Router:
		if err := firstErr(checkPositive("Tool", s.Tool), checkPositive("Depth", s.Depth),
			checkPositive("StepDown", s.StepDown), checkUnused("Kerf", s.Kerf), checkUnused("Passes", float64(s.Passes))); err != nil {
			return err
		}
		if s.RampAngle != 0 && s.RampLength != 0 {
			return opErr("RampLength", s.RampLength, ErrBoth)
		}
		if s.RampAngle != 0 && !(s.RampAngle < math.Pi/2) {
			return opLimit("RampAngle", s.RampAngle, math.Pi/2, ErrChoice)
		}
		if s.Tabs > 0 {
			if err := firstErr(checkPositive("TabWidth", s.TabWidth), checkPositive("TabHeight", s.TabHeight)); err != nil {
				return err
			}
			if !(s.TabHeight < s.Depth) {
				return opLimit("TabHeight", s.TabHeight, s.Depth, ErrTabTooTall)
			}
		}
		return nil
	case Laser:
		return firstErr(checkPositive("Kerf", s.Kerf), checkUnused("Tool", s.Tool), s.noDepth())
	default:
		return firstErr(checkUnused("Kerf", s.Kerf), s.noDepth())
	}
}

// noDepth refuses the router-only fields, and Passes for a plotter.
func (s *ProfileSpec) noDepth() error {
	passes := 0.0
	if s.Machine == Plotter {
		passes = float64(s.Passes)
	}
	return firstErr(checkUnused("Depth", s.Depth), checkUnused("StepDown", s.StepDown),
		checkUnused("Tabs", float64(s.Tabs)), checkUnused("TabWidth", s.TabWidth), checkUnused("TabHeight", s.TabHeight),
		checkUnused("RampAngle", s.RampAngle), checkUnused("RampLength", s.RampLength),
		checkUnused("Passes", passes))
}

// planDepth derives the passes and the ramp.
func (p *profilePlan) planDepth() error {
	s := &p.s
	p.tabTop = math.Inf(-1)
	switch s.Machine {
	case Laser:
		p.passes = max(1, s.Passes)
		return nil
	case Plotter:
		p.passes = 1
		return nil
	}
	p.passes, p.step = DepthPasses(s.Depth, s.StepDown)
	if p.passes > MaxCount {
		return opLimit("StepDown", s.StepDown, s.Depth/MaxCount, ErrTooMany)
	}
	switch {
	case s.RampLength > 0:
		if !(s.RampLength <= p.length) {
			return opLimit("RampLength", s.RampLength, p.length, ErrRampTooLong)
		}
		p.rampLen = s.RampLength
	case s.RampAngle > 0:
		l := p.step / math.Tan(s.RampAngle)
		if !(l <= p.length) {
			return opLimit("RampAngle", s.RampAngle, math.Atan(p.step/p.length), ErrRampTooLong)
		}
		p.rampLen = l
	}
	return nil
}

// planLead chooses the lead radius and checks that it fits.
func (p *profilePlan) planLead() error {
	s := &p.s
	if s.NoLead {
		return nil
	}
	r := s.LeadRadius
	explicit := r > 0
	if !explicit {
		if p.side == SideOn {
			return nil
		}
		switch s.Machine {
		case Laser:
			r = 10 * s.Kerf
		default:
			r = s.Tool
		}
	}
	if p.side == SideInside {
		// A circle of radius R touching a closed convex curve from inside
		// lies inside it when R is at most the curve's least radius of
		// curvature (Blaschke's rolling theorem). The path's start lies on
		// a parallel curve at most Tol inside the tool-centre curve, whose
		// least radius of curvature is b²/a − r − Tol.
		lim := p.s.Ellipse.MinRadiusOfCurvature() + p.radius - s.Tol
		if explicit && !(r <= lim) {
			return opLimit("LeadRadius", r, math.Max(lim, 0), ErrLeadTooLarge)
		}
		if !explicit {
			r = math.Min(r, 0.99*lim)
		}
	}
	if explicit && r < s.Tol {
		return opLimit("LeadRadius", r, s.Tol, ErrLeadTooSmall)
	}
	if r >= s.Tol {
		p.lead = r
	}
	return nil
}

// planTabs places the tabs: the odd points of the equal arc-length
// division of the tool-centre curve into 2·Tabs parts.
func (p *profilePlan) planTabs() error {
	s := &p.s
	if s.Tabs == 0 {
		return nil
	}
	raised := s.TabWidth + s.Tool
	if lim := p.length/float64(s.Tabs) - s.Tool; !(s.TabWidth < lim) {
		return opLimit("TabWidth", s.TabWidth, math.Max(lim, 0), ErrTabsOverlap)
	}
	d, err := ellipse.NewDivider(p.curve, 2*s.Tabs)
	if err != nil {
		return &OpError{Field: "Tabs", Value: float64(s.Tabs), Err: err}
	}
	p.tabs = make([]float64, 0, s.Tabs)
	for i := 0; ; i++ {
		pt, ok := d.Next()
		if !ok {
			break
		}
		if i%2 == 1 {
			p.tabs = append(p.tabs, pt.S)
		}
	}
	p.tabHalf = raised / 2
	p.tabTop = -s.Depth + s.TabHeight
	return nil
}

// checkSize refuses a profile whose path would pass MaxSegments, judged
// by twice the asymptotic least segment count of one loop ([LowerBound])
// plus the moves each tab and pass adds, times the passes.
func (p *profilePlan) checkSize() error {
	s := &p.s
	loop := 2*LowerBound(p.curve, s.Geometry, p.zone, s.Tol, 0, 0) + 8*float64(len(p.tabs)) + 8
	p.loopSize = int(loop)
	if total := loop * float64(p.passes); total > MaxSegments {
		most := math.Max(1, math.Floor(MaxSegments/loop))
		if s.Machine == Laser {
			return opLimit("Passes", float64(s.Passes), most, ErrTooMany)
		}
		if s.Machine == Router && p.passes > 1 {
			return opLimit("StepDown", s.StepDown, s.Depth/most, ErrTooMany)
		}
		return &SpecError{Field: "Tol", Value: s.Tol, Limit: total, Err: ErrTooFine}
	}
	return nil
}
