package design

import (
	"context"
	"fmt"
	"math/big"
)

// Kronrod builds the (2N+1)-node Gauss-Kronrod extension of the N-point
// Gauss rule of m (N = req.Points), verified: degree 3N+1 at least (for a
// symmetric measure and odd N the rule is symmetric and 3N+2 is reached;
// the degree reported is the one verified, testing through 3N+2). The
// Gauss rule travels with it as Rule.Paired.
//
// Method (Laurie, "Calculation of Gauss-Kronrod quadrature rules", Math.
// Comp. 66, 1997): the extension is the Gauss rule of a Jacobi matrix K of
// order 2N+1 whose first 3N/2+1 or so coefficients are m's own and whose
// trailing N x N block J' has the same eigenvalues as the leading one, the
// N Gauss nodes x_i. J' is therefore the Jacobi matrix of a discrete
// measure sum_i c_i delta(x - x_i), whose first N moments are fixed by
// the known top entries of J'. Here the masses c_i are found without a
// linear solve, in the orthonormal basis p_j of m on which the Gauss rule
// (x_i, w_i) is orthogonal:
//
//	c_i = w_i sum_{j<N} L(p_j) p_j(x_i),   L(p_j) = e_0^T p_j(J'_top) e_0,
//
// with J'_top the ceil(N/2) x ceil(N/2) known part of J' (its Gauss rule
// reproduces those N moments). A real extension with positive weights
// exists exactly when every c_i > 0 (Laurie 1997, the real Kronrod matrix
// criterion); then J' follows from (x_i, c_i) by the Lanczos process, K is
// assembled, and gaussStage gives the 2N+1 nodes and weights at each
// stage's precision. Otherwise, or when a node falls outside the support,
// the extension is refused with the reason.
func Kronrod(ctx context.Context, m Measure, req Request) (*Rule, error) {
	// The count first, so that digits advised by checkRequest are never
	// followed by a refusal for too few moments (as in Radau).
	if err := needPairs(m, max((3*req.Points+1)/2+1, 3*req.Points+1), fmt.Sprintf("the Kronrod extension of the %d-point Gauss rule", req.Points)); err != nil {
		return nil, err
	}
	req, err := checkRequest(ctx, m, req, 2*req.Points+1)
	if err != nil {
		return nil, err
	}
	n := req.Points
	np := 2*n + 1
	L := (3*n+1)/2 + 1 // pairs 0..ceil(3N/2)
	nominal := 3*n + 1
	src, err := sourceFor(m, max(L, nominal), max(L, nominal+1), firstPrec(req.Digits, np), fmt.Sprintf("the Kronrod extension of the %d-point Gauss rule", n))
	if err != nil {
		return nil, err
	}
	var inner []*big.Float // the last Gauss nodes: starting values
	s1, s2, texts, err := confirmStages(np, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(L, p)
		if err != nil {
			return nil, err
		}
		gs, err := gaussStage(ctx, rec, n, p, inner)
		if err != nil {
			return nil, err
		}
		inner = gs.nodes
		K, err := kronrodMatrix(ctx, rec, gs, n, p)
		if err != nil {
			return nil, fmt.Errorf("the Kronrod extension of the %d-point Gauss rule of %s %v", n, m.Label(), err)
		}
		s, err := gaussStage(ctx, K, np, p, startNodes(prev))
		if err != nil {
			return nil, variantStageError("Kronrod", err)
		}
		return s, nil
	})
	if err != nil {
		return nil, err
	}
	if x := firstOutside(s2.nodes, m.Domain()); x != nil {
		return nil, fmt.Errorf("the Kronrod extension of the %d-point Gauss rule of %s has a node at %s, outside the support %s; it is not printed", n, m.Label(), x.Text('g', 10), m.Domain())
	}
	r := newRule("kronrod", m, s1, s2, texts, req.Digits, "Laurie's Jacobi-Kronrod matrix (trailing block by Lanczos from the Gauss nodes), Newton refinement on its recurrence")
	if err := verifyRule(ctx, src, r, nominal, nominal+1); err != nil {
		return nil, err
	}
	g, err := Gauss(ctx, m, Request{Points: n, Digits: req.Digits})
	if err != nil {
		return nil, err
	}
	r.Paired = g
	r.Stability = stabilityOf(r)
	r.Notes = append(r.Notes, fmt.Sprintf("extends the %d-point Gauss rule G (every other node, from the second); |K(f) - G(f)| is the usual estimate of the error of G(f), and a pessimistic one for K(f)", n))
	return r, nil
}

