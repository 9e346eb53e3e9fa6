package fast_test

import (
	"context"
	"math"
	"testing"

	"quadwright/design/fast"
)

// The cost of the exactness check through degree 2N-1 (CheckChebyshev,
// the two transforms, the direct sums and the moments), the acceptance's
// sizes of the Chebyshev check: go test -run XXX -bench CheckChebyshev
// -cpu 1 ./design/fast/.

func BenchmarkCheckChebyshevLegendre1e6(b *testing.B) {
	n := 1000000
	x, w := make([]float64, n), make([]float64, n)
	fast.Legendre(n, x, w)
	benchCheck(b, x, w, [2]float64{2, 0}, [2]float64{}, [2]float64{}, 10)
}

func BenchmarkCheckChebyshevJacobi1e5(b *testing.B) {
	n := 100000
	x, w := make([]float64, n), make([]float64, n)
	a, be := -0.7, 2.3
	if err := fast.Jacobi(n, a, be, x, w); err != nil {
		b.Fatal(err)
	}
	// The mass 2^(a+b+1) Gamma(a+1) Gamma(b+1) / Gamma(a+b+2) in float64
	// (the benchmark times the check; its verdict is tested elsewhere).
	mass := math.Pow(2, a+be+1) * math.Gamma(a+1) * math.Gamma(be+1) / math.Gamma(a+be+2)
	benchCheck(b, x, w, [2]float64{mass, 0}, [2]float64{a, 0}, [2]float64{be, 0}, 100)
}

func benchCheck(b *testing.B, x, w []float64, mass, a, be [2]float64, direct int) {
	n := len(x)
	measureCPU(b, func() {
		c, err := fast.CheckChebyshev(context.Background(), x, w, unitLo, unitHalf, mass, a, be, 2*n-1, direct, 1e-15)
		if err != nil {
			b.Fatal(err)
		}
		_ = c
	})
}

func BenchmarkCheckChebyshevLegendre1e7(b *testing.B) {
	n := 10000000
	x, w := make([]float64, n), make([]float64, n)
	fast.Legendre(n, x, w)
	benchCheck(b, x, w, [2]float64{2, 0}, [2]float64{}, [2]float64{}, 8)
}
