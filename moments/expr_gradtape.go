package moments

import (
	"fmt"
	"math/big"

	"quadwright/precision"
)

// GradTape is an expression compiled, at one precision, for repeated
// evaluation of its value and of up to MaxGradVars directional
// derivatives (forward-mode automatic differentiation along tangent
// vectors). Every value lives in storage the tape owns and reuses, so an
// evaluation of a polynomial allocates nothing; the elementary functions
// and a^b with b not a small integer go through package precision and
// allocate as GradBig does. The operations and roundings are those of
// GradBig (each result rounded once to prec bits, integer powers by
// binary powering at p + 2 log2|n| + 8 bits, constants the exact
// rationals rounded to prec); with the unit tangents the results equal
// GradBig's. A GradTape is not safe for concurrent use.
type GradTape struct {
	src  string
	prec uint
	nv   int
	code []tapeOp
	val  []*big.Float
	der  [][MaxGradVars]*big.Float
	dz   [][MaxGradVars]bool // derivative j of the op is exactly zero
	t1   *big.Float
	t2   *big.Float
	unit [][]*big.Float
}

// tapeOp is one node of the tree in post order; a, b index the operands'
// ops.
type tapeOp struct {
	op     opKind
	a, b   int
	v      int
	n      int64
	fn     string
	r, sq  *big.Float // opPowInt: powers at the wider precision
	r1, s1 *big.Float // opPowInt: the power n-1 for the derivative
	nf     *big.Float // opPowInt: n at prec
	w      uint       // opPowInt: the wider precision
}

// CompileGrad compiles e for GradTape.Eval at prec bits (prec > 0).
func (e *Expr) CompileGrad(prec uint) *GradTape {
	nv := len(e.vars)
	if nv > MaxGradVars || prec == 0 {
		panic(fmt.Sprintf("moments: CompileGrad of %q with %d variables at %d bits", e.src, nv, prec))
	}
	t := &GradTape{src: e.src, prec: prec, nv: nv, t1: new(big.Float).SetPrec(prec), t2: new(big.Float).SetPrec(prec)}
	t.compile(e.root)
	for i := 0; i < nv; i++ {
		u := make([]*big.Float, nv)
		u[i] = new(big.Float).SetPrec(prec).SetInt64(1)
		t.unit = append(t.unit, u)
	}
	return t
}

// Prec is the precision the tape computes at.
func (t *GradTape) Prec() uint { return t.prec }

// Unit returns the unit tangents e_0, ..., e_(nv-1): with them Eval gives
// the gradient.
func (t *GradTape) Unit() [][]*big.Float { return t.unit }

func (t *GradTape) compile(n *node) int {
	op := tapeOp{op: n.op, a: -1, b: -1}
	mk := func() *big.Float { return new(big.Float).SetPrec(t.prec) }
	var c *big.Float
	switch n.op {
	case opConst:
		if c = mk().SetFloat64(n.f); n.rat != nil {
			c.SetRat(n.rat)
		}
	case opPi:
		c = precision.Pi(t.prec)
	case opE:
		c = precision.ExpTo(mk().SetInt64(1), t.prec)
	case opVar:
		op.v = n.v
	case opPowInt:
		if n.n == 0 {
			// As GradBig: a^0 is the constant 1, whatever a is.
			op.op = opConst
			c = mk().SetInt64(1)
			break
		}
		op.a = t.compile(n.a)
		op.n = n.n
		w := t.prec + 2*uint(bitLen64(abs64(n.n))) + 8
		op.r, op.sq = new(big.Float).SetPrec(w), new(big.Float).SetPrec(w)
		op.r1, op.s1 = new(big.Float).SetPrec(w), new(big.Float).SetPrec(w)
		op.nf = mk().SetInt64(n.n)
		op.w = w
	case opNeg, opFunc:
		op.a = t.compile(n.a)
		op.fn = n.fn
	default:
		op.a = t.compile(n.a)
		op.b = t.compile(n.b)
	}
	if op.op == opConst || op.op == opPi || op.op == opE {
		op.op = opConst
	}
	t.code = append(t.code, op)
	v := mk()
	if c != nil {
		v.Set(c)
	}
	t.val = append(t.val, v)
	var d [MaxGradVars]*big.Float
	for j := range d {
		d[j] = mk()
	}
	t.der = append(t.der, d)
	t.dz = append(t.dz, [MaxGradVars]bool{})
	return len(t.code) - 1
}

// Eval sets the tape to e(vals) and its derivatives along the tangents
// (each of nv entries; a nil entry is 0; at most MaxGradVars tangents).
// It returns the value and the derivatives, one per tangent: storage of
// the tape, valid until the next Eval. vals are rounded to prec bits. As
// GradBig it returns an error, never panics, where the expression or (with
// tangents) its derivative is undefined at vals.
func (t *GradTape) Eval(vals []*big.Float, tangents [][]*big.Float) (*big.Float, []*big.Float, error) {
	m := len(tangents)
	if len(vals) != t.nv || m > MaxGradVars {
		panic(fmt.Sprintf("moments: GradTape.Eval of %q with %d values, %d tangents for %d variables", t.src, len(vals), m, t.nv))
	}
	for i := range t.code {
		if !t.step(i, vals, tangents, m) {
			return nil, nil, fmt.Errorf("level set %s: undefined at the point, or its derivative is", quoteExpr(t.src))
		}
	}
	last := len(t.code) - 1
	out := t.der[last][:m]
	for j := 0; j < m; j++ {
		if t.dz[last][j] {
			out[j].SetInt64(0)
		}
		if out[j].IsInf() {
			return nil, nil, fmt.Errorf("level set %s: its derivative is undefined at the point", quoteExpr(t.src))
		}
	}
	return t.val[last], out, nil
}

