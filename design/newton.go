package design

import (
	"context"
	"errors"
	"math/big"
	"math/bits"
	"runtime"
	"sync"
	"sync/atomic"

	"quadwright/precision"
)

// evaluator runs the three-term recurrence of one recurrence at one fixed
// precision. Each goroutine owns one; the coefficient slices are shared and
// only read.
type evaluator struct {
	n    int
	prec uint
	a, b []*precision.Real // alpha_k, beta_k for k < n

	p0, p1, d0, d1, t, u, v, w *precision.Real
	// After eval(x): p = pi_n(x), q = pi_{n-1}(x), dp = pi_n'(x).
	p, q, dp *precision.Real
}

func newEvaluator(a, b []*precision.Real, prec uint) *evaluator {
	s := precision.NewRealSlice(8, prec)
	return &evaluator{n: len(a), prec: prec, a: a, b: b,
		p0: s[0], p1: s[1], d0: s[2], d1: s[3], t: s[4], u: s[5], v: s[6], w: s[7]}
}

// eval sets e.p, e.q and e.dp to pi_n(x), pi_{n-1}(x) and pi_n'(x), each
// computed by the forward recurrence at e.prec bits. The forward recurrence
// is the stable direction for x inside the support (the orthogonal
// polynomials are the dominant solution there), so the values carry
// absolute errors of a few ulp of the largest term times n.
func (e *evaluator) eval(x *precision.Real) {
	p0, p1, d0, d1 := e.p0, e.p1, e.d0, e.d1
	p0.SetInt64(1)
	p1.Sub(x, e.a[0])
	d0.SetInt64(0)
	d1.SetInt64(1)
	t, u, v, w := e.t, e.u, e.v, e.w
	for k := 1; k < e.n; k++ {
		t.Sub(x, e.a[k])
		u.Mul(e.b[k], p0)
		v.MulSub(t, p1, u) // pi_{k+1}
		u.Mul(e.b[k], d0)
		w.MulSub(t, d1, u)
		w.Add(w, p1) // pi_{k+1}'
		p0, p1, v = p1, v, p0
		d0, d1, w = d1, w, d0
	}
	e.p0, e.p1, e.d0, e.d1, e.v, e.w = p0, p1, d0, d1, v, w
	e.p, e.q, e.dp = p1, p0, d1
}

// newton refines x in place to a zero of pi_n by Newton's method and then
// sets wt to the Christoffel number there, norm / (pi_{n-1}(x) pi_n'(x))
// with norm = beta_0 beta_1 ... beta_{n-1} (Gautschi 2004, Theorem 1.46 in
// the monic form). It stops when the correction is below 2^(4-prec)|x|, is
// exactly zero, or stops shrinking (rounding noise, which the caller's
// recomputation at a higher precision judges). It reports false when the
// iteration did not settle.
func (e *evaluator) newton(x, wt, norm *precision.Real, delta, prev *precision.Real) bool {
	const maxIter = 60
	for it := 0; it < maxIter; it++ {
		e.eval(x)
		if e.p.IsZero() {
			break
		}
		if e.dp.IsZero() {
			return false
		}
		delta.Quo(e.p, e.dp)
		x.Sub(x, delta)
		if x.IsZero() || delta.Exponent() <= x.Exponent()-int64(e.prec)+4 {
			break
		}
		if it >= 3 && delta.Exponent() >= prev.Exponent()-1 {
			break
		}
		prev.Set(delta)
		if it == maxIter-1 {
			return false
		}
	}
	wt.Mul(e.q, e.dp)
	if wt.IsZero() {
		return false
	}
	wt.Quo(norm, wt)
	return true
}

var errNoConvergence = errors.New("design: Newton refinement did not settle")

// forceSturm makes gaussStage skip the float64 start (tests of the fallback).
var forceSturm = false

// stage is one computation of an n-point Gauss rule at one precision.
type stage struct {
	prec     uint
	fallback bool // the Sturm-bisection path was taken
	nodes    []*big.Float
	weights  []*big.Float
}

