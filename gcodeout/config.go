package gcodeout

import "math"

// MaxDecimals is the largest number of coordinate decimals the writer
// prints.
const MaxDecimals = 8

// Arc radius limits of NIST RS274NGC v3 §3.5.3, centre format arcs
// (Kramer, Proctor & Messina, NISTIR 6556, 2000): the distance from the
// start to the centre and from the end to the centre may differ by at most
// 0.002 mm, or 0.0002 in when programming in inches.
const (
	ArcRadiusLimitMM   = 0.002
	ArcRadiusLimitInch = 0.0002
)

// Config says what program to write: for which machine, in which units and
// at which feeds, heights and powers. Every length, height and feed is in
// Units; the writer converts nothing. Fields that do not apply to the
// machine are ignored, but every number must still be finite and none of
// them negative except heights.
type Config struct {
	// Machine is the machine kind; it must be set.
	Machine Machine
	// Units is mm (G21, the zero value) or inch (G20).
	Units Units
	// Decimals forces the number of coordinate decimals. Zero chooses
	// Decimals(Tolerance, Units). A forced value must be at least
	// MinDecimals(Units) and at most MaxDecimals.
	Decimals int
	// Tolerance is the tolerance the path was made to, in Units. It
	// chooses the decimals when Decimals is zero (zero Tolerance: the
	// minimum for the units) and is shown in the header when
	// Header.Tolerance is empty.
	Tolerance float64

	// Feed is the cutting feed per minute (G94), used by every cut move
	// whose segment has no Feed of its own. It must be greater than zero.
	Feed float64
	// PlungeFeed is the feed of plunges: cut lines that only move down in
	// Z, and segments with the role toolpath.Plunge, when they have no
	// Feed of their own. Zero means Feed.
	PlungeFeed float64

	// RPM is the router spindle speed (S word); it must be greater than
	// zero for a router.
	RPM float64
	// SpinUp is a pause in seconds after the router spindle starts (G4);
	// zero writes none.
	SpinUp float64
	// SafeZ is the router's travel height above Z0: the start block moves
	// there before the spindle starts and the end block retracts there.
	// It must be greater than zero for a router.
	SafeZ float64

	// Power is the laser S word; it must be greater than zero for a laser.
	// The beam is switched on with M3 S<Power> before a cut move that
	// follows a travel (or the start), and off with M5 before every travel.
	Power float64
	// PierceDwell is a pause in seconds written after each beam-on (G4),
	// to pierce the material before moving; zero writes none.
	PierceDwell float64
	// FocusZ is the laser head height written once in the start block,
	// only when UseFocusZ is set. Without it a laser program has no Z word
	// at all.
	FocusZ float64
	// UseFocusZ asks for the FocusZ move in the laser start block.
	UseFocusZ bool

	// PenUp is the plotter's travel height: the start and end blocks lift
	// the pen to it. It must be above PenDown for a plotter.
	PenUp float64
	// PenDown is the plotter's drawing height (default 0, the paper). The
	// writer writes the path's Z as given; PenDown is for the operations
	// that build plotter paths, and is checked against PenUp.
	PenDown float64

	// Title names the program in the first header comment. It is
	// sanitised: it can never become code.
	Title string
	// Header holds the descriptive header lines.
	Header Header
}

// Header holds plain-text descriptions for the header comment block. Empty
// fields are left out (Z0 gets a default per machine). Every string is
// sanitised like the title: parentheses become brackets, semicolons
// become commas, line breaks and control characters become spaces,
// characters outside printable ASCII become '?', runs of spaces collapse,
// and the text is cut to a line's length.
type Header struct {
	Shape      string   // the shape, e.g. "ellipse 300 x 200 at 0,0"
	Tool       string   // the tool, or the kerf for a laser
	Tolerance  string   // the tolerance, if Config.Tolerance should not be shown
	ZeroZ      string   // what Z0 means; empty: a default for the machine
	Operations []string // one line each: passes, depths, tabs, ...
}

// MinDecimals returns the fewest coordinate decimals the writer allows:
// 3 for mm (1 µm) and 5 for inch (0.00001 in, 0.254 µm).
//
// With three points of an arc (start, end, centre) each rounded by up to
// half a unit in X and Y, the start and end radii can disagree by up to
// 2√2 ≈ 2.83 units in the last place. At 5 inch decimals that is 0.000028
// in, far inside the 0.0002 in limit, and the inch grid is no coarser than
// the mm grid. At 3 mm decimals it could reach 0.0028 mm against a limit of
// 0.002 mm, so the writer moves an arc's centre by one unit when rounding
// alone would come near the limit (see [Writer.WriteSegment]).
func MinDecimals(units Units) int {
	if units == Inch {
		return 5
	}
	return 3
}

