package conformance

import (
	"slices"
	"strings"
	"testing"
)

// router wraps body in a sound router program: millimetres, rapid to the
// safe height, spindle on, and a proper end.
func router(body string) string {
	return "G21 G90 G17 G94\nG0 Z5\nG0 X0 Y0\nM3 S12000\nF600\n" + body + "\nG0 Z5\nM5\nM30\n"
}

func TestRules(t *testing.T) {
	laser := Rules{Machine: Laser}
	safe := Rules{SafeZ: 5}
	plotter := Rules{Machine: Plotter, SafeZ: 3}
	box := Rules{SafeZ: 5, Travel: &Box{MinX: -1, MinY: -1, MaxX: 100, MaxY: 50, HasZ: true, MinZ: -10, MaxZ: 20}}
	tests := []struct {
		name  string
		rules Rules
		src   string
		rule  string // the rule under test
		want  bool   // whether it must fire
		text  string // part of the message when it fires
	}{
		{"sound router program", safe, router("G1 Z-1\nG1 X10\nG1 Y10"), "", false, ""},

		{"units after motion", safe, "G0 Z5\nG21\nM2\n", RuleUnitsBeforeMotion, true, "before any G20 or G21"},
		{"no units at all", safe, "G0 Z5\nM2\n", RuleUnitsBeforeMotion, true, "without ever"},
		{"units on the first move's line", safe, "G21 G0 Z5\nM2\n", RuleUnitsBeforeMotion, false, ""},
		{"units first", safe, "G20\nG0 Z5\nM2\n", RuleUnitsBeforeMotion, false, ""},

		{"no feed", safe, "G21\nG0 Z5\nG0 X0 Y0\nM3 S9000\nG1 Z-1\nM30\n", RuleFeedBeforeCut, true, "G1 feed move"},
		{"feed zero", safe, "G21\nG0 Z5\nG0 X0 Y0\nM3 S9000\nG1 Z-1 F0\nM30\n", RuleFeedBeforeCut, true, ""},
		{"feed on the line", safe, "G21\nG0 Z5\nG0 X0 Y0\nM3 S9000\nG1 Z-1 F200\nM30\n", RuleFeedBeforeCut, false, ""},
		{"rapids need no feed", safe, "G21\nG0 Z5\nG0 X4 Y4\nM30\n", RuleFeedBeforeCut, false, ""},

		// NISTIR 6556 §3.5.3: start and end radius may differ by 0.002 mm.
		{"end radius 0.0021 mm off", safe, router("G0 X10 Y0\nG1 Z-1\nG3 X0 Y10.0021 I-10 J0"), RuleArcRadiusMismatch, true, "0.0021"},
		{"end radius 0.0019 mm off", safe, router("G0 X10 Y0\nG1 Z-1\nG3 X0 Y10.0019 I-10 J0"), RuleArcRadiusMismatch, false, ""},
		// ... or by 0.0002 in.
		{"end radius 0.00021 in off", safe, "G20\nG0 Z1\nG0 X1 Y0\nM3 S9000\nG1 Z-0.1 F20\nG3 X0 Y1.00021 I-1 J0\nG0 Z1\nM30\n", RuleArcRadiusMismatch, true, "0.00021"},
		{"end radius 0.00019 in off", safe, "G20\nG0 Z1\nG0 X1 Y0\nM3 S9000\nG1 Z-0.1 F20\nG3 X0 Y1.00019 I-1 J0\nG0 Z1\nM30\n", RuleArcRadiusMismatch, false, ""},
		{"R form has no mismatch", safe, router("G0 X10 Y0\nG1 Z-1\nG3 X0 Y10.5 R10"), RuleArcRadiusMismatch, false, ""},

		// 10·(cos 179.5°, sin 179.5°) and 10·(cos 178°, sin 178°).
		{"R arc of 179.5°", safe, router("G0 X10 Y0\nG1 Z-1\nG3 X-9.999619 Y0.087265 R10"), RuleArcRNearHalf, true, "179.5"},
		{"R arc of 178°", safe, router("G0 X10 Y0\nG1 Z-1\nG3 X-9.993908 Y0.348995 R10"), RuleArcRNearHalf, false, ""},
		{"I J arc of 179.5°", safe, router("G0 X10 Y0\nG1 Z-1\nG3 X-9.999619 Y0.087265 I-10 J0"), RuleArcRNearHalf, false, ""},

		{"rapid in XY below safe Z", safe, router("G0 Z2\nG0 X10 Y10"), RuleRapidBelowSafe, true, "at Z 2"},
		{"rapid in XY at safe Z", safe, router("G0 X10 Y10"), RuleRapidBelowSafe, false, ""},
		{"first rapid in XY below safe Z", safe, "G21\nG0 Z2\nG0 X10 Y10\nM30\n", RuleRapidBelowSafe, true, "at Z 2"},
		{"rapid down to a clearance", safe, router("G0 X10 Y10\nG0 Z0.5\nG1 Z-1"), RuleRapidBelowSafe, false, ""},
		{"rapid up out of the cut", safe, router("G1 Z-1\nG1 X10\nG0 Z5\nG0 X0"), RuleRapidBelowSafe, false, ""},
		{"rapid plunge into the stock", safe, router("G0 X10 Y10\nG0 Z-1"), RuleRapidBelowSafe, true, "into the stock"},
		{"diagonal rapid into the cut", safe, router("G0 X10 Y10 Z-1"), RuleRapidBelowSafe, true, "at Z -1"},
		{"rapid in XY before any Z", safe, "G21\nG0 X10 Y10\nG0 Z5\nM30\n", RuleRapidBelowSafe, true, "before the program gives any Z"},
		{"plotter pen dragged", plotter, "G21\nG0 Z3\nG0 X1 Y1\nG1 Z0 F900\nG0 X20\nG0 Z3\nM30\n", RuleRapidBelowSafe, true, "below the safe height 3"},
		{"plotter pen up", plotter, "G21\nG0 Z3\nG0 X1 Y1\nG1 Z0 F900\nG1 X20\nG0 Z3\nG0 X0 Y0\nM30\n", RuleRapidBelowSafe, false, ""},
		{"laser has no safe height", laser, "G21\nG0 X1 Y1\nM30\n", RuleRapidBelowSafe, false, ""},

		{"laser rapid with the beam on", laser, "G21\nG0 X0 Y0\nM3 S800\nG1 X10 F1500\nG0 X20\nM5\nM30\n", RuleRapidBeamOn, true, "M3 S800"},
		{"laser rapid with M4 on", laser, "G21\nG0 X0 Y0\nM4 S800\nG0 X20\nM5\nM30\n", RuleRapidBeamOn, true, "M4"},
		{"laser rapid with S0", laser, "G21\nG0 X0 Y0\nM3 S800\nG1 X10 F1500\nS0\nG0 X20\nM5\nM30\n", RuleRapidBeamOn, false, ""},
		{"laser rapid after M5", laser, "G21\nG0 X0 Y0\nM3 S800\nG1 X10 F1500\nM5\nG0 X20\nM30\n", RuleRapidBeamOn, false, ""},
		{"router rapid with the spindle on", safe, router("G0 X10"), RuleRapidBeamOn, false, ""},

		{"cut with the spindle never on", safe, "G21\nG0 Z5\nG0 X0 Y0\nG1 Z-1 F100\nG0 Z5\nM30\n", RuleCutSpindleOff, true, "spindle is off"},
		{"cut after M5", safe, router("M5\nG1 Z-1"), RuleCutSpindleOff, true, "spindle is off"},
		{"cut at S0", safe, router("S0\nG1 Z-1"), RuleCutSpindleOff, true, "speed is 0"},
		{"feed above the stock with the spindle off", safe, "G21\nG0 Z5\nG0 X0 Y0\nG1 Z1 F100\nG1 X9\nG0 Z5\nM30\n", RuleCutSpindleOff, false, ""},
		{"laser feed with the beam off", laser, "G21\nG0 X0 Y0\nG1 X10 F1500\nM30\n", RuleCutSpindleOff, false, ""},

		{"no end", safe, "G21\nG0 Z5\n", RuleProgramEnd, true, "M2 or M30"},
		{"M2 end", safe, "G21\nG0 Z5\nM2\n", RuleProgramEnd, false, ""},

		{"code after the end", safe, "G21\nG0 Z5\nM30\nG0 X1\n", RuleAfterEnd, true, "never run"},
		{"comments after the end", safe, "G21\nG0 Z5\nM30\n(end)\n; bye\n%\n\n", RuleAfterEnd, false, ""},

		{"beyond X", box, router("G0 X120 Y10"), RuleTravelLimit, true, "X reaches 120, 20 mm beyond the limit 100"},
		{"below Y", box, router("G0 X10 Y-3"), RuleTravelLimit, true, "Y reaches -3, 2 mm below the limit -1"},
		{"arc bulging beyond Y", box, router("G0 X38 Y40\nG1 Z-1\nG2 X62 Y40 I12 J0"), RuleTravelLimit, true, "Y reaches 52, 2 mm beyond"}, // the arc's top, not its ends
		{"below Z", box, router("G0 X10 Y10\nG1 Z-12"), RuleTravelLimit, true, "Z reaches -12"},
		{"inside the box", box, router("G0 X10 Y10\nG1 Z-1\nG1 X90 Y40"), RuleTravelLimit, false, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := read(t, tc.src)
			vs := Check(p, tc.rules)
			var fired []Violation
			for _, v := range vs {
				if v.Rule == tc.rule {
					fired = append(fired, v)
				}
				if v.Line < 0 || v.Line > p.Lines {
					t.Errorf("violation %v: line out of range 0..%d", v, p.Lines)
				}
			}
			if tc.rule == "" {
				if len(vs) != 0 {
					t.Errorf("violations in a sound program: %v", vs)
				}
				return
			}
			if tc.want != (len(fired) > 0) {
				t.Fatalf("%s fired %v, want %v; all: %v", tc.rule, len(fired) > 0, tc.want, vs)
			}
			if tc.want && !strings.Contains(fired[0].Message, tc.text) {
				t.Errorf("message %q, want it to contain %q", fired[0].Message, tc.text)
			}
		})
	}
}

