package toolpath

import (
	"errors"
	"strconv"
)

// Envelope is the travel of a machine: the box its tool centre can reach,
// in the path's coordinates. Z limits apply only when HasZ is set.
type Envelope struct {
	MinX, MinY, MaxX, MaxY float64
	MinZ, MaxZ             float64
	HasZ                   bool
}

// EnvelopeError reports a path that leaves the envelope along one axis,
// or an envelope that is not a box.
type EnvelopeError struct {
	Axis  string  // "X", "Y" or "Z"
	Max   bool    // the upper limit was passed (else the lower)
	Value float64 // how far the path reaches along the axis
	Limit float64 // the limit it passes
	Err   error   // ErrEnvelope, or ErrNotFinite / ErrLimitOrder for a bad envelope
}

// Over returns by how much the path passes the limit (positive).
func (e *EnvelopeError) Over() float64 {
	if e.Max {
		return e.Value - e.Limit
	}
	return e.Limit - e.Value
}

// Error returns a message such as "toolpath: X reaches -312.5, 12.5
// beyond the lower travel limit -300: outside the machine's travel".
func (e *EnvelopeError) Error() string {
	b := make([]byte, 0, 128)
	b = append(b, "toolpath: "...)
	side := "lower"
	if e.Max {
		side = "upper"
	}
	if e.Err != ErrEnvelope {
		b = append(b, "envelope "...)
		b = append(b, e.Axis...)
		b = append(b, ' ')
		b = append(b, side...)
		b = append(b, " limit "...)
		b = strconv.AppendFloat(b, e.Value, 'g', 6, 64)
		b = append(b, ": "...)
		b = append(b, e.Err.Error()...)
		return string(b)
	}
	b = append(b, e.Axis...)
	b = append(b, " reaches "...)
	b = strconv.AppendFloat(b, e.Value, 'g', 8, 64)
	b = append(b, ", "...)
	b = strconv.AppendFloat(b, e.Over(), 'g', 6, 64)
	b = append(b, " beyond the "...)
	b = append(b, side...)
	b = append(b, " travel limit "...)
	b = strconv.AppendFloat(b, e.Limit, 'g', 8, 64)
	b = append(b, ": "...)
	b = append(b, e.Err.Error()...)
	return string(b)
}

// Unwrap returns the sentinel.
func (e *EnvelopeError) Unwrap() error { return e.Err }

// Check returns nil if every point of p lies inside e (limits included),
// and otherwise one [*EnvelopeError] per limit passed, joined with
// errors.Join, in the order X lower, X upper, Y lower, Y upper, Z lower,
// Z upper; errors.As finds the first. Arcs count by their exact bounding
// box ([Path.Bounds]), so an arc that bulges past a limit between its ends
// is caught. An empty path passes. An envelope with a NaN or infinite
// limit, or a lower limit above the upper one, is refused the same way
// with ErrNotFinite or ErrLimitOrder.
func (e Envelope) Check(p Path) error {
	if err := e.valid(); err != nil {
		return err
	}
	minX, minY, maxX, maxY, ok := p.Bounds()
	if !ok {
		return nil
	}
	var errs []error
	add := func(axis string, lo, hi, vlo, vhi float64) {
		if vlo < lo {
			errs = append(errs, &EnvelopeError{Axis: axis, Value: vlo, Limit: lo, Err: ErrEnvelope})
		}
		if vhi > hi {
			errs = append(errs, &EnvelopeError{Axis: axis, Max: true, Value: vhi, Limit: hi, Err: ErrEnvelope})
		}
	}
	add("X", e.MinX, e.MaxX, minX, maxX)
	add("Y", e.MinY, e.MaxY, minY, maxY)
	if e.HasZ {
		lo, hi, _ := p.ZRange()
		add("Z", e.MinZ, e.MaxZ, lo, hi)
	}
	return errors.Join(errs...)
}

// valid checks that e is a box.
func (e Envelope) valid() error {
	axes := []struct {
		name   string
		lo, hi float64
		use    bool
	}{{"X", e.MinX, e.MaxX, true}, {"Y", e.MinY, e.MaxY, true}, {"Z", e.MinZ, e.MaxZ, e.HasZ}}
	for _, a := range axes {
		if !a.use {
			continue
		}
		if !finite(a.lo) {
			return &EnvelopeError{Axis: a.name, Value: a.lo, Err: ErrNotFinite}
		}
		if !finite(a.hi) {
			return &EnvelopeError{Axis: a.name, Max: true, Value: a.hi, Err: ErrNotFinite}
		}
		if a.lo > a.hi {
			return &EnvelopeError{Axis: a.name, Value: a.lo, Limit: a.hi, Err: ErrLimitOrder}
		}
	}
	return nil
}
