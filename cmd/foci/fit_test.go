package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/focitools/foci/ellipse"
)

// fitRun runs "foci" with args and stdin and returns the exit status and
// both streams.
func fitRun(t *testing.T, stdin string, args ...string) (int, string, string) {
	t.Helper()
	var out, errOut bytes.Buffer
	code := run(&env{stdin: strings.NewReader(stdin), stdout: &out, stderr: &errOut}, args)
	return code, out.String(), errOut.String()
}

// fitGasket is a hatch gasket measured with calipers (our own data: a
// 180.5 x 119.6 ellipse at 8°, with 0.04 mm of measuring error, rounded
// to 0.01 mm).
var fitGasket = [][2]string{
	{"338.83", "155.46"}, {"324.39", "179.49"}, {"296.77", "195.05"}, {"256.93", "200.51"},
	{"221.58", "194.78"}, {"184.30", "175.77"}, {"165.66", "153.96"}, {"160.37", "129.92"},
	{"173.61", "102.54"}, {"197.93", "86.98"}, {"239.27", "79.44"}, {"274.91", "84.15"},
	{"313.10", "102.29"}, {"334.64", "126.53"},
}

func fitGasketPoints(t *testing.T) []ellipse.Point {
	pts := make([]ellipse.Point, len(fitGasket))
	for i, p := range fitGasket {
		x, err1 := strconv.ParseFloat(p[0], 64)
		y, err2 := strconv.ParseFloat(p[1], 64)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		pts[i] = ellipse.Point{X: x, Y: y}
	}
	return pts
}

// fitCSV writes the gasket points with a separator.
func fitCSV(sep, eol string) string {
	var b strings.Builder
	for _, p := range fitGasket {
		b.WriteString(p[0] + sep + p[1] + eol)
	}
	return b.String()
}

// fitDecode runs "foci fit -json -" on input and decodes the report.
func fitDecode(t *testing.T, input string, extra ...string) map[string]any {
	t.Helper()
	code, out, errOut := fitRun(t, input, append(append([]string{"fit", "-json"}, extra...), "-")...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("%v in %s", err, out)
	}
	return m
}

func fitNumbers(t *testing.T, v any) []float64 {
	t.Helper()
	list, ok := v.([]any)
	if !ok {
		t.Fatalf("%v is not a list", v)
	}
	out := make([]float64, len(list))
	for i, x := range list {
		f, ok := x.(float64)
		if !ok {
			t.Fatalf("%v is not a number", x)
		}
		out[i] = f
	}
	return out
}

// TestFitParsesEveryForm feeds the same points in every accepted form and
// requires the same fit as the library gives for them.
func TestFitParsesEveryForm(t *testing.T) {
	want, err := ellipse.Fit(fitGasketPoints(t))
	if err != nil {
		t.Fatal(err)
	}
	forms := map[string]string{
		"comma":               fitCSV(",", "\n"),
		"comma and space":     fitCSV(", ", "\n"),
		"semicolon":           fitCSV(";", "\n"),
		"tab":                 fitCSV("\t", "\n"),
		"spaces":              fitCSV("   ", "\n"),
		"CRLF":                fitCSV(",", "\r\n"),
		"header":              "x,y\n" + fitCSV(",", "\n"),
		"header with units":   "X (mm); Y (mm)\n" + fitCSV(";", "\n"),
		"comments and blanks": "# gasket, hatch 3\n\n" + strings.ReplaceAll(fitCSV(",", "\n"), "\n", "  # caliper\n\n"),
		"byte-order mark":     "\xef\xbb\xbfx,y\r\n" + fitCSV(",", "\r\n"),
		"no final newline":    strings.TrimSuffix(fitCSV(",", "\n"), "\n"),
	}
	for name, input := range forms {
		m := fitDecode(t, input)
		c := fitNumbers(t, m["center"])
		ax := fitNumbers(t, m["semi_axes"])
		wc := want.Ellipse.Center()
		if c[0] != wc.X || c[1] != wc.Y || ax[0] != want.Ellipse.SemiMajor() || ax[1] != want.Ellipse.SemiMinor() {
			t.Errorf("%s: centre %v, semi-axes %v; the library gives %v, %v, %v", name, c, ax, wc, want.Ellipse.SemiMajor(), want.Ellipse.SemiMinor())
		}
	}
}

