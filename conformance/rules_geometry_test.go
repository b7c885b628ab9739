package conformance

import (
	"bytes"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/gcodeout"
	"github.com/focitools/foci/toolpath"
)

// A workshop order of our own: an oval sign blank 120 × 80 mm, centred at
// (10, -5), turned 30°, cut with its tool centre 3 mm outside the line.
func signBlank(t testing.TB) ellipse.Parallel {
	t.Helper()
	el, err := ellipse.FromSize(120, 80, ellipse.Point{X: 10, Y: -5}, 30*math.Pi/180)
	if err != nil {
		t.Fatal(err)
	}
	c, err := el.Parallel(3)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

const geoTol = 0.02

// job describes a test program cut around a curve in straight lines.
type job struct {
	machine Machine
	zone    toolpath.Zone
	levels  []float64 // Z of each pass (ignored for the laser)
	steps   int       // lines per turn, uniform in the parameter
	shift   float64   // vertices moved by this much along the normal (+ out)
	// tab: on the deepest pass, vertices with t in [tab0, tab1] are cut at
	// tabZ instead; tab0 > tab1 puts the tab across t = 0, the start.
	tab0, tab1, tabZ float64
	// gap: on the deepest pass (every pass for the laser), vertices with t
	// in [gap0, gap1] are skipped by lifting out of the cut.
	gap0, gap1 float64
	// turns is how far round each pass goes, upperTurns each pass but the
	// deepest; 0 means 1 and turns.
	turns, upperTurns float64
	// lead is "", "waste" or "part": quarter-circle lead-in and lead-out
	// arcs of radius 4 on that side.
	lead string
	// bump moves one vertex of the first pass by this much (+ out).
	bump float64
	// joined keeps the tool down between passes (one continuous run).
	joined bool
}

// program writes the job as text, six decimals.
func (j job) program(c ellipse.Parallel) string {
	if j.machine == 0 {
		j.machine = Router // as in Rules, the zero machine is a router
	}
	var b strings.Builder
	f := func(v float64) string { return strconv.FormatFloat(v, 'f', 6, 64) }
	pt := func(t, extra float64) (x, y float64) {
		p := c.PointAt(t)
		n := c.Normal(t)
		d := j.shift + extra
		return p.X + d*n.X, p.Y + d*n.Y
	}
	b.WriteString("G21 G90 G17 G94\n")
	on, off := "M3 S12000\n", "M5\n"
	if j.machine == Laser {
		on, off = "M3 S700\n", "M5\n"
	} else {
		b.WriteString("G0 Z5\n")
	}
	if j.machine == Router {
		b.WriteString(on)
	}
	b.WriteString("F900\n")
	levels := j.levels
	if j.machine == Laser && len(levels) == 0 {
		levels = []float64{0}
	}
	turns := j.turns
	if turns == 0 {
		turns = 1
	}
	const r = 4.0
	upper := j.upperTurns
	if upper == 0 {
		upper = turns
	}
	tStart := 0.0
	for li, z := range levels {
		deepest := li == len(levels)-1
		passTurns := upper
		if deepest {
			passTurns = turns
		}
		if !j.joined {
			tStart = 0
		}
		x0, y0 := pt(tStart, 0)
		tg := c.Tangent(0)
		n := c.Normal(0)
		qx, qy := x0, y0
		side := 1.0
		if j.lead == "part" {
			side = -1
		}
		if j.lead != "" {
			qx, qy = x0+side*r*n.X-r*tg.X, y0+side*r*n.Y-r*tg.Y
		}
		zs := " Z" + f(z)
		if j.machine == Laser {
			zs = ""
		}
		if !j.joined || li == 0 {
			b.WriteString("G0 X" + f(qx) + " Y" + f(qy) + "\n")
			if j.machine == Laser {
				b.WriteString(on)
			} else {
				b.WriteString("G0 Z1\nG1" + zs + "\n")
			}
		} else {
			b.WriteString("G1" + zs + "\n") // straight down to the next level
		}
		arc := func(ex, ey, i, jj float64) {
			g := "G2"
			if side < 0 {
				g = "G3"
			}
			b.WriteString(g + " X" + f(ex) + " Y" + f(ey) + " I" + f(i) + " J" + f(jj) + "\n")
		}
		if j.lead != "" {
			arc(x0, y0, r*tg.X, r*tg.Y)
		}
		curZ := z
		lifted := false
		steps := int(float64(j.steps) * passTurns)
		for k := 1; k <= steps; k++ {
			t := tStart + 2*math.Pi*float64(k)/float64(j.steps)
			tm := math.Mod(t, 2*math.Pi)
			extra := 0.0
			if li == 0 && k == j.steps/3 {
				extra = j.bump
			}
			x, y := pt(t, extra)
			inGap := (deepest || j.machine == Laser) && tm >= j.gap0 && tm <= j.gap1 && j.gap1 > j.gap0
			if inGap {
				if !lifted {
					if j.machine == Laser {
						b.WriteString(off)
					} else {
						b.WriteString("G0 Z5\n")
					}
					lifted = true
				}
				b.WriteString("G0 X" + f(x) + " Y" + f(y) + "\n")
				continue
			}
			if lifted {
				if j.machine == Laser {
					b.WriteString(on)
				} else {
					b.WriteString("G1 Z" + f(curZ) + "\n")
				}
				lifted = false
			}
			want := z
			inTab := tm >= j.tab0 && tm <= j.tab1
			if j.tab0 > j.tab1 { // across the start of the pass
				inTab = tm >= j.tab0 || tm <= j.tab1
			}
			if deepest && j.tabZ != 0 && inTab {
				want = j.tabZ
			}
			if want != curZ && j.machine != Laser {
				b.WriteString("G1 Z" + f(want) + "\n")
				curZ = want
			}
			b.WriteString("G1 X" + f(x) + " Y" + f(y) + "\n")
		}
		tStart += 2 * math.Pi * float64(steps) / float64(j.steps) // a joined run goes on from here
		if j.lead != "" {
			arc(x0+side*r*n.X+r*tg.X, y0+side*r*n.Y+r*tg.Y, side*r*n.X, side*r*n.Y)
		}
		if !j.joined || deepest {
			if j.machine == Laser {
				b.WriteString(off)
			} else {
				b.WriteString("G0 Z5\n")
			}
		}
	}
	if j.machine == Router {
		b.WriteString(off)
	}
	b.WriteString("M30\n")
	return b.String()
}

func TestGeometryRules(t *testing.T) {
	c := signBlank(t)
	base := job{zone: toolpath.Band, levels: []float64{-6}, steps: 800}
	passes := []float64{-2, -4, -6}
	tests := []struct {
		name  string
		job   job
		zone  toolpath.Zone
		rules []string // the geometry rules that must fire, all others must not
	}{
		{"one pass on the curve", base, toolpath.Band, nil},
		{"three passes with tabs and leads on the waste side",
			job{zone: toolpath.Outside, levels: passes, steps: 800, shift: geoTol / 2, tab0: 1, tab1: 1.1, tabZ: -4.5, lead: "waste"}, toolpath.Outside, nil},
		{"a tab across the start of the final pass",
			job{levels: passes, steps: 800, tab0: 6.2, tab1: 0.05, tabZ: -4}, toolpath.Band, nil},
		{"a tab across the start of a joined final pass",
			job{levels: passes, steps: 800, tab0: 6.2, tab1: 0.05, tabZ: -4, joined: true}, toolpath.Band, nil},
		{"inside zone", job{levels: passes, steps: 800, shift: -geoTol / 2}, toolpath.Inside, nil},
		{"passes joined by plunges", job{levels: passes, steps: 800, joined: true}, toolpath.Band, nil},
		{"laser, two passes", job{machine: Laser, levels: []float64{0, 0}, steps: 800}, toolpath.Band, nil},
		{"plotter", job{machine: Plotter, levels: []float64{0}, steps: 800}, toolpath.Band, nil},

		// One vertex 2·tol inside the band: the two moves that meet there.
		{"a vertex too far in", job{levels: []float64{-6}, steps: 800, bump: -2 * geoTol}, toolpath.Band, []string{RuleDeviation}},
		// Vertices on the curve, chords inside it: outside zone broken.
		{"chords cut into the part", job{levels: []float64{-6}, steps: 800}, toolpath.Outside, []string{RuleDeviation}},
		{"lead arcs on the part side", job{levels: []float64{-6}, steps: 800, shift: geoTol / 2, lead: "part"}, toolpath.Outside, []string{RuleDeviation}},
		// Band has no waste side: its lead arcs count as contour.
		{"lead arcs in a band", job{levels: []float64{-6}, steps: 800, lead: "waste"}, toolpath.Band, []string{RuleDeviation}},

		{"a pass stops short", job{levels: []float64{-6}, steps: 800, turns: 0.9}, toolpath.Band, []string{RuleClosedLoop, RuleCoverage}},
		{"an upper pass stops short", job{levels: passes, steps: 800, upperTurns: 0.8}, toolpath.Band, []string{RuleClosedLoop}},
		{"the final pass lifts out over a stretch", job{levels: passes, steps: 800, gap0: 2, gap1: 2.2}, toolpath.Band, []string{RuleClosedLoop, RuleCoverage}},
		{"the laser beam goes off over a stretch", job{machine: Laser, levels: []float64{0}, steps: 800, gap0: 2, gap1: 2.2}, toolpath.Band, []string{RuleClosedLoop, RuleCoverage}},
		{"a tab lifted out of the stock", job{levels: passes, steps: 800, tab0: 1, tab1: 1.1, tabZ: 0.5}, toolpath.Band, []string{RuleClosedLoop, RuleCoverage}},
		{"a joined run that skips part of a level", job{levels: []float64{-2, -4}, steps: 800, joined: true, upperTurns: 0.7}, toolpath.Band, []string{RuleClosedLoop}},
		{"a joined run short at every level", job{levels: []float64{-2, -4}, steps: 800, joined: true, turns: 0.7}, toolpath.Band, []string{RuleClosedLoop, RuleCoverage}},
		// Everything 3·tol out: all of it lies in the waste, none is contour.
		{"offset to the wrong side", job{levels: []float64{-6}, steps: 800, shift: 3 * geoTol}, toolpath.Outside, []string{RuleCoverage}},
		{"nothing cut at depth", job{levels: []float64{1}, steps: 800}, toolpath.Band, []string{RuleCoverage}},
	}
	geometryRules := []string{RuleDeviation, RuleClosedLoop, RuleCoverage}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src := tc.job.program(c)
			p := read(t, src)
			rules := Rules{Machine: tc.job.machine, SafeZ: 5, Shape: &Shape{Curve: c, Zone: tc.zone, Tol: geoTol}}
			if tc.job.machine == Plotter {
				rules.SafeZ = 5
			}
			rep := CheckReport(p, rules)
			fired := map[string]bool{}
			for _, v := range rep.Violations {
				fired[v.Rule] = true
				if !contains(geometryRules, v.Rule) && !(tc.name == "nothing cut at depth" || strings.Contains(tc.name, "lifted out")) {
					t.Errorf("unexpected %v", v)
				}
			}
			for _, r := range geometryRules {
				if fired[r] != contains(tc.rules, r) {
					t.Errorf("%s fired %v, want %v; violations: %v", r, fired[r], contains(tc.rules, r), firstFew(rep.Violations))
				}
			}
			if !rep.Summary.Geometry {
				t.Error("summary says no geometry was checked")
			}
			if len(tc.rules) == 0 && rep.Summary.MaxDeviation > geoTol {
				t.Errorf("max deviation %v beyond the tolerance in a sound program", rep.Summary.MaxDeviation)
			}
		})
	}
}

