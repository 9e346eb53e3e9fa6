package main

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"quadwright/design/polytope"
	"quadwright/rulefile"
)

// polytopeOptions holds the flags of `element` for the user's own cells.
type polytopeOptions struct {
	polygon, polyhedron, polygons, polyhedra, shard string
}

func (p *polytopeOptions) active() bool {
	return p.polygon != "" || p.polyhedron != "" || p.polygons != "" || p.polyhedra != "" || p.shard != ""
}

func addPolytopeFlags(f *pflag.FlagSet, p *polytopeOptions) {
	f.StringVar(&p.polygon, "polygon", "", "file of a polygon, one vertex \"x y\" per line (decimal or p/q, read exactly) around the boundary: a rule on it instead of a reference element")
	f.StringVar(&p.polyhedron, "polyhedron", "", "file of a polyhedron, lines \"v x y z\" and \"f i j k ...\" (1-based vertex indices, faces consistently oriented): a rule on it")
	f.StringVar(&p.polygons, "polygons", "", "batch: file of polygons separated by blank lines; one JSON line per cell, in input order")
	f.StringVar(&p.polyhedra, "polyhedra", "", "batch: file of polyhedra separated by blank lines; one JSON line per cell, in input order")
	f.StringVar(&p.shard, "shard", "", "with --polygons or --polyhedra: K/N builds only the K-th of N contiguous, near-equal blocks of cells (K = 1..N)")
}

func runPolytope(ctx context.Context, o *elementOptions, cmd *cobra.Command) error {
	p := &o.poly
	var given []string
	for _, g := range []struct{ name, val string }{{"--polygon", p.polygon}, {"--polyhedron", p.polyhedron}, {"--polygons", p.polygons}, {"--polyhedra", p.polyhedra}} {
		if g.val != "" {
			given = append(given, g.name)
		}
	}
	switch {
	case len(given) == 0:
		return fmt.Errorf("--shard works with --polygons or --polyhedra")
	case len(given) > 1:
		return fmt.Errorf("%s and %s both give the cell: choose one", given[0], given[1])
	case o.shape != "":
		return fmt.Errorf("--shape and %s both give the domain: choose one", given[0])
	case o.weight != "" || o.momentsFile != "":
		return fmt.Errorf("%s: rules on the user's cells are built for weight 1 in this version; leave out --weight and --moments", given[0])
	case o.product || o.lobatto:
		return fmt.Errorf("%s: --product and --lobatto are for the reference elements", given[0])
	case p.shard != "" && p.polygons == "" && p.polyhedra == "":
		return fmt.Errorf("--shard works with --polygons or --polyhedra, not %s", given[0])
	}
	format, err := parseFormat(o.format)
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
	digits, auto, err := parseDigits(o.digits)
	if err != nil {
		return err
	}
	if auto {
		return fmt.Errorf("--digits auto: give a number of digits for an element rule, for example --digits 34")
	}
	opt := polytope.Options{Degree: deg, Digits: digits}
	if p.polygons != "" || p.polyhedra != "" {
		return runPolytopeBatch(ctx, o, opt, format, cmd)
	}
	var rule *polytope.Rule
	if p.polygon != "" {
		cell, err := readCell(p.polygon, polytope.ParsePolygon)
		if err != nil {
			return err
		}
		if rule, err = polytope.BuildPolygon(ctx, cell, opt); err != nil {
			return fmt.Errorf("--polygon %s: %v", p.polygon, err)
		}
	} else {
		cell, err := readCell(p.polyhedron, polytope.ParsePolyhedron)
		if err != nil {
			return err
		}
		if rule, err = polytope.BuildPolyhedron(ctx, cell, opt); err != nil {
			return fmt.Errorf("--polyhedron %s: %v", p.polyhedron, err)
		}
	}
	return writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		return writePolytopeRule(w, rule, format)
	})
}

func readCell[T any](path string, parse func(r io.Reader, name string) (T, error)) (T, error) {
	var zero T
	f, err := os.Open(path)
	if err != nil {
		return zero, fmt.Errorf("%s: cannot read it (%v)", path, unwrapPathError(err))
	}
	defer f.Close()
	return parse(f, path)
}

