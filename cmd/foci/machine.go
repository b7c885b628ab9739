package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// This file holds the machine and program plumbing the program-writing
// commands (path, profile, drill, dash) share: the machine flags and the
// machines each applies to, unit-dependent defaults, the writer's
// configuration, the mapping of library errors to flag names, and writing
// a program without ever leaving half of one behind.

// Machine sets, for the flags that apply to some machines only.
const (
	forRouter uint8 = 1 << iota
	forLaser
	forPlotter
	forAll = forRouter | forLaser | forPlotter
)

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

// machineBit returns the set bit of a machine.
func machineBit(m toolpath.Machine) uint8 {
	switch m {
	case toolpath.Router:
		return forRouter
	case toolpath.Laser:
		return forLaser
	}
	return forPlotter
}

// machineFlags are the flags every operation command shares: the machine,
// its feeds, speeds and heights, the program's title, the travel limits,
// the time-estimate assumptions and the outputs. Commands register their
// own operation flags through float and int, so that every flag knows the
// machines it applies to and a flag given for another machine is refused.
type machineFlags struct {
	machine string
	feed    float64 // all
	plunge  float64 // router, plotter
	rpm     float64 // router
	spinUp  float64 // router
	safeZ   float64 // router
	power   float64 // laser
	focusZ  float64 // laser
	penUp   float64 // plotter
	rapid   float64 // the time estimate
	accel   float64
	title   string
	travel  string
	report  string
	out     string
	pics    pictureFlags

	only map[string]uint8 // flag name → the machines it applies to
	m    toolpath.Machine // resolved
	set  map[string]bool  // the flags given
}

// float registers a float flag that applies to the given machines.
func (f *machineFlags) float(fs *flag.FlagSet, p *float64, name string, machines uint8, value float64, usage string) {
	fs.Float64Var(p, name, value, usage)
	f.only[name] = machines
}

// int registers an int flag that applies to the given machines.
func (f *machineFlags) int(fs *flag.FlagSet, p *int, name string, machines uint8, value int, usage string) {
	fs.IntVar(p, name, value, usage)
	f.only[name] = machines
}

// register adds the shared flags to fs.
func (f *machineFlags) register(fs *flag.FlagSet) {
	f.only = map[string]uint8{}
	fs.StringVar(&f.machine, "machine", "", "machine `kind`: router, laser or plotter (required)")
	f.float(fs, &f.feed, "feed", forAll, 0, "cutting `feed` per minute (default: router 1000, laser 600, plotter 3000 mm/min; 40, 24, 120 in/min)")
	f.float(fs, &f.plunge, "plunge", forRouter|forPlotter, 0, "`feed` per minute into the stock, or of the pen going down (default: router 300 mm/min, 12 in/min; plotter the -feed)")
	f.float(fs, &f.rpm, "rpm", forRouter, 18000, "router spindle `speed` (S word)")
	f.float(fs, &f.spinUp, "spin-up", forRouter, 0, "router pause after starting the spindle, in `seconds`")
	f.float(fs, &f.safeZ, "safe-z", forRouter, 5, "router travel `height` above the stock (0.2 with -units inch)")
	f.float(fs, &f.power, "power", forLaser, 0, "laser `power` as the S word, on the machine's own scale (required)")
	f.float(fs, &f.focusZ, "focus-z", forLaser, 0, "laser head `height`, moved to once at the start; without it the program moves no Z")
	f.float(fs, &f.penUp, "pen-up", forPlotter, 3, "plotter pen-up `height` above the paper (0.12 with -units inch)")
	fs.Float64Var(&f.rapid, "rapid", 5000, "rapid `speed` per minute assumed by the time estimate (200 with -units inch)")
	fs.Float64Var(&f.accel, "accel", 500, "acceleration per second² assumed by the time estimate, 0 for none (20 with -units inch)")
	fs.StringVar(&f.title, "title", "", "program `title` for the header comment")
	fs.StringVar(&f.travel, "travel", "", "machine travel `X0,Y0,X1,Y1[,Z0,Z1]`: refuse a program that leaves it")
	fs.StringVar(&f.report, "report", "", "write a JSON report (lengths, time estimate, segments, deviation, extent) to `FILE`")
	fs.StringVar(&f.out, "o", "-", "write the program to `FILE` (- for standard output)")
	f.pics.register(fs)
}

