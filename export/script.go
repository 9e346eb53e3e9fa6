package export

import (
	"fmt"
	"math"
	"strings"
)

// writePython writes a Python module: NAME_nodes and NAME_weights as lists
// of floats (the nearest double to every value; element rules as tuples)
// and, for more than 17 digits, NAME_nodes_str and NAME_weights_str with
// every digit as strings (ready for mpmath.mpf) and the same as
// decimal.Decimal lists (NAME_nodes_decimal, NAME_weights_decimal), which
// hold the strings exactly whatever the decimal context.
func writePython(b *strings.Builder, t *table) error {
	vars := t.varLines("lists", t.pair("")+" (floats)",
		t.pair("_str")+": every digit as strings (mpmath.mpf(s) reads them); "+t.pair("_decimal")+": the same as exact decimal.Decimal values",
		fmt.Sprintf("%s_nodes[i] = (%s) is node i", t.name, strings.Join(t.coordNames(), ", ")))
	comment(b, "# ", t.headerLines(vars))
	if t.extended {
		b.WriteString("\nfrom decimal import Decimal\n")
	}
	fmt.Fprintf(b, "\n%s_points = %d\n\n", t.name, t.points())
	t.pythonLists(b, "", literal.double)
	if t.extended {
		t.pythonLists(b, "_str", func(l literal) string { return `"` + l.plain() + `"` })
		for _, which := range []string{"nodes", "weights"} {
			conv := "Decimal(s)"
			if which == "nodes" && t.dim > 1 {
				conv = "tuple(Decimal(c) for c in s)"
			}
			fmt.Fprintf(b, "%s_%s_decimal = [%s for s in %s_%s_str]\n", t.name, which, conv, t.name, which)
		}
	}
	return nil
}

func (t *table) pythonLists(b *strings.Builder, suffix string, spell func(literal) string) {
	fmt.Fprintf(b, "%s_nodes%s = [\n", t.name, suffix)
	for _, n := range t.nodes {
		if t.dim == 1 {
			fmt.Fprintf(b, "    %s,\n", spell(n[0]))
		} else {
			fmt.Fprintf(b, "    (%s),\n", joinLits(n, spell, ""))
		}
	}
	fmt.Fprintf(b, "]\n\n%s_weights%s = [\n", t.name, suffix)
	for _, w := range t.weights {
		fmt.Fprintf(b, "    %s,\n", spell(w))
	}
	b.WriteString("]\n\n")
}

// writeJulia writes Julia constants: NAME_nodes and NAME_weights as
// Float64 vectors (element rules: a points x dim matrix, node i in row i)
// and, for more than 17 digits, NAME_nodes_big and NAME_weights_big parsed
// from every digit as BigFloat at a precision of the digits plus 16 bits
// (setprecision is scoped to their construction).
func writeJulia(b *strings.Builder, t *table) error {
	vars := t.varLines("vectors", t.pair("")+" (Float64)", t.pair("_big")+" (BigFloat): parsed from every digit",
		fmt.Sprintf("%s_nodes[i, :] = (%s) is node i", t.name, strings.Join(t.coordNames(), ", ")))
	comment(b, "# ", t.headerLines(vars))
	fmt.Fprintf(b, "\nconst %s_points = %d\n\n", t.name, t.points())
	t.juliaArrays(b, "", "", literal.double)
	if t.extended {
		digits := max(t.digits, t.fracDigits)
		bits := int(math.Ceil(float64(digits)*math.Log2(10))) + 16
		fmt.Fprintf(b, "const %s_nodes_big, %s_weights_big = setprecision(BigFloat, %d) do\n", t.name, t.name, bits)
		t.juliaArrays(b, "    ", "BigFloat", func(l literal) string { return `parse(BigFloat, "` + l.plain() + `")` })
		b.WriteString("    nodes, weights\nend\n")
	}
	return nil
}

// juliaArrays writes the two arrays; with elem set (inside a do block)
// they are local "nodes" and "weights" typed by elem, else constants.
func (t *table) juliaArrays(b *strings.Builder, indent, elem string, spell func(literal) string) {
	nodes, weights := "const "+t.name+"_nodes", "const "+t.name+"_weights"
	if elem != "" {
		nodes, weights = "nodes", "weights"
	}
	sep := ","
	if t.dim > 1 {
		sep = ""
	}
	fmt.Fprintf(b, "%s%s = %s[\n", indent, nodes, elem)
	for _, n := range t.nodes {
		parts := make([]string, len(n))
		for i, c := range n {
			parts[i] = spell(c)
		}
		fmt.Fprintf(b, "%s    %s%s\n", indent, strings.Join(parts, " "), sep)
	}
	fmt.Fprintf(b, "%s]\n", indent)
	fmt.Fprintf(b, "%s%s = %s[\n", indent, weights, elem)
	for _, w := range t.weights {
		fmt.Fprintf(b, "%s    %s,\n", indent, spell(w))
	}
	fmt.Fprintf(b, "%s]\n", indent)
	if elem == "" {
		b.WriteString("\n")
	}
}
