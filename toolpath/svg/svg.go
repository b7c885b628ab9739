package svg

import (
	"bufio"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"strconv"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
)

// Options says how to write the drawing. The zero value writes in
// millimetres with 4 decimals, hairline strokes and no margin.
type Options struct {
	// Units names the length unit of the path: "mm" (the default when
	// empty) or "inch" (written "in").
	Units string
	// Title goes into the <title> element.
	Title string
	// Margin is added around the drawing, in path units (0 or more).
	Margin float64
	// Decimals is the number of digits after the decimal point, 1 to 9;
	// 0 means 4.
	Decimals int
	// ToolWidth, when positive, is the stroke width of the cutting moves
	// (the tool diameter or the kerf), so that the drawing shows the
	// material removed; 0 draws hairlines.
	ToolWidth float64
	// HoleRadius is the radius of the hole marks; 0 means half the
	// ToolWidth, or 1 mm (0.04 in) without one.
	HoleRadius float64
	// SkipTravel leaves the travel group empty and sizes the drawing to
	// the cuts and marks alone.
	SkipTravel bool
}

// Sentinel errors wrapped by [*Error].
var (
	// ErrOutOfRange reports an option outside its limits.
	ErrOutOfRange = errors.New("out of range")
	// ErrNotFinite reports a NaN or infinite value.
	ErrNotFinite = errors.New("not a finite number")
	// ErrEmpty reports a path with nothing to draw in XY.
	ErrEmpty = errors.New("the path has nothing to draw")
	// ErrUnits reports a unit other than mm or inch.
	ErrUnits = errors.New("unknown unit; use mm or inch")
)

// Error records a rejected option or path value.
type Error struct {
	Field string  // "Decimals", "Margin", "path[4].End.Y", ...
	Value float64 // the rejected value
	Limit string  // the allowed range, when there is one
	Err   error   // one of the sentinel errors
}

// Error returns a message such as "svg: Margin -1: out of range (0 or more)".
func (e *Error) Error() string {
	b := []byte("svg: ")
	if e.Field != "" {
		b = append(b, e.Field...)
		b = append(b, ' ')
		b = strconv.AppendFloat(b, e.Value, 'g', -1, 64)
		b = append(b, ": "...)
	}
	b = append(b, e.Err.Error()...)
	if e.Limit != "" {
		b = append(b, " ("...)
		b = append(b, e.Limit...)
		b = append(b, ')')
	}
	return string(b)
}

// Unwrap returns the sentinel error.
func (e *Error) Unwrap() error { return e.Err }

// Default stroke widths in millimetres; inch drawings use the same sizes.
const (
	hairlineMM = 0.1
	holeMM     = 1.0
)

// settings are the options after defaults and checks.
type settings struct {
	unit               string
	mm                 float64 // one millimetre in path units
	dec                int
	margin             float64
	cutW, thinW, holeR float64
	skipTravel         bool
	title              string
}

func settle(o Options) (settings, error) {
	s := settings{title: o.Title, skipTravel: o.SkipTravel, dec: o.Decimals, margin: o.Margin}
	switch o.Units {
	case "", "mm":
		s.unit, s.mm = "mm", 1
	case "inch", "in":
		s.unit, s.mm = "in", 1/25.4
	default:
		return s, &Error{Err: ErrUnits, Limit: "got " + strconv.Quote(o.Units)}
	}
	if s.dec == 0 {
		s.dec = 4
	}
	if s.dec < 1 || s.dec > 9 {
		return s, &Error{Field: "Decimals", Value: float64(o.Decimals), Limit: "1 to 9, or 0 for 4", Err: ErrOutOfRange}
	}
	for _, f := range []struct {
		name string
		v    float64
	}{{"Margin", o.Margin}, {"ToolWidth", o.ToolWidth}, {"HoleRadius", o.HoleRadius}} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) {
			return s, &Error{Field: f.name, Value: f.v, Err: ErrNotFinite}
		}
		if f.v < 0 {
			return s, &Error{Field: f.name, Value: f.v, Limit: "0 or more", Err: ErrOutOfRange}
		}
	}
	s.thinW = hairlineMM * s.mm
	s.cutW = s.thinW
	if o.ToolWidth > 0 {
		s.cutW = o.ToolWidth
	}
	s.holeR = o.HoleRadius
	if s.holeR == 0 {
		s.holeR = o.ToolWidth / 2
	}
	if s.holeR == 0 {
		s.holeR = holeMM * s.mm
	}
	return s, nil
}

// checkPath refuses NaN and infinite coordinates.
func checkPath(p toolpath.Path) error {
	names := [...]string{"Start.X", "Start.Y", "End.X", "End.Y", "CenterX", "CenterY", "Radius"}
	for i := range p {
		s := &p[i]
		vals := [...]float64{s.Start.X, s.Start.Y, s.End.X, s.End.Y, s.CenterX, s.CenterY, s.Radius}
		n := 4
		if s.Kind == toolpath.Arc {
			n = len(vals)
		}
		for k, v := range vals[:n] {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &Error{Field: "path[" + strconv.Itoa(i) + "]." + names[k], Value: v, Err: ErrNotFinite}
			}
		}
	}
	return nil
}

// Write writes p to w as an SVG document. It returns an [*Error] for bad
// options, a non-finite coordinate or a path with nothing to draw, before
// writing anything, and otherwise the first error of w.
func Write(w io.Writer, p toolpath.Path, o Options) error {
	s, err := settle(o)
	if err != nil {
		return err
	}
	if err := checkPath(p); err != nil {
		return err
	}
	d := newDrawing(p, &s)
	if d.empty() {
		return &Error{Err: ErrEmpty}
	}
	bw := bufio.NewWriterSize(w, 64<<10)
	d.write(bw)
	return bw.Flush()
}

