package gcodeout

import (
	"math"

	"github.com/focitools/foci/toolpath"
)

// WriteSegment writes one segment of a path.
//
// A travel is a rapid (G0); a cut is a feed move (G1, or G2 clockwise and
// G3 counter-clockwise for an arc); a dwell is G4 P<Seconds>. The motion
// word is written on every move so that each line reads on its own; X and
// Y are written together whenever the XY position changes, Z only when it
// changes, and F only when the feed changes. A cut's feed is the
// segment's Feed, or PlungeFeed for a plunge, or Config.Feed. For a laser,
// the beam goes off (M5) before a travel and back on (M3 S<Power>, then
// G4 P<PierceDwell> if set) before the next cut or cutting dwell, and no Z
// is ever written.
//
// Arcs are written in centre form: I and J are the offsets from the
// written start to the written centre, never R. A full circle (Start ==
// End) is one G2 or G3 whose X Y repeat the start. The start and end radii
// of the written arc agree within the RS274NGC limit (0.002 mm or
// 0.0002 in): when the rounded centre would bring them within a quarter of
// the limit of breaking it (possible only at 3 mm decimals), the writer
// takes the best grid point within one unit of the rounded centre.
//
// A segment must start where the previous one ended (within one unit in
// the last place); the first must start at the start-block height for a
// router or plotter. The writer adds no moves of its own, but rounding
// can leave too little of a move to write as given: a move that rounds to
// no motion at all is left out; an arc of at most half a turn whose ends
// round to one point, or whose rounded ends and centre would turn it
// inside out (it is then a few units in the last place long), is written
// as a straight move to its rounded end; an arc of more than half a turn
// whose rounded ends would cross is written as two arcs of the same
// circle, split at its middle. An arc that travels is written as a feed
// move too, since G0 has no arc form.
//
// Coordinates must be finite and below 10^15 units in the last place in
// magnitude (10^12 at 3 decimals). A refused segment is reported as a
// *SegmentError and writes nothing; the Writer stays usable. WriteSegment
// also returns the io.Writer's error, and an error wrapping ErrState after
// Close.
func (w *Writer) WriteSegment(s toolpath.Segment) error {
	if w.err != nil {
		return w.err
	}
	if w.state == closed {
		return &opError{"WriteSegment after Close"}
	}
	if w.state == fresh {
		if err := w.WriteHeader(); err != nil {
			return err
		}
	}
	i := w.index
	w.index++
	if s.Motion > toolpath.Cut {
		return &SegmentError{Index: i, Field: "Motion", Value: float64(s.Motion), Err: ErrUnknown}
	}
	var err error
	switch s.Kind {
	case toolpath.Line:
		err = w.line(i, &s)
	case toolpath.Arc:
		err = w.arc(i, &s)
	case toolpath.Dwell:
		err = w.dwell(i, &s)
	default:
		return &SegmentError{Index: i, Field: "Kind", Value: float64(s.Kind), Err: ErrUnknown}
	}
	if err != nil {
		return err
	}
	w.maybeFlush()
	return w.err
}

// target holds a segment's end in grid units and what changes.
type target struct {
	x, y, z       int64
	moveXY, moveZ bool
}

// checkStart verifies that s starts where the machine is.
func (w *Writer) checkStart(i int, s *toolpath.Segment) error {
	if w.xyKnown {
		if err := w.near(i, "Start.X", s.Start.X, w.endX); err != nil {
			return err
		}
		if err := w.near(i, "Start.Y", s.Start.Y, w.endY); err != nil {
			return err
		}
	}
	if w.zKnown && w.cfg.Machine != Laser {
		return w.near(i, "Start.Z", s.Start.Z, w.endZ)
	}
	return nil
}

func (w *Writer) near(i int, field string, v, at float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &SegmentError{Index: i, Field: field, Value: v, Err: ErrNotFinite}
	}
	if !(float64(math.Abs(v-at)*w.scale) <= 1) {
		return &SegmentError{Index: i, Field: field, Value: v, Err: ErrGap}
	}
	return nil
}

// coord returns v in grid units, or an error naming the word.
func (w *Writer) coord(i int, word string, v float64) (int64, error) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, &SegmentError{Index: i, Field: word, Value: v, Err: ErrNotFinite}
	}
	n, ok := grid(v, w.scale)
	if !ok {
		return 0, &SegmentError{Index: i, Field: word, Value: v, Limit: maxGrid / w.scale, HasLimit: true, Err: ErrRange}
	}
	return n, nil
}

// end returns the segment's end in grid units and which axes move. For a
// laser Z never moves.
func (w *Writer) end(i int, s *toolpath.Segment) (t target, err error) {
	if t.x, err = w.coord(i, "X", s.End.X); err != nil {
		return t, err
	}
	if t.y, err = w.coord(i, "Y", s.End.Y); err != nil {
		return t, err
	}
	t.moveXY = !w.xyKnown || t.x != w.x || t.y != w.y
	if w.cfg.Machine != Laser {
		if t.z, err = w.coord(i, "Z", s.End.Z); err != nil {
			return t, err
		}
		t.moveZ = !w.zKnown || t.z != w.z
	}
	return t, nil
}

