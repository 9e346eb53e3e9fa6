package design

import (
	"fmt"
	"math/big"

	"quadwright/moments"
)

// SupportError reports moments that belong to no positive measure on the
// support stated with them: the Points-point Gauss rule they fix (the
// smallest one that fails) has a node at or beyond the end named.
type SupportError struct {
	Support moments.Interval
	Upper   bool // the right end fails; else the left end
	Points  int
}

func (e *SupportError) Error() string {
	var side, form string
	if e.Upper {
		side, form = "above the right end "+e.Support.Hi.String(), linearForm(e.Support.Hi.Value, true)
	} else {
		side, form = "below the left end "+e.Support.Lo.String(), linearForm(e.Support.Lo.Value, false)
	}
	return fmt.Sprintf("these moments belong to no positive measure on %s: their %d-point Gauss rule has a node at or %s (the Hankel form of %s is not positive definite)",
		e.Support, e.Points, side, form)
}

// linearForm writes x - end (upper: end - x) as a user would, e.g. "x",
// "x + 2", "1 - x", "-x".
func linearForm(end *big.Rat, upper bool) string {
	v := moments.RatString(end)
	switch {
	case end.Sign() == 0 && upper:
		return "-x"
	case end.Sign() == 0:
		return "x"
	case upper:
		return v + " - x"
	case end.Sign() < 0:
		return "x + " + moments.RatString(new(big.Rat).Neg(end))
	}
	return "x - " + v
}

// CheckSupport tests that the recurrence rec (n pairs, from 2n moments)
// belongs to a positive measure on iv: that the Hankel forms of x - a and
// b - x on the polynomials of degree < n are positive definite for each
// finite end a, b. In the orthonormal basis those forms are J_n - aI and
// bI - J_n, J_n the Jacobi matrix of rec, so the test is the signs of the
// pivots of their LDL^T factorisations,
//
//	d_0 = alpha_0 - a,  d_k = (alpha_k - a) - beta_k / d_{k-1},
//
// all positive exactly when every node of the k-point Gauss rule lies
// above a, for every k <= n (Krein and Nudelman, "The Markov moment problem
// and extremal problems", AMS Translations of Mathematical Monographs 50,
// 1977, for the truncated Hausdorff and Stieltjes moment problems). The
// pivot recurrence is the Sturm count of the Jacobi matrix, which is
// backward stable (W. Kahan, "Accurate eigenvalues of a symmetric
// tri-diagonal matrix", Stanford CS report 41, 1966): its computed signs
// are exact for a matrix within a few ulp of J_n, and rec itself is within
// a few ulp of the pairs the moments fix. The first k at which a pivot is
// not positive names the smallest failing rule. Infinite ends are not
// tested. It returns a *SupportError, or nil.
func CheckSupport(rec *Recurrence, iv moments.Interval) error {
	if iv.Lo.Finite() {
		if k := firstNonPositivePivot(rec, iv.Lo.Value, false); k >= 0 {
			return &SupportError{Support: iv, Points: k + 1}
		}
	}
	if iv.Hi.Finite() {
		if k := firstNonPositivePivot(rec, iv.Hi.Value, true); k >= 0 {
			return &SupportError{Support: iv, Upper: true, Points: k + 1}
		}
	}
	return nil
}

// firstNonPositivePivot returns the first k whose pivot of J - end I
// (upper: end I - J) is <= 0, or -1 when every pivot is positive. It works
// at the precision of rec's coefficients.
func firstNonPositivePivot(rec *Recurrence, end *big.Rat, upper bool) int {
	if rec.Len() == 0 {
		return -1
	}
	prec := rec.Alpha[0].Prec()
	e := new(big.Float).SetPrec(prec).SetRat(end)
	d := new(big.Float).SetPrec(prec)
	t := new(big.Float).SetPrec(prec)
	for k := range rec.Alpha {
		if upper {
			t.Sub(e, rec.Alpha[k])
		} else {
			t.Sub(rec.Alpha[k], e)
		}
		if k > 0 {
			q := new(big.Float).SetPrec(prec).Quo(rec.Beta[k], d)
			t.Sub(t, q)
		}
		if t.Sign() <= 0 {
			return k
		}
		d.Set(t)
	}
	return -1
}

// SupportStater is implemented by measures that may come without a stated
// support (a raw moment list without --interval): their Domain is then the
// whole line, for computation only.
type SupportStater interface {
	SupportGiven() bool
}

// supportGiven reports whether m's Domain was stated by the user or its
// family; true for every measure that is not a SupportStater.
func supportGiven(m Measure) bool {
	if s, ok := m.(SupportStater); ok {
		return s.SupportGiven()
	}
	return true
}
