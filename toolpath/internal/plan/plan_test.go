package plan

import (
	"testing"

	"github.com/focitools/foci/toolpath"
)

// builder appends moves to a path, keeping the current point.
type builder struct {
	p   toolpath.Path
	pos toolpath.Point
}

func (b *builder) move(m toolpath.Motion, x, y, z float64) {
	q := toolpath.Point{X: x, Y: y, Z: z}
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Line, Motion: m, Start: b.pos, End: q})
	b.pos = q
}

func (b *builder) rapid(x, y, z float64) { b.move(toolpath.Travel, x, y, z) }
func (b *builder) feed(x, y, z float64)  { b.move(toolpath.Cut, x, y, z) }

func TestClassifyCutTravelHidden(t *testing.T) {
	b := &builder{pos: toolpath.Point{Z: 5}}
	b.rapid(10, 0, 5) // travel in XY
	b.rapid(10, 0, 1) // vertical travel: hidden
	b.feed(10, 0, -2) // plunge: hidden
	b.feed(20, 0, -2) // cut
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Dwell, Motion: toolpath.Cut, Start: b.pos, End: b.pos})
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: b.pos, End: b.pos, CenterX: 15, Radius: 5}) // full circle
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Start: b.pos, End: b.pos})                         // zero radius: hidden
	want := []Class{Travel, Hidden, Hidden, Cut, Hidden, Cut, Hidden}
	got := Classify(nil, b.p)
	if len(got) != len(want) {
		t.Fatalf("%d classes, want %d", len(got), len(want))
	}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("segment %d (%v %v): class %d, want %d", i, b.p[i].Kind, b.p[i].Motion, got[i], want[i])
		}
	}
}

func TestTabsAreRaisedCutsOrRoleTab(t *testing.T) {
	// Each case builds one unbroken run of cuts in XY at the heights
	// given (one unit of X per move) and says which moves are tabs.
	tests := []struct {
		name  string
		zs    []float64
		roles map[int]toolpath.Role
		want  []int // indices of tab moves among the XY moves
	}{
		{"one level", []float64{-5, -5, -5}, nil, nil},
		{"passes going down are not tabs", []float64{-2, -2, -4, -4, -6, -6}, nil, nil},
		{"raised between two deeper moves", []float64{-6, -6, -3, -3, -6}, nil, []int{2, 3}},
		{"raised at the end is not a tab", []float64{-6, -6, -3}, nil, nil},
		{"raised at the start is not a tab", []float64{-3, -6, -6}, nil, nil},
		{"tab in the last of several passes", []float64{-2, -2, -4, -4, -3, -4}, nil, []int{4}},
		{"Role Tab at the bottom", []float64{-6, -6, -6}, map[int]toolpath.Role{1: toolpath.Tab}, []int{1}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := &builder{pos: toolpath.Point{Z: 5}}
			b.feed(0, 0, tt.zs[0])
			var xy []int
			for i, z := range tt.zs {
				if z != b.pos.Z {
					b.feed(b.pos.X, b.pos.Y, z) // vertical step
				}
				b.feed(float64(i+1), 0, z)
				if r, ok := tt.roles[i]; ok {
					b.p[len(b.p)-1].Role = r
				}
				xy = append(xy, len(b.p)-1)
			}
			cls := Classify(nil, b.p)
			want := map[int]bool{}
			for _, k := range tt.want {
				want[k] = true
			}
			for k, i := range xy {
				if got := cls[i] == Tab; got != want[k] {
					t.Errorf("move %d at Z %v: tab %v, want %v", k, tt.zs[k], got, want[k])
				}
			}
		})
	}
}

func TestHolesArePlungesNotFollowedByCutting(t *testing.T) {
	b := &builder{pos: toolpath.Point{Z: 5}}
	// a drilled hole: plunge, retract
	b.rapid(10, 10, 5)
	b.feed(10, 10, -8)
	b.rapid(10, 10, 5)
	// a peck drilled hole: two plunges at one XY count once
	b.rapid(30, 10, 5)
	b.feed(30, 10, -4)
	b.rapid(30, 10, 1)
	b.feed(30, 10, -8)
	b.rapid(30, 10, 5)
	// a plunge that starts a contour is not a hole
	b.rapid(50, 10, 5)
	b.feed(50, 10, -3)
	b.feed(60, 10, -3)
	b.rapid(60, 10, 5)
	// a laser mark: a dwell with the beam on
	b.rapid(70, 10, 0)
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Dwell, Motion: toolpath.Cut, Start: b.pos, End: b.pos, Seconds: 0.2})
	// a dwell while travelling is not a mark
	b.rapid(90, 10, 0)
	b.p = append(b.p, toolpath.Segment{Kind: toolpath.Dwell, Motion: toolpath.Travel, Start: b.pos, End: b.pos, Seconds: 1})
	// a plunge at the very end of the program
	b.rapid(110, 10, 5)
	b.feed(110, 10, -2)
	got := Holes(b.p)
	want := []Point{{10, 10}, {30, 10}, {70, 10}, {110, 10}}
	if len(got) != len(want) {
		t.Fatalf("holes %v, want %v", got, want)
	}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("hole %d at %v, want %v", i, got[i], want[i])
		}
	}
}
