package svg

import (
	"encoding/xml"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/focitools/foci/toolpath"
)

// A small reader for the subset this package writes, for the tests: the
// document's size, its groups, the path data (absolute M, L and A with
// equal radii and no rotation) and the circles.

type docXML struct {
	XMLName xml.Name   `xml:"svg"`
	Width   string     `xml:"width,attr"`
	Height  string     `xml:"height,attr"`
	ViewBox string     `xml:"viewBox,attr"`
	Title   string     `xml:"title"`
	Groups  []groupXML `xml:"g"`
}

type groupXML struct {
	ID      string      `xml:"id,attr"`
	Paths   []pathXML   `xml:"path"`
	Circles []circleXML `xml:"circle"`
}

type pathXML struct {
	Class string `xml:"class,attr"`
	D     string `xml:"d,attr"`
}

type circleXML struct {
	CX float64 `xml:"cx,attr"`
	CY float64 `xml:"cy,attr"`
	R  float64 `xml:"r,attr"`
}

// readSegments turns path data back into segments in path coordinates
// (y negated again). Arcs get their centre from the SVG endpoint
// parametrisation (SVG 1.1, Implementation Notes F.6.5, with rx = ry and
// no rotation), radius scaled up when too small as F.6.6 says.
func readSegments(d string) (toolpath.Path, error) {
	f := strings.Fields(d)
	var out toolpath.Path
	var cur toolpath.Point
	nums := func(i, n int) ([]float64, error) {
		if i+n > len(f) {
			return nil, fmt.Errorf("command at field %d: want %d numbers", i, n)
		}
		v := make([]float64, n)
		for k := range v {
			x, err := strconv.ParseFloat(f[i+k], 64)
			if err != nil {
				return nil, err
			}
			v[k] = x
		}
		return v, nil
	}
	for i := 0; i < len(f); {
		switch f[i] {
		case "M":
			v, err := nums(i+1, 2)
			if err != nil {
				return nil, err
			}
			cur = toolpath.Point{X: v[0], Y: -v[1]}
			i += 3
		case "L":
			v, err := nums(i+1, 2)
			if err != nil {
				return nil, err
			}
			q := toolpath.Point{X: v[0], Y: -v[1]}
			out = append(out, toolpath.Segment{Kind: toolpath.Line, Start: cur, End: q})
			cur = q
			i += 3
		case "A":
			v, err := nums(i+1, 7)
			if err != nil {
				return nil, err
			}
			if v[0] != v[1] || v[2] != 0 {
				return nil, fmt.Errorf("arc with radii %v, %v and rotation %v", v[0], v[1], v[2])
			}
			// in SVG coordinates
			x1, y1 := cur.X, -cur.Y
			x2, y2 := v[5], v[6]
			r, large, sweep := v[0], v[3] == 1, v[4] == 1
			mx, my := (x1-x2)/2, (y1-y2)/2
			if l := (mx*mx + my*my) / (r * r); l > 1 {
				r *= math.Sqrt(l)
			}
			k := math.Sqrt(math.Max(0, (r*r-mx*mx-my*my)/(mx*mx+my*my)))
			if large == sweep {
				k = -k
			}
			cx := k*my + (x1+x2)/2
			cy := -k*mx + (y1+y2)/2
			q := toolpath.Point{X: x2, Y: -y2}
			// sweep-flag 1 turns clockwise on screen, which is clockwise
			// in path coordinates too once y is negated back
			out = append(out, toolpath.Segment{Kind: toolpath.Arc, Start: cur, End: q, CenterX: cx, CenterY: -cy, Radius: r, Clockwise: sweep})
			cur = q
			i += 8
		default:
			return nil, fmt.Errorf("unknown command %q", f[i])
		}
	}
	return out, nil
}
