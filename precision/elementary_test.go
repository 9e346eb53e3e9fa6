package precision

import (
	"fmt"
	"math"
	"math/big"
	"testing"
)

// TestElementaryReference checks Exp, Log, Pow, Sqrt, Sin, Cos and Atan at
// 50, 200 and 1000 digits against mpmath (see consts_test.go): the
// arguments are the exact binary values mpmath used, and every result must
// be within 1 ulp (Sqrt: correctly rounded, within 1/2 ulp).
func TestElementaryReference(t *testing.T) {
	funcs := map[string]func(*big.Float) *big.Float{
		"exp": Exp, "log": Log, "sqrt": Sqrt, "sin": Sin, "cos": Cos, "atan": Atan,
	}
	ref := mustReference(t)
	if len(ref.Elementary) == 0 {
		t.Fatal("no elementary reference values")
	}
	for _, e := range ref.Elementary {
		name := fmt.Sprintf("%s(%s)@%d", e.Func, e.Arg, e.Digits)
		if DigitsToBits(e.Digits) != e.Bits {
			t.Fatalf("%s: DigitsToBits(%d) = %d, generator used %d", name, e.Digits, DigitsToBits(e.Digits), e.Bits)
		}
		x := e.X.float(t, e.Bits)
		var got *big.Float
		if e.Func == "pow" {
			got = Pow(x, e.Y.float(t, e.Bits))
		} else {
			got = funcs[e.Func](x)
		}
		if got.Prec() != e.Bits {
			t.Errorf("%s: result at %d bits, want %d", name, got.Prec(), e.Bits)
		}
		limit := 1.0
		if e.Func == "sqrt" {
			limit = 0.5
		}
		if u := ulps(t, got, e.Value); u > limit {
			t.Errorf("%s = %s, %.3g ulp from mpmath %s", name, got.Text('g', 30), u, e.Value[:30])
		}
	}
}

func TestElementaryExact(t *testing.T) {
	f := func(v float64) *big.Float { return new(big.Float).SetPrec(100).SetFloat64(v) }
	for _, c := range []struct {
		name string
		got  *big.Float
		want float64
	}{
		// Identities (common practice).
		{"exp(0)", Exp(f(0)), 1},
		{"log(1)", Log(f(1)), 0},
		{"sqrt(0)", Sqrt(f(0)), 0},
		{"sqrt(2^-2000)", Sqrt(new(big.Float).SetMantExp(f(1), -2000)), 0x1p-1000},
		{"sqrt(1/4)", Sqrt(f(0.25)), 0.5},
		{"sin(0)", Sin(f(0)), 0},
		{"cos(0)", Cos(f(0)), 1},
		{"atan(0)", Atan(f(0)), 0},
		{"pow(2,10)", Pow(f(2), f(10)), 1024},
		{"pow(4,0.5)", Pow(f(4), f(0.5)), 2},
		{"pow(3,0)", Pow(f(3), f(0)), 1},
		{"exp(-2e9)", Exp(f(-2e9)), 0},
	} {
		if c.got.Cmp(big.NewFloat(c.want)) != 0 {
			t.Errorf("%s = %s, want %g", c.name, c.got.Text('g', 40), c.want)
		}
	}
	if e := Exp(f(2e9)); !e.IsInf() {
		t.Errorf("exp(2e9) = %s, want +Inf", e.Text('g', 10))
	}
	if a := Atan(new(big.Float).SetPrec(100).SetInf(true)); a.Cmp(new(big.Float).SetMantExp(Pi(100), -1).Neg(new(big.Float).SetMantExp(Pi(100), -1))) != 0 {
		t.Errorf("atan(-Inf) = %s, want -pi/2", a.Text('g', 30))
	}
}

// TestSqrtCorrectRounding compares Sqrt at 53 bits with the float64 square
// root, which IEEE 754 defines as correctly rounded.
func TestSqrtCorrectRounding(t *testing.T) {
	for _, v := range []float64{2, 3, 5, 0.1, 1e-300, 1e300, 123456789, 0x1.fffffffffffffp0, 5e-324} {
		got, _ := Sqrt(new(big.Float).SetFloat64(v).SetPrec(53)).Float64()
		want := math.Sqrt(v)
		if got != want {
			t.Errorf("Sqrt(%g) = %v at 53 bits, want %v (IEEE float64 sqrt)", v, got, want)
		}
	}
}

func TestSinCosLargeArgument(t *testing.T) {
	// sin^2 + cos^2 = 1 near multiples of pi/2 and for large |x| (common practice).
	for _, s := range []string{"1e22", "-1e22", "6381956970095103e797", "355", "103993", "1e-100"} {
		x, _, _ := new(big.Float).SetPrec(300).Parse(s, 10)
		sn, cs := Sin(x), Cos(x)
		one := new(big.Float).SetPrec(300).Mul(sn, sn)
		one.Add(one, new(big.Float).SetPrec(300).Mul(cs, cs))
		one.Sub(one, big.NewFloat(1))
		if one.Sign() != 0 && one.MantExp(nil) > -290 {
			t.Errorf("x = %s: sin^2+cos^2-1 = %s", s, one.Text('g', 5))
		}
	}
}

func TestElementaryPanics(t *testing.T) {
	for name, f := range map[string]func(){
		"Log(-1)":   func() { Log(big.NewFloat(-1)) },
		"Log(0)":    func() { Log(big.NewFloat(0)) },
		"Pow(0,1)":  func() { Pow(big.NewFloat(0), big.NewFloat(1)) },
		"Sqrt(-1)":  func() { Sqrt(big.NewFloat(-1)) },
		"Sin(+Inf)": func() { Sin(new(big.Float).SetInf(false)) },
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s did not panic", name)
				}
			}()
			f()
		}()
	}
}
