package moments

import (
	"math/big"
)

// ClosedForm names a weight whose modified moments are known in closed
// form, recognised from its expression and interval by (*Weight).ClosedForm.
type ClosedForm struct {
	// Kind is "log": w(x) = Scale * (-log(x)) on [0, 1].
	Kind  string
	Scale *big.Rat // > 0
}

// ClosedForm reports whether w is a weight whose modified moments in
// DefaultBasis(w.Interval) have a closed form: so far c * (-log(x)) on
// [0, 1], c > 0 a rational, written in any of the forms c * log(x) with
// c < 0 folded from negations, products and quotients by constants, or
// log(1/x) and log(x^-1) (so "-log(x)", "log(1/x)", "-2*log(x)",
// "log(x)/(-3)" all qualify).
func (w *Weight) ClosedForm() (ClosedForm, bool) {
	iv := w.Interval
	if !iv.Finite() || iv.Lo.Value.Sign() != 0 || iv.Hi.Value.Cmp(big.NewRat(1, 1)) != 0 || len(w.Expr.vars) != 1 {
		return ClosedForm{}, false
	}
	c, ok := logMultiple(w.Expr.root)
	if !ok || c.Sign() >= 0 {
		return ClosedForm{}, false
	}
	return ClosedForm{Kind: "log", Scale: c.Neg(c)}, true
}

// logMultiple reports whether n is c * log(x) for a rational constant c,
// and returns c.
func logMultiple(n *node) (*big.Rat, bool) {
	switch n.op {
	case opFunc:
		if n.fn != "log" {
			return nil, false
		}
		switch a := n.a; {
		case a.op == opVar:
			return big.NewRat(1, 1), true
		case a.op == opDiv && a.a.op == opConst && a.a.rat.Cmp(big.NewRat(1, 1)) == 0 && a.b.op == opVar:
			return big.NewRat(-1, 1), true
		case a.op == opPowInt && a.a.op == opVar:
			return big.NewRat(a.n, 1), true
		}
	case opNeg:
		c, ok := logMultiple(n.a)
		if ok {
			c.Neg(c)
		}
		return c, ok
	case opMul:
		if n.a.op == opConst {
			if c, ok := logMultiple(n.b); ok {
				return c.Mul(c, n.a.rat), true
			}
		}
		if n.b.op == opConst {
			if c, ok := logMultiple(n.a); ok {
				return c.Mul(c, n.b.rat), true
			}
		}
	case opDiv:
		if n.b.op == opConst && n.b.rat.Sign() != 0 {
			if c, ok := logMultiple(n.a); ok {
				return c.Quo(c, n.b.rat), true
			}
		}
	}
	return nil, false
}

// Moments returns the modified moments m_k, k = 0..n-1, of the closed-form
// weight in DefaultBasis of its interval (the monic shifted Legendre
// polynomials q_k on [0, 1]), at prec bits, and for each a bound on its
// rounding error.
//
// For w = -log(x) on [0, 1]: with P*_k(x) = P_k(2x - 1) the shifted Legendre
// polynomial, integral_0^1 -log(x) P*_k(x) dx = 1 for k = 0 and
// (-1)^k / (k (k+1)) for k >= 1. Derivation: Rodrigues' formula
// P*_k = (1/k!) D^k g, g = (x^2 - x)^k, and k integrations by parts (the
// boundary terms vanish, D^j g having a zero of order k - j at both ends)
// give (1/k!) (k-1)! integral_0^1 x^-k g dx = (1/k) integral_0^1 (x-1)^k dx
// = (-1)^k / (k (k+1)). TestClosedLogMoments checks it against the
// double-exponential quadrature of the expression.
// P*_k has leading coefficient (2k)!/(k!)^2, so the monic moments are
//
//	m_0 = 1,  m_k = (-1)^k (k!)^2 / ((2k)! k (k+1)),
//
// formed by t_k = t_{k-1} k / (2 (2k - 1)), t_0 = 1, m_k = (-1)^k t_k /
// (k (k+1)), each multiplied by Scale. Every operation is rounded to
// nearest at prec + 32 bits (relative error <= 2^-(prec+32) each, at most
// 2k + 3 of them), then the result to prec bits, so
// |error| <= (2^-prec + (2k + 5) 2^-(prec+31)) |m_k|, the bound returned.
func (cf ClosedForm) Moments(n int, prec uint) (m, errBound []*big.Float) {
	if cf.Kind != "log" || n < 1 {
		panic("moments: ClosedForm.Moments of an unknown form or with n < 1")
	}
	wp := max(prec, 64) + 32
	scale := new(big.Float).SetPrec(wp).SetRat(cf.Scale)
	t := new(big.Float).SetPrec(wp).SetInt64(1)
	f := new(big.Float).SetPrec(wp)
	m = make([]*big.Float, n)
	errBound = make([]*big.Float, n)
	for k := 0; k < n; k++ {
		v := new(big.Float).SetPrec(wp)
		if k == 0 {
			v.Set(scale)
		} else {
			t.Mul(t, f.SetInt64(int64(k)))
			t.Quo(t, f.SetInt64(int64(2*(2*k-1))))
			v.Quo(t, f.SetInt64(int64(k)*int64(k+1)))
			v.Mul(v, scale)
			if k%2 == 1 {
				v.Neg(v)
			}
		}
		m[k] = new(big.Float).SetPrec(prec).Set(v)
		e := new(big.Float).SetPrec(64).SetInt64(int64(2*k + 5))
		e.SetMantExp(e, -int(prec)-31)
		e.Add(e, new(big.Float).SetPrec(64).SetMantExp(big.NewFloat(1), -int(prec)))
		errBound[k] = e.Mul(e, new(big.Float).SetPrec(64).Abs(m[k]))
	}
	return m, errBound
}
