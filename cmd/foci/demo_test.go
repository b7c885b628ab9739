package main

import (
	"bytes"
	"errors"
	"image/png"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// demoWant is what the test expects of each program of the built-in
// order, written out here from the order's description rather than taken
// from the demo's own tables: the machine, the heights, the curve the tool
// centre must follow and its zone, and for holes and dashes the pattern.
var demoWant = []struct {
	part, program, file string
	machine             conformance.Machine
	safeZ               float64
	center              ellipse.Point
	w, h, offset        float64
	zone                toolpath.Zone
	kind                string // "contour", "holes" or "dashes"
	count               int    // holes
	dashOn, dashOff     float64
	travel              conformance.Box
}{
	{"mirror frame", "holes", "mirror-frame-1-holes.gcode", conformance.Router, 5, ellipse.Point{X: 350, Y: 250}, 640, 440, -40, toolpath.Band, "holes", 6, 0, 0, conformance.Box{MaxX: 1250, MaxY: 2500}},
	// A 6 mm cutter: the tool centre 3 mm inside the opening, 3 mm
	// outside the edge.
	{"mirror frame", "opening", "mirror-frame-2-opening.gcode", conformance.Router, 5, ellipse.Point{X: 350, Y: 250}, 480, 300, -3, toolpath.Inside, "contour", 0, 0, 0, conformance.Box{MaxX: 1250, MaxY: 2500}},
	{"mirror frame", "edge", "mirror-frame-3-edge.gcode", conformance.Router, 5, ellipse.Point{X: 350, Y: 250}, 640, 440, 3, toolpath.Outside, "contour", 0, 0, 0, conformance.Box{MaxX: 1250, MaxY: 2500}},
	{"door plate", "border", "door-plate-1-border.gcode", conformance.Laser, 0, ellipse.Point{X: 150, Y: 100}, 240, 150, -8, toolpath.Band, "dashes", 0, 6, 4, conformance.Box{MaxX: 600, MaxY: 400}},
	// A 0.15 mm kerf: the beam 0.075 mm outside the plate.
	{"door plate", "outline", "door-plate-2-outline.gcode", conformance.Laser, 0, ellipse.Point{X: 150, Y: 100}, 240, 150, 0.075, toolpath.Outside, "contour", 0, 0, 0, conformance.Box{MaxX: 600, MaxY: 400}},
	{"frame template", "opening", "frame-template-1-opening.gcode", conformance.Plotter, 3, ellipse.Point{X: 350, Y: 250}, 480, 300, 0, toolpath.Band, "contour", 0, 0, 0, conformance.Box{MaxX: 900, MaxY: 620}},
	{"frame template", "edge", "frame-template-2-edge.gcode", conformance.Plotter, 3, ellipse.Point{X: 350, Y: 250}, 640, 440, 0, toolpath.Band, "contour", 0, 0, 0, conformance.Box{MaxX: 900, MaxY: 620}},
	{"frame template", "holes", "frame-template-3-holes.gcode", conformance.Plotter, 3, ellipse.Point{X: 350, Y: 250}, 640, 440, -40, toolpath.Band, "holes", 6, 0, 0, conformance.Box{MaxX: 900, MaxY: 620}},
}

// demoParts are the parts with their picture, drawing and report.
var demoParts = []struct{ name, stem string }{
	{"mirror frame", "mirror-frame"}, {"door plate", "door-plate"}, {"frame template", "frame-template"},
}

// demoTestTol is the tolerance the demo promises for every curve (mm).
const demoTestTol = 0.05

// runDemoInto runs "foci demo -o dir" and returns what it printed.
func runDemoInto(t *testing.T, dir string) (code int, stdout, stderr string) {
	t.Helper()
	var out, errb bytes.Buffer
	code = run(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}, []string{"demo", "-o", dir})
	return code, out.String(), errb.String()
}

