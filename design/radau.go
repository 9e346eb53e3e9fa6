package design

import (
	"context"
	"errors"
	"fmt"
	"math/big"

	"quadwright/moments"
)

// Radau builds the Points-node Gauss-Radau rule of m with one prescribed
// node z, verified to degree 2N-2. z nil means the left end of the
// support, or its only finite end. z must lie at or outside an end of the
// support: strictly inside, (x - z) w(x) changes sign and the rule is
// refused with a sentence that says so.
//
// The rule is the Gauss rule of the N x N Jacobi matrix of m whose last
// diagonal entry is replaced so that z becomes an eigenvalue (Golub, "Some
// modified matrix eigenvalue problems", SIAM Review 15, 1973):
//
//	alpha'_{N-1} = z - beta_{N-1} pi_{N-2}(z) / pi_{N-1}(z),
//
// formed at each stage's working precision, after which gaussStage gives
// the nodes and the weights (Christoffel numbers of the modified matrix,
// which are the Radau weights). Confirmation and verification are those
// of Gauss.
func Radau(ctx context.Context, m Measure, req Request, z *big.Rat) (*Rule, error) {
	// The count first, so that digits advised by checkRequest are never
	// followed by this refusal.
	if err := needPairs(m, max(req.Points, 2*req.Points-2), fmt.Sprintf("a %d-point Radau rule", req.Points)); err != nil {
		return nil, err
	}
	req, err := checkRequest(ctx, m, req, 0)
	if err != nil {
		return nil, err
	}
	n := req.Points
	iv := m.Domain()
	if z == nil {
		switch {
		case iv.Lo.Finite():
			z = iv.Lo.Value
		case iv.Hi.Finite():
			z = iv.Hi.Value
		default:
			return nil, fmt.Errorf("--fixed: the support %s has no finite end, so a Radau node must be given with --fixed", iv)
		}
	}
	sd := side(z, iv)
	if sd == 0 {
		return nil, fmt.Errorf("--fixed %s: a Radau node must lie at or outside an end of the support %s; strictly inside, (x - z) w(x) changes sign and no Radau rule of degree 2N-2 is guaranteed", moments.RatString(z), iv)
	}
	nominal := 2*n - 2
	src, err := sourceFor(m, max(n, nominal), max(n, nominal), firstPrec(req.Digits, n), fmt.Sprintf("a %d-point Radau rule", n))
	if err != nil {
		return nil, err
	}
	at := 0
	if sd > 0 {
		at = n - 1
	}
	s1, s2, texts, err := confirmStages(n, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(n, p)
		if err != nil {
			return nil, err
		}
		mod := copyPrefix(rec, n, p)
		zf := ratFloat(z, p)
		pk, pkm1 := monicPair(rec, n-1, zf, p)
		if pk.Sign() == 0 {
			return nil, fmt.Errorf("--fixed %s: the node is a zero of the measure's orthogonal polynomial of degree %d, so the Radau modification is undefined", moments.RatString(z), n-1)
		}
		t := new(big.Float).SetPrec(p).Mul(rec.Beta[n-1], pkm1)
		if n == 1 {
			t.SetInt64(0)
		}
		t.Quo(t, pk)
		mod.Alpha[n-1].Sub(zf, t)
		s, err := gaussStage(ctx, mod, n, p, startNodes(prev))
		if err != nil {
			return nil, variantStageError("Radau", err)
		}
		setFixed(s, at, z)
		return s, nil
	})
	if err != nil {
		return nil, err
	}
	r := newRule("radau", m, s1, s2, texts, req.Digits, "Golub's modified Jacobi matrix (Radau), Newton refinement on its recurrence")
	r.Fixed = printFixed(texts, []int{at}, []*big.Rat{z}, req.Digits)
	if err := verifyRule(ctx, src, r, nominal, nominal); err != nil {
		return nil, err
	}
	r.Stability = stabilityOf(r)
	return r, nil
}

