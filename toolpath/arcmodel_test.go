package toolpath

import (
	"math"
	"testing"

	"pgregory.net/rapid"
)

// denseModelRatio evaluates the step model's cubic at 20 001 points: the
// slow route that stepModel.ratio's roots of δ′ must agree with.
func denseModelRatio(m *stepModel, l float64) float64 {
	u1 := m.u1
	if !m.fixed {
		u1 = 0.8 * (m.u0/2 + l*(m.v0-m.c*l*l/12)/4)
		u1 = max(-endLimit*m.w, min(endLimit*m.w, u1))
	}
	a := 2 * (u1 - m.u0 - m.v0*l - m.c*l*l*l/6) / (l * l)
	worst := 0.0
	for i := 0; i <= 20000; i++ {
		s := l * float64(i) / 20000
		d := m.u0 + m.v0*s + a*s*s/2 + m.c*s*s*s/6
		worst = max(worst, math.Abs(d))
	}
	return worst / m.w
}

func drawStepModel(t *rapid.T) stepModel {
	w := math.Pow(10, rapid.Float64Range(-4, 0).Draw(t, "log w"))
	m := newStepModel(
		w*rapid.Float64Range(-0.99, 0.99).Draw(t, "u0"),
		rapid.Float64Range(-0.05, 0.05).Draw(t, "v0"),
		rapid.Float64Range(-1, 1).Draw(t, "c")*math.Pow(10, rapid.Float64Range(-6, 0).Draw(t, "log c")),
		w)
	m.fixed = rapid.Bool().Draw(t, "fixed")
	m.u1 = w * rapid.Float64Range(-0.8, 0.8).Draw(t, "u1")
	return m
}

// TestStepModelRatioFindsTheCubicsExtremes: the extremes from the roots
// of δ′ against dense sampling of the same cubic.
func TestStepModelRatioFindsTheCubicsExtremes(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		m := drawStepModel(t)
		l := math.Pow(10, rapid.Float64Range(-2, 2).Draw(t, "log l"))
		got, want := m.ratio(l), denseModelRatio(&m, l)
		// dense sampling misses an extreme by at most a sliver of it
		if !(got >= want*(1-1e-12)-1e-12) || got > want*(1+1e-6)+1e-9 {
			t.Fatalf("ratio(%g) = %.12g, dense %.12g", l, got, want)
		}
	})
}

// TestStepModelSpanCrossesTheTarget: a span found lies within 1% of a
// length where the model's use of the zone crosses the target.
func TestStepModelSpanCrossesTheTarget(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		m := drawStepModel(t)
		target := rapid.Float64Range(0.3, 1.5).Draw(t, "target")
		l0 := math.Pow(10, rapid.Float64Range(-2, 2).Draw(t, "log l0"))
		l, ok := m.span(target, l0, m.ratio(l0))
		if !ok {
			return
		}
		lo, hi := m.ratio(l*0.98)-target, m.ratio(l*1.02)-target
		if (lo > 0) == (hi > 0) && math.Abs(m.ratio(l)-target) > 1e-9 {
			t.Fatalf("span(%g, %g) = %g: ratio %g at −2%%, %g at +2%%", target, l0, l, lo+target, hi+target)
		}
	})
}

// TestStepModelCases: the steady pattern and the edge cases.
func TestStepModelCases(t *testing.T) {
	// On the steady pattern (u₀ = 0, v₀ = g = cL²/12) the deadbeat end is
	// the middle and the humps reach cL³/(72√3) (see endDeviation).
	c, l, w := 2e-3, 10.0, 1.0
	m := newStepModel(0, c*l*l/12, c, w)
	want := c * l * l * l / (72 * math.Sqrt(3)) / w
	if got := m.ratio(l); math.Abs(got-want) > 1e-12 {
		t.Errorf("steady pattern: ratio %.15g, want %.15g", got, want)
	}
	tests := []struct {
		name string
		m    stepModel
		l0   float64
		ok   bool
	}{
		{"no length", newStepModel(0, 0, 1, 1), 0, false},
		{"NaN length", newStepModel(0, 0, 1, 1), math.NaN(), false},
		{"never reaches the target", fixedAt(newStepModel(0, 0, 0, 1), 0), 1, false},
		{"reaches it", newStepModel(0, 0, 1e-3, 1), 10, true},
	}
	for _, tt := range tests {
		if _, ok := tt.m.span(0.9, tt.l0, tt.m.ratio(tt.l0)); ok != tt.ok {
			t.Errorf("%s: ok %v, want %v", tt.name, ok, tt.ok)
		}
	}
}

// fixedAt returns m with the end deviation fixed at u1.
func fixedAt(m stepModel, u1 float64) stepModel {
	m.fixed, m.u1 = true, u1
	return m
}

func TestCbrtNear(t *testing.T) {
	for _, c := range []struct{ x, b float64 }{
		{1, 1}, {1.09, 1}, {0.91, 1}, {1.2, 1}, {0.5, 1}, {8.5e-9, 2e-3}, {7.1e12, 2e4}, {1e-300, 1},
	} {
		got, want := cbrtNear(c.x, c.b*c.b*c.b, c.b), math.Cbrt(c.x)
		if math.Abs(got-want) > 1e-4*want {
			t.Errorf("cbrtNear(%g, b=%g) = %.17g, want %.17g", c.x, c.b, got, want)
		}
	}
}
