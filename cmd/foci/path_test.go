package main

import (
	"fmt"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/toolpath"
)

// pathCase is one shape for "foci path".
type pathCase struct {
	name               string
	w, h, cx, cy, rot  float64
	offset, tol, safeZ float64
	units              string
	extra              []string
}

// pathCases spans round, ordinary and flat shapes in both units; the
// flat one has b²/a = 0.015 mm, below the tolerance, so only the outside
// zone can follow it.
var pathCases = []pathCase{
	{name: "round", w: 80, h: 80, tol: 0.05, safeZ: 5, units: "mm"},
	{name: "ordinary rotated", w: 600, h: 400, cx: 310, cy: -45.5, rot: 30, tol: 0.05, safeZ: 5, units: "mm"},
	{name: "ordinary offset out", w: 120, h: 70, rot: -12, offset: 3.175, tol: 0.02, safeZ: 5, units: "mm"},
	{name: "ordinary offset in", w: 120, h: 70, rot: 100, offset: -3, tol: 0.1, safeZ: 5, units: "mm"},
	{name: "flat", w: 300, h: 3, tol: 0.05, safeZ: 5, units: "mm", extra: []string{"-zone", "outside"}},
	{name: "inch ordinary", w: 8, h: 5, cx: 4, cy: 2.5, tol: 0.002, safeZ: 0.2, units: "inch"},
	{name: "inch round offset", w: 3, h: 3, offset: 0.125, tol: 0.001, safeZ: 0.2, units: "inch"},
	{name: "inch flat", w: 10, h: 0.4, rot: 45, tol: 0.001, safeZ: 0.2, units: "inch"},
}

func (c pathCase) args() []string {
	a := []string{"path",
		"-size", fmt.Sprintf("%gx%g", c.w, c.h), "-center", fmt.Sprintf("%g,%g", c.cx, c.cy),
		"-rotate", fmt.Sprint(c.rot), "-offset", fmt.Sprint(c.offset),
		"-tol", fmt.Sprint(c.tol), "-units", c.units}
	return append(a, c.extra...)
}

func TestPathProgramsReadBackWithinTheZone(t *testing.T) {
	for _, c := range pathCases {
		for _, geom := range []string{"lines", "arcs"} {
			zones := []string{"band", "outside", "inside"}
			if len(c.extra) > 0 {
				zones = []string{""}
			}
			for _, zone := range zones {
				args := append(c.args(), "-geometry", geom)
				if zone != "" {
					args = append(args, "-zone", zone)
				}
				name := fmt.Sprintf("%s/%s/%s", c.name, geom, zone)
				src, r := runToFile(t, args...)
				z, _ := toolpath.ParseZone(zone)
				if zone == "" {
					z = toolpath.Outside
				}
				rules := conformance.Rules{
					Machine: conformance.Plotter,
					SafeZ:   c.safeZ,
					Shape:   &conformance.Shape{Curve: curveOf(t, c.w, c.h, c.cx, c.cy, c.rot, c.offset), Zone: z, Tol: c.tol},
				}
				rep := checkProgram(t, name, src, rules)
				s := rep.Summary
				if !s.Geometry || s.Contour == 0 || s.Runs != 1 || s.Lead != 0 {
					t.Errorf("%s: summary %+v: want one run of contour moves and no lead moves", name, s)
				}
				lo, hi := z.Limits(c.tol)
				if s.DeviationLo < lo || s.DeviationHi > hi {
					t.Errorf("%s: deviation [%g, %g] outside the zone [%g, %g]", name, s.DeviationLo, s.DeviationHi, lo, hi)
				}
				// The count on stderr is the count in the program.
				if want := fmt.Sprintf(": %d %s within", s.Contour, geom); !strings.Contains(r.stderr, want) {
					t.Errorf("%s: stderr %q does not report %q", name, r.stderr, want)
				}
				if geom == "lines" && s.Arcs != 0 {
					t.Errorf("%s: %d arcs in a lines program", name, s.Arcs)
				}
				u, _ := parseUnits(c.units)
				if got, want := headerDecimals(src), programDecimals(c.tol, u); got != want {
					t.Errorf("%s: header says %d decimals, want %d", name, got, want)
				}
			}
		}
	}
}

// The program is made of exactly the parts promised: the setup line, a
// lift, one rapid to the start, the pen lowered, feed moves, the lift and
// the end.
func TestPathProgramHasOnlyTheCurveBetweenLiftAndEnd(t *testing.T) {
	r := runFoci(t, "path", "-size", "60x40", "-tol", "0.05", "-feed", "750")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	var code []string
	for _, l := range strings.Split(strings.TrimSpace(r.stdout), "\n") {
		if !strings.HasPrefix(l, "(") {
			code = append(code, l)
		}
	}
	want := []string{"G21 G17 G90 G94", "G0 Z5", "G0 X30 Y0", "G1 Z0 F750"}
	for i, w := range want {
		if code[i] != w {
			t.Errorf("line %d of the code is %q, want %q", i+1, code[i], w)
		}
	}
	body := code[len(want) : len(code)-2]
	for i, l := range body {
		if !strings.HasPrefix(l, "G2 ") && !strings.HasPrefix(l, "G3 ") && !strings.HasPrefix(l, "G1 X") {
			t.Errorf("body line %d %q is not a feed move in X Y", i+1, l)
		}
		if strings.Contains(l, " R") || strings.Contains(l, "Z") {
			t.Errorf("body line %d %q has an R or a Z word", i+1, l)
		}
	}
	if tail := code[len(code)-2:]; tail[0] != "G0 Z5" || tail[1] != "M2" {
		t.Errorf("the program ends %q, want the lift and M2", tail)
	}
	if !strings.HasSuffix(body[len(body)-1], " X30 Y0") && !strings.Contains(body[len(body)-1], "X30 Y0 ") {
		t.Errorf("the last move %q does not return to the start X30 Y0", body[len(body)-1])
	}
}

