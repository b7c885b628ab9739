package main

import (
	"fmt"
	"math"
)

// infoReport is the JSON form of "foci info".
type infoReport struct {
	Units                string        `json:"units"`
	SemiMajor            float64       `json:"semi_major"`
	SemiMinor            float64       `json:"semi_minor"`
	Eccentricity         float64       `json:"eccentricity"`
	FocalDistance        float64       `json:"focal_distance"`
	Foci                 [2][2]float64 `json:"foci"`
	Area                 float64       `json:"area"`
	Perimeter            float64       `json:"perimeter"`
	MinRadiusOfCurvature float64       `json:"min_radius_of_curvature"`
	MaxRadiusOfCurvature float64       `json:"max_radius_of_curvature"`
	MajorAxisAngle       float64       `json:"major_axis_angle_deg"`
}

func runInfo(e *env, args []string) error {
	fs := newFlagSet("info", "info -size WxH [-center X,Y] [-rotate DEG] [-units mm|inch] [-json]", e.stderr)
	var shape shapeFlags
	shape.register(fs, "")
	asJSON := fs.Bool("json", false, "print JSON instead of text")
	if err := parseFlags(fs, args, 0); err != nil {
		return err
	}
	if !shape.given() {
		return badFlag("size", "is required (for example -size 600x400)")
	}
	el, err := shape.ellipse()
	if err != nil {
		return err
	}
	f1, f2 := el.Foci()
	r := infoReport{
		Units:                shape.units,
		SemiMajor:            el.SemiMajor(),
		SemiMinor:            el.SemiMinor(),
		Eccentricity:         el.Eccentricity(),
		FocalDistance:        el.FocalDistance(),
		Foci:                 [2][2]float64{{f1.X, f1.Y}, {f2.X, f2.Y}},
		Area:                 el.Area(),
		Perimeter:            el.Perimeter(),
		MinRadiusOfCurvature: el.MinRadiusOfCurvature(),
		MaxRadiusOfCurvature: el.MaxRadiusOfCurvature(),
		MajorAxisAngle:       el.MajorAngle() * 180 / math.Pi,
	}
	if *asJSON {
		return writeJSON(e.stdout, r)
	}
	u := shape.units
	w := e.stdout
	fmt.Fprintf(w, "ellipse %s x %s %s, centre %s, major axis at %.6g°\n", fmtNum(2*el.SemiX()), fmtNum(2*el.SemiY()), u, shape.center, r.MajorAxisAngle)
	fmt.Fprintf(w, "  semi-major a          %.10g %s\n", r.SemiMajor, u)
	fmt.Fprintf(w, "  semi-minor b          %.10g %s\n", r.SemiMinor, u)
	fmt.Fprintf(w, "  eccentricity e        %.10g\n", r.Eccentricity)
	fmt.Fprintf(w, "  focal distance 2ae    %.10g %s\n", r.FocalDistance, u)
	fmt.Fprintf(w, "  foci                  (%.10g, %.10g) and (%.10g, %.10g)\n", f1.X, f1.Y, f2.X, f2.Y)
	fmt.Fprintf(w, "  area πab              %.10g %s²\n", r.Area, u)
	fmt.Fprintf(w, "  perimeter 4aE(e)      %.12g %s\n", r.Perimeter, u)
	fmt.Fprintf(w, "  min radius b²/a       %.10g %s (inward offsets and tools must stay below this)\n", r.MinRadiusOfCurvature, u)
	fmt.Fprintf(w, "  max radius a²/b       %.10g %s\n", r.MaxRadiusOfCurvature, u)
	return nil
}
