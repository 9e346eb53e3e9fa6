package systems

import (
	"fmt"
	"math"
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// basis is an orthonormalised form of a function system: u = R^-T f, with
// R the upper triangular factor of the modified Gram-Schmidt QR of the
// matrix sqrt(c_l) f_k(x_l) over a positive discretisation (x_l, c_l) of
// the weight. In that discrete inner product the u_k are orthonormal; in
// the weight's own they are nearly so, which is all the moment equations
// need to stay well conditioned. The moments of the u_k follow exactly
// from those of the f_k by the same triangular solve, so the discretisation
// bounds the conditioning, never the accuracy.
type basis struct {
	fs   []*moments.Expr
	r    [][]*big.Float // r[i][j], i <= j, at gsPrec bits
	prec uint           // gsPrec: the precision of r
	// condBits is log2 of max_k |f_k| / min_k R_kk, the bits the forward
	// solve R^T u = f loses: an estimate of the conditioning of the
	// monomial-style system against its orthonormalised form.
	condBits float64
	// cols[k][l] is sqrt(c_l) u_k(x_l) before any flip, the discrete
	// basis; flip[k] negates u_k (orient).
	cols [][]*big.Float
	flip []bool
	// rAt caches r rounded to the precisions the solves run at: a product
	// costs in the longer operand, and r is kept at the Gram-Schmidt
	// precision. Not safe for concurrent use.
	rAt map[uint][][]*big.Float
}

// rounded returns r rounded to prec bits (r itself at or above b.prec).
func (b *basis) rounded(prec uint) [][]*big.Float {
	if prec >= b.prec {
		return b.r
	}
	if r, ok := b.rAt[prec]; ok {
		return r
	}
	r := make([][]*big.Float, len(b.r))
	for i := range r {
		r[i] = cloneAt(b.r[i], prec)
	}
	if b.rAt == nil {
		b.rAt = map[uint][][]*big.Float{}
	}
	b.rAt[prec] = r
	return r
}

// orient flips the u_k whose discrete inner product with q's u_k is
// negative. The linear homotopy between two bases passes near a
// degenerate system where a pair points in opposite directions: with
// (1 - s) q_k + s u_k, s = 1/2 nearly cancels them.
func (b *basis) orient(q *basis) {
	for k := range b.flip {
		b.flip[k] = dot(b.cols[k], q.cols[k], 64).Sign() < 0
	}
}

// newBasis orthonormalises fs on (x, c) at prec bits (twice-repeated
// modified Gram-Schmidt: one pass loses orthogonality in proportion to
// the conditioning, the second restores it). A function whose remainder
// after the others is below 2^-(prec/2) of its norm is dependent on them:
// that is an error naming it. The sweeps, O(m^2 L) products, run in
// precision.Real (prec rounded up to whole words), which allocates
// nothing; r and the columns are handed back as big.Float.
func newBasis(fs []*moments.Expr, names []string, x, c []*big.Float, prec uint) (*basis, error) {
	m, L := len(fs), len(x)
	if L < 2*m {
		return nil, fmt.Errorf("the discretisation of the weight has %d points, too few for %d functions", L, m)
	}
	a := make([][]*precision.Real, m) // column k: sqrt(c_l) f_k(x_l)
	for k := range fs {
		a[k] = precision.NewRealSlice(L, prec)
	}
	sc := new(big.Float).SetPrec(prec)
	for l := range x {
		v, err := moments.EvalShared(fs, prec, x[l])
		if err != nil {
			return nil, err
		}
		sc.Sqrt(new(big.Float).SetPrec(prec).Set(c[l]))
		for k := range fs {
			a[k][l].SetBig(v[k].Mul(v[k], sc))
		}
	}
	s, t := precision.NewReal(prec), precision.NewReal(prec)
	dot := func(u, v []*precision.Real) *precision.Real {
		s.SetInt64(0)
		for i := range u {
			s.Add(s, t.Mul(u[i], v[i]))
		}
		return s
	}
	norms := make([]float64, m)
	for k := range fs {
		norms[k] = math.Sqrt(dot(a[k], a[k]).Float64())
	}
	r := make([][]*precision.Real, m)
	for i := range r {
		r[i] = precision.NewRealSlice(m, prec)
	}
	d, n, inv, one := precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec).SetInt64(1)
	minRatio, condBits := math.Inf(1), 0.0
	for k := 0; k < m; k++ {
		for pass := 0; pass < 2; pass++ {
			for i := 0; i < k; i++ {
				d.Set(dot(a[i], a[k]))
				r[i][k].Add(r[i][k], d)
				ai, ak := a[i], a[k]
				for l := range ak {
					ak[l].Sub(ak[l], t.Mul(d, ai[l]))
				}
			}
		}
		n.Sqrt(dot(a[k], a[k]))
		r[k][k].Set(n)
		nf := n.Float64()
		if n.IsZero() || n.Exponent() < -int64(prec/2) || nf < norms[k]*math.Ldexp(1, -int(prec/2)) {
			return nil, fmt.Errorf("the functions are linearly dependent on the weight's support: %s is a combination of the ones before it", names[k])
		}
		minRatio = math.Min(minRatio, nf/norms[k])
		inv.Quo(one, n)
		for l := range a[k] {
			a[k][l].Mul(a[k][l], inv)
		}
	}
	if minRatio > 0 {
		condBits = math.Max(0, -math.Log2(minRatio))
	}
	big2 := func(v [][]*precision.Real) [][]*big.Float {
		out := make([][]*big.Float, len(v))
		for i := range v {
			out[i] = make([]*big.Float, len(v[i]))
			for j := range v[i] {
				out[i][j] = v[i][j].Big(new(big.Float).SetPrec(prec))
			}
		}
		return out
	}
	return &basis{fs: fs, r: big2(r), prec: prec, condBits: condBits, cols: big2(a), flip: make([]bool, m)}, nil
}

