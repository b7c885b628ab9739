package conformance

import (
	"bytes"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// fuzzSeeds are programs good, truncated and broken. Inputs the fuzzer
// found to fail are kept under testdata/fuzz/FuzzRead and run with every
// go test.
func fuzzSeeds(t testing.TB) [][]byte {
	c := signBlank(t)
	good := []byte(job{zone: toolpath.Outside, levels: []float64{-2, -4}, steps: 24, shift: 0.01, tab0: 1, tab1: 1.5, tabZ: -3, lead: "waste"}.program(c))
	laser := []byte(job{machine: Laser, levels: []float64{0}, steps: 16, gap0: 1, gap1: 2}.program(c))
	seeds := [][]byte{
		good,
		laser,
		good[:len(good)/2],
		good[:len(good)/3+7],
		laser[:len(laser)-5],
		[]byte(""),
		[]byte("%\n%\n"),
		[]byte("G21 G90\nG0 Z5\nG0 X0 Y0\nM3 S1000\nG1 Z-1 F100\nG2 X0 Y0 I5 J0\nG3 X10 Y0 R5\nG3 X0 Y0 R-5.0001\nG4 P0.5\nM5\nM30\n"),
		[]byte("g20g91g0x1y1z1\ng1x.5f10\ng2x1y0r.5\ng3i-1j0\nm2\n"),
		[]byte("N1 G21 (a) ; b\nN2 G0 X1 (c) Y2\n/N3 G18 G2 X1 K1\nG38.2 Z-1\nM6 T2\nM30\nG0 X5\n"),
		[]byte("G1 X1e309\nG0 XNaN\nG0 Xinf Y-inf\nG1 X1.2.3\nG0 X" + string(bytes.Repeat([]byte("9"), 400)) + "\n"),
		[]byte("G21\nG0 X0 Y0 Z0\nG2 X999999999999 Y0 I-999999999999 J999999999999 F1\nG3 X-999999999999 Y-999999999999 R0.0000001\nM2\n"),
		[]byte("G21\nG0 X0 Y0 Z0\nG91\n" + string(bytes.Repeat([]byte("G1 X999999999999 Y999999999999 F1\n"), 20)) + "M2\n"),
		[]byte("(unclosed\n((nested))\n)\nG0 G1 G2\nM3 M4 M5\nX1\nI1\nP1\nG4\nG4 P-1\nF-1\nS-1\nT-1\nT1.5\n"),
		[]byte("G21\x00G0\x00X1\n\xff\xfe\x00\x01\n\r\n\t\v\f"),
		append([]byte("G21\nG0 "), bytes.Repeat([]byte("X1"), 500_000)...), // a 1 MB line
		append([]byte("G21\n("), bytes.Repeat([]byte{'a'}, 1<<20)...),
	}
	return seeds
}

func FuzzRead(f *testing.F) {
	for _, s := range fuzzSeeds(f) {
		if len(s) < 1<<16 { // the megabyte lines have a test of their own
			f.Add(s)
		}
	}
	box := &Box{MinX: -100, MinY: -100, MaxX: 100, MaxY: 100, HasZ: true, MinZ: -50, MaxZ: 50}
	f.Fuzz(func(t *testing.T, src []byte) {
		p, err := Read(src, ReadOptions{MaxProblems: 100})
		if err != nil {
			t.Fatalf("Read: %v", err)
		}
		checkProgramInvariants(t, p)
		for _, m := range []Machine{Router, Laser, Plotter} {
			checkViolations(t, p, Check(p, Rules{Machine: m, SafeZ: 5, Travel: box}))
		}
	})
}

// FuzzCheckShape runs the geometry rules on whatever the reader makes of
// the input. The geometry measures every move densely, so inputs are cut
// to 2 KiB to keep each run short.
func FuzzCheckShape(f *testing.F) {
	for _, s := range fuzzSeeds(f) {
		if len(s) <= 2048 {
			f.Add(s)
		}
	}
	el, err := ellipse.FromSize(60, 40, ellipse.Point{X: 1, Y: 2}, 0.3)
	if err != nil {
		f.Fatal(err)
	}
	shapes := []*Shape{
		{Curve: el.Curve(), Zone: toolpath.Band, Tol: 0.05},
		{Curve: signBlank(f), Zone: toolpath.Outside, Tol: geoTol},
		{Curve: signBlank(f), Zone: toolpath.Inside, Tol: geoTol},
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		if len(src) > 2048 {
			src = src[:2048]
		}
		p, err := Read(src, ReadOptions{MaxProblems: 100})
		if err != nil {
			t.Fatalf("Read: %v", err)
		}
		for i, m := range []Machine{Router, Laser, Plotter} {
			rep := CheckReport(p, Rules{Machine: m, SafeZ: 5, Shape: shapes[i]})
			checkViolations(t, p, rep.Violations)
			s := rep.Summary
			if s.Contour+s.Lead > s.Cut || s.MaxDeviation < 0 || s.Segments != len(p.Path) {
				t.Fatalf("%v: summary %+v of %d segments", m, s, len(p.Path))
			}
		}
	})
}

