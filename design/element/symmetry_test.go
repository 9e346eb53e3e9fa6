package element

import (
	"math"
	"math/big"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// The orbit sizes of every shape's orbit types (common practice: the
// orders of the stabilisers in the groups S3, D4, Oh, S4, D3h, C4v).
func TestOrbitSizes(t *testing.T) {
	want := map[Shape][]int{
		Triangle:      {1, 3, 6},
		Quadrilateral: {1, 4, 4, 8},
		Hexahedron:    {1, 6, 8, 12, 24, 24, 48},
		Tetrahedron:   {1, 4, 6, 12, 24},
		Prism:         {1, 2, 3, 6, 6, 12},
		Pyramid:       {1, 4, 4, 8},
	}
	for s, sizes := range want {
		sy := SymmetryOf(s)
		if len(sy.Types) != len(sizes) {
			t.Errorf("%s: %d orbit types, want %d", s, len(sy.Types), len(sizes))
			continue
		}
		for i, o := range sy.Types {
			if o.Points() != sizes[i] {
				t.Errorf("%s orbit %s: %d points, want %d", s, o.Name, o.Points(), sizes[i])
			}
		}
	}
}

// The generic basis of every shape is orthonormal: tested on a collapsed
// or tensor product rule of degree 2d from Product (30 digits), which
// integrates every product of two basis functions exactly.
func TestBasisOrthonormal(t *testing.T) {
	for _, c := range []struct {
		s Shape
		d int
	}{{Triangle, 8}, {Quadrilateral, 6}, {Hexahedron, 4}, {Tetrahedron, 5}, {Prism, 4}, {Pyramid, 5}} {
		r, err := Product(t.Context(), Request{Shape: c.s, Degree: 2 * c.d, Digits: 30})
		if err != nil {
			t.Fatal(err)
		}
		b := basisFor(c.s, c.d)
		m := b.m
		gram := make([]float64, m*m)
		gramBig := make([]*big.Float, m*m)
		for i := range gramBig {
			gramBig[i] = new(big.Float).SetPrec(160)
		}
		val := make([]float64, m)
		vb := make([]*big.Float, m)
		for i := range r.Nodes {
			xf := make([]float64, len(r.Nodes[i]))
			xb := make([]*big.Float, len(r.Nodes[i]))
			for k, s := range r.Nodes[i] {
				xb[k], _ = new(big.Float).SetPrec(160).SetString(s)
				xf[k], _ = xb[k].Float64()
			}
			w, _ := new(big.Float).SetPrec(160).SetString(r.Weights[i])
			wf, _ := w.Float64()
			b.values64(xf, val)
			b.valuesBig(xb, 160, vb)
			for j := 0; j < m; j++ {
				for k := 0; k < m; k++ {
					gram[j*m+k] += wf * val[j] * val[k]
					p := new(big.Float).SetPrec(160).Mul(vb[j], vb[k])
					gramBig[j*m+k].Add(gramBig[j*m+k], p.Mul(p, w))
				}
			}
		}
		for j := 0; j < m; j++ {
			for k := 0; k < m; k++ {
				want := 0.0
				if j == k {
					want = 1
				}
				// Tuned: float64 norms (1e-15) and sums of a few hundred terms.
				if math.Abs(gram[j*m+k]-want) > 1e-12 {
					t.Errorf("%s float64 <psi_%d, psi_%d> = %g, want %g", c.s, j, k, gram[j*m+k], want)
				}
				g, _ := gramBig[j*m+k].Float64()
				// The norms are float64: the diagonal is 1 to about 1e-15.
				if tol := map[bool]float64{true: 1e-13, false: 1e-28}[j == k]; math.Abs(g-want) > tol {
					t.Errorf("%s big <psi_%d, psi_%d> = %g, want %g", c.s, j, k, g, want)
				}
			}
		}
	}
}

// The analytic gradients of the basis agree with central differences.
func TestBasisGradient(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, s := range []Shape{Triangle, Quadrilateral, Hexahedron, Tetrahedron, Prism, Pyramid} {
		b := basisFor(s, 7)
		dim := s.Dim()
		x := make([]float64, dim)
		for k := range x {
			x[k] = 0.1 + 0.2*rng.Float64()
		}
		val, grad := make([]float64, b.m), make([]float64, b.m*dim)
		b.eval64(x, val, grad)
		v2 := make([]float64, b.m)
		b.values64(x, v2)
		lo, hi := make([]float64, b.m), make([]float64, b.m)
		for c := 0; c < dim; c++ {
			const h = 1e-6
			xp := append([]float64(nil), x...)
			xp[c] += h
			b.values64(xp, hi)
			xp[c] -= 2 * h
			b.values64(xp, lo)
			for j := 0; j < b.m; j++ {
				fd := (hi[j] - lo[j]) / (2 * h)
				// Tuned: central differences with h = 1e-6 on values of size <= 100.
				if math.Abs(fd-grad[j*dim+c]) > 1e-6*(1+math.Abs(fd)) {
					t.Errorf("%s: d psi_%d / dx_%d = %g, differences give %g", s, j, c, grad[j*dim+c], fd)
				}
			}
		}
		for j := range val {
			if math.Abs(val[j]-v2[j]) > 1e-13*(1+math.Abs(val[j])) {
				t.Errorf("%s: eval64 and values64 differ at %d", s, j)
			}
		}
	}
}

// On the triangle the generic basis is the PKD basis of pkd64 (the
// closed form of Dubiner 1991, implemented separately): the same values at
// a point, listed in another order.
func TestBasisIsPKD(t *testing.T) {
	const d = 10
	b := basisFor(Triangle, d)
	got, want := make([]float64, b.m), make([]float64, pkdLen(d))
	b.values64([]float64{0.21, 0.37}, got)
	pkd64(d, 0.21, 0.37, want)
	sort.Float64s(got)
	sort.Float64s(want)
	for j := range got {
		if math.Abs(got[j]-want[j]) > 1e-12*(1+math.Abs(want[j])) {
			t.Fatalf("sorted value %d: %g, PKD %g", j, got[j], want[j])
		}
	}
}

// The invariant basis is invariant: phi_i(g x) = phi_i(x) for every
// symmetry g, and the projected residual has the norm of the full one.
func TestInvariantBasis(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, c := range []struct {
		s Shape
		d int
	}{{Triangle, 20}, {Quadrilateral, 15}, {Hexahedron, 11}, {Tetrahedron, 10}, {Prism, 10}, {Pyramid, 10}} {
		sy := SymmetryOf(c.s)
		st := Structure(make([]int, len(sy.Types)))
		st[len(st)-1] = 2
		st[1] = 1
		full, proj := newSystem(sy, st, c.d), newProjectedSystem(sy, st, c.d)
		v := start(sy, st, rng)
		rf, rp := make([]float64, full.m), make([]float64, proj.m)
		full.eval(v, rf, nil)
		proj.eval(v, rp, nil)
		// Tuned: float64 sums of up to 455 terms of size up to 1e2.
		if a, b := norm2(rf), norm2(rp); math.Abs(a-b) > 1e-12*(1+a) {
			t.Errorf("%s degree %d: residual norm %g in full, %g projected", c.s, c.d, a, b)
		}
		Jf, Jp := mat.NewDense(full.m, full.n, nil), mat.NewDense(proj.m, proj.n, nil)
		full.eval(v, rf, Jf)
		proj.eval(v, rp, Jp)
		var Af, Ap mat.SymDense
		Af.SymOuterK(1, Jf.T())
		Ap.SymOuterK(1, Jp.T())
		for i := 0; i < full.n; i++ {
			for j := 0; j < full.n; j++ {
				if d := Af.At(i, j) - Ap.At(i, j); math.Abs(d) > 1e-10*(1+math.Abs(Af.At(i, j))) {
					t.Fatalf("%s degree %d: J^T J differs at (%d,%d): %g vs %g", c.s, c.d, i, j, Af.At(i, j), Ap.At(i, j))
				}
			}
		}
	}
}
