package precision

import (
	"math/big"
	"math/bits"
)

// Add sets z to x+y rounded toward zero to z's precision and returns z.
// The result is exact when it is representable, in particular x + (-x) = 0.
func (z *Real) Add(x, y *Real) *Real { return z.add(x, y, false) }

// Sub sets z to x-y rounded toward zero to z's precision and returns z.
// The result is exact when it is representable: x - x = 0, and x - y for
// y/2 <= x <= 2y (Sterbenz' lemma) at equal precisions.
func (z *Real) Sub(x, y *Real) *Real { return z.add(x, y, true) }

// add sets z to x + y, or x - y if sub, rounded toward zero.
func (z *Real) add(x, y *Real, sub bool) *Real {
	w := len(z.mant)
	if len(x.mant) != w || len(y.mant) != w {
		if sub {
			return z.mixed(opSub, x, y)
		}
		return z.mixed(opAdd, x, y)
	}
	yneg := y.neg != sub
	if x.zero || y.zero {
		if y.zero {
			return z.Set(x)
		}
		z.Set(y)
		z.neg = yneg
		return z
	}
	a, b, neg := x, y, x.neg
	if x.exp < y.exp {
		a, b, neg = y, x, yneg
	}
	e, d := a.exp, uint64(a.exp-b.exp)
	if x.neg == yneg {
		var c bool
		if d < 64 && w <= 4 {
			s := uint(d)
			switch w {
			case 1:
				c = add1((*[1]uint64)(z.mant), (*[1]uint64)(a.mant), (*[1]uint64)(b.mant), s)
			case 2:
				c = add2((*[2]uint64)(z.mant), (*[2]uint64)(a.mant), (*[2]uint64)(b.mant), s)
			case 3:
				c = add3((*[3]uint64)(z.mant), (*[3]uint64)(a.mant), (*[3]uint64)(b.mant), s)
			case 4:
				c = add4((*[4]uint64)(z.mant), (*[4]uint64)(a.mant), (*[4]uint64)(b.mant), s)
			}
		} else {
			c = addShifted(z.mant, a.mant, b.mant, d)
		}
		if c {
			z.setExp(e + 1)
		} else {
			z.exp = e
		}
		z.neg, z.zero = neg, false
		return z
	}
	if d == 0 {
		switch cmpWords(x.mant, y.mant) {
		case 0:
			return z.setZero()
		case -1:
			a, b, neg = y, x, yneg
		}
	}
	var l int64
	if d < 64 && w <= 4 {
		s := uint(d)
		switch w {
		case 1:
			l = sub1((*[1]uint64)(z.mant), (*[1]uint64)(a.mant), (*[1]uint64)(b.mant), s)
		case 2:
			l = sub2((*[2]uint64)(z.mant), (*[2]uint64)(a.mant), (*[2]uint64)(b.mant), s)
		case 3:
			l = sub3((*[3]uint64)(z.mant), (*[3]uint64)(a.mant), (*[3]uint64)(b.mant), s)
		case 4:
			l = sub4((*[4]uint64)(z.mant), (*[4]uint64)(a.mant), (*[4]uint64)(b.mant), s)
		}
	} else {
		l = subShifted(z.mant, a.mant, b.mant, d)
	}
	z.setExp(e - l)
	z.neg, z.zero = neg, false
	return z
}

// addShifted sets z to the top len(z) words of a + b*2^-d, where a, b and z
// are mantissas of equal length aligned at the top, and reports whether the
// sum carried out of the top word, in which case z holds the sum shifted
// right one bit (top bit set). Bits of b below a's last word are dropped;
// since a's bits there are zero, this truncates the exact sum toward zero.
// z may alias a or b: word i of z is written after every word of a and b
// that it depends on and no later word depends on index i of z.
func addShifted(z, a, b []uint64, d uint64) bool {
	w := len(z)
	a, b = a[:w], b[:w]
	if d >= uint64(64*w) {
		copy(z, a) // 0 < b < ulp(a)
		return false
	}
	q, s := int(d>>6), uint(d&63)
	n := w - q // words of a that meet bits of b
	c := addShiftedVV(z[:n], a[:n], b[q:], s)
	for i := n; i < w; i++ {
		z[i], c = bits.Add64(a[i], 0, c)
	}
	if c == 0 {
		return false
	}
	for i := 0; i < w-1; i++ {
		z[i] = z[i]>>1 | z[i+1]<<63
	}
	z[w-1] = z[w-1]>>1 | 1<<63
	return true
}

