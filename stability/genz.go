package stability

import (
	"context"
	"math"
	"math/big"
	"strconv"
	"sync"

	"quadwright/design"
)

// Genz is one of the six one-dimensional test integrands of A. Genz,
// "Testing multidimensional integration routines", in Tools, Methods and
// Languages for Scientific and Engineering Computation (B. Ford, J. C.
// Rault, F. Thomasset, eds.), North-Holland, 1984, pp. 81-94, on t in
// [0, 1], with difficulty C > 0 and shift W in [0, 1].
type Genz struct {
	Name string
	C, W float64
}

// GenzSet is the six families with the parameters the audit uses, chosen by
// us: a difficulty of 4, which the rules of 3 to 20 points that element codes
// use resolve to visibly different accuracies, and the shift 0.371, which
// falls on no node of the common closed rules.
var GenzSet = []Genz{
	{"oscillatory", 4, 0.371},
	{"product peak", 4, 0.371},
	{"corner peak", 4, 0.371},
	{"gaussian", 4, 0.371},
	{"continuous", 4, 0.371},
	{"discontinuous", 4, 0.371},
}

// Eval returns the integrand at t in float64:
//
//	oscillatory    cos(2 pi W + C t)
//	product peak   1 / (C^-2 + (t - W)^2)
//	corner peak    (1 + C |t|)^-2   (Genz's (1 + C t)^-(d+1) for d = 1; |t| keeps it finite for t < 0)
//	gaussian       exp(-C^2 (t - W)^2)
//	continuous     exp(-C |t - W|)
//	discontinuous  exp(C t) for t <= W, else 0
func (g Genz) Eval(t float64) float64 {
	c, w := g.C, g.W
	switch g.Name {
	case "oscillatory":
		return math.Cos(2*math.Pi*w + c*t)
	case "product peak":
		return 1 / (1/(c*c) + (t-w)*(t-w))
	case "corner peak":
		s := 1 + c*math.Abs(t)
		return 1 / (s * s)
	case "gaussian":
		return math.Exp(-c * c * (t - w) * (t - w))
	case "continuous":
		return math.Exp(-c * math.Abs(t-w))
	case "discontinuous":
		if t > w {
			return 0
		}
		return math.Exp(c * t)
	}
	panic("stability: unknown Genz family " + g.Name)
}

// Integral returns the integral of Eval over [0, 1] from its closed form,
// in float64 (a few ulp):
//
//	oscillatory    (sin(2 pi W + C) - sin(2 pi W)) / C
//	product peak   C (atan(C (1 - W)) + atan(C W))
//	corner peak    1 / (1 + C)
//	gaussian       sqrt(pi) / (2 C) (erf(C (1 - W)) + erf(C W))
//	continuous     (2 - exp(-C W) - exp(-C (1 - W))) / C
//	discontinuous  (exp(C W) - 1) / C
func (g Genz) Integral() float64 {
	c, w := g.C, g.W
	switch g.Name {
	case "oscillatory":
		return (math.Sin(2*math.Pi*w+c) - math.Sin(2*math.Pi*w)) / c
	case "product peak":
		return c * (math.Atan(c*(1-w)) + math.Atan(c*w))
	case "corner peak":
		return 1 / (1 + c)
	case "gaussian":
		return math.Sqrt(math.Pi) / (2 * c) * (math.Erf(c*(1-w)) + math.Erf(c*w))
	case "continuous":
		return (2 - math.Exp(-c*w) - math.Exp(-c*(1-w))) / c
	case "discontinuous":
		return math.Expm1(c*w) / c
	}
	panic("stability: unknown Genz family " + g.Name)
}

// GenzReport compares the audited rule with the Gauss rule of the same size
// on the test integrands f(t(x)), t the map of the measure's interval onto
// [0, 1] (t = (x-a)/(b-a); t = x - a on [a, inf); t = x on the whole line).
type GenzReport struct {
	// Reference says where the exact values come from: the closed forms
	// (weight 1 on a finite interval, scaled by b-a), or else the measure's
	// own float64 Gauss rule with ReferencePoints nodes, whose error is
	// estimated by the one with half as many (ReferenceError per case).
	Reference       string     `json:"reference"`
	ReferencePoints int        `json:"reference_points,omitempty"`
	Map             string     `json:"map"`
	GaussPoints     int        `json:"gauss_points"`
	Cases           []GenzCase `json:"cases"`
	gaussRule       *design.Rule
}

// GenzCase is one integrand. Errors are relative, |Q - I| / |I|, in float64:
// values below about 1e-15 are at the floor of float64 evaluation.
type GenzCase struct {
	Name           string  `json:"name"`
	C              float64 `json:"c"`
	W              float64 `json:"w"`
	Integral       Float   `json:"integral"`
	ReferenceError Float   `json:"reference_error,omitempty"`
	Rule           Float   `json:"rule"`
	RuleError      Float   `json:"rule_error"`
	Gauss          Float   `json:"gauss"`
	GaussError     Float   `json:"gauss_error"`
}

// ReferencePoints is the size of the Gauss rule used as the reference for a
// classical family other than weight 1 on a finite interval. Other measures
// (weight expressions, moment lists), whose recurrences cost far more per
// pair, use max(3N, 48) nodes, at most ReferencePoints.
const ReferencePoints = 400

// sharedMeasure serves the recurrence of a measure to the several Gauss
// builds of the comparison from one fetch at the largest length and
// precision asked so far (design.Gauss caches within one build only).
type sharedMeasure struct {
	design.Measure
	mu   sync.Mutex
	rec  *design.Recurrence
	prec uint
}

