package systems

import "math/big"

// solve overwrites b with the solution of A y = b by Gaussian elimination
// with partial pivoting at prec bits, destroying A (n x n, row-major
// slices). It reports false for a matrix singular at that precision.
func solve(a [][]*big.Float, b []*big.Float, prec uint) bool {
	n := len(b)
	t := new(big.Float).SetPrec(prec)
	f := new(big.Float).SetPrec(prec)
	for k := 0; k < n; k++ {
		p := k
		for i := k + 1; i < n; i++ {
			if cmpAbs(a[i][k], a[p][k]) > 0 {
				p = i
			}
		}
		if a[p][k].Sign() == 0 {
			return false
		}
		a[k], a[p] = a[p], a[k]
		b[k], b[p] = b[p], b[k]
		for i := k + 1; i < n; i++ {
			if a[i][k].Sign() == 0 {
				continue
			}
			f.Quo(a[i][k], a[k][k])
			for j := k + 1; j < n; j++ {
				a[i][j].Sub(a[i][j], t.Mul(f, a[k][j]))
			}
			b[i].Sub(b[i], t.Mul(f, b[k]))
		}
	}
	for k := n - 1; k >= 0; k-- {
		for j := k + 1; j < n; j++ {
			b[k].Sub(b[k], t.Mul(a[k][j], b[j]))
		}
		b[k].Quo(b[k], a[k][k])
	}
	return true
}

// inverseAbsTimes returns |A^-1| v for a copy of A, at prec bits (column
// by column), or nil when A is singular at that precision.
func inverseAbsTimes(a [][]*big.Float, v []float64, prec uint) []float64 {
	n := len(v)
	out := make([]float64, n)
	for j := 0; j < n; j++ {
		if v[j] == 0 {
			continue
		}
		cp := make([][]*big.Float, n)
		for i := range cp {
			cp[i] = make([]*big.Float, n)
			for k := range cp[i] {
				cp[i][k] = new(big.Float).SetPrec(prec).Set(a[i][k])
			}
		}
		e := make([]*big.Float, n)
		for i := range e {
			e[i] = new(big.Float).SetPrec(prec)
		}
		e[j].SetInt64(1)
		if !solve(cp, e, prec) {
			return nil
		}
		for i := range e {
			f, _ := e[i].Float64()
			if f < 0 {
				f = -f
			}
			out[i] += f * v[j]
		}
	}
	return out
}

func cmpAbs(x, y *big.Float) int {
	return new(big.Float).Abs(x).Cmp(new(big.Float).Abs(y))
}
