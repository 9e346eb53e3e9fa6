package design

import (
	"context"
	"testing"
)

// Benchmarks of whole verified builds (two stages and the exactness
// checks). Targets on one core (-cpu 1): Lobatto 100 points at 34 digits
// 60 ms, Kronrod extension of the 50-point Gauss rule at 34 digits 150 ms,
// Kronrod 20 in float64 mode 20 ms, Clenshaw-Curtis 101 points at 34 digits
// 60 ms, anti-Gauss paired with Gauss-Legendre 100 at 34 digits 100 ms
// (its Gauss rule and the averaged-rule check included).
func BenchmarkLobattoJacobi100Digits34(b *testing.B) {
	src := family(b, "jacobi", "-0.7", "2.3", "")
	for i := 0; i < b.N; i++ {
		if _, err := Lobatto(context.Background(), src, Request{Points: 100, Digits: 34}, nil, nil); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkKronrodLegendre50Digits34(b *testing.B) { benchKronrod(b, 50, 34) }
func BenchmarkKronrodLegendre20Float64(b *testing.B)  { benchKronrod(b, 20, 0) }

func benchKronrod(b *testing.B, n, digits int) {
	src := family(b, "legendre", "", "", "")
	for i := 0; i < b.N; i++ {
		if _, err := Kronrod(context.Background(), src, Request{Points: n, Digits: digits}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkClenshawCurtis101Digits34(b *testing.B) {
	src := family(b, "legendre", "", "", "")
	for i := 0; i < b.N; i++ {
		if _, err := Preset(context.Background(), src, Request{Points: 101, Digits: 34}, "clenshaw-curtis"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkAntiGaussLegendre100Digits34(b *testing.B) {
	src := family(b, "legendre", "", "", "")
	for i := 0; i < b.N; i++ {
		if _, err := AntiGauss(context.Background(), src, Request{Points: 100, Digits: 34}); err != nil {
			b.Fatal(err)
		}
	}
}
