package svg

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/toolpath"
)

// line and arc build segments for the tests.
func line(m toolpath.Motion, x0, y0, z0, x1, y1, z1 float64) toolpath.Segment {
	return toolpath.Segment{Kind: toolpath.Line, Motion: m, Start: toolpath.Point{X: x0, Y: y0, Z: z0}, End: toolpath.Point{X: x1, Y: y1, Z: z1}}
}

// arc is a cutting arc about (cx, cy) of radius r from angle a0 through
// sweep radians (positive counter-clockwise) at height z.
func arc(cx, cy, r, a0, sweep, z float64) toolpath.Segment {
	a1 := a0 + sweep
	return toolpath.Segment{
		Kind: toolpath.Arc, Motion: toolpath.Cut,
		Start:   toolpath.Point{X: cx + r*math.Cos(a0), Y: cy + r*math.Sin(a0), Z: z},
		End:     toolpath.Point{X: cx + r*math.Cos(a1), Y: cy + r*math.Sin(a1), Z: z},
		CenterX: cx, CenterY: cy, Radius: r, Clockwise: sweep < 0,
	}
}

// joined sets each segment's start to the previous one's end where they
// are meant to chain (within 1e-9), so that chains stay unbroken.
func joined(p toolpath.Path) toolpath.Path {
	for i := 1; i < len(p); i++ {
		a, b := p[i-1].End, p[i].Start
		if math.Abs(a.X-b.X) < 1e-9 && math.Abs(a.Y-b.Y) < 1e-9 {
			p[i].Start = a
		}
	}
	return p
}

// fixture is a scene of our own: a name plate 120 × 60 with round corners
// of radius 8 (quarter arcs), a full-circle window of radius 12, a long
// clockwise arc of 300° and a short one of 1°, reached by travel, with a
// plunge, a dwell, a move that rounds to nothing and a drilled hole.
func fixture() toolpath.Path {
	const z = -1.5
	p := toolpath.Path{
		line(toolpath.Travel, 0, 0, 5, 8, 0, 5),
		line(toolpath.Cut, 8, 0, 5, 8, 0, z), // plunge: not drawn
		line(toolpath.Cut, 8, 0, z, 112, 0, z),
		arc(112, 8, 8, -math.Pi/2, math.Pi/2, z),
		line(toolpath.Cut, 120, 8, z, 120, 52, z),
		arc(112, 52, 8, 0, math.Pi/2, z),
		line(toolpath.Cut, 112, 60, z, 8, 60, z),
		arc(8, 52, 8, math.Pi/2, math.Pi/2, z),
		line(toolpath.Cut, 0, 52, z, 0, 8, z),
		arc(8, 8, 8, math.Pi, math.Pi/2, z),
		line(toolpath.Cut, 8, 0, z, 8+1e-9, 0, z), // rounds to nothing
		line(toolpath.Travel, 8, 0, z, 8, 0, 5),
		line(toolpath.Travel, 8, 0, 5, 72, 30, 5),
		line(toolpath.Cut, 72, 30, 5, 72, 30, z),
		arc(60, 30, 12, 0, 2*math.Pi, z), // full circle
		line(toolpath.Travel, 72, 30, z, 40, 30, 5),
		arc(30, 30, 10, 0, -300*math.Pi/180, z), // long, clockwise
		arc(30, 30, 10, -300*math.Pi/180, -math.Pi/180, z),
		line(toolpath.Travel, 0, 0, 5, 100, 30, 5),
		line(toolpath.Cut, 100, 30, 5, 100, 30, -4), // a drilled hole
		line(toolpath.Travel, 100, 30, -4, 100, 30, 5),
		{Kind: toolpath.Dwell, Motion: toolpath.Travel, Start: toolpath.Point{X: 100, Y: 30, Z: 5}, End: toolpath.Point{X: 100, Y: 30, Z: 5}, Seconds: 1},
	}
	return joined(p)
}

// parse reads a document written by Write.
func parse(t *testing.T, b []byte) docXML {
	t.Helper()
	var doc docXML
	if err := xml.Unmarshal(b, &doc); err != nil {
		t.Fatalf("not well-formed XML: %v\n%s", err, b)
	}
	return doc
}

