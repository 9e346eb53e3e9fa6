package moments

import (
	"math"
	"math/big"
	"strings"
	"testing"
)

// The error texts below are the contract's: one sentence, the expression
// quoted, the 1-based position of the offending character.
func TestParseExprErrors(t *testing.T) {
	known := "(known: x, pi, e, exp, log, sqrt, abs, sin, cos, tan, atan, sinh, cosh, tanh)"
	cases := []struct{ src, want string }{
		{"x^^2", `weight "x^^2": position 3: expected a number, a name or "(" after "^"`},
		{"foo(x)", `weight "foo(x)": position 1: unknown name "foo" ` + known},
		{"x*Exp(x)", `weight "x*Exp(x)": position 3: unknown name "Exp" ` + known},
		{"", `weight "": the expression is empty`},
		{"   ", `weight "   ": the expression is empty`},
		{"(x+1", `weight "(x+1": position 5: expected ")" to close "(" at position 1, found the end`},
		{"x+1)", `weight "x+1)": position 4: unmatched ")"`},
		{"2x", `weight "2x": position 2: expected an operator or the end after the number "2", found the name "x"`},
		{"2e", `weight "2e": position 2: expected an operator or the end after the number "2", found the name "e"`},
		{"exp x", `weight "exp x": position 5: expected "(" after the function name "exp"`},
		{"x # 2", `weight "x # 2": position 3: unexpected character '#'`},
		{"1.2.3*x", `weight "1.2.3*x": position 1: "1.2.3" is not a number`},
		{"x*", `weight "x*": position 3: expected a number, a name or "(" after "*", found the end`},
		{"sin()", `weight "sin()": position 5: expected a number, a name or "(" after "("`},
		{"x(2)", `weight "x(2)": position 2: expected an operator or the end after the name "x", found "("`},
		{"exp(x", `weight "exp(x": position 6: expected ")" to close "(" at position 4, found the end`},
		{"x^", `weight "x^": position 3: expected a number, a name or "(" after "^", found the end`},
		{"x^-", `weight "x^-": position 4: expected a number, a name or "(" after "-", found the end`},
		{"y+1", `weight "y+1": position 1: unknown name "y" ` + known},
		{"x·2", `weight "x·2": position 2: unexpected character '·'`},
		{"(µ)", `weight "(µ)": position 2: unexpected character 'µ'`},
		{"·+", `weight "·+": position 1: unexpected character '·'`},
	}
	for _, c := range cases {
		_, err := ParseExpr(c.src)
		if err == nil {
			t.Errorf("ParseExpr(%q) succeeded, want error %s", c.src, c.want)
			continue
		}
		if err.Error() != c.want {
			t.Errorf("ParseExpr(%q):\n got %s\nwant %s", c.src, err, c.want)
		}
	}
}

