package element

import (
	"context"
	"math"
	"math/big"
	"sort"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// rule64 is a rule being thinned in float64: nodes x and weights w.
type rule64 struct {
	x [][]float64
	w []float64
}

func (r *rule64) without(drop ...int) *rule64 {
	gone := map[int]bool{}
	for _, i := range drop {
		gone[i] = true
	}
	out := &rule64{}
	for k := range r.x {
		if !gone[k] {
			out.x = append(out.x, r.x[k])
			out.w = append(out.w, r.w[k])
		}
	}
	return out
}

// sys64 is the moment system of a momentSystem in float64: the residual
// F = sum_i w_i psi(x_i) - C^T mu in the basis psi = phi C, orthonormal
// for the candidate measure, so that float64 keeps about 14 digits of it
// (monomial moments would lose most of them at degree 20).
type sys64 struct {
	ms   *momentSystem
	b    []float64
	bn   float64
	M, d int
	// work counts the flops spent, the budget's currency.
	work float64
}

func newSys64(ms *momentSystem) *sys64 {
	M := ms.bb.size()
	mu := make([]float64, M)
	for j := range mu {
		mu[j], _ = ms.mu[j].Float64()
	}
	b := make([]float64, M)
	mat.NewVecDense(M, b).MulVec(ms.C.T(), mat.NewVecDense(M, mu))
	return &sys64{ms: ms, b: b, bn: floats.Norm(b, 2), M: M, d: ms.s.Dim()}
}

// basis returns Psi (M x n, column i = psi(x_i)) and, when grad, the dim
// matrices of its derivatives.
func (s *sys64) basis(r *rule64, grad bool) (*mat.Dense, []*mat.Dense) {
	n := len(r.x)
	Phi := mat.NewDense(s.M, n, nil)
	var G []*mat.Dense
	var g [][]float64
	if grad {
		G = make([]*mat.Dense, s.d)
		g = make([][]float64, s.d)
		for k := range G {
			G[k] = mat.NewDense(s.M, n, nil)
			g[k] = make([]float64, s.M)
		}
	}
	val := make([]float64, s.M)
	for i := range r.x {
		s.ms.bb.eval64(r.x[i], val, g)
		Phi.SetCol(i, val)
		for k := range G {
			G[k].SetCol(i, g[k])
		}
	}
	var Psi mat.Dense
	Psi.Mul(s.ms.C.T(), Phi)
	s.work += 2 * float64(s.M*s.M*n)
	for k := range G {
		var t mat.Dense
		t.Mul(s.ms.C.T(), G[k])
		G[k] = &t
		s.work += 2 * float64(s.M*s.M*n)
	}
	return &Psi, G
}

func (s *sys64) residual(r *rule64) ([]float64, float64) {
	Psi, _ := s.basis(r, false)
	F := make([]float64, s.M)
	mat.NewVecDense(s.M, F).MulVec(Psi, mat.NewVecDense(len(r.w), r.w))
	floats.Sub(F, s.b)
	return F, floats.Norm(F, 2)
}

// solve runs Gauss-Newton with minimum-norm steps (QR of J^T) from r
// until ||F|| <= tol ||b||, in at most maxIter steps, the weights kept
// positive and the nodes in the open domain by halving the step; a node
// that blocks every step is frozen for that step. While r has more than
// minPts nodes, a full step that would take a weight through zero
// removes that node instead. nil when it does not converge.
func (s *sys64) solve(ctx context.Context, r *rule64, tol float64, maxIter, minPts int) *rule64 {
	F, ln := s.residual(r)
	for it := 0; ln > tol*s.bn; it++ {
		if it == maxIter || ctx.Err() != nil {
			return nil
		}
		n := len(r.x)
		Psi, G := s.basis(r, true)
		J := mat.NewDense(s.M, n*(s.d+1), nil)
		for i := 0; i < n; i++ {
			for j := 0; j < s.M; j++ {
				J.Set(j, i, r.w[i]*Psi.At(j, i))
				for k := 0; k < s.d; k++ {
					J.Set(j, n+i*s.d+k, r.w[i]*G[k].At(j, i))
				}
			}
		}
		neg := make([]float64, s.M)
		floats.ScaleTo(neg, -1, F)
		frozen := map[int]bool{}
		accepted := false
		for !accepted {
			dvec, ok := minNorm(J, neg)
			s.work += 2 * float64(s.M*s.M*n*(s.d+1))
			if !ok {
				return nil
			}
			blocker := -1
			for t := 1.0; t > 1e-5; t /= 2 {
				c, bad, byWeight := s.step(r, dvec, t)
				if c == nil && t == 1 && byWeight && n > minPts {
					r = r.without(bad)
					F, ln = s.residual(r)
					accepted = true
					break
				}
				if c == nil {
					if blocker < 0 && !byWeight {
						blocker = bad
					}
					continue
				}
				F2, ln2 := s.residual(c)
				if ln2 < ln {
					r, F, ln, accepted = c, F2, ln2, true
					break
				}
			}
			if accepted {
				break
			}
			if blocker < 0 || frozen[blocker] {
				return nil
			}
			frozen[blocker] = true
			for k := 0; k < s.d; k++ {
				for j := 0; j < s.M; j++ {
					J.Set(j, n+blocker*s.d+k, 0)
				}
			}
		}
	}
	return r
}

// step moves r by t d (relative weight changes, then coordinates), or
// returns nil and the first node whose weight (byWeight) or position
// stops it.
func (s *sys64) step(r *rule64, d []float64, t float64) (*rule64, int, bool) {
	n := len(r.x)
	out := &rule64{x: make([][]float64, n), w: make([]float64, n)}
	for i := 0; i < n; i++ {
		if t*d[i] <= -1+1e-12 {
			return nil, i, true
		}
	}
	for i := 0; i < n; i++ {
		out.w[i] = r.w[i] * (1 + t*d[i])
		out.x[i] = make([]float64, s.d)
		for k := 0; k < s.d; k++ {
			out.x[i][k] = r.x[i][k] + t*d[n+i*s.d+k]
		}
		if !s.ms.insideOpen(out.x[i]) {
			return nil, i, false
		}
	}
	return out, -1, false
}

// significance is w_i |psi(x_i)|^2.
func (s *sys64) significance(r *rule64) []float64 {
	Psi, _ := s.basis(r, false)
	out := make([]float64, len(r.x))
	for i := range out {
		c := mat.Col(nil, i, Psi)
		out[i] = r.w[i] * floats.Dot(c, c)
	}
	return out
}

// elim64Work bounds the float64 flops one elimination may spend.
const elim64Work = 4e11

// eliminate64 is the point elimination of H. Xiao and Z. Gimbutas, "A
// numerical algorithm for the construction of efficient quadrature rules
// in two and higher dimensions", Comput. Math. Appl. 59 (2010), carried
// out in float64 on the orthonormal basis: the nodes are ordered by
// significance w_i |psi(x_i)|^2, smallest first; the least significant
// is removed and the rest re-solved by Gauss-Newton with minimum-norm
// steps, positive weights and interior nodes; when that fails the next
// candidate is tried, through every node, before giving up. Far above the
// fewest points possible, batches of the least significant go at once
// (halved on failure). It stops at ceil(M/(dim+1)) points, when no node
// can go, or when the work budget is spent; r must solve the equations
// to about float64 accuracy.
func (s *sys64) eliminate(ctx context.Context, r *rule64) *rule64 {
	minPts := (s.M + s.d) / (s.d + 1)
	const tol = 1e-13
	batch := max(1, (len(r.x)-minPts)/4)
	for len(r.x) > minPts && s.work < elim64Work && ctx.Err() == nil {
		sig := s.significance(r)
		order := make([]int, len(r.x))
		for i := range order {
			order[i] = i
		}
		sort.SliceStable(order, func(a, b int) bool { return sig[order[a]] < sig[order[b]] })
		if batch > 1 {
			b := min(batch, len(r.x)-minPts)
			if res := s.solve(ctx, r.without(order[:b]...), tol, 15, minPts); res != nil {
				r = res
			} else {
				batch /= 2
			}
			continue
		}
		removed := false
		for t := 0; t < len(order) && s.work < elim64Work; t++ {
			if res := s.solve(ctx, r.without(order[t]), tol, 25, minPts); res != nil {
				r, removed = res, true
				break
			}
		}
		if !removed {
			break
		}
	}
	return r
}

func toRule64(r *wrule) *rule64 {
	out := &rule64{x: make([][]float64, len(r.x)), w: make([]float64, len(r.u))}
	for i := range r.x {
		out.x[i] = make([]float64, len(r.x[i]))
		for k := range r.x[i] {
			out.x[i][k], _ = r.x[i][k].Float64()
		}
		out.w[i], _ = r.u[i].Float64()
	}
	return out
}

func (r *rule64) at(prec uint) *wrule {
	out := &wrule{x: make([][]*big.Float, len(r.x)), u: make([]*big.Float, len(r.w))}
	for i := range r.x {
		out.x[i] = make([]*big.Float, len(r.x[i]))
		for k, v := range r.x[i] {
			out.x[i][k] = new(big.Float).SetPrec(prec).SetFloat64(v)
		}
		out.u[i] = new(big.Float).SetPrec(prec).SetFloat64(r.w[i])
	}
	return out
}

// thin64 runs eliminate64 on r (solved at 128 bits) and solves the
// survivors at 128 bits to tolLog2; nil when that last solve fails.
func (ms *momentSystem) thin64(ctx context.Context, r *wrule, tolLog2 float64) *wrule {
	_ = math.Abs
	s := newSys64(ms)
	t := s.eliminate(ctx, toRule64(r))
	if len(t.x) >= len(r.x) {
		return r
	}
	res, _, err := ms.solve(ctx, t.at(128), 128, tolLog2, 25)
	if err != nil {
		return nil
	}
	return res
}
