package levelset

import (
	"context"
	"math/big"
	"testing"

	"quadwright/precision"
)

// TestDigitsDegenerate runs the extended path through the degenerate
// cases: a circle through the four vertices (the inside is the whole
// square, area 4), an interface along an edge (y - 1 < 0: the whole
// square), an annulus 0.09 < x^2+y^2 < 0.81 (two components of the
// interface; area pi (0.81 - 0.09), elementary geometry), and the circle
// of radius 1/2 as a surface (length pi). Tolerances are the measured
// errors times about 100 (tuned): order 10 leaves 1e-19 in the annulus
// and 1e-8 in the circle.
func TestDigitsDegenerate(t *testing.T) {
	pi := precision.Pi(xprec)
	for _, c := range []struct {
		req  Request
		want float64 // multiple of pi, or (pi0) of 1
		pi0  bool
		tol  float64
	}{
		{Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-2", Order: 8}, 4, true, 1e-28},
		{Request{Shape: "quadrilateral", LevelSet: "y-1", Order: 8}, 4, true, 1e-28},
		{Request{Shape: "quadrilateral", LevelSet: "(x^2+y^2-0.81)*(x^2+y^2-0.09)", Order: 10}, 0.72, false, 1e-17},
		{Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-0.25", Order: 10, Side: Surface}, 1, false, 1e-6},
	} {
		c.req.Digits = 30
		r, err := Build(context.Background(), c.req)
		if err != nil {
			t.Errorf("%s %v: %v", c.req.LevelSet, c.req.Side, err)
			continue
		}
		want := rat(0, 1).SetFloat64(c.want)
		if c.want == 0.72 {
			want = rat(72, 100)
		}
		if !c.pi0 {
			want.Mul(want, pi)
		}
		for i, w := range r.PrintedWeights {
			if w[0] == '-' || w == "0" {
				t.Fatalf("%s: weight %d is %s", c.req.LevelSet, i, w)
			}
		}
		if e := relErrX(sumX(t, r, func(p []*big.Float) *big.Float { return rat(1, 1) }), want); !(e <= c.tol) {
			t.Errorf("%s %v: relative error %.3g, want <= %.1g", c.req.LevelSet, c.req.Side, e, c.tol)
		}
	}
}
