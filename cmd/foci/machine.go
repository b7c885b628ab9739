package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"strconv"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// This file holds what the program-writing commands (path, profile, drill,
// dash) share: unit-dependent defaults, the tolerance and geometry flags,
// the coordinate decimals, the mapping of library errors to flag names,
// and writing a program without ever leaving half of one behind.

// inchDefault replaces the millimetre default of the named flag with the
// inch one when -units inch was chosen and the flag was not given.
func inchDefault(set map[string]bool, name string, u Units, v *float64, inch float64) {
	if u == unitsInch && !set[name] {
		*v = inch
	}
}

// writerUnits returns the gcodeout units for u.
func writerUnits(u Units) gcodeout.Units {
	if u == unitsInch {
		return gcodeout.Inch
	}
	return gcodeout.MM
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
	fs.StringVar(&c.geometry, "geometry", "arcs", "segments: `lines` (G1) or arcs (G2/G3)")
	c.withZone = withZone
	if withZone {
		fs.StringVar(&c.zone, "zone", "band", "where the path may stray: `band` (either side), outside or inside the curve")
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
// tolerance, see toolpath.DecimalsFor), raised to the writer's minimum for
// the units so that arc radii stay within the RS274NGC limit, and capped
// at the writer's maximum. A tolerance too fine for the cap is then
// refused by the approximation as too fine for the decimals.
func programDecimals(tol float64, u Units) int {
	d := toolpath.DecimalsFor(tol)
	d = max(d, gcodeout.MinDecimals(writerUnits(u)))
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

// writerFlags maps the gcodeout.Config fields the machine flags set to
// the flags' names, for messages.
var writerFlags = map[string]string{
	"Feed": "feed", "PlungeFeed": "plunge", "RPM": "rpm", "SpinUp": "spin-up",
	"SafeZ": "safe-z", "Power": "power", "PierceDwell": "dwell",
	"PenUp": "pen-up", "FocusZ": "focus-z", "Tolerance": "tol",
}

// newProgramWriter validates cfg by making a Writer for it, turning a
// refused field into a usage error that names its flag (penUpFlag for
// PenUp, since "foci path" calls its lift -safe-z).
func newProgramWriter(cfg gcodeout.Config, penUpFlag string) (*gcodeout.Writer, error) {
	wr, err := gcodeout.NewWriter(io.Discard, cfg)
	if err == nil {
		return wr, nil
	}
	var ge *gcodeout.Error
	if !errors.As(err, &ge) {
		return nil, err
	}
	name, ok := writerFlags[ge.Field]
	if ge.Field == "PenUp" {
		name = penUpFlag
	}
	if !ok {
		return nil, fmt.Errorf("cannot write the program: %v", err)
	}
	msg := fmt.Sprintf("%s: %v", fmtNum(ge.Value), ge.Err)
	if ge.HasLimit {
		msg += fmt.Sprintf(" (limit %s)", fmtNum(ge.Limit))
	}
	return nil, badFlag(name, "%s", msg)
}

// writeProgram writes path as the program of wr to out ("-" or empty:
// standard output) through writeFileAtomic, so an error leaves no file.
func writeProgram(e *env, out string, wr *gcodeout.Writer, path toolpath.Path) error {
	return streamProgram(e, out, wr, func(wr *gcodeout.Writer) error {
		for _, s := range path {
			if err := wr.WriteSegment(s); err != nil {
				return err
			}
		}
		return nil
	})
}

// streamProgram is writeProgram for segments that fill gives the writer
// one at a time.
func streamProgram(e *env, out string, wr *gcodeout.Writer, fill func(wr *gcodeout.Writer) error) error {
	return writeFileAtomic(e, out, func(w io.Writer) error {
		wr.Reset(w)
		if err := fill(wr); err != nil {
			return fmt.Errorf("cannot write the program: %v", err)
		}
		return wr.Close()
	})
}

// pictureFlags are -png and -svg, the pictures of the path a command can
// draw besides the program.
type pictureFlags struct {
	png, svg string
}

func (p *pictureFlags) register(fs *flag.FlagSet) {
	fs.StringVar(&p.png, "png", "", "also draw the path as a PNG picture to `FILE`")
	fs.StringVar(&p.svg, "svg", "", "also draw the path true to size as an SVG drawing to `FILE`")
}

// wanted reports whether a picture was asked for.
func (p *pictureFlags) wanted() bool { return p.png != "" || p.svg != "" }

// write draws the pictures asked for (none: nothing to do). Call it
// before writing the program, so that a refused picture leaves no program
// behind.
func (p *pictureFlags) write(e *env, path toolpath.Path, opts pictureOptions) error {
	if !p.wanted() {
		return nil
	}
	return writePictures(e, p.png, p.svg, path, opts)
}
