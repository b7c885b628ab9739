package gcodeout_test

import (
	"io"
	"math"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// allocCases are segment cycles that end where they start, so they can be
// written over and over; each exercises one branch of the writer.
func allocCases() []struct {
	name string
	cfg  gcodeout.Config
	lead toolpath.Segment // written once, to fix the position
	loop []toolpath.Segment
} {
	router := validRouter()
	router.PlungeFeed = 250
	laser := gcodeout.Config{Machine: gcodeout.Laser, Feed: 900, Power: 40, PierceDwell: 0.05}
	plotter := gcodeout.Config{Machine: gcodeout.Plotter, Feed: 2000, PenUp: 2}
	inchLaser := gcodeout.Config{Machine: gcodeout.Laser, Units: gcodeout.Inch, Feed: 20, Power: 100}
	r := 10.000009
	delta := math.Asin(0.000004 / r)
	crossing := toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut,
		Start:   toolpath.Point{X: 10.000009, Y: 0.000006},
		End:     toolpath.Point{X: r * math.Cos(delta), Y: 0.000006 - r*math.Sin(delta)},
		CenterX: 0, CenterY: 0.000006, Radius: r}
	sliver := crossing
	sliver.Clockwise = true
	back := seg(line, cut, crossing.End.X, crossing.End.Y, 0, 10, 0, 0)
	withFeed := func(s toolpath.Segment, f float64) toolpath.Segment { s.Feed = f; return s }
	dw := seg(toolpath.Dwell, cut, 1, 1, 5, 1, 1, 5)
	dw.Seconds = 0.75
	return []struct {
		name string
		cfg  gcodeout.Config
		lead toolpath.Segment
		loop []toolpath.Segment
	}{
		{"router lines", router, seg(line, travel, 0, 0, 5, 1, 1, 5), []toolpath.Segment{
			seg(line, cut, 1, 1, 5, 12.345, -6.5, 5), seg(line, cut, 12.345, -6.5, 5, 1, 1, 5)}},
		{"router plunge and lift", router, seg(line, travel, 0, 0, 5, 1, 1, 5), []toolpath.Segment{
			seg(line, cut, 1, 1, 5, 1, 1, -3.25), seg(line, travel, 1, 1, -3.25, 1, 1, 5)}},
		{"feed changes", router, seg(line, travel, 0, 0, 5, 1, 1, 5), []toolpath.Segment{
			withFeed(seg(line, cut, 1, 1, 5, 2, 1, 5), 100.5), withFeed(seg(line, cut, 2, 1, 5, 1, 1, 5), 700)}},
		{"half circles", router, seg(line, travel, 0, 0, 5, 10, 0, 5), []toolpath.Segment{
			arcSeg(cut, 10, 0, -10, 0, 0, 0, 5, true), arcSeg(cut, -10, 0, 10, 0, 0, 0, 5, true)}},
		{"full circle", router, seg(line, travel, 0, 0, 5, 10.0001, 0.0003, 5), []toolpath.Segment{
			arcSeg(cut, 10.0001, 0.0003, 10.0001, 0.0003, 0.0002, -0.0004, 5, false)}},
		{"off-grid arcs", router, seg(line, travel, 0, 0, 5, 3.0004, 4.0004, 5), []toolpath.Segment{
			arcSeg(cut, 3.0004, 4.0004, -3.0004+0.0008, -4.0004+0.0008, 0.0004, 0.0004, 5, false),
			arcSeg(cut, -3.0004+0.0008, -4.0004+0.0008, 3.0004, 4.0004, 0.0004, 0.0004, 5, false)}},
		{"laser beam off and on", laser, seg(line, travel, 0, 0, 0, 1, 1, 0), []toolpath.Segment{
			seg(line, cut, 1, 1, 0, 5, 1, 0), seg(line, travel, 5, 1, 0, 1, 1, 0)}},
		{"laser dwell mark", laser, seg(line, travel, 0, 0, 0, 1, 1, 0), []toolpath.Segment{
			func() toolpath.Segment { s := seg(toolpath.Dwell, cut, 1, 1, 0, 1, 1, 0); s.Seconds = 0.2; return s }(),
			seg(line, travel, 1, 1, 0, 2, 2, 0), seg(line, travel, 2, 2, 0, 1, 1, 0)}},
		{"plotter pen", plotter, seg(line, travel, 0, 0, 2, 1, 1, 2), []toolpath.Segment{
			seg(line, cut, 1, 1, 2, 1, 1, 0), seg(line, cut, 1, 1, 0, 4, 4, 0),
			seg(line, travel, 4, 4, 0, 4, 4, 2), seg(line, travel, 4, 4, 2, 1, 1, 2)}},
		{"dwell", router, seg(line, travel, 0, 0, 5, 1, 1, 5), []toolpath.Segment{dw}},
		{"zero-length move left out", router, seg(line, travel, 0, 0, 5, 1, 1, 5), []toolpath.Segment{
			seg(line, cut, 1, 1, 5, 1.0001, 1, 5), seg(line, cut, 1.0001, 1, 5, 1, 1, 5)}},
		{"crossing near-circle split in two", inchLaser, seg(line, travel, 0, 0, 0, 10, 0, 0), []toolpath.Segment{crossing, back}},
		{"sliver written as a line", inchLaser, seg(line, travel, 0, 0, 0, 10, 0, 0), []toolpath.Segment{sliver, back}},
	}
}

// TestWriteSegmentAllocatesNothing: writing a segment allocates nothing,
// whatever branch it takes, including the buffer flushes to the
// io.Writer along the way.
func TestWriteSegmentAllocatesNothing(t *testing.T) {
	for _, tt := range allocCases() {
		w, err := gcodeout.NewWriter(io.Discard, tt.cfg)
		if err != nil {
			t.Fatal(err)
		}
		if err := w.WriteSegment(tt.lead); err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		var werr error
		allocs := testing.AllocsPerRun(2000, func() {
			for _, s := range tt.loop {
				if err := w.WriteSegment(s); err != nil {
					werr = err
				}
			}
		})
		if werr != nil {
			t.Fatalf("%s: %v", tt.name, werr)
		}
		if allocs != 0 {
			t.Errorf("%s: %v allocations per cycle, want 0", tt.name, allocs)
		}
	}
}
