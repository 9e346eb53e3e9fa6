package levelset

import (
	"context"
	"strings"
	"testing"
)

// FuzzLevelSetInput: any level-set text, side and digits give a rule with
// positive weights or a one-sentence error, never a panic (order 2, so
// that a run stays short).
func FuzzLevelSetInput(f *testing.F) {
	for _, s := range []string{"x^2+y^2-0.25", "x^^2", "log(x)-0.5", "1/(x-0.3)+y", "sqrt(x^2+y^2)-0.5", "x^2+y^2+1", "abs(x)-y", "x", "(x+y)^0-2", "sin(1e9*x)", "x^y-0.5", ""} {
		f.Add(s, "inside", 0)
		f.Add(s, "surface", 8)
	}
	f.Add("x-y", "middle", 0)
	f.Fuzz(func(t *testing.T, set, side string, digits int) {
		s, err := ParseSide(side)
		if err != nil {
			return
		}
		if digits < 0 || digits > 12 {
			digits = 0
		}
		r, err := Build(context.Background(), Request{Shape: "quadrilateral", LevelSet: set, Side: s, Order: 2, Digits: digits})
		if err != nil {
			if msg := err.Error(); msg == "" || strings.Contains(msg, "\n") {
				t.Fatalf("%q: error %q", set, msg)
			}
			return
		}
		for i, w := range r.PrintedWeights {
			if strings.HasPrefix(w, "-") || w == "0" {
				t.Fatalf("%q: weight %d is %s", set, i, w)
			}
		}
	})
}

// FuzzAuditInput: any node and weight text in a level-set rule file gives
// an audit or an error, never a panic.
func FuzzAuditInput(f *testing.F) {
	f.Add("0.1", "0.2", "0.5")
	f.Add("0.123456789012345678901234567", "-0.2", "1e-3")
	f.Add("1/3", "x", "")
	f.Fuzz(func(t *testing.T, x, y, w string) {
		req := Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-0.25", Order: 2}
		_, _ = AuditRule(context.Background(), req, [][]string{{x, y}}, []string{w})
	})
}
