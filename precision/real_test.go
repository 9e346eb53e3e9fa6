package precision

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
	"math/rand/v2"
	"testing"
)

// The reference arithmetic throughout is math/big.Float, whose Add, Sub,
// Mul, Quo and Set are correctly rounded in every rounding mode. Since Real
// promises the exact result rounded toward zero, the expected value is
// big.Float's result at the same precision in mode ToZero, and results must
// agree bit for bit.

var realTestWords = []int{1, 2, 3, 4, 5, 7, 54}

// checkReal fails if x breaks the representation invariants.
func checkReal(t *testing.T, x *Real) {
	t.Helper()
	if x.zero {
		if x.neg || x.exp != 0 {
			t.Fatalf("zero with neg=%v exp=%d", x.neg, x.exp)
		}
		return
	}
	if x.mant[len(x.mant)-1] < 1<<63 {
		t.Fatalf("unnormalised mantissa %x", x.mant)
	}
	if x.exp > RealMaxExp || x.exp < RealMinExp {
		t.Fatalf("exponent %d out of range", x.exp)
	}
}

// randReal returns a random nonzero Real of w words with exponent in
// [emin, emax], favouring mantissas with long runs of ones or zeros, which
// exercise carries and cancellation.
func randReal(r *rand.Rand, w int, emin, emax int64) *Real {
	x := NewReal(uint(64 * w))
	for i := range x.mant {
		x.mant[i] = r.Uint64()
	}
	switch r.IntN(8) {
	case 0:
		for i := range x.mant {
			x.mant[i] = ^uint64(0)
		}
	case 1:
		clear(x.mant)
	case 2:
		clear(x.mant)
		x.mant[0] = 1
	case 3:
		x.mant[r.IntN(w)] = ^uint64(0)
	}
	x.mant[w-1] |= 1 << 63
	x.exp = emin + r.Int64N(emax-emin+1)
	x.neg = r.IntN(2) == 0
	x.zero = false
	return x
}

// perturb returns a copy of x with a few low bits changed and maybe its
// exponent moved by one, a partner for cancelling subtraction.
func perturb(r *rand.Rand, x *Real) *Real {
	y := NewReal(x.Prec()).Set(x)
	if r.IntN(4) > 0 {
		y.mant[0] ^= r.Uint64() >> uint(r.IntN(64))
	}
	if r.IntN(3) == 0 {
		y.exp += int64(r.IntN(3)) - 1
	}
	y.mant[len(y.mant)-1] |= 1 << 63
	if r.IntN(2) == 0 {
		y.neg = !y.neg
	}
	return y
}

// refOp returns x op y computed by math/big at prec bits, rounded toward
// zero.
func refOp(op int, x, y *big.Float, prec uint) *big.Float {
	z := new(big.Float).SetPrec(prec).SetMode(big.ToZero)
	switch op {
	case opAdd:
		return z.Add(x, y)
	case opSub:
		return z.Sub(x, y)
	case opMul:
		return z.Mul(x, y)
	case opQuo:
		return z.Quo(x, y)
	}
	panic("bad op")
}

var opNames = []string{"Add", "Sub", "Mul", "Quo"}

// realOp applies op to Reals.
func realOp(op int, z, x, y *Real) *Real {
	switch op {
	case opAdd:
		return z.Add(x, y)
	case opSub:
		return z.Sub(x, y)
	case opMul:
		return z.Mul(x, y)
	case opQuo:
		return z.Quo(x, y)
	}
	panic("bad op")
}

// checkOp computes x op y both ways and fails unless they agree exactly.
func checkOp(t *testing.T, op int, x, y *Real) {
	t.Helper()
	if op == opQuo && y.IsZero() {
		return
	}
	z := NewReal(x.Prec())
	realOp(op, z, x, y)
	checkReal(t, z)
	want := refOp(op, x.Big(nil), y.Big(nil), z.Prec())
	if got := z.Big(nil); got.Cmp(want) != 0 {
		t.Fatalf("W=%d %s(%v, %v)\n got %v\nwant %v", len(x.mant), opNames[op], x, y, got, want)
	}
}

