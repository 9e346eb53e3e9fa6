package design

import (
	"context"
	"fmt"
	"math/big"
	"strings"

	"quadwright/precision"
)

// PresetKinds are the named node sets whose interpolatory weights Preset
// computes for any measure on a finite interval.
var PresetKinds = []string{"newton-cotes", "newton-cotes-open", "clenshaw-curtis", "fejer", "fejer2"}

// Preset builds the Points-node interpolatory rule of m on a named node set
// of its interval [lo, hi] (finite), mapped affinely from [-1, 1] where the
// set is defined there; nodes ascending:
//
//   - newton-cotes: closed Newton-Cotes, N >= 2 equispaced nodes including
//     both ends, lo + i (hi-lo)/(N-1) (exact rationals);
//   - newton-cotes-open: lo + i (hi-lo)/(N+1), i = 1..N;
//   - clenshaw-curtis: cos(k pi/(N-1)), k = 0..N-1, ends included (N >= 2);
//   - fejer: Fejer's first rule, cos((2k+1) pi/(2N)), k = 0..N-1;
//   - fejer2: Fejer's second rule, cos(k pi/(N+1)), k = 1..N.
//
// The weights are the interpolatory weights of Interpolatory, for the
// measure given. For the weight 1 they are the classical Clenshaw-Curtis
// and Fejer weights, whose closed forms (Waldvogel, "Fast construction of
// the Fejer and Clenshaw-Curtis quadrature rules", BIT 46, 2006, eqs. 2.1
// to 2.5) the tests compare against; the construction here is the general
// one, so it serves every measure. The cosine nodes are computed at each
// stage's precision, symmetric pairs as exact negatives and a middle node
// as exactly the midpoint.
func Preset(ctx context.Context, m Measure, req Request, kind string) (*Rule, error) {
	kind = strings.ToLower(strings.TrimSpace(kind))
	n := req.Points
	iv := m.Domain()
	known := false
	for _, k := range PresetKinds {
		known = known || k == kind
	}
	if !known {
		panic("design: Preset of unknown kind " + kind)
	}
	if !iv.Finite() {
		return nil, fmt.Errorf("--kind %s: the node set needs a finite interval, and the support is %s", kind, iv)
	}
	if n < 1 || n > MaxPrescribedNodes {
		return nil, fmt.Errorf("--points %d: a %s rule takes 1 to %d points", n, kind, MaxPrescribedNodes)
	}
	if (kind == "newton-cotes" || kind == "clenshaw-curtis") && n < 2 {
		return nil, fmt.Errorf("--points %d: a %s rule includes both ends of the interval, so it needs at least 2 points", n, kind)
	}
	lo, hi := iv.Lo.Value, iv.Hi.Value
	if kind == "newton-cotes" || kind == "newton-cotes-open" {
		zs := make([]*big.Rat, n)
		for i := range zs {
			num, den := int64(i), int64(n-1)
			if kind == "newton-cotes-open" {
				num, den = int64(i+1), int64(n+1)
			}
			t := new(big.Rat).Sub(hi, lo)
			t.Mul(t, big.NewRat(num, den))
			zs[i] = t.Add(t, lo)
		}
		r, err := Interpolatory(ctx, m, req, zs, kind)
		if err != nil {
			return nil, err
		}
		r.Method = kind + " nodes; " + r.Method
		return r, nil
	}
	c := new(big.Rat).Add(lo, hi)
	c.Quo(c, big.NewRat(2, 1))
	h := new(big.Rat).Sub(hi, lo)
	h.Quo(h, big.NewRat(2, 1))
	var ends []*big.Rat
	if kind == "clenshaw-curtis" {
		ends = make([]*big.Rat, n)
		ends[0], ends[n-1] = lo, hi
	}
	if n%2 == 1 {
		if ends == nil {
			ends = make([]*big.Rat, n)
		}
		ends[n/2] = c
	}
	r, err := interpolatoryRule(ctx, m, req, kind, n, func(p uint) []*big.Float {
		return mappedCosines(kind, n, c, h, p)
	}, ends)
	if err != nil {
		return nil, err
	}
	r.Method = kind + " nodes; " + r.Method
	return r, nil
}

// mappedCosines returns c + h t_i for the cosine nodes t_i of kind,
// ascending, at prec bits.
func mappedCosines(kind string, n int, c, h *big.Rat, prec uint) []*big.Float {
	wp := prec + 32
	pi := precision.Pi(wp)
	cf, hf := ratFloat(c, wp), ratFloat(h, wp)
	out := make([]*big.Float, n)
	for i := 0; i < (n+1)/2; i++ {
		// t_i = -cos(theta_i), ascending in i.
		var num, den int64
		switch kind {
		case "clenshaw-curtis":
			num, den = int64(i), int64(n-1)
		case "fejer":
			num, den = int64(2*i+1), int64(2*n)
		default: // fejer2
			num, den = int64(i+1), int64(n+1)
		}
		j := n - 1 - i
		if i == j {
			out[i] = new(big.Float).SetPrec(prec).Set(cf)
			break
		}
		th := new(big.Float).SetPrec(wp).Mul(pi, new(big.Float).SetPrec(wp).SetInt64(num))
		th.Quo(th, new(big.Float).SetPrec(wp).SetInt64(den))
		t := precision.Cos(th)
		if num == 0 {
			t.SetInt64(1)
		}
		t.Mul(t, hf)
		out[i] = new(big.Float).SetPrec(prec).Sub(cf, t)
		out[j] = new(big.Float).SetPrec(prec).Add(cf, t)
	}
	return out
}
