package element

import (
	"math/big"

	"quadwright/precision"
)

// boxBasis is the polynomial basis in which weighted rules are solved,
// orthogonal (up to normalisation) on the element for weight 1: products
// of homogenised Jacobi polynomials H_n^(a,0)(p, q) = q^n P_n^(a,0)(p/q)
// in affine functions p, q of the coordinates, one factor per coordinate,
// indexed by exponent tuples e of total degree <= deg (in the order of
// exps: by total degree, then as monomials lists them):
//
//	line, quadrilateral, hexahedron: Legendre products P_e0(x) P_e1(y) P_e2(z);
//	triangle: H_i(2x+y-1, 1-y) P_j^(2i+1,0)(2y-1);
//	tetrahedron: H_i(2x+y+z-1, 1-y-z) H_j^(2i+1,0)(2y+z-1, 1-z) P_k^(2i+2j+2,0)(2z-1);
//	prism: the triangle's times P_k(z);
//	pyramid: H_i(x, 1-z) H_j(y, 1-z) P_k^(2i+2j+2,0)(2z-1).
//
// On the simplices these are the Proriol-Koornwinder-Dubiner polynomials
// (T. Koornwinder, "Two-variable analogues of the classical orthogonal
// polynomials", in Theory and Application of Special Functions, Academic
// Press 1975; M. Dubiner, "Spectral methods on triangles and other
// domains", J. Sci. Comput. 6, 1991); on the pyramid the analogous
// collapsed basis. Each is a polynomial of total degree |e|, so together
// they span the polynomials of total degree <= deg, and they are far
// better conditioned on the element than monomials or products on the
// bounding box; the solve adds an orthonormalisation (float64 QR) for the
// weight on top.
type boxBasis struct {
	shape   Shape
	deg     int
	exps    [][]int
	factors []basisFactor
	alphas  []map[int64]bool         // per factor, the alphas used (alphaSets)
	c64     []map[int64][][3]float64 // per factor and alpha: c1, c2, c3 by n
	alist   [][]int64                // per factor, the alphas in increasing order
	which   [][]int                  // per basis function and factor: index into alist
	polys   []ratPoly                // the exact polynomials, made on first use
}

// basisFactor is H_n^(alpha,0)(p(x), q(x)) with n = e[k], p and q affine
// with integer coefficients (constant first, then x, y, z) and alpha =
// sum_l alphaCoef[l] e[l] + alphaConst over the earlier factors.
type basisFactor struct {
	p, q       [4]int64
	alphaCoef  [3]int64
	alphaConst int64
}

func (f *basisFactor) alpha(e []int) int64 {
	a := f.alphaConst
	for l, c := range f.alphaCoef {
		if l < len(e) {
			a += c * int64(e[l])
		}
	}
	return a
}

func newBoxBasis(s Shape, deg int) *boxBasis {
	bb := &boxBasis{shape: s, deg: deg}
	for d := 0; d <= deg; d++ {
		bb.exps = append(bb.exps, monomials(s.Dim(), d)...)
	}
	one := [4]int64{1, 0, 0, 0}
	legendre := func(k int) basisFactor {
		f := basisFactor{q: one}
		f.p[k+1] = 1
		return f
	}
	switch s {
	case Line:
		bb.factors = []basisFactor{legendre(0)}
	case Quadrilateral:
		bb.factors = []basisFactor{legendre(0), legendre(1)}
	case Hexahedron:
		bb.factors = []basisFactor{legendre(0), legendre(1), legendre(2)}
	case Triangle, Prism:
		bb.factors = []basisFactor{
			{p: [4]int64{-1, 2, 1, 0}, q: [4]int64{1, 0, -1, 0}},
			{p: [4]int64{-1, 0, 2, 0}, q: one, alphaCoef: [3]int64{2, 0, 0}, alphaConst: 1},
		}
		if s == Prism {
			bb.factors = append(bb.factors, legendre(2))
		}
	case Tetrahedron:
		bb.factors = []basisFactor{
			{p: [4]int64{-1, 2, 1, 1}, q: [4]int64{1, 0, -1, -1}},
			{p: [4]int64{-1, 0, 2, 1}, q: [4]int64{1, 0, 0, -1}, alphaCoef: [3]int64{2, 0, 0}, alphaConst: 1},
			{p: [4]int64{-1, 0, 0, 2}, q: one, alphaCoef: [3]int64{2, 2, 0}, alphaConst: 2},
		}
	case Pyramid:
		bb.factors = []basisFactor{
			{p: [4]int64{0, 1, 0, 0}, q: [4]int64{1, 0, 0, -1}},
			{p: [4]int64{0, 0, 1, 0}, q: [4]int64{1, 0, 0, -1}},
			{p: [4]int64{-1, 0, 0, 2}, q: one, alphaCoef: [3]int64{2, 2, 0}, alphaConst: 2},
		}
	}
	bb.alphas = make([]map[int64]bool, len(bb.factors))
	bb.c64 = make([]map[int64][][3]float64, len(bb.factors))
	for k := range bb.factors {
		bb.alphas[k] = map[int64]bool{}
		bb.c64[k] = map[int64][][3]float64{}
		for _, e := range bb.exps {
			a := bb.factors[k].alpha(e)
			if bb.alphas[k][a] {
				continue
			}
			bb.alphas[k][a] = true
			c := make([][3]float64, deg+1)
			for n := 1; n <= deg; n++ {
				c1, c2, c3 := jacobiCoefs(a, n)
				c[n][0], _ = c1.Float64()
				c[n][1], _ = c2.Float64()
				c[n][2], _ = c3.Float64()
			}
			bb.c64[k][a] = c
		}
	}
	bb.alist = make([][]int64, len(bb.factors))
	pos := make([]map[int64]int, len(bb.factors))
	for k := range bb.factors {
		for a := range bb.alphas[k] {
			bb.alist[k] = append(bb.alist[k], a)
		}
		sortInt64(bb.alist[k])
		pos[k] = map[int64]int{}
		for i, a := range bb.alist[k] {
			pos[k][a] = i
		}
	}
	for _, e := range bb.exps {
		w := make([]int, len(bb.factors))
		for k := range w {
			w[k] = pos[k][bb.factors[k].alpha(e)]
		}
		bb.which = append(bb.which, w)
	}
	return bb
}

