package main

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// This file holds the checks "foci demo" makes on every program it has
// written, read back from its text as a machine would read it.

// Rules of the demo's own pattern checks, beside the conformance rules.
const (
	// ruleHoleCount: not as many holes, marks or dots as asked for.
	ruleHoleCount = "hole-count"
	// ruleHolePosition: a hole farther than the tolerance from its curve.
	ruleHolePosition = "hole-position"
	// ruleHoleSpacing: two neighbouring holes whose distance along the
	// curve differs from an equal share of its length by more than the
	// tolerance.
	ruleHoleSpacing = "hole-spacing"
	// ruleDashCount: not as many dashes as the pattern gives.
	ruleDashCount = "dash-count"
	// ruleDashLength: a dash whose length differs from the pattern's by
	// more than the tolerance.
	ruleDashLength = "dash-length"
)

// demoCheck is what checking one program found.
type demoCheck struct {
	OK bool `json:"ok"`
	// Against says what the program was checked against.
	Against    string           `json:"against"`
	Violations []checkViolation `json:"violations"`
	// MaxDeviation is the largest distance, either way, of a contour or
	// dash move, or of a hole, from the intended curve.
	MaxDeviation float64 `json:"max_deviation"`
}

// checkDemoProgram reads src back and checks it against everything the
// job of p was made for: the conformance rules for the machine (safe
// height, travel, order, arcs) and the geometry rules against the intended
// curve in its zone. A row of holes or a dashed line does not go round its
// curve, so closed-loop and coverage, which are about closed contours, do
// not apply to it; the holes are checked for their number, their distance
// from the curve and their equal spacing along it instead, and the dashes
// for their number and length (the deviation rule holds for them as for a
// contour). It returns the program as read, for the pictures.
func checkDemoProgram(p *demoPart, s demoShape, src []byte) (demoCheck, *conformance.Program, error) {
	prog, err := conformance.Read(src, conformance.ReadOptions{Units: conformance.Millimeters})
	if err != nil {
		return demoCheck{}, nil, err
	}
	box := conformance.Box{MinX: p.travel[0], MinY: p.travel[1], MaxX: p.travel[2], MaxY: p.travel[3]}
	rules := conformance.Rules{Machine: p.machine, SafeZ: p.safeZ, Travel: &box,
		Shape: &conformance.Shape{Curve: s.curve, Zone: s.zone, Tol: s.tol}}
	rep := conformance.CheckReport(prog, rules)
	c := demoCheck{Against: s.describe(p), Violations: []checkViolation{}, MaxDeviation: rep.Summary.MaxDeviation}
	for _, v := range rep.Violations {
		if s.kind != demoContour && (v.Rule == conformance.RuleClosedLoop || v.Rule == conformance.RuleCoverage) {
			continue
		}
		c.Violations = append(c.Violations, checkViolation{v.Rule, v.Line, v.Message})
	}
	switch s.kind {
	case demoHoles:
		var vs []checkViolation
		vs, c.MaxDeviation = checkHoles(demoHolesOf(prog, p.machine), s)
		c.Violations = append(c.Violations, vs...)
	case demoDashes:
		c.Violations = append(c.Violations, checkDashes(demoDashesOf(prog, p.machine), s)...)
	}
	c.OK = len(c.Violations) == 0
	return c, prog, nil
}

// describe says in a few words what a program is checked against.
func (s demoShape) describe(p *demoPart) string {
	el := s.curve.Ellipse()
	what := map[demoKind]string{demoContour: "contour", demoHoles: fmt.Sprintf("%d holes", s.count), demoDashes: fmt.Sprintf("%d dashes", s.count)}[s.kind]
	t := fmt.Sprintf("%s on the %s x %s mm ellipse", what, fmtNum(2*el.SemiX()), fmtNum(2*el.SemiY()))
	if d := s.curve.Offset(); d != 0 {
		t = fmt.Sprintf("%s on the parallel curve %s mm from the %s x %s mm ellipse", what, fmtNum(d), fmtNum(2*el.SemiX()), fmtNum(2*el.SemiY()))
	}
	t += ", " + zoneText(s.zone, s.tol, "mm")
	if p.safeZ > 0 {
		t += fmt.Sprintf("; rapids at Z %s or above", fmtNum(p.safeZ))
	}
	return t + fmt.Sprintf("; travel X %s to %s, Y %s to %s", fmtNum(p.travel[0]), fmtNum(p.travel[2]), fmtNum(p.travel[1]), fmtNum(p.travel[3]))
}

// demoHole is a place where a program cuts without moving in XY.
type demoHole struct {
	x, y float64
	line int
}

