package gcodeout_test

import (
	"errors"
	"io"
	"math"
	"testing"

	"github.com/focitools/foci/gcodeout"
)

func validRouter() gcodeout.Config {
	return gcodeout.Config{Machine: gcodeout.Router, Feed: 1000, RPM: 12000, SafeZ: 5}
}

func TestNewWriterRefusesBadConfig(t *testing.T) {
	tests := []struct {
		name   string
		change func(c *gcodeout.Config)
		msg    string
		err    error
	}{
		{"no machine", func(c *gcodeout.Config) { c.Machine = 0 }, "gcodeout: Machine 0: unknown value", gcodeout.ErrUnknown},
		{"bad machine", func(c *gcodeout.Config) { c.Machine = 9 }, "gcodeout: Machine 9: unknown value", gcodeout.ErrUnknown},
		{"bad units", func(c *gcodeout.Config) { c.Units = 2 }, "gcodeout: Units 2: unknown value", gcodeout.ErrUnknown},
		{"zero feed", func(c *gcodeout.Config) { c.Feed = 0 }, "gcodeout: Feed 0: must be greater than zero", gcodeout.ErrNotPositive},
		{"negative feed", func(c *gcodeout.Config) { c.Feed = -3 }, "gcodeout: Feed -3: must not be negative", gcodeout.ErrNegative},
		{"NaN feed", func(c *gcodeout.Config) { c.Feed = math.NaN() }, "gcodeout: Feed NaN: not a finite number", gcodeout.ErrNotFinite},
		{"huge feed", func(c *gcodeout.Config) { c.Feed = 1e20 }, "gcodeout: Feed 1e+20: out of range (limit 1e+12)", gcodeout.ErrRange},
		{"feed that prints as zero", func(c *gcodeout.Config) { c.Feed = 0.0004 }, "gcodeout: Feed 0.0004: out of range (limit 0.0005)", gcodeout.ErrRange},
		{"spindle speed that prints as zero", func(c *gcodeout.Config) { c.RPM = 1e-9 }, "gcodeout: RPM 1e-09: out of range (limit 0.0005)", gcodeout.ErrRange},
		{"negative plunge", func(c *gcodeout.Config) { c.PlungeFeed = -1 }, "gcodeout: PlungeFeed -1: must not be negative", gcodeout.ErrNegative},
		{"router without rpm", func(c *gcodeout.Config) { c.RPM = 0 }, "gcodeout: RPM 0: must be greater than zero", gcodeout.ErrNotPositive},
		{"router safe z at zero", func(c *gcodeout.Config) { c.SafeZ = 0 }, "gcodeout: SafeZ 0: must be greater than zero", gcodeout.ErrNotPositive},
		{"router safe z below", func(c *gcodeout.Config) { c.SafeZ = -2 }, "gcodeout: SafeZ -2: must be greater than zero", gcodeout.ErrNotPositive},
		{"infinite safe z", func(c *gcodeout.Config) { c.SafeZ = math.Inf(1) }, "gcodeout: SafeZ +Inf: not a finite number", gcodeout.ErrNotFinite},
		{"negative spin-up", func(c *gcodeout.Config) { c.SpinUp = -1 }, "gcodeout: SpinUp -1: must not be negative", gcodeout.ErrNegative},
		{"too few decimals", func(c *gcodeout.Config) { c.Decimals = 2 }, "gcodeout: Decimals 2: out of range (limit 3)", gcodeout.ErrRange},
		{"too few inch decimals", func(c *gcodeout.Config) { c.Units, c.Decimals = gcodeout.Inch, 4 }, "gcodeout: Decimals 4: out of range (limit 5)", gcodeout.ErrRange},
		{"too many decimals", func(c *gcodeout.Config) { c.Decimals = 9 }, "gcodeout: Decimals 9: out of range (limit 8)", gcodeout.ErrRange},
		{"negative tolerance", func(c *gcodeout.Config) { c.Tolerance = -0.1 }, "gcodeout: Tolerance -0.1: must not be negative", gcodeout.ErrNegative},
		{"laser without power", func(c *gcodeout.Config) { c.Machine = gcodeout.Laser }, "gcodeout: Power 0: must be greater than zero", gcodeout.ErrNotPositive},
		{"negative pierce", func(c *gcodeout.Config) { c.Machine, c.Power, c.PierceDwell = gcodeout.Laser, 500, -0.1 }, "gcodeout: PierceDwell -0.1: must not be negative", gcodeout.ErrNegative},
		{"plotter pen up at pen down", func(c *gcodeout.Config) { c.Machine, c.PenUp, c.PenDown = gcodeout.Plotter, 1, 1 }, "gcodeout: PenUp 1: must be above PenDown (limit 1)", gcodeout.ErrPenHeights},
		{"plotter pen up unset", func(c *gcodeout.Config) { c.Machine = gcodeout.Plotter }, "gcodeout: PenUp 0: must be above PenDown (limit 0)", gcodeout.ErrPenHeights},
		{"height beyond the grid", func(c *gcodeout.Config) { c.SafeZ = 1e14 }, "gcodeout: SafeZ 1e+14: out of range (limit 1e+12)", gcodeout.ErrRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			cfg := validRouter()
			tt.change(&cfg)
			w, err := gcodeout.NewWriter(io.Discard, cfg)
			if err == nil {
				t.Fatalf("NewWriter accepted %+v", cfg)
			}
			if w != nil {
				t.Errorf("NewWriter returned a Writer with an error")
			}
			if err.Error() != tt.msg {
				t.Errorf("error %q, want %q", err, tt.msg)
			}
			if !errors.Is(err, tt.err) {
				t.Errorf("error %q does not wrap %q", err, tt.err)
			}
			var ce *gcodeout.Error
			if !errors.As(err, &ce) {
				t.Errorf("error %T is not a *gcodeout.Error", err)
			}
		})
	}
}