// pairDistances are exponent differences at the word and precision
// boundaries of the alignment shift, for W words.
func pairDistances(w int) []int64 {
	p := int64(64 * w)
	return []int64{0, 1, 2, 63, 64, 65, 127, 128, p - 1, p, p + 1, p + 63, p + 64, p + 65, p + 200, 5000, 1 << 16}
}

func TestRealArithRandom(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, w := range realTestWords {
		n := 3000
		if w > 8 {
			n = 150
		}
		for i := 0; i < n; i++ {
			x := randReal(r, w, -200, 200)
			var y *Real
			switch i % 4 {
			case 0:
				y = randReal(r, w, -200, 200)
			case 1:
				y = randReal(r, w, x.exp-3, x.exp+3)
			case 2:
				y = perturb(r, x)
			case 3:
				ds := pairDistances(w)
				y = randReal(r, w, 0, 0)
				y.exp = x.exp - ds[r.IntN(len(ds))]
				if r.IntN(2) == 0 {
					x, y = y, x
				}
			}
			for op := opAdd; op <= opQuo; op++ {
				checkOp(t, op, x, y)
			}
		}
	}
}

func TestRealArithTable(t *testing.T) {
	// Hand-picked operands whose exact results are float64 values, known
	// without any reference arithmetic.
	tests := []struct {
		op         int
		x, y, want float64
	}{
		{opAdd, 1, 1, 2},
		{opAdd, 1, -1, 0},
		{opAdd, 0, -3, -3},
		{opAdd, 0.75, 0.25, 1},
		{opSub, 1, 1, 0},
		{opSub, 0.5, 1, -0.5},
		{opSub, 1, 0x1.fffffffffffffp-1, 0x1p-53}, // Sterbenz: exact
		{opMul, 3, -7, -21},
		{opQuo, 1, 4, 0.25},
		{opQuo, -21, 7, -3},
		{opQuo, 6, 0.5, 12},
	}
	for _, w := range realTestWords {
		prec := uint(64 * w)
		v := func(f float64) *Real { return NewReal(prec).SetFloat64(f) }
		for _, tc := range tests {
			z := realOp(tc.op, NewReal(prec), v(tc.x), v(tc.y))
			checkReal(t, z)
			if got := z.Float64(); got != tc.want {
				t.Errorf("W=%d %s(%g, %g) = %g, want %g", w, opNames[tc.op], tc.x, tc.y, got, tc.want)
			}
		}
		// 2^-1000 * 2^-1000 = 2^-2000 = (1/2) 2^-1999, outside float64.
		if z := NewReal(prec).Mul(v(0x1p-1000), v(0x1p-1000)); z.Exponent() != -1999 || z.mant[w-1] != 1<<63 {
			t.Errorf("W=%d 2^-1000 * 2^-1000 = %v", w, z)
		}
		// 2^-600 - 2^600 = -(2^600 - 2^-600) needs 1201 bits; rounded
		// toward zero to fewer it is -(1 - 2^-64W) 2^600, all ones.
		z := NewReal(prec).Sub(v(0x1p-600), v(0x1p+600))
		if prec > 1200 {
			exact := new(big.Float).SetMantExp(big.NewFloat(1), 600).SetPrec(1201)
			exact.Sub(exact, new(big.Float).SetMantExp(big.NewFloat(1), -600))
			if z.Big(nil).Cmp(exact.Neg(exact)) != 0 {
				t.Errorf("W=%d 2^-600 - 2^600 = %v", w, z)
			}
			continue
		}
		for _, m := range z.mant {
			if m != ^uint64(0) || z.Exponent() != 600 || z.Sign() != -1 {
				t.Errorf("W=%d 2^-600 - 2^600 = %v, mant %x", w, z, z.mant)
				break
			}
		}
	}
}

