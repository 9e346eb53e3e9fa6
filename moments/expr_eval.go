package moments

import (
	"errors"
	"fmt"
	"math"
	"math/big"

	"quadwright/precision"
)

// Eval64 evaluates e in float64 arithmetic at the variable values vals (one
// per variable, in the order of Vars; another count panics). Every
// operation rounds to nearest as IEEE 754 does, the functions are those of
// package math, and integer powers are math.Pow with an integer exponent;
// the result may be NaN or ±Inf (log of a negative number, overflow, 0/0),
// which the caller checks. The accuracy is that of a few dozen float64
// operations: meant for sampling and plots, never for a printed digit.
func (e *Expr) Eval64(vals ...float64) float64 {
	if len(vals) != len(e.vars) {
		panic(fmt.Sprintf("moments: Eval64 of %q with %d values for %d variables", e.src, len(vals), len(e.vars)))
	}
	return eval64(e.root, vals)
}

func eval64(n *node, vals []float64) float64 {
	switch n.op {
	case opConst:
		return n.f
	case opPi:
		return math.Pi
	case opE:
		return math.E
	case opVar:
		return vals[n.v]
	case opNeg:
		return -eval64(n.a, vals)
	case opPowInt:
		return math.Pow(eval64(n.a, vals), float64(n.n))
	case opFunc:
		return func64(n.fn, eval64(n.a, vals))
	}
	a, b := eval64(n.a, vals), eval64(n.b, vals)
	switch n.op {
	case opAdd:
		return a + b
	case opSub:
		return a - b
	case opMul:
		return a * b
	case opDiv:
		return a / b
	}
	return math.Pow(a, b)
}

// funcs64 are the float64 versions of the functions of exprFuncs.
var funcs64 = map[string]func(float64) float64{
	"exp": math.Exp, "log": math.Log, "sqrt": math.Sqrt, "abs": math.Abs,
	"sin": math.Sin, "cos": math.Cos, "tan": math.Tan, "atan": math.Atan,
	"sinh": math.Sinh, "cosh": math.Cosh, "tanh": math.Tanh,
}

func func64(fn string, a float64) float64 { return funcs64[fn](a) }

// EvalBig evaluates e at the variable values vals (one per variable, in the
// order of Vars; another count panics) and returns the result rounded to
// prec bits (prec >= 1).
//
// Every operation is carried out at prec bits by math/big or package
// precision and rounds once (+ - * / correctly, the elementary functions
// within 1 ulp); integer powers x^n are repeated products at prec + 2
// log2|n| + 8 bits, never exp(n log x). The result is therefore accurate to
// about prec - log2(condition) - log2(operations) bits, where condition is
// the relative condition number of the expression at vals; for the weight
// expressions users write (a few dozen operations, well-conditioned away
// from their singularities) that is prec - 10 bits or better.
//
// The variable values are used as given, not rounded to prec: a value
// carrying more bits makes 1-x exact when x lies closer to 1 than 2^-prec,
// which is how the quadrature keeps end singularities such as (1-x)^-0.5
// accurate. Constants are then rounded to the largest precision among prec
// and the values, so that an end point written in the expression and the
// same end point in the value cancel exactly, and + - * /, integer powers,
// negation and abs keep the largest precision of their operands (so that
// 1-x^2 survives too); the functions round to prec.
//
// EvalBig returns an error, never panics, for the log of a number <= 0, a
// square root of a number < 0, division by zero, 0 to a power <= 0, a
// non-integer power of a negative number, tan at a pole, and a result or
// intermediate beyond the range of big.Float (overflow); the error is one
// sentence that names the expression and the position of the operation.
func (e *Expr) EvalBig(prec uint, vals ...*big.Float) (*big.Float, error) {
	return e.evalBig(prec, nil, vals)
}