func TestDemoWritesCheckedProgramsPicturesAndReports(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "new", "demo")
	code, stdout, stderr := runDemoInto(t, dir)
	if code != 0 {
		t.Fatalf("foci demo: exit %d, stderr:\n%s", code, stderr)
	}
	if stderr != "" {
		t.Errorf("foci demo printed on stderr:\n%s", stderr)
	}

	t.Run("files", func(t *testing.T) {
		var want []string
		for _, p := range demoParts {
			want = append(want, p.stem+".png", p.stem+".svg", p.stem+".json")
		}
		for _, w := range demoWant {
			want = append(want, w.file)
		}
		entries, err := os.ReadDir(dir)
		if err != nil {
			t.Fatal(err)
		}
		var got []string
		for _, e := range entries {
			got = append(got, e.Name())
			if info, err := e.Info(); err != nil || info.Size() == 0 {
				t.Errorf("%s is empty (%v)", e.Name(), err)
			}
		}
		slices.Sort(got)
		slices.Sort(want)
		if !slices.Equal(got, want) {
			t.Errorf("files in the demo directory:\n got %q\nwant %q", got, want)
		}
	})

	t.Run("programs", func(t *testing.T) {
		for _, w := range demoWant {
			src, err := os.ReadFile(filepath.Join(dir, w.file))
			if err != nil {
				t.Fatal(err)
			}
			prog, err := conformance.Read(src, conformance.ReadOptions{Units: conformance.Millimeters})
			if err != nil {
				t.Fatalf("%s: %v", w.file, err)
			}
			el, err := ellipse.FromSize(w.w, w.h, w.center, 0)
			if err != nil {
				t.Fatal(err)
			}
			curve, err := el.Parallel(w.offset)
			if err != nil {
				t.Fatal(err)
			}
			travel := w.travel
			rules := conformance.Rules{Machine: w.machine, SafeZ: w.safeZ, Travel: &travel,
				Shape: &conformance.Shape{Curve: curve, Zone: w.zone, Tol: demoTestTol}}
			for _, v := range conformance.Check(prog, rules) {
				// Holes and dashes do not go round the curve: the rules for
				// closed contours do not apply to them.
				if w.kind != "contour" && (v.Rule == conformance.RuleClosedLoop || v.Rule == conformance.RuleCoverage) {
					continue
				}
				t.Errorf("%s:%d: %s: %s", w.file, v.Line, v.Rule, v.Message)
			}
			switch w.kind {
			case "holes":
				checkDemoTestHoles(t, w.file, prog, curve, w.count)
			case "dashes":
				checkDemoTestDashes(t, w.file, prog, curve, w.dashOn, w.dashOff)
			}
		}
	})

	t.Run("pictures", func(t *testing.T) {
		for _, p := range demoParts {
			f, err := os.Open(filepath.Join(dir, p.stem+".png"))
			if err != nil {
				t.Fatal(err)
			}
			img, err := png.Decode(f)
			f.Close()
			if err != nil {
				t.Errorf("%s.png: %v", p.stem, err)
				continue
			}
			if b := img.Bounds(); b.Dx() != 1600 || b.Dy() != 1000 {
				t.Errorf("%s.png is %dx%d; want 1600x1000", p.stem, b.Dx(), b.Dy())
			}
			data, err := os.ReadFile(filepath.Join(dir, p.stem+".svg"))
			if err != nil {
				t.Fatal(err)
			}
			checkDemoTestSVG(t, p.stem+".svg", data)
		}
	})

	t.Run("reports", func(t *testing.T) {
		for _, p := range demoParts {
			r := readDemoTestReport(t, filepath.Join(dir, p.stem+".json"))
			if r.Part != p.name || r.Picture != p.stem+".png" || r.Drawing != p.stem+".svg" {
				t.Errorf("%s.json: part %q, picture %q, drawing %q", p.stem, r.Part, r.Picture, r.Drawing)
			}
			var files []string
			for _, w := range demoWant {
				if w.part == p.name {
					files = append(files, w.file)
				}
			}
			if len(r.Programs) != len(files) {
				t.Fatalf("%s.json lists %d programs; want %d", p.stem, len(r.Programs), len(files))
			}
			for i, prog := range r.Programs {
				rep := prog.Report
				switch {
				case prog.File != files[i] || rep.Program != files[i]:
					t.Errorf("%s.json program %d: file %q, report's program %q; want %q", p.stem, i, prog.File, rep.Program, files[i])
				case !prog.Check.OK || len(prog.Check.Violations) != 0:
					t.Errorf("%s: check %+v", prog.File, prog.Check)
				case !(rep.CutLength > 0) || !(rep.TimeEstimate > 0) || rep.Segments < 2 || rep.Machine != r.Machine:
					t.Errorf("%s: report %+v", prog.File, rep)
				case !(prog.Check.MaxDeviation >= 0 && prog.Check.MaxDeviation <= demoTestTol):
					t.Errorf("%s: max deviation %g, not within the tolerance %g", prog.File, prog.Check.MaxDeviation, demoTestTol)
				}
			}
		}
	})

	t.Run("table", func(t *testing.T) {
		lines := strings.Split(stdout, "\n")
		for _, w := range demoWant {
			found := false
			for _, l := range lines {
				f := strings.Fields(l)
				if strings.HasPrefix(l, w.part+" ") && len(f) > 3 && slices.Contains(f, w.program) && slices.Contains(f, w.machine.String()) && f[len(f)-1] == "ok" {
					found = true
				}
			}
			if !found {
				t.Errorf("the table has no line for %s, %s on the %s with check ok:\n%s", w.part, w.program, w.machine, stdout)
			}
			if !strings.Contains(stdout, w.file) {
				t.Errorf("the output does not say where %s is", w.file)
			}
		}
		if !strings.Contains(stdout, dir) {
			t.Errorf("the output does not name the directory %s", dir)
		}
	})

	t.Run("commands", func(t *testing.T) {
		// The command each report gives remakes the program exactly.
		for _, p := range demoParts {
			r := readDemoTestReport(t, filepath.Join(dir, p.stem+".json"))
			for _, prog := range r.Programs {
				args := splitDemoTestWords(t, prog.Command)
				if len(args) < 2 || args[0] != "foci" {
					t.Fatalf("%s: command %q", prog.File, prog.Command)
				}
				args = args[1:]
				i := slices.Index(args, "-o")
				if i < 0 || i+1 >= len(args) || args[i+1] != prog.File {
					t.Fatalf("%s: command %q does not write the program", prog.File, prog.Command)
				}
				again := filepath.Join(t.TempDir(), prog.File)
				args[i+1] = again
				var errb bytes.Buffer
				if code := run(&env{stdin: strings.NewReader(""), stdout: &errb, stderr: &errb}, args); code != 0 {
					t.Fatalf("%s: exit %d: %s", prog.Command, code, errb.String())
				}
				a, _ := os.ReadFile(filepath.Join(dir, prog.File))
				b, err := os.ReadFile(again)
				if err != nil || !bytes.Equal(a, b) {
					t.Errorf("%s: the command %q writes a different program (%v)", prog.File, prog.Command, err)
				}
			}
		}
	})
}

