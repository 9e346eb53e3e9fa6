package stability

import (
	"context"
	"math"
	"math/big"
	"strconv"
	"strings"
	"testing"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// legendreFamily is weight 1 on [-1, 1].
func legendreFamily() design.FamilySource {
	f, err := moments.NewFamily("legendre", nil, nil, nil)
	if err != nil {
		panic(err)
	}
	return design.FamilySource{Family: f}
}

func itoa(n int) string { return strconv.Itoa(n) }

func legendreOn(t *testing.T, iv string) design.FamilySource {
	t.Helper()
	var ivp *moments.Interval
	if iv != "" {
		v, err := moments.ParseInterval(iv)
		if err != nil {
			t.Fatal(err)
		}
		ivp = &v
	}
	f, err := moments.NewFamily("legendre", nil, nil, ivp)
	if err != nil {
		t.Fatal(err)
	}
	return design.FamilySource{Family: f}
}

// newtonCotes returns the closed n-point Newton-Cotes rule on [-1, 1] in
// exact rationals: nodes -1 + 2i/(n-1), weights solving sum_i w_i x_i^k =
// integral of x^k over [-1, 1] (2/(k+1) for even k, else 0), k < n, by
// Gaussian elimination on big.Rat (the definition of an interpolatory rule).
func newtonCotes(n int) (x, w []*big.Rat) {
	x = make([]*big.Rat, n)
	for i := range x {
		x[i] = new(big.Rat).Add(big.NewRat(-1, 1), big.NewRat(int64(2*i), int64(n-1)))
	}
	a := make([][]*big.Rat, n) // row k: x_i^k | m_k
	for k := 0; k < n; k++ {
		a[k] = make([]*big.Rat, n+1)
		for i := 0; i < n; i++ {
			p := big.NewRat(1, 1)
			for j := 0; j < k; j++ {
				p.Mul(p, x[i])
			}
			a[k][i] = p
		}
		if k%2 == 0 {
			a[k][n] = big.NewRat(2, int64(k+1))
		} else {
			a[k][n] = new(big.Rat)
		}
	}
	for c := 0; c < n; c++ {
		piv := c
		for a[piv][c].Sign() == 0 {
			piv++
		}
		a[c], a[piv] = a[piv], a[c]
		for r := 0; r < n; r++ {
			if r == c || a[r][c].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Quo(a[r][c], a[c][c])
			for j := c; j <= n; j++ {
				a[r][j].Sub(a[r][j], new(big.Rat).Mul(f, a[c][j]))
			}
		}
	}
	w = make([]*big.Rat, n)
	for i := range w {
		w[i] = new(big.Rat).Quo(a[i][n], a[i][i])
	}
	return x, w
}

func ratStrings(v []*big.Rat, digits int) []string {
	out := make([]string, len(v))
	for i, r := range v {
		if digits == 0 {
			out[i] = r.RatString()
		} else {
			out[i] = precision.FormatSig(new(big.Float).SetPrec(precision.DigitsToBits(digits)+64).SetRat(r), digits)
		}
	}
	return out
}

// TestNewtonCotes11 is the acceptance case of the issue: the closed
// 11-point Newton-Cotes rule has 4 negative weights (Abramowitz and Stegun,
// Handbook of Mathematical Functions, 1964, Table 25.3: the weights of the
// 10-interval rule alternate in sign at the 3rd, 5th, 7th and 9th node... as
// recomputed here exactly), degree 11 (an odd number of points gives one
// degree more than n-1: A&S 25.4.13 ff.), and the stability factor
// sum |w| / 2 computed exactly in the test.
func TestNewtonCotes11(t *testing.T) {
	x, w := newtonCotes(11)
	abs := new(big.Rat)
	for _, v := range w {
		abs.Add(abs, new(big.Rat).Abs(v))
	}
	wantFactor, _ := new(big.Rat).Quo(abs, big.NewRat(2, 1)).Float64()
	// Exact fractions (tested at ExactDigits), and 40-digit decimals.
	for _, digits := range []int{0, 40} {
		r, err := Audit(context.Background(), legendreOn(t, ""), ratStrings(x, digits), ratStrings(w, digits), Options{})
		if err != nil {
			t.Fatal(err)
		}
		if r.NegativeWeights != 4 || r.Degree != 11 || r.DegreeTested != 23 {
			t.Errorf("digits %d: %d negative weights, degree %d tested to %d; want 4, 11, 23", digits, r.NegativeWeights, r.Degree, r.DegreeTested)
		}
		if got := float64(r.StabilityFactor); math.Abs(got-wantFactor) > 1e-15*wantFactor {
			t.Errorf("digits %d: stability factor %v, want %v", digits, got, wantFactor)
		}
		if got, want := float64(r.LostDigits), math.Log10(wantFactor); math.Abs(got-want) > 1e-14 {
			t.Errorf("digits %d: lost digits %v, want %v", digits, got, want)
		}
		if r.NodesOutside != 0 || r.NodesOnBoundary != 2 || math.Abs(float64(r.MinGap)-0.2) > 1e-16 {
			t.Errorf("digits %d: outside %d, boundary %d, gap %v", digits, r.NodesOutside, r.NodesOnBoundary, r.MinGap)
		}
		if r.Float64 == nil || r.Float64.Degree != 11 {
			t.Errorf("digits %d: float64 degree %+v, want 11", digits, r.Float64)
		}
		if r.MostNegativeIndex != 5 && r.MostNegativeIndex != 7 {
			t.Errorf("digits %d: most negative weight at %d", digits, r.MostNegativeIndex)
		}
	}
}

// TestGaussLegendre: a Gauss rule has positive weights (factor 1, no lost
// digits) and degree 2N-1 exactly (Gautschi 2004, Theorem 1.45; common
// practice), also after rounding to float64; the orthonormal Vandermonde
// matrix P_ij = p_j(x_i) of a Gauss rule satisfies P^T W P = I, so its
// condition number is sqrt(max w / min w) (derivation, common practice).
func TestGaussLegendre(t *testing.T) {
	for _, n := range []int{1, 2, 3, 5, 8, 13} {
		for _, iv := range []string{"", "0,2.5"} {
			m := legendreOn(t, iv)
			g, err := design.Gauss(context.Background(), m, design.Request{Points: n, Digits: 30})
			if err != nil {
				t.Fatal(err)
			}
			r, err := Audit(context.Background(), m, g.Nodes, g.Weights, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if r.NegativeWeights != 0 || r.StabilityFactor != 1 || r.LostDigits != 0 || r.Degree != 2*n-1 || r.Float64.Degree != 2*n-1 || r.NodesOutside != 0 {
				t.Errorf("N=%d %q: negative %d factor %v lost %v degree %d float64 %d outside %d", n, iv, r.NegativeWeights, r.StabilityFactor, r.LostDigits, r.Degree, r.Float64.Degree, r.NodesOutside)
			}
			wmin, wmax := math.Inf(1), 0.0
			for _, v := range r.Weights {
				wmin, wmax = math.Min(wmin, v), math.Max(wmax, v)
			}
			want := math.Sqrt(wmax / wmin)
			if got := float64(r.Conditioning.Orthonormal); math.Abs(got-want) > 1e-12*want {
				t.Errorf("N=%d %q: orthonormal condition %v, want %v", n, iv, got, want)
			}
			if n > 2 && !(r.Conditioning.Monomial > r.Conditioning.Orthonormal) {
				t.Errorf("N=%d %q: monomial condition %v not above the orthonormal %v", n, iv, r.Conditioning.Monomial, r.Conditioning.Orthonormal)
			}
		}
	}
}

// TestPerturbedWeight: one weight changed in its 8th significant digit is
// wrong by about 1e-8 relative, far beyond the tolerance of 30-digit data,
// so even constants fail (the issue asks for a degree of at most 1).
func TestPerturbedWeight(t *testing.T) {
	m := legendreOn(t, "")
	g, err := design.Gauss(context.Background(), m, design.Request{Points: 10, Digits: 30})
	if err != nil {
		t.Fatal(err)
	}
	w := append([]string(nil), g.Weights...)
	b := []byte(w[3]) // "0.2692667193099963550912269215695": 8th significant digit at byte 9
	sig := 0
	for i, c := range b {
		if c >= '1' && c <= '9' || sig > 0 && c >= '0' && c <= '9' {
			sig++
			if sig == 8 {
				b[i] = '0' + (b[i]-'0'+1)%10
				break
			}
		}
	}
	w[3] = string(b)
	r, err := Audit(context.Background(), m, g.Nodes, w, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if r.Degree > 1 {
		t.Errorf("perturbed %s -> %s: degree %d, want at most 1", g.Weights[3], w[3], r.Degree)
	}
	// With u = 1e-6 the same rule is again exact to 2N-1.
	r, err = Audit(context.Background(), m, g.Nodes, w, Options{Unit: big.NewRat(1, 1000000), SkipGenz: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.Degree != 19 {
		t.Errorf("with --tolerance 1e-6: degree %d, want 19", r.Degree)
	}
}

// TestOutsideAndErrors covers nodes outside the interval, a measure with a
// bounded recurrence, and values that do not parse.
func TestOutsideAndErrors(t *testing.T) {
	m := legendreOn(t, "0,1")
	// 10 digits, so that u = 1e-9 (one-digit values would give u = 1).
	r, err := Audit(context.Background(), m, []string{"-0.1000000000", "0.5", "1.2"}, []string{"0.3", "0.4", "0.3"}, Options{SkipGenz: true})
	if err != nil {
		t.Fatal(err)
	}
	// Mass 1, but sum w_i (x_i - 1/2) = 0.03: degree 0.
	if r.NodesOutside != 2 || r.Degree != 0 {
		t.Errorf("outside %d degree %d, want 2 and 0", r.NodesOutside, r.Degree)
	}
	if _, err := Audit(context.Background(), m, []string{"0.5", "x"}, []string{"1", "1"}, Options{}); err == nil || !strings.Contains(err.Error(), "node 2") {
		t.Errorf("error %v, want one naming node 2", err)
	}
}

// TestSummarize checks the short report on a built rule.
func TestSummarize(t *testing.T) {
	g, err := design.Gauss(context.Background(), legendreOn(t, ""), design.Request{Points: 4})
	if err != nil {
		t.Fatal(err)
	}
	s, err := Summarize(g)
	if err != nil {
		t.Fatal(err)
	}
	// Gauss-Legendre 4: nodes +-0.3399810435848563, +-0.8611363115940526
	// (Abramowitz and Stegun, Table 25.4), smallest gap between the outer
	// and inner nodes, 0.8611363115940526 - 0.3399810435848563.
	if s.Points != 4 || s.Degree != 7 || s.NegativeWeights != 0 || s.StabilityFactor != 1 || math.Abs(float64(s.MinGap)-0.5211552680091963) > 1e-15 {
		t.Errorf("%+v", s)
	}
	if !strings.Contains(s.TextBlock(), "0 negative weights") {
		t.Errorf("text block %q", s.TextBlock())
	}
}

func FuzzParseRule(f *testing.F) {
	f.Add("0.5", "1/3")
	f.Add("-1e-3", "2")
	f.Add("nan", "1")
	f.Fuzz(func(t *testing.T, x, w string) {
		p, err := parseRule([]string{x, "7"}, []string{w, "1"})
		if err == nil {
			p.summarize(moments.Unit())
		}
	})
}

func TestDegreeCappedAtTwiceThePoints(t *testing.T) {
	// The float64 Gauss-Hermite rule of 80 points passes the test in the
	// orthonormal basis beyond degree 159 (its error on p_160 is of the
	// order 2^-80, far below 10u at 17 digits), but no 80-point rule
	// integrates the square of its node polynomial (degree 160, zero at
	// every node, positive integral): the degree is 159, with a note.
	f, err := moments.NewFamily("hermite", nil, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	m := design.FamilySource{Family: f}
	g, err := design.Gauss(context.Background(), m, design.Request{Points: 80})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Audit(context.Background(), m, g.Nodes, g.Weights, Options{SkipConditioning: true, SkipGenz: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.Degree != 159 || r.DegreeTested != 161 {
		t.Errorf("degree %d tested to %d, want 159 tested to 161", r.Degree, r.DegreeTested)
	}
	if !strings.Contains(strings.Join(r.Notes, " "), "node polynomial") {
		t.Errorf("no note on the cap: %q", r.Notes)
	}
}