// Values in float64 and at 200 bits. Reference values are exact by hand
// (integer arithmetic) or from the Go math package where marked; tolerances
// are a few float64 ulps (Eval64) and 2^-190 relative (EvalBig, one rounding
// per operation at 200 bits, common practice).
func TestExprValues(t *testing.T) {
	cases := []struct {
		src  string
		x    float64
		want float64
	}{
		{"-x^2", 3, -9},          // unary minus binds looser than ^
		{"x^-0.5", 4, 0.5},       // signed exponent
		{"2^3^2", 0, 512},        // right-associative: 2^9
		{"(2^3)^2", 0, 64},       // parentheses
		{"-2^2", 0, -4},          // -(2^2)
		{"2*-x", 1.5, -3},        // unary minus after an operator
		{"x^2^-1", 9, 3},         // x^(2^-1)
		{"1/3*3", 0, 1},          // exact folding
		{"1e-3*x", 2, 0.002},     // exponent notation
		{"x - 2 - 3", 10, 5},     // left-associative
		{"12/3/2", 0, 2},         // left-associative
		{"+x", 2, 2},             // unary plus
		{"x^3", -2, -8},          // integer power of a negative number
		{"x^-2", -2, 0.25},       // negative integer power
		{"abs(x-0.3)", 0.1, 0.2}, // abs
		{"pi", 0, math.Pi},       // from the Go math package
		{"e", 0, math.E},         // from the Go math package
		{"exp(-x^2)", 1.5, math.Exp(-2.25)},
		{"-log(x)", 0.25, math.Log(4)},
		{"sqrt(x)*(1-x)^0.3", 0.5, math.Sqrt(0.5) * math.Pow(0.5, 0.3)},
		{"sin(x)+cos(x)+tan(x)+atan(x)", 0.7, math.Sin(0.7) + math.Cos(0.7) + math.Tan(0.7) + math.Atan(0.7)},
		{"sinh(x)+cosh(x)+tanh(x)", 0.7, math.Sinh(0.7) + math.Cosh(0.7) + math.Tanh(0.7)},
		{"sinh(x)", 1e-30, 1e-30},
		{"tanh(x)", -1e-20, -1e-20},
	}
	for _, c := range cases {
		e, err := ParseExpr(c.src)
		if err != nil {
			t.Errorf("ParseExpr(%q): %v", c.src, err)
			continue
		}
		if e.String() != c.src {
			t.Errorf("String() = %q, want %q", e.String(), c.src)
		}
		if got := e.Eval64(c.x); math.Abs(got-c.want) > 4e-16*math.Abs(c.want) {
			t.Errorf("%q at %g: Eval64 = %.17g, want %.17g", c.src, c.x, got, c.want)
		}
		xb := new(big.Float).SetPrec(200).SetFloat64(c.x)
		got, err := e.EvalBig(200, xb)
		if err != nil {
			t.Errorf("%q at %g: EvalBig: %v", c.src, c.x, err)
			continue
		}
		if got.Prec() != 200 {
			t.Errorf("%q: EvalBig precision %d, want 200", c.src, got.Prec())
		}
		f, _ := got.Float64()
		if math.Abs(f-c.want) > 4e-16*math.Abs(c.want) {
			t.Errorf("%q at %g: EvalBig = %.17g, want %.17g", c.src, c.x, f, c.want)
		}
	}
}

// Exact results: folding keeps 1/3 a rational, and integer powers are
// products, so these are correctly rounded at any precision.
func TestExprExact(t *testing.T) {
	third := new(big.Float).SetPrec(300).SetRat(big.NewRat(1, 3))
	got, err := MustParseExpr("1/3").EvalBig(300, new(big.Float))
	if err != nil || got.Cmp(third) != 0 {
		t.Errorf("1/3 at 300 bits = %v (%v), want the correctly rounded 1/3", got, err)
	}
	// (1+2^-100)^3 = 1 + 3*2^-100 + 3*2^-200 + 2^-300, exact at 301 bits.
	x := new(big.Float).SetPrec(301).SetMantExp(big.NewFloat(1), -100)
	x.Add(x, big.NewFloat(1))
	want := new(big.Float).SetPrec(301).Mul(x, x)
	want.Mul(want, x)
	got, err = MustParseExpr("x^3").EvalBig(301, x)
	if err != nil || got.Cmp(want) != 0 {
		t.Errorf("x^3 at 1+2^-100 = %v (%v), want the exact cube", got, err)
	}
	got, _ = MustParseExpr("2^3^2").EvalBig(64, new(big.Float))
	if got.Cmp(big.NewFloat(512)) != 0 {
		t.Errorf("2^3^2 = %v, want 512", got)
	}
}