// size is the number of basis functions, C(deg+dim, dim).
func (bb *boxBasis) size() int { return len(bb.exps) }

// jacobiCoefs returns c1, c2, c3 of H_n = (c1 p + c2 q) H_(n-1) - c3 q^2
// H_(n-2) for the Jacobi polynomials P^(alpha,0) (the three-term
// recurrence, Abramowitz and Stegun 22.7.1, homogenised): for n = 1,
// c1 = (alpha+2)/2, c2 = alpha/2; for n >= 2, with
// d = 2n (n+alpha) (2n+alpha-2), c1 = (2n+alpha-1)(2n+alpha)(2n+alpha-2)/d,
// c2 = (2n+alpha-1) alpha^2/d, c3 = 2 (n+alpha-1)(n-1)(2n+alpha)/d.
func jacobiCoefs(alpha int64, n int) (c1, c2, c3 *big.Rat) {
	if n == 1 {
		return big.NewRat(alpha+2, 2), big.NewRat(alpha, 2), new(big.Rat)
	}
	m := int64(n)
	d := 2 * m * (m + alpha) * (2*m + alpha - 2)
	return big.NewRat((2*m+alpha-1)*(2*m+alpha)*(2*m+alpha-2), d),
		big.NewRat((2*m+alpha-1)*alpha*alpha, d),
		big.NewRat(2*(m+alpha-1)*(m-1)*(2*m+alpha), d)
}

// djet is a value with its gradient in the coordinates (forward-mode
// differentiation of the recurrences).
type djet struct {
	v float64
	d [3]float64
}

func (a djet) mul(b djet) djet {
	r := djet{v: a.v * b.v}
	for k := range r.d {
		r.d[k] = a.v*b.d[k] + a.d[k]*b.v
	}
	return r
}

func (a djet) axpy(c float64, b djet) djet { // a + c b
	r := djet{v: a.v + c*b.v}
	for k := range r.d {
		r.d[k] = a.d[k] + c*b.d[k]
	}
	return r
}

func affineJet64(c [4]int64, x []float64) djet {
	j := djet{v: float64(c[0])}
	for k := range x {
		j.v += float64(c[k+1]) * x[k]
		j.d[k] = float64(c[k+1])
	}
	return j
}

// eval64 sets val[j] = phi_j(x) and, when grad is not nil, grad[k][j] =
// d phi_j / d x_k, in float64 (len(val) == size, len(grad) == dim).
func (bb *boxBasis) eval64(x []float64, val []float64, grad [][]float64) {
	nf := len(bb.factors)
	tabs := make([][][]djet, nf)
	for k := range bb.factors {
		f := &bb.factors[k]
		p, q := affineJet64(f.p, x), affineJet64(f.q, x)
		q2 := q.mul(q)
		tabs[k] = make([][]djet, len(bb.alist[k]))
		for ai, a := range bb.alist[k] {
			c := bb.c64[k][a]
			h := make([]djet, bb.deg+1)
			h[0] = djet{v: 1}
			for n := 1; n <= bb.deg; n++ {
				lin := djet{}.axpy(c[n][0], p).axpy(c[n][1], q)
				h[n] = lin.mul(h[n-1])
				if n >= 2 {
					h[n] = h[n].axpy(-c[n][2], q2.mul(h[n-2]))
				}
			}
			tabs[k][ai] = h
		}
	}
	for j, e := range bb.exps {
		w := bb.which[j]
		v := tabs[0][w[0]][e[0]]
		for k := 1; k < nf; k++ {
			v = v.mul(tabs[k][w[k]][e[k]])
		}
		val[j] = v.v
		if grad != nil {
			for k := range x {
				grad[k][j] = v.d[k]
			}
		}
	}
}

