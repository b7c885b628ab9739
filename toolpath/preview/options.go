package preview

import (
	"errors"
	"math"
	"strconv"

	"github.com/focitools/foci/ellipse"
)

// Picture size limits, in pixels.
const (
	// DefaultWidth and DefaultHeight are used when Options leaves them 0.
	DefaultWidth  = 1600
	DefaultHeight = 1000
	// MinWidth and MinHeight leave room for the title and the legend.
	MinWidth  = 480
	MinHeight = 320
	// MaxSide bounds each side so that a typo cannot ask for gigabytes.
	MaxSide = 12000
)

// Options says how to draw a path. The zero value draws at the default
// size with no title, lengths labelled in millimetres and no tool band.
type Options struct {
	// Width and Height are the picture size in pixels; 0 means
	// DefaultWidth and DefaultHeight. Each must lie in [MinWidth, MaxSide]
	// (or [MinHeight, MaxSide]).
	Width, Height int
	// Title is printed at the top left; empty prints no title line.
	Title string
	// Units names the length unit of the path for labels: "mm" (the
	// default when empty) or "inch" (shown as "in").
	Units string
	// ToolWidth is the width the tool removes, in path units: the router
	// tool's diameter or the laser's kerf. 0 draws no band.
	ToolWidth float64
	// Intended are the shapes the path is meant to produce (the part's
	// edges), drawn as thin reference lines. They also count for the frame.
	Intended []ellipse.Parallel
}

// Sentinel errors wrapped by [*Error].
var (
	// ErrOutOfRange reports an option outside its limits.
	ErrOutOfRange = errors.New("out of range")
	// ErrNotFinite reports a NaN or infinite coordinate or option.
	ErrNotFinite = errors.New("not a finite number")
	// ErrEmpty reports a path with no segments.
	ErrEmpty = errors.New("the path has no segments to draw")
	// ErrUnits reports a unit name other than mm or inch.
	ErrUnits = errors.New("unknown unit; use mm or inch")
)

// Error records a rejected option or path value.
type Error struct {
	Field string  // "Width", "ToolWidth", "path[12].End.X", ...
	Value float64 // the rejected value (0 when not numeric)
	Limit string  // the allowed range, when there is one
	Err   error   // one of the sentinel errors
}

// Error returns a message such as
// "preview: Width 99: out of range (320 to 12000)".
func (e *Error) Error() string {
	b := []byte("preview: ")
	if e.Field != "" {
		b = append(b, e.Field...)
		b = append(b, ' ')
		b = strconv.AppendFloat(b, e.Value, 'g', -1, 64)
		b = append(b, ": "...)
	}
	b = append(b, e.Err.Error()...)
	if e.Limit != "" {
		b = append(b, " ("...)
		b = append(b, e.Limit...)
		b = append(b, ')')
	}
	return string(b)
}

// Unwrap returns the sentinel error.
func (e *Error) Unwrap() error { return e.Err }

// resolved holds the options after defaults and checks.
type resolved struct {
	width, height int
	title         string
	unit          string // label: "mm" or "in"
	toolWidth     float64
	intended      []ellipse.Parallel
}

// resolve applies defaults and validates o.
func resolve(o Options) (resolved, error) {
	r := resolved{width: o.Width, height: o.Height, title: o.Title, toolWidth: o.ToolWidth, intended: o.Intended}
	if r.width == 0 {
		r.width = DefaultWidth
	}
	if r.height == 0 {
		r.height = DefaultHeight
	}
	if r.width < MinWidth || r.width > MaxSide {
		return r, &Error{Field: "Width", Value: float64(r.width), Limit: strconv.Itoa(MinWidth) + " to " + strconv.Itoa(MaxSide), Err: ErrOutOfRange}
	}
	if r.height < MinHeight || r.height > MaxSide {
		return r, &Error{Field: "Height", Value: float64(r.height), Limit: strconv.Itoa(MinHeight) + " to " + strconv.Itoa(MaxSide), Err: ErrOutOfRange}
	}
	switch o.Units {
	case "", "mm":
		r.unit = "mm"
	case "inch", "in":
		r.unit = "in"
	default:
		return r, &Error{Err: ErrUnits, Limit: "got " + strconv.Quote(o.Units)}
	}
	if math.IsNaN(o.ToolWidth) || math.IsInf(o.ToolWidth, 0) {
		return r, &Error{Field: "ToolWidth", Value: o.ToolWidth, Err: ErrNotFinite}
	}
	if o.ToolWidth < 0 {
		return r, &Error{Field: "ToolWidth", Value: o.ToolWidth, Limit: "0 or more", Err: ErrOutOfRange}
	}
	for i, c := range o.Intended {
		// The zero Parallel has no ellipse behind it; its length is not a
		// positive number.
		if l := c.Length(); !(l > 0) || math.IsInf(l, 0) {
			return r, &Error{Field: "Intended[" + strconv.Itoa(i) + "] length", Value: l, Limit: "build it with ellipse.FromSize and Parallel", Err: ErrNotFinite}
		}
	}
	return r, nil
}
