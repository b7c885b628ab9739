package gcodeout

import (
	"errors"
	"strconv"
)

// Sentinel errors wrapped by [*Error] and [*SegmentError]; test for them
// with errors.Is.
var (
	// ErrNotFinite reports a NaN or infinite number.
	ErrNotFinite = errors.New("not a finite number")
	// ErrNotPositive reports a value that must be greater than zero.
	ErrNotPositive = errors.New("must be greater than zero")
	// ErrNegative reports a value that must not be negative.
	ErrNegative = errors.New("must not be negative")
	// ErrUnknown reports a machine kind, units value, segment kind or
	// motion that the writer does not know.
	ErrUnknown = errors.New("unknown value")
	// ErrRange reports a number outside the range the writer accepts; the
	// error carries the limit.
	ErrRange = errors.New("out of range")
	// ErrPenHeights reports a PenUp that is not above PenDown.
	ErrPenHeights = errors.New("must be above PenDown")
	// ErrGap reports a segment that does not start where the machine is:
	// more than one unit in the last written place from the end of the
	// previous segment (or, for the first segment, from the start-block
	// height).
	ErrGap = errors.New("does not start where the previous move ended")
	// ErrArcUnknownStart reports an arc written before any move has fixed
	// the X and Y position, so its centre offsets I J have nothing to be
	// relative to.
	ErrArcUnknownStart = errors.New("arc before the XY position is known: start with a line or travel")
	// ErrArcRadius reports an arc whose radius rounds to zero, or whose
	// start and end radii cannot be made to agree within the RS274NGC limit
	// at the chosen decimals.
	ErrArcRadius = errors.New("arc cannot be written within the radius limit")
	// ErrState reports a call out of order: a second WriteHeader, or any
	// write after Close.
	ErrState = errors.New("call out of order")
)

// Error records a rejected [Config] field: its name as written in Go, its
// value, why, and the limit when one applies.
type Error struct {
	Field string  // the Config field, e.g. "Feed" or "Header.Title"
	Value float64 // the rejected value
	Limit float64 // the limit that was passed, when HasLimit
	// HasLimit says whether Limit is meaningful.
	HasLimit bool
	Err      error // one of the sentinel errors
}

// Error returns a message of the form
// "gcodeout: Feed 0: must be greater than zero".
func (e *Error) Error() string {
	b := make([]byte, 0, 96)
	b = append(b, "gcodeout: "...)
	b = appendFieldError(b, e.Field, e.Value, e.Limit, e.HasLimit, e.Err)
	return string(b)
}

// Unwrap returns the sentinel error.
func (e *Error) Unwrap() error { return e.Err }

// SegmentError records a rejected segment: its index among the segments
// given to the writer (from 0), the word or field at fault ("X", "Y",
// "Z", "I", "J", "F", "P", "Kind", "Motion" or "Start"), its value, and
// why.
type SegmentError struct {
	Index int     // index of the segment, counting from 0
	Field string  // the word or field at fault
	Value float64 // the rejected value
	Limit float64 // the limit that was passed, when HasLimit
	// HasLimit says whether Limit is meaningful.
	HasLimit bool
	Err      error // one of the sentinel errors
}

// Error returns a message of the form
// "gcodeout: segment 4: X NaN: not a finite number".
func (e *SegmentError) Error() string {
	b := make([]byte, 0, 112)
	b = append(b, "gcodeout: segment "...)
	b = strconv.AppendInt(b, int64(e.Index), 10)
	b = append(b, ": "...)
	b = appendFieldError(b, e.Field, e.Value, e.Limit, e.HasLimit, e.Err)
	return string(b)
}

// Unwrap returns the sentinel error.
func (e *SegmentError) Unwrap() error { return e.Err }

func appendFieldError(b []byte, field string, value, limit float64, hasLimit bool, err error) []byte {
	b = append(b, field...)
	b = append(b, ' ')
	b = strconv.AppendFloat(b, value, 'g', -1, 64)
	b = append(b, ": "...)
	b = append(b, err.Error()...)
	if hasLimit {
		b = append(b, " (limit "...)
		b = strconv.AppendFloat(b, limit, 'g', 10, 64)
		b = append(b, ')')
	}
	return b
}
