package design

import (
	"context"
	"math/big"
	"strings"
	"testing"
)

// TestLinearModification checks Christoffel's theorem for a linear factor
// against closed forms: (1+x) dx and (1-x) dx on [-1, 1] are the Jacobi
// weights (0, 1) and (1, 0), whose recurrences FamilySource gives (Gautschi
// 2004, Table 1.1). Tolerance: 1e-70 at 300 bits, a few ulp times N.
func TestLinearModification(t *testing.T) {
	const prec, n = 300, 30
	leg, err := family(t, "legendre", "", "", "").Recurrence(n+1, prec)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		z    int64
		a, b string
	}{{-1, "0", "1"}, {1, "1", "0"}} {
		got, err := linearModification(leg, n, new(big.Float).SetPrec(prec).SetInt64(c.z), prec)
		if err != nil {
			t.Fatal(err)
		}
		want, _ := family(t, "jacobi", c.a, c.b, "").Recurrence(n, prec)
		for k := 0; k < n; k++ {
			for _, pair := range [][2]*big.Float{{got.Alpha[k], want.Alpha[k]}, {got.Beta[k], want.Beta[k]}} {
				d := new(big.Float).Sub(pair[0], pair[1])
				if f, _ := d.Abs(d).Float64(); f > 1e-70 {
					t.Errorf("z=%d k=%d: %s, want %s", c.z, k, pair[0].Text('g', 30), pair[1].Text('g', 30))
				}
			}
		}
	}
}

// TestGaussFixedMatchesGolub builds Radau and Lobatto rules twice, by
// Golub's modified matrix and by Christoffel modification with the ends as
// prescribed nodes: the two independent routes must print the same digits.
// It also checks degree 2N-k-1 for nodes outside the support.
func TestGaussFixedMatchesGolub(t *testing.T) {
	ctx := context.Background()
	for _, src := range []FamilySource{family(t, "legendre", "", "", ""), family(t, "jacobi", "-0.7", "2.3", "0,2"), family(t, "laguerre", "1.5", "", "")} {
		iv := src.Domain()
		for _, n := range []int{2, 5, 12} {
			req := Request{Points: n, Digits: 35}
			r1, err := Radau(ctx, src, req, nil)
			if err != nil {
				t.Fatal(err)
			}
			r2, err := GaussFixed(ctx, src, req, []*big.Rat{iv.Lo.Value})
			if err != nil {
				t.Fatal(err)
			}
			sameRule(t, src.Label()+" radau", r1, r2)
			if !iv.Finite() {
				continue
			}
			l1, err := Lobatto(ctx, src, req, nil, nil)
			if err != nil {
				t.Fatal(err)
			}
			l2, err := GaussFixed(ctx, src, req, []*big.Rat{iv.Hi.Value, iv.Lo.Value})
			if err != nil {
				t.Fatal(err)
			}
			sameRule(t, src.Label()+" lobatto", l1, l2)
		}
	}
	leg := family(t, "legendre", "", "", "")
	fixed := []*big.Rat{big.NewRat(-2, 1), big.NewRat(3, 2), big.NewRat(3, 1)}
	r, err := GaussFixed(ctx, leg, Request{Points: 7, Digits: 30}, fixed)
	if err != nil {
		t.Fatal(err)
	}
	if r.Degree != 2*7-3-1 || len(r.Fixed) != 3 || r.Fixed[0] != "-2" || r.Nodes[5] != "1.5" {
		t.Errorf("degree %d, fixed %v, nodes %v", r.Degree, r.Fixed, r.Nodes)
	}
}

func sameRule(t *testing.T, what string, a, b *Rule) {
	t.Helper()
	if a.Points() != b.Points() || a.Degree != b.Degree {
		t.Fatalf("%s: %d/%d points, degrees %d/%d", what, a.Points(), b.Points(), a.Degree, b.Degree)
	}
	for i := range a.Nodes {
		if a.Nodes[i] != b.Nodes[i] || a.Weights[i] != b.Weights[i] {
			t.Errorf("%s N=%d %d: %s %s vs %s %s", what, a.Points(), i, a.Nodes[i], a.Weights[i], b.Nodes[i], b.Weights[i])
		}
	}
}

// TestNonExistence checks that every case without a rule is refused with a
// sentence that says why.
func TestNonExistence(t *testing.T) {
	ctx := context.Background()
	leg := family(t, "legendre", "", "", "")
	req := Request{Points: 5, Digits: 20}
	half := big.NewRat(1, 2)
	cases := []struct {
		name string
		run  func() (*Rule, error)
		want string
	}{
		{"radau inside", func() (*Rule, error) { return Radau(ctx, leg, req, half) }, "strictly inside"},
		{"radau hermite default", func() (*Rule, error) { return Radau(ctx, family(t, "hermite", "", "", ""), req, nil) }, "no finite end"},
		{"lobatto inside", func() (*Rule, error) { return Lobatto(ctx, leg, req, big.NewRat(-1, 1), half) }, "changes sign"},
		{"lobatto laguerre default", func() (*Rule, error) { return Lobatto(ctx, family(t, "laguerre", "", "", ""), req, nil, nil) }, "infinite end"},
		{"lobatto one point", func() (*Rule, error) { return Lobatto(ctx, leg, Request{Points: 1}, nil, nil) }, "at least 2"},
		{"fixed inside", func() (*Rule, error) { return GaussFixed(ctx, leg, req, []*big.Rat{half}) }, "changes sign"},
		{"fixed twice", func() (*Rule, error) {
			return GaussFixed(ctx, leg, req, []*big.Rat{big.NewRat(2, 1), big.NewRat(2, 1)})
		}, "twice"},
		{"fixed too many", func() (*Rule, error) {
			return GaussFixed(ctx, leg, Request{Points: 1}, []*big.Rat{big.NewRat(2, 1), big.NewRat(3, 1)})
		}, "do not fit"},
		{"kronrod hermite 3", func() (*Rule, error) { return Kronrod(ctx, family(t, "hermite", "", "", ""), Request{Points: 3}) }, "does not exist"},
		{"kronrod laguerre 1", func() (*Rule, error) { return Kronrod(ctx, family(t, "laguerre", "", "", ""), Request{Points: 1}) }, "outside the support"},
		{"kronrod laguerre 3", func() (*Rule, error) { return Kronrod(ctx, family(t, "laguerre", "", "", ""), Request{Points: 3}) }, "does not exist"},
		{"newton-cotes infinite", func() (*Rule, error) { return Preset(ctx, family(t, "hermite", "", "", ""), req, "newton-cotes") }, "finite interval"},
		{"clenshaw-curtis 1", func() (*Rule, error) { return Preset(ctx, leg, Request{Points: 1}, "clenshaw-curtis") }, "at least 2"},
		{"nodes twice", func() (*Rule, error) {
			return Interpolatory(ctx, leg, req, []*big.Rat{half, big.NewRat(1, 1), big.NewRat(2, 4)}, "interpolatory")
		}, "twice"},
	}
	for _, c := range cases {
		r, err := c.run()
		if err == nil {
			t.Errorf("%s: built a rule with %d points", c.name, r.Points())
			continue
		}
		if !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("%s: %q does not say %q in one line", c.name, err, c.want)
		}
	}
}
