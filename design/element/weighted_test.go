package element

import (
	"context"
	"math/big"
	"strings"
	"testing"

	"quadwright/precision"
)

// checkWeightedRule tests r independently of the moments Weighted used:
// positive weights, nodes in the open element, at most C(D+dim, dim)
// points, and every monomial through the degree against integral, with
// the contract's tolerance.
func checkWeightedRule(t *testing.T, r *Rule, integral Integral) {
	t.Helper()
	if r.Degree < r.Requested {
		t.Errorf("%s degree %d: verified degree %d", r.Shape, r.Requested, r.Degree)
	}
	if len(r.Nodes) > newBoxBasis(r.Shape, r.Requested).size() {
		t.Errorf("%s degree %d: %d points, more than dim P_D", r.Shape, r.Requested, len(r.Nodes))
	}
	for i, w := range r.Weights {
		v, _ := precision.ParseExact(w)
		p := make([]*big.Rat, len(r.Nodes[i]))
		for k, c := range r.Nodes[i] {
			p[k], _ = precision.ParseExact(c)
		}
		if v.Sign() <= 0 || !r.Shape.Contains(p, true) {
			t.Errorf("%s degree %d: node %d %v weight %s not positive and interior", r.Shape, r.Requested, i+1, r.Nodes[i], w)
		}
	}
	minDigits := r.Digits
	if minDigits == 0 {
		minDigits = 17
	}
	ex, err := VerifyAgainst(context.Background(), r.Shape, r.Nodes, r.Weights, CheckOptions{MaxDegree: r.Requested, MinDigits: minDigits, Integral: integral})
	if err != nil || ex.Degree < r.Requested {
		t.Errorf("%s degree %d: independent check gives degree %d (%v)", r.Shape, r.Requested, ex.Degree, err)
	}
}

// shifted returns the Integral of x_k^(e_k+1) times the others over s: the
// moments of the weight x_k (exact rationals, MonomialIntegral), plus
// those of weight 1 when plusOne (weight 1 + x_k).
func shifted(s Shape, k int, plusOne bool) Integral {
	return func(e []int) *big.Rat {
		f := append([]int(nil), e...)
		f[k]++
		r := MonomialIntegral(s, f)
		if plusOne {
			r.Add(r, MonomialIntegral(s, e))
		}
		return r
	}
}

func TestWeightedPolynomialExact(t *testing.T) {
	// A polynomial weight times a monomial is a sum of monomials, so the
	// weight's moments are exact rationals: on the triangle x * x^a y^b
	// integrates to (a+1)! b! / (a+b+3)! (Dirichlet; Stroud 1971, 7.1).
	for _, c := range []struct {
		s       Shape
		w       string
		k       int
		plusOne bool
		deg     []int
		digits  int
	}{
		{Triangle, "x", 0, false, []int{0, 1, 2, 3, 5, 8}, 0},
		{Triangle, "x", 0, false, []int{4, 7}, 32},
		{Quadrilateral, "1+x", 0, true, []int{1, 3, 5, 6}, 0},
		{Quadrilateral, "1 + y", 1, true, []int{5}, 25},
		{Tetrahedron, "x", 0, false, []int{2, 4}, 0},
		{Hexahedron, "1+z", 2, true, []int{1, 3}, 20},
		{Prism, "1+z", 2, true, []int{3}, 0},
		{Pyramid, "z", 2, false, []int{3}, 0},
		{Line, "1+x", 0, true, []int{5}, 30},
	} {
		for _, d := range c.deg {
			r, err := Build(context.Background(), Request{Shape: c.s, Degree: d, Digits: c.digits, Weight: c.w})
			if err != nil {
				t.Errorf("%s weight %s degree %d: %v", c.s, c.w, d, err)
				continue
			}
			checkWeightedRule(t, r, shifted(c.s, c.k, c.plusOne))
			if r.Kind != "weighted" || r.Weight != c.w {
				t.Errorf("%s weight %s: kind %q weight %q", c.s, c.w, r.Kind, r.Weight)
			}
		}
	}
}

