package moments

import (
	"fmt"
	"math/big"

	"quadwright/precision"
)

// GradBig evaluates e and its gradient at vals (one per variable, at most
// MaxGradVars; another count panics) by forward-mode automatic
// differentiation at prec bits: every operation on the value and on each
// partial derivative is rounded once to prec bits (+ - * / correctly, the
// elementary functions of package precision within an ulp), constants are
// the exact rationals of the expression rounded to prec. The results
// therefore carry about prec - log2(condition) - log2(operations) bits,
// the accuracy of EvalBig. grad, on exit, holds the partial derivatives
// in the order of Vars (len(vals) entries, each a new *big.Float).
//
// It returns an error, never panics, where the expression or its
// derivative is undefined at vals (log of a number <= 0, a square root at
// or below 0, division by zero, abs at its kink, overflow).
func (e *Expr) GradBig(prec uint, vals []*big.Float, grad []*big.Float) (*big.Float, error) {
	nv := len(e.vars)
	if len(vals) != nv || len(grad) != nv || nv > MaxGradVars || prec == 0 {
		panic(fmt.Sprintf("moments: GradBig of %q with %d values, %d derivatives for %d variables at %d bits", e.src, len(vals), len(grad), nv, prec))
	}
	var xs [MaxGradVars]bigS
	for i, v := range vals {
		xs[i] = bigS{x: new(big.Float).SetPrec(prec).Set(v), p: prec}
	}
	r := evalDual(e.root, xs[:nv], nv, func(c float64) bigS {
		return bigS{x: new(big.Float).SetPrec(prec).SetFloat64(c), p: prec}
	})
	if r.v.bad {
		return nil, fmt.Errorf("level set %s: undefined at the point, or its derivative is", quoteExpr(e.src))
	}
	for i := range grad {
		if r.d[i].bad {
			return nil, fmt.Errorf("level set %s: its derivative is undefined at the point", quoteExpr(e.src))
		}
		grad[i] = r.d[i].x
	}
	return r.v.x, nil
}

// bigS is a big.Float of precision p as a scalar of the dual evaluator;
// bad marks a value that is undefined (its x is then 0), and spreads.
type bigS struct {
	x   *big.Float
	p   uint
	bad bool
}

func (a bigS) mk() *big.Float { return new(big.Float).SetPrec(a.p) }

func (a bigS) fail() bigS { return bigS{x: a.mk(), p: a.p, bad: true} }

func (a bigS) ok(x *big.Float, others ...bigS) bigS {
	for _, o := range others {
		if o.bad {
			return a.fail()
		}
	}
	if a.bad || x.IsInf() {
		return a.fail()
	}
	return bigS{x: x, p: a.p}
}

// exact gives a constant node its exact rational value at a's precision
// (evalDual's hook; the float64 constant would lose digits of 0.1).
func (a bigS) exact(n *node) bigS {
	switch n.op {
	case opPi:
		return bigS{x: precision.Pi(a.p), p: a.p}
	case opE:
		return bigS{x: precision.ExpTo(new(big.Float).SetPrec(a.p).SetInt64(1), a.p), p: a.p}
	}
	if n.rat == nil {
		return bigS{x: a.mk().SetFloat64(n.f), p: a.p} // evalDual's own constant 1 of a^0
	}
	return bigS{x: a.mk().SetRat(n.rat), p: a.p}
}

func (a bigS) add(b bigS) bigS {
	if a.bad || b.bad {
		return a.fail()
	}
	return a.ok(a.mk().Add(a.x, b.x))
}

func (a bigS) sub(b bigS) bigS {
	if a.bad || b.bad {
		return a.fail()
	}
	return a.ok(a.mk().Sub(a.x, b.x))
}

func (a bigS) mul(b bigS) bigS {
	if a.bad || b.bad {
		return a.fail()
	}
	return a.ok(a.mk().Mul(a.x, b.x))
}

func (a bigS) div(b bigS) bigS {
	if a.bad || b.bad || b.x.Sign() == 0 {
		return a.fail()
	}
	return a.ok(a.mk().Quo(a.x, b.x))
}

func (a bigS) neg() bigS {
	if a.bad {
		return a
	}
	return bigS{x: a.mk().Neg(a.x), p: a.p}
}

