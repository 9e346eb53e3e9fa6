package moments

import (
	"math/big"
	"testing"

	"quadwright/precision"
)

// TestGradBig checks GradBig against hand derivatives at 200 bits:
// phi = x^2 + y^2 - 1/10 at (3/10, 1/5): value 3/100, gradient (3/5, 2/5);
// phi = sin(x) y at (1/2, 2): gradient (2 cos(1/2), sin(1/2)), the sine and
// cosine from package precision (the derivative rules are from memory).
func TestGradBig(t *testing.T) {
	const prec = 200
	r := func(a, b int64) *big.Float { return new(big.Float).SetPrec(prec).SetRat(big.NewRat(a, b)) }
	tol := new(big.Float).SetMantExp(big.NewFloat(1), -190)
	near := func(name string, got, want *big.Float) {
		d := new(big.Float).SetPrec(prec).Sub(got, want)
		if d.Abs(d).Cmp(tol) > 0 {
			t.Errorf("%s = %s, want %s", name, got.Text('g', 50), want.Text('g', 50))
		}
	}
	e := MustParseExpr("x^2+y^2-0.1", "x", "y")
	g := make([]*big.Float, 2)
	v, err := e.GradBig(prec, []*big.Float{r(3, 10), r(1, 5)}, g)
	if err != nil {
		t.Fatal(err)
	}
	near("value", v, r(3, 100))
	near("d/dx", g[0], r(3, 5))
	near("d/dy", g[1], r(2, 5))
	e = MustParseExpr("sin(x)*y", "x", "y")
	v, err = e.GradBig(prec, []*big.Float{r(1, 2), r(2, 1)}, g)
	if err != nil {
		t.Fatal(err)
	}
	s, c := precisionSinCos(r(1, 2))
	near("value", v, new(big.Float).SetPrec(prec).Mul(s, r(2, 1)))
	near("d/dx", g[0], new(big.Float).SetPrec(prec).Mul(c, r(2, 1)))
	near("d/dy", g[1], s)
	if _, err := MustParseExpr("sqrt(x)", "x").GradBig(prec, []*big.Float{r(0, 1)}, g[:1]); err == nil {
		t.Error("sqrt at 0: no error")
	}
}

func precisionSinCos(x *big.Float) (*big.Float, *big.Float) {
	return precision.Sin(x), precision.Cos(x)
}
