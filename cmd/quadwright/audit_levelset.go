package main

import (
	"context"
	"encoding/json"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design/levelset"
	"quadwright/rulefile"
)

// runLevelSetAudit audits a cut-element rule file (domain.shape
// "level-set"): the domain comes from the file, the checks from levelset.
func runLevelSetAudit(ctx context.Context, o *auditOptions, path, format string, checks []failCheck, cmd *cobra.Command) error {
	if format == "html" {
		return fmt.Errorf("--format html: a cut-element rule is audited as text or json")
	}
	f, err := rulefile.ReadLevelSet(path)
	if err != nil {
		return err
	}
	req, err := f.Request(path)
	if err != nil {
		return err
	}
	nodes := make([][]string, len(f.Nodes))
	for i, n := range f.Nodes {
		nodes[i] = []string(n)
	}
	rep, err := levelset.AuditRule(ctx, req, nodes, f.Weights)
	if err != nil {
		return fmt.Errorf("rule file %s: %v", path, err)
	}
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		if format == "json" {
			b, err := json.MarshalIndent(rep, "", "  ")
			if err != nil {
				return err
			}
			w.Write(append(b, '\n'))
			return nil
		}
		fmt.Fprintf(w, "audit of %s: cut-element rule, %s side of %s on the %s\n", path, req.Side, req.LevelSet, req.Shape)
		fmt.Fprintf(w, "points:           %d (order %d; no polynomial degree is claimed)\n", rep.Points, rep.Order)
		fmt.Fprintf(w, "negative weights: %d\n", rep.NegativeWeights)
		fmt.Fprintf(w, "stability factor: %.6g (lost digits %.2g)\n", rep.StabilityFactor, rep.LostDigits)
		fmt.Fprintf(w, "nodes outside:    %d (off the element or not on the %s side)\n", rep.NodesOutside, req.Side)
		fmt.Fprintf(w, "measure:          %.17g\n", rep.Measure)
		fmt.Fprintf(w, "estimated error:  %.2e against a fresh rule of order %d\n", rep.EstimatedError, rep.Order+4)
		if rep.Digits > 17 {
			fmt.Fprintf(w, "digits:           %d (every check at this precision)\n", rep.Digits)
		} else {
			fmt.Fprintf(w, "digits:           %d (checked in float64)\n", rep.Digits)
		}
		return nil
	})
	if err != nil {
		return err
	}
	return checkThresholds(checks, auditFacts{rep.NegativeWeights, rep.NodesOutside, rep.Degree, rep.LostDigits, "element"})
}
