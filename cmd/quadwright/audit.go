package main

import (
	"context"
	"encoding/json"
	"fmt"
	"math/big"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/design/element"
	"quadwright/precision"
	"quadwright/rulefile"
	"quadwright/stability"
)

// auditOptions holds the flags of `quadwright audit` as typed. The measure
// flags are the shared ones (measure_opts.go), so that audit accepts every
// measure build does.
type auditOptions struct {
	measure   measureFlags
	tolerance string
	maxDegree string
	format    string
	output    string
	failOn    string
	quick     bool
	shape     string
	// inferredShape: the table named no element and InferElement chose it.
	inferredShape bool
	functions     functionFlags // audit_functions.go
}

func newAuditCommand() *cobra.Command {
	o := &auditOptions{}
	cmd := &cobra.Command{
		Use:   "audit RULE",
		Short: "Report what a quadrature rule really integrates and how far it can be trusted",
		Long: `Audit a rule file (quadwright JSON, a text table of "node weight" lines, or
any output of build, element and export as it stands: text, CSV, and the
source code of every export language) against a measure: the degree of exactness with the residual at each degree,
negative weights and the stability factor with the digits it costs, nodes
outside the interval or on its ends, the smallest gap, the conditioning of the
Vandermonde and Hankel matrices, the degree left after rounding to float64,
and the errors on Genz's six test integrands beside the Gauss rule of the same
size.

The measure is given as for build (--family with --alpha/--beta/--interval,
--weight with --interval, --moments, --measure); by default it is the rule
file's own, and for a table without one, weight 1 on --interval. Values are read as exact decimals; each is taken as known to D
digits, D the most significant digits of any value (--tolerance sets u
instead of 10^(1-D)).

A rule on a reference element (a rule file whose domain.shape names one, or a
table of "x y [z] weight" lines with --shape) is audited on the element: the
degree (every monomial of total degree up to d integrated, against the exact
integrals for weight 1, the moments of the file's weight or of --weight, an
expression in x, y, z, or a --moments table of "a b [c] value" lines), negative
weights, the stability factor and lost digits, nodes outside the closed element
and on its boundary, and the symmetry: the subgroup of the element's symmetry
group under which the rule is invariant to its own digits.`,
		Example: `  quadwright build --family legendre --points 6 --digits 30 --format json -o g6.json
  quadwright audit g6.json
  quadwright audit g6.json --format json --fail-on 'negative,outside,degree<11'
  quadwright audit g6.json --format html -o g6.html
  quadwright audit g6.json --format csv -o residuals.csv
  printf '0 1/6\n0.5 2/3\n1 1/6\n' > simpson.txt
  quadwright audit simpson.txt --interval 0,1 --quick
  quadwright audit simpson.txt --interval 0,1 --quick --fail-on 'degree<4'   # exits 2
  quadwright element --shape triangle --degree 7 --format json -o tri7.json
  quadwright audit tri7.json
  quadwright element --shape triangle --degree 4 --weight x --format json -o tri-x4.json
  quadwright audit tri-x4.json --format json --fail-on 'negative,outside,degree<4'`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runAudit(cmd.Context(), o, args[0], cmd)
		},
	}
	addMeasureFlags(cmd, &o.measure)
	f := cmd.Flags()
	f.Lookup("family").Usage += " (default: the rule file's own measure)"
	f.Lookup("interval").Usage += "; alone, weight 1 on [A,B] for a rule file that names no measure"
	f.StringVar(&o.tolerance, "tolerance", "", "relative accuracy u of every node and weight, decimal or p/q, 0 < u < 1 (default: 10^(1-D), D the rule's own digits)")
	f.StringVar(&o.maxDegree, "max-degree", "", "highest degree to test (default 2N+1, lowered to what the measure provides)")
	f.StringVar(&o.format, "format", "text", "output format: text, json, csv or html (csv: the residual by degree, for plots; html: a self-contained page with inline plots)")
	f.StringVarP(&o.output, "output", "o", "", "write the report to this file (atomically) instead of standard output")
	addAuditFunctionFlags(cmd, &o.functions)
	f.StringVar(&o.failOn, "fail-on", "", "comma-separated conditions that make the exit status 2: negative, outside, degree<K, lost>L (L in decimal digits)")
	f.BoolVar(&o.quick, "quick", false, "leave out the test integrands and the matrix conditioning")
	f.StringVar(&o.shape, "shape", "", "audit the rule on this reference element ("+strings.Join(element.ShapeNames, ", ")+"); default: the rule file's domain.shape (needed for a text table of \"x y [z] weight\" lines)")
	return cmd
}