// group returns the group with the id, failing when it is missing.
func group(t *testing.T, doc docXML, id string) groupXML {
	t.Helper()
	for _, g := range doc.Groups {
		if g.ID == id {
			return g
		}
	}
	t.Fatalf("no group %q", id)
	return groupXML{}
}

func TestDocumentHasRealSizeGroupsAndTitle(t *testing.T) {
	p := fixture()
	tests := []struct {
		units, unit string
		margin      float64
	}{
		{"", "mm", 0},
		{"mm", "mm", 5},
		{"inch", "in", 0.25},
	}
	for _, tt := range tests {
		var buf bytes.Buffer
		if err := Write(&buf, p, Options{Units: tt.units, Margin: tt.margin, Title: `Plate <oak> & "co"`}); err != nil {
			t.Fatal(err)
		}
		doc := parse(t, buf.Bytes())
		if doc.Title != `Plate <oak> & "co"` {
			t.Errorf("title %q read back, want the original", doc.Title)
		}
		w, okW := strings.CutSuffix(doc.Width, tt.unit)
		h, okH := strings.CutSuffix(doc.Height, tt.unit)
		if !okW || !okH {
			t.Fatalf("size %q × %q, want unit %q", doc.Width, doc.Height, tt.unit)
		}
		vb := strings.Fields(doc.ViewBox)
		if len(vb) != 4 || vb[2] != w || vb[3] != h {
			t.Errorf("viewBox %q, want width and height %s %s in the same units", doc.ViewBox, w, h)
		}
		// The plate spans 0..120 × 0..60 (the travel from 0,0 included);
		// the hairline adds 0.05 mm a side.
		hair := 0.1
		if tt.unit == "in" {
			hair = 0.1 / 25.4
		}
		wantW := 120 + 2*tt.margin + hair
		if got, _ := strconv.ParseFloat(w, 64); math.Abs(got-wantW) > 1e-4 {
			t.Errorf("width %v, want %v", got, wantW)
		}
		// y negated: the top of the box is -(60 + edge)
		if got, _ := strconv.ParseFloat(vb[1], 64); math.Abs(got-(-60-tt.margin-hair/2)) > 1e-4 {
			t.Errorf("viewBox top %v, want %v", got, -60-tt.margin-hair/2)
		}
		ids := []string{}
		for _, g := range doc.Groups {
			ids = append(ids, g.ID)
		}
		if strings.Join(ids, ",") != "travel,cut,marks" {
			t.Errorf("groups %v, want travel, cut, marks", ids)
		}
		marks := group(t, doc, "marks")
		if len(marks.Circles) != 1 || marks.Circles[0].CX != 100 || marks.Circles[0].CY != -30 {
			t.Errorf("marks %+v, want one circle at (100, -30)", marks.Circles)
		}
	}
}

func TestArcDirectionAndPieces(t *testing.T) {
	tests := []struct {
		name string
		s    toolpath.Segment
		want string // the path data
	}{
		{"counter-clockwise quarter", arc(0, 0, 10, 0, math.Pi/2, -1), "M 10 0\nA 10 10 0 0 0 0 -10"},
		{"clockwise quarter", arc(0, 0, 10, 0, -math.Pi/2, -1), "M 10 0\nA 10 10 0 0 1 0 10"},
		{"half turn in two", arc(0, 0, 10, 0, math.Pi, -1), "M 10 0\nA 10 10 0 0 0 0 -10\nA 10 10 0 0 0 -10 0"},
		{"full circle in four", func() toolpath.Segment { s := arc(5, 5, 5, 0, 2*math.Pi, -1); s.End = s.Start; return s }(),
			"M 10 -5\nA 5 5 0 0 0 5 -10\nA 5 5 0 0 0 0 -5\nA 5 5 0 0 0 5 0\nA 5 5 0 0 0 10 -5"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var buf bytes.Buffer
			if err := Write(&buf, toolpath.Path{tt.s}, Options{}); err != nil {
				t.Fatal(err)
			}
			cut := group(t, parse(t, buf.Bytes()), "cut")
			if len(cut.Paths) != 1 || cut.Paths[0].D != tt.want {
				t.Errorf("path data %q, want %q", cut.Paths, tt.want)
			}
		})
	}
}

