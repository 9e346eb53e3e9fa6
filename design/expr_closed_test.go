package design

import (
	"context"
	"math/big"
	"testing"
)

// TestClosedRouteAgreesWithQuadrature compares the pairs of the closed-form
// route (exact moments of -log(x) and of a multiple of it) with the two
// quadrature routes, the modified Chebyshev algorithm on integrated moments
// and Lanczos on the discretisation: every pair to prec - routeSlack bits.
func TestClosedRouteAgreesWithQuadrature(t *testing.T) {
	const prec = 256
	type tc struct {
		expr string
		n    int
	}
	cases := []tc{{"-log(x)", 60}, {"log(1/x)/3", 25}, {"-log(1-x)", 20}, {"x^0.5", 30}, {"2*(1-x)^-0.75", 20}, {"x^3", 10}}
	if heavy {
		cases = append(cases, tc{"-log(x)", 250}, tc{"x^-0.9", 120}, tc{"(1-x)^7.5", 120})
	}
	for _, c := range cases {
		src := exprSource(t, c.expr, "0,1")
		cf, ok := src.closedForm()
		if !ok {
			t.Fatalf("%s: no closed form", c.expr)
		}
		closed, err := src.closedRoute(cf, c.n, prec)
		if err != nil {
			t.Fatal(err)
		}
		ctx := context.Background()
		mm, err := src.ModifiedMomentRoute(ctx, c.n, prec)
		if err != nil {
			t.Fatal(err)
		}
		lz, err := src.LanczosRoute(ctx, c.n, prec)
		if err != nil {
			t.Fatal(err)
		}
		if !pairsAgree(closed, mm, prec-routeSlack) {
			t.Errorf("%s: closed form and integrated moments disagree at pair %d", c.expr, firstDisagreement(closed, mm, prec-routeSlack))
		}
		if !pairsAgree(closed, lz, prec-routeSlack) {
			t.Errorf("%s: closed form and Lanczos disagree at pair %d", c.expr, firstDisagreement(closed, lz, prec-routeSlack))
		}
	}
}

// TestClosedRouteTaken checks that a closed-form weight keeps its exact
// moments for the check of the printed rule (VerifyRule), and that a weight
// on another interval does not take the route.
func TestClosedRouteTaken(t *testing.T) {
	src := exprSource(t, "-log(x)", "0,1")
	r, err := Gauss(context.Background(), src, Request{Points: 12, Digits: 30})
	if err != nil {
		t.Fatal(err)
	}
	if r.Degree != 23 {
		t.Errorf("degree %d, want 23", r.Degree)
	}
	cf, _ := src.closedForm()
	want, _ := cf.Moments(24, 64)
	src.mu.Lock()
	nu := src.nu
	src.mu.Unlock()
	if len(nu) < 24 {
		t.Fatalf("%d moments kept, want 24", len(nu))
	}
	for k := range want {
		d := new(big.Float).SetPrec(128).Sub(nu[k], want[k])
		if !smallRelative(d, want[k], 60) {
			t.Errorf("kept moment %d = %.20g, closed form %.20g", k, nu[k], want[k])
		}
	}
	if _, ok := exprSource(t, "-log(x)", "0,1/2").closedForm(); ok {
		t.Error("-log(x) on [0,1/2] took the closed form of [0,1]")
	}
}

// TestClosedPowerMatchesJacobi builds Gauss rules for powers of x and 1 - x
// on [0, 1] by the closed-form route and compares their nodes with those of
// the Jacobi family mapped onto [0, 1] (closed-form recurrence, the
// reference): (1-t)^a (1+t)^b with t = 2x - 1 is 2^(a+b) (1-x)^a x^b, so
// the nodes agree digit for digit.
func TestClosedPowerMatchesJacobi(t *testing.T) {
	for _, c := range []struct{ expr, alpha, beta string }{
		{"x^0.5", "0", "0.5"},
		{"(1-x)^-0.25", "-0.25", "0"},
		{"x^-0.9", "0", "-0.9"},
	} {
		want := build(t, family(t, "jacobi", c.alpha, c.beta, "0,1"), 9, 30)
		got, err := Gauss(context.Background(), exprSource(t, c.expr, "0,1"), Request{Points: 9, Digits: 30})
		if err != nil {
			t.Fatalf("%s: %v", c.expr, err)
		}
		for i := range want.Nodes {
			if got.Nodes[i] != want.Nodes[i] {
				t.Errorf("%s node %d: %s, family %s", c.expr, i, got.Nodes[i], want.Nodes[i])
			}
		}
	}
}
