package main

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"quadwright/design/levelset"
	"quadwright/rulefile"
)

// levelSetOptions holds the flags of `element` for cut elements.
type levelSetOptions struct {
	levelSet, side, box string
}

func addLevelSetFlags(f *pflag.FlagSet, o *levelSetOptions) {
	f.StringVar(&o.levelSet, "level-set", "", "level-set function of x, y[, z]: the rule is for the part of the element where it is < 0 (--side inside), > 0 (outside), or for the surface where it vanishes (surface); --degree is then the order of the one-dimensional Gauss-Legendre rules; with --digits D (1 to 100) the rule is recomputed at extended precision and every weight and coordinate prints D significant digits (a coordinate within half a unit of the D-th digit of the element's size from 0 prints as 0)")
	f.StringVar(&o.side, "side", "inside", "with --level-set: inside (level set < 0), outside (> 0) or surface (= 0, with its area or length measure)")
	f.StringVar(&o.box, "box", "", "with --level-set: a rectangle A,B,C,D ([A,B] x [C,D]) or box A,B,C,D,E,F instead of --shape")
}

// levelSetAsked reports whether the element command is asked for a cut
// element.
func (o *levelSetOptions) asked() bool {
	return o.levelSet != "" || o.box != "" || o.side != "inside"
}

// runLevelSetElement builds a rule on a cut element: flags -> request ->
// levelset.Build -> print.
func runLevelSetElement(ctx context.Context, o *elementOptions, cmd *cobra.Command) error {
	ls := &o.ls
	format, err := parseFormat(o.format)
	if err != nil {
		return err
	}
	if strings.TrimSpace(ls.levelSet) == "" {
		return fmt.Errorf("--level-set: give the level-set expression, for example --level-set \"x^2+y^2-0.25\"")
	}
	if o.momentsFile != "" || o.product || o.lobatto || o.allowNegative || o.allowOutside {
		return fmt.Errorf("--level-set: --moments, --product, --lobatto, --allow-negative and --allow-outside do not apply to a cut element")
	}
	req := levelset.Request{LevelSet: ls.levelSet, Weight: strings.TrimSpace(o.weight)}
	if req.Side, err = levelset.ParseSide(ls.side); err != nil {
		return err
	}
	switch {
	case ls.box != "" && o.shape != "":
		return fmt.Errorf("--box and --shape both give the element: choose one")
	case ls.box != "":
		req.Shape = "box"
		for _, s := range strings.Split(ls.box, ",") {
			v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
			if err != nil {
				return fmt.Errorf("--box %q: %q is not a number", ls.box, strings.TrimSpace(s))
			}
			req.Box = append(req.Box, v)
		}
	case o.shape == "":
		return fmt.Errorf("--shape is required with --level-set: give one of quadrilateral, hexahedron, triangle, tetrahedron (or --box)")
	default:
		req.Shape = strings.TrimSpace(o.shape)
	}
	if o.degree == "" {
		return fmt.Errorf("--degree is required: give the order of the one-dimensional rules, for example --degree 10")
	}
	if req.Order, err = strconv.Atoi(strings.TrimSpace(o.degree)); err != nil {
		return fmt.Errorf("--degree %q: not a whole number", o.degree)
	}
	digits, auto, err := parseDigits(o.digits)
	if err != nil {
		return err
	}
	if auto {
		return fmt.Errorf("--digits auto: give a number of digits for a cut-element rule, for example --digits 30")
	}
	req.Digits = digits
	if ls.box != "" {
		if err := levelset.CheckBoxText(strings.Split(ls.box, ","), digits); err != nil {
			return err
		}
	}
	rule, err := levelset.Build(ctx, req)
	if err != nil {
		return err
	}
	if rule.Note != "" {
		fmt.Fprintf(cmd.ErrOrStderr(), "note: %s\n", rule.Note)
	}
	return writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		return writeLevelSetRule(w, rule, format)
	})
}

func writeLevelSetRule(w *strings.Builder, r *levelset.Rule, format string) error {
	r.Print()
	coords := []string{"x", "y", "z"}[:r.Dim]
	switch format {
	case "json":
		b, err := rulefile.FromLevelSetRule(r, "quadwright "+version).MarshalIndent()
		if err != nil {
			return err
		}
		w.Write(b)
	case "csv":
		w.WriteString(strings.Join(coords, ",") + ",weight\n")
		for i := range r.PrintedNodes {
			fmt.Fprintf(w, "%s,%s\n", strings.Join(r.PrintedNodes[i], ","), r.PrintedWeights[i])
		}
	default:
		where := "the reference " + r.Shape
		if r.Shape == "box" {
			where = fmt.Sprintf("the box %v", r.Box)
		}
		what := map[levelset.Side]string{levelset.Inside: "< 0", levelset.Outside: "> 0", levelset.Surface: "= 0 (surface measure)"}[r.Side]
		fmt.Fprintf(w, "# quadwright cut-element rule on %s where %s %s\n", where, r.LevelSet, what)
		fmt.Fprintf(w, "# method:   %s\n", r.Method)
		if r.Weight != "" {
			fmt.Fprintf(w, "# weight:   %s (the rule integrates w f over the domain)\n", r.Weight)
		}
		fmt.Fprintf(w, "# points:   %d (order %d; no polynomial degree of exactness is claimed on a curved domain)\n", len(r.PrintedNodes), r.Order)
		fmt.Fprintf(w, "# measure:  %.17g\n", r.Measure)
		fmt.Fprintf(w, "# estimated error: %.2e (%s)\n", r.EstimatedError, rulefile.ErrorTestText)
		if r.Digits > 0 {
			fmt.Fprintf(w, "# digits:   %d significant (a coordinate within half a unit of the %d-th digit of the element's size from 0 prints as 0), every one confirmed by two working precisions\n", r.Digits, r.Digits)
		} else {
			fmt.Fprintf(w, "# digits:   float64 (shortest round-trip form)\n")
		}
		if r.Note != "" {
			fmt.Fprintf(w, "# note:     %s\n", r.Note)
		}
		w.WriteString("i," + strings.Join(coords, ",") + ",weight\n")
		for i := range r.PrintedNodes {
			fmt.Fprintf(w, "%d,%s,%s\n", i+1, strings.Join(r.PrintedNodes[i], ","), r.PrintedWeights[i])
		}
	}
	return nil
}
