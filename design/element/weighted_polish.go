package element

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"

	"quadwright/precision"
)

// wrule is a weighted rule being solved: n nodes of dim coordinates and
// their weights, held at one precision.
type wrule struct {
	x [][]*big.Float
	u []*big.Float
}

func (r *wrule) at(prec uint) *wrule {
	out := &wrule{x: make([][]*big.Float, len(r.x)), u: make([]*big.Float, len(r.u))}
	for i := range r.x {
		out.x[i] = make([]*big.Float, len(r.x[i]))
		for k, v := range r.x[i] {
			out.x[i][k] = new(big.Float).SetPrec(prec).Set(v)
		}
		out.u[i] = new(big.Float).SetPrec(prec).Set(r.u[i])
	}
	return out
}

// momentSystem is the system sum_i u_i psi_j(x_i) = mu_j, j < M, in the
// basis psi = phi C (phi the box basis, C the inverse of the R factor of
// the candidate measure's weighted basis matrix, taken as exact): the psi
// are close to orthonormal for the weighted measure, which keeps the
// float64 Jacobian well conditioned, while the residual is formed in phi
// at extended precision and only then transformed, so that C's own
// rounding never enters a printed digit.
type momentSystem struct {
	s  Shape
	bb *boxBasis
	C  *mat.Dense // M x M
	mu []*big.Float
	// inside, when not nil, is the open domain the nodes must stay in
	// (SolveRegion's region, in the coordinates of the box s); nil means
	// the element s itself.
	inside func(x []float64) bool
	// evals caches the basis evaluator by precision: building one costs
	// as much as a residual at low degree.
	evals map[uint]*realEval
}

func (ms *momentSystem) evalAt(prec uint) *realEval {
	if re, ok := ms.evals[prec]; ok {
		return re
	}
	if ms.evals == nil {
		ms.evals = map[uint]*realEval{}
	}
	re := ms.bb.newRealEval(prec)
	ms.evals[prec] = re
	return re
}

// residual returns C^T (sum_i u_i phi(x_i) - mu) in float64, scaled by
// 2^shift so that its largest entry is about 1 (each entry formed at prec
// bits, then rounded once: a residual of 10^-500 survives the conversion),
// and the base-2 logarithm of its true 2-norm (-Inf when it is zero).
func (ms *momentSystem) residual(r *wrule, prec uint) (F []float64, shift int, log2Norm float64) {
	M := ms.bb.size()
	dim := ms.s.Dim()
	re := ms.evalAt(prec)
	sum := precision.NewRealSlice(M, prec)
	val := precision.NewRealSlice(M, prec)
	x := precision.NewRealSlice(dim, prec)
	u := precision.NewReal(prec)
	for i := range r.x {
		for k := 0; k < dim; k++ {
			x[k].SetBig(r.x[i][k])
		}
		re.eval(x, val)
		u.SetBig(r.u[i])
		for j := range sum {
			sum[j].MulAdd(u, val[j], sum[j])
		}
	}
	m := precision.NewReal(prec)
	top := int64(math.MinInt64)
	for j := range sum {
		m.SetBig(ms.mu[j])
		sum[j].Sub(sum[j], m)
		if !sum[j].IsZero() {
			top = max(top, sum[j].Exponent())
		}
	}
	if top == math.MinInt64 {
		return make([]float64, M), 0, math.Inf(-1)
	}
	shift = int(-top)
	Fphi := make([]float64, M)
	for j := range sum {
		Fphi[j] = sum[j].MulPow2(sum[j], shift).Float64()
	}
	F = make([]float64, M)
	mat.NewVecDense(M, F).MulVec(ms.C.T(), mat.NewVecDense(M, Fphi))
	return F, shift, math.Log2(floats.Norm(F, 2)) - float64(shift)
}

