package design

import (
	"context"
	"fmt"
	"math/big"
	"testing"

	"quadwright/precision"
)

// exactNewtonCotes returns the closed Newton-Cotes weights on n equispaced
// nodes of [-1, 1] as exact rationals, by Gauss-Jordan elimination in
// big.Rat on the moment equations sum_i w_i x_i^k = 2/(k+1) (k even), 0
// (k odd), k < n. Exact arithmetic makes the monomial system harmless here;
// the package never uses it.
func exactNewtonCotes(n int) []*big.Rat {
	xs := make([]*big.Rat, n)
	for i := range xs {
		xs[i] = new(big.Rat).Add(big.NewRat(-1, 1), big.NewRat(int64(2*i), int64(n-1)))
	}
	A := make([][]*big.Rat, n)
	for k := range A {
		A[k] = make([]*big.Rat, n+1)
		for i, x := range xs {
			p := big.NewRat(1, 1)
			for j := 0; j < k; j++ {
				p.Mul(p, x)
			}
			A[k][i] = p
		}
		A[k][n] = new(big.Rat)
		if k%2 == 0 {
			A[k][n] = big.NewRat(2, int64(k+1))
		}
	}
	for c := 0; c < n; c++ {
		p := c
		for A[p][c].Sign() == 0 {
			p++
		}
		A[c], A[p] = A[p], A[c]
		for r := 0; r < n; r++ {
			if r == c || A[r][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(A[r][c], A[c][c])
			for k := c; k <= n; k++ {
				A[r][k].Sub(A[r][k], new(big.Rat).Mul(f, A[c][k]))
			}
		}
	}
	w := make([]*big.Rat, n)
	for i := range w {
		w[i] = new(big.Rat).Quo(A[i][n], A[i][i])
	}
	return w
}

// TestNewtonCotesExact checks closed Newton-Cotes weights against exact
// rationals: Simpson (1/3, 4/3, 1/3) and Boole (7, 32, 12, 32, 7)/45 on
// [-1, 1] (Abramowitz and Stegun 25.4.5 and 25.4.14, from memory), and
// N = 2..15 against exactNewtonCotes. Negative weights appear at N = 9
// (common practice; Abramowitz and Stegun 25.4): the exact weights are all
// positive for N <= 8 and N = 10, and some are negative for N = 9 and every
// N >= 11 (so computed here). The verified degree is N-1 for even N and N
// for odd N (symmetry).
func TestNewtonCotesExact(t *testing.T) {
	ctx := context.Background()
	leg := family(t, "legendre", "", "", "")
	fixedTables := map[int][]*big.Rat{
		3: {ratOf(1, 3), ratOf(4, 3), ratOf(1, 3)},
		5: {ratOf(7, 45), ratOf(32, 45), ratOf(12, 45), ratOf(32, 45), ratOf(7, 45)},
	}
	for n := 2; n <= 15; n++ {
		r, err := Preset(ctx, leg, Request{Points: n, Digits: 40}, "newton-cotes")
		if err != nil {
			t.Fatalf("N=%d: %v", n, err)
		}
		exact := exactNewtonCotes(n)
		if tab, ok := fixedTables[n]; ok {
			for i := range tab {
				if tab[i].Cmp(exact[i]) != 0 {
					t.Fatalf("N=%d: the exact solve gives %s, the table %s", n, exact[i].RatString(), tab[i].RatString())
				}
			}
		}
		neg := 0
		for i := range exact {
			if !withinLastPlace(t, r.Weights[i], exact[i]) {
				t.Errorf("N=%d weight %d: %s, exact %s", n, i, r.Weights[i], exact[i].RatString())
			}
			if exact[i].Sign() < 0 {
				neg++
			}
		}
		if r.Stability.NegativeWeights != neg {
			t.Errorf("N=%d: %d negative weights reported, exact count %d", n, r.Stability.NegativeWeights, neg)
		}
		if wantNeg := n == 9 || n >= 11; (neg > 0) != wantNeg {
			t.Errorf("N=%d: %d negative weights", n, neg)
		}
		want := n - 1
		if n%2 == 1 {
			want = n
		}
		if r.Degree != want {
			t.Errorf("N=%d: verified degree %d, want %d", n, r.Degree, want)
		}
	}
}

// TestCosinePresetsClosedForms checks the Clenshaw-Curtis and Fejer rules
// for the weight 1 against the explicit cosine sums (Waldvogel, BIT 46,
// 2006, eqs. 2.1-2.5; from memory), evaluated at 60 digits:
//
//	Clenshaw-Curtis, n = N-1, theta_k = k pi/n:
//	  w_k = c_k/n (1 - sum_{j=1}^{n/2} b_j/(4j^2-1) cos(2j theta_k)), c = 1 at the ends else 2, b_j = 1 for j = n/2 else 2;
//	Fejer 1, theta_k = (2k+1) pi/(2N):  w_k = 2/N (1 - 2 sum_{j=1}^{N/2} cos(2j theta_k)/(4j^2-1));
//	Fejer 2, theta_k = k pi/(N+1):      w_k = 4 sin(theta_k)/(N+1) sum_{j=1}^{ceil(N/2)} sin((2j-1) theta_k)/(2j-1).
func TestCosinePresetsClosedForms(t *testing.T) {
	ctx := context.Background()
	leg := family(t, "legendre", "", "", "")
	const prec = 260
	pi := precision.Pi(prec)
	f := func(v int64) *big.Float { return new(big.Float).SetPrec(prec).SetInt64(v) }
	angle := func(num, den int64) *big.Float {
		a := new(big.Float).SetPrec(prec).Mul(pi, f(num))
		return a.Quo(a, f(den))
	}
	for _, kind := range []string{"clenshaw-curtis", "fejer", "fejer2"} {
		for _, n := range []int{2, 3, 4, 7, 12, 33} {
			r, err := Preset(ctx, leg, Request{Points: n, Digits: 40}, kind)
			if err != nil {
				t.Fatalf("%s N=%d: %v", kind, n, err)
			}
			for k := 0; k < n; k++ {
				var th, w, x *big.Float
				switch kind {
				case "clenshaw-curtis":
					m := int64(n - 1)
					th = angle(int64(k), m)
					s := new(big.Float).SetPrec(prec)
					for j := int64(1); j <= m/2; j++ {
						b := f(2)
						if 2*j == m {
							b = f(1)
						}
						term := precision.Cos(new(big.Float).SetPrec(prec).Mul(th, f(2*j)))
						term.Mul(term, b)
						s.Add(s, term.Quo(term, f(4*j*j-1)))
					}
					c := f(2)
					if k == 0 || k == n-1 {
						c = f(1)
					}
					w = new(big.Float).SetPrec(prec).Sub(f(1), s)
					w.Mul(w, c).Quo(w, f(m))
				case "fejer":
					th = angle(int64(2*k+1), int64(2*n))
					s := new(big.Float).SetPrec(prec)
					for j := int64(1); j <= int64(n/2); j++ {
						term := precision.Cos(new(big.Float).SetPrec(prec).Mul(th, f(2*j)))
						s.Add(s, term.Quo(term, f(4*j*j-1)))
					}
					w = new(big.Float).SetPrec(prec).Sub(f(1), s.Mul(s, f(2)))
					w.Mul(w, f(2)).Quo(w, f(int64(n)))
				default:
					th = angle(int64(k+1), int64(n+1))
					s := new(big.Float).SetPrec(prec)
					for j := int64(1); j <= int64((n+1)/2); j++ {
						term := precision.Sin(new(big.Float).SetPrec(prec).Mul(th, f(2*j-1)))
						s.Add(s, term.Quo(term, f(2*j-1)))
					}
					w = s.Mul(s, precision.Sin(th))
					w.Mul(w, f(4)).Quo(w, f(int64(n+1)))
				}
				x = precision.Cos(th)
				i := n - 1 - k // ascending
				if 2*i+1 == n {
					if r.Nodes[i] != "0" {
						t.Errorf("%s N=%d: middle node %s", kind, n, r.Nodes[i])
					}
				} else {
					checkValue(t, fmt.Sprintf("%s N=%d node %d", kind, n, i), r.Nodes[i], x)
				}
				checkValue(t, fmt.Sprintf("%s N=%d weight %d", kind, n, i), r.Weights[i], w)
			}
			want := n - 1
			if n%2 == 1 {
				want = n
			}
			if r.Degree != want {
				t.Errorf("%s N=%d: verified degree %d, want %d", kind, n, r.Degree, want)
			}
		}
	}
}

// TestInterpolatoryOnGaussNodes gives the printed 40-digit Gauss nodes of
// several measures as prescribed nodes: the interpolatory weights must be
// the Gauss weights (to the 30 printed digits; the given 40-digit nodes are
// printed rounded to 30) and the verified degree must come out as 2N-1, not N-1.
func TestInterpolatoryOnGaussNodes(t *testing.T) {
	ctx := context.Background()
	for _, src := range []FamilySource{family(t, "legendre", "", "", ""), family(t, "jacobi", "-0.7", "2.3", ""), family(t, "laguerre", "1.5", "", ""), family(t, "hermite", "", "", "")} {
		for _, n := range []int{1, 4, 9} {
			g := build(t, src, n, 40)
			nodes := make([]*big.Rat, n)
			for i := range nodes {
				nodes[i] = rat(t, g.Nodes[n-1-i]) // any order is accepted
			}
			r, err := Interpolatory(ctx, src, Request{Digits: 30}, nodes, "interpolatory")
			if err != nil {
				t.Fatalf("%s N=%d: %v", src.Label(), n, err)
			}
			if r.Degree != 2*n-1 {
				t.Errorf("%s N=%d: degree %d, want %d", src.Label(), n, r.Degree, 2*n-1)
			}
			for i := range nodes {
				if !withinLastPlace(t, r.Weights[i], rat(t, g.Weights[i])) {
					t.Errorf("%s N=%d weight %d: %s, Gauss %s", src.Label(), n, i, r.Weights[i], g.Weights[i])
				}
				if g.Nodes[i] != "0" && !withinLastPlace(t, r.Nodes[i], rat(t, g.Nodes[i])) {
					t.Errorf("%s N=%d node %d printed %s, given %s", src.Label(), n, i, r.Nodes[i], g.Nodes[i])
				}
			}
		}
	}
}

// TestOpenNewtonCotesInstability checks that the instability of the open
// Newton-Cotes rules is reported: for N = 9 on [0, 1], weights of both
// signs and sum |w| / |sum w| well above 1 (the exact weights give 30.4).
func TestOpenNewtonCotesInstability(t *testing.T) {
	r, err := Preset(context.Background(), family(t, "legendre", "", "", "0,1"), Request{Points: 9, Digits: 30}, "newton-cotes-open")
	if err != nil {
		t.Fatal(err)
	}
	if r.Stability.NegativeWeights != 4 || r.Stability.Factor < 30 || r.Stability.Factor > 31 || len(r.Notes) == 0 {
		t.Errorf("stability %+v, notes %v", r.Stability, r.Notes)
	}
	if r.Nodes[0] != "0.1" || r.Degree != 9 {
		t.Errorf("nodes %v, degree %d", r.Nodes, r.Degree)
	}
}
