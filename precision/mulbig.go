package precision

import (
	"math/big"
	"sync"
	"unsafe"
)

// mulBigWords is the mantissa length from which mulLarge forms the full
// product with math/big's natural-number multiplication (assembly kernels,
// Karatsuba from 40 words) instead of the Go short product of mulTop: the
// full product costs twice the word products but each runs several times
// faster, and truncating an exact product is exact. Below it the call
// overhead outweighs the gain (a tuned threshold: on a shared 2-core machine the full product won from about 24 words, 1.4 times at 54).
const mulBigWords = 24

// mulScratch holds the big.Int values and the product buffer of mulViaBig.
type mulScratch struct {
	x, y, p big.Int
	buf     []big.Word
}

var mulPool = sync.Pool{New: func() any { return new(mulScratch) }}

// words views a mantissa as math/big words (uint64 and big.Word are both
// 64 bits on the platforms where big.Word is 64 bits; see wordsOK).
func words(m []uint64) []big.Word {
	return unsafe.Slice((*big.Word)(unsafe.Pointer(unsafe.SliceData(m))), len(m))
}

// wordsOK reports whether big.Word is 64 bits wide, which words needs.
const wordsOK = unsafe.Sizeof(big.Word(0)) == 8

// mulViaBig is mulTop by math/big: the exact 2W-word product, then its
// top W words normalised as normProduct does. z may alias x or y.
func mulViaBig(z, x, y []uint64) bool {
	w := len(z)
	s := mulPool.Get().(*mulScratch)
	if cap(s.buf) < 8*w {
		s.buf = make([]big.Word, 8*w)
	}
	s.x.SetBits(words(x[:w]))
	s.y.SetBits(words(y[:w]))
	s.p.SetBits(s.buf[:0])
	s.p.Mul(&s.x, &s.y)
	p := s.p.Bits()
	// Both mantissas have their top bit set, so the product has 2W words
	// (top word nonzero) and its top bit sits at position 128W-1 or 128W-2.
	if len(p) != 2*w {
		mulPool.Put(s)
		return mulExact(z, x, y) // unreachable for normalised mantissas
	}
	pu := unsafe.Slice((*uint64)(unsafe.Pointer(unsafe.SliceData(p))), len(p))
	sh := normProduct(z, pu[w:2*w], pu[w-1])
	if cap(p) > cap(s.buf) {
		s.buf = p[:0] // math/big grew the buffer: keep the larger one
	}
	s.x.SetBits(nil)
	s.y.SetBits(nil)
	mulPool.Put(s)
	return sh
}
