#!/usr/bin/python3
"""Reference rules for quadwright's design/variants tests, by routes that
share nothing with quadwright's algorithms.

Run with Debian's python3-mpmath:  /usr/bin/python3 gen_variants.py > variants.json

Routes (no quadrature-rule generator is used anywhere):
  * Lobatto-Legendre: interior nodes are the zeros of P'_{N-1}, found by
    mpmath.polyroots on the exact rational coefficients of P_{N-1}' (built by
    Bonnet's recurrence in Fractions); weights 2/(N(N-1) P_{N-1}(x)^2), end
    weights 2/(N(N-1)) (Abramowitz and Stegun 25.4.32).
  * Radau-Legendre (node -1): other nodes the zeros of
    (P_{N-1}(x) + P_N(x))/(1+x); weights 2/N^2 at -1 and
    (1-x)/(N^2 P_{N-1}(x)^2) elsewhere (Abramowitz and Stegun 25.4.31).
  * Gauss-Kronrod: from the raw moments of the weight (exact Fractions where
    they are rational): pi_N from the Hankel system, the Stieltjes polynomial
    E_{N+1} from the conditions int E pi_N x^k w = 0, k <= N (exact), the
    nodes as polyroots of pi_N and E_{N+1}, the weights as the integrals of
    the Lagrange basis polynomials, expanded in monomials at 200 digits and
    integrated with the moments.
  * Hermite Kronrod existence: whether E_{N+1} has N+1 real zeros and all
    weights are positive, N = 1..6.
"""
from fractions import Fraction as F
import json, sys, datetime
import mpmath
from mpmath import mp, mpf

mp.dps = 200
OUT = 50


def s(x):
    return mpmath.nstr(x, OUT, strip_zeros=False, min_fixed=-5, max_fixed=5) if x != 0 else "0"


def legendre_coeffs(n):
    """Coefficients (ascending) of P_n, exact."""
    p0, p1 = [F(1)], [F(0), F(1)]
    if n == 0:
        return p0
    for k in range(1, n):
        # (k+1) P_{k+1} = (2k+1) x P_k - k P_{k-1}
        xp = [F(0)] + p1
        nxt = [F(0)] * (k + 2)
        for i, c in enumerate(xp):
            nxt[i] += F(2 * k + 1, k + 1) * c
        for i, c in enumerate(p0):
            nxt[i] -= F(k, k + 1) * c
        p0, p1 = p1, nxt
    return p1


def peval(c, x):
    r = mpf(0)
    for a in reversed(c):
        r = r * x + mpf(a.numerator) / a.denominator if isinstance(a, F) else r * x + a
    return r


def roots(c):
    """Real zeros (ascending) of the polynomial with ascending coefficients c."""
    hi = [mpf(a.numerator) / a.denominator if isinstance(a, F) else a for a in reversed(c)]
    rs = mpmath.polyroots(hi, maxsteps=2000, extraprec=2000)
    return rs


def real_sorted(rs):
    out = []
    for r in rs:
        if abs(mpmath.im(r)) > mpf(10) ** (-100):
            return None
        out.append(mpmath.re(r))
    return sorted(out)


def lobatto(n):
    p = legendre_coeffs(n - 1)
    d = [i * p[i] for i in range(1, len(p))]
    xs = [mpf(-1)] + (real_sorted(roots(d)) if len(d) > 1 else []) + [mpf(1)]
    ws = [mpf(2) / (n * (n - 1) * peval(p, x) ** 2) for x in xs]
    return xs, ws


def radau(n):
    a, b = legendre_coeffs(n - 1), legendre_coeffs(n)
    q = [F(0)] * (n + 1)
    for i, c in enumerate(a):
        q[i] += c
    for i, c in enumerate(b):
        q[i] += c
    # divide by (1 + x), long division from the top
    coeffs = q[:]
    quo = [F(0)] * n
    for i in range(n, 0, -1):
        quo[i - 1] = coeffs[i]
        coeffs[i - 1] -= coeffs[i]
        coeffs[i] = F(0)
    assert coeffs[0] == 0
    xs = [mpf(-1)] + (real_sorted(roots(quo)) if n > 1 else [])
    pm = legendre_coeffs(n - 1)
    ws = [mpf(2) / n ** 2] + [(1 - x) / (n ** 2 * peval(pm, x) ** 2) for x in xs[1:]]
    return xs, ws


