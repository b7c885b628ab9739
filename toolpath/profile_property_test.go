package toolpath

import (
	"errors"
	"math"
	"testing"

	"github.com/focitools/foci/ellipse"
	"pgregory.net/rapid"
)

// drawEllipse draws an ellipse from 10 to 600 units wide, at most 1:6
// flat, anywhere near the origin and at any rotation.
func drawEllipse(t *rapid.T) ellipse.Ellipse {
	w := rapid.Float64Range(10, 600).Draw(t, "width")
	ratio := rapid.Float64Range(1.0/6, 1).Draw(t, "ratio")
	h := w * ratio
	if rapid.Bool().Draw(t, "tall") {
		w, h = h, w
	}
	c := ellipse.Point{X: rapid.Float64Range(-500, 500).Draw(t, "cx"), Y: rapid.Float64Range(-500, 500).Draw(t, "cy")}
	e, err := ellipse.FromSize(w, h, c, rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "rotation"))
	if err != nil {
		t.Fatalf("%v", err)
	}
	return e
}

// drawTol draws a tolerance between 0.01 and 0.2, log-uniformly, scaled
// to the ellipse so that segment counts stay moderate.
func drawTol(t *rapid.T, e ellipse.Ellipse) float64 {
	lg := rapid.Float64Range(math.Log(0.01), math.Log(0.2)).Draw(t, "logTol")
	return math.Exp(lg) * math.Max(1, e.SemiMajor()/200)
}

// drawProfile draws a valid ProfileSpec for any machine.
func drawProfile(t *rapid.T) ProfileSpec {
	e := drawEllipse(t)
	s := ProfileSpec{Ellipse: e}
	s.Tol = drawTol(t, e)
	s.Geometry = Geometry(rapid.IntRange(0, 1).Draw(t, "arcs"))
	s.Direction = Direction(rapid.IntRange(0, 1).Draw(t, "direction"))
	s.Start = rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "start")
	s.Side = Side(rapid.IntRange(0, 3).Draw(t, "side"))
	s.Machine = Machine(rapid.IntRange(1, 3).Draw(t, "machine"))
	rho := e.MinRadiusOfCurvature()
	if s.Side == SideOn || (s.Side == SideDefault && s.Machine == Plotter) {
		s.Tol = math.Min(s.Tol, 0.5*rho) // the band must not reach the fold
	}
	// A width (tool, kerf, pen) that fits an inside cut.
	width := func(lo, hi float64) float64 {
		if s.Side == SideInside {
			hi = math.Min(hi, 0.9*MaxInsideTool(e, s.Tol))
		}
		if hi <= lo {
			return hi
		}
		return rapid.Float64Range(lo, hi).Draw(t, "width")
	}
	if s.Side == SideInside && MaxInsideTool(e, s.Tol) < 0.1 {
		s.Side = SideOutside
	}
	switch s.Machine {
	case Router:
		s.SafeZ = rapid.Float64Range(1, 20).Draw(t, "safeZ")
		s.Tool = width(0.05, 25)
		s.Depth = rapid.Float64Range(0.2, 30).Draw(t, "depth")
		s.StepDown = s.Depth * rapid.Float64Range(1.0/12, 1.5).Draw(t, "stepShare")
		_, step := DepthPasses(s.Depth, s.StepDown)
		r := s.Tool / 2
		if s.Side == SideInside {
			r = -r
		}
		if s.Side == SideOn {
			r = 0
		}
		l := e.Perimeter() + 2*math.Pi*r
		if n := rapid.IntRange(0, 8).Draw(t, "tabs"); n > 0 && l/float64(n)-s.Tool > 0.2 {
			s.Tabs = n
			s.TabWidth = (l/float64(n) - s.Tool) * rapid.Float64Range(0.01, 0.6).Draw(t, "tabShare")
			s.TabHeight = s.Depth * rapid.Float64Range(0.05, 0.95).Draw(t, "tabHeightShare")
		}
		switch rapid.IntRange(0, 2).Draw(t, "ramp") {
		case 1:
			lo := math.Atan(step/l) * 1.01
			s.RampAngle = rapid.Float64Range(lo, math.Max(lo, math.Pi/6)).Draw(t, "rampAngle")
		case 2:
			s.RampLength = l * rapid.Float64Range(0.01, 1).Draw(t, "rampShare")
		}
	case Laser:
		s.Kerf = width(0.05, 0.5)
		s.Passes = rapid.IntRange(0, 3).Draw(t, "passes")
		s.FocusZ = rapid.Float64Range(-2, 10).Draw(t, "focusZ")
	default:
		s.PenDown = rapid.Float64Range(-1, 0).Draw(t, "penDown")
		s.PenUp = s.PenDown + rapid.Float64Range(0.5, 10).Draw(t, "penLift")
		s.Tool = width(0, 1)
	}
	switch rapid.IntRange(0, 2).Draw(t, "lead") {
	case 1:
		s.NoLead = true
	case 2:
		lim := math.Inf(1)
		if s.Side == SideInside {
			w := s.Tool
			if s.Machine == Laser {
				w = s.Kerf
			}
			lim = rho - w/2 - s.Tol
		}
		if lim >= s.Tol {
			s.LeadRadius = math.Min(rapid.Float64Range(s.Tol, math.Max(s.Tol, 30)).Draw(t, "leadRadius"), lim)
		}
	}
	return s
}

