package design

import (
	"context"
	"errors"
	"math/big"
	"runtime"
	"testing"

	"quadwright/moments"
)

// legendreMoments returns the raw moments of weight 1 on [-1, 1]: 2/(k+1)
// for even k, 0 for odd k (elementary integral).
func legendreMoments(m int, prec uint) []*big.Float {
	mu := make([]*big.Float, m)
	for k := range mu {
		mu[k] = new(big.Float).SetPrec(prec)
		if k%2 == 0 {
			mu[k].SetRat(big.NewRat(2, int64(k+1)))
		}
	}
	return mu
}

// maxPairDiff returns the largest difference between r and ref over the
// first n pairs, relative to |alpha|+sqrt(beta) and beta as pairsAgree
// measures, as a binary exponent (bits of agreement).
func agreeBits(r, ref *Recurrence, n int) int {
	for bits := uint(1); bits < 4000; bits++ {
		if !pairsAgree(r.Prefix(n), ref.Prefix(n), bits) {
			return int(bits) - 1
		}
	}
	return 4000
}

func TestChebyshevAgainstClosedForms(t *testing.T) {
	const prec = 256
	// Reference pairs: the Legendre and Laguerre closed forms of
	// FamilySource (Gautschi 2004, Table 1.1).
	cases := []struct {
		name     string
		src      FamilySource
		mu       func(m int) []*big.Float
		n        int
		wantBits int // tuned: raw moments lose about 2-3.5 bits per moment
	}{
		{"legendre raw", family(t, "legendre", "", "", ""), func(m int) []*big.Float { return legendreMoments(m, 2048) }, 30, 200},
		{"laguerre raw", family(t, "laguerre", "", "", ""), func(m int) []*big.Float {
			// moments k! of e^(-x) on [0, inf) (Gamma function)
			mu := make([]*big.Float, m)
			f := big.NewInt(1)
			for k := range mu {
				if k > 0 {
					f.Mul(f, big.NewInt(int64(k)))
				}
				mu[k] = new(big.Float).SetPrec(4096).SetInt(f)
			}
			return mu
		}, 25, 200},
	}
	for _, c := range cases {
		ref, _ := c.src.Recurrence(c.n, prec)
		mu := c.mu(2 * c.n)
		got, err := chebyshevConverged(func(w uint) (nu, a, b []*big.Float) {
			a, b = basisPairs(moments.MonomialBasis(), 2*c.n-1, w)
			return mu, a, b
		}, c.n, prec)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if bits := agreeBits(got, ref, c.n); bits < c.wantBits {
			t.Errorf("%s: agrees with the closed form to %d bits, want %d", c.name, bits, c.wantBits)
		}
	}
}

func TestModifiedChebyshevLegendreBasis(t *testing.T) {
	// In its own orthogonal basis the weight 1 on [0, 2] has modified
	// moments nu = (2, 0, 0, ...): the algorithm must return the basis
	// pairs (shifted Legendre closed form) to the last bits.
	const n, prec = 50, 192
	iv, _ := moments.ParseInterval("0,2")
	basis := moments.LegendreBasis(iv)
	nu := make([]*big.Float, 2*n)
	for k := range nu {
		nu[k] = new(big.Float).SetPrec(prec)
	}
	nu[0].SetInt64(2)
	a, b := basisPairs(basis, 2*n-1, prec)
	got, err := ModifiedChebyshev(nu, a, b, n, prec)
	if err != nil {
		t.Fatal(err)
	}
	ref, _ := family(t, "legendre", "", "", "0,2").Recurrence(n, prec)
	if bits := agreeBits(got, ref, n); bits < prec-16 {
		t.Errorf("agrees with the Legendre closed form to %d bits, want %d", bits, prec-16)
	}
}

func TestChebyshevRefusesInvalidSequence(t *testing.T) {
	// m = 1, 0, 1, 0, 1/2: beta_1 = m2/m0 = 1 and, for a symmetric
	// sequence, beta_2 = m4/m2 - m2/m0 = -1/2 (worked by hand), so the
	// first non-positive coefficient is beta_2: at most 2 nodes.
	cases := []struct {
		mu    []*big.Rat
		wantK int
	}{
		{[]*big.Rat{big.NewRat(1, 1), big.NewRat(0, 1), big.NewRat(1, 1), big.NewRat(0, 1), big.NewRat(1, 2), big.NewRat(0, 1)}, 2},
		{[]*big.Rat{big.NewRat(-1, 1), big.NewRat(0, 1)}, 0},
		// m2 < m1^2: variance negative, beta_1 < 0 (by hand).
		{[]*big.Rat{big.NewRat(1, 1), big.NewRat(1, 1), big.NewRat(1, 2), big.NewRat(0, 1)}, 1},
		// The moments of the two-point measure delta(x-1) + delta(x+1) fix
		// beta_2 = 0 exactly (by hand): at most 2 nodes.
		{[]*big.Rat{big.NewRat(2, 1), big.NewRat(0, 1), big.NewRat(2, 1), big.NewRat(0, 1), big.NewRat(2, 1), big.NewRat(0, 1)}, 2},
	}
	for _, c := range cases {
		n := len(c.mu) / 2
		_, err := chebyshevConverged(func(w uint) (nu, a, b []*big.Float) {
			nu = make([]*big.Float, len(c.mu))
			for k := range nu {
				nu[k] = new(big.Float).SetPrec(w).SetRat(c.mu[k])
			}
			a, b = basisPairs(moments.MonomialBasis(), 2*n-1, w)
			return nu, a, b
		}, n, 128)
		var se *MomentSequenceError
		if !errors.As(err, &se) || se.K != c.wantK {
			t.Errorf("%v: error %v, want beta_%d <= 0", c.mu, err, c.wantK)
		}
	}
}