// subShifted sets z to the exact difference a - b*2^-d rounded toward zero
// to len(z) words, for mantissas aligned at the top with a > b*2^-d, and
// returns the left shift l that normalised it (the result exponent is a's
// minus l). z may alias a or b.
//
// One guard word g below a's last word holds the next 64 bits of b, and a
// sticky unit stands for all of b's bits below it. Subtracting b's guard
// bits plus one guard unit when the sticky bits are nonzero gives a value
// D' = D - delta with 0 <= delta < 1 guard unit, where D is the exact
// difference; D' is a multiple of the guard unit and D lies strictly between
// D' and D' + 1 unit. The final grid (ulp of the result) is a multiple of
// the guard unit because the normalising shift is at most one bit whenever
// the sticky bits are nonzero (d >= 2 implies a - b > a/2), so truncating
// D' and truncating D give the same result: rounding toward zero is exact.
// When d <= 1 no bit of b falls below the guard word and D' = D.
func subShifted(z, a, b []uint64, d uint64) int64 {
	w := len(z)
	a, b = a[:w], b[:w]
	var g, sticky uint64
	q, s := int(d>>6), uint(d&63)
	if q > w {
		sticky = 1
	} else {
		if q >= 1 {
			g = b[q-1] >> s
			st := b[q-1] << (64 - s) // the s bits shifted out; 0 for s = 0
			for _, v := range b[:q-1] {
				st |= v
			}
			if st != 0 {
				sticky = 1
			}
		}
		if q < w {
			g |= b[q] << (64 - s)
		}
	}
	var br uint64
	g, br = bits.Sub64(0, g, sticky)
	if q < w {
		n := w - q
		br = subShiftedVV(z[:n], a[:n], b[q:], s, br)
		for i := n; i < w; i++ {
			z[i], br = bits.Sub64(a[i], 0, br)
		}
	} else {
		for i := range z {
			z[i], br = bits.Sub64(a[i], 0, br)
		}
	}
	return normLeft(z, g)
}

// addShiftedVV sets z = a + (b >> s) + carry-free, over n = len(z) words
// with b's bits beyond its n-th word treated as zero, and returns the carry.
// len(a) and len(b) must equal len(z); z may alias a, or b at the same offset.
func addShiftedVV(z, a, b []uint64, s uint) uint64 {
	n := len(z)
	a, b = a[:n], b[:n]
	var c uint64
	if s == 0 {
		for i, bi := range b {
			z[i], c = bits.Add64(a[i], bi, c)
		}
		return c
	}
	for i := 0; i < n-1; i++ {
		z[i], c = bits.Add64(a[i], b[i]>>s|b[i+1]<<(64-s), c)
	}
	z[n-1], c = bits.Add64(a[n-1], b[n-1]>>s, c)
	return c
}

// subShiftedVV is addShiftedVV for a - (b >> s) - br, returning the borrow.
func subShiftedVV(z, a, b []uint64, s uint, br uint64) uint64 {
	n := len(z)
	a, b = a[:n], b[:n]
	if s == 0 {
		for i, bi := range b {
			z[i], br = bits.Sub64(a[i], bi, br)
		}
		return br
	}
	for i := 0; i < n-1; i++ {
		z[i], br = bits.Sub64(a[i], b[i]>>s|b[i+1]<<(64-s), br)
	}
	z[n-1], br = bits.Sub64(a[n-1], b[n-1]>>s, br)
	return br
}

// normLeft shifts the w+1 words (z, g), g the lowest, left until z's top
// bit is set, keeps the top w words in z and returns the shift. (z, g) must
// not be zero.
func normLeft(z []uint64, g uint64) int64 {
	w := len(z)
	if z[w-1] >= 1<<63 {
		return 0
	}
	if z[w-1] != 0 {
		// The common case, a shift by less than a word.
		lb := uint(bits.LeadingZeros64(z[w-1]))
		for i := w - 1; i > 0; i-- {
			z[i] = z[i]<<lb | z[i-1]>>(64-lb)
		}
		z[0] = z[0]<<lb | g>>(64-lb)
		return int64(lb)
	}
	k := w - 1
	for k >= 0 && z[k] == 0 {
		k--
	}
	var lw int
	var lb uint
	if k >= 0 {
		lw, lb = w-1-k, uint(bits.LeadingZeros64(z[k]))
	} else {
		lw, lb = w, uint(bits.LeadingZeros64(g))
	}
	ext := func(k int) uint64 { // word k of (z, g), g being word 0
		switch {
		case k < 0:
			return 0
		case k == 0:
			return g
		}
		return z[k-1]
	}
	for i := w - 1; i >= 0; i-- {
		k := i + 1 - lw
		z[i] = ext(k)<<lb | ext(k-1)>>(64-lb)
	}
	return int64(64*lw) + int64(lb)
}

