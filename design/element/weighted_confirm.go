package element

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"sort"

	"gonum.org/v1/gonum/mat"

	"quadwright/design"
	"quadwright/precision"
)

// orthonormalize factors the matrix of rows sqrt(lambda_i) phi(X_i) as
// Q R (float64) and returns Q, C = R^-1 and the 2-norm condition number
// of R. A numerically rank-deficient R (a weight that vanishes on too much
// of the element for the degree) is an error.
func orthonormalize(dw *discreteWeight, bb *boxBasis) (*mat.Dense, *mat.Dense, float64, error) {
	M, N, dim := bb.size(), len(dw.pts), bb.shape.Dim()
	A := mat.NewDense(N, M, nil)
	val := make([]float64, M)
	x := make([]float64, dim)
	for i := range dw.pts {
		for k := range x {
			x[k], _ = dw.pts[i][k].Float64()
		}
		l, _ := dw.lambda[i].Float64()
		sl := math.Sqrt(l)
		bb.eval64(x, val, nil)
		for j := range val {
			A.Set(i, j, sl*val[j])
		}
	}
	// Columns scaled by powers of two to unit norm (exactly, so that C
	// stays an exact transform): the Jacobi factors with large alpha differ
	// in size by many orders, which is scaling, not ill-conditioning.
	scale := make([]float64, M)
	for j := 0; j < M; j++ {
		nrm := mat.Norm(A.ColView(j), 2)
		if nrm == 0 || math.IsInf(nrm, 0) || math.IsNaN(nrm) {
			return nil, nil, 0, fmt.Errorf("its moment matrix is singular: a basis polynomial vanishes at every sample")
		}
		_, e := math.Frexp(nrm)
		scale[j] = math.Ldexp(1, -e)
		for i := 0; i < N; i++ {
			A.Set(i, j, A.At(i, j)*scale[j])
		}
	}
	var qr mat.QR
	qr.Factorize(A)
	var rf mat.Dense
	qr.RTo(&rf)
	R := mat.NewTriDense(M, mat.Upper, nil)
	for i := 0; i < M; i++ {
		for j := i; j < M; j++ {
			R.SetTri(i, j, rf.At(i, j))
		}
	}
	cond := mat.Cond(R, 2)
	if math.IsInf(cond, 0) || math.IsNaN(cond) || cond > 1e13 {
		return nil, nil, 0, fmt.Errorf("its moment matrix is numerically singular (condition %.2g): the weight vanishes on too much of the element for this degree", cond)
	}
	var Ci mat.TriDense
	if err := Ci.InverseTri(R); err != nil {
		if c, ok := err.(mat.Condition); !ok || math.IsInf(float64(c), 1) {
			return nil, nil, 0, fmt.Errorf("its moment matrix is singular")
		}
	}
	Cs := mat.DenseCopyOf(&Ci)
	var Q mat.Dense
	Q.Mul(A, Cs)
	// psi = phi C with C = S R^-1, S the column scaling.
	C := mat.NewDense(M, M, nil)
	for i := 0; i < M; i++ {
		for j := 0; j < M; j++ {
			C.Set(i, j, scale[i]*Cs.At(i, j))
		}
	}
	return &Q, C, max(cond, 1), nil
}

// supportedDigits estimates, to first order, how many significant digits
// of r the moments determine: the minimum-norm change of r that keeps it a
// rule when every moment moves by half a unit in its last written place
// (ulps, nil for exact ones), in three sign patterns; D = floor(-log10 of
// the largest relative change) - 1, capped at d0 (common practice, as for
// the 1-D moment lists).
func (ms *momentSystem) supportedDigits(r *wrule, bb *boxBasis, ulps []*big.Rat, d0 int) int {
	M := bb.size()
	J := ms.jacobian(r)
	n, dim := len(r.x), ms.s.Dim()
	worst := math.Inf(-1)
	seed := uint32(12345)
	for pat := 0; pat < 3; pat++ {
		delta := make([]*big.Rat, M)
		for j := range delta {
			sign := int64(1)
			switch pat {
			case 1:
				sign = int64(1 - 2*(j%2))
			case 2:
				seed = seed*1664525 + 1013904223
				sign = int64(1 - 2*int(seed>>31))
			}
			delta[j] = new(big.Rat)
			if ulps[j] != nil {
				delta[j].Mul(ulps[j], big.NewRat(sign, 2))
			}
		}
		f, shift := scaledFloats(bb.fromMonomials(delta))
		rhs := make([]float64, M)
		mat.NewVecDense(M, rhs).MulVec(ms.C.T(), mat.NewVecDense(M, f))
		d, ok := minNorm(J, rhs)
		if !ok {
			return 0
		}
		// The changes are d 2^-shift; worst is kept as its log2.
		for i := 0; i < n; i++ {
			worst = max(worst, math.Log2(math.Abs(d[i]))-float64(shift))
			for k := 0; k < dim; k++ {
				xv, _ := r.x[i][k].Float64()
				worst = max(worst, math.Log2(math.Abs(d[n+i*dim+k])/max(math.Abs(xv), 1e-8))-float64(shift))
			}
		}
	}
	if math.IsInf(worst, -1) {
		return d0
	}
	return min(d0, int(math.Floor(-worst*math.Log10(2)))-1)
}

