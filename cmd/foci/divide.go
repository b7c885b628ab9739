package main

import (
	"errors"
	"fmt"

	"github.com/focitools/foci/ellipse"
)

// divideReport is the JSON form of "foci divide".
type divideReport struct {
	Units   string        `json:"units"`
	Offset  float64       `json:"offset"`
	Count   int           `json:"count"`
	Length  float64       `json:"length"`
	Spacing float64       `json:"spacing"`
	Points  []dividePoint `json:"points"`
}

type dividePoint struct {
	X float64 `json:"x"`
	Y float64 `json:"y"`
	S float64 `json:"s"`
	T float64 `json:"t"`
}

// maxDivideCount bounds -count so a typo cannot ask for gigabytes.
const maxDivideCount = 10_000_000

func runDivide(e *env, args []string) error {
	fs := newFlagSet("divide", "divide -size WxH -count N [-offset D] [shape flags] [-json]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	count := fs.Int("count", 0, "number of points `N` (1 to 10000000)")
	offset := fs.Float64("offset", 0, "signed `distance` of the parallel curve to divide (+ outward)")
	asJSON := fs.Bool("json", false, "print JSON instead of text")
	if err := parseFlags(fs, args, 0); err != nil {
		return err
	}
	if !shape.given() {
		return badFlag("size", "is required (for example -size 600x400)")
	}
	el, err := shape.ellipse()
	if err != nil {
		return err
	}
	if *count < 1 || *count > maxDivideCount {
		return badFlag("count", "%d is out of range; use 1 to %d", *count, maxDivideCount)
	}
	curve, err := parallelFlag(el, *offset)
	if err != nil {
		return err
	}
	pts, err := curve.Divide(make([]ellipse.DivisionPoint, 0, *count), *count)
	if err != nil {
		return badFlag("count", "%v", err)
	}
	r := divideReport{Units: shape.units, Offset: *offset, Count: *count, Length: curve.Length(), Spacing: curve.Length() / float64(*count)}
	r.Points = make([]dividePoint, len(pts))
	for i, p := range pts {
		r.Points[i] = dividePoint{p.X, p.Y, p.S, p.T}
	}
	if *asJSON {
		return writeJSON(e.stdout, r)
	}
	fmt.Fprintf(e.stdout, "%d points at equal arc length %.10g %s on a curve of length %.12g %s (offset %s)\n",
		r.Count, r.Spacing, shape.units, r.Length, shape.units, fmtNum(*offset))
	fmt.Fprintf(e.stdout, "%6s %16s %16s %16s %14s\n", "#", "x", "y", "s", "t (rad)")
	for i, p := range r.Points {
		fmt.Fprintf(e.stdout, "%6d %16.6f %16.6f %16.6f %14.10f\n", i, p.X, p.Y, p.S, p.T)
	}
	return nil
}

// parallelFlag returns the parallel curve at the -offset distance, with the
// fold limit named in the error.
func parallelFlag(el ellipse.Ellipse, d float64) (ellipse.Parallel, error) {
	c, err := el.Parallel(d)
	if err != nil {
		var ee *ellipse.Error
		if errors.As(err, &ee) && errors.Is(err, ellipse.ErrOffsetLimit) {
			return c, badFlag("offset", "%s is too far inward: an inward offset must be less than the minimum radius of curvature b²/a = %s, where the parallel curve folds", fmtNum(d), fmtNum(el.MinRadiusOfCurvature()))
		}
		return c, badFlag("offset", "%v", err)
	}
	return c, nil
}
