#!/usr/bin/python3
"""Generate testdata/reference/gauss.json: 50-digit reference Gauss rules.

Run (from the repository root):

    /usr/bin/python3 testdata/reference/gen_gauss.py

Uses Debian python3-mpmath (1.2.1) for all high-precision work and
numpy/scipy only for float64 starting guesses.  See README.md.

Route, for every case, at mp.dps = 90:

  nodes   zeros of the degree-N polynomial as evaluated by mpmath's own
          special functions (mpmath.legendre, jacobi, gegenbauer, chebyt,
          chebyu, laguerre, hermite), polished by mpmath.findroot (Newton,
          analytic derivative) from float64 eigenvalues of the Jacobi
          matrix (the recurrence is used ONLY for these starting guesses).
          Each root is confirmed: |Newton correction| tiny, count N,
          distinct, sorted, inside the support, sign change of p at a small
          offset on both sides, and alternating signs of p at the midpoints
          between consecutive roots (so there is exactly one root per gap).
  weights route A: family-specific handbook closed forms (see weights_A).
          route B: the general Christoffel-number formula
                   lambda_i = (k_n/k_{n-1}) h_{n-1} / (p_n'(x_i) p_{n-1}(x_i))
                   with p_n' from mpmath.diff (numerical differentiation) and
                   leading coefficients k_n / norms h_n from handbook tables.
          Route A is written out; A and B must agree to ~1e-80.
  checks  sum_i w_i x_i^k against exact moments for k = 0..2N-1 (closed
          forms, computed at raised precision), total mass, a second
          moment formula for symmetric weights, and for every weight
          function a few moments re-derived with mpmath.quad (tanh-sinh).

All formulas are quoted from memory; references:
  [AS]     Abramowitz & Stegun, Handbook of Mathematical Functions (1964).
  [Szego]  G. Szego, Orthogonal Polynomials, AMS Colloq. Publ. 23.
  [DLMF]   NIST Digital Library of Mathematical Functions, ch. 18.
"""

import datetime
import json
import math
import os
import re
import sys
import time
from fractions import Fraction

import mpmath
from mpmath import mp, mpf
import numpy as np
from scipy.linalg import eigh_tridiagonal

WORK_DPS = 90
OUT_DIGITS = 50
CHECK_TOL = mpf(10) ** -80  # relative tolerance of all self-checks

mp.dps = WORK_DPS


def exact(s):
    """Exact decimal string -> mpf at the current precision (p/q division)."""
    f = Fraction(s)
    return mpf(f.numerator) / f.denominator


# ---------------------------------------------------------------------------
# Float64 starting guesses: eigenvalues of the symmetric Jacobi matrix.
# Monic recurrence p_{k+1} = (x - a_k) p_k - b_k p_{k-1}; the matrix has
# diagonal a_k and off-diagonal sqrt(b_k).  Coefficients from memory
# (they follow from [AS] 22.7 by normalising to monic form).
# ---------------------------------------------------------------------------

def jacobi_recurrence_f64(n, a, b):
    diag = np.zeros(n)
    off = np.zeros(max(n - 1, 0))
    for k in range(n):
        s = 2 * k + a + b
        if k == 0:
            diag[k] = (b - a) / (a + b + 2)
        else:
            diag[k] = (b * b - a * a) / (s * (s + 2))
    for k in range(1, n):
        s = 2 * k + a + b
        if k == 1:
            bk = 4 * (1 + a) * (1 + b) / ((2 + a + b) ** 2 * (3 + a + b))
        else:
            bk = 4 * k * (k + a) * (k + b) * (k + a + b) / (s * s * (s + 1) * (s - 1))
        off[k - 1] = math.sqrt(bk)
    return diag, off


def guesses_f64(family, n, a, b):
    if family in ("laguerre",):
        diag = np.array([2 * k + a + 1 for k in range(n)], dtype=float)
        off = np.array([math.sqrt(k * (k + a)) for k in range(1, n)], dtype=float)
    elif family == "hermite":
        diag = np.zeros(n)
        off = np.array([math.sqrt(k / 2.0) for k in range(1, n)], dtype=float)
    else:
        diag, off = jacobi_recurrence_f64(n, a, b)
    if n == 1:
        return [float(diag[0])]
    ev = eigh_tridiagonal(diag, off, eigvals_only=True)
    return sorted(float(v) for v in ev)


