package fast_test

import (
	"context"
	"testing"

	"quadwright/design"
	"quadwright/design/fast"
	"quadwright/moments"
)

// familyRecurrence is the monic recurrence of design.FamilySource rounded
// to float64: an independent source of the coefficients.
func familyRecurrence(t testing.TB, f moments.Family, n int) (al, be []float64) {
	t.Helper()
	rec, err := design.FamilySource{Family: f}.Recurrence(n, 128)
	if err != nil {
		t.Fatal(err)
	}
	al, be = make([]float64, n), make([]float64, n)
	for k := 0; k < n; k++ {
		al[k], _ = rec.Alpha[k].Float64()
		be[k], _ = rec.Beta[k].Float64()
	}
	return al, be
}

// TestCheckDegree: the fast rules are exact through their nominal degree
// 2n-1 by the audit's criterion (tol = 10 u, u = 10^-16, the unit of the
// 17th digit), and a rule with its largest weight off by 1e-9 relative fails
// already at degree 0 (the residual, about 1e-12, is far above 1e-15).
func TestCheckDegree(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		name string
		n    int
		f    moments.Family
	}{
		{"legendre", 1500, jacobiFamily(t, 0, 0)},
		{"jacobi", 1200, jacobiFamily(t, -0.5, 0.5)},
		{"hermite", 400, hermiteFamily(t)},
		{"laguerre", 300, laguerreFamily(t, 0)},
	} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		var err error
		switch c.name {
		case "legendre":
			fast.Legendre(c.n, x, w)
		case "jacobi":
			err = fast.Jacobi(c.n, -0.5, 0.5, x, w)
		case "hermite":
			fast.Hermite(c.n, x, w, false)
		case "laguerre":
			err = fast.Laguerre(c.n, 0, x, w, false)
		}
		if err != nil {
			t.Fatal(err)
		}
		al, be := familyRecurrence(t, c.f, 2*c.n)
		double := c.name == "laguerre"
		deg, worst, err := fast.CheckDegree(ctx, al, be, x, w, 2*c.n-1, 1e-15, double)
		t.Logf("%s n=%d: degree %d, worst share %.3g", c.name, c.n, deg, worst)
		if err != nil || deg != 2*c.n-1 {
			t.Errorf("%s n=%d: degree %d (%v), want %d", c.name, c.n, deg, err, 2*c.n-1)
		}
		big := 0
		for i := range w {
			if w[i] > w[big] {
				big = i
			}
		}
		w[big] *= 1 + 1e-9
		if deg, _, _ := fast.CheckDegree(ctx, al, be, x, w, 2*c.n-1, 1e-15, double); deg >= 0 {
			t.Errorf("%s n=%d: a perturbed weight still passes degree %d", c.name, c.n, deg)
		}
	}
}

func BenchmarkCheckDegree20000(b *testing.B) {
	n := 20000
	x, w := make([]float64, n), make([]float64, n)
	fast.Legendre(n, x, w)
	al, be := familyRecurrence(b, jacobiFamily(b, 0, 0), 2*n)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if deg, _, _ := fast.CheckDegree(context.Background(), al, be, x, w, 2*n-1, 1e-15, false); deg != 2*n-1 {
			b.Fatal(deg)
		}
	}
}
