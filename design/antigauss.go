package design

import (
	"context"
	"fmt"
)

// AntiGauss builds the (N+1)-node anti-Gauss rule A paired with the N-point
// Gauss rule G of m (N = req.Points), verified: A is exact through degree
// 2N-1 and I(p) - A(p) = -(I(p) - G(p)) for every polynomial p of degree
// <= 2N+1. The second property is verified on the printed values of both
// rules as the exactness through 2N+1 of the averaged rule (G + A)/2. The
// Gauss rule travels with it as Rule.Paired, and Notes says how the pair
// estimates an error.
//
// A is the Gauss rule of the Jacobi matrix of order N+1 whose last
// coefficient beta_N is doubled (Laurie, "Anti-Gaussian quadrature
// formulas", Math. Comp. 65, 1996); its nodes interlace with G's and its
// weights are positive, but its end nodes can fall outside the support,
// where the integrand may not be defined: such a rule is refused.
func AntiGauss(ctx context.Context, m Measure, req Request) (*Rule, error) {
	if err := needPairs(m, 2*req.Points+1, fmt.Sprintf("the anti-Gauss rule paired with the %d-point Gauss rule", req.Points)); err != nil {
		return nil, err // before checkRequest, as in Radau
	}
	req, err := checkRequest(ctx, m, req, req.Points+1)
	if err != nil {
		return nil, err
	}
	n := req.Points
	np := n + 1
	src, err := sourceFor(m, 2*n+1, 2*n+1, firstPrec(req.Digits, np), fmt.Sprintf("the anti-Gauss rule paired with the %d-point Gauss rule", n))
	if err != nil {
		return nil, err
	}
	s1, s2, texts, err := confirmStages(np, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(np, p)
		if err != nil {
			return nil, err
		}
		mod := copyPrefix(rec, np, p)
		mod.Beta[n].SetMantExp(mod.Beta[n], 1)
		s, err := gaussStage(ctx, mod, np, p, startNodes(prev))
		if err != nil {
			return nil, variantStageError("anti-Gauss", err)
		}
		return s, nil
	})
	if err != nil {
		return nil, err
	}
	if x := firstOutside(s2.nodes, m.Domain()); x != nil {
		return nil, fmt.Errorf("the anti-Gauss rule paired with the %d-point Gauss rule has a node at %s, outside the support %s, where the weight is not defined; it is not printed", n, x.Text('g', 10), m.Domain())
	}
	r := newRule("anti-gauss", m, s1, s2, texts, req.Digits, "Laurie's anti-Gauss Jacobi matrix (beta_N doubled), Newton refinement on its recurrence")
	if err := verifyRule(ctx, src, r, 2*n-1, 2*n-1); err != nil {
		return nil, err
	}
	g, err := Gauss(ctx, m, Request{Points: n, Digits: req.Digits})
	if err != nil {
		return nil, err
	}
	r.Paired = g
	ex, err := verifyAveraged(ctx, src, g, r, 2*n+1)
	if err != nil {
		return nil, err
	}
	if ex.Degree < 2*n+1 {
		return nil, fmt.Errorf("the anti-Gauss rule printed to %s satisfies I - A = -(I - G) only through degree %d, not %d; it is not printed", digitsLabel(req.Digits), ex.Degree, 2*n+1)
	}
	r.Stability = stabilityOf(r)
	r.Notes = append(r.Notes, fmt.Sprintf("paired with the %d-point Gauss rule G: I(p) - A(p) = -(I(p) - G(p)) for every polynomial of degree <= %d (verified), so for a smooth f, (A(f) - G(f))/2 estimates the error I(f) - G(f) and (G(f) + A(f))/2 is a rule of degree %d", n, 2*n+1, 2*n+1))
	return r, nil
}

// verifyAveraged tests the rule (a + b)/2 built from the printed values of
// a and b for exactness through maxDeg, with VerifyPrinted's criterion
// (u one unit in the largest number of significant digits among the
// printed values, tol = 10 u). It tests the union of the two rules with
// their weights as printed against the measure of twice the mass, which is
// the same test without halving (and so lengthening) any printed weight.
// For a Gauss and an anti-Gauss rule this is the test of I - A = -(I - G).
func verifyAveraged(ctx context.Context, src RecurrenceSource, a, b *Rule, maxDeg int) (Exactness, error) {
	nodes := append(append([]string(nil), a.Nodes...), b.Nodes...)
	weights := append(append([]string(nil), a.Weights...), b.Weights...)
	return VerifyPrinted(ctx, doubledMass{src}, nodes, weights, maxDeg)
}

// doubledMass is the recurrence source of twice the measure of src: the
// same coefficients with beta_0 doubled.
type doubledMass struct{ src RecurrenceSource }

func (d doubledMass) MaxLen() int { return d.src.MaxLen() }

func (d doubledMass) Recurrence(n int, prec uint) (*Recurrence, error) {
	rec, err := d.src.Recurrence(n, prec)
	if err != nil {
		return nil, err
	}
	out := copyPrefix(rec, n, prec)
	out.Beta[0].SetMantExp(out.Beta[0], 1)
	return out, nil
}
