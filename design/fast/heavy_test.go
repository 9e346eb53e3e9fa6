//go:build heavy

package fast_test

import (
	"math/big"
	"testing"

	"quadwright/design/fast"
	"quadwright/precision"
)

// The acceptance sweep: N = 10^5, 200 indices spread over both ends
// and the middle, against Newton's method on the recurrence at 192 bits.
// Run with go test -tags heavy -run Heavy -v ./design/fast/ (minutes).

func TestHeavyJacobi(t *testing.T) {
	for _, ab := range [][2]float64{{-0.3, 0.8}, {0, 0}, {2, -0.5}, {-0.9, 4.5}} {
		n := 100000
		x, w := make([]float64, n), make([]float64, n)
		if err := fast.Jacobi(n, ab[0], ab[1], x, w); err != nil {
			t.Fatal(err)
		}
		r := newReference(t, jacobiFamily(t, ab[0], ab[1]), n)
		acc := measure(r, x, w, samples(n, 200))
		t.Logf("jacobi n=%d a=%g b=%g: node share %.3g (%.3g ulp of x), weight %.3g ulp", n, ab[0], ab[1], acc.NodeShare, acc.NodeULP, acc.WeightULP)
		if acc.NodeShare > 1 || acc.WeightULP > weightULPLimit {
			t.Errorf("jacobi a=%g b=%g: %+v", ab[0], ab[1], acc)
		}
	}
}

func TestHeavyLegendre(t *testing.T) {
	n := 100000
	x, w := make([]float64, n), make([]float64, n)
	fast.Legendre(n, x, w)
	r := newReference(t, jacobiFamily(t, 0, 0), n)
	acc := measure(r, x, w, samples(n, 200))
	t.Logf("legendre n=%d: node share %.3g (%.3g ulp of x), weight %.3g ulp", n, acc.NodeShare, acc.NodeULP, acc.WeightULP)
	if acc.NodeShare > 1 || acc.WeightULP > weightULPLimit {
		t.Errorf("legendre: %+v", acc)
	}
}

func TestHeavyHermiteLaguerre(t *testing.T) {
	n := 100000
	x, w := make([]float64, n), make([]float64, n)
	fast.Hermite(n, x, w, true)
	r := newReference(t, hermiteFamily(t), n)
	checkScaled(t, "hermite", r, x, w, func(x *big.Float) *big.Float { return new(big.Float).Mul(x, x) })
	if err := fast.Laguerre(n, -0.3, x, w, true); err != nil {
		t.Fatal(err)
	}
	r = newReference(t, laguerreFamily(t, -0.3), n)
	checkScaled(t, "laguerre", r, x, w, func(x *big.Float) *big.Float { return x })
}

// checkScaled compares nodes and scaled weights w exp(g(x)) at 200 indices.
func checkScaled(t *testing.T, name string, r *reference, x, w []float64, g func(*big.Float) *big.Float) {
	t.Helper()
	worstX, worstW := 0.0, 0.0
	for _, i := range samples(len(x), 200) {
		xr, wr := r.point(x[i])
		ws := new(big.Float).SetPrec(refPrec).Mul(wr, precision.Exp(new(big.Float).SetPrec(refPrec).Set(g(xr))))
		xf, _ := xr.Float64()
		wf, _ := ws.Float64()
		dx, _ := new(big.Float).Sub(xr, new(big.Float).SetFloat64(x[i])).Float64()
		dw, _ := new(big.Float).Sub(ws, new(big.Float).SetFloat64(w[i])).Float64()
		worstX = max(worstX, abs(dx)/ulp(xf))
		worstW = max(worstW, abs(dw)/ulp(wf))
	}
	t.Logf("%s n=%d scaled: node %.3g ulp, weight %.3g ulp", name, len(x), worstX, worstW)
	if worstX > 1 || worstW > 4 {
		t.Errorf("%s: node %.3g ulp, weight %.3g ulp", name, worstX, worstW)
	}
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}
