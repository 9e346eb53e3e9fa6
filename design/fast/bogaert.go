package fast

import (
	"math"
	"math/big"

	"quadwright/precision"
)

// bogaertMin is the smallest rule computed from Bogaert's expansions; the
// smaller ones come from the recurrence (jacobiCore), where the
// expansions in 1/(n+1/2) are not yet accurate to float64.
const bogaertMin = 101

// bogaertPoint returns, for the k-th node from x = 1 (1 <= k <= (n+1)/2)
// of the n-point Gauss-Legendre rule, n >= bogaertMin, the node angle
// theta in double-double and the weight, from Bogaert, "Iteration-free
// computation of Gauss-Legendre quadrature nodes and weights", SIAM J.
// Sci. Comput. 36(3), A1008-A1026, 2014: theta = v (j + theta0 (v^2 j /
// sin theta0) F(theta0^2, v^2 j / sin theta0)) with v = 1/(n+1/2), j the
// k-th zero of the Bessel function J_0 and theta0 = v j, and the weight 2v
// / (J_1(j)^2 (j / sin theta0) G(..)), F and G the paper's Chebyshev
// interpolants of the higher-order terms (the coefficients below are the
// paper's, as gonum's integrate/quad also uses them).
//
// Unlike a plain float64 evaluation, v j and the leading term pi (k-1/4)
// of McMahon's expansion of j are formed in double-double, so that theta
// carries its truncation error (far below 1 ulp for n >= 101) and about
// 2^-100 of rounding instead of several ulp: near theta = pi/2 the node
// cos(theta) has an absolute error of ulp(theta) sin(theta) per ulp of
// theta.
func bogaertPoint(n, k int, v dd) (theta dd, weight float64) {
	vh := v.hi
	// nu = z + mc, the zero j_{0,k} with z in double-double.
	var z dd
	var mc float64
	if k <= len(besselJ0Zeros) {
		z = ddF(besselJ0Zeros[k-1])
	} else {
		// McMahon's expansion (Abramowitz and Stegun 9.5.12).
		kq := float64(k) - 0.25
		z = twoProd(kq, math.Pi)
		z.lo += kq * pi2
		r := 1 / z.hi
		r2 := r * r
		mc = r * (0.125 + r2*(-0.807291666666666666666666666667e-1+r2*(0.246028645833333333333333333333+r2*(-1.82443876720610119047619047619+r2*(25.3364147973439050099206349206+r2*(-567.644412135183381139802038240+r2*(18690.4765282320653831636345064+r2*(-8.49353580299148769921876983660e5+5.09225462402226769498681286758e7*r2))))))))
	}
	nu := dd{z.hi + mc, 0}
	nu.lo = (z.hi - nu.hi) + mc + z.lo // |mc| < z.hi/8: the sum loses nothing
	t0 := vh * nu.hi
	x := t0 * t0
	b := besselJ1Squared(k)

	sf1t := (((((-1.29052996274280508473467968379e-12*x+2.40724685864330121825976175184e-10)*x-3.13148654635992041468855740012e-8)*x+0.275573168962061235623801563453e-5)*x-0.148809523713909147898955880165e-3)*x+0.416666666665193394525296923981e-2)*x - 0.416666666666662959639712457549e-1
	sf2t := (((((+2.20639421781871003734786884322e-9*x-7.53036771373769326811030753538e-8)*x+0.161969259453836261731700382098e-5)*x-0.253300326008232025914059965302e-4)*x+0.282116886057560434805998583817e-3)*x-0.209022248387852902722635654229e-2)*x + 0.815972221772932265640401128517e-2
	sf3t := (((((-2.97058225375526229899781956673e-8*x+5.55845330223796209655886325712e-7)*x-0.567797841356833081642185432056e-5)*x+0.418498100329504574443885193835e-4)*x-0.251395293283965914823026348764e-3)*x+0.128654198542845137196151147483e-2)*x - 0.416012165620204364833694266818e-2
	wsf1t := ((((((((-2.20902861044616638398573427475e-14*x+2.30365726860377376873232578871e-12)*x-1.75257700735423807659851042318e-10)*x+1.03756066927916795821098009353e-8)*x-4.63968647553221331251529631098e-7)*x+0.149644593625028648361395938176e-4)*x-0.326278659594412170300449074873e-3)*x+0.436507936507598105249726413120e-2)*x-0.305555555555553028279487898503e-1)*x + 0.833333333333333302184063103900e-1
	wsf2t := (((((((+3.63117412152654783455929483029e-12*x+7.67643545069893130779501844323e-11)*x-7.12912857233642220650643150625e-9)*x+2.11483880685947151466370130277e-7)*x-0.381817918680045468483009307090e-5)*x+0.465969530694968391417927388162e-4)*x-0.407297185611335764191683161117e-3)*x+0.268959435694729660779984493795e-2)*x - 0.111111111111214923138249347172e-1
	wsf3t := (((((((+2.01826791256703301806643264922e-9*x-4.38647122520206649251063212545e-8)*x+5.08898347288671653137451093208e-7)*x-0.397933316519135275712977531366e-5)*x+0.200559326396458326778521795392e-4)*x-0.422888059282921161626339411388e-4)*x-0.105646050254076140548678457002e-3)*x-0.947969308958577323145923317955e-4)*x + 0.656966489926484797412985260842e-2

	s0 := math.Sin(t0)
	nuSin := nu.hi / s0
	wInvSinc := vh * vh * nuSin
	wIS2 := wInvSinc * wInvSinc
	corr := t0 * wInvSinc * (sf1t + wIS2*(sf2t+wIS2*sf3t))
	// theta = v (nu + corr), the leading product exact (FMA), the rest
	// of order 2^-53 theta.
	p := twoProd(vh, nu.hi)
	theta = quickTwoSum(p.hi, p.lo+vh*(nu.lo+corr)+v.lo*nu.hi)
	// weight = 2 v sin(theta0) / (J_1(j)^2 j (1 + wIS2 G)), numerator and
	// denominator in double-double, so that only sin(theta0), J_1(j)^2
	// (about 1 ulp each) and the final rounding reach the weight.
	num := ddMulF(v, 2*s0)
	den := ddMul(ddMul(nu, b), twoSum(1, wIS2*(wsf1t+wIS2*(wsf2t+wIS2*wsf3t))))
	inv := 1 / den.hi
	q := num.hi * inv
	return theta, q + (math.FMA(-q, den.hi, num.hi)+num.lo-q*den.lo)*inv
}