// expMoments returns E_a = integral over [-1,1] of x^a e^x for a = 0..n at
// prec bits, by parts: E_a = e - (-1)^a / e - a E_(a-1), E_0 = e - 1/e
// (common practice; the recurrence loses about log2(n!) bits, far less
// than the 256 bits of margin used here).
func expMoments(n int, prec uint) []*big.Float {
	e := precision.Exp(new(big.Float).SetPrec(prec).SetInt64(1))
	ie := new(big.Float).SetPrec(prec).Quo(big.NewFloat(1), e)
	out := make([]*big.Float, n+1)
	out[0] = new(big.Float).SetPrec(prec).Sub(e, ie)
	for a := 1; a <= n; a++ {
		v := new(big.Float).SetPrec(prec).Set(e)
		if a%2 == 0 {
			v.Sub(v, ie)
		} else {
			v.Add(v, ie)
		}
		t := new(big.Float).SetPrec(prec).Mul(big.NewFloat(float64(a)), out[a-1])
		out[a] = v.Sub(v, t)
	}
	return out
}

func TestWeightedSeparableExp(t *testing.T) {
	// exp(x) exp(y) on [-1,1]^2: moments E_a E_b from the closed form
	// above, independent of the product rules Weighted samples with.
	E := expMoments(12, 600)
	integral := func(e []int) *big.Rat {
		v := new(big.Float).SetPrec(600).Mul(E[e[0]], E[e[1]])
		r, _ := v.Rat(nil)
		return r
	}
	for _, c := range []struct{ deg, digits int }{{4, 0}, {7, 30}} {
		r, err := Build(context.Background(), Request{Shape: Quadrilateral, Degree: c.deg, Digits: c.digits, Weight: "exp(x)*exp(y)"})
		if err != nil {
			t.Fatalf("degree %d: %v", c.deg, err)
		}
		checkWeightedRule(t, r, integral)
	}
}

// sqrtTable returns the moment table of sqrt(1+x) on the quadrilateral
// through total degree deg, each moment written to digits digits: the
// integral of x^a sqrt(1+x) over [-1,1] is, with t = 1+x,
// sum_k C(a,k) (-1)^(a-k) 2^(k+3/2) / (k+3/2) (binomial expansion, common
// practice), and y^b integrates to L(b).
func sqrtTable(t *testing.T, deg, digits int) *MomentTable {
	const prec = 400
	s2 := precision.Sqrt(new(big.Float).SetPrec(prec).SetInt64(2))
	var b strings.Builder
	for d := 0; d <= deg; d++ {
		for _, e := range monomials(2, d) {
			sum := new(big.Rat)
			for k := 0; k <= e[0]; k++ {
				c := new(big.Rat).SetInt(new(big.Int).Binomial(int64(e[0]), int64(k)))
				if (e[0]-k)%2 == 1 {
					c.Neg(c)
				}
				c.Mul(c, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(2), uint(k)))) // 2^(k+1)
				c.Quo(c, big.NewRat(int64(2*k+3), 2))
				sum.Add(sum, c)
			}
			sum.Mul(sum, lineMonomial(e[1]))
			v := new(big.Float).SetPrec(prec).SetRat(sum)
			v.Mul(v, s2) // 2^(k+3/2) = 2^(k+1) sqrt(2)
			b.WriteString(monomialKey(e) + " " + precision.FormatSig(v, digits) + "\n")
		}
	}
	tab, err := ParseMomentTable(strings.NewReader(b.String()), "sqrt.txt", 2)
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