// realEval evaluates the basis at prec bits without allocating per point.
type realEval struct {
	bb     *boxBasis
	alphas [][]int64                // per factor, the alphas used
	coefs  [][][3][]*precision.Real // per factor and alpha: c1, c2, c3 by n
	H      [][][]*precision.Real    // per factor and alpha: H_0..H_deg
	which  [][]int                  // per basis function and factor: the alpha's index
	pc, qc [][4]*precision.Real     // per factor: the affine coefficients
	p, q   *precision.Real
	q2     *precision.Real
	lin    *precision.Real
	tmp    *precision.Real
}

func (bb *boxBasis) newRealEval(prec uint) *realEval {
	nf := len(bb.factors)
	re := &realEval{bb: bb,
		p: precision.NewReal(prec), q: precision.NewReal(prec), q2: precision.NewReal(prec),
		lin: precision.NewReal(prec), tmp: precision.NewReal(prec)}
	index := make([]map[int64]int, nf)
	for k, set := range bb.alphas {
		index[k] = map[int64]int{}
		// A fixed order of the alphas keeps the evaluation deterministic.
		var as []int64
		for a := range set {
			as = append(as, a)
		}
		sortInt64(as)
		var cs [][3][]*precision.Real
		var hs [][]*precision.Real
		for i, a := range as {
			index[k][a] = i
			var c [3][]*precision.Real
			for t := range c {
				c[t] = precision.NewRealSlice(bb.deg+1, prec)
			}
			for n := 1; n <= bb.deg; n++ {
				c1, c2, c3 := jacobiCoefs(a, n)
				c[0][n].SetRat(c1)
				c[1][n].SetRat(c2)
				c[2][n].SetRat(c3)
			}
			cs = append(cs, c)
			hs = append(hs, precision.NewRealSlice(bb.deg+1, prec))
		}
		re.alphas = append(re.alphas, as)
		re.coefs = append(re.coefs, cs)
		re.H = append(re.H, hs)
		var pc, qc [4]*precision.Real
		for t := 0; t < 4; t++ {
			pc[t] = precision.NewReal(prec).SetInt64(bb.factors[k].p[t])
			qc[t] = precision.NewReal(prec).SetInt64(bb.factors[k].q[t])
		}
		re.pc, re.qc = append(re.pc, pc), append(re.qc, qc)
	}
	for _, e := range bb.exps {
		w := make([]int, nf)
		for k := range w {
			w[k] = index[k][bb.factors[k].alpha(e)]
		}
		re.which = append(re.which, w)
	}
	return re
}

func sortInt64(a []int64) {
	for i := 1; i < len(a); i++ {
		for j := i; j > 0 && a[j] < a[j-1]; j-- {
			a[j], a[j-1] = a[j-1], a[j]
		}
	}
}

func (re *realEval) affine(z *precision.Real, c [4]*precision.Real, x []*precision.Real) {
	z.Set(c[0])
	for k := range x {
		if !c[k+1].IsZero() {
			z.MulAdd(c[k+1], x[k], z)
		}
	}
}

// eval sets val[j] = phi_j(x) at the evaluator's precision (len(val) ==
// size). The recurrences are stable on the element, and the rounded
// coefficients perturb the basis by a few units of 2^-prec, the same at
// every point, so each value carries all but a few bits.
func (re *realEval) eval(x []*precision.Real, val []*precision.Real) {
	deg := re.bb.deg
	for k := range re.bb.factors {
		re.affine(re.p, re.pc[k], x)
		re.affine(re.q, re.qc[k], x)
		re.q2.Mul(re.q, re.q)
		for i := range re.alphas[k] {
			H, c := re.H[k][i], re.coefs[k][i]
			H[0].SetInt64(1)
			for n := 1; n <= deg; n++ {
				re.lin.Mul(c[0][n], re.p)
				re.lin.MulAdd(c[1][n], re.q, re.lin)
				H[n].Mul(re.lin, H[n-1])
				if n >= 2 {
					re.tmp.Mul(c[2][n], re.q2)
					re.tmp.Mul(re.tmp, H[n-2])
					H[n].Sub(H[n], re.tmp)
				}
			}
		}
	}
	for j, e := range re.bb.exps {
		w := re.which[j]
		val[j].Set(re.H[0][w[0]][e[0]])
		for k := 1; k < len(w); k++ {
			val[j].Mul(val[j], re.H[k][w[k]][e[k]])
		}
	}
}
