package rulefile

import (
	"fmt"
	"strconv"
	"strings"
)

// A source file written by `quadwright export` (C, C++, Fortran, Go,
// Python, Julia) is read back from what the exporter itself writes: its
// header comment (the "exported by quadwright" line, measure, domain,
// points and the names of the arrays) and the literal lists of the pair of
// arrays that carries every digit (or the only pair, in float64 mode).
// Nothing is compiled or evaluated: the lists are scanned for numbers and
// quoted decimals, and their counts must be exactly those the header
// announces.

// exportMark is how every exported header's first line ends.
const exportMark = " exported by quadwright"

// isExport reports whether data begins with an exporter's header.
func isExport(data []byte) bool {
	head := data[:min(len(data), 4096)]
	for _, line := range strings.Split(string(head), "\n") {
		c, ok := commentText(line)
		if !ok {
			if strings.TrimSpace(line) == "" {
				continue
			}
			return false
		}
		if i := strings.Index(c, exportMark); i > 0 && strings.HasSuffix(strings.TrimSpace(c[:i]), "rule") {
			return true
		}
	}
	return false
}

// commentText returns the text of a comment line in any of the export
// languages ("//", "#", "!").
func commentText(line string) (string, bool) {
	t := strings.TrimSpace(line)
	for _, p := range []string{"//", "#", "!"} {
		if rest, ok := strings.CutPrefix(t, p); ok {
			return rest, true
		}
	}
	return "", false
}

// exportHeader is what parseExport takes from the header.
type exportHeader struct {
	points, dim    int
	shape, weight  string
	interval       []string
	pairs          [][2]string // array names, nodes then weights
	everyDigitPair int         // index into pairs of the first pair said to carry every digit, or -1
	bodyStart      int         // byte offset where the header ends
}

func parseExport(name string, data []byte) (*File, error) {
	h, err := readExportHeader(name, data)
	if err != nil {
		return nil, err
	}
	pick := 0
	if h.everyDigitPair >= 0 {
		pick = h.everyDigitPair
	}
	body := string(data[h.bodyStart:])
	nodesName, weightsName := h.pairs[pick][0], h.pairs[pick][1]
	nodeVals, end, err := literalList(body, nodesName, 0, h.points*h.dim)
	if err != nil {
		return nil, fmt.Errorf("rule file %s: %s: %v", name, nodesName, err)
	}
	weightVals, _, err := literalList(body, weightsName, end, h.points)
	if err != nil {
		return nil, fmt.Errorf("rule file %s: %s: %v", name, weightsName, err)
	}
	f := &File{Format: FormatName, Kind: "unknown", Points: h.points, Degree: -1, Weight: h.weight}
	if h.shape != "" {
		f.Domain.Shape = h.shape
	} else {
		f.Domain.Shape = "interval"
		f.Domain.Interval = h.interval
	}
	for i := 0; i < h.points; i++ {
		f.Nodes = append(f.Nodes, Node(nodeVals[i*h.dim:(i+1)*h.dim]))
	}
	f.Weights = weightVals
	return f, nil
}

func readExportHeader(name string, data []byte) (*exportHeader, error) {
	h := &exportHeader{everyDigitPair: -1, dim: 1}
	lines := strings.SplitAfter(string(data), "\n")
	off, key := 0, ""
	for _, raw := range lines {
		c, ok := commentText(raw)
		if !ok {
			if strings.TrimSpace(raw) == "" {
				off += len(raw)
				continue
			}
			break
		}
		off += len(raw)
		k, v, found := strings.Cut(c, ":")
		if found && strings.TrimSpace(k) != "" && !strings.ContainsAny(strings.TrimSpace(k), " ()") {
			key = strings.TrimSpace(k)
		} else {
			v = c // a continuation line of the previous key
		}
		v = strings.TrimSpace(v)
		switch key {
		case "points":
			f := strings.Fields(v)
			if len(f) > 0 {
				h.points, _ = strconv.Atoi(f[0])
			}
		case "measure":
			if i := strings.LastIndex(v, ", weight "); i >= 0 {
				h.weight = strings.TrimSpace(v[i+len(", weight "):])
			}
		case "domain":
			if iv, ok := strings.CutPrefix(v, "interval ["); ok {
				ends := strings.Split(strings.TrimSuffix(strings.TrimSuffix(iv, ")"), "]"), ",")
				if len(ends) == 2 && isFinite(strings.TrimSpace(ends[0])) && isFinite(strings.TrimSpace(ends[1])) {
					h.interval = []string{strings.TrimSpace(ends[0]), strings.TrimSpace(ends[1])}
				}
			} else if sh, _, ok := strings.Cut(v, " with vertices"); ok {
				h.shape = strings.TrimSpace(sh)
			}
		case "arrays", "lists", "vars", "vectors":
			h.readPairs(v)
		}
	}
	h.bodyStart = off
	switch {
	case h.points < 1:
		return nil, fmt.Errorf("rule file %s: an exported rule whose header gives no \"points\"", name)
	case len(h.pairs) == 0:
		return nil, fmt.Errorf("rule file %s: an exported rule whose header names no arrays of nodes and weights", name)
	}
	if h.shape != "" {
		h.dim = exportDim(string(data[h.bodyStart:]), h.shape)
		if h.dim == 0 {
			return nil, fmt.Errorf("rule file %s: domain %q is not an element quadwright knows", name, h.shape)
		}
	}
	return h, nil
}