func runAudit(ctx context.Context, o *auditOptions, path string, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	format := strings.ToLower(strings.TrimSpace(o.format))
	if format != "text" && format != "json" && format != "html" && format != "csv" {
		return fmt.Errorf("--format %q: choose text, json, csv or html", o.format)
	}
	checks, err := parseFailOn(o.failOn)
	if err != nil {
		return err
	}
	opt := stability.Options{SkipGenz: o.quick, SkipConditioning: o.quick}
	if s := strings.TrimSpace(o.tolerance); s != "" {
		u, err := parseTolerance(s)
		if err != nil {
			return err
		}
		opt.Unit = u
	}
	if s := strings.TrimSpace(o.maxDegree); s != "" {
		d, err := strconv.Atoi(s)
		if err != nil || d < 1 || d > 2*design.MaxPoints+1 {
			return fmt.Errorf("--max-degree %q: give a whole number from 1 to %d", s, 2*design.MaxPoints+1)
		}
		opt.MaxDegree = d
	}
	file, err := rulefile.Read(path)
	if err != nil {
		return err
	}
	if file.IsLevelSet() {
		return runLevelSetAudit(ctx, o, path, format, checks, cmd)
	}
	if done, err := runPolytopeAudit(ctx, o, file, path, format, checks, opt.MaxDegree, cmd); done {
		return err
	}
	shape, isElement, err := file.ElementShape(path)
	if err != nil {
		return err
	}
	if strings.TrimSpace(o.shape) != "" {
		if shape, err = element.ParseShape(o.shape); err != nil {
			return err
		}
		if file.Dim() != shape.Dim() {
			return fmt.Errorf("rule file %s: its nodes have %d coordinates, but a rule on the %s needs %d", path, file.Dim(), shape, shape.Dim())
		}
		isElement = true
	}
	if !isElement && file.Dim() >= 2 {
		shape, isElement = file.InferElement()
		o.inferredShape = isElement
	}
	if isElement {
		return runElementAudit(ctx, o, file, shape, path, format, checks, opt.Unit, opt.MaxDegree, cmd)
	}
	if file.Dim() != 1 {
		return fmt.Errorf("rule file %s: its nodes have %d coordinates and it names no element; give the element with --shape", path, file.Dim())
	}
	if o.functions.given() {
		return runFunctionsAudit(ctx, o, file, path, format, checks, opt, cmd)
	}
	m, err := o.resolveAuditMeasure(ctx, file, path)
	if err != nil {
		return err
	}
	rep, err := stability.Audit(ctx, m, file.Coordinates(), file.Weights, opt)
	if err != nil {
		return fmt.Errorf("rule file %s: %v", path, err)
	}
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		switch format {
		case "json":
			b, err := json.MarshalIndent(rep, "", "  ")
			if err != nil {
				return err
			}
			w.Write(b)
			w.WriteString("\n")
		case "html":
			return rep.WriteHTML(w, path, cautionText)
		case "csv":
			return writeResidualCSV(w, rep)
		default:
			if err := rep.WriteText(w, path); err != nil {
				return err
			}
			w.WriteString("\n" + cautionText)
		}
		return nil
	})
	if err != nil {
		return err
	}
	return checkThresholds(checks, auditFacts{rep.NegativeWeights, rep.NodesOutside, rep.Degree, float64(rep.LostDigits), "interval"})
}

// parseTolerance reads --tolerance: u with 0 < u < 1, decimal or p/q.
func parseTolerance(s string) (*big.Rat, error) {
	u, err := precision.ParseExact(s)
	if err != nil {
		return nil, fmt.Errorf("--tolerance: %v", err)
	}
	if u.Sign() <= 0 || u.Cmp(big.NewRat(1, 1)) >= 0 {
		return nil, fmt.Errorf("--tolerance %s: the relative accuracy must lie strictly between 0 and 1", s)
	}
	return u, nil
}

