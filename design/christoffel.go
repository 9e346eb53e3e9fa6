package design

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"sort"

	"quadwright/moments"
)

// linearModification returns the first n pairs of the recurrence of the
// measure |x - z| dmu(x), where dmu has the recurrence rec (at least n+1
// pairs) and z lies at or outside an end of its support, so that x - z has
// one sign there. It is Christoffel's theorem for a linear factor in the
// form of Gautschi, Orthogonal Polynomials: Computation and Approximation,
// Oxford 2004, section 2.4.2: with r_k = pi_{k+1}(z) / pi_k(z),
//
//	r_0 = z - alpha_0,  r_k = z - alpha_k - beta_k / r_{k-1},
//	alpha'_k = alpha_{k+1} + r_{k+1} - r_k,
//	beta'_0 = |r_0| beta_0,  beta'_k = beta_k r_k / r_{k-1}.
//
// Every r_k has the same sign (pi_k has no zero outside the open support),
// so no step cancels; each value is rounded to prec bits and carries an
// error of a few ulp times k. It fails when some pi_k(z) vanishes.
func linearModification(rec *Recurrence, n int, z *big.Float, prec uint) (*Recurrence, error) {
	if rec.Len() < n+1 {
		panic(fmt.Sprintf("design: linearModification to %d pairs from %d", n, rec.Len()))
	}
	r := make([]*big.Float, n+1)
	for k := 0; k <= n; k++ {
		v := new(big.Float).SetPrec(prec).Sub(z, rec.Alpha[k])
		if k > 0 {
			v.Sub(v, new(big.Float).SetPrec(prec).Quo(rec.Beta[k], r[k-1]))
		}
		if v.Sign() == 0 {
			return nil, errors.New("a prescribed node is a zero of one of the measure's orthogonal polynomials")
		}
		r[k] = v
	}
	out := &Recurrence{Alpha: make([]*big.Float, n), Beta: make([]*big.Float, n)}
	for k := 0; k < n; k++ {
		a := new(big.Float).SetPrec(prec).Add(rec.Alpha[k+1], r[k+1])
		out.Alpha[k] = a.Sub(a, r[k])
		if k == 0 {
			b := new(big.Float).SetPrec(prec).Mul(rec.Beta[0], r[0])
			out.Beta[0] = b.Abs(b)
		} else {
			b := new(big.Float).SetPrec(prec).Mul(rec.Beta[k], r[k])
			out.Beta[k] = b.Quo(b, r[k-1])
		}
	}
	return out, nil
}

