package element

import (
	"math/rand/v2"
	"sync"

	"gonum.org/v1/gonum/mat"
)

// invariantBasis is an orthonormal basis of the invariant polynomials of
// degree <= deg in the coordinates of the orthonormal basis psi: row i of
// qt (r x m) holds the coefficients of phi_i = sum_j qt[i][j] psi_j. Since
// phi_i is invariant, its sum over an orbit O is |O| phi_i at any one
// point of O, and for a fully symmetric rule the residuals
// sum_O w_O |O| phi_i(x_O) - integral of phi_i are the projection onto the
// invariant subspace of the residuals in psi, which lie in that subspace:
// the same norm from r equations evaluated at one point per orbit.
type invariantBasis struct {
	r, m int
	qt   []float64
}

type invKey struct {
	s   Shape
	deg int
}

var invCache sync.Map // invKey -> *invariantBasis

// invariantsOf returns the invariant basis of degree d on sy's element:
// the left singular vectors, for singular values above 1e-9 of the
// largest, of the orbit sums of psi over m+8 random general orbits (for
// an orthonormal basis psi on which the group acts orthogonally, the
// orbit sums span exactly the invariant subspace).
func (sy *Symmetry) invariantsOf(d int) *invariantBasis {
	if v, ok := invCache.Load(invKey{sy.Shape, d}); ok {
		return v.(*invariantBasis)
	}
	gi := len(sy.Types) - 1
	st := Structure(make([]int, len(sy.Types)))
	st[gi] = 1
	sys := newSystem(sy, st, d)
	rng := rand.New(rand.NewPCG(7, uint64(d)))
	K := sys.m + 8
	S := mat.NewDense(sys.m, K, nil)
	r := make([]float64, sys.m)
	for k := 0; k < K; k++ {
		v := start(sy, st, rng)
		v[0] = 1
		sys.eval(v, r, nil)
		r[0] += sys.mass
		S.SetCol(k, r)
	}
	var svd mat.SVD
	if !svd.Factorize(S, mat.SVDThinU) {
		panic("element: SVD of the orbit sums failed")
	}
	rank := 0
	sv := svd.Values(nil)
	for _, x := range sv {
		if x > 1e-9*sv[0] {
			rank++
		}
	}
	var U mat.Dense
	svd.UTo(&U)
	ib := &invariantBasis{r: rank, m: sys.m, qt: make([]float64, rank*sys.m)}
	for i := 0; i < rank; i++ {
		for j := 0; j < sys.m; j++ {
			ib.qt[i*sys.m+j] = U.At(j, i)
		}
	}
	v, _ := invCache.LoadOrStore(invKey{sy.Shape, d}, ib)
	return v.(*invariantBasis)
}

// Equations returns the number of independent moment equations of a fully
// symmetric rule of degree d on sy's element, the dimension of the
// polynomials of degree <= d invariant under the group (invariantsOf).
func (sy *Symmetry) Equations(d int) int { return sy.invariantsOf(d).r }

// newProjectedSystem is newSystem on the r invariant equations
// (invariantBasis): each orbit is evaluated at one point.
func newProjectedSystem(sy *Symmetry, st Structure, deg int) *system {
	s := newSystem(sy, st, deg)
	s.proj = sy.invariantsOf(deg)
	s.m = s.proj.r
	return s
}

// like returns a system of the same kind (projected or not) for st.
func (s *system) like(st Structure) *system {
	if s.proj != nil {
		return newProjectedSystem(s.sy, st, s.deg)
	}
	return newSystem(s.sy, st, s.deg)
}

// evalProjected is eval on the invariant equations.
func (s *system) evalProjected(v []float64, r []float64, J *mat.Dense) {
	q := s.proj
	M := q.m
	for i := range r {
		r[i] = -s.mass * q.qt[i*M]
	}
	dim := s.sy.Shape.Dim()
	var jd []float64
	if J != nil {
		jd = J.RawMatrix().Data
	}
	k := 0
	for _, o := range s.orbits {
		w := v[k]
		t := v[k+1 : k+1+o.Params]
		A := o.A64[0]
		s.setPoint(o, 0, t)
		size := float64(len(o.c64))
		if J == nil {
			s.basis.values64(s.x, s.val)
			for i := 0; i < s.m; i++ {
				row := q.qt[i*M : (i+1)*M]
				phi := 0.0
				for j, y := range s.val[:M] {
					phi += row[j] * y
				}
				r[i] += w * size * phi
			}
			k += 1 + o.Params
			continue
		}
		s.basis.eval64(s.x, s.val, s.grad)
		for i := 0; i < s.m; i++ {
			row := q.qt[i*M : (i+1)*M]
			var phi, g0, g1, g2 float64
			for j, y := range s.val[:M] {
				phi += row[j] * y
			}
			switch dim {
			case 2:
				for j := 0; j < M; j++ {
					g0 += row[j] * s.grad[2*j]
					g1 += row[j] * s.grad[2*j+1]
				}
			case 3:
				for j := 0; j < M; j++ {
					g0 += row[j] * s.grad[3*j]
					g1 += row[j] * s.grad[3*j+1]
					g2 += row[j] * s.grad[3*j+2]
				}
			}
			r[i] += w * size * phi
			jr := jd[i*s.n : (i+1)*s.n]
			jr[k] = size * phi
			g := [3]float64{g0, g1, g2}
			for p := 0; p < o.Params; p++ {
				d := 0.0
				for c := 0; c < dim; c++ {
					d += g[c] * A[c][p]
				}
				jr[k+1+p] = w * size * d
			}
		}
		k += 1 + o.Params
	}
}
