package levelset

import (
	"context"
	"math"
	"testing"
)

func build(t *testing.T, req Request) *Rule {
	t.Helper()
	r, err := Build(context.Background(), req)
	if err != nil {
		t.Fatalf("%+v: %v", req, err)
	}
	return r
}

// integral sums w f over the rule.
func integral(r *Rule, f func(p []float64) float64) float64 {
	s := 0.0
	for i, p := range r.Nodes {
		s += r.Weights[i] * f(p)
	}
	return s
}

func one([]float64) float64 { return 1 }

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func TestDiscQuick(t *testing.T) {
	for _, q := range []int{4, 8, 12, 16, 20} {
		r := build(t, Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-0.64", Order: q})
		s := build(t, Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-0.64", Order: q, Side: Surface})
		t.Logf("q=%d n=%d area err %.3g len err %.3g est %.3g", q, len(r.Nodes), relErr(integral(r, one), math.Pi*0.64), relErr(integral(s, one), 2*math.Pi*0.8), r.EstimatedError)
	}
}

func TestBallQuick(t *testing.T) {
	for _, q := range []int{4, 8, 12} {
		r := build(t, Request{Shape: "hexahedron", LevelSet: "x^2+y^2+z^2-0.64", Order: q})
		s := build(t, Request{Shape: "hexahedron", LevelSet: "x^2+y^2+z^2-0.64", Order: q, Side: Surface})
		tr := build(t, Request{Shape: "triangle", LevelSet: "(x-0.2)^2+(y-0.3)^2-0.04", Order: q})
		ts := build(t, Request{Shape: "tetrahedron", LevelSet: "(x-0.2)^2+(y-0.25)^2+(z-0.2)^2-0.01", Order: q, Side: Surface})
		t.Logf("q=%d n=%d vol err %.3g area err %.3g  tri %.3g tet-sphere %.3g", q, len(r.Nodes), relErr(integral(r, one), 4*math.Pi*0.512/3), relErr(integral(s, one), 4*math.Pi*0.64), relErr(integral(tr, one), math.Pi*0.04), relErr(integral(ts, one), 4*math.Pi*0.01))
	}
}
