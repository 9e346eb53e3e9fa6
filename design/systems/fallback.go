package systems

import (
	"context"
	"errors"
	"math"
	"math/big"
	"sort"
)

// fallback finds an n-point rule for the user's system (the homotopy at
// s = 1) without a path from a known rule, after J. Bremer, Z. Gimbutas
// and V. Rokhlin, "A nonlinear optimization procedure for generalized
// Gaussian quadratures", SIAM J. Sci. Comput. 32 (2010) 1761-1788: an
// oversampled positive rule on the candidate points cand (a positive
// solution of the moment equations by nonnegative least squares, at most
// 2n points: Tchakaloff's bound) is reduced one point at a time, the
// least significant first, each reduction followed by Gauss-Newton steps
// that restore the moment equations with nodes ordered and inside and
// weights positive. Everything here is float64 in the orthonormalised
// basis, where the equations are well conditioned; the caller refines the
// result with Newton at full precision. evalPrec is the precision the basis
// is evaluated at before rounding to float64.
func (h *homotopy) fallback(ctx context.Context, cand []*big.Float, n int, evalPrec uint) ([]*big.Float, []*big.Float, error) {
	m := 2 * n
	b := make([]float64, m)
	for j := range b {
		b[j], _ = h.bu[j].Float64()
	}
	ev := func(x float64, deriv bool) ([]float64, []float64, error) {
		u, du, err := h.u.eval(new(big.Float).SetPrec(evalPrec).SetFloat64(x), evalPrec, deriv)
		if err != nil {
			return nil, nil, err
		}
		return floats(u), floats(du), nil
	}
	var xs []float64
	for _, c := range cand {
		f, _ := c.Float64()
		// Candidates within 10^-8 of a finite end (the double-exponential
		// points reach far closer) would only slow the descent.
		if h.inside(f) && h.room(f) > 1e-8 && (len(xs) == 0 || f > xs[len(xs)-1]) {
			xs = append(xs, f)
		}
	}
	if stride := len(xs) / (6 * m); stride > 1 {
		var thin []float64
		for i := 0; i < len(xs); i += stride {
			thin = append(thin, xs[i])
		}
		xs = thin
	}
	cols := make([][]float64, len(xs))
	for l, x := range xs {
		u, _, err := ev(x, false)
		if err != nil {
			return nil, nil, err
		}
		cols[l] = u
	}
	c := nnls(cols, b)
	var px, pw []float64
	for l := range c {
		if c[l] > 0 {
			px, pw = append(px, xs[l]), append(pw, c[l])
		}
	}
	if debugCont {
		println("nnls support", len(px), "of", len(xs))
	}
	if len(px) < n {
		return nil, nil, errNoConvergence
	}
	var err error
	if px, pw, err = gaussNewton(ctx, h, px, pw, b, n, ev); err != nil {
		if debugCont {
			println("gn first failed")
		}
		return nil, nil, err
	}
	for len(px) > n {
		if err := ctx.Err(); err != nil {
			return nil, nil, err
		}
		sig := make([]float64, len(px))
		order := make([]int, len(px))
		for i := range px {
			u, _, err := ev(px[i], false)
			if err != nil {
				return nil, nil, err
			}
			for _, v := range u {
				sig[i] += v * v
			}
			sig[i] *= pw[i]
			order[i] = i
		}
		sort.Slice(order, func(a, b int) bool { return sig[order[a]] < sig[order[b]] })
		done := false
		for _, drop := range order[:min(len(order), 8)] {
			qx := append(append([]float64(nil), px[:drop]...), px[drop+1:]...)
			qw := append(append([]float64(nil), pw[:drop]...), pw[drop+1:]...)
			// The dropped weight goes to the nearest neighbour, so the
			// zeroth moment stays about right.
			near := drop
			if near >= len(qx) || near > 0 && px[drop]-px[drop-1] < px[drop+1]-px[drop] {
				near--
			}
			qw[near] += pw[drop]
			rx, rw, err := gaussNewton(ctx, h, qx, qw, b, n, ev)
			if errors.Is(err, errNoConvergence) {
				continue
			}
			if err != nil {
				return nil, nil, err
			}
			px, pw, done = rx, rw, true
			break
		}
		if !done {
			return nil, nil, errNoConvergence
		}
	}
	out := func(v []float64) []*big.Float {
		r := make([]*big.Float, len(v))
		for i := range v {
			r[i] = new(big.Float).SetPrec(evalPrec).SetFloat64(v[i])
		}
		return r
	}
	return out(px), out(pw), nil
}