func TestDemoWritesNothingWhenAProgramFailsItsCheck(t *testing.T) {
	// Each case makes one program differ from the shape the demo checks
	// it against (a later flag overrides the one the order gives), and
	// names a rule that must catch it.
	cases := []struct {
		name, part, job string
		flags           []string
		rule            string
	}{
		{"edge too coarse", "mirror frame", "edge", []string{"-tol", "0.2"}, conformance.RuleDeviation},
		{"holes off their curve", "mirror frame", "holes", []string{"-offset", "-39"}, ruleHolePosition},
		{"holes too few", "frame template", "holes", []string{"-count", "5"}, ruleHoleCount},
		{"dashes of another pattern", "door plate", "border", []string{"-dash", "6,5"}, ruleDashCount},
		{"opening below the safe height", "mirror frame", "opening", []string{"-safe-z", "2"}, conformance.RuleRapidBelowSafe},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			order := demoOrder()
			found := false
			for i := range order {
				for j := range order[i].jobs {
					if order[i].name == c.part && order[i].jobs[j].name == c.job {
						jb := &order[i].jobs[j]
						jb.flags = append(slices.Clone(jb.flags), c.flags...)
						found = true
					}
				}
			}
			if !found {
				t.Fatalf("no job %s of %s in the order", c.job, c.part)
			}
			dir := t.TempDir()
			var out, errb bytes.Buffer
			err := makeDemo(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}, dir, order)
			if !errors.Is(err, errViolations) {
				t.Fatalf("err = %v; want the violations (stderr %s)", err, errb.String())
			}
			if !strings.Contains(errb.String(), ": "+c.rule+": ") {
				t.Errorf("stderr does not report %s:\n%s", c.rule, errb.String())
			}
			if entries, _ := os.ReadDir(dir); len(entries) != 0 {
				t.Errorf("files written although a check failed: %v", entries)
			}
			if out.Len() != 0 {
				t.Errorf("stdout: %s", out.String())
			}
		})
	}
}

func TestDemoRefusesBadUsage(t *testing.T) {
	file := filepath.Join(t.TempDir(), "plain-file")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"demo", "-o", file}, "-o: cannot make the directory"},
		{[]string{"demo", "-o", ""}, "-o: is required"},
		{[]string{"demo", "extra"}, `unexpected argument "extra"`},
		{[]string{"demo", "-size", "10x10"}, "-size"},
	}
	for _, c := range cases {
		var out, errb bytes.Buffer
		code := run(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}, c.args)
		if code != 2 || !strings.Contains(errb.String(), c.want) || out.Len() != 0 {
			t.Errorf("foci %q: exit %d, stdout %q, stderr %q; want exit 2 and %q", c.args, code, out.String(), errb.String(), c.want)
		}
	}
}
