package moments

import (
	"context"
	"math/big"
	"testing"
)

// Integrals from handbook formulas: int_0^1 log x = -1, int_0^1 x^(1/2) =
// 2/3, int_0^1 x^2 log x = -1/9, int_0^inf e^-3x = 1/3, int_0^1
// |x - 1/3| = 5/18 (with the kink named).
func TestFunctionMoments(t *testing.T) {
	for _, c := range []struct {
		fs     []string
		iv     string
		breaks []*big.Rat
		want   []*big.Rat
	}{
		{[]string{"log(x)", "x^(1/2)", "x^2*log(x)"}, "0,1", nil, []*big.Rat{big.NewRat(-1, 1), big.NewRat(2, 3), big.NewRat(-1, 9)}},
		{[]string{"exp(-3*x)"}, "0,inf", nil, []*big.Rat{big.NewRat(1, 3)}},
		{[]string{"abs(x-1/3)"}, "0,1", []*big.Rat{big.NewRat(1, 3)}, []*big.Rat{big.NewRat(5, 18)}},
	} {
		iv, _ := ParseInterval(c.iv)
		w, err := NewWeight("1", iv, c.breaks)
		if err != nil {
			t.Fatal(err)
		}
		var es []*Expr
		for _, s := range c.fs {
			es = append(es, MustParseExpr(s, "x"))
		}
		m, est, x, cs, err := w.FunctionMoments(context.Background(), es, 40)
		if err != nil {
			t.Fatal(err)
		}
		if len(x) == 0 || len(x) != len(cs) {
			t.Errorf("%v: discretisation of %d nodes, %d masses", c.fs, len(x), len(cs))
		}
		for k := range c.want {
			d := new(big.Float).Sub(m[k], new(big.Float).SetPrec(256).SetRat(c.want[k]))
			lim := new(big.Float).SetFloat64(1e-39)
			if d.Abs(d).Cmp(lim) > 0 || est[k].Cmp(lim) > 0 {
				t.Errorf("%s: %s, error %s, estimate %s", c.fs[k], m[k].Text('g', 45), d.Text('g', 3), est[k].Text('g', 3))
			}
		}
	}
}

func TestEvalSharedMatchesEvalBig(t *testing.T) {
	es := []*Expr{MustParseExpr("log(x)", "x"), MustParseExpr("x^3*log(x)", "x"), MustParseExpr("exp(-x)*log(x)", "x")}
	x := new(big.Float).SetPrec(200).SetFloat64(0.3)
	got, err := EvalShared(es, 200, x)
	if err != nil {
		t.Fatal(err)
	}
	for k, e := range es {
		want, _ := e.EvalBig(200, x)
		if got[k].Cmp(want) != 0 {
			t.Errorf("%s: shared %s, alone %s", e, got[k].Text('g', 50), want.Text('g', 50))
		}
	}
	got[0].SetInt64(7) // the caller's to modify: the cache must not see it
	again, _ := EvalShared(es[:1], 200, x)
	if again[0].Cmp(big.NewFloat(7)) == 0 {
		t.Error("EvalShared returned a cached value itself")
	}
}