// parseShard reads --shard K/N.
func parseShard(s string) (k, n int, err error) {
	if s == "" {
		return 1, 1, nil
	}
	a, b, ok := strings.Cut(strings.TrimSpace(s), "/")
	k, e1 := strconv.Atoi(a)
	n, e2 := strconv.Atoi(b)
	if !ok || e1 != nil || e2 != nil || n < 1 || k < 1 || k > n {
		return 0, 0, fmt.Errorf("--shard %q: give K/N with whole numbers 1 <= K <= N, for example --shard 3/8", s)
	}
	return k, n, nil
}

// batchLine is one JSON line of a batch: the cell's index in the whole
// file, then its rule file.
type batchLine struct {
	Cell int `json:"cell"`
	*rulefile.File
}

func runPolytopeBatch(ctx context.Context, o *elementOptions, opt polytope.Options, format string, cmd *cobra.Command) error {
	p := &o.poly
	path, flag, dim := p.polygons, "--polygons", 2
	if p.polyhedra != "" {
		path, flag, dim = p.polyhedra, "--polyhedra", 3
	}
	if format != "json" && strings.TrimSpace(o.format) != "text" {
		return fmt.Errorf("--format %s: a batch writes JSON lines; leave out --format or give json", o.format)
	}
	k, n, err := parseShard(p.shard)
	if err != nil {
		return err
	}
	f, err := os.Open(path)
	if err != nil {
		return fmt.Errorf("%s %s: cannot read it (%v)", flag, path, unwrapPathError(err))
	}
	blocks, err := polytope.SplitBlocks(f, path)
	f.Close()
	if err != nil {
		return err
	}
	lo, hi := polytope.Shard(len(blocks), k, n)
	res := polytope.Batch(ctx, blocks[lo:hi], path, polytope.BatchOptions{Options: opt, Dim: dim})
	if err := ctx.Err(); err != nil {
		return err
	}
	bad := 0
	err = writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		for _, r := range res {
			if r.Err != nil {
				bad++
				fmt.Fprintf(cmd.ErrOrStderr(), "quadwright: cell %d: %v\n", r.Index, r.Err)
				continue
			}
			file := rulefile.FromPolytopeRule(r.Rule, "quadwright "+version)
			// The residual share depends on how the check's sums were
			// split over the cores: left out, so that the lines are the
			// same on any number of them.
			file.Provenance.ResidualShare = ""
			b, err := json.Marshal(batchLine{r.Index, file})
			if err != nil {
				return err
			}
			w.Write(b)
			w.WriteByte('\n')
		}
		return nil
	})
	if err != nil {
		return err
	}
	if bad > 0 {
		return fmt.Errorf("%s %s: %d of %d cells failed (named above); the other rules were written", flag, path, bad, len(res))
	}
	return nil
}

// writePolytopeRule renders a rule on a user's cell.
func writePolytopeRule(w *strings.Builder, r *polytope.Rule, format string) error {
	coords := []string{"x", "y", "z"}[:r.Dim]
	switch format {
	case "json":
		b, err := rulefile.FromPolytopeRule(r, "quadwright "+version).MarshalIndent()
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
		fmt.Fprintf(w, "# quadwright rule on a %s of %d vertices\n", r.Kind, len(r.Vertices))
		fmt.Fprintf(w, "# method:   %s\n", r.Method)
		fmt.Fprintf(w, "# points:   %d\n", r.Points())
		fmt.Fprintf(w, "# degree:   %d (asked %d; verified on the printed values against exact moments, largest residual %.2g times the tolerance)\n", r.Degree, r.Requested, r.Exactness.WorstShare)
		fmt.Fprintf(w, "# digits:   %s\n", digits)
		fmt.Fprintf(w, "# precision: %d bits, confirmed against an independent computation at %d bits\n", r.WorkingPrec, r.CheckPrec)
		w.WriteString("# " + strings.Join(append(coords, "weight"), " ") + "\n")
		for i := range r.Nodes {
			fmt.Fprintf(w, "%s %s\n", strings.Join(r.Nodes[i], " "), r.Weights[i])
		}
	}
	return nil
}
