package gcodeout_test

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
	"pgregory.net/rapid"
)

// job is a random configuration and a connected path for it, with no move
// short enough to vanish in rounding.
type job struct {
	cfg  gcodeout.Config
	top  float64
	path toolpath.Path
}

func drawJob(t *rapid.T) job {
	m := rapid.SampledFrom([]gcodeout.Machine{gcodeout.Router, gcodeout.Laser, gcodeout.Plotter}).Draw(t, "machine")
	units := rapid.SampledFrom([]gcodeout.Units{gcodeout.MM, gcodeout.Inch}).Draw(t, "units")
	u := 1.0
	if units == gcodeout.Inch {
		u = 1 / 25.4
	}
	cfg := gcodeout.Config{Machine: m, Units: units, Feed: rapid.Float64Range(1, 5000).Draw(t, "feed") * u}
	if rapid.Bool().Draw(t, "tolerance") {
		cfg.Tolerance = math.Pow(10, rapid.Float64Range(-4, -1).Draw(t, "log10 tol")) * u
	}
	if rapid.Bool().Draw(t, "plunge feed") {
		cfg.PlungeFeed = rapid.Float64Range(1, 500).Draw(t, "plunge") * u
	}
	var j job
	switch m {
	case gcodeout.Router:
		cfg.RPM, cfg.SafeZ = rapid.Float64Range(1000, 30000).Draw(t, "rpm"), rapid.Float64Range(1, 20).Draw(t, "safe z")*u
		j.top = cfg.SafeZ
	case gcodeout.Laser:
		cfg.Power = rapid.Float64Range(1, 1000).Draw(t, "power")
		cfg.PierceDwell = rapid.SampledFrom([]float64{0, 0.1}).Draw(t, "pierce")
	case gcodeout.Plotter:
		cfg.PenUp = rapid.Float64Range(0.5, 10).Draw(t, "pen up") * u
		j.top = cfg.PenUp
	}
	j.cfg = cfg
	coord := rapid.Float64Range(-500, 500)
	at := toolpath.Point{X: coord.Draw(t, "x0") * u, Y: coord.Draw(t, "y0") * u, Z: j.top}
	add := func(s toolpath.Segment) {
		s.Start = at
		j.path = append(j.path, s)
		at = s.End
	}
	// far returns a point at least 0.05 mm from p in X or Y.
	far := func(p toolpath.Point, label string) toolpath.Point {
		q := toolpath.Point{X: coord.Draw(t, label+" x") * u, Y: coord.Draw(t, label+" y") * u, Z: p.Z}
		if math.Abs(q.X-p.X) < 0.05*u && math.Abs(q.Y-p.Y) < 0.05*u {
			q.X = p.X + 0.1*u
		}
		return q
	}
	depth := func() float64 {
		if m == gcodeout.Laser {
			return rapid.Float64Range(-5, 5).Draw(t, "ignored z") // the laser writes no Z
		}
		return -rapid.Float64Range(0.1, 10).Draw(t, "depth") * u
	}
	add(toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, End: far(at, "first")})
	for n := rapid.IntRange(0, 30).Draw(t, "steps"); n > 0; n-- {
		switch rapid.IntRange(0, 4).Draw(t, "step") {
		case 0: // lift if needed, travel
			if m != gcodeout.Laser && at.Z != j.top {
				add(toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, End: toolpath.Point{X: at.X, Y: at.Y, Z: j.top}})
			}
			add(toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, End: far(at, "travel")})
		case 1: // plunge
			if m != gcodeout.Laser {
				z := depth()
				if math.Abs(z-at.Z) < 0.05*u {
					z -= 0.1 * u
				}
				add(toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Role: toolpath.Plunge, End: toolpath.Point{X: at.X, Y: at.Y, Z: z}})
			}
		case 2: // cut line, maybe with its own feed
			end := far(at, "cut")
			end.Z = depth()
			s := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, End: end}
			if rapid.IntRange(0, 3).Draw(t, "own feed") == 0 {
				s.Feed = rapid.Float64Range(1, 3000).Draw(t, "feed") * u
			}
			add(s)
		case 3: // arc: radius ≥ 0.5 mm, sweep ≥ 0.3 rad or a full circle
			r := rapid.Float64Range(0.5, 200).Draw(t, "r") * u
			a0 := rapid.Float64Range(-math.Pi, math.Pi).Draw(t, "a0")
			sweep := rapid.Float64Range(0.3, 2*math.Pi).Draw(t, "sweep")
			cw := rapid.Bool().Draw(t, "cw")
			c := toolpath.Point{X: at.X - r*math.Cos(a0), Y: at.Y - r*math.Sin(a0)}
			end := at
			if sweep < 2*math.Pi-0.3 {
				d := sweep
				if cw {
					d = -d
				}
				end = toolpath.Point{X: c.X + r*math.Cos(a0+d), Y: c.Y + r*math.Sin(a0+d), Z: at.Z}
			}
			add(toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, End: end, CenterX: c.X, CenterY: c.Y, Radius: r, Clockwise: cw})
		case 4:
			motion := rapid.SampledFrom([]toolpath.Motion{toolpath.Travel, toolpath.Cut}).Draw(t, "dwell motion")
			add(toolpath.Segment{Kind: toolpath.Dwell, Motion: motion, End: at, Seconds: rapid.Float64Range(0, 5).Draw(t, "seconds")})
		}
	}
	return j
}

