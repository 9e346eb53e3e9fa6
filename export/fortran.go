package export

import (
	"fmt"
	"math"
	"strings"
)

// Fortran free-form limits (ISO/IEC 1539-1:2010, 6.3.2): 132 characters a
// line, 255 continuation lines a statement.
const (
	fortranLine          = 131
	fortranContinuations = 255
)

// writeFortran writes a free-form module NAME_rule with real64 parameter
// arrays (the nearest double to every value) and, for more than 17 digits,
// real128 arrays whose literals carry every digit; kinds come from
// iso_fortran_env. Element rules hold NAME_nodes(dim, points), node i in
// column i. An array whose constructor would need more than 255
// continuation lines is declared protected and filled by one data
// statement per node instead, which no line limit constrains.
func writeFortran(b *strings.Builder, t *table) error {
	vars := t.varLines("arrays", t.pair("")+" (real64)", t.pair("_q")+" (real128): every digit",
		fmt.Sprintf("%s_nodes(:, i) = (%s) is node i", t.name, strings.Join(t.coordNames(), ", ")))
	if k := t.subnormals(); k > 0 {
		vars = append(vars, fmt.Sprintf("note:     %d values lie below the normal real64 range; gfortran warns (-Wunderflow) about their literals and may flush the smallest to 0", k))
	}
	comment(b, "! ", t.headerLines(vars))
	kinds := "real64"
	if t.extended {
		kinds += ", real128"
	}
	fmt.Fprintf(b, "\nmodule %s_rule\n  use iso_fortran_env, only: %s\n  implicit none\n  private\n\n", t.name, kinds)
	fmt.Fprintf(b, "  integer, parameter, public :: %s_points = %d\n", t.name, t.points())
	if t.dim > 1 {
		fmt.Fprintf(b, "  integer, parameter, public :: %s_dim = %d\n", t.name, t.dim)
	}
	b.WriteString("\n")
	t.fortranArrays(b, "real64", "", literal.double)
	if t.extended {
		t.fortranArrays(b, "real128", "_q", literal.float)
	}
	fmt.Fprintf(b, "end module %s_rule\n", t.name)
	return nil
}

func (t *table) fortranArrays(b *strings.Builder, kind, suffix string, spell func(literal) string) {
	lit := func(l literal) string { return spell(l) + "_" + kind }
	nodes := make([]string, 0, t.points()*t.dim)
	for _, n := range t.nodes {
		for _, c := range n {
			nodes = append(nodes, lit(c))
		}
	}
	weights := make([]string, t.points())
	for i, w := range t.weights {
		weights[i] = lit(w)
	}
	shape := fmt.Sprintf("(%d)", t.points())
	if t.dim > 1 {
		shape = fmt.Sprintf("(%d, %d)", t.dim, t.points())
	}
	fortranArray(b, kind, t.name+"_nodes"+suffix, shape, t.dim, nodes)
	fortranArray(b, kind, t.name+"_weights"+suffix, fmt.Sprintf("(%d)", t.points()), 1, weights)
	b.WriteString("\n")
}

// fortranArray declares name with the given shape and values (column
// order), as a parameter when the statement fits the continuation limit.
func fortranArray(b *strings.Builder, kind, name, shape string, dim int, values []string) {
	open := fmt.Sprintf("  real(%s), parameter, public :: %s%s = ", kind, name, shape)
	if dim > 1 {
		open += "reshape(["
	} else {
		open += "["
	}
	closing := "]"
	if dim > 1 {
		closing = fmt.Sprintf("], [%s])", strings.Trim(shape, "()"))
	}
	body := fortranLines("    ", values, closing)
	if len(body) <= fortranContinuations {
		b.WriteString(open + "&\n" + strings.Join(body, "\n") + "\n")
		return
	}
	fmt.Fprintf(b, "  real(%s), public, protected :: %s%s\n", kind, name, shape)
	for i := 0; i < len(values); i += dim {
		target := fmt.Sprintf("%s(%d)", name, i+1)
		if dim > 1 {
			target = fmt.Sprintf("%s(1:%d, %d)", name, dim, i/dim+1)
		}
		lines := fortranLines("    ", values[i:i+dim], "/")
		b.WriteString("  data " + target + " / &\n" + strings.Join(lines, "\n") + "\n")
	}
}

// fortranLines packs comma-separated values into lines of at most
// fortranLine characters, the last value followed by closing; every line
// but the last ends with the continuation mark. A value too long for one
// line is split inside the token, the next line starting with '&' (free
// form's token continuation).
func fortranLines(indent string, values []string, closing string) []string {
	var lines []string
	cur := indent
	room := fortranLine - 2 // keep space for " &"
	for i, v := range values {
		item := v + ","
		if i == len(values)-1 {
			item = v + closing
		}
		if cur != indent && len(cur)+1+len(item) > room {
			lines = append(lines, cur+" &")
			cur = indent
		}
		if cur != indent {
			cur += " "
		}
		for len(cur)+len(item) > room {
			cut := room - len(cur)
			lines = append(lines, cur+item[:cut]+"&")
			cur = indent + "&"
			item = item[cut:]
		}
		cur += item
	}
	return append(lines, cur)
}

// subnormals counts the values whose nearest double is subnormal.
func (t *table) subnormals() int {
	k := 0
	count := func(l literal) {
		if l.f64 != 0 && math.Abs(l.f64) < 0x1p-1022 {
			k++
		}
	}
	for i, n := range t.nodes {
		for _, c := range n {
			count(c)
		}
		count(t.weights[i])
	}
	return k
}