func TestNewWriterAcceptsGoodConfig(t *testing.T) {
	tests := []struct {
		name     string
		cfg      gcodeout.Config
		decimals int
	}{
		{"router default decimals", validRouter(), 3},
		{"router from tolerance", func() gcodeout.Config { c := validRouter(); c.Tolerance = 0.002; return c }(), 4},
		{"router forced", func() gcodeout.Config { c := validRouter(); c.Tolerance = 0.002; c.Decimals = 6; return c }(), 6},
		{"inch default", func() gcodeout.Config { c := validRouter(); c.Units = gcodeout.Inch; return c }(), 5},
		{"laser, fields of other machines ignored", gcodeout.Config{Machine: gcodeout.Laser, Feed: 100, Power: 1, SafeZ: -3}, 3},
		{"plotter below zero", gcodeout.Config{Machine: gcodeout.Plotter, Feed: 100, PenUp: -1, PenDown: -2}, 3},
	}
	for _, tt := range tests {
		w, err := gcodeout.NewWriter(io.Discard, tt.cfg)
		if err != nil {
			t.Errorf("%s: %v", tt.name, err)
			continue
		}
		if w.Decimals() != tt.decimals {
			t.Errorf("%s: Decimals() = %d, want %d", tt.name, w.Decimals(), tt.decimals)
		}
	}
}

func TestParseNames(t *testing.T) {
	for _, m := range []gcodeout.Machine{gcodeout.Router, gcodeout.Laser, gcodeout.Plotter} {
		if got, ok := gcodeout.ParseMachine(m.String()); !ok || got != m {
			t.Errorf("ParseMachine(%q) = %v, %v", m.String(), got, ok)
		}
	}
	for _, u := range []gcodeout.Units{gcodeout.MM, gcodeout.Inch} {
		if got, ok := gcodeout.ParseUnits(u.String()); !ok || got != u {
			t.Errorf("ParseUnits(%q) = %v, %v", u.String(), got, ok)
		}
	}
	for _, s := range []string{"", "Router", "mill", "unknown"} {
		if _, ok := gcodeout.ParseMachine(s); ok {
			t.Errorf("ParseMachine(%q) accepted", s)
		}
	}
	for _, s := range []string{"", "MM", "in", "inches", "unknown"} {
		if _, ok := gcodeout.ParseUnits(s); ok {
			t.Errorf("ParseUnits(%q) accepted", s)
		}
	}
	if gcodeout.Machine(0).String() != "unknown" || gcodeout.Units(7).String() != "unknown" {
		t.Errorf("out-of-range values do not print as unknown")
	}
}
