package fast_test

import (
	"math"
	"testing"

	"quadwright/design"
	"quadwright/design/fast"
)

// exactnessError returns max_j |sum_i w_i p_j(x_i) - I(p_j)| / sum_i |w_i p_j(x_i)|
// over j = 0..deg, p_j the orthonormal Jacobi polynomials evaluated in
// float64 (I(p_0) = sqrt(mass), I(p_j) = 0 otherwise).
func exactnessError(t *testing.T, a, b float64, x, w []float64, deg int) float64 {
	t.Helper()
	rec, err := design.FamilySource{Family: jacobiFamily(t, a, b)}.Recurrence(deg+2, 64)
	if err != nil {
		t.Fatal(err)
	}
	al := make([]float64, deg+2)
	sb := make([]float64, deg+2)
	for k := range al {
		al[k], _ = rec.Alpha[k].Float64()
		v, _ := rec.Beta[k].Float64()
		sb[k] = math.Sqrt(v)
	}
	sums := make([]float64, deg+1)
	abs := make([]float64, deg+1)
	for i := range x {
		p0, p1 := 0.0, 1/sb[0]
		for j := 0; j <= deg; j++ {
			sums[j] += w[i] * p1
			abs[j] += math.Abs(w[i] * p1)
			p0, p1 = p1, ((x[i]-al[j])*p1-sb[j]*p0)/sb[j+1]
			if j == 0 {
				p0 = 1 / sb[0]
			}
		}
	}
	worst := 0.0
	for j := range sums {
		target := 0.0
		if j == 0 {
			target = sb[0]
		}
		worst = math.Max(worst, math.Abs(sums[j]-target)/abs[j])
	}
	return worst
}

func TestRadauLobattoExactness(t *testing.T) {
	for _, c := range []struct {
		n    int
		a, b float64
	}{{5, 0, 0}, {12, -0.3, 0.8}, {40, 1.5, -0.6}, {150, -0.3, 0.8}, {400, 2, 0.5}} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		if err := fast.RadauJacobi(c.n, c.a, c.b, x, w); err != nil {
			t.Fatal(err)
		}
		if e := exactnessError(t, c.a, c.b, x, w, 2*c.n-2); e > 1e-13 {
			t.Errorf("radau n=%d a=%g b=%g: residual %.3g", c.n, c.a, c.b, e)
		}
		if err := fast.LobattoJacobi(c.n, c.a, c.b, x, w); err != nil {
			t.Fatal(err)
		}
		if e := exactnessError(t, c.a, c.b, x, w, 2*c.n-3); e > 1e-13 {
			t.Errorf("lobatto n=%d a=%g b=%g: residual %.3g", c.n, c.a, c.b, e)
		}
	}
}
