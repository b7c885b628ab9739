package main

import (
	"bytes"
	"encoding/xml"
	"image"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// pvRun runs one command line with stdin and returns the exit status and
// what was printed.
func pvRun(t *testing.T, stdin string, args ...string) (int, string, string) {
	t.Helper()
	var out, errOut bytes.Buffer
	code := run(&env{stdin: strings.NewReader(stdin), stdout: &out, stderr: &errOut}, args)
	return code, out.String(), errOut.String()
}

// pvCoasterProgram is a router program of our own: a coaster of radius
// 40 mm cut in two passes as full circles, then a centre mark.
const pvCoasterProgram = `(coaster)
G21 G17 G90 G94
M3 S16000
G0 Z5
G0 X40 Y0
G1 Z-2 F300
G3 X40 Y0 I-40 J0 F1200
G1 Z-4 F300
G3 X40 Y0 I-40 J0 F1200
G0 Z5
G0 X0 Y0
G1 Z-1 F300
G0 Z5
M5
M30
`

// pvDecode reads a PNG file.
func pvDecode(t *testing.T, name string) image.Image {
	t.Helper()
	f, err := os.Open(name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return img
}

// pvDarkPixels counts pixels darker than mid grey.
func pvDarkPixels(img image.Image) int {
	n := 0
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bb, _ := img.At(x, y).RGBA()
			if (299*r+587*g+114*bb)/1000 < 0x8000 {
				n++
			}
		}
	}
	return n
}

func TestPreviewDrawsAProgram(t *testing.T) {
	dir := t.TempDir()
	prog := filepath.Join(dir, "coaster.nc")
	if err := os.WriteFile(prog, []byte(pvCoasterProgram), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name  string
		stdin string
		args  []string
		w, h  int
	}{
		{"file first", "", []string{"preview", prog, "-o", "OUT"}, 1600, 1000},
		{"file last", "", []string{"preview", "-o", "OUT", "-width", "900", "-height", "700", prog}, 900, 700},
		{"standard input", pvCoasterProgram, []string{"preview", "-", "-o", "OUT", "-tool", "6", "-title", "Coaster"}, 1600, 1000},
		{"with the intended shape", "", []string{"preview", prog, "-o", "OUT", "-size", "80x80", "-offset", "0"}, 1600, 1000},
	}
	for i, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out := filepath.Join(dir, "p"+string(rune('a'+i))+".png")
			args := append([]string(nil), tt.args...)
			for k := range args {
				if args[k] == "OUT" {
					args[k] = out
				}
			}
			code, stdout, stderr := pvRun(t, tt.stdin, args...)
			if code != 0 {
				t.Fatalf("exit %d, stderr %q", code, stderr)
			}
			if stdout != "" {
				t.Errorf("stdout %q, want nothing", stdout)
			}
			img := pvDecode(t, out)
			if b := img.Bounds(); b.Dx() != tt.w || b.Dy() != tt.h {
				t.Errorf("picture %dx%d, want %dx%d", b.Dx(), b.Dy(), tt.w, tt.h)
			}
			if n := pvDarkPixels(img); n < 2000 {
				t.Errorf("%d dark pixels, want the circle, text and legend", n)
			}
		})
	}
}

func TestPreviewRefusesBadInput(t *testing.T) {
	dir := t.TempDir()
	prog := filepath.Join(dir, "coaster.nc")
	empty := filepath.Join(dir, "empty.nc")
	os.WriteFile(prog, []byte(pvCoasterProgram), 0o644)
	os.WriteFile(empty, []byte("(nothing but a comment)\nG21\nM30\n"), 0o644)
	out := filepath.Join(dir, "out.png")
	tests := []struct {
		name string
		args []string
		msg  string
	}{
		{"no output", []string{prog}, "-o: is required"},
		{"no program", []string{"-o", out}, "program to draw is missing"},
		{"two programs", []string{prog, "-o", out, prog}, "unexpected argument"},
		{"narrow", []string{prog, "-o", out, "-width", "10"}, "-width: 10 pixels is out of range; use 480 to 12000"},
		{"huge", []string{prog, "-o", out, "-height", "99999"}, "-height: 99999 pixels is out of range"},
		{"negative tool", []string{prog, "-o", out, "-tool", "-3"}, "-tool: -3 must be"},
		{"offset without shape", []string{prog, "-o", out, "-offset", "2"}, "-offset: does not apply without -size"},
		{"units without shape", []string{prog, "-o", out, "-units", "inch"}, "-units: does not apply without -size"},
		{"bad shape", []string{prog, "-o", out, "-size", "80x0"}, "-size:"},
		{"offset past the fold", []string{prog, "-o", out, "-size", "80x40", "-offset", "-30"}, "-offset:"},
		{"missing file", []string{filepath.Join(dir, "nope.nc"), "-o", out}, "cannot read"},
		{"nothing to draw", []string{empty, "-o", out}, "empty.nc has no moves to draw"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, _, stderr := pvRun(t, "", append([]string{"preview"}, tt.args...)...)
			if code != 2 {
				t.Errorf("exit %d, want 2", code)
			}
			if !strings.Contains(stderr, tt.msg) {
				t.Errorf("stderr %q, want it to contain %q", stderr, tt.msg)
			}
			if _, err := os.Stat(out); err == nil {
				t.Errorf("%s was written", out)
			}
			left, _ := filepath.Glob(filepath.Join(dir, ".*.tmp"))
			if len(left) > 0 {
				t.Errorf("temporary files left: %v", left)
			}
		})
	}
}

