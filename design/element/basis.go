package element

import (
	"math"
	"math/big"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
)

// stage is one factor of a collapsed Jacobi basis: the homogeneous Jacobi
// polynomial Q_n(t, s) = P_n^(alpha,0)(t/s) s^n of the affine forms
// t = tc + tg.x and s = sc + sg.x, with alpha = aMul (n_1 + ... + n_(k-1))
// + aAdd from the degrees of the stages before it.
type stage struct {
	tc     int64
	tg     []int64
	sc     int64
	sg     []int64
	aMul   int
	aAdd   int
	affine bool // s is the constant 1
}

// jacobiBasis is an orthonormal basis of the polynomials of total degree
// <= deg on an element, each basis function a product over the stages of
// homogeneous Jacobi polynomials Q_(n_k), n_1 + ... + n_D <= deg, divided
// by its norm. With the stages of each shape (symmetry.go) this is the
// Proriol-Koornwinder-Dubiner basis on the triangle and tetrahedron (M.
// Dubiner, "Spectral methods on triangles and other domains", J. Sci.
// Comput. 6, 1991; S. J. Sherwin and G. E. Karniadakis, "A new triangular
// and tetrahedral basis for high-order finite element methods", Int. J.
// Numer. Meth. Eng. 38, 1995), tensor Legendre on the quadrilateral and
// hexahedron, PKD times Legendre on the prism, and on the pyramid the
// polynomial basis P_i(x/(1-z)) P_j(y/(1-z)) (1-z)^(i+j) P_k^(2i+2j+2,0)(2z-1),
// orthogonal because x = u(1-z), y = v(1-z) turns the pyramid into the cube
// with weight (1-z)^2.
//
// Orthogonality comes from the construction, exactly; the norms are
// computed in float64 by a Gauss-Legendre product rule in collapsed
// coordinates, so the functions are orthonormal to about 1e-15 and the
// same float64 scale factors are used in every precision (the moment
// equations stay exact: only the integral of the constant is nonzero).
type jacobiBasis struct {
	dim, deg int
	stages   []stage
	m        int
	scale    []float64
	coef     [][][3]float64 // coef[alpha][n]: Q_n = (c0 t + c1 s) Q_(n-1) - c2 s^2 Q_(n-2)
	ratCoef  [][][3]*big.Rat
	qbuf     [][]jet
	fbuf     [][]float64
	// scratch of valuesBig at bigPrec bits
	bigPrec                 uint
	bigCoef                 [][][3]*big.Float
	bigScale                []*big.Float
	bigT, bigS, bigS2, bigP []*big.Float
	bigQ                    [][]*big.Float
	bigTmp, bigTmp2, bigOne *big.Float
}

// jet is a value and its gradient (up to three coordinates).
type jet struct {
	v float64
	g [3]float64
}

func (a jet) mul(b jet) jet {
	return jet{a.v * b.v, [3]float64{a.v*b.g[0] + b.v*a.g[0], a.v*b.g[1] + b.v*a.g[1], a.v*b.g[2] + b.v*a.g[2]}}
}

// jacobiCoef returns the coefficients of the recurrence of P_n^(alpha,0)
// (Abramowitz and Stegun 22.7.1) in homogeneous form: for n = 1,
// Q_1 = ((alpha+2) t + alpha s) / 2; for n >= 2, with
// D = 2n (n+alpha) (2n+alpha-2),
// Q_n = ((2n+alpha-1)((2n+alpha)(2n+alpha-2) t + alpha^2 s) Q_(n-1)
// - 2 (n+alpha-1)(n-1)(2n+alpha) s^2 Q_(n-2)) / D.
func jacobiCoef(alpha, n int) [3]*big.Rat {
	a := int64(alpha)
	k := int64(n)
	if n == 1 {
		return [3]*big.Rat{big.NewRat(a+2, 2), big.NewRat(a, 2), new(big.Rat)}
	}
	d := 2 * k * (k + a) * (2*k + a - 2)
	return [3]*big.Rat{
		big.NewRat((2*k+a-1)*(2*k+a)*(2*k+a-2), d),
		big.NewRat((2*k+a-1)*a*a, d),
		big.NewRat(2*(k+a-1)*(k-1)*(2*k+a), d),
	}
}

type basisKey struct {
	s   Shape
	deg int
}

var basisCache sync.Map // basisKey -> *jacobiBasis (read-only after creation)

