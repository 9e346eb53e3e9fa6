package systems

import (
	"math/big"

	"quadwright/precision"
)

// solve overwrites b with the solution of A y = b by Gaussian elimination
// with partial pivoting at prec bits (rounded up to whole 64-bit words),
// destroying A (n x n, row-major slices). It reports false for a matrix
// singular at that precision. The elimination runs in precision.Real,
// whose operations allocate nothing (it rounds toward zero: the same
// bound on each operation's relative error as rounding to nearest, within
// a factor 2); the O(n^3) loop is most of a Newton step's cost.
func solve(a [][]*big.Float, b []*big.Float, prec uint) bool {
	n := len(b)
	rows := make([][]*precision.Real, n)
	flat := precision.NewRealSlice(n*n+n, prec)
	rb := flat[n*n:]
	for i := range rows {
		rows[i] = flat[i*n : (i+1)*n]
		for j := range rows[i] {
			rows[i][j].SetBig(a[i][j])
		}
		rb[i].SetBig(b[i])
	}
	t := precision.NewReal(prec)
	f := precision.NewReal(prec)
	for k := 0; k < n; k++ {
		p := k
		for i := k + 1; i < n; i++ {
			if rows[i][k].CmpAbs(rows[p][k]) > 0 {
				p = i
			}
		}
		if rows[p][k].IsZero() {
			return false
		}
		rows[k], rows[p] = rows[p], rows[k]
		rb[k], rb[p] = rb[p], rb[k]
		for i := k + 1; i < n; i++ {
			if rows[i][k].IsZero() {
				continue
			}
			f.Quo(rows[i][k], rows[k][k])
			ri, rk := rows[i], rows[k]
			for j := k + 1; j < n; j++ {
				ri[j].Sub(ri[j], t.Mul(f, rk[j]))
			}
			rb[i].Sub(rb[i], t.Mul(f, rb[k]))
		}
	}
	for k := n - 1; k >= 0; k-- {
		for j := k + 1; j < n; j++ {
			rb[k].Sub(rb[k], t.Mul(rows[k][j], rb[j]))
		}
		rb[k].Quo(rb[k], rows[k][k])
	}
	for i := range b {
		b[i] = rb[i].Big(new(big.Float).SetPrec(prec))
	}
	return true
}

// lu is an LU factorisation with partial pivoting (factor), for solving
// with one matrix many times.
type lu struct {
	a    [][]*big.Float // L below the diagonal (unit diagonal), U on and above
	perm []int          // row k of the factors is row perm[k] of the matrix
	prec uint
}

// factor returns the LU factors of a copy of A at prec bits, or false for
// a matrix singular at that precision.
func factor(a [][]*big.Float, prec uint) (*lu, bool) {
	n := len(a)
	f := &lu{a: make([][]*big.Float, n), perm: make([]int, n), prec: prec}
	for i := range a {
		f.a[i] = cloneAt(a[i], prec)
		f.perm[i] = i
	}
	t := new(big.Float).SetPrec(prec)
	for k := 0; k < n; k++ {
		p := k
		for i := k + 1; i < n; i++ {
			if cmpAbs(f.a[i][k], f.a[p][k]) > 0 {
				p = i
			}
		}
		if f.a[p][k].Sign() == 0 {
			return nil, false
		}
		f.a[k], f.a[p] = f.a[p], f.a[k]
		f.perm[k], f.perm[p] = f.perm[p], f.perm[k]
		for i := k + 1; i < n; i++ {
			l := f.a[i][k].Quo(f.a[i][k], f.a[k][k])
			if l.Sign() == 0 {
				continue
			}
			for j := k + 1; j < n; j++ {
				f.a[i][j].Sub(f.a[i][j], t.Mul(l, f.a[k][j]))
			}
		}
	}
	return f, true
}

// solve returns A^-1 b at the factors' precision (b is not modified).
func (f *lu) solve(b []*big.Float) []*big.Float {
	n := len(b)
	y := make([]*big.Float, n)
	t := new(big.Float).SetPrec(f.prec)
	for k := 0; k < n; k++ {
		y[k] = new(big.Float).SetPrec(f.prec).Set(b[f.perm[k]])
		for j := 0; j < k; j++ {
			y[k].Sub(y[k], t.Mul(f.a[k][j], y[j]))
		}
	}
	for k := n - 1; k >= 0; k-- {
		for j := k + 1; j < n; j++ {
			y[k].Sub(y[k], t.Mul(f.a[k][j], y[j]))
		}
		y[k].Quo(y[k], f.a[k][k])
	}
	return y
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