# ---------------------------------------------------------------------------
# Families.  Each provides
#   p(n, x)     the degree-n polynomial, mpmath special function
#   dp(n, x)    analytic derivative (used by Newton and route A)
#   kn(n), hn(n)  leading coefficient and squared norm int p_n^2 w  (route B)
#   weights_A(n, x) handbook closed form
#   moment(k)   exact int x^k w(x) dx
#   support     (lo, hi) ; exps (a, b) for Jacobi-type weights
# ---------------------------------------------------------------------------

G = mpmath.gamma


def _zp():
    # mpmath's hypergeometric summation raises its precision until the result
    # is known to full relative accuracy; at an exact zero (e.g. the middle
    # node x = 0 of an odd symmetric polynomial) that never terminates.
    # zeroprec makes it return 0 once the cancellation exceeds this many bits,
    # far below anything that matters at 90 digits.
    return {"zeroprec": 4 * mp.prec}


def poly_jacobi(n, a, b, x):
    return mpmath.jacobi(n, a, b, x, **_zp())


def poly_gegenbauer(n, a, x):
    return mpmath.gegenbauer(n, a, x, **_zp())


def poly_laguerre(n, a, x):
    return mpmath.laguerre(n, a, x, **_zp())


def poly_hermite(n, x):
    return mpmath.hermite(n, x, **_zp())


def poly_legendre(n, x):
    return mpmath.legendre(n, x, **_zp())


def poly_chebyt(n, x):
    return mpmath.chebyt(n, x, **_zp())


def poly_chebyu(n, x):
    return mpmath.chebyu(n, x, **_zp())


def jacobi_moment(a, b, k):
    """int_{-1}^{1} (1-x)^a (1+x)^b x^k dx.

    Substituting x = 2t-1 (from memory): 2^(a+b+1) int_0^1 (1-t)^a t^b (2t-1)^k dt
    = 2^(a+b+1) sum_j C(k,j) 2^j (-1)^(k-j) B(b+j+1, a+1)   ([AS] 6.2.1 for B).
    The alternating sum cancels about k*log10(2) digits, so it is evaluated
    with that many extra digits.
    """
    with mp.workdps(WORK_DPS + int(0.31 * k) + 40):
        a1 = mpf(a)
        b1 = mpf(b)
        s = mpf(0)
        for j in range(k + 1):
            s += mpmath.binomial(k, j) * mpf(2) ** j * (-1) ** (k - j) * mpmath.beta(b1 + j + 1, a1 + 1)
        r = mpf(2) ** (a1 + b1 + 1) * s
    return +r


def symmetric_moment(a, k):
    """int_{-1}^{1} (1-x^2)^a x^k dx = B((k+1)/2, a+1) for even k, 0 for odd k
    (from memory; substitution u = x^2 and [AS] 6.2.1)."""
    if k % 2:
        return mpf(0)
    return mpmath.beta(mpf(k + 1) / 2, a + 1)


class JacobiType:
    """Base for weights (1-x)^a (1+x)^b on [-1, 1]."""
    support = (mpf(-1), mpf(1))
    lo_open = False

    def weight_fn(self, x):
        return (1 - x) ** self.a * (1 + x) ** self.b

    def moment(self, k):
        return jacobi_moment(self.a, self.b, k)

    def mass(self):
        # 2^(a+b+1) Gamma(a+1) Gamma(b+1) / Gamma(a+b+2)   (from memory)
        a, b = self.a, self.b
        return mpf(2) ** (a + b + 1) * G(a + 1) * G(b + 1) / G(a + b + 2)