// Mul sets z to x*y rounded toward zero to z's precision and returns z.
func (z *Real) Mul(x, y *Real) *Real {
	w := len(z.mant)
	if len(x.mant) != w || len(y.mant) != w {
		return z.mixed(opMul, x, y)
	}
	if x.zero || y.zero {
		return z.setZero()
	}
	e, neg := x.exp+y.exp, x.neg != y.neg
	var sh bool
	switch w {
	case 1:
		hi, lo := bits.Mul64(x.mant[0], y.mant[0])
		if hi < 1<<63 {
			hi, sh = hi<<1|lo>>63, true
		}
		z.mant[0] = hi
	case 2:
		sh = mul2((*[2]uint64)(z.mant), (*[2]uint64)(x.mant), (*[2]uint64)(y.mant))
	case 3:
		sh = mul3((*[3]uint64)(z.mant), (*[3]uint64)(x.mant), (*[3]uint64)(y.mant))
	case 4:
		sh = mul4((*[4]uint64)(z.mant), (*[4]uint64)(x.mant), (*[4]uint64)(y.mant))
	case 5:
		sh = mul5((*[5]uint64)(z.mant), (*[5]uint64)(x.mant), (*[5]uint64)(y.mant))
	default:
		sh = mulLarge(z.mant, x.mant, y.mant)
	}
	if sh {
		e--
	}
	z.setExp(e)
	z.neg, z.zero = neg, false
	return z
}

// mulLarge is mulTop with scratch space for W > 4.
func mulLarge(z, x, y []uint64) bool {
	w := len(z)
	if wordsOK && w >= mulBigWords {
		return mulViaBig(z, x, y)
	}
	if w > 64 {
		return mulTop(z, x, y, make([]uint64, w+2))
	}
	var p [66]uint64
	return mulTop(z, x, y, p[:w+2])
}

// mulTop sets z to the top len(z) = W words of the exact product x*y of two
// normalised mantissas, shifted left one bit if the product's top bit is
// clear (which it reports), that is the product rounded toward zero.
// p is scratch of W+2 words; z may alias x or y.
//
// Only the partial products x[i]*y[j] with i+j >= W-2 are summed, into the
// product's words W-2 .. 2W-1. Writing B = 2^64, the dropped ones sum to
//
//	E <= sum_{c=0}^{W-3} (c+1) (B-1)^2 B^c < (W-1) B^(W-1),
//
// so the computed P' satisfies P - E <= P' <= P: the true product exceeds
// P' by less than W-1 units of word W-1. Truncating P and P' to the top W
// words (after the shift) differs only if adding E to P' carries across the
// kept part, which requires word W-1 of P', with its top bit forced to one
// to cover the shifted case, to be at least B - W. In that rare case
// (probability about W 2^-64 for random operands) the full product is
// formed, so the result is always the exactly truncated product.
func mulTop(z, x, y, p []uint64) bool {
	w := len(z)
	x, y, p = x[:w], y[:w], p[:w+2]
	clear(p)
	for i, xi := range x {
		j0 := max(w-2-i, 0)
		off := i + j0 - (w - 2)
		var c uint64
		for j := j0; j < w; j++ {
			hi, lo := bits.Mul64(xi, y[j])
			var cc uint64
			lo, cc = bits.Add64(lo, p[off+j-j0], 0)
			hi += cc
			lo, cc = bits.Add64(lo, c, 0)
			hi += cc
			p[off+j-j0] = lo
			c = hi
		}
		p[i+2] = c
	}
	if w >= 3 && p[1]|1<<63 >= -uint64(w) {
		return mulExact(z, x, y)
	}
	return normProduct(z, p[2:], p[1])
}

