package element

import (
	"math"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// nnls returns x >= 0 minimising ||A x - b||_2 (A m x n, len(b) == m) by
// the active-set method of C. L. Lawson and R. J. Hanson (Solving Least
// Squares Problems, Prentice-Hall 1974, chapter 23, algorithm NNLS). At
// most rank(A) <= m entries of x are positive. It stops when no inactive
// variable would lower the residual (no entry of the gradient A^T (b - A x)
// above tol ||b||; A is meant to have rows of norm about 1), when the
// residual falls below tol ||b||, or after maxIter outer steps, and returns
// the residual norm.
//
// Used for the positive subsampling of a discrete measure that Tchakaloff's
// theorem promises (V. Tchakaloff, "Formules de cubatures mécaniques à
// coefficients non négatifs", Bull. Sci. Math. 81, 1957; computed as in A.
// Sommariva and M. Vianello, "Compression of multivariate discrete
// measures and applications", Numer. Funct. Anal. Optim. 36, 2015).
func nnls(A *mat.Dense, b []float64, tol float64, maxIter int) (x []float64, res float64) {
	m, n := A.Dims()
	x = make([]float64, n)
	passive := make([]bool, n)
	var P []int
	r := make([]float64, m)
	w := make([]float64, n)
	bn := floats.Norm(b, 2)
	residual := func() {
		copy(r, b)
		for _, j := range P {
			floats.AddScaled(r, -x[j], mat.Col(nil, j, A))
		}
	}
	residual()
	for it := 0; it < maxIter; it++ {
		if floats.Norm(r, 2) <= tol*bn || len(P) >= m {
			break
		}
		mat.NewVecDense(n, w).MulVec(A.T(), mat.NewVecDense(m, r))
		t, wmax := -1, tol*bn
		for j := 0; j < n; j++ {
			if !passive[j] && w[j] > wmax {
				t, wmax = j, w[j]
			}
		}
		if t < 0 {
			break
		}
		passive[t] = true
		P = append(P, t)
		for inner := 0; inner < 3*n; inner++ {
			z, ok := lsOn(A, b, P)
			if !ok {
				// A column dependent on the others: leave it out.
				passive[t] = false
				P = P[:len(P)-1]
				w[t] = 0
				break
			}
			alpha := 1.0
			allPos := true
			for k, j := range P {
				if z[k] <= 0 {
					allPos = false
					if a := x[j] / (x[j] - z[k]); a < alpha {
						alpha = a
					}
				}
			}
			if allPos {
				for k, j := range P {
					x[j] = z[k]
				}
				break
			}
			keep := P[:0]
			for k, j := range P {
				x[j] += alpha * (z[k] - x[j])
				if x[j] <= 1e-300 {
					x[j] = 0
					passive[j] = false
					continue
				}
				keep = append(keep, j)
			}
			P = keep
		}
		residual()
	}
	return x, floats.Norm(r, 2)
}

// lsOn solves the least-squares problem on the columns cols of A; ok is
// false when they are (numerically) dependent.
func lsOn(A *mat.Dense, b []float64, cols []int) ([]float64, bool) {
	m, _ := A.Dims()
	sub := mat.NewDense(m, len(cols), nil)
	for k, j := range cols {
		sub.SetCol(k, mat.Col(nil, j, A))
	}
	var qr mat.QR
	qr.Factorize(sub)
	var z mat.Dense
	if err := qr.SolveTo(&z, false, mat.NewVecDense(m, append([]float64(nil), b...))); err != nil {
		if c, isCond := err.(mat.Condition); isCond && !math.IsInf(float64(c), 1) && float64(c) < 1e14 {
			return mat.Col(nil, 0, &z), true
		}
		return nil, false
	}
	return mat.Col(nil, 0, &z), true
}
