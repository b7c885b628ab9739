// Package preview draws a [toolpath.Path] as a picture an operator can read
// before cutting: a PNG in which every move of the machine is visible at
// equal scale on both axes.
//
// # What the picture shows
//
//   - Cut moves as solid lines shaded by depth: the deeper the cut, the
//     darker the blue. The depth range is that of the cutting moves.
//   - Travel moves (rapids, beam off, pen up) as thin dashed lines.
//   - The tool's actual width, when [Options.ToolWidth] is set (router tool
//     diameter or laser kerf), as a faint band along every cut, drawn at
//     the picture's scale: the band's edge is where the material ends.
//   - Holding tabs as hollow stretches of the cut line: a segment with
//     [toolpath.Tab], or a cutting move raised above the pass it belongs
//     to (the tool climbs, moves on, and goes back down).
//   - Holes and marks as circled crosses: a segment with [toolpath.Hole],
//     a dwell while cutting, or a vertical plunge at one XY that is not
//     followed by cutting in XY.
//   - The start of the first cut as a ringed dot and the cutting direction
//     as arrows spaced along the first cut loop.
//   - The intended shape ([Options.Intended]) as a thin black line on top.
//   - A scale bar of a round length, the extent of the cuts (W × H) with
//     units, a title and a legend of the styles present.
//
// Colours are chosen from a palette that stays distinct for red-green
// colour-blind readers (Okabe & Ito, "Color Universal Design", 2002), and
// every style is also told apart by line form and lightness, so a grey
// print still reads.
//
// # Large programs
//
// Moves are turned into pixel polylines first: a move shorter than a pixel
// is merged into the next, and an arc becomes a number of chords that grows
// with the square root of its radius in pixels (chord error at most a
// quarter pixel); the tool band is stroked opaque into a mask and laid on
// once. A program of a million moves draws in one to two seconds (see the
// benchmarks).
//
// The main entry points are [Render] and [WritePNG].
package preview
