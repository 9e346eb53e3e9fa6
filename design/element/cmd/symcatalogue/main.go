// Command symcatalogue regenerates an embedded catalogue of fully
// symmetric element rules (design/element/catalogue/SHAPE.json):
//
//	go run ./design/element/cmd/symcatalogue -shape quadrilateral -max-degree 15 -o design/element/catalogue/quadrilateral.json
//
// For each degree it searches (element.Search) at the published point
// count, then at one more point at a time up to the collapsed or tensor
// product rule's count (or -max-extra points above the published count,
// whichever is less), polishes the first rule found to 40 digits, verifies
// it on every monomial, and writes the catalogue. The search is
// deterministic for a given -seed. Degrees already in the file given by
// -keep are copied, not searched again (with -rebuild they are polished
// again from their parameters, which refreshes the nodes and weights; with
// -redo the kept degrees in range are searched again, and a rule found
// replaces the kept one).
// With -descents N each degree is instead given N descents aimed at the
// published count (element.Smallest), and the smallest rule any of them
// reaches replaces a kept one with more points.
// With -random-only the search leaves out the descents that open its
// rounds and makes random starts alone.
// With -projected the search solves only the invariant equations, each
// orbit evaluated at one point (much faster on the 3-D shapes). With
// -uniform every orbit structure is tried equally often, which finds
// rules above the published count sooner. Each file's "regenerate" field
// records the commands that made it, in order: a record, since each ran
// with the search of its day (the descents and the strata bound came
// later), and run again today a command may find another rule; the stored
// rules are what TestCatalogue verifies.
package main

import (
	"context"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"sort"
	"strings"
	"time"

	"quadwright/design/element"
)

