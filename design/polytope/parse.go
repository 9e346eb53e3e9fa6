package polytope

import (
	"bufio"
	"fmt"
	"io"
	"math/big"
	"strconv"
	"strings"

	"quadwright/precision"
)

// maxField bounds the length of one number in a geometry file: far more
// digits than any coordinate needs, and it keeps exact arithmetic on a
// hostile file bounded.
const maxField = 200

// maxVertices bounds the vertices of one cell (the validation is
// quadratic in them).
const maxVertices = 10000

// Polygon is a polygon given by its vertices in order around the
// boundary (either orientation), exactly. Src keeps the coordinates as
// written, for the rule file.
type Polygon struct {
	V   [][2]*big.Rat
	Src [][]string
	// ccwV caches ccw().
	ccwV [][2]*big.Rat
}

// Polyhedron is a polyhedron given by its vertices and its faces (lists of
// 0-based vertex indices, each face a planar polygon).
type Polyhedron struct {
	V   [][3]*big.Rat
	F   [][]int
	Src [][]string
}

func readNumber(s, where string) (*big.Rat, error) {
	if len(s) > maxField {
		return nil, fmt.Errorf("%s: the number %.20q... is longer than %d characters", where, s, maxField)
	}
	if strings.ContainsAny(s, "eE") {
		// Exponents would let a few characters ask for huge rationals.
		if i := strings.IndexAny(s, "eE"); i >= 0 {
			if e, err := strconv.Atoi(strings.TrimPrefix(s[i+1:], "+")); err != nil || e > 1000 || e < -1000 {
				return nil, fmt.Errorf("%s: %q is not a decimal number with an exponent between -1000 and 1000", where, s)
			}
		}
	}
	if d, err := readDecimal(s); err == nil {
		return d.rat(), nil // the common case, without the general reader
	}
	v, err := precision.ParseExact(s)
	if err != nil {
		return nil, fmt.Errorf("%s: %q is not a decimal number or a fraction p/q", where, s)
	}
	return v, nil
}

// lines yields the lines of r with comments ('#' to the end) and
// surrounding space removed, with their 1-based numbers.
func lines(r io.Reader, each func(no int, text string) error) error {
	sc := bufio.NewScanner(r)
	sc.Buffer(nil, 1<<20) // grows from 4 KiB: one cell of a batch is a few lines
	no := 0
	for sc.Scan() {
		no++
		t := sc.Text()
		if i := strings.IndexByte(t, '#'); i >= 0 {
			t = t[:i]
		}
		if err := each(no, strings.TrimSpace(t)); err != nil {
			return err
		}
	}
	if err := sc.Err(); err != nil {
		return fmt.Errorf("line %d: %v", no+1, err)
	}
	return nil
}

// ParsePolygon reads a polygon: one vertex "x y" per line (decimals or
// fractions p/q, read exactly), in order around the boundary; blank lines
// and '#' comments are skipped. name is used in errors. The polygon is
// validated (Validate) before it is returned.
func ParsePolygon(r io.Reader, name string) (*Polygon, error) {
	p := &Polygon{}
	err := lines(r, func(no int, t string) error {
		if t == "" {
			return nil
		}
		f := strings.Fields(t)
		if len(f) != 2 {
			return fmt.Errorf("%s line %d: a vertex is \"x y\", two numbers, not %d fields", name, no, len(f))
		}
		if len(p.V) == maxVertices {
			return fmt.Errorf("%s line %d: more than %d vertices", name, no, maxVertices)
		}
		var v [2]*big.Rat
		for k := range v {
			if len(f[k]) <= maxField && !strings.ContainsAny(f[k], "eE") {
				// a plain decimal, read without building the error's
				// location first
				if d, err := readDecimal(f[k]); err == nil {
					v[k] = d.rat()
					continue
				}
			}
			x, err := readNumber(f[k], fmt.Sprintf("%s line %d", name, no))
			if err != nil {
				return err
			}
			v[k] = x
		}
		p.V = append(p.V, v)
		p.Src = append(p.Src, f)
		return nil
	})
	if err != nil {
		return nil, err
	}
	if err := p.Validate(); err != nil {
		return nil, fmt.Errorf("%s: %v", name, err)
	}
	return p, nil
}

// ParsePolyhedron reads a polyhedron: lines "v x y z" (a vertex) and
// "f i j k ..." (a face through the vertices with those 1-based indices,
// in order around it); blank lines and '#' comments are skipped. The
// polyhedron is validated (Validate) before it is returned.
func ParsePolyhedron(r io.Reader, name string) (*Polyhedron, error) {
	p := &Polyhedron{}
	type faceLine struct {
		no  int
		idx []string
	}
	var faces []faceLine
	err := lines(r, func(no int, t string) error {
		if t == "" {
			return nil
		}
		f := strings.Fields(t)
		switch f[0] {
		case "v":
			if len(f) != 4 {
				return fmt.Errorf("%s line %d: a vertex is \"v x y z\", three numbers after v, not %d", name, no, len(f)-1)
			}
			if len(p.V) == maxVertices {
				return fmt.Errorf("%s line %d: more than %d vertices", name, no, maxVertices)
			}
			var v [3]*big.Rat
			for k := range v {
				x, err := readNumber(f[k+1], fmt.Sprintf("%s line %d", name, no))
				if err != nil {
					return err
				}
				v[k] = x
			}
			p.V = append(p.V, v)
			p.Src = append(p.Src, f[1:])
		case "f":
			if len(f) < 4 {
				return fmt.Errorf("%s line %d: a face needs at least three vertex indices after f", name, no)
			}
			if len(faces) == maxVertices {
				return fmt.Errorf("%s line %d: more than %d faces", name, no, maxVertices)
			}
			faces = append(faces, faceLine{no, f[1:]})
		default:
			return fmt.Errorf("%s line %d: a line starts with v (vertex) or f (face), not %q", name, no, clip(f[0]))
		}
		return nil
	})
	if err != nil {
		return nil, err
	}
	for fi, fl := range faces {
		face := make([]int, len(fl.idx))
		for k, s := range fl.idx {
			i, err := strconv.Atoi(s)
			if err != nil || i < 1 || i > len(p.V) {
				return nil, fmt.Errorf("%s line %d: face %d: vertex index %q is not a whole number from 1 to %d", name, fl.no, fi+1, clip(s), len(p.V))
			}
			face[k] = i - 1
		}
		p.F = append(p.F, face)
	}
	if err := p.Validate(); err != nil {
		return nil, fmt.Errorf("%s: %v", name, err)
	}
	return p, nil
}

func clip(s string) string {
	if len(s) > 20 {
		return s[:20] + "..."
	}
	return s
}
