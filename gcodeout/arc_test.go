package gcodeout_test

import (
	"bytes"
	"math"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
	"pgregory.net/rapid"
)

// drawArc draws a random arc: centre in ±1000, radius from 0.01 to 10 000
// (log-uniform), any start angle, sweeps near a half turn (where rounding
// hurts the radii most) as often as any other, and full circles.
func drawArc(t *rapid.T, units gcodeout.Units) toolpath.Segment {
	u := 1.0
	if units == gcodeout.Inch {
		u = 1 / 25.4
	}
	cx := rapid.Float64Range(-1000, 1000).Draw(t, "cx") * u
	cy := rapid.Float64Range(-1000, 1000).Draw(t, "cy") * u
	r := math.Pow(10, rapid.Float64Range(-2, 4).Draw(t, "log10 r")) * u
	a0 := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "a0")
	var sweep float64
	switch rapid.IntRange(0, 3).Draw(t, "sweep kind") {
	case 0:
		sweep = rapid.Float64Range(0.01, 2*math.Pi-0.01).Draw(t, "sweep")
	case 1:
		sweep = math.Pi + rapid.Float64Range(-0.05, 0.05).Draw(t, "sweep")
	case 2:
		sweep = rapid.Float64Range(1e-4, 0.01).Draw(t, "sweep")
	case 3:
		sweep = 2 * math.Pi
	}
	cw := rapid.Bool().Draw(t, "clockwise")
	if cw {
		sweep = -sweep
	}
	start := toolpath.Point{X: cx + r*math.Cos(a0), Y: cy + r*math.Sin(a0)}
	end := start
	if math.Abs(sweep) < 2*math.Pi {
		end = toolpath.Point{X: cx + r*math.Cos(a0+sweep), Y: cy + r*math.Sin(a0+sweep)}
	}
	return toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: start, End: end,
		CenterX: cx, CenterY: cy, Radius: r, Clockwise: cw}
}

// TestArcRadiiAgreeWithinNISTLimit: after rounding, the start and end
// radius of every written arc, computed from the text read back, differ
// by at most 0.002 mm or 0.0002 in (NIST RS274NGC v3 §3.5.3, Kramer,
// Proctor & Messina, NISTIR 6556, 2000), at the fewest decimals allowed and
// at decimals chosen from a random tolerance. The written arc also stays
// close to the intended one: end within half a unit in X and Y, centre
// within two units, mid-point within six; an arc written as a line (or
// not at all) is at most five units long; an arc split in two turns more
// than half a circle and is split at its middle.
func TestArcRadiiAgreeWithinNISTLimit(t *testing.T) {
	for _, units := range []gcodeout.Units{gcodeout.MM, gcodeout.Inch} {
		t.Run(units.String(), func(t *testing.T) {
			limit := gcodeout.ArcRadiusLimitMM
			if units == gcodeout.Inch {
				limit = gcodeout.ArcRadiusLimitInch
			}
			rapid.Check(t, func(rt *rapid.T) {
				cfg := gcodeout.Config{Machine: gcodeout.Laser, Units: units, Feed: 100, Power: 1}
				if rapid.Bool().Draw(rt, "random tolerance") {
					cfg.Tolerance = math.Pow(10, rapid.Float64Range(-4, -1).Draw(rt, "log10 tol"))
				}
				for n := rapid.IntRange(1, 8).Draw(rt, "arcs"); n > 0; n-- {
					checkOneArc(rt, cfg, drawArc(rt, units), limit)
				}
			})
		})
	}
}

// checkOneArc writes a travel to a's start and then a, reads the program
// back and checks what became of the arc.
func checkOneArc(rt *rapid.T, cfg gcodeout.Config, a toolpath.Segment, limit float64) {
	var out bytes.Buffer
	w, err := gcodeout.NewWriter(&out, cfg)
	if err != nil {
		rt.Fatal(err)
	}
	unit := math.Pow10(-w.Decimals())
	go1 := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Start: a.Start, End: a.Start}
	if err := w.WriteSegment(go1); err != nil {
		rt.Fatal(err)
	}
	if err := w.WriteSegment(a); err != nil {
		rt.Fatalf("arc %+v: %v", a, err)
	}
	if err := w.Close(); err != nil {
		rt.Fatal(err)
	}
	p := readBack(rt, out.String())
	moves := p.moves[1:]
	var arcs []readMove
	for _, m := range moves {
		if m.g >= 2 {
			arcs = append(arcs, m)
		}
	}
	last := p.moves[len(p.moves)-1]
	if math.Abs(last.to[0]-a.End.X) > unit/2*1.0001 || math.Abs(last.to[1]-a.End.Y) > unit/2*1.0001 {
		rt.Errorf("ends at %v, want %v", last.to, a.End)
	}
	length := a.Radius * math.Abs(a.Sweep())
	switch {
	case len(arcs) == 0:
		if length > 5*unit {
			rt.Errorf("arc of length %.3g units written as %d straight moves:\n%s", length/unit, len(moves), out.String())
		}
		return
	case len(arcs) != len(moves) || len(arcs) > 2:
		rt.Fatalf("arc written as a mix of moves:\n%s", out.String())
	case len(arcs) == 2:
		if math.Abs(a.Sweep()) <= math.Pi {
			rt.Errorf("arc of sweep %v split in two", a.Sweep())
		}
		mid := a.At(0.5)
		if math.Hypot(arcs[0].to[0]-mid.X, arcs[0].to[1]-mid.Y) > unit {
			rt.Errorf("split at %v, not at the middle %v", arcs[0].to, mid)
		}
	}
	for _, m := range arcs {
		rs, re := m.radii()
		if d := math.Abs(rs - re); d > limit {
			rt.Errorf("line %d %q: start radius %.9g, end radius %.9g differ by %.3g > %g",
				m.line, p.lines[m.line-1], rs, re, d, limit)
		}
		if (m.g == 2) != a.Clockwise {
			rt.Errorf("line %d: G%d for clockwise=%v", m.line, m.g, a.Clockwise)
		}
		if math.Hypot(m.ci-a.CenterX, m.cj-a.CenterY) > 2*unit {
			rt.Errorf("line %d: centre %v,%v, want %v,%v", m.line, m.ci, m.cj, a.CenterX, a.CenterY)
		}
	}
	if len(arcs) == 1 {
		if d := midGap(arcs[0], a); d > 6*unit {
			rt.Errorf("mid-point %.3g units from the intended arc's:\n%s", d/unit, out.String())
		}
	}
}

// midGap returns the distance between the mid-points of the arc as read
// back and as intended.
func midGap(m readMove, a toolpath.Segment) float64 {
	r, _ := m.radii()
	got := toolpath.Segment{Kind: toolpath.Arc, Start: toolpath.Point{X: m.from[0], Y: m.from[1]},
		End: toolpath.Point{X: m.to[0], Y: m.to[1]}, CenterX: m.ci, CenterY: m.cj, Radius: r, Clockwise: m.g == 2}
	p, q := got.At(0.5), a.At(0.5)
	return math.Hypot(p.X-q.X, p.Y-q.Y)
}
