package ellipse

import (
	"math"
	"strconv"
	"testing"
	"time"

	"gonum.org/v1/gonum/mathext"
)

// Benchmarks. The performance targets compare within one run:
//
//	go test ./ellipse -run '^$' -bench 'Ratio|Divide' -count 5
//
// BenchmarkRatio alternates blocks of the two sides of each comparison
// (ArcLength against the same arcs as differences of gonum's EllipticE,
// ParamAtArcLength against ArcLength) inside one benchmark and reports
// the fastest block of each and their ratio, which a busy machine
// disturbs far less than separate runs; the separate benchmarks below
// give the plain figures. Divide reports ns/point across N.

// arcCase is one arc for the benchmarks: an ellipse whose own y axis is
// the major one, so that s(t0, t1) = a·(E(t1|m) − E(t0|m)) with
// m = 1 − b²/a² ∈ [0, 1), gonum's domain, and t0, t1 in [−π/2, π/2] at
// least 1 rad apart, so that ArcLength takes its Carlson path as gonum
// does.
type arcCase struct {
	e      Ellipse
	a, m   float64
	t0, t1 float64
}

func arcCases(b *testing.B) []arcCase {
	var cs []arcCase
	for i, k := range []float64{1e-6, 1e-3, 0.05, 0.2, 0.5, 0.8, 0.95, 0.999} {
		a := 300.0
		e := mustNew(b, Point{X: 10, Y: 20}, a*k, a, 0.25)
		for j := 0; j < 8; j++ {
			// Spread the ends over the quarter turns on either side.
			u := math.Mod(float64(i*8+j)*0.6180339887, 1)
			w := math.Mod(float64(i*8+j)*0.4142135624+0.5, 1)
			t0 := -1.5 + 1.0*u
			t1 := 0.5 + 1.0*w
			if j%2 == 1 {
				t0, t1 = t1, t0
			}
			cs = append(cs, arcCase{e, a, (1 - k) * (1 + k), t0, t1})
		}
	}
	return cs
}

// sink keeps results alive without global state.
type sink struct{ v float64 }

func perItem(b *testing.B, n int, unit string) {
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/"+unit)
}

func BenchmarkArcLength(b *testing.B) {
	cs := arcCases(b)
	var out sink
	b.Run("ours", func(b *testing.B) {
		for b.Loop() {
			for _, c := range cs {
				out.v += c.e.ArcLength(c.t0, c.t1)
			}
		}
		perItem(b, len(cs), "arc")
	})
	b.Run("gonum-difference", func(b *testing.B) {
		for b.Loop() {
			for _, c := range cs {
				out.v += c.a * (mathext.EllipticE(c.t1, c.m) - mathext.EllipticE(c.t0, c.m))
			}
		}
		perItem(b, len(cs), "arc")
	})
	b.Run("gonum-one-call", func(b *testing.B) {
		for b.Loop() {
			for _, c := range cs {
				out.v += mathext.EllipticE(c.t1, c.m)
			}
		}
		perItem(b, len(cs), "arc")
	})
	b.Run("ours-short", func(b *testing.B) {
		// Arcs of 0.01 rad: the quadrature path.
		for b.Loop() {
			for _, c := range cs {
				out.v += c.e.ArcLength(c.t0, c.t0+0.01)
			}
		}
		perItem(b, len(cs), "arc")
	})
	b.Run("ours-parallel", func(b *testing.B) {
		for b.Loop() {
			for _, c := range cs {
				p := Parallel{e: c.e, d: 5}
				out.v += p.ArcLength(c.t0, c.t1)
			}
		}
		perItem(b, len(cs), "arc")
	})
	_ = out.v
}

