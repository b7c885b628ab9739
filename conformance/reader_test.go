package conformance

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/toolpath"
)

// read reads src with default options and fails the test on an error.
func read(t *testing.T, src string) *Program {
	t.Helper()
	p, err := Read([]byte(src), ReadOptions{})
	if err != nil {
		t.Fatalf("Read: %v", err)
	}
	if len(p.Path) != len(p.Moves) {
		t.Fatalf("Read: %d segments but %d moves", len(p.Path), len(p.Moves))
	}
	return p
}

// rulesOf lists the rule names of vs.
func rulesOf(vs []Violation) []string {
	var out []string
	for _, v := range vs {
		out = append(out, v.Rule)
	}
	return out
}

func TestScanNumber(t *testing.T) {
	tests := []struct {
		in   string
		want float64
		next int
		bad  string // part of the message, "" for a good number
	}{
		{"1", 1, 1, ""},
		{"-1.5", -1.5, 4, ""},
		{".5", 0.5, 2, ""},
		{"+2", 2, 2, ""},
		{"3.", 3, 2, ""},
		{"-0.0625Y", -0.0625, 7, ""},
		{" 12 . 5 X", 12.5, 7, ""}, // blanks are ignored inside numbers (NISTIR 6556 §3.3)
		{"0.1", 0.1, 3, ""},
		{"123456.789", 123456.789, 10, ""},
		{"00000000000000000000000012.5", 12.5, 28, ""},
		{"0.00000000000000000000000001", 1e-26, 28, ""}, // beyond the exact fast path
		{"12345678901234567890123", 12345678901234567890123, 23, "beyond"}, // more than 19 digits
		{"999999999999", 999999999999, 12, ""},
		{"1000000000001", 0, 13, "beyond"},
		{"1e5", 0, 1, "exponent"},
		{"2.5E-3", 0, 3, "exponent"},
		{"1.2.3", 0, 3, "two decimal points"},
		{"", 0, 0, "no number"},
		{"-", 0, 1, "no number"},
		{"NaN", 0, 0, "no number"},
		{"inf", 0, 0, "no number"},
		{".", 0, 1, "no number"},
		{strings.Repeat("9", 70), 0, 65, "longer than"},
	}
	for _, tc := range tests {
		v, next, msg := scanNumber([]byte(tc.in), 0)
		if tc.bad != "" {
			if !strings.Contains(msg, tc.bad) {
				t.Errorf("scanNumber(%q): message %q, want one containing %q", tc.in, msg, tc.bad)
			}
			continue
		}
		if msg != "" || v != tc.want || next != tc.next {
			t.Errorf("scanNumber(%q) = %v, %d, %q; want %v, %d", tc.in, v, next, msg, tc.want, tc.next)
		}
	}
}

// The fast path must round exactly as strconv.ParseFloat does.
func TestScanNumberAgreesWithParseFloat(t *testing.T) {
	for _, s := range []string{"0.1", "0.3", "2.675", "123.456789", "-98765.4321", "1.0000000000000002", "0.000123456789012345678", "123456789012.3456789", "0.12345678901234567890123"} {
		v, _, msg := scanNumber([]byte(s), 0)
		if msg != "" {
			t.Errorf("scanNumber(%q): %s", s, msg)
			continue
		}
		want := mustParse(t, s)
		if v != want {
			t.Errorf("scanNumber(%q) = %v, strconv says %v", s, v, want)
		}
	}
}

