package polytope

import (
	"context"
	"math"
	"math/big"
	"testing"

	"quadwright/design/element"
)

// exactSums against element.VerifyAgainst (sums at extended precision
// against the same exact moments) on built rules and on rules spoiled in
// one weight: the same degree and nearly the same residual share.
func TestExactSumsAgainstVerifyAgainst(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		src    string
		deg    int
		digits int
	}{
		{"0 0\n2 0\n2 1\n1 3/2\n0 1\n", 5, 0},
		{"0 0\n3 0\n3 1\n1 1\n1 2\n0 2\n", 6, 25},
		{"-1.5 -0.25\n1e-3 -1\n4.75 2\n-2 3.125\n", 3, 0},
	} {
		p := mustPolygon(t, c.src)
		r, err := BuildPolygon(ctx, p, Options{Degree: c.deg, Digits: c.digits})
		if err != nil {
			t.Fatal(err)
		}
		mono := PolygonMoments(p, c.deg+2)
		ix := newExpIndex(2, c.deg+2)
		integral := func(e []int) *big.Rat { return mono[ix.pos[key3(e)]] }
		base := max(c.digits, 17*boolInt(c.digits == 0))
		for spoil := 0; spoil < 2; spoil++ {
			w := append([]string(nil), r.Weights...)
			if spoil == 1 {
				w[0] = w[0][:len(w[0])-3] + "9" + w[0][len(w[0])-2:]
			}
			want, err := element.VerifyAgainst(ctx, element.Quadrilateral, r.Nodes, w, element.CheckOptions{MaxDegree: c.deg + 2, MinDigits: base, Integral: integral})
			if err != nil {
				t.Fatal(err)
			}
			got, err := exactSums(r.Nodes, w, mono, 2, c.deg+2, base)
			if err != nil {
				t.Fatal(err)
			}
			if got.Degree != want.Degree || got.Digits != want.Digits || got.Tested != want.Tested ||
				math.Abs(got.WorstShare-want.WorstShare) > 1e-9*math.Max(1, want.WorstShare) {
				t.Errorf("%q degree %d spoiled %d: exactSums %+v, VerifyAgainst %+v", c.src, c.deg, spoil, got, want)
			}
		}
	}
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

// Reading printed decimals exactly.
func TestReadDecimal(t *testing.T) {
	for _, c := range []struct {
		s      string
		m      int64
		e, dig int
	}{
		{"1.25", 125, -2, 3}, {"-0.00120", -120, -5, 3}, {"3e5", 3, 5, 1},
		{"2.5E-3", 25, -4, 2}, {"0", 0, 0, 0}, {"+7.", 7, 0, 1}, {".5", 5, -1, 1},
		{"-1.234567890123456789", -1234567890123456789, -18, 19},
	} {
		d, err := readDecimal(c.s)
		if err != nil || d.m.Int64() != c.m || d.e != c.e || d.digits != c.dig {
			t.Errorf("%q: %v %d %d %v, want %d %d %d", c.s, d.m, d.e, d.digits, err, c.m, c.e, c.dig)
		}
	}
	long, err := readDecimal("0.00123456789012345678901234567890e3")
	if want, _ := new(big.Int).SetString("123456789012345678901234567890", 10); err != nil || long.m.Cmp(want) != 0 || long.e != -29 || long.digits != 30 {
		t.Errorf("30 digits: %v %d %d %v", long.m, long.e, long.digits, err)
	}
	for _, s := range []string{"", "-", "1.2.3", "1e", "x", "1e1234567", "1/3", "."} {
		if _, err := readDecimal(s); err == nil {
			t.Errorf("%q: read", s)
		}
	}
}