// resolveAuditMeasure picks the measure: the measure flags when any is
// given; else the rule file's own family, or its weight on its domain; else
// weight 1 on --interval.
func (o *auditOptions) resolveAuditMeasure(ctx context.Context, f *rulefile.File, path string) (design.Measure, error) {
	b := o.measure
	if b.family != "" || b.weight != "" || b.momentsFile != "" || b.measure != "" {
		m, _, err := b.resolve(ctx)
		return m, err
	}
	if err := fileMeasureHint(f, path); err != nil {
		return nil, err
	}
	domain := ""
	if len(f.Domain.Interval) == 2 {
		domain = f.Domain.Interval[0] + "," + f.Domain.Interval[1]
	}
	if b.interval == "" {
		b.interval = domain
	}
	switch {
	case f.Family != nil:
		b.family, b.alpha, b.beta = f.Family.Name, f.Family.Alpha, f.Family.Beta
		m, _, err := b.resolve(ctx)
		if err != nil {
			return nil, fmt.Errorf("rule file %s: its family: %v", path, err)
		}
		return m, nil
	case strings.TrimSpace(f.Weight) == "1" && b.interval != "":
		b.family = "legendre"
	case f.Weight != "" && b.interval != "":
		b.weight = f.Weight
		m, _, err := b.resolve(ctx)
		if err != nil {
			return nil, fmt.Errorf("rule file %s: its weight %q is not a classical family, and reading it failed (%v); give the measure with --family", path, f.Weight, err)
		}
		return m, nil
	case b.interval != "":
		b.family = "legendre"
	default:
		return nil, fmt.Errorf("rule file %s names no measure: give one with --family, or --interval A,B for weight 1 on [A,B]", path)
	}
	m, _, err := b.resolve(ctx)
	return m, err
}

// failCheck is one condition of --fail-on.
type failCheck struct {
	kind   string // "negative", "outside", "degree", "lost"
	degree int
	lost   float64
	text   string
}

// parseFailOn reads --fail-on: negative, outside, degree<K, lost>L.
func parseFailOn(s string) ([]failCheck, error) {
	var out []failCheck
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	for _, item := range strings.Split(s, ",") {
		it := strings.ToLower(strings.ReplaceAll(item, " ", ""))
		switch {
		case it == "negative" || it == "outside":
			out = append(out, failCheck{kind: it, text: it})
		case strings.HasPrefix(it, "degree<"):
			k, err := strconv.Atoi(it[len("degree<"):])
			if err != nil || k < 0 {
				return nil, fmt.Errorf("--fail-on %q: degree<K needs a whole number K >= 0", strings.TrimSpace(item))
			}
			out = append(out, failCheck{kind: "degree", degree: k, text: it})
		case strings.HasPrefix(it, "lost>"):
			l, err := strconv.ParseFloat(it[len("lost>"):], 64)
			if err != nil || l < 0 || l != l {
				return nil, fmt.Errorf("--fail-on %q: lost>L needs a number of digits L >= 0", strings.TrimSpace(item))
			}
			out = append(out, failCheck{kind: "lost", lost: l, text: it})
		default:
			return nil, fmt.Errorf("--fail-on %q: choose among negative, outside, degree<K and lost>L", strings.TrimSpace(item))
		}
	}
	return out, nil
}

// auditFacts are what --fail-on looks at in a report.
type auditFacts struct {
	NegativeWeights, NodesOutside, Degree int
	LostDigits                            float64
	domain                                string // "interval" or "element"
}

// checkThresholds returns a *thresholdError naming every condition that
// holds, or nil.
func checkThresholds(checks []failCheck, r auditFacts) error {
	var failed []string
	for _, c := range checks {
		switch c.kind {
		case "negative":
			if r.NegativeWeights > 0 {
				failed = append(failed, design.Plural(r.NegativeWeights, "negative weight", "negative weights"))
			}
		case "outside":
			if r.NodesOutside > 0 {
				failed = append(failed, design.Plural(r.NodesOutside, "node", "nodes")+" outside the "+r.domain)
			}
		case "degree":
			if r.Degree < c.degree {
				failed = append(failed, fmt.Sprintf("degree %d < %d", r.Degree, c.degree))
			}
		case "lost":
			if r.LostDigits > c.lost {
				failed = append(failed, fmt.Sprintf("lost digits %.3g > %g", r.LostDigits, c.lost))
			}
		}
	}
	if len(failed) == 0 {
		return nil
	}
	return &thresholdError{msg: "--fail-on: the rule fails " + strings.Join(failed, ", ")}
}