func floats(v []*big.Float) []float64 {
	out := make([]float64, len(v))
	for i := range v {
		out[i], _ = v[i].Float64()
	}
	return out
}

// room is the distance from x to the nearer finite end, or max(|x|, 1)
// where both ends are infinite or that distance exceeds it.
func (h *homotopy) room(x float64) float64 {
	r := math.Max(math.Abs(x), 1)
	if h.lo != nil {
		lo, _ := h.lo.Float64()
		r = math.Min(r, x-lo)
	}
	if h.hi != nil {
		hi, _ := h.hi.Float64()
		r = math.Min(r, hi-x)
	}
	return r
}

func (h *homotopy) inside(x float64) bool {
	if h.lo != nil {
		if lo, _ := h.lo.Float64(); x <= lo {
			return false
		}
	}
	if h.hi != nil {
		if hi, _ := h.hi.Float64(); x >= hi {
			return false
		}
	}
	return !math.IsInf(x, 0) && !math.IsNaN(x)
}

// gaussNewton drives sum_i w_i u(x_i) - b to zero (relative 1e-13) by
// minimum-norm Gauss-Newton steps, shortened so that no weight loses more
// than half of itself and no gap more than half; a point whose weight
// blocks the step is dropped while more than minPoints remain.
func gaussNewton(ctx context.Context, h *homotopy, x, w, b []float64, minPoints int, ev func(float64, bool) ([]float64, []float64, error)) ([]float64, []float64, error) {
	n, m := len(x), len(b)
	x, w = append([]float64(nil), x...), append([]float64(nil), w...)
	bn := norm(b)
	for it := 0; it < 80; it++ {
		if err := ctx.Err(); err != nil {
			return nil, nil, err
		}
		F := make([]float64, m)
		for j := range F {
			F[j] = -b[j]
		}
		J := make([][]float64, m)
		for j := range J {
			J[j] = make([]float64, 2*n)
		}
		// The nodes' columns are scaled by each node's distance to the
		// nearer finite end (or by max(|x|, 1)): the minimum-norm step then
		// moves a node near an end by a share of its distance to it.
		sc := make([]float64, n)
		for i := range x {
			sc[i] = h.room(x[i])
			u, du, err := ev(x[i], true)
			if err != nil {
				return nil, nil, err
			}
			for j := 0; j < m; j++ {
				F[j] += w[i] * u[j]
				J[j][i] = w[i] * du[j] * sc[i]
				J[j][n+i] = u[j]
			}
		}
		r := norm(F)
		if debugCont {
			println("gn", it, n, r/bn)
		}
		if r < 1e-13*bn {
			return x, w, nil
		}
		// Minimum-norm step: d = -J^T (J J^T)^-1 F (or the least-squares
		// step when there are fewer unknowns than equations).
		var d []float64
		if 2*n >= m {
			G := make([][]float64, m)
			for a := range G {
				G[a] = make([]float64, m)
				for c := range G[a] {
					for k := 0; k < 2*n; k++ {
						G[a][c] += J[a][k] * J[c][k]
					}
				}
			}
			y := append([]float64(nil), F...)
			if !solveF64(G, y) {
				if debugCont {
					println("singular G")
				}
				return nil, nil, errNoConvergence
			}
			d = make([]float64, 2*n)
			for k := range d {
				for a := 0; a < m; a++ {
					d[k] -= J[a][k] * y[a]
				}
				if k < n {
					d[k] *= sc[k]
				}
			}
		} else {
			return nil, nil, errNoConvergence
		}
		// Fraction to the boundary: no weight loses more than half of
		// itself, no gap (between nodes, or to a finite end) more than half.
		t, block := 1.0, -1
		lo, hi := math.Inf(-1), math.Inf(1)
		if h.lo != nil {
			lo, _ = h.lo.Float64()
		}
		if h.hi != nil {
			hi, _ = h.hi.Float64()
		}
		for i := 0; i < n; i++ {
			if d[n+i] < 0 && 0.5*w[i]/-d[n+i] < t {
				t, block = 0.5*w[i]/-d[n+i], i
			}
			left, dl := lo, 0.0
			if i > 0 {
				left, dl = x[i-1], d[i-1]
			}
			if rel := d[i] - dl; rel < 0 && !math.IsInf(left, -1) && 0.5*(x[i]-left)/-rel < t {
				t, block = 0.5*(x[i]-left)/-rel, -1
			}
			if i == n-1 && d[i] > 0 && !math.IsInf(hi, 1) && 0.5*(hi-x[i])/d[i] < t {
				t, block = 0.5*(hi-x[i])/d[i], -1
			}
		}
		if block >= 0 && t < 0.1 && n > minPoints {
			// The step wants this weight gone: the point eliminates
			// itself (Bremer, Gimbutas and Rokhlin's reduction, unforced).
			x = append(x[:block:block], x[block+1:]...)
			w = append(w[:block:block], w[block+1:]...)
			n--
			continue
		}
		if t < 1e-12 {
			if debugCont {
				println("t small", t)
				for i := range x {
					println(x[i], w[i], d[i], d[n+i])
				}
			}
			return nil, nil, errNoConvergence
		}
		for i := 0; i < n; i++ {
			x[i] += t * d[i]
			w[i] += t * d[n+i]
		}
		if !h.inside(x[0]) || !h.inside(x[n-1]) {
			return nil, nil, errNoConvergence
		}
	}
	return nil, nil, errNoConvergence
}

