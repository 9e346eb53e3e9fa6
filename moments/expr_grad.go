package moments

import (
	"fmt"
	"math"
)

// MaxGradVars is the number of variables whose partial derivatives Grad64
// and GradInterval carry (x, y, z of an element).
const MaxGradVars = 3

// scalar is a number type the forward-mode evaluator runs on: float64
// (f64) and enclosing intervals (Interval). Every method returns a new
// value; call returns f(a) and f'(a) for a function of exprFuncs.
type scalar[T any] interface {
	add(T) T
	sub(T) T
	mul(T) T
	div(T) T
	neg() T
	powInt(n int64) T
	log() T
	exp() T
	call(fn string) (T, T)
}

// dual is a value with its gradient: forward-mode automatic
// differentiation, each operation applying the chain rule exactly, so the
// derivatives are those of the expression as written, with no step size.
type dual[T scalar[T]] struct {
	v T
	d [MaxGradVars]T
}

func evalDual[T scalar[T]](n *node, vals []T, nv int, num func(float64) T) dual[T] {
	var r dual[T]
	zero := num(0)
	switch n.op {
	case opConst, opPi, opE:
		c := n.f
		if n.op == opPi {
			c = math.Pi
		} else if n.op == opE {
			c = math.E
		}
		r.v = num(c)
		// An extended-precision scalar takes the exact rational instead.
		if k, ok := any(zero).(interface{ exact(*node) T }); ok {
			r.v = k.exact(n)
		}
		for i := 0; i < nv; i++ {
			r.d[i] = zero
		}
		return r
	case opVar:
		r.v = vals[n.v]
		for i := 0; i < nv; i++ {
			r.d[i] = zero
		}
		r.d[n.v] = num(1)
		return r
	}
	a := evalDual(n.a, vals, nv, num)
	switch n.op {
	case opNeg:
		r.v = a.v.neg()
		for i := 0; i < nv; i++ {
			r.d[i] = a.d[i].neg()
		}
		return r
	case opPowInt:
		if n.n == 0 {
			return evalDual(&node{op: opConst, f: 1}, vals, nv, num)
		}
		// d(a^n) = n a^(n-1) da; a^(n-1) is formed as its own power so
		// that an interval keeps the tight enclosure of an even power.
		r.v = a.v.powInt(n.n)
		c := a.v.powInt(n.n - 1).mul(num(float64(n.n)))
		for i := 0; i < nv; i++ {
			r.d[i] = c.mul(a.d[i])
		}
		return r
	case opFunc:
		f, df := a.v.call(n.fn)
		r.v = f
		for i := 0; i < nv; i++ {
			r.d[i] = df.mul(a.d[i])
		}
		return r
	}
	b := evalDual(n.b, vals, nv, num)
	switch n.op {
	case opAdd, opSub:
		if n.op == opAdd {
			r.v = a.v.add(b.v)
		} else {
			r.v = a.v.sub(b.v)
		}
		for i := 0; i < nv; i++ {
			if n.op == opAdd {
				r.d[i] = a.d[i].add(b.d[i])
			} else {
				r.d[i] = a.d[i].sub(b.d[i])
			}
		}
	case opMul:
		r.v = a.v.mul(b.v)
		for i := 0; i < nv; i++ {
			r.d[i] = a.d[i].mul(b.v).add(a.v.mul(b.d[i]))
		}
	case opDiv:
		r.v = a.v.div(b.v)
		// d(a/b) = (da - (a/b) db) / b
		for i := 0; i < nv; i++ {
			r.d[i] = a.d[i].sub(r.v.mul(b.d[i])).div(b.v)
		}
	default: // opPow: a^b = exp(b log a), d = a^b (db log a + b da / a)
		la := a.v.log()
		r.v = b.v.mul(la).exp()
		for i := 0; i < nv; i++ {
			r.d[i] = r.v.mul(b.d[i].mul(la).add(b.v.mul(a.d[i]).div(a.v)))
		}
	}
	return r
}

// Grad64 evaluates e and its gradient in float64 at vals (one value per
// variable, at most MaxGradVars of them; another count panics). grad, on
// exit, holds the partial derivatives in the order of Vars (it must have
// len(vals) entries). The derivatives come from forward-mode automatic
// differentiation of the parsed tree (the chain rule applied operation by
// operation), never from differences; their accuracy is that of a few
// dozen float64 operations. As with Eval64 the results may be NaN or ±Inf
// where the expression or its derivative is undefined (sqrt at 0, a pole),
// which the caller checks. Eval64 is unchanged by this: the value returned
// here follows the same operations, except that a^b for b not a small
// integer is exp(b log a) (math.Pow in Eval64), equal to a few ulps.
func (e *Expr) Grad64(vals []float64, grad []float64) float64 {
	nv := len(e.vars)
	if len(vals) != nv || len(grad) != nv || nv > MaxGradVars {
		panic(fmt.Sprintf("moments: Grad64 of %q with %d values, %d derivatives for %d variables", e.src, len(vals), len(grad), nv))
	}
	var xs [MaxGradVars]f64
	for i, v := range vals {
		xs[i] = f64(v)
	}
	r := evalDual(e.root, xs[:nv], nv, func(c float64) f64 { return f64(c) })
	for i := range grad {
		grad[i] = float64(r.d[i])
	}
	return float64(r.v)
}

// f64 is float64 as a scalar of the dual evaluator.
type f64 float64

func (a f64) add(b f64) f64 { return a + b }
func (a f64) sub(b f64) f64 { return a - b }
func (a f64) mul(b f64) f64 { return a * b }
func (a f64) div(b f64) f64 { return a / b }
func (a f64) neg() f64      { return -a }
func (a f64) log() f64      { return f64(math.Log(float64(a))) }
func (a f64) exp() f64      { return f64(math.Exp(float64(a))) }
func (a f64) powInt(n int64) f64 {
	return f64(math.Pow(float64(a), float64(n)))
}

func (a f64) call(fn string) (f64, f64) {
	x := float64(a)
	switch fn {
	case "exp":
		v := math.Exp(x)
		return f64(v), f64(v)
	case "log":
		return f64(math.Log(x)), f64(1 / x)
	case "sqrt":
		v := math.Sqrt(x)
		return f64(v), f64(0.5 / v)
	case "abs":
		d := 1.0
		if x < 0 {
			d = -1
		} else if x == 0 {
			d = math.NaN() // no derivative at the kink
		}
		return f64(math.Abs(x)), f64(d)
	case "sin":
		return f64(math.Sin(x)), f64(math.Cos(x))
	case "cos":
		return f64(math.Cos(x)), f64(-math.Sin(x))
	case "tan":
		t := math.Tan(x)
		return f64(t), f64(1 + t*t)
	case "atan":
		return f64(math.Atan(x)), f64(1 / (1 + x*x))
	case "sinh":
		return f64(math.Sinh(x)), f64(math.Cosh(x))
	case "cosh":
		return f64(math.Cosh(x)), f64(math.Sinh(x))
	case "tanh":
		t := math.Tanh(x)
		return f64(t), f64(1 - t*t)
	}
	panic("moments: unknown function " + fn)
}
