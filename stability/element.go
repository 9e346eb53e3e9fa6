package stability

import (
	"context"
	"fmt"
	"io"
	"math/big"
	"strings"

	"quadwright/design"
	"quadwright/design/element"
	"quadwright/precision"
)

// ElementOptions says how AuditElement tests an element rule.
type ElementOptions struct {
	// Unit, when not nil, is u (--tolerance); else u = 10^(1-D), D the
	// rule's own digits (ExactDigits when a value is an exact fraction).
	Unit *big.Rat
	// MaxDegree, when > 0, is the highest total degree tested; otherwise
	// one past the highest degree N points allow (pointBound), at most
	// element.MaxDegree (element.MaxWeightedDegree for a weight).
	MaxDegree int
	// Weight is the weight expression in the element's coordinates; "" or
	// "1" means weight 1, whose monomial integrals are exact rationals.
	Weight string
	// Moments, when not nil, gives the weight by a moment table instead;
	// the degrees tested stop where the table stops (Covers).
	Moments *element.MomentTable
}

// ElementReport is the audit of a rule on a reference element. The first
// keys are the contract's (CONTRACT.md, `quadwright audit`), with
// nodes_outside counting the nodes outside the closed element.
type ElementReport struct {
	Points          int   `json:"points"`
	Degree          int   `json:"degree"`
	NegativeWeights int   `json:"negative_weights"`
	StabilityFactor Float `json:"stability_factor"`
	NodesOutside    int   `json:"nodes_outside"`
	LostDigits      Float `json:"lost_digits"`
	// NodesOnBoundary counts the nodes on the boundary of the element.
	NodesOnBoundary int `json:"nodes_on_boundary"`

	Shape    string     `json:"shape"`
	Vertices [][]string `json:"vertices"`
	Weight   string     `json:"weight"`
	// Digits is the D the tolerance came from; Unit is u and Tolerance 10u.
	Digits       int    `json:"digits"`
	UnitGiven    bool   `json:"unit_given"`
	Unit         string `json:"unit"`
	Tolerance    string `json:"tolerance"`
	DegreeTested int    `json:"degree_tested_to"`
	// DegreeBound is the highest degree the point count allows for a
	// positive weight (pointBound); testing stops one past it by default.
	DegreeBound int `json:"degree_bound"`
	// WorstShare is the largest residual over the monomials of the degrees
	// that passed, as a share of the tolerance.
	WorstShare Float `json:"largest_residual_share"`
	// Mass is the sum of the weights; MeasureMass the integral of the
	// weight over the element.
	Mass        Float          `json:"mass"`
	MeasureMass Float          `json:"measure_mass"`
	Symmetry    SymmetryReport `json:"symmetry"`
	// Accuracy says what the residuals imply for the values (accuracy.go).
	Accuracy *Accuracy `json:"accuracy,omitempty"`
	// Residual[d] is the largest residual of a degree-d monomial as a share
	// of its tolerance, RelResidual[d] the same relative to its scale, for
	// d = 0..DegreeTested (as the interval audit's keys of the same names).
	Residual    []Float  `json:"residual_share,omitempty"`
	RelResidual []Float  `json:"residual,omitempty"`
	Notes       []string `json:"notes,omitempty"`
}