func main() {
	shapeName := flag.String("shape", "triangle", "element shape")
	maxDeg := flag.Int("max-degree", 0, "highest degree to catalogue (default: the highest with a published count)")
	minDeg := flag.Int("min-degree", 1, "lowest degree to catalogue")
	seed := flag.Uint64("seed", 1, "seed of the random starts")
	starts := flag.Int("starts", 4000, "starts per point count")
	fromExtra := flag.Int("from-extra", 0, "points above the published count to start at")
	maxExtra := flag.Int("max-extra", 1000, "most points above the published count to try")
	out := flag.String("o", "", "catalogue file to write (default: standard output)")
	keep := flag.String("keep", "", "existing catalogue whose degrees are kept as they are")
	uniform := flag.Bool("uniform", false, "visit every orbit structure equally often (see element.SearchOptions)")
	projected := flag.Bool("projected", false, "solve the invariant equations only (see element.SearchOptions)")
	redo := flag.Bool("redo", false, "search the kept degrees in range again, replacing a kept rule only by one found")
	rebuild := flag.Bool("rebuild", false, "polish the kept degrees again from their parameters")
	randomOnly := flag.Bool("random-only", false, "leave out the descent that opens each round of the search, for random starts alone (see element.SearchOptions)")
	descents := flag.Int("descents", 0, "instead of the search count by count, run this many descents aimed at the published count and keep the smallest rule any reaches (see element.Smallest), where it has fewer points than a kept one")
	flag.Parse()
	s, err := element.ParseShape(*shapeName)
	if err != nil || element.SymmetryOf(s) == nil {
		fail(fmt.Errorf("-shape %q: choose a shape with symmetric rules (not the line)", *shapeName))
	}
	if *maxDeg == 0 {
		*maxDeg = element.PublishedDegrees(s)
	}
	ctx := context.Background()
	cmdline := "go run ./design/element/cmd/symcatalogue " + strings.Join(os.Args[1:], " ")
	regen := cmdline
	old := map[int]element.CatalogueEntry{}
	var notes []string
	if *keep != "" {
		b, err := os.ReadFile(*keep)
		if err != nil {
			fail(err)
		}
		var c element.Catalogue
		if err := json.Unmarshal(b, &c); err != nil {
			fail(fmt.Errorf("-keep %s: %v", *keep, err))
		}
		for _, e := range c.Rules {
			old[e.Degree] = e
		}
		notes = c.Notes
		if c.Regenerate != "" {
			regen = c.Regenerate + " && " + cmdline
		}
	}
	cat := element.NewCatalogue(s, regen)
	cat.Notes = notes
	for d := *minDeg; d <= *maxDeg; d++ {
		if _, ok := old[d]; ok && !*redo {
			continue
		}
		p := element.Published(s, d)
		if p == 0 {
			p = 1
		}
		t0 := time.Now()
		if *descents > 0 {
			res, _, ok, err := element.Smallest(ctx, s, d, p, *seed, *descents)
			if err != nil {
				fail(err)
			}
			if !ok {
				fmt.Fprintf(os.Stderr, "%s degree %d: no descent produced a rule (%.1fs)\n", s, d, time.Since(t0).Seconds())
				continue
			}
			e, err := element.NewCatalogueEntry(ctx, d, res, *seed)
			if err != nil {
				fail(fmt.Errorf("degree %d: %v", d, err))
			}
			if k, had := old[d]; had && k.Points <= e.Points {
				fmt.Fprintf(os.Stderr, "%s degree %d: %d points (kept %d), %.1fs\n", s, d, e.Points, k.Points, time.Since(t0).Seconds())
				continue
			}
			fmt.Fprintf(os.Stderr, "%s degree %d: %d points (published %d), %s, descent %d, %.1fs\n", s, d, e.Points, e.Published, e.Orbits, e.Starts, time.Since(t0).Seconds())
			old[d] = e
			if *out != "" {
				write(ctx, cat, old, *out, s, false)
			}
			continue
		}
		limit := min(element.ProductPoints(s, d), p+*maxExtra)
		p += *fromExtra
		found := false
		for ; p <= limit && !found; p++ {
			if len(element.SymmetryOf(s).Structures(d, p)) == 0 {
				continue
			}
			res, ok, err := element.SearchWith(ctx, s, d, p, element.SearchOptions{Seed: *seed, MaxStarts: *starts, Uniform: *uniform, Projected: *projected, RandomOnly: *randomOnly})
			if err != nil {
				fail(err)
			}
			if !ok {
				fmt.Fprintf(os.Stderr, "%s degree %d: no rule of %d points in %d starts (%.1fs)\n", s, d, p, res.Starts, time.Since(t0).Seconds())
				continue
			}
			e, err := element.NewCatalogueEntry(ctx, d, res, *seed)
			if err != nil {
				fmt.Fprintf(os.Stderr, "%s degree %d, %d points: %v\n", s, d, p, err)
				continue
			}
			fmt.Fprintf(os.Stderr, "%s degree %d: %d points (published %d), %s, %d starts, %.1fs\n", s, d, e.Points, e.Published, e.Orbits, e.Starts, time.Since(t0).Seconds())
			old[d] = e
			found = true
			// Write as we go: a long run that is stopped keeps its degrees.
			if *out != "" {
				write(ctx, cat, old, *out, s, false)
			}
		}
	}
	write(ctx, cat, old, *out, s, *rebuild)
}

// write writes the catalogue of rules to out (standard output when empty),
// through a temporary file so that no partial catalogue is left.
func write(ctx context.Context, cat *element.Catalogue, rules map[int]element.CatalogueEntry, out string, s element.Shape, rebuild bool) {
	cat.Rules = cat.Rules[:0]
	for _, e := range rules {
		if rebuild {
			ne, err := element.RebuildEntry(ctx, s, e)
			if err != nil {
				fail(fmt.Errorf("rebuilding degree %d: %v", e.Degree, err))
			}
			e = ne
		}
		cat.Rules = append(cat.Rules, e)
	}
	sort.Slice(cat.Rules, func(i, j int) bool { return cat.Rules[i].Degree < cat.Rules[j].Degree })
	b, err := json.MarshalIndent(cat, "", " ")
	if err != nil {
		panic(err)
	}
	b = append(b, '\n')
	if out == "" {
		os.Stdout.Write(b)
		return
	}
	tmp := out + ".tmp"
	if err := os.WriteFile(tmp, b, 0o644); err != nil {
		fail(err)
	}
	if err := os.Rename(tmp, out); err != nil {
		fail(err)
	}
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "symcatalogue:", err)
	os.Exit(1)
}