// demoHolesOf returns the holes, marks or dots of a program as read back:
// the places where it cuts without moving in XY (a feed straight down into
// the stock or onto the paper, or a pause with the beam on), in program
// order, each once however many pecks it takes, with the line where it
// starts.
func demoHolesOf(prog *conformance.Program, m toolpath.Machine) []demoHole {
	var holes []demoHole
	for i, s := range prog.Path {
		mv := prog.Moves[i]
		var hole bool
		switch {
		case s.Kind == toolpath.Dwell:
			hole = m == toolpath.Laser && mv.Spindle != conformance.SpindleOff && mv.Speed > 0
		case s.Motion == toolpath.Cut && s.Kind == toolpath.Line && s.Start.X == s.End.X && s.Start.Y == s.End.Y && s.End.Z < s.Start.Z:
			hole = s.End.Z < 0 || (m == toolpath.Plotter && s.End.Z <= 0)
		}
		if !hole {
			continue
		}
		if n := len(holes); n > 0 && holes[n-1].x == s.Start.X && holes[n-1].y == s.Start.Y {
			continue
		}
		holes = append(holes, demoHole{s.Start.X, s.Start.Y, mv.Line})
	}
	return holes
}

// checkHoles checks the number of holes, the distance of each from the
// curve and the spacing of neighbours along it, and returns the largest
// distance.
func checkHoles(holes []demoHole, s demoShape) ([]checkViolation, float64) {
	var vs []checkViolation
	if len(holes) != s.count {
		vs = append(vs, checkViolation{ruleHoleCount, 0, fmt.Sprintf("the program makes %d holes; want %d", len(holes), s.count)})
	}
	el := s.curve.Ellipse()
	type foot struct {
		t    float64
		line int
	}
	feet := make([]foot, 0, len(holes))
	worst := 0.0
	for _, h := range holes {
		t, d := el.Nearest(ellipse.Point{X: h.x, Y: h.y})
		dev := d - s.curve.Offset()
		worst = math.Max(worst, math.Abs(dev))
		if !(math.Abs(dev) <= s.tol) {
			vs = append(vs, checkViolation{ruleHolePosition, h.line, fmt.Sprintf("the hole at X%s Y%s is %.4g mm from the curve; allowed %s", fmtNum(h.x), fmtNum(h.y), dev, zoneText(s.zone, s.tol, "mm"))})
		}
		feet = append(feet, foot{math.Mod(math.Mod(t, 2*math.Pi)+2*math.Pi, 2*math.Pi), h.line})
	}
	if len(feet) < 2 {
		return vs, worst
	}
	slices.SortFunc(feet, func(a, b foot) int { return cmp.Compare(a.t, b.t) })
	want := s.curve.Length() / float64(len(feet))
	for i, f := range feet {
		next := feet[(i+1)%len(feet)].t
		if next <= f.t {
			next += 2 * math.Pi
		}
		if gap := s.curve.ArcLength(f.t, next); !(math.Abs(gap-want) <= s.tol) {
			vs = append(vs, checkViolation{ruleHoleSpacing, f.line, fmt.Sprintf("the next hole along the curve is %.6g mm on; want %.6g mm (an equal share of %.6g mm) within %s mm", gap, want, s.curve.Length(), fmtNum(s.tol))})
		}
	}
	return vs, worst
}

// demoDash is one dash of a program as read back.
type demoDash struct {
	length float64
	line   int
}

// demoDashesOf returns the dashes of a program as read back: the runs of
// moves that cut while moving in XY (router below Z0, plotter at or below
// Z0, laser with the beam on), each with its length and its first line.
func demoDashesOf(prog *conformance.Program, m toolpath.Machine) []demoDash {
	var dashes []demoDash
	in := false
	for i, s := range prog.Path {
		mv := prog.Moves[i]
		cuts := s.Motion == toolpath.Cut && s.Kind != toolpath.Dwell && (s.Start.X != s.End.X || s.Start.Y != s.End.Y)
		switch m {
		case toolpath.Laser:
			cuts = cuts && mv.Spindle != conformance.SpindleOff && mv.Speed > 0
		case toolpath.Plotter:
			cuts = cuts && math.Min(s.Start.Z, s.End.Z) <= 0
		default:
			cuts = cuts && math.Min(s.Start.Z, s.End.Z) < 0
		}
		if !cuts {
			in = false
			continue
		}
		if !in {
			dashes = append(dashes, demoDash{line: mv.Line})
			in = true
		}
		dashes[len(dashes)-1].length += s.Length()
	}
	return dashes
}

// checkDashes checks the number of dashes and the length of each.
func checkDashes(dashes []demoDash, s demoShape) []checkViolation {
	var vs []checkViolation
	if len(dashes) != s.count {
		vs = append(vs, checkViolation{ruleDashCount, 0, fmt.Sprintf("the program cuts %d dashes; want %d", len(dashes), s.count)})
	}
	for _, d := range dashes {
		if !(math.Abs(d.length-s.dash) <= s.tol) {
			vs = append(vs, checkViolation{ruleDashLength, d.line, fmt.Sprintf("the dash is %.6g mm long; want %.6g mm within %s mm", d.length, s.dash, fmtNum(s.tol))})
		}
	}
	return vs
}