// TestRoundTrip: a program read back by an independent reader gives the
// path that was written: same moves in the same order, ends within half a
// unit, the feed each cut was meant to have, arcs in the right direction
// and within the radius limit, the beam on for every cut and off for every
// travel (laser), the spindle on before the first cut (router), no Z word
// at all for a laser, and the dwells in order.
func TestRoundTrip(t *testing.T) {
	rapid.Check(t, func(rt *rapid.T) {
		j := drawJob(rt)
		var out bytes.Buffer
		w, err := gcodeout.NewWriter(&out, j.cfg)
		if err != nil {
			rt.Fatal(err)
		}
		for _, s := range j.path {
			if err := w.WriteSegment(s); err != nil {
				rt.Fatal(err)
			}
		}
		if err := w.Close(); err != nil {
			rt.Fatal(err)
		}
		half := 0.5 * math.Pow10(-w.Decimals()) * (1 + 1e-9)
		limit := gcodeout.ArcRadiusLimitMM
		if j.cfg.Units == gcodeout.Inch {
			limit = gcodeout.ArcRadiusLimitInch
		}
		p := readBack(rt, out.String())
		laser := j.cfg.Machine == gcodeout.Laser
		if laser && strings.Contains(strings.Join(codeLines(out.String()), "\n"), " Z") {
			rt.Errorf("laser program has a Z word")
		}
		moves := p.moves
		if !laser {
			moves = moves[1:] // the start block's move to the top
		}
		var dwells []float64
		k := 0
		for i, s := range j.path {
			if s.Kind == toolpath.Dwell {
				dwells = append(dwells, math.Round(s.Seconds*1000)/1000)
				continue
			}
			if k >= len(moves) {
				rt.Fatalf("segment %d: no move left in the program", i)
			}
			m := moves[k]
			k++
			wantG := 0
			switch {
			case s.Kind == toolpath.Arc && s.Clockwise:
				wantG = 2
			case s.Kind == toolpath.Arc:
				wantG = 3
			case s.Motion == toolpath.Cut:
				wantG = 1
			}
			if m.g != wantG {
				rt.Fatalf("segment %d (%v %v): line %d is G%d", i, s.Kind, s.Motion, m.line, m.g)
			}
			if math.Abs(m.to[0]-s.End.X) > half || math.Abs(m.to[1]-s.End.Y) > half ||
				(!laser && math.Abs(m.to[2]-s.End.Z) > half) {
				rt.Errorf("segment %d: line %d ends at %v, want %v", i, m.line, m.to, s.End)
			}
			if s.Motion == toolpath.Cut {
				want := s.Feed
				if want == 0 {
					want = j.cfg.Feed
					if s.Role == toolpath.Plunge && j.cfg.PlungeFeed > 0 {
						want = j.cfg.PlungeFeed
					}
				}
				if math.Abs(m.feed-want) > 0.0005*(1+1e-9) {
					rt.Errorf("segment %d: line %d at F%v, want %v", i, m.line, m.feed, want)
				}
			}
			if wantG >= 2 {
				if rs, re := m.radii(); math.Abs(rs-re) > limit {
					rt.Errorf("line %d: radii %v and %v", m.line, rs, re)
				}
			}
			switch {
			case laser && (m.g == 0) == m.beam:
				rt.Errorf("line %d: G%d with the beam on=%v", m.line, m.g, m.beam)
			case !laser && j.cfg.Machine == gcodeout.Router && !m.beam:
				rt.Errorf("line %d: move with the spindle off", m.line)
			}
		}
		if extra := moves[k:]; len(extra) > 1 || (len(extra) == 1 && (laser || extra[0].g != 0 || extra[0].from[0] != extra[0].to[0] || extra[0].from[1] != extra[0].to[1])) {
			rt.Errorf("%d moves in the program for %d in the path; only a final lift may be added", len(moves), k)
		}
		if len(dwells) != len(p.dwells)-pierces(p, j.cfg) {
			rt.Errorf("%d dwells written for %d in the path", len(p.dwells), len(dwells))
		}
		wantS := math.Round(j.cfg.RPM*1000) / 1000
		if laser {
			wantS = math.Round(j.cfg.Power*1000) / 1000
		}
		for _, v := range p.sValues {
			if v != wantS {
				rt.Errorf("S%v, want S%v", v, wantS)
			}
		}
		if !laser {
			if last := p.moves[len(p.moves)-1]; last.to[2] < j.top-half {
				rt.Errorf("program ends at Z%v, below the top %v", last.to[2], j.top)
			}
		}
	})
}

