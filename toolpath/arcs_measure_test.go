package toolpath

import (
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// TestDevRangeFindsAPeakBesideTheSample: an arc across the end of a cap,
// where the curvature changes fast beside the sample spacing. The best
// sample and its neighbours lay nearly symmetric, so the first parabola
// put its vertex on the sample and polishing stopped there, 1.6 % of the
// half-width short of the peak between the sample and the arc's end; the
// arc, accepted at 0.987 of the zone, left it (found by the zone property
// test, seed 5547723694909931612). The measure must come within devMiss
// of the dense maximum.
func TestDevRangeFindsAPeakBesideTheSample(t *testing.T) {
	a := math.Pow(10, 1.234375)
	b := a * math.Pow(10, -1.978515625)
	e, err := ellipse.New(ellipse.Point{X: 1, Y: 1}, a, b, 1)
	if err != nil {
		t.Fatal(err)
	}
	c, err := e.Parallel(16.6015625)
	if err != nil {
		t.Fatal(err)
	}
	ap, err := NewApproximator(Spec{Curve: c, Zone: Band, Tol: b * math.Pow(10, -1.220703125), Geometry: Arcs})
	if err != nil {
		t.Fatal(err)
	}
	sg := Segment{Kind: Arc, Start: Point{X: 3.705398575576565, Y: -24.934855291504462}, End: Point{X: 5.76458212093752, Y: -22.392581256891134},
		CenterX: -10.29492233176449, CenterY: -11.489834397977658, Radius: 19.41075919009618}
	p, q := vec{sg.Start.X, sg.Start.Y}, vec{sg.End.X, sg.End.Y}
	tg, _ := segTangents(sg)
	t0, d0 := e.Nearest(ellipse.Point{X: p.x, Y: p.y})
	t1, d1 := e.Nearest(ellipse.Point{X: q.x, Y: q.y})
	t1 = unwrapNear(t1, t0)
	f0, fm, f1 := ap.footAt(t0), ap.footAt(0.5*(t0+t1)), ap.footAt(t1)
	var g arcGeom
	ap.newArcGeom(&g, p, tg, 1/sg.Radius, q)
	_, hi := ap.devRange(&f0, &fm, &f1, d0-c.Offset(), d1-c.Offset(), &g)
	dense := math.Inf(-1)
	for j := 0; j <= 100000; j++ {
		dense = max(dense, ap.f.circleDev(t0+(t1-t0)*float64(j)/100000, &g))
	}
	if miss := devMiss * 0.5 * (ap.hi - ap.lo); hi < dense-miss {
		t.Errorf("devRange's largest deviation %.9g, dense %.9g: short by %.3g, more than devMiss of the half-width (%.3g)", hi, dense, dense-hi, miss)
	}
}
