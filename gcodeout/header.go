package gcodeout

import (
	"strconv"
	"unicode/utf8"
)

// Lengths of sanitised header text, in bytes (all printable ASCII after
// sanitising). A header line stays under 80 characters.
const (
	maxTitle = 60
	maxField = 68
)

// appendComment appends one comment line "(label text)" with text
// sanitised and cut to max bytes.
func appendComment(dst []byte, label, text string, max int) []byte {
	dst = append(dst, '(')
	dst = append(dst, label...)
	dst = appendSanitized(dst, text, max)
	return append(dst, ")\n"...)
}

// appendSanitized appends s made safe for the inside of a comment:
// '(' and ')' become '[' and ']', ';' becomes ',', '%' becomes a space,
// line breaks, tabs and other control characters become spaces, runes
// outside printable ASCII (and invalid UTF-8) become '?', runs of spaces
// collapse to one, leading and trailing spaces go, and the result is cut
// to at most max bytes. Nothing it appends can close the comment or start
// a new line, so the text can never become code.
func appendSanitized(dst []byte, s string, max int) []byte {
	start := len(dst)
	space := false // a space is pending
	for _, r := range s {
		var c byte
		switch {
		case r == '(':
			c = '['
		case r == ')':
			c = ']'
		case r == ';':
			c = ','
		case r == '%' || r == ' ' || r < 0x20 || r == 0x7f:
			c = ' '
		case r == utf8.RuneError || r > 0x7e:
			c = '?'
		default:
			c = byte(r)
		}
		if c == ' ' {
			space = len(dst) > start
			continue
		}
		n := 1
		if space {
			n = 2
		}
		if len(dst)-start+n > max {
			break
		}
		if space {
			dst = append(dst, ' ')
			space = false
		}
		dst = append(dst, c)
	}
	return dst
}

// Sanitize returns s as the writer would put it inside a comment, cut to
// max bytes (see [Header] for the rules). It is exported so that callers
// can show the user what their title will become.
func Sanitize(s string, max int) string {
	return string(appendSanitized(nil, s, max))
}

// appendHeader appends the header comment block.
func (w *Writer) appendHeader(b []byte) []byte {
	c := &w.cfg
	title := c.Title
	if len(appendSanitized(w.scratch[:0], title, maxTitle)) == 0 {
		title = "untitled"
	}
	b = appendComment(b, "program: ", title, maxTitle)
	b = append(b, "(machine: "...)
	b = append(b, c.Machine.String()...)
	b = append(b, ", units: "...)
	b = append(b, c.Units.String()...)
	b = append(b, ", coordinates to "...)
	b = appendFixed(b, int64(w.dec), 0)
	b = append(b, " decimals)\n"...)
	h := &c.Header
	if h.Shape != "" {
		b = appendComment(b, "shape: ", h.Shape, maxField)
	}
	if h.Tool != "" {
		label := "tool: "
		if c.Machine == Laser {
			label = "kerf: "
		} else if c.Machine == Plotter {
			label = "pen: "
		}
		b = appendComment(b, label, h.Tool, maxField)
	}
	switch {
	case h.Tolerance != "":
		b = appendComment(b, "tolerance: ", h.Tolerance, maxField)
	case c.Tolerance > 0:
		b = append(b, "(tolerance: "...)
		if t, ok := grid(c.Tolerance, w.scale*10); ok {
			b = appendFixed(b, t, w.dec+1)
		} else {
			b = strconv.AppendFloat(b, c.Tolerance, 'f', -1, 64)
		}
		b = append(b, ' ')
		b = append(b, c.Units.String()...)
		b = append(b, ")\n"...)
	}
	z := h.ZeroZ
	if z == "" {
		switch c.Machine {
		case Router:
			z = "top of the stock, cuts at negative Z"
		case Plotter:
			z = "the paper surface"
		case Laser:
			z = "not used, the program moves no Z"
			if c.UseFocusZ {
				z = "as set on the machine, the head goes to the focus height once"
			}
		}
	}
	b = appendComment(b, "Z0: ", z, maxField)
	for _, op := range h.Operations {
		if len(appendSanitized(w.scratch[:0], op, maxField)) > 0 {
			b = appendComment(b, "operation: ", op, maxField)
		}
	}
	return appendCaution(b, c.Machine)
}

// appendCaution appends the safety notes for the machine kind.
func appendCaution(b []byte, m Machine) []byte {
	b = append(b, "(CAUTION - before running it for real:)\n"...)
	switch m {
	case Router:
		b = append(b, "(- dry-run it first: cut air with the tool raised clear of the stock)\n"...)
		b = append(b, "(- check work zero X Y Z, the clamping and the tool and its holder)\n"...)
		b = append(b, "(- keep the guards in place and wear eye and hearing protection)\n"...)
	case Laser:
		b = append(b, "(- dry-run it with the beam off or at zero power, above the work)\n"...)
		b = append(b, "(- check work zero, how the work is held down and the focus)\n"...)
		b = append(b, "(- keep the enclosure closed and wear eyewear rated for this laser)\n"...)
		b = append(b, "(- never leave the laser running unattended)\n"...)
		b = append(b, "(- run the fume extraction for the whole job)\n"...)
	case Plotter:
		b = append(b, "(- dry-run it with the pen lifted clear of the paper)\n"...)
		b = append(b, "(- check work zero, that the paper is held flat and the pen)\n"...)
		b = append(b, "(- keep the guards in place, hands clear, and wear eye protection)\n"...)
	}
	return append(b, "(- follow the machine maker's instructions and local safety rules)\n"...)
}