// AuditElement audits the printed rule (nodes[i] with s.Dim() coordinates,
// weights[i]) on the reference element s: the degree (every monomial of
// total degree <= d integrated within the contract's tolerance, against
// the exact integrals for weight 1 or the weight's moments; see
// element.VerifyAgainst), negative weights, the stability factor and lost
// digits, nodes outside the closed element and on its boundary, and the
// symmetry (ruleSymmetry, to the rule's digits: coordinates within 10u, weights
// within 10u of themselves). Every value is read as exact; an unreadable
// one is an error naming it.
func AuditElement(ctx context.Context, s element.Shape, nodes [][]string, weights []string, opt ElementOptions) (*ElementReport, error) {
	dim := s.Dim()
	n := len(nodes)
	xs := make([][]*big.Rat, n)
	ws := make([]*big.Rat, n)
	digits, fraction := 1, false
	read := func(v, what string) (*big.Rat, error) {
		num, err := precision.ParseNumber(v)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", what, err)
		}
		digits = max(digits, num.Digits)
		fraction = fraction || num.Exact
		return num.Value, nil
	}
	for i := range nodes {
		if len(nodes[i]) != dim {
			return nil, fmt.Errorf("node %d has %d coordinates, the %s needs %d", i+1, len(nodes[i]), s, dim)
		}
		xs[i] = make([]*big.Rat, dim)
		for k, c := range nodes[i] {
			v, err := read(c, fmt.Sprintf("node %d coordinate %d", i+1, k+1))
			if err != nil {
				return nil, err
			}
			xs[i][k] = v
		}
		v, err := read(weights[i], fmt.Sprintf("weight %d", i+1))
		if err != nil {
			return nil, err
		}
		ws[i] = v
	}
	if fraction && digits < ExactDigits {
		digits = ExactDigits
	}
	rep := &ElementReport{Points: n, Shape: s.String(), Vertices: s.Vertices(), Weight: "1", Digits: digits}
	u := opt.Unit
	if u != nil {
		rep.UnitGiven = true
	} else {
		u = new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits-1)), nil))
	}
	tol := new(big.Rat).Mul(u, big.NewRat(10, 1))
	rep.Unit, rep.Tolerance = ratText(u), ratText(tol)

	sum, absSum := new(big.Rat), new(big.Rat)
	for i, w := range ws {
		sum.Add(sum, w)
		absSum.Add(absSum, new(big.Rat).Abs(w))
		if w.Sign() < 0 {
			rep.NegativeWeights++
		}
		switch {
		case !s.Contains(xs[i], false):
			rep.NodesOutside++
		case !s.Contains(xs[i], true):
			rep.NodesOnBoundary++
		}
	}
	rep.StabilityFactor, rep.LostDigits = stabilityFactor(rep.NegativeWeights, sum, absSum)
	rep.Mass = ratFloat(sum)

	weighted := strings.TrimSpace(opt.Weight) != "" && strings.TrimSpace(opt.Weight) != "1"
	rep.DegreeBound = pointBound(dim, n)
	maxDeg := opt.MaxDegree
	if maxDeg <= 0 {
		// One past the bound: that degree must fail, so the degree found
		// is the true one, not a lower bound.
		maxDeg = rep.DegreeBound + 1
		lim := element.MaxDegree(s)
		if weighted {
			lim = element.MaxWeightedDegree(s)
		}
		if maxDeg > lim {
			maxDeg = lim
			rep.Notes = append(rep.Notes, fmt.Sprintf("degrees tested up to %d, the most quadwright tests on the %s by default", lim, s))
		}
	}
	var integral element.Integral
	var slack *big.Rat
	if opt.Moments != nil {
		rep.Weight = "moments(" + opt.Moments.Name + ")"
		if c := opt.Moments.Covers(); maxDeg > c {
			if c < 0 {
				return nil, fmt.Errorf("--moments %s: the moment of x^0 (the mass) is missing", opt.Moments.Name)
			}
			maxDeg = c
			rep.Notes = append(rep.Notes, fmt.Sprintf("degrees tested up to %d, the highest the moment table covers", c))
		}
		integral = opt.Moments.Integral()
	} else if weighted {
		rep.Weight = opt.Weight
		var err error
		if integral, slack, err = element.WeightIntegral(ctx, s, opt.Weight, maxDeg, digits); err != nil {
			return nil, err
		}
	}
	ex, err := element.VerifyAgainst(ctx, s, nodes, weights, element.CheckOptions{MaxDegree: maxDeg, MinDigits: digits, Unit: u, Integral: integral, Slack: slack})
	if err != nil {
		return nil, err
	}
	rep.Degree, rep.DegreeTested, rep.WorstShare = ex.Degree, ex.Tested, Float(ex.WorstShare)
	if rep.Accuracy, rep.RelResidual, rep.Residual, err = elementAccuracy(ctx, s, xs, ws, u, slack, ex, integral, rep.DegreeBound); err != nil {
		return nil, err
	}
	if integral != nil {
		rep.MeasureMass = ratFloat(integral(make([]int, dim)))
	} else {
		rep.MeasureMass = ratFloat(s.Measure())
	}
	rep.Symmetry = ruleSymmetry(s, xs, ws, tol)
	return rep, nil
}

