package element

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"sort"
	"sync"

	"gonum.org/v1/gonum/mat"

	"quadwright/precision"
)

// Region is a domain on which SolveRegion builds rules for weight 1: a
// polygon or polyhedron already placed inside the box [-1,1]^Dim (the
// frame of the quadrilateral or hexahedron, whose Legendre basis the
// moment equations are solved in).
type Region struct {
	Dim, Degree int
	// Inside reports whether a float64 point lies in the open region:
	// the test that keeps Gauss-Newton's nodes inside.
	Inside func(x []float64) bool
	// Simplices subdivide the region: each holds Dim+1 vertices (either
	// orientation). The candidate measure is a collapsed rule on each.
	Simplices [][][]*big.Rat
	// Moments are the exact integrals of the monomials x^e over the
	// region, e in the order of Exponents(Dim, Degree).
	Moments []*big.Rat
}

// Exponents lists the exponent tuples of dim variables of total degree
// <= deg: by total degree, and within one degree in lexicographically
// decreasing order (the order of every moment list of this package).
func Exponents(dim, deg int) [][]int {
	var out [][]int
	for d := 0; d <= deg; d++ {
		out = append(out, monomials(dim, d)...)
	}
	return out
}

// Solution is a positive rule solved at two precisions, PrecLo and
// PrecHi bits, from the same start: the pair whose agreement confirms
// every printed digit (Print).
type Solution struct {
	lo, hi         *wrule
	PrecLo, PrecHi uint
}

// Points is the number of nodes.
func (s *Solution) Points() int { return len(s.hi.x) }

// Mapped returns the solution carried by the affine map x -> A x + t (A
// dim x dim, exact): nodes mapped and weights multiplied by |det A|, each
// at its own precision, so that the pair still confirms what it confirmed
// up to the rounding of the map (a few units in the last bit).
func (s *Solution) Mapped(A [][]*big.Rat, t []*big.Rat, det *big.Rat) *Solution {
	mp := func(r *wrule, prec uint) *wrule {
		dim := len(t)
		Af := make([][]*big.Float, dim)
		tf := make([]*big.Float, dim)
		for i := range A {
			Af[i] = make([]*big.Float, dim)
			for j := range A[i] {
				Af[i][j] = new(big.Float).SetPrec(prec).SetRat(A[i][j])
			}
			tf[i] = new(big.Float).SetPrec(prec).SetRat(t[i])
		}
		d := new(big.Float).SetPrec(prec).SetRat(new(big.Rat).Abs(det))
		out := &wrule{x: make([][]*big.Float, len(r.x)), u: make([]*big.Float, len(r.u))}
		tmp := new(big.Float).SetPrec(prec)
		for n := range r.x {
			out.x[n] = make([]*big.Float, dim)
			for i := 0; i < dim; i++ {
				v := new(big.Float).SetPrec(prec).Set(tf[i])
				for j := 0; j < dim; j++ {
					v.Add(v, tmp.Mul(Af[i][j], r.x[n][j]))
				}
				out.x[n][i] = v
			}
			out.u[n] = new(big.Float).SetPrec(prec).Mul(r.u[n], d)
		}
		return out
	}
	return &Solution{lo: mp(s.lo, s.PrecLo), hi: mp(s.hi, s.PrecHi), PrecLo: s.PrecLo, PrecHi: s.PrecHi}
}

// Print prints the higher solution (nodes sorted by coordinates) to digits
// significant digits (0: float64 mode) and confirms every value against
// the lower one; ok is false when some value is not confirmed.
func (s *Solution) Print(digits int) (nodes [][]string, weights []string, ok bool) {
	lo, hi := s.lo.at(s.PrecLo), s.hi.at(s.PrecHi)
	base := digits
	if base == 0 {
		base = 17
	}
	snapZeros(lo, hi, base+8)
	return confirmWeighted(lo, hi, digits, s.PrecHi)
}

// refKey names a cached reference collapsed rule.
type refKey struct{ dim, n int }

// refRules caches the collapsed reference rules SolveRegion maps onto
// simplices: a batch of cells asks for the same few again and again. The
// cached rules are only read.
var refRules sync.Map

func referenceSimplexRule(ctx context.Context, dim, n int) (*assembled, uint, error) {
	if v, ok := refRules.Load(refKey{dim, n}); ok {
		a := v.(*discreteWeight)
		return &assembled{a.pts, a.lambda}, a.prec, nil
	}
	s := Triangle
	if dim == 3 {
		s = Tetrahedron
	}
	a, prec, err := productNodes(ctx, s, n, 20)
	if err != nil {
		return nil, 0, err
	}
	refRules.Store(refKey{dim, n}, &discreteWeight{pts: a.pts, lambda: a.wts, prec: prec})
	return a, prec, nil
}

