package systems

import (
	"context"
	"fmt"
	"math/big"
	"strings"
	"testing"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

func printAs(v *big.Float, digits int) string {
	if digits == 0 {
		return precision.FormatFloat64(precision.NearestFloat64(v))
	}
	return precision.FormatSig(v, digits)
}

// x^(k/2), k < 20, on [0,1] is, with x = u^2, the Gauss rule of the weight
// 2u on [0,1]: x_i = u_i^2 and the same weights. Reference:
// testdata/gauss_jacobi_2u_n10.txt (mpmath, gen_refs.py).
func TestHalfPowersAreMappedGaussJacobi(t *testing.T) {
	ref := readRefs(t, "gauss_jacobi_2u_n10.txt")[10]
	for i := range ref.x {
		ref.x[i] = new(big.Float).SetPrec(256).Mul(ref.x[i], ref.x[i])
	}
	r, err := build(t, "x^(k/2); k=0..19", "0,1", "1", 30)
	if err != nil {
		t.Fatal(err)
	}
	samePrinted(t, "x^(k/2), N = 10", r.Rule, ref)
	if r.ExactFor != 20 {
		t.Errorf("exact_for %d, want 20", r.ExactFor)
	}
}

// Polynomial systems give the ordinary Gauss rule of the weight, digit for
// digit (the reference is design.Gauss, itself checked against tables).
func TestPolynomialSystemsAreGauss(t *testing.T) {
	for _, c := range []struct {
		weight, iv string
		n          int
	}{
		{"1", "0,1", 5},
		{"exp(-x)", "0,2", 6},
		{"x^-0.5", "0,1", 4},
	} {
		r, err := build(t, fmt.Sprintf("x^k; k=0..%d", 2*c.n-1), c.iv, c.weight, 30)
		if err != nil {
			t.Fatalf("weight %s: %v", c.weight, err)
		}
		in, _ := moments.ParseInterval(c.iv)
		w, _ := moments.NewWeight(c.weight, in, nil)
		g, err := design.Gauss(context.Background(), design.NewExprSource(context.Background(), w), design.Request{Points: c.n, Digits: 30})
		if err != nil {
			t.Fatal(err)
		}
		for i := range g.Nodes {
			if r.Rule.Nodes[i] != g.Nodes[i] || r.Rule.Weights[i] != g.Weights[i] {
				t.Errorf("weight %s, point %d: %s %s, Gauss %s %s", c.weight, i+1, r.Rule.Nodes[i], r.Rule.Weights[i], g.Nodes[i], g.Weights[i])
			}
		}
		if r.Rule.Degree != 2*c.n-1 {
			t.Errorf("weight %s: degree %d, want %d", c.weight, r.Rule.Degree, 2*c.n-1)
		}
	}
}

// e^(-jx), j = 1..12, on [0,inf) is the 6-point Gauss-Legendre rule on
// [0,1] mapped by t = e^-x: x_i = -log t_i, w_i = W_i/t_i. Reference:
// testdata/legendre01_n6.txt (mpmath, gen_refs.py), mapped here.
func TestExponentialsAreMappedLegendre(t *testing.T) {
	ref := readRefs(t, "legendre01_n6.txt")[6]
	m := &refRule{}
	for i := len(ref.x) - 1; i >= 0; i-- {
		lt := precision.Log(ref.x[i])
		m.x = append(m.x, lt.Neg(lt))
		m.w = append(m.w, new(big.Float).SetPrec(256).Quo(ref.w[i], ref.x[i]))
	}
	r, err := build(t, "exp(-k*x); k=1..12", "0,inf", "1", 30)
	if err != nil {
		t.Fatal(err)
	}
	samePrinted(t, "e^-jx, N = 6", r.Rule, m)
}

// The log system x^k, x^k log x, k < N, on [0,1] against our own mpmath
// continuation (testdata/log_system.txt, gen_refs.py): N = 4..8 always,
// up to 16 without -short; float64 mode at N = 6.
func TestLogSystem(t *testing.T) {
	refs := readRefs(t, "log_system.txt")
	top := 16
	if testing.Short() {
		top = 8
	}
	for n := 4; n <= top; n++ {
		if refs[n] == nil {
			t.Fatalf("no reference for N = %d", n)
		}
		r, err := build(t, logList(n), "0,1", "1", 30)
		if err != nil {
			t.Fatalf("N = %d: %v", n, err)
		}
		samePrinted(t, fmt.Sprintf("log system N = %d", n), r.Rule, refs[n])
	}
	r, err := build(t, logList(6), "0,1", "1", 0)
	if err != nil {
		t.Fatal(err)
	}
	samePrinted(t, "log system N = 6, float64", r.Rule, refs[6])
}

// Each refusal is one sentence naming what is wrong.
func TestRefusals(t *testing.T) {
	for _, c := range []struct {
		list, iv, weight, want string
	}{
		{"x^k; k=0..2", "0,1", "1", "odd number"},
		{"1, x, 2*x, x^3", "0,1", "1", "linearly dependent"},
		{"x, x^2", "-1,1", "1", "no generalized Gauss rule"},
		{"1, x", "0,1", "x-0.5", "negative"},
	} {
		_, err := build(t, c.list, c.iv, c.weight, 20)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s with weight %s: error %v, want one saying %q", c.list, c.weight, err, c.want)
		}
		if err != nil && strings.Count(strings.TrimSuffix(err.Error(), "."), ". ") > 0 {
			t.Errorf("%s: more than one sentence: %v", c.list, err)
		}
	}
	if _, err := ParseFunctions("x^k, x^k*log(x)"); err == nil || !strings.Contains(err.Error(), "range clause") {
		t.Errorf("k without a range: %v", err)
	}
}

