package design

import (
	"math/big"

	"quadwright/moments"
)

// Measure is what a rule is built for: a recurrence source together with
// the description that travels with the rule.
type Measure interface {
	RecurrenceSource
	// Label names the measure, as in "jacobi(alpha=-0.7, beta=2.3)".
	Label() string
	// Weight is the weight function as an expression in x.
	Weight() string
	// Domain is the interval the rule lives on.
	Domain() moments.Interval
}

// Label is the family with its parameters.
func (s FamilySource) Label() string { return s.Family.Label() }

// Weight is the family's weight as an expression in x on its interval.
func (s FamilySource) Weight() string { return s.Family.Weight() }

// Domain is the family's interval.
func (s FamilySource) Domain() moments.Interval { return s.Family.Interval }

// Rule is a verified quadrature rule with its provenance. It is built once,
// by this package, and flows on unchanged to reports and writers.
type Rule struct {
	Kind    string           // "gauss", "radau", "lobatto", "kronrod", "anti-gauss", "interpolatory", "newton-cotes", ...
	Measure string           // Measure.Label()
	Weight  string           // Measure.Weight()
	Domain  moments.Interval // Measure.Domain()
	// SupportUnknown says the measure came without a stated support (a
	// raw moment list without --interval): Domain is the whole line, for
	// computation only, and reports say "support not given".
	SupportUnknown bool
	// Input is how many digits of the rule the measure's input carries and
	// vouches for; nil for an exactly known measure or before it is set.
	Input *InputDigits

	// Nodes and Weights are the printed values, nodes ascending: Digits
	// significant digits each, every one with an error below one unit in
	// its last place; in float64 mode (Digits == 0) the float64 nearest to
	// the true value, in shortest round-trip form.
	Nodes, Weights []string
	// NodeValues and WeightValues are the values the printed digits were
	// rounded from, at WorkingPrec bits.
	NodeValues, WeightValues []*big.Float

	Digits int // significant digits printed; 0 in float64 mode
	// Degree is the degree of exactness verified on the printed values
	// (Exactness.Degree), never a nominal one.
	Degree    int
	Exactness Exactness

	WorkingPrec uint // bits of the computation the printed digits come from
	CheckPrec   uint // bits of the independent computation they were confirmed against
	Method      string
	Fallback    bool // the Sturm-bisection path was needed

	// Fixed lists the printed prescribed nodes (radau, lobatto, gauss with
	// fixed nodes; every node of an interpolatory rule), ascending; nil
	// when no node was prescribed.
	Fixed []string
	// Paired is the Gauss rule that a kronrod rule extends or an
	// anti-gauss rule pairs with (built and verified on its own); nil for
	// the other kinds.
	Paired *Rule
	// Stability summarises the signs and the spread of the weights and
	// where the nodes lie; nil when it was not computed.
	Stability *Stability
	// Notes are sentences about the rule worth showing with it (an error
	// estimate the kind supports, an instability); nil when there are none.
	Notes []string
}

// Stability is how far a rule is from one with positive weights and
// nodes inside its support, computed from WeightValues and NodeValues.
type Stability struct {
	NegativeWeights int     // weights < 0
	Factor          float64 // sum |w_i| / |sum w_i|, 1 when no weight is negative
	NodesOutside    int     // nodes outside the closed support
}

// Points is the number of nodes.
func (r *Rule) Points() int { return len(r.Nodes) }