// A value with more bits than prec keeps 1-x exact: the distance to the
// end survives (EvalBig's contract for end singularities).
func TestExprExtendedArgument(t *testing.T) {
	d := new(big.Float).SetPrec(64).SetMantExp(big.NewFloat(1), -500)
	x := new(big.Float).SetPrec(600).Sub(big.NewFloat(1), d) // 1 - 2^-500, exact
	got, err := MustParseExpr("(1-x)^-0.5").EvalBig(128, x)
	if err != nil {
		t.Fatal(err)
	}
	want := new(big.Float).SetPrec(128).SetMantExp(big.NewFloat(1), 250) // 2^250
	diff := new(big.Float).Sub(got, want)
	diff.Quo(diff, want)
	if f, _ := diff.Float64(); math.Abs(f) > 1e-36 {
		t.Errorf("(1-x)^-0.5 at 1-2^-500 = %v, want 2^250 (relative error %g)", got, f)
	}
	// 0.3 - x at x = 0.3 + 2^-300, with 0.3 written in the expression.
	end := new(big.Float).SetPrec(400).SetRat(big.NewRat(3, 10))
	x = new(big.Float).SetPrec(400).Add(end, new(big.Float).SetMantExp(big.NewFloat(1), -300))
	got, _ = MustParseExpr("x-0.3").EvalBig(64, x)
	if got.Cmp(new(big.Float).SetMantExp(big.NewFloat(1), -300)) != 0 {
		t.Errorf("x-0.3 at 0.3+2^-300 = %v, want 2^-300", got)
	}
}

func TestExprEvalErrors(t *testing.T) {
	cases := []struct {
		src  string
		x    float64
		want string
	}{
		{"log(x)", -1, `weight "log(x)": position 1: log of a number <= 0`},
		{"1/x", 0, `weight "1/x": position 2: division by zero`},
		{"sqrt(x)", -1, `weight "sqrt(x)": position 1: square root of a negative number`},
		{"x^0.5", -1, `weight "x^0.5": position 2: a power of a negative number with an exponent that is not an integer`},
		{"x^-1", 0, `weight "x^-1": position 2: 0 to a negative power`},
		{"x^-0.5", 0, `weight "x^-0.5": position 2: 0 to a power <= 0`},
		{"exp(x)", 1e10, `weight "exp(x)": position 1: the value overflows`},
		{"exp(exp(x))", 30, `weight "exp(exp(x))": position 1: the value overflows`},
		{"sinh(x)-cosh(x)", 2e9, `weight "sinh(x)-cosh(x)": position 1: the value overflows`},
	}
	for _, c := range cases {
		e := MustParseExpr(c.src)
		_, err := e.EvalBig(128, new(big.Float).SetFloat64(c.x))
		if err == nil || err.Error() != c.want {
			t.Errorf("%q at %g: error %v, want %s", c.src, c.x, err, c.want)
		}
	}
	// A trigonometric argument beyond 2^4096 is refused rather than reduced.
	x := new(big.Float).SetMantExp(big.NewFloat(1), 5000)
	if _, err := MustParseExpr("sin(x)").EvalBig(64, x); err == nil || !strings.Contains(err.Error(), "beyond 2^4096") {
		t.Errorf("sin(2^5000): error %v, want a refusal", err)
	}
}

func TestParseExprVars(t *testing.T) {
	e, err := ParseExpr("x*y+z", "x", "y", "z")
	if err != nil {
		t.Fatal(err)
	}
	if got := e.Eval64(2, 3, 4); got != 10 {
		t.Errorf("x*y+z at (2,3,4) = %g, want 10", got)
	}
	if _, err := ParseExpr("x*y", "x"); err == nil || !strings.Contains(err.Error(), `unknown name "y" (known: x, pi, e,`) {
		t.Errorf("y in an expression of x: error %v", err)
	}
}

// FuzzParseExpr: ParseExpr never panics, and a parsed expression evaluates
// without panicking, in float64 and at 64 bits, for a few values of x.
func FuzzParseExpr(f *testing.F) {
	for _, s := range []string{"x^^2", "-x^2", "x^-0.5", "2^3^2", "1/3", "exp(-x^2)*abs(x-0.3)", "log(sinh(x))/tan(x)",
		"(1-x)^2.5*x^-0.5", "cosh(x)^1000000", "10^10^10", "0^-1", "1e99999*x", "((((x))))", "e^x*pi", "x/0"} {
		f.Add(s, 0.5)
	}
	f.Fuzz(func(t *testing.T, src string, x float64) {
		e, err := ParseExpr(src)
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Errorf("error with a newline: %q", err)
			}
			return
		}
		for _, v := range []float64{x, 0, -1.5, 0.7, 1e6} {
			e.Eval64(v)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				continue
			}
			e.EvalBig(64, new(big.Float).SetFloat64(v))
		}
	})
}
