package main

import (
	"errors"
	"fmt"
	"io"
	"math"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// profileFields maps the fields of toolpath.ProfileSpec to the flags that
// set them, for messages.
var profileFields = map[string]string{
	"Tool": "tool", "Kerf": "kerf", "Depth": "depth", "StepDown": "stepdown", "Passes": "passes",
	"Tabs": "tabs", "TabWidth": "tab-width", "TabHeight": "tab-height", "LeadRadius": "lead",
	"RampAngle": "ramp", "RampLength": "ramp-length", "Start": "start", "Side": "side",
	"Direction": "direction", "Machine": "machine", "Ellipse": "size", "Tol": "tol", "Geometry": "geometry",
	"SafeZ": "safe-z", "PenUp": "pen-up", "PenDown": "pen-up", "FocusZ": "focus-z", "PlungeFeed": "plunge",
}

// profileFlags are the flags of "foci profile" beyond the shared ones.
type profileFlags struct {
	side, direction       string
	start                 float64
	tool, depth, stepdown float64
	tabs                  int
	tabWidth, tabHeight   float64
	ramp, rampLength      float64
	kerf, dwell           float64
	passes                int
	lead                  float64
}

func runProfile(e *env, args []string) error {
	fs := newFlagSet("profile", "profile -machine router|laser|plotter -size WxH [flags]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	var cf curveFlags
	cf.register(fs, false)
	var mf machineFlags
	mf.register(fs)
	var o profileFlags
	fs.StringVar(&o.side, "side", "", "the waste `side`: outside (cut a part out), inside (cut a hole) or on (follow the line); default outside, plotter on")
	fs.StringVar(&o.direction, "direction", "climb", "router cutting `direction` for a clockwise spindle: climb or conventional")
	mf.only["direction"] = forRouter
	fs.Float64Var(&o.start, "start", 0, "where the cut meets the outline: the ellipse parameter in `degrees` (0: end of the own +x semi-axis)")
	mf.float(fs, &o.tool, "tool", forRouter, 0, "router cutter `diameter` (required)")
	mf.float(fs, &o.depth, "depth", forRouter, 0, "router depth of cut below the top of the stock (required)")
	mf.float(fs, &o.stepdown, "stepdown", forRouter, 0, "router deepest `step` per pass; the passes are equal (default half the tool diameter, common practice in wood)")
	mf.int(fs, &o.tabs, "tabs", forRouter, 0, "router holding tabs, `N` at equal arc length")
	mf.float(fs, &o.tabWidth, "tab-width", forRouter, 6, "width of each tab along the cut (0.25 with -units inch; common practice 3 to 10 mm)")
	mf.float(fs, &o.tabHeight, "tab-height", forRouter, 0, "height of the tabs above the bottom of the cut (default a third of -depth, common practice)")
	mf.float(fs, &o.ramp, "ramp", forRouter, 0, "enter each pass down a ramp along the path at this `angle` in degrees instead of plunging")
	mf.float(fs, &o.rampLength, "ramp-length", forRouter, 0, "enter each pass down a ramp of this `length` along the path instead of plunging")
	mf.float(fs, &o.kerf, "kerf", forLaser, 0, "laser kerf `width` (required; common practice for a CO2 laser: 0.1 to 0.3 mm)")
	mf.int(fs, &o.passes, "passes", forLaser, 1, "laser passes `N`")
	mf.float(fs, &o.dwell, "dwell", forLaser, 0, "laser pierce pause in `seconds` at each beam-on")
	fs.Float64Var(&o.lead, "lead", 0, "`radius` of the lead-in and lead-out arcs on the waste side, 0 for none (default: router the tool diameter, laser ten kerfs; none on the line)")
	el, u, err := parseOperation(fs, args, &shape, &mf, "")
	if err != nil {
		return err
	}
	geom, _, err := cf.resolve(mf.set, u)
	if err != nil {
		return err
	}
	spec, err := o.spec(&mf, u, el)
	if err != nil {
		return err
	}
	dec := programDecimals(cf.tol, u)
	spec.Setup = mf.setup(cf.tol, geom, dec)
	path, err := toolpath.Profile(nil, spec)
	if err != nil {
		var oe *toolpath.OpError
		if errors.As(err, &oe) && errors.Is(err, toolpath.ErrToolTooLarge) && oe.Limit <= 0 {
			// No width fits: the tolerance zone alone reaches the fold.
			fold := el.MinRadiusOfCurvature()
			return badFlag("tol", "%s is too wide for an inside cut of this ellipse: the zone reaches inward past the minimum radius of curvature b²/a = %s, where the inward parallel curves fold, so no tool fits; use a tolerance below %s",
				fmtNum(cf.tol), fmtNum(fold), fmtNum(fold))
		}
		return opFlagError(err, profileFields, o.widthFlag(mf.m), cf.tol)
	}
	side, curve, zone := profileCurve(spec, el)
	if err := mf.checkTravel(path, shape.units); err != nil {
		return err
	}
	cfg := mf.config(u, cf.tol, dec)
	cfg.PierceDwell = o.dwell
	if cfg.Title == "" {
		cfg.Title = fmt.Sprintf("ellipse %s %s, %s profile", shape.size, shape.units, side)
	}
	cfg.Header.Shape = shapeText(&shape, 0)
	cfg.Header.Tool = o.toolText(mf.m, side, shape.units)
	cfg.Header.Tolerance = zoneText(zone, cf.tol, shape.units) + map[toolpath.Machine]string{
		toolpath.Router: " of the tool-centre path", toolpath.Laser: " of the beam path", toolpath.Plotter: " of the pen path"}[mf.m]
	cfg.Header.Operations = o.operations(&mf, spec, side, shape.units)
	prog, err := programFor(cfg, "pen-up", path)
	if err != nil {
		return err
	}
	rep := newProgramReport("profile", &mf, shape.units, path, dec)
	rep.measure(path, curve, zone, cf.tol)
	width := spec.Tool
	if mf.m == toolpath.Laser {
		width = spec.Kerf
	}
	return rep.finish(e, &mf, prog, path, pictureOptions{
		title: cfg.Title, units: u, toolWidth: width, intended: []ellipse.Parallel{el.Curve(), curve},
	})
}

// spec checks the profile flags for the machine and returns the
// ProfileSpec without its Setup.
func (o *profileFlags) spec(mf *machineFlags, u Units, el ellipse.Ellipse) (toolpath.ProfileSpec, error) {
	s := toolpath.ProfileSpec{Ellipse: el}
	if o.side != "" {
		side, ok := toolpath.ParseSide(o.side)
		if !ok {
			return s, badFlag("side", "%q is not a side; use outside, inside or on", o.side)
		}
		s.Side = side
	}
	dir, ok := toolpath.ParseDirection(o.direction)
	if !ok {
		return s, badFlag("direction", "%q is not a direction; use climb or conventional", o.direction)
	}
	s.Direction = dir
	if err := finite("start", o.start); err != nil {
		return s, err
	}
	s.Start = o.start * math.Pi / 180
	set := mf.set
	if set["lead"] {
		if err := nonNegative("lead", o.lead); err != nil {
			return s, err
		}
		s.LeadRadius, s.NoLead = o.lead, o.lead == 0
	}
	switch mf.m {
	case toolpath.Router:
		for _, req := range []string{"tool", "depth"} {
			if !set[req] {
				return s, badFlag(req, "is required for a router")
			}
		}
		if err := firstError(positive("tool", o.tool), positive("depth", o.depth)); err != nil {
			return s, err
		}
		if !set["stepdown"] {
			o.stepdown = o.tool / 2
		}
		inchDefault(set, "tab-width", u, &o.tabWidth, 0.25)
		if !set["tab-height"] {
			o.tabHeight = o.depth / 3
		}
		if o.tabs == 0 {
			if err := refuseFlags(set, "without -tabs N", "tab-width", "tab-height"); err != nil {
				return s, err
			}
		}
		if set["ramp"] && set["ramp-length"] {
			return s, badFlag("ramp-length", "give either -ramp (an angle) or -ramp-length, not both")
		}
		if err := firstError(positive("stepdown", o.stepdown), rangeInt("tabs", o.tabs, 0, toolpath.MaxCount),
			positiveIfSet(set, "tab-width", o.tabWidth), positiveIfSet(set, "tab-height", o.tabHeight),
			positiveIfSet(set, "ramp", o.ramp), positiveIfSet(set, "ramp-length", o.rampLength)); err != nil {
			return s, err
		}
		if o.ramp >= 90 {
			return s, badFlag("ramp", "%s degrees is not a ramp: use an angle between 0 and 90", fmtNum(o.ramp))
		}
		s.Tool, s.Depth, s.StepDown = o.tool, o.depth, o.stepdown
		s.Tabs, s.RampAngle, s.RampLength = o.tabs, o.ramp*math.Pi/180, o.rampLength
		if o.tabs > 0 {
			s.TabWidth, s.TabHeight = o.tabWidth, o.tabHeight
		}
	case toolpath.Laser:
		if !set["kerf"] {
			return s, badFlag("kerf", "is required for a laser (common practice for a CO2 laser: 0.1 to 0.3 mm)")
		}
		if err := firstError(positive("kerf", o.kerf), rangeInt("passes", o.passes, 1, toolpath.MaxCount), nonNegative("dwell", o.dwell)); err != nil {
			return s, err
		}
		s.Kerf, s.Passes = o.kerf, o.passes
	}
	return s, nil
}

// widthFlag names the flag of the cutting width: -tool or -kerf.
func (o *profileFlags) widthFlag(m toolpath.Machine) string {
	if m == toolpath.Laser {
		return "kerf"
	}
	return "tool"
}

// profileCurve returns the side the profile cuts on (the machine's
// default resolved), the tool-centre curve and its tolerance zone, as
// toolpath.Profile makes them.
func profileCurve(s toolpath.ProfileSpec, el ellipse.Ellipse) (toolpath.Side, ellipse.Parallel, toolpath.Zone) {
	side := s.Side
	if side == toolpath.SideDefault {
		side = toolpath.SideOutside
		if s.Machine == toolpath.Plotter {
			side = toolpath.SideOn
		}
	}
	r := s.Tool / 2
	if s.Machine == toolpath.Laser {
		r = s.Kerf / 2
	}
	switch side {
	case toolpath.SideOutside:
		c, _ := el.Parallel(r)
		return side, c, toolpath.Outside
	case toolpath.SideInside:
		c, _ := el.Parallel(-r)
		return side, c, toolpath.Inside
	}
	return side, el.Curve(), toolpath.Band
}

// toolText describes the tool for the header.
func (o *profileFlags) toolText(m toolpath.Machine, side toolpath.Side, units string) string {
	where := map[toolpath.Side]string{toolpath.SideOutside: "outside", toolpath.SideInside: "inside"}[side]
	switch m {
	case toolpath.Router:
		t := fmt.Sprintf("%s %s cutter", fmtNum(o.tool), units)
		if where != "" {
			t += fmt.Sprintf(", centre %s %s %s the line", fmtNum(o.tool/2), units, where)
		}
		return t
	case toolpath.Laser:
		t := fmt.Sprintf("%s %s", fmtNum(o.kerf), units)
		if where != "" {
			t += fmt.Sprintf(", beam %s %s %s the line", fmtNum(o.kerf/2), units, where)
		}
		return t
	}
	return ""
}

// operations describes the cut for the header, one line each.
func (o *profileFlags) operations(mf *machineFlags, s toolpath.ProfileSpec, side toolpath.Side, units string) []string {
	turn := "clockwise"
	cw := side != toolpath.SideInside
	if s.Direction == toolpath.Conventional {
		cw = !cw
	}
	if !cw {
		turn = "counter-clockwise"
	}
	first := fmt.Sprintf("profile %s the line, %s", side, turn)
	if mf.m == toolpath.Router {
		first += ", " + s.Direction.String() + " milling"
	}
	ops := []string{first}
	switch mf.m {
	case toolpath.Router:
		n, step := toolpath.DepthPasses(s.Depth, s.StepDown)
		ops = append(ops, fmt.Sprintf("%d passes of %s %s to %s %s deep", n, fmtNum(roundTo(step, 6)), units, fmtNum(s.Depth), units))
		if s.Tabs > 0 {
			ops = append(ops, fmt.Sprintf("%d tabs %s %s wide, %s %s high", s.Tabs, fmtNum(s.TabWidth), units, fmtNum(s.TabHeight), units))
		}
		switch {
		case s.RampAngle > 0:
			ops = append(ops, fmt.Sprintf("ramped entry at %s deg", fmtNum(o.ramp)))
		case s.RampLength > 0:
			ops = append(ops, fmt.Sprintf("ramped entry over %s %s", fmtNum(s.RampLength), units))
		default:
			ops = append(ops, "straight plunge at the entry of each pass")
		}
	case toolpath.Laser:
		ops = append(ops, fmt.Sprintf("%d passes at power S%s", max(1, s.Passes), fmtNum(mf.power)))
	}
	switch {
	case s.NoLead:
		ops = append(ops, "no lead arcs")
	case s.LeadRadius > 0:
		ops = append(ops, fmt.Sprintf("lead-in and lead-out arcs of radius %s %s on the waste side", fmtNum(s.LeadRadius), units))
	case side != toolpath.SideOn:
		ops = append(ops, "lead-in and lead-out arcs on the waste side")
	}
	return ops
}

// programReport is the JSON form of -report for the operation commands,
// and the source of the short summary on stderr.
type programReport struct {
	Command  string `json:"command"`
	Machine  string `json:"machine"`
	Units    string `json:"units"`
	Program  string `json:"program"`
	Decimals int    `json:"decimals"`
	Segments int    `json:"segments"`
	// CutLength and TravelLength are the lengths of the cutting and the
	// travel moves.
	CutLength    float64 `json:"cut_length"`
	TravelLength float64 `json:"travel_length"`
	// TimeEstimate is in seconds, under TimeModel.
	TimeEstimate float64   `json:"time_estimate_s"`
	TimeModel    timeModel `json:"time_model"`
	// MaxDeviation is the largest distance, either way, of a measured
	// move from its intended curve; DeviationRange the signed range
	// (+ outward); Zone and Tolerance what it was held to. Measured moves
	// are the cutting moves along the curve (contour, ramps, tabs) or
	// the holes and marks, with coordinates rounded as written.
	MaxDeviation   float64    `json:"max_deviation"`
	DeviationRange [2]float64 `json:"deviation_range"`
	Measured       int        `json:"measured_moves"`
	Zone           string     `json:"zone,omitempty"`
	Tolerance      float64    `json:"tolerance,omitempty"`
	BoundingBox    box        `json:"bounding_box"`
}

// timeModel states what the time estimate assumes (toolpath.Summarize).
type timeModel struct {
	Feed       float64 `json:"feed_per_min"`
	PlungeFeed float64 `json:"plunge_feed_per_min"`
	Rapid      float64 `json:"rapid_per_min"`
	Accel      float64 `json:"accel_per_s2"`
	Note       string  `json:"note"`
}

// box is an XY extent with the Z range.
type box struct {
	MinX float64 `json:"min_x"`
	MinY float64 `json:"min_y"`
	MaxX float64 `json:"max_x"`
	MaxY float64 `json:"max_y"`
	MinZ float64 `json:"min_z"`
	MaxZ float64 `json:"max_z"`
}

// newProgramReport summarises path for the report.
func newProgramReport(cmd string, mf *machineFlags, units string, path toolpath.Path, decimals int) *programReport {
	rates := mf.rates()
	s := toolpath.Summarize(path, rates)
	return &programReport{
		Command: cmd, Machine: mf.m.String(), Units: units, Program: mf.out, Decimals: decimals,
		Segments: s.Segments, CutLength: s.CutLength, TravelLength: s.TravelLength, TimeEstimate: s.Seconds,
		TimeModel: timeModel{Feed: rates.Feed, PlungeFeed: rates.PlungeFeed, Rapid: rates.Rapid, Accel: rates.Accel,
			Note: "feeds with a trapezoidal speed profile at this acceleration, stopping at travels, dwells, feed changes and corners over 10 degrees; a lower bound"},
		BoundingBox: box{s.MinX, s.MinY, s.MaxX, s.MaxY, s.MinZ, s.MaxZ},
	}
}

// measure sets the deviation of the measured moves of path from curve:
// cutting moves with the roles Contour, Ramp, Tab or Hole, their
// coordinates rounded to the report's decimals as the writer does.
// A zero tol leaves the zone out of the report.
func (r *programReport) measure(path toolpath.Path, curve ellipse.Parallel, zone toolpath.Zone, tol float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, s := range path {
		if s.Motion != toolpath.Cut {
			continue
		}
		switch s.Role {
		case toolpath.Contour, toolpath.Ramp, toolpath.Tab, toolpath.Hole:
		default:
			continue
		}
		a, b := conformance.SegmentDeviation(curve, rounded(s, r.Decimals))
		lo, hi = math.Min(lo, a), math.Max(hi, b)
		r.Measured++
	}
	if r.Measured > 0 {
		r.DeviationRange = [2]float64{lo, hi}
		r.MaxDeviation = math.Max(math.Abs(lo), math.Abs(hi))
	}
	if tol > 0 {
		r.Zone, r.Tolerance = zone.String(), tol
	}
}

// rounded returns s with its coordinates rounded to the given decimals,
// the arc radius taken from the rounded start and centre.
func rounded(s toolpath.Segment, decimals int) toolpath.Segment {
	p := math.Pow10(decimals)
	rd := func(v float64) float64 { return math.Round(v*p) / p }
	s.Start.X, s.Start.Y, s.End.X, s.End.Y = rd(s.Start.X), rd(s.Start.Y), rd(s.End.X), rd(s.End.Y)
	if s.Kind == toolpath.Arc {
		s.CenterX, s.CenterY = rd(s.CenterX), rd(s.CenterY)
		s.Radius = math.Hypot(s.Start.X-s.CenterX, s.Start.Y-s.CenterY)
	}
	return s
}

// finish writes the outputs of an operation command, pictures first and
// the program last, after everything has been checked and made in
// memory, and prints the summary on stderr.
func (r *programReport) finish(e *env, mf *machineFlags, prog []byte, path toolpath.Path, pics pictureOptions) error {
	return r.finishAs(e, mf, prog, path, pics, r)
}

// finishAs is finish writing report (r or a report that embeds it) as
// the JSON report.
func (r *programReport) finishAs(e *env, mf *machineFlags, prog []byte, path toolpath.Path, pics pictureOptions, report any) error {
	if err := mf.pics.write(e, path, pics); err != nil {
		return err
	}
	if mf.report != "" {
		if err := writeFileAtomic(e, mf.report, func(w io.Writer) error { return writeJSON(w, report) }); err != nil {
			return err
		}
	}
	if err := writeBytes(e, mf.out, prog); err != nil {
		return err
	}
	r.summary(e.stderr)
	return nil
}

// summary prints the report in a few lines.
func (r *programReport) summary(w io.Writer) {
	u := r.Units
	fmt.Fprintf(w, "foci %s: %s program, %d segments, coordinates to %d decimals\n", r.Command, r.Machine, r.Segments, r.Decimals)
	fmt.Fprintf(w, "  cut %.6g %s, travel %.6g %s, about %s (estimate)\n", r.CutLength, u, r.TravelLength, u, duration(r.TimeEstimate))
	if r.Measured > 0 {
		fmt.Fprintf(w, "  deviation %.3g to %.3g %s from the intended curve over %d moves", r.DeviationRange[0], r.DeviationRange[1], u, r.Measured)
		if r.Zone != "" {
			fmt.Fprintf(w, " (allowed: %s)", zoneText(mustZone(r.Zone), r.Tolerance, u))
		}
		fmt.Fprintln(w)
	}
	b := r.BoundingBox
	fmt.Fprintf(w, "  extent X %.6g to %.6g, Y %.6g to %.6g, Z %.6g to %.6g %s\n", b.MinX, b.MaxX, b.MinY, b.MaxY, b.MinZ, b.MaxZ, u)
}

// mustZone parses a zone name the report itself wrote.
func mustZone(s string) toolpath.Zone {
	z, _ := toolpath.ParseZone(s)
	return z
}

// duration renders seconds as "1 h 2 min", "3 min 4 s" or "5.6 s".
func duration(sec float64) string {
	switch {
	case sec >= 3600:
		return fmt.Sprintf("%d h %d min", int(sec/3600), int(math.Mod(sec, 3600)/60))
	case sec >= 60:
		return fmt.Sprintf("%d min %d s", int(sec/60), int(math.Mod(sec, 60)))
	}
	return fmt.Sprintf("%.2g s", sec)
}
