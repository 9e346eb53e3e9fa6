package moments

import (
	"bufio"
	"fmt"
	"io"
	"math/big"
	"os"
	"sort"
	"strings"

	"quadwright/precision"
)

// MomentList is a sequence of moments read from a file: Values[k] is the
// k-th (raw or modified) moment, exactly as written, with the number of
// significant digits it was written with (Digits 0 and Exact for p/q).
type MomentList struct {
	Name   string             // the file, as named by the user
	Values []precision.Number // in file order
	Lines  []int              // Lines[k] is the line Values[k] came from, counted from 1
	// ULP[k] is one unit in the last written place of Values[k]
	// (precision.DecimalULP); nil for an exact p/q.
	ULP []*big.Rat
}

// DiscreteMeasure is a measure sum_i Mass[i] delta(x - X[i]) read from a
// file, with points of equal value merged (their masses added) and points of
// zero mass dropped; X ascending, every Mass positive.
type DiscreteMeasure struct {
	Name    string
	X, Mass []*big.Rat
	// XULP[i] and MassULP[i] are one unit in the last written place of X[i]
	// and Mass[i] (for merged points, the sum over the lines merged); nil
	// for exact p/q values.
	XULP, MassULP []*big.Rat
	// Digits is the largest number of significant digits among the
	// decimals read (so that exact short values such as 1 or 0.5 do not
	// lower it); Exact reports that every number was exact (p/q or a plain
	// integer), and Digits is then 0.
	Digits int
	Exact  bool
}

// ReadMomentFile reads a moment list from the file at path (see
// ParseMomentList).
func ReadMomentFile(path string) (*MomentList, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("--moments %s: %v", path, unwrapPath(err))
	}
	defer f.Close()
	return ParseMomentList(f, path)
}

// ParseMomentList reads one moment per line: a decimal or p/q as
// precision.ParseNumber accepts it (a plain integer counts as exact). Blank lines and everything after '#' are
// ignored. An error is one sentence naming the file and the line, e.g.
// `--moments m.txt, line 4: number "1.2.3": more than one decimal point`.
// A file without any moment is an error.
func ParseMomentList(r io.Reader, name string) (*MomentList, error) {
	ml := &MomentList{Name: name}
	err := scanLines(r, name, "--moments", func(line int, fields []string) error {
		if len(fields) != 1 {
			return fmt.Errorf("expected one number per line, found %d fields", len(fields))
		}
		v, err := readNumber(fields[0])
		if err != nil {
			return err
		}
		ml.Values = append(ml.Values, v)
		ml.Lines = append(ml.Lines, line)
		ml.ULP = append(ml.ULP, lastPlace(fields[0], v))
		return nil
	})
	if err != nil {
		return nil, err
	}
	if len(ml.Values) == 0 {
		return nil, fmt.Errorf("--moments %s: the file holds no moment", name)
	}
	return ml, nil
}

// ReadMeasureFile reads a discrete measure from the file at path (see
// ParseMeasure).
func ReadMeasureFile(path string) (*DiscreteMeasure, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("--measure %s: %v", path, unwrapPath(err))
	}
	defer f.Close()
	return ParseMeasure(f, path)
}

// ParseMeasure reads one `x mass` pair per line (separated by spaces, tabs
// or a comma), each a decimal or p/q. Blank lines and everything after '#'
// are ignored. A negative mass is an error naming its line; points of zero
// mass are dropped and repeated points merged. A measure without a point of
// positive mass is an error.
func ParseMeasure(r io.Reader, name string) (*DiscreteMeasure, error) {
	type pt struct{ x, m, xu, mu *big.Rat }
	var pts []pt
	dm := &DiscreteMeasure{Name: name, Exact: true}
	note := func(n precision.Number) {
		if n.Exact {
			return
		}
		dm.Digits = max(dm.Digits, n.Digits)
		dm.Exact = false
	}
	err := scanLines(r, name, "--measure", func(line int, fields []string) error {
		if len(fields) != 2 {
			return fmt.Errorf("expected a point and its mass, found %d fields", len(fields))
		}
		x, err := readNumber(fields[0])
		if err != nil {
			return fmt.Errorf("point: %v", err)
		}
		m, err := readNumber(fields[1])
		if err != nil {
			return fmt.Errorf("mass: %v", err)
		}
		if m.Value.Sign() < 0 {
			return fmt.Errorf("mass %s is negative; a measure has non-negative masses", strings.TrimSpace(fields[1]))
		}
		if m.Value.Sign() == 0 {
			return nil
		}
		note(x)
		note(m)
		pts = append(pts, pt{x.Value, m.Value, lastPlace(fields[0], x), lastPlace(fields[1], m)})
		return nil
	})
	if err != nil {
		return nil, err
	}
	if len(pts) == 0 {
		return nil, fmt.Errorf("--measure %s: the file holds no point of positive mass", name)
	}
	sort.SliceStable(pts, func(i, j int) bool { return pts[i].x.Cmp(pts[j].x) < 0 })
	for _, p := range pts {
		if k := len(dm.X); k > 0 && dm.X[k-1].Cmp(p.x) == 0 {
			dm.Mass[k-1].Add(dm.Mass[k-1], p.m)
			dm.MassULP[k-1] = addULP(dm.MassULP[k-1], p.mu)
			dm.XULP[k-1] = maxULP(dm.XULP[k-1], p.xu)
			continue
		}
		dm.X = append(dm.X, p.x)
		dm.Mass = append(dm.Mass, new(big.Rat).Set(p.m))
		dm.XULP = append(dm.XULP, p.xu)
		dm.MassULP = append(dm.MassULP, p.mu)
	}
	return dm, nil
}