def solve(A, b):
    """Exact (Fractions) or mpf Gaussian elimination."""
    n = len(b)
    A = [row[:] for row in A]
    b = b[:]
    for c in range(n):
        piv = max(range(c, n), key=lambda r: abs(A[r][c]))
        A[c], A[piv] = A[piv], A[c]
        b[c], b[piv] = b[piv], b[c]
        for r in range(c + 1, n):
            f = A[r][c] / A[c][c]
            for k in range(c, n):
                A[r][k] -= f * A[c][k]
            b[r] -= f * b[c]
    x = [0] * n
    for r in range(n - 1, -1, -1):
        t = b[r] - sum(A[r][k] * x[k] for k in range(r + 1, n))
        x[r] = t / A[r][r]
    return x


def kronrod(mom, n):
    """Gauss-Kronrod extension of the n-point Gauss rule for the raw moments
    mom(k); returns (nodes, weights) or None when E_{n+1} has complex zeros."""
    m = [mom(k) for k in range(4 * n + 4)]
    # pi_n monic: sum_j c_j m_{j+k} = -m_{n+k}, k < n
    c = solve([[m[j + k] for j in range(n)] for k in range(n)], [-m[n + k] for k in range(n)]) + [1]
    M = [sum(c[l] * m[i + l] for l in range(n + 1)) for i in range(2 * n + 3)]
    e = solve([[M[j + k] for j in range(n + 1)] for k in range(n + 1)], [-M[n + 1 + k] for k in range(n + 1)]) + [1]
    g = real_sorted(roots(c))
    k = real_sorted(roots(e))
    if g is None or k is None:
        return None
    xs = sorted(g + k)
    mm = [mpf(v.numerator) / v.denominator if isinstance(v, F) else mpf(v) for v in m]
    ws = []
    for i, xi in enumerate(xs):
        poly = [mpf(1)]
        den = mpf(1)
        for j, xj in enumerate(xs):
            if j == i:
                continue
            poly = [mpf(0)] + poly
            for t in range(len(poly) - 1):
                poly[t] -= xj * poly[t + 1]
            den *= xi - xj
        ws.append(sum(poly[t] * mm[t] for t in range(len(poly))) / den)
    return xs, ws


def legendre_mom(k):
    return F(2, k + 1) if k % 2 == 0 else F(0)


def neglog_mom(k):  # int_0^1 x^k (-log x) dx
    return F(1, (k + 1) ** 2)


def hermite_mom(k):  # int x^k e^{-x^2} dx / sqrt(pi)
    if k % 2:
        return F(0)
    r = F(1)
    for j in range(1, k // 2 + 1):
        r *= F(2 * j - 1, 2)
    return r


def jacobi_mom(a, b):
    a, b = mpf(a), mpf(b)
    def mom(k):
        t = mpf(0)
        for j in range(k + 1):
            t += mpmath.binomial(k, j) * mpf(2) ** j * (-1) ** (k - j) * mpmath.beta(j + b + 1, a + 1)
        return mpf(2) ** (a + b + 1) * t
    return mom


cases = []
for n in (3, 4, 5, 6, 8, 11):
    xs, ws = lobatto(n)
    cases.append({"kind": "lobatto", "measure": "legendre", "n": n, "nodes": [s(x) for x in xs], "weights": [s(w) for w in ws]})
for n in (2, 3, 4, 5, 7, 10):
    xs, ws = radau(n)
    cases.append({"kind": "radau", "measure": "legendre", "n": n, "nodes": [s(x) for x in xs], "weights": [s(w) for w in ws]})
for name, mom, ns in (("legendre", legendre_mom, (1, 2, 3, 7, 10)), ("jacobi(0.5,-0.3)", jacobi_mom("0.5", "-0.3"), (2, 3, 4)), ("-log(x) on [0,1]", neglog_mom, (2, 3, 5))):
    for n in ns:
        r = kronrod(mom, n)
        xs, ws = r
        cases.append({"kind": "kronrod", "measure": name, "n": n, "nodes": [s(x) for x in xs], "weights": [s(w) for w in ws]})
herm = []
for n in range(1, 7):
    r = kronrod(hermite_mom, n)
    if r is None:
        herm.append({"n": n, "real": False, "positive": False})
    else:
        herm.append({"n": n, "real": True, "positive": all(w > 0 for w in r[1])})

json.dump({
    "provenance": "gen_variants.py, Debian python3-mpmath %s, Python %s, %s UTC; command: /usr/bin/python3 gen_variants.py > variants.json" % (mpmath.__version__, sys.version.split()[0], datetime.datetime.utcnow().strftime("%Y-%m-%d %H:%M")),
    "digits": OUT, "cases": cases, "hermite_kronrod": herm,
}, sys.stdout, indent=1)
sys.stdout.write("\n")
