package moments

import (
	"math/big"
	"testing"
)

// TestGradTapeMatchesGradBig: the compiled tape gives GradBig's value and
// gradient bit for bit with the unit tangents, a directional derivative
// equal to the gradient's dot product with the tangent, and GradBig's
// refusals.
func TestGradTapeMatchesGradBig(t *testing.T) {
	const prec = 200
	f := func(v float64) *big.Float { return new(big.Float).SetPrec(prec).SetFloat64(v) }
	for _, c := range []struct {
		src  string
		at   []float64
		fail bool
	}{
		{"x^2+y^2+z^2-0.64", []float64{0.3, -0.2, 0.125}, false},
		{"(x-0.1)^3*y - 2/(1+z^2) + x^-2", []float64{0.3, -0.2, 0.125}, false},
		{"sqrt(x^2+y^2)-0.5+sin(3*z)*exp(x*y)", []float64{0.3, -0.2, 0.125}, false},
		{"x^y + log(z) - atan(x/y) + tanh(z) + abs(y)", []float64{0.3, 0.7, 0.125}, false},
		{"(x+y)^0 + 1/(x-0.5)", []float64{0.5, 0, 0}, true},
		{"sqrt(x-y)", []float64{0.25, 0.25, 0}, true},
	} {
		e, err := ParseExpr(c.src, "x", "y", "z")
		if err != nil {
			t.Fatal(err)
		}
		vals := []*big.Float{f(c.at[0]), f(c.at[1]), f(c.at[2])}
		gb := make([]*big.Float, 3)
		vb, errB := e.GradBig(prec, vals, gb)
		tp := e.CompileGrad(prec)
		for rep := 0; rep < 2; rep++ { // a second run reuses the storage
			vt, gt, errT := tp.Eval(vals, tp.Unit())
			if (errB != nil) != c.fail || (errT != nil) != c.fail {
				t.Fatalf("%s: GradBig error %v, tape error %v, want failure %v", c.src, errB, errT, c.fail)
			}
			if c.fail {
				continue
			}
			if vt.Cmp(vb) != 0 {
				t.Errorf("%s: value %s, GradBig %s", c.src, vt.Text('g', 40), vb.Text('g', 40))
			}
			for i := range gb {
				if gt[i].Cmp(gb[i]) != 0 {
					t.Errorf("%s: d/d%d %s, GradBig %s", c.src, i, gt[i].Text('g', 40), gb[i].Text('g', 40))
				}
			}
		}
		if c.fail {
			continue
		}
		dir := []*big.Float{f(0.5), nil, f(-2)}
		_, d, err := tp.Eval(vals, [][]*big.Float{dir})
		if err != nil {
			t.Fatal(err)
		}
		want := new(big.Float).SetPrec(prec).Mul(gb[0], dir[0])
		want.Sub(want, new(big.Float).SetPrec(prec).SetMantExp(gb[2], 1))
		diff := new(big.Float).Sub(d[0], want)
		if x, _ := diff.Float64(); x > 1e-50 || x < -1e-50 {
			t.Errorf("%s: directional derivative off by %g", c.src, x)
		}
	}
}
