package export

import (
	"fmt"
	"strings"
)

// writeC writes a C11 header: static const double arrays holding the
// nearest double to every value, and, when the rule has more than 17
// digits, long double arrays (suffix L) and __float128 arrays (suffix Q,
// a GNU extension, guarded by __SIZEOF_FLOAT128__) whose literals carry
// every digit. How many of those digits a long double keeps depends on the
// platform (x86-64: 64-bit significand, about 19 digits; aarch64 Linux:
// binary128, 34 digits).
func writeC(b *strings.Builder, t *table) error {
	vars := t.varLines("arrays", t.pair("")+" (double)",
		t.pair("_ld")+" (long double) and "+t.pair("_q")+" (__float128): every digit", t.cLayout())
	comment(b, "// ", t.headerLines(vars))
	guard := strings.ToUpper(t.name) + "_RULE_H"
	fmt.Fprintf(b, "\n#ifndef %s\n#define %s\n\n", guard, guard)
	if t.dim > 1 {
		fmt.Fprintf(b, "enum { %s_points = %d, %s_dim = %d };\n\n", t.name, t.points(), t.name, t.dim)
	} else {
		fmt.Fprintf(b, "enum { %s_points = %d };\n\n", t.name, t.points())
	}
	t.cArrays(b, "static const double", "", "", literal.double)
	if t.extended {
		t.cArrays(b, "static const long double", "_ld", "L", literal.float)
		b.WriteString("#ifdef __SIZEOF_FLOAT128__\n")
		t.cArrays(b, "static const __float128", "_q", "Q", literal.float)
		b.WriteString("#endif\n\n")
	}
	fmt.Fprintf(b, "#endif /* %s */\n", guard)
	return nil
}

// writeCPP writes a C++17 header: constexpr std::array<double, N> (and, for
// more than 17 digits, std::array<long double, N> with every digit).
func writeCPP(b *strings.Builder, t *table) error {
	vars := t.varLines("arrays", t.pair("")+" (double)", t.pair("_ld")+" (long double): every digit", t.cLayout())
	comment(b, "// ", t.headerLines(vars))
	b.WriteString("\n#pragma once\n\n#include <array>\n#include <cstddef>\n\n")
	fmt.Fprintf(b, "inline constexpr std::size_t %s_points = %d;\n", t.name, t.points())
	if t.dim > 1 {
		fmt.Fprintf(b, "inline constexpr std::size_t %s_dim = %d;\n", t.name, t.dim)
	}
	b.WriteString("\n")
	t.cppArrays(b, "double", "", "", literal.double)
	if t.extended {
		t.cppArrays(b, "long double", "_ld", "L", literal.float)
	}
	return nil
}

// pair names the node and weight arrays with suffix.
func (t *table) pair(suffix string) string {
	return t.name + "_nodes" + suffix + ", " + t.name + "_weights" + suffix
}

// cLayout says how multi-coordinate nodes are laid out in C and C++.
func (t *table) cLayout() string {
	return fmt.Sprintf("node i is %s_nodes[i] = {%s}", t.name, strings.Join(t.coordNames(), ", "))
}

func (t *table) cArrays(b *strings.Builder, decl, suffix, litSuffix string, spell func(literal) string) {
	if t.dim == 1 {
		fmt.Fprintf(b, "%s %s_nodes%s[%d] = {\n", decl, t.name, suffix, t.points())
		for _, n := range t.nodes {
			fmt.Fprintf(b, "    %s%s,\n", spell(n[0]), litSuffix)
		}
	} else {
		fmt.Fprintf(b, "%s %s_nodes%s[%d][%d] = {\n", decl, t.name, suffix, t.points(), t.dim)
		for _, n := range t.nodes {
			fmt.Fprintf(b, "    {%s},\n", joinLits(n, spell, litSuffix))
		}
	}
	b.WriteString("};\n")
	fmt.Fprintf(b, "%s %s_weights%s[%d] = {\n", decl, t.name, suffix, t.points())
	for _, w := range t.weights {
		fmt.Fprintf(b, "    %s%s,\n", spell(w), litSuffix)
	}
	b.WriteString("};\n\n")
}

func (t *table) cppArrays(b *strings.Builder, typ, suffix, litSuffix string, spell func(literal) string) {
	elem := typ
	if t.dim > 1 {
		elem = fmt.Sprintf("std::array<%s, %d>", typ, t.dim)
	}
	fmt.Fprintf(b, "inline constexpr std::array<%s, %d> %s_nodes%s{{\n", elem, t.points(), t.name, suffix)
	for _, n := range t.nodes {
		if t.dim == 1 {
			fmt.Fprintf(b, "    %s%s,\n", spell(n[0]), litSuffix)
		} else {
			fmt.Fprintf(b, "    {{%s}},\n", joinLits(n, spell, litSuffix))
		}
	}
	b.WriteString("}};\n")
	fmt.Fprintf(b, "inline constexpr std::array<%s, %d> %s_weights%s{{\n", typ, t.points(), t.name, suffix)
	for _, w := range t.weights {
		fmt.Fprintf(b, "    %s%s,\n", spell(w), litSuffix)
	}
	b.WriteString("}};\n\n")
}

func joinLits(ls []literal, spell func(literal) string, suffix string) string {
	parts := make([]string, len(ls))
	for i, l := range ls {
		parts[i] = spell(l) + suffix
	}
	return strings.Join(parts, ", ")
}
