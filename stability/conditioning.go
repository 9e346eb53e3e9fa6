package stability

import (
	"context"
	"math"
	"math/big"

	"gonum.org/v1/gonum/mat"

	"quadwright/design"
	"quadwright/precision"
)

// Conditioning holds the condition numbers that explain why some ways of
// computing or checking a rule lose digits.
type Conditioning struct {
	// Norm names the norm of the two Vandermonde condition numbers.
	Norm string `json:"norm"`
	// Monomial is cond(V), V_ij = x_i^j (i, j = 0..N-1); Orthonormal is
	// cond(P), P_ij = p_j(x_i) with p_j the orthonormal polynomials of the
	// measure. Both are float64 diagnostics (gonum mat.Cond, 2-norm: the ratio
	// of the extreme singular values); a value near 1e16 or above means
	// "at least that": float64 cannot resolve more. Omitted (0) above
	// MaxMatrixPoints nodes or when the measure provides fewer than N pairs.
	Monomial    Float `json:"vandermonde_monomial,omitempty"`
	Orthonormal Float `json:"vandermonde_orthonormal,omitempty"`
	// HankelOrder is the order N of the Hankel matrix H_ij = m_{i+j}
	// (i, j = 0..N-1) of the measure's moments m_k, Hankel its 1-norm
	// condition number and HankelLostDigits log10 of it: the decimal
	// digits that building an N-point rule from raw monomial moments loses.
	// Omitted (0) above MaxHankelPoints.
	HankelOrder      int   `json:"hankel_order,omitempty"`
	Hankel           Float `json:"hankel_condition,omitempty"`
	HankelLostDigits Float `json:"hankel_lost_digits,omitempty"`
}