class Jacobi(JacobiType):
    family = "jacobi"

    def __init__(self, a, b):
        self.sa, self.sb = a, b
        self.a, self.b = exact(a), exact(b)

    def params(self):
        return {"alpha": self.sa, "beta": self.sb}

    def p(self, n, x):
        return poly_jacobi(n, self.a, self.b, x)

    def dp(self, n, x):
        # d/dx P_n^(a,b) = (n+a+b+1)/2 P_{n-1}^(a+1,b+1)   [DLMF 18.9.15], from memory
        if n == 0:
            return mpf(0)
        return (n + self.a + self.b + 1) / 2 * poly_jacobi(n - 1, self.a + 1, self.b + 1, x)

    def kn(self, n):
        # leading coefficient Gamma(2n+a+b+1) / (2^n n! Gamma(n+a+b+1))  [AS] 22.3.1, from memory
        a, b = self.a, self.b
        return G(2 * n + a + b + 1) / (mpf(2) ** n * mpmath.factorial(n) * G(n + a + b + 1))

    def hn(self, n):
        # 2^(a+b+1)/(2n+a+b+1) Gamma(n+a+1)Gamma(n+b+1)/(n! Gamma(n+a+b+1))  [AS] 22.2.1, from memory
        a, b = self.a, self.b
        return (mpf(2) ** (a + b + 1) / (2 * n + a + b + 1) * G(n + a + 1) * G(n + b + 1)
                / (mpmath.factorial(n) * G(n + a + b + 1)))

    def weights_A(self, n, x):
        # Derivative form of [AS] 25.4.33 (cf. [Szego] (15.3.5)), from memory:
        # w_i = Gamma(n+a+1)Gamma(n+b+1) / (Gamma(n+a+b+1) n!)
        #       * 2^(a+b+1) / ((1-x_i^2) [P_n'(x_i)]^2)
        a, b = self.a, self.b
        c = G(n + a + 1) * G(n + b + 1) / (G(n + a + b + 1) * mpmath.factorial(n)) * mpf(2) ** (a + b + 1)
        return c / ((1 - x * x) * self.dp(n, x) ** 2)


class Legendre(JacobiType):
    family = "legendre"
    a = mpf(0)
    b = mpf(0)

    def params(self):
        return {}

    def p(self, n, x):
        return poly_legendre(n, x)

    def dp(self, n, x):
        # P_n' = n (P_{n-1} - x P_n) / (1 - x^2)   [AS] 22.8.5, from memory
        if n == 0:
            return mpf(0)
        return n * (poly_legendre(n - 1, x) - x * poly_legendre(n, x)) / (1 - x * x)

    def kn(self, n):
        # (2n)! / (2^n (n!)^2)   [AS] 22.3.8, from memory
        return mpmath.factorial(2 * n) / (mpf(2) ** n * mpmath.factorial(n) ** 2)

    def hn(self, n):
        # 2/(2n+1)   [AS] 22.2.10, from memory
        return mpf(2) / (2 * n + 1)

    def weights_A(self, n, x):
        # [AS] 25.4.29, from memory: w_i = 2 / ((1 - x_i^2) [P_n'(x_i)]^2)
        return 2 / ((1 - x * x) * self.dp(n, x) ** 2)


class Gegenbauer(JacobiType):
    family = "gegenbauer"

    def __init__(self, lam):
        self.slam = lam
        self.lam = exact(lam)
        self.a = self.b = self.lam - mpf(1) / 2

    def params(self):
        return {"alpha": self.slam}

    def moment(self, k):
        return jacobi_moment(self.a, self.b, k)

    def p(self, n, x):
        return poly_gegenbauer(n, self.lam, x)

    def dp(self, n, x):
        # d/dx C_n^(l) = 2 l C_{n-1}^(l+1)   [DLMF 18.9.19], from memory
        if n == 0:
            return mpf(0)
        return 2 * self.lam * poly_gegenbauer(n - 1, self.lam + 1, x)

    def kn(self, n):
        # 2^n Gamma(n+l) / (n! Gamma(l))   [AS] 22.3.4, from memory
        l = self.lam
        return mpf(2) ** n * G(n + l) / (mpmath.factorial(n) * G(l))

    def hn(self, n):
        # pi 2^(1-2l) Gamma(n+2l) / (n! (n+l) Gamma(l)^2)   [AS] 22.2.3, from memory
        l = self.lam
        return mpmath.pi * mpf(2) ** (1 - 2 * l) * G(n + 2 * l) / (mpmath.factorial(n) * (n + l) * G(l) ** 2)

    def weights_A(self, n, x):
        # Obtained from the Christoffel formula [Szego] (3.4.7) together with
        # (1-x^2) C_n' = -n x C_n + (n+2l-1) C_{n-1}  ([AS] 22.8.2), both from memory:
        # w_i = pi 2^(2-2l) Gamma(n+2l) / (n! Gamma(l)^2 (1-x_i^2) [C_n'(x_i)]^2)
        l = self.lam
        c = mpmath.pi * mpf(2) ** (2 - 2 * l) * G(n + 2 * l) / (mpmath.factorial(n) * G(l) ** 2)
        return c / ((1 - x * x) * self.dp(n, x) ** 2)