// GaussFixed builds the Points-node rule of m that contains the prescribed
// nodes fixed (distinct, each at or outside an end of the support) and
// chooses the other N - k nodes for the highest degree, 2N - k - 1,
// verified. With k = N every node is prescribed and the result is the
// interpolatory rule on them.
//
// The free nodes are the Gauss nodes of the modified measure
// prod_j |x - z_j| w(x), which is positive on the support (Christoffel's
// theorem; Gautschi 2004, section 2.4), its recurrence obtained by k
// linear modifications (linearModification). Their weights are the
// modified Christoffel numbers divided by prod_j |x_i - z_j|; the k weights
// at the prescribed nodes then follow from the k moment conditions in the
// orthonormal basis p_0..p_{k-1} of m, solved at the working precision
// with partial pivoting. A node strictly inside the support is refused:
// the modified weight would change sign there, and a rule of degree
// 2N - k - 1 with real nodes inside the support and positive weights is
// then not guaranteed to exist.
func GaussFixed(ctx context.Context, m Measure, req Request, fixed []*big.Rat) (*Rule, error) {
	req, err := checkRequest(ctx, m, req, 0)
	if err != nil {
		return nil, err
	}
	n, k := req.Points, len(fixed)
	if k == 0 {
		return Gauss(ctx, m, req)
	}
	if k > n {
		return nil, fmt.Errorf("--fixed: %d prescribed nodes do not fit a rule of --points %d (the points count the prescribed nodes)", k, n)
	}
	iv := m.Domain()
	zs := append([]*big.Rat(nil), fixed...)
	sort.Slice(zs, func(i, j int) bool { return zs[i].Cmp(zs[j]) < 0 })
	for j, z := range zs {
		if j > 0 && z.Cmp(zs[j-1]) == 0 {
			return nil, fmt.Errorf("--fixed: the node %s is given twice", moments.RatString(z))
		}
		if side(z, iv) == 0 {
			return nil, fmt.Errorf("--fixed %s: the node lies strictly inside the support %s, so prod(x - z_j) w(x) changes sign there and a rule of the highest degree with these nodes is not guaranteed to exist (a rule with positive weights may not); give nodes at or outside the ends, or all nodes with --nodes for their interpolatory weights", moments.RatString(z), iv)
		}
	}
	if k == n {
		return Interpolatory(ctx, m, req, zs, "interpolatory")
	}
	free := n - k
	nominal := 2*n - k - 1
	src, err := sourceFor(m, max(n, nominal), max(n, nominal), firstPrec(req.Digits, n), fmt.Sprintf("a %d-point rule with %d prescribed nodes", n, k))
	if err != nil {
		return nil, err
	}
	var fixedAt []int
	s1, s2, texts, err := confirmStages(n, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(n, p)
		if err != nil {
			return nil, err
		}
		mod := rec
		for j, z := range zs {
			if mod, err = linearModification(mod, n-j-1, ratFloat(z, p), p); err != nil {
				return nil, fmt.Errorf("--fixed: %v", err)
			}
		}
		if symmetricSet(zs) && isSymmetric(rec, n) {
			// The modified measure is symmetric too; exact zeros keep its
			// rule symmetric and an odd rule's middle node exactly 0.
			for _, a := range mod.Alpha {
				a.SetInt64(0)
			}
		}
		var start []*big.Float
		if prev != nil {
			for i, x := range prev.nodes {
				if !contains(fixedAt, i) {
					start = append(start, x)
				}
			}
		}
		gs, err := gaussStage(ctx, mod, free, p, start)
		if err != nil {
			return nil, variantStageError("free", err)
		}
		s, at, err := assembleFixed(rec, gs, zs, p)
		fixedAt = at
		return s, err
	})
	if err != nil {
		return nil, err
	}
	r := newRule("gauss", m, s1, s2, texts, req.Digits, "Christoffel modification by the prescribed nodes, Newton refinement on the modified recurrence; prescribed-node weights from the moment conditions")
	r.Fixed = printFixed(texts, fixedAt, zs, req.Digits)
	if err := verifyRule(ctx, src, r, nominal, nominal); err != nil {
		return nil, err
	}
	r.Stability = stabilityOf(r)
	stabilityNotes(r)
	return r, nil
}

func contains(xs []int, v int) bool {
	for _, x := range xs {
		if x == v {
			return true
		}
	}
	return false
}

// assembleFixed merges the free nodes of gs (Gauss nodes of the modified
// measure, with its Christoffel numbers) with the prescribed nodes zs into
// one ascending stage at prec bits, and returns where the prescribed nodes
// went. rec is the recurrence of the measure itself (at least len(zs)
// pairs).
func assembleFixed(rec *Recurrence, gs *stage, zs []*big.Rat, prec uint) (*stage, []int, error) {
	free, k := len(gs.nodes), len(zs)
	zf := make([]*big.Float, k)
	for j, z := range zs {
		zf[j] = ratFloat(z, prec)
	}
	// Free weights: lambda_i / prod_j |x_i - z_j|.
	fw := make([]*big.Float, free)
	for i, x := range gs.nodes {
		d := new(big.Float).SetPrec(prec).SetInt64(1)
		for _, z := range zf {
			t := new(big.Float).SetPrec(prec).Sub(x, z)
			d.Mul(d, t.Abs(t))
		}
		fw[i] = new(big.Float).SetPrec(prec).Quo(gs.weights[i], d)
	}
	// Prescribed weights: sum_j v_j p_l(z_j) = I(p_l) - sum_i w_i p_l(x_i),
	// l < k, in the orthonormal basis (I(p_0) = sqrt(beta_0), else 0).
	A := make([][]*big.Float, k)
	rhs := make([]*big.Float, k)
	for l := range A {
		A[l] = make([]*big.Float, k)
		rhs[l] = new(big.Float).SetPrec(prec)
	}
	for j, z := range zf {
		col := orthonormalValues(rec, k, z, prec)
		for l := 0; l < k; l++ {
			A[l][j] = col[l]
		}
	}
	for i, x := range gs.nodes {
		col := orthonormalValues(rec, k, x, prec)
		for l := 0; l < k; l++ {
			rhs[l].Sub(rhs[l], new(big.Float).SetPrec(prec).Mul(fw[i], col[l]))
		}
	}
	rhs[0].Add(rhs[0], new(big.Float).SetPrec(prec).Sqrt(rec.Beta[0]))
	v, ok := solveDense(A, rhs, prec)
	if !ok {
		return nil, nil, errors.New("--fixed: the moment conditions for the prescribed weights are singular")
	}
	s := &stage{prec: prec, fallback: gs.fallback}
	var at []int
	i, j := 0, 0
	for i < free || j < k {
		if j < k && (i == free || zf[j].Cmp(gs.nodes[i]) < 0) {
			at = append(at, len(s.nodes))
			s.nodes = append(s.nodes, zf[j])
			s.weights = append(s.weights, v[j])
			j++
		} else {
			s.nodes = append(s.nodes, gs.nodes[i])
			s.weights = append(s.weights, fw[i])
			i++
		}
	}
	return s, at, nil
}

