package main

import (
	"encoding/json"
	"fmt"
	"strings"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/rulefile"
	"quadwright/stability"
)

// maxRatio is the largest exactness residual, as a share of the
// tolerance, over the degrees that passed.
func maxRatio(r *design.Rule) string {
	return fmt.Sprintf("%.2g", r.Exactness.WorstShare())
}

// writeRule renders r in the given format.
func writeRule(w *strings.Builder, r *design.Rule, fam *moments.Family, format string) error {
	switch format {
	case "json":
		f := rulefile.FromRule(r, fam, "quadwright "+version)
		s, err := stability.Summarize(r)
		if err != nil {
			return err
		}
		if f.Report, err = json.Marshal(s); err != nil {
			return err
		}
		b, err := f.MarshalIndent()
		if err != nil {
			return err
		}
		w.Write(b)
	case "csv":
		w.WriteString("node,weight\n")
		for i := range r.Nodes {
			fmt.Fprintf(w, "%s,%s\n", r.Nodes[i], r.Weights[i])
		}
	default:
		return writeText(w, r)
	}
	return nil
}

// writeText renders r as a commented header, with the short stability
// report (stability.Summarize), and a table of nodes and weights.
func writeText(w *strings.Builder, r *design.Rule) error {
	s, err := stability.Summarize(r)
	if err != nil {
		return err
	}
	digits := "float64 (each value the nearest double, shortest form)"
	if r.Digits > 0 {
		digits = fmt.Sprintf("%d significant, each within one unit of its last place", r.Digits)
	}
	fmt.Fprintf(w, "# quadwright %s rule\n", r.Kind)
	fmt.Fprintf(w, "# measure:  %s%s%s\n", r.Measure, design.WeightPhrase(r.Weight), domainLabel(r))
	fmt.Fprintf(w, "# points:   %d\n", r.Points())
	fmt.Fprintf(w, "# degree:   %d (verified on the printed values; largest residual %s times the tolerance)\n", r.Degree, maxRatio(r))
	fmt.Fprintf(w, "# digits:   %s\n", digits)
	fmt.Fprintf(w, "# precision: %d bits, confirmed against an independent computation at %d bits\n", r.WorkingPrec, r.CheckPrec)
	if in := r.Input; in != nil {
		fmt.Fprintf(w, "# input:    %s\n", inputLabel(in))
	}
	w.WriteString(s.TextBlock())
	for _, note := range r.Notes {
		fmt.Fprintf(w, "# note:     %s\n", note)
	}
	wn := len("node")
	for i := range r.Nodes {
		wn = max(wn, len(r.Nodes[i]))
	}
	iw := len(fmt.Sprint(r.Points()))
	fmt.Fprintf(w, "%*s  %-*s  %s\n", iw, "i", wn+1, " node", " weight")
	for i := range r.Nodes {
		fmt.Fprintf(w, "%*d  %-*s  %s\n", iw, i+1, wn+1, padSign(r.Nodes[i]), padSign(r.Weights[i]))
	}
	return nil
}

// padSign lines up digits by giving positive values a leading space where
// negative ones carry their minus.
func padSign(s string) string {
	if strings.HasPrefix(s, "-") {
		return s
	}
	return " " + s
}

// domainLabel is the phrase for the rule's support after the measure: " on
// [a, b]" as the user stated it, or ", support not given" with the span of
// the nodes when none was stated.
func domainLabel(r *design.Rule) string {
	if !r.SupportUnknown {
		return " on " + r.Domain.String()
	}
	return fmt.Sprintf(", support not given (nodes span [%s, %s])", r.Nodes[0], r.Nodes[len(r.Nodes)-1])
}

// inputLabel states the bound and the measured estimate of the digits a
// finite-digit input vouches for.
func inputLabel(in *design.InputDigits) string {
	return fmt.Sprintf("%d digits carried; the %d-point rule keeps %d by the bound (%s), %d measured (largest relative change %.2g over %d seeded draws within half a unit of the last digit)",
		in.Carried, in.Points, in.Bound, in.BoundMethod, in.Measured, in.Spread, in.Draws)
}
