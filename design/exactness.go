package design

import (
	"context"
	"fmt"
	"math/big"
	"math/bits"
	"runtime"
	"sync"

	"quadwright/precision"
)

// Exactness is the outcome of testing a rule, polynomial by polynomial,
// against the orthogonal polynomials of the measure it claims.
type Exactness struct {
	// Degree is the highest d such that every polynomial of degree <= d
	// passes; -1 when constants fail.
	Degree int
	// Tested is the highest degree tested.
	Tested int
	// Ratio[j] is |Q(p_j) - I(p_j)| / sum_i |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|)
	// for the orthogonal polynomial p_j of degree j (the ratio does not
	// depend on how p_j is normalised). It is the residual at degree j
	// measured in units of what the rule's own rounding can explain.
	Ratio []*big.Float
	// Tol is the tolerance the ratios were held against.
	Tol *big.Float
}

// WorstShare returns the largest Ratio[j] / Tol over the degrees that
// passed: 1 would be a residual right at the tolerance.
func (e Exactness) WorstShare() float64 {
	worst := 0.0
	if e.Tol == nil || e.Tol.Sign() == 0 {
		return worst
	}
	for j := 0; j <= e.Degree && j < len(e.Ratio); j++ {
		q := new(big.Float).SetPrec(64).Quo(e.Ratio[j], e.Tol)
		if f, _ := q.Float64(); f > worst {
			worst = f
		}
	}
	return worst
}

// CheckExactness tests the rule (nodes, weights) against the measure of rec
// for the degrees 0..maxDeg: the degree-j orthogonal polynomial p_j counts
// as integrated when
//
//	|sum_i w_i p_j(x_i) - I(p_j)| <= tol * sum_i |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|),
//
// with I(p_0) = beta_0 and I(p_j) = 0 for j >= 1. Testing in the orthogonal
// basis keeps the test well conditioned, where a test on monomials would
// itself lose digits; the right-hand side is the change that perturbing
// every node and weight by a relative tol/2 can cause, so tol = 10 u is "ten
// times what data known to a relative u allows". rec must hold at least
// maxDeg pairs. The sums are formed at prec bits, which should exceed the
// bits of tol by a margin (64 bits is ample).
func CheckExactness(ctx context.Context, rec *Recurrence, nodes, weights []*big.Float, tol *big.Float, maxDeg int, prec uint) (Exactness, error) {
	if rec.Len() < maxDeg {
		panic(fmt.Sprintf("design: CheckExactness to degree %d needs %d recurrence pairs, have %d", maxDeg, maxDeg, rec.Len()))
	}
	integrals := []*big.Float{rec.Beta[0]}
	return checkInBasis(ctx, rec.Alpha[:maxDeg], rec.Beta[:maxDeg], integrals, nil, nodes, weights, tol, maxDeg, sumPrec(tol, maxDeg+1, prec))
}

// sumPrec is the precision CheckExactness forms its sums at: prec, or less
// when tol leaves room. The test compares |S_j| with tol B_j, so what the
// sums must resolve is a small fraction of tol B_j. Rounding the nodes and
// weights to P bits moves S_j by less than 2^(1-P) B_j (B_j is the first-order
// change of S_j under relative perturbations of them), and the forward
// recurrence's rounding adds at most about m^2 2^-P B_j over m degrees (a
// conservative allowance: for nodes in the support the errors grow about
// linearly with the degree). P = log2(1/tol) + 2 log2(m) + 32 keeps both
// below 2^-30 tol B_j, so the verdict and the printed ratios do not depend
// on it.
func sumPrec(tol *big.Float, m int, prec uint) uint {
	if tol.Sign() <= 0 {
		return prec
	}
	e := tol.MantExp(nil) // tol < 2^e
	if e >= 0 {
		return prec
	}
	need := uint(-e) + 2*uint(bits.Len(uint(m))) + 32
	return min(prec, (need+63)/64*64)
}