// regionCandidates is the collapsed rule of n points per direction
// (exact for degree 2n-1) mapped onto every simplex of the subdivision: a
// positive rule for the region, exact through the degree.
func regionCandidates(ctx context.Context, reg Region, n int) (*discreteWeight, error) {
	ref, prec, err := referenceSimplexRule(ctx, reg.Dim, n)
	if err != nil {
		return nil, err
	}
	dim := reg.Dim
	out := &discreteWeight{prec: prec}
	for _, sx := range reg.Simplices {
		E := make([][]*big.Rat, dim) // E[k] = v_(k+1) - v_0
		for k := range E {
			E[k] = make([]*big.Rat, dim)
			for i := range E[k] {
				E[k][i] = new(big.Rat).Sub(sx[k+1][i], sx[0][i])
			}
		}
		det := new(big.Rat).Abs(ratDet(E))
		if det.Sign() == 0 {
			continue
		}
		df := new(big.Float).SetPrec(prec).SetRat(det)
		v0 := make([]*big.Float, dim)
		Ef := make([][]*big.Float, dim)
		for i := 0; i < dim; i++ {
			v0[i] = new(big.Float).SetPrec(prec).SetRat(sx[0][i])
			Ef[i] = make([]*big.Float, dim)
			for k := 0; k < dim; k++ {
				Ef[i][k] = new(big.Float).SetPrec(prec).SetRat(E[k][i])
			}
		}
		tmp := new(big.Float).SetPrec(prec)
		for j, xi := range ref.pts {
			p := make([]*big.Float, dim)
			for i := 0; i < dim; i++ {
				v := new(big.Float).SetPrec(prec).Set(v0[i])
				for k := 0; k < dim; k++ {
					v.Add(v, tmp.Mul(Ef[i][k], xi[k]))
				}
				p[i] = v
			}
			out.pts = append(out.pts, p)
			out.lambda = append(out.lambda, new(big.Float).SetPrec(prec).Mul(ref.wts[j], df))
		}
	}
	if len(out.pts) == 0 {
		return nil, fmt.Errorf("the subdivision has no simplex of positive measure")
	}
	return out, nil
}

// ratDet is the determinant of the 2 x 2 or 3 x 3 matrix with rows E.
func ratDet(E [][]*big.Rat) *big.Rat {
	m := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
	if len(E) == 2 {
		return new(big.Rat).Sub(m(E[0][0], E[1][1]), m(E[0][1], E[1][0]))
	}
	d := new(big.Rat)
	for c := 0; c < 3; c++ {
		t := m(E[0][c], new(big.Rat).Sub(m(E[1][(c+1)%3], E[2][(c+2)%3]), m(E[1][(c+2)%3], E[2][(c+1)%3])))
		d.Add(d, t)
	}
	return d
}

