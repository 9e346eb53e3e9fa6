package main

import (
	"context"
	"encoding/json"
	"fmt"
	"math/big"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// momentsOptions holds the flags of `quadwright moments`.
type momentsOptions struct {
	listOptions
	outBasis string
}

func newMomentsCommand() *cobra.Command {
	o := &momentsOptions{}
	cmd := &cobra.Command{
		Use:   "moments",
		Short: "Print the raw or modified moments of a measure",
		Long: `Print the moments m_k = integral of q_k(x) dlambda(x), k < --count, of a
measure, to --digits significant digits: raw moments (q_k = x^k, the default)
or modified moments in a monic basis (--out-basis legendre, chebyshev,
laguerre, hermite).

A weight expression (--weight with --interval, or a --family through its
weight) is integrated by double-exponential quadrature with an error bound;
a moment is printed only when its bound is below a tenth of a unit in its
last printed digit, and as 0 with its bound when the bound exceeds the
moment itself (zero by symmetry, as far as the quadrature can tell). A
--measure file or a --moments file of raw moments gives its moments exactly
(the data as written; read --moments with --basis monomial only).`,
		Example: `  quadwright moments --weight "-log(x)" --interval 0,1 --count 6 --digits 30
  quadwright moments --weight "exp(-x^2)" --interval 0,inf --count 4 --digits 20 --format json
  quadwright moments --family legendre --count 5 --out-basis legendre --digits 10`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runMoments(cmd.Context(), o, cmd)
		},
	}
	o.addFlags(cmd, "number K of moments, k = 0..K-1")
	cmd.Flags().StringVar(&o.outBasis, "out-basis", "monomial", "basis of the printed moments: monomial (raw), legendre or chebyshev (on the measure's finite interval), laguerre (on [A,inf)), hermite")
	return cmd
}

// momentLine is one printed moment: its digits, or "0" with the bound
// that its true value lies within.
type momentLine struct {
	value, bound string
}

func runMoments(ctx context.Context, o *momentsOptions, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	K, D, format, err := o.parse()
	if err != nil {
		return err
	}
	if o.mf.basis != "" && !strings.EqualFold(o.mf.basis, "monomial") {
		return fmt.Errorf("--basis %s: the moments command reads --moments files of raw moments only; use --out-basis for the printed moments", o.mf.basis)
	}
	m, fam, err := o.mf.resolve(ctx)
	if err != nil {
		return err
	}
	dom := m.Domain()
	basis, _, err := momentBasis(o.outBasis, &dom)
	if err != nil {
		return fmt.Errorf("--out-basis %s: %v", o.outBasis, strings.TrimPrefix(err.Error(), "--basis "+o.outBasis+": "))
	}
	var lines []momentLine
	switch {
	case o.mf.momentsFile != "":
		ml, err := o.mf.readMoments()
		if err != nil {
			return err
		}
		ex, err := ml.BasisMoments(K, basis)
		if err != nil {
			return err
		}
		lines = exactLines(ex, D)
	case o.mf.measure != "":
		dm, err := o.mf.readMeasure()
		if err != nil {
			return err
		}
		lines = exactLines(dm.BasisMoments(K, basis), D)
	default:
		var w *moments.Weight
		if fam != nil {
			if w, err = moments.NewWeight(fam.Weight(), fam.Interval, nil); err != nil {
				return fmt.Errorf("--family %s: its weight %s could not be integrated (%v)", o.mf.family, fam.Weight(), err)
			}
		} else if w, err = o.mf.weightFunction(&dom); err != nil {
			return err
		}
		if lines, err = quadratureLines(ctx, w, K, basis, D); err != nil {
			return err
		}
	}
	return writeOutput(o.output, cmd.OutOrStdout(), func(out *strings.Builder) error {
		vals := make([]string, len(lines))
		bounds := make([]string, len(lines))
		for k, l := range lines {
			vals[k], bounds[k] = l.value, l.bound
		}
		switch format {
		case "json":
			js := map[string]any{
				"measure": m.Label(), "weight": m.Weight(),
				"basis": basis.Name, "digits": D, "count": K, "moments": vals, "zero_bounds": bounds,
			}
			supportJSON(m, js)
			b, err := json.MarshalIndent(js, "", "  ")
			if err != nil {
				return err
			}
			out.Write(b)
			out.WriteString("\n")
		case "csv":
			out.WriteString("k,moment\n")
			for k, v := range vals {
				fmt.Fprintf(out, "%d,%s\n", k, v)
			}
		default:
			fmt.Fprintf(out, "# %s moments of %s%s%s\n", basis.Name, m.Label(), design.WeightPhrase(m.Weight()), supportLabel(m))
			fmt.Fprintf(out, "# digits: %d significant, each within one unit of its last place\n", D)
			for k, v := range vals {
				if bounds[k] != "" {
					v += "  (|m| <= " + bounds[k] + ")"
				}
				vals[k] = v
			}
			writeColumns(out, []string{"k", "moment"}, vals)
		}
		return nil
	})
}

// exactLines prints exact values to D digits.
func exactLines(vals []*big.Rat, D int) []momentLine {
	out := make([]momentLine, len(vals))
	prec := precision.DigitsToBits(D) + 64
	for k, v := range vals {
		out[k].value = precision.FormatSig(new(big.Float).SetPrec(prec).SetRat(v), D)
	}
	return out
}

// quadratureLines integrates the moments with rising accuracy until every
// one is either confirmed to D digits (its error bound below a tenth of a
// unit in its D-th digit) or bounded by less than its own size away from
// zero.
func quadratureLines(ctx context.Context, w *moments.Weight, K int, basis moments.Basis, D int) ([]momentLine, error) {
	ask := D + 5
	for attempt := 0; ; attempt++ {
		vals, est, err := w.Moments(ctx, K, basis, ask)
		if err != nil {
			return nil, err
		}
		out := make([]momentLine, K)
		short := 0 // the largest number of digits missing
		for k := range vals {
			lim := new(big.Float).SetPrec(64).Abs(vals[k])
			lim.Mul(lim, new(big.Float).SetPrec(64).SetRat(new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D)), nil))))
			switch {
			case est[k].Cmp(lim) <= 0:
				out[k].value = precision.FormatSig(vals[k], D)
			case est[k].Cmp(new(big.Float).Abs(vals[k])) >= 0:
				out[k] = momentLine{value: "0", bound: precision.FormatSig(new(big.Float).Mul(est[k], big.NewFloat(2)), 2)}
				short = max(short, 1)
			default:
				r := new(big.Float).SetPrec(64).Quo(est[k], lim)
				f, _ := r.Float64()
				short = max(short, len(fmt.Sprintf("%.0f", f)))
			}
		}
		done := true
		for k := range out {
			if out[k].value == "" {
				done = false
			}
		}
		if done || ask >= precision.MaxDigits || attempt == 2 {
			for k := range out {
				if out[k].value == "" {
					return nil, fmt.Errorf("moment %d of %s could not be confirmed to %d digits (the quadrature's bound stays too large)", k, w.Label(), D)
				}
			}
			return out, nil
		}
		ask = min(precision.MaxDigits, ask+short+5)
	}
}
