package toolpath

import (
	"fmt"
	"strings"
	"testing"
)

// recordTB records what a check reports instead of failing a test.
type recordTB struct{ msgs []string }

type stopCheck struct{}

func (r *recordTB) Helper() {}
func (r *recordTB) Errorf(format string, args ...any) {
	r.msgs = append(r.msgs, fmt.Sprintf(format, args...))
}
func (r *recordTB) Fatalf(format string, args ...any) {
	r.Errorf(format, args...)
	panic(stopCheck{})
}

// run applies check and returns what it reported.
func (r *recordTB) run(check func(opsTB)) []string {
	defer func() {
		if v := recover(); v != nil {
			if _, ok := v.(stopCheck); !ok {
				panic(v)
			}
		}
	}()
	check(r)
	return r.msgs
}

// The profile checks must catch broken paths, each by the promise it
// breaks, and stay quiet on the unbroken one.
func TestProfileChecksCatchBrokenPaths(t *testing.T) {
	e := opsShapes(t)["tray"]
	spec := ProfileSpec{Setup: Setup{Machine: Router, Tol: 0.1, SafeZ: 5}, Ellipse: e,
		Tool: 6, Depth: 12, StepDown: 4, Tabs: 4, TabWidth: 8, TabHeight: 5}
	good, err := Profile(nil, spec)
	if err != nil {
		t.Fatal(err)
	}
	find := func(p Path, ok func(Segment) bool) int {
		for i, g := range p {
			if ok(g) {
				return i
			}
		}
		t.Fatalf("no segment to break")
		return -1
	}
	finalContour := func(g Segment) bool {
		return g.Role == Contour && g.Start.Z == -12 && g.End.Z == -12 && movesXY(g)
	}
	cases := []struct {
		name   string
		spec   func(*ProfileSpec)
		mutate func(p Path)
		want   string
	}{
		{"unbroken", nil, nil, ""},
		{"gap", nil, func(p Path) {
			i := find(p, finalContour)
			p[i].Start.X += 1e-3
		}, "starts at"},
		{"into the part", nil, func(p Path) {
			i := find(p, finalContour)
			// Pull the end of a contour line (and the start of the next)
			// inward by the tool radius.
			tt := footParam(e, p[i].End)
			n := e.Normal(tt)
			p[i].End.X -= 3 * n.X
			p[i].End.Y -= 3 * n.Y
			p[i+1].Start = p[i].End
		}, "inside the tool radius"},
		{"tab too low", nil, func(p Path) {
			i := find(p, func(g Segment) bool { return g.Role == Tab && movesXY(g) })
			p[i].Start.Z -= 0.5
			p[i].End.Z -= 0.5
			p[i-1].End.Z -= 0.5
			p[i+1].Start.Z -= 0.5
		}, "tab segment"},
		{"low travel", nil, func(p Path) {
			p[0].End.Z = 1
			p[1].Start.Z = 1
		}, "travel height"},
		{"backwards", nil, func(p Path) {
			i := find(p, finalContour)
			p[i].Start, p[i].End = p[i].End, p[i].Start
		}, "wrong way"},
		{"stretch left uncut", nil, func(p Path) {
			i := find(p, finalContour)
			p[i].Role = Link
		}, "cover"},
		{"passes deeper than asked", func(s *ProfileSpec) { s.StepDown = 3.5 }, nil, "levels"},
		{"tabs narrower than asked", func(s *ProfileSpec) { s.TabWidth = 6 }, nil, "TabWidth + Tool"},
		{"lead the long way round", nil, func(p Path) {
			i := find(p, func(g Segment) bool { return g.Role == LeadIn })
			p[i].Clockwise = !p[i].Clockwise
		}, "quarter turn"},
		{"no retract", nil, func(p Path) {
			p[len(p)-1].End.Z = 2
		}, "ends with"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := append(Path(nil), good...)
			s := spec
			if c.spec != nil {
				c.spec(&s)
			}
			if c.mutate != nil {
				c.mutate(p)
			}
			msgs := new(recordTB).run(func(tb opsTB) { checkProfile(tb, s, p) })
			if c.want == "" {
				if len(msgs) > 0 {
					t.Errorf("false alarm on the unbroken path: %q", msgs)
				}
				return
			}
			for _, m := range msgs {
				if strings.Contains(m, c.want) {
					return
				}
			}
			t.Errorf("no report containing %q; got %q", c.want, msgs)
		})
	}
}