// step computes op i; false where it is undefined.
func (t *GradTape) step(i int, vals []*big.Float, tg [][]*big.Float, m int) bool {
	op := &t.code[i]
	z, dz, zd := t.val[i], &t.der[i], &t.dz[i]
	switch op.op {
	case opConst:
		for j := 0; j < m; j++ {
			zd[j] = true
		}
		return true
	case opVar:
		z.Set(vals[op.v])
		for j := 0; j < m; j++ {
			s := tg[j][op.v]
			zd[j] = s == nil || s.Sign() == 0
			if !zd[j] {
				dz[j].Set(s)
			}
		}
		return !z.IsInf()
	}
	a, da, az := t.val[op.a], &t.der[op.a], &t.dz[op.a]
	switch op.op {
	case opNeg:
		z.Neg(a)
		for j := 0; j < m; j++ {
			if zd[j] = az[j]; !zd[j] {
				dz[j].Neg(da[j])
			}
		}
		return true
	case opPowInt:
		if !t.powInt(op, a, op.n, op.r, op.sq) {
			return false
		}
		z.Set(op.r)
		// d(a^n) = n a^(n-1) da, a^(n-1) its own power as in GradBig.
		c := t.t1
		if op.n == 1 {
			c.SetInt64(1)
		} else {
			if !t.powInt(op, a, op.n-1, op.r1, op.s1) {
				return false
			}
			c.Set(op.r1)
		}
		c.Mul(c, op.nf)
		for j := 0; j < m; j++ {
			if zd[j] = az[j]; !zd[j] {
				dz[j].Mul(c, da[j])
			}
		}
		return !z.IsInf() && !c.IsInf()
	case opFunc:
		f, df := bigS{x: a, p: t.prec}.call(op.fn)
		if f.bad || df.bad {
			return false
		}
		z.Set(f.x)
		for j := 0; j < m; j++ {
			if zd[j] = az[j]; !zd[j] {
				dz[j].Mul(df.x, da[j])
			}
		}
		return true
	}
	b, db, bz := t.val[op.b], &t.der[op.b], &t.dz[op.b]
	switch op.op {
	case opAdd, opSub:
		if op.op == opAdd {
			z.Add(a, b)
		} else {
			z.Sub(a, b)
		}
		for j := 0; j < m; j++ {
			zd[j] = az[j] && bz[j]
			switch {
			case zd[j]:
			case bz[j]:
				dz[j].Set(da[j])
			case az[j] && op.op == opAdd:
				dz[j].Set(db[j])
			case az[j]:
				dz[j].Neg(db[j])
			case op.op == opAdd:
				dz[j].Add(da[j], db[j])
			default:
				dz[j].Sub(da[j], db[j])
			}
		}
	case opMul:
		z.Mul(a, b)
		for j := 0; j < m; j++ {
			zd[j] = az[j] && bz[j]
			switch {
			case zd[j]:
			case bz[j]:
				dz[j].Mul(da[j], b)
			case az[j]:
				dz[j].Mul(a, db[j])
			default:
				t.t1.Mul(da[j], b)
				t.t2.Mul(a, db[j])
				dz[j].Add(t.t1, t.t2)
			}
		}
	case opDiv:
		if b.Sign() == 0 {
			return false
		}
		z.Quo(a, b)
		// d(a/b) = (da - (a/b) db) / b
		for j := 0; j < m; j++ {
			zd[j] = az[j] && bz[j]
			switch {
			case zd[j]:
			case bz[j]:
				dz[j].Quo(da[j], b)
			default:
				t.t1.Mul(z, db[j])
				if az[j] {
					t.t1.Neg(t.t1)
				} else {
					t.t1.Sub(da[j], t.t1)
				}
				dz[j].Quo(t.t1, b)
			}
		}
	default: // opPow: a^b = exp(b log a), d = a^b (db log a + b da / a)
		if a.Sign() <= 0 {
			return false
		}
		la := precision.LogTo(a, t.prec)
		t.t1.Mul(b, la)
		z.Set(precision.ExpTo(t.t1, t.prec))
		for j := 0; j < m; j++ {
			zd[j] = az[j] && bz[j]
			if zd[j] {
				continue
			}
			t.t1.SetInt64(0)
			if !bz[j] {
				t.t1.Mul(db[j], la)
			}
			if !az[j] {
				t.t2.Mul(b, da[j])
				t.t2.Quo(t.t2, a)
				t.t1.Add(t.t1, t.t2)
			}
			dz[j].Mul(z, t.t1)
		}
	}
	if z.IsInf() {
		return false
	}
	for j := 0; j < m; j++ {
		if !zd[j] && dz[j].IsInf() {
			return false
		}
	}
	return true
}

// powInt sets r to a^n by binary powering at r's precision (sq is
// scratch of the same), then reports whether it is defined (0^n, n < 0,
// is not).
func (t *GradTape) powInt(op *tapeOp, a *big.Float, n int64, r, sq *big.Float) bool {
	if a.Sign() == 0 {
		if n < 0 {
			return false
		}
		r.SetInt64(0)
		return true
	}
	r.SetInt64(1)
	sq.Set(a)
	for k := abs64(n); ; {
		if k&1 == 1 {
			r.Mul(r, sq)
		}
		if k >>= 1; k == 0 {
			break
		}
		sq.Mul(sq, sq)
	}
	if n < 0 {
		if r.Sign() == 0 || r.IsInf() {
			return false
		}
		sq.SetInt64(1)
		r.Quo(sq, r)
	}
	// One rounding to prec, as GradBig's a.mk().Set(r).
	r.SetPrec(t.prec).SetPrec(op.w)
	return !r.IsInf()
}
