package element

import (
	"context"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
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

// benchmarkSearch designs a fully symmetric rule of degree d on s at the
// published point count from scratch and polishes it to 40 digits. Run
// with -cpu 1 -benchtime 1x: one iteration is a whole search.
func benchmarkSearch(b *testing.B, s Shape, d int, opt SearchOptions) {
	ctx := context.Background()
	opt.MaxStarts = 20000
	for b.Loop() {
		res, ok, err := SearchWith(ctx, s, d, Published(s, d), opt)
		if err != nil || !ok {
			b.Fatalf("%s degree %d: no rule (%v)", s, d, err)
		}
		if _, err := NewCatalogueEntry(ctx, d, res, opt.Seed); err != nil {
			b.Fatal(err)
		}
		b.ReportMetric(float64(res.Starts), "starts")
	}
}

func BenchmarkTriangleDegree10Search(b *testing.B) {
	benchmarkSearch(b, Triangle, 10, SearchOptions{Seed: 1, Projected: true})
}
func BenchmarkTriangleDegree15Search(b *testing.B) {
	benchmarkSearch(b, Triangle, 15, SearchOptions{Seed: 1, Projected: true})
}

// The degree-20 search on the invariant equations (the fastest
// configuration); ...Full on all the basis equations.
func BenchmarkTriangleDegree20Search(b *testing.B) {
	benchmarkSearch(b, Triangle, 20, SearchOptions{Seed: 1, Projected: true})
}
func BenchmarkTriangleDegree20SearchFull(b *testing.B) {
	benchmarkSearch(b, Triangle, 20, SearchOptions{Seed: 1})
}
func BenchmarkHexahedronDegree10Search(b *testing.B) {
	benchmarkSearch(b, Hexahedron, 10, SearchOptions{Seed: 1, Projected: true})
}
func BenchmarkTetrahedronDegree8Search(b *testing.B) {
	benchmarkSearch(b, Tetrahedron, 8, SearchOptions{Seed: 1, Projected: true})
}

// One evaluation of the degree-20 triangle moment equations of the
// 79-point structure with their analytic Jacobian, the inner step of the
// search.
func BenchmarkTriangleDegree20Jacobian(b *testing.B) { benchmarkJacobian(b, false) }

// The same on the invariant equations (one point per orbit).
func BenchmarkTriangleDegree20JacobianProjected(b *testing.B) { benchmarkJacobian(b, true) }

func benchmarkJacobian(b *testing.B, projected bool) {
	sy := SymmetryOf(Triangle)
	st := Structure{1, 8, 9}
	sys := newSystem(sy, st, 20)
	if projected {
		sys = newProjectedSystem(sy, st, 20)
	}
	v := start(sy, st, rand.New(rand.NewPCG(1, 2)))
	r := make([]float64, sys.m)
	J := mat.NewDense(sys.m, sys.n, nil)
	for b.Loop() {
		sys.eval(v, r, J)
	}
}