// SolveRegion builds a positive rule for the region, exact (to the
// working precision) for every monomial of total degree <= reg.Degree,
// with nodes in the open region, at two precisions whose agreement
// confirms digits significant digits (0: float64 mode, 17). The route is
// Weighted's for a moment table, with the region's exact moments and with
// candidates from its simplices:
//
//  1. a collapsed rule on every simplex of the subdivision (positive,
//     exact through the degree);
//  2. Tchakaloff compression of it by nonnegative least squares to at
//     most C(D+dim, dim) points (subsample);
//  3. point elimination with Gauss-Newton keeping the weights positive
//     and the nodes in the region (thin, after H. Xiao and Z. Gimbutas,
//     Comput. Math. Appl. 59, 2010);
//  4. Gauss-Newton at extended precision p1, then again at p2 > p1.
//
// The caller maps the solution to its own coordinates, prints it (Print)
// and verifies the printed rule against the exact moments there.
func SolveRegion(ctx context.Context, reg Region, digits int) (*Solution, error) {
	if reg.Dim != 2 && reg.Dim != 3 {
		panic("element: SolveRegion in a dimension other than 2 or 3")
	}
	frame := Quadrilateral
	if reg.Dim == 3 {
		frame = Hexahedron
	}
	deg := reg.Degree
	bb := newBoxBasis(frame, deg)
	M := bb.size()
	if len(reg.Moments) != M {
		panic("element: SolveRegion with the wrong number of moments")
	}
	base := digits
	if base == 0 {
		base = 17
	}
	// Enough candidates that no polynomial of the degree vanishes on all.
	n := deg/2 + 1
	for int(math.Pow(float64(n), float64(reg.Dim)))*len(reg.Simplices) < 2*M && n < deg+2 {
		n++
	}
	exact := bb.fromMonomials(reg.Moments)
	at := func(prec uint) []*big.Float {
		mu := make([]*big.Float, M)
		for j, v := range exact {
			mu[j] = new(big.Float).SetPrec(prec).SetRat(v)
		}
		return mu
	}
	// Elimination from one candidate rule can stall above the count the
	// moment equations allow; a finer collapsed rule gives another start.
	// Up to five are thinned; the first within ceil(M/(dim+1)) + dim + 1
	// points that solves at both precisions is the answer, else the
	// smallest of the others that does (a thinned rule can sit where the
	// equations are singular, and fail there).
	target := (M+reg.Dim)/(reg.Dim+1) + reg.Dim + 1
	type thinned struct {
		r        *wrule
		bn, cond float64
		C        *mat.Dense
	}
	var starts []thinned
	var lastErr error
	solveBest := func() *Solution {
		sort.SliceStable(starts, func(a, b int) bool { return len(starts[a].r.x) < len(starts[b].r.x) })
		for _, st := range starts {
			sol, err := solveTwice(ctx, frame, bb, st.C, at, reg.Inside, st.r, st.bn, st.cond, digits)
			if err == nil {
				return sol
			}
			lastErr = err
		}
		return nil
	}
	for k := 0; k < 5; k++ {
		cand, err := regionCandidates(ctx, reg, n+k)
		if err != nil {
			return nil, err
		}
		Q, Ck, cond, err := orthonormalize(cand, bb)
		if err != nil {
			lastErr = err
			continue
		}
		prec1 := precision.DigitsToBits(base+10+int(math.Ceil(math.Log10(cond)))) + 32
		ms := &momentSystem{s: frame, bb: bb, C: Ck, mu: at(prec1), inside: reg.Inside}
		start, bn := ms.subsample(Q, cand, prec1)
		if len(start.x) == 0 {
			lastErr = fmt.Errorf("no positive subsample of the candidate rule was found")
			continue
		}
		st := thinned{ms.thin(ctx, start, bn, prec1), bn, cond, Ck}
		if len(st.r.x) <= target {
			sol, err := solveTwice(ctx, frame, bb, st.C, at, reg.Inside, st.r, st.bn, st.cond, digits)
			if err == nil {
				return sol, nil
			}
			lastErr = err
			continue
		}
		starts = append(starts, st)
	}
	// None reached the target: the smallest that solves.
	if sol := solveBest(); sol != nil {
		return sol, nil
	}
	return nil, lastErr
}

// solveTwice solves the thinned rule start at the working precision and
// again at a higher one (the confirmation pair), with more guard digits
// on a second try when the pair does not confirm the digits asked.
func solveTwice(ctx context.Context, frame Shape, bb *boxBasis, C *mat.Dense, at func(uint) []*big.Float, inside func([]float64) bool, start *wrule, bn, cond float64, digits int) (*Solution, error) {
	base := digits
	if base == 0 {
		base = 17
	}
	tolLog2 := func(digits int) float64 { return math.Log2(bn) - float64(digits)*math.Log2(10) }
	guard := 10 + int(math.Ceil(math.Log10(cond)))
	var lastErr error
	for try := 0; try < 2; try, guard = try+1, guard+16 {
		d1 := base + guard
		prec1 := precision.DigitsToBits(d1) + 32
		ms := &momentSystem{s: frame, bb: bb, C: C, mu: at(prec1), inside: inside}
		maxIter := 40 + base/5
		r1, _, err := ms.solve(ctx, start.at(prec1), prec1, tolLog2(base+guard/2), maxIter)
		if err != nil {
			return nil, fmt.Errorf("no rule with positive weights and interior nodes found: %v", err)
		}
		prec2 := precision.DigitsToBits(d1+24) + 32
		ms2 := &momentSystem{s: frame, bb: bb, C: C, mu: at(prec2), inside: inside}
		r2, _, err := ms2.solve(ctx, r1.at(prec2), prec2, tolLog2(base+guard), maxIter)
		if err != nil {
			lastErr = fmt.Errorf("the rule could not be confirmed at higher precision: %v", err)
			continue
		}
		sol := &Solution{lo: r1, hi: r2, PrecLo: prec1, PrecHi: prec2}
		if _, _, ok := sol.Print(digits); !ok {
			lastErr = fmt.Errorf("the rule could not be confirmed to %d digits by a second computation at higher precision", base)
			continue
		}
		return sol, nil
	}
	return nil, lastErr
}
