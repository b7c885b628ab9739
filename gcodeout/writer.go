package gcodeout

import (
	"io"
	"math"

	"github.com/focitools/foci/toolpath"
)

// flushAt is the buffer length past which the writer hands its bytes to
// the io.Writer. The buffer is allocated with room for one more line of
// any length the writer produces, so it never grows while segments are
// written.
const flushAt = 32 << 10

// Writer states.
const (
	fresh   = iota // nothing written yet
	writing        // header and start block written
	closed         // end block written
)

// Writer writes one program: the header block, then segments one at a
// time, then the end block on Close. It appends words into a reused byte
// buffer and hands the buffer to the io.Writer whenever it passes 32 KiB
// and on Close; writing a segment allocates nothing.
//
// A segment the writer refuses (bad number, gap, arc it cannot write)
// writes nothing and leaves the Writer usable. An error from the
// io.Writer is sticky: every later call returns it. A Writer is not safe
// for concurrent use.
type Writer struct {
	w     io.Writer
	cfg   Config
	dec   int     // coordinate decimals
	scale float64 // 10^dec
	limit float64 // arc radius limit in grid units
	buf   []byte
	err   error
	state int
	index int // segments given so far

	// Position as printed, in grid units, and whether each is known.
	x, y, z         int64
	xyKnown, zKnown bool
	// End of the last segment as given, for the gap check.
	endX, endY, endZ float64
	feed             int64 // last F written, in units of 10^-wordDecimals
	feedKnown        bool
	beamOn           bool

	scratch [80]byte
}

// NewWriter validates cfg and returns a Writer that writes the program to
// w. Errors are *Error values naming the Config field, for example
// "gcodeout: Feed 0: must be greater than zero". Nothing is written until
// [Writer.WriteHeader], [Writer.WriteSegment] or [Writer.Close].
func NewWriter(w io.Writer, cfg Config) (*Writer, error) {
	if err := cfg.validate(); err != nil {
		return nil, err
	}
	cfg.Header.Operations = append([]string(nil), cfg.Header.Operations...)
	wr := &Writer{cfg: cfg, buf: make([]byte, 0, flushAt+1024)}
	wr.dec = cfg.decimals()
	wr.scale = math.Pow10(wr.dec)
	wr.limit = float64(arcRadiusLimit(cfg.Units) * wr.scale)
	wr.Reset(w)
	return wr, nil
}

// Reset discards any unflushed output and state and makes the Writer start
// a new program, with the same Config, on w. The buffer is reused.
func (w *Writer) Reset(dst io.Writer) {
	*w = Writer{
		w: dst, cfg: w.cfg, dec: w.dec, scale: w.scale, limit: w.limit,
		buf: w.buf[:0],
	}
}

// Decimals returns the number of coordinate decimals the Writer prints:
// Config.Decimals if set, else chosen from Config.Tolerance and Units. Give
// it to the approximation so that it can budget for rounding.
func (w *Writer) Decimals() int { return w.dec }

