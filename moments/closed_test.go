package moments

import (
	"context"
	"math/big"
	"testing"
)

func TestClosedFormRecognised(t *testing.T) {
	cases := []struct {
		src, iv string
		kind    string // "" when not a closed form
		scale   string
		power   string
		mirror  bool
	}{
		{"-log(x)", "0,1", "log", "1", "", false},
		{"log(1/x)", "0,1", "log", "1", "", false},
		{"log(x^-1)", "0,1", "log", "1", "", false},
		{"-2*log(x)", "0,1", "log", "2", "", false},
		{"log(x)*(-3/2)", "0,1", "log", "3/2", "", false},
		{"log(x)/(-4)", "0,1", "log", "1/4", "", false},
		{"-(log(x)*5)", "0,1", "log", "5", "", false},
		{"-log(1-x)", "0,1", "log", "1", "", true},
		{"log(1/(1-x))/2", "0,1", "log", "1/2", "", true},
		{"x^0.5", "0,1", "power", "1", "1/2", false},
		{"sqrt(x)/2", "0,1", "power", "1/2", "1/2", false},
		{"3*(1-x)^-0.25", "0,1", "power", "3", "-1/4", true},
		{"x^2", "0,1", "power", "1", "2", false},
		{"-log(x)", "0,1/2", "", "", "", false},   // another interval: not these closed forms
		{"x^2", "-1,1", "", "", "", false},        // another interval
		{"-log(x)+1", "0,1", "", "", "", false},   // not a multiple of log(x)
		{"-log(2*x)", "0,1/2", "", "", "", false}, // argument not x
		{"log(x)^2", "0,1", "", "", "", false},
		{"x^-1.5", "0,1", "", "", "", false}, // no moments: left to the quadrature's error
		{"x^x", "0,1", "", "", "", false},
	}
	for _, c := range cases {
		w := mustWeight(t, c.src, c.iv)
		cf, ok := w.ClosedForm()
		if ok != (c.kind != "") {
			t.Errorf("%s on [%s]: closed form %v, want %v", c.src, c.iv, ok, c.kind != "")
			continue
		}
		if !ok {
			continue
		}
		if cf.Kind != c.kind || cf.Scale.Cmp(rat(c.scale)) != 0 || cf.Mirror != c.mirror || (c.power != "" && cf.Power.Cmp(rat(c.power)) != 0) {
			t.Errorf("%s: %+v, want %s scale %s power %s mirror %v", c.src, cf, c.kind, c.scale, c.power, c.mirror)
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

// TestClosedPowerMoments checks the closed forms of the power weights, and of
// the mirrored log weight, against the double-exponential quadrature of the
// expression, each within both error bounds, and the first power moments
// against values worked by hand (integral_0^1 x^a x^j = 1/(a+j+1), common
// practice).
func TestClosedPowerMoments(t *testing.T) {
	for _, c := range []struct {
		src  string
		want []string // m_0, m_1 by hand, or nil
	}{
		// q_1 = x - 1/2: m_1 = 1/(a+2) - 1/(2(a+1)).
		{"x^0.5", []string{"2/3", "1/15"}},
		{"3*(1-x)^-0.25", []string{"4", "2/7"}},
		{"x^3", []string{"1/4", "3/40"}},
		{"x^-0.9", nil},
		{"-log(1-x)/2", []string{"1/2", "1/8"}},
	} {
		w := mustWeight(t, c.src, "0,1")
		cf, ok := w.ClosedForm()
		if !ok {
			t.Fatalf("%s not recognised", c.src)
		}
		const n, digits = 40, 35
		num, est, err := w.Moments(context.Background(), n, DefaultBasis(w.Interval), digits)
		if err != nil {
			t.Fatal(err)
		}
		m, bound := cf.Moments(n, 256)
		for k := 0; k < n; k++ {
			d := new(big.Float).SetPrec(256).Sub(m[k], num[k])
			lim := new(big.Float).Add(est[k], bound[k])
			if d.Abs(d).Cmp(lim) > 0 {
				t.Errorf("%s moment %d: closed form %.20g, quadrature %.20g (difference %.3g above %.3g)", c.src, k, m[k], num[k], d, lim)
			}
		}
		for k, want := range c.want {
			d := new(big.Float).SetPrec(256).Sub(m[k], new(big.Float).SetPrec(256).SetRat(rat(want)))
			if d.Abs(d).Cmp(bound[k]) > 0 {
				t.Errorf("%s moment %d = %.30g, want %s", c.src, k, m[k], want)
			}
		}
	}
}
