package stability

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// ExactDigits is the digit count D given to a rule whose values include an
// exact fraction p/q (and whose decimals carry fewer digits): such a rule is
// tested as if every value were known to ExactDigits digits, far beyond any
// float64 or quadruple-precision rule, so that only a genuine failure of
// exactness shows.
const ExactDigits = 50

// MaxMatrixPoints bounds the rules whose Vandermonde conditioning Audit
// computes by default (an SVD of an N x N float64 matrix costs O(N^3)).
const MaxMatrixPoints = 600

// MaxHankelPoints bounds the rules whose Hankel conditioning Audit computes
// (O(N^3) operations at about 8N bits; beyond it the Hankel matrix of any
// measure has lost every digit of any practical precision anyway).
const MaxHankelPoints = 120

// Options says what Audit computes beyond the summary.
type Options struct {
	// Unit, when non-nil and positive, is the relative accuracy u of every
	// node and weight (--tolerance); otherwise u = 10^(1-D) with D the
	// rule's own digits.
	Unit *big.Rat
	// MaxDegree, when > 0, is the highest degree tested; otherwise 2N+1.
	// Either is lowered to what the measure's recurrence provides.
	MaxDegree int
	// SkipGenz and SkipConditioning leave those sections out.
	SkipGenz, SkipConditioning bool
}

// Report is the full audit of a rule against a measure.
type Report struct {
	Summary
	Measure  string   `json:"measure"`
	Weight   string   `json:"weight"`
	Interval []string `json:"interval"`
	// Domain is the interval as text, infinite ends open: "[0, inf)".
	Domain string `json:"domain"`
	// Digits is the D the tolerance came from (ExactDigits for exact
	// values); Unit is u and Tolerance 10u, as decimals.
	Digits    int    `json:"digits"`
	Exact     bool   `json:"exact_values"`
	UnitGiven bool   `json:"unit_given"` // u came from Options.Unit (--tolerance)
	Unit      string `json:"unit"`
	Tolerance string `json:"tolerance"`
	// DegreeTested is the highest degree tested; Degree == DegreeTested
	// means "at least that".
	DegreeTested int `json:"degree_tested_to"`
	// Residual[j] is the exactness residual at degree j as a share of the
	// tolerance: |Q(p_j) - I(p_j)| / (10u sum |w_i|(|p_j(x_i)| + |x_i p_j'(x_i)|)),
	// p_j the degree-j orthogonal polynomial; degree j passes when <= 1.
	Residual []Float `json:"residual_share"`
	// RelResidual[j] is the residual itself, the ratio above before the
	// division by 10u (design.Exactness.Ratio), for tables and plots.
	RelResidual []Float `json:"residual"`
	// Accuracy says what the residuals imply for the values (accuracy.go).
	Accuracy *Accuracy `json:"accuracy,omitempty"`
	// MostNegative is the most negative weight as printed, at the 1-based
	// MostNegativeIndex (0 and "" when no weight is negative); NegativeMass
	// is the sum of the negative weights, NegativeShare its absolute value
	// divided by sum |w_i|, and Mass the sum of all weights.
	MostNegative      string `json:"most_negative_weight,omitempty"`
	MostNegativeIndex int    `json:"most_negative_index,omitempty"`
	NegativeMass      Float  `json:"negative_mass"`
	NegativeShare     Float  `json:"negative_share"`
	Mass              Float  `json:"mass"`
	// MeasureMass is beta_0 of the measure, to float64.
	MeasureMass Float `json:"measure_mass"`

	Float64      *Float64Check `json:"float64,omitempty"`
	Conditioning *Conditioning `json:"conditioning,omitempty"`
	Genz         *GenzReport   `json:"genz,omitempty"`
	// Notes says what was left out and why.
	Notes []string `json:"notes,omitempty"`

	// Nodes and Weights are the audited values to float64, for plots.
	Nodes   []float64 `json:"-"`
	Weights []float64 `json:"-"`
}

