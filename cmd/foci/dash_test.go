package main

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// dashRun is one continuous cut read back from a program: the curve
// parameters of the feet of its first and last points and its moves.
type dashRun struct {
	t0, t1 float64
	moves  []toolpath.Segment
}

// dashesOf reads the dashes of a program back: runs of feed moves in XY
// at cutting height (router below Z0, plotter at or below Z0, laser with
// the beam on).
func dashesOf(t *testing.T, src []byte, m conformance.Machine, el ellipse.Ellipse) []dashRun {
	t.Helper()
	p, err := conformance.Read(src, conformance.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var runs []dashRun
	open := false
	for i, s := range p.Path {
		mv := p.Moves[i]
		cutting := s.Motion == toolpath.Cut && s.Kind != toolpath.Dwell && (s.Start.X != s.End.X || s.Start.Y != s.End.Y)
		switch m {
		case conformance.Laser:
			cutting = cutting && mv.Spindle != conformance.SpindleOff && mv.Speed > 0
		case conformance.Plotter:
			cutting = cutting && math.Max(s.Start.Z, s.End.Z) <= 0
		default:
			cutting = cutting && math.Max(s.Start.Z, s.End.Z) < 0
		}
		if !cutting {
			if s.Kind != toolpath.Dwell {
				open = false
			}
			continue
		}
		if !open {
			t0, _ := el.Nearest(ellipse.Point{X: s.Start.X, Y: s.Start.Y})
			runs = append(runs, dashRun{t0: t0})
			open = true
		}
		r := &runs[len(runs)-1]
		r.moves = append(r.moves, s)
		r.t1, _ = el.Nearest(ellipse.Point{X: s.End.X, Y: s.End.Y})
	}
	return runs
}

// forward returns the arc length from parameter a to b going
// counter-clockwise.
func forward(c ellipse.Parallel, a, b float64) float64 {
	for b < a {
		b += 2 * math.Pi
	}
	return c.ArcLength(a, b)
}

func TestDashProgramsPassTheChecksAndCloseEvenly(t *testing.T) {
	for _, units := range []string{"mm", "inch"} {
		k, tol, safe, up := 1.0, 0.05, 5.0, 3.0
		if units == "inch" {
			k, tol, safe, up = 1/25.4, 0.002, 0.2, 0.12
		}
		for _, sh := range shapes {
			for _, off := range []float64{0, 4} {
				w, h, cx, cy := sh.w*k, sh.h*k, sh.cx*k, sh.cy*k
				curve := curveOf(t, w, h, cx, cy, sh.rot, off*k)
				on, gap := 25*k, 10*k
				base := append(append([]string{"dash"}, shapeArgs(w, h, cx, cy, sh.rot, units)...),
					"-offset", fmt.Sprint(off*k), "-dash", fmt.Sprintf("%g,%g", on, gap))
				for _, c := range []struct {
					machine string
					cm      conformance.Machine
					safeZ   float64
					extra   []string
				}{
					{"router", conformance.Router, safe, []string{"-depth", fmt.Sprint(0.5 * k)}},
					{"laser", conformance.Laser, 0, []string{"-power", "400", "-geometry", "lines"}},
					{"plotter", conformance.Plotter, up, nil},
				} {
					args := append(with(base, "-machine", c.machine), c.extra...)
					name := strings.Join(args[1:], " ")
					src, _ := runToFile(t, args...)
					checkProgram(t, name, src, conformance.Rules{Machine: c.cm, SafeZ: c.safeZ})
					// The pattern: n = round(L/(on+off)) periods, both
					// lengths scaled by L/(n·(on+off)).
					l := curve.Length()
					n := int(math.Round(l / (on + gap)))
					scale := l / (float64(n) * (on + gap))
					runs := dashesOf(t, src, c.cm, curve.Ellipse())
					if len(runs) != n {
						t.Errorf("%s: %d dashes, want %d", name, len(runs), n)
						continue
					}
					for i, r := range runs {
						for _, s := range r.moves {
							if lo, hi := conformance.SegmentDeviation(curve, s); lo < -tol || hi > tol {
								t.Errorf("%s: dash %d strays %g to %g from the curve, more than %g", name, i, lo, hi, tol)
							}
						}
						// Lengths along the curve between the feet: the ends
						// of a dash are within the band, so within about tol.
						if got := forward(curve, r.t0, r.t1); math.Abs(got-on*scale) > 3*tol {
							t.Errorf("%s: dash %d covers %g of the curve, want %g", name, i, got, on*scale)
						}
						next := runs[(i+1)%n]
						if got := forward(curve, r.t1, next.t0); math.Abs(got-gap*scale) > 3*tol {
							t.Errorf("%s: the gap after dash %d is %g, want %g", name, i, got, gap*scale)
						}
					}
				}
			}
		}
	}
}

func TestDashDotsAreMarksAtEqualSpacing(t *testing.T) {
	for _, c := range []struct {
		machine string
		cm      conformance.Machine
		extra   []string
	}{
		{"router", conformance.Router, []string{"-depth", "1"}},
		{"laser", conformance.Laser, []string{"-power", "90"}}, // dwell defaults to 0.1 s for dots
		{"plotter", conformance.Plotter, nil},
	} {
		args := append([]string{"dash", "-machine", c.machine, "-size", "200x120", "-rotate", "15", "-dash", "0,12"}, c.extra...)
		src, _ := runToFile(t, args...)
		curve := curveOf(t, 200, 120, 0, 0, 15, 0)
		n := int(math.Round(curve.Length() / 12))
		pts := marksOf(t, src, c.cm)
		checkSpacing(t, c.machine, pts, curve, n, 2e-4)
		if c.cm == conformance.Laser && len(pts) > 0 && pts[0].seconds != 0.1 {
			t.Errorf("laser dots: %g s each, want the 0.1 s default", pts[0].seconds)
		}
	}
}

func TestDashRefusesBadInput(t *testing.T) {
	p := []string{"dash", "-machine", "plotter", "-size", "300x200"}
	testRefusals(t, []refusal{
		{p, "dash"},
		{with(p, "-dash", "10"), "dash"},
		{with(p, "-dash", "10,0"), "dash"},
		{with(p, "-dash", "-1,5"), "dash"},
		{with(p, "-dash", "a,b"), "dash"},
		{with(p, "-dash", "1e-9,1e-9"), "dash"}, // shorter than the tolerance
		{with(p, "-dash", "0.04,5"), "dash"},    // likewise, at -tol 0.05
		{with(p, "-dash", "0,1e-9"), "dash"},    // far too many dots
		{with(p, "-dash", "10,5", "-tol", "0"), "tol"},
		{with(p, "-dash", "10,5", "-offset", "-80"), "offset"},
		{with(p, "-dash", "10,5", "-depth", "1"), "depth"},
		{[]string{"dash", "-machine", "router", "-size", "300x200", "-dash", "10,5"}, "depth"},
		{[]string{"dash", "-machine", "router", "-size", "300x200", "-dash", "10,5", "-depth", "0"}, "depth"},
		{[]string{"dash", "-machine", "router", "-size", "300x200", "-dash", "10,5", "-depth", "1", "-power", "1"}, "power"},
		{[]string{"dash", "-machine", "laser", "-size", "300x200", "-dash", "0,5", "-power", "9", "-dwell", "0"}, "dwell"},
		{[]string{"dash", "-machine", "laser", "-size", "300x200", "-dash", "10,5", "-power", "9", "-dwell", "-1"}, "dwell"},
		{[]string{"dash", "-machine", "laser", "-size", "300x200", "-dash", "10,5"}, "power"},
	})
}
