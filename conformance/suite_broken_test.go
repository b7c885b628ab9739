package conformance

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Deliberately broken generators, each wrapping a sound one, and the test
// that the suite catches each with the right sentinel and nothing else.

// afterBase runs gen and hands the new segments to edit.
func afterBase(gen Generator, edit func(seg toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) toolpath.Path) GeneratorFunc {
	return func(dst toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) (toolpath.Path, error) {
		base := len(dst)
		p, err := gen.Generate(dst, c, z, tol)
		if err != nil {
			return p, err
		}
		return append(p[:base], edit(p[base:], c, z, tol)...), nil
	}
}

// overshoot moves the vertex a third of the way round outward so that it
// lies 2% of tol beyond the zone: the exact deviation of a point moved
// along the normal at its foot changes by the distance moved.
func overshoot(seg toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) toolpath.Path {
	j := len(seg) / 3
	v := seg[j].End
	e := c.Ellipse()
	foot, sd := e.Nearest(ellipse.Point{X: v.X, Y: v.Y})
	n := e.Normal(foot)
	_, hi := z.Limits(tol)
	move := hi + 0.02*tol - (sd - c.Offset())
	v.X += move * n.X
	v.Y += move * n.Y
	seg[j].End, seg[j+1].Start = v, v
	return seg
}

// gap shortens one segment by ten times the join limit.
func gap(seg toolpath.Path, c ellipse.Parallel, _ toolpath.Zone, _ float64) toolpath.Path {
	e := c.Ellipse()
	ctr := e.Center()
	cut := 10 * JoinLimit * (e.SemiMajor() + math.Abs(c.Offset()) + math.Abs(ctr.X) + math.Abs(ctr.Y))
	s := &seg[len(seg)/2]
	dx, dy := s.End.X-s.Start.X, s.End.Y-s.Start.Y
	h := math.Hypot(dx, dy)
	s.End.X -= cut * dx / h
	s.End.Y -= cut * dy / h
	return seg
}

// twice goes round two times.
func twice(seg toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, _ float64) toolpath.Path {
	return append(seg, seg...)
}

// travel marks one segment as a rapid.
func travel(seg toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, _ float64) toolpath.Path {
	seg[len(seg)/4].Motion = toolpath.Travel
	return seg
}

// kink turns one arc of the chain about its chord so that the directions
// at both its ends change by 1e-6 rad: same ends, half-sweep α + 1e-6,
// radius c/sin α′ for the half-chord c, centre on the same side.
func kink(seg toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, _ float64) toolpath.Path {
	for j := len(seg) / 2; j < len(seg); j++ {
		s := &seg[j]
		if s.Kind != toolpath.Arc {
			continue
		}
		mx, my := (s.Start.X+s.End.X)/2, (s.Start.Y+s.End.Y)/2
		cx, cy := s.End.X-s.Start.X, s.End.Y-s.Start.Y
		half := math.Hypot(cx, cy) / 2
		px, py := -cy/(2*half), cx/(2*half) // unit normal of the chord
		side := 1.0
		if (s.CenterX-mx)*px+(s.CenterY-my)*py < 0 {
			side = -1
		}
		alpha := math.Abs(s.Sweep())/2 + 1e-6
		s.Radius = half / math.Sin(alpha)
		s.CenterX = mx + side*px*half/math.Tan(alpha)
		s.CenterY = my + side*py*half/math.Tan(alpha)
		break
	}
	return seg
}

// endRadius moves the joint after the tightest arc away from that arc's
// centre by min(1e-6·R, tol/10): its end is off its circle (and the next
// arc's start off the next circle) while everything still joins.
func endRadius(seg toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, tol float64) toolpath.Path {
	j := -1
	for i := range seg[:len(seg)-1] {
		if seg[i].Kind == toolpath.Arc && (j < 0 || seg[i].Radius < seg[j].Radius) {
			j = i
		}
	}
	s := &seg[j]
	move := math.Min(1e-6*s.Radius, tol/10)
	rx, ry := s.End.X-s.CenterX, s.End.Y-s.CenterY
	h := math.Hypot(rx, ry)
	s.End.X += move * rx / h
	s.End.Y += move * ry / h
	seg[j+1].Start = s.End
	return seg
}

// open drops the last segment.
func open(seg toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, _ float64) toolpath.Path {
	return seg[:len(seg)-1]
}

// dwell puts a pause in the middle of the contour.
func dwell(seg toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, _ float64) toolpath.Path {
	j := len(seg) / 2
	p := seg[j].Start
	seg = append(seg[:j+1], seg[j:]...)
	seg[j] = toolpath.Segment{Kind: toolpath.Dwell, Motion: toolpath.Cut, Start: p, End: p, Seconds: 0.5}
	return seg
}

