package moments

import (
	"context"
	"math/big"
	"testing"

	"quadwright/precision"
)

// Strong end singularities at both ends of [0, 1] and at the nonzero end
// -1: the integral of x^(k-0.9) (1-x)^-0.9 is B(k+0.1, 0.1) (Abramowitz and
// Stegun 6.2.2), and that of (1+x)^-0.9 x^k over [-1, 1] is, with s = 1+x,
// the sum over j of C(k,j) (-1)^(k-j) 2^(j+0.1)/(j+0.1) (exact binomial
// expansion, evaluated at 400 bits).
func TestMomentsStrongSingularities(t *testing.T) {
	const n, digits = 8, 40
	w := mustWeight(t, "x^-0.9*(1-x)^-0.9", "0,1")
	m, est, err := w.Moments(context.Background(), n, MonomialBasis(), digits)
	if err != nil {
		t.Fatal(err)
	}
	tenth := big.NewRat(1, 10)
	ref := func(k int) *big.Float {
		a := new(big.Rat).Add(big.NewRat(int64(k), 1), tenth)
		r := new(big.Float).SetPrec(testPrec).Mul(gammaRat(a), gammaRat(tenth))
		return r.Quo(r, gammaRat(new(big.Rat).Add(a, tenth)))
	}
	checkMoments(t, "x^-0.9*(1-x)^-0.9", m, est, ref, ref, digits)

	w = mustWeight(t, "(1+x)^-0.9", "-1,1")
	m, est, err = w.Moments(context.Background(), n, MonomialBasis(), digits)
	if err != nil {
		t.Fatal(err)
	}
	two := new(big.Float).SetPrec(testPrec).SetInt64(2)
	ref = func(k int) *big.Float {
		s := new(big.Float).SetPrec(testPrec)
		binom := big.NewInt(1)
		for j := 0; j <= k; j++ {
			e := new(big.Float).SetPrec(testPrec).SetRat(new(big.Rat).Add(big.NewRat(int64(j), 1), tenth))
			term := precision.Pow(two, e)
			term.Quo(term, e)
			term.Mul(term, new(big.Float).SetInt(binom))
			if (k-j)%2 == 1 {
				term.Neg(term)
			}
			s.Add(s, term)
			binom.Mul(binom, big.NewInt(int64(k-j)))
			binom.Quo(binom, big.NewInt(int64(j+1)))
		}
		return s
	}
	// The scale: the integral of |x|^k (1+x)^-0.9 is at most that of
	// (1+x)^-0.9, 2^0.1/0.1.
	scale := func(int) *big.Float {
		r := precision.Pow(two, new(big.Float).SetPrec(testPrec).SetRat(tenth))
		return r.Quo(r, new(big.Float).SetPrec(testPrec).SetRat(tenth))
	}
	checkMoments(t, "(1+x)^-0.9", m, est, ref, scale, digits)
}

// An interior singularity named by a break, at a point (0.3) that binary
// cannot represent: the integral of |x-0.3|^-0.5 over [0, 1] is
// 2 (sqrt(0.3) + sqrt(0.7)) (elementary).
func TestMomentsSingularBreak(t *testing.T) {
	w := mustWeight(t, "abs(x-0.3)^-0.5", "0,1", big.NewRat(3, 10))
	m, est, err := w.Moments(context.Background(), 1, MonomialBasis(), 40)
	if err != nil {
		t.Fatal(err)
	}
	want := new(big.Float).Add(precision.Sqrt(new(big.Float).SetPrec(testPrec).SetRat(big.NewRat(3, 10))),
		precision.Sqrt(new(big.Float).SetPrec(testPrec).SetRat(big.NewRat(7, 10))))
	want.Mul(want, big.NewFloat(2))
	ref := func(int) *big.Float { return want }
	checkMoments(t, "abs(x-0.3)^-0.5", m, est, ref, ref, 40)
}

// A jump at 0.3 that no break names: the weight 1 + (x-0.3)/|x-0.3| is 0
// below 0.3 and 2 above, with moments 2 (1 - 0.3^(k+1))/(k+1).
func TestMomentsJump(t *testing.T) {
	w := mustWeight(t, "1+(x-0.3)/abs(x-0.3)", "0,1")
	m, est, err := w.Moments(context.Background(), 6, MonomialBasis(), 30)
	if err != nil {
		t.Fatal(err)
	}
	ref := func(k int) *big.Float {
		r := new(big.Rat).Sub(big.NewRat(1, 1), ratPowInt(big.NewRat(3, 10), int64(k)+1))
		r.Mul(r, big.NewRat(2, int64(k)+1))
		return new(big.Float).SetPrec(testPrec).SetRat(r)
	}
	checkMoments(t, "jump", m, est, ref, ref, 30)
}

// The cached nodes are the same whichever order they are asked for in.
func TestDeNodesCache(t *testing.T) {
	a := deNodes(expSinhR, 256, 3, true, 5)
	b := deNodes(expSinhR, 256, 3, true, 9)
	for i := range a {
		if a[i].d.Cmp(b[i].d) != 0 || a[i].wt.Cmp(b[i].wt) != 0 {
			t.Fatalf("node %d changed when the list grew", i)
		}
	}
	// Mirror: tanh-sinh level 0, t = -h0 is t = +h0.
	p, n := deNodes(tanhSinh, 256, 0, false, 2), deNodes(tanhSinh, 256, 0, true, 1)
	if p[1].d.Cmp(n[0].d) != 0 {
		t.Errorf("tanh-sinh nodes at +h0 and -h0 differ")
	}
}

// A singularity at the end 1 as strong as one at 0: the integral of
// (1-x)^-0.99 x^k over [0, 1] is B(k+1, 0.01) (Abramowitz and Stegun 6.2.2);
// its nodes lie as close as 10^-4000 to 1.
func TestMomentsStrongNonzeroEnd(t *testing.T) {
	w := mustWeight(t, "(1-x)^-0.99", "0,1")
	m, est, err := w.Moments(context.Background(), 4, MonomialBasis(), 40)
	if err != nil {
		t.Fatal(err)
	}
	b1 := big.NewRat(1, 100)
	ref := func(k int) *big.Float {
		a := big.NewRat(int64(k)+1, 1)
		r := new(big.Float).SetPrec(testPrec).Mul(gammaRat(a), gammaRat(b1))
		return r.Quo(r, gammaRat(new(big.Rat).Add(a, b1)))
	}
	checkMoments(t, "(1-x)^-0.99", m, est, ref, ref, 40)
}
