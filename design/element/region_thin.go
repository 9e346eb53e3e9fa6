package element

import (
	"context"
	"math"
	"math/big"
	"sort"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// rule64 is a rule being thinned in float64: nodes x and weights u.
type rule64 struct {
	x [][]float64
	u []float64
}

func (r *rule64) without(drop ...int) *rule64 {
	gone := map[int]bool{}
	for _, i := range drop {
		gone[i] = true
	}
	out := &rule64{}
	for k := range r.x {
		if !gone[k] {
			out.x, out.u = append(out.x, r.x[k]), append(out.u, r.u[k])
		}
	}
	return out
}

// wide is r held as big.Float values of prec bits (exactly: a float64
// fits), for the shared float64 pieces of the extended-precision
// elimination (jacobian, significance, closestPairs) and for the solve
// that follows.
func (r *rule64) wide(prec uint) *wrule {
	out := &wrule{x: make([][]*big.Float, len(r.x)), u: make([]*big.Float, len(r.u))}
	for i := range r.x {
		out.x[i] = make([]*big.Float, len(r.x[i]))
		for k, v := range r.x[i] {
			out.x[i][k] = new(big.Float).SetPrec(prec).SetFloat64(v)
		}
		out.u[i] = new(big.Float).SetPrec(prec).SetFloat64(r.u[i])
	}
	return out
}

func narrow(r *wrule) *rule64 {
	out := &rule64{x: make([][]float64, len(r.x)), u: make([]float64, len(r.u))}
	for i := range r.x {
		out.x[i] = make([]float64, len(r.x[i]))
		for k, v := range r.x[i] {
			out.x[i][k], _ = v.Float64()
		}
		out.u[i], _ = r.u[i].Float64()
	}
	return out
}

// residual64 is C^T (sum_i u_i phi(x_i) - mu) in float64 and the base-2
// logarithm of its 2-norm. Rounding makes it wrong by about 2^-52 times
// the sum of |u_i phi(x_i)|, far below the 10^-13 relative tolerance the
// thinning works to (thin64): the float64 residual decides nothing that
// is printed, the extended-precision solve after it does.
func (ms *momentSystem) residual64(r *rule64, mu64 []float64) ([]float64, float64) {
	M := ms.bb.size()
	sum := make([]float64, M)
	val := make([]float64, M)
	for i := range r.x {
		ms.bb.eval64(r.x[i], val, nil)
		floats.AddScaled(sum, r.u[i], val)
	}
	floats.Sub(sum, mu64)
	F := make([]float64, M)
	mat.NewVecDense(M, F).MulVec(ms.C.T(), mat.NewVecDense(M, sum))
	return F, math.Log2(floats.Norm(F, 2))
}

// step64 is stepWhy in float64: r moved by t times d (relative weight
// changes, then node coordinates), or nil with the node that stopped it
// and whether its weight did.
func (ms *momentSystem) step64(r *rule64, d []float64, t float64) (*rule64, int, bool) {
	n, dim := len(r.x), ms.s.Dim()
	out := &rule64{x: make([][]float64, n), u: make([]float64, n)}
	for i := 0; i < n; i++ {
		if t*d[i] <= -1 {
			return nil, i, true
		}
		out.u[i] = r.u[i] + t*d[i]*r.u[i]
		out.x[i] = make([]float64, dim)
		for k := 0; k < dim; k++ {
			out.x[i][k] = r.x[i][k] + t*d[n+i*dim+k]
		}
		if !ms.insideOpen(out.x[i]) {
			return nil, i, false
		}
	}
	return out, -1, false
}

// solveDropping64 is solveDropping in float64 (the same damped
// Gauss-Newton with minimum-norm steps, the same dropping of a node whose
// weight a full step would take to zero, the same freezing of a node a
// step would take outside): the float64 twin used while thinning, where
// the extended-precision iteration cost most of a polygon batch.
func (ms *momentSystem) solveDropping64(ctx context.Context, r *rule64, mu64 []float64, tolLog2 float64, maxIter, minPts int) (*rule64, bool) {
	F, ln := ms.residual64(r, mu64)
	for it := 0; ln > tolLog2; it++ {
		if ctx.Err() != nil || it == maxIter {
			return nil, false
		}
		J := ms.jacobian(r.wide(53))
		neg := make([]float64, len(F))
		floats.ScaleTo(neg, -1, F)
		accepted := false
		frozen := map[int]bool{}
		for !accepted {
			d, ok := minNorm(J, neg)
			if !ok {
				return nil, false
			}
			blocker := -1
			for t := 1.0; t > 1e-6; t /= 2 {
				c, dying, byWeight := ms.step64(r, d, t)
				if c == nil && t == 1 && dying >= 0 && byWeight && len(r.x) > minPts {
					r = r.without(dying)
					F, ln = ms.residual64(r, mu64)
					accepted = true
					break
				}
				if c == nil {
					if blocker < 0 {
						blocker = dying
					}
					continue
				}
				if F2, ln2 := ms.residual64(c, mu64); ln2 < ln {
					r, F, ln, accepted = c, F2, ln2, true
					break
				}
			}
			if accepted {
				break
			}
			if blocker < 0 || frozen[blocker] || len(frozen) >= len(r.x) {
				return nil, false
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
	return r, true
}

// thin64 is thin with the solve and the point elimination (eliminate's
// moves, order and budget) run in float64 instead of at 128 bits: the
// moment equations are solved there only to 10^-13 relative, which
// float64 reaches, and the thinned rule is only the start of the solve at
// the working precision (solveTwice), which decides every printed digit.
// When the first solve fails, start itself comes back.
func (ms *momentSystem) thin64(ctx context.Context, start *wrule, bn float64, prec uint) *wrule {
	M, dim := ms.bb.size(), ms.s.Dim()
	mu64 := make([]float64, M)
	for j := range mu64 {
		mu64[j], _ = ms.mu[j].Float64()
	}
	tol := math.Log2(bn) - 13*math.Log2(10)
	r, ok := ms.solveDropping64(ctx, narrow(start), mu64, tol, 25, len(start.x))
	if !ok {
		return start
	}
	minPts := (M + dim) / (dim + 1)
	per := 24 * float64(M) * float64(M) * float64((dim+1)*len(r.x))
	budget := int(math.Min(float64(4*M), math.Max(8, eliminationWork/per)))
	batch := max(1, (len(r.x)-minPts)/4)
	for len(r.x) > minPts && budget > 0 && ctx.Err() == nil {
		w := r.wide(53)
		sig := ms.significance(w)
		order := make([]int, len(r.x))
		for i := range order {
			order[i] = i
		}
		sort.SliceStable(order, func(a, b int) bool { return sig[order[a]] < sig[order[b]] })
		if batch > 1 {
			b := min(batch, len(r.x)-minPts)
			budget--
			if res, ok := ms.solveDropping64(ctx, r.without(order[:b]...), mu64, tol, 12, minPts); ok {
				r = res
			} else {
				batch /= 2
			}
			continue
		}
		removed := false
		for t := 0; t < len(order) && budget > 0; t++ {
			budget--
			if res, ok := ms.solveDropping64(ctx, r.without(order[t]), mu64, tol, elimIter, minPts); ok {
				r, removed = res, true
				break
			}
		}
		for _, pr := range closestPairs(w, mergeTries) {
			if removed || budget <= 0 {
				break
			}
			budget--
			if m := w.merged(pr[0], pr[1], 53); m != nil && ms.insideAll(m) {
				if res, ok := ms.solveDropping64(ctx, narrow(m), mu64, tol, elimIter, minPts); ok {
					r, removed = res, true
				}
			}
		}
		if !removed {
			break
		}
	}
	return r.wide(prec)
}
