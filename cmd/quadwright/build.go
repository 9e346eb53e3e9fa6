package main

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/precision"
)

// buildOptions holds the flags of `quadwright build` as typed.
type buildOptions struct {
	measure                      measureFlags
	points, kind, digits, format string
	fixed, nodesFile             string
	output                       string
	engine, verify               string // the fast path (build_fast.go)
	failOn                       string // build_failon.go
	fastFacts                    *auditFacts
	functions                    functionFlags // build_functions.go
}

func newBuildCommand() *cobra.Command {
	o := &buildOptions{}
	cmd := &cobra.Command{
		Use:   "build [SPEC.toml]",
		Short: "Build a verified one-dimensional quadrature rule",
		Long: fmt.Sprintf(`Build the rule of a measure, verify it and print it.

The measure is exactly one of: a classical family (--family, with --alpha and
--beta where it has parameters, mapped affinely onto --interval for the finite
families), a weight expression (--weight with --interval, optional --breaks),
a moment list (--moments FILE, --basis) or a discrete measure (--measure FILE).
The rule is computed twice at two working precisions; only digits on which both agree
are printed, and the printed values are tested for exactness before they are
written. A rule that cannot be verified is an error, not a result.

Large rules: in float64 mode (no --digits), a gauss, radau or lobatto
rule of a classical family (Jacobi exponents up to 5; laguerre and
hermite gauss only; no --fixed or --nodes) with at least %d points is built
by the fast O(N) path instead (design/fast: Bogaert's expansions for
Legendre, Hale and Townsend's for Jacobi, Glaser, Liu and Rokhlin's march
for Laguerre and Hermite), up to %d points; above %d points only this path
builds. Its values are not guaranteed to be the nearest doubles: each rule
is compared at up to 200 sampled nodes with Newton's method in
double-double (on asymptotic series for Legendre, on the recurrence
otherwise), and the measured accuracy in ulps is printed with it (a rule
beyond the bounds is an error). On a finite interval its degree is tested
through the construction degree in the Chebyshev basis (direct
double-double sums for low degrees, a nonuniform FFT for all). For
laguerre and hermite it is tested through 2N-1 while the work N(K+1) stays
within 2e8 steps (laguerre in double-double, 2e7), beyond that through the
degree K the budget allows, which is then the degree reported (--verify
full tests it all); construction_degree gives the degree it was built for. --engine
extended keeps the extended-precision engine (at most %d points).

The options can also come from a spec file (TOML, one key per flag:
points = 12, interval = "0,1", ...); flags given beside it override it.`,
			design.FastThreshold, design.FastMaxPoints, design.MaxPoints, design.MaxPoints),
		Example: `  quadwright build --family legendre --points 5 --digits 30
  quadwright build --family jacobi --alpha -0.7 --beta 2.3 --points 10 --format json
  quadwright build --family laguerre --alpha 1.5 --points 12 --format csv -o laguerre12.csv
  quadwright build --family legendre --interval 0,2 --points 4
  quadwright build specs/spectral-lobatto.toml --digits 20
  quadwright build --family legendre --points 50000 --format csv -o legendre50000.csv
  quadwright build --family legendre --points 8 --fail-on 'negative,degree<15' -o g8.txt`,
		Args: cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if len(args) == 1 {
				if err := applySpec(cmd, args[0]); err != nil {
					return err
				}
			}
			return runBuild(cmd.Context(), o, cmd)
		},
	}
	addMeasureFlags(cmd, &o.measure)
	addFunctionFlags(cmd, &o.functions)
	f := cmd.Flags()
	f.StringVar(&o.points, "points", "", fmt.Sprintf("number of nodes N, 1 to %d (required; above %d only by the fast float64 path)", design.FastMaxPoints, design.MaxPoints))
	f.StringVar(&o.kind, "kind", "gauss", kindHelp)
	f.StringVar(&o.digits, "digits", "", fmt.Sprintf("significant decimal digits, all correct, 1 to %d, or auto (%d for an exactly known measure); default: float64 mode, the nearest double to every value", precision.MaxDigits, design.AutoDigits))
	f.StringVar(&o.format, "format", "text", "output format: text, json or csv")
	f.StringVar(&o.fixed, "fixed", "", "prescribed nodes X,.. (decimal or p/q): radau one, default the left (or only finite) end; lobatto two, default both ends; gauss any number at or outside the ends of the support")
	f.StringVar(&o.nodesFile, "nodes", "", "file of all the nodes, one decimal or p/q per line: the interpolatory weights for the measure are computed")
	f.StringVarP(&o.output, "output", "o", "", "write the rule to this file (atomically) instead of standard output")
	f.StringVar(&o.engine, "engine", "auto", fmt.Sprintf("auto: the fast float64 path (design/fast) in float64 mode from %d points for the families and kinds it serves (and up to %d points, beyond the engine's %d), else the extended-precision engine; fast or extended to choose", design.FastThreshold, design.FastMaxPoints, design.MaxPoints))
	f.StringVar(&o.verify, "verify", "budget", "fast path exactness test for laguerre and hermite (finite intervals are always tested through the construction degree): budget (through degree 2N-1 while N(K+1) <= 2e8 recurrence steps, else to the degree K that allows; degree reports what was tested) or full (through 2N-1 at any N: O(N^2))")
	addBuildFailOn(cmd, o)
	return cmd
}

