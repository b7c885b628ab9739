package main

import (
	"fmt"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// runPath writes the approximated closed curve alone as a small program:
// units, XY plane, absolute distances, feed per minute; lift to the safe
// height, a rapid to the start, down to Z0, feed moves once around, lift,
// program end. It is written as a pen-plotter program (no spindle or beam
// words, Z only to lift and lower), so that its first rapid is at a known
// height and the checker can read it back. The segments are streamed from
// the approximation straight to the writer.
func runPath(e *env, args []string) error {
	fs := newFlagSet("path", "path -size WxH [-tol T] [-geometry lines|arcs] [-zone band|outside|inside] [-offset D] [-feed F] [-safe-z Z] [shape flags] [-o FILE] [-png FILE] [-svg FILE]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	var cf curveFlags
	cf.register(fs, true)
	offset := fs.Float64("offset", 0, "signed `distance` of the parallel curve to follow (+ outward)")
	feed := fs.Float64("feed", 1000, "feed `F` per minute along the curve (40 with -units inch)")
	safeZ := fs.Float64("safe-z", 5, "height `Z` above Z0 for the rapid to the start (0.2 with -units inch)")
	out := fs.String("o", "-", "write the program to `FILE` (- for standard output)")
	var pics pictureFlags
	pics.register(fs)
	if err := parseFlags(fs, args, 0); err != nil {
		return err
	}
	if !shape.given() {
		return badFlag("size", "is required (for example -size 600x400)")
	}
	el, err := shape.ellipse()
	if err != nil {
		return err
	}
	u, _ := parseUnits(shape.units)
	set := flagsSet(fs)
	geom, zone, err := cf.resolve(set, u)
	if err != nil {
		return err
	}
	inchDefault(set, "feed", u, feed, 40)
	inchDefault(set, "safe-z", u, safeZ, 0.2)
	if err := positive("feed", *feed); err != nil {
		return err
	}
	if err := positive("safe-z", *safeZ); err != nil {
		return err
	}
	if err := finite("offset", *offset); err != nil {
		return err
	}
	curve, err := parallelFlag(el, *offset)
	if err != nil {
		return err
	}
	dec := programDecimals(cf.tol, u)
	ap, err := toolpath.NewApproximator(toolpath.Spec{Curve: curve, Zone: zone, Tol: cf.tol, Geometry: geom, Decimals: dec})
	if err != nil {
		return specError(err, "offset", cf.tol)
	}
	cfg := gcodeout.Config{
		Machine:   gcodeout.Plotter,
		Units:     writerUnits(u),
		Decimals:  ap.Decimals(),
		Tolerance: cf.tol,
		Feed:      *feed,
		PenUp:     *safeZ,
		Title:     "foci path",
		Header: gcodeout.Header{
			Shape:      shapeText(&shape, *offset),
			Tolerance:  zoneText(zone, cf.tol, shape.units),
			ZeroZ:      "the surface the curve is traced on",
			Operations: []string{"the curve alone, once around, as " + geom.String()},
		},
	}
	wr, err := newProgramWriter(cfg, "safe-z")
	if err != nil {
		return err
	}
	first, ok := ap.Next()
	if !ok {
		return fmt.Errorf("the approximation gave no segments")
	}
	up := first.Start
	up.Z = *safeZ
	n := 0
	// each gives every segment of the program in order, from the lift to
	// the start to the lift at the end, consuming the approximation.
	each := func(yield func(toolpath.Segment) error) error {
		lead := [...]toolpath.Segment{
			{Kind: toolpath.Line, Motion: toolpath.Travel, Start: up, End: up},
			{Kind: toolpath.Line, Motion: toolpath.Cut, Role: toolpath.Plunge, Start: up, End: first.Start},
		}
		for _, s := range lead {
			if err := yield(s); err != nil {
				return err
			}
		}
		last := first
		for s, ok := first, true; ok; s, ok = ap.Next() {
			if err := yield(s); err != nil {
				return err
			}
			last = s
			n++
		}
		end := last.End
		end.Z = *safeZ
		return yield(toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Role: toolpath.Retract, Start: last.End, End: end})
	}
	if pics.wanted() {
		// The pictures need the whole path: collect it, draw it, then
		// write the program from it.
		var path toolpath.Path
		_ = each(func(s toolpath.Segment) error { path = append(path, s); return nil })
		if err := pics.write(e, path, pictureOptions{title: "foci path: " + shapeText(&shape, *offset), units: u, intended: []ellipse.Parallel{curve}}); err != nil {
			return err
		}
		err = writeProgram(e, *out, wr, path)
	} else {
		err = streamProgram(e, *out, wr, func(wr *gcodeout.Writer) error { return each(wr.WriteSegment) })
	}
	if err != nil {
		return err
	}
	fmt.Fprintf(e.stderr, "foci path: %d %s within %s of the curve (fewest possible about %.1f), coordinates to %d decimals\n",
		n, geom, zoneText(zone, cf.tol, shape.units), toolpath.LowerBound(curve, geom, zone, cf.tol, 0, 0), ap.Decimals())
	return nil
}

// shapeText describes the shape for a program header.
func shapeText(s *shapeFlags, offset float64) string {
	t := fmt.Sprintf("ellipse %s %s, centre %s, rotated %s deg", s.size, s.units, s.center, fmtNum(s.rotate))
	if offset != 0 {
		t += fmt.Sprintf(", offset %s", fmtNum(offset))
	}
	return t
}

// zoneText describes a tolerance zone: "band +-0.05 mm", "0.05 mm outside".
func zoneText(z toolpath.Zone, tol float64, units string) string {
	switch z {
	case toolpath.Outside:
		return fmt.Sprintf("%s %s outside", fmtNum(tol), units)
	case toolpath.Inside:
		return fmt.Sprintf("%s %s inside", fmtNum(tol), units)
	}
	return fmt.Sprintf("band +-%s %s", fmtNum(tol), units)
}
