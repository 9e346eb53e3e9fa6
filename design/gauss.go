package design

import (
	"context"
	"fmt"
	"math/big"

	"quadwright/precision"
)

// MaxPoints is the largest rule the extended-precision engine builds. Its
// cost grows as N^2 (about a third of a second of CPU at N = 1000 and 34
// digits for a symmetric measure, three times that otherwise); beyond this
// size a fast float64 method is the right tool.
const MaxPoints = 20000

// Request says which rule to build.
type Request struct {
	Points int  // number of nodes, >= 1
	Digits int  // significant decimal digits, 1..precision.MaxDigits; 0 selects float64 mode
	Auto   bool // as many digits as the input supports (Digits is then ignored)
}

// AutoDigits is what Request.Auto gives for a measure known exactly (a
// family with exact parameters, or an ExactInput whose values are all
// exact): quadruple precision's 34 digits.
const AutoDigits = 34

// DigitLimiter is implemented by sources whose input carries finitely many
// digits (a moment list read from a file, measured samples).
type DigitLimiter interface {
	// SupportedDigits returns how many significant digits of an n-point
	// rule the input can vouch for, after the loss in the map from the
	// input to the rule.
	SupportedDigits(ctx context.Context, n int) (int, error)
}

// resolveDigits applies Request.Auto and the input's limit: it returns the
// digits to print (0: float64 mode), or an error that gives both numbers.
func resolveDigits(ctx context.Context, src RecurrenceSource, req Request) (int, error) {
	lim, ok := src.(DigitLimiter)
	if !ok || (req.Auto && exactlyKnown(src)) {
		if req.Auto {
			return AutoDigits, nil
		}
		return req.Digits, nil
	}
	sup, err := lim.SupportedDigits(ctx, req.Points)
	if err != nil {
		return 0, err
	}
	sup = min(sup, precision.MaxDigits)
	switch {
	case req.Auto && sup < 1:
		return 0, fmt.Errorf("the input supports no correct digit of a %d-point rule", req.Points)
	case req.Auto:
		return sup, nil
	case req.Digits == 0 && sup < 1:
		return 0, fmt.Errorf("float64 mode needs 17 correct digits to fix the nearest double, but the input supports none for a %d-point rule", req.Points)
	case req.Digits == 0 && sup < 17:
		return 0, fmt.Errorf("float64 mode needs 17 correct digits to fix the nearest double, but the input supports only %d for a %d-point rule; ask for --digits %d or fewer", sup, req.Points, max(sup, 1))
	case req.Digits > sup:
		return 0, fmt.Errorf("--digits %d: the input supports only %d correct digits for a %d-point rule", req.Digits, sup, req.Points)
	}
	return req.Digits, nil
}

// maxAttempts bounds how often the working precision is raised when two
// computations disagree in a printed digit.
const maxAttempts = 6

// Gauss builds the Points-node Gauss rule of m, verified.
//
// The rule is computed twice, at a working precision p chosen from the
// digits asked and at a higher precision p2 starting from the first result;
// the printed digits (or, in float64 mode, the nearest doubles) must agree
// between the two, else p is raised and both are recomputed. The printed
// values are then read back exactly and tested for exactness through degree
// 2N-1 against m's own orthogonal polynomials (CheckExactness with tol =
// 10 u, u one unit in the D-th printed digit); a rule that fails any of this
// is an error, never a result.
func Gauss(ctx context.Context, m Measure, req Request) (*Rule, error) {
	req, err := checkRequest(ctx, m, req, 0)
	if err != nil {
		return nil, err
	}
	n := req.Points
	need := 2 * n
	if _, ok := m.(Verifier); ok {
		need = n // it verifies from n pairs (see Verifier)
	}
	if max := m.MaxLen(); max >= 0 && max < need {
		return nil, fmt.Errorf("the measure provides %d recurrence coefficients; an %d-point Gauss rule and its check need %d", max, n, need)
	}
	src := &cachedSource{src: m}
	phase(ctx, "recurrence: %s", recurrenceMethod(m))
	if err := src.reserve(need, confirmPrec(firstPrec(req.Digits, n))); err != nil {
		return nil, err
	}
	s1, s2, texts, err := confirmStages(n, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(n, p)
		if err != nil {
			return nil, err
		}
		start := startNodes(prev)
		if prev == nil {
			if st, ok := mfStart(m, rec, n, req.Digits); ok {
				start = st // family_mf.go: asymptotic start, refined in double-double
			}
		}
		return gaussStage(ctx, rec, n, p, start)
	})
	if err != nil {
		return nil, err
	}
	r := newRule("gauss", m, s1, s2, texts, req.Digits, "Golub-Welsch start (float64), Newton refinement on the three-term recurrence")
	if err := verifyRule(ctx, src, r, 2*n-1, 2*n-1); err != nil {
		return nil, err
	}
	return r, nil
}

// confirmPrec is the precision of the second, confirming stage: 64 bits
// more than the first, so that their agreement to the printed digits
// leaves the printed digits resting on the more accurate one.
func confirmPrec(p uint) uint { return p + 64 }

func digitsLabel(d int) string {
	if d == 0 {
		return "float64"
	}
	return fmt.Sprintf("%d digits", d)
}

// VerifyPrinted reads printed nodes and weights as exact decimals and tests
// them with CheckExactness through degree maxDeg, with u one unit in the
// largest number of significant digits among them (so exact short values
// such as 1 or 0.5 do not lower it) and tol = 10 u.
func VerifyPrinted(ctx context.Context, m RecurrenceSource, nodes, weights []string, maxDeg int) (Exactness, error) {
	pv, err := readPrinted(nodes, weights)
	if err != nil {
		return Exactness{}, err
	}
	rec, err := m.Recurrence(maxDeg, pv.prec)
	if err != nil {
		return Exactness{}, err
	}
	return CheckExactness(ctx, rec, pv.nodes, pv.weights, pv.tol, maxDeg, pv.prec)
}

// printedRule is a printed rule read back exactly for an exactness test.
type printedRule struct {
	digits         int          // D, the largest number of significant digits among the values
	prec           uint         // DigitsToBits(D) + 64, the precision of the test's sums
	nodes, weights []*big.Float // the values at prec bits
	tol            *big.Float   // 10 u, u = 10^(1-D)
}

// readPrinted reads printed nodes and weights as exact decimals, the
// common start of VerifyPrinted and the Verifier implementations.
func readPrinted(nodes, weights []string) (printedRule, error) {
	D := 1
	vals := make([]*big.Rat, 0, len(nodes)+len(weights))
	for _, s := range append(append([]string(nil), nodes...), weights...) {
		num, err := precision.ParseNumber(s)
		if err != nil {
			return printedRule{}, err
		}
		D = max(D, num.Digits)
		vals = append(vals, num.Value)
	}
	prec := precision.DigitsToBits(D) + 64
	pv := printedRule{digits: D, prec: prec, nodes: make([]*big.Float, len(nodes)), weights: make([]*big.Float, len(nodes))}
	for i := range nodes {
		pv.nodes[i] = new(big.Float).SetPrec(prec).SetRat(vals[i])
		pv.weights[i] = new(big.Float).SetPrec(prec).SetRat(vals[len(nodes)+i])
	}
	pv.tol = new(big.Float).SetPrec(prec).SetRat(new(big.Rat).SetFrac(big.NewInt(10), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D-1)), nil)))
	return pv, nil
}