func norm(v []float64) float64 {
	s := 0.0
	for _, a := range v {
		s += a * a
	}
	return math.Sqrt(s)
}

// solveF64 overwrites b with A^-1 b (partial pivoting), destroying A.
func solveF64(a [][]float64, b []float64) bool {
	n := len(b)
	for k := 0; k < n; k++ {
		p := k
		for i := k + 1; i < n; i++ {
			if math.Abs(a[i][k]) > math.Abs(a[p][k]) {
				p = i
			}
		}
		if a[p][k] == 0 {
			return false
		}
		a[k], a[p] = a[p], a[k]
		b[k], b[p] = b[p], b[k]
		for i := k + 1; i < n; i++ {
			f := a[i][k] / a[k][k]
			for j := k; j < n; j++ {
				a[i][j] -= f * a[k][j]
			}
			b[i] -= f * b[k]
		}
	}
	for k := n - 1; k >= 0; k-- {
		for j := k + 1; j < n; j++ {
			b[k] -= a[k][j] * b[j]
		}
		b[k] /= a[k][k]
	}
	return true
}

// nnls returns c >= 0 minimising |sum_l c_l cols[l] - b| by the active-set
// method of C. L. Lawson and R. J. Hanson, "Solving Least Squares
// Problems" (Prentice-Hall, 1974), chapter 23, with the passive-set
// subproblems solved by normal equations (the columns are values of an
// orthonormal basis, so their Gram matrices stay tame).
func nnls(cols [][]float64, b []float64) []float64 {
	L, m := len(cols), len(b)
	c := make([]float64, L)
	passive := make([]bool, L)
	resid := func() []float64 {
		r := append([]float64(nil), b...)
		for l := range cols {
			if c[l] != 0 {
				for j := 0; j < m; j++ {
					r[j] -= c[l] * cols[l][j]
				}
			}
		}
		return r
	}
	for outer := 0; outer < 3*m; outer++ {
		r := resid()
		best, bi := 1e-14*norm(b), -1
		for l := range cols {
			if passive[l] {
				continue
			}
			g := 0.0
			for j := 0; j < m; j++ {
				g += cols[l][j] * r[j]
			}
			if g > best {
				best, bi = g, l
			}
		}
		if bi < 0 {
			break
		}
		passive[bi] = true
		for inner := 0; inner < 3*m; inner++ {
			var P []int
			for l := range passive {
				if passive[l] {
					P = append(P, l)
				}
			}
			G := make([][]float64, len(P))
			z := make([]float64, len(P))
			for a, la := range P {
				G[a] = make([]float64, len(P))
				for bb, lb := range P {
					for j := 0; j < m; j++ {
						G[a][bb] += cols[la][j] * cols[lb][j]
					}
				}
				for j := 0; j < m; j++ {
					z[a] += cols[la][j] * b[j]
				}
			}
			if !solveF64(G, z) {
				passive[bi] = false
				return c
			}
			allPos := true
			for a := range z {
				if z[a] <= 0 {
					allPos = false
				}
			}
			if allPos {
				for a, l := range P {
					c[l] = z[a]
				}
				break
			}
			alpha := 1.0
			for a, l := range P {
				if z[a] <= 0 {
					alpha = math.Min(alpha, c[l]/(c[l]-z[a]))
				}
			}
			for a, l := range P {
				c[l] += alpha * (z[a] - c[l])
				if c[l] <= 1e-300 {
					c[l], passive[l] = 0, false
				}
			}
		}
	}
	return c
}
