package fast

import (
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// nufftParams are the number Msp of grid points on each side of a node
// over which its Gaussian is spread and the grid's oversampling ratio R.
// With R = 2 the truncation and aliasing errors are about exp(-2 pi Msp /
// 3) at the edge of the band (3e-15 for Msp = 16), while the
// deconvolution multiplies the rounding of the transform by up to exp(pi
// Msp / 12) (66) there; Msp = 16 balances the two (Greengard and Lee 2004,
// section 2). The coarse setting (R = 5/4, Msp = 8, errors near 1e-3)
// serves a lower bound that needs only a few digits.
type nufftParams struct {
	spread int
	ratio  float64
}

var (
	nufftFine   = nufftParams{16, 2}
	nufftCoarse = nufftParams{8, 1.25}
)

// cosTransform holds the result of cosSums: F[k] = sum_i c_i cos(k
// theta_i) for k < K, and what bounds its error.
type cosTransform struct {
	F      []float64
	amp    []float64 // the deconvolution factor exp(k^2 tau) at the end of each block of 64 degrees
	tau    float64   // the Gaussian's parameter
	grid   int       // Mr, points of the periodic grid
	trunc  float64   // truncation and aliasing at the band's edge, relative to sum |c|
	rounds float64   // roundings per value: spreading and the FFT
}

// errBound returns the bound on |F[k] - exact| relative to sum_i |c_i|:
// the truncation and aliasing of the Gaussian (trunc, largest at the
// band's edge) plus the rounding of spreading (2 Msp terms per node, each
// with about 2 Msp roundings) and of the real FFT (about 4 log2(Mr)
// roundings of the grid's l1 norm, which the normalisation makes sum |c|)
// times the deconvolution factor exp(k^2 tau).
func (t *cosTransform) errBound(k int) float64 {
	// exp(k^2 tau) grows with k: the block's last value bounds it.
	return t.trunc + 0x1p-53*t.rounds*t.amp[k/64]*(1+1e-12)
}

// cosSums returns F[k] = sum_i c_i cos(k theta_i) for k = 0..K-1 by one
// nonuniform fast Fourier transform of type 1 with Gaussian gridding (L.
// Greengard and J.-Y. Lee, "Accelerating the nonuniform fast Fourier
// transform", SIAM Review 46, 2004): the nodes theta_i in [0, pi] and their
// mirror images -theta_i carry c_i/2 each, so that the spread function is
// even and 2 pi periodic, and its transform on the oversampled grid is one
// real cosine transform (DCT-I, gonum's dsp/fourier) of half the grid.
// The angles are given in double-double (th), and each node's offset from
// its grid point is formed from them in double-double, so that the
// transform at degree k is not spoiled by k times the rounding of theta_i.
func cosSums(th []dd, c []float64, K int, par nufftParams) *cosTransform {
	piOnce.Do(buildPi)
	M := 2 * K // the band -K..K of the even extension
	spread := par.spread
	half := niceSize(int(math.Ceil(par.ratio * float64(M) / 2)))
	Mr := 2 * half
	R := float64(Mr) / float64(M)
	tau := math.Pi * float64(spread) / (float64(M) * float64(M) * R * (R - 0.5))
	h := ddDiv(ddMulF(ddPi, 2), ddF(float64(Mr)))
	hf := h.hi
	e3 := make([]float64, spread+1)
	for l := range e3 {
		d := float64(l) * hf
		e3[l] = math.Exp(-d * d / (4 * tau))
	}
	f := make([]float64, half+1)
	// m lies within spread of [0, half], so one reflection folds it.
	add := func(m int, v float64) {
		if m < 0 {
			m = -m
		}
		if m > half {
			m = Mr - m
		}
		if m == 0 || m == half {
			v *= 2
		}
		f[m] += v
	}
	for i, t := range th {
		m0 := int(t.hi / hf)
		xi := ddSub(t, ddMulF(h, float64(m0))).hi
		for xi < 0 {
			m0--
			xi += hf
		}
		for xi >= hf {
			m0++
			xi -= hf
		}
		v := 0.5 * c[i] * math.Exp(-xi*xi/(4*tau))
		e2 := math.Exp(xi * hf / (2 * tau))
		ie2 := 1 / e2
		up, dn := v, v
		if m0 >= spread && m0+spread <= half {
			// Away from the grid's ends no value needs folding.
			g := f[m0-spread : m0+spread+1]
			g[spread] += v
			for l := 1; l <= spread; l++ {
				up *= e2
				g[spread+l] += up * e3[l]
				if l < spread {
					dn *= ie2
					g[spread-l] += dn * e3[l]
				}
			}
			continue
		}
		add(m0, v)
		for l := 1; l <= spread; l++ {
			up *= e2
			add(m0+l, up*e3[l])
			if l < spread {
				dn *= ie2
				add(m0-l, dn*e3[l])
			}
		}
	}
	D := fourier.NewDCT(half+1).Transform(f, f)
	scale := math.Sqrt(math.Pi/tau) / float64(Mr)
	F := make([]float64, K)
	amp := make([]float64, (K+63)/64)
	// exp(k^2 tau) exactly every 64 degrees, by the step factors exp((2k+1)
	// tau) in between (at most 128 roundings, counted in rounds).
	var a, step, grow float64
	for k := range F {
		fk := float64(k)
		if k%64 == 0 {
			a = math.Exp(fk * fk * tau)
			step, grow = math.Exp((2*fk+1)*tau), math.Exp(2*tau)
			last := float64(min(k+63, K-1))
			amp[k/64] = math.Exp(last * last * tau)
		} else {
			a *= step
			step *= grow
		}
		F[k] = D[k] * scale * a
	}
	edge := float64(M/2) * float64(M/2) * tau
	trunc := 2 * (math.Exp(-float64(spread*spread)*hf*hf/(4*tau)+edge) +
		math.Exp(-tau*float64(Mr)*float64(Mr-M)))
	return &cosTransform{F: F, amp: amp, tau: tau, grid: Mr, trunc: trunc,
		rounds: float64(4*spread) + 8*math.Log2(float64(Mr)) + 128}
}

// niceSize returns the smallest n >= m of the form 2^a 3^b 5^c (a fast
// length for the transform).
func niceSize(m int) int {
	best := math.MaxInt
	for p5 := 1; p5 < 2*m; p5 *= 5 {
		for p3 := p5; p3 < 2*m; p3 *= 3 {
			p := p3
			for p < m {
				p *= 2
			}
			best = min(best, p)
		}
	}
	return best
}
