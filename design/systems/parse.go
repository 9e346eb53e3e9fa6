package systems

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"quadwright/moments"
)

// Function is one function of a system: the expanded expression as the
// rule file records it, and its parse in x.
type Function struct {
	Source string
	Expr   *moments.Expr
}

// Limits on what one list may expand to: a rule of more than
// MaxFunctions/2 points is beyond what the dense Newton solver serves.
const (
	MaxFunctions = 400
	maxListLen   = 100000
)

// ParseFunctions reads a function list: comma-separated expressions in x in
// the weight-expression syntax (moments.ParseExpr), where the identifier k
// stands for an integer index, optionally followed by "; k=A..B" with
// integers A <= B. With the range clause every template is expanded for
// k = A, ..., B in that order (all templates at k = A, then all at A+1,
// ...), by putting the integer in place of k (in parentheses when
// negative); without it, a k anywhere is refused. Every expanded function
// is parsed in x alone. ParseFunctions never panics; an error is one
// sentence naming the template or the clause.
func ParseFunctions(list string) ([]Function, error) {
	if len(list) > maxListLen {
		return nil, fmt.Errorf("function list: longer than %d characters", maxListLen)
	}
	body, clause, hasClause := strings.Cut(list, ";")
	lo, hi := 0, 0
	if hasClause {
		var err error
		if lo, hi, err = parseRange(clause); err != nil {
			return nil, err
		}
	}
	var templates []string
	for _, t := range strings.Split(body, ",") {
		t = strings.TrimSpace(t)
		if t == "" {
			return nil, fmt.Errorf("function list %q: an empty function (two commas, or a comma at an end)", cut(list))
		}
		if _, err := moments.ParseExpr(t, "x", "k"); err != nil {
			return nil, fmt.Errorf("function %q: %v", cut(t), err)
		}
		if !hasClause && mentionsK(t) {
			return nil, fmt.Errorf("function %q uses the index k but the list has no range clause such as \"; k=0..7\"", cut(t))
		}
		templates = append(templates, t)
	}
	if !hasClause {
		lo, hi = 0, 0
	}
	if n := int64(hi-lo+1) * int64(len(templates)); n > MaxFunctions {
		return nil, fmt.Errorf("function list %q expands to %d functions, more than the %d served", cut(list), n, MaxFunctions)
	}
	var out []Function
	for k := lo; k <= hi; k++ {
		for _, t := range templates {
			src := t
			if hasClause {
				src = substituteK(t, k)
			}
			e, err := moments.ParseExpr(src, "x")
			if err != nil {
				return nil, fmt.Errorf("function %q at k = %d: %v", cut(t), k, err)
			}
			out = append(out, Function{Source: src, Expr: e})
		}
	}
	return out, nil
}

// parseRange reads " k=A..B" with integers |A|, |B| <= MaxFunctions.
func parseRange(clause string) (int, int, error) {
	c := strings.TrimSpace(clause)
	name, rng, ok := strings.Cut(c, "=")
	if !ok || strings.TrimSpace(name) != "k" {
		return 0, 0, fmt.Errorf("range clause %q: write it as \"k=A..B\"", cut(c))
	}
	a, b, ok := strings.Cut(rng, "..")
	if !ok {
		return 0, 0, fmt.Errorf("range clause %q: write the range as A..B with integers A <= B", cut(c))
	}
	lo, err1 := strconv.Atoi(strings.TrimSpace(a))
	hi, err2 := strconv.Atoi(strings.TrimSpace(b))
	switch {
	case err1 != nil || err2 != nil:
		return 0, 0, fmt.Errorf("range clause %q: the ends must be whole numbers", cut(c))
	case lo > hi:
		return 0, 0, fmt.Errorf("range clause %q: the range is empty (%d > %d)", cut(c), lo, hi)
	case lo < -MaxFunctions || hi > MaxFunctions:
		return 0, 0, fmt.Errorf("range clause %q: the ends must lie within -%d..%d", cut(c), MaxFunctions, MaxFunctions)
	}
	return lo, hi, nil
}

// identifiers calls do for every maximal run of letters, digits and '_'
// that starts with a letter or '_', with its byte offsets. A run starting
// with a digit belongs to a number (including the exponent of "1e5").
func identifiers(s string, do func(i, j int)) {
	for i := 0; i < len(s); {
		c := s[i]
		word := c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z'
		num := '0' <= c && c <= '9' || c == '.'
		if !word && !num {
			i++
			continue
		}
		j := i + 1
		for j < len(s) && (s[j] == '_' || s[j] == '.' && num || 'a' <= s[j] && s[j] <= 'z' || 'A' <= s[j] && s[j] <= 'Z' || '0' <= s[j] && s[j] <= '9' ||
			num && (s[j] == '+' || s[j] == '-') && (s[j-1] == 'e' || s[j-1] == 'E')) {
			j++
		}
		if word {
			do(i, j)
		}
		i = j
	}
}

func mentionsK(t string) bool {
	found := false
	identifiers(t, func(i, j int) { found = found || t[i:j] == "k" })
	return found
}

func substituteK(t string, k int) string {
	val := strconv.Itoa(k)
	if k < 0 {
		val = "(" + val + ")"
	}
	var b strings.Builder
	last := 0
	identifiers(t, func(i, j int) {
		if t[i:j] == "k" {
			b.WriteString(t[last:i])
			b.WriteString(val)
			last = j
		}
	})
	b.WriteString(t[last:])
	return b.String()
}

// ReadFunctionsFile reads one function list per line (text after '#' is a
// comment, blank lines are skipped) and returns their functions in order.
func ReadFunctionsFile(path string) ([]Function, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("--functions-file: %v", err)
	}
	defer f.Close()
	return ParseFunctionsReader(f, path)
}

// ParseFunctionsReader is ReadFunctionsFile on r, with name in messages.
func ParseFunctionsReader(r io.Reader, name string) ([]Function, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 0, 4096), maxListLen+1)
	var out []Function
	line := 0
	for sc.Scan() {
		line++
		s, _, _ := strings.Cut(sc.Text(), "#")
		if strings.TrimSpace(s) == "" {
			continue
		}
		fs, err := ParseFunctions(s)
		if err != nil {
			return nil, fmt.Errorf("%s, line %d: %v", name, line, err)
		}
		out = append(out, fs...)
		if len(out) > MaxFunctions {
			return nil, fmt.Errorf("%s: more than %d functions", name, MaxFunctions)
		}
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("%s, line %d: %v", name, line+1, err)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("%s: no function in the file", name)
	}
	return out, nil
}

func cut(s string) string {
	if len(s) > 60 {
		return s[:60] + "..."
	}
	return s
}