// mulAddVW adds y*m to z, both of len(z) words, and returns the carry
// word.
func mulAddVW(z, y []uint64, m uint64) uint64 {
	y = y[:len(z)]
	var c uint64
	for j, yj := range y {
		hi, lo := bits.Mul64(m, yj)
		var cc uint64
		lo, cc = bits.Add64(lo, z[j], 0)
		hi += cc
		lo, cc = bits.Add64(lo, c, 0)
		hi += cc
		z[j] = lo
		c = hi
	}
	return c
}

// normProduct sets z to hi, or to hi shifted left one bit with the top bit
// of below shifted in if hi's top bit is clear, which it reports.
func normProduct(z, hi []uint64, below uint64) bool {
	w := len(z)
	if hi[w-1] >= 1<<63 {
		copy(z, hi)
		return false
	}
	for i := w - 1; i > 0; i-- {
		z[i] = hi[i]<<1 | hi[i-1]>>63
	}
	z[0] = hi[0]<<1 | below>>63
	return true
}

// mulExact is mulTop forming the full 2W-word product.
func mulExact(z, x, y []uint64) bool {
	w := len(z)
	var buf [128]uint64
	var p []uint64
	if 2*w <= len(buf) {
		p = buf[:2*w]
	} else {
		p = make([]uint64, 2*w)
	}
	clear(p)
	for i, xi := range x {
		p[i+w] = mulAddVW(p[i:i+w], y, xi)
	}
	return normProduct(z, p[w:], p[w-1])
}

// Quo sets z to x/y rounded toward zero to z's precision and returns z.
// It panics if y is zero.
func (z *Real) Quo(x, y *Real) *Real {
	if y.zero {
		panic("precision: Real division by zero")
	}
	w := len(z.mant)
	if len(x.mant) != w || len(y.mant) != w {
		return z.mixed(opQuo, x, y)
	}
	if x.zero {
		return z.setZero()
	}
	e, neg := x.exp-y.exp, x.neg != y.neg
	var sh bool
	if w <= 4 {
		var buf [14]uint64
		sh = quoWords(z.mant, x.mant, y.mant, buf[:3*w+2])
	} else if w <= 64 {
		sh = quoLarge(z.mant, x.mant, y.mant)
	} else {
		sh = quoWords(z.mant, x.mant, y.mant, make([]uint64, 3*w+2))
	}
	if sh {
		e++
	}
	z.setExp(e)
	z.neg, z.zero = neg, false
	return z
}

// quoLarge is quoWords with stack scratch for 4 < W <= 64.
func quoLarge(z, x, y []uint64) bool {
	var buf [194]uint64
	return quoWords(z, x, y, buf[:3*len(z)+2])
}

// quoWords sets z to the W-word quotient of the normalised mantissas x/y
// rounded toward zero and reports whether it was shifted right one bit
// (x >= y, so the exponent grows by one). buf is scratch of 3W+2 words; z
// may alias x or y.
//
// With X, Y the mantissas as integers, Q = floor(X*2^(64W)/Y) lies in
// [2^(64W-1), 2^(64W+1)); Q, or floor(Q/2) = floor(X*2^(64W-1)/Y) when Q
// has 64W+1 bits, is exactly the truncated quotient.
func quoWords(z, x, y, buf []uint64) bool {
	w := len(z)
	u, q := buf[:2*w+1], buf[2*w+1:3*w+2]
	clear(u[:w])
	copy(u[w:2*w], x)
	u[2*w] = 0
	if w == 1 {
		if x[0] >= y[0] {
			q[1] = 1
			q[0], _ = bits.Div64(x[0]-y[0], 0, y[0])
		} else {
			q[1] = 0
			q[0], _ = bits.Div64(x[0], 0, y[0])
		}
	} else {
		divKnuth(q, u, y[:w])
	}
	if q[w] == 0 {
		copy(z, q[:w])
		return false
	}
	for i := 0; i < w; i++ {
		z[i] = q[i]>>1 | q[i+1]<<63
	}
	return true
}

