package conformance

import (
	"errors"
	"math"
	"regexp"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// The suite's own tests: sound generators raise no alarm over the default
// cases, and deliberately broken ones, each wrapping a sound one, are
// caught with the right sentinel and nothing else.

// smooth marks a generator as claiming tangent continuity.
type smooth struct{ Generator }

func (smooth) TangentContinuous() bool { return true }

// approximate is the toolpath package's own generator.
func approximate(g toolpath.Geometry) GeneratorFunc {
	return func(dst toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) (toolpath.Path, error) {
		return toolpath.Approximate(dst, toolpath.Spec{Curve: c, Zone: z, Tol: tol, Geometry: g})
	}
}

// biarcChain is a tangent-continuous arc generator of the tests' own:
// nodes at equal parameter steps on the parallel curve in the middle of the
// zone, with the curve's tangent there, joined by equal-tangent-length
// biarcs (Bolton, "Biarc curves", CAD 7, 1975). The steps are those a
// polygon would need for half the zone width; a biarc's error is of third
// order in the step, so far smaller.
func biarcChain(dst toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) (toolpath.Path, error) {
	e := c.Ellipse()
	lo, hi := z.Limits(tol)
	mid := c.Offset() + (lo+hi)/2
	nodes, err := e.Parallel(mid)
	if err != nil {
		return dst, err
	}
	a, b := e.SemiMajor(), e.SemiMinor()
	m := a + math.Abs(mid)*(3*a*a-2*b*b)/(b*b)
	n := int(math.Max(8, math.Ceil(2*math.Pi/math.Sqrt(4*(hi-lo)/m))))
	p0, t0 := nodes.PointAt(0), e.Tangent(0)
	first, firstT := p0, t0
	for k := 1; k <= n; k++ {
		p1, t1 := first, firstT
		if k < n {
			t := 2 * math.Pi * float64(k) / float64(n)
			p1, t1 = nodes.PointAt(t), e.Tangent(t)
		}
		dst = appendBiarc(dst, p0, t0, p1, t1)
		p0, t0 = p1, t1
	}
	return dst, nil
}

// appendBiarc appends the biarc from p0 with unit tangent t0 to p1 with
// unit tangent t1 whose two control legs have the same length d: the joint
// is the middle of the segment between p0 + d·t0 and p1 − d·t1, whose
// length is 2d; solving |v − d(t0 + t1)| = 2d for v = p1 − p0 gives
// d = v·v / (v·t + √((v·t)² + 2(1 − t0·t1)·v·v)), t = t0 + t1.
func appendBiarc(dst toolpath.Path, p0, t0, p1, t1 ellipse.Point) toolpath.Path {
	vx, vy := p1.X-p0.X, p1.Y-p0.Y
	tx, ty := t0.X+t1.X, t0.Y+t1.Y
	vt, vv := vx*tx+vy*ty, vx*vx+vy*vy
	d := vv / (vt + math.Sqrt(vt*vt+2*(1-(t0.X*t1.X+t0.Y*t1.Y))*vv))
	q0 := ellipse.Point{X: p0.X + d*t0.X, Y: p0.Y + d*t0.Y}
	q1 := ellipse.Point{X: p1.X - d*t1.X, Y: p1.Y - d*t1.Y}
	j := ellipse.Point{X: (q0.X + q1.X) / 2, Y: (q0.Y + q1.Y) / 2}
	jx, jy := q1.X-q0.X, q1.Y-q0.Y
	h := math.Hypot(jx, jy)
	tj := ellipse.Point{X: jx / h, Y: jy / h}
	dst = append(dst, arcFrom(p0, t0, j))
	return append(dst, arcFrom(j, tj, p1))
}

// arcFrom returns the arc that leaves p along unit tangent tg and ends at
// q: its centre lies on the normal at p at signed distance |q−p|²/(2h),
// h the distance of q from the tangent line (+ to the left).
func arcFrom(p, tg, q ellipse.Point) toolpath.Segment {
	wx, wy := q.X-p.X, q.Y-p.Y
	nx, ny := -tg.Y, tg.X
	s := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut,
		Start: toolpath.Point{X: p.X, Y: p.Y}, End: toolpath.Point{X: q.X, Y: q.Y}}
	h := wx*nx + wy*ny
	if h == 0 {
		return s
	}
	r := (wx*wx + wy*wy) / (2 * h)
	s.Kind = toolpath.Arc
	s.CenterX, s.CenterY = p.X+r*nx, p.Y+r*ny
	s.Radius = math.Abs(r)
	s.Clockwise = r < 0
	return s
}