// WriteHeader writes the header comment block, the modal setup line
// (units, G17 XY plane, G90 absolute, G94 feed per minute) and the start
// block for the machine: a router moves to SafeZ and starts the spindle
// (M3 S<RPM>, then G4 P<SpinUp> if set); a laser switches the beam off
// (M5) and, if asked, moves to FocusZ; a plotter lifts the pen to PenUp.
// WriteSegment and Close call it if it has not been called. Calling it
// twice, or after Close, is an error.
func (w *Writer) WriteHeader() error {
	if w.err != nil {
		return w.err
	}
	if w.state != fresh {
		return &opError{"WriteHeader twice or after Close"}
	}
	c := &w.cfg
	b := w.appendHeader(w.buf)
	b = append(b, c.Units.word()...)
	b = append(b, " G17 G90 G94\n"...)
	switch c.Machine {
	case Router:
		w.z, _ = grid(c.SafeZ, w.scale)
		b = append(b, "G0 Z"...)
		b = appendFixed(b, w.z, w.dec)
		b = append(b, "\nM3 S"...)
		b = w.appendWord(b, c.RPM)
		b = append(b, '\n')
		if c.SpinUp > 0 {
			b = append(b, "G4 P"...)
			b = w.appendWord(b, c.SpinUp)
			b = append(b, '\n')
		}
		w.zKnown, w.endZ = true, c.SafeZ
	case Laser:
		b = append(b, "M5\n"...)
		if c.UseFocusZ {
			fz, _ := grid(c.FocusZ, w.scale)
			b = append(b, "G0 Z"...)
			b = appendFixed(b, fz, w.dec)
			b = append(b, '\n')
		}
	case Plotter:
		w.z, _ = grid(c.PenUp, w.scale)
		b = append(b, "G0 Z"...)
		b = appendFixed(b, w.z, w.dec)
		b = append(b, '\n')
		w.zKnown, w.endZ = true, c.PenUp
	}
	w.buf = b
	w.state = writing
	w.maybeFlush()
	return w.err
}

// Close writes the end block and hands everything to the io.Writer. A
// router retracts to SafeZ (if below it), stops the spindle (M5) and ends
// the program (M2); a laser switches the beam off (M5) and ends; a plotter
// lifts the pen to PenUp (if below it) and ends. M2 is the last line.
// Close writes the header first if nothing was written, so a Writer that
// was given no segments still writes a complete, empty program. Close does
// not close the io.Writer. Calling it twice is an error.
func (w *Writer) Close() error {
	if w.err != nil {
		return w.err
	}
	if w.state == closed {
		return &opError{"Close twice"}
	}
	if w.state == fresh {
		if err := w.WriteHeader(); err != nil {
			return err
		}
	}
	c := &w.cfg
	b := w.buf
	switch c.Machine {
	case Router, Plotter:
		top := c.SafeZ
		if c.Machine == Plotter {
			top = c.PenUp
		}
		tz, _ := grid(top, w.scale)
		if !w.zKnown || w.z < tz {
			b = append(b, "G0 Z"...)
			b = appendFixed(b, tz, w.dec)
			b = append(b, '\n')
		}
		if c.Machine == Router {
			b = append(b, "M5\n"...)
		}
	case Laser:
		b = append(b, "M5\n"...)
	}
	b = append(b, "M2\n"...)
	w.buf = b
	w.state = closed
	w.flush()
	return w.err
}

// WritePath writes path as a complete program for cfg to w: header,
// segments, end block. On error the program is incomplete and part of it
// may already have been written to w: callers that must not leave a
// partial file should write to a temporary file or a buffer first.
func WritePath(w io.Writer, cfg Config, path toolpath.Path) error {
	wr, err := NewWriter(w, cfg)
	if err != nil {
		return err
	}
	for _, s := range path {
		if err := wr.WriteSegment(s); err != nil {
			return err
		}
	}
	return wr.Close()
}

// appendWord appends an F, S or P value at wordDecimals, trailing zeros
// trimmed. The value must have passed the range check.
func (w *Writer) appendWord(b []byte, v float64) []byte {
	n, _ := grid(v, math.Pow10(wordDecimals))
	return appendFixed(b, n, wordDecimals)
}

// maybeFlush hands the buffer to the io.Writer once it passes flushAt.
func (w *Writer) maybeFlush() {
	if len(w.buf) >= flushAt {
		w.flush()
	}
}

func (w *Writer) flush() {
	if len(w.buf) == 0 || w.err != nil {
		return
	}
	_, err := w.w.Write(w.buf)
	w.buf = w.buf[:0]
	if err != nil {
		w.err = err
	}
}

// opError reports a call out of order; it wraps ErrState.
type opError struct{ op string }

func (e *opError) Error() string { return "gcodeout: " + e.op + ": " + ErrState.Error() }
func (e *opError) Unwrap() error { return ErrState }
