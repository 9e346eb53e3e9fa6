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
	"quadwright/precision"
)

// listOptions holds the flags shared by `moments` and `recurrence`.
type listOptions struct {
	mf                    measureFlags
	count, digits, format string
	output                string
}

func (o *listOptions) addFlags(cmd *cobra.Command, countHelp string) {
	addMeasureFlags(cmd, &o.mf)
	f := cmd.Flags()
	f.StringVar(&o.count, "count", "10", countHelp)
	f.StringVar(&o.digits, "digits", "20", fmt.Sprintf("significant decimal digits of every printed value, all correct, 1 to %d", precision.MaxDigits))
	f.StringVar(&o.format, "format", "text", "output format: text, json or csv")
	f.StringVarP(&o.output, "output", "o", "", "write to this file (atomically) instead of standard output")
}

// parse reads --count, --digits and --format.
func (o *listOptions) parse() (count, digits int, format string, err error) {
	if format, err = parseFormat(o.format); err != nil {
		return
	}
	count, err = strconv.Atoi(strings.TrimSpace(o.count))
	if err != nil || count < 1 || count > 2*design.MaxPoints {
		return 0, 0, "", fmt.Errorf("--count %q: give a whole number from 1 to %d", o.count, 2*design.MaxPoints)
	}
	d, auto, err := parseDigits(o.digits)
	if err != nil {
		return 0, 0, "", err
	}
	if auto || d == 0 {
		return 0, 0, "", fmt.Errorf("--digits %q: give a number of significant digits from 1 to %d", o.digits, precision.MaxDigits)
	}
	return count, d, format, nil
}

func newRecurrenceCommand() *cobra.Command {
	o := &listOptions{}
	cmd := &cobra.Command{
		Use:   "recurrence",
		Short: "Print the recurrence coefficients alpha_k, beta_k of a measure",
		Long: `Print the coefficients of the three-term recurrence

  pi_{k+1}(x) = (x - alpha_k) pi_k(x) - beta_k pi_{k-1}(x),  beta_0 = total mass,

of the monic orthogonal polynomials of a measure, for k < --count, to --digits
significant digits. The measure flags are those of build. Every value is
computed twice, at two working precisions, and printed only where both give
the same digits; an alpha_k that both put below 10^-D sqrt(beta_k) (zero by
symmetry, as far as D digits can tell) is printed as 0.`,
		Example: `  quadwright recurrence --family jacobi --alpha 0.5 --beta -0.5 --count 5 --digits 25
  quadwright recurrence --weight "-log(x)" --interval 0,1 --count 8 --digits 30 --format json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runRecurrence(cmd.Context(), o, cmd)
		},
	}
	o.addFlags(cmd, "number K of coefficient pairs, k = 0..K-1")
	return cmd
}

func runRecurrence(ctx context.Context, o *listOptions, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	K, D, format, err := o.parse()
	if err != nil {
		return err
	}
	m, _, err := o.mf.resolve(ctx)
	if err != nil {
		return err
	}
	if lim, ok := m.(design.DigitLimiter); ok {
		sup, err := lim.SupportedDigits(ctx, K)
		if err != nil {
			return err
		}
		if D > sup {
			return fmt.Errorf("--digits %d: the input supports only %d correct digits of %d recurrence pairs", D, sup, K)
		}
	}
	p := precision.DigitsToBits(D) + 64
	r1, err := m.Recurrence(K, p)
	if err != nil {
		return err
	}
	r2, err := m.Recurrence(K, p+64)
	if err != nil {
		return err
	}
	alpha := make([]string, K)
	beta := make([]string, K)
	for k := 0; k < K; k++ {
		var ok bool
		if beta[k], ok = design.ConfirmPrinted(r1.Beta[k], r2.Beta[k], D, p+64); !ok {
			return fmt.Errorf("beta_%d could not be confirmed to %d digits: two computations disagree", k, D)
		}
		if alpha[k], ok = design.ConfirmPrinted(r1.Alpha[k], r2.Alpha[k], D, p+64); !ok {
			if !negligible(r1.Alpha[k], r1.Beta[k], D) || !negligible(r2.Alpha[k], r2.Beta[k], D) {
				return fmt.Errorf("alpha_%d could not be confirmed to %d digits: two computations disagree", k, D)
			}
			alpha[k] = "0"
		}
	}
	return writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		switch format {
		case "json":
			out := map[string]any{
				"measure": m.Label(), "weight": m.Weight(),
				"digits": D, "count": K, "alpha": alpha, "beta": beta,
			}
			supportJSON(m, out)
			b, err := json.MarshalIndent(out, "", "  ")
			if err != nil {
				return err
			}
			w.Write(b)
			w.WriteString("\n")
		case "csv":
			w.WriteString("k,alpha,beta\n")
			for k := range alpha {
				fmt.Fprintf(w, "%d,%s,%s\n", k, alpha[k], beta[k])
			}
		default:
			fmt.Fprintf(w, "# recurrence of %s%s%s\n", m.Label(), design.WeightPhrase(m.Weight()), supportLabel(m))
			fmt.Fprintf(w, "# pi_{k+1} = (x - alpha_k) pi_k - beta_k pi_{k-1}; beta_0 is the total mass\n")
			fmt.Fprintf(w, "# digits: %d significant, confirmed at %d and %d bits\n", D, p, p+64)
			writeColumns(w, []string{"k", "alpha", "beta"}, alpha, beta)
		}
		return nil
	})
}

// negligible reports |alpha| <= 10^-D sqrt(beta) (by binary exponents,
// within a factor of two).
func negligible(alpha, beta *big.Float, D int) bool {
	if alpha.Sign() == 0 {
		return true
	}
	s := new(big.Float).SetPrec(64).Sqrt(new(big.Float).SetPrec(64).Abs(beta))
	return alpha.MantExp(nil) <= s.MantExp(nil)-int(precision.DigitsToBits(D))
}

// writeColumns prints an index column and the given columns of values,
// aligned, with a header line.
func writeColumns(w *strings.Builder, head []string, cols ...[]string) {
	widths := make([]int, len(cols))
	for c, col := range cols {
		widths[c] = len(head[c+1]) + 1
		for _, s := range col {
			widths[c] = max(widths[c], len(padSign(s)))
		}
	}
	iw := max(len(head[0]), len(fmt.Sprint(len(cols[0])-1)))
	fmt.Fprintf(w, "%*s", iw, head[0])
	for c := range cols {
		fmt.Fprintf(w, "  %-*s", widths[c], " "+head[c+1])
	}
	w.WriteString("\n")
	for i := range cols[0] {
		fmt.Fprintf(w, "%*d", iw, i)
		for c, col := range cols {
			fmt.Fprintf(w, "  %-*s", widths[c], padSign(col[i]))
		}
		w.WriteString("\n")
	}
}