// reversed runs a sound generator's path the other way round.
func reversed(dst toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) (toolpath.Path, error) {
	base := len(dst)
	p, err := Polyline{}.Generate(dst, c, z, tol)
	if err != nil {
		return p, err
	}
	seg := p[base:]
	for i, j := 0, len(seg)-1; i < j; i, j = i+1, j-1 {
		seg[i], seg[j] = seg[j], seg[i]
	}
	for i := range seg {
		seg[i].Start, seg[i].End = seg[i].End, seg[i].Start
	}
	return p, nil
}

func TestGeneratorSoundGeneratorsPass(t *testing.T) {
	tests := []struct {
		name string
		gen  Generator
		few  bool // a small spread is enough
	}{
		{"Polyline", Polyline{}, false},
		{"Polyline reversed", GeneratorFunc(reversed), true},
		{"biarc chain", smooth{GeneratorFunc(biarcChain)}, false},
		{"toolpath.Approximate lines", approximate(toolpath.Lines), false},
		{"toolpath.Approximate arcs", smooth{approximate(toolpath.Arcs)}, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			cases := DefaultCases()
			switch {
			case tt.few:
				cases = testCases(t)
			case testing.Short():
				cases = coarseCases(cases)
			}
			if err := TestGenerator(tt.gen, cases...); err != nil {
				t.Error(err)
			}
		})
	}
}

// coarseCases keeps the coarse tolerance of each pair of default cases.
func coarseCases(all []Case) []Case {
	var out []Case
	for i, c := range all {
		if i%2 == 0 {
			out = append(out, c)
		}
	}
	return out
}

// TestGeneratorFaultForm checks the message form, one fault per line, the
// count in the first line and errors.As to *Fault.
func TestGeneratorFaultForm(t *testing.T) {
	cases := testCases(t)[:1]
	err := TestGenerator(afterBase(Polyline{}, overshoot), cases...)
	if err == nil {
		t.Fatal("no error")
	}
	lines := strings.Split(err.Error(), "\n")
	if want := "conformance: TestGenerator found 2 misbehaviours:"; lines[0] != want {
		t.Errorf("first line %q, want %q", lines[0], want)
	}
	form := regexp.MustCompile(`^` + regexp.QuoteMeta(cases[0].Name) + `: segment \d+ deviation: got \[.*\], want within \[.*\] \(.*\)$`)
	for _, l := range lines[1:] {
		if !form.MatchString(l) {
			t.Errorf("line %q is not of the form subject: operation: got X, want Y", l)
		}
	}
	var f *Fault
	if !errors.As(err, &f) || f.Subject != cases[0].Name || f.Err != ErrOutsideZone {
		t.Errorf("errors.As: %+v", f)
	}
}

func TestGeneratorInvalidCase(t *testing.T) {
	e, _ := ellipse.New(ellipse.Point{}, 2, 1, 0)
	err := TestGenerator(Polyline{}, Case{Name: "no ellipse", Tol: 0.1}, Case{Name: "zero tol", Curve: e.Curve()})
	if !errors.Is(err, ErrCase) || strings.Count(err.Error(), "\n") != 2 {
		t.Errorf("got %v, want two ErrCase faults", err)
	}
}

// TestGeneratorNamesUnnamedCases checks the name built for a case without
// one.
func TestGeneratorNamesUnnamedCases(t *testing.T) {
	e, _ := ellipse.New(ellipse.Point{X: 1, Y: 2}, 3, 2, 0)
	err := TestGenerator(afterBase(Polyline{}, travel), Case{Curve: e.Curve(), Zone: toolpath.Outside, Tol: 0.01})
	want := "ellipse 6x4 at (1,2) rotated 0 rad, offset 0, outside, tol 0.01: segment "
	if err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("got %v, want a line starting %q", err, want)
	}
}