class Chebyshev1(JacobiType):
    family = "chebyshev1"
    a = b = mpf(-1) / 2

    def params(self):
        return {}

    def p(self, n, x):
        return poly_chebyt(n, x)

    def dp(self, n, x):
        # T_n' = n U_{n-1}   [AS] 22.8.x / [DLMF] 18.9.21, from memory
        if n == 0:
            return mpf(0)
        return n * poly_chebyu(n - 1, x)

    def kn(self, n):
        # T_0 = 1, else 2^(n-1)   [AS] 22.3.6, from memory
        return mpf(1) if n == 0 else mpf(2) ** (n - 1)

    def hn(self, n):
        # pi for n = 0, pi/2 otherwise   [AS] 22.2.4, from memory
        return mpmath.pi if n == 0 else mpmath.pi / 2

    def weights_A(self, n, x):
        # [AS] 25.4.38, from memory: w_i = pi / n
        return mpmath.pi / n

    def trig_nodes(self, n):
        # zeros of T_n: cos((2i-1) pi / (2n)), i = 1..n   [AS] 22.16.4, from memory
        return sorted(mpmath.cos((2 * i - 1) * mpmath.pi / (2 * n)) for i in range(1, n + 1))


class Chebyshev2(JacobiType):
    family = "chebyshev2"
    a = b = mpf(1) / 2

    def params(self):
        return {}

    def p(self, n, x):
        return poly_chebyu(n, x)

    def dp(self, n, x):
        # (1-x^2) U_n' = -n x U_n + (n+1) U_{n-1}   ([AS] 22.8.x, from memory;
        # follows from U_n(cos t) = sin((n+1)t)/sin t)
        if n == 0:
            return mpf(0)
        return (-n * x * poly_chebyu(n, x) + (n + 1) * poly_chebyu(n - 1, x)) / (1 - x * x)

    def kn(self, n):
        # 2^n   [AS] 22.3.7, from memory
        return mpf(2) ** n

    def hn(self, n):
        # pi/2   [AS] 22.2.5, from memory
        return mpmath.pi / 2

    def weights_A(self, n, x):
        # [AS] 25.4.40, from memory: w_i = pi/(n+1) sin^2(i pi/(n+1)) = pi (1 - x_i^2)/(n+1)
        return mpmath.pi * (1 - x * x) / (n + 1)

    def trig_nodes(self, n):
        # zeros of U_n: cos(i pi/(n+1)), i = 1..n   [AS] 22.16.5, from memory
        return sorted(mpmath.cos(i * mpmath.pi / (n + 1)) for i in range(1, n + 1))


class Chebyshev34(Jacobi):
    """chebyshev3: (1-x)^(-1/2)(1+x)^(1/2); chebyshev4: (1-x)^(1/2)(1+x)^(-1/2).
    Nodes are zeros of poly_jacobi(n, -1/2, 1/2, x) resp. (n, 1/2, -1/2, x)."""

    def __init__(self, kind):
        self.kind = kind
        self.family = "chebyshev%d" % kind
        if kind == 3:
            Jacobi.__init__(self, "-0.5", "0.5")
        else:
            Jacobi.__init__(self, "0.5", "-0.5")

    def params(self):
        return {}

    def trig_nodes(self, n):
        # From memory: V_n(cos t) = cos((n+1/2)t)/cos(t/2) has zeros t = (i-1/2) pi/(n+1/2);
        # W_n(cos t) = sin((n+1/2)t)/sin(t/2) has zeros t = i pi/(n+1/2), i = 1..n.
        if self.kind == 3:
            ts = [(i - mpf(1) / 2) * mpmath.pi / (n + mpf(1) / 2) for i in range(1, n + 1)]
        else:
            ts = [i * mpmath.pi / (n + mpf(1) / 2) for i in range(1, n + 1)]
        return sorted(mpmath.cos(t) for t in ts)


