package main

import (
	"context"
	"encoding/json"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design/systems"
	"quadwright/rulefile"
	"quadwright/stability"
)

// addAuditFunctionFlags registers audit's --functions and
// --functions-file (CONTRACT.md, "Function systems").
func addAuditFunctionFlags(cmd *cobra.Command, ff *functionFlags) {
	f := cmd.Flags()
	f.StringVar(&ff.list, "functions", "", "also report, function by function, whether the rule integrates these functions of x times its weight (syntax as for build --functions)")
	f.StringVar(&ff.file, "functions-file", "", "file of function lists for --functions, one per line")
}

// functionReport is one function's line of the audit's json.
type functionReport struct {
	Expression    string  `json:"expression"`
	Integrated    bool    `json:"integrated"`
	ResidualShare float64 `json:"residual_share"`
}

// runFunctionsAudit is audit with --functions: the polynomial audit where
// the weight has polynomial moments, and beside it the contract's test for
// every function of the system, with u from the rule's own digits.
func runFunctionsAudit(ctx context.Context, o *auditOptions, file *rulefile.File, path, format string, checks []failCheck, opt stability.Options, cmd *cobra.Command) error {
	if format == "html" {
		return fmt.Errorf("--format html: audit --functions writes text or json")
	}
	mf := o.measure
	if strings.TrimSpace(mf.weight) == "" {
		mf.weight = file.Weight
	}
	domain := ""
	if len(file.Domain.Interval) == 2 {
		domain = file.Domain.Interval[0] + "," + file.Domain.Interval[1]
	}
	pr, err := o.functions.problem(mf, domain)
	if err != nil {
		return err
	}
	fc, err := systems.CheckRule(ctx, pr.Functions, pr.Weight, file.Coordinates(), file.Weights, file.Digits)
	if err != nil {
		return fmt.Errorf("rule file %s: %v", path, err)
	}
	var rep *stability.Report
	if m, err := o.resolveAuditMeasure(ctx, file, path); err == nil {
		if r, err := stability.Audit(ctx, m, file.Coordinates(), file.Weights, opt); err == nil {
			rep = r
		}
	}
	lines := make([]functionReport, len(fc))
	for i, c := range fc {
		lines[i] = functionReport{c.Expression, c.Integrated, c.Share}
	}
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		if format == "json" {
			obj := map[string]any{}
			if rep != nil {
				b, err := json.Marshal(rep)
				if err != nil {
					return err
				}
				if err := json.Unmarshal(b, &obj); err != nil {
					return err
				}
			} else {
				obj["points"], obj["degree"] = len(file.Weights), -1
			}
			obj["functions"] = lines
			b, err := json.MarshalIndent(obj, "", "  ")
			if err != nil {
				return err
			}
			w.Write(b)
			w.WriteString("\n")
			return nil
		}
		if rep != nil {
			if err := rep.WriteText(w, path); err != nil {
				return err
			}
		} else {
			fmt.Fprintf(w, "quadwright audit of %s\n\npolynomials:   not integrable against %s, no degree to test\n", path, pr.Weight.Label())
		}
		integrated := 0
		for _, c := range fc {
			if c.Integrated {
				integrated++
			}
		}
		fmt.Fprintf(w, "\nfunctions:     %d of %d integrated (residual as a share of 10u sum|w|(|f|+|x f'|) + err(I))\n", integrated, len(fc))
		for _, c := range fc {
			verdict := "integrated"
			if !c.Integrated {
				verdict = "NOT integrated"
			}
			fmt.Fprintf(w, "  %-28s %-15s %.2g\n", c.Expression, verdict, c.Share)
		}
		w.WriteString("\n" + cautionText)
		return nil
	})
	if err != nil || rep == nil {
		return err
	}
	return checkThresholds(checks, auditFacts{rep.NegativeWeights, rep.NodesOutside, rep.Degree, float64(rep.LostDigits), "interval"})
}
