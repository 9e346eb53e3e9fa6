package design_test

import (
	"context"
	"testing"

	"quadwright/design"
)

// BenchmarkBuildFastLegendre1e6 times a whole fast build of the 10^6-point
// Gauss-Legendre rule: nodes, the exactness check and the sampled accuracy.
func BenchmarkBuildFastLegendre1e6(b *testing.B) {
	f := fastFamily(b, "legendre", nil, nil, "")
	for i := 0; i < b.N; i++ {
		if _, err := design.BuildFast(context.Background(), f, "gauss", 1000000, design.FastOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkBuildFastLegendre1e7 is BenchmarkBuildFastLegendre1e6 at 10^7
// points.
func BenchmarkBuildFastLegendre1e7(b *testing.B) {
	f := fastFamily(b, "legendre", nil, nil, "")
	for i := 0; i < b.N; i++ {
		if _, err := design.BuildFast(context.Background(), f, "gauss", 10000000, design.FastOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
