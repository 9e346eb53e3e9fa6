package design

import (
	"testing"
)

// Gauss-Legendre abscissae and weights on [-1, 1], 15 decimals, from
// Abramowitz and Stegun, Handbook of Mathematical Functions, Table 25.4
// (from memory; every value is also checked against the mpmath-generated
// 50-digit reference in testdata/reference/gauss.json, and against gonum in
// gonum_test.go). Only the non-negative abscissae are tabulated there; the
// rule is symmetric.
var abramowitzLegendre = []struct {
	n    int
	x, w []string
}{
	{2, []string{"0.577350269189626"}, []string{"1.000000000000000"}},
	{3, []string{"0.000000000000000", "0.774596669241483"}, []string{"0.888888888888889", "0.555555555555556"}},
	{4, []string{"0.339981043584856", "0.861136311594053"}, []string{"0.652145154862546", "0.347854845137454"}},
	{5, []string{"0.000000000000000", "0.538469310105683", "0.906179845938664"}, []string{"0.568888888888889", "0.478628670499366", "0.236926885056189"}},
	{6, []string{"0.238619186083197", "0.661209386466265", "0.932469514203152"}, []string{"0.467913934572691", "0.360761573048139", "0.171324492379170"}},
	{8, []string{"0.183434642495650", "0.525532409916329", "0.796666477413627", "0.960289856497536"}, []string{"0.362683783378362", "0.313706645877887", "0.222381034453374", "0.101228536290376"}},
	{10, []string{"0.148874338981631", "0.433395394129247", "0.679409568299024", "0.865063366688985", "0.973906528517172"}, []string{"0.295524224714753", "0.269266719309996", "0.219086362515982", "0.149451349150581", "0.066671344308688"}},
}

func TestLegendreAbramowitzStegun(t *testing.T) {
	src := family(t, "legendre", "", "", "")
	for _, c := range abramowitzLegendre {
		r := build(t, src, c.n, 20)
		if r.Degree != 2*c.n-1 {
			t.Errorf("N=%d: degree %d, want %d", c.n, r.Degree, 2*c.n-1)
		}
		half := (c.n + 1) / 2
		for k := 0; k < half; k++ {
			i := c.n/2 + k // the k-th non-negative node in ascending order
			// The table rounds to 15 decimals: allow half a unit there plus
			// our own last-place error.
			if d := absDiff(rat(t, r.Nodes[i]), rat(t, c.x[k])); d > 0.5e-15+1e-20 {
				t.Errorf("N=%d node %d: %s, table %s (diff %.2g)", c.n, i, r.Nodes[i], c.x[k], d)
			}
			if d := absDiff(rat(t, r.Weights[i]), rat(t, c.w[k])); d > 0.5e-15+1e-20 {
				t.Errorf("N=%d weight %d: %s, table %s (diff %.2g)", c.n, i, r.Weights[i], c.w[k], d)
			}
		}
	}
}
