package element

import (
	"context"
	"math"
	"math/big"
	"sort"
)

// eliminationWork bounds the floating-point work of point elimination:
// about this many flops in all, so that the attempts allowed shrink as
// the moment equations grow (deterministically, unlike a time limit).
const eliminationWork = 1.2e11

// eliminate removes points from the rule r (which solves the moment
// equations to 2^tolLog2 at prec bits) one at a time while the rest can still
// solve them with positive weights and interior nodes, after H. Xiao and
// Z. Gimbutas, "A numerical algorithm for the construction of efficient
// quadrature rules in two and higher dimensions", Comput. Math. Appl. 59
// (2010): the points are tried in increasing order of significance u_i
// |psi(x_i)|^2 (the share of the weighted basis the point carries), each
// removal followed by damped Gauss-Newton with minimum-norm steps from the
// remaining points, during which a point whose weight would collapse is
// dropped as well (solveDropping). Every point is tried before giving up. A
// rule of n points has (dim+1) n unknowns, so no removal is tried below
// ceil(M / (dim+1)) points.
func (ms *momentSystem) eliminate(ctx context.Context, r *wrule, prec uint, tolLog2 float64) *wrule {
	M, dim := ms.bb.size(), ms.s.Dim()
	minPts := (M + dim) / (dim + 1)
	per := 24 * float64(M) * float64(M) * float64((dim+1)*len(r.x)) // one attempt, about 12 steps of QR
	budget := int(math.Min(float64(4*M), math.Max(8, eliminationWork/per)))
	// Far above the fewest points possible, the least significant points
	// are first removed in batches (halved on failure), which saves most
	// of the attempts; single removals finish the job.
	batch := max(1, (len(r.x)-minPts)/4)
	for len(r.x) > minPts && budget > 0 {
		if ctx.Err() != nil {
			return r
		}
		sig := ms.significance(r)
		order := make([]int, len(r.x))
		for i := range order {
			order[i] = i
		}
		sort.SliceStable(order, func(a, b int) bool { return sig[order[a]] < sig[order[b]] })
		if batch > 1 {
			b := min(batch, len(r.x)-minPts)
			budget--
			if res, _, err := ms.solveDropping(ctx, r.without(order[:b]...), prec, tolLog2, 12, minPts); err == nil {
				r = res
			} else {
				batch /= 2
			}
			continue
		}
		removed := false
		for t := 0; t < len(order) && budget > 0; t++ {
			budget--
			if res, _, err := ms.solveDropping(ctx, r.without(order[t]), prec, tolLog2, elimIter, minPts); err == nil {
				r, removed = res, true
				break
			}
		}
		for _, pr := range closestPairs(r, mergeTries) {
			if removed || budget <= 0 {
				break
			}
			budget--
			if m := r.merged(pr[0], pr[1], prec); m != nil && ms.insideAll(m) {
				if res, _, err := ms.solveDropping(ctx, m, prec, tolLog2, elimIter, minPts); err == nil {
					r, removed = res, true
				}
			}
		}
		if !removed {
			break
		}
	}
	return r
}

// mergeTries is how many of the closest pairs of nodes are tried for a
// merge once no single removal succeeds.
const mergeTries = 8

// closestPairs returns up to k pairs of nodes in increasing distance.
func closestPairs(r *wrule, k int) [][2]int {
	n := len(r.x)
	type pair struct {
		i, j int
		d    float64
	}
	var ps []pair
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			d := 0.0
			for c := range r.x[i] {
				a, _ := r.x[i][c].Float64()
				b, _ := r.x[j][c].Float64()
				d += (a - b) * (a - b)
			}
			ps = append(ps, pair{i, j, d})
		}
	}
	sort.SliceStable(ps, func(a, b int) bool { return ps[a].d < ps[b].d })
	var out [][2]int
	for _, p := range ps[:min(k, len(ps))] {
		out = append(out, [2]int{p.i, p.j})
	}
	return out
}

// merged replaces nodes i and j by one node at their weighted mean
// carrying the sum of their weights: it keeps the mass and the first
// moments, and is the usual second move of point elimination when
// removing a node alone fails.
func (r *wrule) merged(i, j int, prec uint) *wrule {
	out := r.without(i, j)
	u := new(big.Float).SetPrec(prec).Add(r.u[i], r.u[j])
	if u.Sign() <= 0 {
		return nil
	}
	x := make([]*big.Float, len(r.x[i]))
	for c := range x {
		a := new(big.Float).SetPrec(prec).Mul(r.u[i], r.x[i][c])
		b := new(big.Float).SetPrec(prec).Mul(r.u[j], r.x[j][c])
		x[c] = a.Add(a, b).Quo(a, u)
	}
	out.x, out.u = append(out.x, x), append(out.u, u)
	return out
}

// insideAll reports whether every node of r is in the open domain.
func (ms *momentSystem) insideAll(r *wrule) bool {
	p := make([]float64, ms.s.Dim())
	for i := range r.x {
		for k := range p {
			p[k], _ = r.x[i][k].Float64()
		}
		if !ms.insideOpen(p) {
			return false
		}
	}
	return true
}

// significance is u_i |psi(x_i)|^2 for every node, in float64.
func (ms *momentSystem) significance(r *wrule) []float64 {
	M := ms.bb.size()
	val := make([]float64, M)
	psi := make([]float64, M)
	x := make([]float64, ms.s.Dim())
	out := make([]float64, len(r.x))
	for i := range r.x {
		for k := range x {
			x[k], _ = r.x[i][k].Float64()
		}
		ms.bb.eval64(x, val, nil)
		for j := 0; j < M; j++ {
			s := 0.0
			for a := 0; a <= j; a++ {
				s += val[a] * ms.C.At(a, j)
			}
			psi[j] = s
		}
		u, _ := r.u[i].Float64()
		n := 0.0
		for _, p := range psi {
			n += p * p
		}
		out[i] = u * n
	}
	return out
}

// without returns r with the nodes drop left out (sharing the values of
// the rest).
func (r *wrule) without(drop ...int) *wrule {
	gone := map[int]bool{}
	for _, i := range drop {
		gone[i] = true
	}
	out := &wrule{}
	for k := range r.x {
		if !gone[k] {
			out.x = append(out.x, r.x[k])
			out.u = append(out.u, r.u[k])
		}
	}
	return out
}

var elimIter = 12
