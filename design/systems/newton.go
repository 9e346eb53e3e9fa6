package systems

import (
	"context"
	"errors"
	"math"
	"math/big"
)

// homotopy is the family of moment equations
//
//	sum_i w_i phi_j(x_i; s) = (1-s) bq_j + s bu_j,  phi_j = (1-s) q_j + s u_j,
//
// j < 2N, joining at s = 0 a system q whose N-point rule is known (bq its
// sums over that rule, so the start solves the equations to rounding) to
// the user's orthonormalised system u at s = 1 (bu its exact moments).
// This is the continuation of Ma, Rokhlin and Wandzura (SIAM J. Numer.
// Anal. 33, 1996), section 5, with the orthonormalised bases of both ends
// as the path: linear in the functions, so every intermediate system is a
// system of 2N functions and its rule moves continuously while it exists.
type homotopy struct {
	q, u   *basis
	bq, bu []*big.Float
	lo, hi *big.Float // the open interval the nodes stay in; nil for an infinite end
}

// equations returns the residuals F_j = sum_i w_i phi_j(x_i) - b_j and,
// when jac, the Jacobian (dF_j/dx_i = w_i phi_j'(x_i), dF_j/dw_i =
// phi_j(x_i)), at prec bits.
func (h *homotopy) equations(s float64, xs, ws []*big.Float, prec uint, jac bool) ([]*big.Float, [][]*big.Float, error) {
	n := len(xs)
	m := 2 * n
	sb := new(big.Float).SetPrec(prec).SetFloat64(s)
	sc := new(big.Float).SetPrec(prec).SetFloat64(1 - s)
	F := make([]*big.Float, m)
	for j := range F {
		F[j] = new(big.Float).SetPrec(prec)
		if s != 1 {
			F[j].Mul(sc, h.bq[j])
		}
		if s != 0 {
			F[j].Add(F[j], new(big.Float).SetPrec(prec).Mul(sb, h.bu[j]))
		}
		F[j].Neg(F[j])
	}
	var J [][]*big.Float
	if jac {
		J = make([][]*big.Float, m)
		for j := range J {
			J[j] = make([]*big.Float, m)
		}
	}
	t := new(big.Float).SetPrec(prec)
	for i := range xs {
		phi, dphi, err := h.mix(s, sb, sc, xs[i], prec, jac)
		if err != nil {
			return nil, nil, err
		}
		for j := 0; j < m; j++ {
			F[j].Add(F[j], t.Mul(ws[i], phi[j]))
			if jac {
				J[j][i] = dphi[j].Mul(dphi[j], ws[i])
				J[j][n+i] = phi[j]
			}
		}
	}
	return F, J, nil
}

// mix evaluates phi_j(x; s) and its derivative.
func (h *homotopy) mix(s float64, sb, sc, x *big.Float, prec uint, deriv bool) (phi, dphi []*big.Float, err error) {
	if s == 1 {
		return h.u.eval(x, prec, deriv)
	}
	qv, dq, err := h.q.eval(x, prec, deriv)
	if err != nil || s == 0 {
		return qv, dq, err
	}
	uv, du, err := h.u.eval(x, prec, deriv)
	if err != nil {
		return nil, nil, err
	}
	t := new(big.Float).SetPrec(prec)
	for j := range qv {
		qv[j].Mul(qv[j], sc).Add(qv[j], t.Mul(uv[j], sb))
		if deriv {
			dq[j].Mul(dq[j], sc).Add(dq[j], t.Mul(du[j], sb))
		}
	}
	return qv, dq, nil
}

// valid reports whether the nodes are strictly ascending inside the open
// interval and the weights positive.
func (h *homotopy) valid(xs, ws []*big.Float) bool {
	for i := range xs {
		if ws[i].Sign() <= 0 || i > 0 && xs[i].Cmp(xs[i-1]) <= 0 {
			return false
		}
	}
	n := len(xs)
	return (h.lo == nil || xs[0].Cmp(h.lo) > 0) && (h.hi == nil || xs[n-1].Cmp(h.hi) < 0)
}

var errNoConvergence = errors.New("newton did not converge")

// equationSystem is a family of 2N moment equations in N nodes and N
// weights with a parameter s in [0, 1]: the residuals and Jacobian at s,
// and the region (nodes ordered inside, weights positive) the iterates
// must stay in. The homotopy between two bases is one; the power-exponent
// path of the log system (logpath.go) is another.
type equationSystem interface {
	equations(s float64, xs, ws []*big.Float, prec uint, jac bool) ([]*big.Float, [][]*big.Float, error)
	valid(xs, ws []*big.Float) bool
}

// newton is newtonOn for the homotopy.
func (h *homotopy) newton(ctx context.Context, s float64, xs, ws []*big.Float, prec uint, tolBits int, maxIter int) ([]*big.Float, []*big.Float, error) {
	return newtonOn(ctx, h, s, xs, ws, prec, tolBits, maxIter)
}

