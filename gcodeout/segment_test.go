package gcodeout_test

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// codeLines returns the lines of a program after the modal setup line,
// without comments.
func codeLines(s string) []string {
	var out []string
	started := false
	for _, l := range strings.Split(strings.TrimSuffix(s, "\n"), "\n") {
		if strings.HasPrefix(l, "(") {
			continue
		}
		if started {
			out = append(out, l)
		}
		if strings.HasSuffix(l, "G17 G90 G94") {
			started = true
		}
	}
	return out
}

func seg(kind toolpath.Kind, m toolpath.Motion, x0, y0, z0, x1, y1, z1 float64) toolpath.Segment {
	return toolpath.Segment{Kind: kind, Motion: m, Start: toolpath.Point{X: x0, Y: y0, Z: z0}, End: toolpath.Point{X: x1, Y: y1, Z: z1}}
}

func arcSeg(m toolpath.Motion, x0, y0, x1, y1, cx, cy, z float64, cw bool) toolpath.Segment {
	s := seg(toolpath.Arc, m, x0, y0, z, x1, y1, z)
	s.CenterX, s.CenterY, s.Clockwise = cx, cy, cw
	s.Radius = math.Hypot(x0-cx, y0-cy)
	return s
}

var (
	travel = toolpath.Travel
	cut    = toolpath.Cut
	line   = toolpath.Line
)

