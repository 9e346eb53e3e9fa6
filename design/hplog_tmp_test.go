package design

import (
	"testing"
)

func BenchmarkHplogMC(b *testing.B) {
	src := exprSource(b, "-log(x)", "0,1")
	cf, _ := src.closedForm()
	n := 1000
	for _, w := range []uint{256, 320} {
		nu, _ := cf.Moments(2*n, w)
		a, bb := basisPairs(src.Basis, 2*n-1, w)
		b.Run(string(rune('0'+w/64)), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				ModifiedChebyshev(nu, a, bb, n, w)
			}
		})
	}
}
