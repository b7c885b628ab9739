package main

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/focitools/foci/conformance"
	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/preview"
)

// maxPreviewProblems is how many reading problems "foci preview" lists
// before it only counts them.
const maxPreviewProblems = 5

// runPreview reads any G-code program and draws it as a PNG: cut moves
// shaded by depth, travel dashed, the tool band, tabs, holes, the start
// and the cutting direction, and with the shape flags the intended curve.
// Problems met while reading are listed on standard error; the picture is
// still drawn from what could be read.
func runPreview(e *env, args []string) error {
	fs := newFlagSet("preview", "preview FILE -o OUT.png [-width W] [-height H] [-title TEXT] [-tool DIA] [-size WxH [shape flags] [-offset D]]", e.stderr)
	out := fs.String("o", "", "write the picture to `FILE`.png (required; - for standard output)")
	width := fs.Int("width", preview.DefaultWidth, "picture width in `pixels`")
	height := fs.Int("height", preview.DefaultHeight, "picture height in `pixels`")
	title := fs.String("title", "", "`text` at the top of the picture (default: the file name)")
	tool := fs.Float64("tool", 0, "router tool `diameter` or laser kerf, drawn as a faint band (0: none)")
	var shape shapeFlags
	shape.register(fs, "")
	offset := fs.Float64("offset", 0, "signed `distance` of the intended curve from the ellipse (+ outward); needs -size")
	file, rest := previewFileArg(args)
	if err := parseFlags(fs, rest, 1); err != nil {
		return err
	}
	if fs.NArg() == 1 {
		if file != "" {
			return fmt.Errorf("unexpected argument %q", fs.Arg(0))
		}
		file = fs.Arg(0)
	}
	if file == "" {
		return errors.New("the program to draw is missing: foci preview FILE -o OUT.png (FILE may be - for standard input)")
	}
	if *out == "" {
		return badFlag("o", "is required: the PNG file to write (for example -o part.png)")
	}
	if *width < preview.MinWidth || *width > preview.MaxSide {
		return badFlag("width", "%d pixels is out of range; use %d to %d", *width, preview.MinWidth, preview.MaxSide)
	}
	if *height < preview.MinHeight || *height > preview.MaxSide {
		return badFlag("height", "%d pixels is out of range; use %d to %d", *height, preview.MinHeight, preview.MaxSide)
	}
	if err := nonNegative("tool", *tool); err != nil {
		return err
	}
	set := flagsSet(fs)
	if !shape.given() {
		if err := refuseFlags(set, "without -size (the intended curve needs a shape)", "center", "rotate", "offset"); err != nil {
			return err
		}
	}
	var intended []ellipse.Parallel
	var readUnits conformance.Units
	if shape.given() {
		el, err := shape.ellipse()
		if err != nil {
			return err
		}
		if err := finite("offset", *offset); err != nil {
			return err
		}
		c, err := parallelFlag(el, *offset)
		if err != nil {
			return err
		}
		intended = append(intended, c)
		// The program is read in the shape's unit so the two line up.
		readUnits = conformance.Millimeters
		if u, _ := parseUnits(shape.units); u == unitsInch {
			readUnits = conformance.Inches
		}
	} else if set["units"] {
		return badFlag("units", "does not apply without -size (the program's own G20 or G21 sets the unit)")
	}
	src, err := readInput(e, file)
	if err != nil {
		return err
	}
	prog, err := conformance.Read(src, conformance.ReadOptions{Units: readUnits})
	if err != nil {
		return fmt.Errorf("cannot read %s: %v", file, err)
	}
	reportProblems(e.stderr, file, prog)
	path := drawnPath(prog)
	if len(path) == 0 {
		return fmt.Errorf("%s has no moves to draw", displayName(file))
	}
	units := unitsMM
	if prog.Units == conformance.Inches {
		units = unitsInch
	}
	t := *title
	if !set["title"] {
		t = displayName(file)
	}
	return writePictures(e, *out, "", path, pictureOptions{
		title: t, units: units, toolWidth: *tool, intended: intended, width: *width, height: *height,
	})
}

// previewFileArg takes the program's name from the front of args, where
// "foci preview FILE -o OUT.png" puts it, and returns the rest for the
// flag parser; a name after the flags is found by the parser instead.
func previewFileArg(args []string) (file string, rest []string) {
	if len(args) > 0 && (args[0] == "-" || !strings.HasPrefix(args[0], "-")) {
		return args[0], args[1:]
	}
	return "", args
}

// displayName is how a source is named in titles and messages.
func displayName(file string) string {
	if file == "-" {
		return "standard input"
	}
	return filepath.Base(file)
}

// reportProblems lists the first reading problems on w and counts the
// rest.
func reportProblems(w io.Writer, file string, prog *conformance.Program) {
	n := len(prog.Problems) + prog.ProblemsDropped
	if n == 0 {
		return
	}
	for i, v := range prog.Problems {
		if i == maxPreviewProblems {
			break
		}
		fmt.Fprintf(w, "foci preview: %s:%d: %s: %s\n", displayName(file), v.Line, v.Rule, v.Message)
	}
	if n > maxPreviewProblems {
		fmt.Fprintf(w, "foci preview: %d more problems in %s; run \"foci check\" for all of them\n", n-maxPreviewProblems, displayName(file))
	}
}

// drawnPath returns the path as the machine will run it: a feed move made
// while the spindle, beam or pen is off (M5), in a program that switches it
// on somewhere, removes nothing and is drawn as travel.
func drawnPath(prog *conformance.Program) toolpath.Path {
	switches := false
	for _, m := range prog.Moves {
		if m.Spindle != conformance.SpindleOff {
			switches = true
			break
		}
	}
	if !switches || len(prog.Moves) != len(prog.Path) {
		return prog.Path
	}
	p := prog.Path
	for i := range p {
		if p[i].Motion == toolpath.Cut && prog.Moves[i].Spindle == conformance.SpindleOff {
			p[i].Motion = toolpath.Travel
		}
	}
	return p
}
