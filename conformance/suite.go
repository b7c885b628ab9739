package conformance

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/focitools/foci/ellipse"
	"github.com/focitools/foci/toolpath"
)

// Generator is anything that turns an intended curve into a closed
// toolpath: an ellipse or a parallel curve of one, a tolerance zone and a
// tolerance in, segments appended to dst out. [TestGenerator] checks one.
type Generator interface {
	// Generate appends to dst a closed path of cutting lines and arcs that
	// winds once around curve and deviates from it only inside zone's
	// limits for tol (see [toolpath.Zone.Limits]), and returns the
	// extended path. It returns an error only for input it cannot meet.
	Generate(dst toolpath.Path, curve ellipse.Parallel, zone toolpath.Zone, tol float64) (toolpath.Path, error)
}

// GeneratorFunc adapts an ordinary function to the [Generator] interface.
type GeneratorFunc func(dst toolpath.Path, curve ellipse.Parallel, zone toolpath.Zone, tol float64) (toolpath.Path, error)

// Generate calls f(dst, curve, zone, tol).
func (f GeneratorFunc) Generate(dst toolpath.Path, curve ellipse.Parallel, zone toolpath.Zone, tol float64) (toolpath.Path, error) {
	return f(dst, curve, zone, tol)
}

// TangentContinuity is implemented by a [Generator] that promises a path
// whose direction never jumps. When TangentContinuous reports true,
// [TestGenerator] checks every join, the closing one included, for a kink
// of more than [KinkLimit]; otherwise kinks are allowed (a polygon has one
// at every vertex).
type TangentContinuity interface {
	TangentContinuous() bool
}

// Limits of the checks made by TestGenerator.
const (
	// KinkLimit is the largest change of direction, in radians, allowed at
	// a join of a generator that claims tangent continuity.
	KinkLimit = 1e-9
	// RadiusLimit is the largest disagreement, relative to Radius, between
	// an arc's Radius and the distances from its centre to Start and End.
	RadiusLimit = 1e-9
	// JoinLimit is the largest gap between one segment's end and the next
	// one's start (and between the last end and the first start), relative
	// to the size of the case: semi-major axis plus |offset| plus the
	// distance of the centre from the origin.
	JoinLimit = 1e-9
)

// Misbehaviours reported by TestGenerator, each wrapped in a [*Fault].
var (
	// ErrGenerate reports an error from the generator on valid input.
	ErrGenerate = errors.New("generator failed on valid input")
	// ErrAppend reports a generator that does not append to dst, or whose
	// segments differ between two calls with the same input.
	ErrAppend = errors.New("generator does not append the same segments to dst")
	// ErrEmpty reports an empty path.
	ErrEmpty = errors.New("generator returned no segments")
	// ErrSegment reports a segment that is not a line or an arc, or has a
	// coordinate that is not finite.
	ErrSegment = errors.New("segment is not a finite line or arc")
	// ErrMotion reports a segment that is not a cutting move.
	ErrMotion = errors.New("segment is not a cutting move")
	// ErrOutsideZone reports a segment that leaves the tolerance zone.
	ErrOutsideZone = errors.New("deviation outside the tolerance zone")
	// ErrGap reports consecutive segments that do not join.
	ErrGap = errors.New("segments do not join")
	// ErrNotClosed reports a path whose end is not its start.
	ErrNotClosed = errors.New("path does not close")
	// ErrWinding reports a path that does not wind exactly once around the
	// curve: winding number about the centre, total turning of the
	// direction, or enclosed area.
	ErrWinding = errors.New("path does not wind once around the curve")
	// ErrKink reports a change of direction at a join of a generator that
	// claims tangent continuity.
	ErrKink = errors.New("direction jumps at a join")
	// ErrArcRadius reports an arc whose Radius disagrees with the distance
	// from its centre to its ends.
	ErrArcRadius = errors.New("arc radius disagrees with its ends")
	// ErrLength reports a path whose length is not between the lengths of
	// the parallel curves at its smallest and largest deviation.
	ErrLength = errors.New("path length disagrees with the curve")
	// ErrCase reports a case that cannot be run: no ellipse, or a
	// tolerance that is not a finite number greater than zero.
	ErrCase = errors.New("invalid case")
)

