// Command trianglecatalogue regenerates the embedded catalogue of fully
// symmetric triangle rules (design/element/catalogue/triangle.json):
//
//	go run ./design/element/cmd/trianglecatalogue -max-degree 20 -o design/element/catalogue/triangle.json
//
// For each degree it searches (element.SearchTriangle) at the published
// point count, then at one more point at a time up to the collapsed
// product rule's count (or the published count, if that is larger), polishes the first rule found to 40 digits,
// verifies it, and writes the catalogue. The search is deterministic for a
// given -seed. Degrees already in the file given by -keep are copied, not
// searched again. The committed catalogue was made by
//
//	go run ./design/element/cmd/trianglecatalogue -max-degree 19 -o design/element/catalogue/triangle.json
//	go run ./design/element/cmd/trianglecatalogue -keep design/element/catalogue/triangle.json -min-degree 20 -max-degree 20 -seed 2 -starts 10000 -o design/element/catalogue/triangle.json
//
// (seed 1 finds no 79-point rule of degree 20 in 4000 starts; seed 2 finds
// one after 2741).
package main

import (
	"context"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"sort"
	"time"

	"quadwright/design/element"
)

func main() {
	maxDeg := flag.Int("max-degree", 20, "highest degree to catalogue")
	minDeg := flag.Int("min-degree", 1, "lowest degree to catalogue")
	seed := flag.Uint64("seed", 1, "seed of the random starts")
	starts := flag.Int("starts", 4000, "starts per point count")
	out := flag.String("o", "", "catalogue file to write (default: standard output)")
	keep := flag.String("keep", "", "existing catalogue whose degrees are kept as they are")
	flag.Parse()
	ctx := context.Background()
	cat := element.Catalogue{Format: "quadwright-element-catalogue/1", Shape: "triangle",
		Regenerate: "go run ./design/element/cmd/trianglecatalogue -max-degree 19 -o design/element/catalogue/triangle.json && go run ./design/element/cmd/trianglecatalogue -keep design/element/catalogue/triangle.json -min-degree 20 -max-degree 20 -seed 2 -starts 10000 -o design/element/catalogue/triangle.json"}
	old := map[int]element.CatalogueEntry{}
	if *keep != "" {
		b, err := os.ReadFile(*keep)
		if err == nil {
			var c element.Catalogue
			if json.Unmarshal(b, &c) == nil {
				for _, e := range c.Rules {
					old[e.Degree] = e
				}
			}
		}
	}
	for d := *minDeg; d <= *maxDeg; d++ {
		if e, ok := old[d]; ok {
			cat.Rules = append(cat.Rules, e)
			continue
		}
		p := d + 1
		if d <= len(element.PublishedTriangle) {
			p = element.PublishedTriangle[d-1]
		}
		n := (d + 2) / 2
		t0 := time.Now()
		found := false
		for limit := max(n*n, p); p <= limit && !found; p++ {
			res, ok, err := element.SearchTriangle(ctx, d, p, *seed, *starts)
			if err != nil {
				fmt.Fprintln(os.Stderr, err)
				os.Exit(1)
			}
			if !ok {
				fmt.Fprintf(os.Stderr, "degree %d: no rule of %d points in %d starts\n", d, p, res.Starts)
				continue
			}
			e, err := element.NewCatalogueEntry(ctx, d, res, *seed)
			if err != nil {
				fmt.Fprintf(os.Stderr, "degree %d, %d points: %v\n", d, p, err)
				continue
			}
			fmt.Fprintf(os.Stderr, "degree %d: %d points (published %d), %+v, %d starts, %.1fs\n", d, e.Points, e.Published, e.Structure, e.Starts, time.Since(t0).Seconds())
			cat.Rules = append(cat.Rules, e)
			found = true
		}
	}
	for d, e := range old {
		if d < *minDeg || d > *maxDeg {
			cat.Rules = append(cat.Rules, e)
		}
	}
	sort.Slice(cat.Rules, func(i, j int) bool { return cat.Rules[i].Degree < cat.Rules[j].Degree })
	b, err := json.MarshalIndent(&cat, "", " ")
	if err != nil {
		panic(err)
	}
	b = append(b, '\n')
	if *out == "" {
		os.Stdout.Write(b)
		return
	}
	tmp := *out + ".tmp"
	if err := os.WriteFile(tmp, b, 0o644); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	if err := os.Rename(tmp, *out); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}