func (e *Expr) evalBig(prec uint, cache map[string]*big.Float, vals []*big.Float) (*big.Float, error) {
	if len(vals) != len(e.vars) {
		panic(fmt.Sprintf("moments: EvalBig of %q with %d values for %d variables", e.src, len(vals), len(e.vars)))
	}
	if prec == 0 {
		panic("moments: EvalBig at precision 0")
	}
	cp := prec
	for _, v := range vals {
		if v.IsInf() {
			panic("moments: EvalBig at an infinite value")
		}
		cp = max(cp, v.Prec())
	}
	// A divisor that cancels to zero at prec bits (exp(x)-1 at x = 1e-138)
	// is evaluated again at twice the bits, up to maxCancelRetries times:
	// the value of x/(exp(x)-1) there is well defined, only the working
	// precision was too short to see it. A divisor that is zero at every
	// precision stays an error.
	var r *big.Float
	var err error
	for try, p := 0, prec; ; try, p = try+1, 2*p {
		ev := bigEval{e: e, prec: p, constPrec: max(cp, p), vals: vals, cache: cache}
		r, err = ev.eval(e.root)
		var ce *cancelError
		if err == nil || !errors.As(err, &ce) || try == maxCancelRetries {
			break
		}
	}
	if err != nil {
		return nil, err
	}
	if r.Prec() != prec {
		r = new(big.Float).SetPrec(prec).Set(r)
	}
	return r, nil
}

// maxCancelRetries bounds the doublings of precision EvalBig tries when a
// divisor cancels to zero (32 times the bits asked at most).
const maxCancelRetries = 5

// cancelError is a division by a computed zero, which more bits may resolve.
type cancelError struct{ err error }

func (e *cancelError) Error() string { return e.err.Error() }
func (e *cancelError) Unwrap() error { return e.err }

type bigEval struct {
	e         *Expr
	prec      uint
	constPrec uint
	vals      []*big.Float
	// cache, when not nil, keeps the values of function calls by name,
	// precision and argument, shared between expressions (EvalShared).
	cache map[string]*big.Float
}

func (ev *bigEval) fail(n *node, format string, args ...any) error {
	return fmt.Errorf("weight %s: position %d: %s", quoteExpr(ev.e.src), charPos(ev.e.src, n.pos), fmt.Sprintf(format, args...))
}

func (ev *bigEval) newf() *big.Float { return new(big.Float).SetPrec(ev.prec) }

// wide returns a zero value at the larger of prec and the precisions of
// the operands: arithmetic on a value given with extra bits keeps them, so
// that 1-x^2 at x = 1-d (x carrying the bits of d) is still 2d-d^2 to prec
// relative bits. Values of ordinary precision never carry more than prec.
func (ev *bigEval) wide(a, b *big.Float) *big.Float {
	p := max(ev.prec, a.Prec())
	if b != nil {
		p = max(p, b.Prec())
	}
	return new(big.Float).SetPrec(p)
}

// finite turns an overflow into an error, so that no later operation meets
// an infinity (math/big panics on Inf - Inf and 0 * Inf).
func (ev *bigEval) finite(n *node, r *big.Float) (*big.Float, error) {
	if r.IsInf() {
		return nil, ev.fail(n, "the value overflows")
	}
	return r, nil
}

func (ev *bigEval) eval(n *node) (*big.Float, error) {
	switch n.op {
	case opConst:
		return new(big.Float).SetPrec(ev.constPrec).SetRat(n.rat), nil
	case opPi:
		return precision.Pi(ev.constPrec), nil
	case opE:
		return precision.Exp(new(big.Float).SetPrec(ev.constPrec).SetInt64(1)), nil
	case opVar:
		return ev.vals[n.v], nil
	}
	a, err := ev.eval(n.a)
	if err != nil {
		return nil, err
	}
	switch n.op {
	case opNeg:
		return ev.wide(a, nil).Neg(a), nil
	case opPowInt:
		return ev.powInt(n, a)
	case opFunc:
		return ev.call(n, a)
	}
	b, err := ev.eval(n.b)
	if err != nil {
		return nil, err
	}
	switch n.op {
	case opAdd:
		return ev.finite(n, ev.wide(a, b).Add(a, b))
	case opSub:
		return ev.finite(n, ev.wide(a, b).Sub(a, b))
	case opMul:
		return ev.finite(n, ev.wide(a, b).Mul(a, b))
	case opDiv:
		if b.Sign() == 0 {
			if n.b.op != opConst {
				return nil, &cancelError{ev.fail(n, "division by zero")}
			}
			return nil, ev.fail(n, "division by zero")
		}
		return ev.finite(n, ev.wide(a, b).Quo(a, b))
	}
	return ev.pow(n, a, b)
}