// Fault is one misbehaviour found by [TestGenerator]. Its message has the
// form "subject: operation: got X, want Y".
type Fault struct {
	Subject   string // the case, as [Case.Name]
	Operation string // what was checked, such as "segment 17 deviation"
	Got       string // what the generator did
	Want      string // what the property requires
	Err       error  // the sentinel, such as ErrOutsideZone
	Cause     error  // the generator's own error, for ErrGenerate
}

// Error returns "subject: operation: got X, want Y".
func (f *Fault) Error() string {
	return f.Subject + ": " + f.Operation + ": got " + f.Got + ", want " + f.Want
}

// Unwrap returns the sentinel and, when there is one, the generator's own
// error, so that errors.Is finds both.
func (f *Fault) Unwrap() []error {
	if f.Cause != nil {
		return []error{f.Err, f.Cause}
	}
	return []error{f.Err}
}

// Case is one input for a generator.
type Case struct {
	// Name names the case in every Fault; empty gives a name built from
	// the other fields.
	Name string
	// Curve is the intended curve: an ellipse (e.Curve()) or a parallel
	// curve of one (e.Parallel(d)).
	Curve ellipse.Parallel
	// Zone and Tol give the allowed deviation, Zone.Limits(Tol).
	Zone toolpath.Zone
	Tol  float64
}

// subject returns the name of the case.
func (c Case) subject() string {
	if c.Name != "" {
		return c.Name
	}
	e := c.Curve.Ellipse()
	ctr := e.Center()
	return fmt.Sprintf("ellipse %gx%g at (%g,%g) rotated %g rad, offset %g, %v, tol %g",
		2*e.SemiX(), 2*e.SemiY(), ctr.X, ctr.Y, e.Rotation(), c.Curve.Offset(), c.Zone, c.Tol)
}

// TestGenerator runs gen over the cases (over [DefaultCases] when none are
// given) and checks every property of a sound toolpath on each: the
// generator returns no error; it appends to dst and gives the same
// segments twice; the path is not empty; every segment is a finite line or
// arc marked [toolpath.Cut]; every arc's Radius matches its ends within
// [RadiusLimit]; every segment's deviation ([SegmentDeviation]) lies in the
// zone; consecutive segments join and the last ends where the first starts,
// within [JoinLimit]; the path winds exactly once around the centre, its
// direction turns through exactly one full turn the same way, and the area
// it encloses is between the areas of the parallel curves at its smallest
// and largest deviation; its length lies between their lengths (a path that
// wobbles inside the zone fails this); and, when gen implements
// [TangentContinuity] and claims it, no join kinks by more than
// [KinkLimit] plus the angle that rounding of coordinates of the case's
// size can cause: 4·2^-52 times the size, over the line length or the
// shorter of arc radius and chord on each side of the join (about 1e-9 rad
// for arcs of 1e-4 at coordinates of 100).
//
// TestGenerator keeps going after a failure. If it finds any misbehaviours
// it returns an error joining them, one per line, each a [*Fault] of the
// form "subject: operation: got X, want Y" that wraps one of the sentinel
// errors (ErrOutsideZone, ErrGap, …): use errors.Is or errors.As. A
// property that fails on many segments of one case is reported for the
// first few and then counted. Typical use inside a test:
//
//	if err := conformance.TestGenerator(myGenerator); err != nil {
//		t.Fatal(err)
//	}
func TestGenerator(gen Generator, cases ...Case) error {
	if len(cases) == 0 {
		cases = DefaultCases()
	}
	smooth := false
	if tc, ok := gen.(TangentContinuity); ok {
		smooth = tc.TangentContinuous()
	}
	var faults []error
	for _, c := range cases {
		r := caseRun{subject: c.subject(), c: c, smooth: smooth}
		r.run(gen)
		faults = append(faults, r.faults...)
	}
	if len(faults) == 0 {
		return nil
	}
	return fmt.Errorf("conformance: TestGenerator found %d misbehaviours:\n%w", len(faults), errors.Join(faults...))
}

