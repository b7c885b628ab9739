package main

import (
	"flag"
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// pocketFields maps the fields of toolpath.PocketSpec to the flags that
// set them, for messages.
var pocketFields = map[string]string{
	"Tool": "tool", "Depth": "depth", "StepDown": "stepdown", "StepOver": "stepover", "Allowance": "allowance",
	"RampAngle": "ramp", "Direction": "direction", "Ellipse": "size", "Tol": "tol", "Geometry": "geometry",
	"SafeZ": "safe-z", "PlungeFeed": "plunge",
}

// pocketFlags are the flags of "foci pocket" beyond the shape, curve and
// machine ones.
type pocketFlags struct {
	tool, depth, stepdown float64
	stepover, allowance   float64
	ramp                  float64
	direction             string
}

// pocketMachineFlags are the router flags of the shared machine flags
// that "foci pocket" offers, with their help for a pocket. A pocket is cut
// by a router only, so the other machines' flags are not offered at all.
var pocketMachineFlags = []struct{ name, usage string }{
	{"feed", "cutting `feed` per minute (default 1000 mm/min, 40 in/min)"},
	{"plunge", "`feed` per minute of moves down into the stock and down to it (default 300 mm/min, 12 in/min)"},
	{"rpm", "spindle `speed` (S word)"},
	{"spin-up", "pause after starting the spindle, in `seconds`"},
	{"safe-z", "travel `height` above the stock (0.2 with -units inch)"},
	{"rapid", "rapid `speed` per minute assumed by the time estimate (200 with -units inch)"},
	{"accel", "acceleration per second² assumed by the time estimate, 0 for none (20 with -units inch)"},
	{"title", "program `title` for the header comment"},
	{"travel", "machine travel `X0,Y0,X1,Y1[,Z0,Z1]`: refuse a program that leaves it"},
	{"report", "write a JSON report (lengths, time estimate, segments, deviation, extent, the pocket's layout) to `FILE`"},
	{"o", "write the program to `FILE` (- for standard output)"},
	{"png", "also draw the path as a PNG picture to `FILE`"},
	{"svg", "also draw the path true to size as an SVG drawing to `FILE`"},
}

// runPocket writes a program that clears an elliptical recess: rings on
// the inward parallel curves at each depth level, the middle along the
// major axis, a wall pass at full depth (see toolpath.Pocket).
func runPocket(e *env, args []string) error {
	fs := newFlagSet("pocket", "pocket -size WxH -tool DIA -depth D [-stepdown S] [-stepover W] [-allowance A] [flags]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	var cf curveFlags
	cf.register(fs, false)
	var o pocketFlags
	fs.Float64Var(&o.tool, "tool", 0, "cutter `diameter` (required)")
	fs.Float64Var(&o.depth, "depth", 0, "`depth` of the floor below the top of the stock (required)")
	fs.Float64Var(&o.stepdown, "stepdown", 0, "deepest `step` per level; the levels are equal (default half the tool diameter, common practice in wood)")
	fs.Float64Var(&o.stepover, "stepover", 0, "largest `distance` between neighbouring rings, at most the tool diameter (default 40% of it, common practice)")
	fs.Float64Var(&o.allowance, "allowance", 0, "finishing `allowance` left on the wall and removed by the wall pass at full depth, 0 for none (default 0.2 mm or 0.008 in, at least 3 times -tol; none when the step-over is smaller)")
	fs.Float64Var(&o.ramp, "ramp", 3, "steepest entry slope in `degrees`: each level is entered down a ramp or a helix (common practice 2 to 5)")
	fs.StringVar(&o.direction, "direction", "climb", "cutting `direction` for a clockwise spindle: climb (counter-clockwise) or conventional")
	// The router's machine flags, borrowed from a set of their own.
	var mf machineFlags
	all := flag.NewFlagSet("machine", flag.ContinueOnError)
	mf.register(all)
	for _, f := range pocketMachineFlags {
		fs.Var(all.Lookup(f.name).Value, f.name, f.usage)
	}
	el, u, err := parseOperation(fs, args, &shape, &mf, "router")
	if err != nil {
		return err
	}
	geom, _, err := cf.resolve(mf.set, u)
	if err != nil {
		return err
	}
	spec, err := o.spec(mf.set, u, el, cf.tol)
	if err != nil {
		return err
	}
	dec := programDecimals(cf.tol, u)
	spec.Setup = mf.setup(cf.tol, geom, dec)
	path, err := toolpath.Pocket(nil, spec)
	if err != nil {
		return opFlagError(err, pocketFields, "tool", cf.tol)
	}
	plan, err := toolpath.PlanPocket(spec)
	if err != nil {
		return opFlagError(err, pocketFields, "tool", cf.tol)
	}
	if err := mf.checkTravel(path, shape.units); err != nil {
		return err
	}
	cfg := mf.config(u, cf.tol, dec)
	if cfg.Title == "" {
		cfg.Title = fmt.Sprintf("ellipse %s %s, pocket %s %s deep", shape.size, shape.units, fmtNum(spec.Depth), shape.units)
	}
	cfg.Header.Shape = shapeText(&shape, 0)
	cfg.Header.Tool = fmt.Sprintf("%s %s cutter, centre at least %s %s inside the line", fmtNum(spec.Tool), shape.units, fmtNum(spec.Tool/2), shape.units)
	cfg.Header.Tolerance = zoneText(toolpath.Inside, cf.tol, shape.units) + " of each ring and of the wall pass"
	cfg.Header.Operations = pocketOperations(spec, plan, shape.units)
	prog, err := programFor(cfg, "safe-z", path)
	if err != nil {
		return err
	}
	rep := &pocketReport{programReport: newProgramReport("pocket", &mf, shape.units, path, dec)}
	intended := []ellipse.Parallel{el.Curve()}
	r := spec.Tool / 2
	if r+cf.tol < el.MinRadiusOfCurvature() {
		wall, err := el.Parallel(-r)
		if err != nil {
			return fmt.Errorf("the wall pass's curve: %v", err)
		}
		rep.measure(toolpath.PocketWall(path), wall, toolpath.Inside, cf.tol)
		intended = append(intended, wall)
	}
	rep.Pocket = newPocketDetails(spec, plan, rep.CutLength)
	return rep.finish(e, &mf, prog, path, pictureOptions{title: cfg.Title, units: u, toolWidth: spec.Tool, intended: intended})
}

// spec checks the pocket flags and returns the PocketSpec without its
// Setup.
func (o *pocketFlags) spec(set map[string]bool, u Units, el ellipse.Ellipse, tol float64) (toolpath.PocketSpec, error) {
	s := toolpath.PocketSpec{Ellipse: el}
	for _, req := range []string{"tool", "depth"} {
		if !set[req] {
			return s, badFlag(req, "is required")
		}
	}
	if err := firstError(positive("tool", o.tool), positive("depth", o.depth)); err != nil {
		return s, err
	}
	dir, ok := toolpath.ParseDirection(o.direction)
	if !ok {
		return s, badFlag("direction", "%q is not a direction; use climb or conventional", o.direction)
	}
	if !set["stepdown"] {
		o.stepdown = o.tool / 2
	}
	if !set["stepover"] {
		o.stepover = 0.4 * o.tool
	}
	if err := firstError(positive("stepdown", o.stepdown), positive("stepover", o.stepover), nonNegative("allowance", o.allowance)); err != nil {
		return s, err
	}
	if !set["allowance"] {
		o.allowance = 0.2
		if u == unitsInch {
			o.allowance = 0.008
		}
		o.allowance = math.Max(o.allowance, 3*tol)
		if o.allowance > math.Min(o.stepover, o.tool-tol) {
			o.allowance = 0
		}
	}
	if err := positive("ramp", o.ramp); err != nil {
		return s, err
	}
	if o.ramp >= 90 {
		return s, badFlag("ramp", "%s degrees is not a ramp: use an angle between 0 and 90", fmtNum(o.ramp))
	}
	s.Direction = dir
	s.Tool, s.Depth, s.StepDown = o.tool, o.depth, o.stepdown
	s.StepOver, s.Allowance, s.RampAngle = o.stepover, o.allowance, o.ramp*math.Pi/180
	return s, nil
}

// pocketOperations describes the pocket for the header, one short line
// each (the writer keeps header lines under 80 characters).
func pocketOperations(s toolpath.PocketSpec, p toolpath.PocketPlan, units string) []string {
	num := func(v float64) string { return fmtNum(roundTo(v, 6)) }
	turn := "counter-clockwise"
	if s.Direction == toolpath.Conventional {
		turn = "clockwise"
	}
	ops := []string{
		fmt.Sprintf("pocket %s %s deep in %s of %s %s", num(s.Depth), units, pocketPlural(len(p.Levels), "level"), num(-p.Levels[0]), units),
		fmt.Sprintf("%s milling, %s", s.Direction, turn),
	}
	switch len(p.Rings) {
	case 0:
		ops = append(ops, "no rings: the middle and the wall pass clear the floor")
	case 1:
		ops = append(ops, fmt.Sprintf("1 ring %s %s in from the line", num(p.Rings[0]), units))
	default:
		ops = append(ops, fmt.Sprintf("%d rings %s to %s %s in, %s %s apart, innermost first",
			len(p.Rings), num(p.Rings[0]), num(p.Rings[len(p.Rings)-1]), units, num(p.Spacing), units))
	}
	if n := pocketTrimmed(s, p); n > 0 {
		ops = append(ops, fmt.Sprintf("%s trimmed on the major axis, past %s %s in", pocketPlural(n, "pass"), num(p.Fold), units))
	}
	if p.Spine > 0 {
		ops = append(ops, fmt.Sprintf("middle along the major axis, %s %s long", num(2*p.Spine), units))
	} else {
		ops = append(ops, "middle at the centre")
	}
	deg := num(p.RampAngle * 180 / math.Pi)
	if p.HelixRadius > 0 {
		ops = append(ops, fmt.Sprintf("entry: helix of radius %s %s about the centre, at most %s deg", num(p.HelixRadius), units, deg))
	} else {
		ops = append(ops, fmt.Sprintf("entry: ramp along the major axis, at most %s deg", deg))
	}
	if s.Allowance > 0 {
		ops = append(ops, fmt.Sprintf("allowance %s %s on the wall, taken by a wall pass at full depth", num(s.Allowance), units))
	} else {
		ops = append(ops, "no allowance: the outer ring is the wall pass at every level")
	}
	return ops
}

// pocketPlural returns "1 ring", "2 rings", "3 passes".
func pocketPlural(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	if noun[len(noun)-1] == 's' {
		return fmt.Sprintf("%d %ses", n, noun)
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// pocketTrimmed counts the rings (the wall pass included) trimmed on the
// major axis: those whose zone reaches the least radius of curvature.
func pocketTrimmed(s toolpath.PocketSpec, p toolpath.PocketPlan) int {
	n := 0
	offsets := append([]float64{p.Wall}, p.Rings...)
	if len(p.Rings) > 0 && p.Rings[0] == p.Wall {
		offsets = offsets[1:]
	}
	for _, d := range offsets {
		if !(d+s.Tol < p.Fold) {
			n++
		}
	}
	return n
}

// pocketReport is the JSON report of "foci pocket": the operation report
// and the pocket's layout.
type pocketReport struct {
	*programReport
	Pocket pocketDetails `json:"pocket"`
}

// pocketDetails is the layout of a pocket and its cutting length against
// the simple lower bound.
type pocketDetails struct {
	Levels      []float64 `json:"levels"`
	Rings       []float64 `json:"rings"`
	RingSpacing float64   `json:"ring_spacing"`
	StepOver    float64   `json:"stepover"`
	Allowance   float64   `json:"allowance"`
	WallOffset  float64   `json:"wall_offset"`
	WallTrimmed bool      `json:"wall_trimmed"`
	Trimmed     int       `json:"trimmed_rings"`
	SpineLength float64   `json:"spine_length"`
	Entry       string    `json:"entry"`
	HelixRadius float64   `json:"helix_radius,omitempty"`
	RampDegrees float64   `json:"ramp_degrees"`
	// Area is the pocket's area πab; LowerBound the least cutting length
	// that clears it at every level a step-over at a time, levels · area /
	// step-over; CutRatio the cutting length over it.
	Area       float64 `json:"area"`
	LowerBound float64 `json:"cut_lower_bound"`
	CutRatio   float64 `json:"cut_ratio"`
}

func newPocketDetails(s toolpath.PocketSpec, p toolpath.PocketPlan, cut float64) pocketDetails {
	d := pocketDetails{
		Levels: p.Levels, Rings: p.Rings, RingSpacing: p.Spacing, StepOver: s.StepOver, Allowance: s.Allowance,
		WallOffset: p.Wall, WallTrimmed: !(p.Wall+s.Tol < p.Fold), Trimmed: pocketTrimmed(s, p),
		SpineLength: 2 * p.Spine, Entry: "ramp", RampDegrees: p.RampAngle * 180 / math.Pi,
		Area: s.Ellipse.Area(),
	}
	if d.Rings == nil {
		d.Rings = []float64{}
	}
	if p.HelixRadius > 0 {
		d.Entry, d.HelixRadius = "helix", p.HelixRadius
	}
	d.LowerBound = float64(len(p.Levels)) * d.Area / s.StepOver
	d.CutRatio = cut / d.LowerBound
	return d
}

// finish writes the pictures, the report and the program, in that order,
// and prints the summary with the pocket's layout on stderr.
func (r *pocketReport) finish(e *env, mf *machineFlags, prog []byte, path toolpath.Path, pics pictureOptions) error {
	if err := r.programReport.finishAs(e, mf, prog, path, pics, r); err != nil {
		return err
	}
	d := &r.Pocket
	fmt.Fprintf(e.stderr, "  %s, %s %.4g %s apart, %s entry; cut %.2f times the least for the area at this step-over\n",
		pocketPlural(len(d.Levels), "level"), pocketPlural(len(d.Rings), "ring"), d.RingSpacing, r.Units, d.Entry, d.CutRatio)
	return nil
}
