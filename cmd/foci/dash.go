package main

import (
	"fmt"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// runDash writes a dashed or dotted outline: dashes of -dash ON with gaps
// of OFF along the ellipse or its parallel curve, both scaled alike so
// that a whole number of periods closes the loop evenly
// (toolpath.DashPattern); ON = 0 gives dots, one mark per period. A dash
// shorter than the tolerance is refused.
func runDash(e *env, args []string) error {
	fs := newFlagSet("dash", "dash -machine router|laser|plotter -size WxH -dash ON,OFF [-offset D] [flags]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	var cf curveFlags
	cf.register(fs, false)
	var mf machineFlags
	mf.register(fs)
	dash := fs.String("dash", "", "the pattern `ON,OFF`: dash and gap lengths along the curve, scaled alike to close evenly; ON 0 for dots (required)")
	offset := fs.Float64("offset", 0, "signed `distance` of the parallel curve to dash (+ outward)")
	var o markFlags
	o.register(fs, &mf, false, "laser time in `seconds` with the beam on at each dot, or the pierce pause at the start of each dash (default 0.1 for dots, 0 for dashes)")
	el, u, err := parseOperation(fs, args, &shape, &mf, "")
	if err != nil {
		return err
	}
	geom, _, err := cf.resolve(mf.set, u)
	if err != nil {
		return err
	}
	if *dash == "" {
		return badFlag("dash", "is required: the dash and gap lengths ON,OFF (for example 10,5; 0,5 for dots)")
	}
	v, err := parseList(*dash, 2)
	if err != nil {
		return badFlag("dash", "%v (want ON,OFF such as 10,5)", err)
	}
	on, off := v[0], v[1]
	if err := firstError(nonNegative("dash", on), positive("dash", off)); err != nil {
		return badFlag("dash", "%s,%s: the dash must be zero or more and the gap greater than zero", fmtNum(on), fmtNum(off))
	}
	if on > 0 && on < cf.tol {
		// Shorter than the tolerance zone is wide, a dash is no dash.
		return badFlag("dash", "%s: a dash must be 0 (for dots) or at least as long as the tolerance %s", fmtNum(on), fmtNum(cf.tol))
	}
	if err := finite("offset", *offset); err != nil {
		return err
	}
	curve, err := parallelFlag(el, *offset)
	if err != nil {
		return err
	}
	dots := on == 0
	if !dots && mf.m == toolpath.Laser && !mf.set["dwell"] {
		o.dwell = 0
	}
	if err := o.check(&mf, dots); err != nil {
		return err
	}
	dec := programDecimals(cf.tol, u)
	spec := toolpath.DashSpec{Setup: mf.setup(cf.tol, geom, dec), Ellipse: el, Offset: *offset, On: on, Off: off}
	pierce := 0.0
	switch {
	case mf.m == toolpath.Router:
		spec.Depth = o.depth
	case mf.m == toolpath.Laser && dots:
		spec.MarkSeconds = o.dwell
	case mf.m == toolpath.Laser:
		pierce = o.dwell
	}
	path, err := toolpath.Dash(nil, spec)
	if err != nil {
		return opFlagError(err, markFields, "offset", cf.tol)
	}
	if err := mf.checkTravel(path, shape.units); err != nil {
		return err
	}
	n, dashLen, gap := toolpath.DashPattern(curve.Length(), on, off)
	kind := "dashes"
	if dots {
		kind = "dots"
	}
	cfg := mf.config(u, cf.tol, dec)
	cfg.PierceDwell = pierce
	if cfg.Title == "" {
		cfg.Title = fmt.Sprintf("ellipse %s %s, %d %s", shape.size, shape.units, n, kind)
	}
	cfg.Header.Shape = shapeText(&shape, *offset)
	if mf.m == toolpath.Router && o.tool > 0 {
		cfg.Header.Tool = fmt.Sprintf("%s %s cutter", fmtNum(o.tool), shape.units)
	}
	line := fmt.Sprintf("%d %s %s %s long, %s %s apart (scaled to close evenly)", n, kind, fmtNum(roundTo(dashLen, 6)), shape.units, fmtNum(roundTo(gap, 6)), shape.units)
	if dots {
		line = fmt.Sprintf("%d dots %s %s apart (scaled to close evenly)", n, fmtNum(roundTo(gap, 6)), shape.units)
	}
	cfg.Header.Operations = []string{line}
	if mf.m == toolpath.Router {
		cfg.Header.Operations = append(cfg.Header.Operations, fmt.Sprintf("each %s %s deep in one pass", fmtNum(o.depth), shape.units))
	}
	prog, err := programFor(cfg, "pen-up", path)
	if err != nil {
		return err
	}
	rep := newProgramReport("dash", &mf, shape.units, path, dec)
	markTol := cf.tol
	if dots {
		markTol = 0 // dots are points on the curve, not approximations
	}
	rep.measure(path, curve, toolpath.Band, markTol)
	return rep.finish(e, &mf, prog, path, pictureOptions{
		title: cfg.Title, units: u, toolWidth: o.width(mf.m), intended: []ellipse.Parallel{curve},
	})
}
