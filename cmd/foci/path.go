package main

import (
	"errors"
	"flag"
	"fmt"
	"strconv"

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
		var prog []byte
		if prog, err = renderProgram(wr, path); err == nil {
			err = writeBytes(e, *out, prog)
		}
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

// curveFlags are the approximation flags: -tol and -geometry, and -zone
// for the commands that let the user choose it.
type curveFlags struct {
	tol      float64
	geometry string
	zone     string
	withZone bool
}

// register adds -tol, -geometry and, when withZone, -zone to fs.
func (c *curveFlags) register(fs *flag.FlagSet, withZone bool) {
	fs.Float64Var(&c.tol, "tol", 0.05, "tolerance `T`: how far the path may stray from the curve (0.002 with -units inch)")
	fs.StringVar(&c.geometry, "geometry", "arcs", "segment `kind`: lines (G1) or arcs (G2/G3)")
	c.withZone = withZone
	if withZone {
		fs.StringVar(&c.zone, "zone", "band", "`zone` the path keeps to: band (either side of the curve), outside or inside it")
	}
}

// resolve applies the inch default and checks the values.
func (c *curveFlags) resolve(set map[string]bool, u Units) (toolpath.Geometry, toolpath.Zone, error) {
	inchDefault(set, "tol", u, &c.tol, 0.002)
	if err := positive("tol", c.tol); err != nil {
		return 0, 0, err
	}
	g, ok := toolpath.ParseGeometry(c.geometry)
	if !ok {
		return 0, 0, badFlag("geometry", "%q is not a geometry; use lines or arcs", c.geometry)
	}
	z := toolpath.Band
	if c.withZone {
		if z, ok = toolpath.ParseZone(c.zone); !ok {
			return 0, 0, badFlag("zone", "%q is not a zone; use band, outside or inside", c.zone)
		}
	}
	return g, z, nil
}

// programDecimals returns the coordinate decimals of a program made to
// tolerance tol: the approximation's choice (rounding at most 1% of the
// tolerance, see toolpath.DecimalsFor), at least 4 for mm and 5 for inch,
// and at most the writer's maximum. The floor keeps centre-form arcs
// within the RS274NGC radius limit by rounding alone: three rounded
// points move the two radii apart by at most 2√2 units in the last place,
// 0.00028 mm at 4 decimals against the 0.002 mm limit and 0.000028 in at
// 5 against 0.0002 in, where 3 mm decimals could reach 0.0028 mm and
// would rest on the writer finding a better centre. A tolerance too fine
// for the maximum is then refused by the approximation as too fine for
// the decimals.
func programDecimals(tol float64, u Units) int {
	floor := 4
	if u == unitsInch {
		floor = 5
	}
	d := max(toolpath.DecimalsFor(tol), floor, gcodeout.MinDecimals(writerUnits(u)))
	return min(d, gcodeout.MaxDecimals)
}

// specError turns an approximation error into a usage error naming the
// flag behind the field: -tol for the tolerance and the decimals it needs;
// for a zone that reaches inward past the fold of the parallel curves,
// offsetFlag when the curve is offset and -tol when it is not.
func specError(err error, offsetFlag string, tol float64) error {
	var se *toolpath.SpecError
	if !errors.As(err, &se) {
		return err
	}
	switch {
	case errors.Is(err, toolpath.ErrTooFine):
		return badFlag("tol", "%s is too fine: the curve would need about %.3g segments, more than the limit of %d; use a larger tolerance",
			fmtNum(se.Value), se.Limit, toolpath.MaxSegments)
	case errors.Is(err, toolpath.ErrDecimals):
		return badFlag("tol", "%s is too fine for the %d coordinate decimals a program can carry: rounding would take up the whole tolerance; use a tolerance of at least about %s",
			fmtNum(tol), gcodeout.MaxDecimals, strconv.FormatFloat(40*toolpath.RoundingAllowance(gcodeout.MaxDecimals), 'g', 2, 64))
	case errors.Is(err, toolpath.ErrTolerance):
		return badFlag("tol", "%s must be a finite number greater than zero", fmtNum(se.Value))
	case errors.Is(err, toolpath.ErrOffset):
		// SpecError.Limit is the furthest inward offset the zone allows:
		// minus (b²/a less the tolerance).
		fold := tol - se.Limit
		if se.Value == 0 {
			return badFlag("tol", "%s is too wide for this ellipse: the zone reaches inward past the minimum radius of curvature b²/a = %s of this ellipse, where the inward parallel curves fold; use a tolerance below %s or the outside zone",
				fmtNum(tol), fmtNum(fold), fmtNum(fold))
		}
		if se.Limit >= 0 {
			return badFlag(offsetFlag, "%s cannot be followed with -tol %s: the zone alone reaches inward past the minimum radius of curvature b²/a = %s, where the inward parallel curves fold; use a tolerance below %s or the outside zone",
				fmtNum(se.Value), fmtNum(tol), fmtNum(fold), fmtNum(fold))
		}
		return badFlag(offsetFlag, "%s is too far inward for the tolerance: the zone reaches inward past the minimum radius of curvature b²/a = %s, where the inward parallel curves fold; the inward offset must be less than about %s (b²/a less the tolerance)",
			fmtNum(se.Value), fmtNum(fold), fmtNum(-se.Limit))
	}
	return fmt.Errorf("%v", err)
}