// powInt forms a^n by binary powering at prec + 2 log2|n| + 8 bits, so that
// the log2|n| roundings of the products cost no bit of the result.
func (ev *bigEval) powInt(n *node, a *big.Float) (*big.Float, error) {
	k := n.n
	if k == 0 {
		return ev.newf().SetInt64(1), nil
	}
	if a.Sign() == 0 {
		if k < 0 {
			return nil, ev.fail(n, "0 to a negative power")
		}
		return ev.newf(), nil
	}
	w := max(ev.prec, a.Prec()) + 2*uint(bitLen64(abs64(k))) + 8
	r := new(big.Float).SetPrec(w).SetInt64(1)
	sq := new(big.Float).SetPrec(w).Set(a)
	for m := abs64(k); ; {
		if m&1 == 1 {
			r.Mul(r, sq)
		}
		m >>= 1
		if m == 0 {
			break
		}
		sq.Mul(sq, sq)
		if sq.IsInf() || sq.Sign() == 0 {
			break // r then overflows or underflows below, reported or exact 0
		}
	}
	if sq.IsInf() || r.IsInf() {
		if k > 0 {
			return nil, ev.fail(n, "the value overflows")
		}
		return ev.newf(), nil
	}
	if k < 0 {
		if r.Sign() == 0 {
			return nil, ev.fail(n, "the value overflows")
		}
		r.Quo(new(big.Float).SetPrec(w).SetInt64(1), r)
	}
	return ev.finite(n, ev.wide(a, nil).Set(r))
}

func bitLen64(v int64) int {
	b := 0
	for ; v != 0; v >>= 1 {
		b++
	}
	return b
}

// pow is a^b for a b that is not a small integer constant: e^(b ln a) for
// a > 0 (precision.Pow), 0 for a = 0 < b, and (-1)^b |a|^b when a < 0 and b
// is an integer value.
func (ev *bigEval) pow(n *node, a, b *big.Float) (*big.Float, error) {
	switch a.Sign() {
	case 0:
		if b.Sign() <= 0 {
			return nil, ev.fail(n, "0 to a power <= 0")
		}
		return ev.newf(), nil
	case 1:
		return ev.finite(n, precision.PowTo(a, b, ev.prec))
	}
	if !b.IsInt() {
		return nil, ev.fail(n, "a power of a negative number with an exponent that is not an integer")
	}
	r := precision.PowTo(new(big.Float).Neg(a), b, ev.prec)
	if r.IsInf() {
		return nil, ev.fail(n, "the value overflows")
	}
	// b is an integer; its parity decides the sign.
	bi, _ := b.Int(nil)
	if bi.Bit(0) == 1 {
		r.Neg(r)
	}
	return ev.newf().Set(r), nil
}

// atPrec returns x at at least prec bits (x itself when it has them), so
// that a function of package precision, which works at its argument's
// precision, delivers prec bits.
func atPrec(x *big.Float, prec uint) *big.Float {
	if x.Prec() >= prec {
		return x
	}
	return new(big.Float).SetPrec(prec).Set(x)
}

// maxTrigExp bounds the binary exponent of a sine, cosine or tangent
// argument: reducing a larger one modulo pi would need more bits of pi than
// any weight a user means justifies.
const maxTrigExp = 4096

// call applies the function of n to a at prec bits. Arguments keep their
// own precision (see EvalBig); the results are rounded to prec.
func (ev *bigEval) call(n *node, a *big.Float) (*big.Float, error) {
	if ev.cache == nil {
		return ev.callOnce(n, a)
	}
	key := fmt.Sprintf("%s:%d:%s", n.fn, ev.prec, a.Text('p', 0))
	if v, ok := ev.cache[key]; ok {
		return v, nil
	}
	v, err := ev.callOnce(n, a)
	if err == nil {
		ev.cache[key] = v
	}
	return v, err
}