func TestReadWords(t *testing.T) {
	tests := []struct {
		name  string
		src   string
		rules []string // reading problems, in order
		segs  int
	}{
		{"upper case with spaces", "G21 G90\nG0 X1 Y2 Z3\nM2\n", nil, 1},
		{"lower case without spaces", "g21g90\ng0x1y2z3\nm2\n", nil, 1},
		{"leading zeros in codes", "G21\nG00 X1 Y2\nG01 X2 F100\nM02\n", nil, 2},
		{"N words and percent", "%\nN10 G21\nN20 G0 X1\nN30 M30\n%\n", nil, 1},
		{"comments", "(setup) G21 (mm)\nG0 X1 ; to the start\n;only a comment\n( another )\nM2\n", nil, 1},
		{"unknown letter", "G21\nG0 X1 A5\nM2\n", []string{RuleUnsupported}, 1},
		{"unsupported G code runs the rest", "G21\nG18 G0 X1\nM2\n", []string{RuleUnsupported}, 1},
		{"tool change", "G21 T2 M6\nM2\n", []string{RuleUnsupported}, 0},
		{"coolant", "G21 M8\nM2\n", []string{RuleUnsupported}, 0},
		{"block delete", "G21\n/G0 X1\nM2\n", []string{RuleUnsupported}, 1},
		{"two motion codes", "G21\nG0 G1 X1\nM2\n", []string{RuleModal}, 0},
		{"motion and canned cycle", "G21\nG1 G81 X1 F1\nM2\n", []string{RuleUnsupported, RuleModal}, 0},
		{"two units codes", "G20 G21\nM2\n", []string{RuleModal}, 0},
		{"two spindle codes", "G21 M3 M5\nM2\n", []string{RuleModal}, 0},
		{"axis words with no motion mode", "G21\nX1 Y1\nM2\n", []string{RuleModal}, 0},
		{"word twice", "G21\nG0 X1 X2\nM2\n", []string{RuleSyntax}, 0},
		{"N not first", "G21\nG0 N5 X1\nM2\n", []string{RuleSyntax}, 0},
		{"letter without number", "G21\nG0 X\nM2\n", []string{RuleSyntax}, 0},
		{"exponent", "G21\nG0 X1e3\nM2\n", []string{RuleSyntax}, 0},
		{"unclosed comment", "G21\nG0 X1 (oops\nM2\n", []string{RuleSyntax}, 0},
		{"nested comment", "G21\nG0 X1 (a (b) c)\nM2\n", []string{RuleSyntax}, 0},
		{"stray character", "G21\nG0 X1 #2\nM2\n", []string{RuleSyntax}, 0},
		{"NUL byte", "G21\nG0 X1\x00\nM2\n", []string{RuleSyntax}, 0},
		{"not a G code", "G21\nG1.25 X1\nM2\n", []string{RuleSyntax}, 0},
		{"negative feed", "G21\nG1 X1 F-5\nM2\n", []string{RuleBadWord}, 0},
		{"dwell without P", "G21\nG4\nM2\n", []string{RuleBadWord}, 0},
		{"P without G4", "G21\nG0 X1 P2\nM2\n", []string{RuleBadWord}, 0},
		{"I without arc", "G21\nG1 X1 I2 F9\nM2\n", []string{RuleBadWord}, 0},
		{"fractional tool", "G21 T1.5\nM2\n", []string{RuleBadWord}, 0},
		{"text after percent", "% G21\nM2\n", []string{RuleSyntax}, 0},
		{"carriage returns", "G21\r\nG0 X1\r\nM2\r\n", nil, 1},
		{"huge number", "G21\nG0 X" + strings.Repeat("9", 40) + "\nM2\n", []string{RuleSyntax}, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := read(t, tc.src)
			got := rulesOf(p.Problems)
			if strings.Join(got, ",") != strings.Join(tc.rules, ",") {
				t.Errorf("problems %v, want rules %v", p.Problems, tc.rules)
			}
			if len(p.Path) != tc.segs {
				t.Errorf("%d segments, want %d: %+v", len(p.Path), tc.segs, p.Path)
			}
			for _, v := range p.Problems {
				if v.Line < 1 || v.Line > p.Lines || v.Message == "" {
					t.Errorf("problem %+v: bad line or empty message (program has %d lines)", v, p.Lines)
				}
			}
		})
	}
}

