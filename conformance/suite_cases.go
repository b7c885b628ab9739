package conformance

import (
	"fmt"
	"math"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// DefaultCases returns the cases [TestGenerator] runs when given none, a
// new slice on every call. Lengths are in millimetres. The ellipses are
//
//   - round: a disc of 50 (a circle, where every method is at its easiest
//     and some divide by a² − b²);
//   - ordinary: 120 × 80;
//   - flat: 200 × 0.2, b/a = 1e-3, a slot with sharp ends (radius of
//     curvature 1e-4 there);
//   - tiny: 0.1 × 0.06;
//   - large: 5000 × 3000;
//   - rotated: 80 × 120 (major axis along its own y) turned 35°;
//   - off-centre: 120 × 80 turned −70° with its centre at (1500, −800),
//     far from the origin compared with its size.
//
// Each is run at offset 0 ("on"), outward by b/4 and inward by half the
// folding limit b²/a; in the band, outside and inside zones; at two
// tolerances, a coarse one and a hundredth of it. The coarse tolerance is
// 1e-3 of the semi-major axis a, except where the zone reaches inward
// (band, inside): there it is held at or below half the distance from the
// curve to the fold of the inner parallel curves, (b²/a + offset)/2, so
// that every case is one a generator must be able to meet. That makes 126
// cases, named like "ordinary/outward/band/tol=0.06".
func DefaultCases() []Case {
	type shape struct {
		name   string
		center ellipse.Point
		rx, ry float64
		rot    float64
	}
	shapes := []shape{
		{"round", ellipse.Point{}, 25, 25, 0},
		{"ordinary", ellipse.Point{}, 60, 40, 0},
		{"flat", ellipse.Point{}, 100, 0.1, 0},
		{"tiny", ellipse.Point{}, 0.05, 0.03, 0},
		{"large", ellipse.Point{}, 2500, 1500, 0},
		{"rotated", ellipse.Point{}, 40, 60, 35 * math.Pi / 180},
		{"off-centre", ellipse.Point{X: 1500, Y: -800}, 60, 40, -70 * math.Pi / 180},
	}
	var cases []Case
	for _, sh := range shapes {
		e, err := ellipse.New(sh.center, sh.rx, sh.ry, sh.rot)
		if err != nil {
			panic("conformance: default case " + sh.name + ": " + err.Error()) // a mistake in the table above
		}
		a, b := e.SemiMajor(), e.SemiMinor()
		fold := e.MinRadiusOfCurvature()
		for _, off := range []struct {
			name string
			d    float64
		}{{"on", 0}, {"outward", b / 4}, {"inward", -fold / 2}} {
			curve, err := e.Parallel(off.d)
			if err != nil {
				panic("conformance: default case " + sh.name + "/" + off.name + ": " + err.Error())
			}
			for _, zone := range []toolpath.Zone{toolpath.Band, toolpath.Outside, toolpath.Inside} {
				coarse := 1e-3 * a
				if zone != toolpath.Outside {
					coarse = math.Min(coarse, (fold+off.d)/2)
				}
				for _, tol := range []float64{coarse, coarse / 100} {
					cases = append(cases, Case{
						Name:  fmt.Sprintf("%s/%s/%v/tol=%.3g", sh.name, off.name, zone, tol),
						Curve: curve, Zone: zone, Tol: tol,
					})
				}
			}
		}
	}
	return cases
}
