package toolpath_test

import (
	"bytes"
	"math"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// The operations' paths, written by package gcodeout and read back by
// package conformance, pass every safety rule (rapids at safe height,
// beam off on rapids, spindle on before cutting, program end last), in
// millimetres and in inches; profiles without tabs pass the geometry rules
// too (every contour move in the zone of the tool-centre curve, closed
// loops, the final pass covering the curve).
func TestOperationsWriteSafePrograms(t *testing.T) {
	type job struct {
		name   string
		units  gcodeout.Units
		build  func(scale float64, setup toolpath.Setup) (toolpath.Path, error)
		setup  toolpath.Setup
		shape  func(scale float64) *conformance.Shape
		tol    float64
		cfgFor func(c *gcodeout.Config, scale float64)
	}
	mk := func(scale float64) ellipse.Ellipse {
		e, err := ellipse.FromSize(360*scale, 240*scale, ellipse.Point{X: 20 * scale, Y: -10 * scale}, 0.2)
		if err != nil {
			t.Fatal(err)
		}
		return e
	}
	// Heights the writer prints exactly in either unit: 5 mm or 0.2 in,
	// 3 mm or 0.125 in.
	safeZ := func(k float64) float64 {
		if k == 1 {
			return 5
		}
		return 0.2
	}
	penUp := func(k float64) float64 {
		if k == 1 {
			return 3
		}
		return 0.125
	}
	router := func(c *gcodeout.Config, scale float64) {
		c.Machine, c.RPM, c.SafeZ, c.Feed, c.PlungeFeed = gcodeout.Router, 18000, safeZ(scale), 1500*scale, 400*scale
	}
	laser := func(c *gcodeout.Config, scale float64) {
		c.Machine, c.Power, c.Feed, c.PierceDwell = gcodeout.Laser, 800, 900*scale, 0.2
	}
	plotter := func(c *gcodeout.Config, scale float64) {
		c.Machine, c.PenUp, c.Feed = gcodeout.Plotter, penUp(scale), 3000*scale
	}
	var jobs []job
	for _, u := range []gcodeout.Units{gcodeout.MM, gcodeout.Inch} {
		jobs = append(jobs,
			job{name: "router profile", units: u, cfgFor: router, tol: 0.02,
				setup: toolpath.Setup{Machine: toolpath.Router},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					s.SafeZ = safeZ(k)
					return toolpath.Profile(nil, toolpath.ProfileSpec{Setup: s, Ellipse: mk(k), Tool: 6 * k, Depth: 12 * k, StepDown: 4 * k})
				},
				shape: func(k float64) *conformance.Shape {
					c, _ := mk(k).Parallel(3 * k)
					return &conformance.Shape{Curve: c, Zone: toolpath.Outside}
				}},
			job{name: "router profile tabs ramp", units: u, cfgFor: router, tol: 0.02,
				setup: toolpath.Setup{Machine: toolpath.Router, Geometry: toolpath.Arcs},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					s.SafeZ = safeZ(k)
					return toolpath.Profile(nil, toolpath.ProfileSpec{Setup: s, Ellipse: mk(k), Side: toolpath.SideInside, Tool: 6 * k,
						Depth: 12 * k, StepDown: 4 * k, Tabs: 4, TabWidth: 8 * k, TabHeight: 4 * k, RampAngle: 0.05})
				}},
			job{name: "router drill", units: u, cfgFor: router, tol: 0.02,
				setup: toolpath.Setup{Machine: toolpath.Router},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					s.SafeZ = safeZ(k)
					return toolpath.Drill(nil, toolpath.DrillSpec{Setup: s, Ellipse: mk(k), Count: 10, Depth: 8 * k, Peck: 3 * k, PeckRetract: 1 * k, Offset: -20 * k})
				}},
			job{name: "laser profile", units: u, cfgFor: laser, tol: 0.01,
				setup: toolpath.Setup{Machine: toolpath.Laser},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					return toolpath.Profile(nil, toolpath.ProfileSpec{Setup: s, Ellipse: mk(k), Kerf: 0.2 * k, Passes: 2})
				},
				shape: func(k float64) *conformance.Shape {
					c, _ := mk(k).Parallel(0.1 * k)
					return &conformance.Shape{Curve: c, Zone: toolpath.Outside}
				}},
			job{name: "laser marks", units: u, cfgFor: laser, tol: 0.01,
				setup: toolpath.Setup{Machine: toolpath.Laser},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					return toolpath.Drill(nil, toolpath.DrillSpec{Setup: s, Ellipse: mk(k), Count: 24, MarkSeconds: 0.1})
				}},
			job{name: "plotter dashes", units: u, cfgFor: plotter, tol: 0.05,
				setup: toolpath.Setup{Machine: toolpath.Plotter},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					s.PenUp = penUp(k)
					return toolpath.Dash(nil, toolpath.DashSpec{Setup: s, Ellipse: mk(k), On: 15 * k, Off: 5 * k, Offset: 10 * k})
				}},
			job{name: "plotter profile", units: u, cfgFor: plotter, tol: 0.05,
				setup: toolpath.Setup{Machine: toolpath.Plotter, Geometry: toolpath.Arcs},
				build: func(k float64, s toolpath.Setup) (toolpath.Path, error) {
					s.PenUp = penUp(k)
					return toolpath.Profile(nil, toolpath.ProfileSpec{Setup: s, Ellipse: mk(k)})
				},
				shape: func(k float64) *conformance.Shape {
					return &conformance.Shape{Curve: mk(k).Curve(), Zone: toolpath.Band}
				}},
		)
	}
	for _, j := range jobs {
		name := j.name + " " + j.units.String()
		t.Run(name, func(t *testing.T) {
			k := 1.0
			if j.units == gcodeout.Inch {
				k = 1 / 25.4
			}
			cfg := gcodeout.Config{Units: j.units, Tolerance: j.tol * k, Title: name}
			j.cfgFor(&cfg, k)
			wr, err := gcodeout.NewWriter(&bytes.Buffer{}, cfg)
			if err != nil {
				t.Fatal(err)
			}
			s := j.setup
			s.Tol = j.tol * k
			s.Decimals = wr.Decimals()
			path, err := j.build(k, s)
			if err != nil {
				t.Fatal(err)
			}
			var buf bytes.Buffer
			if err := gcodeout.WritePath(&buf, cfg, path); err != nil {
				t.Fatalf("the writer refuses the path: %v", err)
			}
			prog, err := conformance.Read(buf.Bytes(), conformance.ReadOptions{})
			if err != nil {
				t.Fatal(err)
			}
			m, _ := conformance.ParseMachine(cfg.Machine.String())
			rules := conformance.Rules{Machine: m, SafeZ: cfg.SafeZ}
			if m == conformance.Plotter {
				rules.SafeZ = cfg.PenUp
			}
			if j.shape != nil {
				rules.Shape = j.shape(k)
				rules.Shape.Tol = s.Tol
			}
			for _, v := range conformance.Check(prog, rules) {
				t.Errorf("%v", v)
			}
			// A negative control: against a curve further out by ten
			// tolerances the same program deviates.
			if rules.Shape != nil {
				c := rules.Shape.Curve
				far, _ := c.Ellipse().Parallel(c.Offset() + 10*s.Tol)
				rules.Shape = &conformance.Shape{Curve: far, Zone: rules.Shape.Zone, Tol: s.Tol}
				if rep := conformance.CheckReport(prog, rules); rep.Summary.MaxDeviation < 9*s.Tol {
					t.Errorf("against a curve 10 tolerances out the deviation is only %g", rep.Summary.MaxDeviation)
				}
			}
			// The program's lengths agree with the path's.
			cut, _ := path.Lengths()
			got, _ := prog.Path.Lengths()
			if math.Abs(got-cut) > 1e-3*cut {
				t.Errorf("program cuts %g, the path %g", got, cut)
			}
		})
	}
}
