package design

import "math/big"

// cachedSource serves a build's repeated requests (two stages, the check,
// raised precisions) from one fetch of the underlying source at the largest
// length and precision asked so far, rounding down as needed. Masses from
// Gamma functions and exact rational coefficients are then computed once
// per build instead of once per stage.
type cachedSource struct {
	src  RecurrenceSource
	rec  *Recurrence
	prec uint
}

func (c *cachedSource) MaxLen() int { return c.src.MaxLen() }

// reserve makes sure n pairs at prec bits are held.
func (c *cachedSource) reserve(n int, prec uint) error {
	if c.rec != nil && c.rec.Len() >= n && c.prec >= prec {
		return nil
	}
	if c.rec != nil {
		n = max(n, c.rec.Len())
		prec = max(prec, c.prec)
	}
	rec, err := c.src.Recurrence(n, prec)
	if err != nil {
		return err
	}
	c.rec, c.prec = rec, prec
	return nil
}

// Recurrence returns n pairs rounded to prec bits.
func (c *cachedSource) Recurrence(n int, prec uint) (*Recurrence, error) {
	if err := c.reserve(n, prec); err != nil {
		return nil, err
	}
	r := &Recurrence{Alpha: make([]*big.Float, n), Beta: make([]*big.Float, n)}
	for k := 0; k < n; k++ {
		r.Alpha[k] = new(big.Float).SetPrec(prec).Set(c.rec.Alpha[k])
		r.Beta[k] = new(big.Float).SetPrec(prec).Set(c.rec.Beta[k])
	}
	return r, nil
}