// wobble is a band generator whose path zigzags inside the zone: the
// polygon for the outside zone at a quarter of tol, each side cut into 16
// pieces whose inner ends are pushed inward by tol/2. Every point stays in
// [−tol/2, tol/4], but the path no longer turns one way only and is longer
// than the parallel curve at its largest deviation.
func wobble(dst toolpath.Path, c ellipse.Parallel, _ toolpath.Zone, tol float64) (toolpath.Path, error) {
	base, err := Polyline{}.Generate(nil, c, toolpath.Outside, tol/4)
	if err != nil {
		return dst, err
	}
	e := c.Ellipse()
	for _, s := range base {
		prev := s.Start
		for k := 1; k <= 16; k++ {
			u := float64(k) / 16
			q := toolpath.Point{X: s.Start.X + u*(s.End.X-s.Start.X), Y: s.Start.Y + u*(s.End.Y-s.Start.Y)}
			if k == 16 {
				q = s.End
			} else if k%2 == 1 {
				t, _ := e.Nearest(ellipse.Point{X: q.X, Y: q.Y})
				n := e.Normal(t)
				q.X -= tol / 2 * n.X
				q.Y -= tol / 2 * n.Y
			}
			dst = append(dst, toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: prev, End: q})
			prev = q
		}
	}
	return dst, nil
}

var errRefused = errors.New("refused on purpose")

// sentinels lists every sentinel the suite wraps, for the tests.
var sentinels = []error{ErrGenerate, ErrAppend, ErrEmpty, ErrSegment, ErrMotion, ErrOutsideZone, ErrGap,
	ErrNotClosed, ErrWinding, ErrKink, ErrArcRadius, ErrLength, ErrCase}

// testCases is a small spread for the broken generators.
func testCases(t *testing.T) []Case {
	var cases []Case
	for _, c := range DefaultCases() {
		for _, prefix := range []string{"ordinary/on/", "rotated/outward/", "off-centre/inward/", "flat/on/band", "tiny/outward/inside"} {
			if strings.HasPrefix(c.Name, prefix) {
				cases = append(cases, c)
			}
		}
	}
	if len(cases) < 10 {
		t.Fatalf("only %d test cases", len(cases))
	}
	return cases
}

func TestGeneratorCatchesBrokenGenerators(t *testing.T) {
	chain := GeneratorFunc(biarcChain)
	tests := []struct {
		name  string
		gen   Generator
		want  error
		extra []error // other sentinels this fault may also raise
	}{
		{"overshoot by 2% of tol", afterBase(Polyline{}, overshoot), ErrOutsideZone, nil},
		{"gap", afterBase(Polyline{}, gap), ErrGap, nil},
		{"winds twice", afterBase(Polyline{}, twice), ErrWinding, []error{ErrLength}},
		{"travel move", afterBase(Polyline{}, travel), ErrMotion, nil},
		{"open", afterBase(Polyline{}, open), ErrNotClosed, nil},
		{"dwell in the contour", afterBase(Polyline{}, dwell), ErrSegment, nil},
		{"kinked arc join", smooth{afterBase(chain, kink)}, ErrKink, nil},
		{"arc end off its circle", afterBase(chain, endRadius), ErrArcRadius, nil},
		{"ignores dst", GeneratorFunc(func(_ toolpath.Path, c ellipse.Parallel, z toolpath.Zone, tol float64) (toolpath.Path, error) {
			return Polyline{}.Generate(nil, c, z, tol)
		}), ErrAppend, nil},
		{"zone ignored", GeneratorFunc(func(dst toolpath.Path, c ellipse.Parallel, _ toolpath.Zone, tol float64) (toolpath.Path, error) {
			return Polyline{}.Generate(dst, c, toolpath.Band, tol)
		}), ErrOutsideZone, nil},
		{"error on valid input", GeneratorFunc(func(toolpath.Path, ellipse.Parallel, toolpath.Zone, float64) (toolpath.Path, error) {
			return nil, errRefused
		}), ErrGenerate, nil},
		{"empty", GeneratorFunc(func(dst toolpath.Path, _ ellipse.Parallel, _ toolpath.Zone, _ float64) (toolpath.Path, error) {
			return dst, nil
		}), ErrEmpty, nil},
	}
	cases := testCases(t)
	var band []Case
	for _, c := range cases {
		if c.Zone == toolpath.Band && !strings.HasPrefix(c.Name, "flat/") {
			band = append(band, c)
		}
	}
	tests = append(tests, struct {
		name  string
		gen   Generator
		want  error
		extra []error
	}{"wobbles inside the band", GeneratorFunc(wobble), ErrLength, nil})
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			cases := cases
			if tt.want == ErrLength {
				cases = band
			}
			err := TestGenerator(tt.gen, cases...)
			if err == nil {
				t.Fatalf("no misbehaviour found, want %v", tt.want)
			}
			if !errors.Is(err, tt.want) {
				t.Errorf("errors.Is(err, %q) = false; err:\n%v", tt.want, err)
			}
			for _, s := range sentinels {
				if s != tt.want && !slicesContain(tt.extra, s) && errors.Is(err, s) {
					t.Errorf("also reported %q, a false alarm for this fault:\n%v", s, err)
				}
			}
			if tt.want == ErrGenerate && !errors.Is(err, errRefused) {
				t.Errorf("the generator's own error is not wrapped: %v", err)
			}
		})
	}
}

func slicesContain(list []error, e error) bool {
	for _, x := range list {
		if x == e {
			return true
		}
	}
	return false
}
