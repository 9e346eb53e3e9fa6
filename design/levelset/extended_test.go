package levelset

import (
	"context"
	"math/big"
	"strings"
	"testing"

	"quadwright/precision"
)

const xprec = 256

// sumX is the sum of w f over the printed rule, the printed decimals read
// at xprec bits.
func sumX(t *testing.T, r *Rule, f func(p []*big.Float) *big.Float) *big.Float {
	t.Helper()
	s := new(big.Float).SetPrec(xprec)
	for i, n := range r.PrintedNodes {
		p := make([]*big.Float, len(n))
		for k, c := range n {
			v, _, err := big.ParseFloat(c, 10, xprec, big.ToNearestEven)
			if err != nil {
				t.Fatalf("node %d: %q", i, c)
			}
			p[k] = v
		}
		w, _, err := big.ParseFloat(r.PrintedWeights[i], 10, xprec, big.ToNearestEven)
		if err != nil {
			t.Fatalf("weight %d: %q", i, r.PrintedWeights[i])
		}
		s.Add(s, w.Mul(w, f(p)))
	}
	return s
}

func relErrX(got, want *big.Float) float64 {
	d := new(big.Float).SetPrec(xprec).Sub(got, want)
	d.Quo(d, want)
	f, _ := d.Abs(d).Float64()
	return f
}

func rat(a, b int64) *big.Float { return new(big.Float).SetPrec(xprec).SetRat(big.NewRat(a, b)) }

// TestDiscThirtyDigits: the disc of radius r = 7/10 about (x0, y0) in the
// quadrilateral, order 40, 30 digits. Closed forms (elementary geometry
// and, for the moments, polar coordinates with the angular integral
// 2 B(a+1/2, b+1/2), Abramowitz and Stegun 6.2.1): area pi r^2;
// integral of X^2 Y^2 (X = x-x0, Y = y-y0) = r^6/6 * 2 B(3/2, 3/2) =
// pi r^6 / 24; of X^4 = r^6/6 * 2 B(5/2, 1/2) = pi r^6 / 8.
func TestDiscThirtyDigits(t *testing.T) {
	for _, c := range []struct {
		set    string
		x0, y0 *big.Float
	}{
		{"x^2+y^2-0.49", rat(0, 1), rat(0, 1)},
		{"(x-0.125)^2+(y+0.25)^2-0.49", rat(1, 8), rat(-1, 4)},
	} {
		r, err := Build(context.Background(), Request{Shape: "quadrilateral", LevelSet: c.set, Order: 40, Digits: 30})
		if err != nil {
			t.Fatalf("%s: %v", c.set, err)
		}
		if r.Digits != 30 || len(r.PrintedWeights) != len(r.PrintedNodes) {
			t.Fatalf("%s: digits %d", c.set, r.Digits)
		}
		for i, w := range r.PrintedWeights {
			if strings.HasPrefix(w, "-") || w == "0" {
				t.Fatalf("%s: weight %d is %s", c.set, i, w)
			}
			if n := len(strings.TrimLeft(strings.Replace(strings.Split(w, "e")[0], ".", "", 1), "0")); n != 30 {
				t.Fatalf("%s: weight %s has %d digits", c.set, w, n)
			}
		}
		pi := precision.Pi(xprec)
		r2 := rat(49, 100)
		r6 := new(big.Float).SetPrec(xprec).Mul(r2, r2)
		r6.Mul(r6, r2)
		dx := func(p []*big.Float) (*big.Float, *big.Float) {
			return new(big.Float).SetPrec(xprec).Sub(p[0], c.x0), new(big.Float).SetPrec(xprec).Sub(p[1], c.y0)
		}
		checks := []struct {
			name string
			f    func(p []*big.Float) *big.Float
			want *big.Float
		}{
			{"area", func([]*big.Float) *big.Float { return rat(1, 1) }, new(big.Float).Mul(pi, r2)},
			{"X^2 Y^2", func(p []*big.Float) *big.Float {
				X, Y := dx(p)
				X.Mul(X, X)
				return X.Mul(X, Y.Mul(Y, Y))
			}, new(big.Float).Quo(new(big.Float).Mul(pi, r6), rat(24, 1))},
			{"X^4", func(p []*big.Float) *big.Float {
				X, _ := dx(p)
				X.Mul(X, X)
				return X.Mul(X, X)
			}, new(big.Float).Quo(new(big.Float).Mul(pi, r6), rat(8, 1))},
		}
		for _, ch := range checks {
			if e := relErrX(sumX(t, r, ch.f), ch.want); !(e <= 1e-27) {
				t.Errorf("%s, %s: relative error %.3g, want <= 1e-27", c.set, ch.name, e)
			} else {
				t.Logf("%s, %s: relative error %.3g (%d points)", c.set, ch.name, e, len(r.PrintedNodes))
			}
		}
	}
}
