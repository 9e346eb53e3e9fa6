package element

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// system holds the float64 moment equations of one structure and degree:
// r_j = sum_i w_i psi_j(x_i) - integral of psi_j over the orthonormal
// basis psi_j of degree deg (jacobiBasis), and their Jacobian.
type system struct {
	sy     *Symmetry
	st     Structure
	deg    int
	m, n   int
	basis  *jacobiBasis
	orbits []*OrbitType
	mass   float64 // integral of psi_0
	x      []float64
	val    []float64
	grad   []float64
	sum    []float64
	gsum   []float64 // m x 3
	// proj, when set, replaces the m basis equations by its r invariant
	// ones (m is then r; see invariantBasis).
	proj *invariantBasis
}

func newSystem(sy *Symmetry, st Structure, deg int) *system {
	b := basisFor(sy.Shape, deg)
	dim := sy.Shape.Dim()
	vol, _ := sy.Shape.Measure().Float64()
	return &system{sy: sy, st: st, deg: deg, m: b.m, n: st.Unknowns(sy), basis: b,
		orbits: st.orbitList(sy), mass: vol * b.scale[0],
		x: make([]float64, dim), val: make([]float64, b.m), grad: make([]float64, b.m*dim),
		sum: make([]float64, b.m), gsum: make([]float64, b.m*3)}
}

// eval sets r to the residuals of v and, when J is not nil, J (m x n) to
// their Jacobian: exact in the weights; in the coordinates the basis
// gradients times the constant Jacobian of the orbit's affine points.
func (s *system) eval(v []float64, r []float64, J *mat.Dense) {
	if s.proj != nil {
		s.evalProjected(v, r, J)
		return
	}
	for j := range r {
		r[j] = 0
	}
	r[0] = -s.mass
	dim := s.sy.Shape.Dim()
	var jd []float64
	if J != nil {
		jd = J.RawMatrix().Data
	}
	k := 0
	for _, o := range s.orbits {
		w := v[k]
		t := v[k+1 : k+1+o.Params]
		for j := range s.sum {
			s.sum[j] = 0
		}
		if J != nil {
			for j := range s.gsum {
				s.gsum[j] = 0
			}
		}
		for p := range o.c64 {
			s.setPoint(o, p, t)
			if J == nil {
				s.basis.values64(s.x, s.val)
				for j, y := range s.val {
					s.sum[j] += y
				}
				continue
			}
			s.basis.eval64(s.x, s.val, s.grad)
			A := o.A64[p]
			for j, y := range s.val {
				s.sum[j] += y
				g := s.grad[j*dim : j*dim+dim]
				for q := 0; q < o.Params; q++ {
					d := 0.0
					for c := 0; c < dim; c++ {
						d += g[c] * A[c][q]
					}
					s.gsum[j*3+q] += d
				}
			}
		}
		for j := range r {
			r[j] += w * s.sum[j]
		}
		if J != nil {
			for j := 0; j < s.m; j++ {
				row := jd[j*s.n : (j+1)*s.n]
				row[k] = s.sum[j]
				for q := 0; q < o.Params; q++ {
					row[k+1+q] = w * s.gsum[j*3+q]
				}
			}
		}
		k += 1 + o.Params
	}
}

// setPoint sets s.x to point p of orbit o with parameters t.
func (s *system) setPoint(o *OrbitType, p int, t []float64) {
	for c := range s.x {
		s.x[c] = o.c64[p][c]
		for q, tq := range t {
			s.x[c] += o.A64[p][c][q] * tq
		}
	}
}

func norm2(r []float64) float64 {
	t := 0.0
	for _, x := range r {
		t += x * x
	}
	return math.Sqrt(t)
}

