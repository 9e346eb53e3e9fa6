package element

import "math"

// pkdLen is the number of polynomials of total degree <= d in two
// variables, (d+1)(d+2)/2.
func pkdLen(d int) int { return (d + 1) * (d + 2) / 2 }

// pkd64 is the closed form of the PKD basis on the triangle, written
// separately from the generic jacobiBasis as the reference it is tested
// against (TestBasisIsPKD).
//
// pkd64 sets out[0:pkdLen(d)] to the orthonormal Proriol-Koornwinder-Dubiner
// polynomials psi_ik, i+k <= d, on the reference triangle (0,0),(1,0),(0,1)
// at (x, y), in float64, ordered by i for each total degree: out[j] holds
// psi_(i, n-i) with n the total degree and j = pkdLen(n-1) + i.
//
// In collapsed coordinates a = 2x/(1-y) - 1, b = 2y - 1,
//
//	psi_ik = sqrt((2i+1)(2i+2k+2)) P_i(a) ((1-b)/2)^i P_k^(2i+1,0)(b),
//
// orthonormal for the plain area integral (J. Proriol, "Sur une famille de
// polynomes a deux variables orthogonaux dans un triangle", C. R. Acad. Sci.
// Paris 245, 1957; T. Koornwinder, "Two-variable analogues of the classical
// orthogonal polynomials", in Theory and Application of Special Functions,
// Academic Press 1975; M. Dubiner, "Spectral methods on triangles and other
// domains", J. Sci. Comput. 6, 1991). The factor P_i(a) ((1-b)/2)^i is run
// as Q_i = P_i(a) s^i with s = 1-y and t = a s = 2x-1+y,
// Q_(i+1) = ((2i+1) t Q_i - i s^2 Q_(i-1)) / (i+1), so that nothing is
// divided by 1-y; P_k^(alpha,0) by its three-term recurrence (Abramowitz
// and Stegun 22.7.1). Accurate to a few ulp times the degree.
func pkd64(d int, x, y float64, out []float64) {
	s, t, b := 1-y, 2*x-1+y, 2*y-1
	q0, q1 := 0.0, 1.0
	for i := 0; i <= d; i++ {
		if i > 0 {
			q0, q1 = q1, (float64(2*i-1)*t*q1-float64(i-1)*s*s*q0)/float64(i)
		}
		al := float64(2*i + 1)
		p0, p1 := 0.0, 1.0
		for k := 0; i+k <= d; k++ {
			if k == 1 {
				p0, p1 = p1, (al+1)+(al+2)*(b-1)/2
			} else if k > 1 {
				n := float64(k)
				c := 2 * n * (n + al) * (2*n + al - 2)
				p0, p1 = p1, ((2*n+al-1)*((2*n+al)*(2*n+al-2)*b+al*al)*p1-2*(n+al-1)*(n-1)*(2*n+al)*p0)/c
			}
			out[pkdLen(i+k-1)+i] = math.Sqrt(float64((2*i+1)*(2*i+2*k+2))) * q1 * p1
		}
	}
}
