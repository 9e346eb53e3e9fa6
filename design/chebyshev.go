package design

import (
	"fmt"
	"math/big"

	"quadwright/precision"
)

// MomentSequenceError reports that a moment sequence is not that of a
// positive measure: beta_K, the first recurrence coefficient that is not
// positive, came out <= 0.
type MomentSequenceError struct {
	K    int        // index of the first beta_k <= 0
	Beta *big.Float // its computed value
}

func (e *MomentSequenceError) Error() string {
	if e.K == 0 {
		return fmt.Sprintf("the moments are not those of a positive measure: the total mass beta_0 = %s is not positive", precision.FormatSig(e.Beta, 6))
	}
	return fmt.Sprintf("the moments are not those of a positive measure: beta_%d = %s <= 0 (with beta_0 the total mass, when beta_k is the first that is <= 0, a Gauss rule with positive weights exists for at most k = %d nodes)", e.K, precision.FormatSig(e.Beta, 6), e.K)
}

// Chebyshev returns the first n recurrence pairs of the measure with raw
// moments mu[l] = integral of x^l, l = 0..2n-1, by the Chebyshev algorithm
// (the modified Chebyshev algorithm in the monomial basis, a_l = b_l = 0;
// see ModifiedChebyshev). mu must hold at least 2n values.
//
// The map from raw moments to recurrence coefficients is ill conditioned
// (the condition grows exponentially with n), so the bits of the result
// that are trustworthy are prec minus that loss; callers that need a
// guarantee compare two precisions (see chebyshevConverged).
func Chebyshev(mu []*big.Float, n int, prec uint) (*Recurrence, error) {
	zero := make([]*big.Float, max(2*n-1, 0))
	for i := range zero {
		zero[i] = new(big.Float)
	}
	return ModifiedChebyshev(mu, zero, zero, n, prec)
}

// ModifiedChebyshev returns the first n recurrence pairs (alpha_k, beta_k),
// k < n, of the positive measure d lambda whose modified moments are
//
//	nu[l] = integral of p_l d lambda,  l = 0..2n-1,
//
// where p_l are the monic polynomials of the basis recurrence
// p_{l+1} = (x - a[l]) p_l - b[l] p_{l-1}, p_0 = 1, p_{-1} = 0. On entry nu
// holds at least 2n values, a and b at least 2n-1 (b[0] is not used); they
// are read, never changed.
//
// This is the modified Chebyshev algorithm (R. A. Sack and A. F. Donovan,
// "An algorithm for Gaussian quadrature given modified moments", Numer.
// Math. 18, 1971/72; J. C. Wheeler, "Modified moments and Gaussian
// quadratures", Rocky Mountain J. Math. 4, 1974; in the form of W.
// Gautschi, Orthogonal Polynomials: Computation and Approximation, Oxford
// 2004, section 2.1.7, Algorithm 2.1): with sigma_{k,l} = integral of
// pi_k p_l,
//
//	sigma_{k,l} = sigma_{k-1,l+1} - (alpha_{k-1} - a_l) sigma_{k-1,l} - beta_{k-1} sigma_{k-2,l} + b_l sigma_{k-1,l-1},
//	alpha_k = a_k + sigma_{k,k+1}/sigma_{k,k} - sigma_{k-1,k}/sigma_{k-1,k-1},  beta_k = sigma_{k,k}/sigma_{k-1,k-1}.
//
// Every operation is rounded to prec bits (toward zero, precision.Real);
// the results are returned at prec bits. How many of those bits are right
// depends on the conditioning of the moment map: for a basis orthogonal
// with respect to a measure close to d lambda only a few bits are lost,
// for raw moments on [0,1] about 3.5 bits per moment. When some beta_k is
// <= 0 the error is a *MomentSequenceError naming the first such k.
func ModifiedChebyshev(nu, a, b []*big.Float, n int, prec uint) (*Recurrence, error) {
	if n < 1 {
		panic("design: ModifiedChebyshev needs n >= 1")
	}
	L := 2 * n
	if len(nu) < L || len(a) < L-1 || len(b) < L-1 {
		panic(fmt.Sprintf("design: ModifiedChebyshev(%d) needs %d moments and %d basis pairs, have %d, %d, %d", n, L, L-1, len(nu), len(a), len(b)))
	}
	ra := precision.NewRealSlice(L-1, prec)
	rb := precision.NewRealSlice(L-1, prec)
	for l := 0; l < L-1; l++ {
		ra[l].SetBig(a[l])
		rb[l].SetBig(b[l])
	}
	s0 := precision.NewRealSlice(L+1, prec) // row k-2 (sigma_{-1} = 0)
	s1 := precision.NewRealSlice(L+1, prec) // row k-1
	s2 := precision.NewRealSlice(L+1, prec) // row k
	for l := 0; l < L; l++ {
		s1[l].SetBig(nu[l])
	}
	al := precision.NewRealSlice(n, prec)
	be := precision.NewRealSlice(n, prec)
	if s1[0].Sign() <= 0 {
		return nil, &MomentSequenceError{K: 0, Beta: s1[0].Big(nil)}
	}
	t, u := precision.NewReal(prec), precision.NewReal(prec)
	al[0].Quo(s1[1], s1[0])
	al[0].Add(al[0], ra[0])
	be[0].Set(s1[0])
	constA := true
	for l := 1; l < L-1; l++ {
		constA = constA && ra[l].Cmp(ra[0]) == 0
	}
	for k := 1; k < n; k++ {
		if constA {
			// a_l = a for every l (an interval's Legendre or Chebyshev
			// basis): t = alpha_{k-1} - a is the same for the whole row.
			t.Sub(al[k-1], ra[0])
			for l := k; l <= L-k-1; l++ {
				u.MulSub(t, s1[l], s1[l+1])     // t sigma_{k-1,l} - sigma_{k-1,l+1}
				u.MulAdd(be[k-1], s0[l], u)     // + beta_{k-1} sigma_{k-2,l}
				s2[l].MulSub(rb[l], s1[l-1], u) // b_l sigma_{k-1,l-1} - (...)
			}
		} else {
			for l := k; l <= L-k-1; l++ {
				t.Sub(al[k-1], ra[l])
				u.Mul(t, s1[l])
				s2[l].Sub(s1[l+1], u)
				u.Mul(be[k-1], s0[l])
				s2[l].Sub(s2[l], u)
				s2[l].MulAdd(rb[l], s1[l-1], s2[l])
			}
		}
		if s2[k].Sign() <= 0 {
			be[k].Quo(s2[k], s1[k-1])
			return nil, &MomentSequenceError{K: k, Beta: be[k].Big(nil)}
		}
		t.Quo(s2[k+1], s2[k])
		u.Quo(s1[k], s1[k-1])
		al[k].Sub(t, u)
		al[k].Add(al[k], ra[k])
		be[k].Quo(s2[k], s1[k-1])
		s0, s1, s2 = s1, s2, s0
	}
	return realsToRecurrence(al, be, prec), nil
}

