package design

import (
	"context"
	"fmt"
	"math/big"
	"runtime"
	"sync"

	"quadwright/precision"
)

// Lanczos returns the first n recurrence pairs of the discrete measure
// sum_i c[i] delta(x - x[i]). On entry x holds distinct support points (in
// any order) and c positive masses, len(x) == len(c) >= n >= 1; they are
// read, never changed.
//
// The method is the Rutishauser-Kahan-Pal-Walker form of the Lanczos
// process, which adds one support point at a time to the Jacobi matrix by
// a chase of Givens rotations in squared form (W. B. Gragg and W. J.
// Harrod, "The numerically stable reconstruction of Jacobi matrices from
// spectral data", Numer. Math. 44, 1984; the square-root-free layout is
// that of W. Gautschi, Orthogonal Polynomials: Computation and
// Approximation, Oxford 2004, section 2.2.3.2). The bulge of each chase only
// travels downward, so rows below n never influence rows above it: the
// matrix is kept to its first n rows, and the cost is O(len(x) n) instead
// of O(len(x)^2). Every operation is rounded to prec bits; the method is
// stable (orthogonal transformations), so the pairs carry errors of a few
// ulp times a modest multiple of n.
func Lanczos(ctx context.Context, x, c []*big.Float, n int, prec uint) (*Recurrence, error) {
	M := len(x)
	if len(c) != M || n < 1 || n > M {
		panic(fmt.Sprintf("design: Lanczos(%d) with %d points and %d masses", n, M, len(c)))
	}
	rows := min(n+1, M)
	p0 := precision.NewRealSlice(rows, prec) // alpha_k
	p1 := precision.NewRealSlice(rows, prec) // beta_k
	for l := 0; l < rows; l++ {
		p0[l].SetBig(x[l])
	}
	p1[0].SetBig(c[0])
	// The chase of point k passes row l before the chase of point k+1
	// reaches it, so the rows can be cut into bands, one goroutine each,
	// that pass the chase on like a bucket brigade: every row sees the same
	// operations in the same order whatever the number of bands, and the
	// result does not depend on the core count.
	bands := min(runtime.GOMAXPROCS(0), rows/lanczosBandRows)
	if M < 4*rows {
		bands = 1
	}
	bands = max(bands, 1)
	links := make([]chan *chaseState, bands+1)
	for i := range links {
		links[i] = make(chan *chaseState, lanczosPipeline)
	}
	free := make(chan *chaseState, lanczosPipeline+bands+1)
	for i := 0; i < lanczosPipeline+bands+1; i++ {
		free <- newChaseState(prec)
	}
	var wg sync.WaitGroup
	for b := 0; b < bands; b++ {
		lo, hi := b*rows/bands, (b+1)*rows/bands
		wg.Add(1)
		go func(in, out chan *chaseState, lo, hi int) {
			defer wg.Done()
			w := newChaseWork(prec)
			for st := range in {
				st.chase(w, p0, p1, lo, hi)
				if st.k < hi || hi == rows {
					free <- st // this chase ended in the band
				} else {
					out <- st
				}
			}
			close(out)
		}(links[b], links[b+1], lo, hi)
	}
	var err error
	for k := 1; k < M; k++ {
		if k%64 == 0 {
			if err = ctx.Err(); err != nil {
				break
			}
		}
		st := <-free
		st.k = k
		st.pk.SetBig(c[k])
		st.gam.SetInt64(1)
		st.sig.SetInt64(0)
		st.t.SetInt64(0)
		st.lam.SetBig(x[k])
		links[0] <- st
	}
	close(links[0])
	wg.Wait()
	if err != nil {
		return nil, err
	}
	return realsToRecurrence(p0[:n], p1[:n], prec), nil
}

// lanczosBandRows is the fewest rows a band of the pipelined Lanczos gets,
// and lanczosPipeline how many chases may wait between two bands.
const (
	lanczosBandRows = 48
	lanczosPipeline = 8
)

// chaseState is the bulge of one point's chase down the rows: the point
// k, its coordinate lam, and the rotation state pk, gam, sig, t.
type chaseState struct {
	k                    int
	pk, gam, sig, t, lam *precision.Real
}

