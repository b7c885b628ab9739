package gcodeout

import (
	"math"
	"strconv"
	"testing"
)

func TestAppendFixed(t *testing.T) {
	tests := []struct {
		n    int64
		d    int
		want string
	}{
		{0, 3, "0"},
		{1500, 3, "1.5"},
		{2000, 3, "2"},
		{-2000, 3, "-2"},
		{1, 3, "0.001"},
		{-5, 3, "-0.005"},
		{10, 3, "0.01"},
		{123456, 3, "123.456"},
		{-123450, 3, "-123.45"},
		{100000, 5, "1"},
		{1, 8, "0.00000001"},
		{7, 0, "7"},
		{70, 0, "70"},
		{maxGrid - 1, 3, "999999999999.999"},
		{-(maxGrid - 1), 8, "-9999999.99999999"},
		{1 << 53, 3, "9007199254740.992"},
	}
	for _, tt := range tests {
		if got := string(appendFixed(nil, tt.n, tt.d)); got != tt.want {
			t.Errorf("appendFixed(%d, %d) = %q, want %q", tt.n, tt.d, got, tt.want)
		}
	}
}

func TestGrid(t *testing.T) {
	tests := []struct {
		v     float64
		d     int
		want  int64
		valid bool
	}{
		{1.5, 3, 1500, true},
		{-0.0004, 3, 0, true}, // rounds to zero: printed "0", never "-0"
		{math.Copysign(0, -1), 3, 0, true},
		{0.0005, 3, 1, true},   // half away from zero (0.0005·1000 rounds to exactly 0.5)
		{-0.0005, 3, -1, true}, // likewise
		{1e12 - 0.001, 3, 1e15 - 1, true},
		{1e12, 3, 0, false}, // 1e15 units is the limit
		{-1e12, 3, 0, false},
		{math.NaN(), 3, 0, false},
		{math.Inf(1), 3, 0, false},
		{math.Inf(-1), 3, 0, false},
	}
	for _, tt := range tests {
		got, ok := grid(tt.v, math.Pow10(tt.d))
		if got != tt.want || ok != tt.valid {
			t.Errorf("grid(%v, 1e%d) = %d, %v; want %d, %v", tt.v, tt.d, got, ok, tt.want, tt.valid)
		}
	}
}

// TestGridAgreesWithCorrectRounding compares the writer's fixed-point text
// with strconv's correctly rounded 'f' formatting (a second, independent
// route) over values away from ties.
func TestGridAgreesWithCorrectRounding(t *testing.T) {
	for d := 3; d <= MaxDecimals; d++ {
		scale := math.Pow10(d)
		for k := 0; k < 2000; k++ {
			// Values spread over magnitudes, with fractional parts far
			// from a tie at d decimals.
			v := math.Ldexp(float64(k*7919%10007)/10007+0.001, k%40-20)
			if k%2 == 1 {
				v = -v
			}
			frac := math.Abs(v*scale) - math.Floor(math.Abs(v*scale))
			if math.Abs(frac-0.5) < 1e-6 {
				continue
			}
			n, ok := grid(v, scale)
			if !ok {
				t.Fatalf("grid(%v) out of range", v)
			}
			got := string(appendFixed(nil, n, d))
			want, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'f', d, 64), 64)
			back, err := strconv.ParseFloat(got, 64)
			if err != nil || back != want {
				t.Errorf("d=%d v=%v: wrote %q, correctly rounded value is %v", d, v, got, want)
			}
		}
	}
}

func TestDecimals(t *testing.T) {
	tests := []struct {
		tol   float64
		units Units
		want  int
	}{
		{0.05, MM, 3},   // half unit 0.0005 ≤ 0.0025
		{0.01, MM, 3},   // 0.0005 ≤ 0.0005: exactly a twentieth
		{0.0099, MM, 4}, // 0.0005 > 0.000495
		{0.001, MM, 4},
		{1, MM, 3},      // never fewer than 3 for mm
		{0.01, Inch, 5}, // never fewer than 5 for inch
		{0.0001, Inch, 5},
		{0.00009, Inch, 6},
		{1e-9, MM, MaxDecimals},
		{math.Inf(1), MM, 3},
		{math.Inf(1), Inch, 5},
		{0, MM, MaxDecimals},
		{-1, Inch, MaxDecimals},
		{math.NaN(), MM, MaxDecimals},
	}
	for _, tt := range tests {
		got := Decimals(tt.tol, tt.units)
		if got != tt.want {
			t.Errorf("Decimals(%v, %v) = %d, want %d", tt.tol, tt.units, got, tt.want)
		}
		// The rule itself, checked from the definition where it applies.
		if tt.tol > 0 && !math.IsInf(tt.tol, 0) && got < MaxDecimals {
			half := 0.5 / math.Pow10(got)
			if half > tt.tol/20*(1+1e-12) {
				t.Errorf("Decimals(%v) = %d: half unit %v > tol/20", tt.tol, got, half)
			}
			if got > MinDecimals(tt.units) && 0.5/math.Pow10(got-1) <= tt.tol/20*(1-1e-12) {
				t.Errorf("Decimals(%v) = %d: one fewer would do", tt.tol, got)
			}
		}
	}
}
