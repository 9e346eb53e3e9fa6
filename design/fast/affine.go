package fast

// MapFinite maps a rule on [-1, 1] affinely onto [lo, hi] in place: the
// node t becomes lo + half (1 + t) when t < 0 and hi - half (1 - t)
// otherwise, with the distance 1 -/+ t taken from d (Points) so that nodes
// near either end keep their relative accuracy; each weight is multiplied
// by half = (hi - lo)/2. lo, hi and half are given as pairs hi + lo (to
// about 2^-106); each result is formed in double-double and rounded once.
func MapFinite(x, w, d []float64, lo, hi, half [2]float64) {
	if len(d) != len(x) || len(w) != len(x) {
		panic("fast: slice length mismatch")
	}
	L, H, h := dd{lo[0], lo[1]}, dd{hi[0], hi[1]}, dd{half[0], half[1]}
	parallelFor(len(x), func(a, b int) {
		for i := a; i < b; i++ {
			off := ddMulF(h, d[i])
			if x[i] < 0 {
				x[i] = ddAdd(L, off).float()
			} else {
				x[i] = ddSub(H, off).float()
			}
			w[i] = ddMulF(h, w[i]).float()
		}
	})
}

// Shift adds lo (a pair hi + lo) to every node, each sum formed in
// double-double and rounded once.
func Shift(x []float64, lo [2]float64) {
	L := dd{lo[0], lo[1]}
	parallelFor(len(x), func(a, b int) {
		for i := a; i < b; i++ {
			x[i] = ddAdd(L, ddF(x[i])).float()
		}
	})
}