func TestRealMixedPrecision(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 300; i++ {
		ws := []int{1, 2, 3, 5}
		x := randReal(r, ws[r.IntN(4)], -50, 50)
		y := randReal(r, ws[r.IntN(4)], -50, 50)
		z := NewReal(uint(64 * ws[r.IntN(4)]))
		for op := opAdd; op <= opQuo; op++ {
			realOp(op, z, x, y)
			checkReal(t, z)
			want := refOp(op, x.Big(nil), y.Big(nil), z.Prec())
			if got := z.Big(nil); got.Cmp(want) != 0 {
				t.Fatalf("%s(%v, %v) at %d bits = %v, want %v", opNames[op], x, y, z.Prec(), got, want)
			}
		}
	}
}

func TestRealAliasing(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for _, w := range realTestWords {
		for i := 0; i < 200; i++ {
			x := randReal(r, w, -20, 20)
			y := randReal(r, w, x.exp-2, x.exp+2)
			if i%3 == 0 {
				y = perturb(r, x)
			}
			bx, by := x.Big(nil), y.Big(nil)
			prec := x.Prec()
			for op := opAdd; op <= opQuo; op++ {
				cases := []struct {
					name       string
					run        func(z *Real) *Real
					a, b, want *big.Float
				}{
					{"z=x", func(z *Real) *Real { return realOp(op, z, z, y) }, bx, by, nil},
					{"z=y", func(z *Real) *Real { return realOp(op, z, x, z) }, bx, by, nil},
					{"z=x=y", func(z *Real) *Real { return realOp(op, z, z, z) }, bx, bx, nil},
				}
				for _, c := range cases {
					z := NewReal(prec)
					if c.name == "z=y" {
						z.Set(y)
					} else {
						z.Set(x)
					}
					c.run(z)
					checkReal(t, z)
					want := refOp(op, c.a, c.b, prec)
					if got := z.Big(nil); got.Cmp(want) != 0 {
						t.Fatalf("W=%d %s with %s: got %v want %v", w, opNames[op], c.name, got, want)
					}
				}
			}
			// MulAdd with z aliasing each operand.
			z := NewReal(prec).Set(x)
			z.MulAdd(z, y, z) // x*y + x
			want := refMulAdd(bx, by, bx, false)
			checkMulAdd(t, z, want, bx, by)
		}
	}
}

// refMulAdd returns x*y ± w at a precision where it is exact or, when the
// exponents are far apart, correct to far more bits than any test needs.
func refMulAdd(x, y, w *big.Float, sub bool) *big.Float {
	p := new(big.Float).SetPrec(x.Prec()+y.Prec()).Mul(x, y) // exact
	s := new(big.Float).SetPrec(4*p.Prec() + 64)
	if sub {
		return s.Sub(p, w)
	}
	return s.Add(p, w)
}

// checkMulAdd fails unless |got - want| < ulp(got) + ulp(x*y), the
// documented bound for two roundings toward zero.
func checkMulAdd(t *testing.T, z *Real, want, x, y *big.Float) {
	t.Helper()
	checkReal(t, z)
	prec := int(z.Prec())
	err := new(big.Float).SetPrec(want.Prec()).Sub(z.Big(nil), want)
	err.Abs(err)
	bound := new(big.Float)
	if !z.IsZero() {
		bound.SetMantExp(big.NewFloat(1), int(z.Exponent())-prec)
	}
	if x.Sign() != 0 && y.Sign() != 0 {
		e := x.MantExp(nil) + y.MantExp(nil)
		bound.Add(bound, new(big.Float).SetMantExp(big.NewFloat(1), e-prec))
	}
	if err.Cmp(bound) >= 0 {
		t.Fatalf("MulAdd at %d bits: got %v want %v, error %v >= bound %v", prec, z, want, err, bound)
	}
}