class Laguerre:
    family = "laguerre"
    lo_open = False

    def __init__(self, a):
        self.sa = a
        self.a = exact(a)
        self.b = None
        self.support = (mpf(0), mpmath.inf)

    def params(self):
        return {"alpha": self.sa}

    def weight_fn(self, x):
        return x ** self.a * mpmath.exp(-x)

    def p(self, n, x):
        return poly_laguerre(n, self.a, x)

    def dp(self, n, x):
        # d/dx L_n^(a) = -L_{n-1}^(a+1)   [AS] 22.8.x / [DLMF] 18.9.23, from memory
        if n == 0:
            return mpf(0)
        return -poly_laguerre(n - 1, self.a + 1, x)

    def kn(self, n):
        # (-1)^n / n!   [AS] 22.3.9, from memory
        return mpf(-1) ** n / mpmath.factorial(n)

    def hn(self, n):
        # Gamma(n+a+1)/n!   [AS] 22.2.12, from memory
        return G(n + self.a + 1) / mpmath.factorial(n)

    def weights_A(self, n, x):
        # [AS] 25.4.45 (generalised to x^a e^-x), from memory:
        # w_i = Gamma(n+a+1) x_i / (n! (n+1)^2 [L_{n+1}^(a)(x_i)]^2)
        return G(n + self.a + 1) * x / (mpmath.factorial(n) * (n + 1) ** 2 * poly_laguerre(n + 1, self.a, x) ** 2)

    def weights_A2(self, n, x):
        # derivative form, from memory: w_i = Gamma(n+a+1) / (n! x_i [L_n^(a)'(x_i)]^2)
        return G(n + self.a + 1) / (mpmath.factorial(n) * x * self.dp(n, x) ** 2)

    def moment(self, k):
        # Gamma(k+a+1)   [AS] 6.1.1
        return G(k + self.a + 1)

    def mass(self):
        return G(self.a + 1)


class Hermite:
    family = "hermite"

    def __init__(self):
        self.a = self.b = None
        self.support = (-mpmath.inf, mpmath.inf)

    def params(self):
        return {}

    def weight_fn(self, x):
        return mpmath.exp(-x * x)

    def p(self, n, x):
        return poly_hermite(n, x)

    def dp(self, n, x):
        # H_n' = 2n H_{n-1}   [AS] 22.8.8, from memory
        if n == 0:
            return mpf(0)
        return 2 * n * poly_hermite(n - 1, x)

    def kn(self, n):
        # 2^n   [AS] 22.3.10, from memory
        return mpf(2) ** n

    def hn(self, n):
        # sqrt(pi) 2^n n!   [AS] 22.2.14, from memory
        return mpmath.sqrt(mpmath.pi) * mpf(2) ** n * mpmath.factorial(n)

    def weights_A(self, n, x):
        # [AS] 25.4.46, from memory: w_i = 2^(n-1) n! sqrt(pi) / (n^2 [H_{n-1}(x_i)]^2)
        return (mpf(2) ** (n - 1) * mpmath.factorial(n) * mpmath.sqrt(mpmath.pi)
                / (n * n * poly_hermite(n - 1, x) ** 2))

    def moment(self, k):
        # int x^k e^{-x^2} = Gamma((k+1)/2) for even k, 0 for odd k  ([AS] 6.1.1 after u = x^2)
        if k % 2:
            return mpf(0)
        return G(mpf(k + 1) / 2)

    def mass(self):
        return mpmath.sqrt(mpmath.pi)


# ---------------------------------------------------------------------------
# Cases
# ---------------------------------------------------------------------------

def cases():
    out = []
    # 26 and 45 also settle disagreements with gonum's float64 rules (see
    # design/gonum_test.go).
    for n in (1, 2, 3, 4, 5, 8, 10, 16, 20, 26, 32, 40, 45, 64, 100):
        out.append((Legendre(), n))
    J1 = Jacobi("-0.7", "2.3")
    for n in (1, 2, 3, 5, 10, 20, 40):
        out.append((J1, n))
    J2 = Jacobi("0.5", "-0.3")
    for n in (7, 25):
        out.append((J2, n))
    out.append((Jacobi("3", "4.5"), 12))
    g = Gegenbauer("0.75")
    out += [(g, 5), (g, 20)]
    g = Gegenbauer("2.5")
    out += [(g, 9), (g, 30)]
    out.append((Gegenbauer("-0.25"), 6))
    for fam in (Chebyshev1(), Chebyshev2(), Chebyshev34(3), Chebyshev34(4)):
        out += [(fam, 7), (fam, 16)]
    L = Laguerre("-0.5")
    for n in (1, 5, 10, 20, 40):
        out.append((L, n))
    L = Laguerre("1.5")
    for n in (3, 10, 40):
        out.append((L, n))
    out.append((Laguerre("0"), 15))
    for n in (1, 2, 3, 5, 10, 20, 21, 27, 40, 64, 100, 200):
        out.append((Hermite(), n))
    return out


