// Package conformance checks toolpaths and programs against what they are
// meant to be: it reads RS-274 text back into a [toolpath.Path], checks it
// for machine safety and against an intended ellipse, and offers a suite
// that any generator of ellipse toolpaths can run.
//
// # Reading programs
//
// [Read] understands the subset of RS-274 that most programs for routers,
// lasers and pen plotters use: G0 G1 G2 G3 (centre form with I and J, or
// radius form with R), G4 (dwell, P in seconds), G17, G20 and G21, G90 and
// G91, G94, the F, S and T words, M2 and M30, M3, M4 and M5, comments in
// parentheses or after a semicolon, N words, % lines, upper or lower case,
// with or without spaces. It keeps the modal state the way the NIST
// RS274NGC interpreter does (Kramer, Proctor & Messina, "The NIST RS274NGC
// Interpreter, Version 3", NISTIR 6556, 2000): one code per modal group on a
// line, a line's words run in the order of that report's table of
// execution order, and a line with an error is not run at all. Anything
// outside the subset is reported as unsupported with its line rather than
// skipped in silence. Read never panics and never stops early: every
// problem becomes a [Violation] in [Program.Problems].
//
// The result is a [Program]: the path in one length unit, and for each
// segment a [Move] with its source line, the spindle or beam state, the
// feed and the S value in force.
//
// # Checking programs
//
// [Check] runs the rules a [Rules] value selects and returns every
// violation with its line and a rule name; [CheckReport] adds a
// [Summary] (counts of moves, largest deviation). The rules are:
//
//   - reading: syntax, unsupported, modal, bad-word, arc-invalid;
//   - arcs: arc-radius-mismatch (NIST RS274NGC v3 §3.5.3), arc-r-near-half;
//   - order: units-before-motion, feed-before-cut, program-end, after-end;
//   - safety: rapid-below-safe, rapid-beam-on, cut-spindle-off,
//     travel-limit;
//   - geometry against an intended curve: deviation, closed-loop, coverage.
//
// Each rule's exact meaning is in the documentation of its name constant,
// such as [RuleDeviation].
//
// # Checking generators
//
// The exported suite runs any [Generator] over a spread of ellipses,
// offsets, zones and tolerances and reports every misbehaviour, in the
// manner of testing/fstest.TestFS.
package conformance
