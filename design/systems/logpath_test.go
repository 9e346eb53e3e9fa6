package systems

import (
	"fmt"
	"math/big"
	"strings"
	"testing"

	"quadwright/moments"
)

// logSystem takes the power path only for weight 1 on [0, c] and exactly
// the functions x^k, x^k log(x), k < N, in any order and spelling.
func TestLogSystemRecognised(t *testing.T) {
	for _, c := range []struct {
		list, iv, weight string
		want             bool
	}{
		{"x^k, x^k*log(x); k=0..5", "0,1", "1", true},
		{"x^k*log(x), x^k; k=0..5", "0,1", "1", true},
		{"1, log(x), x, x*log(x), x^2, log(x) * x^2, x^(3), x^3*log(x)", "0,1", "1", true},
		{"x^k, x^k*log(x); k=0..5", "0,3/2", "1", true},
		{"x^k, x^k*log(x); k=0..5", "0,1", "x^-0.5", false},
		{"x^k, x^k*log(x); k=0..5", "1/2,1", "1", false},
		{"x^k, x^k*log(x); k=1..6", "0,1", "1", false},
		{"x^k, x^k*log(x+1); k=0..5", "0,1", "1", false},
		{"x^k, x^(k+1/2); k=0..5", "0,1", "1", false},
		{"1, x, x, log(x)", "0,1", "1", false},
	} {
		fs, err := ParseFunctions(c.list)
		if err != nil {
			t.Fatal(err)
		}
		in, _ := moments.ParseInterval(c.iv)
		w, err := moments.NewWeight(c.weight, in, nil)
		if err != nil {
			t.Fatal(err)
		}
		if _, _, got := logSystem(Problem{Functions: fs, Weight: w}); got != c.want {
			t.Errorf("%s on [%s], weight %s: recognised %v, want %v", c.list, c.iv, c.weight, got, c.want)
		}
	}
}

// The power path serves the log system in another order and on [0, 2]
// (x = 2t maps the rule: nodes and weights doubled, exact in binary), and
// the rule says so; references as in TestLogSystem.
func TestLogSystemPathOrderAndScale(t *testing.T) {
	refs := readRefs(t, "log_system.txt")
	r, err := build(t, "x^k*log(x), x^k; k=0..5", "0,1", "1", 30)
	if err != nil {
		t.Fatal(err)
	}
	samePrinted(t, "log system N = 6, reordered", r.Rule, refs[6])
	if !strings.Contains(r.Rule.Method, "power-exponent path") {
		t.Errorf("method %q: not the power path", r.Rule.Method)
	}
	r, err = build(t, logList(7), "0,2", "1", 30)
	if err != nil {
		t.Fatal(err)
	}
	two := &refRule{}
	for i := range refs[7].x {
		two.x = append(two.x, new(big.Float).Mul(refs[7].x[i], big.NewFloat(2)))
		two.w = append(two.w, new(big.Float).Mul(refs[7].w[i], big.NewFloat(2)))
	}
	samePrinted(t, "log system N = 7 on [0, 2]", r.Rule, two)
}

// Every point of the power path has a rule: at s = 1/2 the path's
// equations are solved from the Gauss-Legendre rule in steps of 1/8, and the result
// integrates x^a_k and its partner to rounding (moments in closed form,
// as in gen_refs.py).
func TestPowerPathMidway(t *testing.T) {
	n := 5
	x, w, err := legendre01(t.Context(), n)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []float64{0.125, 0.25, 0.375, 0.5} {
		if x, w, err = newtonOn(t.Context(), powerPath{n}, s, x, w, 192, 100, 40); err != nil {
			t.Fatalf("s = %g: %v", s, err)
		}
	}
	F, _, err := powerPath{n}.equations(0.5, x, w, 192, false)
	if err != nil {
		t.Fatal(err)
	}
	for j, f := range F {
		if v, _ := f.Float64(); v > 1e-40 || v < -1e-40 {
			t.Errorf("equation %d: relative residual %g", j, v)
		}
	}
}

// logTerm never panics, and what it accepts reads back as the term it
// names.
func FuzzLogTerm(f *testing.F) {
	for _, s := range []string{"x^3", "x^(12)*log(x)", "log(x)*x", "1", "log(x)", "x^-1", "x^03", "x^(2"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		k, lg, ok := logTerm(s)
		if !ok {
			return
		}
		if k < 0 || k > MaxFunctions || lg < 0 || lg > 1 {
			t.Fatalf("%q: k = %d, log = %d", s, k, lg)
		}
		back := fmt.Sprintf("x^%d", k)
		if lg == 1 {
			back += "*log(x)"
		}
		if k2, lg2, ok2 := logTerm(back); !ok2 || k2 != k || lg2 != lg {
			t.Fatalf("%q read as %q, which reads back as %d, %d, %v", s, back, k2, lg2, ok2)
		}
	})
}
