package gcodeout

import (
	"math"
	"strconv"
)

// Numbers are written in fixed point: a value v at d decimals is first
// turned into the integer n = round(v·10^d) (half away from zero), and n
// is printed with a decimal point inserted d places from the right and
// trailing zeros trimmed. The writer keeps positions as these integers, so
// it knows exactly what a reader will read back: I and J are differences
// of two printed grid values, and "has Z changed" compares printed values,
// not floats.
//
// v·10^d is a single rounded product (no sum for a fused multiply-add to
// absorb) and 10^d is exact for d ≤ 22, so the integer, and the text, are
// the same on every architecture.

// maxGrid bounds |n|: 10^15 is below 2^53, where every integer is exact in
// a float64, so grid arithmetic done in floating point (radii of arcs)
// stays exact up to the final square root. At 3 decimals it allows
// coordinates up to 10^12 in magnitude, at 8 decimals up to 10^7.
const maxGrid = 1e15

// wordDecimals is the number of decimals of F, S and P words.
const wordDecimals = 3

// grid returns round(v·scale) and true, or 0 and false when v is not
// finite or the result is not below maxGrid in magnitude.
func grid(v, scale float64) (int64, bool) {
	p := math.Round(float64(v * scale))
	if !(math.Abs(p) < maxGrid) { // also refuses NaN
		return 0, false
	}
	return int64(p), true
}

// appendFixed appends n·10^-d in fixed point with trailing zeros trimmed:
// 1500 at 3 decimals is "1.5", 2000 is "2", -5 is "-0.005", 0 is "0"
// (never "-0"), and no exponent is ever written. Any int64 but the most
// negative one is printed correctly.
func appendFixed(dst []byte, n int64, d int) []byte {
	if n == 0 {
		return append(dst, '0')
	}
	if n < 0 {
		dst = append(dst, '-')
		n = -n
	}
	var scratch [24]byte
	digits := strconv.AppendUint(scratch[:0], uint64(n), 10)
	frac := d
	for frac > 0 && digits[len(digits)-1] == '0' {
		digits = digits[:len(digits)-1]
		frac--
	}
	if len(digits) <= frac {
		dst = append(dst, '0', '.')
		for i := len(digits); i < frac; i++ {
			dst = append(dst, '0')
		}
		return append(dst, digits...)
	}
	whole := len(digits) - frac
	dst = append(dst, digits[:whole]...)
	if frac > 0 {
		dst = append(dst, '.')
		dst = append(dst, digits[whole:]...)
	}
	return dst
}
