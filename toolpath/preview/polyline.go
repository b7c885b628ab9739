package preview

import (
	"math"

	"github.com/focitools/foci/toolpath"
	"github.com/fogleman/gg"
)

// minStep is the shortest polyline step in pixels; shorter moves merge into
// the next one.
const minStep = 0.75

// chordError is the largest gap in pixels between an arc and its chords.
const chordError = 0.25

// maxChords bounds the chords of one arc.
const maxChords = 4096

// polyline collects one drawing layer as pixel subpaths, merging steps
// shorter than minStep.
type polyline struct {
	pts    []float64 // x, y pairs
	starts []int     // index in pts (pairs) where each subpath begins
	// the pen: last position reached, and whether it was emitted
	penX, penY float64
	pending    bool
	open       bool
	lastX      float64
	lastY      float64
}

// at reports whether the pen is at (x, y) within a tiny fraction of a pixel.
func (p *polyline) at(x, y float64) bool {
	return p.open && math.Abs(p.penX-x) < 1e-6 && math.Abs(p.penY-y) < 1e-6
}

// moveTo starts a new subpath at (x, y) unless the pen is already there.
func (p *polyline) moveTo(x, y float64) {
	if p.at(x, y) {
		return
	}
	p.flush()
	p.starts = append(p.starts, len(p.pts)/2)
	p.pts = append(p.pts, x, y)
	p.lastX, p.lastY = x, y
	p.penX, p.penY = x, y
	p.open = true
}

// lineTo extends the current subpath to (x, y).
func (p *polyline) lineTo(x, y float64) {
	p.penX, p.penY = x, y
	dx, dy := x-p.lastX, y-p.lastY
	if dx*dx+dy*dy < minStep*minStep {
		p.pending = true
		return
	}
	p.pts = append(p.pts, x, y)
	p.lastX, p.lastY = x, y
	p.pending = false
}

// flush emits the pen position if it was held back.
func (p *polyline) flush() {
	if p.pending {
		p.pts = append(p.pts, p.penX, p.penY)
		p.lastX, p.lastY = p.penX, p.penY
		p.pending = false
	}
}

// empty reports whether nothing was added.
func (p *polyline) empty() bool { return len(p.starts) == 0 }

// replay hands the subpaths to dc as a path (not yet stroked).
func (p *polyline) replay(dc *gg.Context) { p.walk(dc, 0) }

// replayChunks strokes the subpaths on dc with its current settings, at
// most about chunk points per stroke. It suits opaque drawing only: where
// two chunks meet or overlap, their coverage adds up.
func (p *polyline) replayChunks(dc *gg.Context, chunk int) {
	p.walk(dc, chunk)
	dc.Stroke()
}

// walk hands the subpaths to dc, stroking after every chunk points when
// chunk > 0 (the last stretch is left to the caller).
func (p *polyline) walk(dc *gg.Context, chunk int) {
	p.flush()
	n := len(p.pts) / 2
	count := 0
	for k, s := range p.starts {
		e := n
		if k+1 < len(p.starts) {
			e = p.starts[k+1]
		}
		dc.MoveTo(p.pts[2*s], p.pts[2*s+1])
		if e-s == 1 {
			// a lone point: a tiny stroke so that round caps show it
			dc.LineTo(p.pts[2*s]+0.01, p.pts[2*s+1])
		}
		for i := s + 1; i < e; i++ {
			dc.LineTo(p.pts[2*i], p.pts[2*i+1])
			if count++; chunk > 0 && count >= chunk && i+1 < e {
				dc.Stroke()
				dc.MoveTo(p.pts[2*i], p.pts[2*i+1])
				count = 0
			}
		}
	}
}

// addSegment appends the plan view of a line or an arc to p.
func addSegment(p *polyline, l *layout, s *toolpath.Segment) {
	x0, y0 := l.px(s.Start.X, s.Start.Y)
	p.moveTo(x0, y0)
	if s.Kind != toolpath.Arc {
		x1, y1 := l.px(s.End.X, s.End.Y)
		p.lineTo(x1, y1)
		return
	}
	sweep := s.Sweep()
	rpx := s.Radius * l.scale
	n := chordCount(rpx, sweep)
	a0 := math.Atan2(s.Start.Y-s.CenterY, s.Start.X-s.CenterX)
	for k := 1; k < n; k++ {
		a := a0 + sweep*float64(k)/float64(n)
		x, y := l.px(s.CenterX+s.Radius*math.Cos(a), s.CenterY+s.Radius*math.Sin(a))
		p.lineTo(x, y)
	}
	x1, y1 := l.px(s.End.X, s.End.Y)
	p.lineTo(x1, y1)
}

// chordCount returns how many chords draw an arc of radius rpx pixels
// through sweep radians with a gap of at most chordError: a chord over
// angle θ stands off the arc by r(1 − cos θ/2) ≈ rθ²/8.
func chordCount(rpx, sweep float64) int {
	if !(rpx > 0) {
		return 1
	}
	theta := math.Sqrt(8 * chordError / rpx)
	n := int(math.Ceil(math.Abs(sweep) / theta))
	return max(1, min(n, maxChords))
}
