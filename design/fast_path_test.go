package design_test

import (
	"context"
	"math"
	"math/big"
	"strconv"
	"testing"

	"quadwright/design"
	"quadwright/moments"
)

func fastFamily(t testing.TB, name string, a, b *big.Rat, iv string) moments.Family {
	t.Helper()
	var ivp *moments.Interval
	if iv != "" {
		v, err := moments.ParseInterval(iv)
		if err != nil {
			t.Fatal(err)
		}
		ivp = &v
	}
	f, err := moments.NewFamily(name, a, b, ivp)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// TestBuildFast builds fast rules of every kind the fast path serves and
// holds them to the bounds (the sampled check inside BuildFast
// fails the build otherwise) and to their construction degree, tested in
// full at these sizes.
func TestBuildFast(t *testing.T) {
	r := big.NewRat
	for _, c := range []struct {
		name, kind string
		a, b       *big.Rat
		iv         string
		n          int
	}{
		{"legendre", "gauss", nil, nil, "", 2000},
		{"legendre", "gauss", nil, nil, "0,1", 1001},
		{"jacobi", "gauss", r(-3, 10), r(4, 5), "", 1500},
		{"jacobi", "radau", r(-3, 10), r(4, 5), "", 1200},
		{"legendre", "lobatto", nil, nil, "-2,7/3", 1200},
		{"chebyshev1", "gauss", nil, nil, "", 1000},
		{"gegenbauer", "gauss", r(3, 4), nil, "", 1000},
		{"laguerre", "gauss", r(-1, 2), nil, "", 1000},
		{"laguerre", "gauss", nil, nil, "3/2,inf", 1000},
		{"hermite", "gauss", nil, nil, "", 1000},
	} {
		f := fastFamily(t, c.name, c.a, c.b, c.iv)
		rule, err := design.BuildFast(context.Background(), f, c.kind, c.n, design.FastOptions{})
		if err != nil {
			t.Errorf("%s %s n=%d on %s: %v", c.name, c.kind, c.n, c.iv, err)
			continue
		}
		a := rule.Accuracy
		t.Logf("%s %s n=%d %s: degree %d/%d (share %.2g), %d samples: node %.3g ulp (share %.3g), weight %.3g ulp (share %.3g)",
			c.name, c.kind, c.n, c.iv, rule.Degree, rule.ConstructionDegree, rule.WorstShare, a.Samples, a.NodeULP, a.NodeShare, a.WeightULP, a.WeightShare)
		if rule.Degree != rule.ConstructionDegree {
			t.Errorf("%s %s n=%d: degree %d, built for %d", c.name, c.kind, c.n, rule.Degree, rule.ConstructionDegree)
		}
	}
}

// TestFastAgreesWithEngine compares the fast path with the
// extended-precision engine (each value the nearest double, verified in
// extended precision) at design.FastThreshold points: every node within
// the bound max(2 ulp(theta) sin(theta), 1 ulp(x)) plus the
// engine's half ulp, every weight within 4.5 ulp.
func TestFastAgreesWithEngine(t *testing.T) {
	n := design.FastThreshold
	f := fastFamily(t, "jacobi", big.NewRat(-3, 10), big.NewRat(4, 5), "")
	ext, err := design.Gauss(context.Background(), design.FamilySource{Family: f}, design.Request{Points: n})
	if err != nil {
		t.Fatal(err)
	}
	fr, err := design.BuildFast(context.Background(), f, "gauss", n, design.FastOptions{})
	if err != nil {
		t.Fatal(err)
	}
	worstX, worstW := 0.0, 0.0
	for i := 0; i < n; i++ {
		xe, _ := strconv.ParseFloat(ext.Nodes[i], 64)
		we, _ := strconv.ParseFloat(ext.Weights[i], 64)
		theta := math.Acos(xe)
		bound := math.Max(2*ulpOf(theta)*math.Sin(theta), ulpOf(xe)) + 0.5*ulpOf(xe)
		worstX = math.Max(worstX, math.Abs(fr.X[i]-xe)/bound)
		worstW = math.Max(worstW, math.Abs(fr.W[i]-we)/ulpOf(we))
	}
	t.Logf("n=%d: node difference %.3g of the bound, weight difference %.3g ulp", n, worstX, worstW)
	if worstX > 1 || worstW > 4.5 {
		t.Errorf("fast and engine differ: nodes %.3g of the bound, weights %.3g ulp", worstX, worstW)
	}
}

func ulpOf(v float64) float64 {
	v = math.Abs(v)
	return math.Nextafter(v, math.Inf(1)) - v
}
