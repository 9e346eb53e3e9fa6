package main

import (
	"strings"
	"testing"
	"time"
)

// etaOf redraws p at now and returns the smoothed remaining time.
func etaOf(p *phaseLine, now time.Time) (string, float64) {
	s := p.line(now)
	return s, p.eta
}

// TestPhaseLineSmoothing: the remaining time shown follows a sudden change
// of pace without jumping by orders of magnitude between redraws, and a new
// phase starts its own count (issue 19, item 6). The pace is simulated.
func TestPhaseLineSmoothing(t *testing.T) {
	t0 := time.Unix(0, 0)
	p := newPhaseLine("building N=1000", t0)
	p.phaseAt("Newton at 192 bits", t0)
	p.Grow(1000)
	now := t0
	prev := 0.0
	for step := 1; step <= 240; step++ { // 60 s in redraws of 250 ms
		now = now.Add(progressTick)
		// 20 units a second for 10 s, then 2 a second: the raw
		// estimate jumps tenfold.
		if step <= 40 {
			p.Advance(5)
		} else if step%2 == 0 {
			p.Advance(1)
		}
		_, eta := etaOf(p, now)
		if prev > 0 && eta > 0 && (eta > 1.2*prev || eta < prev/1.2) {
			t.Fatalf("step %d: remaining time jumped from %.1f s to %.1f s", step, prev, eta)
		}
		prev = eta
	}
	if prev < 100 {
		t.Errorf("after the slowdown the remaining time is %.0f s; the estimate never caught up", prev)
	}
	p.phaseAt("verifying through degree 1999", now)
	s, eta := etaOf(p, now.Add(progressTick))
	if !strings.Contains(s, "[2] verifying") || strings.Contains(s, "/") || eta != 0 {
		t.Errorf("new phase: %q, eta %v", s, eta)
	}
	p.Grow(10)
	p.Advance(3)
	if s := p.line(now.Add(2 * time.Second)); !strings.Contains(s, "3/10 30%") || !strings.Contains(s, "left") {
		t.Errorf("phase counts: %q", s)
	}
}

func TestLeftWords(t *testing.T) {
	for _, c := range []struct {
		s    float64
		want string
	}{{2, "a few seconds left"}, {37, "~35 s left"}, {250, "~4 min left"}, {9000, "~2.5 h left"}} {
		if got := leftWords(c.s); got != c.want {
			t.Errorf("%v s: %q, want %q", c.s, got, c.want)
		}
	}
	if got := clipLine(strings.Repeat("x", 100), 79); len(got) != 79 {
		t.Errorf("clip: %d", len(got))
	}
}
