package main

import (
	"context"
	"os"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"

	"quadwright/design"
)

// progressThreshold is the rule size from which build shows a progress bar
// (extended-precision builds with N >= 200 take long enough to want one).
const progressThreshold = 200

// barProgress adapts a terminal progress bar to design.Progress.
type barProgress struct{ bar *progressbar.ProgressBar }

func (p barProgress) Grow(n int64)    { p.bar.ChangeMax64(p.bar.GetMax64() + n) }
func (p barProgress) Advance(n int64) { p.bar.Add64(n) }

// withProgress returns ctx carrying a progress bar on stderr when stderr is
// a terminal, the work is large and --quiet was not given, and a function
// that clears the bar when the work ends.
func withProgress(ctx context.Context, quiet bool, size int, what string) (context.Context, func()) {
	if quiet || size < progressThreshold || !term.IsTerminal(int(os.Stderr.Fd())) {
		return ctx, func() {}
	}
	bar := progressbar.NewOptions64(0,
		progressbar.OptionSetWriter(os.Stderr),
		progressbar.OptionSetDescription(what),
		progressbar.OptionShowCount(),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionThrottle(100_000_000),
	)
	return design.WithProgress(ctx, barProgress{bar}), func() { bar.Finish(); bar.Clear() }
}
