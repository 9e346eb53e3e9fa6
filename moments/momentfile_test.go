package moments

import (
	"math/big"
	"strings"
	"testing"
)

func TestParseMomentList(t *testing.T) {
	cases := []struct {
		in     string
		values []string // exact values as p/q
		digits []int
		lines  []int
	}{
		// Digits: significant digits as written (precision.ParseNumber);
		// plain integers and p/q count as exact (0).
		{"1\n1/4\n0.111111 # a comment\n\n# only a comment\n  6.25e-2  \n", []string{"1", "1/4", "111111/1000000", "1/16"}, []int{0, 0, 6, 3}, []int{1, 2, 3, 6}},
		{"-0.5\r\n", []string{"-1/2"}, []int{1}, []int{1}},
	}
	for _, c := range cases {
		ml, err := ParseMomentList(strings.NewReader(c.in), "m.txt")
		if err != nil {
			t.Fatalf("%q: %v", c.in, err)
		}
		if len(ml.Values) != len(c.values) {
			t.Fatalf("%q: %d values", c.in, len(ml.Values))
		}
		for k, v := range ml.Values {
			want, _ := new(big.Rat).SetString(c.values[k])
			if v.Value.Cmp(want) != 0 || v.Digits != c.digits[k] || ml.Lines[k] != c.lines[k] {
				t.Errorf("%q value %d: %s (%d digits, line %d), want %s (%d, line %d)", c.in, k, v.Value.RatString(), v.Digits, ml.Lines[k], c.values[k], c.digits[k], c.lines[k])
			}
		}
	}
}

func TestMomentFileErrors(t *testing.T) {
	cases := []struct{ in, want string }{
		{"1\n0.5\nnan\n", "m.txt, line 3"},
		{"1\ninf\n", "line 2"},
		{"1\n0.5 0.25\n", "line 2: expected one number per line"},
		{"1\n1.2.3\n", "line 2"},
		{"# nothing\n\n", "holds no moment"},
		{"1/0\n", "line 1"},
	}
	for _, c := range cases {
		_, err := ParseMomentList(strings.NewReader(c.in), "m.txt")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.in, err, c.want)
		}
		if err != nil && strings.Count(err.Error(), "\n") > 0 {
			t.Errorf("%q: error on more than one line", c.in)
		}
	}
}

func TestParseMeasure(t *testing.T) {
	dm, err := ParseMeasure(strings.NewReader("0.5 1/4\n-1, 0.25\n0.5\t0.125 # merged\n2 0\n"), "d.txt")
	if err != nil {
		t.Fatal(err)
	}
	// Sorted, the two lines at 0.5 merged (1/4 + 1/8), the zero mass dropped.
	wantX := []string{"-1", "1/2"}
	wantM := []string{"1/4", "3/8"}
	if len(dm.X) != 2 {
		t.Fatalf("%d points", len(dm.X))
	}
	for i := range wantX {
		if dm.X[i].RatString() != wantX[i] || dm.Mass[i].RatString() != wantM[i] {
			t.Errorf("point %d: %s %s", i, dm.X[i].RatString(), dm.Mass[i].RatString())
		}
	}
	if dm.Exact || dm.Digits != 3 {
		t.Errorf("digits %d exact %v, want 3 (from 0.125), not exact", dm.Digits, dm.Exact)
	}
	for _, c := range []struct{ in, want string }{
		{"0 1\n1 -0.5\n", "line 2: mass -0.5 is negative"},
		{"0 1\n1\n", "line 2: expected a point and its mass"},
		{"0 nan\n", "line 1: mass"},
		{"x 1\n", "line 1: point"},
		{"0 0\n", "no point of positive mass"},
	} {
		_, err := ParseMeasure(strings.NewReader(c.in), "d.txt")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.in, err, c.want)
		}
	}
}

func TestBasisMoments(t *testing.T) {
	// Raw moments of weight 1 on [-1,1] (2/(k+1), even k) in the Legendre
	// basis are (2, 0, 0, ...) by orthogonality (common practice).
	ml, err := ParseMomentList(strings.NewReader("2\n0\n2/3\n0\n2/5\n0\n2/7\n"), "leg.txt")
	if err != nil {
		t.Fatal(err)
	}
	nu, err := ml.BasisMoments(7, LegendreBasis(Unit()))
	if err != nil {
		t.Fatal(err)
	}
	for k, v := range nu {
		want := new(big.Rat)
		if k == 0 {
			want.SetInt64(2)
		}
		if v.Cmp(want) != 0 {
			t.Errorf("nu_%d = %s, want %s", k, v.RatString(), want.RatString())
		}
	}
	// The 2-point Gauss-Legendre-like measure at +-1 with masses 1: raw
	// moments 2, 0, 2, 0 (by hand).
	dm, _ := ParseMeasure(strings.NewReader("-1 1\n1 1\n"), "pm.txt")
	for k, v := range dm.BasisMoments(4, MonomialBasis()) {
		want := int64(2 * ((k + 1) % 2))
		if v.Cmp(big.NewRat(want, 1)) != 0 {
			t.Errorf("moment %d = %s, want %d", k, v.RatString(), want)
		}
	}
	if _, err := ml.BasisMoments(8, MonomialBasis()); err == nil {
		t.Error("8 moments from a file of 7")
	}
}

func FuzzParseMomentList(f *testing.F) {
	for _, s := range []string{"1\n1/4\n", "0.5 # c\n\n1e-3\n", "nan\n", "1 2\n", "", "#\n", "1/0\n"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		ml, err := ParseMomentList(strings.NewReader(s), "f.txt")
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Errorf("multi-line error %q", err)
			}
			return
		}
		if len(ml.Values) == 0 || len(ml.Values) != len(ml.Lines) || len(ml.ULP) != len(ml.Values) {
			t.Errorf("inconsistent list for %q", s)
		}
	})
}

func FuzzParseMeasure(f *testing.F) {
	for _, s := range []string{"0 1\n1 1/2\n", "0.5,0.25\n", "1 -1\n", "x y\n", "1\n", "0 0\n"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		dm, err := ParseMeasure(strings.NewReader(s), "f.txt")
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Errorf("multi-line error %q", err)
			}
			return
		}
		for i := range dm.X {
			if dm.Mass[i].Sign() <= 0 || (i > 0 && dm.X[i].Cmp(dm.X[i-1]) <= 0) {
				t.Errorf("%q: point %d not ascending with positive mass", s, i)
			}
		}
	})
}
