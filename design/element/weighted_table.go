package element

import (
	"bufio"
	"fmt"
	"io"
	"math/big"
	"os"
	"strconv"
	"strings"

	"quadwright/precision"
)

// MomentTable is a table of monomial moments of a weight on an element,
// read from a file: the integral of x^a y^b z^c w over the reference
// element for the exponents listed, each exactly as written.
type MomentTable struct {
	Name string // the file, as named by the user
	Dim  int    // exponents per line
	// entries maps the exponent tuple (monomialKey) to its moment.
	entries map[string]tableEntry
}

type tableEntry struct {
	value precision.Number
	ulp   *big.Rat // one unit in the last written place; nil when exact
	line  int
}

// maxTableExponent bounds an exponent in a moment table; no element rule
// needs more (MaxWeightedDegree).
const maxTableExponent = 1000

// ReadMomentTable reads a moment table for an element of dimension dim
// from the file at path (see ParseMomentTable).
func ReadMomentTable(path string, dim int) (*MomentTable, error) {
	f, err := os.Open(path)
	if err != nil {
		if pe, ok := err.(*os.PathError); ok {
			err = pe.Err
		}
		return nil, fmt.Errorf("--moments %s: %v", path, err)
	}
	defer f.Close()
	return ParseMomentTable(f, path, dim)
}

// ParseMomentTable reads lines "a b [c] value": dim non-negative whole
// exponents (of x, y and, on 3-D elements, z) and the moment, a decimal or
// p/q as precision.ParseNumber reads it (a plain integer such as "1" is
// exact, like p/q). Fields are separated by blanks, tabs or commas; blank
// lines and everything after '#' are ignored. An error is one sentence
// naming the file and the line, e.g. `--moments m.txt, line 4: expected 2
// exponents and a value, found 2 fields`; an exponent tuple given twice is an
// error naming both lines. ParseMomentTable never panics on any input; dim
// outside 1..3 is a programmer error and panics.
func ParseMomentTable(r io.Reader, name string, dim int) (*MomentTable, error) {
	if dim < 1 || dim > 3 {
		panic("element: ParseMomentTable with dimension outside 1..3")
	}
	t := &MomentTable{Name: name, Dim: dim, entries: map[string]tableEntry{}}
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64*1024), 1<<20)
	lineNo := 0
	for sc.Scan() {
		lineNo++
		if err := t.parseLine(sc.Text(), lineNo); err != nil {
			return nil, fmt.Errorf("--moments %s, line %d: %v", name, lineNo, err)
		}
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("--moments %s, line %d: %v", name, lineNo+1, err)
	}
	if len(t.entries) == 0 {
		return nil, fmt.Errorf("--moments %s: the file holds no moment", name)
	}
	return t, nil
}

func (t *MomentTable) parseLine(text string, lineNo int) error {
	if i := strings.IndexByte(text, '#'); i >= 0 {
		text = text[:i]
	}
	fields := strings.FieldsFunc(text, func(r rune) bool { return r == ' ' || r == '\t' || r == ',' || r == '\r' })
	if len(fields) == 0 {
		return nil
	}
	if len(fields) != t.Dim+1 {
		return fmt.Errorf("expected %d exponents and a value, found %d fields", t.Dim, len(fields))
	}
	exps := make([]int, t.Dim)
	for k := 0; k < t.Dim; k++ {
		e, err := strconv.Atoi(fields[k])
		if err != nil || e < 0 || e > maxTableExponent || strings.HasPrefix(fields[k], "+") {
			return fmt.Errorf("exponent %q: expected a whole number from 0 to %d", clipField(fields[k]), maxTableExponent)
		}
		exps[k] = e
	}
	v, err := precision.ParseNumber(fields[t.Dim])
	if err != nil {
		return err
	}
	// A plain integer means exactly that integer, as in a 1-D moment list.
	if s := strings.TrimLeft(fields[t.Dim], "+-"); !v.Exact && strings.Trim(s, "0123456789") == "" {
		v.Exact, v.Digits = true, 0
	}
	key := monomialKey(exps)
	if old, dup := t.entries[key]; dup {
		return fmt.Errorf("the moment of %s is given again (first on line %d)", monomialName(exps), old.line)
	}
	en := tableEntry{value: v, line: lineNo}
	if !v.Exact {
		if en.ulp, err = precision.DecimalULP(fields[t.Dim]); err != nil {
			return err
		}
	}
	t.entries[key] = en
	return nil
}

func clipField(s string) string {
	if len(s) > 20 {
		return s[:20] + "..."
	}
	return s
}

// monomialKey is a map key for an exponent tuple.
func monomialKey(e []int) string {
	var b strings.Builder
	for k, v := range e {
		if k > 0 {
			b.WriteByte(' ')
		}
		b.WriteString(strconv.Itoa(v))
	}
	return b.String()
}

// monomialName writes x^a y^b z^c as the user would, e.g. "x^2 y^0".
func monomialName(e []int) string {
	parts := make([]string, len(e))
	for k, v := range e {
		parts[k] = fmt.Sprintf("%c^%d", "xyz"[k], v)
	}
	return strings.Join(parts, " ")
}

// Needed returns the moments of every monomial of total degree <= deg, in
// the order of the basis (by total degree, then lexicographically from the
// highest power of x), read as exact, and D0, the largest number of
// significant digits among the decimals among them (0 when all are
// exact). The first missing exponent tuple is an error naming it.
func (t *MomentTable) Needed(deg int) ([]*big.Rat, int, error) {
	var out []*big.Rat
	d0 := 0
	for d := 0; d <= deg; d++ {
		for _, e := range monomials(t.Dim, d) {
			en, ok := t.entries[monomialKey(e)]
			if !ok {
				return nil, 0, fmt.Errorf("--moments %s: the moment of %s (line \"%s value\") is missing; degree %d needs every exponent of total degree up to %d", t.Name, monomialName(e), monomialKey(e), deg, deg)
			}
			if !en.value.Exact {
				d0 = max(d0, en.value.Digits)
			}
			out = append(out, en.value.Value)
		}
	}
	return out, d0, nil
}

// lastPlaces returns, in the order of Needed, one unit in the last written
// place of every moment through total degree deg (nil for an exact one);
// call it after Needed has succeeded.
func (t *MomentTable) lastPlaces(deg int) []*big.Rat {
	var out []*big.Rat
	for d := 0; d <= deg; d++ {
		for _, e := range monomials(t.Dim, d) {
			out = append(out, t.entries[monomialKey(e)].ulp)
		}
	}
	return out
}

// Covers returns the highest total degree d such that the table holds the
// moment of every monomial of total degree <= d (-1 when it lacks x^0).
func (t *MomentTable) Covers() int {
	d := 0
	for ; d <= maxTableExponent; d++ {
		for _, e := range monomials(t.Dim, d) {
			if _, ok := t.entries[monomialKey(e)]; !ok {
				return d - 1
			}
		}
	}
	return d - 1
}

// Integral returns the table's moments as an Integral (read as exact),
// for the monomials through Covers(); others give nil.
func (t *MomentTable) Integral() Integral {
	return func(e []int) *big.Rat {
		if en, ok := t.entries[monomialKey(e)]; ok {
			return en.value.Value
		}
		return nil
	}
}
