package systems

import (
	"context"
	"testing"
	"time"

	"quadwright/design"
	"quadwright/moments"
)

func TestQuick(t *testing.T) {
	for _, c := range []struct {
		list, iv, w string
		d           int
	}{
		{"x^k; k=0..5", "0,1", "1", 20},
		{"x^(k/2); k=0..5", "0,1", "1", 20},
		{"x^k, x^k*log(x); k=0..3", "0,1", "1", 30},
		{"exp(-k*x); k=1..6", "0,inf", "1", 20},
	} {
		fs, err := ParseFunctions(c.list)
		if err != nil {
			t.Fatal(err)
		}
		iv, _ := moments.ParseInterval(c.iv)
		w, err := moments.NewWeight(c.w, iv, nil)
		if err != nil {
			t.Fatal(err)
		}
		t0 := time.Now()
		r, err := GeneralizedGauss(context.Background(), Problem{Functions: fs, Weight: w}, design.Request{Digits: c.d})
		if err != nil {
			t.Errorf("%s: %v", c.list, err)
			continue
		}
		t.Logf("%s: %v degree %d exact %d prec %d", c.list, time.Since(t0), r.Rule.Degree, r.ExactFor, r.Rule.WorkingPrec)
		for i := range r.Rule.Nodes {
			t.Logf("  %s  %s", r.Rule.Nodes[i], r.Rule.Weights[i])
		}
	}
}
