package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/toolpath"
)

// checkReport is the JSON form of "foci check".
type checkReport struct {
	OK           bool             `json:"ok"`
	File         string           `json:"file"`
	Machine      string           `json:"machine"`
	Units        string           `json:"units"`
	ProgramUnits string           `json:"program_units"`
	Violations   []checkViolation `json:"violations"`
	// MaxDeviation is null when no shape was given.
	MaxDeviation *float64    `json:"max_deviation"`
	Counts       checkCounts `json:"counts"`
}

type checkViolation struct {
	Rule    string `json:"rule"`
	Line    int    `json:"line"`
	Message string `json:"message"`
}

type checkCounts struct {
	Segments int `json:"segments"`
	Cut      int `json:"cut"`
	Travel   int `json:"travel"`
	Arcs     int `json:"arcs"`
	Lines    int `json:"lines"`
	Dwells   int `json:"dwells"`
}

// checkDefaultSafeZ is the height rapids must keep unless -safe-z says
// otherwise: the router's safe height and the plotter's pen-up height of
// the program-writing commands, so that their programs pass as written.
func checkDefaultSafeZ(m conformance.Machine, u Units) float64 {
	switch {
	case m == conformance.Plotter && u == unitsInch:
		return 0.12
	case m == conformance.Plotter:
		return 3
	case u == unitsInch:
		return 0.2
	}
	return 5
}

const checkSynopsis = "check FILE [-machine router|laser|plotter] [-safe-z Z] [-travel X0,Y0,X1,Y1[,Z0,Z1]] [-size WxH [shape flags] [-offset D] [-tol T] [-zone band|outside|inside]] [-units mm|inch] [-json]"

// runCheck reads a program back and checks it. The program is read into
// the -units: a program written in the other unit is converted (1 in =
// 25.4 mm), so every flag and every length reported is in -units, and a
// program that never says G20 or G21 is taken to be in -units.
func runCheck(e *env, args []string) error {
	fs := newFlagSet("check", checkSynopsis, e.stderr)
	machineName := fs.String("machine", "router", "machine `kind` the program is for: router, laser or plotter")
	safeZ := fs.Float64("safe-z", 0, "`height` rapids that move in X or Y must keep, router and plotter (default: router 5, plotter 3; 0.2 and 0.12 with -units inch)")
	travel := fs.String("travel", "", "machine travel `X0,Y0,X1,Y1[,Z0,Z1]` every point must stay within")
	var shape shapeFlags
	shape.register(fs, "")
	offset := fs.Float64("offset", 0, "signed `distance` of the intended tool path from the ellipse (+ outward); needs -size")
	tol := fs.Float64("tol", 0.05, "tolerance `T` of the intended curve (0.002 with -units inch); needs -size")
	zoneName := fs.String("zone", "band", "tolerance `zone`: band (either side), outside or inside the curve; needs -size")
	asJSON := fs.Bool("json", false, "print JSON instead of text")
	file, err := checkFileArg(fs, args)
	if err != nil {
		return err
	}
	set := flagsSet(fs)
	units, err := parseUnits(shape.units)
	if err != nil {
		return err
	}
	machine, ok := conformance.ParseMachine(*machineName)
	if !ok {
		return badFlag("machine", "%q is not a machine; use router, laser or plotter", *machineName)
	}
	rules := conformance.Rules{Machine: machine}
	if machine == conformance.Laser {
		if err := refuseFlags(set, "to the laser, whose rapids are checked for the beam instead", "safe-z"); err != nil {
			return err
		}
	} else {
		rules.SafeZ = checkDefaultSafeZ(machine, units)
		if set["safe-z"] {
			if err := finite("safe-z", *safeZ); err != nil {
				return err
			}
			rules.SafeZ = *safeZ
		}
	}
	if *travel != "" {
		box, err := checkTravelFlag(*travel)
		if err != nil {
			return err
		}
		rules.Travel = &box
	}
	if shape.given() {
		sh, err := checkShapeFlags(&shape, set, units, *offset, *tol, *zoneName)
		if err != nil {
			return err
		}
		rules.Shape = sh
	} else if err := refuseFlags(set, "without -size: give the intended ellipse", "offset", "tol", "zone", "center", "rotate"); err != nil {
		return err
	}

	src, err := readInput(e, file)
	if err != nil {
		return err
	}
	readUnits := conformance.Millimeters
	if units == unitsInch {
		readUnits = conformance.Inches
	}
	prog, err := conformance.Read(src, conformance.ReadOptions{Units: readUnits})
	if err != nil {
		return fmt.Errorf("cannot read %s: %v", file, err)
	}
	rep := conformance.CheckReport(prog, rules)
	out := newCheckReport(file, machine, units, prog, rep)
	if *asJSON {
		if err := writeJSON(e.stdout, out); err != nil {
			return err
		}
	} else if err := writeCheckText(e.stdout, out, rules.Shape); err != nil {
		return err
	}
	if !out.OK {
		return errViolations
	}
	return nil
}

