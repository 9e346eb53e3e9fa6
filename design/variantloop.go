package design

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/precision"
)

// stageFunc computes a rule once with every operation at prec bits. prev is
// the previous computation (its nodes make good starting values), or nil
// on the first call. The nodes it returns are ascending.
type stageFunc func(prec uint, prev *stage) (*stage, error)

// checkRequest validates the points and digits of req (Points is the size
// the user asked for, which for kronrod and anti-gauss is the Gauss size)
// and applies Request.Auto and the input's digit limit for a rule of size
// nodes (0: req.Points).
func checkRequest(ctx context.Context, m RecurrenceSource, req Request, size int) (Request, error) {
	n := req.Points
	if n < 1 || n > MaxPoints {
		return req, fmt.Errorf("--points %d: the number of points must be between 1 and %d", n, MaxPoints)
	}
	if req.Digits < 0 || req.Digits > precision.MaxDigits {
		return req, fmt.Errorf("--digits %d: the digits must be between 1 and %d", req.Digits, precision.MaxDigits)
	}
	sized := req
	if size > 0 {
		sized.Points = size
	}
	digits, err := resolveDigits(ctx, m, sized)
	if err != nil {
		return req, err
	}
	req.Digits, req.Auto = digits, false
	return req, nil
}

// firstPrec is the working precision of the first stage of a rule with
// points nodes printed to digits digits (0: float64 mode, 17 digits).
func firstPrec(digits, points int) uint {
	if digits == 0 {
		digits = 17
	}
	return precision.WorkingPrec(digits, points)
}

// confirmStages is the confirm loop every kind of rule shares. It runs
// compute at the working precision p = firstPrec(digits, points) and again
// at confirmPrec(p) from the first result; when agree finds the printed
// digits (or, in float64 mode, the nearest doubles) of the two equal with
// margin, it returns both stages and the printed strings of the second.
// Otherwise p is raised and both stages rerun, at most maxAttempts times;
// then it fails with a sentence that gives the precision reached.
func confirmStages(points, digits int, compute stageFunc) (s1, s2 *stage, texts [2][]string, err error) {
	p := firstPrec(digits, points)
	var prev *stage
	for attempt := 0; ; attempt++ {
		if attempt == maxAttempts {
			return nil, nil, texts, fmt.Errorf("the %d-point rule could not be confirmed to %s: two computations still disagreed at %d bits", points, digitsLabel(digits), p)
		}
		if s1, err = compute(p, prev); err != nil {
			return nil, nil, texts, err
		}
		p2 := confirmPrec(p)
		if s2, err = compute(p2, s1); err != nil {
			return nil, nil, texts, err
		}
		var ok bool
		if texts, ok = agree(s1, s2, digits); ok {
			return s1, s2, texts, nil
		}
		prev = s2
		p = precision.RaisePrec(p2)
	}
}

// newRule assembles the Rule of two confirmed stages; Degree and Exactness
// are set by verifyRule.
func newRule(kind string, m Measure, s1, s2 *stage, texts [2][]string, digits int, method string) *Rule {
	return &Rule{
		Kind: kind, Measure: m.Label(), Weight: m.Weight(), Domain: m.Domain(), SupportUnknown: !supportGiven(m),
		Nodes: texts[0], Weights: texts[1], NodeValues: s2.nodes, WeightValues: s2.weights,
		Digits: digits, WorkingPrec: s2.prec, CheckPrec: s1.prec,
		Method: method, Fallback: s1.fallback || s2.fallback,
	}
}

