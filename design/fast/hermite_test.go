package fast_test

import (
	"math"
	"math/big"
	"testing"

	"quadwright/design/fast"
	"quadwright/moments"
	"quadwright/precision"
)

func hermiteFamily(t testing.TB) moments.Family {
	f, err := moments.NewFamily("hermite", nil, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func TestHermiteAgainstRecurrence(t *testing.T) {
	for _, c := range []struct{ n, samples int }{{1, 1}, {2, 2}, {7, 7}, {20, 20}, {101, 101}, {300, 120}, {2000, 30}} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		fast.Hermite(c.n, x, w, false)
		r := newReference(t, hermiteFamily(t), c.n)
		worstX, worstW := 0.0, 0.0
		for _, i := range samples(c.n, c.samples) {
			xr, wr := r.point(x[i])
			xf, _ := xr.Float64()
			wf, _ := wr.Float64()
			dx, _ := new(big.Float).Sub(xr, new(big.Float).SetFloat64(x[i])).Float64()
			dw, _ := new(big.Float).Sub(wr, new(big.Float).SetFloat64(w[i])).Float64()
			worstX = math.Max(worstX, math.Abs(dx)/math.Max(ulp(xf), ulp(1)*0))
			if wf > 1e-300 {
				worstW = math.Max(worstW, math.Abs(dw)/ulp(wf))
			}
		}
		t.Logf("hermite n=%d: node %.3g ulp, weight %.3g ulp", c.n, worstX, worstW)
		if worstX > 2 || worstW > 4 {
			t.Errorf("hermite n=%d: node %.3g ulp, weight %.3g ulp", c.n, worstX, worstW)
		}
	}
}

// TestHermiteScaled checks w exp(x^2) at sampled indices of large rules,
// where the plain weights underflow, against the reference weight times
// exp(x^2) formed at the reference precision.
func TestHermiteScaled(t *testing.T) {
	for _, c := range []struct{ n, samples int }{{1000, 40}, {100000, 4}} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		fast.Hermite(c.n, x, w, true)
		r := newReference(t, hermiteFamily(t), c.n)
		worst := 0.0
		for _, i := range samples(c.n, c.samples) {
			xr, wr := r.point(x[i])
			e := precision.Exp(new(big.Float).SetPrec(refPrec).Mul(xr, xr))
			ws := new(big.Float).SetPrec(refPrec).Mul(wr, e)
			wf, _ := ws.Float64()
			dw, _ := new(big.Float).Sub(ws, new(big.Float).SetFloat64(w[i])).Float64()
			worst = math.Max(worst, math.Abs(dw)/ulp(wf))
		}
		t.Logf("hermite n=%d scaled: weight %.3g ulp", c.n, worst)
		if worst > 4 {
			t.Errorf("hermite n=%d scaled: weight %.3g ulp", c.n, worst)
		}
	}
}

func TestHermiteMass(t *testing.T) {
	n := 300
	x, w := make([]float64, n), make([]float64, n)
	fast.Hermite(n, x, w, false)
	s := 0.0
	for _, v := range w {
		s += v
	}
	// sqrt(pi): the mass of exp(-x^2) (common practice).
	if d := math.Abs(s-math.Sqrt(math.Pi)) / math.Sqrt(math.Pi); d > 1e-15 {
		t.Errorf("weight sum %v, relative error %.3g", s, d)
	}
}
