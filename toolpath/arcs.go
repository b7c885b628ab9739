package toolpath

// arcState holds the arc approximator's state between segments.
type arcState struct {
	lastDt float64
}

func (s *arcState) start(a *Approximator) {}

func (s *arcState) next(a *Approximator) (Segment, bool) { return a.nextLine() }