// TestFitReportsBadLines checks that bad input names the line and quotes
// it, exits 2 and leaves no output file.
func TestFitReportsBadLines(t *testing.T) {
	good := fitCSV(",", "\n")
	tests := []struct {
		name, input string
		want        []string
	}{
		{"word", "x,y\n1,2\n3,abc\n", []string{"line 3", `"3,abc"`, `"abc" is not a number`}},
		{"three fields", good + "1,2,3\n", []string{"line 15", `"1,2,3"`, "found 3 fields"}},
		{"one field", "1,2\n7\n", []string{"line 2", `"7"`, "found 1 field"}},
		{"decimal comma", "x;y\n1,5;2,5\n", []string{"line 2", `"1,5;2,5"`, "decimal mark"}},
		{"NaN", "1\t2\nNaN\t3\n", []string{"line 2", "not a finite number"}},
		{"infinite", "1 2\n3 +Inf\n", []string{"line 2", "not a finite number"}},
		{"second header", "x,y\nX,Y\n", []string{"line 2", `"X,Y"`}},
		{"header after a comment", "# c\nx,y\nx,y\n" + good, []string{"line 3", `"x,y"`}},
		{"beyond 1e100", good + "1e200,3\n", []string{"line 15", "1e+200", "1e100"}},
		{"empty", "# nothing measured yet\n\n", []string{"no points"}},
		{"too few", "1,2\n3,4\n5,6\n7,9\n", []string{"has 4 points", "at least 5"}},
		{"duplicate", "0,0\n2,0\n3,1\n2,2\n0,3\n# again\n3,1\n", []string{"lines 3 and 7", "same point (3, 1)"}},
		{"collinear", "0,1\n1,3\n2,5\n3,7\n4,9\n", []string{"one straight line"}},
		{"hyperbola", "1 1\n2 0.5\n4 0.25\n-1 -1\n-2 -0.5\n0.5 2\n", []string{"hyperbola"}},
	}
	dir := t.TempDir()
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			outPath := filepath.Join(dir, strings.ReplaceAll(tc.name, " ", "_")+".json")
			code, out, errOut := fitRun(t, tc.input, "fit", "-json", "-o", outPath, "-")
			if code != 2 {
				t.Errorf("exit %d, want 2", code)
			}
			if out != "" {
				t.Errorf("stdout %q, want nothing", out)
			}
			for _, w := range tc.want {
				if !strings.Contains(errOut, w) {
					t.Errorf("message %q, want it to contain %q", errOut, w)
				}
			}
			if _, err := os.Stat(outPath); !os.IsNotExist(err) {
				t.Errorf("output file written despite the error (%v)", err)
			}
		})
	}
}

// TestFitRefusesBadUsage checks the flag and argument errors.
func TestFitRefusesBadUsage(t *testing.T) {
	tests := []struct {
		args []string
		want string
	}{
		{[]string{"fit"}, "need a file of measured points"},
		{[]string{"fit", "a.csv", "b.csv"}, `unexpected argument "b.csv"`},
		{[]string{"fit", "-units", "cm", "-"}, "-units"},
		{[]string{"fit", "-min-coverage", "120", "-"}, "-min-coverage: 120 is out of range"},
		{[]string{"fit", "-min-coverage", "-1", "-"}, "-min-coverage"},
		{[]string{"fit", filepath.Join(t.TempDir(), "missing.csv")}, "cannot read"},
	}
	for _, tc := range tests {
		code, _, errOut := fitRun(t, fitCSV(",", "\n"), tc.args...)
		if code != 2 || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, %q; want 2 and %q", tc.args, code, errOut, tc.want)
		}
	}
}

// TestFitJSONFields checks every field of the JSON report against the
// library's result, and the conventions: a ≥ b, rotation in [0, 180),
// residuals signed and in input order, warnings a list.
func TestFitJSONFields(t *testing.T) {
	pts := fitGasketPoints(t)
	want, err := ellipse.Fit(pts)
	if err != nil {
		t.Fatal(err)
	}
	m := fitDecode(t, "x,y\n"+fitCSV(",", "\n"))
	for _, k := range []string{"units", "points", "center", "semi_axes", "rotation", "rotation_determined", "flags",
		"rms_residual", "max_residual", "max_residual_line", "residuals", "coverage", "uncertainty", "iterations", "converged", "warnings"} {
		if _, ok := m[k]; !ok {
			t.Errorf("field %q missing", k)
		}
	}
	ax := fitNumbers(t, m["semi_axes"])
	if !(ax[0] >= ax[1]) {
		t.Errorf("semi_axes %v, want a ≥ b", ax)
	}
	rot := m["rotation"].(float64)
	if !(rot >= 0 && rot < 180) || math.Abs(rot-want.Ellipse.MajorAngle()*180/math.Pi) > 1e-12 {
		t.Errorf("rotation %v", rot)
	}
	res := fitNumbers(t, m["residuals"])
	if len(res) != len(pts) {
		t.Fatalf("%d residuals for %d points", len(res), len(pts))
	}
	for i, p := range pts {
		if d := want.Ellipse.SignedDistance(p); res[i] != want.Residuals[i] || math.Abs(res[i]-d) > 1e-12 {
			t.Errorf("residual %d = %v, want %v", i, res[i], d)
		}
	}
	if m["rms_residual"].(float64) != want.RMS || m["max_residual"].(float64) != want.MaxResidual {
		t.Errorf("rms %v, max %v; want %v, %v", m["rms_residual"], m["max_residual"], want.RMS, want.MaxResidual)
	}
	// The header is line 1, so point i is on line i + 2.
	if line := m["max_residual_line"].(float64); int(line) != want.MaxIndex+2 {
		t.Errorf("max_residual_line %v, want %d", line, want.MaxIndex+2)
	}
	if c := m["coverage"].(float64); c != want.Coverage || !(c > 0.9 && c < 1) {
		t.Errorf("coverage %v", c)
	}
	if w, ok := m["warnings"].([]any); !ok || len(w) != 0 {
		t.Errorf("warnings %v, want an empty list", m["warnings"])
	}
	u := m["uncertainty"].(map[string]any)
	if uc := fitNumbers(t, u["center"]); uc[0] != want.Uncertainty.Center.X {
		t.Errorf("uncertainty %v", u)
	}
	if m["units"] != "mm" || m["points"].(float64) != 14 || m["rotation_determined"] != true {
		t.Errorf("units %v, points %v, rotation determined %v", m["units"], m["points"], m["rotation_determined"])
	}
}

