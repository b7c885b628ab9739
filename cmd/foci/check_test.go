package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// ckRun runs "foci check" with args and stdin, returning the exit status,
// standard output and standard error.
func ckRun(t *testing.T, stdin string, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(&env{stdin: strings.NewReader(stdin), stdout: &out, stderr: &errb}, append([]string{"check"}, args...))
	return code, out.String(), errb.String()
}

// ckWrite writes a program into a temporary directory.
func ckWrite(t *testing.T, name, src string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// A circle of radius 20 about the origin, cut 1 mm deep in two arcs: a
// small program of our own that keeps every rule.
const ckSound = `(ring 40 mm across)
G21 G90 G17 G94
G0 Z5
M3 S16000
G0 X20 Y0
G1 Z-1 F200
G3 X-20 Y0 I-20 J0 F800
G3 X20 Y0 I20 J0
G0 Z5
M5
M30
`

// The same ring with three faults: a rapid dragged through the stock
// (line 8), an arc whose end radius is 0.01 mm off (line 9), and no end.
const ckBroken = `G21 G90 G17 G94
G0 Z5
M3 S16000
G0 X20 Y0
G1 Z-1 F200
G3 X-20 Y0 I-20 J0 F800
G3 X20 Y0 I20 J0
G0 X0 Y20
G2 X20.01 Y0 I0 J-20
G0 Z5
M5
`

func TestCheckSoundProgram(t *testing.T) {
	file := ckWrite(t, "ring.nc", ckSound)
	for _, args := range [][]string{
		{file},
		{file, "-machine", "router", "-safe-z", "5"},
		{"-machine", "router", file, "-travel", "-30,-30,30,30,-5,10"},
		{file, "-size", "40x40", "-tol", "0.01"},
		{file, "-size", "40x40", "-zone", "inside", "-tol", "0.01"},
	} {
		code, out, errs := ckRun(t, "", args...)
		if code != 0 || !strings.Contains(out, "ok: every rule holds") || errs != "" {
			t.Errorf("check %v: exit %d, out %q, err %q", args, code, out, errs)
		}
	}
	// Standard input.
	if code, out, _ := ckRun(t, ckSound, "-"); code != 0 || !strings.Contains(out, "-: router program, 6 segments") {
		t.Errorf("check -: exit %d, out %q", code, out)
	}
}

func TestCheckReportsEveryViolation(t *testing.T) {
	file := ckWrite(t, "ring.nc", ckBroken)
	code, out, errs := ckRun(t, "", file)
	if code != 1 || errs != "" {
		t.Fatalf("exit %d (want 1), err %q", code, errs)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	want := []string{"8: rapid-below-safe: ", "9: arc-radius-mismatch: ", "11: program-end: "}
	if len(lines) != len(want)+2 {
		t.Fatalf("output:\n%s\nwant %d violation lines and a summary", out, len(want))
	}
	for i, w := range want {
		if !strings.HasPrefix(lines[i], w) {
			t.Errorf("line %d: %q, want it to start with %q", i+1, lines[i], w)
		}
	}
	if lines[len(lines)-1] != "3 violations" {
		t.Errorf("last line %q, want \"3 violations\"", lines[len(lines)-1])
	}
}

func TestCheckJSON(t *testing.T) {
	file := ckWrite(t, "ring.nc", ckBroken)
	code, out, _ := ckRun(t, "", file, "-json")
	if code != 1 {
		t.Fatalf("exit %d, want 1", code)
	}
	type report struct {
		OK         bool `json:"ok"`
		Violations []struct {
			Rule    string `json:"rule"`
			Line    int    `json:"line"`
			Message string `json:"message"`
		} `json:"violations"`
		MaxDeviation *float64 `json:"max_deviation"`
		Counts       struct {
			Segments, Cut, Travel, Arcs, Lines, Dwells int
		} `json:"counts"`
		Units string `json:"units"`
	}
	var r report
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("%v in %s", err, out)
	}
	if r.OK || len(r.Violations) != 3 || r.Violations[1].Rule != "arc-radius-mismatch" || r.Violations[1].Line != 9 || r.Violations[1].Message == "" {
		t.Errorf("report %+v", r)
	}
	if c := r.Counts; c.Segments != 8 || c.Cut != 4 || c.Travel != 4 || c.Arcs != 3 || c.Lines != 5 || c.Dwells != 0 || r.Units != "mm" || r.MaxDeviation != nil {
		t.Errorf("counts %+v units %q max_deviation %v (want null without a shape)", c, r.Units, r.MaxDeviation)
	}
	// The sound ring, radius 20, against a circle of radius 20.02: it lies
	// 0.02 mm inside it all the way round.
	file = ckWrite(t, "ring.nc", ckSound)
	code, out, _ = ckRun(t, "", file, "-json", "-size", "40.04x40.04", "-tol", "0.05")
	r = report{}
	if err := json.Unmarshal([]byte(out), &r); err != nil || code != 0 || !r.OK {
		t.Fatalf("exit %d, %v in %s", code, err, out)
	}
	if r.MaxDeviation == nil || *r.MaxDeviation < 0.02-1e-9 || *r.MaxDeviation > 0.02+1e-9 {
		t.Errorf("max_deviation %v, want 0.02", r.MaxDeviation)
	}
}

// The ring written in inches, checked in millimetres: lengths are
// converted before any rule runs, and the flags are in millimetres.
func TestCheckConvertsInchPrograms(t *testing.T) {
	inch := strings.NewReplacer("G21", "G20", "Z5", "Z0.25", "Z-1", "Z-0.04", "X20", "X0.8", "X-20", "X-0.8", "I-20", "I-0.8", "I20", "I0.8", "F200", "F8", "F800", "F30").Replace(ckSound)
	file := ckWrite(t, "ring-inch.nc", inch)
	code, out, _ := ckRun(t, "", file, "-units", "mm", "-size", "40.64x40.64", "-tol", "0.001", "-json")
	if code != 0 || !strings.Contains(out, `"program_units": "inch"`) {
		t.Errorf("inch program with -units mm: exit %d, %s", code, out)
	}
	// Its safe height, 0.25 in = 6.35 mm, is below -safe-z 7 mm.
	code, out, _ = ckRun(t, "", file, "-units", "mm", "-safe-z", "7")
	if code != 1 || !strings.Contains(out, "rapid-below-safe") {
		t.Errorf("-safe-z 7 mm: exit %d, %s", code, out)
	}
	// In its own units the defaults hold (safe height 0.2 in).
	if code, out, _ := ckRun(t, "", file, "-units", "inch"); code != 0 {
		t.Errorf("-units inch: exit %d, %s", code, out)
	}
}

func TestCheckRefusesBadUsage(t *testing.T) {
	file := ckWrite(t, "ring.nc", ckSound)
	binary := ckWrite(t, "picture.png", "\x89PNG\r\n\x1a\n\x00\x00\x00")
	tests := []struct {
		args []string
		want string // part of the error
	}{
		{nil, "missing"},
		{[]string{file, file}, "unexpected argument"},
		{[]string{filepath.Join(t.TempDir(), "none.nc")}, "cannot read"},
		{[]string{binary}, "not a text file"},
		{[]string{file, "-machine", "lathe"}, "-machine"},
		{[]string{file, "-machine", "laser", "-safe-z", "2"}, "-safe-z"},
		{[]string{file, "-safe-z", "NaN"}, "-safe-z"},
		{[]string{file, "-travel", "0,0,100"}, "-travel"},
		{[]string{file, "-travel", "100,0,0,100"}, "-travel: X runs from 100 to 0"},
		{[]string{file, "-travel", "0,0,100,100,5,-5"}, "-travel: Z"},
		{[]string{file, "-tol", "0.1"}, "-tol"},
		{[]string{file, "-offset", "1"}, "-offset"},
		{[]string{file, "-zone", "outside"}, "-zone"},
		{[]string{file, "-size", "40x40", "-tol", "0"}, "-tol"},
		{[]string{file, "-size", "40x40", "-tol", "50"}, "-tol"},
		{[]string{file, "-size", "40x40", "-zone", "left"}, "-zone"},
		{[]string{file, "-size", "40x40", "-offset", "-30"}, "-offset"},
		{[]string{file, "-size", "40"}, "-size"},
		{[]string{file, "-units", "furlong"}, "-units"},
	}
	for _, tc := range tests {
		code, out, errs := ckRun(t, "", tc.args...)
		if code != 2 || !strings.Contains(errs, tc.want) || out != "" {
			t.Errorf("check %v: exit %d, out %q, err %q; want exit 2 and an error naming %q", tc.args, code, out, errs, tc.want)
		}
	}
}

// A program from "foci profile" passes "foci check" against the same
// shape, and fails it against another.
func TestCheckPassesProfilePrograms(t *testing.T) {
	dir := t.TempDir()
	for _, m := range []struct {
		name    string
		profile []string
		check   []string
	}{
		{"router", []string{"-machine", "router", "-tool", "6", "-depth", "4", "-stepdown", "2", "-tabs", "3"}, []string{"-machine", "router", "-offset", "3", "-zone", "outside"}},
		{"laser", []string{"-machine", "laser", "-kerf", "0.2", "-power", "600", "-passes", "2"}, []string{"-machine", "laser", "-offset", "0.1", "-zone", "outside"}},
		{"plotter", []string{"-machine", "plotter"}, []string{"-machine", "plotter"}},
	} {
		file := filepath.Join(dir, m.name+".nc")
		var out, errb bytes.Buffer
		args := append([]string{"profile", "-size", "240x150", "-rotate", "15", "-o", file}, m.profile...)
		if code := run(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}, args); code != 0 {
			t.Fatalf("%s: profile exit %d: %s", m.name, code, errb.String())
		}
		args = append([]string{file, "-size", "240x150", "-rotate", "15"}, m.check...)
		if code, out, errs := ckRun(t, "", args...); code != 0 {
			t.Errorf("%s: check exit %d:\n%s%s", m.name, code, out, errs)
		}
		args = append([]string{file, "-size", "240x150", "-rotate", "16"}, m.check...)
		if code, out, _ := ckRun(t, "", args...); code != 1 || !strings.Contains(out, "deviation") {
			t.Errorf("%s: check against a shape turned 1° more: exit %d:\n%s", m.name, code, out)
		}
	}
}
