package moments

import (
	"math"
	"math/rand"
	"testing"
)

// TestProg64 checks the compiled evaluator against Eval64 and Grad64 (the
// tree walks it stands for): the same numbers, bit for bit, at random
// points, for expressions using every operation.
func TestProg64(t *testing.T) {
	srcs := []string{
		"(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64",
		"(x^2+y^2-0.09)*(x^2+y^2-0.49)",
		"x^3*y-z/(1+x^2)+x^0",
		"-sin(3*x)*exp(y)+sqrt(abs(z)+1)-log(2+cos(x*y))",
		"(1.5+x)^(0.3+y)+atan(z)+tanh(x)*sinh(y)-cosh(z)+tan(0.5*x)",
		"pi*x-e*y+2^-3*z+x^-2",
		"0.7",
	}
	rng := rand.New(rand.NewSource(1))
	for _, src := range srcs {
		e := MustParseExpr(src, "x", "y", "z")
		p := e.Compile64()
		for n := 0; n < 200; n++ {
			v := []float64{rng.Float64()*2 - 1, rng.Float64()*2 - 1, rng.Float64()*2 - 1}
			want := e.Eval64(v...)
			if got := p.Value(v); math.Float64bits(got) != math.Float64bits(want) && !(math.IsNaN(got) && math.IsNaN(want)) {
				t.Fatalf("%s at %v: Value %v, Eval64 %v", src, v, got, want)
			}
			var g1, g2 [3]float64
			w := e.Grad64(v, g1[:])
			got := p.Grad(v, g2[:])
			same := func(a, b float64) bool {
				return math.Float64bits(a) == math.Float64bits(b) || math.IsNaN(a) && math.IsNaN(b)
			}
			if !same(got, w) || !same(g1[0], g2[0]) || !same(g1[1], g2[1]) || !same(g1[2], g2[2]) {
				t.Fatalf("%s at %v: Grad %v %v, Grad64 %v %v", src, v, got, g2, w, g1)
			}
		}
	}
	e := MustParseExpr("x*y", "x", "y")
	var g [2]float64
	if v := e.Compile64().Grad([]float64{2, 3}, g[:]); v != 6 || g != [2]float64{3, 2} {
		t.Errorf("x*y at (2, 3): %v %v", v, g)
	}
}
