package moments

import (
	"fmt"
	"math"
)

// Prog64 is an Expr compiled into a flat list of float64 operations, one
// register per operation of the tree in post-order, for the inner loops
// that evaluate one expression millions of times (the root searches of
// cut-element rules). Value follows the operations of Eval64 and Grad
// those of Grad64, operation for operation, so the results are the same
// numbers (a square a^2 is a*a, which math.Pow also computes with one
// rounding, except where the square is subnormal). A Prog64 keeps its
// registers inside: it is not safe for concurrent use; compile one per
// goroutine.
type Prog64 struct {
	src  string
	nv   int
	code []inst64
	val  []float64
	der  []float64 // MaxGradVars partial derivatives per register
}

type inst64 struct {
	op   opKind
	a, b int32 // operand registers
	c    float64
	n    int64 // opVar: the variable; opPowInt: the exponent
	fn   string
	f    func(float64) float64
}

// Compile64 compiles e for Prog64.Value and Prog64.Grad.
func (e *Expr) Compile64() *Prog64 {
	p := &Prog64{src: e.src, nv: len(e.vars)}
	p.emit(e.root)
	p.val = make([]float64, len(p.code))
	p.der = make([]float64, MaxGradVars*len(p.code))
	return p
}

func (p *Prog64) emit(n *node) int32 {
	in := inst64{op: n.op, a: -1, b: -1}
	switch n.op {
	case opConst:
		in.c = n.f
	case opPi:
		in.op, in.c = opConst, math.Pi
	case opE:
		in.op, in.c = opConst, math.E
	case opVar:
		in.n = int64(n.v)
	case opPowInt:
		if n.n == 0 {
			// a^0 is 1 whatever a is, in Eval64 (math.Pow) and Grad64.
			in.op, in.c = opConst, 1
			break
		}
		in.a, in.n = p.emit(n.a), n.n
	case opNeg:
		in.a = p.emit(n.a)
	case opFunc:
		in.a, in.fn, in.f = p.emit(n.a), n.fn, funcs64[n.fn]
	default:
		in.a = p.emit(n.a)
		in.b = p.emit(n.b)
	}
	p.code = append(p.code, in)
	return int32(len(p.code) - 1)
}

// powInt64 is math.Pow(a, n) with the common small exponents inline.
func powInt64(a float64, n int64) float64 {
	switch n {
	case 1:
		return a
	case 2:
		return a * a
	}
	return math.Pow(a, float64(n))
}

// Value is Eval64 of the compiled expression at vals (one value per
// variable; another count panics).
func (p *Prog64) Value(vals []float64) float64 {
	if len(vals) != p.nv {
		panic(fmt.Sprintf("moments: Value of %q with %d values for %d variables", p.src, len(vals), p.nv))
	}
	r := p.val
	for i := range p.code {
		in := &p.code[i]
		var v float64
		switch in.op {
		case opConst:
			v = in.c
		case opVar:
			v = vals[in.n]
		case opNeg:
			v = -r[in.a]
		case opPowInt:
			v = powInt64(r[in.a], in.n)
		case opFunc:
			v = in.f(r[in.a])
		case opAdd:
			v = r[in.a] + r[in.b]
		case opSub:
			v = r[in.a] - r[in.b]
		case opMul:
			v = r[in.a] * r[in.b]
		case opDiv:
			v = r[in.a] / r[in.b]
		default: // opPow
			v = math.Pow(r[in.a], r[in.b])
		}
		r[i] = v
	}
	return r[len(r)-1]
}

// Grad is Grad64 of the compiled expression: the value at vals and, in
// grad (len(vals) entries), the partial derivatives by forward-mode
// automatic differentiation.
func (p *Prog64) Grad(vals []float64, grad []float64) float64 {
	nv := p.nv
	if len(vals) != nv || len(grad) != nv || nv > MaxGradVars {
		panic(fmt.Sprintf("moments: Grad of %q with %d values, %d derivatives for %d variables", p.src, len(vals), len(grad), nv))
	}
	r, d := p.val, p.der
	const s = MaxGradVars
	for i := range p.code {
		in := &p.code[i]
		di := d[s*i : s*i+s]
		switch in.op {
		case opConst:
			r[i] = in.c
			di[0], di[1], di[2] = 0, 0, 0
		case opVar:
			r[i] = vals[in.n]
			di[0], di[1], di[2] = 0, 0, 0
			di[in.n] = 1
		case opNeg:
			r[i] = -r[in.a]
			da := d[s*in.a : s*in.a+s]
			for j := 0; j < nv; j++ {
				di[j] = -da[j]
			}
		case opPowInt:
			a := r[in.a]
			r[i] = powInt64(a, in.n)
			c := float64(powInt64(a, in.n-1) * float64(in.n))
			da := d[s*in.a : s*in.a+s]
			for j := 0; j < nv; j++ {
				di[j] = c * da[j]
			}
		case opFunc:
			f, df := f64(r[in.a]).call(in.fn)
			r[i] = float64(f)
			da := d[s*in.a : s*in.a+s]
			for j := 0; j < nv; j++ {
				di[j] = float64(df) * da[j]
			}
		case opAdd, opSub, opMul, opDiv, opPow:
			a, b := r[in.a], r[in.b]
			da, db := d[s*in.a:s*in.a+s], d[s*in.b:s*in.b+s]
			switch in.op {
			case opAdd:
				r[i] = a + b
				for j := 0; j < nv; j++ {
					di[j] = da[j] + db[j]
				}
			case opSub:
				r[i] = a - b
				for j := 0; j < nv; j++ {
					di[j] = da[j] - db[j]
				}
			case opMul:
				r[i] = a * b
				// The conversions round each product (no fused
				// multiply-add), as the method calls of Grad64 do.
				for j := 0; j < nv; j++ {
					di[j] = float64(da[j]*b) + float64(a*db[j])
				}
			case opDiv:
				v := a / b
				r[i] = v
				for j := 0; j < nv; j++ {
					di[j] = (da[j] - float64(v*db[j])) / b
				}
			default: // a^b = exp(b log a)
				la := math.Log(a)
				v := math.Exp(float64(b * la))
				r[i] = v
				for j := 0; j < nv; j++ {
					di[j] = v * (float64(db[j]*la) + float64(b*da[j])/a)
				}
			}
		}
	}
	last := len(p.code) - 1
	for j := range grad {
		grad[j] = d[s*last+j]
	}
	return r[last]
}