// levenbergMarquardt minimises |r(v)| from v (changed in place) by the
// Levenberg-Marquardt method (K. Levenberg, "A method for the solution of
// certain non-linear problems in least squares", Quart. Appl. Math. 2,
// 1944; D. W. Marquardt, "An algorithm for least-squares estimation of
// nonlinear parameters", J. SIAM 11, 1963) with Marquardt's diagonal
// scaling, in float64. It returns the final |r|; it gives up early when a
// point strays far outside the element or the residual stalls.
func (s *system) levenbergMarquardt(v []float64, maxIter int) float64 {
	n := len(v)
	r := make([]float64, s.m)
	rt := make([]float64, s.m)
	J := mat.NewDense(s.m, n, nil)
	trial := make([]float64, n)
	var A mat.SymDense
	A.ReuseAsSym(n)
	M := mat.NewSymDense(n, nil)
	g := mat.NewVecDense(n, nil)
	d := mat.NewVecDense(n, nil)
	rv := mat.NewVecDense(s.m, r)
	var ch mat.Cholesky
	lambda := 1e-3
	s.eval(v, r, J)
	cost := norm2(r)
	// A start that has not halved its residual in 20 steps, while still
	// far from a solution, is abandoned: such starts almost never converge,
	// and they would otherwise take most of the search time.
	mark := cost
	for it := 0; it < maxIter && cost > 1e-15; it++ {
		if it > 0 && it%20 == 0 {
			if cost > 1e-6 && cost > mark/2 {
				return cost
			}
			mark = cost
		}
		A.SymOuterK(1, J.T())
		g.MulVec(J.T(), rv)
		improved := false
		for lambda < 1e12 {
			M.CopySym(&A)
			for i := 0; i < n; i++ {
				M.SetSym(i, i, A.At(i, i)*(1+lambda)+1e-14)
			}
			if ch.Factorize(M) && ch.SolveVecTo(d, g) == nil {
				for i := range trial {
					trial[i] = v[i] - d.AtVec(i)
				}
				s.eval(trial, rt, nil)
				if c := norm2(rt); c < cost {
					copy(v, trial)
					cost = c
					lambda = math.Max(lambda/5, 1e-12)
					improved = true
					break
				}
			}
			lambda *= 4
		}
		if !improved || !roughlyInside(s.sy, s.st, v, -0.5) {
			return cost
		}
		s.eval(v, r, J)
	}
	return cost
}

// start draws a random starting point for st: every weight the measure
// over the number of points; each orbit's coordinates uniform in the
// element's bounding box, drawn again until the orbit lies inside with a
// margin of 1% and its points are distinct.
func start(sy *Symmetry, st Structure, rng *rand.Rand) []float64 {
	vol, _ := sy.Shape.Measure().Float64()
	w := vol / float64(st.Points(sy))
	var v []float64
	for i, c := range st {
		for k := 0; k < c; k++ {
			t, _ := randomOrbit(sy, i, rng)
			v = append(append(v, w), t...)
		}
	}
	return v
}

// randomOrbit draws the parameters of an orbit of type i uniformly in the
// element's bounding box until the orbit lies inside with a margin of 1%
// and its points are distinct (ok), at most 10000 times.
func randomOrbit(sy *Symmetry, i int, rng *rand.Rand) (t []float64, ok bool) {
	o := &sy.Types[i]
	t = make([]float64, o.Params)
	one := single(sy, i)
	for try := 0; try < 10000; try++ {
		for q := range t {
			c := 0
			for c < len(o.A64[0]) && o.A64[0][c][q] == 0 {
				c++
			}
			t[q] = sy.lo[c] + (sy.hi[c]-sy.lo[c])*rng.Float64()
		}
		v := append([]float64{1}, t...)
		if roughlyInside(sy, one, v, 0.01) && acceptable(sy, one, v) {
			return t, true
		}
	}
	return t, false
}

// Structures lists the orbit structures of sy with exactly p points, at
// least as many unknowns as Equations(d) and enough unknowns off every
// stratum (admissible), those with fewest unknowns first (then those with
// fewer orbits of the first types).
func (sy *Symmetry) Structures(d, p int) []Structure {
	need := sy.Equations(d)
	var out []Structure
	cur := make([]int, len(sy.Types))
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == len(sy.Types) {
			if left == 0 {
				st := Structure(append([]int(nil), cur...))
				if st.Unknowns(sy) >= need && sy.admissible(st, d) {
					out = append(out, st)
				}
			}
			return
		}
		o := sy.Types[i]
		maxc := left / o.Points()
		if o.Params == 0 {
			maxc = min(maxc, 1)
		}
		for c := 0; c <= maxc; c++ {
			cur[i] = c
			rec(i+1, left-c*o.Points())
		}
		cur[i] = 0
	}
	rec(0, p)
	sort.SliceStable(out, func(i, j int) bool { return out[i].Unknowns(sy) < out[j].Unknowns(sy) })
	return out
}

// SearchResult is a fully symmetric rule found in float64.
type SearchResult struct {
	Shape     Shape
	Structure Structure
	Params    []float64 // the parameter vector (see expand64)
	Residual  float64   // |r| of the moment equations in the orthonormal basis
	Starts    int       // starts tried
}

