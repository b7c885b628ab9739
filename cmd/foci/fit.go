package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/focitools/foci/ellipse"
)

// fitReport is the JSON form of "foci fit".
type fitReport struct {
	Units              string         `json:"units"`
	Points             int            `json:"points"`
	Center             [2]float64     `json:"center"`
	SemiAxes           [2]float64     `json:"semi_axes"` // a ≥ b
	Rotation           float64        `json:"rotation"`  // degrees of the major axis, [0, 180)
	RotationDetermined bool           `json:"rotation_determined"`
	Flags              string         `json:"flags"`
	RMSResidual        float64        `json:"rms_residual"`
	MaxResidual        float64        `json:"max_residual"`
	MaxResidualLine    int            `json:"max_residual_line"`
	Residuals          []float64      `json:"residuals"` // signed, + outside, in input order
	Coverage           float64        `json:"coverage"`  // fraction of the curve, 0 to 1
	Uncertainty        fitUncertainty `json:"uncertainty"`
	Iterations         int            `json:"iterations"`
	Converged          bool           `json:"converged"`
	Warnings           []string       `json:"warnings"`
	maxIndex           int
}

// fitUncertainty holds one standard error of each parameter; null where
// none can be given (five points, or the rotation of a nearly round fit).
type fitUncertainty struct {
	Center   *[2]float64 `json:"center"`
	SemiAxes *[2]float64 `json:"semi_axes"`
	Rotation *float64    `json:"rotation"` // degrees
}

// fitListAll is the most points whose residuals the text report lists
// without -list.
const fitListAll = 25

func runFit(e *env, args []string) error {
	fs := newFlagSet("fit", "fit [-json] [-units mm|inch] [-list] [-min-coverage PERCENT] [-o FILE] FILE.csv|-", e.stderr)
	units := fs.String("units", "mm", "length units of the points: mm or inch")
	asJSON := fs.Bool("json", false, "print JSON instead of text")
	list := fs.Bool("list", false, "list the residual of every point (done anyway up to 25 points)")
	minCoverage := fs.Float64("min-coverage", 50, "warn when the points span less than this `percent` of the curve")
	out := fs.String("o", "-", "write the report to `FILE` instead of standard output")
	path, err := parseFitArgs(fs, args)
	if err != nil {
		return err
	}
	u, err := parseUnits(*units)
	if err != nil {
		return err
	}
	if !(*minCoverage >= 0 && *minCoverage <= 100) {
		return badFlag("min-coverage", "%s is out of range; use 0 to 100 (percent of the curve)", fmtNum(*minCoverage))
	}
	name := path
	if path == "-" {
		name = "standard input"
	}
	data, err := readInput(e, path)
	if err != nil {
		return err
	}
	pts, lines, err := parseMeasuredPoints(data, name)
	if err != nil {
		return err
	}
	res, err := ellipse.Fit(pts, ellipse.FitMinCoverage(*minCoverage/100))
	if err != nil {
		return fitInputError(err, name, pts, lines)
	}
	r := newFitReport(res, u, lines)
	return writeFileAtomic(e, *out, func(w io.Writer) error {
		if *asJSON {
			return writeJSON(w, r)
		}
		return writeFitText(w, r, name, pts, lines, *list)
	})
}

// parseFitArgs parses the flags, which may stand before or after the one
// file argument, and returns the file.
func parseFitArgs(fs *flag.FlagSet, args []string) (string, error) {
	path := ""
	for {
		if err := parseFlags(fs, args, len(args)); err != nil {
			return "", err
		}
		if fs.NArg() == 0 {
			break
		}
		if path != "" {
			return "", fmt.Errorf("unexpected argument %q: give one file of measured points", fs.Arg(0))
		}
		path, args = fs.Arg(0), fs.Args()[1:]
	}
	if path == "" {
		return "", errors.New("need a file of measured points, one x,y pair a line (or - for standard input)")
	}
	return path, nil
}