func TestReadModalState(t *testing.T) {
	p := read(t, `G21 G90 G17 G94
G0 Z5
G0 X10 Y20
M3 S9000
G1 Z-2 F250
X30
Y40 F400
G91 X-5 Y-5
G4 P1.5
M5
G90 G0 Z5
T3
M30
`)
	want := []struct {
		kind    toolpath.Kind
		motion  toolpath.Motion
		end     toolpath.Point
		line    int
		spindle Spindle
		feed    float64
		speed   float64
	}{
		{toolpath.Line, toolpath.Travel, toolpath.Point{X: 10, Y: 20, Z: 5}, 2, SpindleOff, 0, 0},
		{toolpath.Line, toolpath.Travel, toolpath.Point{X: 10, Y: 20, Z: 5}, 3, SpindleOff, 0, 0},
		{toolpath.Line, toolpath.Cut, toolpath.Point{X: 10, Y: 20, Z: -2}, 5, SpindleClockwise, 250, 9000},
		{toolpath.Line, toolpath.Cut, toolpath.Point{X: 30, Y: 20, Z: -2}, 6, SpindleClockwise, 250, 9000},
		{toolpath.Line, toolpath.Cut, toolpath.Point{X: 30, Y: 40, Z: -2}, 7, SpindleClockwise, 400, 9000},
		{toolpath.Line, toolpath.Cut, toolpath.Point{X: 25, Y: 35, Z: -2}, 8, SpindleClockwise, 400, 9000},
		{toolpath.Dwell, toolpath.Travel, toolpath.Point{X: 25, Y: 35, Z: -2}, 9, SpindleClockwise, 400, 9000},
		{toolpath.Line, toolpath.Travel, toolpath.Point{X: 25, Y: 35, Z: 5}, 11, SpindleOff, 400, 9000},
	}
	if len(p.Path) != len(want) {
		t.Fatalf("%d segments, want %d: %+v", len(p.Path), len(want), p.Path)
	}
	for i, w := range want {
		s, m := p.Path[i], p.Moves[i]
		if s.Kind != w.kind || s.Motion != w.motion || s.End != w.end || m.Line != w.line || m.Spindle != w.spindle || m.Feed != w.feed || m.Speed != w.speed {
			t.Errorf("segment %d: %v %v end %+v line %d %v F%v S%v; want %v %v end %+v line %d %v F%v S%v",
				i, s.Kind, s.Motion, s.End, m.Line, m.Spindle, m.Feed, m.Speed, w.kind, w.motion, w.end, w.line, w.spindle, w.feed, w.speed)
		}
		if i > 0 && s.Start != p.Path[i-1].End {
			t.Errorf("segment %d starts at %+v, the last ended at %+v", i, s.Start, p.Path[i-1].End)
		}
	}
	if p.Path[6].Seconds != 1.5 {
		t.Errorf("dwell of %v s, want 1.5", p.Path[6].Seconds)
	}
	if p.EndLine != 13 || p.Units != Millimeters || p.Declared != Millimeters || p.UnitsLine != 1 || p.Lines != 13 {
		t.Errorf("end line %d, units %v declared %v at %d, %d lines; want 13, mm, mm at 1, 13", p.EndLine, p.Units, p.Declared, p.UnitsLine, p.Lines)
	}
	if p.Moves[0].Flags != MoveFromUnknownXY|MoveFromUnknownZ || p.Moves[1].Flags != MoveFromUnknownXY|MoveGivesXY {
		t.Errorf("first moves' flags %b %b, want unknown XY and Z, then unknown XY", p.Moves[0].Flags, p.Moves[1].Flags)
	}
	if len(p.Problems) != 0 {
		t.Errorf("problems: %v", p.Problems)
	}
}

func TestReadUnknownStart(t *testing.T) {
	// The tool starts where the program first sends each axis.
	p := read(t, "G21\nG0 X5 Y6\nG0 Z7\nM2\n")
	if got := p.Path[0]; got.Start != (toolpath.Point{X: 5, Y: 6, Z: 7}) || got.End != (toolpath.Point{X: 5, Y: 6, Z: 7}) {
		t.Errorf("first rapid %+v → %+v, want both at (5, 6, 7)", got.Start, got.End)
	}
	if p.Moves[0].Flags != MoveFromUnknownXY|MoveFromUnknownZ|MoveXYBeforeZ|MoveGivesXY || p.Moves[1].Flags != MoveFromUnknownZ {
		t.Errorf("flags %b %b, want XY before Z from unknown XY and Z, then from unknown Z", p.Moves[0].Flags, p.Moves[1].Flags)
	}
	// An arc needs a known start.
	p = read(t, "G21\nG2 X1 Y1 I1 J0 F10\nM2\n")
	if rulesOf(p.Problems)[0] != RuleArcInvalid || len(p.Path) != 0 {
		t.Errorf("arc from nowhere: %v, %d segments", p.Problems, len(p.Path))
	}
	// Incremental moves on an unknown axis count from 0.
	p = read(t, "G21 G91\nG0 X5\nM2\n")
	if got := p.Path[0]; got.Start.X != 0 || got.End.X != 5 {
		t.Errorf("incremental first move %+v → %+v, want X 0 → 5", got.Start, got.End)
	}
}

