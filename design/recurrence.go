package design

import (
	"fmt"
	"math/big"
)

// Recurrence holds the first coefficients of the three-term recurrence
//
//	pi_{k+1}(x) = (x - Alpha[k]) pi_k(x) - Beta[k] pi_{k-1}(x),  pi_0 = 1, pi_{-1} = 0,
//
// of the monic orthogonal polynomials of a positive measure, with Beta[0]
// the total mass of the measure. len(Alpha) == len(Beta); every value is
// rounded to the precision the source was asked for.
type Recurrence struct {
	Alpha, Beta []*big.Float
}

// Len returns the number of coefficient pairs held.
func (r *Recurrence) Len() int { return len(r.Alpha) }

// Prefix returns the first n coefficient pairs (sharing storage); it panics
// if fewer are held.
func (r *Recurrence) Prefix(n int) *Recurrence {
	if n > r.Len() {
		panic(fmt.Sprintf("design: Prefix(%d) of a recurrence of length %d", n, r.Len()))
	}
	return &Recurrence{Alpha: r.Alpha[:n], Beta: r.Beta[:n]}
}

// RecurrenceSource yields the recurrence of one measure at any precision.
type RecurrenceSource interface {
	// Recurrence returns the coefficient pairs 0..n-1, each within a few
	// ulp at prec bits. It fails (with an error naming the input) when the
	// source cannot provide n pairs.
	Recurrence(n int, prec uint) (*Recurrence, error)
	// MaxLen is the number of pairs the source can provide; -1 when unlimited.
	MaxLen() int
}
