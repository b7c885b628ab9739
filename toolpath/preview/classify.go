package preview

import (
	"math"
	"strconv"

	"github.com/focitools/foci/toolpath"
)

// class says how one segment appears in plan view.
type class uint8

const (
	hidden class = iota // no XY motion: plunges, retracts, dwells
	travel              // a travel move in XY
	cut                 // a cutting move in XY
	tabCut              // a cutting move that leaves a holding tab
)

// isCut reports whether class c cuts in XY.
func isCut(c class) bool { return c == cut || c == tabCut }

// point is a position in the XY plane.
type point struct{ x, y float64 }

// analysis is what the picture needs to know about a path beyond its
// segments.
type analysis struct {
	classes []class
	// zLo and zHi are the range of cutting heights (segment midpoints);
	// hasCut is false when nothing cuts in XY.
	zLo, zHi float64
	hasCut   bool
	hasTrav  bool
	hasTab   bool
	holes    []point
	// loops are the cut loops in order; start is where the first cut
	// begins, when hasStart.
	loops    []span
	start    point
	hasStart bool
	// bounds of the whole path
	minX, minY, maxX, maxY float64
	// bounds of the cuts (or of everything when nothing cuts)
	cutMinX, cutMinY, cutMaxX, cutMaxY float64
	cutLength, travelLength            float64
}

// movesXY reports whether s moves in the XY plane.
func movesXY(s *toolpath.Segment) bool {
	switch s.Kind {
	case toolpath.Line:
		return s.Start.X != s.End.X || s.Start.Y != s.End.Y
	case toolpath.Arc:
		return s.Radius > 0
	}
	return false
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

// analyse classifies every segment, finds tabs, holes and the first loop.
func analyse(p toolpath.Path) *analysis {
	a := &analysis{classes: make([]class, len(p))}
	a.zLo, a.zHi = math.Inf(1), math.Inf(-1)
	a.minX, a.minY, a.maxX, a.maxY, _ = p.Bounds()
	for i := range p {
		s := &p[i]
		if !movesXY(s) {
			continue
		}
		if s.Motion == toolpath.Cut {
			a.classes[i] = cut
			z := (s.Start.Z + s.End.Z) / 2
			a.zLo, a.zHi = math.Min(a.zLo, z), math.Max(a.zHi, z)
			a.hasCut = true
			a.cutLength += s.Length()
		} else {
			a.classes[i] = travel
			a.hasTrav = true
			a.travelLength += s.Length()
		}
	}
	a.findTabs(p)
	a.findHoles(p)
	a.findLoops(p)
	a.cutBounds(p)
	return a
}

// findTabs marks tab segments: those with Role Tab, and cutting moves in
// XY raised above both an earlier and a later cutting move of the same
// unbroken run of cuts (the tool climbed over a tab and went back down).
func (a *analysis) findTabs(p toolpath.Path) {
	eps := 1e-9 * (1 + math.Abs(a.zLo) + math.Abs(a.zHi))
	// suffix minimum of the cutting height within each run, walking back
	suffix := make([]float64, len(p))
	low := math.Inf(1)
	for i := len(p) - 1; i >= 0; i-- {
		s := &p[i]
		if s.Motion != toolpath.Cut {
			low = math.Inf(1)
		} else if a.classes[i] == cut {
			low = math.Min(low, (s.Start.Z+s.End.Z)/2)
		}
		suffix[i] = low
	}
	low = math.Inf(1)
	for i := range p {
		s := &p[i]
		if s.Motion != toolpath.Cut {
			low = math.Inf(1)
			continue
		}
		if a.classes[i] != cut {
			continue
		}
		z := (s.Start.Z + s.End.Z) / 2
		low = math.Min(low, z)
		if s.Role == toolpath.Tab || (z > low+eps && z > suffix[i]+eps) {
			a.classes[i] = tabCut
			a.hasTab = true
		}
	}
}

// findHoles collects hole and mark positions: Role Hole, dwells while
// cutting, and vertical plunges not followed by cutting in XY. Repeats at
// one XY (peck drilling) count once.
func (a *analysis) findHoles(p toolpath.Path) {
	seen := map[point]bool{}
	add := func(x, y float64) {
		q := point{x, y}
		if !seen[q] {
			seen[q] = true
			a.holes = append(a.holes, q)
		}
	}
	for i := range p {
		s := &p[i]
		switch {
		case s.Role == toolpath.Hole && s.Motion == toolpath.Cut:
			add(s.End.X, s.End.Y)
		case s.Kind == toolpath.Dwell && s.Motion == toolpath.Cut:
			add(s.Start.X, s.Start.Y)
		case s.Kind == toolpath.Line && s.Motion == toolpath.Cut && !movesXY(s) && s.End.Z < s.Start.Z:
			if !cutsNext(p, i+1) {
				add(s.End.X, s.End.Y)
			}
		}
	}
}

// cutsNext reports whether the first segment from i on that is not a
// dwell or a further vertical feed is a cutting move in XY.
func cutsNext(p toolpath.Path, i int) bool {
	for ; i < len(p); i++ {
		s := &p[i]
		if s.Kind == toolpath.Dwell {
			continue
		}
		if movesXY(s) {
			return s.Motion == toolpath.Cut
		}
		if s.Motion != toolpath.Cut || s.End.Z >= s.Start.Z {
			return false
		}
	}
	return false
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
		if isCut(a.classes[i]) {
			a.start = point{p[i].Start.X, p[i].Start.Y}
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
			if isCut(a.classes[i]) && s.Role != toolpath.LeadIn && s.Role != toolpath.Link && s.Role != toolpath.LeadOut {
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
		if movesXY(s) && (i > from || s.Kind == toolpath.Arc) && math.Hypot(s.End.X-o.X, s.End.Y-o.Y) <= closeEnough {
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
		if a.classes[i] != cut && a.classes[i] != tabCut {
			continue
		}
		x0, y0, x1, y1, _ := p[i : i+1].Bounds()
		a.cutMinX, a.cutMaxX = math.Min(a.cutMinX, x0), math.Max(a.cutMaxX, x1)
		a.cutMinY, a.cutMaxY = math.Min(a.cutMinY, y0), math.Max(a.cutMaxY, y1)
	}
	for _, h := range a.holes {
		a.cutMinX, a.cutMaxX = math.Min(a.cutMinX, h.x), math.Max(a.cutMaxX, h.x)
		a.cutMinY, a.cutMaxY = math.Min(a.cutMinY, h.y), math.Max(a.cutMaxY, h.y)
	}
}