// besselJ1Squared returns J_1(j)^2 at the k-th zero j of J_0 in
// double-double: tabulated for k <= 21, else its asymptotic series in
// x = 1/(k-1/4) (Bogaert 2014), the leading term 2x/pi^2 in double-double
// (in float64 it biases the weights by about 1.5 ulp) and the rest, below
// 2e-3 of it, in float64.
func besselJ1Squared(k int) dd {
	if k <= len(besselJ1SqAtZeros) {
		return ddF(besselJ1SqAtZeros[k-1])
	}
	kq := float64(k) - 0.25
	xh := 1 / kq
	x := dd{xh, math.FMA(-xh, kq, 1) * xh}
	x2 := xh * xh
	rest := xh * x2 * x2 * (-0.303380429711290253026202643516e-3 + x2*(0.198924364245969295201137972743e-3+x2*(-0.228969902772111653038747229723e-3+x2*(0.433710719130746277915572905025e-3+x2*(-0.123632349727175414724737657367e-2+x2*(0.496101423268883102872271417616e-2+x2*(-0.266837393702323757700998557826e-1+.185395398206345628711318848386*x2)))))))
	return ddAddFast(ddMul(x, twoOverPi2), ddF(rest))
}

// twoOverPi2 is 2/pi^2 in double-double.
var twoOverPi2 = func() dd {
	p := precision.Pi(constPrec)
	v := new(big.Float).SetPrec(constPrec).Quo(big.NewFloat(2).SetPrec(constPrec), new(big.Float).SetPrec(constPrec).Mul(p, p))
	return splitDDc(v)
}()