// Float64Check is the exactness test repeated on the rule rounded to
// float64: each node and weight replaced by its nearest double, then tested
// through the same degrees with u + 2^-53 in place of u (the rule's own
// uncertainty plus that of the rounding; tol = 10 (u + 2^-53)).
type Float64Check struct {
	Degree   int     `json:"degree"`
	Residual []Float `json:"residual_share"`
}

// Audit reads the rule (nodes and weights as printed: exact decimals or
// fractions p/q) and reports on it against the measure m.
//
// The degree of exactness is design.CheckExactness of the exact values,
// rounded to prec = max(DigitsToBits(D)+64, 192) bits (so the 10u test is unaffected
// by the rounding), against m's recurrence at the same precision, for the
// degrees 0..2N+1 (or opt.MaxDegree), fewer when m.MaxLen() provides fewer
// pairs. Counts, factor and gap come from exact rational arithmetic; the
// conditioning and test-integrand sections are float64 diagnostics unless
// their doc says otherwise. Errors name the value or the measure at fault.
func Audit(ctx context.Context, m design.Measure, nodes, weights []string, opt Options) (*Report, error) {
	p, err := parseRule(nodes, weights)
	if err != nil {
		return nil, err
	}
	n := len(p.x)
	dom := m.Domain()
	r := &Report{Summary: p.summarize(dom), Measure: m.Label(), Weight: m.Weight(), Interval: dom.Strings(), Domain: dom.String()}
	noteAuditSupport(r, m, p)
	r.Digits, r.Exact = p.digits, p.exact
	if p.exact {
		r.Digits = max(r.Digits, ExactDigits)
	}
	u := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(r.Digits-1)), nil))
	if opt.Unit != nil && opt.Unit.Sign() > 0 {
		u = new(big.Rat).Set(opt.Unit)
		r.UnitGiven = true
		r.Digits = max(1, 1+int(math.Ceil(-log10Rat(u))))
	}
	r.Unit = precision.FormatSig(new(big.Float).SetPrec(64).SetRat(u), 3)
	tol := new(big.Rat).Mul(u, big.NewRat(10, 1))
	r.Tolerance = precision.FormatSig(new(big.Float).SetPrec(64).SetRat(tol), 3)
	r.weightDetails(p, weights)

	maxDeg := 2*n + 1
	if opt.MaxDegree > 0 {
		maxDeg = opt.MaxDegree
	}
	wanted := maxDeg
	if ml := m.MaxLen(); ml >= 0 && ml < maxDeg {
		if ml < 1 {
			return nil, fmt.Errorf("measure %s: its recurrence provides no coefficients, so no degree can be tested", m.Label())
		}
		maxDeg = ml
	}
	// 192 bits at least, so that the float64 repetition of the test has a
	// recurrence far more accurate than its own tolerance.
	prec := max(precision.DigitsToBits(r.Digits)+64, 192)
	rec, err := m.Recurrence(maxDeg, prec)
	if err != nil {
		return nil, err
	}
	mass, _ := rec.Beta[0].Float64()
	r.MeasureMass = Float(mass)
	ex, err := design.CheckExactness(ctx, rec, ratsToFloats(p.x, prec), ratsToFloats(p.w, prec), new(big.Float).SetPrec(prec).SetRat(tol), maxDeg, prec)
	if err != nil {
		return nil, err
	}
	r.Degree, r.DegreeTested, r.Residual = ex.Degree, ex.Tested, shares(ex)
	r.RelResidual = ratios(ex)
	if r.Float64, err = float64Check(ctx, p, rec, u, maxDeg); err != nil {
		return nil, err
	}
	if maxDeg < wanted {
		r.productTest(ctx, m, p, nodes, weights, opt, wanted)
	}
	r.capAtNodePolynomial(m, n)
	r.Accuracy = impliedAccuracy(r)
	r.Nodes, r.Weights = make([]float64, n), make([]float64, n)
	for i := range p.x {
		r.Nodes[i], _ = p.x[i].Float64()
		r.Weights[i], _ = p.w[i].Float64()
	}
	if !opt.SkipConditioning {
		r.Conditioning, err = conditioning(ctx, m, p, r)
		if err != nil {
			return nil, err
		}
	}
	if !opt.SkipGenz {
		if r.Genz, err = genzCompare(ctx, m, r.Nodes, r.Weights); err != nil {
			return nil, err
		}
		if r.Genz == nil {
			r.Notes = append(r.Notes, "test integrands left out: no Gauss rule of the measure could serve as the comparison")
		}
	}
	return r, nil
}