// Decimals returns the number of coordinate decimals for a path made to
// tolerance tol in the given units: the fewest, at least MinDecimals(units)
// and at most MaxDecimals, for which rounding (half a unit in the last
// place) is at most tol/20, that is 10^-d ≤ tol/10. A twentieth keeps
// rounding a small, fixed share of the tolerance that the approximation
// can budget for.
//
// Special cases are:
//
//	Decimals(+Inf, u) = MinDecimals(u)
//	Decimals(tol ≤ 0, u) = MaxDecimals
//	Decimals(NaN, u) = MaxDecimals
func Decimals(tol float64, units Units) int {
	d := MinDecimals(units)
	switch {
	case math.IsInf(tol, 1):
		return d
	case !(tol > 0):
		return MaxDecimals
	}
	for d < MaxDecimals && float64(tol*math.Pow10(d)) < 10 {
		d++
	}
	return d
}

// arcRadiusLimit returns the RS274NGC arc radius limit for the units.
func arcRadiusLimit(units Units) float64 {
	if units == Inch {
		return ArcRadiusLimitInch
	}
	return ArcRadiusLimitMM
}

// decimals returns the coordinate decimals of a valid configuration.
func (c *Config) decimals() int {
	if c.Decimals != 0 {
		return c.Decimals
	}
	if c.Tolerance == 0 {
		return MinDecimals(c.Units)
	}
	return Decimals(c.Tolerance, c.Units)
}

// validate checks the configuration and returns the first problem as an
// *Error naming the field.
func (c *Config) validate() error {
	if c.Machine < Router || c.Machine > Plotter {
		return &Error{Field: "Machine", Value: float64(c.Machine), Err: ErrUnknown}
	}
	if c.Units > Inch {
		return &Error{Field: "Units", Value: float64(c.Units), Err: ErrUnknown}
	}
	if c.Decimals != 0 {
		if lo := MinDecimals(c.Units); c.Decimals < lo {
			return &Error{Field: "Decimals", Value: float64(c.Decimals), Limit: float64(lo), HasLimit: true, Err: ErrRange}
		}
		if c.Decimals > MaxDecimals {
			return &Error{Field: "Decimals", Value: float64(c.Decimals), Limit: MaxDecimals, HasLimit: true, Err: ErrRange}
		}
	}
	nonNegative := []struct {
		name string
		v    float64
	}{
		{"Tolerance", c.Tolerance}, {"Feed", c.Feed}, {"PlungeFeed", c.PlungeFeed},
		{"RPM", c.RPM}, {"SpinUp", c.SpinUp}, {"Power", c.Power}, {"PierceDwell", c.PierceDwell},
	}
	for _, f := range nonNegative {
		if err := checkFinite(f.name, f.v); err != nil {
			return err
		}
		if f.v < 0 {
			return &Error{Field: f.name, Value: f.v, Err: ErrNegative}
		}
	}
	scale := math.Pow10(c.decimals())
	heights := []struct {
		name string
		v    float64
	}{{"SafeZ", c.SafeZ}, {"FocusZ", c.FocusZ}, {"PenUp", c.PenUp}, {"PenDown", c.PenDown}}
	for _, f := range heights {
		if err := checkFinite(f.name, f.v); err != nil {
			return err
		}
		if _, ok := grid(f.v, scale); !ok {
			return &Error{Field: f.name, Value: f.v, Limit: maxGrid / scale, HasLimit: true, Err: ErrRange}
		}
	}
	words := []struct {
		name string
		v    float64
	}{{"Feed", c.Feed}, {"PlungeFeed", c.PlungeFeed}, {"RPM", c.RPM}, {"SpinUp", c.SpinUp}, {"Power", c.Power}, {"PierceDwell", c.PierceDwell}}
	for _, f := range words {
		n, ok := grid(f.v, math.Pow10(wordDecimals))
		if !ok {
			return &Error{Field: f.name, Value: f.v, Limit: maxGrid / math.Pow10(wordDecimals), HasLimit: true, Err: ErrRange}
		}
		if n == 0 && f.v > 0 { // would print as 0
			return &Error{Field: f.name, Value: f.v, Limit: 0.5 / math.Pow10(wordDecimals), HasLimit: true, Err: ErrRange}
		}
	}
	if c.Feed == 0 {
		return &Error{Field: "Feed", Value: c.Feed, Err: ErrNotPositive}
	}
	switch c.Machine {
	case Router:
		if c.RPM == 0 {
			return &Error{Field: "RPM", Value: c.RPM, Err: ErrNotPositive}
		}
		if !(c.SafeZ > 0) {
			return &Error{Field: "SafeZ", Value: c.SafeZ, Err: ErrNotPositive}
		}
	case Laser:
		if c.Power == 0 {
			return &Error{Field: "Power", Value: c.Power, Err: ErrNotPositive}
		}
	case Plotter:
		if !(c.PenUp > c.PenDown) {
			return &Error{Field: "PenUp", Value: c.PenUp, Limit: c.PenDown, HasLimit: true, Err: ErrPenHeights}
		}
	}
	return nil
}

func checkFinite(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &Error{Field: name, Value: v, Err: ErrNotFinite}
	}
	return nil
}