// besselJ0Zeros are the first 20 zeros of J_0 and besselJ1SqAtZeros the
// values J_1(j)^2 at the first 21 (Abramowitz and Stegun, Table 9.5; the
// digits as in Bogaert 2014).
var besselJ0Zeros = [20]float64{2.40482555769577276862163187933, 5.52007811028631064959660411281, 8.65372791291101221695419871266, 11.7915344390142816137430449119, 14.9309177084877859477625939974, 18.0710639679109225431478829756, 21.2116366298792589590783933505, 24.3524715307493027370579447632, 27.4934791320402547958772882346, 30.6346064684319751175495789269, 33.7758202135735686842385463467, 36.9170983536640439797694930633, 40.0584257646282392947993073740, 43.1997917131767303575240727287, 46.3411883716618140186857888791, 49.4826098973978171736027615332, 52.6240518411149960292512853804, 55.7655107550199793116834927735, 58.9069839260809421328344066346, 62.0484691902271698828525002646}

var besselJ1SqAtZeros = [21]float64{0.269514123941916926139021992911, 0.115780138582203695807812836182, 0.0736863511364082151406476811985, 0.0540375731981162820417749182758, 0.0426614290172430912655106063495, 0.0352421034909961013587473033648, 0.0300210701030546726750888157688, 0.0261473914953080885904584675399, 0.0231591218246913922652676382178, 0.0207838291222678576039808057297, 0.0188504506693176678161056800214, 0.0172461575696650082995240053542, 0.0158935181059235978027065594287, 0.0147376260964721895895742982592, 0.0137384651453871179182880484134, 0.0128661817376151328791406637228, 0.0120980515486267975471075438497, 0.0114164712244916085168627222986, 0.0108075927911802040115547286830, 0.0102603729262807628110423992790, 0.00976589713979105054059846736696}

// cosFromAngle returns x = cos(theta) and d = 1 - x, the distance to the
// end x = 1, for 0 <= theta <= pi/2 given in double-double (theta.lo a
// correction below ulp(theta.hi)), x with an error of at most about 0.05
// ulp(x) before its final rounding:
//
//   - theta <= pi/4: 1 - cos(theta) = (theta^2/2)(1 - p), p from its Taylor
//     series in theta^2 (p <= 0.052); theta^2/2 = A + B with A formed
//     exactly, and x = fl(1 - A) + (err(1 - A) + A p - B (1 - p)), all but
//     the first term below 0.016 in size;
//   - above: x = sin(phi) = phi (1 - p), phi = pi/2 - theta (its leading
//     part pi/2 - theta.hi exact by Sterbenz's lemma), p <= 0.103, so a node
//     near 0 keeps its relative accuracy.
//
// The truncated series (ten terms for arguments up to pi/4) are below 1e-19
// relative.
func cosFromAngle(theta dd) (x, d float64) {
	th, tl := theta.hi, theta.lo
	if th <= math.Pi/4 {
		e := twoProd(th, th)
		q := e.hi
		// p = 1 - (1 - cos theta) / (theta^2 / 2) = q/12 - q^2/360 + ...
		p := q * (1.0 / 12) * (1 - q*(1.0/30)*(1-q*(1.0/56)*(1-q*(1.0/90)*(1-q*(1.0/132)*(1-q*(1.0/182)*(1-q*(1.0/240)*(1-q*(1.0/306)*(1-q*(1.0/380)))))))))
		a := 0.5 * e.hi
		b := 0.5*e.lo + th*tl
		s := twoSum(1, -a)
		x = s.hi + (s.lo + (a*p - b*(1-p)))
		d = a + (b*(1-p) - a*p)
		return x, d
	}
	ph := math.Pi/2 - th
	pl := pi2/2 - tl
	phi := ph + pl
	q := phi * phi
	// p = 1 - sin(phi)/phi = q/6 - q^2/120 + ...
	p := q * (1.0 / 6) * (1 - q*(1.0/20)*(1-q*(1.0/42)*(1-q*(1.0/72)*(1-q*(1.0/110)*(1-q*(1.0/156)*(1-q*(1.0/210)*(1-q*(1.0/272)*(1-q*(1.0/342)))))))))
	x = ph + (pl - phi*p)
	return x, 1 - x
}
