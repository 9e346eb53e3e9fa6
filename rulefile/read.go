package rulefile

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"quadwright/precision"
)

// maxFileSize bounds what Read loads (a rule of 10^6 nodes at 1000 digits
// is about 2 GB; this is far beyond anything the extended engine builds).
const maxFileSize = 1 << 30

// Read loads a rule from path: a JSON rule file (recognised by a leading
// '{'), or a text table of "node weight" or "node,weight" lines, with '#'
// comments, blank lines and an optional header line "node,weight". Every
// number is checked to parse exactly; errors are one sentence naming the
// file and, for a table, the line.
func Read(path string) (*File, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, fmt.Errorf("rule file %s: %v", path, unwrap(err))
	}
	if st.IsDir() {
		return nil, fmt.Errorf("rule file %s: is a folder, not a file", path)
	}
	if st.Size() > maxFileSize {
		return nil, fmt.Errorf("rule file %s: larger than %d bytes", path, maxFileSize)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("rule file %s: %v", path, unwrap(err))
	}
	return Parse(path, data)
}

func unwrap(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}

// Parse reads a rule from data; name is used in errors.
func Parse(name string, data []byte) (*File, error) {
	trimmed := bytes.TrimSpace(data)
	if len(trimmed) == 0 {
		return nil, fmt.Errorf("rule file %s: is empty", name)
	}
	var f *File
	var err error
	switch {
	case trimmed[0] == '{':
		f, err = parseJSON(name, trimmed)
	case isExport(trimmed):
		f, err = parseExport(name, trimmed)
	default:
		f, err = parseTable(name, data)
	}
	if err != nil {
		return nil, err
	}
	return f, checkValues(name, f)
}

func parseJSON(name string, data []byte) (*File, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	var f File
	if err := dec.Decode(&f); err != nil {
		if se, ok := err.(*json.SyntaxError); ok {
			line := 1 + bytes.Count(data[:min(int(se.Offset), len(data))], []byte("\n"))
			return nil, fmt.Errorf("rule file %s: line %d: not valid JSON (%v)", name, line, se)
		}
		if err == io.ErrUnexpectedEOF {
			return nil, fmt.Errorf("rule file %s: not valid JSON (it ends before the object is closed)", name)
		}
		return nil, fmt.Errorf("rule file %s: not a rule file (%v)", name, err)
	}
	if f.Format != FormatName {
		return nil, fmt.Errorf("rule file %s: \"format\" is %q, expected %q", name, f.Format, FormatName)
	}
	if len(f.Nodes) != len(f.Weights) {
		return nil, fmt.Errorf("rule file %s: %d nodes but %d weights", name, len(f.Nodes), len(f.Weights))
	}
	if f.Points != len(f.Nodes) {
		return nil, fmt.Errorf("rule file %s: \"points\" is %d but %d nodes are listed", name, f.Points, len(f.Nodes))
	}
	if len(f.Nodes) == 0 {
		return nil, fmt.Errorf("rule file %s: lists no nodes", name)
	}
	d := len(f.Nodes[0])
	for i, n := range f.Nodes {
		if len(n) != d || d == 0 {
			return nil, fmt.Errorf("rule file %s: node %d has %d coordinates, node 1 has %d", name, i+1, len(n), d)
		}
	}
	return &f, nil
}

// parseTable reads "node weight" lines (or "x y [z] weight" for element
// rules, all lines alike).
func parseTable(name string, data []byte) (*File, error) {
	f := &File{Format: FormatName, Kind: "unknown", Domain: Domain{Shape: "interval"}}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	lineNo := 0
	dim := 0
	var head tableHeader
	// indexed: the table's first column is the row number (quadwright's
	// text output, header "i node weight" or "i x y weight").
	indexed := false
	for sc.Scan() {
		lineNo++
		line := strings.TrimSpace(sc.Text())
		if i := strings.IndexByte(line, '#'); i >= 0 {
			if len(f.Nodes) == 0 {
				head.readComment(line[i+1:])
			}
			line = strings.TrimSpace(line[:i])
		}
		if line == "" {
			continue
		}
		fields := strings.FieldsFunc(line, func(r rune) bool { return r == ',' || r == ' ' || r == '\t' || r == ';' })
		if len(f.Nodes) == 0 && dim == 0 && isHeader(fields) {
			indexed = len(fields) >= 3 && strings.EqualFold(fields[0], "i")
			dim = len(fields) - 1
			if indexed {
				dim--
			}
			continue
		}
		if indexed {
			if k, err := strconv.Atoi(fields[0]); err != nil || k != len(f.Nodes)+1 {
				return nil, fmt.Errorf("rule file %s: line %d: the first column is the row number, expected %d, found %q", name, lineNo, len(f.Nodes)+1, clip(fields[0]))
			}
			fields = fields[1:]
		}
		if len(fields) < 2 {
			return nil, fmt.Errorf("rule file %s: line %d: %q holds one number; expected a node and a weight", name, lineNo, clip(line))
		}
		if dim == 0 {
			dim = len(fields) - 1
		}
		if len(fields) != dim+1 {
			return nil, fmt.Errorf("rule file %s: line %d: %d numbers, expected %d", name, lineNo, len(fields), dim+1)
		}
		for _, s := range fields {
			if _, err := precision.ParseNumber(s); err != nil {
				return nil, fmt.Errorf("rule file %s: line %d: %v", name, lineNo, err)
			}
		}
		f.Nodes = append(f.Nodes, Node(fields[:dim]))
		f.Weights = append(f.Weights, fields[dim])
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("rule file %s: line %d: %v", name, lineNo+1, err)
	}
	if len(f.Nodes) == 0 {
		return nil, fmt.Errorf("rule file %s: holds no node/weight lines", name)
	}
	f.Points = len(f.Nodes)
	f.Degree = -1
	head.apply(f)
	return f, nil
}

// isHeader recognises a header such as "node,weight" or "x,y,weight".
func isHeader(fields []string) bool {
	if len(fields) < 2 {
		return false
	}
	for _, s := range fields {
		if _, err := precision.ParseNumber(s); err == nil {
			return false
		}
		for _, r := range s {
			if !(r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r == '_') {
				return false
			}
		}
	}
	return true
}

// checkValues parses every node and weight and refuses duplicate nodes.
func checkValues(name string, f *File) error {
	seen := make(map[string]int, len(f.Nodes))
	for i, n := range f.Nodes {
		key := ""
		for _, c := range n {
			v, err := precision.ParseNumber(c)
			if err != nil {
				return fmt.Errorf("rule file %s: node %d: %v", name, i+1, err)
			}
			key += v.Value.RatString() + " "
		}
		if _, err := precision.ParseNumber(f.Weights[i]); err != nil {
			return fmt.Errorf("rule file %s: weight %d: %v", name, i+1, err)
		}
		if j, dup := seen[key]; dup {
			return fmt.Errorf("rule file %s: nodes %d and %d are the same point %s", name, j+1, i+1, strings.Join(n, ","))
		}
		seen[key] = i
	}
	return nil
}

func clip(s string) string {
	if len(s) > 60 {
		return s[:57] + "..."
	}
	return s
}