// divKnuth sets q (m+1 words) to floor(u/v) for u of m+n+1 words whose top
// word is below v's top word, and v of n >= 2 words with its top bit set;
// u is overwritten by the remainder.
//
// This is Algorithm D of D. E. Knuth, The Art of Computer Programming,
// Vol. 2: Seminumerical Algorithms, 3rd ed., Addison-Wesley, 1997,
// section 4.3.1. The trial digit qhat is refined with v's second word, after
// which it exceeds the true digit by at most one (Knuth's Theorem B and the
// test of step D3); when the remainder's top word equals v's, qhat = B-1 is
// used unrefined, and the true digit is then at least B-2 because
// u >= v[n-1] B^n and v < (v[n-1]+1) B^(n-1) with v[n-1] >= B/2. So one
// add-back always suffices.
func divKnuth(q, u, v []uint64) {
	n := len(v)
	m := len(u) - 1 - n
	vn1, vn2 := v[n-1], v[n-2]
	for j := m; j >= 0; j-- {
		qhat := ^uint64(0)
		if ujn := u[j+n]; ujn != vn1 {
			var rhat uint64
			qhat, rhat = bits.Div64(ujn, u[j+n-1], vn1)
			x1, x2 := bits.Mul64(qhat, vn2)
			ujn2 := u[j+n-2]
			for x1 > rhat || x1 == rhat && x2 > ujn2 {
				qhat--
				prev := rhat
				rhat += vn1
				if rhat < prev {
					break
				}
				x1, x2 = bits.Mul64(qhat, vn2)
			}
		}
		var c, br uint64
		for i, vi := range v {
			hi, lo := bits.Mul64(qhat, vi)
			var cc uint64
			lo, cc = bits.Add64(lo, c, 0)
			c = hi + cc
			u[j+i], br = bits.Sub64(u[j+i], lo, br)
		}
		u[j+n], br = bits.Sub64(u[j+n], c, br)
		if br != 0 {
			qhat--
			c = 0
			for i, vi := range v {
				u[j+i], c = bits.Add64(u[j+i], vi, c)
			}
			u[j+n] += c
		}
		q[j] = qhat
	}
}

// Sqrt sets z to the square root of x rounded toward zero to z's precision
// and returns z. It panics if x < 0. It goes through math/big and
// allocates.
func (z *Real) Sqrt(x *Real) *Real {
	if x.neg {
		panic("precision: Sqrt of a negative Real")
	}
	if x.zero {
		return z.setZero()
	}
	// x = X * 2^t with X the mantissa integer. Scaling X by 2^s makes t - s
	// even and X*2^s at least 128W bits long (W of z), so its integer square
	// root has at least 64W bits and truncating that root again to 64W bits
	// is truncating the exact root.
	xw := int64(64 * len(x.mant))
	t := x.exp - xw
	s := max(2*int64(64*len(z.mant))-xw, 0)
	s += (t - s) & 1
	n := wordsToInt(new(big.Int), x.mant)
	n.Lsh(n, uint(s)).Sqrt(n)
	return z.setInt(false, n, (t-s)/2)
}

// MulAdd sets z to x*y + w and returns z. The product is rounded toward
// zero to z's precision and the sum rounded toward zero again, so the
// result r satisfies |r - (x*y + w)| < ulp(r) + ulp(x*y): relative to the
// result the error is below 2^(1-64W) (1 + |x*y|/|x*y + w|).
func (z *Real) MulAdd(x, y, w *Real) *Real { return z.mulAdd(x, y, w, false) }

// MulSub sets z to x*y - w, rounded as MulAdd does, and returns z.
func (z *Real) MulSub(x, y, w *Real) *Real { return z.mulAdd(x, y, w, true) }

// mulAdd is MulAdd, or MulSub if sub.
func (z *Real) mulAdd(x, y, w *Real, sub bool) *Real {
	n := len(z.mant)
	if n <= 4 {
		var buf [4]uint64
		t := Real{mant: buf[:n]}
		return z.add(t.Mul(x, y), w, sub)
	}
	if n <= 64 {
		return z.mulAddLarge(x, y, w, sub)
	}
	t := NewReal(z.Prec())
	return z.add(t.Mul(x, y), w, sub)
}

// mulAddLarge is mulAdd with stack scratch for 4 < W <= 64.
func (z *Real) mulAddLarge(x, y, w *Real, sub bool) *Real {
	var buf [64]uint64
	t := Real{mant: buf[:len(z.mant)]}
	return z.add(t.Mul(x, y), w, sub)
}

// Operations of the slow path for operands of differing precisions.
const (
	opAdd = iota
	opSub
	opMul
	opQuo
)

