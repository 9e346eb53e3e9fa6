package moments

import (
	"math/big"
	"strings"
	"testing"
)

func TestDeclareExact(t *testing.T) {
	ml, err := ParseMomentList(strings.NewReader("1\n0.3333\n1/5\n"), "m.txt")
	if err != nil {
		t.Fatal(err)
	}
	if ml.Values[1].Exact {
		t.Fatal("0.3333 read as exact before DeclareExact")
	}
	ml.DeclareExact()
	for k, v := range ml.Values {
		if !v.Exact || v.Digits != 0 || ml.ULP[k] != nil {
			t.Errorf("value %d: %+v, ulp %v", k, v, ml.ULP[k])
		}
	}
	if ml.Values[1].Value.Cmp(big.NewRat(3333, 10000)) != 0 {
		t.Errorf("0.3333 is %v, want 3333/10000 as written", ml.Values[1].Value)
	}
	dm, err := ParseMeasure(strings.NewReader("0.5 0.25\n1 3/4\n"), "d.txt")
	if err != nil {
		t.Fatal(err)
	}
	dm.DeclareExact()
	if !dm.Exact || dm.Digits != 0 || dm.XULP[0] != nil || dm.MassULP[0] != nil {
		t.Errorf("measure after DeclareExact: %+v", dm)
	}
}

func TestDiscreteCheckSupport(t *testing.T) {
	dm, err := ParseMeasure(strings.NewReader("-1 1\n0 1\n2 1\n"), "d.txt")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		iv, want string
	}{
		{"-1,2", ""}, // closed ends hold their points
		{"-inf,inf", ""},
		{"0,2", "the point -1 lies below the left end 0"},
		{"-1,1", "the point 2 lies above the right end 1"},
		{"-2,inf", ""},
	} {
		iv, err := ParseInterval(c.iv)
		if err != nil {
			t.Fatal(err)
		}
		err = dm.CheckSupport(iv)
		if (err == nil) != (c.want == "") || (err != nil && !strings.Contains(err.Error(), c.want)) {
			t.Errorf("[%s]: %v, want %q", c.iv, err, c.want)
		}
	}
}

// FuzzMeasureSupport reads arbitrary measure files and intervals and tests
// the points against the interval: an error or nil, never a panic.
func FuzzMeasureSupport(f *testing.F) {
	f.Add("0 1\n1 1\n", "0,1")
	f.Add("-1 1/2\n3 0.5\n", "-inf,2")
	f.Add("1e9 1\n", "0,inf")
	f.Fuzz(func(t *testing.T, text, ivs string) {
		dm, err := ParseMeasure(strings.NewReader(text), "fuzz.txt")
		if err != nil {
			return
		}
		iv, err := ParseInterval(ivs)
		if err != nil {
			return
		}
		err = dm.CheckSupport(iv)
		inside := (!iv.Lo.Finite() || dm.X[0].Cmp(iv.Lo.Value) >= 0) && (!iv.Hi.Finite() || dm.X[len(dm.X)-1].Cmp(iv.Hi.Value) <= 0)
		if (err == nil) != inside {
			t.Fatalf("%q on %s: %v", text, iv, err)
		}
		dm.DeclareExact()
	})
}