func newChaseState(prec uint) *chaseState {
	r := precision.NewRealSlice(5, prec)
	return &chaseState{pk: r[0], gam: r[1], sig: r[2], t: r[3], lam: r[4]}
}

// chaseWork is one band's scratch space.
type chaseWork struct {
	rho, tmp, tsig, tk, u, inv, rpk, one *precision.Real
}

func newChaseWork(prec uint) *chaseWork {
	r := precision.NewRealSlice(8, prec)
	return &chaseWork{rho: r[0], tmp: r[1], tsig: r[2], tk: r[3], u: r[4], inv: r[5], rpk: r[6], one: r[7].SetInt64(1)}
}

// chase carries st's point through rows lo..hi-1 (those below k+1).
func (st *chaseState) chase(w *chaseWork, p0, p1 []*precision.Real, lo, hi int) {
	pk, gam, sig, t, lam := st.pk, st.gam, st.sig, st.t, st.lam
	rho, tmp, tsig, tk, u, inv, rpk, one := w.rho, w.tmp, w.tsig, w.tk, w.u, w.inv, w.rpk, w.one
	for l := lo; l < min(hi, st.k+1); l++ {
		if l == st.k {
			// The new point's own row starts as alpha = lambda.
			p0[l].Set(lam)
		}
		rho.Add(p1[l], pk)
		tmp.Mul(gam, rho)
		tsig.Set(sig)
		switch {
		case rho.Sign() <= 0:
			gam.SetInt64(1)
			sig.SetInt64(0)
		case pk.Sign() <= 0:
			inv.Quo(one, rho)
			gam.Mul(p1[l], inv)
			sig.SetInt64(0)
		default:
			// One division gives both 1/rho and 1/pk, the latter for
			// pk' = t^2 / sig = t^2 rho / pk below: divisions cost about
			// ten multiplications at these precisions.
			inv.Mul(rho, pk)
			inv.Quo(one, inv)
			rpk.Mul(rho, inv)
			inv.Mul(inv, pk)
			gam.Mul(p1[l], inv)
			sig.Mul(pk, inv)
		}
		u.Sub(p0[l], lam)
		tk.Mul(sig, u)
		u.Mul(gam, t)
		tk.Sub(tk, u)
		u.Sub(tk, t)
		p0[l].Sub(p0[l], u)
		t.Set(tk)
		if sig.Sign() <= 0 {
			pk.Mul(tsig, p1[l])
		} else {
			pk.Mul(t, t)
			pk.Mul(pk, rho)
			pk.Mul(pk, rpk)
		}
		p1[l].Set(tmp)
	}
}

