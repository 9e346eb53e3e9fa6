package main

import (
	"context"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/specs"
	"quadwright/stability"
)

func newDemoCommand() *cobra.Command {
	var out string
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run the built-in example scenario: build the example specs, audit a poor rule beside a good one",
		Long: `Run the built-in scenario end to end: build and verify the rule of every
example spec (a boundary-element log panel, a kinetic half-range Maxwellian, an
axisymmetric radius weight, spectral-element Lobatto points, a weight known only
from measured moments), then audit a deliberately poor rule (11-point closed
Newton-Cotes) beside a good one (11-point Gauss-Legendre) and write the rule
files, a summary and the HTML audit pages into a folder that the command names.`,
		Example: `  quadwright demo
  quadwright demo --out ./demo-output`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runDemo(cmd.Context(), out, cmd)
		},
	}
	cmd.Flags().StringVar(&out, "out", filepath.Join(os.TempDir(), "quadwright-demo"), "folder for the demo's rule files and reports (created if missing)")
	return cmd
}

func runDemo(ctx context.Context, out string, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	specDir := filepath.Join(out, "specs")
	if err := os.MkdirAll(specDir, 0o755); err != nil {
		return fmt.Errorf("--out %s: cannot create the folder (%v)", out, unwrapPathError(err))
	}
	// The embedded specs are written out first, so that the paths they name
	// (a moments table) resolve beside them, as for a user's own specs.
	names, err := fs.Glob(specs.Files, "*")
	if err != nil {
		return err
	}
	for _, n := range names {
		b, _ := specs.Files.ReadFile(n)
		if err := writeFileAtomic(filepath.Join(specDir, n), b); err != nil {
			return err
		}
	}
	w := cmd.OutOrStdout()
	var summary strings.Builder
	fmt.Fprintf(&summary, "quadwright %s demo\n\n", version)
	tomls, _ := filepath.Glob(filepath.Join(specDir, "*.toml"))
	sort.Strings(tomls)
	fmt.Fprintf(w, "quadwright demo: building and verifying the rules of %d example specs\n", len(tomls))
	for _, sp := range tomls {
		base := strings.TrimSuffix(filepath.Base(sp), ".toml")
		dest := filepath.Join(out, base+".json")
		b := newBuildCommand()
		b.SetContext(ctx)
		b.SetOut(w)
		b.Flags().Bool("quiet", true, "")
		if err := applySpec(b, sp); err != nil {
			return err
		}
		if err := b.Flags().Set("output", dest); err != nil {
			return err
		}
		t0 := time.Now()
		if err := b.RunE(b, nil); err != nil {
			return fmt.Errorf("demo spec %s: %v", filepath.Base(sp), err)
		}
		line := fmt.Sprintf("%-26s -> %s  (%s)", base, filepath.Base(dest), time.Since(t0).Round(time.Millisecond))
		fmt.Fprintln(w, "  "+line)
		fmt.Fprintln(&summary, line)
	}

	fmt.Fprintln(w, "quadwright demo: auditing a poor rule beside a good one (11 points, weight 1 on [-1, 1])")
	fmt.Fprintln(&summary, "\nAudits, weight 1 on [-1, 1]:")
	legendre, err := moments.NewFamily("legendre", nil, nil, nil)
	if err != nil {
		return err
	}
	m := design.FamilySource{Family: legendre}
	req := design.Request{Points: 11, Digits: 30}
	poor, err := design.Preset(ctx, m, req, "newton-cotes")
	if err != nil {
		return err
	}
	good, err := design.Gauss(ctx, m, req)
	if err != nil {
		return err
	}
	for _, c := range []struct {
		file, title string
		rule        *design.Rule
	}{
		{"audit-newton-cotes-11.html", "11-point closed Newton-Cotes rule (a poor choice)", poor},
		{"audit-gauss-legendre-11.html", "11-point Gauss-Legendre rule (a good one)", good},
	} {
		rep, err := stability.Audit(ctx, m, c.rule.Nodes, c.rule.Weights, stability.Options{})
		if err != nil {
			return err
		}
		var page strings.Builder
		if err := rep.WriteHTML(&page, c.title, cautionText); err != nil {
			return err
		}
		if err := writeFileAtomic(filepath.Join(out, c.file), []byte(page.String())); err != nil {
			return err
		}
		line := fmt.Sprintf("%-30s degree %2d, %d negative weights, stability factor %.4g, lost digits %.2f",
			c.file, rep.Degree, rep.NegativeWeights, float64(rep.StabilityFactor), float64(rep.LostDigits))
		fmt.Fprintln(w, "  "+line)
		fmt.Fprintln(&summary, line)
	}
	summary.WriteString("\n" + cautionText)
	sp := filepath.Join(out, "summary.txt")
	if err := writeFileAtomic(sp, []byte(summary.String())); err != nil {
		return err
	}
	fmt.Fprintf(w, "wrote the rule files, the audit pages and the summary to %s (open %s)\n", out, filepath.Join(out, "audit-newton-cotes-11.html"))
	return nil
}

// cautionText goes into every report that may feed engineering analysis.
const cautionText = `Caution: rules used in safety-relevant engineering analysis (for example
structural finite-element models) must be verified in the target code; the
applicable design codes and licensed engineering practice govern.
`
