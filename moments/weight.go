package moments

import (
	"fmt"
	"math"
	"math/big"

	"quadwright/precision"
)

// Weight is a weight function of x given by an expression, on an interval.
type Weight struct {
	Source   string     // the expression text
	Expr     *Expr      // the parsed expression, in the variable x
	Interval Interval   // where the weight lives
	Breaks   []*big.Rat // interior points where w is not smooth (sorted, inside the interval)

	memo *deMemo // the last integration (see integrateShared)
}

// weightSamples is the number of points where NewWeight checks the weight in
// float64, and weightBigSamples how many of them (spread evenly) it checks
// again at 128 bits.
const (
	weightSamples    = 400
	weightBigSamples = 8
)

// NewWeight parses src as an expression in x, checks that every break lies
// strictly inside iv (they are sorted and duplicates dropped; the slice
// given is not modified), and samples the weight: at weightSamples points
// spread over iv (Chebyshev-like on a finite interval, so that the ends are
// sampled closely; x = a + s/(1-s) style maps on infinite ones), in float64,
// a value that is NaN or negative is checked again at 128 bits, and a few
// points are always checked at 128 bits. A value that is negative, or that
// cannot be evaluated (log of a negative number, ...), is an error naming
// the point; so is a weight that is zero at every sample.
//
// Sampling proves nothing: a weight negative only between samples is found
// by Moments, which evaluates it at every quadrature node.
func NewWeight(src string, iv Interval, breaks []*big.Rat) (*Weight, error) {
	e, err := ParseExpr(src)
	if err != nil {
		return nil, err
	}
	w := &Weight{Source: src, Expr: e, Interval: iv, memo: &deMemo{}}
	for _, b := range breaks {
		if b == nil {
			panic("moments: NewWeight with a nil break")
		}
		if (iv.Lo.Finite() && b.Cmp(iv.Lo.Value) <= 0) || (iv.Hi.Finite() && b.Cmp(iv.Hi.Value) >= 0) {
			return nil, fmt.Errorf("--breaks %s: the break lies outside the open interval %s", RatString(b), iv)
		}
		w.Breaks = insertRat(w.Breaks, b)
	}
	nonzero := false
	for i := 0; i < weightSamples; i++ {
		x := samplePoint(iv, (float64(i)+0.5)/weightSamples)
		v := e.Eval64(x)
		if i%(weightSamples/weightBigSamples) == 0 || math.IsNaN(v) || v < 0 || math.IsInf(v, 0) {
			xb := new(big.Float).SetPrec(128).SetFloat64(x)
			vb, err := e.EvalBig(128, xb)
			if err != nil {
				return nil, fmt.Errorf("%v, at x = %s (%s)", err, precision.FormatFloat64(x), w.Label())
			}
			if vb.Sign() < 0 {
				return nil, fmt.Errorf("%s: the weight is negative at x = %s", w.Label(), precision.FormatFloat64(x))
			}
			v, _ = vb.Float64()
			if vb.Sign() > 0 {
				v = math.Max(v, math.SmallestNonzeroFloat64)
			}
		}
		if v > 0 {
			nonzero = true
		}
	}
	if !nonzero {
		return nil, fmt.Errorf("%s: the weight is zero at every sampled point", w.Label())
	}
	return w, nil
}

// samplePoint maps s in (0, 1) onto iv: (1-cos(pi s))/2 on a finite
// interval, a + s/(1-s) on [a, inf), b - (1-s)/s on (-inf, b], and
// tan(pi (s - 1/2)) on the whole line. The result is a float64 strictly
// inside iv when iv's ends are not too close in float64.
func samplePoint(iv Interval, s float64) float64 {
	switch {
	case iv.Finite():
		a, _ := iv.Lo.Value.Float64()
		b, _ := iv.Hi.Value.Float64()
		x := a + (b-a)*(1-math.Cos(math.Pi*s))/2
		return math.Min(math.Max(x, math.Nextafter(a, b)), math.Nextafter(b, a))
	case iv.Lo.Finite():
		a, _ := iv.Lo.Value.Float64()
		return a + s/(1-s)
	case iv.Hi.Finite():
		b, _ := iv.Hi.Value.Float64()
		return b - (1-s)/s
	}
	return math.Tan(math.Pi * (s - 0.5))
}

func insertRat(rs []*big.Rat, r *big.Rat) []*big.Rat {
	i := 0
	for i < len(rs) && rs[i].Cmp(r) < 0 {
		i++
	}
	if i < len(rs) && rs[i].Cmp(r) == 0 {
		return rs
	}
	rs = append(rs, nil)
	copy(rs[i+1:], rs[i:])
	rs[i] = new(big.Rat).Set(r)
	return rs
}

// Label names the weight for messages and reports: "weight -log(x) on [0, 1]".
func (w *Weight) Label() string { return "weight " + w.Source + " on " + w.Interval.String() }
