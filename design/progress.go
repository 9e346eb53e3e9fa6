package design

import (
	"context"
	"fmt"
)

// Progress receives reports of long computations: Grow announces n more
// units of work (nodes to refine, nodes to check), Advance that n are done.
// Both may be called from several goroutines at once.
type Progress interface {
	Grow(n int64)
	Advance(n int64)
}

type progressKey struct{}

// WithProgress returns a context under which the rule computations of this
// package report to p. Progress rides on the context because it is a
// concern of the caller's request (a terminal bar), not of the numerics.
func WithProgress(ctx context.Context, p Progress) context.Context {
	return context.WithValue(ctx, progressKey{}, p)
}

// progressOf returns the context's Progress, or one that does nothing.
func progressOf(ctx context.Context) Progress {
	if p, ok := ctx.Value(progressKey{}).(Progress); ok {
		return p
	}
	return noProgress{}
}

type noProgress struct{}

func (noProgress) Grow(int64)    {}
func (noProgress) Advance(int64) {}

// PhaseProgress is a Progress that is also told when a new phase of the
// work begins (the recurrence, Newton's method at a precision, the
// confirming computation, the verification, the writing). Grow and Advance
// after Phase count the work of that phase; a display can then show what
// is being done and a remaining time for it, instead of one count whose
// total keeps growing.
type PhaseProgress interface {
	Progress
	Phase(name string)
}

// ReportPhase tells the context's Progress, if it follows phases, that the
// phase name begins. Callers outside the package (the command's writing
// step) use it as the package's own steps do.
func ReportPhase(ctx context.Context, name string) {
	if p, ok := progressOf(ctx).(PhaseProgress); ok {
		p.Phase(name)
	}
}

// phase is ReportPhase with a format, building the name only when someone
// listens.
func phase(ctx context.Context, format string, args ...any) {
	if p, ok := progressOf(ctx).(PhaseProgress); ok {
		p.Phase(fmt.Sprintf(format, args...))
	}
}

// recurrenceMethod names how m's recurrence coefficients are computed, for
// the phase shown while they are.
func recurrenceMethod(m RecurrenceSource) string {
	switch m := m.(type) {
	case *MomentSource:
		return "Chebyshev algorithm"
	case *ExprSource:
		if _, ok := m.closedForm(); ok {
			return "modified Chebyshev algorithm on closed-form moments"
		}
		return "Stieltjes procedure"
	case *DiscreteSource:
		return "Stieltjes procedure"
	case FamilySource, *FamilySource:
		return "closed form"
	}
	return "from the measure"
}

// stagePhase names a stage of Newton's method at prec bits: the first
// computation starts from float64 (Golub-Welsch), a later one from the
// previous stage's nodes, which it confirms digit by digit.
func stagePhase(ctx context.Context, prec uint, fromPrevious bool) {
	if fromPrevious {
		phase(ctx, "confirming: Newton at %d bits", prec)
		return
	}
	phase(ctx, "Newton at %d bits", prec)
}
