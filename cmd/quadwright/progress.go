package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"os"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"golang.org/x/term"

	"quadwright/design"
)

// progressDelay is how long build runs before its status line appears: a
// build that ends sooner prints nothing on the terminal. progressTick is
// how often the line is redrawn, so that even a phase that reports no
// units (a recurrence, a float64 eigenvalue start) shows its clock moving.
const (
	progressDelay = time.Second
	progressTick  = 250 * time.Millisecond
)

// withProgress returns ctx carrying a status line on stderr when stderr is
// a terminal and --quiet was not given, and a function that clears the line
// when the work ends. size is the rule's point count, shown in the line.
func withProgress(ctx context.Context, quiet bool, size int, what string) (context.Context, func()) {
	fd := int(os.Stderr.Fd())
	if quiet || !term.IsTerminal(fd) {
		return ctx, func() {}
	}
	width := func() int {
		if w, _, err := term.GetSize(fd); err == nil && w > 20 {
			return w - 1
		}
		return 79
	}
	p := newPhaseLine(fmt.Sprintf("%s N=%d", what, size), time.Now())
	stop := make(chan struct{})
	var wg sync.WaitGroup
	wg.Add(1)
	go func() {
		defer wg.Done()
		t := time.NewTicker(progressTick)
		defer t.Stop()
		drawn := false
		for {
			select {
			case <-stop:
				if drawn {
					io.WriteString(os.Stderr, "\r\x1b[K")
				}
				return
			case now := <-t.C:
				if now.Sub(p.start) < progressDelay {
					continue
				}
				io.WriteString(os.Stderr, "\r\x1b[K"+clipLine(p.line(now), width()))
				drawn = true
			}
		}
	}()
	var once sync.Once
	return design.WithProgress(ctx, p), func() {
		once.Do(func() { close(stop); wg.Wait() })
	}
}

// phaseLine is a design.PhaseProgress that keeps what a status line shows:
// the phase, its units done out of those announced, the time since the
// start, and a remaining time for the phase.
//
// The remaining time is the phase's units left divided by its average rate
// since the phase began (not the rate of the last moment, which swings with
// every pause of the machine), then smoothed: the figure shown counts down
// with the clock and moves toward the new estimate with a time constant of
// etaSmoothing, so it cannot jump by orders of magnitude between two
// redraws. Each phase starts its own count, so work announced later (the
// confirming stage, the verification) never makes a nearly full bar wait.
type phaseLine struct {
	what  string
	start time.Time

	mu         sync.Mutex
	name       string
	number     int
	phaseStart time.Time
	eta        float64 // seconds shown, 0 before an estimate exists
	lastDraw   time.Time

	total, done atomic.Int64
}

// etaSmoothing is the time constant, in seconds, with which the remaining
// time shown follows its estimate.
const etaSmoothing = 4.0

func newPhaseLine(what string, now time.Time) *phaseLine {
	return &phaseLine{what: what, start: now, phaseStart: now, lastDraw: now}
}

func (p *phaseLine) Grow(n int64)    { p.total.Add(n) }
func (p *phaseLine) Advance(n int64) { p.done.Add(n) }

// Phase starts a new phase with counts of zero.
func (p *phaseLine) Phase(name string) { p.phaseAt(name, time.Now()) }

func (p *phaseLine) phaseAt(name string, now time.Time) {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.name, p.number, p.phaseStart, p.eta = name, p.number+1, now, 0
	p.total.Store(0)
	p.done.Store(0)
}

// line renders the status at now and advances the smoothed remaining time.
func (p *phaseLine) line(now time.Time) string {
	p.mu.Lock()
	defer p.mu.Unlock()
	var b strings.Builder
	b.WriteString(p.what)
	if p.name != "" {
		fmt.Fprintf(&b, " [%d] %s", p.number, p.name)
	}
	total, done := p.total.Load(), p.done.Load()
	if total > 0 {
		done = min(done, total)
		fmt.Fprintf(&b, "  %d/%d %d%%", done, total, 100*done/total)
	}
	fmt.Fprintf(&b, "  %s", clock(now.Sub(p.start)))
	if left, ok := p.remaining(now, total, done); ok {
		b.WriteString("  " + left)
	}
	p.lastDraw = now
	return b.String()
}

// remaining updates p.eta and says it in words; ok is false while no
// estimate exists (nothing done yet, or less than a second into the phase).
func (p *phaseLine) remaining(now time.Time, total, done int64) (string, bool) {
	dt := now.Sub(p.lastDraw).Seconds()
	in := now.Sub(p.phaseStart).Seconds()
	if total <= 0 || done <= 0 || in < 1 {
		return "", false
	}
	raw := float64(total-done) * in / float64(done)
	if p.eta == 0 {
		p.eta = raw
	} else {
		p.eta = math.Max(p.eta-dt, 0)
		p.eta += (raw - p.eta) * (1 - math.Exp(-dt/etaSmoothing))
	}
	return leftWords(p.eta), true
}

// leftWords says a remaining time coarsely: the digits beyond these would
// be noise.
func leftWords(s float64) string {
	switch {
	case s < 5:
		return "a few seconds left"
	case s < 100:
		return fmt.Sprintf("~%d s left", 5*int(math.Round(s/5)))
	case s < 100*60:
		return fmt.Sprintf("~%d min left", int(math.Round(s/60)))
	}
	return fmt.Sprintf("~%.1f h left", s/3600)
}

func clock(d time.Duration) string {
	s := int(d.Seconds())
	if s >= 3600 {
		return fmt.Sprintf("%d:%02d:%02d", s/3600, s/60%60, s%60)
	}
	return fmt.Sprintf("%d:%02d", s/60, s%60)
}

// clipLine keeps a status line within the terminal's width, so that "\r"
// redraws it in place instead of scrolling.
func clipLine(s string, width int) string {
	if r := []rune(s); len(r) > width {
		return string(r[:width-3]) + "..."
	}
	return s
}

// clearBeforeStdout ends the status line (done) before a rule is written
// to standard output on the same terminal, where the two would interleave;
// written to a file or a pipe, the line stays through the writing phase.
func clearBeforeStdout(output string, done func()) {
	if output == "" && term.IsTerminal(int(os.Stdout.Fd())) {
		done()
	}
}