func TestRealMulAdd(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for _, w := range realTestWords {
		for i := 0; i < 500; i++ {
			x := randReal(r, w, -30, 30)
			y := randReal(r, w, -30, 30)
			var a *Real
			if i%2 == 0 {
				// Make x*y nearly cancel a.
				a = NewReal(x.Prec()).Mul(x, y)
				a = perturb(r, a)
			} else {
				a = randReal(r, w, -60, 60)
			}
			for _, sub := range []bool{false, true} {
				z := NewReal(x.Prec())
				if sub {
					z.MulSub(x, y, a)
				} else {
					z.MulAdd(x, y, a)
				}
				checkMulAdd(t, z, refMulAdd(x.Big(nil), y.Big(nil), a.Big(nil), sub), x.Big(nil), y.Big(nil))
			}
		}
	}
}

func TestRealSqrt(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	for _, w := range realTestWords {
		for i := 0; i < 300; i++ {
			x := randReal(r, w, -101, 101)
			x.neg = false
			zw := w
			if i%3 == 1 {
				zw = realTestWords[r.IntN(len(realTestWords))]
			}
			z := NewReal(uint(64 * zw)).Sqrt(x)
			checkReal(t, z)
			// Exactly: z^2 <= x < (z + ulp)^2, squares formed without rounding.
			bz := z.Big(nil)
			ulp := new(big.Float).SetMantExp(big.NewFloat(1), int(z.Exponent())-64*zw)
			up := new(big.Float).SetPrec(z.Prec()+1).Add(bz, ulp)
			sq := new(big.Float).SetPrec(2*z.Prec() + 4)
			if sq.Mul(bz, bz).Cmp(x.Big(nil)) > 0 || sq.Mul(up, up).Cmp(x.Big(nil)) <= 0 {
				t.Fatalf("Sqrt(%v) at %d words = %v", x, zw, z)
			}
		}
	}
	if z := NewReal(128).Sqrt(NewReal(128).SetInt64(144)); z.Float64() != 12 {
		t.Errorf("Sqrt(144) = %v", z)
	}
}