func dot(a, b []*big.Float, prec uint) *big.Float {
	s := new(big.Float).SetPrec(prec)
	t := new(big.Float).SetPrec(prec)
	for i := range a {
		s.Add(s, t.Mul(a[i], b[i]))
	}
	return s
}

// solveRT overwrites v with R^-T v at prec bits (forward substitution).
func (b *basis) solveRT(v []*big.Float, prec uint) {
	t := new(big.Float).SetPrec(prec)
	r := b.rounded(prec)
	for j := range v {
		if v[j].Prec() > prec {
			v[j].SetPrec(prec)
		}
		for i := 0; i < j; i++ {
			v[j].Sub(v[j], t.Mul(r[i][j], v[i]))
		}
		v[j].Quo(v[j], r[j][j])
	}
	for j := range v {
		if b.flip[j] {
			v[j].Neg(v[j])
		}
	}
}

// evalF returns f_k(x) at prec bits, and, when dbits > 0, f_k'(x) to
// about dbits relative bits by a central difference with step
// h = 2^-(dbits/2+8) |x| (|x| = 1 at x = 0) at max(prec, 3 dbits/2 + 40)
// bits: truncation O(h^2), rounding O(2^-bits / h). The step is relative to
// |x| so that a log(x) near a zero end is differenced inside its domain.
// Newton needs the derivatives only to set its steps (a relative error e
// in them makes each step gain -log2 e bits), and the verification only
// as a scale.
func evalF(fs []*moments.Expr, x *big.Float, prec uint, dbits uint) (f, df []*big.Float, err error) {
	if f, err = moments.EvalShared(fs, prec, x); err != nil {
		return nil, nil, fmt.Errorf("%v at x = %s", err, x.Text('g', 10))
	}
	if dbits == 0 {
		return f, nil, nil
	}
	k := dbits/2 + 8
	hp := max(prec, dbits+k+32)
	h := new(big.Float).SetPrec(hp).Abs(x)
	if h.Sign() == 0 {
		h.SetInt64(1)
	}
	h.SetMantExp(h, -int(k))
	xp := new(big.Float).SetPrec(hp).Add(x, h)
	xm := new(big.Float).SetPrec(hp).Sub(x, h)
	h2 := new(big.Float).SetPrec(hp).Add(h, h)
	fp, err := moments.EvalShared(fs, hp, xp)
	if err != nil {
		return nil, nil, fmt.Errorf("%v near x = %s", err, x.Text('g', 10))
	}
	fm, err := moments.EvalShared(fs, hp, xm)
	if err != nil {
		return nil, nil, fmt.Errorf("%v near x = %s", err, x.Text('g', 10))
	}
	df = make([]*big.Float, len(fs))
	for k := range fs {
		df[k] = new(big.Float).SetPrec(prec).Quo(fp[k].Sub(fp[k], fm[k]), h2)
	}
	return f, df, nil
}

// eval returns u_k(x) at prec bits and, when deriv, u_k'(x) to about 96
// relative bits (the derivatives of the f_k to 96 bits more than the
// solve with R loses).
func (b *basis) eval(x *big.Float, prec uint, deriv bool) (u, du []*big.Float, err error) {
	var dbits uint
	if deriv {
		dbits = uint(math.Ceil(b.condBits)) + 96
	}
	u, du, err = evalF(b.fs, x, prec, dbits)
	if err != nil {
		return nil, nil, err
	}
	b.solveRT(u, prec)
	if deriv {
		b.solveRT(du, prec)
	}
	return u, du, nil
}
