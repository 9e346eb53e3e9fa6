package element

import (
	"math/rand/v2"
	"sync"

	"gonum.org/v1/gonum/mat"
)

// Strata: the orbits of a few types lie on a proper algebraic subset of
// the element (the prism's mid-plane z = 0 holds the centre, (a,a,0) and
// (a,b,0); its axis holds the centre and (1/3,1/3,c)). An invariant
// polynomial of degree <= d that vanishes there (z^2 q on the mid-plane)
// is integrated by the other orbits alone, so those orbits need at least
// as many unknowns as there are such independent polynomials: the same
// count that asks a structure for Equations(d) unknowns, applied to each
// subset of the types. It removes most structures on the 3-D shapes (of
// the 1316 prism structures of 71 points at degree 10, those with nearly
// all points on the mid-plane, for instance).

// stratum is a set of orbit types and the number of independent
// invariant polynomials of degree <= d vanishing at every point of them.
type stratum struct {
	on   []bool
	need int
	// sub holds those polynomials as orthonormal invariant equations
	// (combinations of the invariant basis): the equations the orbits
	// off the stratum solve alone (TestStrataSubEquations checks the
	// catalogue against them).
	sub *invariantBasis
}

type strataKey struct {
	s   Shape
	deg int
}

var strataCache sync.Map // strataKey -> []stratum

// strataOf returns, for each set of types (but the most general, whose
// points fill the element), the number of invariant polynomials of degree
// <= d vanishing on them where it is positive: the rank deficit of the
// invariant basis evaluated at random orbits of those types.
func (sy *Symmetry) strataOf(d int) []stratum {
	if v, ok := strataCache.Load(strataKey{sy.Shape, d}); ok {
		return v.([]stratum)
	}
	n := len(sy.Types)
	gi := n - 1 // the general type (invariantsOf)
	sys := newProjectedSystem(sy, single(sy, gi), d)
	r := sys.m
	rng := rand.New(rand.NewPCG(11, uint64(d)))
	// Values of the invariant basis at random orbits of each type.
	vals := make([][][]float64, n)
	for i, o := range sy.Types {
		k := r + 8
		if o.Params == 0 {
			k = 1
		}
		for j := 0; j < k; j++ {
			t, ok := randomOrbit(sy, i, rng)
			if !ok {
				continue
			}
			v := make([]float64, r)
			orbitSums(sys, i, t, v)
			vals[i] = append(vals[i], v)
		}
	}
	var out []stratum
	for mask := 1; mask < 1<<gi; mask++ {
		var cols [][]float64
		on := make([]bool, n)
		for i := 0; i < gi; i++ {
			if mask&(1<<i) != 0 {
				on[i] = true
				cols = append(cols, vals[i]...)
			}
		}
		E := mat.NewDense(r, len(cols), nil)
		for j, c := range cols {
			E.SetCol(j, c)
		}
		var svd mat.SVD
		if !svd.Factorize(E, mat.SVDFullU) {
			continue // no bound from this set
		}
		sv := svd.Values(nil)
		rank := 0
		for _, x := range sv {
			if x > 1e-9*sv[0] {
				rank++
			}
		}
		if need := r - rank; need > 0 {
			var U mat.Dense
			svd.UTo(&U)
			q := sys.proj
			sub := &invariantBasis{r: need, m: q.m, qt: make([]float64, need*q.m)}
			for i := 0; i < need; i++ {
				for k := 0; k < r; k++ {
					c := U.At(k, rank+i)
					for j := 0; j < q.m; j++ {
						sub.qt[i*q.m+j] += c * q.qt[k*q.m+j]
					}
				}
			}
			out = append(out, stratum{on, need, sub})
		}
	}
	v, _ := strataCache.LoadOrStore(strataKey{sy.Shape, d}, out)
	return v.([]stratum)
}

// admissible reports whether st gives, for every stratum of degree d, the
// orbits off it at least as many unknowns as the polynomials vanishing on
// it (and so may hold a rule; see strataOf).
func (sy *Symmetry) admissible(st Structure, d int) bool {
	for _, z := range sy.strataOf(d) {
		u := 0
		for i, c := range st {
			if !z.on[i] {
				u += c * (sy.Types[i].Params + 1)
			}
		}
		if u < z.need {
			return false
		}
	}
	return true
}
