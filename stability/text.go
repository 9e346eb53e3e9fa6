package stability

import (
	"fmt"
	"io"
	"math"
	"strings"

	"quadwright/design"
)

// num formats a diagnostic number with 3 significant digits ("inf" when
// it is not finite).
func num(f Float) string {
	v := float64(f)
	switch {
	case math.IsInf(v, 0), math.IsNaN(v):
		return "inf"
	case v == 0:
		return "0"
	}
	return fmt.Sprintf("%.3g", v)
}

// sci formats a number of a table column that spans orders of magnitude
// (residual shares, errors) in one style, 3 significant digits in
// scientific notation, so that the column reads down: "6.46e-09" above
// "4.63e-03", never "0.00463". An exact zero stays "0"; a value that is
// not finite is "inf".
func sci(f Float) string {
	v := float64(f)
	switch {
	case math.IsInf(v, 0), math.IsNaN(v):
		return "inf"
	case v == 0:
		return "0"
	}
	return fmt.Sprintf("%.2e", v)
}

// TextBlock returns the short report as comment lines ("# report: ...") for
// the text rendering of a built rule.
func (s Summary) TextBlock() string {
	var b strings.Builder
	where := fmt.Sprintf("%s outside the interval, %d on its ends", design.Plural(s.NodesOutside, "node", "nodes"), s.NodesOnBoundary)
	if s.Support != "" {
		where = "nodes outside not counted (support " + s.Support + ")"
	}
	fmt.Fprintf(&b, "# report:   %s, stability factor %s (lost digits %s), %s, smallest gap %s\n",
		design.Plural(s.NegativeWeights, "negative weight", "negative weights"), num(s.StabilityFactor), num(s.LostDigits), where, num(s.MinGap))
	return b.String()
}

