package moments

import (
	"context"
	"fmt"
	"math/big"
	"math/bits"
	"runtime"
	"sort"
	"sync"

	"quadwright/precision"
)

// Moments returns the modified moments m_k = integral over w's interval of
// q_k(x) w(x) dx, k = 0..n-1 (n >= 1, digits >= 1; others panic), with q_k
// the polynomials of basis, and for each an error estimate.
//
// Accuracy. Let A_k be the double-exponential approximation of the integral
// of |q_k w| that the computation forms alongside (each term rounded up to a
// power of two, so A_k lies between about one and two times that integral).
// Then errEst[k] <= 10^-digits A_k / 2 (on a subdivided interval, A_k as
// estimated before the subdivision), and errEst[k] bounds |m[k] - m_k|:
// it is the difference of the last two levels of the quadrature (times the
// observed rate of convergence, which for double-exponential convergence
// makes it still an overestimate), plus a bound on the rounding errors. A
// moment that is itself much smaller than A_k (by symmetry, or for a smooth
// weight in a basis orthogonal for a nearby weight) therefore has fewer
// than digits correct relative digits, as any quadrature gives it.
//
// The values are at precision.WorkingPrec(digits, n) bits. The method is the
// double-exponential quadrature of Takahasi and Mori (see dequad.go) on the
// pieces of the interval cut at w.Breaks, with levels halved until they
// agree, and pieces split where they do not: at the kink, jump or
// interior singularity that w.Breaks does not name, located by zooming on
// second differences of w (kink.go), else at the midpoint. All moments share one set of weight evaluations:
// w(x_j) once per node, then q_k(x_j) by the basis recurrence.
//
// A weight made by NewWeight remembers its last computation: Moments and
// Discretize asked for the same thing (n = degree+1 moments in
// DefaultBasis, the same digits) share one quadrature, and the discrete
// measure's moments are then these moments to rounding.
//
// Moments fails, with one sentence naming the weight, when a moment does
// not exist (a weight that is not integrable, or decays too slowly for the
// degree asked), when the weight cannot be evaluated or is negative at a
// node, when the quadrature does not converge after the subdivisions it
// allows, or when ctx is done.
func (w *Weight) Moments(ctx context.Context, n int, basis Basis, digits int) (m []*big.Float, errEst []*big.Float, err error) {
	if n < 1 || digits < 1 {
		panic(fmt.Sprintf("moments: Moments with n = %d, digits = %d", n, digits))
	}
	prec := precision.WorkingPrec(digits, n)
	res, err := w.integrateShared(ctx, n, basis, digits, prec)
	if err != nil {
		return nil, nil, err
	}
	m = make([]*big.Float, n)
	errEst = make([]*big.Float, n)
	for k := range m {
		m[k] = res.sum[k].Big(nil).SetPrec(prec)
		errEst[k] = res.est[k].big(prec)
	}
	return m, errEst, nil
}

// Discretize returns a positive discrete measure, nodes x (ascending) and
// masses c, whose integrals of every polynomial of degree <= degree
// (degree >= 0, digits >= 1; others panic) agree with those of w to about
// 10^-digits relative to the integral of |p| w, the accuracy of Moments at
// n = degree+1 moments in DefaultBasis(w.Interval): the points are those of
// the final level of that computation, on every piece, and c_j = h dx/dt
// w(x_j) includes the weight. Values are at
// precision.WorkingPrec(digits, degree+1) bits; nodes where the mass
// underflows to zero are left out. The errors are those of Moments.
func (w *Weight) Discretize(ctx context.Context, degree int, digits int) (x, c []*big.Float, err error) {
	if degree < 0 || digits < 1 {
		panic(fmt.Sprintf("moments: Discretize with degree = %d, digits = %d", degree, digits))
	}
	prec := precision.WorkingPrec(digits, degree+1)
	res, err := w.integrateShared(ctx, degree+1, DefaultBasis(w.Interval), digits, prec)
	if err != nil {
		return nil, nil, err
	}
	idx := make([]int, len(res.x))
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(a, b int) bool { return res.x[idx[a]].Cmp(res.x[idx[b]]) < 0 })
	for _, i := range idx {
		if res.c[i].Sign() > 0 {
			x = append(x, new(big.Float).Set(res.x[i]))
			c = append(c, new(big.Float).Set(res.c[i]))
		}
	}
	return x, c, nil
}

// deProblem is one moment computation: the weight, the basis recurrence at
// prec bits, the tolerance.
type deProblem struct {
	w      *Weight
	nk     int
	digits int
	prec   uint
	nprec  uint // precision of the cached nodes
	a, b   []*precision.Real
	aConst bool     // A(k) the same for every k
	a0     *big.Rat // A(0)
	bZero  bool     // B(k) = 0 for every k (the monomial basis)
	tol    xfloat
	keep   bool
	maxGap uint
	// maxLevel is the finest level tried before a piece is split: resolving
	// q_{n-1}, which has n-1 sign changes, needs about 4n nodes per unit of
	// t, and three more levels leave room for the digits.
	maxLevel int
	// funcs, when not nil, replaces the basis: term k is c f_k(x), with
	// f_k evaluated at the extended point (functions.go).
	funcs []*Expr
}

