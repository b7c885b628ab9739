package preview

import (
	"bytes"
	"errors"
	"image/png"
	"math"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

func TestBadOptionsAndPathsAreRefused(t *testing.T) {
	good := square(nil, 0, 0, 10, -1)
	nan := square(nil, 0, 0, 10, -1)
	nan[3].End.Y = math.NaN()
	inf := square(nil, 0, 0, 10, -1)
	inf = append(inf, toolpath.Segment{Kind: toolpath.Arc, Motion: toolpath.Cut, Radius: math.Inf(1)})
	tests := []struct {
		name string
		p    toolpath.Path
		o    Options
		err  error
		msg  string // part of the message that names the field
	}{
		{"width too small", good, Options{Width: 100}, ErrOutOfRange, "Width 100"},
		{"width too large", good, Options{Width: MaxSide + 1}, ErrOutOfRange, "Width 12001"},
		{"negative height", good, Options{Height: -5}, ErrOutOfRange, "Height -5"},
		{"unknown unit", good, Options{Units: "furlong"}, ErrUnits, "furlong"},
		{"negative tool width", good, Options{ToolWidth: -1}, ErrOutOfRange, "ToolWidth -1"},
		{"NaN tool width", good, Options{ToolWidth: math.NaN()}, ErrNotFinite, "ToolWidth NaN"},
		{"zero intended shape", good, Options{Intended: []ellipse.Parallel{{}}}, ErrNotFinite, "Intended[0]"},
		{"empty path", nil, Options{}, ErrEmpty, "no segments"},
		{"NaN coordinate", nan, Options{}, ErrNotFinite, "path[3].End.Y"},
		{"infinite radius", inf, Options{}, ErrNotFinite, "path[7].Radius"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var buf bytes.Buffer
			err := WritePNG(&buf, tt.p, tt.o)
			if !errors.Is(err, tt.err) {
				t.Fatalf("error %v, want %v", err, tt.err)
			}
			var pe *Error
			if !errors.As(err, &pe) {
				t.Errorf("error %T, want *Error", err)
			}
			if !strings.HasPrefix(err.Error(), "preview: ") || !strings.Contains(err.Error(), tt.msg) {
				t.Errorf("message %q, want it to start with \"preview: \" and name %q", err, tt.msg)
			}
			if buf.Len() != 0 {
				t.Errorf("%d bytes written on error, want none", buf.Len())
			}
		})
	}
}

func TestWritePNGAtTheChosenSize(t *testing.T) {
	tests := []struct {
		o    Options
		w, h int
	}{
		{Options{}, DefaultWidth, DefaultHeight},
		{Options{Width: 900, Height: 600}, 900, 600},
		{Options{Width: MinWidth, Height: MinHeight, Units: "inch"}, MinWidth, MinHeight},
	}
	for _, tt := range tests {
		var buf bytes.Buffer
		if err := WritePNG(&buf, square(nil, 0, 0, 4, -0.1), tt.o); err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		if b := img.Bounds(); b.Dx() != tt.w || b.Dy() != tt.h {
			t.Errorf("%+v: picture %dx%d, want %dx%d", tt.o, b.Dx(), b.Dy(), tt.w, tt.h)
		}
	}
}

func TestRoundLength(t *testing.T) {
	tests := []struct{ in, want float64 }{
		{1, 1}, {1.9, 1}, {2, 2}, {4.99, 2}, {5, 5}, {9.9, 5}, {10, 10},
		{73, 50}, {0.034, 0.02}, {0.0051, 0.005}, {260, 200}, {1e6 + 1, 1e6},
	}
	for _, tt := range tests {
		if got := roundLength(tt.in); math.Abs(got-tt.want) > 1e-12*tt.want {
			t.Errorf("roundLength(%v) = %v, want %v", tt.in, got, tt.want)
		}
	}
}

func TestFormatLength(t *testing.T) {
	tests := []struct {
		v, ref float64
		want   string
	}{
		{386, 386, "386"},
		{386.04, 386, "386"},
		{612.75, 612, "612.8"},
		{24.126, 24, "24.13"},
		{0.0626, 2, "0.063"},
		{-20, 380, "-20"},
		{-0.00001, 380, "0"},
		{3029.3, 3029, "3029"},
	}
	for _, tt := range tests {
		if got := formatLength(tt.v, tt.ref); got != tt.want {
			t.Errorf("formatLength(%v, %v) = %q, want %q", tt.v, tt.ref, got, tt.want)
		}
	}
}

func TestChordsStayWithinAQuarterPixel(t *testing.T) {
	for _, r := range []float64{0.5, 3, 10, 100, 700, 5000, 1e5} {
		for _, sweep := range []float64{0.01, 1, math.Pi, -2 * math.Pi} {
			n := chordCount(r, sweep)
			theta := math.Abs(sweep) / float64(n)
			gap := r * (1 - math.Cos(theta/2))
			if n < maxChords && gap > chordError*1.0001 {
				t.Errorf("radius %v px, sweep %v: %d chords stand %.3f px off, want at most %v", r, sweep, n, gap, chordError)
			}
			if n < 1 || n > maxChords {
				t.Errorf("radius %v px, sweep %v: %d chords", r, sweep, n)
			}
		}
	}
}

func TestBucketRunsFromShallowToDeep(t *testing.T) {
	tests := []struct {
		z, lo, hi float64
		want      int
	}{
		{0, -10, 0, 0},
		{-10, -10, 0, depthShades - 1},
		{-5, -10, 0, 6}, // 5.5 rounds to 6
		{-3, -3, -3, depthShades - 1},
		{4, -10, 0, 0},
	}
	for _, tt := range tests {
		if got := bucket(tt.z, tt.lo, tt.hi); got != tt.want {
			t.Errorf("bucket(%v, %v, %v) = %d, want %d", tt.z, tt.lo, tt.hi, got, tt.want)
		}
	}
	for k := 1; k < depthShades; k++ {
		if luma(rgba(shade(k))) >= luma(rgba(shade(k-1))) {
			t.Errorf("shade %d is not darker than shade %d", k, k-1)
		}
	}
}

func TestCoordinatesBeyondTheLimitAreRefused(t *testing.T) {
	p := square(nil, 0, 0, 10, -1)
	p[2].End.X = 2e9
	err := WritePNG(&bytes.Buffer{}, p, Options{})
	if !errors.Is(err, ErrOutOfRange) || !strings.Contains(err.Error(), "path[2].End.X 2e+09") || !strings.Contains(err.Error(), "±1e9") {
		t.Errorf("error %v, want path[2].End.X out of range with the limit", err)
	}
}

func TestFitTextShortensAndCleans(t *testing.T) {
	f := newFaces(1).text
	long := strings.Repeat("walnut ", 60)
	got := fitText(f, long, 300)
	if !strings.HasSuffix(got, "…") || textWidth(f, got) > 300 {
		t.Errorf("fitText of a long title = %q (%.0f px), want at most 300 px ending in an ellipsis", got, textWidth(f, got))
	}
	if got := fitText(f, "oak\nboard\t1", 1000); got != "oak board 1" {
		t.Errorf("fitText with control characters = %q, want %q", got, "oak board 1")
	}
}
