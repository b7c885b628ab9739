package toolpath

import (
	"testing"

	"github.com/focitools/foci/ellipse"
)

// benchShape is a 420 by 280 tray.
func benchShape(b *testing.B) ellipse.Ellipse {
	e, err := ellipse.FromSize(420, 280, ellipse.Point{}, 0.3)
	if err != nil {
		b.Fatal(err)
	}
	return e
}

// benchOp runs op into a reused path and reports the segments made per
// operation and the allocations per segment.
func benchOp(b *testing.B, op func(dst Path) (Path, error)) {
	p, err := op(nil)
	if err != nil {
		b.Fatal(err)
	}
	n := len(p)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if p, err = op(p[:0]); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(n), "segments/op")
}

func BenchmarkProfileRouterTabs(b *testing.B) {
	for _, g := range []Geometry{Lines, Arcs} {
		b.Run(g.String(), func(b *testing.B) {
			s := ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.02, SafeZ: 5, Geometry: g}, Ellipse: benchShape(b),
				Tool: 6, Depth: 18, StepDown: 5, Tabs: 6, TabWidth: 8, TabHeight: 6}
			benchOp(b, func(dst Path) (Path, error) { return Profile(dst, s) })
		})
	}
}

func BenchmarkProfileRouterRamp(b *testing.B) {
	s := ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.02, SafeZ: 5, Geometry: Arcs}, Ellipse: benchShape(b),
		Side: SideInside, Tool: 6, Depth: 18, StepDown: 5, RampAngle: 0.05}
	benchOp(b, func(dst Path) (Path, error) { return Profile(dst, s) })
}

func BenchmarkProfileLaser(b *testing.B) {
	s := ProfileSpec{Setup: Setup{Machine: Laser, Tol: 0.01}, Ellipse: benchShape(b), Kerf: 0.2, Passes: 2}
	benchOp(b, func(dst Path) (Path, error) { return Profile(dst, s) })
}

func BenchmarkDrillPecks(b *testing.B) {
	s := DrillSpec{Setup: Setup{Machine: Router, Tol: 0.02, SafeZ: 5}, Ellipse: benchShape(b), Count: 100, Depth: 10, Peck: 2, Offset: -15}
	benchOp(b, func(dst Path) (Path, error) { return Drill(dst, s) })
}

func BenchmarkDashPlotter(b *testing.B) {
	s := DashSpec{Setup: Setup{Machine: Plotter, Tol: 0.05, PenUp: 3}, Ellipse: benchShape(b), On: 6, Off: 3}
	benchOp(b, func(dst Path) (Path, error) { return Dash(dst, s) })
}

func BenchmarkSummarize(b *testing.B) {
	p, err := Profile(nil, ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.005, SafeZ: 5}, Ellipse: benchShape(b),
		Tool: 6, Depth: 18, StepDown: 5, Tabs: 6, TabWidth: 8, TabHeight: 6})
	if err != nil {
		b.Fatal(err)
	}
	r := Rates{Feed: 1500, PlungeFeed: 400, Rapid: 8000, Accel: 800}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Summarize(p, r)
	}
	b.ReportMetric(float64(len(p)), "segments/op")
}

func BenchmarkEnvelopeCheck(b *testing.B) {
	p, err := Profile(nil, ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.005, SafeZ: 5, Geometry: Arcs}, Ellipse: benchShape(b),
		Tool: 6, Depth: 18, StepDown: 5})
	if err != nil {
		b.Fatal(err)
	}
	env := Envelope{MinX: -400, MinY: -400, MaxX: 400, MaxY: 400, MinZ: -20, MaxZ: 10, HasZ: true}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := env.Check(p); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(p)), "segments/op")
}

// Summarize and Envelope.Check allocate nothing; the operations allocate a
// few times per pass, tab, hole or dash, never per segment of a curve.
func TestOperationsAllocateNothingPerSegment(t *testing.T) {
	e, _ := ellipse.FromSize(420, 280, ellipse.Point{}, 0.3)
	coarse := ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.05, SafeZ: 5}, Ellipse: e, Tool: 6, Depth: 18, StepDown: 5, Tabs: 6, TabWidth: 8, TabHeight: 6}
	fine := coarse
	fine.Tol = 0.002
	pc, _ := Profile(nil, coarse)
	pf, err := Profile(nil, fine)
	if err != nil {
		t.Fatal(err)
	}
	if len(pf) < 3*len(pc) {
		t.Fatalf("fine path %d segments, coarse %d: not enough difference to tell", len(pf), len(pc))
	}
	ac := testing.AllocsPerRun(5, func() { pc, _ = Profile(pc[:0], coarse) })
	af := testing.AllocsPerRun(5, func() { pf, _ = Profile(pf[:0], fine) })
	if af > ac {
		t.Errorf("%d segments take %v allocations, %d take %v: allocations grow with the segments", len(pf), af, len(pc), ac)
	}
	r := Rates{Feed: 1500, Rapid: 8000, Accel: 800}
	if a := testing.AllocsPerRun(5, func() { Summarize(pf, r) }); a != 0 {
		t.Errorf("Summarize allocates %v times", a)
	}
	env := Envelope{MinX: -400, MinY: -400, MaxX: 400, MaxY: 400}
	if a := testing.AllocsPerRun(5, func() { _ = env.Check(pf) }); a != 0 {
		t.Errorf("Envelope.Check allocates %v times on a path inside it", a)
	}
}
