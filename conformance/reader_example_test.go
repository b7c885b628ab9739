package conformance_test

import (
	"fmt"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// A coaster 40 mm across: one pass 1 mm deep, two half circles.
const coaster = `(coaster, 40 mm)
G21 G90 G17 G94
G0 Z5
M3 S16000
G0 X20 Y0
G1 Z-1 F200
G3 X-20 Y0 I-20 J0 F800
G3 X20 Y0 R20
G0 Z5
M5
M30
`

func ExampleRead() {
	p, err := conformance.Read([]byte(coaster), conformance.ReadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, s := range p.Path {
		m := p.Moves[i]
		fmt.Printf("line %2d: G%d %-4s to (%g, %g, %g) feed %g spindle %v\n", m.Line, m.Code, s.Kind, s.End.X, s.End.Y, s.End.Z, m.Feed, m.Spindle)
	}
	fmt.Println(len(p.Problems), "problems; units", p.Units, "; ends at line", p.EndLine)
	// Output:
	// line  3: G0 line to (20, 0, 5) feed 0 spindle off
	// line  5: G0 line to (20, 0, 5) feed 0 spindle M3
	// line  6: G1 line to (20, 0, -1) feed 200 spindle M3
	// line  7: G3 arc  to (-20, 0, -1) feed 800 spindle M3
	// line  8: G3 arc  to (20, 0, -1) feed 800 spindle M3
	// line  9: G0 line to (20, 0, 5) feed 800 spindle M3
	// 0 problems; units mm ; ends at line 11
}

func ExampleCheck() {
	// The coaster with its end cut off and a rapid dragged through it.
	src := coaster[:len(coaster)-len("G0 Z5\nM5\nM30\n")] + "G0 X0 Y0\n"
	p, _ := conformance.Read([]byte(src), conformance.ReadOptions{})
	for _, v := range conformance.Check(p, conformance.Rules{Machine: conformance.Router, SafeZ: 5}) {
		fmt.Println(v)
	}
	// Output:
	// line 8: arc-r-near-half: a radius-form arc sweeps 180.000°, within 1° of half a turn, where its centre is ill-conditioned; write it with I and J
	// line 9: program-end: the program does not end with M2 or M30
	// line 9: rapid-below-safe: a rapid moves in X or Y at Z -1, below the safe height 5 mm
}

func ExampleCheckReport() {
	el, _ := ellipse.FromSize(40, 40, ellipse.Point{}, 0)
	// Meant to be cut with the tool centre 0.01 mm to 0.03 mm outside.
	curve, _ := el.Parallel(0.01)
	p, _ := conformance.Read([]byte(coaster), conformance.ReadOptions{})
	rep := conformance.CheckReport(p, conformance.Rules{SafeZ: 5, Shape: &conformance.Shape{Curve: curve, Zone: toolpath.Outside, Tol: 0.02}})
	for _, v := range rep.Violations {
		fmt.Println(v.Rule, "at line", v.Line)
	}
	fmt.Printf("%d contour moves, deviation %.4f to %.4f mm\n", rep.Summary.Contour, rep.Summary.DeviationLo, rep.Summary.DeviationHi)
	// Output:
	// deviation at line 7
	// arc-r-near-half at line 8
	// deviation at line 8
	// 2 contour moves, deviation -0.0100 to -0.0100 mm
}
