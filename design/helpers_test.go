package design

import (
	"context"
	"math/big"
	"testing"

	"quadwright/moments"
	"quadwright/precision"
)

// family returns the source of a family for tests; params are exact strings.
func family(t testing.TB, name, alpha, beta, interval string) FamilySource {
	t.Helper()
	var a, b *big.Rat
	var err error
	if alpha != "" {
		if a, err = precision.ParseExact(alpha); err != nil {
			t.Fatal(err)
		}
	}
	if beta != "" {
		if b, err = precision.ParseExact(beta); err != nil {
			t.Fatal(err)
		}
	}
	var iv *moments.Interval
	if interval != "" {
		v, err := moments.ParseInterval(interval)
		if err != nil {
			t.Fatal(err)
		}
		iv = &v
	}
	f, err := moments.NewFamily(name, a, b, iv)
	if err != nil {
		t.Fatal(err)
	}
	return FamilySource{Family: f}
}

func build(t testing.TB, src FamilySource, n, digits int) *Rule {
	t.Helper()
	r, err := Gauss(context.Background(), src, Request{Points: n, Digits: digits})
	if err != nil {
		t.Fatalf("%s N=%d digits=%d: %v", src.Label(), n, digits, err)
	}
	return r
}

// rat parses a decimal string exactly (test helper).
func rat(t testing.TB, s string) *big.Rat {
	t.Helper()
	r, err := precision.ParseExact(s)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// absDiff returns |a-b| as a float64 (it is only compared with tolerances).
func absDiff(a, b *big.Rat) float64 {
	d := new(big.Rat).Sub(a, b)
	f, _ := d.Abs(d).Float64()
	return f
}

// withinLastPlace reports whether the printed decimal s is within one unit
// of its last place of the reference value ref.
func withinLastPlace(t testing.TB, s string, ref *big.Rat) bool {
	t.Helper()
	ulp, err := precision.DecimalULP(s)
	if err != nil {
		t.Fatal(err)
	}
	d := new(big.Rat).Sub(rat(t, s), ref)
	return d.Abs(d).Cmp(ulp) < 0
}