// resolve reads the machine, refuses every flag given that does not apply
// to it, fills in the defaults for the units and checks the shared values.
func (f *machineFlags) resolve(fs *flag.FlagSet, u Units) error {
	f.set = flagsSet(fs)
	m, ok := toolpath.ParseMachine(f.machine)
	switch {
	case f.machine == "":
		return badFlag("machine", "is required: router, laser or plotter")
	case !ok:
		return badFlag("machine", "%q is not a machine; use router, laser or plotter", f.machine)
	}
	f.m = m
	bit := machineBit(m)
	var refused []string
	fs.VisitAll(func(fl *flag.Flag) {
		if only, ok := f.only[fl.Name]; ok && only&bit == 0 {
			refused = append(refused, fl.Name)
		}
	})
	if err := refuseFlags(f.set, "to a "+m.String(), refused...); err != nil {
		return err
	}
	feed := map[toolpath.Machine][2]float64{toolpath.Router: {1000, 40}, toolpath.Laser: {600, 24}, toolpath.Plotter: {3000, 120}}[m]
	if !f.set["feed"] {
		f.feed = feed[0]
		if u == unitsInch {
			f.feed = feed[1]
		}
	}
	if m == toolpath.Router && !f.set["plunge"] {
		f.plunge = 300
		inchDefault(f.set, "plunge", u, &f.plunge, 12)
	}
	inchDefault(f.set, "safe-z", u, &f.safeZ, 0.2)
	inchDefault(f.set, "pen-up", u, &f.penUp, 0.12)
	inchDefault(f.set, "rapid", u, &f.rapid, 200)
	inchDefault(f.set, "accel", u, &f.accel, 20)
	checks := []error{positive("feed", f.feed), positive("rapid", f.rapid), nonNegative("accel", f.accel)}
	switch m {
	case toolpath.Router:
		checks = append(checks, positive("plunge", f.plunge), positive("rpm", f.rpm), nonNegative("spin-up", f.spinUp), positive("safe-z", f.safeZ))
	case toolpath.Laser:
		if !f.set["power"] {
			return badFlag("power", "is required for a laser: the S word on the machine's own power scale")
		}
		checks = append(checks, positive("power", f.power), finite("focus-z", f.focusZ))
	case toolpath.Plotter:
		checks = append(checks, nonNegative("plunge", f.plunge), positive("pen-up", f.penUp))
	}
	for _, err := range checks {
		if err != nil {
			return err
		}
	}
	return nil
}

// setup returns the toolpath setup for the machine flags.
func (f *machineFlags) setup(tol float64, g toolpath.Geometry, decimals int) toolpath.Setup {
	s := toolpath.Setup{Machine: f.m, Tol: tol, Geometry: g, Decimals: decimals}
	switch f.m {
	case toolpath.Router:
		s.SafeZ = f.safeZ
	case toolpath.Laser:
		s.FocusZ = f.focusZ
	case toolpath.Plotter:
		s.PenUp = f.penUp
	}
	return s
}

// config returns the writer configuration for the machine flags; the
// caller adds the title and the header.
func (f *machineFlags) config(u Units, tol float64, decimals int) gcodeout.Config {
	c := gcodeout.Config{
		Machine: f.m,
		Units:   writerUnits(u), Decimals: decimals, Tolerance: tol,
		Feed: f.feed, PlungeFeed: f.plunge, Title: f.title,
	}
	switch f.m {
	case toolpath.Router:
		c.RPM, c.SpinUp, c.SafeZ = f.rpm, f.spinUp, f.safeZ
	case toolpath.Laser:
		c.Power, c.FocusZ, c.UseFocusZ = f.power, f.focusZ, f.set["focus-z"]
	case toolpath.Plotter:
		c.PenUp = f.penUp
	}
	return c
}

// rates returns the speeds the time estimate assumes.
func (f *machineFlags) rates() toolpath.Rates {
	return toolpath.Rates{Feed: f.feed, PlungeFeed: f.plunge, Rapid: f.rapid, Accel: f.accel}
}

// envelope parses -travel; ok is false when it was not given.
func (f *machineFlags) envelope() (env toolpath.Envelope, ok bool, err error) {
	if f.travel == "" {
		return env, false, nil
	}
	n := 4
	if strings.Count(f.travel, ",") == 5 {
		n = 6
	}
	v, err := parseList(f.travel, n)
	if err != nil {
		return env, false, badFlag("travel", "%v (want X0,Y0,X1,Y1 or X0,Y0,X1,Y1,Z0,Z1)", err)
	}
	env = toolpath.Envelope{MinX: v[0], MinY: v[1], MaxX: v[2], MaxY: v[3]}
	if n == 6 {
		env.MinZ, env.MaxZ, env.HasZ = v[4], v[5], true
	}
	return env, true, nil
}

// checkTravel refuses a path that leaves the -travel box, naming every
// axis and by how much.
func (f *machineFlags) checkTravel(p toolpath.Path, unit string) error {
	env, ok, err := f.envelope()
	if err != nil || !ok {
		return err
	}
	err = env.Check(p)
	if err == nil {
		return nil
	}
	var msgs []string
	for _, e := range unjoin(err) {
		var ee *toolpath.EnvelopeError
		switch {
		case errors.As(e, &ee) && errors.Is(e, toolpath.ErrEnvelope):
			side := "lower"
			if ee.Max {
				side = "upper"
			}
			msgs = append(msgs, fmt.Sprintf("%s reaches %s, %s %s beyond the %s limit %s", ee.Axis, fmtNum(ee.Value), fmtNum(ee.Over()), unit, side, fmtNum(ee.Limit)))
		default:
			return badFlag("travel", "%s", libMessage(e))
		}
	}
	return badFlag("travel", "the program would leave the machine's travel: %s", strings.Join(msgs, "; "))
}

