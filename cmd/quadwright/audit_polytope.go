package main

import (
	"context"
	"encoding/json"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design/polytope"
	"quadwright/rulefile"
)

// runPolytopeAudit audits a rule whose file names a user's polygon or
// polyhedron (domain.shape "polygon" or "polyhedron"): weight signs,
// nodes in the closed cell, and exactness against the cell's exact
// moments for weight 1, through --max-degree (default: the file's degree
// plus one, within polytope.MaxDegree). done is false for any other file.
func runPolytopeAudit(ctx context.Context, o *auditOptions, file *rulefile.File, path, format string, checks []failCheck, maxDegree int, cmd *cobra.Command) (done bool, err error) {
	pg, ph, ok, err := file.PolytopeDomain(path)
	if !ok {
		return false, nil
	}
	if err != nil {
		return true, err
	}
	m := o.measure
	for _, f := range []struct{ name, val string }{
		{"--family", m.family}, {"--alpha", m.alpha}, {"--beta", m.beta}, {"--interval", m.interval},
		{"--breaks", m.breaks}, {"--basis", m.basis}, {"--measure", m.measure}, {"--weight", m.weight}, {"--moments", m.momentsFile}, {"--shape", o.shape},
	} {
		if strings.TrimSpace(f.val) != "" {
			return true, fmt.Errorf("%s: not used for a rule on a user's %s (audited for weight 1 on the cell of its file)", f.name, file.Domain.Shape)
		}
	}
	if w := strings.TrimSpace(file.Weight); w != "" && w != "1" {
		return true, fmt.Errorf("rule file %s: its weight is %q; rules on a user's cell are audited for weight 1", path, w)
	}
	dim := 2
	if ph != nil {
		dim = 3
	}
	if file.Dim() != dim {
		return true, fmt.Errorf("rule file %s: its nodes have %d coordinates, but a rule on a %s needs %d", path, file.Dim(), file.Domain.Shape, dim)
	}
	if maxDegree == 0 {
		maxDegree = min(max(file.Degree+1, 1), polytope.MaxDegree(dim))
	}
	var rep *polytope.Report
	if pg != nil {
		rep, err = polytope.AuditPolygon(ctx, pg, nodesOf(file), file.Weights, maxDegree)
	} else {
		rep, err = polytope.AuditPolyhedron(ctx, ph, nodesOf(file), file.Weights, maxDegree)
	}
	if err != nil {
		return true, fmt.Errorf("rule file %s: %v", path, err)
	}
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		if format == "json" {
			enc := json.NewEncoder(w)
			enc.SetIndent("", "  ")
			return enc.Encode(struct {
				Rule            string  `json:"rule"`
				Domain          string  `json:"domain"`
				Points          int     `json:"points"`
				Degree          int     `json:"degree"`
				Tested          int     `json:"exactness_tested_to"`
				NegativeWeights int     `json:"negative_weights"`
				NodesOutside    int     `json:"nodes_outside"`
				WorstShare      float64 `json:"largest_residual_share_of_tolerance"`
			}{path, rep.Kind, rep.Points, rep.Exactness.Degree, rep.Exactness.Tested, rep.NegativeWeights, rep.NodesOutside, rep.Exactness.WorstShare})
		}
		fmt.Fprintf(w, "audit of %s: a rule on a %s of %d vertices, weight 1\n", path, rep.Kind, len(file.Domain.Vertices))
		fmt.Fprintf(w, "points:            %d\n", rep.Points)
		fmt.Fprintf(w, "degree:            %d (every monomial tested through degree %d against the cell's exact moments)\n", rep.Exactness.Degree, rep.Exactness.Tested)
		fmt.Fprintf(w, "negative weights:  %d\n", rep.NegativeWeights)
		fmt.Fprintf(w, "nodes outside:     %d (of the closed %s, tested exactly)\n", rep.NodesOutside, rep.Kind)
		return nil
	})
	if err != nil {
		return true, err
	}
	return true, checkThresholds(checks, auditFacts{rep.NegativeWeights, rep.NodesOutside, rep.Exactness.Degree, 0, "element"})
}