func TestReadUnits(t *testing.T) {
	src := "G20\nG0 X1 Y2 Z0.5\nG1 X2 F10\nG21\nG1 X25.4\nM2\n"
	tests := []struct {
		opts      Units
		wantUnits Units
		x         [3]float64 // end X of the three moves
		feed      float64
	}{
		{UnitsUnset, Inches, [3]float64{1, 2, 1}, 10},
		{Inches, Inches, [3]float64{1, 2, 1}, 10},
		{Millimeters, Millimeters, [3]float64{25.4, 50.8, 25.4}, 254},
	}
	for _, tc := range tests {
		p, err := Read([]byte(src), ReadOptions{Units: tc.opts})
		if err != nil {
			t.Fatal(err)
		}
		if p.Units != tc.wantUnits || p.Declared != Inches {
			t.Errorf("Units %v: path in %v declared %v, want %v declared inch", tc.opts, p.Units, p.Declared, tc.wantUnits)
		}
		for i, x := range tc.x {
			if math.Abs(p.Path[i].End.X-x) > 1e-12 {
				t.Errorf("Units %v: move %d ends at X %v, want %v", tc.opts, i, p.Path[i].End.X, x)
			}
		}
		if math.Abs(p.Moves[1].Feed-tc.feed) > 1e-12 {
			t.Errorf("Units %v: feed %v, want %v", tc.opts, p.Moves[1].Feed, tc.feed)
		}
		if p.Moves[2].Units != Millimeters || p.Moves[1].Units != Inches {
			t.Errorf("Units %v: lines written in %v and %v, want inch and mm", tc.opts, p.Moves[1].Units, p.Moves[2].Units)
		}
	}
	// No units word: millimetres are assumed, or the unit asked for.
	p := read(t, "G0 X1\nM2\n")
	if p.Units != Millimeters || p.Declared != UnitsUnset || p.UnitsLine != 0 {
		t.Errorf("no units: %v declared %v at %d", p.Units, p.Declared, p.UnitsLine)
	}
}

func TestReadAfterEnd(t *testing.T) {
	p := read(t, "G21\nG0 X1\nM30\n(done)\n\n%\nG0 X2\n  ; fine\nM3\n")
	if p.EndLine != 3 || p.AfterEndCount != 2 || len(p.AfterEnd) != 2 || p.AfterEnd[0] != 7 || p.AfterEnd[1] != 9 {
		t.Errorf("end %d, after end %v (%d); want 3, [7 9]", p.EndLine, p.AfterEnd, p.AfterEndCount)
	}
	if len(p.Path) != 1 {
		t.Errorf("%d segments: code after the end must not run", len(p.Path))
	}
}

func TestReadProblemLimit(t *testing.T) {
	src := strings.Repeat("@\n", 50)
	p, err := Read([]byte(src), ReadOptions{MaxProblems: 10})
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Problems) != 10 || p.ProblemsDropped != 40 {
		t.Errorf("%d problems kept, %d dropped; want 10 and 40", len(p.Problems), p.ProblemsDropped)
	}
	vs := Check(p, Rules{MaxPerRule: 100})
	if n := len(vs); n != 12 || vs[0].Rule != RuleTooMany || !strings.Contains(vs[0].Message, "40 more") {
		t.Errorf("Check: %d violations, first %v; want 10 syntax, too-many-problems and program-end", n, vs[0])
	}
	if _, err := Read(make([]byte, 100), ReadOptions{MaxBytes: 99}); err == nil {
		t.Error("Read over MaxBytes: no error")
	}
}

func mustParse(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}