// uniformMeasure is sum_i 1/M delta(x - i/M), i = 1..M.
func uniformMeasure(M int, prec uint) (x, c []*big.Float) {
	x = make([]*big.Float, M)
	c = make([]*big.Float, M)
	for i := range x {
		x[i] = new(big.Float).SetPrec(prec).SetRat(big.NewRat(int64(i+1), int64(M)))
		c[i] = new(big.Float).SetPrec(prec).SetRat(big.NewRat(1, int64(M)))
	}
	return x, c
}

func TestLanczosStieltjesChebyshevAgree(t *testing.T) {
	// Three independent routes to the recurrence of a discrete measure:
	// Lanczos (truncated to n rows), Lanczos on the full matrix, Stieltjes,
	// and the Chebyshev algorithm on the exact moments.
	ctx := context.Background()
	const M, n, prec = 60, 20, 256
	x, c := uniformMeasure(M, prec)
	lz, err := Lanczos(ctx, x, c, n, prec)
	if err != nil {
		t.Fatal(err)
	}
	full, _ := Lanczos(ctx, x, c, M, prec)
	st, _ := Stieltjes(ctx, x, c, n, prec)
	mu := make([]*big.Rat, 2*n)
	for k := range mu {
		mu[k] = new(big.Rat)
		for i := 1; i <= M; i++ {
			xi := big.NewRat(int64(i), M)
			p := new(big.Rat).SetInt64(1)
			for j := 0; j < k; j++ {
				p.Mul(p, xi)
			}
			mu[k].Add(mu[k], p.Mul(p, big.NewRat(1, M)))
		}
	}
	ch, err := chebyshevConverged(func(w uint) (nu, a, b []*big.Float) {
		nu = make([]*big.Float, 2*n)
		for k := range nu {
			nu[k] = new(big.Float).SetPrec(w).SetRat(mu[k])
		}
		a, b = basisPairs(moments.MonomialBasis(), 2*n-1, w)
		return nu, a, b
	}, n, prec)
	if err != nil {
		t.Fatal(err)
	}
	for _, o := range []struct {
		name string
		r    *Recurrence
	}{{"full Lanczos", full}, {"Stieltjes", st}, {"Chebyshev", ch}} {
		// tuned: a few ulp times n at 256 bits.
		if bits := agreeBits(lz, o.r, n); bits < prec-20 {
			t.Errorf("truncated Lanczos and %s agree to %d bits only", o.name, bits)
		}
	}
}

func TestLanczosOnGaussRuleGivesItsRecurrence(t *testing.T) {
	// The M-point Gauss-Jacobi rule, as a discrete measure, has the first
	// M pairs of the Jacobi recurrence (exactness through degree 2M-1).
	ctx := context.Background()
	src := family(t, "jacobi", "-0.7", "2.3", "")
	const M, digits = 30, 60
	r := build(t, src, M, digits)
	x := make([]*big.Float, M)
	c := make([]*big.Float, M)
	for i := range x {
		x[i] = new(big.Float).SetPrec(256).SetRat(rat(t, r.Nodes[i]))
		c[i] = new(big.Float).SetPrec(256).SetRat(rat(t, r.Weights[i]))
	}
	got, err := Lanczos(ctx, x, c, M, 256)
	if err != nil {
		t.Fatal(err)
	}
	ref, _ := src.Recurrence(M, 256)
	// 60 printed digits are about 199 bits; tuned margin of 16 bits.
	if bits := agreeBits(got, ref, M); bits < 180 {
		t.Errorf("Lanczos on the Gauss rule agrees with the Jacobi closed form to %d bits", bits)
	}
}

func TestLanczosBandsDoNotChangeTheResult(t *testing.T) {
	// The pipelined bands of Lanczos and the parallel chunks of Stieltjes
	// must give the very bits of a one-core run, and the two agree.
	ctx := context.Background()
	const M, n, prec = 1200, 150, 192
	x, c := uniformMeasure(M, prec)
	old := runtime.GOMAXPROCS(1)
	one, err := Lanczos(ctx, x, c, n, prec)
	st1, _ := Stieltjes(ctx, x, c, n, prec)
	runtime.GOMAXPROCS(3)
	three, err3 := Lanczos(ctx, x, c, n, prec)
	st, _ := Stieltjes(ctx, x, c, n, prec)
	runtime.GOMAXPROCS(old)
	if err != nil || err3 != nil {
		t.Fatal(err, err3)
	}
	for k := 0; k < n; k++ {
		if one.Alpha[k].Cmp(three.Alpha[k]) != 0 || one.Beta[k].Cmp(three.Beta[k]) != 0 {
			t.Fatalf("Lanczos pair %d differs between one band and three", k)
		}
		if st1.Alpha[k].Cmp(st.Alpha[k]) != 0 || st1.Beta[k].Cmp(st.Beta[k]) != 0 {
			t.Fatalf("Stieltjes pair %d differs between one core and three", k)
		}
	}
	// tuned: a few ulp times n at 192 bits; Stieltjes loses a little more.
	if bits := agreeBits(three, st, n); bits < prec-40 {
		t.Errorf("banded Lanczos and Stieltjes agree to %d bits only", bits)
	}
}