// WriteText writes the report as readable text; title names the rule (a
// file name, as the user gave it).
func (r *Report) WriteText(w io.Writer, title string) error {
	var b strings.Builder
	fmt.Fprintf(&b, "quadwright audit of %s\n\n", title)
	fmt.Fprintf(&b, "measure:       %s%s on %s\n", r.Measure, design.WeightPhrase(r.Weight), r.Domain)
	fmt.Fprintf(&b, "points:        %d\n", r.Points)
	dig := fmt.Sprintf("%d (the most significant digits of any value)", r.Digits)
	switch {
	case r.UnitGiven:
		dig = fmt.Sprintf("%d (from the tolerance given)", r.Digits)
	case r.Exact:
		dig = fmt.Sprintf("%d (exact fractions among the values)", r.Digits)
	}
	fmt.Fprintf(&b, "digits:        D = %s; u = %s, tolerance 10u = %s\n", dig, r.Unit, r.Tolerance)
	deg := fmt.Sprintf("%d", r.Degree)
	if r.Degree == r.DegreeTested {
		deg = fmt.Sprintf("at least %d", r.Degree)
	}
	fmt.Fprintf(&b, "degree:        %s (tested in the orthonormal basis to degree %d)", deg, r.DegreeTested)
	if r.Float64 != nil {
		fmt.Fprintf(&b, "; rounded to float64: %d", r.Float64.Degree)
	}
	b.WriteString("\n")
	b.WriteString("residual:      share of the tolerance by degree (a degree passes at <= 1)\n")
	from := 0
	if len(r.Residual) > 48 {
		// Long rules: the worst passing share, then the degrees near the end.
		from = max(0, r.Degree-5)
		worst, at := Float(0), 0
		for j := 0; j < from; j++ {
			if r.Residual[j] > worst {
				worst, at = r.Residual[j], j
			}
		}
		fmt.Fprintf(&b, "               degrees 0 to %d: largest %s (degree %d)\n", from-1, num(worst), at)
	}
	end := min(len(r.Residual), from+48)
	for j := from; j < end; j += 6 {
		b.WriteString("              ")
		for k := j; k < min(j+6, end); k++ {
			fmt.Fprintf(&b, " %3d: %-8s", k, sci(r.Residual[k]))
		}
		b.WriteString("\n")
	}
	if end < len(r.Residual) {
		fmt.Fprintf(&b, "               (degrees %d to %d: see --format json)\n", end, len(r.Residual)-1)
	}
	if r.Accuracy != nil {
		fmt.Fprintf(&b, "accuracy:      %s\n", r.Accuracy.Text)
	}
	if r.NegativeWeights == 0 {
		fmt.Fprintf(&b, "weights:       none negative; sum %s (measure's mass %s)\n", num(r.Mass), num(r.MeasureMass))
	} else {
		fmt.Fprintf(&b, "weights:       %d negative; most negative %s (weight %d); negative mass %s, %s of sum |w|; sum %s (measure's mass %s)\n",
			r.NegativeWeights, r.MostNegative, r.MostNegativeIndex, num(r.NegativeMass), percent(r.NegativeShare), num(r.Mass), num(r.MeasureMass))
	}
	fmt.Fprintf(&b, "stability:     factor sum|w|/|sum w| = %s; lost digits %s\n", num(r.StabilityFactor), num(r.LostDigits))
	fmt.Fprintf(&b, "nodes:         %d outside the interval, %d on its ends; smallest gap %s", r.NodesOutside, r.NodesOnBoundary, num(r.MinGap))
	if r.MinGapAfter > 0 {
		fmt.Fprintf(&b, " (between the %s and %s nodes in ascending order)", ordinal(r.MinGapAfter), ordinal(r.MinGapAfter+1))
	}
	b.WriteString("\n")
	if c := r.Conditioning; c != nil {
		if c.Monomial != 0 {
			fmt.Fprintf(&b, "conditioning:  Vandermonde matrix, %s: monomial basis %s, orthonormal basis %s\n", c.Norm, num(c.Monomial), num(c.Orthonormal))
		}
		if c.HankelOrder > 0 {
			fmt.Fprintf(&b, "               Hankel matrix of the moments, order %d, 1-norm: %s, so a construction from raw moments loses about %.1f digits\n",
				c.HankelOrder, num(c.Hankel), float64(c.HankelLostDigits))
		}
	}
	if g := r.Genz; g != nil {
		ref := g.Reference
		if g.ReferencePoints > 0 {
			ref = fmt.Sprintf("%s (%d nodes; its error estimated against %d nodes)", ref, g.ReferencePoints, g.ReferencePoints/2)
		}
		fmt.Fprintf(&b, "test integrands: Genz (1984), relative errors; reference %s; %s\n", ref, g.Map)
		fmt.Fprintf(&b, "  %-14s %5s %6s  %-12s %-12s", "integrand", "c", "w", "this rule", fmt.Sprintf("gauss(%d)", g.GaussPoints))
		if g.ReferencePoints > 0 {
			fmt.Fprintf(&b, " %-12s", "ref. error")
		}
		b.WriteString("\n")
		for _, cs := range g.Cases {
			fmt.Fprintf(&b, "  %-14s %5g %6g  %-12s %-12s", cs.Name, cs.C, cs.W, sci(cs.RuleError), sci(cs.GaussError))
			if g.ReferencePoints > 0 {
				fmt.Fprintf(&b, " %-12s", sci(cs.ReferenceError))
			}
			b.WriteString("\n")
		}
	}
	for _, n := range r.Notes {
		fmt.Fprintf(&b, "note: %s\n", n)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func percent(f Float) string {
	return fmt.Sprintf("%.3g%%", 100*float64(f))
}

func ordinal(n int) string {
	suf := "th"
	switch {
	case n%100 >= 11 && n%100 <= 13:
	case n%10 == 1:
		suf = "st"
	case n%10 == 2:
		suf = "nd"
	case n%10 == 3:
		suf = "rd"
	}
	return fmt.Sprintf("%d%s", n, suf)
}