// perProperty is the number of failing segments of one property reported
// one by one in a case before the rest are only counted.
const perProperty = 3

// caseRun collects the faults of one case.
type caseRun struct {
	subject string
	c       Case
	smooth  bool
	// resolution is the uncertainty of a coordinate times 4; see checkJoin.
	resolution float64
	faults     []error
	counts     map[error]int
}

// fail records a fault; past perProperty faults with the same sentinel it
// only counts.
func (r *caseRun) fail(err error, op, got, want string) {
	if r.counts == nil {
		r.counts = make(map[error]int)
	}
	r.counts[err]++
	if r.counts[err] <= perProperty {
		r.faults = append(r.faults, &Fault{Subject: r.subject, Operation: op, Got: got, Want: want, Err: err})
	}
}

// summarise adds one fault per sentinel that was counted past the limit.
func (r *caseRun) summarise() {
	for _, err := range []error{ErrSegment, ErrMotion, ErrArcRadius, ErrOutsideZone, ErrGap, ErrKink} {
		if n := r.counts[err]; n > perProperty {
			r.faults = append(r.faults, &Fault{Subject: r.subject, Operation: "further segments: " + err.Error(),
				Got: fmt.Sprint(n - perProperty), Want: "none", Err: err})
		}
	}
}

func (r *caseRun) run(gen Generator) {
	c := r.c
	e := c.Curve.Ellipse()
	if !(e.SemiMajor() > 0) || !(c.Tol > 0) || math.IsInf(c.Tol, 0) {
		r.fail(ErrCase, "case", fmt.Sprintf("semi-major axis %g, tol %g", e.SemiMajor(), c.Tol), "an ellipse and a finite tol > 0")
		return
	}
	path, err := gen.Generate(nil, c.Curve, c.Zone, c.Tol)
	if err != nil {
		r.faults = append(r.faults, &Fault{Subject: r.subject, Operation: "Generate", Got: strings.ReplaceAll(err.Error(), "\n", " "),
			Want: "no error", Err: ErrGenerate, Cause: err})
		return
	}
	r.checkAppend(gen, path)
	if len(path) == 0 {
		r.fail(ErrEmpty, "Generate", "0 segments", "a closed path")
		return
	}
	r.checkSegments(path)
	r.summarise()
}

// checkAppend calls the generator again with a dst that already holds a
// segment and checks that it is kept and followed by the same segments.
func (r *caseRun) checkAppend(gen Generator, path toolpath.Path) {
	marker := toolpath.Segment{Kind: toolpath.Dwell, Start: toolpath.Point{X: -1.25, Y: 2.5, Z: 7}, End: toolpath.Point{X: -1.25, Y: 2.5, Z: 7}, Seconds: 0.125}
	dst := make(toolpath.Path, 1, 1+len(path)/2)
	dst[0] = marker
	again, err := gen.Generate(dst, r.c.Curve, r.c.Zone, r.c.Tol)
	want := fmt.Sprintf("the segment already in dst followed by the %d segments of Generate(nil, …)", len(path))
	switch {
	case err != nil:
		r.faults = append(r.faults, &Fault{Subject: r.subject, Operation: "Generate(dst of 1 segment, …)",
			Got: strings.ReplaceAll(err.Error(), "\n", " "), Want: "no error", Err: ErrGenerate, Cause: err})
	case len(again) == 0 || again[0] != marker:
		r.fail(ErrAppend, "Generate(dst of 1 segment, …)", "dst's segment replaced or dropped", want)
	case len(again) != 1+len(path):
		r.fail(ErrAppend, "Generate(dst of 1 segment, …)", fmt.Sprintf("%d segments", len(again)), fmt.Sprintf("%d: %s", 1+len(path), want))
	default:
		for i := range path {
			if again[1+i] != path[i] {
				r.fail(ErrAppend, "Generate(dst of 1 segment, …)", fmt.Sprintf("segment %d differs", i), want)
				break
			}
		}
	}
}
