package design

import "context"

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
