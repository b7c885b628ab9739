package main

import (
	"strconv"
	"strings"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// This file holds the built-in order that "foci demo" works through, and
// turns each of its programs into the command line that makes it and the
// shape the program must cut.

// demoTol is the tolerance of every curve in the demo, in millimetres.
const demoTol = 0.05

// demoOrderTitle names the built-in order in the demo's output.
const demoOrderTitle = "workshop order 27: an oval hall mirror with a matching door plate"

// demoPart is one part of the order: what it is, the machine that makes
// it, and its programs in the order they run.
type demoPart struct {
	// name is the part's name in the table; file the stem of its files.
	name, file string
	// machine makes every program of the part.
	machine toolpath.Machine
	// material and tool describe the job for the picture's title.
	material, tool string
	// toolWidth is the router cutter's diameter or the laser's kerf,
	// drawn as a band on the picture; 0 for a pen.
	toolWidth float64
	// center places every ellipse of the part (work zero at the front
	// left corner of the stock or the paper).
	center [2]float64
	// travel is the machine's reach X0,Y0,X1,Y1: every program is made
	// and checked against it.
	travel [4]float64
	// safeZ is the router's safe height or the plotter's pen-up height,
	// which every rapid in XY must keep; 0 for the laser.
	safeZ float64
	// settings are the feeds, speeds and power the part's programs share.
	settings []string
	jobs     []demoJob
}

// demoJob is one program of a part, made by one foci command.
type demoJob struct {
	// name is the program's name within the part, and what it does.
	name, does string
	// command is "profile", "drill" or "dash".
	command string
	// width and height are the full size of the ellipse.
	width, height float64
	// side is the waste side of a profile: outside, inside or on.
	side string
	// cutter is the profile's cutting width: the router tool diameter or
	// the laser kerf, 0 on the line.
	cutter float64
	// offset is the parallel curve the holes or dashes lie on.
	offset float64
	// count is the number of holes.
	count int
	// dashOn and dashOff are the dash pattern.
	dashOn, dashOff float64
	// flags are the job's own flags: depths, passes, tabs.
	flags []string
}

// demoOrder returns the built-in order: an oval mirror frame cut from
// 18 mm birch plywood on a router, an acrylic door plate scored and cut
// on a laser, and a full-size paper template of the frame, drawn on a pen
// plotter, for the customer to try on the wall.
//
// The frame is cut with one 6 mm cutter, as is common practice: 0.5 mm
// into the spoilboard so the part comes free, in equal steps of at most
// 5 mm, with tabs 8 mm wide and 5 mm high. The holes are for the screws
// that hang the frame: six, at equal spacing on the parallel curve 40 mm
// inside the outer edge, which runs between the two edges all the way
// round. Work zero is the front left corner of the stock (or the paper,
// or the laser bed), so every program stays in positive coordinates.
func demoOrder() []demoPart {
	router := []string{"-feed", "1500", "-plunge", "400", "-rpm", "18000"}
	return []demoPart{
		{
			name: "mirror frame", file: "mirror-frame", machine: toolpath.Router,
			material: "18 mm birch plywood", tool: "6 mm cutter", toolWidth: 6,
			center: [2]float64{350, 250}, travel: [4]float64{0, 0, 1250, 2500}, safeZ: 5,
			settings: router,
			jobs: []demoJob{
				{name: "holes", does: "6 screw holes 40 mm inside the edge", command: "drill",
					width: 640, height: 440, offset: -40, count: 6,
					flags: []string{"-tool", "6", "-depth", "18.5", "-peck", "6"}},
				{name: "opening", does: "the 480x300 opening, inside cut", command: "profile",
					width: 480, height: 300, side: "inside", cutter: 6,
					flags: []string{"-depth", "18.5", "-stepdown", "5", "-tabs", "2", "-tab-width", "8", "-tab-height", "5"}},
				{name: "edge", does: "the 640x440 outer edge, outside cut with 4 tabs", command: "profile",
					width: 640, height: 440, side: "outside", cutter: 6,
					flags: []string{"-depth", "18.5", "-stepdown", "5", "-tabs", "4", "-tab-width", "8", "-tab-height", "5"}},
			},
		},
		{
			name: "door plate", file: "door-plate", machine: toolpath.Laser,
			material: "3 mm cast acrylic", tool: "0.15 mm kerf", toolWidth: 0.15,
			center: [2]float64{150, 100}, travel: [4]float64{0, 0, 600, 400},
			jobs: []demoJob{
				{name: "border", does: "a dashed border 8 mm inside the edge, scored", command: "dash",
					width: 240, height: 150, offset: -8, dashOn: 6, dashOff: 4,
					flags: []string{"-power", "250", "-feed", "3000"}},
				{name: "outline", does: "the 240x150 plate, cut out in 2 passes", command: "profile",
					width: 240, height: 150, side: "outside", cutter: 0.15,
					flags: []string{"-passes", "2", "-power", "900", "-feed", "600"}},
			},
		},
		{
			name: "frame template", file: "frame-template", machine: toolpath.Plotter,
			material: "paper", tool: "pen", center: [2]float64{350, 250},
			travel: [4]float64{0, 0, 900, 620}, safeZ: 3,
			settings: []string{"-feed", "3000"},
			jobs: []demoJob{
				{name: "opening", does: "the line of the opening", command: "profile", width: 480, height: 300, side: "on"},
				{name: "edge", does: "the line of the outer edge", command: "profile", width: 640, height: 440, side: "on"},
				{name: "holes", does: "a dot at each screw hole", command: "drill", width: 640, height: 440, offset: -40, count: 6},
			},
		},
	}
}

// programFile returns the file name of the i-th program (from 0) of p:
// the part, the order it runs in and its name, "mirror-frame-1-holes.gcode".
func (p *demoPart) programFile(i int) string {
	return p.file + "-" + strconv.Itoa(i+1) + "-" + p.jobs[i].name + ".gcode"
}

// args returns the foci command line that makes the job of p, writing the
// program to out and its report to report (none when empty).
func (j *demoJob) args(p *demoPart, out, report string) []string {
	a := []string{j.command, "-machine", p.machine.String(),
		"-size", num(j.width) + "x" + num(j.height),
		"-center", num(p.center[0]) + "," + num(p.center[1]),
		"-travel", strings.Join([]string{num(p.travel[0]), num(p.travel[1]), num(p.travel[2]), num(p.travel[3])}, ","),
		"-title", p.name + ": " + j.does}
	switch p.machine {
	case toolpath.Router:
		a = append(a, "-safe-z", num(p.safeZ))
	case toolpath.Plotter:
		a = append(a, "-pen-up", num(p.safeZ))
	}
	switch j.command {
	case "profile":
		a = append(a, "-side", j.side, "-tol", num(demoTol))
		switch {
		case p.machine == toolpath.Router:
			a = append(a, "-tool", num(j.cutter))
		case p.machine == toolpath.Laser:
			a = append(a, "-kerf", num(j.cutter))
		}
	case "drill":
		a = append(a, "-count", strconv.Itoa(j.count), "-offset", num(j.offset))
	case "dash":
		a = append(a, "-dash", num(j.dashOn)+","+num(j.dashOff), "-offset", num(j.offset), "-tol", num(demoTol))
	}
	a = append(a, p.settings...)
	a = append(a, j.flags...)
	a = append(a, "-o", out)
	if report != "" {
		a = append(a, "-report", report)
	}
	return a
}

// demoShape is what a program must cut: the curve the tool centre follows
// and the zone it must keep to, and for holes and dashes the pattern.
type demoShape struct {
	curve ellipse.Parallel
	zone  toolpath.Zone
	tol   float64
	// kind is what the program makes along the curve.
	kind demoKind
	// count is the number of holes, or of dashes.
	count int
	// dash is the length of each dash after the pattern is scaled to
	// close evenly.
	dash float64
}

// demoKind tells contours from rows of holes and from dashed lines, which
// are checked differently.
type demoKind uint8

const (
	demoContour demoKind = iota
	demoHoles
	demoDashes
)

// shape returns the curve the job of p is made for, worked out from its
// description alone: a profile's tool centre runs half the cutting width
// outside or inside the outline, in the zone on the waste side, or on the
// line in a band; holes and dashes lie on the parallel curve at their
// offset, in a band.
func (j *demoJob) shape(p *demoPart) (demoShape, error) {
	el, err := ellipse.FromSize(j.width, j.height, ellipse.Point{X: p.center[0], Y: p.center[1]}, 0)
	if err != nil {
		return demoShape{}, err
	}
	s := demoShape{zone: toolpath.Band, tol: demoTol}
	d := j.offset
	switch {
	case j.command == "profile" && j.side == "outside":
		d, s.zone = j.cutter/2, toolpath.Outside
	case j.command == "profile" && j.side == "inside":
		d, s.zone = -j.cutter/2, toolpath.Inside
	case j.command == "drill":
		s.kind, s.count = demoHoles, j.count
	case j.command == "dash":
		s.kind = demoDashes
	}
	if s.curve, err = el.Parallel(d); err != nil {
		return demoShape{}, err
	}
	if s.kind == demoDashes {
		s.count, s.dash, _ = toolpath.DashPattern(s.curve.Length(), j.dashOn, j.dashOff)
	}
	return s, nil
}

// outline returns the line a job of p is meant to make, drawn as the
// intended shape on the part's picture: the ellipse itself for a
// profile, the curve through the holes. A dashed line has none, so that
// its gaps show.
func (j *demoJob) outline(p *demoPart) (c ellipse.Parallel, ok bool, err error) {
	if j.command == "dash" {
		return c, false, nil
	}
	el, err := ellipse.FromSize(j.width, j.height, ellipse.Point{X: p.center[0], Y: p.center[1]}, 0)
	if err != nil {
		return c, false, err
	}
	if j.command == "profile" {
		return el.Curve(), true, nil
	}
	c, err = el.Parallel(j.offset)
	return c, err == nil, err
}

// num formats a number for a command line.
func num(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
