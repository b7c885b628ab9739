package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// demoReport is the JSON report of one part of the demo.
type demoReport struct {
	Order    string        `json:"order"`
	Part     string        `json:"part"`
	Machine  string        `json:"machine"`
	Material string        `json:"material"`
	Tool     string        `json:"tool"`
	Units    string        `json:"units"`
	File     string        `json:"-"`
	Picture  string        `json:"picture"`
	Drawing  string        `json:"drawing"`
	Programs []demoProgram `json:"programs"`
}

// demoProgram is one program of a part: its file, the command that makes
// it, what checking it found and the command's own report.
type demoProgram struct {
	Name    string         `json:"program"`
	File    string         `json:"file"`
	Does    string         `json:"does"`
	Command string         `json:"command"`
	Check   demoCheck      `json:"check"`
	Report  *programReport `json:"report"`

	src  []byte        // the program's text
	path toolpath.Path // the program as read back, as the machine runs it
}

// runDemo works through the built-in order (see demoOrder). For every
// program of every part it runs the foci command that makes it, reads the
// program back and checks it against the shape it was made for; only when
// every program passes does it write them, with a picture (PNG), a
// true-size drawing (SVG) and a JSON report of each part, into the
// directory, and print a table. A program that fails a check is never
// written: the demo lists the violations and exits with status 1.
func runDemo(e *env, args []string) error {
	fs := newFlagSet("demo", "demo [-o DIR]", e.stderr)
	dir := fs.String("o", "foci-demo", "write the programs, pictures and reports into `DIR` (made if missing)")
	if err := parseFlags(fs, args, 0); err != nil {
		return err
	}
	return makeDemo(e, *dir, demoOrder())
}

// makeDemo makes, checks and writes the programs of parts into dir.
func makeDemo(e *env, dir string, parts []demoPart) error {
	if dir == "" {
		return badFlag("o", "is required: the directory to write the demo into")
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return badFlag("o", "cannot make the directory %s: %v", dir, err)
	}
	work, err := os.MkdirTemp("", "foci-demo-*")
	if err != nil {
		return fmt.Errorf("cannot make a working directory: %v", err)
	}
	defer os.RemoveAll(work)

	reports := make([]demoReport, len(parts))
	failed := 0
	for i := range parts {
		p := &parts[i]
		r, err := makeDemoPart(e, work, p)
		if err != nil {
			return err
		}
		for _, prog := range r.Programs {
			for _, v := range prog.Check.Violations {
				fmt.Fprintf(e.stderr, "foci demo: %s:%d: %s: %s\n", prog.File, v.Line, v.Rule, v.Message)
				failed++
			}
		}
		reports[i] = r
	}
	if failed > 0 {
		fmt.Fprintf(e.stderr, "foci demo: %d violations: no files written\n", failed)
		return errViolations
	}
	for i := range parts {
		if err := writeDemoPart(e, dir, &parts[i], &reports[i]); err != nil {
			return err
		}
	}
	printDemoTable(e.stdout, dir, reports)
	return nil
}

// makeDemoPart runs the commands of the part's programs with their files
// in work, and reads and checks each program.
func makeDemoPart(e *env, work string, p *demoPart) (demoReport, error) {
	r := demoReport{Order: demoOrderTitle, Part: p.name, Machine: p.machine.String(), Material: p.material,
		Tool: p.tool, Units: "mm", File: p.file + ".json", Picture: p.file + ".png", Drawing: p.file + ".svg"}
	for i := range p.jobs {
		j := &p.jobs[i]
		file := p.programFile(i)
		out, reportFile := filepath.Join(work, file), filepath.Join(work, file+".json")
		var log bytes.Buffer
		sub := &env{stdin: strings.NewReader(""), stdout: &log, stderr: &log}
		if err := runDemoCommand(sub, j.args(p, out, reportFile)); err != nil {
			return r, fmt.Errorf("%s, %s: foci %s failed: %v", p.name, j.name, j.command, err)
		}
		src, err := os.ReadFile(out)
		if err != nil {
			return r, fmt.Errorf("%s, %s: %v", p.name, j.name, err)
		}
		rep, err := readProgramReport(reportFile)
		if err != nil {
			return r, fmt.Errorf("%s, %s: %v", p.name, j.name, err)
		}
		rep.Program = file
		shape, err := j.shape(p)
		if err != nil {
			return r, fmt.Errorf("%s, %s: the intended shape: %v", p.name, j.name, err)
		}
		check, prog, err := checkDemoProgram(p, shape, src)
		if err != nil {
			return r, fmt.Errorf("%s: cannot read it back: %v", file, err)
		}
		r.Programs = append(r.Programs, demoProgram{
			Name: j.name, File: file, Does: j.does, Command: "foci " + shellWords(j.args(p, file, "")),
			Check: check, Report: rep, src: src, path: drawnPath(prog),
		})
	}
	return r, nil
}

