package design

import (
	"context"
	"testing"
)

// The exactness test alone on a printed rule, through degree 2N-1: in the
// squared variable for a symmetric rule (Legendre), in x otherwise
// (Jacobi(-0.7, 2.3)). The rule is built once outside the timed loop.
func BenchmarkExactnessLegendre1000Digits100(b *testing.B) {
	benchExactness(b, family(b, "legendre", "", "", ""), 1000, 100)
}
func BenchmarkExactnessLegendre100Digits1000(b *testing.B) {
	benchExactness(b, family(b, "legendre", "", "", ""), 100, 1000)
}
func BenchmarkExactnessJacobi300Digits100(b *testing.B) {
	benchExactness(b, family(b, "jacobi", "-0.7", "2.3", ""), 300, 100)
}

func benchExactness(b *testing.B, src FamilySource, n, digits int) {
	r, err := Gauss(context.Background(), src, Request{Points: n, Digits: digits})
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		ex, err := VerifyPrinted(context.Background(), src, r.Nodes, r.Weights, 2*n-1)
		if err != nil || ex.Degree != 2*n-1 {
			b.Fatal(err, ex.Degree)
		}
	}
}
