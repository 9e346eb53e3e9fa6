package design

import (
	"context"
	"testing"
)

// BenchmarkGaussJacobi100Digits34 and BenchmarkGaussJacobi1000Digits34 time
// a whole verified build (two stages and the exactness check) of a
// Gauss-Jacobi rule with non-classical parameters. Targets: 50 ms and 3 s on
// one core (run with -cpu 1).
func BenchmarkGaussJacobi100Digits34(b *testing.B)  { benchJacobi(b, 100) }
func BenchmarkGaussJacobi1000Digits34(b *testing.B) { benchJacobi(b, 1000) }

func benchJacobi(b *testing.B, n int) {
	src := family(b, "jacobi", "-0.7", "2.3", "")
	for i := 0; i < b.N; i++ {
		if _, err := Gauss(context.Background(), src, Request{Points: n, Digits: 34}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkGaussLegendre1000Float64(b *testing.B) {
	src := family(b, "legendre", "", "", "")
	for i := 0; i < b.N; i++ {
		if _, err := Gauss(context.Background(), src, Request{Points: 1000}); err != nil {
			b.Fatal(err)
		}
	}
}
