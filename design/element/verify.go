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
	if len(nodes) != len(weights) {
		panic("element: VerifyPrinted with mismatched nodes and weights")
	}
	dim := s.Dim()
	D := max(1, minDigits)
	xs := make([][]*big.Rat, len(nodes))
	ws := make([]*big.Rat, len(nodes))
	read := func(v string, what string) (*big.Rat, error) {
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
	prec := precision.DigitsToBits(D) + 64
	return checkMonomials(ctx, s, xs, ws, D, maxDeg, prec)
}

// checkMonomials is VerifyPrinted on exact values.
func checkMonomials(ctx context.Context, s Shape, xs [][]*big.Rat, ws []*big.Rat, D, maxDeg int, prec uint) (Exactness, error) {
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
	// A fixed order of the final sums keeps the result independent of
	// scheduling.
	for wk := 1; wk < workers; wk++ {
		for j := range mons {
			S[0][j].Add(S[0][j], S[wk][j])
			B[0][j].Add(B[0][j], B[wk][j])
		}
	}
	tol := new(big.Rat).SetFrac(big.NewInt(10), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D-1)), nil))
	t := precision.NewReal(prec).SetRat(tol)
	res := Exactness{Degree: maxDeg, Tested: maxDeg, Digits: D}
	exact := precision.NewReal(prec)
	lim := precision.NewReal(prec)
	scale := precision.NewReal(prec)
	q := precision.NewReal(prec)
	res.Degree = -1
	worst := 0.0 // over the monomials of the degree being tested
	for j, m := range mons {
		d := degOf[j]
		exact.SetRat(MonomialIntegral(s, m))
		r := S[0][j].Sub(S[0][j], exact)
		r.Abs(r)
		scale.SetInt64(int64(1 + d))
		lim.Mul(B[0][j], scale)
		share := 0.0
		switch {
		case lim.IsZero() && !r.IsZero():
			share = math.Inf(1)
		case !lim.IsZero():
			q.Quo(r, lim)
			q.Quo(q, t)
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