// TestFitFlagsRebuildTheShape takes the flags the fit prints and gives
// them to "foci info": the ellipse it describes must be the fitted one to
// the printed precision (1e-3 mm, 1e-3°).
func TestFitFlagsRebuildTheShape(t *testing.T) {
	for _, units := range []string{"mm", "inch"} {
		code, out, errOut := fitRun(t, fitCSV(",", "\n"), "fit", "-units", units, "-")
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errOut)
		}
		var flags []string
		for _, line := range strings.Split(out, "\n") {
			if f, ok := strings.CutPrefix(strings.TrimSpace(line), "flags "); ok {
				flags = strings.Fields(f)
			}
		}
		if len(flags) != 8 {
			t.Fatalf("no flags line in\n%s", out)
		}
		code, info, errOut := fitRun(t, "", append([]string{"info", "-json"}, flags...)...)
		if code != 0 {
			t.Fatalf("info %v: exit %d: %s", flags, code, errOut)
		}
		var got struct {
			SemiMajor float64       `json:"semi_major"`
			SemiMinor float64       `json:"semi_minor"`
			Foci      [2][2]float64 `json:"foci"`
			Angle     float64       `json:"major_axis_angle_deg"`
		}
		if err := json.Unmarshal([]byte(info), &got); err != nil {
			t.Fatal(err)
		}
		m := fitDecode(t, fitCSV(",", "\n"), "-units", units)
		ax := fitNumbers(t, m["semi_axes"])
		half := 0.5e-3
		if units == "inch" {
			half = 0.5e-4
		}
		if math.Abs(got.SemiMajor-ax[0]) > half || math.Abs(got.SemiMinor-ax[1]) > half {
			t.Errorf("%s: info gives semi-axes %v, %v; the fit %v", units, got.SemiMajor, got.SemiMinor, ax)
		}
		// The centre is midway between the foci.
		c := fitNumbers(t, m["center"])
		mx, my := (got.Foci[0][0]+got.Foci[1][0])/2, (got.Foci[0][1]+got.Foci[1][1])/2
		if math.Abs(mx-c[0]) > half || math.Abs(my-c[1]) > half {
			t.Errorf("%s: info gives the centre (%v, %v); the fit %v", units, mx, my, c)
		}
		if d := math.Abs(got.Angle - m["rotation"].(float64)); d > 0.5e-3 {
			t.Errorf("%s: info gives the major axis at %v°, the fit %v°", units, got.Angle, m["rotation"])
		}
	}
}