// powInt is a^n by binary powering at p + 2 log2|n| + 8 bits, rounded
// once to p (as EvalBig's integer powers).
func (a bigS) powInt(n int64) bigS {
	if a.bad {
		return a
	}
	if n == 0 {
		return bigS{x: a.mk().SetInt64(1), p: a.p}
	}
	if a.x.Sign() == 0 {
		if n < 0 {
			return a.fail()
		}
		return bigS{x: a.mk(), p: a.p}
	}
	w := a.p + 2*uint(bitLen64(abs64(n))) + 8
	r := new(big.Float).SetPrec(w).SetInt64(1)
	sq := new(big.Float).SetPrec(w).Set(a.x)
	for m := abs64(n); ; {
		if m&1 == 1 {
			r.Mul(r, sq)
		}
		if m >>= 1; m == 0 {
			break
		}
		sq.Mul(sq, sq)
	}
	if n < 0 {
		if r.Sign() == 0 {
			return a.fail()
		}
		r.Quo(new(big.Float).SetPrec(w).SetInt64(1), r)
	}
	return a.ok(a.mk().Set(r))
}

func (a bigS) log() bigS {
	if a.bad || a.x.Sign() <= 0 {
		return a.fail()
	}
	return a.ok(precision.LogTo(a.x, a.p))
}

func (a bigS) exp() bigS {
	if a.bad {
		return a
	}
	return a.ok(precision.ExpTo(a.x, a.p))
}

// call returns f(a) and f'(a) at p bits for a function of exprFuncs.
func (a bigS) call(fn string) (bigS, bigS) {
	if a.bad {
		return a, a
	}
	one := a.mk().SetInt64(1)
	x := a.x
	switch fn {
	case "exp":
		v := a.exp()
		return v, v
	case "log":
		if x.Sign() <= 0 {
			return a.fail(), a.fail()
		}
		return a.log(), a.ok(a.mk().Quo(one, x))
	case "sqrt":
		if x.Sign() <= 0 {
			return a.fail(), a.fail()
		}
		s := a.mk().Set(precision.Sqrt(x))
		d := a.mk().Quo(one, s)
		return a.ok(s), a.ok(d.SetMantExp(d, -1))
	case "abs":
		if x.Sign() == 0 {
			return a.fail(), a.fail() // no derivative at the kink
		}
		return a.ok(a.mk().Abs(x)), a.ok(a.mk().SetInt64(int64(x.Sign())))
	case "sin", "cos", "tan":
		if x.MantExp(nil) > maxTrigExp {
			return a.fail(), a.fail()
		}
		s, c := a.mk().Set(precision.Sin(x)), a.mk().Set(precision.Cos(x))
		switch fn {
		case "sin":
			return a.ok(s), a.ok(c)
		case "cos":
			return a.ok(c), a.ok(a.mk().Neg(s))
		}
		if c.Sign() == 0 {
			return a.fail(), a.fail()
		}
		t := a.mk().Quo(s, c)
		return a.ok(t), a.ok(a.mk().Add(one, a.mk().Mul(t, t)))
	case "atan":
		d := a.mk().Mul(x, x)
		return a.ok(a.mk().Set(precision.Atan(x))), a.ok(d.Quo(one, d.Add(d, one)))
	case "sinh", "cosh", "tanh":
		// e^x - e^-x cancels about -log2|x| bits for |x| < 1: so many
		// extra bits are carried.
		w := a.p + 16
		if e := x.MantExp(nil); e < 0 {
			w += uint(-e)
		}
		ex := precision.ExpTo(new(big.Float).SetPrec(w).Set(x), w)
		if ex.IsInf() || ex.Sign() == 0 {
			return a.fail(), a.fail()
		}
		em := new(big.Float).SetPrec(w).Quo(big.NewFloat(1), ex)
		sh := new(big.Float).SetPrec(w).Sub(ex, em)
		sh.SetMantExp(sh, -1)
		ch := new(big.Float).SetPrec(w).Add(ex, em)
		ch.SetMantExp(ch, -1)
		switch fn {
		case "sinh":
			return a.ok(a.mk().Set(sh)), a.ok(a.mk().Set(ch))
		case "cosh":
			return a.ok(a.mk().Set(ch)), a.ok(a.mk().Set(sh))
		}
		t := new(big.Float).SetPrec(w).Quo(sh, ch)
		d := new(big.Float).SetPrec(w).Mul(t, t)
		return a.ok(a.mk().Set(t)), a.ok(a.mk().Sub(one, d))
	}
	panic("moments: unknown function " + fn)
}
