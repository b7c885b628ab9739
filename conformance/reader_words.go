package conformance

import (
	"math"
	"strconv"
)

// block is what one line says, gathered before any of it runs.
type block struct {
	has   uint32      // bit i set when the letter 'A'+i was given
	val   [26]float64 // word values by letter
	words bool        // the line holds at least one word
	// G codes by modal group, in tenths (G1 = 10, G38.2 = 382), -1 if none.
	motion, plane, distance, feedMode, units, dwell int16
	// M codes by group, -1 if none.
	stop, spindle int16
}

// Letter bits of the words the subset uses.
const (
	bitF = 1 << ('F' - 'A')
	bitI = 1 << ('I' - 'A')
	bitJ = 1 << ('J' - 'A')
	bitN = 1 << ('N' - 'A')
	bitP = 1 << ('P' - 'A')
	bitR = 1 << ('R' - 'A')
	bitS = 1 << ('S' - 'A')
	bitT = 1 << ('T' - 'A')
	bitX = 1 << ('X' - 'A')
	bitY = 1 << ('Y' - 'A')
	bitZ = 1 << ('Z' - 'A')

	bitsAxis = bitX | bitY | bitZ
	// bitsKnown are the letters of the subset besides G and M.
	bitsKnown = bitF | bitI | bitJ | bitN | bitP | bitR | bitS | bitT | bitX | bitY | bitZ
)

// maxMagnitude bounds every number: a value beyond it is no length, feed
// or speed any machine has, and refusing it keeps every later sum finite.
const maxMagnitude = 1e12

// maxNumberLength bounds the characters of one number.
const maxNumberLength = 64

// exactPow10 holds the exact powers of ten that a float64 represents.
var exactPow10 = [...]float64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

func (b *block) reset() {
	b.has = 0
	b.words = false
	b.motion, b.plane, b.distance, b.feedMode, b.units, b.dwell = -1, -1, -1, -1, -1, -1
	b.stop, b.spindle = -1, -1
}

func isBlank(c byte) bool { return c == ' ' || c == '\t' || c == '\r' || c == '\v' || c == '\f' }

// skipBlanks returns the index of the first non-blank byte at or after i.
func skipBlanks(s []byte, i int) int {
	for i < len(s) && isBlank(s[i]) {
		i++
	}
	return i
}

// scanNumber reads a decimal number starting at s[i]: an optional sign,
// digits with at most one decimal point ("1", "-1.5", ".5", "+2", "3.").
// Blanks inside are ignored, as RS274NGC ignores them everywhere outside
// comments (NISTIR 6556 §3.3). It returns the value, the index after the
// number, and a message when the text is no number. An exponent ("1e5")
// is not RS-274 and is refused.
func scanNumber(s []byte, i int) (v float64, next int, msg string) {
	j := skipBlanks(s, i)
	neg := false
	if j < len(s) && (s[j] == '+' || s[j] == '-') {
		neg = s[j] == '-'
		j = skipBlanks(s, j+1)
	}
	start := j
	var mant uint64
	digits, frac := 0, 0 // digits kept in mant, of which after the point
	sawDigit, sawDot, long := false, false, false
	end := j // index after the last digit or point
scan:
	for j < len(s) {
		c := s[j]
		switch {
		case c >= '0' && c <= '9':
			sawDigit = true
			if digits < 19 {
				mant = mant*10 + uint64(c-'0')
				if mant != 0 {
					digits++ // leading zeros are not significant
				}
				if sawDot {
					frac++
				}
			} else {
				long = true // more digits than a uint64 holds: ParseFloat
			}
			j++
			end = j
		case c == '.':
			if sawDot {
				return 0, j, "a number has two decimal points"
			}
			sawDot = true
			j++
			end = j
		case isBlank(c):
			k := skipBlanks(s, j)
			if k < len(s) && (s[k] >= '0' && s[k] <= '9' || s[k] == '.') {
				j = k
				continue
			}
			break scan
		default:
			break scan
		}
		if end-start > maxNumberLength {
			return 0, j, "a number is longer than " + strconv.Itoa(maxNumberLength) + " characters"
		}
	}
	if !sawDigit {
		return 0, end, "no number"
	}
	if end < len(s) && (s[end] == 'e' || s[end] == 'E') && end+1 < len(s) {
		if c := s[end+1]; c >= '0' && c <= '9' || c == '+' || c == '-' || c == '.' {
			return 0, end, "exponent notation (such as 1e5) is not RS-274; write the digits out"
		}
	}
	if !long && frac < len(exactPow10) && mant < 1<<53 {
		// Both operands are exact, so one division rounds correctly.
		v = float64(mant) / exactPow10[frac]
	} else {
		var buf [maxNumberLength + 2]byte
		t := buf[:0]
		for _, c := range s[start:end] {
			if !isBlank(c) {
				t = append(t, c)
			}
		}
		f, err := strconv.ParseFloat(string(t), 64)
		if err != nil {
			return 0, end, "number out of range"
		}
		v = f
	}
	if neg {
		v = -v
	}
	if math.Abs(v) > maxMagnitude {
		return 0, end, "number beyond ±1e12"
	}
	return v, end, ""
}

