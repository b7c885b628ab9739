package main

import (
	"bytes"
	"errors"
	"io"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/preview"
	"github.com/focitools/foci/toolpath/svg"
)

// pictureOptions says how the commands draw a path for -png and -svg.
type pictureOptions struct {
	// title is printed on the PNG and put in the SVG's <title>.
	title string
	// units is "mm" or "inch", the unit of the path.
	units Units
	// toolWidth is the router tool's diameter or the laser's kerf, drawn
	// as a faint band on the PNG; 0 for a pen plotter. On the SVG, whose
	// lines stay hairlines for importers, it sizes the hole marks.
	toolWidth float64
	// intended are the shapes the path is meant to produce, drawn as thin
	// reference lines on the PNG.
	intended []ellipse.Parallel
	// width and height are the PNG size in pixels; 0 means the default
	// (1600 × 1000).
	width, height int
}

// writePictures draws path as a PNG to pngPath and as an SVG to svgPath;
// an empty path name skips that picture. Both are made in memory first, so
// a bad option writes neither file; each is then written atomically.
// Errors name the flag (-png, -svg, -width, -height, -tool) they come from.
func writePictures(e *env, pngPath, svgPath string, path toolpath.Path, opts pictureOptions) error {
	var pngData, svgData []byte
	if pngPath != "" {
		var buf bytes.Buffer
		err := preview.WritePNG(&buf, path, preview.Options{
			Width: opts.width, Height: opts.height, Title: opts.title,
			Units: string(opts.units), ToolWidth: opts.toolWidth, Intended: opts.intended,
		})
		if err != nil {
			return pictureError(err, "png")
		}
		pngData = buf.Bytes()
	}
	if svgPath != "" {
		var buf bytes.Buffer
		err := svg.Write(&buf, path, svg.Options{Units: string(opts.units), Title: opts.title, HoleRadius: opts.toolWidth / 2})
		if err != nil {
			return pictureError(err, "svg")
		}
		svgData = buf.Bytes()
	}
	if pngPath != "" {
		if err := writeFileAtomic(e, pngPath, func(w io.Writer) error { _, err := w.Write(pngData); return err }); err != nil {
			return err
		}
	}
	if svgPath != "" {
		if err := writeFileAtomic(e, svgPath, func(w io.Writer) error { _, err := w.Write(svgData); return err }); err != nil {
			return err
		}
	}
	return nil
}

// pictureError maps a preview or svg error to the flag it concerns;
// anything about the path itself is reported against the picture's flag.
func pictureError(err error, flagName string) error {
	var pe *preview.Error
	if errors.As(err, &pe) {
		switch pe.Field {
		case "Width":
			return badFlag("width", "%s pixels is out of range; use %d to %d", fmtNum(pe.Value), preview.MinWidth, preview.MaxSide)
		case "Height":
			return badFlag("height", "%s pixels is out of range; use %d to %d", fmtNum(pe.Value), preview.MinHeight, preview.MaxSide)
		case "ToolWidth":
			return badFlag("tool", "%s must be a finite number, zero or more", fmtNum(pe.Value))
		}
	}
	return badFlag(flagName, "%v", err)
}
