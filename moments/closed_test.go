package moments

import (
	"context"
	"math/big"
	"testing"
)

func TestClosedFormRecognised(t *testing.T) {
	cases := []struct {
		src, iv string
		scale   string // "" when not a closed form
	}{
		{"-log(x)", "0,1", "1"},
		{"log(1/x)", "0,1", "1"},
		{"log(x^-1)", "0,1", "1"},
		{"-2*log(x)", "0,1", "2"},
		{"log(x)*(-3/2)", "0,1", "3/2"},
		{"log(x)/(-4)", "0,1", "1/4"},
		{"-(log(x)*5)", "0,1", "5"},
		{"-log(x)", "0,1/2", ""},   // another interval: not this closed form
		{"-log(x)+1", "0,1", ""},   // not a multiple of log(x)
		{"-log(2*x)", "0,1/2", ""}, // argument not x
		{"log(x)^2", "0,1", ""},
		{"x^2", "0,1", ""},
	}
	for _, c := range cases {
		w := mustWeight(t, c.src, c.iv)
		cf, ok := w.ClosedForm()
		if ok != (c.scale != "") {
			t.Errorf("%s on [%s]: closed form %v, want %v", c.src, c.iv, ok, c.scale != "")
			continue
		}
		if ok && cf.Scale.Cmp(rat(c.scale)) != 0 {
			t.Errorf("%s: scale %s, want %s", c.src, cf.Scale.RatString(), c.scale)
		}
	}
}

// TestClosedLogMoments checks the closed form of the monic shifted-Legendre
// moments of -log(x) on [0, 1] against the double-exponential quadrature of
// the expression (an independent route: the weight evaluated at the nodes
// and the basis by its recurrence), each within both error bounds, and the
// first ones against values worked by hand from the closed form of the
// integral of -log(x) x^j (= 1/(j+1)^2, common practice).
func TestClosedLogMoments(t *testing.T) {
	w := mustWeight(t, "-log(x)", "0,1")
	cf, ok := w.ClosedForm()
	if !ok {
		t.Fatal("-log(x) on [0,1] not recognised")
	}
	const n, digits = 60, 40
	num, est, err := w.Moments(context.Background(), n, DefaultBasis(w.Interval), digits)
	if err != nil {
		t.Fatal(err)
	}
	m, bound := cf.Moments(n, 256)
	for k := 0; k < n; k++ {
		d := new(big.Float).SetPrec(256).Sub(m[k], num[k])
		d.Abs(d)
		lim := new(big.Float).Add(est[k], bound[k])
		if d.Cmp(lim) > 0 {
			t.Errorf("moment %d: closed form %.20g, quadrature %.20g (difference %.3g above %.3g)", k, m[k], num[k], d, lim)
		}
	}
	// q_1 = x - 1/2, q_2 = x^2 - x + 1/6: 1/4 - 1/2 = -1/4 and
	// 1/9 - 1/4 + 1/6 = 1/36.
	for k, want := range []string{"1", "-1/4", "1/36"} {
		d := new(big.Float).SetPrec(256).Sub(m[k], new(big.Float).SetPrec(256).SetRat(rat(want)))
		if d.Abs(d).Cmp(bound[k]) > 0 {
			t.Errorf("moment %d = %.30g, want %s", k, m[k], want)
		}
	}
	// A scale multiplies every moment.
	w3 := mustWeight(t, "-3*log(x)", "0,1")
	cf3, _ := w3.ClosedForm()
	m3, _ := cf3.Moments(n, 256)
	for k := 0; k < n; k++ {
		d := new(big.Float).SetPrec(256).Mul(m[k], big.NewFloat(3))
		d.Sub(d, m3[k])
		lim := new(big.Float).Mul(bound[k], big.NewFloat(8))
		if d.Abs(d).Cmp(lim) > 0 {
			t.Errorf("scaled moment %d: %.20g, want 3 x %.20g", k, m3[k], m[k])
		}
	}
}
