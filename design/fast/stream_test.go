package fast_test

import (
	"errors"
	"testing"

	"quadwright/design/fast"
)

func TestStreamMatchesSlices(t *testing.T) {
	for _, c := range []struct {
		kind fast.Kind
		n    int
	}{{fast.GaussLegendre, 3000}, {fast.GaussJacobi, 500}, {fast.RadauJacobiKind, 300}, {fast.LobattoJacobiKind, 300}, {fast.GaussHermite, 300}, {fast.GaussLaguerre, 300}} {
		x, w := make([]float64, c.n), make([]float64, c.n)
		var err error
		switch c.kind {
		case fast.GaussLegendre:
			fast.Legendre(c.n, x, w)
		case fast.GaussJacobi:
			err = fast.Jacobi(c.n, -0.3, 0.8, x, w)
		case fast.RadauJacobiKind:
			err = fast.RadauJacobi(c.n, -0.3, 0.8, x, w)
		case fast.LobattoJacobiKind:
			err = fast.LobattoJacobi(c.n, -0.3, 0.8, x, w)
		case fast.GaussHermite:
			fast.Hermite(c.n, x, w, false)
		case fast.GaussLaguerre:
			err = fast.Laguerre(c.n, -0.3, x, w, false)
		}
		if err != nil {
			t.Fatal(err)
		}
		next := 0
		err = fast.Stream(c.kind, c.n, -0.3, 0.8, false, func(i int, xi, wi float64) error {
			if i != next || xi != x[i] || wi != w[i] {
				t.Fatalf("kind %d: point %d: got (%v, %v), want (%v, %v)", c.kind, i, xi, wi, x[i], w[i])
			}
			next++
			return nil
		})
		if err != nil || next != c.n {
			t.Fatalf("kind %d: %v after %d points", c.kind, err, next)
		}
	}
	stop := errors.New("stop")
	if err := fast.Stream(fast.GaussLegendre, 10, 0, 0, false, func(i int, x, w float64) error { return stop }); err != stop {
		t.Errorf("emit error not returned: %v", err)
	}
	if err := fast.Stream(fast.GaussLegendre, 0, 0, 0, false, nil); err == nil {
		t.Error("n = 0 accepted")
	}
}

func TestCoreCountIndependence(t *testing.T) {
	n := 20000
	x1, w1 := make([]float64, n), make([]float64, n)
	x2, w2 := make([]float64, n), make([]float64, n)
	if err := fast.Jacobi(n, -0.3, 0.8, x1, w1); err != nil {
		t.Fatal(err)
	}
	prev := setProcs(1)
	err := fast.Jacobi(n, -0.3, 0.8, x2, w2)
	setProcs(prev)
	if err != nil {
		t.Fatal(err)
	}
	for i := range x1 {
		if x1[i] != x2[i] || w1[i] != w2[i] {
			t.Fatalf("point %d differs between core counts", i)
		}
	}
}
