package ellipse

import "testing"

// TestNoAllocations: the numeric paths allocate nothing (in the style of
// strconv's AllocsPerRun table).
func TestNoAllocations(t *testing.T) {
	e := mustNew(t, Point{X: 1, Y: 2}, 0.3, 5, 0.4)
	p, err := e.Parallel(0.7)
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]DivisionPoint, 0, 1000)
	var out float64
	tests := []struct {
		name string
		f    func()
	}{
		{"ArcLength", func() { out += e.ArcLength(-3, 100) }},
		{"ArcLength short", func() { out += e.ArcLength(1, 1.001) }},
		{"ParamAtArcLength", func() { out += e.ParamAtArcLength(17.5) }},
		{"ParamAtArcLength near start", func() { out += e.ParamAtArcLength(1e-9) }},
		{"Parallel.ArcLength", func() { out += p.ArcLength(-3, 100) }},
		{"Parallel.ParamAtArcLength", func() { out += p.ParamAtArcLength(-40) }},
		{"Perimeter", func() { out += e.Perimeter() }},
		{"SignedDistance", func() { out += e.SignedDistance(Point{0.5, 0.5}) }},
		{"Nearest", func() { t, d := e.Nearest(Point{4, -3}); out += t + d }},
		{"LegendreE", func() { out += LegendreE(1e4, 0.7) }},
		{"CarlsonRF", func() { out += CarlsonRF(1, 2, 3) }},
		{"CarlsonRD", func() { out += CarlsonRD(1, 2, 3) }},
		{"Divide", func() { dst, _ = p.Divide(dst[:0], 1000) }},
		{"Divider", func() {
			d, _ := NewDivider(e.Curve(), 100)
			for q, ok := d.Next(); ok; q, ok = d.Next() {
				out += q.T
			}
		}},
	}
	for _, tt := range tests {
		if n := testing.AllocsPerRun(100, tt.f); n != 0 {
			t.Errorf("%s: %v allocations per run, want 0", tt.name, n)
		}
	}
	_ = out
}