// jacobian is d residual / d(relative weight changes, node coordinates)
// in float64: column i for u_i -> u_i (1 + e_i), then dim columns per node.
func (ms *momentSystem) jacobian(r *wrule) *mat.Dense {
	M := ms.bb.size()
	dim := ms.s.Dim()
	n := len(r.x)
	Jphi := mat.NewDense(M, n*(dim+1), nil)
	val := make([]float64, M)
	grad := make([][]float64, dim)
	for k := range grad {
		grad[k] = make([]float64, M)
	}
	x := make([]float64, dim)
	for i := range r.x {
		for k := range x {
			x[k], _ = r.x[i][k].Float64()
		}
		u, _ := r.u[i].Float64()
		ms.bb.eval64(x, val, grad)
		for j := 0; j < M; j++ {
			Jphi.Set(j, i, u*val[j])
			for k := 0; k < dim; k++ {
				Jphi.Set(j, n+i*dim+k, u*grad[k][j])
			}
		}
	}
	var J mat.Dense
	J.Mul(ms.C.T(), Jphi)
	return &J
}

// minNorm returns the least-squares solution of J d = rhs of least norm
// (J of full rank; rows <= cols: the minimum-norm solution of the
// underdetermined system). ok is false when J is numerically singular.
func minNorm(J *mat.Dense, rhs []float64) ([]float64, bool) {
	rows, cols := J.Dims()
	var qr mat.QR
	var d mat.Dense
	var err error
	if rows <= cols {
		qr.Factorize(J.T())
		err = qr.SolveTo(&d, true, mat.NewVecDense(rows, append([]float64(nil), rhs...)))
	} else {
		qr.Factorize(J)
		err = qr.SolveTo(&d, false, mat.NewVecDense(rows, append([]float64(nil), rhs...)))
	}
	if err != nil {
		if c, isCond := err.(mat.Condition); !isCond || math.IsInf(float64(c), 1) || float64(c) > 1e15 {
			return nil, false
		}
	}
	return mat.Col(nil, 0, &d), true
}

// step returns r moved by t 2^-shift times the correction d (relative
// weight changes first, then node coordinates), or nil when a weight would fall
// to zero or below or a node would leave the open domain, with the index
// of the first such node.
func (ms *momentSystem) step(r *wrule, d []float64, t float64, shift int, prec uint) (*wrule, int) {
	c, i, _ := ms.stepWhy(r, d, t, shift, prec)
	return c, i
}

// stepWhy is step, also saying whether the node i stopped it by its
// weight (rather than by leaving the domain).
func (ms *momentSystem) stepWhy(r *wrule, d []float64, t float64, shift int, prec uint) (*wrule, int, bool) {
	n, dim := len(r.x), ms.s.Dim()
	out := &wrule{x: make([][]*big.Float, n), u: make([]*big.Float, n)}
	p := make([]float64, dim)
	for i := 0; i < n; i++ {
		if math.Ldexp(t*d[i], -shift) <= -1 {
			return nil, i, true
		}
		// u + e u keeps every bit of e, where u (1 + e) would round e
		// to the 53 bits of 1 + e.
		de := new(big.Float).SetPrec(prec).SetFloat64(t * d[i])
		de.SetMantExp(de, -shift)
		out.u[i] = de.Mul(de, r.u[i]).Add(de, r.u[i])
		out.x[i] = make([]*big.Float, dim)
		for k := 0; k < dim; k++ {
			v := new(big.Float).SetPrec(prec).SetFloat64(t * d[n+i*dim+k])
			v.SetMantExp(v, -shift)
			out.x[i][k] = v.Add(v, r.x[i][k])
			p[k], _ = out.x[i][k].Float64()
		}
		if !ms.insideOpen(p) {
			return nil, i, false
		}
	}
	return out, -1, false
}

// solve runs damped Gauss-Newton with minimum-norm steps from r at prec
// bits until the base-2 logarithm of the residual norm is at most tolLog2,
// in at most maxIter steps, and returns the rule and that logarithm.
// Near the solution each step gains about as many digits as the float64
// Jacobian is accurate (a chord-like iteration); far from it, the step is
// halved until the residual decreases, the weights stay positive and the
// nodes inside.
func (ms *momentSystem) solve(ctx context.Context, r *wrule, prec uint, tolLog2 float64, maxIter int) (*wrule, float64, error) {
	return ms.solveDropping(ctx, r, prec, tolLog2, maxIter, len(r.x))
}