func TestWeightedMomentTable(t *testing.T) {
	ctx := context.Background()
	// Exact p/q moments of the radius weight x on the triangle give the
	// same verification as the expression.
	var b strings.Builder
	for d := 0; d <= 5; d++ {
		for _, e := range monomials(2, d) {
			b.WriteString(monomialKey(e) + " " + shifted(Triangle, 0, false)(e).RatString() + "  # x^a y^b x\n")
		}
	}
	tab, err := ParseMomentTable(strings.NewReader("# radius weight\n"+b.String()), "radius.txt", 2)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Build(ctx, Request{Shape: Triangle, Degree: 5, Digits: 40, Moments: tab})
	if err != nil {
		t.Fatal(err)
	}
	checkWeightedRule(t, r, shifted(Triangle, 0, false))
	if r.Weight != "moments(radius.txt)" {
		t.Errorf("weight %q", r.Weight)
	}

	// sqrt(1+x) has a branch point on the boundary: as an expression its
	// moments never settle, and the error suggests a table; given as a
	// 40-digit table, a 25-digit rule is built and verified.
	_, err = Build(ctx, Request{Shape: Line, Degree: 2, Weight: "sqrt(1+x)"})
	if err == nil || !strings.Contains(err.Error(), "--moments") {
		t.Errorf("sqrt(1+x) on the line: %v, want a suggestion of --moments", err)
	}
	tab = sqrtTable(t, 6, 40)
	r, err = Build(ctx, Request{Shape: Quadrilateral, Degree: 6, Digits: 25, Moments: tab})
	if err != nil {
		t.Fatal(err)
	}
	checkWeightedRule(t, r, tab.Integral())
	// More digits than the moments carry: an error giving both numbers.
	_, err = Build(ctx, Request{Shape: Quadrilateral, Degree: 6, Digits: 45, Moments: tab})
	if err == nil || !strings.Contains(err.Error(), "--digits 45") || !strings.Contains(err.Error(), "40") {
		t.Errorf("45 digits from 40-digit moments: %v", err)
	}
	_, err = Build(ctx, Request{Shape: Quadrilateral, Degree: 6, Moments: sqrtTable(t, 6, 12)})
	if err == nil || !strings.Contains(err.Error(), "float64 mode needs 17") || !strings.Contains(err.Error(), "12") {
		t.Errorf("float64 mode from 12-digit moments: %v", err)
	}
}

func TestWeightedBadInput(t *testing.T) {
	ctx := context.Background()
	tab, _ := ParseMomentTable(strings.NewReader("0 0 1\n1 0 0\n"), "t.txt", 2)
	for _, c := range []struct {
		req  Request
		want string
	}{
		{Request{Shape: Quadrilateral, Degree: 2, Weight: "x"}, "is negative at"},
		{Request{Shape: Triangle, Degree: 2, Weight: "x*z"}, "position 3"},
		{Request{Shape: Triangle, Degree: 2, Weight: "log(x-0.5)"}, "cannot be evaluated"},
		{Request{Shape: Triangle, Degree: 2, Weight: "0*x"}, "vanishes"},
		{Request{Shape: Triangle, Degree: 31, Weight: "x"}, "--degree 31"},
		{Request{Shape: Triangle, Degree: 2, Weight: "x", Product: true}, "--product"},
		{Request{Shape: Triangle, Degree: 2, Weight: "x", Moments: tab}, "choose one"},
		{Request{Shape: Triangle, Degree: 2, Moments: tab}, "x^0 y^1"},
	} {
		_, err := Build(ctx, c.req)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%+v: error %v, want one naming %q", c.req, err, c.want)
		}
	}
}