func contains(list []string, s string) bool {
	for _, v := range list {
		if v == s {
			return true
		}
	}
	return false
}

func firstFew(vs []Violation) []Violation {
	if len(vs) > 6 {
		return vs[:6]
	}
	return vs
}

// The bumped vertex is reported on the two lines that meet there, and the
// summary's extreme agrees with a dense sampling by the exact distance.
func TestDeviationNamesTheLines(t *testing.T) {
	c := signBlank(t)
	j := job{levels: []float64{-6}, steps: 800, bump: -2 * geoTol}
	src := j.program(c)
	p := read(t, src)
	rep := CheckReport(p, Rules{SafeZ: 5, Shape: &Shape{Curve: c, Zone: toolpath.Band, Tol: geoTol}})
	// The bumped vertex is the end of move k = steps/3 of the pass.
	tb := 2 * math.Pi * float64(j.steps/3) / float64(j.steps)
	q := c.PointAt(tb)
	n := c.Normal(tb)
	text := "G1 X" + strconv.FormatFloat(q.X-2*geoTol*n.X, 'f', 6, 64)
	want := 0
	for i, l := range strings.Split(src, "\n") {
		if strings.HasPrefix(l, text) {
			want = i + 1
		}
	}
	if want == 0 {
		t.Fatal("bumped vertex not found in the program")
	}
	if len(rep.Violations) != 2 || rep.Violations[0].Line != want || rep.Violations[1].Line != want+1 {
		t.Fatalf("violations %v, want deviation at lines %d and %d", rep.Violations, want, want+1)
	}
	// Dense sampling of the two moves with the exact distance.
	lo := math.Inf(1)
	for i := range p.Path {
		if p.Moves[i].Line != want && p.Moves[i].Line != want+1 {
			continue
		}
		for k := 0; k <= 1000; k++ {
			pt := p.Path[i].At(float64(k) / 1000)
			_, d := c.Ellipse().Nearest(ellipse.Point{X: pt.X, Y: pt.Y})
			lo = math.Min(lo, d-c.Offset())
		}
	}
	if math.Abs(rep.Summary.DeviationLo-lo) > 1e-9 || math.Abs(rep.Summary.MaxDeviation+lo) > 1e-9 {
		t.Errorf("summary deviation %v (max %v), dense sampling %v", rep.Summary.DeviationLo, rep.Summary.MaxDeviation, lo)
	}
}

