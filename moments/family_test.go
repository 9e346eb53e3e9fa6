package moments

import (
	"math/big"
	"strings"
	"testing"
)

func TestParseInterval(t *testing.T) {
	good := []struct{ in, want string }{
		{"0,1", "[0, 1]"}, {"-1,1", "[-1, 1]"}, {"0,inf", "[0, inf)"}, {"-inf,inf", "(-inf, inf)"},
		{"-inf, 2.5", "(-inf, 2.5]"}, {" 1/3 , 0.5 ", "[1/3, 0.5]"}, {"-2e1,+inf", "[-20, inf)"},
	}
	for _, c := range good {
		iv, err := ParseInterval(c.in)
		if err != nil || iv.String() != c.want {
			t.Errorf("%q: %v %v, want %s", c.in, iv, err, c.want)
		}
	}
	for _, bad := range []string{"", "1", "1,0", "0,0", "inf,0", "0,-inf", "a,b", "0,1,2", "nan,1", "0,1e"} {
		if _, err := ParseInterval(bad); err == nil {
			t.Errorf("%q accepted", bad)
		} else if !strings.Contains(err.Error(), "interval") {
			t.Errorf("%q: error %q does not name the interval", bad, err)
		}
	}
}

func FuzzParseInterval(f *testing.F) {
	for _, s := range []string{"0,1", "-inf,inf", "1/3,0.5", "0,inf", ",", "1e99999,1"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		iv, err := ParseInterval(s)
		if err != nil {
			return
		}
		if iv.Finite() && iv.Lo.Value.Cmp(iv.Hi.Value) >= 0 {
			t.Fatalf("%q gave an empty interval %v", s, iv)
		}
		if _, err := ParseInterval(strings.Join(iv.Strings(), ",")); err != nil {
			t.Fatalf("%q: its own form %v does not parse back: %v", s, iv.Strings(), err)
		}
	})
}

func TestNewFamilyErrors(t *testing.T) {
	r := func(s string) *big.Rat { v, _ := new(big.Rat).SetString(s); return v }
	unit := Unit()
	half, _ := ParseInterval("0,inf")
	cases := []struct {
		name        string
		alpha, beta *big.Rat
		iv          *Interval
		want        string
	}{
		{"fibonacci", nil, nil, nil, `family "fibonacci" does not exist`},
		{"jacobi", r("-1"), nil, nil, "--alpha -1"},
		{"jacobi", nil, r("-3/2"), nil, "--beta -1.5"},
		{"laguerre", r("-2"), nil, nil, "--alpha -2"},
		{"gegenbauer", nil, nil, nil, "--alpha"},
		{"gegenbauer", r("-1/2"), nil, nil, "--alpha -0.5"},
		{"legendre", r("1"), nil, nil, "has no parameter alpha"},
		{"laguerre", nil, r("1"), nil, "has no parameter beta"},
		{"legendre", nil, nil, &half, "finite interval"},
		{"laguerre", nil, nil, &unit, "[a, inf)"},
		{"hermite", nil, nil, &half, "(-inf, inf)"},
	}
	for _, c := range cases {
		_, err := NewFamily(c.name, c.alpha, c.beta, c.iv)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.name, err, c.want)
		}
	}
}

// TestWeightStrings checks the weight expressions written into rule files
// (they must parse back as the same function; the parser lands with the
// expression weights, so here the text itself is pinned).
func TestWeightStrings(t *testing.T) {
	r := func(s string) *big.Rat { v, _ := new(big.Rat).SetString(s); return v }
	iv := func(s string) *Interval {
		v, err := ParseInterval(s)
		if err != nil {
			t.Fatal(err)
		}
		return &v
	}
	cases := []struct {
		name        string
		alpha, beta *big.Rat
		iv          *Interval
		want        string
	}{
		{"legendre", nil, nil, nil, "1"},
		{"legendre", nil, nil, iv("0,2"), "1"},
		{"jacobi", r("-0.7"), r("2.3"), nil, "(1-x)^-0.7*(1+x)^2.3"},
		{"jacobi", r("0"), r("1"), iv("0,1"), "(2)*x"},
		{"jacobi", r("-0.5"), r("0"), iv("1,3"), "(3-x)^-0.5"},
		{"gegenbauer", r("1"), nil, nil, "(1-x^2)^0.5"},
		{"chebyshev1", nil, nil, nil, "(1-x^2)^-0.5"},
		{"chebyshev3", nil, nil, nil, "(1-x)^-0.5*(1+x)^0.5"},
		{"laguerre", r("1.5"), nil, nil, "x^1.5*exp(-x)"},
		{"laguerre", r("1/3"), nil, iv("2,inf"), "(x-2)^(1/3)*exp(-(x-2))"},
		{"hermite", nil, nil, nil, "exp(-x^2)"},
	}
	for _, c := range cases {
		f, err := NewFamily(c.name, c.alpha, c.beta, c.iv)
		if err != nil {
			t.Fatal(err)
		}
		if got := f.Weight(); got != c.want {
			t.Errorf("%s: weight %q, want %q", f.Label(), got, c.want)
		}
	}
}
