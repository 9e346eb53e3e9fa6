package fast_test

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"quadwright/design/fast"
)

var unitLo, unitHalf = [2]float64{-1, 0}, [2]float64{1, 0}

// TestJacobiChebyshevMoments checks the moments' recurrence: for weight 1
// against the closed form 2/(1-k^2) at even k, 0 at odd k (handbook
// formula, integral of cos(k theta) sin(theta)); for (1-t)(1+t)^2, a
// polynomial weight, against gonum's Gauss-Legendre quadrature with 60
// points, exact up to degree 119.
func TestJacobiChebyshevMoments(t *testing.T) {
	m := fast.JacobiChebyshevMomentsF(0, 0, 2, 40)
	for k, v := range m {
		want := 0.0
		if k%2 == 0 {
			want = 2 / (1 - float64(k*k))
		}
		if math.Abs(v-want) > 1e-16 {
			t.Errorf("legendre m_%d = %v, want %v", k, v, want)
		}
	}
	m = fast.JacobiChebyshevMomentsF(1, 2, 4.0/3, 40) // mass of (1-t)(1+t)^2: 2^4 B(2, 3) = 4/3
	for k, v := range m {
		f := func(x float64) float64 {
			return (1 - x) * (1 + x) * (1 + x) * math.Cos(float64(k)*math.Acos(math.Max(-1, math.Min(1, x))))
		}
		want := quad.Fixed(f, -1, 1, 60, quad.Legendre{}, 0)
		if math.Abs(v-want) > 1e-14 {
			t.Errorf("(1-t)(1+t)^2: m_%d = %v, want %v", k, v, want)
		}
	}
}

// TestCheckChebyshevLegendre: a fast Gauss-Legendre rule passes every
// degree to 2N-1; a weight off by 1e-9 of itself stops it early.
func TestCheckChebyshevLegendre(t *testing.T) {
	for _, n := range []int{1000, 20001} {
		x, w := make([]float64, n), make([]float64, n)
		fast.Legendre(n, x, w)
		c, err := fast.CheckChebyshev(context.Background(), x, w, unitLo, unitHalf, [2]float64{2, 0}, [2]float64{}, [2]float64{}, 2*n-1, 20, 1e-15)
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("n=%d: %+v", n, c)
		if c.Degree != 2*n-1 {
			t.Errorf("n=%d: degree %d", n, c.Degree)
		}
		if !c.Symmetric {
			t.Errorf("n=%d: the symmetric rule was not seen as symmetric", n)
		}
		// Perturbed in a mirror pair (the symmetric path) and alone.
		for _, pair := range []bool{true, false} {
			w[n/3] *= 1 + 1e-9
			if pair {
				w[n-1-n/3] = w[n/3]
			}
			c, err = fast.CheckChebyshev(context.Background(), x, w, unitLo, unitHalf, [2]float64{2, 0}, [2]float64{}, [2]float64{}, 2*n-1, 20, 1e-15)
			if err != nil || c.Degree >= 2*n-1 || c.Symmetric != pair {
				t.Errorf("n=%d perturbed (pair %v): degree %d, symmetric %v, %v", n, pair, c.Degree, c.Symmetric, err)
			}
		}
	}
}

// TestCosSumsAgree compares the transform with direct sums at random
// angles (through CheckChebyshev's own agreement test on a random rule).
func TestCosSumsAgree(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	n := 3000
	x, w := make([]float64, n), make([]float64, n)
	for i := range x {
		x[i] = 2*rng.Float64() - 1
		w[i] = rng.Float64()
	}
	c, err := fast.CheckChebyshev(context.Background(), x, w, unitLo, unitHalf, [2]float64{2, 0}, [2]float64{}, [2]float64{}, 4000, 60, 1e-15)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%+v", c)
}
