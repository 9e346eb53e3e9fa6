package design

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"testing"

	"quadwright/precision"
)

// TestChebyshevClosedForms checks the Chebyshev rules against their closed
// forms (Abramowitz and Stegun 25.4.38 and 25.4.40, from memory; common
// practice): first kind x_k = cos((2k-1) pi / (2n)), w_k = pi/n; second kind
// x_k = cos(k pi / (n+1)), w_k = pi/(n+1) sin^2(k pi / (n+1)).
func TestChebyshevClosedForms(t *testing.T) {
	const digits = 45
	prec := precision.DigitsToBits(digits) + 64
	pi := precision.Pi(prec)
	for _, n := range []int{1, 2, 5, 12, 33} {
		r1 := build(t, family(t, "chebyshev1", "", "", ""), n, digits)
		r2 := build(t, family(t, "chebyshev2", "", "", ""), n, digits)
		for k := 1; k <= n; k++ {
			i := n - k // ascending order
			th := new(big.Float).SetPrec(prec).Mul(pi, big.NewFloat(float64(2*k-1)))
			th.Quo(th, big.NewFloat(float64(2*n)))
			x := precision.Cos(th)
			w := new(big.Float).SetPrec(prec).Quo(pi, big.NewFloat(float64(n)))
			checkValue(t, fmt.Sprintf("chebyshev1 N=%d node %d", n, i), r1.Nodes[i], x)
			checkValue(t, fmt.Sprintf("chebyshev1 N=%d weight %d", n, i), r1.Weights[i], w)

			th = new(big.Float).SetPrec(prec).Mul(pi, big.NewFloat(float64(k)))
			th.Quo(th, big.NewFloat(float64(n+1)))
			x = precision.Cos(th)
			s := precision.Sin(th)
			w = new(big.Float).SetPrec(prec).Quo(pi, big.NewFloat(float64(n+1)))
			w.Mul(w, s)
			w.Mul(w, s)
			checkValue(t, fmt.Sprintf("chebyshev2 N=%d node %d", n, i), r2.Nodes[i], x)
			checkValue(t, fmt.Sprintf("chebyshev2 N=%d weight %d", n, i), r2.Weights[i], w)
		}
	}
}

// checkValue requires the printed s to be within one unit of its last place
// of want, except for an exact zero, which must print as 0.
func checkValue(t *testing.T, what, s string, want *big.Float) {
	t.Helper()
	ref, _ := want.Rat(nil)
	if s == "0" {
		if f, _ := want.Float64(); math.Abs(f) > 1e-40 {
			t.Errorf("%s: printed 0, want %s", what, want.Text('g', 20))
		}
		return
	}
	if !withinLastPlace(t, s, ref) {
		t.Errorf("%s: %s, want %s", what, s, want.Text('g', 50))
	}
}

// TestIntervalMap checks the affine map: a Legendre rule on [0, 2.5] has
// weights summing to 2.5 and is exact for x^(2N-1) (integral 2.5^(2N)/(2N)),
// and a Jacobi rule on [1, 3] is the reference rule moved by 2 with the
// same weights (h = 1).
func TestIntervalMap(t *testing.T) {
	r := build(t, family(t, "legendre", "", "", "0,2.5"), 7, 35)
	sum := new(big.Rat)
	mom := new(big.Rat)
	for i := range r.Nodes {
		x, w := rat(t, r.Nodes[i]), rat(t, r.Weights[i])
		sum.Add(sum, w)
		p := new(big.Rat).SetInt64(1)
		for k := 0; k < 13; k++ {
			p.Mul(p, x)
		}
		mom.Add(mom, p.Mul(p, w))
	}
	if d := absDiff(sum, big.NewRat(5, 2)); d > 1e-33 {
		t.Errorf("weights sum to %s", sum.FloatString(40))
	}
	exact := new(big.Rat).SetFrac(new(big.Int).Exp(big.NewInt(5), big.NewInt(14), nil), new(big.Int).Mul(new(big.Int).Exp(big.NewInt(2), big.NewInt(14), nil), big.NewInt(14)))
	if d := absDiff(mom, exact); d > 1e-28 {
		t.Errorf("x^13 integrates to %s, exact %s", mom.FloatString(35), exact.FloatString(35))
	}
	ref := build(t, family(t, "jacobi", "-0.7", "2.3", ""), 6, 30)
	moved := build(t, family(t, "jacobi", "-0.7", "2.3", "1,3"), 6, 30)
	for i := range ref.Nodes {
		x := new(big.Rat).Add(rat(t, ref.Nodes[i]), big.NewRat(2, 1))
		if absDiff(x, rat(t, moved.Nodes[i])) > 1e-29 || ref.Weights[i] != moved.Weights[i] {
			t.Errorf("node %d: reference %s %s, on [1,3] %s %s", i, ref.Nodes[i], ref.Weights[i], moved.Nodes[i], moved.Weights[i])
		}
	}
}

