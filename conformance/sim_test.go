package conformance

import (
	"math"
	"strconv"
	"testing"

	"github.com/focitools/foci/toolpath"
)

func TestReadArcs(t *testing.T) {
	const head = "G21 G90\nG0 X10 Y0 Z0\nF100\n"
	tests := []struct {
		name          string
		line          string
		cx, cy, r     float64
		clockwise     bool
		sweep         float64 // degrees, signed
		problem       string
		endX, endY, z float64
	}{
		{"quarter counter-clockwise", "G3 X0 Y10 I-10 J0", 0, 0, 10, false, 90, "", 0, 10, 0},
		{"quarter clockwise the long way", "G2 X0 Y10 I-10 J0", 0, 0, 10, true, -270, "", 0, 10, 0},
		{"full circle", "G3 X10 Y0 I-10 J0", 0, 0, 10, false, 360, "", 10, 0, 0},
		{"full circle, end words left out", "G2 I-10", 0, 0, 10, true, -360, "", 10, 0, 0},
		{"helix", "G3 X0 Y10 Z-2 I-10 J0", 0, 0, 10, false, 90, "", 0, 10, -2},
		{"R short way counter-clockwise", "G3 X0 Y10 R10", 0, 0, 10, false, 90, "", 0, 10, 0},
		{"R long way counter-clockwise", "G3 X0 Y10 R-10", 10, 10, 10, false, 270, "", 0, 10, 0},
		{"R short way clockwise", "G2 X0 Y10 R10", 10, 10, 10, true, -90, "", 0, 10, 0},
		{"R long way clockwise", "G2 X0 Y10 R-10", 0, 0, 10, true, -270, "", 0, 10, 0},
		{"R half circle", "G3 X-10 Y0 R10", 0, 0, 10, false, 180, "", -10, 0, 0},
		{"R a hair short of half the chord", "G3 X-10 Y0 R9.999", 0, 0, 10, false, 180, "", -10, 0, 0},
		{"R too short", "G3 X-10 Y0 R9.99", 0, 0, 0, false, 0, RuleArcInvalid, 0, 0, 0},
		{"R full circle", "G3 X10 Y0 R10", 0, 0, 0, false, 0, RuleArcInvalid, 0, 0, 0},
		{"R zero", "G3 X0 Y10 R0", 0, 0, 0, false, 0, RuleArcInvalid, 0, 0, 0},
		{"centre on the start", "G3 X0 Y10 I0 J0", 0, 0, 0, false, 0, RuleArcInvalid, 0, 0, 0},
		{"no centre", "G3 X0 Y10", 0, 0, 0, false, 0, RuleArcInvalid, 0, 0, 0},
		{"both forms", "G3 X0 Y10 I-10 R10", 0, 0, 0, false, 0, RuleArcInvalid, 0, 0, 0},
		{"K is not in the XY plane", "G3 X0 Y10 I-10 J0 K1", 0, 0, 10, false, 90, RuleUnsupported, 0, 10, 0},
		{"incremental", "G91 G3 X-10 Y10 I-10 J0", 0, 0, 10, false, 90, "", 0, 10, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := read(t, head+tc.line+"\nM2\n")
			got := ""
			if len(p.Problems) > 0 {
				got = p.Problems[0].Rule
			}
			if got != tc.problem {
				t.Fatalf("problems %v, want %q", p.Problems, tc.problem)
			}
			if tc.problem == RuleArcInvalid {
				if len(p.Path) != 1 {
					t.Errorf("an invalid arc made a segment: %+v", p.Path)
				}
				return
			}
			if len(p.Path) != 2 {
				t.Fatalf("%d segments, want 2", len(p.Path))
			}
			s := p.Path[1]
			if s.Kind != toolpath.Arc || s.Motion != toolpath.Cut || s.Clockwise != tc.clockwise {
				t.Errorf("%v %v clockwise %v, want a cutting arc clockwise %v", s.Kind, s.Motion, s.Clockwise, tc.clockwise)
			}
			const eps = 1e-9
			if math.Abs(s.CenterX-tc.cx) > eps || math.Abs(s.CenterY-tc.cy) > eps || math.Abs(s.Radius-tc.r) > eps {
				t.Errorf("centre (%v, %v) radius %v, want (%v, %v) radius %v", s.CenterX, s.CenterY, s.Radius, tc.cx, tc.cy, tc.r)
			}
			if sw := s.Sweep() * 180 / math.Pi; math.Abs(sw-tc.sweep) > 1e-6 {
				t.Errorf("sweep %v°, want %v°", sw, tc.sweep)
			}
			if s.End != (toolpath.Point{X: tc.endX, Y: tc.endY, Z: tc.z}) {
				t.Errorf("end %+v, want (%v, %v, %v)", s.End, tc.endX, tc.endY, tc.z)
			}
		})
	}
}

// The radius form and the centre form of the same arc must give the same
// centre: two routes to one answer.
func TestRadiusFormAgreesWithCentreForm(t *testing.T) {
	for k := 0; k < 200; k++ {
		// Arcs on a circle of radius 7 about (3, -2), written to 9
		// decimals: start angle a, sweep w, both directions.
		a := float64(k) * 0.731
		w := 0.05 + float64(k%37)*0.17 // up to 6.17 rad, never 2π
		if math.Abs(w-math.Pi) < 0.05 {
			continue // near half a turn R is ill-conditioned; see arc-r-near-half
		}
		for _, cw := range []bool{false, true} {
			sw := w
			g := "G3"
			if cw {
				sw, g = -w, "G2"
			}
			const cx, cy, r = 3, -2, 7
			x0, y0 := cx+r*math.Cos(a), cy+r*math.Sin(a)
			x1, y1 := cx+r*math.Cos(a+sw), cy+r*math.Sin(a+sw)
			R := r
			if w > math.Pi {
				R = -r
			}
			f := func(v float64) string { return strconv.FormatFloat(v, 'f', 9, 64) }
			start := "G21\nG0 X" + f(x0) + " Y" + f(y0) + " Z0\nF100\n"
			ij := read(t, start+g+" X"+f(x1)+" Y"+f(y1)+" I"+f(cx-x0)+" J"+f(cy-y0)+"\nM2\n")
			rr := read(t, start+g+" X"+f(x1)+" Y"+f(y1)+" R"+f(float64(R))+"\nM2\n")
			if len(ij.Path) != 2 || len(rr.Path) != 2 {
				t.Fatalf("case %d: %v %v", k, ij.Problems, rr.Problems)
			}
			a1, a2 := ij.Path[1], rr.Path[1]
			if math.Hypot(a1.CenterX-a2.CenterX, a1.CenterY-a2.CenterY) > 1e-6 || math.Abs(a1.Sweep()-a2.Sweep()) > 1e-6 {
				t.Errorf("case %d %s: I J centre (%v, %v) sweep %v; R centre (%v, %v) sweep %v",
					k, g, a1.CenterX, a1.CenterY, a1.Sweep(), a2.CenterX, a2.CenterY, a2.Sweep())
			}
		}
	}
}