// An inch program read into millimetres keeps the inch tolerance of its
// arcs: 0.00019 in is 0.0048 mm, more than 0.002 mm, yet allowed.
func TestArcToleranceFollowsTheWrittenUnit(t *testing.T) {
	src := "G20\nG0 Z1\nG0 X1 Y0\nM3 S9000\nG1 Z-0.1 F20\nG3 X0 Y1.00019 I-1 J0\nG0 Z1\nM30\n"
	p, err := Read([]byte(src), ReadOptions{Units: Millimeters})
	if err != nil {
		t.Fatal(err)
	}
	if vs := Check(p, Rules{SafeZ: 25.4}); len(vs) != 0 {
		t.Errorf("violations: %v", vs)
	}
}

func TestCheckListsAtMostMaxPerRule(t *testing.T) {
	body := strings.Repeat("G1 X1\nG1 X0\n", 15) // 30 feed moves without F
	src := "G21\nG0 Z5\nG0 X0 Y0\n" + body + "M30\n"
	p := read(t, src)
	vs := Check(p, Rules{SafeZ: 5, MaxPerRule: 5})
	var n int
	for _, v := range vs {
		if v.Rule == RuleFeedBeforeCut {
			n++
		}
	}
	if n != 6 || !strings.Contains(vs[len(vs)-1].Message, "25 more") {
		t.Errorf("%d feed-before-cut violations listed, want 5 and a summary of 25 more: %v", n, vs)
	}
	if !slices.IsSortedFunc(vs, func(a, b Violation) int { return a.Line - b.Line }) {
		t.Errorf("violations not in line order: %v", vs)
	}
}

func TestViolationError(t *testing.T) {
	v := Violation{Rule: RuleDeviation, Line: 12, Message: "too far out"}
	if got, want := v.Error(), "line 12: deviation: too far out"; got != want {
		t.Errorf("Error() = %q, want %q", got, want)
	}
}

func TestCheckReportCounts(t *testing.T) {
	p := read(t, router("G1 Z-1\nG1 X10\nG2 X10 Y0 I-5 J0\nG4 P0.5"))
	sum := CheckReport(p, Rules{SafeZ: 5}).Summary
	// G0 Z5, G0 X0 Y0, G1 Z-1, G1 X10, G2, G4, G0 Z5.
	if sum.Segments != 7 || sum.Travel != 3 || sum.Cut != 3 || sum.Arcs != 1 || sum.Lines != 5 || sum.Dwells != 1 || sum.Geometry {
		t.Errorf("summary %+v", sum)
	}
}