// Lobatto builds the Points-node Gauss-Lobatto rule of m with the two
// prescribed nodes a < b, verified to degree 2N-3 (N >= 2). a and b nil
// mean the two ends of the support, which must then be finite; a must lie
// at or left of the left end and b at or right of the right end.
//
// The last diagonal entry and the last off-diagonal entry of the N x N
// Jacobi matrix are replaced so that a and b become eigenvalues (Golub,
// "Some modified matrix eigenvalue problems", SIAM Review 15, 1973): with
// r(x) = pi_{N-2}(x) / pi_{N-1}(x),
//
//	beta'_{N-1} = (b - a) / (r(b) - r(a)),  alpha'_{N-1} = a - beta'_{N-1} r(a),
//
// where r(a) < 0 < r(b), so beta' > 0 without cancellation. For a
// symmetric measure with a = -b, alpha' is exactly 0 (the rule is
// symmetric, its middle node exactly 0).
func Lobatto(ctx context.Context, m Measure, req Request, a, b *big.Rat) (*Rule, error) {
	if err := needPairs(m, max(req.Points, 2*req.Points-3), fmt.Sprintf("a %d-point Lobatto rule", req.Points)); err != nil {
		return nil, err // before checkRequest, as in Radau
	}
	req, err := checkRequest(ctx, m, req, 0)
	if err != nil {
		return nil, err
	}
	n := req.Points
	iv := m.Domain()
	if n < 2 {
		return nil, fmt.Errorf("--points %d: a Lobatto rule has its two prescribed nodes among its points, so it needs at least 2", n)
	}
	if (a == nil) != (b == nil) {
		panic("design: Lobatto with one prescribed node")
	}
	if a == nil {
		if !iv.Finite() {
			return nil, fmt.Errorf("--fixed: the support %s has an infinite end, so the two Lobatto nodes must be given with --fixed", iv)
		}
		a, b = iv.Lo.Value, iv.Hi.Value
	}
	if a.Cmp(b) > 0 {
		a, b = b, a
	}
	if side(a, iv) >= 0 || side(b, iv) <= 0 {
		return nil, fmt.Errorf("--fixed %s,%s: Lobatto nodes must lie one at or left of the left end and one at or right of the right end of the support %s; otherwise the modified weight (x - a)(x - b) w(x) changes sign (use --kind gauss --fixed for two nodes on one side)", moments.RatString(a), moments.RatString(b), iv)
	}
	nominal := 2*n - 3
	src, err := sourceFor(m, max(n, nominal), max(n, nominal), firstPrec(req.Digits, n), fmt.Sprintf("a %d-point Lobatto rule", n))
	if err != nil {
		return nil, err
	}
	sym := new(big.Rat).Add(a, b).Sign() == 0
	s1, s2, texts, err := confirmStages(n, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(n, p)
		if err != nil {
			return nil, err
		}
		mod := copyPrefix(rec, n, p)
		af, bf := ratFloat(a, p), ratFloat(b, p)
		pa, pam := monicPair(rec, n-1, af, p)
		pb, pbm := monicPair(rec, n-1, bf, p)
		ra := new(big.Float).SetPrec(p).Quo(pam, pa)
		rb := new(big.Float).SetPrec(p).Quo(pbm, pb)
		den := new(big.Float).SetPrec(p).Sub(rb, ra)
		if den.Sign() <= 0 {
			return nil, errors.New("the Lobatto modification gave a non-positive coefficient; the prescribed nodes do not admit a Lobatto rule for this measure")
		}
		beta := new(big.Float).SetPrec(p).Sub(bf, af)
		beta.Quo(beta, den)
		mod.Beta[n-1] = beta
		if sym && isSymmetric(rec, n) {
			mod.Alpha[n-1] = new(big.Float).SetPrec(p)
		} else {
			t := new(big.Float).SetPrec(p).Mul(beta, ra)
			mod.Alpha[n-1] = t.Sub(af, t)
		}
		s, err := gaussStage(ctx, mod, n, p, startNodes(prev))
		if err != nil {
			return nil, variantStageError("Lobatto", err)
		}
		setFixed(s, 0, a)
		setFixed(s, n-1, b)
		return s, nil
	})
	if err != nil {
		return nil, err
	}
	r := newRule("lobatto", m, s1, s2, texts, req.Digits, "Golub's modified Jacobi matrix (Lobatto), Newton refinement on its recurrence")
	r.Fixed = printFixed(texts, []int{0, n - 1}, []*big.Rat{a, b}, req.Digits)
	if err := verifyRule(ctx, src, r, nominal, nominal); err != nil {
		return nil, err
	}
	r.Stability = stabilityOf(r)
	return r, nil
}

// variantStageError rewords a failure of gaussStage on a modified matrix.
func variantStageError(kind string, err error) error {
	if errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
		return err
	}
	return fmt.Errorf("the %s nodes could not be separated at the working precision: %v", kind, err)
}
