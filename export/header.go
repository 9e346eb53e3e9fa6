package export

import (
	"quadwright/rulefile"

	"encoding/json"
	"fmt"
	"strings"
)

// caution is the one line every exported rule carries.
const caution = "Caution: verify in the target code; applicable codes and licensed engineering practice govern."

// headerLines is the provenance of the rule, one fact a line, without
// comment markers: what the rule is for, how it was made and checked, who
// exported it, and what the arrays below hold. vars describes the arrays
// (language specific). Every line is free of control characters, so a
// line comment cannot be ended early by text from the rule file.
func (t *table) headerLines(vars []string) []string {
	f := t.f
	kind := f.Kind
	if kind == "" || kind == "unknown" {
		kind = "quadrature"
	}
	lines := []string{fmt.Sprintf("%s rule exported by %s", kind, t.program())}
	if t.opt.Source != "" {
		lines = append(lines, "source:   "+t.opt.Source)
	}
	measure := f.Measure
	if measure == "" {
		measure = "not recorded"
	}
	if f.Weight != "" {
		measure += ", weight " + f.Weight
	}
	lines = append(lines, "measure:  "+measure, "domain:   "+domainText(f))
	lines = append(lines, fmt.Sprintf("points:   %d", t.points()))
	if f.Degree >= 0 && f.Provenance != nil {
		lines = append(lines, fmt.Sprintf("degree:   %d (degree of exactness verified on the printed values)", f.Degree))
	} else if f.Degree >= 0 {
		lines = append(lines, fmt.Sprintf("degree:   %d (as the rule file states)", f.Degree))
	} else {
		lines = append(lines, "degree:   not recorded (audit the rule to learn it)")
	}
	switch {
	case f.Digits > 0:
		lines = append(lines, fmt.Sprintf("digits:   %d significant, each value within one unit of its last digit", f.Digits))
	case f.Provenance != nil && !t.extended:
		lines = append(lines, "digits:   float64 mode, each value the nearest double to the true value")
	default:
		lines = append(lines, fmt.Sprintf("digits:   up to %d significant, as written in the rule table", t.digits))
	}
	if r := reportSummary(f.Report); r != "" {
		lines = append(lines, "report:   "+r)
	}
	if p := f.Provenance; p != nil {
		lines = append(lines, fmt.Sprintf("built by: %s (%s; %d bits, confirmed at %d bits)", p.Program, p.Method, p.WorkingPrecision, p.CheckPrecision))
	}
	for _, v := range vars {
		if v != "" {
			lines = append(lines, v)
		}
	}
	lines = append(lines, caution)
	for i, l := range lines {
		lines[i] = sanitize(l)
	}
	return lines
}

func (t *table) program() string {
	if t.opt.Program == "" {
		return "quadwright"
	}
	return t.opt.Program
}

func domainText(f *rulefile.File) string {
	d := f.Domain
	shape := d.Shape
	if shape == "" {
		shape = "interval"
	}
	switch {
	case len(d.Interval) == 2:
		return fmt.Sprintf("%s [%s, %s]", shape, d.Interval[0], d.Interval[1])
	case len(d.Vertices) > 0:
		vs := make([]string, len(d.Vertices))
		for i, v := range d.Vertices {
			vs[i] = "(" + strings.Join(v, ",") + ")"
		}
		return shape + " with vertices " + strings.Join(vs, " ")
	}
	return shape + " (ends not recorded)"
}

// reportSummary picks the audit figures out of a rule file's report, when
// it has them: negative weights, stability factor, nodes outside, lost digits.
func reportSummary(raw json.RawMessage) string {
	if len(raw) == 0 {
		return ""
	}
	var m map[string]json.RawMessage
	if json.Unmarshal(raw, &m) != nil {
		return ""
	}
	var parts []string
	for _, k := range []struct{ key, label string }{
		{"negative_weights", "negative weights"},
		{"stability_factor", "stability factor"},
		{"nodes_outside", "nodes outside"},
		{"lost_digits", "lost digits"},
	} {
		v, ok := m[k.key]
		if !ok {
			continue
		}
		var s string
		if json.Unmarshal(v, &s) != nil {
			s = string(v)
		}
		parts = append(parts, fmt.Sprintf("%s %s", k.label, s))
	}
	return strings.Join(parts, ", ")
}

// sanitize replaces control characters (a newline would end a line
// comment) by spaces, "*/" by "* /" for block-comment readers, and keeps a
// line from ending in a backslash.
func sanitize(s string) string {
	s = strings.Map(func(r rune) rune {
		if r < 0x20 || r == 0x7f || r == 0x2028 || r == 0x2029 || r == 0x85 {
			return ' '
		}
		return r
	}, s)
	// A backslash (or the trigraph ??/ that C11 reads as one) at the end
	// of a // comment would splice the next line into the comment.
	s = strings.NewReplacer("*/", "* /", "??", "? ?").Replace(strings.TrimRight(s, " "))
	if strings.HasSuffix(s, "\\") {
		s += "."
	}
	return s
}

// comment writes lines with a comment marker.
func comment(b *strings.Builder, marker string, lines []string) {
	for _, l := range lines {
		if l == "" {
			b.WriteString(strings.TrimRight(marker, " ") + "\n")
			continue
		}
		b.WriteString(marker + l + "\n")
	}
}

// varLines describes the arrays of an export for its header: what they are
// called ("arrays", "lists"), the float64 ones (plain), the extended ones
// with what they hold (ext, shown only for a rule that has them), and, for
// element rules, how a node is laid out.
func (t *table) varLines(what, plain, ext, layout string) []string {
	v := []string{fmt.Sprintf("%-9s %s: the nearest double to each value", what+":", plain)}
	if t.extended {
		v = append(v, "          "+ext)
	}
	if t.dim > 1 {
		v = append(v, "layout:   "+layout)
	}
	return v
}
