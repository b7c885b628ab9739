package toolpath

// Zone says on which side of the intended curve a path may deviate.
// Deviation is the signed distance from the intended curve (+ outward).
type Zone uint8

const (
	// Band allows deviation within ±Tol.
	Band Zone = iota
	// Outside allows deviation in [0, +Tol]: never inside the curve.
	Outside
	// Inside allows deviation in [−Tol, 0]: never outside the curve.
	Inside
)

// String returns "band", "outside" or "inside".
func (z Zone) String() string {
	switch z {
	case Band:
		return "band"
	case Outside:
		return "outside"
	case Inside:
		return "inside"
	}
	return "unknown"
}

// Limits returns the allowed range [lo, hi] of the signed deviation for
// tolerance tol.
func (z Zone) Limits(tol float64) (lo, hi float64) {
	switch z {
	case Outside:
		return 0, tol
	case Inside:
		return -tol, 0
	}
	return -tol, tol
}

// ParseZone returns the zone named s ("band", "outside", "inside").
func ParseZone(s string) (Zone, bool) {
	switch s {
	case "band":
		return Band, true
	case "outside":
		return Outside, true
	case "inside":
		return Inside, true
	}
	return 0, false
}

// Geometry says which segments an approximation uses.
type Geometry uint8

const (
	// Lines approximates with straight segments (G1).
	Lines Geometry = iota
	// Arcs approximates with tangent-continuous circular arcs (G2/G3),
	// falling back to a line where an arc would be too flat to write.
	Arcs
)

// String returns "lines" or "arcs".
func (g Geometry) String() string {
	if g == Arcs {
		return "arcs"
	}
	return "lines"
}

// ParseGeometry returns the geometry named s ("lines", "arcs").
func ParseGeometry(s string) (Geometry, bool) {
	switch s {
	case "lines":
		return Lines, true
	case "arcs":
		return Arcs, true
	}
	return 0, false
}
