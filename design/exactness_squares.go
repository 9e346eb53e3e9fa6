package design

import "quadwright/precision"

// squaresWalk is the walk of the exactness test for a rule folded by pairUp
// (a symmetric recurrence with coefficients b, maxDeg >= 2), run in the
// squared variable y = x^2: for the even degrees j = 2k it adds
// w_i r_k(y_i) to S[j] and |w_i| (|r_k(y_i)| + 2 y_i |r_k'(y_i)|) to B[j],
// which are w_i p_j(x_i) and |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|) since
// x p_j'(x) = 2 y r_k'(y). The odd degrees get nothing: their pairs cancel
// exactly. Each node costs half the steps of the recurrence in x.
func squaresWalk(b []*precision.Real, maxDeg int, prec uint) basisWalk {
	K := maxDeg / 2 // the highest k with 2k <= maxDeg
	c, d := squaredRecurrence(b, K, false, prec)
	d[0].SetInt64(0) // r_0's mass is not a step of the walk (q_-1 = 0)
	return basisWalk{a: c, b: d, steps: K, squares: true}
}

// squaredRecurrence returns the first m coefficients (ya_k, yb_k) of the
// monic orthogonal polynomials in y = x^2 of a symmetric recurrence with
// coefficients b (every alpha_k = 0), rounded to prec bits: those of r_k
// with pi_2k(x) = r_k(x^2), or with odd those of s_k with
// pi_2k+1(x) = x s_k(x^2) (see refineSquares), yb_0 being the mass of the
// measure in y. b must hold 2m values (2m+1 with odd).
func squaredRecurrence(b []*precision.Real, m int, odd bool, prec uint) (ya, yb []*precision.Real) {
	ya = precision.NewRealSlice(m, prec)
	yb = precision.NewRealSlice(m, prec)
	for k := 0; k < m; k++ {
		switch {
		case odd:
			ya[k].Add(b[2*k+1], b[2*k+2])
			if k == 0 {
				yb[0].Mul(b[0], b[1])
			} else {
				yb[k].Mul(b[2*k], b[2*k+1])
			}
		case k == 0:
			ya[0].Set(b[1])
			yb[0].Set(b[0])
		default:
			ya[k].Add(b[2*k], b[2*k+1])
			yb[k].Mul(b[2*k-1], b[2*k])
		}
	}
	return ya, yb
}