// Search looks for a fully symmetric rule of degree d with p points,
// positive weights and interior points on the element s, on the moment
// equations in the orthonormal basis. It works in rounds. Each round
// opens with a descent (descend.go): an NNLS rule over random candidate
// orbits made smaller by orbit elimination and demotion until it has p
// points. The structures of p points (Structures) are then visited; a
// structure with e more unknowns than the fewest any of them has is
// visited in every (1+e^2)-th round only, since the rules of fewest points
// almost always have the fewest unknowns. Each visit makes two starts: one
// by orbit elimination from a rule with two more orbits of the most
// general type (eliminateTo, after Xiao and Gimbutas 2010) and one by
// Levenberg-Marquardt directly on the structure, each from a random
// start. A descent and each start count as one of at most maxStarts
// starts. The random numbers come from a PCG stream seeded by seed, d and
// p, so the result is the same for the same arguments. ok is false when
// no start succeeded.
func Search(ctx context.Context, s Shape, d, p int, seed uint64, maxStarts int) (SearchResult, bool, error) {
	return SearchWith(ctx, s, d, p, SearchOptions{Seed: seed, MaxStarts: maxStarts})
}

// SearchOptions tunes SearchWith.
type SearchOptions struct {
	Seed      uint64
	MaxStarts int
	// Projected solves the invariant equations only, each orbit evaluated
	// at one point (invariantBasis): the same solutions, fewer and cheaper
	// equations, another path through the starts.
	Projected bool
	// Uniform visits every structure in every round: slower to the rules
	// of fewest unknowns, but it reaches the structures with many spare
	// unknowns (easy to solve, hard to keep positive and inside) as often,
	// which is what finds a rule above the published count.
	Uniform bool
	// RandomOnly leaves out the descent (descend.go) that opens every
	// round, for the random starts alone (the search of catalogue entries
	// made before the descent, with their seeds).
	RandomOnly bool
}

// SearchWith is Search with options.
func SearchWith(ctx context.Context, s Shape, d, p int, opt SearchOptions) (SearchResult, bool, error) {
	seed, maxStarts := opt.Seed, opt.MaxStarts
	sy := SymmetryOf(s)
	if sy == nil {
		return SearchResult{}, false, fmt.Errorf("the %s has no symmetric rules to search", s)
	}
	sts := sy.Structures(d, p)
	if len(sts) == 0 {
		return SearchResult{Shape: s}, false, nil
	}
	least := sts[0].Unknowns(sy)
	rng := rand.New(rand.NewPCG(seed, uint64(d)<<32|uint64(p)))
	tries := 0
	dsys := newProjectedSystem(sy, sts[0], d)
	for round := 0; tries < maxStarts; round++ {
		if !opt.RandomOnly {
			if err := ctx.Err(); err != nil {
				return SearchResult{}, false, err
			}
			tries++
			if os, ok := descend(dsys, tchakaloffStart(dsys, rng), sts); ok {
				st, v := flatten(sy, os)
				sys := newSystem(sy, st, d)
				if opt.Projected {
					sys = newProjectedSystem(sy, st, d)
				}
				return result(sys, v, tries), true, nil
			}
		}
		for _, st := range sts {
			e := st.Unknowns(sy) - least
			if opt.Uniform {
				e = 0
			}
			if round%(1+e*e) != 0 {
				continue
			}
			if err := ctx.Err(); err != nil {
				return SearchResult{}, false, err
			}
			sys := newSystem(sy, st, d)
			if opt.Projected {
				sys = newProjectedSystem(sy, st, d)
			}
			tries++
			big := append(Structure(nil), st...)
			big[len(big)-1] += 2
			if v, ok := eliminateTo(sys, big, st, start(sy, big, rng)); ok {
				return result(sys, v, tries), true, nil
			}
			tries++
			v := start(sy, st, rng)
			if sys.levenbergMarquardt(v, 300) < 1e-13 && acceptable(sy, st, v) {
				return result(sys, v, tries), true, nil
			}
			if tries >= maxStarts {
				break
			}
		}
	}
	return SearchResult{Shape: s, Starts: tries}, false, nil
}

func result(sys *system, v []float64, tries int) SearchResult {
	r := make([]float64, sys.m)
	sys.eval(v, r, nil)
	return SearchResult{sys.sy.Shape, sys.st, v, norm2(r), tries}
}
