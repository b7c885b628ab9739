package conformance

import (
	"bytes"
	"math"
	"strconv"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// readBenchSegments is the size of the benchmark programs.
const readBenchSegments = 1_000_000

// readBenchEllipse is a 300 × 200 mm oval tray, centred at the origin.
func readBenchEllipse(tb testing.TB) ellipse.Ellipse {
	el, err := ellipse.FromSize(300, 200, ellipse.Point{}, 0)
	if err != nil {
		tb.Fatal(err)
	}
	return el
}

// readBenchProgram writes a router program of n feed moves once round e,
// vertices on the curve, 4 decimals, with strconv alone.
func readBenchProgram(e ellipse.Ellipse, n int) []byte {
	b := make([]byte, 0, 32*n+256)
	b = append(b, "G21 G90 G17 G94\nG0 Z5\nM3 S18000\n"...)
	xy := func(b []byte, t float64) []byte {
		p := e.PointAt(t)
		b = append(b, " X"...)
		b = strconv.AppendFloat(b, p.X, 'f', 4, 64)
		b = append(b, " Y"...)
		return strconv.AppendFloat(b, p.Y, 'f', 4, 64)
	}
	b = append(b, "G0"...)
	b = xy(b, 0)
	b = append(b, "\nG1 Z-1 F300\nF1200\n"...)
	for k := 1; k <= n; k++ {
		b = append(b, "G1"...)
		b = xy(b, 2*math.Pi*float64(k)/float64(n))
		b = append(b, '\n')
	}
	return append(b, "G0 Z5\nM5\nM30\n"...)
}

// reportPerSegment reports ns/segment for a benchmark over n segments.
func reportPerSegment(b *testing.B, n int) {
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/segment")
}

func BenchmarkRead(b *testing.B) {
	src := readBenchProgram(readBenchEllipse(b), readBenchSegments)
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		p, err := Read(src, ReadOptions{})
		if err != nil || len(p.Path) != readBenchSegments+4 || len(p.Problems) != 0 {
			b.Fatalf("%v: %d segments, problems %v", err, len(p.Path), p.Problems)
		}
	}
	reportPerSegment(b, readBenchSegments)
}

// BenchmarkReadCheck reads and checks the program: "safety" with the
// machine rules and travel limits, "shape" with the geometry rules as well.
func BenchmarkReadCheck(b *testing.B) {
	el := readBenchEllipse(b)
	src := readBenchProgram(el, readBenchSegments)
	// Chords of a curve with vertices on it: the band zone must hold the
	// sag κ·L²/8, at most (a/b²)·L²/8 with L ≤ a·2π/n.
	l := 150 * 2 * math.Pi / readBenchSegments
	tol := 150.0 / (100 * 100) * l * l / 8 * 2
	tol = math.Max(tol, 1e-4) // and the 4-decimal rounding
	for _, bc := range []struct {
		name  string
		rules Rules
	}{
		{"safety", Rules{SafeZ: 5, Travel: &Box{MinX: -200, MinY: -200, MaxX: 200, MaxY: 200}}},
		{"shape", Rules{SafeZ: 5, Shape: &Shape{Curve: el.Curve(), Zone: toolpath.Band, Tol: tol}}},
	} {
		b.Run(bc.name, func(b *testing.B) {
			b.SetBytes(int64(len(src)))
			b.ReportAllocs()
			b.ResetTimer()
			for range b.N {
				p, err := Read(src, ReadOptions{})
				if err != nil {
					b.Fatal(err)
				}
				if vs := Check(p, bc.rules); len(vs) != 0 {
					b.Fatalf("violations: %v", firstFew(vs))
				}
			}
			reportPerSegment(b, readBenchSegments)
		})
	}
}

// readBenchPath is the path gcodeout writes in BenchmarkWriteThenCheck: a
// rapid to the start, a plunge, n cutting lines round the oval, a retract.
func readBenchPath(e ellipse.Ellipse, n int) toolpath.Path {
	p := make(toolpath.Path, 0, n+3)
	at := func(k int) toolpath.Point {
		q := e.PointAt(2 * math.Pi * float64(k) / float64(n))
		return toolpath.Point{X: q.X, Y: q.Y, Z: -1}
	}
	start := at(0)
	up := start
	up.Z = 5
	p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Start: toolpath.Point{Z: 5}, End: up})
	p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Role: toolpath.Plunge, Start: up, End: start})
	for k := 0; k < n; k++ {
		p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: at(k), End: at(k + 1)})
	}
	p = append(p, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Role: toolpath.Retract, Start: at(n), End: up})
	return p
}

// BenchmarkWriteThenCheck is a pair over one program: "write" is the
// writer's cost, "check" reading it back and checking it with the machine
// rules; the target is check ≤ 10 × write.
func BenchmarkWriteThenCheck(b *testing.B) {
	el := readBenchEllipse(b)
	path := readBenchPath(el, readBenchSegments)
	cfg := gcodeout.Config{Machine: gcodeout.Router, Feed: 1200, RPM: 18000, SafeZ: 5, Tolerance: 0.01}
	var buf bytes.Buffer
	if err := gcodeout.WritePath(&buf, cfg, path); err != nil {
		b.Fatal(err)
	}
	src := bytes.Clone(buf.Bytes())
	b.Run("write", func(b *testing.B) {
		b.SetBytes(int64(len(src)))
		b.ReportAllocs()
		for range b.N {
			buf.Reset()
			if err := gcodeout.WritePath(&buf, cfg, path); err != nil {
				b.Fatal(err)
			}
		}
		reportPerSegment(b, readBenchSegments)
	})
	b.Run("check", func(b *testing.B) {
		b.SetBytes(int64(len(src)))
		b.ReportAllocs()
		rules := Rules{SafeZ: 5}
		for range b.N {
			p, err := Read(src, ReadOptions{})
			if err != nil {
				b.Fatal(err)
			}
			if vs := Check(p, rules); len(vs) != 0 {
				b.Fatalf("violations: %v", firstFew(vs))
			}
		}
		reportPerSegment(b, readBenchSegments)
	})
}