// drawing is one document being written.
type drawing struct {
	p       toolpath.Path
	s       *settings
	classes []plan.Class
	holes   []plan.Point
	scale   float64 // 10^dec
	buf     []byte
}

func newDrawing(p toolpath.Path, s *settings) *drawing {
	return &drawing{p: p, s: s, classes: plan.Classify(nil, p), holes: plan.Holes(p), scale: math.Pow(10, float64(s.dec))}
}

// drawn reports whether segment i is written, and in which group.
func (d *drawing) drawn(i int) bool {
	c := d.classes[i]
	return c.Cuts() || (c == plan.Travel && !d.s.skipTravel)
}

func (d *drawing) empty() bool {
	if len(d.holes) > 0 {
		return false
	}
	for i := range d.p {
		if d.drawn(i) {
			return false
		}
	}
	return true
}

// bounds returns the extent of what is drawn, arcs exactly, holes with
// their marks.
func (d *drawing) bounds() (minX, minY, maxX, maxY float64) {
	minX, minY = math.Inf(1), math.Inf(1)
	maxX, maxY = math.Inf(-1), math.Inf(-1)
	for i := range d.p {
		if !d.drawn(i) {
			continue
		}
		x0, y0, x1, y1, _ := d.p[i : i+1].Bounds()
		minX, minY = math.Min(minX, x0), math.Min(minY, y0)
		maxX, maxY = math.Max(maxX, x1), math.Max(maxY, y1)
	}
	for _, h := range d.holes {
		r := d.s.holeR
		minX, minY = math.Min(minX, h.X-r), math.Min(minY, h.Y-r)
		maxX, maxY = math.Max(maxX, h.X+r), math.Max(maxY, h.Y+r)
	}
	return minX, minY, maxX, maxY
}

// round rounds v to the decimals written.
func (d *drawing) round(v float64) float64 { return math.Round(v*d.scale) / d.scale }

// num appends v with the chosen decimals, trailing zeros dropped.
func (d *drawing) num(v float64) {
	start := len(d.buf)
	d.buf = strconv.AppendFloat(d.buf, v, 'f', d.s.dec, 64)
	n := len(d.buf)
	for n > start && d.buf[n-1] == '0' {
		n--
	}
	if n > start && d.buf[n-1] == '.' {
		n--
	}
	d.buf = d.buf[:n]
	if string(d.buf[start:]) == "-0" {
		d.buf = append(d.buf[:start], '0')
	}
}

// point appends "x y" in SVG coordinates (y negated).
func (d *drawing) point(x, y float64) {
	d.num(x)
	d.buf = append(d.buf, ' ')
	d.num(-y)
}

// flushTo writes the buffer to w when it is large.
func (d *drawing) flushTo(w *bufio.Writer, force bool) {
	if force || len(d.buf) > 32<<10 {
		w.Write(d.buf) // errors surface at Flush
		d.buf = d.buf[:0]
	}
}

func (d *drawing) write(w *bufio.Writer) {
	s := d.s
	minX, minY, maxX, maxY := d.bounds()
	// A drawing with no width or height still gets a visible box.
	if pad := s.cutW; maxX-minX < pad {
		c := (minX + maxX) / 2
		minX, maxX = c-pad/2, c+pad/2
	}
	if pad := s.cutW; maxY-minY < pad {
		c := (minY + maxY) / 2
		minY, maxY = c-pad/2, c+pad/2
	}
	// Half the widest stroke lies outside the path.
	edge := s.margin + s.cutW/2
	x0, y0 := minX-edge, -maxY-edge
	wd, ht := maxX-minX+2*edge, maxY-minY+2*edge
	d.buf = append(d.buf, `<?xml version="1.0" encoding="UTF-8"?>`+"\n"+`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="`...)
	d.num(wd)
	d.buf = append(d.buf, s.unit...)
	d.buf = append(d.buf, `" height="`...)
	d.num(ht)
	d.buf = append(d.buf, s.unit...)
	d.buf = append(d.buf, `" viewBox="`...)
	d.num(x0)
	d.buf = append(d.buf, ' ')
	d.num(y0)
	d.buf = append(d.buf, ' ')
	d.num(wd)
	d.buf = append(d.buf, ' ')
	d.num(ht)
	d.buf = append(d.buf, "\">\n"...)
	if s.title != "" {
		d.buf = append(d.buf, "<title>"...)
		d.escape(s.title)
		d.buf = append(d.buf, "</title>\n"...)
	}
	d.buf = append(d.buf, "<desc>Seen from above; y is negated so that the drawing is not mirrored. Units: "...)
	d.buf = append(d.buf, s.unit...)
	d.buf = append(d.buf, ".</desc>\n"...)
	d.group(w, "travel", "#d55e00", s.thinW, true, func(c plan.Class) bool { return c == plan.Travel && !s.skipTravel })
	d.group(w, "cut", "#08306b", s.cutW, false, plan.Class.Cuts)
	d.marks()
	d.buf = append(d.buf, "</svg>\n"...)
	d.flushTo(w, true)
}

// escape appends text with XML special characters escaped.
func (d *drawing) escape(text string) {
	var e escaper
	e.b = d.buf
	xml.EscapeText(&e, []byte(text))
	d.buf = e.b
}

// escaper collects xml.EscapeText output in a byte slice.
type escaper struct{ b []byte }

func (e *escaper) Write(p []byte) (int, error) { e.b = append(e.b, p...); return len(p), nil }
