package element

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"runtime"
	"sync"

	"quadwright/precision"
)

// Integral returns the exact (or, for a computed moment, accurate far
// beyond any tolerance) integral over the element of the monomial with the
// exponents e against the rule's weight.
type Integral func(e []int) *big.Rat

// CheckOptions say what VerifyAgainst tests.
type CheckOptions struct {
	// MaxDegree is the highest total degree tested.
	MaxDegree int
	// MinDigits is a floor on D (as for VerifyPrinted); Unit, when not
	// nil, sets u directly (0 < u < 1) instead of 10^(1-D).
	MinDigits int
	Unit      *big.Rat
	// Integral gives the integrals; nil means weight 1 (MonomialIntegral).
	Integral Integral
	// Slack, when not nil, is an absolute error the integrals may carry
	// (computed moments: the accuracy they were computed to), added to
	// every monomial's tolerance, so that a sum that is exactly 0 is not
	// failed for the rounding in a computed moment that is 0 in truth.
	Slack *big.Rat
}

// VerifyAgainst is VerifyPrinted against the integrals of opt.Integral
// (the moments of a weight, or a moment table) and with an optional unit
// u: monomial p of total degree d counts as integrated when
//
//	|sum_i w_i p(x_i) - I(p)| <= 10 u (1 + d) sum_i |w_i| |p(x_i)|.
//
// Every value is read as an exact decimal; an unreadable value or a node
// with the wrong number of coordinates is an error naming it. The sums are
// formed at DigitsToBits(D) + 64 bits (with u given, at the bits of u plus
// 64), D the largest number of significant digits among the values.
func VerifyAgainst(ctx context.Context, s Shape, nodes [][]string, weights []string, opt CheckOptions) (Exactness, error) {
	if len(nodes) != len(weights) {
		panic("element: VerifyAgainst with mismatched nodes and weights")
	}
	dim := s.Dim()
	D := max(1, opt.MinDigits)
	xs := make([][]*big.Rat, len(nodes))
	ws := make([]*big.Rat, len(nodes))
	read := func(v, what string) (*big.Rat, error) {
		num, err := precision.ParseNumber(v)
		if err != nil {
			return nil, fmt.Errorf("%s %q: not a decimal number", what, v)
		}
		D = max(D, num.Digits)
		return num.Value, nil
	}
	for i := range nodes {
		if len(nodes[i]) != dim {
			return Exactness{}, fmt.Errorf("node %d has %d coordinates, the %s needs %d", i+1, len(nodes[i]), s, dim)
		}
		xs[i] = make([]*big.Rat, dim)
		for k, c := range nodes[i] {
			r, err := read(c, fmt.Sprintf("node %d coordinate %d", i+1, k+1))
			if err != nil {
				return Exactness{}, err
			}
			xs[i][k] = r
		}
		r, err := read(weights[i], fmt.Sprintf("weight %d", i+1))
		if err != nil {
			return Exactness{}, err
		}
		ws[i] = r
	}
	u := opt.Unit
	if u == nil {
		u = new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D-1)), nil))
	}
	integral := opt.Integral
	if integral == nil {
		integral = func(e []int) *big.Rat { return MonomialIntegral(s, e) }
	}
	uBits := u.Denom().BitLen() - u.Num().BitLen() + 1
	prec := precision.DigitsToBits(D) + 64
	if uBits > 0 {
		prec = max(prec, uint(uBits)+64)
	}
	return sumsAgainst(ctx, s, xs, ws, u, opt.Slack, opt.MaxDegree, prec, integral, D)
}

// sumsAgainst forms the sums of every monomial through maxDeg and tests
// them against integral with the unit u.
func sumsAgainst(ctx context.Context, s Shape, xs [][]*big.Rat, ws []*big.Rat, u, slack *big.Rat, maxDeg int, prec uint, integral Integral, D int) (Exactness, error) {
	dim := s.Dim()
	var mons [][]int
	var degOf []int
	for d := 0; d <= maxDeg; d++ {
		for _, m := range monomials(dim, d) {
			mons = append(mons, m)
			degOf = append(degOf, d)
		}
	}
	n := len(xs)
	workers := runtime.GOMAXPROCS(0)
	if n < 4*workers {
		workers = 1
	}
	S := make([][]*precision.Real, workers)
	B := make([][]*precision.Real, workers)
	errs := make([]error, workers)
	var wg sync.WaitGroup
	for wk := 0; wk < workers; wk++ {
		S[wk] = precision.NewRealSlice(len(mons), prec)
		B[wk] = precision.NewRealSlice(len(mons), prec)
		lo, hi := wk*n/workers, (wk+1)*n/workers
		wg.Add(1)
		go func(wk, lo, hi int) {
			defer wg.Done()
			errs[wk] = monomialChunk(ctx, xs[lo:hi], ws[lo:hi], mons, maxDeg, S[wk], B[wk], prec)
		}(wk, lo, hi)
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return Exactness{}, err
		}
	}
	for wk := 1; wk < workers; wk++ {
		for j := range mons {
			S[0][j].Add(S[0][j], S[wk][j])
			B[0][j].Add(B[0][j], B[wk][j])
		}
	}
	t := precision.NewReal(prec).SetRat(new(big.Rat).Mul(u, big.NewRat(10, 1)))
	res := Exactness{Degree: -1, Tested: maxDeg, Digits: D}
	exact, lim, scale, q := precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec)
	sl := precision.NewReal(prec)
	if slack != nil {
		sl.SetRat(slack)
	}
	worst := 0.0
	for j, m := range mons {
		d := degOf[j]
		exact.SetRat(integral(m))
		r := S[0][j].Sub(S[0][j], exact)
		r.Abs(r)
		scale.SetInt64(int64(1 + d))
		lim.Mul(B[0][j], scale)
		lim.Mul(lim, t)
		lim.Add(lim, sl)
		share := 0.0
		switch {
		case lim.IsZero() && !r.IsZero():
			share = math.Inf(1)
		case !lim.IsZero():
			q.Quo(r, lim)
			share = q.Float64()
		}
		if share > 1 {
			break
		}
		worst = max(worst, share)
		if j+1 == len(mons) || degOf[j+1] != d {
			res.Degree = d
			res.WorstShare = max(res.WorstShare, worst)
		}
	}
	return res, nil
}

// WeightIntegral returns the monomial moments of the weight expression w
// (in the element's coordinates, ParseWeight) through total degree maxDeg
// as an Integral, and their accuracy (the slack for CheckOptions: 10^-(digits+8)
// times the mass): computed from product rules of increasing order until two
// agree (see weightMoments). A weight that is negative or cannot be
// evaluated on the element, or whose moments do not settle, is an error.
func WeightIntegral(ctx context.Context, s Shape, src string, maxDeg, digits int) (Integral, *big.Rat, error) {
	w, err := ParseWeight(src, s)
	if err != nil {
		return nil, nil, err
	}
	if err := checkWeightSign(ctx, s, w); err != nil {
		return nil, nil, err
	}
	bb := newBoxBasis(s, maxDeg)
	d := digits + 12
	prec := precision.DigitsToBits(d) + 32
	phi, mono, _, err := weightMoments(ctx, s, w, bb, d, digits+8, prec)
	if err != nil {
		return nil, nil, err
	}
	slack, _ := new(big.Float).Mul(phi[0], pow10Float(-(digits+8), prec)).Rat(nil)
	index := make(map[string]*big.Rat, len(mono))
	for j, e := range bb.exps {
		index[monomialKey(e)], _ = mono[j].Rat(nil)
	}
	return func(e []int) *big.Rat { return index[monomialKey(e)] }, slack, nil
}
