package stability

import (
	"context"
	"fmt"
	"math/big"
	"strings"
	"testing"

	"quadwright/design"
	"quadwright/design/element"
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

// TestElementImpliedAccuracy: the catalogued 7-point degree-5 triangle rule
// (the most 7 points allow: pointBound) with its weights changed by a
// relative 1e-11 fails the constant at its 17 digits; the audit says the
// values are good to about 11 digits and reach degree 5 at that accuracy.
func TestElementImpliedAccuracy(t *testing.T) {
	r, err := element.Build(context.Background(), element.Request{Shape: element.Triangle, Degree: 5})
	if err != nil {
		t.Fatal(err)
	}
	w := make([]string, len(r.Weights))
	for i, s := range r.Weights {
		v, _ := new(big.Rat).SetString(s)
		f := big.NewRat(100000000001, 100000000000)
		if i%3 == 0 {
			f = big.NewRat(99999999999, 100000000000)
		}
		w[i] = new(big.Rat).Mul(v, f).FloatString(20)
	}
	rep, err := AuditElement(context.Background(), element.Triangle, r.Nodes, w, ElementOptions{})
	if err != nil {
		t.Fatal(err)
	}
	a := rep.Accuracy
	if rep.Degree >= 5 || a == nil || a.WithinTolerance || a.Degree != 5 || a.Digits < 10 || a.Digits > 12 {
		t.Fatalf("degree %d, accuracy %+v", rep.Degree, a)
	}
	rep, err = AuditElement(context.Background(), element.Triangle, r.Nodes, r.Weights, ElementOptions{})
	if err != nil || rep.Accuracy == nil || !rep.Accuracy.WithinTolerance || rep.Accuracy.Degree != 5 {
		t.Errorf("unperturbed: %v %+v", err, rep.Accuracy)
	}
}
