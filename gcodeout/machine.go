package gcodeout

// Machine is the kind of machine a program is written for. It decides how
// the tool is engaged: a router runs a spindle and moves in Z, a laser
// switches a beam and stays at one height, a plotter lifts and lowers a pen.
//
// The zero Machine is not a machine kind: a [Config] must name one.
type Machine uint8

const (
	// Router is a spindle machine (router or mill). The start block moves to
	// SafeZ and starts the spindle with M3 S<RPM>; the end block returns to
	// SafeZ and stops it with M5. Path Z values are written as given.
	Router Machine = iota + 1
	// Laser is a beam machine. The beam is off (M5) except during cutting
	// moves, where M3 S<Power> switches it on; travels are written with
	// the beam off. Path Z values are never written: the head stays at one
	// height (FocusZ, when the Config asks for a focus move).
	Laser
	// Plotter is a pen machine. The start and end blocks lift the pen to
	// PenUp; path Z values (pen up, pen down) are written as given. No
	// spindle or beam words are written.
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
// "plotter"), and false for any other string.
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
