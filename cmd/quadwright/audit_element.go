package main

import (
	"context"
	"encoding/json"
	"fmt"
	"math/big"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design/element"
	"quadwright/rulefile"
	"quadwright/stability"
)

// runElementAudit audits a rule on a reference element: against weight 1,
// --weight (an expression in x, y, z), --moments (a table of monomial
// moments, as element --moments reads it), or by default the rule file's
// own weight expression.
//
// unit and maxDegree are --tolerance and --max-degree as runAudit read
// them (nil and 0 when not given).
func runElementAudit(ctx context.Context, o *auditOptions, file *rulefile.File, shape element.Shape, path, format string, checks []failCheck, unit *big.Rat, maxDegree int, cmd *cobra.Command) error {
	m := o.measure
	for _, f := range []struct{ name, val string }{
		{"--family", m.family}, {"--alpha", m.alpha}, {"--beta", m.beta}, {"--interval", m.interval},
		{"--breaks", m.breaks}, {"--basis", m.basis}, {"--measure", m.measure},
	} {
		if strings.TrimSpace(f.val) != "" {
			return fmt.Errorf("%s: not used for a rule on the %s; give its weight with --weight (in %s) or --moments", f.name, shape, coordNames(shape))
		}
	}
	if m.weight != "" && m.momentsFile != "" {
		return fmt.Errorf("--weight and --moments both give the weight: choose one")
	}
	opt := stability.ElementOptions{Unit: unit, Weight: m.weight, MaxDegree: maxDegree}
	if lim := element.MaxDegree(shape); maxDegree > lim {
		return fmt.Errorf("--max-degree %d: give a whole number from 1 to %d for a rule on the %s", maxDegree, lim, shape)
	}
	switch {
	case m.momentsFile != "":
		t, err := element.ReadMomentTable(m.momentsFile, shape.Dim())
		if err != nil {
			return err
		}
		opt.Moments = t
	case m.weight == "":
		w := strings.TrimSpace(file.Weight)
		if strings.HasPrefix(w, "moments(") {
			return fmt.Errorf("rule file %s: its weight is %s, a moment table; give the table with --moments", path, w)
		}
		opt.Weight = w
	}
	rep, err := stability.AuditElement(ctx, shape, nodesOf(file), file.Weights, opt)
	if err != nil {
		return fmt.Errorf("rule file %s: %v", path, err)
	}
	if o.inferredShape {
		rep.Notes = append(rep.Notes, fmt.Sprintf("the table names no element: it is taken as the %s, which holds every node and whose %s its weights sum to (give --shape to choose another)", shape, sizeWord(shape)))
	}
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		switch format {
		case "json":
			// The symmetry maps read "(x,y) -> (y,x)": no HTML escaping.
			enc := json.NewEncoder(w)
			enc.SetEscapeHTML(false)
			enc.SetIndent("", "  ")
			return enc.Encode(rep)
		case "html":
			return rep.WriteHTML(w, path, nodesOf(file), file.Weights)
		case "csv":
			return residualTable(w, rep.Residual, rep.RelResidual)
		}
		return rep.WriteText(w, path)
	})
	if err != nil {
		return err
	}
	return checkThresholds(checks, auditFacts{rep.NegativeWeights, rep.NodesOutside, rep.Degree, float64(rep.LostDigits), shape.String()})
}

func nodesOf(f *rulefile.File) [][]string {
	out := make([][]string, len(f.Nodes))
	for i, n := range f.Nodes {
		out[i] = []string(n)
	}
	return out
}

func coordNames(s element.Shape) string {
	return strings.Join([]string{"x", "y", "z"}[:s.Dim()], ", ")
}

func sizeWord(s element.Shape) string {
	if s.Dim() == 2 {
		return "area"
	}
	return "volume"
}