// productTest takes the degree further than the measure's recurrence
// allows, for a measure that verifies rules by its own criterion
// (design.Verifier: products of the orthogonal polynomials it fixes, up to
// degree 2K-1 from K pairs, with the contract's D and tol of the printed
// values). It is used only when u is the rule's own (no Options.Unit, no
// exact fractions), so that the two tests mean the same; the float64 degree
// is then the same test on the nearest doubles in shortest form.
func (r *Report) productTest(ctx context.Context, m design.Measure, p *parsedRule, nodes, weights []string, opt Options, wanted int) {
	ml := m.MaxLen()
	v, ok := m.(design.Verifier)
	to := min(wanted, 2*ml-1)
	if !ok || opt.Unit != nil || r.Exact || to <= r.DegreeTested {
		r.Notes = append(r.Notes, fmt.Sprintf("exactness tested to degree %d only: the measure provides %d recurrence pairs", ml, ml))
		return
	}
	ex, err := v.VerifyRule(ctx, nodes, weights, to)
	if err != nil {
		r.Notes = append(r.Notes, fmt.Sprintf("exactness tested to degree %d only: the measure provides %d recurrence pairs (%v)", ml, ml, err))
		return
	}
	r.Degree, r.DegreeTested, r.Residual = ex.Degree, to, shares(ex)
	r.RelResidual = ratios(ex)
	r.Notes = append(r.Notes, fmt.Sprintf("exactness tested through degree %d on products of the orthogonal polynomials that the measure's %d recurrence pairs fix", to, ml))
	x64, w64 := make([]string, len(nodes)), make([]string, len(nodes))
	for i := range nodes {
		x, _ := p.x[i].Float64()
		w, _ := p.w[i].Float64()
		if math.IsInf(x, 0) || math.IsInf(w, 0) {
			r.Float64 = &Float64Check{Degree: -1}
			return
		}
		x64[i], w64[i] = precision.FormatFloat64(x), precision.FormatFloat64(w)
	}
	if ex, err := v.VerifyRule(ctx, x64, w64, to); err == nil {
		r.Float64 = &Float64Check{Degree: ex.Degree, Residual: shares(ex)}
	}
}

// weightDetails fills the negative-weight fields from the exact values.
func (r *Report) weightDetails(p *parsedRule, printed []string) {
	sum, neg, abs := new(big.Rat), new(big.Rat), new(big.Rat)
	var most *big.Rat
	for i, w := range p.w {
		sum.Add(sum, w)
		abs.Add(abs, new(big.Rat).Abs(w))
		if w.Sign() < 0 {
			neg.Add(neg, w)
			if most == nil || w.Cmp(most) < 0 {
				most, r.MostNegative, r.MostNegativeIndex = w, printed[i], i+1
			}
		}
	}
	r.Mass, r.NegativeMass = ratFloat(sum), ratFloat(neg)
	if abs.Sign() > 0 {
		r.NegativeShare = ratFloat(new(big.Rat).Quo(new(big.Rat).Neg(neg), abs))
	}
}

// ratsToFloats rounds exact values to prec bits.
func ratsToFloats(v []*big.Rat, prec uint) []*big.Float {
	out := make([]*big.Float, len(v))
	for i, x := range v {
		out[i] = new(big.Float).SetPrec(prec).SetRat(x)
	}
	return out
}

// shares returns Ratio[j]/Tol as float64 (+Inf where the bound is zero
// but the residual is not).
func shares(ex design.Exactness) []Float {
	out := make([]Float, len(ex.Ratio))
	for j, q := range ex.Ratio {
		if q.IsInf() {
			out[j] = Float(math.Inf(1))
			continue
		}
		f, _ := new(big.Float).SetPrec(64).Quo(q, ex.Tol).Float64()
		out[j] = Float(f)
	}
	return out
}

