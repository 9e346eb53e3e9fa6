package rulefile

import "testing"

// TestParseOwnTextOutput: the comment header and row-number column of
// quadwright's own text output are read (the tables are written here in
// that form; the values are the 3-point Gauss-Legendre rule, A&S 25.4.29,
// and the triangle centroid rule, from memory).
func TestParseOwnTextOutput(t *testing.T) {
	interval := "# quadwright gauss rule\n# measure:  legendre, weight 1 on [-1, 1]\n# points:   3\n" +
		"i   node                  weight\n1  -0.7745966692414834    0.5555555555555556\n2   0   0.8888888888888888\n3   0.7745966692414834    0.5555555555555556\n"
	f, err := Parse("g3.txt", []byte(interval))
	if err != nil {
		t.Fatal(err)
	}
	if f.Dim() != 1 || f.Points != 3 || f.Weight != "1" || len(f.Domain.Interval) != 2 || f.Domain.Interval[0] != "-1" || f.Domain.Shape != "interval" {
		t.Errorf("interval table: %+v", f)
	}
	tri := "# quadwright weighted rule on the reference triangle\n# weight:   exp(x) (the rule integrates w p over the element)\ni  x  y  weight\n1  1/3  1/3  1/2\n"
	f, err = Parse("t.txt", []byte(tri))
	if err != nil {
		t.Fatal(err)
	}
	if s, ok, err := f.ElementShape("t.txt"); err != nil || !ok || s.String() != "triangle" || f.Weight != "exp(x)" || f.Dim() != 2 {
		t.Errorf("element table: %v %v %+v", ok, err, f)
	}
	// A half-line's end "inf" leaves the domain unset.
	f, err = Parse("l.txt", []byte("# measure:  laguerre, weight exp(-x) on [0, inf]\n0.5 1\n"))
	if err != nil || len(f.Domain.Interval) != 0 {
		t.Errorf("infinite end: %v %+v", err, f)
	}
	for _, bad := range []string{"i x weight\n2 0 1\n", "i x weight\nx 0 1\n"} {
		if _, err := Parse("b.txt", []byte(bad)); err == nil {
			t.Errorf("%q: accepted a wrong row number", bad)
		}
	}
}

func TestInferElement(t *testing.T) {
	for _, c := range []struct {
		table, want string
	}{
		{"x,y,weight\n0.3333333333333333,0.3333333333333333,0.5\n", "triangle"},
		{"0 0 4\n", "quadrilateral"},
		{"0.25 0.25 0.25 0.1666666666666667\n", "tetrahedron"},
		{"0 0 0.25 1.333333333333333\n", "pyramid"},
		{"0.2 0.2 1\n", ""}, // sums to neither 1/2 nor 4
		{"2 0 4\n", ""},     // outside the square
	} {
		f, err := Parse("c.csv", []byte(c.table))
		if err != nil {
			t.Fatal(err)
		}
		s, ok := f.InferElement()
		if got := map[bool]string{true: s.String(), false: ""}[ok]; got != c.want {
			t.Errorf("%q: inferred %q, want %q", c.table, got, c.want)
		}
	}
}
