package toolpath

import (
	"math"

	"github.com/focitools/foci/ellipse"
)

// Machine is the kind of machine an operation builds a path for. It
// decides how the tool is engaged: a router plunges into the stock and
// travels at a safe height, a laser stays at one height and cuts wherever
// the motion is Cut (the writer switches the beam off for every Travel),
// a plotter lowers and lifts a pen. The zero Machine is not a machine
// kind: a [Setup] must name one.
type Machine uint8

const (
	// Router is a spindle machine (router or mill) with a clockwise
	// spindle: paths travel at SafeZ, feed into the stock with Cut moves
	// and retract to SafeZ at the end.
	Router Machine = iota + 1
	// Laser is a beam machine: every segment is at Z = FocusZ, cutting
	// moves are Cut and every move with the beam off is Travel.
	Laser
	// Plotter is a pen machine: the pen travels at PenUp, is lowered to
	// PenDown by a Cut move and lifted by a Travel move.
	Plotter
)

// String returns "router", "laser" or "plotter", and "unknown" for any
// other value.
func (m Machine) String() string {
	switch m {
	case Router:
		return "router"
	case Laser:
		return "laser"
	case Plotter:
		return "plotter"
	}
	return "unknown"
}

// ParseMachine returns the machine kind named s ("router", "laser",
// "plotter").
func ParseMachine(s string) (Machine, bool) {
	switch s {
	case "router":
		return Router, true
	case "laser":
		return Laser, true
	case "plotter":
		return Plotter, true
	}
	return 0, false
}

// Setup holds what every operation needs besides its own geometry: the
// machine, the approximation settings and the heights. Lengths are in the
// caller's unit, whatever it is.
type Setup struct {
	// Machine is the machine kind; it must be set.
	Machine Machine
	// Tol, Geometry and Decimals are passed to the approximation of every
	// curve (see [Spec]). Tol must be greater than zero.
	Tol      float64
	Geometry Geometry
	Decimals int
	// SafeZ is the router's travel height above Z0 (the top of the
	// stock); it must be greater than zero for a router and unset for
	// other machines. Every travel in XY is at SafeZ.
	SafeZ float64
	// PenUp is the plotter's travel height; it must be above PenDown.
	// PenDown is its drawing height (0, the paper, by default). Both must
	// be unset for other machines.
	PenUp, PenDown float64
	// FocusZ is the laser's height, given to every segment of a laser
	// path (the writer writes it once, if asked to, and no Z otherwise).
	// It must be unset for other machines.
	FocusZ float64
	// PlungeFeed, when greater than zero, is set as the Feed of every
	// move into the stock (plunges, drilling, pen-down moves); zero
	// leaves their Feed at 0 so that the writer's plunge feed applies.
	PlungeFeed float64
}

// check validates the setup for its machine.
func (s *Setup) check() error {
	if s.Machine < Router || s.Machine > Plotter {
		return opErr("Machine", float64(s.Machine), ErrMachine)
	}
	if err := checkPositive("Tol", s.Tol); err != nil {
		return err
	}
	if s.Geometry > Arcs {
		return opErr("Geometry", float64(s.Geometry), ErrChoice)
	}
	if err := checkNonNegative("PlungeFeed", s.PlungeFeed); err != nil {
		return err
	}
	for _, f := range []struct {
		name string
		v    float64
	}{{"SafeZ", s.SafeZ}, {"PenUp", s.PenUp}, {"PenDown", s.PenDown}, {"FocusZ", s.FocusZ}} {
		if err := checkFinite(f.name, f.v); err != nil {
			return err
		}
	}
	switch s.Machine {
	case Router:
		if !(s.SafeZ > 0) {
			return opErr("SafeZ", s.SafeZ, ErrNotPositive)
		}
		return firstErr(checkUnused("PenUp", s.PenUp), checkUnused("PenDown", s.PenDown), checkUnused("FocusZ", s.FocusZ))
	case Laser:
		return firstErr(checkUnused("SafeZ", s.SafeZ), checkUnused("PenUp", s.PenUp), checkUnused("PenDown", s.PenDown))
	default:
		if !(s.PenUp > s.PenDown) {
			return opLimit("PenUp", s.PenUp, s.PenDown, ErrPenHeights)
		}
		return firstErr(checkUnused("SafeZ", s.SafeZ), checkUnused("FocusZ", s.FocusZ))
	}
}

