package element

import (
	"context"
	"math"
	"math/big"

	"quadwright/precision"
)

// Exactness is the outcome of testing an element rule, monomial by
// monomial, against the exact integrals over its element.
type Exactness struct {
	// Degree is the highest d such that every monomial of total degree
	// <= d passes; -1 when the constant fails.
	Degree int
	// Tested is the highest total degree tested.
	Tested int
	// WorstShare is the largest residual over the monomials of the degrees
	// that passed, as a share of the tolerance (1 would be right at it).
	WorstShare float64
	// Digits is D, the largest number of significant digits among the
	// printed values; the tolerance is 10 u with u = 10^(1-D).
	Digits int
}

// VerifyPrinted reads the printed nodes (each len == s.Dim() coordinates)
// and weights as exact decimals and tests them on every monomial
// p = x^a y^b z^c of total degree d = 0..maxDeg: p counts as integrated when
//
//	|sum_i w_i p(x_i) - I(p)| <= 10 u sum_i |w_i| (|p(x_i)| + sum_k |x_ik dp/dx_k(x_i)|)
//	                           = 10 u (1 + d) sum_i |w_i| |p(x_i)|,
//
// with I(p) the exact integral (MonomialIntegral) and u = 10^(1-D), D the
// largest number of significant digits among the printed values, or
// minDigits if that is more (a rule whose values happen to be short, such
// as the 2-point Lobatto rule's -1, 1, 1, 1, is held to the digits it was
// printed at; float64 mode is 17). This is
// the contract's one-dimensional criterion with the derivative term summed
// over the coordinates: the change that perturbing every coordinate and
// weight by a relative u/2 can cause, ten times over. The sums are formed at
// DigitsToBits(D) + 64 bits (precision.Real), far above the tolerance, so
// the test itself loses nothing that matters. An unreadable value is an
// error naming it.
func VerifyPrinted(ctx context.Context, s Shape, nodes [][]string, weights []string, minDigits, maxDeg int) (Exactness, error) {
	return VerifyAgainst(ctx, s, nodes, weights, CheckOptions{MaxDegree: maxDeg, MinDigits: minDigits})
}

// monomialChunk adds, for its points, w p(x) to S[j] and |w| |p(x)| to B[j]
// for every monomial mons[j].
func monomialChunk(ctx context.Context, xs [][]*big.Rat, ws []*big.Rat, mons [][]int, maxDeg int, S, B []*precision.Real, prec uint) error {
	dim := len(mons[0])
	pw := make([][]*precision.Real, dim)
	for k := range pw {
		pw[k] = precision.NewRealSlice(maxDeg+1, prec)
	}
	w, aw, p, ap := precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec)
	for i := range xs {
		if i%16 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		for k := 0; k < dim; k++ {
			pw[k][0].SetInt64(1)
			x := precision.NewReal(prec).SetRat(xs[i][k])
			for e := 1; e <= maxDeg; e++ {
				pw[k][e].Mul(pw[k][e-1], x)
			}
		}
		w.SetRat(ws[i])
		aw.Abs(w)
		for j, m := range mons {
			p.Set(pw[0][m[0]])
			for k := 1; k < dim; k++ {
				p.Mul(p, pw[k][m[k]])
			}
			S[j].MulAdd(w, p, S[j])
			ap.Abs(p)
			B[j].MulAdd(aw, ap, B[j])
		}
	}
	return nil
}

// DegreeResiduals returns, for each total degree d = 0..maxDeg, the largest
// relative residual over the monomials p of degree d,
//
//	rel_d = max_p |sum_i w_i p(x_i) - I(p)| / ((1 + d) sum_i |w_i| |p(x_i)|),
//
// and the largest share of the tolerance VerifyAgainst holds it to,
// share_d = max_p |...| / (10 u (1 + d) sum_i |w_i| |p(x_i)| + slack)
// (+Inf for a nonzero residual against a zero tolerance; rel_d is then
// +Inf as well). integral nil means weight 1 (MonomialIntegral); slack may
// be nil. The sums are formed at prec bits, as VerifyAgainst forms them.
// rel is what the residuals say about the accuracy of the values, whatever
// the digits they are printed to.
func DegreeResiduals(ctx context.Context, s Shape, xs [][]*big.Rat, ws []*big.Rat, u, slack *big.Rat, maxDeg int, prec uint, integral Integral) (rel, share []float64, err error) {
	dim := s.Dim()
	if integral == nil {
		integral = func(e []int) *big.Rat { return MonomialIntegral(s, e) }
	}
	var mons [][]int
	var degOf []int
	for d := 0; d <= maxDeg; d++ {
		for _, m := range monomials(dim, d) {
			mons = append(mons, m)
			degOf = append(degOf, d)
		}
	}
	S := precision.NewRealSlice(len(mons), prec)
	B := precision.NewRealSlice(len(mons), prec)
	if err := monomialChunk(ctx, xs, ws, mons, maxDeg, S, B, prec); err != nil {
		return nil, nil, err
	}
	rel, share = make([]float64, maxDeg+1), make([]float64, maxDeg+1)
	t := precision.NewReal(prec).SetRat(new(big.Rat).Mul(u, big.NewRat(10, 1)))
	sl := precision.NewReal(prec)
	if slack != nil {
		sl.SetRat(slack)
	}
	exact, den, lim, q := precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec)
	for j, m := range mons {
		d := degOf[j]
		exact.SetRat(integral(m))
		r := S[j].Sub(S[j], exact)
		r.Abs(r)
		den.Mul(B[j], precision.NewReal(prec).SetInt64(int64(1+d)))
		lim.Mul(den, t)
		lim.Add(lim, sl)
		var a, b float64
		switch {
		case r.IsZero():
		case den.IsZero():
			a, b = math.Inf(1), math.Inf(1)
		default:
			a = q.Quo(r, den).Float64()
			if lim.IsZero() {
				b = math.Inf(1)
			} else {
				b = q.Quo(r, lim).Float64()
			}
		}
		rel[d], share[d] = max(rel[d], a), max(share[d], b)
	}
	return rel, share, nil
}
