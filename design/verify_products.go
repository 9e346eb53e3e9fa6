package design

import (
	"context"
	"fmt"
	"math/big"

	"quadwright/precision"
)

// Verifier is implemented by sources that verify a printed rule by their
// own criterion, because they provide fewer than the 2N-1 pairs that
// VerifyPrinted needs for an N-point rule (a list of 2N moments fixes only
// N pairs). Gauss then asks such a source for N pairs only, and calls
// VerifyRule instead of VerifyPrinted.
type Verifier interface {
	// VerifyRule tests the printed nodes and weights for exactness through
	// degree maxDeg, as VerifyPrinted does (same tolerance, same meaning of
	// Exactness.Degree), using only what the input determines.
	VerifyRule(ctx context.Context, nodes, weights []string, maxDeg int) (Exactness, error)
}

// maxProductPoints bounds VerifyPrintedProducts, whose cost grows as N^3.
const maxProductPoints = 400

// VerifyPrintedProducts tests a printed N-point rule for exactness through
// degree d = min(maxDeg, 2N-1) using only the pairs 0..min(N, d)-1 of m
// (for d = 2N-1 the N pairs that 2N moments determine). The degree <= d
// polynomials are spanned by the products pi_i pi_j, i <= j <= N,
// i <= N-1, i + j <= d, of the monic orthogonal polynomials, whose
// integrals are known exactly from the recurrence: delta_ij beta_0 beta_1
// ... beta_i (orthogonality; pi_N is orthogonal to every lower degree). The
// product of degree d = i+j counts as integrated when
//
//	|sum_k w_k pi_i pi_j (x_k) - I(pi_i pi_j)| <= tol sum_k |w_k| (|pi_i pi_j (x_k)| + |x_k (pi_i pi_j)'(x_k)|),
//
// the criterion of CheckExactness applied to the products; tol = 10 u, u
// one unit in the D-th digit, D the largest number of significant digits
// among the printed values. Exactness.Degree is one below the lowest degree
// of a failing product (d when none fails), and Ratio[d] is the largest
// ratio over the products of degree d. The test is as well conditioned as
// CheckExactness: no monomial appears. Sums are formed at
// DigitsToBits(D)+64 bits; the cost is O(N^3), so N is limited to
// maxProductPoints.
func VerifyPrintedProducts(ctx context.Context, m RecurrenceSource, nodes, weights []string, maxDeg int) (Exactness, error) {
	n := len(nodes)
	maxDeg = min(maxDeg, 2*n-1)
	J := min(n, maxDeg) // highest degree of a factor pi_j
	if len(weights) != n {
		panic("design: VerifyPrintedProducts with mismatched nodes and weights")
	}
	if n > maxProductPoints {
		return Exactness{}, fmt.Errorf("a %d-point rule from a source of %d recurrence pairs cannot be verified (the direct test is limited to %d points); give 4N moments so that the standard test applies", n, m.MaxLen(), maxProductPoints)
	}
	D := 1
	for _, s := range append(append([]string(nil), nodes...), weights...) {
		num, err := precision.ParseNumber(s)
		if err != nil {
			return Exactness{}, err
		}
		D = max(D, num.Digits)
	}
	prec := precision.DigitsToBits(D) + 64
	rec, err := m.Recurrence(J, prec)
	if err != nil {
		return Exactness{}, err
	}
	a := precision.NewRealSlice(J, prec)
	b := precision.NewRealSlice(J, prec)
	for k := 0; k < J; k++ {
		a[k].SetBig(rec.Alpha[k])
		b[k].SetBig(rec.Beta[k])
	}
	// S[i][j] and B[i][j], j >= i, hold the rule's sum and its bound.
	I := min(n-1, maxDeg/2) // highest degree of the lower factor pi_i
	S := make([][]*precision.Real, I+1)
	B := make([][]*precision.Real, I+1)
	for i := range S {
		S[i] = precision.NewRealSlice(J+1, prec)
		B[i] = precision.NewRealSlice(J+1, prec)
	}
	p := precision.NewRealSlice(J+1, prec)
	d := precision.NewRealSlice(J+1, prec)
	r := precision.NewRealSlice(8, prec)
	x, w, aw, ax, t, u, v, q := r[0], r[1], r[2], r[3], r[4], r[5], r[6], r[7]
	for k := 0; k < n; k++ {
		if err := ctx.Err(); err != nil {
			return Exactness{}, err
		}
		xr, _ := precision.ParseExact(nodes[k])
		wr, _ := precision.ParseExact(weights[k])
		x.SetRat(xr)
		w.SetRat(wr)
		aw.Abs(w)
		ax.Abs(x)
		p[0].SetInt64(1)
		d[0].SetInt64(0)
		for j := 0; j < J; j++ {
			t.Sub(x, a[j])
			p[j+1].Mul(t, p[j])
			d[j+1].Mul(t, d[j])
			d[j+1].Add(d[j+1], p[j])
			if j > 0 {
				u.Mul(b[j], p[j-1])
				p[j+1].Sub(p[j+1], u)
				u.Mul(b[j], d[j-1])
				d[j+1].Sub(d[j+1], u)
			}
		}
		for i := 0; i <= I; i++ {
			for j := i; j <= min(J, maxDeg-i); j++ {
				q.Mul(p[i], p[j])
				S[i][j].MulAdd(w, q, S[i][j])
				q.Abs(q)
				u.Mul(d[i], p[j])
				v.Mul(p[i], d[j])
				u.Add(u, v)
				u.Mul(u, ax)
				u.Abs(u)
				u.Add(u, q)
				B[i][j].MulAdd(aw, u, B[i][j])
			}
		}
	}
	tol := new(big.Float).SetPrec(prec).SetRat(new(big.Rat).SetFrac(big.NewInt(10), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D-1)), nil)))
	tr := precision.NewReal(prec).SetBig(tol)
	res := Exactness{Degree: maxDeg, Tested: maxDeg, Ratio: make([]*big.Float, maxDeg+1), Tol: new(big.Float).SetPrec(64).Set(tol)}
	for deg := range res.Ratio {
		res.Ratio[deg] = new(big.Float).SetPrec(64)
	}
	norm := precision.NewReal(prec).SetInt64(1)
	lim := precision.NewReal(prec)
	for i := 0; i <= I; i++ {
		norm.Mul(norm, b[i])
		for j := i; j <= min(J, maxDeg-i); j++ {
			if i == j {
				S[i][j].Sub(S[i][j], norm)
			}
			S[i][j].Abs(S[i][j])
			lim.Mul(tr, B[i][j])
			deg := i + j
			var ratio *big.Float
			switch {
			case !B[i][j].IsZero():
				ratio = precision.NewReal(prec).Quo(S[i][j], B[i][j]).Big(nil)
			case !S[i][j].IsZero():
				ratio = new(big.Float).SetInf(false)
			default:
				ratio = new(big.Float)
			}
			if ratio.Cmp(res.Ratio[deg]) > 0 {
				res.Ratio[deg].Set(ratio)
			}
			if S[i][j].Cmp(lim) > 0 && deg-1 < res.Degree {
				res.Degree = deg - 1
			}
		}
	}
	return res, nil
}

func isVerifier(src RecurrenceSource) bool {
	_, ok := src.(Verifier)
	return ok
}