// verifyRule tests r's printed values with VerifyPrinted through degree
// testTo (lowered to what src can provide, never below nominal) and sets
// r.Exactness and r.Degree to the degree verified. A verified degree below
// nominal is an error: the rule is not printed.
func verifyRule(ctx context.Context, src RecurrenceSource, r *Rule, nominal, testTo int) error {
	if max := src.MaxLen(); max >= 0 && max < testTo {
		testTo = max
	}
	testTo = max(testTo, nominal, 1)
	phase(ctx, "verifying through degree %d", testTo)
	var ex Exactness
	var err error
	if c, ok := src.(*cachedSource); ok && isVerifier(c.src) {
		ex, err = c.src.(Verifier).VerifyRule(ctx, r.Nodes, r.Weights, testTo)
	} else {
		ex, err = VerifyPrinted(ctx, src, r.Nodes, r.Weights, testTo)
	}
	if err != nil {
		return err
	}
	r.Exactness, r.Degree = ex, ex.Degree
	if ex.Degree < nominal {
		name := r.Kind + " "
		if r.Kind == "gauss" {
			name = ""
		}
		return fmt.Errorf("the %d-point %srule printed to %s integrates only through degree %d, not %d; it is not printed", r.Points(), name, digitsLabel(r.Digits), ex.Degree, nominal)
	}
	return nil
}

// needPairs fails when src cannot provide pairs recurrence coefficients;
// what names the rule, as in "a 7-point Radau rule".
func needPairs(src RecurrenceSource, pairs int, what string) error {
	if max := src.MaxLen(); max >= 0 && max < pairs {
		return fmt.Errorf("the measure provides %d recurrence coefficients; %s and its check need %d", max, what, pairs)
	}
	return nil
}

// sourceFor checks with needPairs that m provides need coefficient pairs
// (what names the rule) and returns m behind a cache that already holds
// max(need, hold) pairs at confirmPrec(prec), the precision of the first
// confirming stage, so that one fetch serves both stages and the check.
func sourceFor(m RecurrenceSource, need, hold int, prec uint, what string) (*cachedSource, error) {
	if err := needPairs(m, need, what); err != nil {
		return nil, err
	}
	src := &cachedSource{src: m}
	// hold is what the rule's own check would like beyond need; a finite
	// moment list may provide no more than need, and the check then tests
	// what there is.
	h := max(need, hold)
	if mx := m.MaxLen(); mx >= 0 && h > mx {
		h = mx
	}
	if err := src.reserve(h, confirmPrec(prec)); err != nil {
		return nil, err
	}
	return src, nil
}

// startNodes returns prev's nodes, or nil when there is no previous stage.
func startNodes(prev *stage) []*big.Float {
	if prev == nil {
		return nil
	}
	return prev.nodes
}

// stabilityOf computes r's Stability from its values at working precision.
func stabilityOf(r *Rule) *Stability {
	st := &Stability{Factor: 1}
	prec := r.WorkingPrec + 64
	sum := new(big.Float).SetPrec(prec)
	abs := new(big.Float).SetPrec(prec)
	for i, w := range r.WeightValues {
		if w.Sign() < 0 {
			st.NegativeWeights++
		}
		sum.Add(sum, w)
		abs.Add(abs, new(big.Float).Abs(w))
		if outside(r.NodeValues[i], r.Domain) {
			st.NodesOutside++
		}
	}
	if st.NegativeWeights > 0 {
		if sum.Sign() == 0 {
			st.Factor = math.Inf(1)
		} else {
			st.Factor, _ = new(big.Float).Quo(abs, sum.Abs(sum)).Float64()
		}
	}
	return st
}

// stabilityNotes adds to r.Notes a sentence on negative weights and nodes
// outside the support, when there are any.
func stabilityNotes(r *Rule) {
	st := r.Stability
	if st == nil {
		return
	}
	if st.NegativeWeights > 0 {
		r.Notes = append(r.Notes, fmt.Sprintf("negative weights: %d of %d; sum |w| / |sum w| = %.4g, so the weighted sum can lose %.1f decimal digits of the integrand values", st.NegativeWeights, r.Points(), st.Factor, math.Log10(st.Factor)))
	}
	if st.NodesOutside > 0 {
		r.Notes = append(r.Notes, fmt.Sprintf("nodes outside the support %[3]s: %[1]d of %[2]d", st.NodesOutside, r.Points(), r.Domain))
	}
}