func TestRealConversions(t *testing.T) {
	// float64 values: powers of two at the ends of the range, subnormals,
	// integers and sign changes.
	floats := []float64{1, -1, 0.1, -3.5, math.MaxFloat64, math.SmallestNonzeroFloat64,
		0x1p-1022, 0x1.fffffffffffffp-1023, 1 << 53, -(1<<53 + 2), math.Pi, 1e300, -1e-300}
	for _, w := range realTestWords {
		prec := uint(64 * w)
		for _, f := range floats {
			x := NewReal(prec).SetFloat64(f)
			checkReal(t, x)
			if got, want := x.Big(nil), big.NewFloat(f); got.Cmp(want) != 0 {
				t.Errorf("SetFloat64(%g).Big() = %v", f, got)
			}
			if got := x.Float64(); got != f {
				t.Errorf("SetFloat64(%g).Float64() = %g", f, got)
			}
		}
		for _, v := range []int64{0, 1, -1, 7, math.MaxInt64, math.MinInt64, -12345678901234} {
			x := NewReal(prec).SetInt64(v)
			checkReal(t, x)
			if got := x.Big(nil); got.Cmp(new(big.Float).SetInt64(v)) != 0 {
				t.Errorf("SetInt64(%d) = %v", v, got)
			}
		}
	}
	r := rand.New(rand.NewPCG(11, 12))
	for _, w := range realTestWords {
		prec := uint(64 * w)
		for i := 0; i < 400; i++ {
			x := randReal(r, w, -1200, 1200)
			if i%4 == 0 {
				x.exp = -1074 + r.Int64N(60) // around float64's subnormals
			}
			// Big -> SetBig round trip is exact at equal precision.
			y := NewReal(prec).SetBig(x.Big(nil))
			if y.Cmp(x) != 0 {
				t.Fatalf("SetBig(Big(%v)) = %v", x, y)
			}
			// Float64 is big.Float's nearest-even Float64 of the exact value.
			want, _ := x.Big(nil).Float64()
			if got := x.Float64(); got != want && !(math.IsNaN(got) && math.IsNaN(want)) {
				t.Fatalf("Float64(%v) = %g, want %g", x, got, want)
			}
			// Set and SetBig to other precisions round toward zero.
			for _, zw := range []int{1, 3, 54} {
				z := NewReal(uint(64 * zw))
				wantB := new(big.Float).SetPrec(z.Prec()).SetMode(big.ToZero).Set(x.Big(nil))
				if got := z.Set(x).Big(nil); got.Cmp(wantB) != 0 {
					t.Fatalf("Set %v to %d words = %v, want %v", x, zw, got, wantB)
				}
				if got := z.SetBig(x.Big(nil)).Big(nil); got.Cmp(wantB) != 0 {
					t.Fatalf("SetBig %v to %d words = %v, want %v", x, zw, got, wantB)
				}
			}
		}
		// SetRat: big.Float.SetRat rounds correctly, in mode ToZero here.
		for _, q := range []*big.Rat{big.NewRat(1, 3), big.NewRat(-22, 7), big.NewRat(1, 1<<62), big.NewRat(0, 5),
			new(big.Rat).SetFrac(new(big.Int).Lsh(big.NewInt(5), 3000), big.NewInt(3))} {
			want := new(big.Float).SetPrec(prec).SetMode(big.ToZero).SetRat(q)
			if got := NewReal(prec).SetRat(q).Big(nil); got.Cmp(want) != 0 {
				t.Errorf("SetRat(%v) = %v, want %v", q, got, want)
			}
		}
	}
	// Big of known words: 0x8000...0001 (two words) * 2^1 is 1 + 2^-127.
	x := NewReal(128)
	x.mant[1], x.mant[0], x.exp, x.zero = 1<<63, 1, 1, false
	want, _, _ := big.ParseFloat("0x1.00000000000000000000000000000002p0", 0, 200, big.ToZero)
	if got := x.Big(nil); got.Cmp(want) != 0 {
		t.Errorf("Big(1+2^-127) = %v", got)
	}
}

func TestRealCompareAndSign(t *testing.T) {
	r := rand.New(rand.NewPCG(13, 14))
	for i := 0; i < 2000; i++ {
		w1, w2 := 1+r.IntN(4), 1+r.IntN(4)
		x := randReal(r, w1, -3, 3)
		y := randReal(r, w2, -3, 3)
		if i%5 == 0 {
			y = NewReal(x.Prec()).Set(x)
		}
		if i%7 == 0 {
			x.setZero()
		}
		bx, by := x.Big(nil), y.Big(nil)
		if got, want := x.Cmp(y), bx.Cmp(by); got != want {
			t.Fatalf("Cmp(%v, %v) = %d, want %d", x, y, got, want)
		}
		ax, ay := new(big.Float).Abs(bx), new(big.Float).Abs(by)
		if got, want := x.CmpAbs(y), ax.Cmp(ay); got != want {
			t.Fatalf("CmpAbs(%v, %v) = %d, want %d", x, y, got, want)
		}
		if x.Sign() != bx.Sign() || x.IsZero() != (bx.Sign() == 0) {
			t.Fatalf("Sign(%v) = %d", x, x.Sign())
		}
		if e := bx.MantExp(nil); int64(e) != x.Exponent() {
			t.Fatalf("Exponent(%v) = %d, want %d", x, x.Exponent(), e)
		}
		n := NewReal(x.Prec()).Neg(x)
		if n.Big(nil).Cmp(new(big.Float).Neg(bx)) != 0 || n.Abs(n).Big(nil).Cmp(ax) != 0 {
			t.Fatalf("Neg/Abs(%v)", x)
		}
		k := r.IntN(4001) - 2000
		m := NewReal(x.Prec()).MulPow2(x, k)
		if m.Big(nil).Cmp(new(big.Float).SetMantExp(bx, k)) != 0 {
			t.Fatalf("MulPow2(%v, %d) = %v", x, k, m)
		}
	}
}

