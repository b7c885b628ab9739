package gcodeout_test

import (
	"math"
	"regexp"
	"strconv"
	"strings"
)

// This file is a second route to the numbers: a small reader, written
// only for these tests, that reads a program back the way a controller
// would (modal state, I J relative to the current point) and checks the
// house format on the way. The tests compare what it reads with the path
// that was written.

// readMove is one motion line as read back.
type readMove struct {
	line     int        // line number, from 1
	g        int        // 0, 1, 2 or 3
	from, to [3]float64 // NaN where not yet known
	ci, cj   float64    // arc centre (from + I J)
	feed     float64    // modal feed in force
	beam     bool       // M3 in force (spindle or beam)
	hasZ     bool       // the line had a Z word
}

// readProgram is a program as read back.
type readProgram struct {
	moves   []readMove
	dwells  []float64 // P of every G4, in order
	lines   []string
	units   string    // "G20" or "G21"
	ended   bool      // M2 seen (and it is the last line)
	setup   int       // line of the modal setup
	sValues []float64 // every S word, in order
}

// numberFormat is the house number format: optional sign, digits, and a
// fraction without trailing zeros; never "-0", never an exponent.
var numberFormat = regexp.MustCompile(`^-?(0|[1-9][0-9]*)(\.[0-9]*[1-9])?$`)

// reporter is what readBack needs of a *testing.T or a *rapid.T.
type reporter interface {
	Helper()
	Errorf(format string, args ...any)
	Fatalf(format string, args ...any)
}

// readBack reads text, reporting through t every departure from the
// format the writer promises.
func readBack(t reporter, text string) readProgram {
	t.Helper()
	var p readProgram
	if !strings.HasSuffix(text, "\n") {
		t.Errorf("program does not end with a newline")
	}
	p.lines = strings.Split(strings.TrimSuffix(text, "\n"), "\n")
	pos := [3]float64{math.NaN(), math.NaN(), math.NaN()}
	feed, beam := math.NaN(), false
	for n, line := range p.lines {
		ln := n + 1
		if p.ended {
			t.Errorf("line %d %q: after M2", ln, line)
		}
		if strings.HasPrefix(line, "(") {
			inner := strings.TrimSuffix(strings.TrimPrefix(line, "("), ")")
			if !strings.HasSuffix(line, ")") || strings.ContainsAny(inner, "();%") {
				t.Errorf("line %d %q: not a single clean comment", ln, line)
			}
			for _, r := range inner {
				if r < 0x20 || r > 0x7e {
					t.Errorf("line %d %q: character %U in a comment", ln, line, r)
				}
			}
			continue
		}
		words := strings.Split(line, " ")
		var gs []int
		vals := map[byte]float64{}
		for _, wd := range words {
			if len(wd) < 2 {
				t.Fatalf("line %d %q: bad word %q", ln, line, wd)
			}
			letter, num := wd[0], wd[1:]
			if !numberFormat.MatchString(num) {
				t.Errorf("line %d %q: number %q breaks the format", ln, line, num)
			}
			v, err := strconv.ParseFloat(num, 64)
			if err != nil {
				t.Fatalf("line %d %q: %v", ln, line, err)
			}
			if letter == 'G' || letter == 'M' {
				if letter == 'M' {
					v += 1000
				}
				gs = append(gs, int(v))
				continue
			}
			if _, dup := vals[letter]; dup {
				t.Errorf("line %d %q: word %c twice", ln, line, letter)
			}
			vals[letter] = v
		}
		if f, ok := vals['F']; ok {
			feed = f
		}
		if s, ok := vals['S']; ok {
			p.sValues = append(p.sValues, s)
		}
		motion := -1
		for _, g := range gs {
			switch g {
			case 0, 1, 2, 3:
				motion = g
			case 4:
				p.dwells = append(p.dwells, vals['P'])
			case 17, 90, 94:
			case 20, 21:
				p.units = "G" + strconv.Itoa(g)
				p.setup = ln
			case 1003:
				beam = true
			case 1005:
				beam = false
			case 1002:
				p.ended = true
			default:
				t.Errorf("line %d %q: unexpected code %d", ln, line, g)
			}
		}
		_, hx := vals['X']
		_, hy := vals['Y']
		_, hz := vals['Z']
		if motion < 0 {
			if hx || hy || hz {
				t.Errorf("line %d %q: axis words without a motion word", ln, line)
			}
			continue
		}
		if hx != hy {
			t.Errorf("line %d %q: X and Y not written together", ln, line)
		}
		if p.setup == 0 {
			t.Errorf("line %d %q: motion before the units are set", ln, line)
		}
		m := readMove{line: ln, g: motion, from: pos, feed: feed, beam: beam, hasZ: hz}
		to := pos
		if hx {
			to[0], to[1] = vals['X'], vals['Y']
		}
		if hz {
			to[2] = vals['Z']
		}
		if motion >= 2 {
			i, hi := vals['I']
			j, hj := vals['J']
			if !hi || !hj || !hx {
				t.Errorf("line %d %q: arc without X Y I J", ln, line)
			}
			if _, r := vals['R']; r {
				t.Errorf("line %d %q: R word", ln, line)
			}
			m.ci, m.cj = pos[0]+i, pos[1]+j
		}
		if motion >= 1 && math.IsNaN(feed) {
			t.Errorf("line %d %q: feed move before any F", ln, line)
		}
		m.to = to
		pos = to
		p.moves = append(p.moves, m)
	}
	if !p.ended {
		t.Errorf("no M2 at the end")
	}
	return p
}

// radii returns the start and end radius of an arc as read back.
func (m readMove) radii() (start, end float64) {
	return math.Hypot(m.from[0]-m.ci, m.from[1]-m.cj), math.Hypot(m.to[0]-m.ci, m.to[1]-m.cj)
}
