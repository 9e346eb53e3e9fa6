package precision

import "testing"

func TestDigitsToBits(t *testing.T) {
	// ceil(d log2 10) with log2 10 = 3.32192809488736234787 (from memory):
	// 1 -> 3.32, 15 -> 49.83, 16 -> 53.15, 34 -> 112.95, 1000 -> 3321.93.
	for _, c := range []struct {
		d    int
		want uint
	}{{0, 0}, {1, 4}, {2, 7}, {15, 50}, {16, 54}, {17, 57}, {34, 113}, {50, 167}, {200, 665}, {1000, 3322}, {MaxDigits, 3322}} {
		if got := DigitsToBits(c.d); got != c.want {
			t.Errorf("DigitsToBits(%d) = %d, want %d", c.d, got, c.want)
		}
	}
}

func TestWorkingPrec(t *testing.T) {
	// DigitsToBits(digits) + 32 + 2*ceil(log2(n+1)), up to a multiple of 64.
	for _, c := range []struct {
		digits, n int
		want      uint
	}{
		{1, 0, 64},         // 4+32+0 = 36
		{16, 1, 128},       // 54+32+2 = 88
		{34, 10, 192},      // 113+32+8 = 153
		{34, 100, 192},     // 113+32+14 = 159
		{1000, 1000, 3392}, // 3322+32+20 = 3374
		{1000, 1 << 20, 3456},
	} {
		got := WorkingPrec(c.digits, c.n)
		if got != c.want || got%64 != 0 {
			t.Errorf("WorkingPrec(%d, %d) = %d, want %d", c.digits, c.n, got, c.want)
		}
	}
}

func TestRaisePrec(t *testing.T) {
	for _, c := range []struct{ prec, want uint }{
		{0, 64}, {1, 128}, {64, 128}, {128, 192}, {192, 320}, {3392, 5120},
	} {
		if got := RaisePrec(c.prec); got != c.want {
			t.Errorf("RaisePrec(%d) = %d, want %d", c.prec, got, c.want)
		}
	}
}
