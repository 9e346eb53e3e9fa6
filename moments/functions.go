package moments

import (
	"context"
	"fmt"
	"math/big"
	"sort"

	"quadwright/precision"
)

// FunctionMoments returns I_k = integral over w's interval of f_k(x) w(x) dx
// for each expression f_k in x of fs (len(fs) >= 1, digits >= 1; others
// panic), by the double-exponential quadrature of Moments with the
// functions in place of the basis polynomials: the same pieces, levels,
// splits at kinks, and the same accuracy statement, errEst[k] bounding
// |m[k] - I_k| with errEst[k] <= 10^-digits A_k / 2, A_k about the integral
// of |f_k| w. The functions are evaluated at the extended abscissae, so a
// log(x) near a zero end keeps its digits.
//
// It also returns the nodes x (ascending) and masses c of the final level
// on every piece, a positive discretisation of w fine enough for the
// functions (c_j includes the weight), which callers use as an inner
// product. Values are at precision.WorkingPrec(digits, len(fs)) bits.
//
// Unlike Moments, the integrands may change sign. It fails, with one
// sentence, where Moments does, and where a function cannot be evaluated
// at a node (naming the function and the point).
func (w *Weight) FunctionMoments(ctx context.Context, fs []*Expr, digits int) (m, errEst, x, c []*big.Float, err error) {
	if len(fs) < 1 || digits < 1 {
		panic(fmt.Sprintf("moments: FunctionMoments with %d functions, digits = %d", len(fs), digits))
	}
	prec := precision.WorkingPrec(digits, len(fs))
	p := w.newProblem(len(fs), MonomialBasis(), digits, prec, true)
	p.funcs = fs
	// The functions are no polynomials of bounded degree: give the levels
	// the room of a moment of degree 4 len(fs).
	p.maxLevel = 14
	res, err := w.run(ctx, p)
	if err != nil {
		return nil, nil, nil, nil, err
	}
	m = make([]*big.Float, len(fs))
	errEst = make([]*big.Float, len(fs))
	for k := range m {
		m[k] = res.sum[k].Big(nil).SetPrec(prec)
		errEst[k] = res.est[k].big(prec)
	}
	idx := make([]int, len(res.x))
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(a, b int) bool { return res.x[idx[a]].Cmp(res.x[idx[b]]) < 0 })
	for _, i := range idx {
		if res.c[i].Sign() > 0 {
			x = append(x, res.x[i])
			c = append(c, res.c[i])
		}
	}
	return m, errEst, x, c, nil
}

// addFunctions accumulates the terms c f_k(x) of a function system, with
// their exponents in the scale sums as add does for a basis. The first
// evaluation failure is kept in a.err and stops the accumulation.
func (p *deProblem) addFunctions(a *accum, pt dePoint, c *big.Float) {
	a.cr.SetBig(c)
	for k, f := range p.funcs {
		v, err := f.EvalBig(p.prec, pt.xExt)
		if err != nil {
			a.err = fmt.Errorf("function %s: %v, at x = %s", f.String(), err, precision.FormatSig(pt.x, 10))
			return
		}
		a.t.SetBig(v)
		a.t.Mul(a.t, a.cr)
		a.sum[k].Add(a.sum[k], a.t)
		if a.t.IsZero() {
			if a.zero != nil {
				a.zero[k] = true
			}
			continue
		}
		e := a.t.Exponent()
		a.abs[k].add(e)
		if a.zero != nil {
			a.zero[k], a.expo[k] = false, e
		}
	}
}

// EvalShared evaluates each expression of es (in one variable) at x, at
// prec bits, as EvalBig does, computing each function call (log, exp,
// ...) once for equal arguments across all of them: log(x) in the
// templates x^k*log(x) of a system is formed once per point. The values
// returned are the caller's to modify.
func EvalShared(es []*Expr, prec uint, x *big.Float) ([]*big.Float, error) {
	cache := make(map[string]*big.Float)
	out := make([]*big.Float, len(es))
	for k, e := range es {
		v, err := e.evalBig(prec, cache, []*big.Float{x})
		if err != nil {
			return nil, err
		}
		out[k] = new(big.Float).Set(v) // never the cached value itself
	}
	return out, nil
}
