package moments

import (
	"fmt"
	"math"
)

// Span is a closed interval [Lo, Hi] of reals; an empty or unknown
// enclosure is the whole line [-Inf, +Inf].
type Span struct{ Lo, Hi float64 }

// Contains0 reports whether 0 lies in the closed interval.
func (a Span) Contains0() bool { return a.Lo <= 0 && 0 <= a.Hi }

// Finite reports whether both ends are finite numbers.
func (a Span) Finite() bool {
	return !math.IsInf(a.Lo, 0) && !math.IsInf(a.Hi, 0) && !math.IsNaN(a.Lo) && !math.IsNaN(a.Hi)
}

var wholeLine = Span{math.Inf(-1), math.Inf(1)}

// GradSpan encloses the values of e and of its gradient over the box
// whose sides are box (one interval per variable, at most MaxGradVars;
// another count panics): val contains e(p) and grad[i] contains the i-th
// partial derivative at every point p of the box where they are defined,
// by interval arithmetic on the forward-mode dual of the parsed tree
// (Moore's natural interval extension). Each end is pushed outward by one
// or more ulps after every operation, which covers the rounding of float64
// arithmetic and of package math (within 1 ulp) for these functions. An
// enclosure that cannot be bounded (a pole, a logarithm reaching 0) is the
// whole line. Enclosures are not tight where a variable occurs more than
// once (x*x is wider than x^2); callers subdivide.
func (e *Expr) GradSpan(box []Span, grad []Span) Span {
	nv := len(e.vars)
	if len(box) != nv || len(grad) != nv || nv > MaxGradVars {
		panic(fmt.Sprintf("moments: GradSpan of %q with %d sides, %d derivatives for %d variables", e.src, len(box), len(grad), nv))
	}
	r := evalDual(e.root, box, nv, point)
	copy(grad, r.d[:nv])
	return r.v
}

func point(c float64) Span { return Span{c, c} }

// down and up move an end one ulp outward; a zero stays, since a float64
// sum, product or function value that is 0 is exact (or an underflow,
// below any scale of interest here).
func down(x float64) float64 {
	if math.IsInf(x, 0) || x == 0 {
		return x
	}
	return math.Nextafter(x, math.Inf(-1))
}

func up(x float64) float64 {
	if math.IsInf(x, 0) || x == 0 {
		return x
	}
	return math.Nextafter(x, math.Inf(1))
}

// out widens [lo, hi] by k ulps at each end; a NaN end makes the whole line.
func out(lo, hi float64, k int) Span {
	if math.IsNaN(lo) || math.IsNaN(hi) {
		return wholeLine
	}
	for ; k > 0; k-- {
		lo, hi = down(lo), up(hi)
	}
	return Span{lo, hi}
}

func (a Span) add(b Span) Span { return out(a.Lo+b.Lo, a.Hi+b.Hi, 1) }
func (a Span) sub(b Span) Span { return out(a.Lo-b.Hi, a.Hi-b.Lo, 1) }
func (a Span) neg() Span       { return Span{-a.Hi, -a.Lo} }

