package polytope

import (
	"math/big"
	"math/rand/v2"
	"testing"
)

// The float64 orientation filter against the exact sign, on triples that
// are exactly collinear, nearly collinear (one coordinate moved by
// 10^-k) and in general position, at magnitudes from 10^-8 to 10^8.
func TestOrientFilterAgreesWithExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	r := func(num, den int64) *big.Rat { return big.NewRat(num, den) }
	for it := 0; it < 3000; it++ {
		scale := []int64{1, 1000, 100000000}[it%3]
		den := []int64{1, 7, 100000000}[(it/3)%3]
		p := func() [2]*big.Rat {
			return [2]*big.Rat{r(rng.Int64N(2000001)-1000000, den), r(rng.Int64N(2000001)-1000000, den)}
		}
		a, b := p(), p()
		for _, v := range [][2]*big.Rat{a, b} {
			v[0].Mul(v[0], r(scale, 1))
			v[1].Mul(v[1], r(scale, 1))
		}
		// c = a + s (b - a), exactly on the line, then nudged
		s := r(rng.Int64N(2001)-1000, 333)
		c := [2]*big.Rat{new(big.Rat).Sub(b[0], a[0]), new(big.Rat).Sub(b[1], a[1])}
		c[0].Mul(c[0], s).Add(c[0], a[0])
		c[1].Mul(c[1], s).Add(c[1], a[1])
		switch it % 4 {
		case 1:
			c[1].Add(c[1], big.NewRat(1, 1000000000000))
		case 2:
			c[0].Sub(c[0], big.NewRat(1, 1000000000000000000))
		case 3:
			c = p()
		}
		o := newOutline([][2]*big.Rat{a, b, c})
		if got, want := o.orient(0, 1, 2), cross2(a, b, c).Sign(); got != want {
			t.Fatalf("%v %v %v: filter %d, exact %d", a, b, c, got, want)
		}
		if got, want := o.areaSign(), signedArea2(o.v).Sign(); got != want {
			t.Fatalf("%v %v %v: area filter %d, exact %d", a, b, c, got, want)
		}
	}
}
