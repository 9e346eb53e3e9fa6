package element

import (
	"context"
	"testing"
)

// BenchmarkWeightedTriangleRadius10 builds the degree-10 rule for the
// radius weight x on the triangle (axisymmetric elements), float64 mode.
func BenchmarkWeightedTriangleRadius10(b *testing.B) {
	for i := 0; i < b.N; i++ {
		if _, err := Weighted(context.Background(), Request{Shape: Triangle, Degree: 10, Weight: "x"}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkWeightedTetrahedron6 builds a degree-6 rule for 1+x on the
// tetrahedron, 30 digits.
func BenchmarkWeightedTetrahedron6(b *testing.B) {
	for i := 0; i < b.N; i++ {
		if _, err := Weighted(context.Background(), Request{Shape: Tetrahedron, Degree: 6, Digits: 30, Weight: "1+x"}); err != nil {
			b.Fatal(err)
		}
	}
}
