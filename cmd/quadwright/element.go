package main

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/design/element"
	"quadwright/rulefile"
)

// elementOptions holds the flags of `quadwright element` as typed.
type elementOptions struct {
	shape, degree, digits, format, output string
	product, lobatto                      bool
	allowNegative, allowOutside           bool
	weight, momentsFile                   string
	poly                                  polytopeOptions
	ls                                    levelSetOptions
}

func newElementCommand() *cobra.Command {
	o := &elementOptions{}
	cmd := &cobra.Command{
		Use:   "element",
		Short: "Build a verified quadrature rule on a reference finite element",
		Long: `Build a rule of a given total degree on a reference element, verify it and
print it.

Reference elements: line [-1,1]; triangle (0,0),(1,0),(0,1); quadrilateral
[-1,1]^2; tetrahedron (0,0,0),(1,0,0),(0,1,0),(0,0,1); hexahedron [-1,1]^3;
prism = triangle x [-1,1]; pyramid with base [-1,1]^2 at z=0 and apex (0,0,1).

Where the built-in catalogue holds a fully symmetric rule of the degree, that
rule is the answer; otherwise (or with --product) the tensor product of
Gauss-Legendre rules (line, quadrilateral, hexahedron; --lobatto for
Gauss-Lobatto) or the collapsed-coordinate product of Gauss-Jacobi rules
(triangle, tetrahedron, prism, pyramid). Every weight is positive and every
node inside. Each printed digit is confirmed by a second computation at
higher precision, and the printed rule is tested on every monomial against
its exact integral over the element; the degree reported is the one verified.

With --weight EXPR (a function of x, y and, on 3-D elements, z: for example
x, the radius, on an axisymmetric triangle in the r-z plane) or --moments FILE
the rule is for the integral of w p over the element: exact for every
polynomial p of total degree up to --degree, with positive weights, nodes
inside the element and at most as many points as there are such polynomials
(degrees up to 60 on the line, 30 on 2-D and 12 on 3-D elements). Its moments
come from product rules of increasing order, sampling the weight, until two
orders agree. A weight that is negative or undefined somewhere on the element
is refused; one so singular or kinked that the orders never agree is refused
with the advice to give its moments in a file. The rule is a positive
subsample of a product rule (Tchakaloff; nonnegative least squares), thinned
by point elimination and polished by Gauss-Newton at extended precision, every
printed digit confirmed at a second precision and verified against the
weight's moments.

A moment file has lines "a b [c] value": the exponents of x, y (and z) and the
integral of x^a y^b z^c w over the reference element, a decimal or p/q; '#'
starts a comment. Every exponent of total degree up to --degree is needed. The
digits of decimal moments limit --digits.`,
		Example: `  quadwright element --shape triangle --degree 5
  quadwright element --shape tetrahedron --degree 4 --digits 30 --format json
  quadwright element --shape hexahedron --degree 3 --product --lobatto --format csv
  quadwright element --shape pyramid --degree 6 -o pyramid6.json --format json
  quadwright element --shape triangle --degree 4 --weight x --digits 20
  quadwright element --shape quadrilateral --degree 5 --weight "exp(x)*exp(y)" --format json -o expq5.json
  printf '0 0 1/2\n1 0 1/6\n0 1 1/6\n2 0 1/12\n1 1 1/24\n0 2 1/12\n' > tri-moments.txt
  quadwright element --shape triangle --degree 2 --moments tri-moments.txt --digits 30
  printf '0 0\n2 0\n2 1\n1 1\n1 2\n0 2\n' > lshape.txt
  quadwright element --polygon lshape.txt --degree 6
  quadwright element --shape quadrilateral --level-set "x^2+y^2-0.25" --degree 10 --format json -o disc.json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runElement(cmd.Context(), o, cmd)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.shape, "shape", "", "reference element: "+strings.Join(element.ShapeNames, ", ")+" (required)")
	f.StringVar(&o.degree, "degree", "", "total polynomial degree to integrate exactly, 0 to 999 on the line, 99 on 2-D and 30 on 3-D elements (required)")
	f.StringVar(&o.digits, "digits", "", "significant decimal digits of every coordinate and weight, all correct, 1 to 1000 (900 with --weight or --moments); default: float64 mode, the nearest double to every value")
	f.StringVar(&o.format, "format", "text", "output format: text, json or csv (x,y[,z],weight)")
	f.StringVarP(&o.output, "output", "o", "", "write the rule to this file (atomically) instead of standard output")
	f.BoolVar(&o.product, "product", false, "build the tensor or collapsed product rule even where a symmetric rule is catalogued")
	f.BoolVar(&o.lobatto, "lobatto", false, "with --product on the line, quadrilateral or hexahedron: Gauss-Lobatto factors (nodes on the boundary included)")
	f.StringVar(&o.weight, "weight", "", "weight function of the coordinates x, y, z (as many as the element has), for example \"x\" or \"exp(-x*y)\": the rule is for the integral of w p over the element (default: weight 1)")
	f.StringVar(&o.momentsFile, "moments", "", "file of the weight's monomial moments, lines \"a b [c] value\" (value: the integral of x^a y^b z^c w, decimal or p/q), instead of --weight")
	f.BoolVar(&o.allowNegative, "allow-negative", false, "accept rules with negative weights (every rule built now has positive weights)")
	addPolytopeFlags(f, &o.poly)
	f.BoolVar(&o.allowOutside, "allow-outside", false, "accept rules with nodes outside the element (every rule built now has its nodes inside)")
	addLevelSetFlags(f, &o.ls)
	return cmd
}

func runElement(ctx context.Context, o *elementOptions, cmd *cobra.Command) error {
	if ctx == nil {
		ctx = context.Background()
	}
	if o.poly.active() && o.ls.asked() {
		return fmt.Errorf("--level-set: not available with --polygon, --polyhedron, --polygons or --polyhedra; it cuts a reference element or a --box")
	}
	if o.poly.active() {
		return runPolytope(ctx, o, cmd)
	}
	if o.ls.asked() {
		return runLevelSetElement(ctx, o, cmd)
	}
	format, err := parseFormat(o.format)
	if err != nil {
		return err
	}
	if o.shape == "" {
		return fmt.Errorf("--shape is required: give one of %s", strings.Join(element.ShapeNames, ", "))
	}
	shape, err := element.ParseShape(o.shape)
	if err != nil {
		return err
	}
	if o.degree == "" {
		return fmt.Errorf("--degree is required: give the total degree to integrate exactly, for example --degree 5")
	}
	deg, err := strconv.Atoi(strings.TrimSpace(o.degree))
	if err != nil {
		return fmt.Errorf("--degree %q: not a whole number", o.degree)
	}
	req := element.Request{Shape: shape, Degree: deg, Product: o.product || o.lobatto, Lobatto: o.lobatto}
	digits, auto, err := parseDigits(o.digits)
	if err != nil {
		return err
	}
	if auto {
		return fmt.Errorf("--digits auto: give a number of digits for an element rule, for example --digits 34")
	}
	req.Digits = digits
	req.Weight = strings.TrimSpace(o.weight)
	if o.weight != "" && req.Weight == "" {
		return fmt.Errorf("--weight %q: the expression is empty", o.weight)
	}
	if o.momentsFile != "" {
		if req.Moments, err = element.ReadMomentTable(o.momentsFile, shape.Dim()); err != nil {
			return err
		}
	}
	rule, err := element.Build(ctx, req)
	if err != nil {
		return err
	}
	return writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		return writeElementRule(w, rule, format)
	})
}

// writeElementRule renders an element rule in the given format.
func writeElementRule(w *strings.Builder, r *element.Rule, format string) error {
	coords := []string{"x", "y", "z"}[:r.Shape.Dim()]
	switch format {
	case "json":
		b, err := rulefile.FromElementRule(r, "quadwright "+version).MarshalIndent()
		if err != nil {
			return err
		}
		w.Write(b)
	case "csv":
		w.WriteString(strings.Join(coords, ",") + ",weight\n")
		for i := range r.Nodes {
			fmt.Fprintf(w, "%s,%s\n", strings.Join(r.Nodes[i], ","), r.Weights[i])
		}
	default:
		digits := "float64 (each value the nearest double, shortest form)"
		if r.Digits > 0 {
			digits = fmt.Sprintf("%d significant, each within one unit of its last place", r.Digits)
		}
		fmt.Fprintf(w, "# quadwright %s rule on the reference %s\n", r.Kind, r.Shape)
		fmt.Fprintf(w, "# method:   %s\n", r.Method)
		if r.Weight != "" {
			fmt.Fprintf(w, "# weight:   %s (the rule integrates w p over the element)\n", design.WeightName(r.Weight))
		}
		fmt.Fprintf(w, "# points:   %d", r.Points())
		if r.Published > 0 {
			fmt.Fprintf(w, " (best published fully symmetric rule: %d)", r.Published)
		}
		against := "exact monomial integrals"
		if r.Weight != "" {
			against = "the weight's monomial moments"
		}
		fmt.Fprintf(w, "\n# degree:   %d (asked %d; verified on the printed values against %s, largest residual %.2g times the tolerance)\n", r.Degree, r.Requested, against, r.Exactness.WorstShare)
		fmt.Fprintf(w, "# digits:   %s\n", digits)
		if r.WorkingPrec > 0 {
			fmt.Fprintf(w, "# precision: %d bits, confirmed against an independent computation at %d bits\n", r.WorkingPrec, r.CheckPrec)
		}
		width := make([]int, len(coords)+1)
		for k, c := range coords {
			width[k] = len(c) + 1
		}
		width[len(coords)] = len("weight") + 1
		for i := range r.Nodes {
			for k, c := range r.Nodes[i] {
				width[k] = max(width[k], len(padSign(c)))
			}
			width[len(coords)] = max(width[len(coords)], len(padSign(r.Weights[i])))
		}
		iw := len(fmt.Sprint(r.Points()))
		row := func(first string, cells []string) {
			var b strings.Builder
			fmt.Fprintf(&b, "%*s", iw, first)
			for k, c := range cells {
				fmt.Fprintf(&b, "  %-*s", width[k], c)
			}
			w.WriteString(strings.TrimRight(b.String(), " ") + "\n")
		}
		var head []string
		for _, c := range append(coords, "weight") {
			head = append(head, " "+c)
		}
		row("i", head)
		for i := range r.Nodes {
			var cells []string
			for _, c := range append(append([]string(nil), r.Nodes[i]...), r.Weights[i]) {
				cells = append(cells, padSign(c))
			}
			row(strconv.Itoa(i+1), cells)
		}
	}
	return nil
}