// lex gathers the words of line into s.blk. It returns false when the line
// has a syntax or modal error (already recorded); unsupported words and
// codes are recorded and lexing goes on.
func (s *simulator) lex(line []byte) bool {
	b := &s.blk
	b.reset()
	i := skipBlanks(line, 0)
	if i < len(line) && line[i] == '%' {
		if k := skipBlanks(line, i+1); k < len(line) && line[k] != ';' && line[k] != '(' {
			s.problem(RuleSyntax, "text after % on a program start or end line")
			return false
		}
		return true
	}
	if i < len(line) && line[i] == '/' {
		s.problem(RuleUnsupported, "block delete (/) is not in the subset; the line is read as if it were not there")
		i++
	}
	first := true
	for i < len(line) {
		c := line[i]
		switch {
		case isBlank(c):
			i++
			continue
		case c == ';':
			return true
		case c == '(':
			k := i + 1
			for k < len(line) && line[k] != ')' {
				if line[k] == '(' {
					s.problem(RuleSyntax, "a comment holds another opening parenthesis")
					return false
				}
				k++
			}
			if k == len(line) {
				s.problem(RuleSyntax, "a comment is not closed on its line")
				return false
			}
			i = k + 1
			continue
		}
		letter := c
		if letter >= 'a' && letter <= 'z' {
			letter -= 'a' - 'A'
		}
		if letter < 'A' || letter > 'Z' {
			s.problem(RuleSyntax, "unexpected character "+quoteByte(c))
			return false
		}
		v, next, msg := scanNumber(line, i+1)
		if msg != "" {
			s.problem(RuleSyntax, string(letter)+" word: "+msg)
			return false
		}
		i = next
		b.words = true
		if !s.word(letter, v, first) {
			return false
		}
		first = false
	}
	return true
}

// word files one word into the block, returning false on an error that
// stops the line.
func (s *simulator) word(letter byte, v float64, first bool) bool {
	b := &s.blk
	switch letter {
	case 'G':
		return s.gWord(v)
	case 'M':
		return s.mWord(v)
	}
	bit := uint32(1) << (letter - 'A')
	if bit&bitsKnown == 0 {
		s.problem(RuleUnsupported, string(letter)+" word is not in the subset (it is ignored)")
		return true
	}
	if b.has&bit != 0 {
		s.problem(RuleSyntax, string(letter)+" word appears twice on the line")
		return false
	}
	if letter == 'N' {
		if !first {
			s.problem(RuleSyntax, "N word (line number) must come first on the line")
			return false
		}
		if v < 0 || v != math.Trunc(v) {
			s.problem(RuleSyntax, "N word must be a whole number, zero or more")
			return false
		}
	}
	b.has |= bit
	b.val[letter-'A'] = v
	return true
}

// codeTenths returns v as a code in tenths (1 → 10, 38.2 → 382), or -1 when v is
// not a non-negative number with at most one decimal.
func codeTenths(v float64) int16 {
	t := math.Round(v * 10)
	if v < 0 || t > 9999 || math.Abs(v*10-t) > 1e-6 {
		return -1
	}
	return int16(t)
}

func codeName(letter byte, c int16) string {
	n := strconv.Itoa(int(c / 10))
	if c%10 != 0 {
		n += "." + strconv.Itoa(int(c%10))
	}
	return string(letter) + n
}

// setGroup stores c in a modal group slot, reporting two codes of one
// group on a line (an error in RS274NGC, NISTIR 6556 §3.4).
func (s *simulator) setGroup(slot *int16, letter byte, c int16, group string) bool {
	if *slot >= 0 {
		s.problem(RuleModal, codeName(letter, *slot)+" and "+codeName(letter, c)+" are both "+group+" codes; a line may hold one")
		return false
	}
	*slot = c
	return true
}

func (s *simulator) gWord(v float64) bool {
	b := &s.blk
	c := codeTenths(v)
	if c < 0 {
		s.problem(RuleSyntax, "G word: "+strconv.FormatFloat(v, 'f', -1, 64)+" is not a G code")
		return false
	}
	switch c {
	case 0, 10, 20, 30:
		return s.setGroup(&b.motion, 'G', c, "motion")
	case 40:
		return s.setGroup(&b.dwell, 'G', c, "non-modal")
	case 170:
		return s.setGroup(&b.plane, 'G', c, "plane")
	case 200, 210:
		return s.setGroup(&b.units, 'G', c, "units")
	case 900, 910:
		return s.setGroup(&b.distance, 'G', c, "distance mode")
	case 940:
		return s.setGroup(&b.feedMode, 'G', c, "feed mode")
	}
	// Outside the subset. Codes of the groups above still collide.
	var slot *int16
	group := ""
	switch {
	case c == 382 || c >= 800 && c <= 890 && c%10 == 0:
		slot, group = &b.motion, "motion"
	case c == 180 || c == 190:
		slot, group = &b.plane, "plane"
	case c == 930:
		slot, group = &b.feedMode, "feed mode"
	}
	s.problem(RuleUnsupported, codeName('G', c)+" is not in the subset (it is ignored)")
	if slot != nil && *slot >= 0 {
		return s.setGroup(slot, 'G', c, group)
	}
	return true
}

func (s *simulator) mWord(v float64) bool {
	b := &s.blk
	c := codeTenths(v)
	if c < 0 || c%10 != 0 {
		s.problem(RuleSyntax, "M word: "+strconv.FormatFloat(v, 'f', -1, 64)+" is not an M code")
		return false
	}
	switch c {
	case 20, 300:
		return s.setGroup(&b.stop, 'M', c, "stopping")
	case 30, 40, 50:
		return s.setGroup(&b.spindle, 'M', c, "spindle")
	case 60:
		s.problem(RuleUnsupported, "M6 tool change is not in the subset (the T number is kept, no change is simulated)")
		return true
	}
	s.problem(RuleUnsupported, codeName('M', c)+" is not in the subset (it is ignored)")
	return true
}

// quoteByte names a byte for a message: printable ASCII in quotes, others
// in hexadecimal.
func quoteByte(c byte) string {
	if c >= 0x21 && c < 0x7f {
		return "'" + string(c) + "'"
	}
	const hex = "0123456789abcdef"
	return "byte 0x" + string(hex[c>>4]) + string(hex[c&15])
}
