package stability

import (
	"encoding/json"
	"fmt"
	"math"
	"math/big"
	"sort"
	"strconv"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// Float is a diagnostic number of a report. It marshals to JSON as a number,
// or as null when it is not finite (a stability factor of a rule whose
// weights sum to zero, a condition number that overflows float64).
type Float float64

// MarshalJSON writes f in shortest round-trip form, or null.
func (f Float) MarshalJSON() ([]byte, error) {
	v := float64(f)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return []byte("null"), nil
	}
	return []byte(strconv.FormatFloat(v, 'g', -1, 64)), nil
}

// UnmarshalJSON reads a number or null (null becomes +Inf).
func (f *Float) UnmarshalJSON(b []byte) error {
	if string(b) == "null" {
		*f = Float(math.Inf(1))
		return nil
	}
	var v float64
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*f = Float(v)
	return nil
}

// Summary is the short report that build attaches to every rule: what the
// weights and node positions alone say, from exact arithmetic on the printed
// values. Every float64 field is the nearest double to the exact rational
// it names.
type Summary struct {
	Points int `json:"points"`
	// Degree is the verified degree of exactness; -1 when constants fail.
	Degree int `json:"degree"`
	// NegativeWeights counts the weights < 0.
	NegativeWeights int `json:"negative_weights"`
	// StabilityFactor is sum |w_i| / |sum w_i|: 1 when no weight is
	// negative, +Inf (JSON null) when the weights sum to zero.
	StabilityFactor Float `json:"stability_factor"`
	// LostDigits is log10(StabilityFactor): the decimal digits of the
	// integrand values that the weighted sum can lose by cancellation.
	LostDigits Float `json:"lost_digits"`
	// NodesOutside counts the nodes outside the closed interval of the
	// measure; NodesOnBoundary those on a finite end of it.
	NodesOutside    int `json:"nodes_outside"`
	NodesOnBoundary int `json:"nodes_on_boundary"`
	// MinGap is the smallest distance between two adjacent nodes (0 for a
	// one-point rule), and MinGapAfter the 1-based position, in ascending
	// order, of the left node of that pair.
	MinGap      Float `json:"min_gap"`
	MinGapAfter int   `json:"min_gap_after"`
	// Input is what a finite-digit input vouches for (see InputReport);
	// nil for an exactly known measure.
	Input *InputReport `json:"input_digits,omitempty"`
	// Support is "not given" when the measure came without one (then
	// NodeSpan holds the first and last node, and nodes outside are not
	// counted); "" otherwise.
	Support  string   `json:"support,omitempty"`
	NodeSpan []string `json:"node_span,omitempty"`
}

// parsedRule holds a rule's printed values read as exact rationals.
type parsedRule struct {
	x, w []*big.Rat
	// digits is the largest number of significant digits among the
	// decimals (at least 1); exact reports a fraction p/q among the values.
	digits int
	exact  bool
}

// parseRule reads nodes and weights exactly. Errors name the value.
func parseRule(nodes, weights []string) (*parsedRule, error) {
	if len(nodes) != len(weights) {
		panic("stability: nodes and weights of different lengths")
	}
	if len(nodes) == 0 {
		return nil, fmt.Errorf("the rule has no nodes")
	}
	p := &parsedRule{x: make([]*big.Rat, len(nodes)), w: make([]*big.Rat, len(nodes)), digits: 1}
	read := func(what string, i int, s string) (*big.Rat, error) {
		num, err := precision.ParseNumber(s)
		if err != nil {
			return nil, fmt.Errorf("%s %d: %v", what, i+1, err)
		}
		if num.Exact {
			p.exact = true
		}
		p.digits = max(p.digits, num.Digits)
		return num.Value, nil
	}
	var err error
	for i := range nodes {
		if p.x[i], err = read("node", i, nodes[i]); err != nil {
			return nil, err
		}
		if p.w[i], err = read("weight", i, weights[i]); err != nil {
			return nil, err
		}
	}
	return p, nil
}

// ratFloat returns the float64 nearest to r as a Float.
func ratFloat(r *big.Rat) Float {
	f, _ := r.Float64()
	return Float(f)
}

// summarize computes everything of a Summary but the degree (left -1).
func (p *parsedRule) summarize(dom moments.Interval) Summary {
	s := Summary{Points: len(p.x), Degree: -1}
	sum, abs, neg := new(big.Rat), new(big.Rat), new(big.Rat)
	for _, w := range p.w {
		sum.Add(sum, w)
		if w.Sign() < 0 {
			s.NegativeWeights++
			neg.Sub(neg, w)
		}
	}
	abs.Add(sum, neg)
	abs.Add(abs, neg)
	s.StabilityFactor, s.LostDigits = stabilityFactor(s.NegativeWeights, sum, abs)
	for _, x := range p.x {
		switch {
		case dom.Lo.Finite() && x.Cmp(dom.Lo.Value) < 0, dom.Hi.Finite() && x.Cmp(dom.Hi.Value) > 0:
			s.NodesOutside++
		case dom.Lo.Finite() && x.Cmp(dom.Lo.Value) == 0, dom.Hi.Finite() && x.Cmp(dom.Hi.Value) == 0:
			s.NodesOnBoundary++
		}
	}
	order := p.ascending()
	var gap *big.Rat
	for k := 0; k+1 < len(order); k++ {
		d := new(big.Rat).Sub(p.x[order[k+1]], p.x[order[k]])
		if gap == nil || d.Cmp(gap) < 0 {
			gap, s.MinGapAfter = d, k+1
		}
	}
	if gap != nil {
		s.MinGap = ratFloat(gap)
	}
	return s
}

// ascending returns the indices of the nodes in ascending order.
func (p *parsedRule) ascending() []int {
	order := make([]int, len(p.x))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return p.x[order[a]].Cmp(p.x[order[b]]) < 0 })
	return order
}

// log10Rat returns log10 r for r > 0, accurate to about 1e-15 relative
// (enough for a digit count), for any magnitude of r.
func log10Rat(r *big.Rat) float64 {
	f := new(big.Float).SetPrec(64).SetRat(r)
	mant := new(big.Float)
	e := f.MantExp(mant)
	m, _ := mant.Float64()
	return math.Log10(m) + float64(e)*math.Log10(2)
}

// Summarize returns the short report of a built rule: the counts, the
// stability factor and lost digits, and the smallest gap, from exact
// arithmetic on the printed values (O(N) rational operations), with the
// degree the rule was verified to. It fails only if a printed value does
// not parse, which a rule from package design never does.
func Summarize(r *design.Rule) (Summary, error) {
	p, err := parseRule(r.Nodes, r.Weights)
	if err != nil {
		return Summary{}, err
	}
	s := p.summarize(r.Domain)
	s.Degree = r.Degree
	noteInput(&s, r)
	return s, nil
}

// stabilityFactor returns sum |w| / |sum w| (abs and sum) and its log10,
// the digits the weighted sum can lose: 1 and 0 when no weight is negative,
// +Inf when the weights sum to zero.
func stabilityFactor(negatives int, sum, abs *big.Rat) (factor, lost Float) {
	switch {
	case negatives == 0:
		return 1, 0
	case sum.Sign() == 0:
		return Float(math.Inf(1)), Float(math.Inf(1))
	}
	f := new(big.Rat).Quo(abs, new(big.Rat).Abs(sum))
	return ratFloat(f), Float(log10Rat(f))
}