// checkInBasis is the test of CheckExactness in the basis of monic
// polynomials q_0 = 1, q_{j+1} = (x - a_j) q_j - b_j q_{j-1} (a and b hold
// at least maxDeg values): q_j counts as integrated when
//
//	|sum_i w_i q_j(x_i) - I_j| <= tol * sum_i |w_i| (|q_j(x_i)| + |x_i q_j'(x_i)|) + e_j,
//
// where I_j = integrals[j] (0 beyond the slice) and e_j = slack[j] (0 when
// slack is nil or shorter), the error bound of a computed I_j.
func checkInBasis(ctx context.Context, alpha, beta, integrals, slack []*big.Float, nodes, weights []*big.Float, tol *big.Float, maxDeg int, prec uint) (Exactness, error) {
	if len(nodes) != len(weights) {
		panic("design: CheckExactness with mismatched nodes and weights")
	}
	m := maxDeg + 1
	a := precision.NewRealSlice(maxDeg+1, prec)
	b := precision.NewRealSlice(maxDeg+1, prec)
	for k := 0; k < maxDeg; k++ {
		a[k].SetBig(alpha[k])
		b[k].SetBig(beta[k])
	}
	nodes, weights, paired := pairUp(alpha[:maxDeg], nodes, weights)
	walk := basisWalk{a: a, b: b, steps: maxDeg, skipOdd: paired, zeroA: paired}
	if paired && maxDeg >= 2 {
		walk = squaresWalk(b, maxDeg, prec)
	}
	n := len(nodes)
	workers := runtime.GOMAXPROCS(0)
	if n < 4*workers {
		workers = 1
	}
	sums := make([][]*precision.Real, workers)
	bounds := make([][]*precision.Real, workers)
	var wg sync.WaitGroup
	errs := make([]error, workers)
	for wk := 0; wk < workers; wk++ {
		sums[wk] = precision.NewRealSlice(m, prec)
		bounds[wk] = precision.NewRealSlice(m, boundPrec)
		lo, hi := wk*n/workers, (wk+1)*n/workers
		wg.Add(1)
		go func(wk, lo, hi int) {
			defer wg.Done()
			errs[wk] = walk.chunk(ctx, nodes[lo:hi], weights[lo:hi], sums[wk], bounds[wk], prec)
		}(wk, lo, hi)
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return Exactness{}, err
		}
	}
	// Fixed chunking and a fixed order of the final sums keep the result
	// independent of scheduling.
	integral := precision.NewReal(prec)
	S, B := sums[0], precision.NewRealSlice(m, prec)
	for j := 0; j < m; j++ {
		B[j].Set(bounds[0][j])
	}
	for wk := 1; wk < workers; wk++ {
		for j := 0; j < m; j++ {
			S[j].Add(S[j], sums[wk][j])
			B[j].Add(B[j], integral.Set(bounds[wk][j]))
		}
	}
	for j := 0; j < min(m, len(integrals)); j++ {
		S[j].Sub(S[j], integral.SetBig(integrals[j]))
	}
	t := precision.NewReal(prec).SetBig(tol)
	lim := precision.NewReal(prec)
	res := Exactness{Degree: -1, Tested: maxDeg, Ratio: make([]*big.Float, m), Tol: new(big.Float).SetPrec(64).Set(tol)}
	failed := false
	for j := 0; j < m; j++ {
		S[j].Abs(S[j])
		lim.Mul(t, B[j])
		if j < len(slack) {
			lim.Add(lim, integral.SetBig(slack[j]))
		}
		r := new(big.Float).SetPrec(64)
		if !B[j].IsZero() {
			q := precision.NewReal(prec).Quo(S[j], B[j])
			r.Set(q.Big(nil))
		} else if !S[j].IsZero() {
			r.SetInf(false)
		}
		res.Ratio[j] = r
		if !failed && S[j].Cmp(lim) <= 0 {
			res.Degree = j
		} else {
			failed = true
		}
	}
	return res, nil
}

// boundPrec is the precision of the right-hand sides B_j of the exactness
// test and of the derivatives they need. B_j is the scale the tolerance is
// measured in, not a quantity the test decides on to the last bit: 64 bits
// fix it to a relative 2^-57 or so even after 10^5 recurrence steps, far
// inside the tolerance's own factor of ten. The sums S_j, where the
// cancellation happens, run at the full precision.
const boundPrec = 64

// pairUp folds a rule that is symmetric about 0 for a symmetric recurrence
// (every alpha_k exactly 0, printed nodes in pairs -x, x with equal weights)
// onto its non-negative half: each pair becomes its positive node with
// twice the weight, the middle node 0 of an odd rule stays as it is. Then
// p_j is even or odd, a pair adds 2 w p_j(x) for even j and exactly 0 for
// odd j, and 2 w (|p_j(x)| + |x p_j'(x)|) to B_j, so the test over the half
// is the test over the whole rule with half the work. Otherwise it returns
// the rule unchanged and false.
func pairUp(alpha, nodes, weights []*big.Float) ([]*big.Float, []*big.Float, bool) {
	n := len(nodes)
	for _, a := range alpha {
		if a.Sign() != 0 {
			return nodes, weights, false
		}
	}
	neg := new(big.Float)
	for i := 0; i < n/2; i++ {
		j := n - 1 - i
		if nodes[j].Sign() <= 0 || neg.Neg(nodes[j]).Cmp(nodes[i]) != 0 || weights[i].Cmp(weights[j]) != 0 {
			return nodes, weights, false
		}
	}
	if n%2 == 1 && nodes[n/2].Sign() != 0 {
		return nodes, weights, false
	}
	hn := make([]*big.Float, 0, (n+1)/2)
	hw := make([]*big.Float, 0, (n+1)/2)
	for i := n / 2; i < n; i++ {
		hn = append(hn, nodes[i])
		w := weights[i]
		if i != n-1-i {
			w = new(big.Float).SetPrec(w.Prec()+1).SetMantExp(w, 1)
		}
		hw = append(hw, w)
	}
	return hn, hw, true
}
