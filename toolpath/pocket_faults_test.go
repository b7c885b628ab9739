package toolpath_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/toolpath"
)

// pocketRecorder collects what the checks report, so that a test can
// feed them broken paths and see them complain.
type pocketRecorder struct{ msgs []string }

type pocketStop struct{}

func (r *pocketRecorder) Helper() {}
func (r *pocketRecorder) Errorf(format string, args ...any) {
	r.msgs = append(r.msgs, fmt.Sprintf(format, args...))
}
func (r *pocketRecorder) Fatalf(format string, args ...any) {
	r.msgs = append(r.msgs, fmt.Sprintf(format, args...))
	panic(pocketStop{})
}

// run applies the checks, stopping quietly at a Fatalf.
func (r *pocketRecorder) run(check func(pocketTB)) []string {
	defer func() {
		if v := recover(); v != nil {
			if _, ok := v.(pocketStop); !ok {
				panic(v)
			}
		}
	}()
	check(r)
	return r.msgs
}

// The pocket checks raise no alarm on a sound path and catch each fault
// put into it: a ring left out, a ring pushed into the wall, a straight
// plunge, a level cut too deep, a travel at depth, a wall pass run the
// wrong way, a gap in the path.
func TestPocketChecksCatchBrokenPaths(t *testing.T) {
	e := pocketShapes[2].ellipse(t)
	s := toolpath.PocketSpec{
		Setup:   toolpath.Setup{Machine: toolpath.Router, Tol: 0.05, Geometry: toolpath.Lines, SafeZ: 5},
		Ellipse: e, Tool: 6, Depth: 8, StepDown: 4, StepOver: 5, Allowance: 0.3,
	}
	plan, err := toolpath.PlanPocket(s)
	if err != nil {
		t.Fatal(err)
	}
	// Without one ring its neighbours leave a strip 2·Spacing + Tol − Tool
	// wide.
	if strip := 2*plan.Spacing + s.Tol - s.Tool; strip < 1 {
		t.Fatalf("rings %g apart: leaving one out would leave only %g", plan.Spacing, strip)
	}
	good, err := toolpath.Pocket(nil, s)
	if err != nil {
		t.Fatal(err)
	}
	if msgs := new(pocketRecorder).run(func(tb pocketTB) { checkPocket(tb, s, good, 3000) }); len(msgs) > 0 {
		t.Fatalf("false alarm on a sound pocket: %v", msgs)
	}
	// The rings of the last level: the runs of Contour moves at −Depth
	// between links.
	var runs [][2]int
	for i := 0; i < len(good); i++ {
		if good[i].Role != toolpath.Contour || good[i].End.Z != -s.Depth || good[i].Start.Z != -s.Depth {
			continue
		}
		j := i
		for j < len(good) && good[j].Role == toolpath.Contour {
			j++
		}
		runs = append(runs, [2]int{i, j})
		i = j
	}
	if len(runs) < 4 {
		t.Fatalf("the last level has %d runs, want the spine, rings and the wall", len(runs))
	}
	mid := runs[len(runs)/2]
	flatten := func(p toolpath.Path, from, to int) {
		// Replace the moves by one straight move from the first start to
		// the last end, keeping the path continuous.
		p[from].End = p[to-1].End
		p[from].Kind = toolpath.Line
		for i := from + 1; i < to; i++ {
			p[i] = toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Start: p[from].End, End: p[from].End}
		}
	}
	faults := []struct {
		name  string
		spoil func(p toolpath.Path) toolpath.Path
		want  string
	}{
		{"a ring of the last level left out", func(p toolpath.Path) toolpath.Path {
			flatten(p, mid[0], mid[1])
			return p
		}, "pocket floor"},
		{"the wall pass 0.05 nearer the wall", func(p toolpath.Path) toolpath.Path {
			ctr := e.Center()
			push := func(q *toolpath.Point) {
				d := math.Hypot(q.X-ctr.X, q.Y-ctr.Y)
				q.X += 0.05 * (q.X - ctr.X) / d
				q.Y += 0.05 * (q.Y - ctr.Y) / d
			}
			w := toolpath.PocketWall(p) // lines only: Geometry is Lines
			for i := range w {
				push(&w[i].End)
				if i == 0 {
					push(&w[i].Start)
				} else {
					w[i].Start = w[i-1].End
				}
			}
			return p
		}, "gouge"},
		{"a straight plunge", func(p toolpath.Path) toolpath.Path {
			// The first ramp leg becomes a drop in place and a level move.
			for i := range p {
				if p[i].Role == toolpath.Ramp {
					a := p[i]
					drop := toolpath.Segment{Kind: toolpath.Line, Motion: toolpath.Cut, Role: toolpath.Plunge, Start: a.Start, End: toolpath.Point{X: a.Start.X, Y: a.Start.Y, Z: a.End.Z}}
					a.Start = drop.End
					a.Role = toolpath.Contour
					p[i] = a
					return append(p[:i], append(toolpath.Path{drop}, p[i:]...)...)
				}
			}
			return p
		}, "steeper than the ramp angle"},
		{"the last level 0.1 too deep", func(p toolpath.Path) toolpath.Path {
			for i := range p {
				for _, q := range []*toolpath.Point{&p[i].Start, &p[i].End} {
					if q.Z == -s.Depth {
						q.Z = -s.Depth - 0.1
					}
				}
			}
			return p
		}, "lowest Z"},
		{"a travel at depth", func(p toolpath.Path) toolpath.Path {
			p[mid[0]-1].Motion = toolpath.Travel
			return p
		}, "travel inside the program"},
		{"the wall pass reversed", func(p toolpath.Path) toolpath.Path {
			w := toolpath.PocketWall(p)
			for i, j := 0, len(w)-1; i < j; i, j = i+1, j-1 {
				w[i], w[j] = w[j], w[i]
			}
			for i := range w {
				w[i].Start, w[i].End = w[i].End, w[i].Start
				w[i].Clockwise = !w[i].Clockwise
			}
			return p
		}, "signed area"},
		{"a gap", func(p toolpath.Path) toolpath.Path {
			p[mid[0]+1].Start.X += 0.5
			return p
		}, "starts at"},
	}
	for _, f := range faults {
		p := f.spoil(append(toolpath.Path(nil), good...))
		msgs := new(pocketRecorder).run(func(tb pocketTB) { checkPocket(tb, s, p, 3000) })
		found := false
		for _, m := range msgs {
			found = found || strings.Contains(m, f.want)
		}
		if !found {
			t.Errorf("%s: the checks did not report %q; they said %v", f.name, f.want, msgs)
		}
	}
}