// deResult is the sum of the accepted pieces.
type deResult struct {
	sum  []*precision.Real
	abs  []xfloat
	est  []xfloat
	x, c []*big.Float // the final nodes and masses, when kept
}

// maxEndGap bounds the extra bits of a point near a nonzero end (see
// dePiece.point): 2^16 bits reach distances of 10^-19700 from 1, which
// (1-x)^a with a = -0.995 needs at 100 digits.
const maxEndGap = 1 << 16

// maxBisections bounds the depth of the subdivision tree: a kink halves
// its piece's error budget and shrinks it by half at each depth, and 60
// halvings of the piece around it reach 2^-60 of the interval.
const maxBisections = 60

// deMemo keeps a weight's last integration, nodes included, so that
// Moments and Discretize asked for the same degree, digits and basis (as
// the two routes of the recurrence do, one after or beside the other) run
// the quadrature once: both are read off the same final level.
type deMemo struct {
	mu     sync.Mutex
	n      int
	digits int
	prec   uint
	where  string // the interval and the breaks
	a, b   []*big.Rat
	res    *deResult
}

// integrateShared is integrate with the nodes kept, served from w's memo
// when the same computation was done last (a Weight made without NewWeight
// has no memo and always computes). Concurrent calls on one weight wait
// for each other.
func (w *Weight) integrateShared(ctx context.Context, n int, basis Basis, digits int, prec uint) (*deResult, error) {
	m := w.memo
	if m == nil {
		return w.integrate(ctx, n, basis, digits, prec, true)
	}
	m.mu.Lock()
	defer m.mu.Unlock()
	a, b := make([]*big.Rat, n), make([]*big.Rat, n)
	where := fmt.Sprint(w.Interval, w.Breaks)
	same := m.res != nil && m.n == n && m.digits == digits && m.prec == prec && m.where == where
	for k := 0; k < n; k++ {
		a[k], b[k] = basis.A(k), basis.B(k)
		if same && (a[k].Cmp(m.a[k]) != 0 || b[k].Cmp(m.b[k]) != 0) {
			same = false
		}
	}
	if same {
		return m.res, nil
	}
	res, err := w.integrate(ctx, n, basis, digits, prec, true)
	if err != nil {
		return nil, err
	}
	m.n, m.digits, m.prec, m.where, m.a, m.b, m.res = n, digits, prec, where, a, b, res
	return res, nil
}

func (w *Weight) integrate(ctx context.Context, n int, basis Basis, digits int, prec uint, keep bool) (*deResult, error) {
	return w.run(ctx, w.newProblem(n, basis, digits, prec, keep))
}

func (w *Weight) newProblem(n int, basis Basis, digits int, prec uint, keep bool) *deProblem {
	p := &deProblem{w: w, nk: n, digits: digits, prec: prec, nprec: prec + 64, tol: xfPow10(digits), keep: keep, maxGap: maxEndGap}
	p.maxLevel = min(14, max(6, bits.Len(uint(n))+3))
	p.a = precision.NewRealSlice(n, prec)
	p.b = precision.NewRealSlice(n, prec)
	p.aConst, p.bZero = true, true
	a0 := basis.A(0)
	p.a0 = a0
	for k := 0; k < n; k++ {
		ak, bk := basis.A(k), basis.B(k)
		p.a[k].SetRat(ak)
		p.b[k].SetRat(bk)
		if ak.Cmp(a0) != 0 {
			p.aConst = false
		}
		if k > 0 && bk.Sign() != 0 {
			p.bZero = false
		}
	}
	return p
}

// run integrates p over w's pieces, splitting those that do not converge.
func (w *Weight) run(ctx context.Context, p *deProblem) (*deResult, error) {
	n, prec, digits := p.nk, p.prec, p.digits
	total := &deResult{sum: precision.NewRealSlice(n, prec), abs: make([]xfloat, n), est: make([]xfloat, n)}
	type job struct {
		pc     dePiece
		budget []xfloat // nil: relative to the piece's own scale
	}
	var stack []job
	pieces := piecesOf(w.Interval, w.Breaks)
	for i := len(pieces) - 1; i >= 0; i-- {
		stack = append(stack, job{pc: pieces[i]})
	}
	for len(stack) > 0 {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		j := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		r, ok, err := p.piece(ctx, j.pc, j.budget)
		if err != nil {
			return nil, err
		}
		if !ok {
			if j.pc.depth >= maxBisections {
				return nil, fmt.Errorf("%s: the moments do not converge to %d digits near x = %s (a singularity or discontinuity there? name it with --breaks)", w.Label(), digits, j.pc.near())
			}
			half := make([]xfloat, n)
			for k := range half {
				if j.budget != nil {
					half[k] = j.budget[k].scale(0.5)
				} else {
					half[k] = p.tol.mul(r.abs[k]).scale(0.25)
				}
			}
			l, h := p.split(j.pc)
			stack = append(stack, job{h, half}, job{l, half})
			continue
		}
		for k := 0; k < n; k++ {
			total.sum[k].Add(total.sum[k], r.sum[k])
			total.abs[k] = total.abs[k].add(r.abs[k])
			total.est[k] = total.est[k].add(r.est[k])
		}
		total.x = append(total.x, r.x...)
		total.c = append(total.c, r.c...)
	}
	return total, nil
}

func workers(n int) int {
	return max(1, min(runtime.GOMAXPROCS(0), n/8))
}
