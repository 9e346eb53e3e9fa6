package design

import (
	"context"
	"math/big"
	"strings"
	"testing"
)

// TestAntiGaussIdentity checks Laurie's defining property on the printed
// 30-digit rules: for p = x^k, k <= 2N+1, I(p) - A(p) = -(I(p) - G(p)),
// that is |2 I(p) - A(p) - G(p)| <= 1e-27 (sum |w| |p(x)| over both rules);
// and that at k = 2N+2 the ratio is far above that bound (above 1e-20: the property is sharp). I(p)
// is taken from a separately built 40-point Gauss rule at 60 digits (exact
// through degree 79). The anti-Gauss rule must also be exact through 2N-1.
func TestAntiGaussIdentity(t *testing.T) {
	ctx := context.Background()
	const prec = 400
	cases := []struct {
		src FamilySource
		n   int
	}{
		{family(t, "legendre", "", "", ""), 5},
		{family(t, "legendre", "", "", "0,3"), 8},
		{family(t, "jacobi", "-0.3", "2.3", ""), 6},
		{family(t, "laguerre", "1.5", "", ""), 4},
		{family(t, "hermite", "", "", ""), 7},
	}
	for _, c := range cases {
		a, err := AntiGauss(ctx, c.src, Request{Points: c.n, Digits: 30})
		if err != nil {
			t.Fatalf("%s N=%d: %v", c.src.Label(), c.n, err)
		}
		if a.Points() != c.n+1 || a.Paired == nil || a.Paired.Points() != c.n || a.Degree < 2*c.n-1 {
			t.Fatalf("%s N=%d: %d points, degree %d", c.src.Label(), c.n, a.Points(), a.Degree)
		}
		big40 := build(t, c.src, 40, 60)
		sum := func(r *Rule, k int) (s, abs *big.Float) {
			s, abs = new(big.Float).SetPrec(prec), new(big.Float).SetPrec(prec)
			for i := range r.Nodes {
				x := new(big.Float).SetPrec(prec).SetRat(rat(t, r.Nodes[i]))
				p := new(big.Float).SetPrec(prec).SetInt64(1)
				for j := 0; j < k; j++ {
					p.Mul(p, x)
				}
				p.Mul(p, new(big.Float).SetPrec(prec).SetRat(rat(t, r.Weights[i])))
				s.Add(s, p)
				abs.Add(abs, p.Abs(p))
			}
			return s, abs
		}
		for k := 0; k <= 2*c.n+2; k++ {
			I, _ := sum(big40, k)
			A, absA := sum(a, k)
			G, absG := sum(a.Paired, k)
			d := new(big.Float).SetPrec(prec).Add(A, G)
			d.Sub(d, I.Mul(I, big.NewFloat(2)))
			d.Abs(d)
			scale := new(big.Float).SetPrec(prec).Add(absA, absG)
			ratio, _ := new(big.Float).Quo(d, scale).Float64()
			if k <= 2*c.n+1 && ratio > 1e-27 {
				t.Errorf("%s N=%d k=%d: |2I - A - G| / scale = %.3g", c.src.Label(), c.n, k, ratio)
			}
			if k == 2*c.n+2 && ratio < 1e-20 {
				t.Errorf("%s N=%d: the identity also holds at k=%d (ratio %.3g); the test has no teeth", c.src.Label(), c.n, k, ratio)
			}
		}
	}
}

// TestAntiGaussOutside checks the refusal when an anti-Gauss node leaves
// the support (Jacobi weights with an exponent near -1; found by
// computation here).
func TestAntiGaussOutside(t *testing.T) {
	_, err := AntiGauss(context.Background(), family(t, "jacobi", "-0.9", "-0.9", ""), Request{Points: 3, Digits: 20})
	if err == nil || !strings.Contains(err.Error(), "outside the support") {
		t.Errorf("got %v", err)
	}
}