// feedFor returns the feed of a cut segment in word units.
func (w *Writer) feedFor(i int, s *toolpath.Segment, t *target) (int64, error) {
	f := s.Feed
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return 0, &SegmentError{Index: i, Field: "F", Value: f, Err: ErrNotFinite}
	}
	if f < 0 {
		return 0, &SegmentError{Index: i, Field: "F", Value: f, Err: ErrNegative}
	}
	if f == 0 {
		f = w.cfg.Feed
		plunge := s.Role == toolpath.Plunge || (s.Kind == toolpath.Line && !t.moveXY && t.moveZ && t.z < w.z)
		if plunge && w.cfg.PlungeFeed > 0 {
			f = w.cfg.PlungeFeed
		}
	}
	n, ok := grid(f, math.Pow10(wordDecimals))
	if !ok {
		return 0, &SegmentError{Index: i, Field: "F", Value: f, Limit: maxGrid / math.Pow10(wordDecimals), HasLimit: true, Err: ErrRange}
	}
	if n == 0 { // a feed that would print as F0: give the smallest that does not
		return 0, &SegmentError{Index: i, Field: "F", Value: f, Limit: 0.5 / math.Pow10(wordDecimals), HasLimit: true, Err: ErrRange}
	}
	return n, nil
}

func (w *Writer) line(i int, s *toolpath.Segment) error {
	if err := w.checkStart(i, s); err != nil {
		return err
	}
	t, err := w.end(i, s)
	if err != nil {
		return err
	}
	return w.move(i, s, &t)
}

// move writes a straight move to t (G0 or G1), or nothing if nothing
// moves.
func (w *Writer) move(i int, s *toolpath.Segment, t *target) error {
	if !t.moveXY && !t.moveZ {
		w.endX, w.endY, w.endZ = s.End.X, s.End.Y, s.End.Z
		return nil
	}
	var feed int64
	if s.Motion == toolpath.Cut {
		var err error
		if feed, err = w.feedFor(i, s, t); err != nil {
			return err
		}
	}
	w.engage(s.Motion)
	b := w.buf
	if s.Motion == toolpath.Cut {
		b = append(b, "G1"...)
	} else {
		b = append(b, "G0"...)
	}
	b = w.appendAxes(b, t)
	if s.Motion == toolpath.Cut {
		b = w.appendFeed(b, feed)
	}
	w.buf = append(b, '\n')
	w.moved(s, t)
	return nil
}

// appendAxes appends " X.. Y.." if XY moves and " Z.." if Z moves.
func (w *Writer) appendAxes(b []byte, t *target) []byte {
	if t.moveXY {
		b = append(b, " X"...)
		b = appendFixed(b, t.x, w.dec)
		b = append(b, " Y"...)
		b = appendFixed(b, t.y, w.dec)
	}
	if t.moveZ {
		b = append(b, " Z"...)
		b = appendFixed(b, t.z, w.dec)
	}
	return b
}

// appendFeed appends " F.." when the feed differs from the last one
// written.
func (w *Writer) appendFeed(b []byte, feed int64) []byte {
	if w.feedKnown && feed == w.feed {
		return b
	}
	w.feed, w.feedKnown = feed, true
	b = append(b, " F"...)
	return appendFixed(b, feed, wordDecimals)
}

// moved records that the machine is now at t.
func (w *Writer) moved(s *toolpath.Segment, t *target) {
	w.x, w.y, w.xyKnown = t.x, t.y, true
	if w.cfg.Machine != Laser {
		w.z, w.zKnown = t.z, true
	}
	w.endX, w.endY, w.endZ = s.End.X, s.End.Y, s.End.Z
}

// engage switches the laser beam for the coming motion: off before a
// travel, on before a cut. Other machines need nothing here.
func (w *Writer) engage(m toolpath.Motion) {
	if w.cfg.Machine != Laser {
		return
	}
	switch {
	case m == toolpath.Travel && w.beamOn:
		w.buf = append(w.buf, "M5\n"...)
		w.beamOn = false
	case m == toolpath.Cut && !w.beamOn:
		b := append(w.buf, "M3 S"...)
		b = w.appendWord(b, w.cfg.Power)
		b = append(b, '\n')
		if w.cfg.PierceDwell > 0 {
			b = append(b, "G4 P"...)
			b = w.appendWord(b, w.cfg.PierceDwell)
			b = append(b, '\n')
		}
		w.buf = b
		w.beamOn = true
	}
}

func (w *Writer) dwell(i int, s *toolpath.Segment) error {
	if err := w.checkStart(i, s); err != nil {
		return err
	}
	sec := s.Seconds
	if math.IsNaN(sec) || math.IsInf(sec, 0) {
		return &SegmentError{Index: i, Field: "P", Value: sec, Err: ErrNotFinite}
	}
	if sec < 0 {
		return &SegmentError{Index: i, Field: "P", Value: sec, Err: ErrNegative}
	}
	if _, ok := grid(sec, math.Pow10(wordDecimals)); !ok {
		return &SegmentError{Index: i, Field: "P", Value: sec, Limit: maxGrid / math.Pow10(wordDecimals), HasLimit: true, Err: ErrRange}
	}
	w.engage(s.Motion)
	b := append(w.buf, "G4 P"...)
	b = w.appendWord(b, sec)
	w.buf = append(b, '\n')
	return nil
}