def symmetric(fam):
    return fam.family in ("legendre", "gegenbauer", "chebyshev1", "chebyshev2", "hermite")


def float_param(fam, name):
    v = getattr(fam, name, None)
    return None if v is None else float(v)


# ---------------------------------------------------------------------------
# Global maxima of every check (printed at the end)
# ---------------------------------------------------------------------------
STATS = {}


def stat(name, value):
    value = mpf(value)
    if name not in STATS or value > STATS[name][0]:
        STATS[name] = (value, CURRENT[0])


CURRENT = [""]


def check(cond, msg):
    if not cond:
        raise AssertionError("%s: %s" % (CURRENT[0], msg))


def find_nodes(fam, n):
    a = float_param(fam, "a")
    b = float_param(fam, "b")
    guesses = guesses_f64(fam.family, n, a, b)
    f = lambda x: fam.p(n, x)
    df = lambda x: fam.dp(n, x)
    nodes = []
    for g in guesses:
        x = mpmath.findroot(f, mpf(g), solver="newton", df=df, tol=mpf(10) ** -(WORK_DPS - 3), verify=False)
        x = mpf(x)
        # Newton correction of the final iterate, relative to max(1,|x|)
        corr = abs(f(x) / df(x)) / max(1, abs(x))
        stat("root: |p/p'| / max(1,|x|)", corr)
        check(corr < mpf(10) ** -85, "root not converged (%s)" % mpmath.nstr(corr, 5))
        # polished root stays near its float64 guess (no jump to a neighbour)
        stat("root: |x - float64 guess| / max(1,|x|)", abs(x - g) / max(1, abs(x)))
        nodes.append(x)
    check(len(nodes) == n, "node count")
    nodes.sort()
    lo, hi = fam.support
    check(all(lo < x < hi for x in nodes), "node outside support")
    for i in range(n - 1):
        check(nodes[i + 1] - nodes[i] > mpf(10) ** -10 * max(1, abs(nodes[i])), "nodes not distinct")
    # sign change at a small offset on both sides of each root
    for x in nodes:
        d = mpf(10) ** -40 * max(1, abs(x))
        check(mpmath.sign(f(x - d)) * mpmath.sign(f(x + d)) < 0, "no sign change at root")
    # alternating signs at midpoints -> exactly one zero in each gap
    mids = [(nodes[i] + nodes[i + 1]) / 2 for i in range(n - 1)]
    sg = [mpmath.sign(f(m)) for m in mids]
    for i in range(len(sg) - 1):
        check(sg[i] * sg[i + 1] < 0, "signs at midpoints do not alternate")
    # cross-check against trigonometric closed forms where they exist
    if hasattr(fam, "trig_nodes"):
        tn = fam.trig_nodes(n)
        stat("nodes vs trig closed form (abs)", max(abs(u - v) for u, v in zip(nodes, tn)))
        check(max(abs(u - v) for u, v in zip(nodes, tn)) < CHECK_TOL, "trig node mismatch")
    return nodes


def weights_B(fam, n, x):
    """General Christoffel formula [Szego] (3.4.7), from memory:
    lambda_i = (k_n / k_{n-1}) h_{n-1} / (p_n'(x_i) p_{n-1}(x_i)),
    with p_n' by mpmath.diff (numerical, independent of dp)."""
    dpn = mpmath.diff(lambda t: fam.p(n, t), x)
    return fam.kn(n) / fam.kn(n - 1) * fam.hn(n - 1) / (dpn * fam.p(n - 1, x))


