package precision

import (
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// relErr returns log2 |got - want| / |want| at 512 bits, -1e9 for an exact
// result.
func relErr(got, want *big.Float) float64 {
	d := new(big.Float).SetPrec(512).Sub(got, want)
	if d.Sign() == 0 {
		return -1e9
	}
	d.Quo(d, want)
	f, _ := d.Float64()
	return math.Log2(math.Abs(f))
}

func randQD(r *rand.Rand) (QD, *big.Float) {
	x := new(big.Float).SetPrec(300).SetFloat64(r.Float64()*2 - 1)
	t := new(big.Float).SetPrec(300)
	for i := 1; i < 6; i++ {
		x.Add(x, t.SetFloat64(math.Ldexp(r.Float64()-0.5, -53*i)))
	}
	x.SetMantExp(x, r.Intn(40)-20)
	q := QDFromBig(x)
	return q, SetQD(new(big.Float).SetPrec(512), q)
}

// TestQDAgainstBig checks every QD operation on random operands against
// math/big at 512 bits, with the error bounds the doc comments state.
func TestQDAgainstBig(t *testing.T) {
	r := rand.New(rand.NewSource(1))
	worst := map[string]float64{}
	note := func(op string, e float64) {
		if e > worst[op] || worst[op] == 0 {
			worst[op] = e
		}
	}
	for i := 0; i < 20000; i++ {
		x, bx := randQD(r)
		y, by := randQD(r)
		z := new(big.Float).SetPrec(512)
		// Add: bound relative to |x|+|y|.
		scale := new(big.Float).SetPrec(512).Add(new(big.Float).Abs(bx), new(big.Float).Abs(by))
		d := new(big.Float).SetPrec(512).Sub(SetQD(new(big.Float).SetPrec(512), x.Add(y)), z.Add(bx, by))
		if d.Sign() != 0 {
			note("add", relErr(new(big.Float).SetPrec(512).Add(scale, d), scale))
		}
		note("mul", relErr(SetQD(new(big.Float).SetPrec(512), x.Mul(y)), z.Mul(bx, by)))
		note("quo", relErr(SetQD(new(big.Float).SetPrec(512), x.Quo(y)), z.Quo(bx, by)))
		v := y.X0
		note("mulfloat", relErr(SetQD(new(big.Float).SetPrec(512), x.MulFloat(v)), z.Mul(bx, new(big.Float).SetFloat64(v))))
		ax := new(big.Float).SetPrec(512).Abs(bx)
		note("sqrt", relErr(SetQD(new(big.Float).SetPrec(512), QDFromBig(ax).Sqrt()), z.Sqrt(ax)))
		dx, dy := x.DD(), y.DD()
		bdx := new(big.Float).SetPrec(512).SetFloat64(dx.Hi)
		bdx.Add(bdx, new(big.Float).SetFloat64(dx.Lo))
		bdy := new(big.Float).SetPrec(512).SetFloat64(dy.Hi)
		bdy.Add(bdy, new(big.Float).SetFloat64(dy.Lo))
		note("ddmul", relErr(ddBig(dx.Mul(dy)), z.Mul(bdx, bdy)))
		note("ddquo", relErr(ddBig(dx.Quo(dy)), z.Quo(bdx, bdy)))
		note("ddmulfloat", relErr(ddBig(dx.MulFloat(v)), z.Mul(bdx, new(big.Float).SetFloat64(v))))
		note("ddsqrt", relErr(ddBig(DDFromBig(ax).Sqrt()), z.Sqrt(ddBig(DDFromBig(ax)))))
		dsc := new(big.Float).SetPrec(512).Add(new(big.Float).Abs(bdx), new(big.Float).Abs(bdy))
		if d := new(big.Float).SetPrec(512).Sub(ddBig(dx.AddFast(dy)), z.Add(bdx, bdy)); d.Sign() != 0 {
			note("ddaddfast", relErr(new(big.Float).SetPrec(512).Add(dsc, d), dsc))
		}
		if s := z.Add(bdx, bdy); s.Sign() != 0 {
			note("ddadd", relErr(ddBig(dx.Add(dy)), s))
		}
	}
	// The bounds of the doc comments (log2 of the relative error).
	bound := map[string]float64{"add": -208, "mul": -206, "quo": -204, "mulfloat": -207, "sqrt": -202,
		"ddadd": -104, "ddaddfast": -104, "ddmul": -102, "ddquo": -100, "ddmulfloat": -103, "ddsqrt": -100}
	for op, b := range bound {
		if worst[op] > b {
			t.Errorf("%s: worst relative error 2^%.1f, above the stated 2^%.0f", op, worst[op], b)
		}
		t.Logf("%s: worst 2^%.1f", op, worst[op])
	}
}

func ddBig(x DD) *big.Float {
	z := new(big.Float).SetPrec(512).SetFloat64(x.Hi)
	return z.Add(z, new(big.Float).SetFloat64(x.Lo))
}

func BenchmarkQDMul(b *testing.B) {
	x, y := QDFrom(1.0/3), QDFrom(2.0/7)
	for i := 0; i < b.N; i++ {
		x = x.Mul(y).Add(y)
	}
	_ = x
}

func BenchmarkDDMul(b *testing.B) {
	x, y := DDFrom(1.0/3), DDFrom(2.0/7)
	for i := 0; i < b.N; i++ {
		x = x.Mul(y).Add(y)
	}
	_ = x
}

func BenchmarkRealMul192(b *testing.B) {
	x, y := NewReal(192).SetFloat64(1.0/3), NewReal(192).SetFloat64(2.0/7)
	for i := 0; i < b.N; i++ {
		x.Mul(x, y)
		x.Add(x, y)
	}
}