func TestRealExtremeExponents(t *testing.T) {
	// Values far outside float64 and big.Float ranges stay representable.
	x := NewReal(192).SetInt64(3)
	x.MulPow2(x, 1_000_000)
	y := NewReal(192).SetInt64(5)
	y.MulPow2(y, -1_000_000)
	z := NewReal(192).Mul(x, y)
	if z.Float64() != 15 {
		t.Errorf("3*2^1e6 * 5*2^-1e6 = %v", z)
	}
	big1 := NewReal(192).MulPow2(x, 1<<40)
	if big1.Exponent() != 2+1_000_000+1<<40 || big1.String() == "" {
		t.Errorf("exponent %d", big1.Exponent())
	}
	if got := big1.Float64(); !math.IsInf(got, 1) {
		t.Errorf("Float64 of huge = %g", got)
	}
	mustPanic(t, "exponent overflow", func() { NewReal(64).MulPow2(big1, RealMaxExp) })
	mustPanic(t, "division by zero", func() { NewReal(64).Quo(x, NewReal(64)) })
	mustPanic(t, "sqrt of negative", func() { NewReal(64).Sqrt(NewReal(64).SetInt64(-1)) })
	mustPanic(t, "NaN", func() { NewReal(64).SetFloat64(math.NaN()) })
	mustPanic(t, "Inf", func() { NewReal(64).SetBig(new(big.Float).SetInf(false)) })
	mustPanic(t, "prec 0", func() { NewReal(0) })
}

func mustPanic(t *testing.T, what string, f func()) {
	t.Helper()
	defer func() {
		if recover() == nil {
			t.Errorf("%s: no panic", what)
		}
	}()
	f()
}

func TestRealSlice(t *testing.T) {
	s := NewRealSlice(5, 130)
	for i, x := range s {
		if x.Prec() != 192 || !x.IsZero() {
			t.Fatalf("element %d: prec %d zero %v", i, x.Prec(), x.IsZero())
		}
		x.SetInt64(int64(i + 1))
	}
	// Writes to one element must not touch its neighbours.
	s[2].Mul(s[2], s[4])
	for i, want := range []float64{1, 2, 15, 4, 5} {
		if got := s[i].Float64(); got != want {
			t.Errorf("element %d = %g, want %g", i, got, want)
		}
	}
}

func TestRealAllocs(t *testing.T) {
	for _, w := range []int{1, 3, 4, 7, 54} {
		r := rand.New(rand.NewPCG(15, uint64(w)))
		x, y, a := randReal(r, w, -3, 3), randReal(r, w, -3, 3), randReal(r, w, -3, 3)
		z := NewReal(x.Prec())
		ops := map[string]func(){
			"Add":    func() { z.Add(x, y) },
			"Sub":    func() { z.Sub(x, y) },
			"Mul":    func() { z.Mul(x, y) },
			"Quo":    func() { z.Quo(x, y) },
			"MulAdd": func() { z.MulAdd(x, y, a) },
			"MulSub": func() { z.MulSub(x, y, a) },
		}
		for name, f := range ops {
			if n := testing.AllocsPerRun(100, f); n != 0 {
				t.Errorf("W=%d %s: %v allocs per run", w, name, n)
			}
		}
	}
}

