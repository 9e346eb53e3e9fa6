package design

import (
	"math/big"
	"testing"
)

// TestJacobiRecurrenceMatchesRationalForms: the integer quotients of
// jacobiRecurrence round to the same 300-bit values as the closed forms
// of jacobiPairs in exact rational arithmetic, mapped to the interval, for
// parameters and intervals of our own choosing (Legendre, Chebyshev of
// both kinds' neighbours, a non-classical pair, fractions).
func TestJacobiRecurrenceMatchesRationalForms(t *testing.T) {
	for _, ab := range [][2]string{{"0", "0"}, {"-0.7", "2.3"}, {"0.5", "-0.5"}, {"-0.5", "-0.5"}, {"1/3", "-2/7"}} {
		for _, iv := range []string{"-1,1", "0,1", "-3/2,5"} {
			fs := family(t, "jacobi", ab[0], ab[1], iv)
			r, _ := fs.Recurrence(50, 300)
			a, b := fs.Family.JacobiExponents()
			al := make([]*big.Rat, 50)
			be := make([]*big.Rat, 50)
			jacobiPairs(a, b, al, be)
			lo, hi := fs.Family.Interval.Lo.Value, fs.Family.Interval.Hi.Value
			c := new(big.Rat).Quo(new(big.Rat).Add(lo, hi), big.NewRat(2, 1))
			h := new(big.Rat).Quo(new(big.Rat).Sub(hi, lo), big.NewRat(2, 1))
			h2 := new(big.Rat).Mul(h, h)
			for k := 0; k < 50; k++ {
				al[k].Add(c, al[k].Mul(h, al[k]))
				be[k].Mul(h2, be[k])
				x := new(big.Float).SetPrec(300).SetRat(al[k])
				if x.Cmp(r.Alpha[k]) != 0 {
					t.Fatalf("%v %s alpha %d", ab, iv, k)
				}
				if k > 0 {
					y := new(big.Float).SetPrec(300).SetRat(be[k])
					if y.Cmp(r.Beta[k]) != 0 {
						t.Fatalf("%v %s beta %d", ab, iv, k)
					}
				}
			}
		}
	}
}