// mixed sets z to x op y for operands whose precisions differ from z's,
// computed by math/big.Float at z's precision with rounding toward zero
// (which math/big performs correctly), so the result is the exact one
// rounded toward zero. It allocates.
func (z *Real) mixed(op int, x, y *Real) *Real {
	r := new(big.Float).SetPrec(z.Prec()).SetMode(big.ToZero)
	bx, by := x.Big(nil), y.Big(nil)
	switch op {
	case opAdd:
		r.Add(bx, by)
	case opSub:
		r.Sub(bx, by)
	case opMul:
		r.Mul(bx, by)
	case opQuo:
		r.Quo(bx, by)
	}
	return z.SetBig(r)
}

// The kernels below are addShifted and subShifted for W <= 4 words and
// shifts d < 64, and mulTop for W = 2, 3, 4, unrolled because loop and
// bounds-check overhead would otherwise cost more than the arithmetic. Each
// computes exactly what its generic counterpart does (the tests compare
// both against math/big).

// carryOut returns z shifted right one bit with the carry as its top bit.
func carryOut(z0, z1 uint64) uint64 { return z0>>1 | z1<<63 }

func add1(z, a, b *[1]uint64, s uint) bool {
	z0, c := bits.Add64(a[0], b[0]>>s, 0)
	if c != 0 {
		z0 = carryOut(z0, 1)
	}
	z[0] = z0
	return c != 0
}

func add2(z, a, b *[2]uint64, s uint) bool {
	t0, t1 := b[0]>>s|b[1]<<(64-s), b[1]>>s
	z0, c := bits.Add64(a[0], t0, 0)
	z1, c := bits.Add64(a[1], t1, c)
	if c != 0 {
		z0, z1 = carryOut(z0, z1), carryOut(z1, 1)
	}
	z[0], z[1] = z0, z1
	return c != 0
}

func add3(z, a, b *[3]uint64, s uint) bool {
	t0, t1, t2 := b[0]>>s|b[1]<<(64-s), b[1]>>s|b[2]<<(64-s), b[2]>>s
	z0, c := bits.Add64(a[0], t0, 0)
	z1, c := bits.Add64(a[1], t1, c)
	z2, c := bits.Add64(a[2], t2, c)
	if c != 0 {
		z0, z1, z2 = carryOut(z0, z1), carryOut(z1, z2), carryOut(z2, 1)
	}
	z[0], z[1], z[2] = z0, z1, z2
	return c != 0
}

func add4(z, a, b *[4]uint64, s uint) bool {
	t0, t1 := b[0]>>s|b[1]<<(64-s), b[1]>>s|b[2]<<(64-s)
	t2, t3 := b[2]>>s|b[3]<<(64-s), b[3]>>s
	z0, c := bits.Add64(a[0], t0, 0)
	z1, c := bits.Add64(a[1], t1, c)
	z2, c := bits.Add64(a[2], t2, c)
	z3, c := bits.Add64(a[3], t3, c)
	if c != 0 {
		z0, z1, z2, z3 = carryOut(z0, z1), carryOut(z1, z2), carryOut(z2, z3), carryOut(z3, 1)
	}
	z[0], z[1], z[2], z[3] = z0, z1, z2, z3
	return c != 0
}

// In the sub kernels the guard word is b[0]<<(64-s) and, the shift being
// below one word, no bit of b falls below it (no sticky bit).

func sub1(z, a, b *[1]uint64, s uint) int64 {
	g, br := bits.Sub64(0, b[0]<<(64-s), 0)
	z[0], _ = bits.Sub64(a[0], b[0]>>s, br)
	return normLeft(z[:], g)
}

func sub2(z, a, b *[2]uint64, s uint) int64 {
	g, br := bits.Sub64(0, b[0]<<(64-s), 0)
	t0, t1 := b[0]>>s|b[1]<<(64-s), b[1]>>s
	z0, br := bits.Sub64(a[0], t0, br)
	z1, _ := bits.Sub64(a[1], t1, br)
	if z1 >= 1<<63 {
		z[0], z[1] = z0, z1
		return 0
	}
	if z1 != 0 {
		lb := uint(bits.LeadingZeros64(z1))
		z[1], z[0] = z1<<lb|z0>>(64-lb), z0<<lb|g>>(64-lb)
		return int64(lb)
	}
	z[0], z[1] = z0, z1
	return normLeft(z[:], g)
}