func checkViolations(t *testing.T, p *Program, vs []Violation) {
	t.Helper()
	for _, v := range vs {
		if v.Rule == "" || v.Message == "" || v.Line < 0 || v.Line > p.Lines {
			t.Fatalf("bad violation %+v (program of %d lines)", v, p.Lines)
		}
	}
}

// checkProgramInvariants holds for whatever Read returns.
func checkProgramInvariants(t *testing.T, p *Program) {
	t.Helper()
	if len(p.Path) != len(p.Moves) {
		t.Fatalf("%d segments, %d moves", len(p.Path), len(p.Moves))
	}
	if p.Units != Millimeters && p.Units != Inches {
		t.Fatalf("path units %v", p.Units)
	}
	last := 0
	for i, s := range p.Path {
		m := p.Moves[i]
		if m.Line < last || m.Line < 1 || m.Line > p.Lines {
			t.Fatalf("segment %d at line %d (last %d, %d lines)", i, m.Line, last, p.Lines)
		}
		last = m.Line
		for _, v := range []float64{s.Start.X, s.Start.Y, s.Start.Z, s.End.X, s.End.Y, s.End.Z, s.CenterX, s.CenterY, s.Radius, m.Feed, m.Speed, s.Seconds} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("segment %d (line %d) has a value that is not finite: %+v %+v", i, m.Line, s, m)
			}
		}
		if s.Kind == toolpath.Arc && !(s.Radius > 0) {
			t.Fatalf("arc at line %d with radius %v", m.Line, s.Radius)
		}
		if i > 0 && s.Start != p.Path[i-1].End {
			t.Fatalf("segment %d (line %d) starts at %+v, the last ended at %+v", i, m.Line, s.Start, p.Path[i-1].End)
		}
	}
	for _, v := range p.Problems {
		if v.Line < 1 || v.Line > p.Lines || v.Rule == "" || v.Message == "" {
			t.Fatalf("bad problem %+v (%d lines)", v, p.Lines)
		}
	}
	if p.EndLine < 0 || p.EndLine > p.Lines {
		t.Fatalf("end line %d of %d", p.EndLine, p.Lines)
	}
}

// A megabyte line and a megabyte comment are read and their problem
// reported once.
func TestReadLongLines(t *testing.T) {
	seeds := fuzzSeeds(t)
	for _, src := range seeds[len(seeds)-2:] {
		p, err := Read(src, ReadOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if len(p.Problems) != 1 || p.Problems[0].Line != 2 || p.Problems[0].Rule != RuleSyntax {
			t.Errorf("%d-byte program: problems %v, want one syntax problem at line 2", len(src), p.Problems)
		}
	}
}