// Simpson's rule: 1, x, x^2 on the nodes 0, 1/2, 1 of [0,1] have the
// interpolatory weights 1/6, 2/3, 1/6 (handbook formula).
func TestInterpolatorySimpson(t *testing.T) {
	fs, _ := ParseFunctions("x^k; k=0..2")
	iv, _ := moments.ParseInterval("0,1")
	w, _ := moments.NewWeight("1", iv, nil)
	nodes := []*big.Rat{big.NewRat(0, 1), big.NewRat(1, 2), big.NewRat(1, 1)}
	r, err := Interpolatory(context.Background(), Problem{Functions: fs, Weight: w}, nodes, design.Request{Digits: 25})
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"0.1666666666666666666666667", "0.6666666666666666666666667", "0.1666666666666666666666667"}
	for i := range want {
		if r.Rule.Weights[i] != want[i] {
			t.Errorf("weight %d: %s, want %s", i+1, r.Rule.Weights[i], want[i])
		}
	}
	if r.CondGiven < 1 || r.CondOrthonormal < 1 {
		t.Errorf("conditioning %g, %g", r.CondGiven, r.CondOrthonormal)
	}
}

func TestParseFunctionsExpansion(t *testing.T) {
	fs, err := ParseFunctions("x^k, x^k*log(x); k=0..2")
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, f := range fs {
		got = append(got, f.Source)
	}
	want := "x^0, x^0*log(x), x^1, x^1*log(x), x^2, x^2*log(x)"
	if strings.Join(got, ", ") != want {
		t.Errorf("expanded to %s, want %s", strings.Join(got, ", "), want)
	}
	fs, err = ParseFunctions("exp(-k*x)*sinh(x); k=-1..0")
	if err != nil || fs[0].Source != "exp(-(-1)*x)*sinh(x)" {
		t.Errorf("negative k: %v %v", fs, err)
	}
}

func FuzzParseFunctions(f *testing.F) {
	for _, s := range []string{"x^k, x^k*log(x); k=0..7", "exp(-k*x); k=1..12", "1, x", "x^(k/2); k=0..19", "k", "; k=1..2", "x;k=3..1", "1e-5*x^k;k=0..1"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		fs, err := ParseFunctions(s)
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Errorf("error over several lines: %q", err)
			}
			return
		}
		if len(fs) == 0 || len(fs) > MaxFunctions {
			t.Errorf("%q expanded to %d functions", s, len(fs))
		}
		for _, fn := range fs {
			if _, err := moments.ParseExpr(fn.Source, "x"); err != nil {
				t.Errorf("%q: expanded %q does not parse: %v", s, fn.Source, err)
			}
		}
	})
}

func FuzzParseFunctionsReader(f *testing.F) {
	f.Add("x^k; k=0..3 # powers\n\nlog(x)\n")
	f.Add("# nothing\n")
	f.Fuzz(func(t *testing.T, s string) {
		_, _ = ParseFunctionsReader(strings.NewReader(s), "fuzz.txt")
	})
}

// Wider systems: exponentials with rates spread from 1 to 1e4, a weighted
// log system, and a kink named with breaks. Each rule is verified against
// every function inside GeneralizedGauss; here we check that it was built
// with positive weights and nodes inside.
func TestWiderSystems(t *testing.T) {
	if testing.Short() {
		t.Skip("several seconds each")
	}
	for _, c := range []struct {
		list, iv, weight, breaks string
	}{
		{"exp(-10^(4*k/9)*x); k=0..9", "0,inf", "1", ""},
		{"x^k, x^k*log(x); k=0..3", "0,1", "x^-0.5", ""},
		{"x^k, x^k*abs(x-1/3); k=0..2", "0,1", "1", "1/3"},
	} {
		fs, err := ParseFunctions(c.list)
		if err != nil {
			t.Fatal(err)
		}
		in, _ := moments.ParseInterval(c.iv)
		var br []*big.Rat
		if c.breaks != "" {
			r, _ := precision.ParseExact(c.breaks)
			br = append(br, r)
		}
		w, err := moments.NewWeight(c.weight, in, br)
		if err != nil {
			t.Fatal(err)
		}
		r, err := GeneralizedGauss(context.Background(), Problem{Functions: fs, Weight: w}, design.Request{Digits: 20})
		if err != nil {
			t.Errorf("%s: %v", c.list, err)
			continue
		}
		if r.ExactFor != len(fs) || r.Rule.Points() != len(fs)/2 {
			t.Errorf("%s: exact for %d of %d, %d points", c.list, r.ExactFor, len(fs), r.Rule.Points())
		}
		for i, s := range r.Rule.Weights {
			if strings.HasPrefix(s, "-") {
				t.Errorf("%s: weight %d is %s", c.list, i+1, s)
			}
		}
	}
}