// basisFor returns a new evaluator of the orthonormal basis of degree deg
// on s. The scale factors are shared; the scratch buffers are the
// caller's.
func basisFor(s Shape, deg int) *jacobiBasis {
	if v, ok := basisCache.Load(basisKey{s, deg}); ok {
		return v.(*jacobiBasis).clone()
	}
	b := &jacobiBasis{dim: s.Dim(), deg: deg, stages: shapeStages(s)}
	amax := 2*deg + 3
	b.coef = make([][][3]float64, amax+1)
	b.ratCoef = make([][][3]*big.Rat, amax+1)
	for a := 0; a <= amax; a++ {
		b.coef[a] = make([][3]float64, deg+1)
		b.ratCoef[a] = make([][3]*big.Rat, deg+1)
		for n := 1; n <= deg; n++ {
			c := jacobiCoef(a, n)
			b.ratCoef[a][n] = c
			for i := range c {
				b.coef[a][n][i], _ = c[i].Float64()
			}
		}
	}
	b.alloc()
	b.m = b.count(0, 0)
	b.scale = make([]float64, b.m)
	for j := range b.scale {
		b.scale[j] = 1
	}
	// Norms by the n^dim Gauss-Legendre product on [0,1]^dim mapped onto
	// the element (collapse), n = deg+2: the squared basis functions times
	// the Jacobian have degree at most 2 deg + 2 in each direction.
	n := deg + 2
	gx, gw := make([]float64, n), make([]float64, n)
	quad.Legendre{}.FixedLocations(gx, gw, 0, 1)
	sq := make([]float64, b.m)
	val := make([]float64, b.m)
	u := make([]float64, b.dim)
	idx := make([]int, b.dim)
	for {
		w := 1.0
		for k := range u {
			u[k] = gx[idx[k]]
			w *= gw[idx[k]]
		}
		x, jac := collapse(s, u)
		b.values64(x, val)
		for j, v := range val {
			sq[j] += w * jac * v * v
		}
		k := 0
		for ; k < b.dim; k++ {
			if idx[k]++; idx[k] < n {
				break
			}
			idx[k] = 0
		}
		if k == b.dim {
			break
		}
	}
	for j := range b.scale {
		b.scale[j] = 1 / math.Sqrt(sq[j])
	}
	v, _ := basisCache.LoadOrStore(basisKey{s, deg}, b)
	return v.(*jacobiBasis).clone()
}

func (b *jacobiBasis) clone() *jacobiBasis {
	c := *b
	c.alloc()
	c.bigPrec = 0
	return &c
}

func (b *jacobiBasis) alloc() {
	b.qbuf = make([][]jet, len(b.stages))
	b.fbuf = make([][]float64, len(b.stages))
	for k := range b.qbuf {
		b.qbuf[k] = make([]jet, b.deg+1)
		b.fbuf[k] = make([]float64, b.deg+1)
	}
}

func (b *jacobiBasis) count(k, n int) int {
	if k == len(b.stages) {
		return 1
	}
	c := 0
	for m := 0; n+m <= b.deg; m++ {
		c += b.count(k+1, n+m)
	}
	return c
}

// affineJet is c + g.x as a jet.
func affineJet(c int64, g []int64, x []float64) jet {
	j := jet{v: float64(c)}
	for i, gi := range g {
		j.v += float64(gi) * x[i]
		j.g[i] = float64(gi)
	}
	return j
}

// eval64 sets val[j] to the j-th basis function at x and grad[j*dim+c] to
// its derivative in coordinate c (len(val) >= m, len(grad) >= m*dim).
func (b *jacobiBasis) eval64(x []float64, val, grad []float64) {
	idx := 0
	b.rec64(0, 0, jet{v: 1}, x, val, grad, &idx)
}

func (b *jacobiBasis) rec64(k, n int, pre jet, x []float64, val, grad []float64, idx *int) {
	st := &b.stages[k]
	t := affineJet(st.tc, st.tg, x)
	s := affineJet(st.sc, st.sg, x)
	s2 := s.mul(s)
	coef := b.coef[st.aMul*n+st.aAdd]
	q := b.qbuf[k]
	top := b.deg - n
	q[0] = jet{v: 1}
	for m := 1; m <= top; m++ {
		c := coef[m]
		var l jet
		l.v = c[0]*t.v + c[1]*s.v
		for i := 0; i < 3; i++ {
			l.g[i] = c[0]*t.g[i] + c[1]*s.g[i]
		}
		nq := l.mul(q[m-1])
		if m >= 2 {
			r := s2.mul(q[m-2])
			nq.v -= c[2] * r.v
			for i := 0; i < 3; i++ {
				nq.g[i] -= c[2] * r.g[i]
			}
		}
		q[m] = nq
	}
	last := k == len(b.stages)-1
	for m := 0; m <= top; m++ {
		p := pre.mul(q[m])
		if !last {
			b.rec64(k+1, n+m, p, x, val, grad, idx)
			continue
		}
		j := *idx
		sc := b.scale[j]
		val[j] = p.v * sc
		if grad != nil {
			for c := 0; c < b.dim; c++ {
				grad[j*b.dim+c] = p.g[c] * sc
			}
		}
		*idx = j + 1
	}
}

// values64 is eval64 without the gradients, faster.
func (b *jacobiBasis) values64(x []float64, val []float64) {
	idx := 0
	b.recVal64(0, 0, 1, x, val, &idx)
}

