package design

import (
	"context"
	"testing"
)

// Whole verified Gauss-Legendre builds at extended precision, the pairs
// that ../shared/bench/vs-arb compares with Arb (issue 18's targets are CPU
// ratios against Arb measured by that script, not times here).
func BenchmarkGaussLegendre100Digits34(b *testing.B)   { benchLegendre(b, 100, 34) }
func BenchmarkGaussLegendre1000Digits34(b *testing.B)  { benchLegendre(b, 1000, 34) }
func BenchmarkGaussLegendre1000Digits100(b *testing.B) { benchLegendre(b, 1000, 100) }
func BenchmarkGaussLegendre100Digits1000(b *testing.B) { benchLegendre(b, 100, 1000) }

func benchLegendre(b *testing.B, n, digits int) {
	src := family(b, "legendre", "", "", "")
	for i := 0; i < b.N; i++ {
		if _, err := Gauss(context.Background(), src, Request{Points: n, Digits: digits}); err != nil {
			b.Fatal(err)
		}
	}
}