func sub3(z, a, b *[3]uint64, s uint) int64 {
	g, br := bits.Sub64(0, b[0]<<(64-s), 0)
	t0, t1, t2 := b[0]>>s|b[1]<<(64-s), b[1]>>s|b[2]<<(64-s), b[2]>>s
	z0, br := bits.Sub64(a[0], t0, br)
	z1, br := bits.Sub64(a[1], t1, br)
	z2, _ := bits.Sub64(a[2], t2, br)
	if z2 >= 1<<63 {
		z[0], z[1], z[2] = z0, z1, z2
		return 0
	}
	if z2 != 0 {
		lb := uint(bits.LeadingZeros64(z2))
		z[2], z[1], z[0] = z2<<lb|z1>>(64-lb), z1<<lb|z0>>(64-lb), z0<<lb|g>>(64-lb)
		return int64(lb)
	}
	z[0], z[1], z[2] = z0, z1, z2
	return normLeft(z[:], g)
}

func sub4(z, a, b *[4]uint64, s uint) int64 {
	g, br := bits.Sub64(0, b[0]<<(64-s), 0)
	t0, t1 := b[0]>>s|b[1]<<(64-s), b[1]>>s|b[2]<<(64-s)
	t2, t3 := b[2]>>s|b[3]<<(64-s), b[3]>>s
	z0, br := bits.Sub64(a[0], t0, br)
	z1, br := bits.Sub64(a[1], t1, br)
	z2, br := bits.Sub64(a[2], t2, br)
	z3, _ := bits.Sub64(a[3], t3, br)
	if z3 >= 1<<63 {
		z[0], z[1], z[2], z[3] = z0, z1, z2, z3
		return 0
	}
	if z3 != 0 {
		lb := uint(bits.LeadingZeros64(z3))
		z[3], z[2], z[1], z[0] = z3<<lb|z2>>(64-lb), z2<<lb|z1>>(64-lb), z1<<lb|z0>>(64-lb), z0<<lb|g>>(64-lb)
		return int64(lb)
	}
	z[0], z[1], z[2], z[3] = z0, z1, z2, z3
	return normLeft(z[:], g)
}

// mac returns the three-word accumulator (r0, r1, r2) plus a*b; column
// sums of at most four products and a carry never overflow it.
func mac(r0, r1, r2, a, b uint64) (uint64, uint64, uint64) {
	hi, lo := bits.Mul64(a, b)
	var c uint64
	r0, c = bits.Add64(r0, lo, 0)
	r1, c = bits.Add64(r1, hi, c)
	return r0, r1, r2 + c
}

// mul2, mul3, mul4 and mul5 are mulTop for W = 2, 3, 4, 5, accumulating the
// product column by column (for W = 2 the full product).
func mul2(z, x, y *[2]uint64) bool {
	x0, x1, y0, y1 := x[0], x[1], y[0], y[1]
	r0, r1, r2 := mac(0, 0, 0, x0, y0)
	r0, r1, r2 = mac(r1, r2, 0, x0, y1)
	r0, r1, r2 = mac(r0, r1, r2, x1, y0)
	p1 := r0
	r0, r1, _ = mac(r1, r2, 0, x1, y1)
	if r1 >= 1<<63 {
		z[0], z[1] = r0, r1
		return false
	}
	z[0], z[1] = r0<<1|p1>>63, r1<<1|r0>>63
	return true
}

func mul3(z, x, y *[3]uint64) bool {
	x0, x1, x2, y0, y1, y2 := x[0], x[1], x[2], y[0], y[1], y[2]
	// Columns 1..4 (W-2 = 1): x0*y0 is dropped, see mulTop.
	r0, r1, r2 := mac(0, 0, 0, x0, y1)
	r0, r1, r2 = mac(r0, r1, r2, x1, y0)
	r0, r1, r2 = mac(r1, r2, 0, x0, y2)
	r0, r1, r2 = mac(r0, r1, r2, x1, y1)
	r0, r1, r2 = mac(r0, r1, r2, x2, y0)
	p2 := r0
	r0, r1, r2 = mac(r1, r2, 0, x1, y2)
	r0, r1, r2 = mac(r0, r1, r2, x2, y1)
	p3 := r0
	p4, p5, _ := mac(r1, r2, 0, x2, y2)
	if p2|1<<63 >= 1<<64-3 {
		return mulExact(z[:], x[:], y[:])
	}
	if p5 >= 1<<63 {
		z[0], z[1], z[2] = p3, p4, p5
		return false
	}
	z[0], z[1], z[2] = p3<<1|p2>>63, p4<<1|p3>>63, p5<<1|p4>>63
	return true
}