// Over random shapes, machines and settings, every profile keeps every
// promise: the waste side by the exact signed distance, the zone, the
// direction, quarter-circle tangent leads on the waste side, travel at the
// travel height, equal passes none deeper than the step-down and the last
// at the depth, tabs at their height, width and spacing, and the outline
// cut all round at the final level except at the tabs.
func TestProfilePropertyEveryPromiseKept(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := drawProfile(t)
		p, err := Profile(nil, s)
		if err != nil {
			t.Fatalf("valid spec refused: %v", err)
		}
		checkProfile(t, s, p)
	})
}

// Over random settings, Profile either returns a path or an *OpError or
// *SpecError, and never panics, whatever the numbers.
func TestProfilePropertyNeverPanics(t *testing.T) {
	anyFloat := rapid.OneOf(rapid.Float64(), rapid.Float64Range(-10, 50),
		rapid.SampledFrom([]float64{0, -0.0, math.NaN(), math.Inf(1), math.Inf(-1), 1e-300, 1e300}))
	rapid.Check(t, func(t *rapid.T) {
		e := drawEllipse(t)
		s := ProfileSpec{Ellipse: e,
			Setup: Setup{Machine: Machine(rapid.IntRange(0, 4).Draw(t, "machine")), Tol: anyFloat.Draw(t, "tol"),
				SafeZ: anyFloat.Draw(t, "safeZ"), PenUp: anyFloat.Draw(t, "penUp")},
			Side: Side(rapid.IntRange(0, 5).Draw(t, "side")), Tool: anyFloat.Draw(t, "tool"), Kerf: anyFloat.Draw(t, "kerf"),
			Depth: anyFloat.Draw(t, "depth"), StepDown: anyFloat.Draw(t, "step"), Tabs: rapid.IntRange(-2, 40).Draw(t, "tabs"),
			TabWidth: anyFloat.Draw(t, "tabWidth"), TabHeight: anyFloat.Draw(t, "tabHeight"),
			LeadRadius: anyFloat.Draw(t, "lead"), RampAngle: anyFloat.Draw(t, "rampAngle"), Start: anyFloat.Draw(t, "start")}
		if s.Tol > 0 && s.Tol < 0.01 {
			s.Tol = 0.05 // keep the approximation itself quick
		}
		p, err := Profile(nil, s)
		if err != nil {
			var oe *OpError
			var se *SpecError
			if !errors.As(err, &oe) && !errors.As(err, &se) {
				t.Fatalf("error %v (%T) is neither an *OpError nor a *SpecError", err, err)
			}
			return
		}
		checkContinuous(t, p)
	})
}
