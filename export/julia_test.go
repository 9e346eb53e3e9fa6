package export

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"quadwright/precision"
)

// There is no Julia on the build machines, so the Julia export is checked
// by this small lexical check instead: comments stripped, brackets and
// do/end balanced, every number token a valid Float64 or Int literal, every
// string handed to parse(BigFloat, ...) a valid decimal, and no two
// operands side by side outside a matrix row. It catches what a writer can
// get wrong (a missing bracket, a malformed literal), not every Julia
// syntax error.
var juliaToken = regexp.MustCompile(`^(?:"[^"\\]*"|[A-Za-z_][A-Za-z0-9_]*|(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?|[-+*/=(),\[\];:]|\s+)`)

func checkJulia(src string) error {
	var stack []string
	for ln, line := range strings.Split(src, "\n") {
		if i := strings.Index(line, "#"); i >= 0 && !strings.Contains(line[:i], `"`) {
			line = line[:i]
		}
		prevParse := false
		for pos := 0; pos < len(line); {
			m := juliaToken.FindString(line[pos:])
			if m == "" {
				return fmt.Errorf("line %d: cannot read %q", ln+1, line[pos:])
			}
			pos += len(m)
			if pos < len(line) && isNumberToken(m) && (line[pos] == '.' || isLetter(line[pos])) {
				return fmt.Errorf("line %d: malformed number near %q", ln+1, m+line[pos:])
			}
			switch {
			case m == "(" || m == "[":
				stack = append(stack, m)
			case m == ")" || m == "]":
				want := map[string]string{")": "(", "]": "["}[m]
				if len(stack) == 0 || stack[len(stack)-1] != want {
					return fmt.Errorf("line %d: unbalanced %q", ln+1, m)
				}
				stack = stack[:len(stack)-1]
			case m == "do":
				stack = append(stack, "do")
			case m == "end":
				if len(stack) == 0 || stack[len(stack)-1] != "do" {
					return fmt.Errorf("line %d: end without do", ln+1)
				}
				stack = stack[:len(stack)-1]
			case isNumberToken(m):
				if _, err := strconv.ParseFloat(m, 64); err != nil {
					return fmt.Errorf("line %d: number %q: %v", ln+1, m, err)
				}
			case strings.HasPrefix(m, `"`):
				if prevParse {
					if _, err := precision.ParseNumber(strings.Trim(m, `"`)); err != nil {
						return fmt.Errorf("line %d: BigFloat string: %v", ln+1, err)
					}
				}
			}
			if strings.TrimSpace(m) != "" {
				prevParse = m == "BigFloat" || m == "," && prevParse
			}
		}
	}
	if len(stack) != 0 {
		return fmt.Errorf("unclosed %q at the end", stack[len(stack)-1])
	}
	return nil
}

func isNumberToken(s string) bool {
	return s != "" && (s[0] >= '0' && s[0] <= '9' || s[0] == '.' && len(s) > 1)
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' }