func runBuild(ctx context.Context, o *buildOptions, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	format, err := parseFormat(o.format)
	if err != nil {
		return err
	}
	checks, err := parseFailOn(o.failOn)
	if err != nil {
		return err
	}
	if o.functions.given() {
		if len(checks) > 0 {
			return fmt.Errorf("--fail-on: not available with --functions; audit the rule file with --fail-on instead")
		}
		return runBuildFunctions(ctx, o, format, cmd.OutOrStdout())
	}
	o.points = o.pointsForNodes()
	if o.points == "" {
		return fmt.Errorf("--points is required: give the number of nodes, for example --points 10")
	}
	n, err := strconv.Atoi(strings.TrimSpace(o.points))
	if err != nil {
		return fmt.Errorf("--points %q: not a whole number", o.points)
	}
	if n < 1 || n > design.FastMaxPoints {
		return fmt.Errorf("--points %d: the number of points must be between 1 and %d (above %d only for the fast float64 path)", n, design.FastMaxPoints, design.MaxPoints)
	}
	req := design.Request{Points: n}
	if req.Digits, req.Auto, err = parseDigits(o.digits); err != nil {
		return err
	}
	quiet, _ := cmd.Flags().GetBool("quiet")
	ctx, done := withProgress(ctx, quiet, n, "building")
	defer done()
	m, fam, err := o.resolveMeasure(ctx)
	if err != nil {
		return err
	}
	kind := strings.ToLower(strings.TrimSpace(o.kind))
	if useFast, err := o.fastChoice(fam, kind, req); err != nil {
		return err
	} else if useFast {
		defer done()
		design.ReportPhase(ctx, "fast float64 path")
		clearBeforeStdout(o.output, done)
		if err := o.runFastBuild(ctx, *fam, kind, n, format, cmd.OutOrStdout()); err != nil {
			return err
		}
		return checkBuilt(checks, func() (auditFacts, error) { return *o.fastFacts, nil })
	}
	rule, err := o.makeRule(ctx, m, req)
	if err == nil {
		err = design.DescribeInput(ctx, m, rule)
	}
	if err != nil {
		return err
	}
	design.ReportPhase(ctx, "writing")
	clearBeforeStdout(o.output, done)
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		return writeRule(w, rule, fam, format)
	})
	if err != nil {
		return err
	}
	return checkBuilt(checks, func() (auditFacts, error) { return ruleFacts(rule) })
}

func parseFormat(s string) (string, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "text", "json", "csv":
		return strings.ToLower(strings.TrimSpace(s)), nil
	}
	return "", fmt.Errorf("--format %q: choose text, json or csv", s)
}

// parseDigits reads --digits: "" is float64 mode (0), auto asks for as
// many digits as the input supports.
func parseDigits(s string) (digits int, auto bool, err error) {
	s = strings.TrimSpace(s)
	switch strings.ToLower(s) {
	case "":
		return 0, false, nil
	case "auto":
		return 0, true, nil
	}
	d, err := strconv.Atoi(s)
	if err != nil {
		return 0, false, fmt.Errorf("--digits %q: give a whole number of significant digits from 1 to %d, or auto", s, precision.MaxDigits)
	}
	if d < 1 || d > precision.MaxDigits {
		return 0, false, fmt.Errorf("--digits %d: the digits must be between 1 and %d", d, precision.MaxDigits)
	}
	return d, false, nil
}