// newtonOn solves the equations of h at s from (xs, ws), at prec bits, until the
// largest relative correction is below 2^-tolBits, or, for a final solve
// (tolBits 0), until the corrections stop decreasing below 2^-(prec/2).
// A step that would leave the nodes unordered or outside, or a weight
// non-positive, is halved up to 10 times (Ma, Rokhlin and Wandzura keep
// the nodes so). It returns the new nodes and weights at prec bits.
func newtonOn(ctx context.Context, h equationSystem, s float64, xs, ws []*big.Float, prec uint, tolBits int, maxIter int) ([]*big.Float, []*big.Float, error) {
	n := len(xs)
	x := cloneAt(xs, prec)
	w := cloneAt(ws, prec)
	last := math.Inf(1)
	for it := 0; it < maxIter; it++ {
		if err := ctx.Err(); err != nil {
			return nil, nil, err
		}
		F, J, err := h.equations(s, x, w, prec, true)
		if err != nil {
			return nil, nil, err
		}
		for j := range F {
			F[j].Neg(F[j])
		}
		if !solve(J, F, prec) {
			return nil, nil, errNoConvergence
		}
		rel := 0.0
		for i := 0; i < n; i++ {
			rel = math.Max(rel, relSize(F[i], x[i]))
			rel = math.Max(rel, relSize(F[n+i], w[i]))
		}
		nx, nw := make([]*big.Float, n), make([]*big.Float, n)
		step := new(big.Float).SetPrec(prec).SetInt64(1)
		ok := false
		for halve := 0; halve <= 10; halve++ {
			for i := 0; i < n; i++ {
				nx[i] = new(big.Float).SetPrec(prec).Mul(F[i], step)
				nx[i].Add(nx[i], x[i])
				nw[i] = new(big.Float).SetPrec(prec).Mul(F[n+i], step)
				nw[i].Add(nw[i], w[i])
			}
			if h.valid(nx, nw) {
				ok = true
				break
			}
			step.SetMantExp(step, -1)
		}
		if !ok {
			return nil, nil, errNoConvergence
		}
		x, w = nx, nw
		switch {
		case tolBits > 0 && rel < math.Ldexp(1, -tolBits):
			return x, w, nil
		case tolBits == 0 && rel < math.Ldexp(1, -int(prec)+8):
			return x, w, nil
		case tolBits == 0 && rel >= last/4 && last < math.Ldexp(1, -int(prec/2)):
			// Rounding level: the corrections no longer shrink.
			return x, w, nil
		case it >= 3 && rel > last && rel > 1e-3:
			return nil, nil, errNoConvergence
		}
		last = rel
	}
	return nil, nil, errNoConvergence
}

// relSize is |d| / max(|v|, 2^-60) as a float64.
func relSize(d, v *big.Float) float64 {
	a, _ := new(big.Float).Abs(d).Float64()
	b, _ := new(big.Float).Abs(v).Float64()
	return a / math.Max(b, 0x1p-60)
}

func cloneAt(v []*big.Float, prec uint) []*big.Float {
	out := make([]*big.Float, len(v))
	for i := range v {
		out[i] = new(big.Float).SetPrec(prec).Set(v[i])
	}
	return out
}

// continuation follows the homotopy from the start rule at s = 0 to s = 1
// (follow, with steps halved down to 2^-5 and at most 6 times in all: a
// path that needs more is usually ending, a node reaching an end of the
// interval or a weight reaching zero, and the fallback is cheaper than
// following it), then solves the final point to prec.
func (h *homotopy) continuation(ctx context.Context, xs, ws []*big.Float, prec uint) ([]*big.Float, []*big.Float, error) {
	x, w, err := follow(ctx, h, xs, ws, prec, 1, 1, 0x1p-5, 6)
	if err != nil {
		return nil, nil, err
	}
	return h.newton(ctx, 1, x, w, prec, 0, 40)
}

// follow tracks the solution of h from the rule (xs, ws) at s = 0 to
// s = 1 with adaptive steps, the first ds0: a step whose Newton iteration
// fails (or leaves the nodes' order or the interval) is halved, down to
// minStep and at most maxFails times in all; after a success the step
// doubles, up to maxStep.
// Points are solved to 2^-40, the one at s = 1 included; each starts from
// the secant through the last two solutions when that guess is itself
// valid.
func follow(ctx context.Context, h equationSystem, xs, ws []*big.Float, prec uint, ds0, maxStep, minStep float64, maxFails int) ([]*big.Float, []*big.Float, error) {
	type point struct {
		s      float64
		xs, ws []*big.Float
	}
	cur := point{0, cloneAt(xs, prec), cloneAt(ws, prec)}
	var prev *point
	ds := ds0
	fails := 0
	for cur.s < 1 {
		s1 := math.Min(1, cur.s+ds)
		gx, gw := cur.xs, cur.ws
		if prev != nil {
			gx, gw = secant(prev.s, prev.xs, prev.ws, cur.s, cur.xs, cur.ws, s1, prec)
			if !h.valid(gx, gw) {
				gx, gw = cur.xs, cur.ws
			}
		}
		nx, nw, err := newtonOn(ctx, h, s1, gx, gw, prec, 40, 14)
		if debugCont {
			println("s", s1, "ds", ds, err == nil)
		}
		if err != nil && !errors.Is(err, errNoConvergence) {
			return nil, nil, err
		}
		if err != nil {
			ds /= 2
			if fails++; ds < minStep || fails > maxFails {
				return nil, nil, errNoConvergence
			}
			continue
		}
		p := cur
		prev = &p
		cur = point{s1, nx, nw}
		ds = math.Min(2*ds, maxStep)
	}
	return cur.xs, cur.ws, nil
}

// secant extrapolates linearly from (s0, z0), (s1, z1) to s.
func secant(s0 float64, x0, w0 []*big.Float, s1 float64, x1, w1 []*big.Float, s float64, prec uint) ([]*big.Float, []*big.Float) {
	r := new(big.Float).SetPrec(prec).SetFloat64((s - s1) / (s1 - s0))
	ext := func(a, b []*big.Float) []*big.Float {
		out := make([]*big.Float, len(a))
		for i := range a {
			d := new(big.Float).SetPrec(prec).Sub(b[i], a[i])
			out[i] = d.Mul(d, r).Add(d, b[i])
		}
		return out
	}
	return ext(x0, x1), ext(w0, w1)
}

var debugCont = false