// runDemoCommand runs one foci command line.
func runDemoCommand(e *env, args []string) error {
	for _, c := range commands() {
		if c.name == args[0] {
			return c.run(e, args[1:])
		}
	}
	return fmt.Errorf("no command %q", args[0])
}

// readProgramReport reads the report an operation command wrote.
func readProgramReport(file string) (*programReport, error) {
	data, err := os.ReadFile(file)
	if err != nil {
		return nil, err
	}
	var rep programReport
	if err := json.Unmarshal(data, &rep); err != nil {
		return nil, fmt.Errorf("cannot read the report %s: %v", file, err)
	}
	return &rep, nil
}

// writeDemoPart writes the programs of a part, its picture, its drawing
// and its report into dir, each file atomically.
func writeDemoPart(e *env, dir string, p *demoPart, r *demoReport) error {
	var path toolpath.Path
	var intended []ellipse.Parallel
	for i, prog := range r.Programs {
		if err := writeBytes(e, filepath.Join(dir, prog.File), prog.src); err != nil {
			return err
		}
		path = append(path, prog.path...)
		c, ok, err := p.jobs[i].outline(p)
		if err != nil {
			return err
		}
		if ok {
			intended = append(intended, c)
		}
	}
	title := fmt.Sprintf("%s, %s: %s, %s", p.name, p.material, p.machine, p.tool)
	err := writePictures(e, filepath.Join(dir, r.Picture), filepath.Join(dir, r.Drawing), path, pictureOptions{
		title: title, units: unitsMM, toolWidth: p.toolWidth, intended: intended,
	})
	if err != nil {
		return err
	}
	return writeFileAtomic(e, filepath.Join(dir, r.File), func(w io.Writer) error { return writeJSON(w, r) })
}

// printDemoTable prints one line per program and where the files are.
func printDemoTable(w io.Writer, dir string, reports []demoReport) {
	fmt.Fprintf(w, "foci demo: %s\n\n", demoOrderTitle)
	fmt.Fprintf(w, "%-15s %-8s %-8s %12s %11s %8s %13s  %s\n", "part", "program", "machine", "cut length", "time", "segments", "max deviation", "check")
	for _, r := range reports {
		for _, prog := range r.Programs {
			check := "ok"
			if !prog.Check.OK {
				check = "FAILED"
			}
			fmt.Fprintf(w, "%-15s %-8s %-8s %9.1f mm %11s %8d %10.5f mm  %s\n", r.Part, prog.Name, r.Machine,
				prog.Report.CutLength, duration(prog.Report.TimeEstimate), prog.Report.Segments, prog.Check.MaxDeviation, check)
		}
	}
	fmt.Fprintf(w, "\nTimes are estimates. Every program was read back and checked against the shape it was made for.\n")
	fmt.Fprintf(w, "Files in %s:\n", dir)
	for _, r := range reports {
		names := []string{r.Picture, r.Drawing, r.File}
		for _, prog := range r.Programs {
			names = append(names, prog.File)
		}
		fmt.Fprintf(w, "  %s\n", strings.Join(names, "  "))
	}
}

// shellWords joins args into a command line a POSIX shell reads back as
// the same words, quoting those that need it.
func shellWords(args []string) string {
	out := make([]string, len(args))
	for i, a := range args {
		out[i] = a
		if a == "" || strings.ContainsFunc(a, func(r rune) bool {
			return !(r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' || strings.ContainsRune("-_.,/:=+@%", r))
		}) {
			out[i] = "'" + strings.ReplaceAll(a, "'", `'\''`) + "'"
		}
	}
	return strings.Join(out, " ")
}