// pointBound is the highest degree an n-point rule on a dim-dimensional
// element can integrate for a positive weight: 2k+1 with k the largest
// such that C(k+dim, dim) <= n. A rule of degree 2k+2 would integrate p^2
// for every p of degree k+1; if the C(k+1+dim, dim) > n such p are too
// many, one of them vanishes at every node, and the rule gives 0 for the
// positive integral of w p^2 (common practice: the lower bound on the
// points of a cubature rule of given degree).
func pointBound(dim, n int) int {
	k := 0
	for binom(k+1+dim, dim) <= n {
		k++
	}
	return 2*k + 1
}

func binom(n, k int) int {
	r := 1
	for i := 1; i <= k; i++ {
		r = r * (n - k + i) / i
	}
	return r
}

// ratText writes a tolerance as a short decimal.
func ratText(r *big.Rat) string {
	f, _ := r.Float64()
	return fmt.Sprintf("%.3g", f)
}

// WriteText writes the report as a few labelled lines.
func (r *ElementReport) WriteText(w io.Writer, title string) error {
	var b strings.Builder
	fmt.Fprintf(&b, "audit of %s: a %d-point rule on the reference %s, weight %s\n", title, r.Points, r.Shape, design.WeightName(r.Weight))
	deg := fmt.Sprintf("%d", r.Degree)
	switch {
	case r.Degree < 0:
		deg = "-1 (the constant is not integrated)"
	case r.Degree == r.DegreeTested:
		deg += " (at least: every degree tested passed)"
	case r.Degree == r.DegreeBound:
		deg += fmt.Sprintf(" (the most %d points allow on the %s for a positive weight)", r.Points, r.Shape)
	}
	fmt.Fprintf(&b, "  degree:            %s; monomials tested through total degree %d, largest residual %.2g of the tolerance\n", deg, r.DegreeTested, float64(r.WorstShare))
	fmt.Fprintf(&b, "  tolerance:         10u = %s (u %s)\n", r.Tolerance, unitSource(r))
	fmt.Fprintf(&b, "  negative weights:  %d\n", r.NegativeWeights)
	fmt.Fprintf(&b, "  stability factor:  %s (lost digits %s)\n", num(r.StabilityFactor), num(r.LostDigits))
	fmt.Fprintf(&b, "  nodes outside:     %d (outside the closed %s); %d on its boundary\n", r.NodesOutside, r.Shape, r.NodesOnBoundary)
	fmt.Fprintf(&b, "  mass:              %s (integral of the weight over the %s: %s)\n", num(r.Mass), r.Shape, num(r.MeasureMass))
	fmt.Fprintf(&b, "  symmetry:          %s\n", r.Symmetry.describe(r.Shape))
	if r.Accuracy != nil {
		fmt.Fprintf(&b, "  accuracy:          %s\n", r.Accuracy.Text)
	}
	for _, n := range r.Notes {
		fmt.Fprintf(&b, "  note: %s\n", n)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func unitSource(r *ElementReport) string {
	if r.UnitGiven {
		return "from --tolerance"
	}
	return fmt.Sprintf("= 10^(1-D), D = %d digits", r.Digits)
}