// firstErr returns the first non-nil error.
func firstErr(errs ...error) error {
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}

// travelZ returns the height of travel moves in XY.
func (s *Setup) travelZ() float64 {
	switch s.Machine {
	case Router:
		return s.SafeZ
	case Plotter:
		return s.PenUp
	}
	return s.FocusZ
}

// plungeFeed returns the Feed for moves into the stock.
func (s *Setup) plungeFeed() float64 { return s.PlungeFeed }

// Side says on which side of the outline the tool cuts: the other side
// is the part and is never cut into.
type Side uint8

const (
	// SideDefault is the machine's default: SideOutside for a router or
	// a laser, SideOn for a plotter.
	SideDefault Side = iota
	// SideOutside cuts a part out: the waste is outside the ellipse and
	// the tool centre runs outside it by the tool radius (half the kerf).
	SideOutside
	// SideInside cuts a hole: the waste is inside the ellipse and the
	// tool centre runs inside it by the tool radius (half the kerf).
	SideInside
	// SideOn runs the tool centre on the ellipse itself (a score line, an
	// engraving, a drawing).
	SideOn
)

// String returns "outside", "inside", "on" or "default".
func (s Side) String() string {
	switch s {
	case SideDefault:
		return "default"
	case SideOutside:
		return "outside"
	case SideInside:
		return "inside"
	case SideOn:
		return "on"
	}
	return "unknown"
}

// ParseSide returns the side named s ("outside", "inside", "on").
func ParseSide(s string) (Side, bool) {
	switch s {
	case "outside":
		return SideOutside, true
	case "inside":
		return SideInside, true
	case "on":
		return SideOn, true
	}
	return 0, false
}

// Direction says which way the tool runs around the outline.
type Direction uint8

const (
	// Climb milling, for a clockwise spindle: clockwise around an
	// outside contour (and on one), counter-clockwise around an inside
	// one. The cutter's teeth enter the material at full chip thickness.
	Climb Direction = iota
	// Conventional milling runs the other way: counter-clockwise around
	// an outside contour, clockwise around an inside one.
	Conventional
)

// String returns "climb" or "conventional".
func (d Direction) String() string {
	switch d {
	case Climb:
		return "climb"
	case Conventional:
		return "conventional"
	}
	return "unknown"
}

// ParseDirection returns the direction named s ("climb",
// "conventional").
func ParseDirection(s string) (Direction, bool) {
	switch s {
	case "climb":
		return Climb, true
	case "conventional":
		return Conventional, true
	}
	return 0, false
}

// clockwise reports whether the cut runs clockwise (seen from +Z) for
// side s (resolved) and direction d.
func clockwise(s Side, d Direction) bool {
	cw := s != SideInside
	if d == Conventional {
		cw = !cw
	}
	return cw
}

// MaxInsideTool returns the largest tool diameter (or kerf) an inside cut
// of e accepts at tolerance tol: 2·(b²/a − tol). The tool-centre path is
// the inward parallel curve at the tool radius r, and its tolerance zone
// lies up to tol further in; inward parallel curves of an ellipse fold
// (develop cusps) at the distance b²/a, the minimum radius of curvature
// at the ends of the major axis, so r + tol must stay below it.
func MaxInsideTool(e ellipse.Ellipse, tol float64) float64 {
	return 2 * (e.MinRadiusOfCurvature() - tol)
}

// DepthPasses returns the number of depth passes for a cut of depth
// depth at most stepDown deep each, and their common step: n =
// ⌈depth/stepDown⌉ (a ratio within 1e-9 of a whole number counts as
// whole) and step = depth/n, so that every pass steps down by the same
// amount, none by more than stepDown, and the last is exactly at depth.
// Both arguments must be greater than zero; a ratio above [MaxCount]
// gives MaxCount + 1 passes, which the operations refuse.
func DepthPasses(depth, stepDown float64) (n int, step float64) {
	q := depth / stepDown
	if !(q <= MaxCount) {
		return MaxCount + 1, depth / (MaxCount + 1)
	}
	r := math.Round(q)
	if math.Abs(q-r) <= 1e-9*math.Max(1, r) {
		q = r
	}
	n = max(1, int(math.Ceil(q)))
	return n, depth / float64(n)
}
