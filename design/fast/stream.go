package fast

import (
	"fmt"
	"runtime"
)

// Kind names a rule for Stream.
type Kind int

// The rules Stream can produce.
const (
	GaussLegendre Kind = iota
	GaussJacobi
	RadauJacobiKind
	LobattoJacobiKind
	GaussHermite  // weight exp(-x^2); with scaled, weights times exp(x^2)
	GaussLaguerre // weight x^alpha exp(-x); with scaled, weights times exp(x)
)

// StreamBlock is the number of points Stream computes per block: large
// enough to keep every core busy, small enough (16 MB per block of
// float64 pairs) to stream rules of any size.
const StreamBlock = 1 << 20

// Stream calls emit(i, x_i, w_i) for i = 0..n-1 in ascending order of the
// nodes, for the n-point rule of the given kind (alpha and beta are used
// where the kind has them; scaled only for GaussHermite and GaussLaguerre).
// It stops at the first error emit returns and returns it. The values are
// those Legendre, Jacobi, RadauJacobi, LobattoJacobi, Hermite and Laguerre
// return.
//
// Gauss-Legendre points are computed block by block (memory O(StreamBlock),
// each block in parallel); the other kinds are computed in full first
// (memory 16 bytes per point), since their per-rule setup is shared by all
// nodes.
func Stream(kind Kind, n int, alpha, beta float64, scaled bool, emit func(i int, x, w float64) error) error {
	if n < 1 {
		return fmt.Errorf("the number of points %d is not positive", n)
	}
	if kind == GaussLegendre {
		return streamLegendre(n, emit)
	}
	x, w := make([]float64, n), make([]float64, n)
	var err error
	switch kind {
	case GaussJacobi:
		err = Jacobi(n, alpha, beta, x, w)
	case RadauJacobiKind:
		if n < 2 {
			return fmt.Errorf("a Radau rule needs at least 2 points, not %d", n)
		}
		err = RadauJacobi(n, alpha, beta, x, w)
	case LobattoJacobiKind:
		if n < 3 {
			return fmt.Errorf("a Lobatto rule needs at least 3 points, not %d", n)
		}
		err = LobattoJacobi(n, alpha, beta, x, w)
	case GaussHermite:
		Hermite(n, x, w, scaled)
	case GaussLaguerre:
		err = Laguerre(n, alpha, x, w, scaled)
	default:
		panic("fast: unknown Kind")
	}
	if err != nil {
		return err
	}
	for i := range x {
		if err := emit(i, x[i], w[i]); err != nil {
			return err
		}
	}
	return nil
}

func streamLegendre(n int, emit func(i int, x, w float64) error) error {
	size := min(n, StreamBlock)
	x, w := make([]float64, size), make([]float64, size)
	for lo := 0; lo < n; lo += size {
		hi := min(lo+size, n)
		legendreRange(n, lo, hi, x[:hi-lo], w[:hi-lo], nil)
		for i := lo; i < hi; i++ {
			if err := emit(i, x[i-lo], w[i-lo]); err != nil {
				return err
			}
		}
		runtime.Gosched()
	}
	return nil
}
