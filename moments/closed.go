package moments

import (
	"math/big"
)

// ClosedForm names a weight whose modified moments are known in closed
// form, recognised from its expression and interval by (*Weight).ClosedForm.
type ClosedForm struct {
	// Kind is "log": w(x) = Scale * (-log(y)) on [0, 1], or "power":
	// w(x) = Scale * y^Power (Power > -1), with y = x, or y = 1 - x when
	// Mirror is set.
	Kind   string
	Scale  *big.Rat // > 0
	Power  *big.Rat // the exponent of "power"
	Mirror bool
}

// ClosedForm reports whether w is a weight whose modified moments in
// DefaultBasis(w.Interval) have a closed form: so far, on [0, 1], with y
// either x or 1 - x and c > 0 a rational,
//
//   - c * (-log(y)), written as any multiple of log(y) folded from
//     negations, products and quotients by constants, or log(1/y),
//     log(y^-1) (so "-log(x)", "log(1/x)", "-2*log(x)", "log(1-x)/(-3)");
//   - c * y^a, a > -1 rational, written y^a or sqrt(y), times or divided
//     by constants ("x^0.5", "3*(1-x)^-0.25", "sqrt(x)/2").
func (w *Weight) ClosedForm() (ClosedForm, bool) {
	iv := w.Interval
	if !iv.Finite() || iv.Lo.Value.Sign() != 0 || iv.Hi.Value.Cmp(big.NewRat(1, 1)) != 0 || len(w.Expr.vars) != 1 {
		return ClosedForm{}, false
	}
	cf, ok := closedTerm(w.Expr.root)
	if !ok {
		return ClosedForm{}, false
	}
	if cf.Kind == "log" {
		// c log(y) with c < 0 is the weight |c| (-log(y)).
		cf.Scale.Neg(cf.Scale)
	}
	if cf.Scale.Sign() <= 0 || (cf.Kind == "power" && cf.Power.Cmp(big.NewRat(-1, 1)) <= 0) {
		return ClosedForm{}, false
	}
	return cf, true
}

// closedTerm reports whether n is c * log(y) (Kind "log", Scale c) or
// c * y^a (Kind "power") for rationals c and a, y = x or 1 - x.
func closedTerm(n *node) (ClosedForm, bool) {
	switch n.op {
	case opFunc:
		switch n.fn {
		case "log":
			if mirror, ok := closedArg(n.a); ok {
				return ClosedForm{Kind: "log", Scale: big.NewRat(1, 1), Mirror: mirror}, true
			}
			a := n.a
			var mirror, ok bool
			switch {
			case a.op == opDiv && a.a.op == opConst && a.a.rat.Cmp(big.NewRat(1, 1)) == 0:
				mirror, ok = closedArg(a.b)
				return ClosedForm{Kind: "log", Scale: big.NewRat(-1, 1), Mirror: mirror}, ok
			case a.op == opPowInt:
				mirror, ok = closedArg(a.a)
				return ClosedForm{Kind: "log", Scale: big.NewRat(a.n, 1), Mirror: mirror}, ok
			}
		case "sqrt":
			if mirror, ok := closedArg(n.a); ok {
				return ClosedForm{Kind: "power", Scale: big.NewRat(1, 1), Power: big.NewRat(1, 2), Mirror: mirror}, true
			}
		}
	case opPow, opPowInt:
		mirror, ok := closedArg(n.a)
		switch {
		case !ok:
		case n.op == opPowInt:
			return ClosedForm{Kind: "power", Scale: big.NewRat(1, 1), Power: big.NewRat(n.n, 1), Mirror: mirror}, true
		case n.b.op == opConst:
			return ClosedForm{Kind: "power", Scale: big.NewRat(1, 1), Power: new(big.Rat).Set(n.b.rat), Mirror: mirror}, true
		}
	case opNeg:
		cf, ok := closedTerm(n.a)
		if ok {
			cf.Scale.Neg(cf.Scale)
		}
		return cf, ok
	case opMul:
		if n.a.op == opConst {
			if cf, ok := closedTerm(n.b); ok {
				cf.Scale.Mul(cf.Scale, n.a.rat)
				return cf, true
			}
		}
		if n.b.op == opConst {
			if cf, ok := closedTerm(n.a); ok {
				cf.Scale.Mul(cf.Scale, n.b.rat)
				return cf, true
			}
		}
	case opDiv:
		if n.b.op == opConst && n.b.rat.Sign() != 0 {
			if cf, ok := closedTerm(n.a); ok {
				cf.Scale.Quo(cf.Scale, n.b.rat)
				return cf, true
			}
		}
	}
	return ClosedForm{}, false
}