// snapZeros sets to exactly 0, in both r1 and r2, every coordinate that
// is below 10^-digits in both: the moment equations fix such a coordinate
// (a node on an axis of symmetry, say) only to the size of their
// residual, not to a relative accuracy, so its printed digits would be
// noise that the two precisions need not share and that the exactness
// test, whose tolerance scales with |x|, would count against the rule.
// The printed rule is verified after the change like any other.
func snapZeros(r1, r2 *wrule, digits int) {
	lim := new(big.Float).SetPrec(64).SetMantExp(big.NewFloat(1), -int(precision.DigitsToBits(digits)))
	a := new(big.Float)
	for i := range r2.x {
		for k := range r2.x[i] {
			if a.Abs(r1.x[i][k]).Cmp(lim) < 0 && new(big.Float).Abs(r2.x[i][k]).Cmp(lim) < 0 {
				r1.x[i][k].SetInt64(0)
				r2.x[i][k].SetInt64(0)
			}
		}
	}
}

// confirmWeighted prints r2 (sorted by coordinates) and confirms every
// value against r1.
func confirmWeighted(r1, r2 *wrule, digits int, prec uint) ([][]string, []string, bool) {
	n := len(r2.x)
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool {
		for k := range r2.x[idx[a]] {
			if c := r2.x[idx[a]][k].Cmp(r2.x[idx[b]][k]); c != 0 {
				return c < 0
			}
		}
		return false
	})
	nodes := make([][]string, n)
	weights := make([]string, n)
	for o, i := range idx {
		nodes[o] = make([]string, len(r2.x[i]))
		for k := range r2.x[i] {
			s, ok := design.ConfirmPrinted(r1.x[i][k], r2.x[i][k], digits, prec)
			if !ok {
				return nil, nil, false
			}
			nodes[o][k] = s
		}
		s, ok := design.ConfirmPrinted(r1.u[i], r2.u[i], digits, prec)
		if !ok {
			return nil, nil, false
		}
		weights[o] = s
	}
	return nodes, weights, true
}

func tableIntegral(bb *boxBasis, mono []*big.Rat) Integral {
	index := make(map[string]*big.Rat, len(mono))
	for j, e := range bb.exps {
		index[monomialKey(e)] = mono[j]
	}
	return func(e []int) *big.Rat { return index[monomialKey(e)] }
}

func floatIntegral(bb *boxBasis, mono []*big.Float) Integral {
	r := make([]*big.Rat, len(mono))
	for j, v := range mono {
		r[j], _ = v.Rat(nil)
	}
	return tableIntegral(bb, r)
}

// finishWeighted checks the printed rule: positive weights, nodes in the
// open element, and exactness through the degree asked against integral
// (known to within slack, nil for exact moments).
func finishWeighted(ctx context.Context, r *Rule, minDigits int, integral Integral, slack *big.Rat) (*Rule, error) {
	for i, w := range r.Weights {
		v, err := precision.ParseExact(w)
		if err != nil || v.Sign() <= 0 {
			return nil, fmt.Errorf("the weighted %s rule of degree %d has a weight that is not positive (weight %d = %s)", r.Shape, r.Requested, i+1, w)
		}
		p := make([]*big.Rat, len(r.Nodes[i]))
		for k, c := range r.Nodes[i] {
			if p[k], err = precision.ParseExact(c); err != nil {
				return nil, fmt.Errorf("node %d coordinate %q: not a decimal number", i+1, c)
			}
		}
		if !r.Shape.Contains(p, true) {
			return nil, fmt.Errorf("the weighted %s rule of degree %d has node %d %v outside the open element", r.Shape, r.Requested, i+1, r.Nodes[i])
		}
	}
	ex, err := VerifyAgainst(ctx, r.Shape, r.Nodes, r.Weights, CheckOptions{MaxDegree: r.Requested, MinDigits: minDigits, Integral: integral, Slack: slack})
	if err != nil {
		return nil, err
	}
	if ex.Degree < r.Requested {
		return nil, fmt.Errorf("the printed weighted %s rule for degree %d could not be verified: it integrates the weight's monomial moments only through degree %d", r.Shape, r.Requested, ex.Degree)
	}
	r.Exactness = ex
	r.Degree = ex.Degree
	return r, nil
}

// scaledFloats returns v times 2^shift in float64, shift chosen so that
// the largest |v_j| is about 1 (all zero: shift 0).
func scaledFloats(v []*big.Rat) ([]float64, int) {
	top, any := 0, false
	fs := make([]*big.Float, len(v))
	for j, r := range v {
		fs[j] = new(big.Float).SetPrec(64).SetRat(r)
		if fs[j].Sign() != 0 {
			if e := fs[j].MantExp(nil); !any || e > top {
				top, any = e, true
			}
		}
	}
	out := make([]float64, len(v))
	for j, f := range fs {
		out[j], _ = f.SetMantExp(f, -top).Float64()
	}
	return out, -top
}
