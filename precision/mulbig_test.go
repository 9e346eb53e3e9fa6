package precision

import (
	"math/rand"
	"slices"
	"testing"
)

// TestMulViaBigMatchesShortProduct: the math/big route of mulLarge gives
// the same truncated product and shift as the Go short product mulTop
// (itself checked against math/big.Float by the Mul tests), for random
// normalised mantissas of 6 to 80 words (our own seeds).
func TestMulViaBigMatchesShortProduct(t *testing.T) {
	rng := rand.New(rand.NewSource(18))
	for w := 6; w <= 80; w++ {
		for it := 0; it < 50; it++ {
			x, y := make([]uint64, w), make([]uint64, w)
			z1, z2, p := make([]uint64, w), make([]uint64, w), make([]uint64, w+2)
			for i := range x {
				x[i], y[i] = rng.Uint64(), rng.Uint64()
			}
			if it%5 == 0 { // all-ones tails reach mulTop's exact fallback
				for i := range x {
					x[i], y[i] = ^uint64(0), ^uint64(0)
				}
			}
			x[w-1] |= 1 << 63
			y[w-1] |= 1 << 63
			s1 := mulTop(z1, x, y, p)
			s2 := mulViaBig(z2, x, y)
			if s1 != s2 || !slices.Equal(z1, z2) {
				t.Fatalf("%d words: the two products differ", w)
			}
		}
	}
}