// Recurrence returns n pairs rounded to prec bits.
func (s *sharedMeasure) Recurrence(n int, prec uint) (*design.Recurrence, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.rec == nil || s.rec.Len() < n || s.prec < prec {
		if s.rec != nil {
			n, prec = max(n, s.rec.Len()), max(prec, s.prec)
		}
		rec, err := s.Measure.Recurrence(n, prec)
		if err != nil {
			return nil, err
		}
		s.rec, s.prec = rec, prec
	}
	out := &design.Recurrence{Alpha: make([]*big.Float, n), Beta: make([]*big.Float, n)}
	for k := 0; k < n; k++ {
		out.Alpha[k] = new(big.Float).SetPrec(prec).Set(s.rec.Alpha[k])
		out.Beta[k] = new(big.Float).SetPrec(prec).Set(s.rec.Beta[k])
	}
	return out, nil
}

// shareable reports whether m can be wrapped in a sharedMeasure without
// hiding an interface that design.Gauss looks for.
func shareable(m design.Measure) bool {
	_, lim := m.(design.DigitLimiter)
	_, ver := m.(design.Verifier)
	return !lim && !ver
}

// genzCompare runs the comparison; it returns nil (no error) when no Gauss
// rule of the measure with the rule's size can be built.
func genzCompare(ctx context.Context, m design.Measure, x, w []float64) (*GenzReport, error) {
	n := len(x)
	ml := m.MaxLen()
	if n > design.MaxPoints || (ml >= 0 && ml < 2*n) {
		return nil, nil
	}
	M := ReferencePoints
	if _, family := m.(design.FamilySource); !family {
		M = min(M, max(3*n, 48))
		if shareable(m) {
			m = &sharedMeasure{Measure: m}
		}
	}
	gx, gw, err := gaussFloat64(ctx, m, n)
	if gx == nil {
		return nil, err
	}
	lo, hi := domainFloats(m.Domain())
	t := func(v float64) float64 { return v }
	rep := &GenzReport{GaussPoints: n, Map: "t = x"}
	switch {
	case !math.IsInf(lo, 0) && !math.IsInf(hi, 0):
		t = func(v float64) float64 { return (v - lo) / (hi - lo) }
		rep.Map = "t = (x - a)/(b - a)"
	case !math.IsInf(lo, 0):
		t = func(v float64) float64 { return v - lo }
		rep.Map = "t = x - a"
	}
	var rx, rw, hx, hw []float64
	unit := unitWeight(m)
	if unit {
		rep.Reference = "closed form (Genz 1984), times b - a"
	} else {
		if ml >= 0 {
			M = min(M, ml/2)
		}
		if M < 2*n {
			return nil, nil
		}
		if rx, rw, err = gaussFloat64(ctx, m, M); rx == nil {
			return nil, err
		}
		if hx, hw, err = gaussFloat64(ctx, m, M/2); hx == nil {
			return nil, err
		}
		rep.Reference = "the measure's own Gauss rule (float64) with many nodes"
		rep.ReferencePoints = M
	}
	for _, g := range GenzSet {
		f := func(v float64) float64 { return g.Eval(t(v)) }
		cs := GenzCase{Name: g.Name, C: g.C, W: g.W}
		var I float64
		if unit {
			I = (hi - lo) * g.Integral()
		} else {
			I = apply(f, rx, rw)
			cs.ReferenceError = Float(relErr(apply(f, hx, hw), I))
		}
		q, qg := apply(f, x, w), apply(f, gx, gw)
		cs.Integral, cs.Rule, cs.Gauss = Float(I), Float(q), Float(qg)
		cs.RuleError, cs.GaussError = Float(relErr(q, I)), Float(relErr(qg, I))
		rep.Cases = append(rep.Cases, cs)
	}
	return rep, nil
}

// apply returns sum_i w_i f(x_i) in float64 by compensated summation (A.
// Neumaier, "Rundungsfehleranalyse einiger Verfahren zur Summation endlicher
// Summen", Zeitschrift fuer Angewandte Mathematik und Mechanik 54 (1974)
// 39-51), so that the floor of the errors is the evaluation of f, not the sum.
func apply(f func(float64) float64, x, w []float64) float64 {
	s, comp := 0.0, 0.0
	for i := range x {
		v := w[i] * f(x[i])
		t := s + v
		if math.Abs(s) >= math.Abs(v) {
			comp += (s - t) + v
		} else {
			comp += (v - t) + s
		}
		s = t
	}
	return s + comp
}

// relErr is |q - ref| / |ref|, or |q - ref| when ref is 0.
func relErr(q, ref float64) float64 {
	if ref == 0 {
		return math.Abs(q)
	}
	return math.Abs(q-ref) / math.Abs(ref)
}

// gaussFloat64 returns the n-point float64 Gauss rule of m, or nil slices
// when it cannot be built (err is then the context's error, if any: a
// measure that yields no such rule only drops the comparison).
func gaussFloat64(ctx context.Context, m design.Measure, n int) (x, w []float64, err error) {
	g, err := design.Gauss(ctx, m, design.Request{Points: n})
	if err != nil {
		return nil, nil, ctx.Err()
	}
	return stringsToFloats(g.Nodes), stringsToFloats(g.Weights), nil
}

func stringsToFloats(s []string) []float64 {
	out := make([]float64, len(s))
	for i, v := range s {
		out[i], _ = strconv.ParseFloat(v, 64)
	}
	return out
}