// TestFitWarnsAndFlagsLimits checks the reports of a partial arc, a nearly
// round part and five points.
func TestFitWarnsAndFlagsLimits(t *testing.T) {
	arc := fitMustEllipse(t, 60, 35, 20)
	round := fitMustEllipse(t, 40, 40, 0)
	var arcIn, roundIn strings.Builder
	for i := range 12 {
		p := arc.PointAt(1 + float64(i)*(2*math.Pi/3)/11)
		arcIn.WriteString(strconv.FormatFloat(p.X, 'f', 4, 64) + "," + strconv.FormatFloat(p.Y, 'f', 4, 64) + "\n")
		q := round.PointAt(float64(i) * 2 * math.Pi / 12)
		roundIn.WriteString(strconv.FormatFloat(q.X, 'f', 4, 64) + "," + strconv.FormatFloat(q.Y, 'f', 4, 64) + "\n")
	}
	// A third of the curve: the warning says how much, in text and JSON.
	m := fitDecode(t, arcIn.String())
	if w := m["warnings"].([]any); len(w) != 1 || !strings.Contains(w[0].(string), "span only 33% of the curve") {
		t.Errorf("arc warnings %v", m["warnings"])
	}
	if _, out, _ := fitRun(t, arcIn.String(), "fit", "-"); !strings.Contains(out, "warning: the points span only 33% of the curve") {
		t.Errorf("arc text:\n%s", out)
	}
	// Nearly round (0.1 µm of rounding in the input): rotation undetermined.
	m = fitDecode(t, roundIn.String())
	u := m["uncertainty"].(map[string]any)
	if m["rotation_determined"] != false || u["rotation"] != nil {
		t.Errorf("round: rotation determined %v, uncertainty %v", m["rotation_determined"], u["rotation"])
	}
	if _, out, _ := fitRun(t, roundIn.String(), "fit", "-"); !strings.Contains(out, "rotation not determined") || !strings.Contains(out, "warning: the fit is nearly round") {
		t.Errorf("round text:\n%s", out)
	}
	// Five points: no uncertainty, and a warning.
	five := "0 1\n1 0.2\n2 0.5\n-1 0.2\n-2 0.5\n"
	m = fitDecode(t, five)
	u = m["uncertainty"].(map[string]any)
	if u["center"] != nil || u["semi_axes"] != nil || u["rotation"] != nil {
		t.Errorf("five points: uncertainty %v, want nulls", u)
	}
	if w := m["warnings"].([]any); len(w) != 1 || !strings.Contains(w[0].(string), "5 points fix an ellipse exactly") {
		t.Errorf("five points: warnings %v", w)
	}
}

func fitMustEllipse(t *testing.T, a, b, rotDeg float64) ellipse.Ellipse {
	t.Helper()
	e, err := ellipse.New(ellipse.Point{X: 100, Y: 50}, a, b, rotDeg*math.Pi/180)
	if err != nil {
		t.Fatal(err)
	}
	return e
}

// TestFitRotationNear180WrapsToZero: a part whose major axis is a hair
// short of 180° shows -rotate 0, never 180.
func TestFitRotationNear180WrapsToZero(t *testing.T) {
	e := fitMustEllipse(t, 50, 30, 179.99995)
	var in strings.Builder
	for i := range 16 {
		p := e.PointAt(float64(i) * 2 * math.Pi / 16)
		in.WriteString(strconv.FormatFloat(p.X, 'g', 17, 64) + " " + strconv.FormatFloat(p.Y, 'g', 17, 64) + "\n")
	}
	m := fitDecode(t, in.String())
	if r := m["rotation"].(float64); !(r >= 0 && r < 180) {
		t.Errorf("rotation %v outside [0, 180)", r)
	}
	if f := m["flags"].(string); !strings.Contains(f, "-rotate 0 ") {
		t.Errorf("flags %q, want -rotate 0", f)
	}
}

// TestFitWritesTheReportFile checks -o, the residual listing and flags
// given after the file.
func TestFitWritesTheReportFile(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "gasket.csv")
	if err := os.WriteFile(in, []byte("x,y\n"+fitCSV(",", "\n")), 0o644); err != nil {
		t.Fatal(err)
	}
	outPath := filepath.Join(dir, "gasket-fit.txt")
	code, out, errOut := fitRun(t, "", "fit", in, "-list", "-o", outPath)
	if code != 0 || out != "" {
		t.Fatalf("exit %d, stdout %q, stderr %q", code, out, errOut)
	}
	text, err := os.ReadFile(outPath)
	if err != nil {
		t.Fatal(err)
	}
	res, err := ellipse.Fit(fitGasketPoints(t))
	if err != nil {
		t.Fatal(err)
	}
	e := res.Ellipse
	f3 := func(v float64) string { return strconv.FormatFloat(v, 'f', 3, 64) }
	wantFlags := "-size " + f3(2*e.SemiMajor()) + "x" + f3(2*e.SemiMinor()) + " -center " + f3(e.Center().X) + "," + f3(e.Center().Y) +
		" -rotate " + f3(e.MajorAngle()*180/math.Pi) + " -units mm"
	for _, w := range []string{"ellipse through 14 points of " + in, wantFlags, "at line " + strconv.Itoa(res.MaxIndex+2)} {
		if !strings.Contains(string(text), w) {
			t.Errorf("report lacks %q:\n%s", w, text)
		}
	}
	// Every point is listed on a row with its line number, coordinates
	// and signed residual.
	for i, p := range fitGasket {
		// The input has two decimals; the listing shows three.
		fields := []string{strconv.Itoa(i + 2), p[0] + "0", p[1] + "0", fitSigned(res.Residuals[i], 3)}
		found := false
		for _, row := range strings.Split(string(text), "\n") {
			if slices.Equal(strings.Fields(row), fields) {
				found = true
			}
		}
		if !found {
			t.Errorf("no row %v in\n%s", fields, text)
		}
	}
}