def fmt(v):
    """Exactly OUT_DIGITS significant digits, correctly rounded (mpmath to_str)."""
    if v == 0:
        return "0.0"
    s = mpmath.nstr(v, OUT_DIGITS, strip_zeros=False)
    mant = re.split("[eE]", s)[0].lstrip("-").replace(".", "").lstrip("0")
    check(len(mant) == OUT_DIGITS, "formatting gave %d digits: %s" % (len(mant), s))
    # rounding robustness: a perturbation far below the accuracy of v must not
    # change the printed string (v is accurate to ~85 digits).
    for eps in (mpf(10) ** -80, -mpf(10) ** -80):
        check(mpmath.nstr(v * (1 + eps), OUT_DIGITS, strip_zeros=False) == s, "rounding is ambiguous: " + s)
    return s


def run_case(fam, n):
    nodes = find_nodes(fam, n)
    if symmetric(fam):
        asym = max(abs(nodes[i] + nodes[n - 1 - i]) for i in range(n))
        stat("symmetry |x_i + x_{n+1-i}|", asym)
        check(asym < CHECK_TOL, "nodes not symmetric")
        if n % 2 == 1:
            # the middle node of a symmetric rule is exactly 0
            nodes[n // 2] = mpf(0)
    wA = [fam.weights_A(n, x) for x in nodes]
    wB = [weights_B(fam, n, x) for x in nodes]
    dAB = max(abs(u - v) / abs(u) for u, v in zip(wA, wB))
    stat("weights route A vs route B (rel)", dAB)
    check(dAB < CHECK_TOL, "weight routes disagree")
    if hasattr(fam, "weights_A2"):
        dA2 = max(abs(u - fam.weights_A2(n, x)) / abs(u) for u, x in zip(wA, nodes))
        stat("laguerre weights: L_{n+1} form vs derivative form (rel)", dA2)
        check(dA2 < CHECK_TOL, "laguerre weight forms disagree")
    check(all(w > 0 for w in wA), "non-positive weight")
    # total mass
    mass = fam.mass()
    dm = abs(mpmath.fsum(wA) - mass) / mass
    stat("sum of weights vs total mass (rel)", dm)
    check(dm < CHECK_TOL, "mass mismatch")
    # moments k = 0..2N-1
    worst = mpf(0)
    worst_rel = mpf(0)  # plain relative error for the non-zero moments
    for k in range(2 * n):
        q = mpmath.fsum(w * x ** k for w, x in zip(wA, nodes))
        # scale = sum w|x|^k (0 only for the one-node rule at x = 0 and odd k)
        scale = mpmath.fsum(w * abs(x) ** k for w, x in zip(wA, nodes))
        m = fam.moment(k)
        scale = max(scale, abs(m), mpf(10) ** -WORK_DPS)
        if fam.family in ("legendre", "gegenbauer", "chebyshev1", "chebyshev2"):
            m2 = symmetric_moment(fam.a, k)
            dd = abs(m - m2) / scale
            stat("moment formulas: binomial-Beta sum vs symmetric Beta", dd)
            check(dd < CHECK_TOL, "moment formulas disagree")
        worst = max(worst, abs(q - m) / scale)
        # (exactly-zero odd moments of symmetric weights come out of the Beta
        # sum as round-off residue, hence the threshold)
        if abs(m) > mpf(10) ** -20 * scale:
            worst_rel = max(worst_rel, abs(q - m) / abs(m))
    stat("moments k<=2N-1: |Q - exact| / sum w|x|^k", worst)
    check(worst < CHECK_TOL, "moment check failed (%s)" % mpmath.nstr(worst, 5))
    stat("moments k<=2N-1, m_k != 0: |Q - exact| / |exact|", worst_rel)
    check(worst_rel < CHECK_TOL, "relative moment check failed (%s)" % mpmath.nstr(worst_rel, 5))
    # one moment beyond exactness must NOT be reproduced (rule is not of higher degree);
    # for symmetric rules degree 2N is the first even one
    k = 2 * n
    q = mpmath.fsum(w * x ** k for w, x in zip(wA, nodes))
    scale = max(mpmath.fsum(w * abs(x) ** k for w, x in zip(wA, nodes)), abs(fam.moment(k)))
    check(abs(q - fam.moment(k)) / scale > mpf(10) ** -60, "rule integrates degree 2N exactly?")
    return nodes, wA


def _quad_singular01(c, g):
    """int_0^1 u^c g(u) du for smooth g, via u = t^(1/(c+1)) (from memory):
    = 1/(c+1) int_0^1 g(t^(1/(c+1))) dt, which removes the endpoint
    singularity before tanh-sinh (mpmath.quad's default) is applied."""
    q = 1 / (c + 1)
    return q * mpmath.quad(lambda t: g(t ** q), [0, 1])


def quad_moment(fam, k):
    if fam.family == "hermite":
        return mpmath.quad(lambda x: x ** k * mpmath.exp(-x * x), [-mpmath.inf, 0, mpmath.inf])
    if fam.family == "laguerre":
        a = fam.a
        return (_quad_singular01(a, lambda x: x ** k * mpmath.exp(-x))
                + mpmath.quad(lambda x: x ** (a + k) * mpmath.exp(-x), [1, mpmath.inf]))
    # [-1,1]: split at 0; u = 1-x on [0,1] and v = 1+x on [-1,0]
    a, b = fam.a, fam.b
    return (_quad_singular01(a, lambda u: (2 - u) ** b * (1 - u) ** k)
            + _quad_singular01(b, lambda v: (2 - v) ** a * (v - 1) ** k))


def quad_moment_checks():
    """Re-derive a few moments of every weight function by tanh-sinh quadrature
    (mpmath.quad), independent of the Beta/Gamma closed forms."""
    fams = [Legendre(), Jacobi("-0.7", "2.3"), Jacobi("0.5", "-0.3"), Jacobi("3", "4.5"),
            Gegenbauer("0.75"), Gegenbauer("2.5"), Gegenbauer("-0.25"),
            Chebyshev1(), Chebyshev2(), Chebyshev34(3), Chebyshev34(4),
            Laguerre("-0.5"), Laguerre("1.5"), Laguerre("0"), Hermite()]
    for fam in fams:
        CURRENT[0] = "quad check %s %s" % (fam.family, fam.params())
        for k in (0, 1, 2, 5, 8, 13):
            v = quad_moment(fam, k)
            m = fam.moment(k)
            err = abs(v - m) / max(abs(m), abs(fam.mass()))
            stat("moment closed form vs mpmath.quad tanh-sinh (rel)", err)
            check(err < CHECK_TOL, "closed-form moment k=%d disagrees with mpmath.quad" % k)
        print("ok  %s" % CURRENT[0], flush=True)


def main():
    t0 = time.time()
    here = os.path.dirname(os.path.abspath(__file__))
    today = datetime.date.today().isoformat()
    out_cases = []
    for fam, n in cases():
        CURRENT[0] = "%s %s n=%d" % (fam.family, fam.params(), n)
        t1 = time.time()
        nodes, weights = run_case(fam, n)
        entry = {"family": fam.family}
        entry.update(fam.params())
        entry["n"] = n
        entry["nodes"] = [fmt(x) for x in nodes]
        entry["weights"] = [fmt(w) for w in weights]
        if symmetric(fam):
            for i in range(n):
                u, v = entry["nodes"][i], entry["nodes"][n - 1 - i]
                check(u == v == "0.0" or u == "-" + v or v == "-" + u, "printed nodes not symmetric")
                check(entry["weights"][i] == entry["weights"][n - 1 - i], "printed weights not symmetric")
        out_cases.append(entry)
        print("ok  %-40s %6.1fs" % (CURRENT[0], time.time() - t1), flush=True)
    quad_moment_checks()
    doc = {
        "provenance": ("generated by testdata/reference/gen_gauss.py with Debian python3-mpmath %s "
                       "at %d working digits on %s; nodes are zeros of mpmath's special-function "
                       "polynomials, weights from closed forms (see README.md)")
                      % (mpmath.__version__, WORK_DPS, today),
        "digits": OUT_DIGITS,
        "cases": out_cases,
    }
    path = os.path.join(here, "gauss.json")
    with open(path, "w") as fh:
        json.dump(doc, fh, indent=1)
        fh.write("\n")
    print()
    print("self-check maxima over all cases (tolerance %s):" % mpmath.nstr(CHECK_TOL, 3))
    for name, (v, where) in STATS.items():
        print("  %-58s %-10s  (%s)" % (name, mpmath.nstr(v, 3), where))
    print("wrote %s: %d cases, %d bytes, %.1fs" % (path, len(out_cases), os.path.getsize(path), time.time() - t0))


if __name__ == "__main__":
    main()