func (a Span) mul(b Span) Span {
	if a.Lo == 0 && a.Hi == 0 || b.Lo == 0 && b.Hi == 0 {
		return Span{0, 0} // an exact zero factor, as a constant's derivative
	}
	p := [4]float64{a.Lo * b.Lo, a.Lo * b.Hi, a.Hi * b.Lo, a.Hi * b.Hi}
	lo, hi := p[0], p[0]
	for _, v := range p[1:] {
		if math.IsNaN(v) {
			return wholeLine // 0 * Inf
		}
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return out(lo, hi, 1)
}

func (a Span) div(b Span) Span {
	if b.Contains0() {
		return wholeLine
	}
	return a.mul(out(1/b.Hi, 1/b.Lo, 1))
}

// powInt is a^n with the exact range of the monomial: even powers of an
// interval holding 0 start at 0.
func (a Span) powInt(n int64) Span {
	if n == 0 {
		return Span{1, 1}
	}
	if n < 0 {
		return Span{1, 1}.div(a.powInt(-n))
	}
	pw := func(x float64) float64 { return math.Pow(x, float64(n)) }
	k := int(2 + bitLen64(n)) // math.Pow with an integer exponent: a few ulps
	if n%2 == 1 {
		return out(pw(a.Lo), pw(a.Hi), k)
	}
	lo, hi := math.Abs(a.Lo), math.Abs(a.Hi)
	if lo > hi {
		lo, hi = hi, lo
	}
	if a.Contains0() {
		return Span{0, up(pw(hi))}
	}
	return out(pw(lo), pw(hi), k)
}

func (a Span) exp() Span { return out(math.Exp(a.Lo), math.Exp(a.Hi), 2) }

func (a Span) log() Span {
	if a.Hi <= 0 || math.IsNaN(a.Lo) {
		return wholeLine
	}
	lo := math.Inf(-1)
	if a.Lo > 0 {
		lo = math.Log(a.Lo)
	}
	return out(lo, math.Log(a.Hi), 2)
}

func (a Span) sq() Span { return a.powInt(2) }

func (a Span) call(fn string) (Span, Span) {
	one := Span{1, 1}
	switch fn {
	case "exp":
		v := a.exp()
		return v, v
	case "log":
		return a.log(), one.div(a)
	case "sqrt":
		if a.Hi < 0 {
			return wholeLine, wholeLine
		}
		v := out(math.Sqrt(math.Max(a.Lo, 0)), math.Sqrt(a.Hi), 2)
		return v, Span{0.5, 0.5}.div(v)
	case "abs":
		lo, hi := math.Abs(a.Lo), math.Abs(a.Hi)
		if lo > hi {
			lo, hi = hi, lo
		}
		switch {
		case a.Lo > 0:
			return a, one
		case a.Hi < 0:
			return a.neg(), one.neg()
		}
		return Span{0, hi}, Span{-1, 1}
	case "sin":
		return sinRange(a), sinRange(a.add(Span{math.Pi / 2, math.Pi / 2}))
	case "cos":
		c := sinRange(a.add(Span{math.Pi / 2, math.Pi / 2}))
		return c, sinRange(a).neg()
	case "tan":
		// A pole k pi + pi/2 inside the interval: unbounded.
		k := math.Floor((a.Lo-math.Pi/2)/math.Pi) + 1
		if !a.Finite() || k*math.Pi+math.Pi/2 <= a.Hi+1e-15*math.Abs(a.Hi) {
			return wholeLine, wholeLine
		}
		t := out(math.Tan(a.Lo), math.Tan(a.Hi), 2)
		return t, one.add(t.sq())
	case "atan":
		return out(math.Atan(a.Lo), math.Atan(a.Hi), 2), one.div(one.add(a.sq()))
	case "sinh":
		return out(math.Sinh(a.Lo), math.Sinh(a.Hi), 2), coshRange(a)
	case "cosh":
		return coshRange(a), out(math.Sinh(a.Lo), math.Sinh(a.Hi), 2)
	case "tanh":
		t := out(math.Tanh(a.Lo), math.Tanh(a.Hi), 2)
		return t, one.sub(t.sq())
	}
	panic("moments: unknown function " + fn)
}

func coshRange(a Span) Span {
	lo, hi := math.Cosh(a.Lo), math.Cosh(a.Hi)
	if a.Contains0() {
		return out(1, math.Max(lo, hi), 2)
	}
	return out(math.Min(lo, hi), math.Max(lo, hi), 2)
}

// sinRange encloses sin over a: the values at the ends, and ±1 where a
// holds a crest or a trough.
func sinRange(a Span) Span {
	if !a.Finite() || a.Hi-a.Lo >= 2*math.Pi {
		return Span{-1, 1}
	}
	lo, hi := math.Sin(a.Lo), math.Sin(a.Hi)
	if lo > hi {
		lo, hi = hi, lo
	}
	r := out(lo, hi, 2)
	// crests at pi/2 + 2 k pi, troughs at -pi/2 + 2 k pi; a little slack
	// for the rounding of the reduction.
	has := func(c float64) bool {
		k := math.Ceil((a.Lo - c - 1e-12) / (2 * math.Pi))
		return c+2*math.Pi*k <= a.Hi+1e-12
	}
	if has(math.Pi / 2) {
		r.Hi = 1
	}
	if has(-math.Pi / 2) {
		r.Lo = -1
	}
	return Span{math.Max(r.Lo, -1), math.Min(r.Hi, 1)}
}
