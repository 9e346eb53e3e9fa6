package main

import (
	"encoding/json"
	"fmt"
	"strings"

	"quadwright/design"
	"quadwright/moments"
)

// ruleFile is the JSON rule file, "quadwright-rule/1" (../shared/CONTRACT.md).
// The first nine keys are the contract's; the rest are quadwright's own.
type ruleFile struct {
	Format     string         `json:"format"`
	Kind       string         `json:"kind"`
	Domain     domainJSON     `json:"domain"`
	Weight     string         `json:"weight"`
	Points     int            `json:"points"`
	Degree     int            `json:"degree"`
	Digits     int            `json:"digits"`
	Nodes      []string       `json:"nodes"`
	Weights    []string       `json:"weights"`
	Measure    string         `json:"measure"`
	Family     *familyJSON    `json:"family,omitempty"`
	Provenance provenanceJSON `json:"provenance"`
}

type domainJSON struct {
	Shape    string   `json:"shape"`
	Interval []string `json:"interval"`
}

type familyJSON struct {
	Name  string `json:"name"`
	Alpha string `json:"alpha,omitempty"`
	Beta  string `json:"beta,omitempty"`
}

type provenanceJSON struct {
	Program            string `json:"program"`
	Method             string `json:"method"`
	WorkingPrecision   uint   `json:"working_precision_bits"`
	CheckPrecision     uint   `json:"check_precision_bits"`
	ExactnessTestedTo  int    `json:"exactness_tested_to"`
	MaxResidualInUnits string `json:"max_residual_in_units"`
}

// maxRatio is the largest exactness residual, in units of the tolerance
// 10u, over the degrees that passed.
func maxRatio(r *design.Rule) string {
	worst := 0.0
	for j := 0; j <= r.Exactness.Degree && j < len(r.Exactness.Ratio); j++ {
		f, _ := r.Exactness.Ratio[j].Float64()
		if f > worst {
			worst = f
		}
	}
	return fmt.Sprintf("%.3g", worst)
}

func newRuleFile(r *design.Rule, fam *moments.Family) ruleFile {
	rf := ruleFile{
		Format: "quadwright-rule/1", Kind: r.Kind,
		Domain: domainJSON{Shape: "interval", Interval: r.Domain.Strings()},
		Weight: r.Weight, Points: r.Points(), Degree: r.Degree, Digits: r.Digits,
		Nodes: r.Nodes, Weights: r.Weights, Measure: r.Measure,
		Provenance: provenanceJSON{
			Program: "quadwright " + version, Method: r.Method,
			WorkingPrecision: r.WorkingPrec, CheckPrecision: r.CheckPrec,
			ExactnessTestedTo: r.Exactness.Tested, MaxResidualInUnits: maxRatio(r),
		},
	}
	if fam != nil {
		fj := &familyJSON{Name: fam.Name}
		if fam.Alpha != nil {
			fj.Alpha = moments.RatString(fam.Alpha)
		}
		if fam.Beta != nil {
			fj.Beta = moments.RatString(fam.Beta)
		}
		rf.Family = fj
	}
	return rf
}

// writeRule renders r in the given format.
func writeRule(w *strings.Builder, r *design.Rule, fam *moments.Family, format string) error {
	switch format {
	case "json":
		b, err := json.MarshalIndent(newRuleFile(r, fam), "", "  ")
		if err != nil {
			return err
		}
		w.Write(b)
		w.WriteString("\n")
	case "csv":
		w.WriteString("node,weight\n")
		for i := range r.Nodes {
			fmt.Fprintf(w, "%s,%s\n", r.Nodes[i], r.Weights[i])
		}
	default:
		writeText(w, r)
	}
	return nil
}

func writeText(w *strings.Builder, r *design.Rule) {
	digits := "float64 (each value the nearest double, shortest form)"
	if r.Digits > 0 {
		digits = fmt.Sprintf("%d significant, each within one unit of its last place", r.Digits)
	}
	fmt.Fprintf(w, "# quadwright %s rule\n", r.Kind)
	fmt.Fprintf(w, "# measure:  %s, weight %s on %s\n", r.Measure, r.Weight, r.Domain)
	fmt.Fprintf(w, "# points:   %d\n", r.Points())
	fmt.Fprintf(w, "# degree:   %d (verified on the printed values; largest residual %s of the tolerance)\n", r.Degree, maxRatio(r))
	fmt.Fprintf(w, "# digits:   %s\n", digits)
	fmt.Fprintf(w, "# precision: %d bits, confirmed against an independent computation at %d bits\n", r.WorkingPrec, r.CheckPrec)
	wn := len("node")
	for i := range r.Nodes {
		wn = max(wn, len(r.Nodes[i]))
	}
	iw := len(fmt.Sprint(r.Points()))
	fmt.Fprintf(w, "%*s  %-*s  %s\n", iw, "i", wn+1, " node", " weight")
	for i := range r.Nodes {
		fmt.Fprintf(w, "%*d  %-*s  %s\n", iw, i+1, wn+1, padSign(r.Nodes[i]), padSign(r.Weights[i]))
	}
}

// padSign lines up digits by giving positive values a leading space where
// negative ones carry their minus.
func padSign(s string) string {
	if strings.HasPrefix(s, "-") {
		return s
	}
	return " " + s
}
