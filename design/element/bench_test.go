package element

import (
	"context"
	"testing"
)

// The largest product rules Build accepts, in float64 mode and at 34 digits.
func benchmarkProduct(b *testing.B, s Shape, deg, digits int) {
	for b.Loop() {
		if _, err := Product(context.Background(), Request{Shape: s, Degree: deg, Digits: digits}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkProductHexahedron30(b *testing.B)          { benchmarkProduct(b, Hexahedron, 30, 0) }
func BenchmarkProductTetrahedron30Digits34(b *testing.B) { benchmarkProduct(b, Tetrahedron, 30, 34) }
func BenchmarkProductPyramid30(b *testing.B)             { benchmarkProduct(b, Pyramid, 30, 0) }
func BenchmarkProductTriangle99(b *testing.B)            { benchmarkProduct(b, Triangle, 99, 0) }
func BenchmarkProductLine999(b *testing.B)               { benchmarkProduct(b, Line, 999, 0) }
func BenchmarkProductTriangle20(b *testing.B)            { benchmarkProduct(b, Triangle, 20, 0) }

// benchmarkSearch designs a fully symmetric triangle rule of degree d at
// the published point count from scratch (with the seed the catalogue used)
// and polishes it to 40 digits. Run with -cpu 1 -benchtime 1x: one
// iteration is a whole search.
func benchmarkSearch(b *testing.B, d int, seed uint64) {
	ctx := context.Background()
	for b.Loop() {
		res, ok, err := SearchTriangle(ctx, d, PublishedTriangle[d-1], seed, 20000)
		if err != nil || !ok {
			b.Fatalf("degree %d: no rule (%v)", d, err)
		}
		if _, err := NewCatalogueEntry(ctx, d, res, seed); err != nil {
			b.Fatal(err)
		}
		b.ReportMetric(float64(res.Starts), "starts")
	}
}

func BenchmarkTriangleDegree10Search(b *testing.B) { benchmarkSearch(b, 10, 1) }
func BenchmarkTriangleDegree15Search(b *testing.B) { benchmarkSearch(b, 15, 1) }
func BenchmarkTriangleDegree20Search(b *testing.B) { benchmarkSearch(b, 20, 2) }
