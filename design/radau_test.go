package design

import (
	"context"
	"fmt"
	"math/big"
	"testing"

	"quadwright/precision"
)

// closedForm is a rule value given by a formula: the value is
// (p + q sqrt(s)) / d with integers p, q, s, d.
type closedForm struct{ p, q, s, d int64 }

func (c closedForm) float(prec uint) *big.Float {
	r := new(big.Float).SetPrec(prec).SetInt64(c.s)
	r = precision.Sqrt(r)
	r.Mul(r, new(big.Float).SetPrec(prec).SetInt64(c.q))
	r.Add(r, new(big.Float).SetPrec(prec).SetInt64(c.p))
	return r.Quo(r, new(big.Float).SetPrec(prec).SetInt64(c.d))
}

// TestRadauLobattoClosedForms checks small Legendre rules against their
// closed forms (Abramowitz and Stegun 25.4.31-32 tables; the values below
// from memory, confirmed by the mpmath reference of TestVariantsAgainstMpmath):
// Radau N=3 at -1: nodes -1, (1 -+ sqrt 6)/5, weights 2/9, (16 +- sqrt 6)/18;
// Lobatto N=5: nodes 0, +-sqrt(3/7), +-1, weights 32/45, 49/90, 1/10.
func TestRadauLobattoClosedForms(t *testing.T) {
	ctx := context.Background()
	leg := family(t, "legendre", "", "", "")
	const digits = 40
	prec := precision.DigitsToBits(digits) + 64
	cases := []struct {
		kind    string
		n       int
		nodes   []closedForm
		weights []closedForm
	}{
		{"radau", 3, []closedForm{{-1, 0, 0, 1}, {1, -1, 6, 5}, {1, 1, 6, 5}}, []closedForm{{2, 0, 0, 9}, {16, 1, 6, 18}, {16, -1, 6, 18}}},
		{"lobatto", 5, []closedForm{{-1, 0, 0, 1}, {0, -1, 21, 7}, {0, 0, 0, 1}, {0, 1, 21, 7}, {1, 0, 0, 1}}, []closedForm{{1, 0, 0, 10}, {49, 0, 0, 90}, {32, 0, 0, 45}, {49, 0, 0, 90}, {1, 0, 0, 10}}},
		{"lobatto", 3, []closedForm{{-1, 0, 0, 1}, {0, 0, 0, 1}, {1, 0, 0, 1}}, []closedForm{{1, 0, 0, 3}, {4, 0, 0, 3}, {1, 0, 0, 3}}},
	}
	for _, c := range cases {
		var r *Rule
		var err error
		if c.kind == "radau" {
			r, err = Radau(ctx, leg, Request{Points: c.n, Digits: digits}, nil)
		} else {
			r, err = Lobatto(ctx, leg, Request{Points: c.n, Digits: digits}, nil, nil)
		}
		if err != nil {
			t.Fatalf("%s N=%d: %v", c.kind, c.n, err)
		}
		for i := range c.nodes {
			checkValue(t, fmt.Sprintf("%s N=%d node %d", c.kind, c.n, i), r.Nodes[i], c.nodes[i].float(prec))
			checkValue(t, fmt.Sprintf("%s N=%d weight %d", c.kind, c.n, i), r.Weights[i], c.weights[i].float(prec))
		}
	}
}