// sweepCases are the families and parameters of the float64-mode sweep.
var sweepCases = [][3]string{
	{"legendre", "", ""}, {"jacobi", "-0.7", "2.3"}, {"jacobi", "0.5", "-0.3"}, {"jacobi", "3", "4.5"},
	{"gegenbauer", "0.75", ""}, {"gegenbauer", "0", ""}, {"chebyshev1", "", ""}, {"chebyshev2", "", ""},
	{"chebyshev3", "", ""}, {"chebyshev4", "", ""}, {"laguerre", "-0.5", ""}, {"laguerre", "1.5", ""},
	{"laguerre", "0", ""}, {"hermite", "", ""},
}

// TestFloat64ModeSweep checks float64 mode (CONTRACT.md): every printed
// value is the float64 nearest to the true value, judged against the same
// rule built at 40 digits (the reference digits decide the rounding unless
// the true value lies within 1e-40 relative of a rounding midpoint, which a
// test would report). Default: N = 1..200 for Legendre, Jacobi(-0.7, 2.3),
// Laguerre(1.5) and Hermite, a spread of N for the others; -tags heavy: all.
func TestFloat64ModeSweep(t *testing.T) {
	for ci, c := range sweepCases {
		src := family(t, c[0], c[1], c[2], "")
		for n := 1; n <= 200; n++ {
			full := ci == 0 || ci == 1 || ci == 11 || ci == 13 || heavy
			if !full && !(n <= 12 || n%23 == 0 || n == 200) {
				continue
			}
			f := build(t, src, n, 0)
			e := build(t, src, n, 40)
			for i := 0; i < n; i++ {
				for _, pair := range [][2]string{{f.Nodes[i], e.Nodes[i]}, {f.Weights[i], e.Weights[i]}} {
					got, err := strconv.ParseFloat(pair[0], 64)
					if err != nil {
						t.Fatal(err)
					}
					want, _ := new(big.Float).SetPrec(200).SetRat(rat(t, pair[1])).Float64()
					if got != want || pair[0] != precision.FormatFloat64(got) {
						t.Errorf("%s N=%d i=%d: float64 mode %s, nearest double to %s is %v", src.Label(), n, i, pair[0], pair[1], want)
					}
				}
			}
		}
	}
}

// TestSturmFallback forces the bisection path and requires it to print the
// same digits as the Newton path from the float64 start.
func TestSturmFallback(t *testing.T) {
	for _, c := range [][3]string{{"jacobi", "-0.7", "2.3"}, {"hermite", "", ""}, {"laguerre", "1.5", ""}, {"legendre", "", ""}} {
		src := family(t, c[0], c[1], c[2], "")
		for _, n := range []int{1, 2, 7, 30} {
			want := build(t, src, n, 30)
			prec := precision.WorkingPrec(30, n)
			rec, _ := src.Recurrence(n, prec)
			forceSturm = true
			s, err := gaussStage(context.Background(), rec, n, prec, nil)
			forceSturm = false
			if err != nil {
				t.Fatalf("%s N=%d: %v", src.Label(), n, err)
			}
			for i := 0; i < n; i++ {
				if precision.FormatSig(s.nodes[i], 30) != want.Nodes[i] || precision.FormatSig(s.weights[i], 30) != want.Weights[i] {
					t.Errorf("%s N=%d i=%d: bisection gives %s %s, Newton %s %s", src.Label(), n, i,
						precision.FormatSig(s.nodes[i], 30), precision.FormatSig(s.weights[i], 30), want.Nodes[i], want.Weights[i])
				}
			}
		}
	}
}

// TestDegreeIsVerified checks that a corrupted rule fails verification: one
// weight changed in its 8th significant digit leaves degree at most 1
// against a 30-digit tolerance.
func TestDegreeIsVerified(t *testing.T) {
	src := family(t, "legendre", "", "", "")
	r := build(t, src, 8, 30)
	w := append([]string(nil), r.Weights...)
	v := rat(t, w[3])
	v.Mul(v, new(big.Rat).SetFrac64(100000001, 100000000))
	w[3] = precision.FormatSig(new(big.Float).SetPrec(200).SetRat(v), 30)
	ex, err := VerifyPrinted(context.Background(), src, r.Nodes, w, 15)
	if err != nil {
		t.Fatal(err)
	}
	if ex.Degree > 1 {
		t.Errorf("corrupted rule verified to degree %d", ex.Degree)
	}
}
