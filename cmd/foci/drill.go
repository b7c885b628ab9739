package main

import (
	"flag"
	"fmt"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// markFields maps the fields of toolpath.DrillSpec and DashSpec to the
// flags that set them, for messages.
var markFields = map[string]string{
	"Count": "count", "Offset": "offset", "Depth": "depth", "Peck": "peck", "PeckRetract": "retract",
	"MarkSeconds": "dwell", "On": "dash", "Off": "dash", "Machine": "machine", "Ellipse": "size",
	"Tol": "tol", "Geometry": "geometry", "SafeZ": "safe-z", "PenUp": "pen-up", "PenDown": "pen-up",
	"FocusZ": "focus-z", "PlungeFeed": "plunge",
}

// markFlags are the router, laser and plotter flags of the commands that
// make holes, marks or dots: drill, and dash for its dots.
type markFlags struct {
	tool, depth, peck, retract, dwell float64
}

// register adds the flags; pecks only where withPeck.
func (o *markFlags) register(fs *flag.FlagSet, mf *machineFlags, withPeck bool, dwellUsage string) {
	mf.float(fs, &o.tool, "tool", forRouter, 0, "router cutter or drill `diameter`, for the header and the pictures")
	mf.float(fs, &o.depth, "depth", forRouter, 0, "router depth below the top of the stock (required)")
	if withPeck {
		mf.float(fs, &o.peck, "peck", forRouter, 0, "router peck `depth`: feed each hole down in equal pecks no deeper than this, clearing chips between them (default: one feed to depth)")
		mf.float(fs, &o.retract, "retract", forRouter, 0, "router `height` above the stock to clear chips at between pecks (default: -safe-z)")
	}
	mf.float(fs, &o.dwell, "dwell", forLaser, 0.1, dwellUsage)
}

// check checks the mark flags for the machine; the laser's -dwell must be
// greater than zero when it times the marks (mark), zero or more when it
// is a pierce pause.
func (o *markFlags) check(mf *machineFlags, mark bool) error {
	switch mf.m {
	case toolpath.Router:
		if !mf.set["depth"] {
			return badFlag("depth", "is required for a router")
		}
		return firstError(positive("depth", o.depth), positiveIfSet(mf.set, "tool", o.tool),
			positiveIfSet(mf.set, "peck", o.peck), positiveIfSet(mf.set, "retract", o.retract))
	case toolpath.Laser:
		if !mark {
			return nonNegative("dwell", o.dwell)
		}
		return positive("dwell", o.dwell)
	}
	return nil
}

// width is the tool diameter the pictures draw.
func (o *markFlags) width(m toolpath.Machine) float64 {
	if m == toolpath.Router {
		return o.tool
	}
	return 0
}

func runDrill(e *env, args []string) error {
	fs := newFlagSet("drill", "drill -machine router|laser|plotter -size WxH -count N [-offset D] [flags]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	var mf machineFlags
	mf.register(fs)
	count := fs.Int("count", 0, "number of holes, marks or dots `N`, at equal arc length from the end of the own +x semi-axis, counter-clockwise (required)")
	offset := fs.Float64("offset", 0, "signed `distance` of the parallel curve the points lie on (+ outward)")
	var o markFlags
	o.register(fs, &mf, true, "laser mark time in `seconds` with the beam on")
	el, u, err := parseOperation(fs, args, &shape, &mf, "")
	if err != nil {
		return err
	}
	if *count < 1 || *count > toolpath.MaxCount {
		return badFlag("count", "%d is out of range; use 1 to %d", *count, toolpath.MaxCount)
	}
	if err := finite("offset", *offset); err != nil {
		return err
	}
	curve, err := parallelFlag(el, *offset)
	if err != nil {
		return err
	}
	if err := o.check(&mf, true); err != nil {
		return err
	}
	tol := 0.05
	if u == unitsInch {
		tol = 0.002
	}
	dec := programDecimals(tol, u)
	spec := toolpath.DrillSpec{Setup: mf.setup(tol, toolpath.Lines, dec), Ellipse: el, Offset: *offset, Count: *count}
	switch mf.m {
	case toolpath.Router:
		spec.Depth, spec.Peck, spec.PeckRetract = o.depth, o.peck, o.retract
	case toolpath.Laser:
		spec.MarkSeconds = o.dwell
	}
	path, err := toolpath.Drill(nil, spec)
	if err != nil {
		return opFlagError(err, markFields, "offset", tol)
	}
	if err := mf.checkTravel(path, shape.units); err != nil {
		return err
	}
	kind := map[toolpath.Machine]string{toolpath.Router: "holes", toolpath.Laser: "marks", toolpath.Plotter: "dots"}[mf.m]
	cfg := mf.config(u, 0, dec)
	if cfg.Title == "" {
		cfg.Title = fmt.Sprintf("ellipse %s %s, %d %s", shape.size, shape.units, *count, kind)
	}
	cfg.Header.Shape = shapeText(&shape, *offset)
	if mf.m == toolpath.Router && o.tool > 0 {
		cfg.Header.Tool = fmt.Sprintf("%s %s drill or cutter", fmtNum(o.tool), shape.units)
	}
	cfg.Header.Operations = []string{fmt.Sprintf("%d %s at equal arc length %s %s apart", *count, kind, fmtNum(roundTo(curve.Length()/float64(*count), 8)), shape.units)}
	switch mf.m {
	case toolpath.Router:
		line := fmt.Sprintf("each %s %s deep", fmtNum(o.depth), shape.units)
		if o.peck > 0 {
			n, step := toolpath.DepthPasses(o.depth, o.peck)
			line += fmt.Sprintf(", in %d pecks of %s %s", n, fmtNum(roundTo(step, 6)), shape.units)
		}
		cfg.Header.Operations = append(cfg.Header.Operations, line)
	case toolpath.Laser:
		cfg.Header.Operations = append(cfg.Header.Operations, fmt.Sprintf("each mark %s s with the beam on at S%s", fmtNum(o.dwell), fmtNum(mf.power)))
	}
	prog, err := programFor(cfg, "pen-up", path)
	if err != nil {
		return err
	}
	rep := newProgramReport("drill", &mf, shape.units, path, dec)
	rep.measure(path, curve, toolpath.Band, 0)
	return rep.finish(e, &mf, prog, path, pictureOptions{
		title: cfg.Title, units: u, toolWidth: o.width(mf.m), intended: []ellipse.Parallel{curve},
	})
}