func TestPathDefaultsFollowTheUnits(t *testing.T) {
	for _, c := range []struct {
		units           string
		tol, feed, safe string
	}{
		{"mm", "(tolerance: band +-0.05 mm)", "F1000", "G0 Z5\n"},
		{"inch", "(tolerance: band +-0.002 inch)", "F40", "G0 Z0.2\n"},
	} {
		r := runFoci(t, "path", "-size", "6x4", "-units", c.units)
		if r.code != 0 {
			t.Fatalf("%s: exit %d: %s", c.units, r.code, r.stderr)
		}
		for _, w := range []string{c.tol, c.feed, c.safe} {
			if !strings.Contains(r.stdout, w) {
				t.Errorf("-units %s: the program lacks %q", c.units, w)
			}
		}
	}
}

// The segments written are the approximation's: count and decimals agree
// with the library's for the same Spec.
func TestPathWritesTheLibraryApproximation(t *testing.T) {
	for _, tol := range []float64{0.5, 0.05, 0.005} {
		for _, g := range []toolpath.Geometry{toolpath.Lines, toolpath.Arcs} {
			curve := curveOf(t, 250, 90, 0, 0, 0, 0)
			dec := programDecimals(tol, unitsMM)
			p, err := toolpath.Approximate(nil, toolpath.Spec{Curve: curve, Tol: tol, Geometry: g, Decimals: dec})
			if err != nil {
				t.Fatal(err)
			}
			r := runFoci(t, "path", "-size", "250x90", "-tol", strconv.FormatFloat(tol, 'g', -1, 64), "-geometry", g.String())
			moves := strings.Count(r.stdout, "\nG1 X") + strings.Count(r.stdout, "\nG2 ") + strings.Count(r.stdout, "\nG3 ")
			if moves != len(p) {
				t.Errorf("tol %g %s: %d feed moves in the program, the library gives %d segments", tol, g, moves, len(p))
			}
			if got := headerDecimals([]byte(r.stdout)); got != dec {
				t.Errorf("tol %g %s: %d decimals, want %d", tol, g, got, dec)
			}
		}
	}
}

func TestPathRefusesBadInput(t *testing.T) {
	testRefusals(t, []refusal{
		{[]string{"path", "-size", "60x40", "-tol", "0"}, "tol"},
		{[]string{"path", "-size", "60x40", "-tol", "-0.1"}, "tol"},
		{[]string{"path", "-size", "60x40", "-tol", "NaN"}, "tol"},
		{[]string{"path", "-size", "60x40", "-tol", "+Inf"}, "tol"},
		{[]string{"path", "-size", "60x40", "-tol", "1e-9"}, "tol"}, // finer than 8 decimals can carry
		{[]string{"path", "-size", "300x3", "-tol", "0.05"}, "tol"}, // band reaches past b²/a = 0.015
		{[]string{"path", "-size", "300x3", "-offset", "-0.001"}, "offset"},
		{[]string{"path", "-size", "60x40", "-offset", "-20"}, "offset"}, // past b²/a = 13.3
		{[]string{"path", "-size", "60x40", "-offset", "NaN"}, "offset"},
		{[]string{"path", "-size", "60x40", "-geometry", "splines"}, "geometry"},
		{[]string{"path", "-size", "60x40", "-zone", "middle"}, "zone"},
		{[]string{"path", "-size", "60x40", "-feed", "0"}, "feed"},
		{[]string{"path", "-size", "60x40", "-feed", "1e300"}, "feed"},
		{[]string{"path", "-size", "60x40", "-safe-z", "-1"}, "safe-z"},
		{[]string{"path", "-size", "60x40", "-units", "furlong"}, "units"},
		{[]string{"path", "-size", "0x40"}, "size"},
		{[]string{"path"}, "size"},
	})
	if r := runFoci(t, "path", "-size", "60x40", "-tol", "abc"); r.code != 2 || !strings.Contains(r.stderr, "-tol") {
		t.Errorf("-tol abc: exit %d, %q", r.code, r.stderr)
	}
	if r := runFoci(t, "path", "-size", "60x40", "extra"); r.code != 2 || r.stdout != "" {
		t.Errorf("a stray argument: exit %d, stdout %q", r.code, r.stdout)
	}
}