func (b *jacobiBasis) recVal64(k, n int, pre float64, x []float64, val []float64, idx *int) {
	st := &b.stages[k]
	t, s := float64(st.tc), float64(st.sc)
	for i := range st.tg {
		t += float64(st.tg[i]) * x[i]
		s += float64(st.sg[i]) * x[i]
	}
	s2 := s * s
	coef := b.coef[st.aMul*n+st.aAdd]
	q := b.fbuf[k]
	top := b.deg - n
	q[0] = 1
	for m := 1; m <= top; m++ {
		c := coef[m]
		q[m] = (c[0]*t + c[1]*s) * q[m-1]
		if m >= 2 {
			q[m] -= c[2] * s2 * q[m-2]
		}
	}
	if k == len(b.stages)-1 {
		j := *idx
		for m := 0; m <= top; m++ {
			val[j+m] = pre * q[m] * b.scale[j+m]
		}
		*idx = j + top + 1
		return
	}
	for m := 0; m <= top; m++ {
		b.recVal64(k+1, n+m, pre*q[m], x, val, idx)
	}
}

// valuesBig sets out[j] (allocated when nil) to the j-th basis function at
// x, every operation rounded to prec bits; the values carry all but a few
// times log2(deg) of their bits. The scratch values are kept in b between
// calls at the same precision.
func (b *jacobiBasis) valuesBig(x []*big.Float, prec uint, out []*big.Float) {
	if b.bigPrec != prec {
		b.prepareBig(prec)
	}
	tmp := b.bigTmp
	for k, st := range b.stages {
		t, s := b.bigT[k].SetInt64(st.tc), b.bigS[k].SetInt64(st.sc)
		for i := range st.tg {
			if st.tg[i] != 0 {
				t.Add(t, tmp.Mul(x[i], tmp.SetInt64(st.tg[i])))
			}
			if st.sg[i] != 0 {
				s.Add(s, tmp.Mul(x[i], tmp.SetInt64(st.sg[i])))
			}
		}
		b.bigS2[k].Mul(s, s)
	}
	idx := 0
	b.recBig(0, 0, b.bigOne, out, &idx)
}

func (b *jacobiBasis) prepareBig(prec uint) {
	nf := func() *big.Float { return new(big.Float).SetPrec(prec) }
	b.bigPrec = prec
	b.bigCoef = make([][][3]*big.Float, len(b.ratCoef))
	for a := range b.ratCoef {
		b.bigCoef[a] = make([][3]*big.Float, b.deg+1)
		for n := 1; n <= b.deg; n++ {
			r := b.ratCoef[a][n]
			b.bigCoef[a][n] = [3]*big.Float{nf().SetRat(r[0]), nf().SetRat(r[1]), nf().SetRat(r[2])}
		}
	}
	b.bigScale = make([]*big.Float, b.m)
	for j := range b.bigScale {
		b.bigScale[j] = nf().SetFloat64(b.scale[j])
	}
	ns := len(b.stages)
	b.bigT, b.bigS, b.bigS2 = make([]*big.Float, ns), make([]*big.Float, ns), make([]*big.Float, ns)
	b.bigQ, b.bigP = make([][]*big.Float, ns), make([]*big.Float, ns)
	for k := 0; k < ns; k++ {
		b.bigT[k], b.bigS[k], b.bigS2[k], b.bigP[k] = nf(), nf(), nf(), nf()
		b.bigQ[k] = make([]*big.Float, b.deg+1)
		for m := range b.bigQ[k] {
			b.bigQ[k][m] = nf()
		}
	}
	b.bigTmp, b.bigTmp2, b.bigOne = nf(), nf(), nf().SetInt64(1)
}

func (b *jacobiBasis) recBig(k, n int, pre *big.Float, out []*big.Float, idx *int) {
	st := b.stages[k]
	top := b.deg - n
	q := b.bigQ[k]
	q[0].SetInt64(1)
	coef := b.bigCoef[st.aMul*n+st.aAdd]
	l, u := b.bigTmp, b.bigTmp2
	for m := 1; m <= top; m++ {
		c := coef[m]
		l.Mul(c[0], b.bigT[k])
		u.Mul(c[1], b.bigS[k])
		l.Add(l, u)
		q[m].Mul(l, q[m-1])
		if m >= 2 {
			u.Mul(b.bigS2[k], q[m-2])
			u.Mul(u, c[2])
			q[m].Sub(q[m], u)
		}
	}
	p := b.bigP[k]
	for m := 0; m <= top; m++ {
		p.Mul(pre, q[m])
		if k < len(b.stages)-1 {
			b.recBig(k+1, n+m, p, out, idx)
			continue
		}
		j := *idx
		if out[j] == nil {
			out[j] = new(big.Float).SetPrec(b.bigPrec)
		}
		out[j].Mul(p, b.bigScale[j])
		*idx = j + 1
	}
}