// parseMeasuredPoints reads one x,y pair a line, separated by a comma, a
// semicolon, a tab or spaces. Blank lines and everything after a # are
// skipped, and so is a first line without any number (a header). It
// returns the points with their line numbers, or an error that names the
// line and quotes it.
func parseMeasuredPoints(data []byte, name string) ([]ellipse.Point, []int, error) {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf")) // a spreadsheet's byte-order mark
	var pts []ellipse.Point
	var lines []int
	seenContent := false
	for i, raw := range strings.Split(string(data), "\n") {
		lineNo := i + 1
		text := strings.TrimRight(raw, "\r")
		content := text
		if k := strings.IndexByte(content, '#'); k >= 0 {
			content = content[:k]
		}
		content = strings.TrimSpace(content)
		if content == "" {
			continue
		}
		fields := fitSplitFields(content)
		first := !seenContent
		seenContent = true
		bad := func(format string, a ...any) error {
			return fmt.Errorf("%s line %d: %q: %s", name, lineNo, strings.TrimSpace(text), fmt.Sprintf(format, a...))
		}
		if first && fitIsHeader(fields) {
			continue
		}
		if len(fields) != 2 {
			return nil, nil, bad("want two numbers x,y; found %s", fitPlural(len(fields), "field"))
		}
		var xy [2]float64
		for k, f := range fields {
			v, err := strconv.ParseFloat(f, 64)
			switch {
			case err != nil && strings.Contains(f, ","):
				return nil, nil, bad("%q is not a number (use a point as the decimal mark)", f)
			case err != nil:
				return nil, nil, bad("%q is not a number", f)
			case math.IsNaN(v) || math.IsInf(v, 0):
				return nil, nil, bad("%q is not a finite number", f)
			}
			xy[k] = v
		}
		pts = append(pts, ellipse.Point{X: xy[0], Y: xy[1]})
		lines = append(lines, lineNo)
	}
	if len(pts) == 0 {
		return nil, nil, fmt.Errorf("%s has no points: want one x,y pair a line", name)
	}
	return pts, lines, nil
}

// fitSplitFields splits a line at semicolons, else tabs, else commas,
// else runs of spaces, trimming each field. Semicolons and tabs come
// first because files that use them often have a comma as the decimal
// mark, which then gets its own message.
func fitSplitFields(s string) []string {
	var parts []string
	switch {
	case strings.Contains(s, ";"):
		parts = strings.Split(s, ";")
	case strings.Contains(s, "\t"):
		parts = strings.Split(s, "\t")
	case strings.Contains(s, ","):
		parts = strings.Split(s, ",")
	default:
		return strings.Fields(s)
	}
	for i := range parts {
		parts[i] = strings.TrimSpace(parts[i])
	}
	return parts
}

// fitIsHeader reports whether a first line names its columns: no field is
// a number or begins like one ("1,5" is a number with a decimal comma,
// not a name).
func fitIsHeader(fields []string) bool {
	for _, f := range fields {
		if _, err := strconv.ParseFloat(f, 64); err == nil {
			return false
		}
		if f != "" && strings.ContainsRune("0123456789+-.", rune(f[0])) {
			return false
		}
	}
	return true
}

// fitInputError turns a refusal of the fit into a message about the
// input, with line numbers in place of point indexes.
func fitInputError(err error, name string, pts []ellipse.Point, lines []int) error {
	var fe *ellipse.FitError
	if !errors.As(err, &fe) {
		return fmt.Errorf("%s: %v", name, err)
	}
	switch {
	case errors.Is(err, ellipse.ErrTooFewPoints):
		return fmt.Errorf("%s has %s; a fit needs at least 5, better 8 or more spread round the curve", name, fitPlural(len(pts), "point"))
	case errors.Is(err, ellipse.ErrDuplicatePoint):
		p := pts[fe.Index]
		return fmt.Errorf("%s lines %d and %d give the same point (%s, %s): remove the repeat", name, lines[fe.Index], lines[fe.Other], fmtNum(p.X), fmtNum(p.Y))
	case errors.Is(err, ellipse.ErrCollinear):
		return fmt.Errorf("the %d points of %s lie on one straight line: no ellipse passes through them", len(pts), name)
	case fe.Index >= 0:
		p := pts[fe.Index]
		return fmt.Errorf("%s line %d: (%s, %s): %s", name, lines[fe.Index], fmtNum(p.X), fmtNum(p.Y), strings.TrimPrefix(err.Error(), "ellipse: fit: "))
	}
	return fmt.Errorf("%s: %s", name, strings.TrimPrefix(err.Error(), "ellipse: fit: "))
}

// fitDecimals is the number of decimals lengths are shown with: a
// micrometre in mm, a tenth of a thousandth in inches.
func fitDecimals(u Units) int {
	if u == unitsInch {
		return 4
	}
	return 3
}

