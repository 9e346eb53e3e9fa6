package fast_test

import (
	"math"
	"testing"

	"quadwright/design/fast"
)

// Acceptance figures of the issue: each node within max(2 ulp(theta)
// sin(theta), 1 ulp(x)) (NodeShare <= 1), each weight within 4 ulp.
const weightULPLimit = 4

func TestJacobiAgainstRecurrence(t *testing.T) {
	for _, c := range []struct {
		n       int
		a, b    float64
		samples int
	}{
		{1, 0.5, 0.5, 1},
		{20, -0.3, 0.8, 20},
		{99, 2, -0.7, 99},
		{100, 0, 0, 100},
		{150, -0.3, 0.8, 150},
		{1000, -0.3, 0.8, 80},
		{2000, 0.5, -0.5, 40},
		{2000, -0.9, 2.5, 40},
		{100000, -0.3, 0.8, 5},
	} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		if err := fast.Jacobi(c.n, c.a, c.b, x, w); err != nil {
			t.Fatal(err)
		}
		checkRule(t, c.n, x, w)
		r := newReference(t, jacobiFamily(t, c.a, c.b), c.n)
		acc := measure(r, x, w, samples(c.n, c.samples))
		t.Logf("jacobi n=%d a=%g b=%g: node share %.3g (%.3g ulp of x), weight %.3g ulp", c.n, c.a, c.b, acc.NodeShare, acc.NodeULP, acc.WeightULP)
		if acc.NodeShare > 1 || acc.WeightULP > weightULPLimit {
			t.Errorf("jacobi n=%d a=%g b=%g: %+v", c.n, c.a, c.b, acc)
		}
		sum := 0.0
		for _, v := range w {
			sum += v
		}
		if d := math.Abs(sum-r.mass) / r.mass; d > float64(c.n)*1e-16 {
			t.Errorf("jacobi n=%d: weight sum %v, mass %v", c.n, sum, r.mass)
		}
	}
}

// checkRule checks ascending nodes inside (-1, 1) and positive weights.
func checkRule(t *testing.T, n int, x, w []float64) {
	t.Helper()
	for i := 0; i < n; i++ {
		if !(w[i] > 0) || !(x[i] > -1 && x[i] < 1) || (i > 0 && !(x[i] > x[i-1])) {
			t.Fatalf("n=%d: bad point %d: x=%v w=%v", n, i, x[i], w[i])
		}
	}
}

func TestJacobiMatchesEngine(t *testing.T) {
	// design.Gauss in float64 mode prints the nearest double of each value;
	// the sampled reference must agree with it (which validates the
	// reference used at large n).
	n, a, b := 300, -0.3, 0.8
	f := jacobiFamily(t, a, b)
	xe, we := gaussRule(t, f, n)
	r := newReference(t, f, n)
	acc := measure(r, xe, we, samples(n, 60))
	if acc.NodeULP > 0.5 || acc.WeightULP > 0.5 {
		t.Errorf("engine vs reference: %+v", acc)
	}
}

func TestJacobiBadParameters(t *testing.T) {
	x, w := make([]float64, 10), make([]float64, 10)
	for _, ab := range [][2]float64{{-1, 0}, {0, -1.5}, {6, 0}, {math.NaN(), 0}} {
		if err := fast.Jacobi(10, ab[0], ab[1], x, w); err == nil {
			t.Errorf("alpha=%v beta=%v: no error", ab[0], ab[1])
		}
	}
}