func TestWriteSegmentLines(t *testing.T) {
	router := validRouter()
	router.PlungeFeed = 200
	laser := gcodeout.Config{Machine: gcodeout.Laser, Feed: 900, Power: 40, PierceDwell: 0.05}
	laserFocus := laser
	laserFocus.UseFocusZ, laserFocus.FocusZ, laserFocus.PierceDwell = true, 12.5, 0
	plotter := gcodeout.Config{Machine: gcodeout.Plotter, Feed: 2000, PenUp: 2}
	withFeed := func(s toolpath.Segment, f float64) toolpath.Segment { s.Feed = f; return s }
	withRole := func(s toolpath.Segment, r toolpath.Role) toolpath.Segment { s.Role = r; return s }
	dwell := func(m toolpath.Motion, x, y, z, sec float64) toolpath.Segment {
		s := seg(toolpath.Dwell, m, x, y, z, x, y, z)
		s.Seconds = sec
		return s
	}
	tests := []struct {
		name string
		cfg  gcodeout.Config
		path toolpath.Path
		want []string
	}{
		{"router: F only when it changes, plunge feed, segment feed, Z only when it changes", router, toolpath.Path{
			seg(line, travel, 0, 0, 5, 1, 2, 5),
			seg(line, cut, 1, 2, 5, 1, 2, -1),
			seg(line, cut, 1, 2, -1, 4, 2, -1),
			seg(line, cut, 4, 2, -1, 4, 6, -1),
			withFeed(seg(line, cut, 4, 6, -1, 5, 6, -1), 333.3333),
			seg(line, cut, 5, 6, -1, 5, 7, -1.5),
			seg(line, travel, 5, 7, -1.5, 5, 7, 5),
		}, []string{
			"G0 Z5", "M3 S12000",
			"G0 X1 Y2", "G1 Z-1 F200", "G1 X4 Y2 F1000", "G1 X4 Y6", "G1 X5 Y6 F333.333", "G1 X5 Y7 Z-1.5 F1000", "G0 Z5",
			"M5", "M2",
		}},
		{"router: a plunge role uses the plunge feed even while moving in XY; a Z-only move up does not", router, toolpath.Path{
			seg(line, travel, 0, 0, 5, 1, 1, 5),
			withRole(seg(line, cut, 1, 1, 5, 2, 1, -1), toolpath.Plunge),
			seg(line, cut, 2, 1, -1, 2, 1, 0),
		}, []string{"G0 Z5", "M3 S12000", "G0 X1 Y1", "G1 X2 Y1 Z-1 F200", "G1 Z0 F1000", "G0 Z5", "M5", "M2"}},
		{"router: moves that round to nothing are left out; end retracts only from below", router, toolpath.Path{
			seg(line, travel, 0, 0, 5, 1, 1, 5),
			seg(line, travel, 1, 1, 5, 1.0004, 0.9996, 5.0004),
			seg(line, travel, 1.0004, 0.9996, 5.0004, 1.0004, 0.9996, 8),
		}, []string{"G0 Z5", "M3 S12000", "G0 X1 Y1", "G0 Z8", "M5", "M2"}},
		{"laser: beam off around every travel, pierce at each beam-on, no Z ever", laser, toolpath.Path{
			seg(line, travel, 0, 0, 0, 1, 1, 0),
			seg(line, cut, 1, 1, 0, 2, 1, 0),
			seg(line, cut, 2, 1, 0, 2, 1, -3), // Z only: nothing to write
			seg(line, cut, 2, 1, -3, 2, 2, 7),
			seg(line, travel, 2, 2, 7, 3, 3, 0),
			dwell(cut, 3, 3, 0, 0.2), // a mark
			dwell(travel, 3, 3, 0, 1),
			seg(line, travel, 3, 3, 0, 0, 0, 0),
		}, []string{
			"M5",
			"G0 X1 Y1", "M3 S40", "G4 P0.05", "G1 X2 Y1 F900", "G1 X2 Y2",
			"M5", "G0 X3 Y3", "M3 S40", "G4 P0.05", "G4 P0.2", "M5", "G4 P1", "G0 X0 Y0",
			"M5", "M2",
		}},
		{"laser: a focus height is written once", laserFocus, toolpath.Path{
			seg(line, travel, 0, 0, 0, 1, 1, 0),
			seg(line, cut, 1, 1, 0, 2, 1, 0),
		}, []string{"M5", "G0 Z12.5", "G0 X1 Y1", "M3 S40", "G1 X2 Y1 F900", "M5", "M2"}},
		{"plotter: pen lifted at the end from below pen up", plotter, toolpath.Path{
			seg(line, travel, 0, 0, 2, 1, 1, 2),
			seg(line, cut, 1, 1, 2, 1, 1, 0),
			seg(line, cut, 1, 1, 0, 3, 1, 0),
			dwell(cut, 3, 1, 0, 0),
		}, []string{"G0 Z2", "G0 X1 Y1", "G1 Z0 F2000", "G1 X3 Y1", "G4 P0", "G0 Z2", "M2"}},
		{"plotter: empty path", plotter, nil, []string{"G0 Z2", "M2"}},
		{"router: full circle is one arc, half circles in both directions", router, toolpath.Path{
			seg(line, travel, 0, 0, 5, 10, 0, 5),
			seg(line, cut, 10, 0, 5, 10, 0, -1),
			arcSeg(cut, 10, 0, 10, 0, 0, 0, -1, false),
			arcSeg(cut, 10, 0, -10, 0, 0, 0, -1, true),
			arcSeg(cut, -10, 0, 10, 0, 0, 0, -1, false),
		}, []string{"G0 Z5", "M3 S12000", "G0 X10 Y0", "G1 Z-1 F200", "G3 X10 Y0 I-10 J0 F1000", "G2 X-10 Y0 I-10 J0", "G3 X10 Y0 I10 J0", "G0 Z5", "M5", "M2"}},
		{"router: helical arc writes Z; short arc that rounds to a point keeps only its Z", router, toolpath.Path{
			seg(line, travel, 0, 0, 5, 10, 0, 5),
			func() toolpath.Segment { s := arcSeg(cut, 10, 0, 0, 10, 0, 0, 5, false); s.End.Z = 4; return s }(),
			func() toolpath.Segment {
				s := arcSeg(cut, 0, 10, 1e-4, 10, 0, 0, 4, true)
				s.End.Z = 3
				return s
			}(),
			arcSeg(cut, 1e-4, 10, 2e-4, 10, 0, 0, 3, true), // rounds to nothing at all
		}, []string{"G0 Z5", "M3 S12000", "G0 X10 Y0", "G3 X0 Y10 Z4 I-10 J0 F1000", "G1 Z3", "G0 Z5", "M5", "M2"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var out bytes.Buffer
			if err := gcodeout.WritePath(&out, tt.cfg, tt.path); err != nil {
				t.Fatal(err)
			}
			got := codeLines(out.String())
			if strings.Join(got, "\n") != strings.Join(tt.want, "\n") {
				t.Errorf("got\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(tt.want, "\n"))
			}
			readBack(t, out.String())
		})
	}
}

func TestWriteSegmentRefuses(t *testing.T) {
	start := seg(line, travel, 0, 0, 5, 1, 1, 5)
	tests := []struct {
		name string
		s    toolpath.Segment
		msg  string
		err  error
	}{
		{"gap in XY", seg(line, cut, 1.002, 1, 5, 2, 2, 5), "gcodeout: segment 1: Start.X 1.002: does not start where the previous move ended", gcodeout.ErrGap},
		{"gap in Z", seg(line, cut, 1, 1, 4, 2, 2, 5), "gcodeout: segment 1: Start.Z 4: does not start where the previous move ended", gcodeout.ErrGap},
		{"NaN start", seg(line, cut, math.NaN(), 1, 5, 2, 2, 5), "gcodeout: segment 1: Start.X NaN: not a finite number", gcodeout.ErrNotFinite},
		{"NaN end", seg(line, cut, 1, 1, 5, 2, math.NaN(), 5), "gcodeout: segment 1: Y NaN: not a finite number", gcodeout.ErrNotFinite},
		{"infinite Z", seg(line, cut, 1, 1, 5, 2, 2, math.Inf(-1)), "gcodeout: segment 1: Z -Inf: not a finite number", gcodeout.ErrNotFinite},
		{"beyond the grid", seg(line, cut, 1, 1, 5, 2e12, 2, 5), "gcodeout: segment 1: X 2e+12: out of range (limit 1e+12)", gcodeout.ErrRange},
		{"negative feed", func() toolpath.Segment { s := seg(line, cut, 1, 1, 5, 2, 2, 5); s.Feed = -1; return s }(), "gcodeout: segment 1: F -1: must not be negative", gcodeout.ErrNegative},
		{"feed rounds to zero", func() toolpath.Segment { s := seg(line, cut, 1, 1, 5, 2, 2, 5); s.Feed = 1e-5; return s }(), "gcodeout: segment 1: F 1e-05: out of range (limit 0.0005)", gcodeout.ErrRange},
		{"negative dwell", func() toolpath.Segment { s := seg(toolpath.Dwell, cut, 1, 1, 5, 1, 1, 5); s.Seconds = -2; return s }(), "gcodeout: segment 1: P -2: must not be negative", gcodeout.ErrNegative},
		{"unknown kind", seg(7, cut, 1, 1, 5, 2, 2, 5), "gcodeout: segment 1: Kind 7: unknown value", gcodeout.ErrUnknown},
		{"unknown motion", seg(line, 4, 1, 1, 5, 2, 2, 5), "gcodeout: segment 1: Motion 4: unknown value", gcodeout.ErrUnknown},
		{"arc of zero radius", func() toolpath.Segment {
			s := arcSeg(cut, 1, 1, 1, 1, 1.0002, 1, 5, false)
			s.Radius = 0.0002
			return s
		}(), "gcodeout: segment 1: Radius 0.0002: arc cannot be written within the radius limit", gcodeout.ErrArcRadius},
		{"arc whose ends are not on one circle", arcSeg(cut, 1, 1, 3, 1, 0, 1, 5, false), "gcodeout: segment 1: Radius 1: arc cannot be written within the radius limit", gcodeout.ErrArcRadius},
		{"NaN centre", arcSeg(cut, 1, 1, 3, 1, math.NaN(), 1, 5, false), "gcodeout: segment 1: CenterX NaN: not a finite number", gcodeout.ErrNotFinite},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var out bytes.Buffer
			w, err := gcodeout.NewWriter(&out, validRouter())
			if err != nil {
				t.Fatal(err)
			}
			if err := w.WriteSegment(start); err != nil {
				t.Fatal(err)
			}
			err = w.WriteSegment(tt.s)
			if err == nil {
				t.Fatalf("accepted %+v", tt.s)
			}
			if err.Error() != tt.msg {
				t.Errorf("error %q, want %q", err, tt.msg)
			}
			if !errors.Is(err, tt.err) {
				t.Errorf("error %q does not wrap %q", err, tt.err)
			}
			var se *gcodeout.SegmentError
			if !errors.As(err, &se) || se.Index != 1 {
				t.Errorf("error %#v is not a *SegmentError for index 1", err)
			}
			// The refused segment wrote nothing and the writer goes on.
			if err := w.WriteSegment(seg(line, cut, 1, 1, 5, 2, 1, 5)); err != nil {
				t.Fatal(err)
			}
			if err := w.Close(); err != nil {
				t.Fatal(err)
			}
			want := []string{"G0 Z5", "M3 S12000", "G0 X1 Y1", "G1 X2 Y1 F1000", "M5", "M2"}
			if got := codeLines(out.String()); strings.Join(got, "|") != strings.Join(want, "|") {
				t.Errorf("program after the refusal:\n%s", strings.Join(got, "\n"))
			}
		})
	}
}