// readPairs takes the array names of one description: consecutive
// identifiers naming nodes and then weights.
func (h *exportHeader) readPairs(v string) {
	ids := strings.FieldsFunc(v, func(r rune) bool {
		return !(r == '_' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9')
	})
	// The every-digit pair is the first one after the text that says so
	// in this line (C: "... (double): the nearest double" on one line,
	// "..._ld, ..._ld (long double) ...: every digit" on the next).
	every := strings.Contains(v, "every digit")
	for i := 0; i+1 < len(ids); i++ {
		a, b := strings.ToLower(ids[i]), strings.ToLower(ids[i+1])
		if strings.Contains(a, "node") && strings.Contains(b, "weight") {
			if every && h.everyDigitPair < 0 {
				h.everyDigitPair = len(h.pairs)
			}
			h.pairs = append(h.pairs, [2]string{ids[i], ids[i+1]})
			i++
		}
	}
}

// exportDim is the number of coordinates of a node on the named element.
func exportDim(_ string, shape string) int {
	switch strings.ToLower(shape) {
	case "line":
		return 1
	case "triangle", "quadrilateral":
		return 2
	case "tetrahedron", "hexahedron", "prism", "pyramid":
		return 3
	}
	return 0
}

// literalList finds the list of the array name in body at or after from:
// the first opening bracket after the name that is not a dimension or
// type ("[6]", "[]", "[2]"), and from it every number and quoted decimal
// to its matching close. It returns exactly want values, and the offset
// just after the list; another count is an error.
func literalList(body, name string, from, want int) ([]string, int, error) {
	at := wordIndex(body, name, from)
	if at < 0 {
		// A pair assigned at once (Julia: "a, b = ... do; nodes = [...];
		// weights = [...]"): the weights are the next list.
		if from == 0 {
			return nil, 0, fmt.Errorf("not found in the file")
		}
		at = from
	} else {
		at += len(name)
	}
	open := -1
	for i := at; i < len(body); i++ {
		c := body[i]
		if c != '{' && c != '[' {
			continue
		}
		j := i + 1
		for j < len(body) && (body[j] == ' ' || body[j] >= '0' && body[j] <= '9' || body[j] == ',') {
			j++
		}
		if j < len(body) && body[j] == ']' {
			i = j // a dimension or slice type
			continue
		}
		open = i
		break
	}
	if open < 0 {
		return nil, 0, fmt.Errorf("no list of values follows the name")
	}
	var vals []string
	depth := 0
	for i := open; i < len(body); {
		c := body[i]
		switch {
		case c == '{' || c == '[' || c == '(':
			depth++
			i++
		case c == '}' || c == ']' || c == ')':
			depth--
			i++
			if depth == 0 {
				if len(vals) != want {
					return nil, 0, fmt.Errorf("%d values listed, the header announces %d", len(vals), want)
				}
				return vals, i, nil
			}
		case c == '"':
			j := strings.IndexByte(body[i+1:], '"')
			if j < 0 {
				return nil, 0, fmt.Errorf("a quoted value is not closed")
			}
			vals = append(vals, body[i+1:i+1+j])
			i += j + 2
		case c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z':
			for i < len(body) && (body[i] == '_' || body[i] >= 'a' && body[i] <= 'z' || body[i] >= 'A' && body[i] <= 'Z' || body[i] >= '0' && body[i] <= '9') {
				i++
			}
		case c >= '0' && c <= '9' || c == '.' || (c == '-' || c == '+') && i+1 < len(body) && (body[i+1] >= '0' && body[i+1] <= '9' || body[i+1] == '.'):
			v, n := numberLiteral(body[i:])
			vals = append(vals, v)
			i += n
		default:
			i++
		}
		if len(vals) > want {
			return nil, 0, fmt.Errorf("more than the %d values the header announces", want)
		}
	}
	return nil, 0, fmt.Errorf("the list is not closed")
}

// numberLiteral reads a numeric literal at the start of s: sign, digits
// with a point, an exponent (e, E, or Fortran's d, D), then a type suffix
// (L, Q, _real64, _real128), which is dropped. It returns the number as a
// decimal and the bytes consumed.
func numberLiteral(s string) (string, int) {
	i := 0
	if s[0] == '-' || s[0] == '+' {
		i++
	}
	for i < len(s) && (s[i] >= '0' && s[i] <= '9' || s[i] == '.') {
		i++
	}
	mant := s[:i]
	exp := ""
	if i < len(s) && strings.IndexByte("eEdD", s[i]) >= 0 {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			exp, i = "e"+s[i+1:k], k
		}
	}
	for i < len(s) && (s[i] == '_' || s[i] >= 'a' && s[i] <= 'z' || s[i] >= 'A' && s[i] <= 'Z' || s[i] >= '0' && s[i] <= '9') {
		i++
	}
	return strings.TrimPrefix(mant, "+") + exp, i
}

// wordIndex is the offset of the first whole-word occurrence of w in s at
// or after from, or -1.
func wordIndex(s, w string, from int) int {
	isWord := func(c byte) bool {
		return c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9'
	}
	for i := from; i <= len(s)-len(w); {
		j := strings.Index(s[i:], w)
		if j < 0 {
			return -1
		}
		j += i
		if (j == 0 || !isWord(s[j-1])) && (j+len(w) == len(s) || !isWord(s[j+len(w)])) && !inComment(s, j) {
			return j
		}
		i = j + 1
	}
	return -1
}

// inComment reports whether offset j of s lies on a comment line (a doc
// comment naming the array above its declaration).
func inComment(s string, j int) bool {
	start := strings.LastIndexByte(s[:j], '\n') + 1
	_, ok := commentText(s[start:j])
	return ok
}
