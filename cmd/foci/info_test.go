package main

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
)

func TestInfoJSONFieldsAgreeWithClosedForms(t *testing.T) {
	r := runFoci(t, "info", "-size", "600x400", "-center", "10,-5", "-rotate", "90", "-json")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	var got map[string]any
	if err := json.Unmarshal([]byte(r.stdout), &got); err != nil {
		t.Fatalf("JSON: %v\n%s", err, r.stdout)
	}
	num := func(k string) float64 {
		v, ok := got[k].(float64)
		if !ok {
			t.Fatalf("field %q missing or not a number in %s", k, r.stdout)
		}
		return v
	}
	a, b := 300.0, 200.0
	c := math.Sqrt(a*a - b*b)
	// Closed forms: e = c/a, 2ae = 2c, area πab, radii b²/a and a²/b. The
	// perimeter itself is checked against mpmath in the ellipse tests;
	// here it is held between Ramanujan's second approximation and a
	// hair above it.
	for _, w := range []struct {
		key  string
		want float64
	}{
		{"semi_major", a}, {"semi_minor", b}, {"eccentricity", c / a},
		{"focal_distance", 2 * c}, {"area", math.Pi * a * b},
		{"min_radius_of_curvature", b * b / a}, {"max_radius_of_curvature", a * a / b},
	} {
		if g := num(w.key); math.Abs(g-w.want) > 1e-12*w.want {
			t.Errorf("%s = %.17g, want %.17g", w.key, g, w.want)
		}
	}
	// Ramanujan's second approximation underestimates, by far less than
	// 1e-4 here (Villarino 2006).
	h := (a - b) * (a - b) / ((a + b) * (a + b))
	ram := math.Pi * (a + b) * (1 + 3*h/(10+math.Sqrt(4-3*h)))
	if p := num("perimeter"); !(p >= ram && p < ram*(1+1e-4)) {
		t.Errorf("perimeter %.17g, Ramanujan II %.17g", p, ram)
	}
	// Rotated by 90°: the foci lie on the world y axis through the centre.
	foci, ok := got["foci"].([]any)
	if !ok || len(foci) != 2 {
		t.Fatalf("foci = %v", got["foci"])
	}
	for i, f := range foci {
		xy := f.([]any)
		x, y := xy[0].(float64), xy[1].(float64)
		if math.Abs(x-10) > 1e-9 || math.Abs(math.Abs(y+5)-c) > 1e-9 {
			t.Errorf("focus %d = (%g, %g), want (10, -5 ± %g)", i, x, y, c)
		}
	}
}

func TestInfoAndDivideRefuseBadValuesNamingTheFlag(t *testing.T) {
	for _, c := range []struct {
		args []string
		flag string
	}{
		{[]string{"info"}, "-size"},
		{[]string{"info", "-size", "600"}, "-size"},
		{[]string{"info", "-size", "0x400"}, "-size"},
		{[]string{"info", "-size", "-600x400"}, "-size"},
		{[]string{"info", "-size", "NaNx400"}, "-size"},
		{[]string{"info", "-size", "1e300x400"}, "-size"},
		{[]string{"info", "-size", "600x400", "-center", "1"}, "-center"},
		{[]string{"info", "-size", "600x400", "-center", "inf,0"}, "-center"},
		{[]string{"info", "-size", "600x400", "-units", "furlong"}, "-units"},
		{[]string{"info", "-size", "600x400", "-rotate", "NaN"}, "-rotate"},
		{[]string{"divide", "-size", "600x400"}, "-count"},
		{[]string{"divide", "-size", "600x400", "-count", "-3"}, "-count"},
		{[]string{"divide", "-size", "600x400", "-count", "100000000"}, "-count"},
		{[]string{"divide", "-size", "600x400", "-count", "8", "-offset", "-133.4"}, "-offset"},
		{[]string{"divide", "-size", "600x400", "-count", "8", "-offset", "NaN"}, "-offset"},
	} {
		r := runFoci(t, c.args...)
		if r.code != 2 {
			t.Errorf("%v: exit %d, want 2 (stderr %q)", c.args, r.code, r.stderr)
			continue
		}
		if !strings.Contains(r.stderr, c.flag) {
			t.Errorf("%v: message %q does not name %s", c.args, r.stderr, c.flag)
		}
		if r.stdout != "" {
			t.Errorf("%v: wrote %q to stdout on error", c.args, r.stdout)
		}
	}
}

func TestDivideJSONPointsAreEquallySpacedOnTheCurve(t *testing.T) {
	r := runFoci(t, "divide", "-size", "600x400", "-count", "12", "-offset", "-20", "-json")
	if r.code != 0 {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	var got struct {
		Length  float64 `json:"length"`
		Spacing float64 `json:"spacing"`
		Points  []struct {
			X, Y, S, T float64
		} `json:"points"`
	}
	if err := json.Unmarshal([]byte(r.stdout), &got); err != nil {
		t.Fatal(err)
	}
	if len(got.Points) != 12 {
		t.Fatalf("%d points", len(got.Points))
	}
	// The parallel curve 20 mm in has length P − 2π·20.
	el := curveOf(t, 600, 400, 0, 0, 0, 0).Ellipse()
	if want := el.Perimeter() - 40*math.Pi; math.Abs(got.Length-want) > 1e-9*want {
		t.Errorf("length %.12g, want %.12g", got.Length, want)
	}
	curve := curveOf(t, 600, 400, 0, 0, 0, -20)
	for i, p := range got.Points {
		if want := float64(i) * got.Spacing; math.Abs(p.S-want) > 1e-9*got.Length {
			t.Errorf("point %d: s = %.12g, want %.12g", i, p.S, want)
		}
		if s := curve.ArcLength(0, p.T); math.Abs(s-p.S) > 1e-9*got.Length {
			t.Errorf("point %d: arc length to t is %.12g, want %.12g", i, s, p.S)
		}
		q := curve.PointAt(p.T)
		if math.Hypot(q.X-p.X, q.Y-p.Y) > 1e-9 {
			t.Errorf("point %d: (%g, %g) is not the curve point at t (%g, %g)", i, p.X, p.Y, q.X, q.Y)
		}
	}
	if p := got.Points[0]; math.Abs(p.X-280) > 1e-9 || math.Abs(p.Y) > 1e-9 {
		t.Errorf("first point (%g, %g), want (280, 0): the end of the own +x semi-axis", p.X, p.Y)
	}
}
