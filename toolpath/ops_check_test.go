package toolpath

import (
	"math"
	"slices"

	"github.com/focitools/foci/ellipse"
)

// This file holds the checks the operation tests apply to the paths they
// get: each works from the spec and the path alone, using the exact signed
// distance of package ellipse (Eberly's method), not from the operations'
// own internals.

// opsTB is what the checks need of *testing.T and *rapid.T.
type opsTB interface {
	Helper()
	Errorf(format string, args ...any)
	Fatalf(format string, args ...any)
}

// movesXY reports whether a segment moves in the XY plane.
func movesXY(s Segment) bool {
	return s.Kind == Arc || (s.Kind == Line && (s.Start.X != s.End.X || s.Start.Y != s.End.Y))
}

// footParam returns the parameter of the point of e nearest to p: for a
// point on the normal line at parameter t (closer than the fold of the
// inward parallel curves), t itself.
func footParam(e ellipse.Ellipse, p Point) float64 {
	t, _ := e.Nearest(ellipse.Point{X: p.X, Y: p.Y})
	return t
}

// paramSpan is a closed interval of parameters within [0, 2π].
type paramSpan struct{ a, b float64 }

// footSpans appends the parameter intervals the segments sweep over, as
// seen from the ellipse: each segment is cut into sixteen pieces (so that
// none turns by half a turn or more, even a half-circle arc) and each
// piece's ends are mapped to their feet.
func footSpans(dst []paramSpan, e ellipse.Ellipse, segs []Segment) []paramSpan {
	const pieces = 16
	for _, s := range segs {
		for k := 0; k < pieces; k++ {
			ta := footParam(e, s.At(float64(k)/pieces))
			tb := footParam(e, s.At(float64(k+1)/pieces))
			d := math.Remainder(tb-ta, 2*math.Pi)
			lo := ta
			if d < 0 {
				lo = ta + d
			}
			lo = math.Mod(lo, 2*math.Pi)
			if lo < 0 {
				lo += 2 * math.Pi
			}
			hi := lo + math.Abs(d)
			if hi > 2*math.Pi {
				dst = append(dst, paramSpan{lo, 2 * math.Pi}, paramSpan{0, hi - 2*math.Pi})
			} else {
				dst = append(dst, paramSpan{lo, hi})
			}
		}
	}
	return dst
}

// mergeSpans returns the union of the spans, sorted, merging spans that
// overlap or leave a gap of at most eps.
func mergeSpans(sp []paramSpan, eps float64) []paramSpan {
	sp = slices.Clone(sp)
	slices.SortFunc(sp, func(x, y paramSpan) int {
		switch {
		case x.a < y.a:
			return -1
		case x.a > y.a:
			return 1
		}
		return 0
	})
	var out []paramSpan
	for _, s := range sp {
		if n := len(out); n > 0 && s.a <= out[n-1].b+eps {
			out[n-1].b = math.Max(out[n-1].b, s.b)
			continue
		}
		out = append(out, s)
	}
	// Join across 2π.
	if n := len(out); n > 1 && out[0].a <= eps && out[n-1].b >= 2*math.Pi-eps {
		out[0].a = out[n-1].a - 2*math.Pi
		out = out[:n-1]
	}
	return out
}

// covered returns the measure of the union of merged spans.
func covered(sp []paramSpan) float64 {
	m := 0.0
	for _, s := range sp {
		m += s.b - s.a
	}
	return m
}

// overlap returns the measure of the intersection of two merged unions.
func overlap(x, y []paramSpan) float64 {
	m := 0.0
	for _, a := range x {
		for _, b := range y {
			for _, k := range []float64{-2 * math.Pi, 0, 2 * math.Pi} {
				lo := math.Max(a.a, b.a+k)
				hi := math.Min(a.b, b.b+k)
				if hi > lo {
					m += hi - lo
				}
			}
		}
	}
	return m
}

// signedFootTurn returns the signed parameter change from the foot of a
// segment's start to the foot of its end, summed over sixteen pieces so
// that a half-circle arc is measured unambiguously.
func signedFootTurn(e ellipse.Ellipse, s Segment) float64 {
	const pieces = 16
	sum := 0.0
	prev := footParam(e, s.Start)
	for k := 1; k <= pieces; k++ {
		t := footParam(e, s.At(float64(k)/pieces))
		sum += math.Remainder(t-prev, 2*math.Pi)
		prev = t
	}
	return sum
}

// checkContinuous checks that every segment starts exactly where the one
// before it ends.
func checkContinuous(t opsTB, p Path) {
	t.Helper()
	for i := 1; i < len(p); i++ {
		if p[i].Start != p[i-1].End {
			t.Errorf("segment %d starts at %+v, the one before ends at %+v", i, p[i].Start, p[i-1].End)
			return
		}
	}
}

// checkTravels checks that every travel in XY is at the travel height
// and, for a router, that no travel goes below Z0.
func checkTravels(t opsTB, s Setup, p Path) {
	t.Helper()
	tz := s.SafeZ
	switch s.Machine {
	case Laser:
		tz = s.FocusZ
	case Plotter:
		tz = s.PenUp
	}
	for i, g := range p {
		if g.Motion != Travel {
			continue
		}
		if movesXY(g) && (g.Start.Z != tz || g.End.Z != tz) && !(i == 0 && g.Start == g.End) {
			t.Errorf("travel %d in XY at Z %g..%g, not at the travel height %g", i, g.Start.Z, g.End.Z, tz)
		}
		if i == 0 && g.End.Z != tz {
			t.Errorf("first travel ends at Z %g, not at the travel height %g", g.End.Z, tz)
		}
		if s.Machine == Router && math.Min(g.Start.Z, g.End.Z) < 0 && g.End.Z < g.Start.Z {
			t.Errorf("travel %d moves down into the stock to Z %g", i, g.End.Z)
		}
		if g.Kind != Line {
			t.Errorf("travel %d is a %v", i, g.Kind)
		}
	}
	if s.Machine != Laser && len(p) > 0 {
		if last := p[len(p)-1]; last.Motion != Travel || last.End.Z != tz {
			t.Errorf("path ends with %v motion at Z %g, not a travel up to %g", last.Motion, last.End.Z, tz)
		}
	}
	if len(p) > 0 && (p[0].Motion != Travel || p[0].Start != p[0].End) {
		t.Errorf("first segment %+v is not a travel to the start", p[0])
	}
}
