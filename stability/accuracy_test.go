package stability

import (
	"context"
	"fmt"
	"math/big"
	"strings"
	"testing"

	"quadwright/design"
)

// TestImpliedAccuracy: every weight of the 10-point Gauss-Legendre rule
// (degree 19, A&S 25.4.29) changed by a relative 1e-11 fails even the
// constant at its own 30 digits, and the audit says in words that its
// values are good to about 11 digits and reach degree 19 at that accuracy.
// The unperturbed rule's residuals stay within its digits.
func TestImpliedAccuracy(t *testing.T) {
	m := legendreOn(t, "")
	g, err := design.Gauss(context.Background(), m, design.Request{Points: 10, Digits: 30})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Audit(context.Background(), m, g.Nodes, g.Weights, Options{SkipGenz: true, SkipConditioning: true})
	if err != nil {
		t.Fatal(err)
	}
	if a := r.Accuracy; a == nil || !a.WithinTolerance || a.Degree != 19 || !strings.Contains(a.Text, "within what the 30 digits") {
		t.Errorf("exact rule: %+v", a)
	}
	w := make([]string, len(g.Weights))
	for i, s := range g.Weights {
		v, _ := new(big.Rat).SetString(s)
		// alternate signs: (1 + 1e-11) and (1 - 1e-11), so no degree
		// sees the changes cancel
		f := big.NewRat(100000000001, 100000000000)
		if i%2 == 1 {
			f = big.NewRat(99999999999, 100000000000)
		}
		w[i] = new(big.Rat).Mul(v, f).FloatString(32)
	}
	r, err = Audit(context.Background(), m, g.Nodes, w, Options{SkipGenz: true, SkipConditioning: true})
	if err != nil {
		t.Fatal(err)
	}
	a := r.Accuracy
	if r.Degree > 0 || a == nil || a.WithinTolerance || a.Degree != 19 || a.Digits < 10 || a.Digits > 12 {
		t.Fatalf("perturbed rule: degree %d, %+v", r.Degree, a)
	}
	want := fmt.Sprintf("good to about %d digits, not the %d they are printed to; at that accuracy the rule reaches degree 19", a.Digits, r.Digits)
	if !strings.Contains(a.Text, want) {
		t.Errorf("text %q lacks %q", a.Text, want)
	}
	var b strings.Builder
	r.WriteText(&b, "p.json")
	if !strings.Contains(b.String(), "accuracy:      the residuals through degree 19") {
		t.Errorf("text report:\n%s", b.String())
	}
}

// TestImpliedAccuracyNoJump: residuals without a clear end of exactness
// (no jump of JumpFactor at or above the verified degree) give no
// statement rather than a guess.
func TestImpliedAccuracyNoJump(t *testing.T) {
	r := &Report{}
	r.Points = 3
	r.Degree = 1
	r.Digits = 16
	r.Residual = []Float{0.1, 0.2, 3, 4, 5, 6}
	r.RelResidual = []Float{1e-16, 2e-16, 3e-15, 4e-15, 5e-15, 6e-15}
	if a := impliedAccuracy(r); a != nil {
		t.Errorf("no jump: %+v", a)
	}
}
