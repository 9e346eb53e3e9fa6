package export

import (
	"strings"

	"quadwright/rulefile"
)

// writeCSV writes the rule as the CSV of `quadwright build --format csv`:
// a header line "node,weight" (element rules "x,y[,z],weight"), then one
// line per node with every digit of every value. It carries no comment
// lines, so that any CSV reader takes it; the provenance stays in the rule
// file.
func writeCSV(b *strings.Builder, t *table) error {
	b.WriteString(strings.Join(t.coordNames(), ",") + ",weight\n")
	for i, n := range t.nodes {
		for _, c := range n {
			b.WriteString(c.plain() + ",")
		}
		b.WriteString(t.weights[i].plain() + "\n")
	}
	return nil
}

// writeJSON writes the rule file itself, normalised: indented, keys in the
// contract's order, every number spelled in one canonical decimal form with
// all its digits (exact fractions p/q of a table as decimals of at least 40
// digits), "points" set to the number of nodes. A rule read from a plain
// table, which records no digit count, gets "digits" set to its largest
// number of significant digits, or, when it held fractions, to the digits
// they were written with.
func writeJSON(b *strings.Builder, t *table) error {
	g := *t.f
	g.Points = t.points()
	g.Nodes = make([]rulefile.Node, len(t.nodes))
	g.Weights = make([]string, len(t.weights))
	for i, n := range t.nodes {
		g.Nodes[i] = make(rulefile.Node, len(n))
		for c, l := range n {
			g.Nodes[i][c] = l.plain()
		}
		g.Weights[i] = t.weights[i].plain()
	}
	if g.Provenance == nil && g.Digits == 0 {
		g.Digits = t.digits
		if t.fracDigits > 0 {
			g.Digits = t.fracDigits
		}
	}
	if g.Format == "" {
		g.Format = rulefile.FormatName
	}
	data, err := g.MarshalIndent()
	if err != nil {
		return err
	}
	b.Write(data)
	return nil
}