// pierces counts the pierce dwells: one at each M3 of a laser program.
func pierces(p readProgram, cfg gcodeout.Config) int {
	if cfg.Machine != gcodeout.Laser || cfg.PierceDwell == 0 {
		return 0
	}
	n := 0
	for _, l := range p.lines {
		if strings.HasPrefix(l, "M3") {
			n++
		}
	}
	return n
}

// TestNeverPanics feeds the writer arbitrary segments, including NaN,
// infinities and nonsense kinds; it may refuse them but must not panic,
// and what it does write must still read back as a clean program.
func TestNeverPanics(t *testing.T) {
	num := rapid.OneOf(rapid.Float64(), rapid.SampledFrom([]float64{0, 1, -1, math.NaN(), math.Inf(1), math.Inf(-1), 1e300, 5e-324}))
	rapid.Check(t, func(rt *rapid.T) {
		cfg, _ := goldenConfig(rapid.SampledFrom([]gcodeout.Machine{gcodeout.Router, gcodeout.Laser, gcodeout.Plotter}).Draw(rt, "machine"), gcodeout.MM)
		var out bytes.Buffer
		w, err := gcodeout.NewWriter(&out, cfg)
		if err != nil {
			rt.Fatal(err)
		}
		for n := rapid.IntRange(0, 20).Draw(rt, "n"); n > 0; n-- {
			s := toolpath.Segment{
				Kind: toolpath.Kind(rapid.IntRange(0, 3).Draw(rt, "kind")), Motion: toolpath.Motion(rapid.IntRange(0, 2).Draw(rt, "motion")),
				Start:   toolpath.Point{X: num.Draw(rt, "sx"), Y: num.Draw(rt, "sy"), Z: num.Draw(rt, "sz")},
				End:     toolpath.Point{X: num.Draw(rt, "ex"), Y: num.Draw(rt, "ey"), Z: num.Draw(rt, "ez")},
				CenterX: num.Draw(rt, "cx"), CenterY: num.Draw(rt, "cy"), Clockwise: rapid.Bool().Draw(rt, "cw"),
				Feed: num.Draw(rt, "feed"), Seconds: num.Draw(rt, "seconds"),
			}
			_ = w.WriteSegment(s)
		}
		if err := w.Close(); err != nil {
			rt.Fatal(err)
		}
		readBack(rt, out.String())
	})
}
