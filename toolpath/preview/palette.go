package preview

import (
	"image/color"
	"math"
)

// The palette. Hues come from Okabe & Ito, "Color Universal Design" (2002),
// chosen to stay apart for red-green colour-blind readers; the styles also
// differ in line form and lightness so that a grey print still reads.
var (
	// cut lines run from a light blue (shallow) to a deep navy (deepest)
	cutShallow = color.NRGBA{158, 202, 225, 255}
	cutDeep    = color.NRGBA{8, 48, 107, 255}
	// travel is vermillion, dashed
	travelColor = color.NRGBA{213, 94, 0, 255}
	// the tool band is a faint sky blue
	bandColor = color.NRGBA{86, 180, 233, 72}
	// the intended shape, holes and outlines are black
	inkColor = color.NRGBA{0, 0, 0, 255}
	// start dot and arrows are orange with a black edge
	markColor = color.NRGBA{230, 159, 0, 255}
	// text that explains rather than labels
	noteColor  = color.NRGBA{70, 70, 70, 255}
	paperColor = color.NRGBA{255, 255, 255, 255}
)

// depthShades is the number of distinct depth shades.
const depthShades = 12

// shade returns the colour of depth bucket k of depthShades (0 shallow).
func shade(k int) color.NRGBA {
	f := float64(k) / (depthShades - 1)
	mix := func(a, b uint8) uint8 { return uint8(math.Round(float64(a) + f*(float64(b)-float64(a)))) }
	return color.NRGBA{mix(cutShallow.R, cutDeep.R), mix(cutShallow.G, cutDeep.G), mix(cutShallow.B, cutDeep.B), 255}
}

// bucket returns the depth bucket of height z for the cutting range
// [lo, hi]: hi (shallowest) is 0, lo (deepest) is depthShades-1. A single
// cutting height draws in the deepest shade.
func bucket(z, lo, hi float64) int {
	if !(hi > lo) {
		return depthShades - 1
	}
	f := (hi - z) / (hi - lo)
	k := int(math.Round(f * (depthShades - 1)))
	return max(0, min(k, depthShades-1))
}