// closedArg reports whether n is x (mirror false) or 1 - x (mirror true).
func closedArg(n *node) (mirror, ok bool) {
	switch {
	case n.op == opVar:
		return false, true
	case n.op == opSub && n.a.op == opConst && n.a.rat.Cmp(big.NewRat(1, 1)) == 0 && n.b.op == opVar:
		return true, true
	}
	return false, false
}

// Moments returns the modified moments m_k, k = 0..n-1, of the closed-form
// weight in DefaultBasis of its interval (the monic shifted Legendre
// polynomials q_k on [0, 1]), at prec bits, and for each a bound on its
// rounding error.
//
// With P*_k(x) = P_k(2x - 1), Rodrigues' formula P*_k = (1/k!) D^k g,
// g = (x^2 - x)^k, and k integrations by parts (the boundary terms vanish:
// D^j g has a zero of order k - j at both ends, and the factors below are
// integrable there):
//
//   - -log(x): integral_0^1 -log(x) P*_k dx = (1/k!) (k-1)! integral_0^1
//     x^-k g dx = (1/k) integral_0^1 (x-1)^k dx = (-1)^k / (k (k+1)) for
//     k >= 1, and 1 for k = 0;
//   - x^a: integral_0^1 x^a P*_k dx = (1/k!) a(a-1)...(a-k+1) integral_0^1
//     x^a (1-x)^k dx = a(a-1)...(a-k+1) / ((a+1)(a+2)...(a+k+1)), by the
//     Beta integral.
//
// P*_k has leading coefficient (2k)!/(k!)^2, so the monic moments are
//
//	-log(x): m_0 = 1, m_k = (-1)^k t_k / (k (k+1)), t_k = (k!)^2/(2k)!;
//	x^a:     m_0 = 1/(a+1), m_k = m_{k-1} k (a-k+1) / (2 (2k-1) (a+k+1)),
//
// with t_k = t_{k-1} k / (2 (2k-1)); times Scale, and times (-1)^k for the
// mirrored weight (q_k(1-x) = (-1)^k q_k(x)). TestClosedLogMoments and
// TestClosedPowerMoments check them against the double-exponential
// quadrature of the expression. The ratios of the power case are exact
// rationals, each rounded once. Every operation is rounded to nearest at
// wp >= prec + 32 bits (relative error <= 2^-wp each, at most 2k + 3 of
// them), then the result to prec bits, so
// |error| <= (2^-prec + (2k + 5) 2^-(prec+31)) |m_k|, the bound returned.
func (cf ClosedForm) Moments(n int, prec uint) (m, errBound []*big.Float) {
	if (cf.Kind != "log" && cf.Kind != "power") || n < 1 {
		panic("moments: ClosedForm.Moments of an unknown form or with n < 1")
	}
	wp := max(prec, 64) + 32
	scale := new(big.Float).SetPrec(wp).SetRat(cf.Scale)
	t := new(big.Float).SetPrec(wp).SetInt64(1)
	f := new(big.Float).SetPrec(wp)
	if cf.Kind == "power" {
		a1 := new(big.Rat).Add(cf.Power, big.NewRat(1, 1))
		t.SetRat(a1.Inv(a1))
	}
	m = make([]*big.Float, n)
	errBound = make([]*big.Float, n)
	r := new(big.Rat)
	for k := 0; k < n; k++ {
		v := new(big.Float).SetPrec(wp)
		switch {
		case k == 0:
		case cf.Kind == "power":
			// k (a-k+1) / (2 (2k-1) (a+k+1)), exact, then rounded once.
			num := new(big.Rat).Add(cf.Power, big.NewRat(int64(1-k), 1))
			den := new(big.Rat).Add(cf.Power, big.NewRat(int64(k+1), 1))
			r.Quo(num.Mul(num, big.NewRat(int64(k), int64(2*(2*k-1)))), den)
			t.Mul(t, f.SetRat(r))
		default:
			t.Mul(t, f.SetInt64(int64(k)))
			t.Quo(t, f.SetInt64(int64(2*(2*k-1))))
		}
		switch {
		case k == 0 || cf.Kind == "power":
			v.Mul(t, scale)
		default:
			v.Quo(t, f.SetInt64(int64(k)*int64(k+1)))
			v.Mul(v, scale)
			if k%2 == 1 {
				v.Neg(v)
			}
		}
		if cf.Mirror && k%2 == 1 {
			v.Neg(v)
		}
		m[k] = new(big.Float).SetPrec(prec).Set(v)
		e := new(big.Float).SetPrec(64).SetInt64(int64(2*k + 5))
		e.SetMantExp(e, -int(prec)-31)
		e.Add(e, new(big.Float).SetPrec(64).SetMantExp(big.NewFloat(1), -int(prec)))
		errBound[k] = e.Mul(e, new(big.Float).SetPrec(64).Abs(m[k]))
	}
	return m, errBound
}
