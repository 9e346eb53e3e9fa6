package main

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/moments"
)

// demoCase is one rule of the built-in scenario.
type demoCase struct {
	file, purpose string
	family        string
	alpha, beta   string
	interval      string
	points        int
	digits        int
}

// The built-in scenario: the rules a small multiphysics team asks for in its
// first week. Every case is an invented but realistic request.
var demoCases = []demoCase{
	{"beam-legendre-6.json", "6-point Gauss rule on a beam element's axis [0, 2.5] (m), for a stiffness integral", "legendre", "", "", "0,2.5", 6, 30},
	{"crack-tip-jacobi-8.json", "8 points for (1-x)^-0.5 (1+x)^0.3 near a crack tip, where the stress field is singular at x = 1", "jacobi", "-0.5", "0.3", "", 8, 34},
	{"radiation-laguerre-10.json", "10 points for x^1.5 e^-x, the photon-energy weight in a grey-body radiation integral", "laguerre", "1.5", "", "", 10, 30},
	{"oscillator-hermite-12.json", "12 points for e^(-x^2), for ground-state expectation values of a quantum oscillator", "hermite", "", "", "", 12, 30},
	{"plate-gegenbauer-5.json", "5 points for (1-x^2)^1, a parabolic inflow profile across a channel", "gegenbauer", "1.5", "", "", 5, 25},
}

func newDemoCommand() *cobra.Command {
	var out string
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run the built-in example scenario and write its rules and report",
		Long: `Build the rules of the built-in scenario (a beam element, a crack-tip singularity,
a radiation integral, a quantum oscillator and a channel-flow profile), verify
each, print a summary, and write every rule file and a summary report into a
folder that the command names.`,
		Example: `  quadwright demo
  quadwright demo --out ./demo-output`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runDemo(cmd.Context(), out, cmd)
		},
	}
	cmd.Flags().StringVar(&out, "out", filepath.Join(os.TempDir(), "quadwright-demo"), "folder for the demo's rule files and report (created if missing)")
	return cmd
}

func runDemo(ctx context.Context, out string, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	if err := os.MkdirAll(out, 0o755); err != nil {
		return fmt.Errorf("--out %s: cannot create the folder (%v)", out, unwrapPathError(err))
	}
	var report strings.Builder
	fmt.Fprintf(&report, "quadwright %s demo: verified Gauss rules for five requests\n\n", version)
	w := cmd.OutOrStdout()
	fmt.Fprintf(w, "quadwright demo: building and verifying %d rules\n", len(demoCases))
	for _, c := range demoCases {
		alpha, _ := optionalRat("--alpha", c.alpha)
		beta, _ := optionalRat("--beta", c.beta)
		var iv *moments.Interval
		if c.interval != "" {
			v, err := moments.ParseInterval(c.interval)
			if err != nil {
				return err
			}
			iv = &v
		}
		fam, err := moments.NewFamily(c.family, alpha, beta, iv)
		if err != nil {
			return err
		}
		t0 := time.Now()
		rule, err := design.Gauss(ctx, design.FamilySource{Family: fam}, design.Request{Points: c.points, Digits: c.digits})
		if err != nil {
			return fmt.Errorf("demo case %s: %v", c.file, err)
		}
		el := time.Since(t0)
		var b strings.Builder
		if err := writeRule(&b, rule, &fam, "json"); err != nil {
			return err
		}
		if err := writeFileAtomic(filepath.Join(out, c.file), []byte(b.String())); err != nil {
			return err
		}
		line := fmt.Sprintf("%-28s %-34s N=%-3d degree %-3d %d digits  (%s)", c.file, rule.Measure, rule.Points(), rule.Degree, rule.Digits, el.Round(time.Millisecond))
		fmt.Fprintln(w, "  "+line)
		fmt.Fprintf(&report, "%s\n  %s\n  weight %s on %s; verified degree %d; %d digits confirmed at %d against %d bits\n  smallest node %s, largest node %s\n\n",
			c.file, c.purpose, rule.Weight, rule.Domain, rule.Degree, rule.Digits, rule.WorkingPrec, rule.CheckPrec, rule.Nodes[0], rule.Nodes[len(rule.Nodes)-1])
	}
	report.WriteString(cautionText)
	rp := filepath.Join(out, "report.txt")
	if err := writeFileAtomic(rp, []byte(report.String())); err != nil {
		return err
	}
	fmt.Fprintf(w, "wrote the rule files and the report to %s (report: %s)\n", out, rp)
	return nil
}

// cautionText goes into every report that may feed engineering analysis.
const cautionText = `Caution: rules used in safety-relevant engineering analysis (for example
structural finite-element models) must be verified in the target code; the
applicable design codes and licensed engineering practice govern.
`