func TestGeometrySummary(t *testing.T) {
	c := signBlank(t)
	j := job{zone: toolpath.Outside, levels: []float64{-2, -4, -6}, steps: 800, shift: geoTol / 2, tab0: 1, tab1: 1.1, tabZ: -4.5, lead: "waste"}
	p := read(t, j.program(c))
	sum := CheckReport(p, Rules{SafeZ: 5, Shape: &Shape{Curve: c, Zone: toolpath.Outside, Tol: geoTol}}).Summary
	if sum.Lead != 6 || sum.Contour != 3*800 || sum.Runs != 3 {
		t.Errorf("%d lead moves, %d contour moves, %d runs; want 6, 2400, 3", sum.Lead, sum.Contour, sum.Runs)
	}
	if !(sum.DeviationLo >= 0 && sum.DeviationHi <= geoTol && sum.DeviationHi > 0) {
		t.Errorf("deviation [%v, %v], want inside [0, %v]", sum.DeviationLo, sum.DeviationHi, geoTol)
	}
}

// Paths from the library's approximation, written by gcodeout for each
// machine, read back without a problem and keep every rule.
func TestWrittenApproximationsPass(t *testing.T) {
	c := signBlank(t)
	for _, m := range []struct {
		name    string
		machine Machine
		cfg     gcodeout.Config
		z       float64
	}{
		{"router", Router, gcodeout.Config{Machine: gcodeout.Router, Feed: 900, RPM: 16000, SafeZ: 5}, -2},
		{"laser", Laser, gcodeout.Config{Machine: gcodeout.Laser, Feed: 900, Power: 500}, 0},
		{"plotter", Plotter, gcodeout.Config{Machine: gcodeout.Plotter, Feed: 3000, PenUp: 3}, 0},
	} {
		for _, geom := range []toolpath.Geometry{toolpath.Lines, toolpath.Arcs} {
			for _, zone := range []toolpath.Zone{toolpath.Band, toolpath.Outside, toolpath.Inside} {
				name := m.name + "/" + geom.String() + "/" + zone.String()
				cfg := m.cfg
				cfg.Tolerance = geoTol
				var buf bytes.Buffer
				w, err := gcodeout.NewWriter(&buf, cfg)
				if err != nil {
					t.Fatal(err)
				}
				path, err := toolpath.Approximate(nil, toolpath.Spec{Curve: c, Zone: zone, Tol: geoTol, Geometry: geom, Decimals: w.Decimals(), Z: m.z})
				if err != nil {
					t.Fatalf("%s: %v", name, err)
				}
				up := 5.0
				if m.machine == Plotter {
					up = 3
				}
				start, above := path[0].Start, path[0].Start
				above.Z = up
				if m.machine == Laser {
					above.Z = 0
				}
				lead := []toolpath.Segment{{Kind: toolpath.Line, Motion: toolpath.Travel, Start: toolpath.Point{Z: above.Z}, End: above}}
				if m.machine != Laser {
					lead = append(lead, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Role: toolpath.Plunge, Start: above, End: start})
				}
				for _, s := range append(lead, path...) {
					if err := w.WriteSegment(s); err != nil {
						t.Fatalf("%s: %v", name, err)
					}
				}
				if m.machine != Laser {
					end := path[len(path)-1].End
					lift := end
					lift.Z = up
					if err := w.WriteSegment(toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Travel, Start: end, End: lift}); err != nil {
						t.Fatalf("%s: %v", name, err)
					}
				}
				if err := w.Close(); err != nil {
					t.Fatal(err)
				}
				p := read(t, buf.String())
				rep := CheckReport(p, Rules{Machine: m.machine, SafeZ: up, Shape: &Shape{Curve: c, Zone: zone, Tol: geoTol}})
				if len(rep.Violations) != 0 || len(p.Problems) != 0 {
					t.Errorf("%s: %v", name, firstFew(rep.Violations))
				}
				if s := rep.Summary; s.Contour != len(path) || s.Runs != 1 {
					t.Errorf("%s: %d contour moves in %d runs, want %d in 1", name, s.Contour, s.Runs, len(path))
				}
			}
		}
	}
}