// kronrodMatrix returns the 2n+1 recurrence pairs of Laurie's Kronrod
// matrix at prec bits from rec (at least ceil(3n/2)+1 pairs) and the
// n-point Gauss rule gs of rec, or an error (a phrase that continues "the
// Kronrod extension ... ") when no real extension with positive weights
// exists. See Kronrod for the method.
func kronrodMatrix(ctx context.Context, rec *Recurrence, gs *stage, n int, prec uint) (*Recurrence, error) {
	mt := (n + 1) / 2
	sq := func(x *big.Float) *big.Float { return new(big.Float).SetPrec(prec).Sqrt(x) }
	// Known top block of J': alpha_{n+1+k}, beta_{n+1+k} (k >= 1).
	ta := make([]*big.Float, mt)
	tb := make([]*big.Float, mt) // tb[k] = sqrt(beta'_k), k >= 1
	for k := 0; k < mt; k++ {
		ta[k] = rec.Alpha[n+1+k]
		if k > 0 {
			tb[k] = sq(rec.Beta[n+1+k])
		}
	}
	// v_j = p_j(J'_top) e_0 by the orthonormal recurrence of m.
	sb := make([]*big.Float, n+1)
	for j := 0; j <= n; j++ {
		sb[j] = sq(rec.Beta[j])
	}
	vPrev := make([]*big.Float, mt)
	v := make([]*big.Float, mt)
	for i := range v {
		vPrev[i] = new(big.Float).SetPrec(prec)
		v[i] = new(big.Float).SetPrec(prec)
	}
	v[0].Quo(new(big.Float).SetPrec(prec).SetInt64(1), sb[0])
	ell := make([]*big.Float, n) // L(p_j)
	t := new(big.Float).SetPrec(prec)
	for j := 0; j < n; j++ {
		ell[j] = new(big.Float).SetPrec(prec).Set(v[0])
		if j+1 == n {
			break
		}
		next := make([]*big.Float, mt)
		for i := 0; i < mt; i++ {
			s := new(big.Float).SetPrec(prec).Sub(ta[i], rec.Alpha[j])
			s.Mul(s, v[i])
			if i > 0 {
				s.Add(s, t.Mul(tb[i], v[i-1]))
			}
			if i+1 < mt {
				s.Add(s, t.Mul(tb[i+1], v[i+1]))
			}
			if j > 0 {
				s.Sub(s, t.Mul(sb[j], vPrev[i]))
			}
			next[i] = s.Quo(s, sb[j+1])
		}
		vPrev, v = v, next
	}
	// Masses c_i of the trailing block's spectral measure.
	c := make([]*big.Float, n)
	for i, x := range gs.nodes {
		pv := orthonormalValues(rec, n, x, prec)
		s := new(big.Float).SetPrec(prec)
		for j := 0; j < n; j++ {
			s.Add(s, t.Mul(ell[j], pv[j]))
		}
		c[i] = s.Mul(s, gs.weights[i])
		if c[i].Sign() <= 0 {
			return nil, fmt.Errorf("does not exist with real nodes and positive weights: the trailing block of Laurie's Kronrod matrix would need a mass of sign %d at the Gauss node %s, so that matrix is not real", c[i].Sign(), x.Text('g', 8))
		}
	}
	tail, err := Lanczos(ctx, gs.nodes, c, n, prec)
	if err != nil {
		return nil, fmt.Errorf("could not be formed: %v", err)
	}
	K := &Recurrence{Alpha: make([]*big.Float, 2*n+1), Beta: make([]*big.Float, 2*n+1)}
	for k := 0; k <= n; k++ {
		K.Alpha[k] = rec.Alpha[k]
	}
	for k := 0; k <= n+1; k++ {
		K.Beta[k] = rec.Beta[k]
	}
	sym := isSymmetric(rec, rec.Len())
	for k := 0; k < n; k++ {
		K.Alpha[n+1+k] = new(big.Float).SetPrec(prec).Set(tail.Alpha[k])
		if sym {
			K.Alpha[n+1+k].SetInt64(0)
		}
		if k > 0 {
			K.Beta[n+1+k] = new(big.Float).SetPrec(prec).Set(tail.Beta[k])
		}
	}
	return K, nil
}