// ratios returns ex.Ratio to float64 (+Inf where a ratio is infinite).
func ratios(ex design.Exactness) []Float {
	out := make([]Float, len(ex.Ratio))
	for j, q := range ex.Ratio {
		f, _ := q.Float64()
		out[j] = Float(f)
	}
	return out
}

// float64Check repeats the exactness test on the nearest doubles of the
// values, with u + 2^-53 for u. A value beyond float64's range gives
// degree -1.
func float64Check(ctx context.Context, p *parsedRule, rec *design.Recurrence, u *big.Rat, maxDeg int) (*Float64Check, error) {
	const prec = 53 + 128
	xs, ws := make([]*big.Float, len(p.x)), make([]*big.Float, len(p.x))
	for i := range p.x {
		x, _ := p.x[i].Float64()
		w, _ := p.w[i].Float64()
		if math.IsInf(x, 0) || math.IsInf(w, 0) {
			return &Float64Check{Degree: -1}, nil
		}
		xs[i] = new(big.Float).SetPrec(prec).SetFloat64(x)
		ws[i] = new(big.Float).SetPrec(prec).SetFloat64(w)
	}
	r64 := &design.Recurrence{Alpha: make([]*big.Float, rec.Len()), Beta: make([]*big.Float, rec.Len())}
	for k := range rec.Alpha {
		r64.Alpha[k] = new(big.Float).SetPrec(prec).Set(rec.Alpha[k])
		r64.Beta[k] = new(big.Float).SetPrec(prec).Set(rec.Beta[k])
	}
	tol := new(big.Float).SetPrec(prec).SetRat(u)
	tol.Add(tol, new(big.Float).SetMantExp(big.NewFloat(1), -53))
	tol.Mul(tol, big.NewFloat(10))
	ex, err := design.CheckExactness(ctx, r64, xs, ws, tol, maxDeg, prec)
	if err != nil {
		return nil, err
	}
	return &Float64Check{Degree: ex.Degree, Residual: shares(ex)}, nil
}

// unitWeight reports whether m is weight 1 on a finite interval, the case
// where the test integrands have closed-form integrals.
func unitWeight(m design.Measure) bool {
	if !m.Domain().Finite() {
		return false
	}
	if fs, ok := m.(design.FamilySource); ok && fs.Family.IsFinite() {
		a, b := fs.Family.JacobiExponents()
		return a.Sign() == 0 && b.Sign() == 0
	}
	return m.Weight() == "1"
}

// domainFloats returns the interval ends as float64 (±Inf for infinite ends).
func domainFloats(iv moments.Interval) (lo, hi float64) {
	end := func(e moments.Endpoint) float64 {
		if !e.Finite() {
			return math.Inf(e.Inf)
		}
		f, _ := e.Value.Float64()
		return f
	}
	return end(iv.Lo), end(iv.Hi)
}

// capAtNodePolynomial lowers a degree found above 2n-1 to 2n-1 when the
// measure has more than n support points (it provides more than n
// recurrence pairs): the square of the node polynomial, prod (x - x_i)^2
// of degree 2n, vanishes at every node while its integral is positive, so
// no n-point rule integrates every polynomial of degree 2n. The test degree
// by degree in the orthonormal basis misses this when the rule's error on
// p_2n is below the tolerance (for Gauss-Hermite rules it falls like
// 2^-n), because the failing polynomial is a combination whose terms
// cancel.
func (r *Report) capAtNodePolynomial(m design.RecurrenceSource, n int) {
	if ml := m.MaxLen(); ml >= 0 && ml <= n {
		return
	}
	if r.Degree >= 2*n {
		r.Notes = append(r.Notes, fmt.Sprintf("degree %d, not the %d that the test in the orthonormal basis passed: the square of the node polynomial (degree %d) vanishes at every node and has a positive integral, so no %d-point rule integrates it", 2*n-1, r.Degree, 2*n, n))
		r.Degree = 2*n - 1
	}
	if r.Float64 != nil && r.Float64.Degree >= 2*n {
		r.Float64.Degree = 2*n - 1
	}
}
