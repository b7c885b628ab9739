package main

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"io"
	"math"
	"os"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// This file holds the test's own readers of what the demo wrote: holes,
// dashes, the SVG, the reports and the command lines, each read without
// the demo's code.

// checkDemoTestHoles checks that the program makes count holes (cuts
// straight down, each place once) and that they are the points of the
// equal arc-length division of the curve, in some order.
func checkDemoTestHoles(t *testing.T, name string, prog *conformance.Program, curve ellipse.Parallel, count int) {
	t.Helper()
	var holes []toolpath.Point
	for _, s := range prog.Path {
		if s.Motion != toolpath.Cut || s.Kind != toolpath.Line || s.Start.X != s.End.X || s.Start.Y != s.End.Y || !(s.End.Z < s.Start.Z) {
			continue
		}
		if n := len(holes); n > 0 && holes[n-1].X == s.Start.X && holes[n-1].Y == s.Start.Y {
			continue
		}
		holes = append(holes, s.Start)
	}
	if len(holes) != count {
		t.Fatalf("%s: %d holes; want %d", name, len(holes), count)
	}
	pts, err := curve.Divide(nil, count)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range pts {
		best := math.Inf(1)
		for _, h := range holes {
			best = math.Min(best, math.Hypot(h.X-p.X, h.Y-p.Y))
		}
		if best > demoTestTol {
			t.Errorf("%s: no hole within %g of the division point (%.4f, %.4f); nearest %.4g away", name, demoTestTol, p.X, p.Y, best)
		}
	}
}

// checkDemoTestDashes checks that the laser program cuts as many dashes
// as the pattern on,off fits round the curve, each of the scaled length.
func checkDemoTestDashes(t *testing.T, name string, prog *conformance.Program, curve ellipse.Parallel, on, off float64) {
	t.Helper()
	var dashes []float64
	in := false
	for i, s := range prog.Path {
		m := prog.Moves[i]
		beam := s.Motion == toolpath.Cut && s.Kind != toolpath.Dwell && m.Spindle != conformance.SpindleOff && m.Speed > 0
		if !beam {
			in = false
			continue
		}
		if !in {
			dashes = append(dashes, 0)
			in = true
		}
		dashes[len(dashes)-1] += s.Length()
	}
	// A whole number of periods, the nearest to the pattern, scaled to
	// close evenly.
	n := math.Round(curve.Length() / (on + off))
	dash := on * curve.Length() / (n * (on + off))
	if len(dashes) != int(n) {
		t.Errorf("%s: %d dashes; want %g", name, len(dashes), n)
	}
	for i, d := range dashes {
		if math.Abs(d-dash) > demoTestTol {
			t.Errorf("%s: dash %d is %.5g long; want %.5g", name, i, d, dash)
		}
	}
}

// checkDemoTestSVG checks that data is well-formed XML with an svg root
// sized in millimetres.
func checkDemoTestSVG(t *testing.T, name string, data []byte) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(data))
	root := true
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			if root {
				t.Errorf("%s: no svg element", name)
			}
			return
		}
		if err != nil {
			t.Errorf("%s: %v", name, err)
			return
		}
		se, ok := tok.(xml.StartElement)
		if !ok || !root {
			continue
		}
		root = false
		if se.Name.Local != "svg" {
			t.Errorf("%s: root element %q; want svg", name, se.Name.Local)
		}
		for _, a := range se.Attr {
			if (a.Name.Local == "width" || a.Name.Local == "height") && !strings.HasSuffix(a.Value, "mm") {
				t.Errorf("%s: %s=%q is not in millimetres", name, a.Name.Local, a.Value)
			}
		}
	}
}

// readDemoTestReport decodes a part's JSON report.
func readDemoTestReport(t *testing.T, file string) demoReport {
	t.Helper()
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	var r demoReport
	if err := json.Unmarshal(data, &r); err != nil {
		t.Fatalf("%s: %v", file, err)
	}
	return r
}

// splitDemoTestWords splits a command line as a POSIX shell does for
// words that are plain, in single quotes or escaped with a backslash.
func splitDemoTestWords(t *testing.T, s string) []string {
	t.Helper()
	var words []string
	var cur strings.Builder
	inWord, quoted, escaped := false, false, false
	for _, r := range s {
		switch {
		case escaped:
			cur.WriteRune(r)
			escaped = false
		case quoted && r == '\'':
			quoted = false
		case quoted:
			cur.WriteRune(r)
		case r == '\'':
			quoted, inWord = true, true
		case r == '\\':
			escaped, inWord = true, true
		case r == ' ':
			if inWord {
				words = append(words, cur.String())
				cur.Reset()
				inWord = false
			}
		default:
			cur.WriteRune(r)
			inWord = true
		}
	}
	if quoted || escaped {
		t.Fatalf("unbalanced quote or escape in %q", s)
	}
	if inWord {
		words = append(words, cur.String())
	}
	return words
}
