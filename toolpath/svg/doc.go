// Package svg writes a [toolpath.Path] as an SVG drawing at true size, for
// laser, vinyl-cutter and drawing software that imports vector files.
//
// # Size and units
//
// The width and height attributes carry the unit ("mm" or "in") and the
// viewBox is in the same unit, so one user unit is one millimetre or one
// inch and the drawing imports at its real size. The box is the extent of
// everything drawn plus [Options.Margin].
//
// # Orientation
//
// SVG's y axis points down; a machine's points up. The writer negates y
// (y' = −y) so that the drawing reads as seen from above the table, not
// mirrored; coordinates in the file are therefore (x, −y). A
// counter-clockwise arc (seen from +Z) stays counter-clockwise on screen
// and is written with sweep-flag 0, a clockwise one with sweep-flag 1.
//
// # Content
//
// Moves are written in plan view (Z is dropped) as path data with M, L
// and A commands: lines stay lines and arcs stay true circular arcs. An
// arc is written in pieces of at most a quarter turn, so a full circle is
// four quarter arcs and no piece needs the large-arc flag. The reason is
// rounding: an SVG arc is given by its ends and radius, and when the radius
// is rounded by δ the centre of a half circle of radius r moves by
// √(2rδ) (0.1 mm for r = 100 mm at four decimals), while that of a
// quarter turn moves by only a few δ.
// Moves that do not move in XY (plunges, retracts, dwells) and moves that
// round to zero length are left out.
//
// Three groups keep the kinds apart so that an importer can pick:
//
//	<g id="travel">  travel moves, thin and dashed
//	<g id="cut">     cutting moves; stretches that leave a holding tab are
//	                 separate paths with class="tab"
//	<g id="marks">   holes and marks as circles
//
// Repeated passes over the same line (depth passes) are written as often
// as the machine makes them.
//
// The entry point is [Write].
package svg