// readNumber reads a number as precision.ParseNumber does, except that a
// plain integer ("1", "-3", no point, no exponent) counts as exact, like
// p/q: a moment or mass written "1" means 1, not "1 to one digit".
func readNumber(s string) (precision.Number, error) {
	n, err := precision.ParseNumber(s)
	if err != nil {
		return n, err
	}
	t := strings.TrimLeft(strings.TrimSpace(s), "+-")
	if !n.Exact && t != "" && strings.Trim(t, "0123456789") == "" {
		n.Exact, n.Digits = true, 0
	}
	return n, nil
}

// lastPlace is one unit in the last written place of the number n read
// from s; nil for an exact p/q.
func lastPlace(s string, n precision.Number) *big.Rat {
	if n.Exact {
		return nil
	}
	u, err := precision.DecimalULP(s)
	if err != nil {
		panic("moments: DecimalULP refused a number ParseNumber accepted: " + err.Error())
	}
	return u
}

func addULP(a, b *big.Rat) *big.Rat {
	switch {
	case a == nil:
		return b
	case b == nil:
		return a
	}
	return new(big.Rat).Add(a, b)
}

func maxULP(a, b *big.Rat) *big.Rat {
	if a == nil || (b != nil && b.Cmp(a) > 0) {
		return b
	}
	return a
}

// maxLineLen bounds one line of a moment or measure file.
const maxLineLen = 1 << 20

// scanLines calls do with the fields of every line that is not blank or a
// comment, and wraps its error as `FLAG NAME, line L: ...`.
func scanLines(r io.Reader, name, flag string, do func(line int, fields []string) error) error {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64*1024), maxLineLen)
	line := 0
	for sc.Scan() {
		line++
		text := sc.Text()
		if i := strings.IndexByte(text, '#'); i >= 0 {
			text = text[:i]
		}
		fields := strings.FieldsFunc(text, func(r rune) bool { return r == ' ' || r == '\t' || r == ',' || r == '\r' })
		if len(fields) == 0 {
			continue
		}
		if err := do(line, fields); err != nil {
			return fmt.Errorf("%s %s, line %d: %v", flag, name, line, err)
		}
	}
	if err := sc.Err(); err != nil {
		return fmt.Errorf("%s %s, line %d: %v", flag, name, line+1, err)
	}
	return nil
}

func unwrapPath(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}

// BasisMoments returns the exact moments integral of q_k, k < count, of
// the measure whose raw moments are the list's values read as exact, with
// q_k the monic polynomials of basis. It fails when the list holds fewer
// than count values. The polynomials are expanded in exact rationals, so
// nothing is lost; the result is what the written values imply, no more.
func (ml *MomentList) BasisMoments(count int, basis Basis) ([]*big.Rat, error) {
	if count > len(ml.Values) {
		return nil, fmt.Errorf("--moments %s: %d moments asked, the file holds %d", ml.Name, count, len(ml.Values))
	}
	out := make([]*big.Rat, count)
	forBasisPolynomials(count, basis, func(k int, coef []*big.Rat) {
		s := new(big.Rat)
		for j, c := range coef {
			s.Add(s, new(big.Rat).Mul(c, ml.Values[j].Value))
		}
		out[k] = s
	})
	return out, nil
}

// BasisMoments returns the exact moments sum_i Mass[i] q_k(X[i]), k < count,
// q_k the monic polynomials of basis, each run by its recurrence in exact
// rationals at every point.
func (dm *DiscreteMeasure) BasisMoments(count int, basis Basis) []*big.Rat {
	out := make([]*big.Rat, count)
	for k := range out {
		out[k] = new(big.Rat)
	}
	for i, x := range dm.X {
		prev, cur := new(big.Rat), big.NewRat(1, 1)
		for k := 0; k < count; k++ {
			out[k].Add(out[k], new(big.Rat).Mul(dm.Mass[i], cur))
			next := new(big.Rat).Sub(x, basis.A(k))
			next.Mul(next, cur)
			if k > 0 {
				next.Sub(next, new(big.Rat).Mul(basis.B(k), prev))
			}
			prev, cur = cur, next
		}
	}
	return out
}

// forBasisPolynomials calls do with the monomial coefficients of q_k,
// k < count (coef[j] multiplies x^j), expanded exactly.
func forBasisPolynomials(count int, basis Basis, do func(k int, coef []*big.Rat)) {
	var prev []*big.Rat
	cur := []*big.Rat{big.NewRat(1, 1)}
	for k := 0; k < count; k++ {
		do(k, cur)
		next := make([]*big.Rat, k+2)
		for j := range next {
			next[j] = new(big.Rat)
		}
		a := basis.A(k)
		for j, c := range cur {
			next[j+1].Add(next[j+1], c)
			next[j].Sub(next[j], new(big.Rat).Mul(a, c))
		}
		if k > 0 {
			b := basis.B(k)
			for j, c := range prev {
				next[j].Sub(next[j], new(big.Rat).Mul(b, c))
			}
		}
		prev, cur = cur, next
	}
}