// FuzzRealArith decodes operands from bytes and checks every operation
// against math/big.Float rounded toward zero.
func FuzzRealArith(f *testing.F) {
	f.Add([]byte{0, 0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17})
	f.Add([]byte{3, 1, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0x80, 0, 0, 0, 0, 0, 0, 0, 0x7f, 0})
	f.Add([]byte{2, 200, 0x80, 0, 0, 0, 0, 0, 0, 1, 0x80, 0, 0, 0, 0, 0, 0, 0})
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) < 3 {
			return
		}
		ws := []int{1, 2, 3, 4, 7}
		w := ws[int(data[0])%len(ws)]
		dexp := int64(int8(data[1])) // exponent difference of y from x
		data = data[2:]
		word := func() uint64 {
			var v uint64
			for k := 0; k < 8; k++ {
				v <<= 8
				if len(data) > 0 {
					v |= uint64(data[0])
					data = data[1:]
				}
			}
			return v
		}
		mk := func(e int64) *Real {
			x := NewReal(uint(64 * w))
			for i := w - 1; i >= 0; i-- {
				x.mant[i] = word()
			}
			if x.mant[w-1] == 0 {
				return x // zero
			}
			x.neg = x.mant[0]&1 == 1
			s := bits.LeadingZeros64(x.mant[w-1])
			x.mant[w-1] <<= uint(s)
			x.exp, x.zero = e, false
			return x
		}
		x := mk(0)
		y := mk(dexp * 3)
		for op := opAdd; op <= opQuo; op++ {
			checkOp(t, op, x, y)
			checkOp(t, op, y, x)
		}
	})
}

// benchOperands returns x in [1/2, 1), y in (-1/2, -1/4] and a in
// [1/2, 1) with uniformly random mantissas of prec bits: Add cancels one
// bit at most and Sub carries, as in a typical recurrence step.
func benchOperands(prec uint) (x, y, a *Real) {
	r := rand.New(rand.NewPCG(1, uint64(prec)))
	mk := func(e int64, neg bool) *Real {
		v := NewReal(prec)
		for i := range v.mant {
			v.mant[i] = r.Uint64()
		}
		v.mant[len(v.mant)-1] |= 1 << 63
		v.exp, v.neg, v.zero = e, neg, false
		return v
	}
	return mk(0, false), mk(-1, true), mk(0, false)
}

var benchPrecs = []uint{128, 192, 256, 320, 1024, 3456}

func benchReal(b *testing.B, f func(z, x, y, a *Real)) {
	for _, prec := range benchPrecs {
		b.Run(fmt.Sprint(prec), func(b *testing.B) {
			x, y, a := benchOperands(prec)
			z := NewReal(prec)
			b.ReportAllocs()
			for b.Loop() {
				f(z, x, y, a)
			}
		})
	}
}

func benchBig(b *testing.B, f func(z, x, y, a *big.Float)) {
	for _, prec := range benchPrecs {
		b.Run(fmt.Sprint(prec), func(b *testing.B) {
			x, y, a := benchOperands(prec)
			bx, by, ba := x.Big(nil), y.Big(nil), a.Big(nil)
			z := new(big.Float).SetPrec(prec)
			b.ReportAllocs()
			for b.Loop() {
				f(z, bx, by, ba)
			}
		})
	}
}

func BenchmarkRealMul(b *testing.B)    { benchReal(b, func(z, x, y, _ *Real) { z.Mul(x, y) }) }
func BenchmarkRealAdd(b *testing.B)    { benchReal(b, func(z, x, y, _ *Real) { z.Add(x, y) }) }
func BenchmarkRealSub(b *testing.B)    { benchReal(b, func(z, x, y, _ *Real) { z.Sub(x, y) }) }
func BenchmarkRealMulAdd(b *testing.B) { benchReal(b, func(z, x, y, a *Real) { z.MulAdd(x, y, a) }) }
func BenchmarkRealQuo(b *testing.B)    { benchReal(b, func(z, x, y, _ *Real) { z.Quo(x, y) }) }

func BenchmarkBigFloatMul(b *testing.B) { benchBig(b, func(z, x, y, _ *big.Float) { z.Mul(x, y) }) }
func BenchmarkBigFloatAdd(b *testing.B) { benchBig(b, func(z, x, y, _ *big.Float) { z.Add(x, y) }) }
func BenchmarkBigFloatSub(b *testing.B) { benchBig(b, func(z, x, y, _ *big.Float) { z.Sub(x, y) }) }
func BenchmarkBigFloatMulAdd(b *testing.B) {
	t := new(big.Float).SetPrec(benchPrecs[len(benchPrecs)-1])
	benchBig(b, func(z, x, y, a *big.Float) { z.Add(t.Mul(x, y), a) }) // no aliasing: big.Float allocates then
}
func BenchmarkBigFloatQuo(b *testing.B) { benchBig(b, func(z, x, y, _ *big.Float) { z.Quo(x, y) }) }

