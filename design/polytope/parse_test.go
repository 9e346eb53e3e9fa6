package polytope

import (
	"context"
	"strings"
	"testing"
)

// Each refusal is one sentence naming the vertex, edge or face.
func TestRefusals(t *testing.T) {
	for _, c := range []struct {
		name, src, want string
		poly            bool
	}{
		{"self-intersecting", "0 0\n1 1\n1 0\n0 1\n", "edges 1 (vertices 1-2) and 3 (vertices 3-4) intersect", false},
		{"repeated vertex", "0 0\n1 0\n1 1\n1 0\n0 1\n", "vertices 2 and 4 are the same point", false},
		{"collinear corner", "0 0\n1 0\n2 0\n1 1\n", "vertex 2 lies on the line through its neighbours 1 and 3", false},
		{"zero area", "0 0\n1 0\n", "at least 3 vertices", false},
		{"bad number", "0 0\n1 x\n0 1\n", "line 2: \"x\" is not a decimal number", false},
		{"three fields", "0 0 0\n1 0\n0 1\n", "line 1: a vertex is \"x y\"", false},
		{"open polyhedron", strings.Replace(boxSrc, "f 4 1 5 8\n", "", 1), "the surface is not closed", true},
		{"non-planar face", strings.Replace(boxSrc, "v 0 2 3\n", "v 0 2 4\n", 1), "is not planar", true},
		{"inconsistent orientation", strings.Replace(boxSrc, "f 5 6 7 8", "f 8 7 6 5", 1), "orientation is inconsistent", true},
		{"bad index", strings.Replace(boxSrc, "f 5 6 7 8", "f 5 6 7 9", 1), "vertex index \"9\" is not a whole number from 1 to 8", true},
	} {
		var err error
		if c.poly {
			_, err = ParsePolyhedron(strings.NewReader(c.src), "cell.txt")
		} else {
			_, err = ParsePolygon(strings.NewReader(c.src), "cell.txt")
		}
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "cell.txt") {
			t.Errorf("%s: got %v, want an error naming the file with %q", c.name, err, c.want)
		}
	}
	// A zero-area polygon through collinear points is caught as a
	// degenerate corner; a non-zero-area check remains for others.
	if _, err := ParsePolygon(strings.NewReader("0 0\n2 0\n1 0\n"), "z"); err == nil {
		t.Error("a flat triangle was accepted")
	}
}

// Decimals and fractions are read exactly.
func TestParseExact(t *testing.T) {
	p := mustPolygon(t, "# a triangle\n0 0\n1/3 0   # comment\n0 0.1\n")
	if p.V[1][0].RatString() != "1/3" || p.V[2][1].RatString() != "1/10" {
		t.Errorf("read %s, %s", p.V[1][0].RatString(), p.V[2][1].RatString())
	}
}

func FuzzParsePolygon(f *testing.F) {
	f.Add("0 0\n1 0\n0 1\n")
	f.Add("0 0\n2 0\n2 1\n1 1\n1 2\n0 2\n")
	f.Add("0 0\n1 1\n1 0\n0 1\n")
	f.Add("1e5 2/3\n-1 0\n0 1e-3\n")
	f.Fuzz(func(t *testing.T, src string) {
		p, err := ParsePolygon(strings.NewReader(src), "fuzz")
		if err != nil {
			return
		}
		if len(p.V) > 12 {
			return
		}
		// A valid polygon has moments and a subdivision of the same area.
		m := PolygonMoments(p, 1)
		if m[0].Sign() <= 0 {
			t.Fatalf("area %s", m[0].RatString())
		}
		a := fanMoments(p, 0)
		if a[0].Cmp(m[0]) != 0 {
			t.Fatalf("fan area %s, divergence %s", a[0].RatString(), m[0].RatString())
		}
	})
}

func FuzzParsePolyhedron(f *testing.F) {
	f.Add(boxSrc)
	f.Add(testPolyhedra[1].src)
	f.Add("v 0 0 0\nv 1 0 0\nv 0 1 0\nv 0 0 1\nf 1 3 2\nf 1 2 4\nf 2 3 4\nf 3 1 4\n")
	f.Fuzz(func(t *testing.T, src string) {
		p, err := ParsePolyhedron(strings.NewReader(src), "fuzz")
		if err != nil {
			return
		}
		if len(p.V) > 16 {
			return
		}
		m := PolyhedronMoments(p, 1)
		if m[0].Sign() <= 0 {
			t.Fatalf("volume %s", m[0].RatString())
		}
	})
}

// Rules for a cell are the same whichever similar copy is built first,
// and a similar copy's rule is verified for that copy.
func TestSimilarCellsShareAClass(t *testing.T) {
	a := mustPolygon(t, "0 0\n2 0\n2 1\n1 1\n1 2\n0 2\n")
	// a rotated by 90 degrees, scaled by 3/2, translated, listed from another vertex
	b := mustPolygon(t, "10 3\n10 4.5\n8.5 4.5\n8.5 6\n7 6\n7 3\n")
	_, ka, _ := canonicalPolygon(a)
	_, kb, _ := canonicalPolygon(b)
	if ka != kb {
		t.Fatalf("similar polygons got different classes")
	}
	blocks := []Block{{1, 1, "0 0\n2 0\n2 1\n1 1\n1 2\n0 2\n"}, {2, 8, "10 3\n10 4.5\n8.5 4.5\n8.5 6\n7 6\n7 3\n"}}
	res := Batch(context.Background(), blocks, "b", BatchOptions{Options: Options{Degree: 5}, Dim: 2})
	single, err := BuildPolygon(context.Background(), b, Options{Degree: 5})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range res {
		if r.Err != nil {
			t.Fatal(r.Err)
		}
	}
	if strings.Join(res[1].Rule.Weights, ",") != strings.Join(single.Weights, ",") {
		t.Error("a cell's rule depends on the cells before it")
	}
}
