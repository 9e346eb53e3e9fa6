package fast_test

import (
	"math"
	"math/big"
	"testing"

	"quadwright/design/fast"
)

// TestReferenceMatchesEngine checks fast.Reference against the 192-bit
// reference of the tests (itself checked against design.Gauss by
// TestJacobiMatchesEngine) on a Jacobi, a Laguerre and a Hermite rule.
func TestReferenceMatchesEngine(t *testing.T) {
	for _, c := range []struct {
		kind fast.Kind
		n    int
		a, b float64
	}{{fast.GaussJacobi, 1000, -0.3, 0.8}, {fast.GaussLaguerre, 500, -0.3, 0}, {fast.GaussHermite, 600, 0, 0}} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		var r *reference
		var err error
		switch c.kind {
		case fast.GaussJacobi:
			err = fast.Jacobi(c.n, c.a, c.b, x, w)
			r = newReference(t, jacobiFamily(t, c.a, c.b), c.n)
		case fast.GaussLaguerre:
			err = fast.Laguerre(c.n, c.a, x, w, false)
			r = newReference(t, laguerreFamily(t, c.a), c.n)
		case fast.GaussHermite:
			fast.Hermite(c.n, x, w, false)
			r = newReference(t, hermiteFamily(t), c.n)
		}
		if err != nil {
			t.Fatal(err)
		}
		ref := fast.NewReference(c.kind, c.n, [2]float64{c.a, 0}, [2]float64{c.b, 0}, [2]float64{r.mass, 0})
		for _, i := range samples(c.n, 40) {
			xr, wr := r.point(x[i])
			z, wm, we, ok := ref.Point(x[i])
			if !ok {
				t.Fatalf("kind %d n=%d: point %d: no result", c.kind, c.n, i)
			}
			xd := new(big.Float).SetPrec(200).SetFloat64(z[0])
			xd.Add(xd, new(big.Float).SetFloat64(z[1]))
			wd := new(big.Float).SetPrec(200).SetFloat64(wm[0])
			wd.Add(wd, new(big.Float).SetFloat64(wm[1]))
			wd.SetMantExp(wd, we)
			ex, _ := new(big.Float).Quo(new(big.Float).Sub(xd, xr), xr).Float64()
			ew, _ := new(big.Float).Quo(new(big.Float).Sub(wd, wr), wr).Float64()
			// The mass is float64 here (2^-53 relative), so the weight
			// is held to 1e-15; the node to 1e-26, far below float64's
			// 1.1e-16 (tuned: Laguerre's smallest node, near 0, measured
			// 2.4e-28; the others below 1e-30).
			if math.Abs(ex) > 1e-26 || math.Abs(ew) > 1e-15 {
				t.Errorf("kind %d n=%d point %d: node rel %.3g, weight rel %.3g", c.kind, c.n, i, ex, ew)
			}
		}
	}
}
