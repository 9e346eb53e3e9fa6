package fast_test

import (
	"math"
	"math/big"
	"testing"

	"quadwright/design/fast"
	"quadwright/moments"
	"quadwright/precision"
)

func laguerreFamily(t testing.TB, a float64) moments.Family {
	f, err := moments.NewFamily("laguerre", new(big.Rat).SetFloat64(a), nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func TestLaguerreAgainstRecurrence(t *testing.T) {
	for _, c := range []struct {
		n, samples int
		a          float64
		scaled     bool
	}{{1, 1, 0, false}, {5, 5, 0, false}, {12, 12, -0.5, false}, {60, 60, 1.5, false}, {300, 100, -0.3, true}, {2000, 30, 0.7, true}, {100000, 4, -0.3, true}} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		if err := fast.Laguerre(c.n, c.a, x, w, c.scaled); err != nil {
			t.Fatal(err)
		}
		r := newReference(t, laguerreFamily(t, c.a), c.n)
		worstX, worstW := 0.0, 0.0
		for _, i := range samples(c.n, c.samples) {
			xr, wr := r.point(x[i])
			if c.scaled {
				wr.Mul(wr, precision.Exp(new(big.Float).SetPrec(refPrec).Set(xr)))
			}
			xf, _ := xr.Float64()
			wf, _ := wr.Float64()
			dx, _ := new(big.Float).Sub(xr, new(big.Float).SetFloat64(x[i])).Float64()
			dw, _ := new(big.Float).Sub(wr, new(big.Float).SetFloat64(w[i])).Float64()
			worstX = math.Max(worstX, math.Abs(dx)/ulp(xf))
			if wf > 1e-300 {
				worstW = math.Max(worstW, math.Abs(dw)/ulp(wf))
			}
		}
		t.Logf("laguerre n=%d a=%g scaled=%v: node %.3g ulp, weight %.3g ulp", c.n, c.a, c.scaled, worstX, worstW)
		if worstX > 2 || worstW > 4 {
			t.Errorf("laguerre n=%d a=%g: node %.3g ulp, weight %.3g ulp", c.n, c.a, worstX, worstW)
		}
	}
}
