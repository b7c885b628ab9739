package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// expectProfile is what a ProfileSpec promises, worked out from the spec
// and the documentation alone.
type expectProfile struct {
	side   Side
	r      float64 // tool radius or half the kerf
	curve  ellipse.Parallel
	zone   Zone
	cw     bool
	passes int
	tabTop float64
	cutZ   float64 // the height below which (router, plotter) the tool cuts
}

func expectFor(t opsTB, s ProfileSpec) expectProfile {
	t.Helper()
	x := expectProfile{side: s.Side, tabTop: math.Inf(-1)}
	if x.side == SideDefault {
		x.side = SideOutside
		if s.Machine == Plotter {
			x.side = SideOn
		}
	}
	w := s.Tool
	if s.Machine == Laser {
		w = s.Kerf
	}
	x.r = w / 2
	d := 0.0
	switch x.side {
	case SideOutside:
		d, x.zone = x.r, Outside
	case SideInside:
		d, x.zone = -x.r, Inside
	default:
		x.zone = Band
	}
	c, err := s.Ellipse.Parallel(d)
	if err != nil {
		t.Fatalf("parallel curve: %v", err)
	}
	x.curve = c
	// Climb with a clockwise spindle: clockwise outside (and on the
	// line), counter-clockwise inside; conventional the other way.
	x.cw = (x.side != SideInside) == (s.Direction == Climb)
	switch s.Machine {
	case Router:
		// The fewest equal passes none deeper than StepDown.
		x.passes = 1
		for s.Depth/float64(x.passes) > s.StepDown*(1+1e-9) {
			x.passes++
		}
		if s.Tabs > 0 {
			x.tabTop = -s.Depth + s.TabHeight
		}
		x.cutZ = 0
	case Laser:
		x.passes = max(1, s.Passes)
		x.cutZ = math.Inf(1)
	default:
		x.passes = 1
		x.cutZ = s.PenDown + 1e-12
	}
	return x
}

// cuts reports whether segment g removes material (or draws).
func (x *expectProfile) cuts(g Segment) bool {
	if g.Motion != Cut {
		return false
	}
	return math.Min(g.Start.Z, g.End.Z) < x.cutZ
}

// checkProfile applies every promise of a profile to its path.
func checkProfile(t opsTB, s ProfileSpec, p Path) {
	t.Helper()
	if len(p) == 0 {
		t.Fatalf("empty path")
	}
	x := expectFor(t, s)
	e := s.Ellipse
	scale := e.SemiMajor() + x.r
	slack := 1e-9 * scale
	checkContinuous(t, p)
	checkTravels(t, s.Setup, p)

	// Never on the part side: every point that cuts is at least r from
	// the part, on the waste side (exact signed distance, sampled and
	// refined). On the line: every contour point within the band.
	part := e.Curve()
	for i, g := range p {
		if !x.cuts(g) || !movesXY(g) {
			continue
		}
		lo, hi := deviationRange(part, g)
		switch x.side {
		case SideOutside:
			if lo < x.r-slack {
				t.Errorf("segment %d (%v, role %d) comes to %g of the part, inside the tool radius %g", i, g.Kind, g.Role, lo, x.r)
			}
		case SideInside:
			if hi > -x.r+slack {
				t.Errorf("segment %d (%v, role %d) comes to %g of the hole's edge, inside the tool radius %g", i, g.Kind, g.Role, -hi, x.r)
			}
		default:
			if (g.Role == Contour || g.Role == Tab || g.Role == Ramp) && (lo < -s.Tol-slack || hi > s.Tol+slack) {
				t.Errorf("segment %d leaves the band: %g..%g, tol %g", i, lo, hi, s.Tol)
			}
		}
	}

	// The contour within the zone of the tool-centre curve, in the
	// direction of the cut.
	zlo, zhi := x.zone.Limits(s.Tol)
	var contour []Segment
	turn := 0.0
	for i, g := range p {
		if g.Motion != Cut || !movesXY(g) || (g.Role != Contour && g.Role != Tab && g.Role != Ramp) {
			continue
		}
		contour = append(contour, g)
		lo, hi := deviationRange(x.curve, g)
		if lo < zlo-slack || hi > zhi+slack {
			t.Errorf("contour segment %d deviates %g..%g from the tool-centre curve, outside the %v zone [%g, %g]", i, lo, hi, x.zone, zlo, zhi)
		}
		d := signedFootTurn(e, g)
		turn += d
		if (d < 0) != x.cw {
			t.Errorf("contour segment %d runs the wrong way (clockwise %v wanted)", i, x.cw)
			break
		}
	}
	// Passes times round (ramps add their length once per pass).
	if laps := math.Abs(turn) / (2 * math.Pi); laps < float64(x.passes)-1e-6 || laps > float64(x.passes)*2+1e-6 {
		t.Errorf("the contour goes %.6f times round for %d passes", laps, x.passes)
	}

	// Links: only those back to the start of the lead-in between router
	// passes; any other would be a join the approximation left open.
	links := 0
	for _, g := range p {
		if g.Role == Link && g.Motion == Cut {
			links++
		}
	}
	wantLinks := 0
	if s.Machine == Router && s.RampAngle == 0 && s.RampLength == 0 && hasLeads(p) {
		wantLinks = x.passes - 1
	}
	if links != wantLinks {
		t.Errorf("%d cutting links, want %d", links, wantLinks)
	}

	checkLeads(t, s, &x, p)
	switch s.Machine {
	case Router:
		checkDepths(t, s, &x, p)
		checkFinalCoverage(t, s, &x, p, -s.Depth)
	case Laser:
		for i, g := range p {
			if g.Start.Z != s.FocusZ || g.End.Z != s.FocusZ {
				t.Errorf("laser segment %d leaves the focus height %g: %g..%g", i, s.FocusZ, g.Start.Z, g.End.Z)
			}
		}
		checkFinalCoverage(t, s, &x, p, s.FocusZ)
	default:
		checkFinalCoverage(t, s, &x, p, s.PenDown)
	}
}