func TestWriteSegmentFirstMove(t *testing.T) {
	w, _ := gcodeout.NewWriter(&bytes.Buffer{}, validRouter())
	err := w.WriteSegment(arcSeg(travel, 1, 0, -1, 0, 0, 0, 5, false))
	if !errors.Is(err, gcodeout.ErrArcUnknownStart) {
		t.Errorf("arc as the first move: %v, want ErrArcUnknownStart", err)
	}
	err = w.WriteSegment(seg(line, cut, 0, 0, 0, 1, 0, 0))
	if !errors.Is(err, gcodeout.ErrGap) {
		t.Errorf("first move below the start-block height: %v, want ErrGap", err)
	}
	// Any XY is fine for the first move: the position is not known yet.
	if err := w.WriteSegment(seg(line, travel, 123, -4, 5, 1, 0, 5)); err != nil {
		t.Errorf("first travel: %v", err)
	}
}

func TestCallOrder(t *testing.T) {
	var out bytes.Buffer
	w, _ := gcodeout.NewWriter(&out, validRouter())
	if err := w.WriteHeader(); err != nil {
		t.Fatal(err)
	}
	if err := w.WriteHeader(); !errors.Is(err, gcodeout.ErrState) {
		t.Errorf("second WriteHeader: %v, want ErrState", err)
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	n := out.Len()
	if err := w.Close(); !errors.Is(err, gcodeout.ErrState) {
		t.Errorf("second Close: %v, want ErrState", err)
	}
	if err := w.WriteSegment(seg(line, travel, 0, 0, 5, 1, 1, 5)); !errors.Is(err, gcodeout.ErrState) {
		t.Errorf("WriteSegment after Close: %v, want ErrState", err)
	}
	if out.Len() != n {
		t.Errorf("calls after Close wrote %q", out.String()[n:])
	}
	readBack(t, out.String())
}

// failingWriter accepts limit bytes, then fails.
type failingWriter struct{ limit int }

var errDiskFull = errors.New("disk full")

func (f *failingWriter) Write(p []byte) (int, error) {
	if len(p) > f.limit {
		n := f.limit
		f.limit = 0
		return n, errDiskFull
	}
	f.limit -= len(p)
	return len(p), nil
}

func TestWriteErrorIsSticky(t *testing.T) {
	w, _ := gcodeout.NewWriter(&failingWriter{limit: 40 << 10}, validRouter())
	var err error
	s := seg(line, travel, 0, 0, 5, 1, 1, 5)
	for i := 0; i < 10000 && err == nil; i++ {
		x := float64(i%2) + 1
		s = seg(line, cut, s.End.X, s.End.Y, 5, 3-x, x, 5)
		err = w.WriteSegment(s)
	}
	if !errors.Is(err, errDiskFull) {
		t.Fatalf("error %v, want the writer's", err)
	}
	if err := w.WriteSegment(s); !errors.Is(err, errDiskFull) {
		t.Errorf("next WriteSegment: %v, want the writer's error again", err)
	}
	if err := w.Close(); !errors.Is(err, errDiskFull) {
		t.Errorf("Close: %v, want the writer's error again", err)
	}
}

// TestArcEndsCrossWhenRounded builds arcs whose written start (one unit
// from the given start, a gap the writer accepts), rounded end and
// rounded centre put the ends on the wrong side of each other: nearly a
// full circle would print as a sliver, and a sliver as nearly a full
// circle. The writer splits the first in two halves and writes the second
// as a line.
func TestArcEndsCrossWhenRounded(t *testing.T) {
	cfg := gcodeout.Config{Machine: gcodeout.Laser, Units: gcodeout.Inch, Feed: 20, Power: 100}
	r := 10.000009
	delta := math.Asin(0.000004 / r)
	arc := toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut,
		Start:   toolpath.Point{X: 10.000009, Y: 0.000006},
		End:     toolpath.Point{X: r * math.Cos(delta), Y: 0.000006 - r*math.Sin(delta)},
		CenterX: 0, CenterY: 0.000006, Radius: r}
	tests := []struct {
		name      string
		clockwise bool
		want      []string
	}{
		{"nearly a full circle, counter-clockwise", false, []string{"G3 X-10.00001 Y0.00001 I-10 J0.00001 F20", "G3 X10.00001 Y0 I10.00001 J0"}},
		{"a sliver, clockwise", true, []string{"G1 X10.00001 Y0 F20"}},
	}
	for _, tt := range tests {
		a := arc
		a.Clockwise = tt.clockwise
		path := toolpath.Path{seg(line, travel, 0, 0, 0, 10, 0, 0), a}
		var out bytes.Buffer
		if err := gcodeout.WritePath(&out, cfg, path); err != nil {
			t.Fatal(err)
		}
		want := append([]string{"M5", "G0 X10 Y0", "M3 S100"}, tt.want...)
		want = append(want, "M5", "M2")
		if got := codeLines(out.String()); strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Errorf("%s: got\n%s\nwant\n%s", tt.name, strings.Join(got, "\n"), strings.Join(want, "\n"))
		}
		p := readBack(t, out.String())
		for _, m := range p.moves {
			if m.g >= 2 {
				if rs, re := m.radii(); math.Abs(rs-re) > gcodeout.ArcRadiusLimitInch {
					t.Errorf("%s: line %d radii %v, %v", tt.name, m.line, rs, re)
				}
			}
		}
	}
}
