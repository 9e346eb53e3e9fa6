package design

import (
	"context"

	"quadwright/precision"
)

// refineSquares refines the Gauss rule of a symmetric recurrence (every
// alpha_k = 0) through the rule of its squared variable, at half the cost
// of refining the positive nodes directly: each evaluation runs n/2 steps
// of a recurrence in y = x^2 instead of n steps in x.
//
// For a measure mu symmetric about 0 the monic orthogonal polynomials split
// into even and odd ones, pi_2k(x) = r_k(x^2) and pi_2k+1(x) = x s_k(x^2),
// where r_k and s_k are the monic orthogonal polynomials of the image
// measure nu of mu under x -> x^2 and of y dnu(y) (Chihara, An Introduction
// to Orthogonal Polynomials, Gordon and Breach 1978, ch. I, Theorem 9.1).
// Eliminating the odd (even) polynomials from two steps of the recurrence
// of mu gives theirs:
//
//	r_k+1 = (y - b_2k - b_2k+1) r_k - b_2k-1 b_2k r_k-1,   r's mass b_0,
//	s_k+1 = (y - b_2k+1 - b_2k+2) s_k - b_2k b_2k+1 s_k-1,  s's mass b_0 b_1,
//
// with b_0 left out of the first alpha of r. The n-point Gauss rule of mu
// then is: for n = 2m, the nodes +-sqrt(y_i) with weights lambda_i / 2, where
// (y_i, lambda_i) is the m-point Gauss rule of nu; for n = 2m+1, the node 0
// and the nodes +-sqrt(y_i) with weights lambda_i / (2 y_i), (y_i, lambda_i)
// the m-point Gauss rule of y dnu, and the middle weight from the recurrence
// of mu at 0 (both follow from integrating f(x^2) and x^2 f(x^2) by the rule).
// xs holds the starting nodes (ascending) and receives the nodes; ws
// receives the weights.
func refineSquares(ctx context.Context, a, b []*precision.Real, norm *precision.Real, xs, ws []*precision.Real, prec uint, startBits int) error {
	n := len(xs)
	m := n / 2
	odd := n%2 == 1
	ya, yb := squaredRecurrence(b, m, odd, prec)
	ynorm := precision.NewReal(prec).SetInt64(1)
	for k := 0; k < m; k++ {
		ynorm.Mul(ynorm, yb[k])
	}
	ys := precision.NewRealSlice(m, prec)
	lam := precision.NewRealSlice(m, prec)
	for i := 0; i < m; i++ {
		x := xs[n-m+i]
		if x.Sign() <= 0 {
			return errNoConvergence
		}
		ys[i].Mul(x, x)
	}
	if err := refineRising(ctx, ya, yb, ynorm, ys, lam, prec, false, 0, m, startBits, func(int) {}); err != nil {
		return err
	}
	two := precision.NewReal(prec).SetInt64(2)
	for i := 0; i < m; i++ {
		if ys[i].Sign() <= 0 || lam[i].Sign() <= 0 {
			return errNoConvergence
		}
		hi, lo := n-m+i, m-1-i
		xs[hi].Sqrt(ys[i])
		xs[lo].Neg(xs[hi])
		if odd {
			ws[hi].Mul(two, ys[i])
			ws[hi].Quo(lam[i], ws[hi])
		} else {
			ws[hi].MulPow2(lam[i], -1)
		}
		ws[lo].Set(ws[hi])
	}
	if odd {
		e := newEvaluator(a, b, prec)
		xs[m].SetInt64(0)
		e.eval(xs[m])
		ws[m].Mul(e.q, e.dp)
		if ws[m].IsZero() {
			return errNoConvergence
		}
		ws[m].Quo(norm, ws[m])
	}
	return nil
}