func realsToRecurrence(al, be []*precision.Real, prec uint) *Recurrence {
	r := &Recurrence{Alpha: make([]*big.Float, len(al)), Beta: make([]*big.Float, len(be))}
	for k := range al {
		r.Alpha[k] = al[k].Big(new(big.Float).SetPrec(prec))
		r.Beta[k] = be[k].Big(new(big.Float).SetPrec(prec))
	}
	return r
}

// maxChebyshevPrec bounds the precision chebyshevConverged tries, so that a
// hopelessly ill-conditioned moment list fails in bounded time.
const maxChebyshevPrec = 1 << 15

// chebyshevConverged runs ModifiedChebyshev at rising precisions w (prec+64,
// then doubling) on the inputs that input(w) returns at w bits, until two
// successive runs agree on every pair to prec+8 bits (relative to the
// pair's scale, see pairsAgree), and returns the more precise one rounded to
// prec bits. The inputs are taken as exact values (input rounds them to w
// bits); the result is then within a few ulp of the pairs those exact
// inputs determine. A *MomentSequenceError is returned only when two
// successive precisions agree that beta_k <= 0 at the same k, or at the
// last precision tried; loss beyond maxChebyshevPrec bits is an error.
func chebyshevConverged(input func(w uint) (nu, a, b []*big.Float), n int, prec uint) (*Recurrence, error) {
	return chebyshevUntil(input, n, prec+64, false, prec+8, prec)
}