func TestParseMomentTable(t *testing.T) {
	good := "# moments\n0 0 1/2\n1,0, 0.166666666666666666667\n0\t1 1/6 # y\n\n"
	tab, err := ParseMomentTable(strings.NewReader(good), "m.txt", 2)
	if err != nil {
		t.Fatal(err)
	}
	m, d0, err := tab.Needed(1)
	if err != nil || d0 != 21 || len(m) != 3 || m[0].Cmp(big.NewRat(1, 2)) != 0 {
		t.Errorf("Needed(1) = %v, %d, %v", m, d0, err)
	}
	if tab.Covers() != 1 {
		t.Errorf("Covers = %d", tab.Covers())
	}
	if _, _, err := tab.Needed(2); err == nil || !strings.Contains(err.Error(), "x^2 y^0") {
		t.Errorf("Needed(2): %v, want the first missing exponent x^2 y^0", err)
	}
	for _, c := range []struct {
		text, want string
	}{
		{"0 0 1\n1 0\n", "line 2: expected 2 exponents and a value, found 2 fields"},
		{"0 0 1\n0 0 2\n", "line 2: the moment of x^0 y^0 is given again (first on line 1)"},
		{"0 -1 1\n", "line 1: exponent \"-1\""},
		{"0 a 1\n", "line 1: exponent \"a\""},
		{"0 0 1.2.3\n", "line 1: number \"1.2.3\""},
		{"# nothing\n", "holds no moment"},
	} {
		_, err := ParseMomentTable(strings.NewReader(c.text), "m.txt", 2)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "--moments m.txt") {
			t.Errorf("%q: %v, want %q", c.text, err, c.want)
		}
	}
}

func FuzzParseMomentTable(f *testing.F) {
	for _, s := range []string{"0 0 1/2\n1 0 1/6\n", "0 0 0 1/6 # tet\n", "1,2,3e-4\n", "0 0 1e999999\n", "00 0 -0\n"} {
		f.Add(s, 2)
		f.Add(s, 3)
	}
	f.Fuzz(func(t *testing.T, text string, dim int) {
		if dim < 1 || dim > 3 {
			return
		}
		tab, err := ParseMomentTable(strings.NewReader(text), "f.txt", dim)
		if err != nil {
			if strings.Count(err.Error(), "\n") != 0 {
				t.Errorf("multi-line error %q", err)
			}
			return
		}
		if c := tab.Covers(); c >= 0 {
			if _, _, err := tab.Needed(min(c, 4)); err != nil {
				t.Errorf("Covers %d but Needed fails: %v", c, err)
			}
		}
	})
}

func TestCheckWeightSign(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		s    Shape
		w    string
		want string // "" for accepted
	}{
		{Triangle, "1-x-y", ""},            // zero on the hypotenuse
		{Triangle, "-log(x)", ""},          // singular on the edge x = 0, 0 at (1,0)
		{Triangle, "1/sqrt(x+y)", ""},      // singular at a vertex
		{Triangle, "x-0.001", "negative"},  // negative on a strip no product node may reach
		{Tetrahedron, "z-x*y", "negative"}, // negative on the face z = 0
		{Quadrilateral, "sqrt(x)", "cannot be evaluated"},
		{Pyramid, "1-z", ""},
	} {
		w, err := ParseWeight(c.w, c.s)
		if err != nil {
			t.Fatal(err)
		}
		err = checkWeightSign(ctx, c.s, w)
		if (c.want == "") != (err == nil) || (err != nil && !strings.Contains(err.Error(), c.want)) {
			t.Errorf("%s %s: %v, want %q", c.s, c.w, err, c.want)
		}
	}
}

func TestWeightedScaleFree(t *testing.T) {
	// A tiny constant factor changes nothing but the weights' scale: the
	// rule for 1e-30 x is the rule for x with weights 1e-30 times theirs,
	// and is verified against the moments of 1e-30 x.
	r, err := Build(context.Background(), Request{Shape: Triangle, Degree: 4, Digits: 20, Weight: "1e-30*x"})
	if err != nil {
		t.Fatal(err)
	}
	scaled := func(e []int) *big.Rat {
		v := shifted(Triangle, 0, false)(e)
		return v.Mul(v, big.NewRat(1, 1).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(30), nil)))
	}
	checkWeightedRule(t, r, scaled)
}