// checkLeads: every lead is a quarter circle on the waste side, tangent to
// the cut where it meets the contour.
func checkLeads(t opsTB, s ProfileSpec, x *expectProfile, p Path) {
	t.Helper()
	e := s.Ellipse
	slack := 1e-9 * (e.SemiMajor() + x.r)
	// Whether leads are due: asked for, or by default (not on the line)
	// with the default radius, reduced to fit an inside cut, at least Tol;
	// near that threshold either answer is fine.
	wantLead, sure := s.LeadRadius > 0, true
	if !s.NoLead && s.LeadRadius == 0 && x.side != SideOn {
		def := s.Tool
		if s.Machine == Laser {
			def = 10 * s.Kerf
		}
		if x.side == SideInside {
			def = math.Min(def, e.MinRadiusOfCurvature()-x.r-s.Tol)
		}
		wantLead = def >= s.Tol
		sure = math.Abs(def-s.Tol) > 0.02*s.Tol
	}
	leads := 0
	for i, g := range p {
		if g.Role != LeadIn && g.Role != LeadOut {
			continue
		}
		leads++
		if g.Kind != Arc || g.Motion != Cut {
			t.Errorf("lead %d is a %v %v move", i, g.Kind, g.Motion)
			continue
		}
		if sw := math.Abs(g.Sweep()); math.Abs(sw-math.Pi/2) > 1e-6 {
			t.Errorf("lead %d sweeps %g rad, not a quarter turn", i, sw)
		}
		if s.LeadRadius > 0 && math.Abs(g.Radius-s.LeadRadius) > slack {
			t.Errorf("lead %d has radius %g, asked for %g", i, g.Radius, s.LeadRadius)
		}
		lo, hi := deviationRange(e.Curve(), g)
		switch x.side {
		case SideInside:
			if hi > -x.r+slack {
				t.Errorf("lead %d reaches %g from the hole's edge, inside the tool radius %g", i, -hi, x.r)
			}
		case SideOn:
			// No waste side: the leads go outward, starting within the band.
			if lo < -s.Tol-slack {
				t.Errorf("lead %d reaches %g inside the line", i, -lo)
			}
		default:
			if lo < x.r-slack {
				t.Errorf("lead %d reaches %g from the part, inside the tool radius %g", i, lo, x.r)
			}
		}
		// Tangent where it meets the contour: the arc's direction there
		// is the curve's tangent in the direction of the cut.
		q := g.End
		if g.Role == LeadOut {
			q = g.Start
		}
		tq := footParam(e, q)
		tg := e.Tangent(tq)
		sg := 1.0
		if x.cw {
			sg = -1
		}
		rx, ry := q.X-g.CenterX, q.Y-g.CenterY
		dx, dy := -ry/g.Radius, rx/g.Radius
		if g.Clockwise {
			dx, dy = -dx, -dy
		}
		if math.Abs(dx-sg*tg.X) > 1e-6 || math.Abs(dy-sg*tg.Y) > 1e-6 {
			t.Errorf("lead %d meets the contour in direction (%g, %g), the cut runs (%g, %g)", i, dx, dy, sg*tg.X, sg*tg.Y)
		}
	}
	if wantLead && sure && leads == 0 {
		t.Errorf("no lead arcs")
	}
	if !wantLead && sure && leads > 0 {
		t.Errorf("%d lead arcs where none were asked for", leads)
	}
}

