package design

import (
	"context"
	"math/big"
	"testing"
)

// TestMFStartAccuracy checks that the double-double start of Legendre and
// Jacobi(-0.7, 2.3) rules lies within 2^-90 of the nodes the engine
// confirms (the start only has to be good, not right: the engine refines
// and confirms it).
func TestMFStartAccuracy(t *testing.T) {
	for _, c := range []struct {
		fam, a, b string
		n         int
	}{{"legendre", "", "", 200}, {"legendre", "", "", 301}, {"jacobi", "-0.7", "2.3", 250}} {
		src := family(t, c.fam, c.a, c.b, "")
		rec, err := src.Recurrence(c.n, 192)
		if err != nil {
			t.Fatal(err)
		}
		st, ok := mfStart(src, rec, c.n, 34)
		if !ok {
			t.Fatalf("%s n=%d: no start", c.fam, c.n)
		}
		r, err := Gauss(context.Background(), src, Request{Points: c.n, Digits: 34})
		if err != nil {
			t.Fatal(err)
		}
		worst := -1000
		for i, x := range st {
			d := new(big.Float).SetPrec(256).Sub(x, r.NodeValues[i])
			if d.Sign() != 0 {
				worst = max(worst, d.MantExp(nil))
			}
		}
		if worst > -90 {
			t.Errorf("%s n=%d: start off by 2^%d", c.fam, c.n, worst)
		}
		if r.Fallback {
			t.Errorf("%s n=%d: the Sturm fallback was taken", c.fam, c.n)
		}
		t.Logf("%s n=%d: worst 2^%d", c.fam, c.n, worst)
	}
}

// TestMFStartScope checks that the route declines what it is not for:
// more than 34 digits, float64 mode, small rules and infinite families
// (those keep the eigenvalue start).
func TestMFStartScope(t *testing.T) {
	for _, c := range []struct {
		fam    string
		n, dig int
	}{{"legendre", 300, 35}, {"legendre", 300, 0}, {"legendre", 199, 34}, {"laguerre", 300, 34}, {"hermite", 300, 34}} {
		src := family(t, c.fam, "", "", "")
		rec, err := src.Recurrence(c.n, 192)
		if err != nil {
			t.Fatal(err)
		}
		if _, ok := mfStart(src, rec, c.n, c.dig); ok {
			t.Errorf("%s n=%d digits=%d: mfStart should decline", c.fam, c.n, c.dig)
		}
	}
}