func TestTabsAreTheirOwnPaths(t *testing.T) {
	const z = -6
	p := joined(toolpath.Path{
		line(toolpath.Cut, 0, 0, z, 40, 0, z),
		line(toolpath.Cut, 40, 0, z, 40, 0, -3),
		line(toolpath.Cut, 40, 0, -3, 50, 0, -3), // over the tab
		line(toolpath.Cut, 50, 0, -3, 50, 0, z),
		line(toolpath.Cut, 50, 0, z, 90, 0, z),
	})
	var buf bytes.Buffer
	if err := Write(&buf, p, Options{}); err != nil {
		t.Fatal(err)
	}
	cut := group(t, parse(t, buf.Bytes()), "cut")
	want := []pathXML{{"", "M 0 0\nL 40 0"}, {"tab", "M 40 0\nL 50 0"}, {"", "M 50 0\nL 90 0"}}
	if len(cut.Paths) != len(want) {
		t.Fatalf("paths %q, want %q", cut.Paths, want)
	}
	for i := range want {
		if cut.Paths[i] != want[i] {
			t.Errorf("path %d is %q, want %q", i, cut.Paths[i], want[i])
		}
	}
}

func TestBadInputIsRefusedBeforeWriting(t *testing.T) {
	good := fixture()
	nan := fixture()
	nan[4].End.X = math.NaN()
	tests := []struct {
		name string
		p    toolpath.Path
		o    Options
		err  error
		msg  string
	}{
		{"unknown unit", good, Options{Units: "cubit"}, ErrUnits, "cubit"},
		{"too many decimals", good, Options{Decimals: 12}, ErrOutOfRange, "Decimals 12"},
		{"negative decimals", good, Options{Decimals: -1}, ErrOutOfRange, "Decimals -1"},
		{"negative margin", good, Options{Margin: -1}, ErrOutOfRange, "Margin -1"},
		{"infinite tool width", good, Options{ToolWidth: math.Inf(1)}, ErrNotFinite, "ToolWidth +Inf"},
		{"negative hole radius", good, Options{HoleRadius: -2}, ErrOutOfRange, "HoleRadius -2"},
		{"NaN coordinate", nan, Options{}, ErrNotFinite, "path[4].End.X"},
		{"empty path", nil, Options{}, ErrEmpty, "nothing"},
		{"no move in XY", toolpath.Path{line(toolpath.Travel, 1, 1, 5, 1, 1, 0)}, Options{}, ErrEmpty, "nothing"},
		{"only travel, skipped", toolpath.Path{line(toolpath.Travel, 0, 0, 5, 10, 0, 5)}, Options{SkipTravel: true}, ErrEmpty, "nothing"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var buf bytes.Buffer
			err := Write(&buf, tt.p, tt.o)
			if !errors.Is(err, tt.err) || !strings.HasPrefix(err.Error(), "svg: ") || !strings.Contains(err.Error(), tt.msg) {
				t.Errorf("error %v, want %v naming %q", err, tt.err, tt.msg)
			}
			if buf.Len() != 0 {
				t.Errorf("%d bytes written on error", buf.Len())
			}
		})
	}
}

// failingWriter fails after n bytes.
type failingWriter struct{ n int }

var errDiskFull = errors.New("disk full")

func (f *failingWriter) Write(p []byte) (int, error) {
	if len(p) > f.n {
		n := f.n
		f.n = 0
		return n, errDiskFull
	}
	f.n -= len(p)
	return len(p), nil
}

func TestWriterErrorsAreReturned(t *testing.T) {
	if err := Write(&failingWriter{n: 100}, fixture(), Options{}); !errors.Is(err, errDiskFull) {
		t.Errorf("error %v, want the writer's", err)
	}
	if err := Write(io.Discard, fixture(), Options{}); err != nil {
		t.Errorf("error %v writing to io.Discard", err)
	}
}