func (ev *bigEval) callOnce(n *node, a *big.Float) (*big.Float, error) {
	prec := ev.prec
	a = atPrec(a, prec)
	if n.fn != "log" && a.Prec() > prec+64 {
		// Only log needs the extra bits of its argument (to form x-1
		// exactly near 1); the others are as accurate from a relatively
		// accurate argument, and cost less at prec+64 bits than at the
		// thousands of bits a point near an end can carry.
		a = new(big.Float).SetPrec(prec + 64).Set(a)
	}
	if (n.fn == "sin" || n.fn == "cos" || n.fn == "tan") && a.MantExp(nil) > maxTrigExp {
		return nil, ev.fail(n, "%s of a number beyond 2^%d in magnitude", n.fn, maxTrigExp)
	}
	switch n.fn {
	case "exp":
		return ev.finite(n, precision.ExpTo(a, prec))
	case "log":
		if a.Sign() <= 0 {
			return nil, ev.fail(n, "log of a number <= 0")
		}
		return precision.LogTo(a, prec), nil
	case "sqrt":
		if a.Sign() < 0 {
			return nil, ev.fail(n, "square root of a negative number")
		}
		return ev.newf().Set(precision.Sqrt(a)), nil
	case "abs":
		return ev.wide(a, nil).Abs(a), nil
	case "sin":
		return ev.newf().Set(precision.Sin(a)), nil
	case "cos":
		return ev.newf().Set(precision.Cos(a)), nil
	case "tan":
		w := prec + 16
		aw := atPrec(a, w)
		c := precision.Cos(aw)
		if c.Sign() == 0 {
			return nil, ev.fail(n, "tan at a pole")
		}
		return ev.finite(n, ev.newf().Quo(precision.Sin(aw), c))
	case "atan":
		return ev.newf().Set(precision.Atan(a)), nil
	case "sinh", "tanh":
		return ev.sinhTanh(n, a)
	case "cosh":
		ea := precision.ExpTo(new(big.Float).SetPrec(prec+8).Abs(a), prec+8)
		if ea.IsInf() {
			return nil, ev.fail(n, "the value overflows")
		}
		r := new(big.Float).SetPrec(prec+8).Quo(big.NewFloat(1), ea)
		r.Add(r, ea)
		return ev.finite(n, ev.newf().Quo(r, big.NewFloat(2)))
	}
	panic("moments: unknown function " + n.fn)
}

// sinhTanh computes sinh a = (e^|a| - e^-|a|)/2 and tanh a = (1 - e^-2|a|)/(1
// + e^-2|a|) with the sign of a. The differences cancel about -log2|a| bits
// when |a| < 1, so they are formed with that many extra bits; below
// |a| = 2^-(prec/2+2) the first term of the Taylor series, a, is already
// within an ulp.
func (ev *bigEval) sinhTanh(n *node, a *big.Float) (*big.Float, error) {
	prec := ev.prec
	if a.Sign() == 0 {
		return ev.newf(), nil
	}
	e := a.MantExp(nil)
	if e < -int(prec/2)-2 {
		return ev.newf().Set(a), nil
	}
	w := prec + 16
	if e < 0 {
		w += uint(-e)
	}
	abs := new(big.Float).SetPrec(w).Abs(a)
	var r *big.Float
	if n.fn == "sinh" {
		ea := precision.ExpTo(abs, w)
		if ea.IsInf() {
			return nil, ev.fail(n, "the value overflows")
		}
		r = new(big.Float).SetPrec(w).Quo(big.NewFloat(1), ea)
		r.Sub(ea, r)
		r.Quo(r, big.NewFloat(2))
	} else {
		t := precision.ExpTo(abs.Mul(abs, big.NewFloat(-2)), w)
		one := big.NewFloat(1)
		num := new(big.Float).SetPrec(w).Sub(one, t)
		r = num.Quo(num, new(big.Float).SetPrec(w).Add(one, t))
	}
	if a.Sign() < 0 {
		r.Neg(r)
	}
	return ev.newf().Set(r), nil
}