// orthonormalValues returns p_0(x), ..., p_{k-1}(x), the orthonormal
// polynomials of rec (p_0 = 1/sqrt(beta_0)) at prec bits, by the forward
// recurrence sqrt(beta_{j+1}) p_{j+1} = (x - alpha_j) p_j - sqrt(beta_j) p_{j-1}.
func orthonormalValues(rec *Recurrence, k int, x *big.Float, prec uint) []*big.Float {
	out := make([]*big.Float, k)
	if k == 0 {
		return out
	}
	sb := make([]*big.Float, k)
	for j := 0; j < k; j++ {
		sb[j] = new(big.Float).SetPrec(prec).Sqrt(rec.Beta[j])
	}
	out[0] = new(big.Float).SetPrec(prec).Quo(new(big.Float).SetPrec(prec).SetInt64(1), sb[0])
	for j := 0; j+1 < k; j++ {
		t := new(big.Float).SetPrec(prec).Sub(x, rec.Alpha[j])
		t.Mul(t, out[j])
		if j > 0 {
			t.Sub(t, new(big.Float).SetPrec(prec).Mul(sb[j], out[j-1]))
		}
		out[j+1] = t.Quo(t, sb[j+1])
	}
	return out
}

// solveDense solves A v = b by Gaussian elimination with partial pivoting
// at prec bits (A and b are overwritten); it reports false for a zero
// pivot. Meant for the small systems of prescribed-node weights.
func solveDense(A [][]*big.Float, b []*big.Float, prec uint) ([]*big.Float, bool) {
	k := len(b)
	for c := 0; c < k; c++ {
		piv := c
		for r := c + 1; r < k; r++ {
			if new(big.Float).Abs(A[r][c]).Cmp(new(big.Float).Abs(A[piv][c])) > 0 {
				piv = r
			}
		}
		if A[piv][c].Sign() == 0 {
			return nil, false
		}
		A[c], A[piv] = A[piv], A[c]
		b[c], b[piv] = b[piv], b[c]
		for r := c + 1; r < k; r++ {
			f := new(big.Float).SetPrec(prec).Quo(A[r][c], A[c][c])
			for cc := c; cc < k; cc++ {
				A[r][cc] = new(big.Float).SetPrec(prec).Sub(A[r][cc], new(big.Float).SetPrec(prec).Mul(f, A[c][cc]))
			}
			b[r] = new(big.Float).SetPrec(prec).Sub(b[r], new(big.Float).SetPrec(prec).Mul(f, b[c]))
		}
	}
	v := make([]*big.Float, k)
	for r := k - 1; r >= 0; r-- {
		t := new(big.Float).SetPrec(prec).Set(b[r])
		for c := r + 1; c < k; c++ {
			t.Sub(t, new(big.Float).SetPrec(prec).Mul(A[r][c], v[c]))
		}
		v[r] = t.Quo(t, A[r][r])
	}
	return v, true
}

// symmetricSet reports whether the ascending zs is symmetric about 0.
func symmetricSet(zs []*big.Rat) bool {
	for i := range zs {
		if new(big.Rat).Add(zs[i], zs[len(zs)-1-i]).Sign() != 0 {
			return false
		}
	}
	return true
}