// conditioning computes the section for the rule p against m. It fills
// what the rule's size and the measure's recurrence allow and notes the rest
// in r.Notes.
func conditioning(ctx context.Context, m design.Measure, p *parsedRule, r *Report) (*Conditioning, error) {
	n := len(p.x)
	c := &Conditioning{Norm: "2-norm (ratio of extreme singular values)"}
	if ml := m.MaxLen(); ml >= 0 && ml < n {
		r.Notes = append(r.Notes, "conditioning left out: the measure provides fewer recurrence pairs than the rule has nodes")
		return c, nil
	}
	if n <= MaxMatrixPoints {
		rec, err := m.Recurrence(n, 64)
		if err != nil {
			return nil, err
		}
		c.Monomial, c.Orthonormal = vandermondeConds(r.Nodes, rec)
	} else {
		r.Notes = append(r.Notes, "Vandermonde conditioning left out: more than 600 nodes")
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if n <= MaxHankelPoints {
		prec := uint(128+8*n+63) / 64 * 64
		rec, err := m.Recurrence(n, prec)
		if err != nil {
			return nil, err
		}
		c.HankelOrder = n
		c.HankelLostDigits = Float(HankelLostDigits(rec, n, prec))
		c.Hankel = Float(math.Pow(10, float64(c.HankelLostDigits)))
	} else {
		r.Notes = append(r.Notes, "Hankel conditioning left out: more than 120 nodes")
	}
	return c, nil
}

// vandermondeConds returns the 2-norm condition numbers of the monomial
// matrix x_i^j and of the orthonormal-basis matrix p_j(x_i) (i, j < N), in
// float64. The orthonormal polynomials come from the monic recurrence by
// p_{-1} = 0, p_0 = 1/sqrt(beta_0),
// sqrt(beta_{j+1}) p_{j+1} = (x - alpha_j) p_j - sqrt(beta_j) p_{j-1}.
// A matrix with a non-finite entry gives +Inf.
func vandermondeConds(x []float64, rec *design.Recurrence) (mono, orth Float) {
	n := len(x)
	a, sb := make([]float64, n), make([]float64, n)
	for k := 0; k < n; k++ {
		a[k], _ = rec.Alpha[k].Float64()
		b, _ := rec.Beta[k].Float64()
		sb[k] = math.Sqrt(b)
	}
	v := mat.NewDense(n, n, nil)
	q := mat.NewDense(n, n, nil)
	finiteV, finiteQ := true, true
	for i, xi := range x {
		pw := 1.0
		prev, cur := 0.0, 1/sb[0]
		for j := 0; j < n; j++ {
			v.Set(i, j, pw)
			q.Set(i, j, cur)
			if math.IsInf(pw, 0) || math.IsNaN(pw) {
				finiteV = false
			}
			if math.IsInf(cur, 0) || math.IsNaN(cur) {
				finiteQ = false
			}
			pw *= xi
			if j+1 < n {
				prev, cur = cur, ((xi-a[j])*cur-sb[j]*prev)/sb[j+1]
			}
		}
	}
	cond := func(ok bool, m *mat.Dense) Float {
		if !ok {
			return Float(math.Inf(1))
		}
		return Float(mat.Cond(m, 2))
	}
	return cond(finiteV, v), cond(finiteQ, q)
}

// HankelLostDigits returns log10 of the 1-norm condition number of the
// order-n Hankel matrix H_ij = m_{i+j} (i, j = 0..n-1) of the moments of
// the measure of rec, computed from the first n pairs of rec at prec bits
// with no matrix inversion:
//
//   - the moments m_k = beta_0 c^(k)_0, where x^k = sum_l c^(k)_l pi_l in the
//     monic orthogonal basis, run by c^(k+1)_l = c^(k)_{l-1} + alpha_l c^(k)_l
//   - beta_{l+1} c^(k)_{l+1} (only l <= n-1 is needed for k <= 2n-2);
//   - the inverse H^-1 = C^T D^-1 C, with C_kj the coefficient of x^j in
//     pi_k and D = diag(beta_0 beta_1 ... beta_k), from C H C^T = D (the
//     orthogonality of the pi_k).
//
// The conditioning of Hankel matrices of positive measures grows
// exponentially with n (E. E. Tyrtyshnikov, "How bad are Hankel matrices?",
// Numerische Mathematik 67 (1994) 261-269), and the map from moments to the
// Gauss rule inherits it (W. Gautschi, "On the construction of Gaussian
// quadrature rules from modified moments", Mathematics of Computation 24
// (1970) 245-260): this is the loss of a construction from raw moments.
// prec should exceed 8n bits; the result is meant to a few tenths of a digit.
func HankelLostDigits(rec *design.Recurrence, n int, prec uint) float64 {
	if n < 1 || rec.Len() < n {
		panic("stability: HankelLostDigits needs n >= 1 recurrence pairs")
	}
	a := precision.NewRealSlice(n, prec)
	b := precision.NewRealSlice(n+1, prec)
	for k := 0; k < n; k++ {
		a[k].SetBig(rec.Alpha[k])
		b[k].SetBig(rec.Beta[k])
	}
	b[n].SetInt64(0)
	// Moments m_0..m_{2n-2}.
	mom := precision.NewRealSlice(2*n-1, prec)
	c := precision.NewRealSlice(n+1, prec)
	nc := precision.NewRealSlice(n+1, prec)
	t := precision.NewReal(prec)
	for l := range c {
		c[l].SetInt64(0)
	}
	c[0].SetInt64(1)
	for k := 0; k <= 2*n-2; k++ {
		mom[k].Mul(b[0], c[0])
		top := min(k+1, n-1, 2*n-3-k)
		for l := 0; l <= top; l++ {
			nc[l].Mul(a[l], c[l])
			if l > 0 {
				nc[l].Add(nc[l], c[l-1])
			}
			if l+1 < n {
				t.Mul(b[l+1], c[l+1])
				nc[l].Add(nc[l], t)
			}
		}
		for l := top + 1; l <= n; l++ {
			nc[l].SetInt64(0)
		}
		c, nc = nc, c
	}
	// ||H||_1.
	normH := precision.NewReal(prec).SetInt64(0)
	col := precision.NewReal(prec)
	for j := 0; j < n; j++ {
		col.SetInt64(0)
		for i := 0; i < n; i++ {
			t.Abs(mom[i+j])
			col.Add(col, t)
		}
		if col.Cmp(normH) > 0 {
			normH.Set(col)
		}
	}
	// C (row k: coefficients of pi_k) and G = D^-1 C.
	C := make([][]*precision.Real, n)
	G := make([][]*precision.Real, n)
	d := precision.NewReal(prec).Set(b[0])
	for k := 0; k < n; k++ {
		C[k] = precision.NewRealSlice(k+1, prec)
		G[k] = precision.NewRealSlice(k+1, prec)
		for j := 0; j <= k; j++ {
			switch {
			case k == 0:
				C[k][j].SetInt64(1)
				continue
			case j == k:
				C[k][j].SetInt64(1)
				continue
			}
			// pi_k = (x - alpha_{k-1}) pi_{k-1} - beta_{k-1} pi_{k-2}.
			C[k][j].Mul(a[k-1], C[k-1][j])
			C[k][j].Neg(C[k][j])
			if j > 0 {
				C[k][j].Add(C[k][j], C[k-1][j-1])
			}
			if k >= 2 && j <= k-2 {
				t.Mul(b[k-1], C[k-2][j])
				C[k][j].Sub(C[k][j], t)
			}
		}
		if k > 0 {
			d.Mul(d, b[k])
		}
		for j := 0; j <= k; j++ {
			G[k][j].Quo(C[k][j], d)
		}
	}
	normInv := precision.NewReal(prec).SetInt64(0)
	e := precision.NewReal(prec)
	for j := 0; j < n; j++ {
		col.SetInt64(0)
		for i := 0; i < n; i++ {
			e.SetInt64(0)
			for k := max(i, j); k < n; k++ {
				e.MulAdd(C[k][i], G[k][j], e)
			}
			e.Abs(e)
			col.Add(col, e)
		}
		if col.Cmp(normInv) > 0 {
			normInv.Set(col)
		}
	}
	return log10Big(normH.Big(nil)) + log10Big(normInv.Big(nil))
}

// log10Big returns log10 x for x > 0 to about 1e-15 relative, any magnitude.
func log10Big(x *big.Float) float64 {
	mant := new(big.Float)
	e := x.MantExp(mant)
	m, _ := mant.Float64()
	return math.Log10(m) + float64(e)*math.Log10(2)
}