// solveDropping is solve, except that while the rule has more than
// minPts nodes, a full step that would drive a weight to zero or below
// removes that node instead (point elimination lets such points go). A
// node that a step would take out of the domain is kept: dropping those
// too cascaded, on polygon rules, down to a singular system.
func (ms *momentSystem) solveDropping(ctx context.Context, r *wrule, prec uint, tolLog2 float64, maxIter, minPts int) (*wrule, float64, error) {
	F, shift, ln := ms.residual(r, prec)
	for it := 0; ln > tolLog2; it++ {
		if err := ctx.Err(); err != nil {
			return nil, 0, err
		}
		if it == maxIter {
			return nil, ln, fmt.Errorf("the moment equations did not converge in %d Gauss-Newton steps (residual 2^%.0f, asked 2^%.0f)", maxIter, ln, tolLog2)
		}
		J := ms.jacobian(r)
		neg := make([]float64, len(F))
		floats.ScaleTo(neg, -1, F)
		accepted := false
		// A node pressed against the boundary blocks every step that
		// moves it outward, however short: its coordinates are then
		// frozen for this step (their columns of J zeroed) and the step
		// recomputed, so that the others and the weights carry it.
		frozen := map[int]bool{}
		for !accepted {
			d, ok := minNorm(J, neg)
			if !ok {
				return nil, ln, fmt.Errorf("the moment equations became singular at %d points", len(r.x))
			}
			blocker := -1
			for t := 1.0; t > 1e-6; t /= 2 {
				c, dying, byWeight := ms.stepWhy(r, d, t, shift, prec)
				if c == nil && t == 1 && dying >= 0 && byWeight && len(r.x) > minPts {
					r = r.without(dying)
					F, shift, ln = ms.residual(r, prec)
					accepted = true
					break
				}
				if c == nil {
					if blocker < 0 {
						blocker = dying
					}
					continue
				}
				F2, shift2, ln2 := ms.residual(c, prec)
				if ln2 < ln {
					r, F, shift, ln, accepted = c, F2, shift2, ln2, true
					break
				}
			}
			if accepted {
				break
			}
			if blocker < 0 || frozen[blocker] || len(frozen) >= len(r.x) {
				return nil, ln, fmt.Errorf("the moment equations stalled at residual 2^%.0f (asked 2^%.0f) with positive weights and interior nodes", ln, tolLog2)
			}
			frozen[blocker] = true
			n, dim := len(r.x), ms.s.Dim()
			rows, _ := J.Dims()
			for k := 0; k < dim; k++ {
				for j := 0; j < rows; j++ {
					J.Set(j, n+blocker*dim+k, 0)
				}
			}
		}
	}
	return r, ln, nil
}

// insideOpen64 reports whether the float64 point x lies in the open
// element s: the cheap test of the iterations (the printed rule is
// checked exactly, Shape.Contains).
func insideOpen64(s Shape, x []float64) bool {
	in := func(v float64) bool { return v > -1 && v < 1 }
	switch s {
	case Line:
		return in(x[0])
	case Quadrilateral:
		return in(x[0]) && in(x[1])
	case Hexahedron:
		return in(x[0]) && in(x[1]) && in(x[2])
	case Triangle:
		return x[0] > 0 && x[1] > 0 && x[0]+x[1] < 1
	case Tetrahedron:
		return x[0] > 0 && x[1] > 0 && x[2] > 0 && x[0]+x[1]+x[2] < 1
	case Prism:
		return x[0] > 0 && x[1] > 0 && x[0]+x[1] < 1 && in(x[2])
	case Pyramid:
		h := 1 - x[2]
		return x[2] > 0 && math.Abs(x[0]) < h && math.Abs(x[1]) < h
	}
	return false
}