// gaussStage computes the Gauss nodes and weights of rec.Prefix(n) at prec
// bits. start holds starting values for the nodes in ascending order (a
// previous stage's nodes), or is nil, in which case a float64 start comes
// from gonum's tridiagonal eigensolver (Golub and Welsch, "Calculation of
// Gauss quadrature rules", Math. Comp. 23, 1969). When that start cannot be
// refined into n distinct, ordered zeros with positive weights (clustered
// nodes, coefficients beyond float64 range), the zeros are isolated by
// bisection on Sturm counts at prec bits instead.
func gaussStage(ctx context.Context, rec *Recurrence, n int, prec uint, start []*big.Float) (*stage, error) {
	stagePhase(ctx, prec, start != nil)
	a := precision.NewRealSlice(n, prec)
	b := precision.NewRealSlice(n, prec)
	for k := 0; k < n; k++ {
		a[k].SetBig(rec.Alpha[k])
		b[k].SetBig(rec.Beta[k])
	}
	norm := precision.NewReal(prec).SetInt64(1)
	for k := 0; k < n; k++ {
		norm.Mul(norm, b[k])
	}
	symmetric := true
	for k := 0; k < n; k++ {
		if !a[k].IsZero() {
			symmetric = false
			break
		}
	}
	xs := precision.NewRealSlice(n, prec)
	ws := precision.NewRealSlice(n, prec)
	haveStart := false
	startBits := 40 // a float64 eigenvalue, about; riseNewton finds out
	if start != nil {
		startBits = int(prec)
		for i := range xs {
			xs[i].SetBig(start[i])
			startBits = min(startBits, int(start[i].Prec()))
		}
		startBits -= 2*bits.Len(uint(n)) + 8
		haveStart = true
	} else if f, ok := float64Start(rec, n); ok {
		for i := range xs {
			xs[i].SetFloat64(f[i])
		}
		haveStart = true
	}
	if haveStart && !forceSturm {
		err := refineAll(ctx, a, b, norm, xs, ws, prec, symmetric, startBits)
		if err != nil && !errors.Is(err, errNoConvergence) {
			return nil, err
		}
		if err == nil && acceptable(xs, ws, b[0], prec) {
			return toStage(xs, ws, prec, false), nil
		}
	}
	if err := sturmAll(ctx, a, b, norm, xs, ws, prec, symmetric); err != nil {
		return nil, err
	}
	if !acceptable(xs, ws, b[0], prec) {
		return nil, errors.New("the Gauss nodes could not be separated at the working precision (the recurrence may not belong to a positive measure)")
	}
	return toStage(xs, ws, prec, true), nil
}

func toStage(xs, ws []*precision.Real, prec uint, fallback bool) *stage {
	s := &stage{prec: prec, fallback: fallback, nodes: make([]*big.Float, len(xs)), weights: make([]*big.Float, len(xs))}
	for i := range xs {
		s.nodes[i] = xs[i].Big(nil)
		s.weights[i] = ws[i].Big(nil)
	}
	return s
}

// refineAll runs Newton on every node, in parallel over the available cores.
// Each node is refined independently, so the result does not depend on the
// number of cores. For a symmetric measure (all alpha_k = 0) only the
// non-negative half is refined and mirrored, and for odd n the middle node
// is exactly 0.
func refineAll(ctx context.Context, a, b []*precision.Real, norm *precision.Real, xs, ws []*precision.Real, prec uint, symmetric bool, startBits int) error {
	n := len(xs)
	if symmetric && n >= 4 {
		return refineSquares(ctx, a, b, norm, xs, ws, prec, startBits)
	}
	first := 0
	if symmetric {
		first = n / 2
		if n%2 == 1 {
			xs[first].SetInt64(0)
		}
	}
	return refineRising(ctx, a, b, norm, xs, ws, prec, symmetric, first, n, startBits, func(i int) {
		if symmetric && i != n-1-i {
			xs[n-1-i].Neg(xs[i])
			ws[n-1-i].Set(ws[i])
		}
	})
}

// parallelNodes calls do for node indices lo..hi-1 on GOMAXPROCS workers,
// each with its own evaluator and two scratch values.
func parallelNodes(ctx context.Context, a, b []*precision.Real, prec uint, lo, hi int, do func(e *evaluator, i int, scratch []*precision.Real) error) error {
	workers := runtime.GOMAXPROCS(0)
	if hi-lo < 2*workers {
		workers = 1
	}
	prog := progressOf(ctx)
	prog.Grow(int64(hi - lo))
	var next atomic.Int64
	next.Store(int64(lo))
	var once sync.Once
	var firstErr error
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			e := newEvaluator(a, b, prec)
			scratch := precision.NewRealSlice(4, prec)
			for {
				i := int(next.Add(1) - 1)
				if i >= hi {
					return
				}
				if err := ctx.Err(); err != nil {
					once.Do(func() { firstErr = err })
					return
				}
				if err := do(e, i, scratch); err != nil {
					once.Do(func() { firstErr = err })
					next.Store(int64(hi))
					return
				}
				prog.Advance(1)
			}
		}()
	}
	wg.Wait()
	return firstErr
}

// acceptable checks what Newton cannot promise by itself: n strictly
// increasing nodes (so n distinct zeros of pi_n, hence all of them),
// positive weights, and weights that add up to the mass beta_0 to half the
// working precision.
func acceptable(xs, ws []*precision.Real, mass *precision.Real, prec uint) bool {
	sum := precision.NewReal(prec)
	for i := range xs {
		if ws[i].Sign() <= 0 {
			return false
		}
		if i > 0 && xs[i].Cmp(xs[i-1]) <= 0 {
			return false
		}
		sum.Add(sum, ws[i])
	}
	diff := precision.NewReal(prec).Sub(sum, mass)
	return diff.IsZero() || diff.Exponent() <= mass.Exponent()-int64(prec/2)
}