// unjoin returns the errors joined in err, or err alone.
func unjoin(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		return j.Unwrap()
	}
	return []error{err}
}

// libMessage returns a library error's message without its package
// prefix.
func libMessage(err error) string {
	msg := err.Error()
	for _, p := range []string{"toolpath: ", "gcodeout: ", "ellipse: "} {
		msg = strings.TrimPrefix(msg, p)
	}
	return msg
}

// opFlagError turns an operation's *toolpath.OpError into a usage error
// naming the flag that sets the field (names maps Go field names to flag
// names; angles are shown in degrees). Approximation errors go through
// specError, with offsetFlag for an inward reach past the fold.
func opFlagError(err error, names map[string]string, offsetFlag string, tol float64) error {
	var oe *toolpath.OpError
	if !errors.As(err, &oe) {
		var se *toolpath.SpecError
		if errors.As(err, &se) {
			return specError(err, offsetFlag, tol)
		}
		return err
	}
	name, ok := names[oe.Field]
	if !ok {
		return fmt.Errorf("%v", err)
	}
	value, limit := oe.Value, oe.Limit
	if strings.HasSuffix(oe.Field, "Angle") {
		value, limit = value*180/math.Pi, limit*180/math.Pi
	}
	reason := libMessage(oe.Err)
	if oe.Err == nil {
		reason = "refused"
	}
	msg := fmtNum(value) + ": " + reason
	if oe.HasLimit {
		msg += " (limit " + fmtNum(limit) + ")"
	}
	return badFlag(name, "%s", msg)
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

// programFor checks cfg (see newProgramWriter) and writes path as its
// program into memory.
func programFor(cfg gcodeout.Config, penUpFlag string, path toolpath.Path) ([]byte, error) {
	wr, err := newProgramWriter(cfg, penUpFlag)
	if err != nil {
		return nil, err
	}
	return renderProgram(wr, path)
}

// renderProgram writes path as the program of wr into memory.
func renderProgram(wr *gcodeout.Writer, path toolpath.Path) ([]byte, error) {
	var buf bytes.Buffer
	wr.Reset(&buf)
	for _, s := range path {
		if err := wr.WriteSegment(s); err != nil {
			return nil, fmt.Errorf("cannot write the program: %v", err)
		}
	}
	if err := wr.Close(); err != nil {
		return nil, fmt.Errorf("cannot write the program: %v", err)
	}
	return buf.Bytes(), nil
}

// writeBytes writes data to out ("-" or empty: standard output) through
// writeFileAtomic.
func writeBytes(e *env, out string, data []byte) error {
	return writeFileAtomic(e, out, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// streamProgram writes the program of wr to out through writeFileAtomic,
// fill giving the writer its segments one at a time, so an error leaves no
// file.
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

// roundTo rounds v to n significant digits, for text.
func roundTo(v float64, n int) float64 {
	if v == 0 {
		return 0
	}
	p := math.Pow(10, float64(n)-math.Ceil(math.Log10(math.Abs(v))))
	return math.Round(v*p) / p
}

// firstError returns the first non-nil error.
func firstError(errs ...error) error {
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}

// positiveIfSet checks a flag that must be greater than zero when given.
func positiveIfSet(set map[string]bool, name string, v float64) error {
	if !set[name] {
		return nil
	}
	return positive(name, v)
}

// rangeInt checks an integer flag against [lo, hi].
func rangeInt(name string, v, lo, hi int) error {
	if v < lo || v > hi {
		return badFlag(name, "%d is out of range; use %d to %d", v, lo, hi)
	}
	return nil
}

// parseOperation parses the flags of an operation command and resolves
// what every operation shares: the shape (required), its units and the
// machine flags. machine, when not empty, fixes the machine kind for a
// command that has no -machine flag.
func parseOperation(fs *flag.FlagSet, args []string, shape *shapeFlags, mf *machineFlags, machine string) (ellipse.Ellipse, Units, error) {
	if err := parseFlags(fs, args, 0); err != nil {
		return ellipse.Ellipse{}, "", err
	}
	if !shape.given() {
		return ellipse.Ellipse{}, "", badFlag("size", "is required (for example -size 600x400)")
	}
	el, err := shape.ellipse()
	if err != nil {
		return ellipse.Ellipse{}, "", err
	}
	u, _ := parseUnits(shape.units)
	if machine != "" {
		mf.machine = machine
	}
	if err := mf.resolve(fs, u); err != nil {
		return ellipse.Ellipse{}, "", err
	}
	return el, u, nil
}
