package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/focitools/foci/ellipse"
)

var (
	// errHelp ends a command that only printed its help.
	errHelp = errors.New("help shown")
	// errViolations ends a check that found violations (exit 1).
	errViolations = errors.New("violations found")
)

// flagError names the flag that is wrong and what is allowed.
type flagError struct {
	flag string
	msg  string
}

func (e *flagError) Error() string { return "-" + e.flag + ": " + e.msg }

// badFlag returns a *flagError with a formatted message.
func badFlag(name, format string, a ...any) error {
	return &flagError{flag: name, msg: fmt.Sprintf(format, a...)}
}

// newFlagSet returns a flag set that reports errors instead of exiting and
// prints its help to w.
func newFlagSet(name, synopsis string, w io.Writer) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(w)
	fs.Usage = func() {
		fmt.Fprintf(w, "Usage: foci %s\n\nFlags:\n", synopsis)
		out := fs.Output()
		fs.SetOutput(w)
		fs.PrintDefaults()
		fs.SetOutput(out)
	}
	return fs
}

// parseFlags parses args, turning -h into errHelp and flag package errors
// into usage errors. It refuses positional arguments unless allowArgs.
func parseFlags(fs *flag.FlagSet, args []string, allowArgs int) error {
	fs.SetOutput(io.Discard)
	err := fs.Parse(args)
	if errors.Is(err, flag.ErrHelp) {
		return errHelp
	}
	if err != nil {
		return err
	}
	if fs.NArg() > allowArgs {
		return fmt.Errorf("unexpected argument %q", fs.Arg(allowArgs))
	}
	return nil
}

// flagsSet returns the names of the flags given on the command line.
func flagsSet(fs *flag.FlagSet) map[string]bool {
	m := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { m[f.Name] = true })
	return m
}

// refuseFlags returns an error naming the first of names that was given,
// saying why it does not apply.
func refuseFlags(set map[string]bool, why string, names ...string) error {
	for _, n := range names {
		if set[n] {
			return badFlag(n, "does not apply %s", why)
		}
	}
	return nil
}

// shapeFlags are the flags every shape command shares.
type shapeFlags struct {
	size   string
	center string
	rotate float64
	units  string
}

func (s *shapeFlags) register(fs *flag.FlagSet, sizeDefault string) {
	fs.StringVar(&s.size, "size", sizeDefault, "full `WxH`: width along the ellipse's own x axis by height along its own y axis")
	fs.StringVar(&s.center, "center", "0,0", "centre `X,Y`")
	fs.Float64Var(&s.rotate, "rotate", 0, "rotation of the own x axis, `degrees` counter-clockwise")
	fs.StringVar(&s.units, "units", "mm", "length units: mm or inch")
}

// given reports whether -size was set or has a default.
func (s *shapeFlags) given() bool { return s.size != "" }

// ellipse builds the ellipse the flags describe.
func (s *shapeFlags) ellipse() (ellipse.Ellipse, error) {
	if _, err := parseUnits(s.units); err != nil {
		return ellipse.Ellipse{}, err
	}
	w, h, err := parsePair(s.size, "x")
	if err != nil {
		return ellipse.Ellipse{}, badFlag("size", "%v (want WxH, two positive lengths such as 600x400)", err)
	}
	cx, cy, err := parsePair(s.center, ",")
	if err != nil {
		return ellipse.Ellipse{}, badFlag("center", "%v (want X,Y such as 0,0)", err)
	}
	if math.IsNaN(s.rotate) || math.IsInf(s.rotate, 0) {
		return ellipse.Ellipse{}, badFlag("rotate", "%v is not a finite angle", s.rotate)
	}
	e, err := ellipse.FromSize(w, h, ellipse.Point{X: cx, Y: cy}, s.rotate*math.Pi/180)
	if err != nil {
		var ee *ellipse.Error
		if errors.As(err, &ee) {
			name := "size"
			if strings.HasPrefix(ee.Field, "center") {
				name = "center"
			}
			return ellipse.Ellipse{}, badFlag(name, "%s %s: %v", ee.Field, fmtNum(ee.Value), describeLimit(ee))
		}
		return ellipse.Ellipse{}, badFlag("size", "%v", err)
	}
	return e, nil
}

// describeLimit renders an ellipse error's reason with its limit.
func describeLimit(e *ellipse.Error) string {
	if e.HasLimit {
		return fmt.Sprintf("%v (limit %s)", e.Err, fmtNum(e.Limit))
	}
	return e.Err.Error()
}

// Units is a length unit at the boundary of the program.
type Units string

const (
	unitsMM   Units = "mm"
	unitsInch Units = "inch"
)

func parseUnits(s string) (Units, error) {
	switch s {
	case "mm":
		return unitsMM, nil
	case "inch", "in":
		return unitsInch, nil
	}
	return "", badFlag("units", "%q is not a unit; use mm or inch", s)
}

// parsePair parses "A<sep>B" into two finite numbers.
func parsePair(s, sep string) (float64, float64, error) {
	parts := strings.Split(strings.ToLower(strings.TrimSpace(s)), sep)
	if len(parts) != 2 {
		return 0, 0, fmt.Errorf("%q is not two numbers separated by %q", s, sep)
	}
	a, err := parseFinite(parts[0])
	if err != nil {
		return 0, 0, err
	}
	b, err := parseFinite(parts[1])
	if err != nil {
		return 0, 0, err
	}
	return a, b, nil
}

// parseList parses n comma-separated finite numbers.
func parseList(s string, n int) ([]float64, error) {
	parts := strings.Split(s, ",")
	if len(parts) != n {
		return nil, fmt.Errorf("%q is not %d comma-separated numbers", s, n)
	}
	out := make([]float64, n)
	for i, p := range parts {
		v, err := parseFinite(p)
		if err != nil {
			return nil, err
		}
		out[i] = v
	}
	return out, nil
}

func parseFinite(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", strings.TrimSpace(s))
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a finite number", strings.TrimSpace(s))
	}
	return v, nil
}

// fmtNum formats a number briefly for messages.
func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }

// positive checks that a flag value is finite and greater than zero.
func positive(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
		return badFlag(name, "%s must be a finite number greater than zero", fmtNum(v))
	}
	return nil
}

// nonNegative checks that a flag value is finite and at least zero.
func nonNegative(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
		return badFlag(name, "%s must be a finite number, zero or more", fmtNum(v))
	}
	return nil
}

// finite checks that a flag value is a finite number.
func finite(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return badFlag(name, "%s must be a finite number", fmtNum(v))
	}
	return nil
}