// recurrenceN and recurrencePrec size the recurrence benchmarks: one
// evaluation of a degree-1000 monic orthogonal polynomial and its
// derivative at 192 bits.
const (
	recurrenceN    = 1000
	recurrencePrec = 192
)

// recurrenceCoeffs returns a_k = 1/(10(k+1)) and the Legendre
// b_k = k^2/(4k^2-1), k < recurrenceN, as exact rationals.
func recurrenceCoeffs() (a, b []*big.Rat) {
	for k := int64(0); k < recurrenceN; k++ {
		a = append(a, big.NewRat(1, 10*(k+1)))
		b = append(b, big.NewRat(k*k, max(4*k*k-1, 1)))
	}
	return a, b
}

// BenchmarkRealRecurrence evaluates p_{k+1} = (x - a_k) p_k - b_k p_{k-1}
// and its derivative, 8 operations per step.
func BenchmarkRealRecurrence(b *testing.B) {
	ar, br := recurrenceCoeffs()
	a, bb := NewRealSlice(recurrenceN, recurrencePrec), NewRealSlice(recurrenceN, recurrencePrec)
	for k := range a {
		a[k].SetRat(ar[k])
		bb[k].SetRat(br[k])
	}
	v := NewRealSlice(9, recurrencePrec)
	x, p, pm, dp, dpm, pn, dpn, t, u := v[0], v[1], v[2], v[3], v[4], v[5], v[6], v[7], v[8]
	x.SetFloat64(0.3)
	b.ReportAllocs()
	for b.Loop() {
		p.SetInt64(1)
		pm.SetInt64(0)
		dp.SetInt64(0)
		dpm.SetInt64(0)
		for k := 0; k < recurrenceN; k++ {
			t.Sub(x, a[k])
			pn.Mul(t, p)
			u.Mul(bb[k], pm)
			pn.Sub(pn, u)
			dpn.Mul(t, dp)
			dpn.Add(dpn, p)
			u.Mul(bb[k], dpm)
			dpn.Sub(dpn, u)
			pm, p, pn = p, pn, pm
			dpm, dp, dpn = dp, dpn, dpm
		}
	}
}

// BenchmarkBigFloatRecurrence is BenchmarkRealRecurrence on big.Float.
func BenchmarkBigFloatRecurrence(b *testing.B) {
	ar, br := recurrenceCoeffs()
	nf := func() *big.Float { return new(big.Float).SetPrec(recurrencePrec) }
	a, bb := make([]*big.Float, recurrenceN), make([]*big.Float, recurrenceN)
	for k := range a {
		a[k], bb[k] = nf().SetRat(ar[k]), nf().SetRat(br[k])
	}
	x, p, pm, dp, dpm, pn, dpn, t, u, v := nf().SetFloat64(0.3), nf(), nf(), nf(), nf(), nf(), nf(), nf(), nf(), nf()
	b.ReportAllocs()
	for b.Loop() {
		p.SetInt64(1)
		pm.SetInt64(0)
		dp.SetInt64(0)
		dpm.SetInt64(0)
		for k := 0; k < recurrenceN; k++ {
			// The same 8 operations, written without aliasing the receiver,
			// on which big.Float allocates.
			t.Sub(x, a[k])
			u.Mul(t, p)
			v.Mul(bb[k], pm)
			pn.Sub(u, v)
			u.Mul(t, dp)
			v.Add(u, p)
			u.Mul(bb[k], dpm)
			dpn.Sub(v, u)
			pm, p, pn = p, pn, pm
			dpm, dp, dpn = dp, dpn, dpm
		}
	}
}
