package gcodeout_test

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

var update = flag.Bool("update", false, "rewrite the golden files under testdata")

// pathBuilder appends connected segments, each starting where the last
// ended.
type pathBuilder struct {
	p   toolpath.Path
	at  toolpath.Point
	top float64
}

func (b *pathBuilder) line(m toolpath.Motion, x, y, z float64) *pathBuilder {
	end := toolpath.Point{X: x, Y: y, Z: z}
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Line, Motion: m, Start: b.at, End: end})
	b.at = end
	return b
}

func (b *pathBuilder) plunge(z float64) *pathBuilder {
	b.line(toolpath.Cut, b.at.X, b.at.Y, z)
	b.p[len(b.p)-1].Role = toolpath.Plunge
	return b
}

func (b *pathBuilder) arc(x, y, cx, cy float64, cw bool) *pathBuilder {
	end := toolpath.Point{X: x, Y: y, Z: b.at.Z}
	r := (b.at.X-cx)*(b.at.X-cx) + (b.at.Y-cy)*(b.at.Y-cy)
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: b.at, End: end,
		CenterX: cx, CenterY: cy, Radius: r, Clockwise: cw})
	b.at = end
	return b
}

func (b *pathBuilder) dwell(m toolpath.Motion, seconds float64) *pathBuilder {
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Dwell, Motion: m, Start: b.at, End: b.at, Seconds: seconds})
	return b
}

// goldenPath is a small hand-made job in length unit u (1 for mm, 0.05
// for inch): a square of lines, a circle of two arcs, travels between them,
// a dwell; plunges and lifts between top and bottom (both 0 for a laser).
func goldenPath(u, top, bottom float64, laser bool) toolpath.Path {
	b := &pathBuilder{at: toolpath.Point{Z: top}, top: top}
	down := func() {
		if !laser {
			b.plunge(bottom)
		}
	}
	up := func() {
		if !laser {
			b.line(toolpath.Travel, b.at.X, b.at.Y, top)
		}
	}
	b.line(toolpath.Travel, 10*u, 10*u, top)
	down()
	b.line(toolpath.Cut, 30*u, 10*u, bottom).
		line(toolpath.Cut, 30*u, 30*u, bottom).
		line(toolpath.Cut, 10*u, 30*u, bottom).
		line(toolpath.Cut, 10*u, 10*u, bottom)
	up()
	b.line(toolpath.Travel, 60*u, 20*u, top)
	down()
	b.arc(40*u, 20*u, 50*u, 20*u, true).arc(60*u, 20*u, 50*u, 20*u, true)
	b.dwell(toolpath.Cut, 0.25)
	up()
	// A mark at a point that is not on the grid: shows rounding.
	b.line(toolpath.Travel, 45.12345*u, 7.00049*u, top)
	down()
	b.dwell(toolpath.Cut, 0.5)
	up()
	b.line(toolpath.Travel, 0, 0, top)
	return b.p
}

// goldenConfig returns the configuration of a golden file.
func goldenConfig(m gcodeout.Machine, units gcodeout.Units) (gcodeout.Config, toolpath.Path) {
	u, tol := 1.0, 0.01
	if units == gcodeout.Inch {
		u, tol = 0.05, 0.0005
	}
	cfg := gcodeout.Config{
		Machine: m, Units: units, Tolerance: tol,
		Title: "Golden test: square & circle (" + units.String() + ")",
		Header: gcodeout.Header{
			Shape:      "square 20 and circle 20 across, in test units",
			Operations: []string{"square of four lines, circle of two arcs", "two dwells"},
		},
	}
	var path toolpath.Path
	switch m {
	case gcodeout.Router:
		cfg.Feed, cfg.PlungeFeed, cfg.RPM, cfg.SafeZ, cfg.SpinUp = 1200*u, 300*u, 18000, 5*u, 2
		cfg.Header.Tool = "6 mm two-flute flat end mill"
		path = goldenPath(u, cfg.SafeZ, -1.5*u, false)
	case gcodeout.Laser:
		cfg.Feed, cfg.Power, cfg.PierceDwell = 600*u, 750, 0.1
		cfg.Header.Tool = "0.15 mm"
		path = goldenPath(u, 0, 0, true)
	case gcodeout.Plotter:
		cfg.Feed, cfg.PlungeFeed, cfg.PenUp, cfg.PenDown = 3000*u, 900*u, 3*u, 0
		cfg.Header.Tool = "0.5 mm fibre tip"
		path = goldenPath(u, cfg.PenUp, 0, false)
	}
	return cfg, path
}

func TestGolden(t *testing.T) {
	for _, m := range []gcodeout.Machine{gcodeout.Router, gcodeout.Laser, gcodeout.Plotter} {
		for _, units := range []gcodeout.Units{gcodeout.MM, gcodeout.Inch} {
			name := m.String() + "-" + units.String()
			t.Run(name, func(t *testing.T) {
				cfg, path := goldenConfig(m, units)
				var got bytes.Buffer
				if err := gcodeout.WritePath(&got, cfg, path); err != nil {
					t.Fatal(err)
				}
				file := filepath.Join("testdata", name+".gcode")
				if *update {
					if err := os.WriteFile(file, got.Bytes(), 0o644); err != nil {
						t.Fatal(err)
					}
				}
				want, err := os.ReadFile(file)
				if err != nil {
					t.Fatalf("%v (run go test -update to create it)", err)
				}
				if !bytes.Equal(got.Bytes(), want) {
					t.Errorf("output differs from %s (run go test -update after checking the change):\n%s", file, got.Bytes())
				}
				readBack(t, got.String())

				// The same input through a reused Writer gives the same bytes.
				var again bytes.Buffer
				w, err := gcodeout.NewWriter(&bytes.Buffer{}, cfg)
				if err != nil {
					t.Fatal(err)
				}
				w.WriteSegment(path[0])
				w.Reset(&again)
				for _, s := range path {
					if err := w.WriteSegment(s); err != nil {
						t.Fatal(err)
					}
				}
				if err := w.Close(); err != nil {
					t.Fatal(err)
				}
				if !bytes.Equal(again.Bytes(), got.Bytes()) {
					t.Errorf("Reset and rewrite: output differs:\n%s", again.Bytes())
				}
			})
		}
	}
}
