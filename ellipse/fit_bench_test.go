package ellipse_test

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// BenchmarkFit fits noisy points (σ = 0.05 on a 100 x 60 ellipse) round
// the whole curve and on a third of it, with and without the geometric
// refinement.
func BenchmarkFit(b *testing.B) {
	truth := fitMustNew(b, ellipse.Point{X: 10, Y: 20}, 50, 30, 0.4)
	for _, span := range []struct {
		name string
		v    float64
	}{{"whole", 2 * math.Pi}, {"third", 2 * math.Pi / 3}} {
		for _, n := range []int{20, 200, 2000} {
			pts := fitNoisy(truth, fitParamsEven(n, 0.1, span.v), 0.05, rand.New(rand.NewPCG(1, uint64(n))))
			for _, mode := range []struct {
				name string
				opts []ellipse.FitOption
			}{{"geometric", nil}, {"algebraic", []ellipse.FitOption{ellipse.FitAlgebraicOnly()}}} {
				b.Run(span.name+"/n="+strconv.Itoa(n)+"/"+mode.name, func(b *testing.B) {
					b.ReportAllocs()
					for b.Loop() {
						if _, err := ellipse.Fit(pts, mode.opts...); err != nil {
							b.Fatal(err)
						}
					}
				})
			}
		}
	}
}
