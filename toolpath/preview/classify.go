package preview

import (
	"math"
	"strconv"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
)

// analysis is what the picture needs to know about a path beyond its
// segments.
type analysis struct {
	classes []plan.Class
	// zLo and zHi are the range of cutting heights (segment midpoints);
	// hasCut is false when nothing cuts in XY.
	zLo, zHi float64
	hasCut   bool
	hasTrav  bool
	hasTab   bool
	holes    []plan.Point
	// loops are the cut loops in order; start is where the first cut
	// begins, when hasStart.
	loops    []span
	start    plan.Point
	hasStart bool
	// bounds of the whole path
	minX, minY, maxX, maxY float64
	// bounds of the cuts (or of everything when nothing cuts)
	cutMinX, cutMinY, cutMaxX, cutMaxY float64
	cutLength, travelLength            float64
}

// MaxCoordinate bounds the coordinates and radii of a path that can be
// drawn: a thousand kilometres in millimetres.
const MaxCoordinate = 1e9

// checkPath refuses non-finite coordinates and coordinates beyond
// ±MaxCoordinate, so that no NaN or overflow reaches the rasterizer.
func checkPath(p toolpath.Path) error {
	if len(p) == 0 {
		return &Error{Err: ErrEmpty}
	}
	names := [...]string{"Start.X", "Start.Y", "Start.Z", "End.X", "End.Y", "End.Z", "CenterX", "CenterY", "Radius"}
	for i := range p {
		s := &p[i]
		vals := [...]float64{s.Start.X, s.Start.Y, s.Start.Z, s.End.X, s.End.Y, s.End.Z, s.CenterX, s.CenterY, s.Radius}
		n := 6 // only arcs use the centre and radius
		if s.Kind == toolpath.Arc {
			n = len(vals)
		}
		for k, v := range vals[:n] {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &Error{Field: "path[" + strconv.Itoa(i) + "]." + names[k], Value: v, Err: ErrNotFinite}
			}
			if math.Abs(v) > MaxCoordinate {
				return &Error{Field: "path[" + strconv.Itoa(i) + "]." + names[k], Value: v, Limit: "±1e9", Err: ErrOutOfRange}
			}
		}
	}
	return nil
}

// analyse classifies every segment (package plan finds tabs and holes),
// measures the path and finds the cut loops.
func analyse(p toolpath.Path) *analysis {
	a := &analysis{classes: plan.Classify(nil, p)}
	a.zLo, a.zHi = math.Inf(1), math.Inf(-1)
	a.minX, a.minY, a.maxX, a.maxY, _ = p.Bounds()
	for i := range p {
		s := &p[i]
		switch a.classes[i] {
		case plan.Cut, plan.Tab:
			z := plan.Height(s)
			a.zLo, a.zHi = math.Min(a.zLo, z), math.Max(a.zHi, z)
			a.hasCut = true
			a.hasTab = a.hasTab || a.classes[i] == plan.Tab
			a.cutLength += s.Length()
		case plan.Travel:
			a.hasTrav = true
			a.travelLength += s.Length()
		}
	}
	a.holes = plan.Holes(p)
	a.findLoops(p)
	a.cutBounds(p)
	return a
}

// span is a range [from, to) of segment indices.
type span struct{ from, to int }

// maxLoops bounds the loops that get direction arrows.
const maxLoops = 200

// findLoops finds the cut loops: each unbroken run of cutting moves in XY
// (leads and links excluded) up to where it closes on itself, stops or
// leaves the stock. The first is where the start mark and most arrows go.
func (a *analysis) findLoops(p toolpath.Path) {
	for i := range p {
		if a.classes[i].Cuts() {
			a.start = plan.Point{X: p[i].Start.X, Y: p[i].Start.Y}
			a.hasStart = true
			break
		}
	}
	if !a.hasStart {
		return
	}
	size := math.Max(a.maxX-a.minX, a.maxY-a.minY)
	closeEnough := 1e-4 * size
	from := -1
	for i := 0; i < len(p) && len(a.loops) < maxLoops; i++ {
		s := &p[i]
		if from < 0 {
			if a.classes[i].Cuts() && s.Role != toolpath.LeadIn && s.Role != toolpath.Link && s.Role != toolpath.LeadOut {
				from = i
			} else {
				continue
			}
		}
		if s.Motion != toolpath.Cut || s.Role == toolpath.LeadOut || s.Role == toolpath.Link {
			a.loops = append(a.loops, span{from, i})
			from = -1
			continue
		}
		o := p[from].Start
		if plan.MovesXY(s) && (i > from || s.Kind == toolpath.Arc) && math.Hypot(s.End.X-o.X, s.End.Y-o.Y) <= closeEnough {
			a.loops = append(a.loops, span{from, i + 1})
			from = -1
		}
	}
	if from >= 0 && len(a.loops) < maxLoops {
		a.loops = append(a.loops, span{from, len(p)})
	}
}

// cutBounds computes the XY extent of the cutting moves (arcs exactly) and
// holes, or of the whole path when nothing cuts.
func (a *analysis) cutBounds(p toolpath.Path) {
	if !a.hasCut && len(a.holes) == 0 {
		a.cutMinX, a.cutMinY, a.cutMaxX, a.cutMaxY = a.minX, a.minY, a.maxX, a.maxY
		return
	}
	a.cutMinX, a.cutMinY = math.Inf(1), math.Inf(1)
	a.cutMaxX, a.cutMaxY = math.Inf(-1), math.Inf(-1)
	for i := range p {
		if !a.classes[i].Cuts() {
			continue
		}
		x0, y0, x1, y1, _ := p[i : i+1].Bounds()
		a.cutMinX, a.cutMaxX = math.Min(a.cutMinX, x0), math.Max(a.cutMaxX, x1)
		a.cutMinY, a.cutMaxY = math.Min(a.cutMinY, y0), math.Max(a.cutMaxY, y1)
	}
	for _, h := range a.holes {
		a.cutMinX, a.cutMaxX = math.Min(a.cutMinX, h.X), math.Max(a.cutMaxX, h.X)
		a.cutMinY, a.cutMaxY = math.Min(a.cutMinY, h.Y), math.Max(a.cutMaxY, h.Y)
	}
}