// checkDepths: equal passes none deeper than StepDown, the last exactly at
// −Depth; tabs exactly at their height; nothing deeper than −Depth.
func checkDepths(t opsTB, s ProfileSpec, x *expectProfile, p Path) {
	t.Helper()
	levels := map[float64]bool{}
	for i, g := range p {
		if math.Min(g.Start.Z, g.End.Z) < -s.Depth {
			t.Errorf("segment %d goes below the depth: Z %g", i, math.Min(g.Start.Z, g.End.Z))
		}
		if !movesXY(g) || g.Motion != Cut || g.Start.Z != g.End.Z {
			continue
		}
		switch g.Role {
		case Contour:
			levels[g.Start.Z] = true
		case Tab:
			if g.Start.Z != x.tabTop {
				t.Errorf("tab segment %d at Z %g, want %g", i, g.Start.Z, x.tabTop)
			}
		}
	}
	step := s.Depth / float64(x.passes)
	for k := 1; k <= x.passes; k++ {
		z := -float64(k) * step
		found := false
		for l := range levels {
			if math.Abs(l-z) <= 1e-9*s.Depth {
				found = true
			}
		}
		// A pass entirely over tabs has no contour at its level; that
		// needs tabs covering everything, which the spec refuses.
		if !found {
			t.Errorf("no contour at pass %d's level %g (levels %v)", k, z, levels)
		}
	}
	if len(levels) != x.passes {
		t.Errorf("%d contour levels for %d passes: %v", len(levels), x.passes, levels)
	}
	if !levels[-s.Depth] {
		t.Errorf("no contour exactly at the depth %g", -s.Depth)
	}
	if step > s.StepDown*(1+1e-9) {
		t.Errorf("passes step %g, deeper than the step-down %g", step, s.StepDown)
	}
}

// checkFinalCoverage: the final level cuts the whole tool-centre curve
// except at the tabs, which are Tabs stretches TabWidth + Tool long at
// equal arc length.
func checkFinalCoverage(t opsTB, s ProfileSpec, x *expectProfile, p Path, z float64) {
	t.Helper()
	e := s.Ellipse
	var final, tabs []Segment
	for _, g := range p {
		if g.Motion != Cut || !movesXY(g) || g.Start.Z != g.End.Z {
			continue
		}
		switch {
		case g.Role == Tab && g.Start.Z == x.tabTop:
			tabs = append(tabs, g)
		case (g.Role == Contour || g.Role == Ramp) && g.Start.Z == z:
			final = append(final, g)
		}
	}
	eps := 1e-9
	fu := mergeSpans(footSpans(nil, e, final), eps)
	tu := mergeSpans(footSpans(nil, e, tabs), eps)
	// Tab stretches at the final level are only those next to it: the
	// raised stretches of earlier passes lie over the same tabs.
	all := mergeSpans(append(footSpans(nil, e, final), footSpans(nil, e, tabs)...), eps)
	if got := covered(all); math.Abs(got-2*math.Pi) > 1e-7 {
		t.Errorf("the final level and the tabs cover %g of 2π rad of the outline (%d gaps)", got, len(all)-1)
	}
	if ov := overlap(fu, tu); ov > 1e-7 {
		t.Errorf("the final level cuts %g rad through the tabs", ov)
	}
	if len(tu) != s.Tabs {
		t.Errorf("%d tabs, want %d", len(tu), s.Tabs)
		return
	}
	if s.Tabs == 0 {
		return
	}
	c := x.curve
	l := c.Length()
	var centres []float64
	for _, sp := range tu {
		w := c.ArcLength(sp.a, sp.b)
		if want := s.TabWidth + s.Tool; math.Abs(w-want) > 1e-6*l {
			t.Errorf("tab stretch %g long along the tool-centre path, want TabWidth + Tool = %g", w, want)
		}
		m := c.ArcLength(0, sp.a) + w/2
		centres = append(centres, math.Mod(m+l, l))
	}
	for i := range centres {
		gap := math.Mod(centres[(i+1)%len(centres)]-centres[i]+2*l, l)
		if len(centres) == 1 {
			gap = l
		}
		if math.Abs(gap-l/float64(s.Tabs)) > 1e-6*l {
			t.Errorf("tabs %d and %d are %g apart along the path, want %g", i, i+1, gap, l/float64(s.Tabs))
		}
	}
}

// hasLeads reports whether p has lead arcs.
func hasLeads(p Path) bool {
	for _, g := range p {
		if g.Role == LeadIn {
			return true
		}
	}
	return false
}