// chebyshevUntil runs ModifiedChebyshev on input(w) at w = w0, then at
// w0 + 64 if step, else 2 w0, then at doubling precisions, until two
// successive runs agree on every pair to agree bits, and returns the more
// precise one rounded to prec bits (see chebyshevConverged). With step the
// first two runs go side by side.
func chebyshevUntil(input func(w uint) (nu, a, b []*big.Float), n int, w uint, step bool, agree, prec uint) (*Recurrence, error) {
	run := func(w uint) (*Recurrence, error) {
		nu, a, b := input(w)
		return ModifiedChebyshev(nu, a, b, n, w)
	}
	var prev, cur *Recurrence
	var prevErr, err error
	if step {
		// The first two runs are independent: side by side.
		done := make(chan struct{})
		go func() {
			defer close(done)
			prev, prevErr = run(w)
		}()
		cur, err = run(w + 64)
		<-done
	} else {
		prev, prevErr = run(w)
	}
	for {
		w2 := 2 * w
		if step {
			w2, step = w+64, false
		} else {
			cur, err = run(w2)
		}
		if prevErr != nil && err != nil {
			var e1, e2 *MomentSequenceError
			if asSeq(prevErr, &e1) && asSeq(err, &e2) && e1.K == e2.K {
				return nil, err
			}
		}
		if prevErr == nil && err == nil && pairsAgree(prev, cur, agree) {
			return roundRecurrence(cur, prec), nil
		}
		if w2 >= maxChebyshevPrec {
			if err != nil {
				return nil, err
			}
			return nil, fmt.Errorf("the moments determine the recurrence too poorly: %d recurrence pairs are not stable even at %d bits", n, w2)
		}
		prev, prevErr, w = cur, err, w2
	}
}

func asSeq(err error, out **MomentSequenceError) bool {
	e, ok := err.(*MomentSequenceError)
	if ok {
		*out = e
	}
	return ok
}

// pairsAgree reports whether r1 and r2 agree on every pair to bits bits:
// |beta1 - beta2| <= 2^-bits |beta2| and |alpha1 - alpha2| <= 2^-bits
// (|alpha2| + sqrt(beta2)). The scale of alpha is its own size plus the
// local spacing of the support, so that an alpha that is zero in truth
// (a symmetric measure) does not demand infinite relative accuracy.
func pairsAgree(r1, r2 *Recurrence, bits uint) bool {
	if r1.Len() != r2.Len() {
		return false
	}
	p := max(r2.Alpha[0].Prec(), 64) + 8
	d := new(big.Float).SetPrec(p)
	s := new(big.Float).SetPrec(p)
	for k := 0; k < r2.Len(); k++ {
		d.Sub(r1.Beta[k], r2.Beta[k])
		if !smallRelative(d, r2.Beta[k], bits) {
			return false
		}
		d.Sub(r1.Alpha[k], r2.Alpha[k])
		s.Sqrt(absF(r2.Beta[k]))
		s.Add(s, absF(r2.Alpha[k]))
		if !smallRelative(d, s, bits) {
			return false
		}
	}
	return true
}

func absF(x *big.Float) *big.Float { return new(big.Float).Abs(x) }

// smallRelative reports |d| <= 2^-bits |scale| (by exponents: a factor of
// two of slack, which the callers' margins absorb).
func smallRelative(d, scale *big.Float, bits uint) bool {
	if d.Sign() == 0 {
		return true
	}
	if scale.Sign() == 0 {
		return false
	}
	return d.MantExp(nil) <= scale.MantExp(nil)-int(bits)
}

// roundRecurrence returns a copy of r rounded to prec bits.
func roundRecurrence(r *Recurrence, prec uint) *Recurrence {
	out := &Recurrence{Alpha: make([]*big.Float, r.Len()), Beta: make([]*big.Float, r.Len())}
	for k := range r.Alpha {
		out.Alpha[k] = new(big.Float).SetPrec(prec).Set(r.Alpha[k])
		out.Beta[k] = new(big.Float).SetPrec(prec).Set(r.Beta[k])
	}
	return out
}

// chebyshevPair runs ModifiedChebyshev on the inputs that input(w) returns
// at w bits, first at w1 = bits + 64 and w1 + 64 bits, then at doubling
// precisions, until two successive runs agree on every pair to bits + 8
// bits (pairsAgree), and returns the more precise one rounded to prec bits.
// It is chebyshevConverged for a caller that needs the pairs to bits < prec
// bits only (ExprSource, whose pairs are confirmed to prec - routeSlack
// bits): a well-conditioned map is then settled by two runs 64 bits apart
// instead of runs at prec + 64 and 2 prec + 128 bits. The inputs are taken
// as exact values, as in chebyshevConverged.
func chebyshevPair(input func(w uint) (nu, a, b []*big.Float), n int, bits, prec uint) (*Recurrence, error) {
	return chebyshevUntil(input, n, (bits+64+63)/64*64, true, bits+8, prec)
}
