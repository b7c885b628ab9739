package toolpath

import (
	"errors"
	"strconv"
)

// Errors returned by the operations ([Profile], [Drill], [Dash]) and by
// [Envelope.Check], wrapped in an [*OpError] or an [*EnvelopeError]; test
// for them with errors.Is.
var (
	// ErrNotFinite reports a NaN or infinite value.
	ErrNotFinite = errors.New("not a finite number")
	// ErrNotPositive reports a size, count or height that must be
	// greater than zero.
	ErrNotPositive = errors.New("must be greater than zero")
	// ErrNegative reports a value that must not be negative.
	ErrNegative = errors.New("must not be negative")
	// ErrMachine reports an unknown or missing machine kind.
	ErrMachine = errors.New("unknown machine: use router, laser or plotter")
	// ErrNotForMachine reports a field set that the chosen machine does
	// not use: it is refused rather than ignored.
	ErrNotForMachine = errors.New("not used by this machine: leave it unset")
	// ErrChoice reports an unknown side or direction.
	ErrChoice = errors.New("unknown choice")
	// ErrToolTooLarge reports a tool (or kerf) too large for an inside
	// cut: the inward offset of the tool-centre path by the tool radius,
	// plus the tolerance zone inside it, must stay below the minimum
	// radius of curvature b²/a, where the inward parallel curves fold.
	// The limit given is the largest diameter, 2·(b²/a − Tol).
	ErrToolTooLarge = errors.New("too large for an inside cut of this ellipse: the inward offset would fold at the ends of the major axis; the largest diameter is 2·(b²/a − tolerance)")
	// ErrTabTooTall reports a tab at least as tall as the depth.
	ErrTabTooTall = errors.New("tabs must be lower than the depth of cut")
	// ErrTabsOverlap reports tabs too wide for their number: the raised
	// stretches (tab width plus the tool diameter each) would meet.
	ErrTabsOverlap = errors.New("tabs too wide for their number: they would overlap; the limit is the largest tab width")
	// ErrLeadTooLarge reports a lead arc that does not fit in the waste
	// of an inside cut.
	ErrLeadTooLarge = errors.New("lead arc does not fit inside the cut; the limit is the largest lead radius")
	// ErrLeadTooSmall reports a lead arc smaller than the tolerance,
	// too small to be worth writing.
	ErrLeadTooSmall = errors.New("lead arc smaller than the tolerance; the limit is the smallest lead radius")
	// ErrRampTooLong reports a ramp longer than one turn of the
	// tool-centre path.
	ErrRampTooLong = errors.New("ramp longer than one turn of the path; the limit is the longest ramp (for an angle: the shallowest)")
	// ErrBoth reports two fields set where only one may be.
	ErrBoth = errors.New("set only one of the two")
	// ErrPenHeights reports a pen-up height not above the pen-down
	// height.
	ErrPenHeights = errors.New("pen-up height must be above the pen-down height")
	// ErrAboveSafe reports a height above the safe height where it must
	// be at or below it.
	ErrAboveSafe = errors.New("must not be above the safe height")
	// ErrCount reports a count below its minimum.
	ErrCount = errors.New("count too small")
	// ErrTooMany reports a count so large that the path would exhaust
	// memory or the machine's buffer.
	ErrTooMany = errors.New("too many: the path would be too long")
	// ErrDashTooShort reports a dash shorter than the tolerance: it would
	// be mostly the approximation's rounding, and very many of them.
	ErrDashTooShort = errors.New("dash shorter than the tolerance (use 0 for dots); the limit is the shortest dash")
	// ErrLimitOrder reports an envelope whose lower limit is above its
	// upper one.
	ErrLimitOrder = errors.New("lower limit above the upper limit")
	// ErrEnvelope reports a path that leaves the machine's travel.
	ErrEnvelope = errors.New("outside the machine's travel")
)

// MaxCount bounds the holes, marks, dashes, passes and tabs of one
// operation, so that a mistyped number is refused rather than allowed to
// exhaust memory.
const MaxCount = 1_000_000

// OpError reports a rejected field of an operation's spec: which field,
// its value, why, and the limit that applies when there is one. Field is
// the Go field name ("Tool", "Depth", "TabHeight", ...), which callers map
// to their own names (a command-line flag, say).
type OpError struct {
	Field    string  // the spec field
	Value    float64 // the rejected value
	Limit    float64 // the limit passed, when HasLimit
	HasLimit bool    // whether Limit is meaningful
	Err      error   // one of the sentinel errors, or an ellipse error
}

// Error returns a message of the form
// "toolpath: Tool 40: too large for an inside cut ... (limit 33.3)".
func (e *OpError) Error() string {
	b := make([]byte, 0, 128)
	b = append(b, "toolpath: "...)
	b = append(b, e.Field...)
	b = append(b, ' ')
	b = strconv.AppendFloat(b, e.Value, 'g', 6, 64)
	b = append(b, ": "...)
	if e.Err != nil {
		b = append(b, e.Err.Error()...)
	}
	if e.HasLimit {
		b = append(b, " (limit "...)
		b = strconv.AppendFloat(b, e.Limit, 'g', 6, 64)
		b = append(b, ')')
	}
	return string(b)
}

// Unwrap returns the sentinel.
func (e *OpError) Unwrap() error { return e.Err }

// opErr returns an *OpError without a limit.
func opErr(field string, v float64, err error) error {
	return &OpError{Field: field, Value: v, Err: err}
}

// opLimit returns an *OpError with a limit.
func opLimit(field string, v, limit float64, err error) error {
	return &OpError{Field: field, Value: v, Limit: limit, HasLimit: true, Err: err}
}

// finite reports whether v is neither NaN nor infinite.
func finite(v float64) bool { return v-v == 0 }

// checkFinite refuses NaN and infinities.
func checkFinite(field string, v float64) error {
	if !finite(v) {
		return opErr(field, v, ErrNotFinite)
	}
	return nil
}

// checkPositive refuses values that are not finite and greater than zero.
func checkPositive(field string, v float64) error {
	if err := checkFinite(field, v); err != nil {
		return err
	}
	if !(v > 0) {
		return opErr(field, v, ErrNotPositive)
	}
	return nil
}

// checkNonNegative refuses values that are not finite and at least zero.
func checkNonNegative(field string, v float64) error {
	if err := checkFinite(field, v); err != nil {
		return err
	}
	if v < 0 {
		return opErr(field, v, ErrNegative)
	}
	return nil
}

// checkUnused refuses a field the machine does not use.
func checkUnused(field string, v float64) error {
	if v != 0 {
		return opErr(field, v, ErrNotForMachine)
	}
	return nil
}
