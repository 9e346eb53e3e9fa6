package levelset

import (
	"context"
	"strings"
	"testing"
)

// sigDigits counts the significant digits of a printed decimal (leading
// zeros not counted, trailing ones counted).
func sigDigits(s string) int {
	m := strings.TrimLeft(strings.SplitN(s, "e", 2)[0], "-+")
	m = strings.Replace(m, ".", "", 1)
	return len(strings.TrimLeft(m, "0"))
}

// TestPrintedCoordinateDigits: with --digits D every coordinate prints D
// significant digits (the contract's rule for every printed value), or 0
// for a zero by symmetry.
func TestPrintedCoordinateDigits(t *testing.T) {
	for _, c := range []struct{ req Request }{
		{Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-0.49", Order: 5, Digits: 25}},
		{Request{Shape: "triangle", LevelSet: "(x-0.3)^2+(y-0.25)^2-0.04", Order: 6, Digits: 30}},
		{Request{Shape: "box", Box: []float64{-0.5, 0.5, 0, 0.25}, LevelSet: "y-0.1-x^2", Side: Surface, Order: 7, Digits: 20}},
		{Request{Shape: "tetrahedron", LevelSet: "x^2+y^2+z^2-0.25", Order: 3, Digits: 30}},
	} {
		r, err := Build(context.Background(), c.req)
		if err != nil {
			t.Fatalf("%s: %v", c.req.LevelSet, err)
		}
		for _, n := range r.PrintedNodes {
			for _, x := range n {
				if x == "0" {
					continue
				}
				if got := sigDigits(x); got != c.req.Digits {
					t.Fatalf("%s: coordinate %s has %d significant digits, want %d", c.req.LevelSet, x, got, c.req.Digits)
				}
			}
		}
	}
}
