package gcodeout_test

import (
	"bytes"
	"strings"
	"testing"

	"github.com/focitools/foci/gcodeout"
	"pgregory.net/rapid"
)

func TestSanitize(t *testing.T) {
	tests := []struct {
		in   string
		max  int
		want string
	}{
		{"Oval frame", 60, "Oval frame"},
		{"Frame (left)", 60, "Frame [left]"},
		{"a) M5 (b", 60, "a] M5 [b"},
		{"x; G0 Z-50", 60, "x, G0 Z-50"},
		{"line one\nG1 X0\r\nline three", 60, "line one G1 X0 line three"},
		{"  lots   of\t\tspace  ", 60, "lots of space"},
		{"100% done", 60, "100 done"},
		{"bell\x07 and del\x7f", 60, "bell and del"},
		{"Jürgen’s oval", 60, "J?rgen?s oval"},
		{"bad \xff byte", 60, "bad ? byte"},
		{"", 60, ""},
		{"\n\t ", 60, ""},
		{"abcdefghij", 5, "abcde"},
		{"abc defghij", 4, "abc"}, // no trailing space after the cut
		{"abc   d", 5, "abc d"},
	}
	for _, tt := range tests {
		if got := gcodeout.Sanitize(tt.in, tt.max); got != tt.want {
			t.Errorf("Sanitize(%q, %d) = %q, want %q", tt.in, tt.max, got, tt.want)
		}
	}
}

// TestTitleNeverBecomesCode: whatever the title and header strings, the
// program's code lines are exactly those of a program with no header text
// at all, and every header line is one clean comment.
func TestTitleNeverBecomesCode(t *testing.T) {
	cfg, path := goldenConfig(gcodeout.Laser, gcodeout.MM)
	cfg.Header = gcodeout.Header{}
	cfg.Title = ""
	var plain bytes.Buffer
	if err := gcodeout.WritePath(&plain, cfg, path); err != nil {
		t.Fatal(err)
	}
	code := func(s string) string {
		var b strings.Builder
		for _, l := range strings.Split(s, "\n") {
			if !strings.HasPrefix(l, "(") {
				b.WriteString(l + "\n")
			}
		}
		return b.String()
	}
	want := code(plain.String())
	text := rapid.StringOf(rapid.OneOf(rapid.Rune(), rapid.RuneFrom([]rune("()\n\r;%GMXYZ0123456789 -."))))
	rapid.Check(t, func(rt *rapid.T) {
		c := cfg
		c.Title = text.Draw(rt, "title")
		c.Header = gcodeout.Header{
			Shape: text.Draw(rt, "shape"), Tool: text.Draw(rt, "tool"),
			Tolerance: text.Draw(rt, "tolerance"), ZeroZ: text.Draw(rt, "zero"),
			Operations: rapid.SliceOfN(text, 0, 3).Draw(rt, "operations"),
		}
		var out bytes.Buffer
		if err := gcodeout.WritePath(&out, c, path); err != nil {
			rt.Fatal(err)
		}
		if got := code(out.String()); got != want {
			rt.Fatalf("code lines changed by header text:\n%s", got)
		}
		readBack(rt, out.String()) // checks each comment is clean
		for _, l := range strings.Split(out.String(), "\n") {
			if len(l) > 80 {
				rt.Errorf("line longer than 80: %q", l)
			}
		}
	})
}

func TestHeaderContents(t *testing.T) {
	tests := []struct {
		machine gcodeout.Machine
		want    []string
	}{
		{gcodeout.Router, []string{"(program: untitled)", "(machine: router, units: mm", "(Z0: top of the stock", "dry-run", "work zero", "clamping", "guards", "eye", "maker's instructions"}},
		{gcodeout.Laser, []string{"(machine: laser", "(Z0: not used", "dry-run", "work zero", "eyewear", "unattended", "fume extraction", "maker's instructions"}},
		{gcodeout.Plotter, []string{"(machine: plotter", "(Z0: the paper", "dry-run", "work zero", "eye protection", "maker's instructions"}},
	}
	for _, tt := range tests {
		cfg, _ := goldenConfig(tt.machine, gcodeout.MM)
		cfg.Title = "  "
		cfg.Header = gcodeout.Header{}
		var out bytes.Buffer
		if err := gcodeout.WritePath(&out, cfg, nil); err != nil {
			t.Fatal(err)
		}
		for _, s := range tt.want {
			if !strings.Contains(out.String(), s) {
				t.Errorf("%v header lacks %q:\n%s", tt.machine, s, out.String())
			}
		}
		readBack(t, out.String())
	}
}