func TestPreviewListsReadingProblemsAndStillDraws(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "out.png")
	src := strings.Replace(pvCoasterProgram, "G0 X0 Y0\n", "G0 X0 Y0\nG81 Z-1 R2\nQ\n", 1)
	code, _, stderr := pvRun(t, src, "preview", "-", "-o", out)
	if code != 0 {
		t.Fatalf("exit %d, stderr %q", code, stderr)
	}
	if !strings.Contains(stderr, "standard input:12:") || !strings.Contains(stderr, "standard input:13:") {
		t.Errorf("stderr %q, want the problems on lines 12 and 13", stderr)
	}
	pvDecode(t, out)
}

// pvLaserProgram switches the beam off between two cuts and moves with G1
// meanwhile.
const pvLaserProgram = `G21 G90
G0 X0 Y0
M3 S800
G1 X10 Y0 F600
M5
G1 X20 Y0
M3
G1 X30 Y0
M5
M2
`

func TestFeedMovesWithTheBeamOffAreDrawnAsTravel(t *testing.T) {
	prog, err := conformance.Read([]byte(pvLaserProgram), conformance.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	p := drawnPath(prog)
	var got []toolpath.Motion
	for _, s := range p {
		if s.Kind == toolpath.Line && s.End.X != s.Start.X {
			got = append(got, s.Motion)
		}
	}
	want := []toolpath.Motion{toolpath.Cut, toolpath.Travel, toolpath.Cut}
	if len(got) != len(want) {
		t.Fatalf("moves %v, want %v", got, want)
	}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("move %d: motion %v, want %v", i, got[i], want[i])
		}
	}
	// A program that never switches anything keeps its feed moves as cuts.
	prog, _ = conformance.Read([]byte("G21 G90\nG0 X0 Y0 Z1\nG1 Z0 F500\nG1 X10\nM2\n"), conformance.ReadOptions{})
	for _, s := range drawnPath(prog) {
		if s.End.X == 10 && s.Motion != toolpath.Cut {
			t.Errorf("pen move drawn as %v, want a cut", s.Motion)
		}
	}
}

func TestWritePicturesWritesBothOrNeither(t *testing.T) {
	dir := t.TempDir()
	el, err := ellipse.FromSize(120, 80, ellipse.Point{}, 0)
	if err != nil {
		t.Fatal(err)
	}
	prog, err := conformance.Read([]byte(pvCoasterProgram), conformance.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	e := &env{stdin: strings.NewReader(""), stdout: &bytes.Buffer{}, stderr: &bytes.Buffer{}}
	pngPath, svgPath := filepath.Join(dir, "a.png"), filepath.Join(dir, "a.svg")
	opts := pictureOptions{title: "Coaster", units: unitsMM, toolWidth: 6, intended: []ellipse.Parallel{el.Curve()}}
	if err := writePictures(e, pngPath, svgPath, prog.Path, opts); err != nil {
		t.Fatal(err)
	}
	pvDecode(t, pngPath)
	data, err := os.ReadFile(svgPath)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Width  string `xml:"width,attr"`
		Groups []struct {
			ID string `xml:"id,attr"`
		} `xml:"g"`
	}
	if err := xml.Unmarshal(data, &doc); err != nil {
		t.Fatalf("SVG: %v", err)
	}
	if !strings.HasSuffix(doc.Width, "mm") || len(doc.Groups) != 3 {
		t.Errorf("SVG width %q and %d groups, want mm and travel, cut, marks", doc.Width, len(doc.Groups))
	}
	// A bad size writes neither file.
	os.Remove(pngPath)
	os.Remove(svgPath)
	opts.width = 5
	err = writePictures(e, pngPath, svgPath, prog.Path, opts)
	if err == nil || !strings.Contains(err.Error(), "-width: 5 pixels") {
		t.Errorf("error %v, want one naming -width", err)
	}
	for _, f := range []string{pngPath, svgPath} {
		if _, err := os.Stat(f); err == nil {
			t.Errorf("%s written despite the error", f)
		}
	}
	// Only an SVG when only -svg is given.
	opts.width = 0
	if err := writePictures(e, "", svgPath, prog.Path, opts); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(pngPath); err == nil {
		t.Errorf("PNG written without a name")
	}
}