// BenchmarkRatio measures ours against gonum on the arc cases, and the
// inverse against the arc length, timing alternate blocks.
func BenchmarkRatio(b *testing.B) {
	cs := arcCases(b)
	s := inverseTargets(cs)
	var out sink
	ours := func() {
		for _, c := range cs {
			out.v += c.e.ArcLength(c.t0, c.t1)
		}
	}
	gonum := func() {
		for _, c := range cs {
			out.v += c.a * (mathext.EllipticE(c.t1, c.m) - mathext.EllipticE(c.t0, c.m))
		}
	}
	inverse := func() {
		for i, c := range cs {
			out.v += c.e.ParamAtArcLength(s[i])
		}
	}
	gonumOne := func() { // one EllipticE call per arc, for reference
		for _, c := range cs {
			out.v += mathext.EllipticE(c.t1, c.m)
		}
	}
	// The machine may be shared: each side's figure is its fastest block
	// (a block interrupted by another process only ever runs slower).
	never := time.Duration(math.MaxInt64)
	minOurs, minGonum, minInverse, minOne := never, never, never, never
	for b.Loop() {
		t0 := time.Now()
		ours()
		t1 := time.Now()
		gonum()
		t2 := time.Now()
		inverse()
		t3 := time.Now()
		gonumOne()
		t4 := time.Now()
		minOurs = min(minOurs, t1.Sub(t0))
		minGonum = min(minGonum, t2.Sub(t1))
		minInverse = min(minInverse, t3.Sub(t2))
		minOne = min(minOne, t4.Sub(t3))
	}
	n := float64(len(cs))
	b.ReportMetric(float64(minOurs.Nanoseconds())/n, "ns/arc")
	b.ReportMetric(float64(minGonum.Nanoseconds())/n, "gonum-ns/arc")
	b.ReportMetric(float64(minInverse.Nanoseconds())/n, "ns/inverse")
	b.ReportMetric(float64(minOurs)/float64(minGonum), "arc/gonum")
	b.ReportMetric(float64(minInverse)/float64(minOurs), "inverse/arc")
	b.ReportMetric(float64(minOurs)/float64(minOne), "arc/gonum-one-call")
	_ = out.v
}

// inverseTargets returns lengths spread over the curves of cs, some
// several turns out.
func inverseTargets(cs []arcCase) []float64 {
	s := make([]float64, len(cs))
	for i, c := range cs {
		s[i] = c.e.ArcLength(0, c.t1) + float64(i%3)*c.e.Perimeter()
	}
	return s
}

func BenchmarkParamAtArcLength(b *testing.B) {
	cs := arcCases(b)
	s := inverseTargets(cs)
	var out sink
	for b.Loop() {
		for i, c := range cs {
			out.v += c.e.ParamAtArcLength(s[i])
		}
	}
	perItem(b, len(cs), "inverse")
	_ = out.v
}

func BenchmarkDivide(b *testing.B) {
	e := mustNew(b, Point{X: 300, Y: 200}, 300, 200, 0.1)
	for _, n := range []int{10, 100, 1000, 10000, 100000} {
		b.Run("N="+strconv.Itoa(n), func(b *testing.B) {
			// Points are timed in runs of up to 1000, and the fastest run
			// per point is reported, as in BenchmarkRatio.
			fastest := math.Inf(1)
			var out sink
			for b.Loop() {
				d, _ := NewDivider(e.Curve(), n)
				for done := false; !done; {
					t0 := time.Now()
					m := 0
					for ; m < 1000; m++ {
						p, ok := d.Next()
						if !ok {
							done = true
							break
						}
						out.v += p.X
					}
					if m > 0 {
						fastest = math.Min(fastest, float64(time.Since(t0).Nanoseconds())/float64(m))
					}
				}
			}
			perItem(b, n, "point")
			b.ReportMetric(fastest, "min-ns/point")
			_ = out.v
		})
	}
}

func BenchmarkLegendreE(b *testing.B) {
	cs := arcCases(b)
	var out sink
	b.Run("ours", func(b *testing.B) {
		for b.Loop() {
			for _, c := range cs {
				out.v += LegendreE(c.t1, c.m)
			}
		}
		perItem(b, len(cs), "call")
	})
	b.Run("gonum", func(b *testing.B) {
		for b.Loop() {
			for _, c := range cs {
				out.v += mathext.EllipticE(c.t1, c.m)
			}
		}
		perItem(b, len(cs), "call")
	})
	_ = out.v
}

func BenchmarkSignedDistance(b *testing.B) {
	e := mustNew(b, Point{X: 300, Y: 200}, 300, 200, 0.1)
	var pts []Point
	for i := 0; i < 64; i++ {
		ang := float64(i) * 0.7
		r := 50 + 7*float64(i)
		pts = append(pts, Point{300 + r*math.Cos(ang), 200 + r*math.Sin(ang)})
	}
	var out sink
	for b.Loop() {
		for _, p := range pts {
			out.v += e.SignedDistance(p)
		}
	}
	perItem(b, len(pts), "point")
	_ = out.v
}