func mul4(z, x, y *[4]uint64) bool {
	x0, x1, x2, x3 := x[0], x[1], x[2], x[3]
	y0, y1, y2, y3 := y[0], y[1], y[2], y[3]
	// Columns 2..6 (W-2 = 2): columns 0 and 1 are dropped, see mulTop.
	r0, r1, r2 := mac(0, 0, 0, x0, y2)
	r0, r1, r2 = mac(r0, r1, r2, x1, y1)
	r0, r1, r2 = mac(r0, r1, r2, x2, y0)
	r0, r1, r2 = mac(r1, r2, 0, x0, y3)
	r0, r1, r2 = mac(r0, r1, r2, x1, y2)
	r0, r1, r2 = mac(r0, r1, r2, x2, y1)
	r0, r1, r2 = mac(r0, r1, r2, x3, y0)
	p3 := r0
	r0, r1, r2 = mac(r1, r2, 0, x1, y3)
	r0, r1, r2 = mac(r0, r1, r2, x2, y2)
	r0, r1, r2 = mac(r0, r1, r2, x3, y1)
	p4 := r0
	r0, r1, r2 = mac(r1, r2, 0, x2, y3)
	r0, r1, r2 = mac(r0, r1, r2, x3, y2)
	p5 := r0
	p6, p7, _ := mac(r1, r2, 0, x3, y3)
	if p3|1<<63 >= 1<<64-4 {
		return mulExact(z[:], x[:], y[:])
	}
	if p7 >= 1<<63 {
		z[0], z[1], z[2], z[3] = p4, p5, p6, p7
		return false
	}
	z[0], z[1], z[2], z[3] = p4<<1|p3>>63, p5<<1|p4>>63, p6<<1|p5>>63, p7<<1|p6>>63
	return true
}

// mul5 serves 257 to 320 bits, the precision of double-exponential moment
// sums for rules of about 30 digits.
func mul5(z, x, y *[5]uint64) bool {
	x0, x1, x2, x3, x4 := x[0], x[1], x[2], x[3], x[4]
	y0, y1, y2, y3, y4 := y[0], y[1], y[2], y[3], y[4]
	// Columns 3..9 (W-2 = 3): columns 0..2 are dropped, see mulTop.
	r0, r1, r2 := mac(0, 0, 0, x0, y3)
	r0, r1, r2 = mac(r0, r1, r2, x1, y2)
	r0, r1, r2 = mac(r0, r1, r2, x2, y1)
	r0, r1, r2 = mac(r0, r1, r2, x3, y0)
	r0, r1, r2 = mac(r1, r2, 0, x0, y4)
	r0, r1, r2 = mac(r0, r1, r2, x1, y3)
	r0, r1, r2 = mac(r0, r1, r2, x2, y2)
	r0, r1, r2 = mac(r0, r1, r2, x3, y1)
	r0, r1, r2 = mac(r0, r1, r2, x4, y0)
	p4 := r0
	r0, r1, r2 = mac(r1, r2, 0, x1, y4)
	r0, r1, r2 = mac(r0, r1, r2, x2, y3)
	r0, r1, r2 = mac(r0, r1, r2, x3, y2)
	r0, r1, r2 = mac(r0, r1, r2, x4, y1)
	p5 := r0
	r0, r1, r2 = mac(r1, r2, 0, x2, y4)
	r0, r1, r2 = mac(r0, r1, r2, x3, y3)
	r0, r1, r2 = mac(r0, r1, r2, x4, y2)
	p6 := r0
	r0, r1, r2 = mac(r1, r2, 0, x3, y4)
	r0, r1, r2 = mac(r0, r1, r2, x4, y3)
	p7 := r0
	p8, p9, _ := mac(r1, r2, 0, x4, y4)
	if p4|1<<63 >= 1<<64-5 {
		return mulExact(z[:], x[:], y[:])
	}
	if p9 >= 1<<63 {
		z[0], z[1], z[2], z[3], z[4] = p5, p6, p7, p8, p9
		return false
	}
	z[0], z[1], z[2], z[3], z[4] = p5<<1|p4>>63, p6<<1|p5>>63, p7<<1|p6>>63, p8<<1|p7>>63, p9<<1|p8>>63
	return true
}
