package element

import (
	"context"
	"math"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// system holds the float64 moment equations of one structure and degree.
type system struct {
	st   Structure
	deg  int
	m    int       // equations: pkdLen(deg)
	buf  []float64 // pkd values at one point
	sums [][]float64
}

func newSystem(st Structure, deg int) *system {
	m := pkdLen(deg)
	return &system{st: st, deg: deg, m: m, buf: make([]float64, m)}
}

// orbitSum sets out[j] to the sum of psi_j over the points of an orbit:
// kind 0 the centroid, 1 a 3-orbit (a), 2 a 6-orbit (a, b).
func (s *system) orbitSum(kind int, a, b float64, out []float64) {
	for j := range out {
		out[j] = 0
	}
	var pts [][2]float64
	switch kind {
	case 0:
		pts = [][2]float64{{1.0 / 3, 1.0 / 3}}
	case 1:
		c := 1 - 2*a
		pts = [][2]float64{{a, a}, {a, c}, {c, a}}
	default:
		c := 1 - a - b
		pts = [][2]float64{{a, b}, {b, a}, {a, c}, {c, a}, {b, c}, {c, b}}
	}
	for _, p := range pts {
		pkd64(s.deg, p[0], p[1], s.buf)
		for j, v := range s.buf {
			out[j] += v
		}
	}
}

// eval sets r to the residuals sum_i w_i psi_j(x_i) - integral of psi_j
// (1/sqrt(2) for j = 0, else 0) and, when J is not nil, J to their
// Jacobian with respect to v: exact in the weights, central differences
// (step 1e-6, error about 1e-10 relative) in the coordinates.
func (s *system) eval(v []float64, r []float64, J *mat.Dense) {
	for j := range r {
		r[j] = 0
	}
	r[0] = -1 / math.Sqrt2
	col := 0
	tmp := make([]float64, s.m)
	tmp2 := make([]float64, s.m)
	add := func(w float64, sum []float64) {
		for j := range r {
			r[j] += w * sum[j]
		}
	}
	const h = 1e-6
	deriv := func(kind int, a, b, da, db, w float64) {
		s.orbitSum(kind, a+da, b+db, tmp)
		s.orbitSum(kind, a-da, b-db, tmp2)
		for j := range tmp {
			J.Set(j, col, w*(tmp[j]-tmp2[j])/(2*h))
		}
		col++
	}
	k := 0
	sum := make([]float64, s.m)
	if s.st.Centroid == 1 {
		s.orbitSum(0, 0, 0, sum)
		add(v[0], sum)
		if J != nil {
			J.SetCol(col, sum)
			col++
		}
		k = 1
	}
	for o := 0; o < s.st.Three; o++ {
		w, a := v[k], v[k+1]
		s.orbitSum(1, a, 0, sum)
		add(w, sum)
		if J != nil {
			J.SetCol(col, sum)
			col++
			deriv(1, a, 0, h, 0, w)
		}
		k += 2
	}
	for o := 0; o < s.st.Six; o++ {
		w, a, b := v[k], v[k+1], v[k+2]
		s.orbitSum(2, a, b, sum)
		add(w, sum)
		if J != nil {
			J.SetCol(col, sum)
			col++
			deriv(2, a, b, h, 0, w)
			deriv(2, a, b, 0, h, w)
		}
		k += 3
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
// point strays far outside the triangle.
func (s *system) levenbergMarquardt(v []float64, maxIter int) float64 {
	n := len(v)
	r := make([]float64, s.m)
	rt := make([]float64, s.m)
	J := mat.NewDense(s.m, n, nil)
	trial := make([]float64, n)
	var A mat.SymDense
	A.ReuseAsSym(n)
	g := mat.NewVecDense(n, nil)
	d := mat.NewVecDense(n, nil)
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
		g.MulVec(J.T(), mat.NewVecDense(s.m, r))
		improved := false
		for lambda < 1e12 {
			M := mat.NewSymDense(n, nil)
			M.CopySym(&A)
			for i := 0; i < n; i++ {
				M.SetSym(i, i, A.At(i, i)*(1+lambda)+1e-14)
			}
			var ch mat.Cholesky
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
		if !improved || !inside64(s.st, v, -0.5) {
			return cost
		}
		s.eval(v, r, J)
	}
	return cost
}

// start draws a random starting point for st: every weight the area over
// the number of points, 3-orbit coordinates in (0.02, 0.48), 6-orbit
// barycentric coordinates uniform on the triangle.
func start(st Structure, rng *rand.Rand) []float64 {
	w := 0.5 / float64(st.Points())
	var v []float64
	if st.Centroid == 1 {
		v = append(v, w)
	}
	for o := 0; o < st.Three; o++ {
		v = append(v, w, 0.02+0.46*rng.Float64())
	}
	for o := 0; o < st.Six; o++ {
		u1, u2 := rng.Float64(), rng.Float64()
		if u1+u2 > 1 {
			u1, u2 = 1-u1, 1-u2
		}
		v = append(v, w, u1, u2)
	}
	return v
}

// acceptable reports whether v is a rule with positive weights, points
// strictly inside and orbits that do not degenerate (a 3-orbit at the
// centroid, a 6-orbit with two equal barycentric coordinates).
func acceptable(st Structure, v []float64) bool {
	if !inside64(st, v, 1e-9) {
		return false
	}
	k := st.Centroid
	for o := 0; o < st.Three; o++ {
		if math.Abs(v[k+1]-1.0/3) < 1e-6 {
			return false
		}
		k += 2
	}
	for o := 0; o < st.Six; o++ {
		a, b := v[k+1], v[k+2]
		c := 1 - a - b
		if math.Abs(a-b) < 1e-6 || math.Abs(a-c) < 1e-6 || math.Abs(b-c) < 1e-6 {
			return false
		}
		k += 3
	}
	return true
}

// structures lists the orbit structures with exactly p points and at least
// as many unknowns as the invariant moment equations of degree d, those
// with fewest unknowns first.
func structures(d, p int) []Structure {
	var out []Structure
	need := invariants(d)
	for c := 0; c <= 1; c++ {
		for six := 0; 6*six+c <= p; six++ {
			rest := p - c - 6*six
			if rest%3 != 0 {
				continue
			}
			st := Structure{c, rest / 3, six}
			if st.Unknowns() >= need {
				out = append(out, st)
			}
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Unknowns() < out[j].Unknowns() })
	return out
}

// SearchResult is a fully symmetric rule found in float64.
type SearchResult struct {
	Structure Structure
	Params    []float64 // the parameter vector (see expand64)
	Residual  float64   // |r| of the moment equations in the orthonormal basis
	Starts    int       // starts tried
}

// SearchTriangle looks for a fully symmetric triangle rule of degree d with
// p points, positive weights and interior points, on the moment equations
// in the orthonormal PKD basis. For each orbit structure of p points
// (structures, fewest unknowns first) in turn it makes two starts: one by
// orbit elimination from a larger rule (eliminateTo, after Xiao and
// Gimbutas 2010) and one by Levenberg-Marquardt directly on the structure,
// each from a random start; at most maxStarts starts in all. The starts are
// drawn from a PCG stream seeded by seed, d and p, so the result is the same
// for the same arguments. ok is false when no start succeeded.
func SearchTriangle(ctx context.Context, d, p int, seed uint64, maxStarts int) (SearchResult, bool, error) {
	sts := structures(d, p)
	if len(sts) == 0 {
		return SearchResult{}, false, nil
	}
	rng := rand.New(rand.NewPCG(seed, uint64(d)<<32|uint64(p)))
	tries := 0
	for tries < maxStarts {
		for _, st := range sts {
			if err := ctx.Err(); err != nil {
				return SearchResult{}, false, err
			}
			sys := newSystem(st, d)
			tries++
			big := Structure{st.Centroid, st.Three + 1, st.Six + 2}
			if v, ok := eliminateTo(sys, big, st, start(big, rng)); ok {
				return result(sys, v, tries), true, nil
			}
			tries++
			v := start(st, rng)
			if sys.levenbergMarquardt(v, 300) < 1e-13 && acceptable(st, v) {
				return result(sys, v, tries), true, nil
			}
			if tries >= maxStarts {
				break
			}
		}
	}
	return SearchResult{Starts: tries}, false, nil
}

func result(sys *system, v []float64, tries int) SearchResult {
	r := make([]float64, sys.m)
	sys.eval(v, r, nil)
	return SearchResult{sys.st, v, norm2(r), tries}
}