// fitFixed formats v with d decimals and no trailing zeros.
func fitFixed(v float64, d int) string {
	s := strconv.FormatFloat(v, 'f', d, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return fitNoNegativeZero(s)
}

func newFitReport(res ellipse.FitResult, u Units, lines []int) fitReport {
	el := res.Ellipse
	c := el.Center()
	rot := el.MajorAngle() * 180 / math.Pi
	d := fitDecimals(u)
	// Round the angle as it is shown, so that 179.9999 becomes 0, not 180.
	shown := math.Round(rot*1000) / 1000
	if shown >= 180 {
		shown -= 180
	}
	r := fitReport{
		Units:              string(u),
		Points:             len(res.Residuals),
		Center:             [2]float64{c.X, c.Y},
		SemiAxes:           [2]float64{el.SemiMajor(), el.SemiMinor()},
		Rotation:           rot,
		RotationDetermined: res.RotationDetermined,
		Flags: "-size " + fitFixed(2*el.SemiMajor(), d) + "x" + fitFixed(2*el.SemiMinor(), d) +
			" -center " + fitFixed(c.X, d) + "," + fitFixed(c.Y, d) +
			" -rotate " + fitFixed(shown, 3) + " -units " + string(u),
		RMSResidual:     res.RMS,
		MaxResidual:     res.MaxResidual,
		MaxResidualLine: lines[res.MaxIndex],
		maxIndex:        res.MaxIndex,
		Residuals:       res.Residuals,
		Coverage:        res.Coverage,
		Iterations:      res.Iterations,
		Converged:       res.Converged,
		Warnings:        res.Warnings,
	}
	if r.Warnings == nil {
		r.Warnings = []string{}
	}
	un := res.Uncertainty
	if fitFinitePair(un.Center.X, un.Center.Y) {
		r.Uncertainty.Center = &[2]float64{un.Center.X, un.Center.Y}
	}
	if fitFinitePair(un.SemiMajor, un.SemiMinor) {
		r.Uncertainty.SemiAxes = &[2]float64{un.SemiMajor, un.SemiMinor}
	}
	if fitFinitePair(un.Rotation, 0) {
		deg := un.Rotation * 180 / math.Pi
		r.Uncertainty.Rotation = &deg
	}
	return r
}

// fitPlural returns "1 point", "3 points".
func fitPlural(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return strconv.Itoa(n) + " " + noun + "s"
}

func fitFinitePair(a, b float64) bool {
	return !math.IsNaN(a) && !math.IsInf(a, 0) && !math.IsNaN(b) && !math.IsInf(b, 0)
}

func writeFitText(w io.Writer, r fitReport, name string, pts []ellipse.Point, lines []int, list bool) error {
	d := fitDecimals(Units(r.Units))
	u := r.Units
	n := func(v float64) string { return fitNoNegativeZero(strconv.FormatFloat(v, 'f', d, 64)) }
	var b strings.Builder
	fmt.Fprintf(&b, "ellipse through %d points of %s (%s)\n", r.Points, name, u)
	rotText := "major axis at " + strconv.FormatFloat(r.Rotation, 'f', 3, 64) + "°"
	if !r.RotationDetermined {
		rotText = "rotation not determined (nearly round)"
	}
	fmt.Fprintf(&b, "  size       %s x %s %s, centre (%s, %s), %s\n", n(2*r.SemiAxes[0]), n(2*r.SemiAxes[1]), u, n(r.Center[0]), n(r.Center[1]), rotText)
	un := r.Uncertainty
	if un.Center != nil && un.SemiAxes != nil {
		rotUnc := ""
		if un.Rotation != nil {
			rotUnc = ", rotation " + strconv.FormatFloat(*un.Rotation, 'f', 3, 64) + "°"
		}
		fmt.Fprintf(&b, "  ± 1 s.e.   centre %s, %s; semi-axes %s, %s%s\n", n(un.Center[0]), n(un.Center[1]), n(un.SemiAxes[0]), n(un.SemiAxes[1]), rotUnc)
	}
	fmt.Fprintf(&b, "  flags      %s\n", r.Flags)
	b.WriteString("             (the shape flags of info, divide, path, profile, pocket and drill)\n")
	side := " (outside)"
	if r.Residuals[r.maxIndex] < 0 {
		side = " (inside)"
	}
	if strings.Trim(n(r.MaxResidual), "0.") == "" {
		side = ""
	}
	fmt.Fprintf(&b, "  residuals  rms %s %s, largest %s %s%s at line %d\n", n(r.RMSResidual), u, n(r.MaxResidual), u, side, r.MaxResidualLine)
	fmt.Fprintf(&b, "  coverage   %.0f%% of the curve\n", 100*r.Coverage)
	if list || r.Points <= fitListAll {
		fmt.Fprintf(&b, "\n  %6s %14s %14s %12s\n", "line", "x", "y", "residual")
		for i, p := range pts {
			fmt.Fprintf(&b, "  %6d %14s %14s %12s\n", lines[i], n(p.X), n(p.Y), fitSigned(r.Residuals[i], d))
		}
		b.WriteString("  (residual: distance from the curve, + outside, - inside)\n")
	}
	for _, warn := range r.Warnings {
		fmt.Fprintf(&b, "warning: %s\n", warn)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// fitSigned formats a residual with its sign; one that rounds to zero
// shows as +0.
func fitSigned(v float64, d int) string {
	s := fitNoNegativeZero(strconv.FormatFloat(v, 'f', d, 64))
	if !strings.HasPrefix(s, "-") {
		s = "+" + s
	}
	return s
}

// fitNoNegativeZero turns a formatted "-0.000" into "0.000".
func fitNoNegativeZero(s string) string {
	if strings.HasPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		return s[1:]
	}
	return s
}