// checkFileArg parses the flags, which may come before or after the one
// file name, and returns the name ("-" for standard input).
func checkFileArg(fs *flag.FlagSet, args []string) (string, error) {
	file := ""
	for {
		if err := parseFlags(fs, args, len(args)); err != nil {
			return "", err
		}
		if fs.NArg() == 0 {
			break
		}
		if file != "" {
			return "", fmt.Errorf("unexpected argument %q: give one program to check", fs.Arg(0))
		}
		file, args = fs.Arg(0), fs.Args()[1:]
	}
	if file == "" {
		return "", errors.New("the program to check is missing: foci check FILE (FILE may be - for standard input)")
	}
	return file, nil
}

// checkTravelFlag parses -travel: four or six numbers, each range with its
// low end first.
func checkTravelFlag(s string) (conformance.Box, error) {
	n := 4
	if strings.Count(s, ",") == 5 {
		n = 6
	}
	v, err := parseList(s, n)
	if err != nil {
		return conformance.Box{}, badFlag("travel", "%v (want X0,Y0,X1,Y1 or X0,Y0,X1,Y1,Z0,Z1)", err)
	}
	box := conformance.Box{MinX: v[0], MinY: v[1], MaxX: v[2], MaxY: v[3]}
	if n == 6 {
		box.HasZ, box.MinZ, box.MaxZ = true, v[4], v[5]
	}
	for _, r := range []struct {
		axis   string
		lo, hi float64
		use    bool
	}{{"X", box.MinX, box.MaxX, true}, {"Y", box.MinY, box.MaxY, true}, {"Z", box.MinZ, box.MaxZ, box.HasZ}} {
		if r.use && !(r.lo < r.hi) {
			return conformance.Box{}, badFlag("travel", "%s runs from %s to %s; the first must be less than the second", r.axis, fmtNum(r.lo), fmtNum(r.hi))
		}
	}
	return box, nil
}

// checkShapeFlags builds the intended shape from the shape flags.
func checkShapeFlags(shape *shapeFlags, set map[string]bool, u Units, offset, tol float64, zoneName string) (*conformance.Shape, error) {
	el, err := shape.ellipse()
	if err != nil {
		return nil, err
	}
	if u == unitsInch && !set["tol"] {
		tol = 0.002
	}
	if err := positive("tol", tol); err != nil {
		return nil, err
	}
	if lim := el.SemiMajor(); tol > lim {
		return nil, badFlag("tol", "%s is larger than the ellipse itself (semi-major %s)", fmtNum(tol), fmtNum(lim))
	}
	zone, ok := toolpath.ParseZone(zoneName)
	if !ok {
		return nil, badFlag("zone", "%q is not a zone; use band, outside or inside", zoneName)
	}
	if err := finite("offset", offset); err != nil {
		return nil, err
	}
	curve, err := parallelFlag(el, offset)
	if err != nil {
		return nil, err
	}
	return &conformance.Shape{Curve: curve, Zone: zone, Tol: tol}, nil
}

func newCheckReport(file string, m conformance.Machine, u Units, p *conformance.Program, rep conformance.Report) checkReport {
	s := rep.Summary
	out := checkReport{
		OK:           len(rep.Violations) == 0,
		File:         file,
		Machine:      m.String(),
		Units:        string(u),
		ProgramUnits: p.Declared.String(),
		Violations:   make([]checkViolation, 0, len(rep.Violations)),
		Counts:       checkCounts{Segments: s.Segments, Cut: s.Cut, Travel: s.Travel, Arcs: s.Arcs, Lines: s.Lines, Dwells: s.Dwells},
	}
	for _, v := range rep.Violations {
		out.Violations = append(out.Violations, checkViolation{v.Rule, v.Line, v.Message})
	}
	if s.Geometry && s.Contour > 0 && !math.IsNaN(s.MaxDeviation) && !math.IsInf(s.MaxDeviation, 0) {
		d := s.MaxDeviation
		out.MaxDeviation = &d
	}
	return out
}

// writeCheckText prints one violation a line, "LINE: RULE: message", then
// a summary.
func writeCheckText(w io.Writer, r checkReport, shape *conformance.Shape) error {
	for _, v := range r.Violations {
		if _, err := fmt.Fprintf(w, "%d: %s: %s\n", v.Line, v.Rule, v.Message); err != nil {
			return err
		}
	}
	c := r.Counts
	fmt.Fprintf(w, "%s: %s program, %d segments (%d cut, %d travel, %d dwell; %d lines, %d arcs), lengths in %s",
		r.File, r.Machine, c.Segments, c.Cut, c.Travel, c.Dwells, c.Lines, c.Arcs, r.Units)
	if r.ProgramUnits != r.Units && r.ProgramUnits != conformance.UnitsUnset.String() {
		fmt.Fprintf(w, " (converted from %s)", r.ProgramUnits)
	}
	fmt.Fprintln(w)
	if shape != nil {
		if r.MaxDeviation != nil {
			fmt.Fprintf(w, "max deviation %.6g %s from the intended curve (%s)\n", *r.MaxDeviation, r.Units, zoneText(shape.Zone, shape.Tol, r.Units))
		} else {
			fmt.Fprintf(w, "no deviation measured: nothing was cut along the intended curve\n")
		}
	}
	var err error
	if r.OK {
		_, err = fmt.Fprintln(w, "ok: every rule holds")
	} else {
		n := len(r.Violations)
		plural := "s"
		if n == 1 {
			plural = ""
		}
		_, err = fmt.Fprintf(w, "%d violation%s\n", n, plural)
	}
	return err
}