// Stieltjes returns the first n recurrence pairs of the discrete measure
// sum_i c[i] delta(x - x[i]) by the discretised Stieltjes procedure: the
// monic orthogonal polynomials are run at every support point by their own
// recurrence, and
//
//	alpha_k = sum c pi_k^2 x / sum c pi_k^2,  beta_k = sum c pi_k^2 / sum c pi_{k-1}^2,
//
// (T. J. Stieltjes, "Quelques recherches sur la theorie des quadratures
// dites mecaniques", Ann. Sci. Ecole Norm. Sup. 1, 1884; W. Gautschi, "On
// generating orthogonal polynomials", SIAM J. Sci. Statist. Comput. 3,
// 1982, section 2.2). Same contract on x and c as Lanczos. Every
// operation is rounded to prec bits. The procedure is not backward stable:
// when n comes close to len(x) the polynomials lose relative accuracy at
// some points, and the pairs can lose bits; Lanczos is the stable route,
// this one the independent check. Cost O(len(x) n).
func Stieltjes(ctx context.Context, x, c []*big.Float, n int, prec uint) (*Recurrence, error) {
	M := len(x)
	if len(c) != M || n < 1 || n > M {
		panic(fmt.Sprintf("design: Stieltjes(%d) with %d points and %d masses", n, M, len(c)))
	}
	// The points are cut into a fixed number of chunks, whatever the
	// number of cores, and the chunks' partial sums are added in a fixed
	// order, so that the result never depends on scheduling.
	chunks := min(stieltjesChunks, max(1, M/256))
	parts := make([]*stieltjesChunk, chunks)
	for j := range parts {
		lo, hi := j*M/chunks, (j+1)*M/chunks
		parts[j] = newStieltjesChunk(x[lo:hi], c[lo:hi], prec)
	}
	al := precision.NewRealSlice(n, prec)
	be := precision.NewRealSlice(n, prec)
	norm, mom, oldNorm := precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec)
	workers := min(runtime.GOMAXPROCS(0), chunks)
	for k := 0; k < n; k++ {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		var a, b *precision.Real // the pair of step k-1, nil at k = 0
		if k > 0 {
			a, b = al[k-1], be[k-1]
		}
		runChunks(workers, chunks, func(j int) { parts[j].step(k, a, b) })
		norm.SetInt64(0)
		mom.SetInt64(0)
		for _, p := range parts {
			norm.Add(norm, p.norm)
			mom.Add(mom, p.mom)
		}
		if norm.Sign() <= 0 {
			return nil, fmt.Errorf("the discrete measure has fewer than %d support points of positive mass", k+1)
		}
		al[k].Quo(mom, norm)
		if k == 0 {
			be[0].Set(norm)
		} else {
			be[k].Quo(norm, oldNorm)
		}
		oldNorm.Set(norm)
	}
	return realsToRecurrence(al, be, prec), nil
}

// stieltjesChunks is the number of chunks Stieltjes cuts the points into.
const stieltjesChunks = 16

// runChunks calls f(0..chunks-1) on workers goroutines.
func runChunks(workers, chunks int, f func(j int)) {
	if workers <= 1 {
		for j := 0; j < chunks; j++ {
			f(j)
		}
		return
	}
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			for j := w; j < chunks; j += workers {
				f(j)
			}
		}(w)
	}
	wg.Wait()
}

// stieltjesChunk holds a chunk of points with sqrt(c) pi_{k-1} and
// sqrt(c) pi_k at each (the recurrence is linear, so the scaling by the
// square root of the mass carries through, and c pi_k^2 is one square),
// and the chunk's sums of c pi_k^2 and c pi_k^2 x.
type stieltjesChunk struct {
	xs, prev, cur   []*precision.Real
	norm, mom, q, t *precision.Real
}

func newStieltjesChunk(x, c []*big.Float, prec uint) *stieltjesChunk {
	m := len(x)
	ch := &stieltjesChunk{xs: precision.NewRealSlice(m, prec),
		prev: precision.NewRealSlice(m, prec), cur: precision.NewRealSlice(m, prec)}
	for i := 0; i < m; i++ {
		ch.xs[i].SetBig(x[i])
		ch.cur[i].SetBig(c[i]).Sqrt(ch.cur[i])
	}
	r := precision.NewRealSlice(4, prec)
	ch.norm, ch.mom, ch.q, ch.t = r[0], r[1], r[2], r[3]
	return ch
}

// step sums c pi_k^2 and c pi_k^2 x over the chunk; for k > 0 it first
// forms pi_k = (x - a) pi_{k-1} - b pi_{k-2} from the pair (a, b) of step
// k-1 (b unused at k = 1).
func (ch *stieltjesChunk) step(k int, a, b *precision.Real) {
	ch.norm.SetInt64(0)
	ch.mom.SetInt64(0)
	for i := range ch.xs {
		if k > 0 {
			ch.t.Sub(ch.xs[i], a)
			if k == 1 {
				ch.q.SetInt64(0)
			} else {
				ch.q.Mul(b, ch.prev[i])
			}
			ch.prev[i].MulSub(ch.t, ch.cur[i], ch.q)
			ch.prev[i], ch.cur[i] = ch.cur[i], ch.prev[i]
		}
		ch.q.Mul(ch.cur[i], ch.cur[i])
		ch.norm.Add(ch.norm, ch.q)
		ch.mom.MulAdd(ch.q, ch.xs[i], ch.mom)
	}
}
