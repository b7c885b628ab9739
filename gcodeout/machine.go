package gcodeout

import "github.com/focitools/foci/toolpath"

// Machine is the kind of machine a program is written for: the same type
// as [toolpath.Machine], so that one value flows from the operation that
// built a path to the writer. It decides how the writer engages the tool:
//
//   - Router, a spindle machine (router or mill): the start block moves to
//     SafeZ and starts the spindle with M3 S<RPM>; the end block returns to
//     SafeZ and stops it with M5. Path Z values are written as given.
//   - Laser, a beam machine: the beam is off (M5) except during cutting
//     moves, where M3 S<Power> switches it on; travels are written with the
//     beam off. Path Z values are never written: the head stays at one
//     height (FocusZ, when the Config asks for a focus move).
//   - Plotter, a pen machine: the start and end blocks lift the pen to
//     PenUp; path Z values (pen up, pen down) are written as given. No
//     spindle or beam words are written.
//
// The zero Machine is not a machine kind: a [Config] must name one.
type Machine = toolpath.Machine

// The machine kinds, as in package toolpath.
const (
	Router  = toolpath.Router
	Laser   = toolpath.Laser
	Plotter = toolpath.Plotter
)

// ParseMachine returns the machine kind named s ("router", "laser",
// "plotter"), and false for any other string.
func ParseMachine(s string) (Machine, bool) { return toolpath.ParseMachine(s) }

// Units is the length unit of a program: every coordinate, feed and
// height given to the writer is in this unit, and the writer converts
// nothing. The zero value is MM.
type Units uint8

const (
	// MM is millimetres (G21); feeds are millimetres per minute.
	MM Units = iota
	// Inch is inches (G20); feeds are inches per minute.
	Inch
)

// String returns "mm" or "inch", and "unknown" for any other value.
func (u Units) String() string {
	switch u {
	case MM:
		return "mm"
	case Inch:
		return "inch"
	}
	return "unknown"
}

// ParseUnits returns the units named s ("mm", "inch"), and false for any
// other string.
func ParseUnits(s string) (Units, bool) {
	switch s {
	case "mm":
		return MM, true
	case "inch":
		return Inch, true
	}
	return 0, false
}

// word returns the G word that selects the units.
func (u Units) word() string {
	if u == Inch {
		return "G20"
	}
	return "G21"
}
