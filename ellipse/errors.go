package ellipse

import (
	"errors"
	"strconv"
)

// Sentinel errors wrapped by [*Error]; test for them with errors.Is.
var (
	// ErrNotFinite reports a NaN or infinite value.
	ErrNotFinite = errors.New("not a finite number")
	// ErrNotPositive reports a size that is zero or negative.
	ErrNotPositive = errors.New("must be greater than zero")
	// ErrOverflow reports a size whose square, or whose square times
	// another size, would overflow float64.
	ErrOverflow = errors.New("too large: its square overflows")
	// ErrFociTooFar reports a major-axis length not greater than the
	// distance between the foci.
	ErrFociTooFar = errors.New("must be greater than the distance between the foci")
	// ErrOffsetLimit reports an inward offset at or beyond the minimum
	// radius of curvature, where the parallel curve folds.
	ErrOffsetLimit = errors.New("inward offset must be less than the minimum radius of curvature b²/a")
	// ErrCount reports a division count below 1.
	ErrCount = errors.New("count must be at least 1")
)

// Error records a rejected input: which field, its value, why, and the
// limit that applies when there is one.
type Error struct {
	Field string  // the name of the field or argument, as the caller knows it
	Value float64 // the rejected value
	Limit float64 // the limit that was passed, when HasLimit
	// HasLimit says whether Limit is meaningful.
	HasLimit bool
	Err      error // one of the sentinel errors
}

// Error returns a message of the form
// "ellipse: width 0: must be greater than zero".
func (e *Error) Error() string {
	b := make([]byte, 0, 96)
	b = append(b, "ellipse: "...)
	b = append(b, e.Field...)
	b = append(b, ' ')
	b = strconv.AppendFloat(b, e.Value, 'g', -1, 64)
	b = append(b, ": "...)
	b = append(b, e.Err.Error()...)
	if e.HasLimit {
		b = append(b, " ("...)
		b = strconv.AppendFloat(b, e.Limit, 'g', 10, 64)
		b = append(b, ')')
	}
	return string(b)
}

// Unwrap returns the sentinel error.
func (e *Error) Unwrap() error { return e.Err }

// More sentinels for sizes out of the representable range.
var (
	// ErrTooSmall reports a size below 1e-100, whose square underflows.
	ErrTooSmall = errors.New("too small: its square underflows")
	// ErrTooFlat reports a minor semi-axis below 1e-9 of the major one.
	ErrTooFlat = errors.New("too flat: the minor axis must be at least 1e-9 of the major axis")
)
