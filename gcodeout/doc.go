// Package gcodeout writes toolpaths as RS-274 programs (G-code) for a
// router, a laser or a plotter.
//
// # Programs
//
// A program written by [Writer] has, in order: a header of comments (the
// title, machine, units, shape, tool or kerf, tolerance, what Z0 means,
// the operations and a safety caution); one modal setup line (G21 or G20,
// G17 XY plane, G90 absolute distances, G94 feed per minute); a start
// block for the machine; the segments of the path; and an end block
// finishing with M2. The writer adds no motion of its own beyond the start
// and end blocks: the path says where to travel, plunge and lift, and
// package conformance checks that it is safe.
//
// The machine kinds differ in how the tool is engaged:
//
//   - [Router]: G0 to SafeZ, spindle on with M3 S<RPM> before any cut;
//     at the end back to SafeZ and M5.
//   - [Laser]: beam off (M5) at the start, on with M3 S<Power> only for
//     cutting moves (off again before every travel), an optional pierce
//     dwell at each beam-on, and no Z word unless a focus height is asked
//     for.
//   - [Plotter]: pen up to PenUp at the start and end; the path's Z values
//     lower and lift the pen.
//
// # Numbers
//
// Coordinates are written in fixed point with [Decimals] places chosen
// from the tolerance and units (or forced by [Config].Decimals), trailing
// zeros trimmed, never "-0" and never an exponent. Arcs are written in
// centre form (I J relative to the start, never R), and the start and end
// radii of every written arc agree within the limit of NIST RS274NGC v3
// §3.5.3 (Kramer, Proctor & Messina, NISTIR 6556, 2000): 0.002 mm or
// 0.0002 in. Header text is sanitised so that no title can become code.
//
// # Output
//
// [NewWriter] validates a [Config]; [Writer.WriteHeader],
// [Writer.WriteSegment] and [Writer.Close] write the program through a
// reused byte buffer, with no allocation per segment, and the same input
// always gives the same bytes. [WritePath] does it all for a whole
// [toolpath.Path].
//
// The package imports only the small standard library and builds for any
// GOOS and GOARCH, including wasip1/wasm.
package gcodeout
