package moments

import (
	"math/big"
	"testing"
)

// FuzzGradTape: for any expression that parses, the compiled tape and
// GradBig agree on whether it is defined at the point, and where it is,
// on the value and gradient bit for bit; neither panics.
func FuzzGradTape(f *testing.F) {
	for _, s := range []string{"x^2+y^2-0.25", "1/(x-y)", "sqrt(x)*log(y)", "x^y", "(x+y)^0", "x^-3", "tanh(x)/cos(y)", "abs(x-y)"} {
		f.Add(s, 0.25, -0.5)
	}
	f.Fuzz(func(t *testing.T, src string, a, b float64) {
		e, err := ParseExpr(src, "x", "y")
		if err != nil || a != a || b != b || a-a != 0 || b-b != 0 {
			return
		}
		const prec = 128
		vals := []*big.Float{new(big.Float).SetPrec(prec).SetFloat64(a), new(big.Float).SetPrec(prec).SetFloat64(b)}
		gb := make([]*big.Float, 2)
		vb, errB := e.GradBig(prec, vals, gb)
		tp := e.CompileGrad(prec)
		vt, gt, errT := tp.Eval(vals, tp.Unit())
		if (errB == nil) != (errT == nil) {
			t.Fatalf("%q at (%g, %g): GradBig error %v, tape error %v", src, a, b, errB, errT)
		}
		if errB != nil {
			return
		}
		if vt.Cmp(vb) != 0 || gt[0].Cmp(gb[0]) != 0 || gt[1].Cmp(gb[1]) != 0 {
			t.Fatalf("%q at (%g, %g): tape %v %v, GradBig %v %v", src, a, b, vt, gt, vb, gb)
		}
	})
}
