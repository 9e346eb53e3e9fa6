#!/usr/bin/python3
"""Reference data for the stability package (testdata/audit/reference.json).

Independent routes only, no quadrature-rule generator:
  * Genz's six one-dimensional test integrals on [0, 1] by direct
    high-precision integration (mpmath.quad, tanh-sinh, split at the kink or
    jump t = w and at the peak), at 40 digits;
  * 1-norm condition numbers of Hankel moment matrices H_ij = m_{i+j},
    from the exact moments (Legendre on [-1, 1]: m_k = 2/(k+1) for even k,
    0 for odd k; Laguerre e^-x on [0, inf): m_k = k!) inverted in exact
    rational arithmetic (mpmath matrices at 300 digits).

Run with Debian's interpreter: /usr/bin/python3 testdata/audit/gen_audit.py
"""
import datetime
import json
import math
from fractions import Fraction

import mpmath

mpmath.mp.dps = 60

GENZ = [  # name, c, w (as in stability.GenzSet)
    ("oscillatory", 4, "0.371"),
    ("product peak", 4, "0.371"),
    ("corner peak", 4, "0.371"),
    ("gaussian", 4, "0.371"),
    ("continuous", 4, "0.371"),
    ("discontinuous", 4, "0.371"),
]


def genz_f(name, c, w):
    c = mpmath.mpf(c)
    w = mpmath.mpf(w)
    if name == "oscillatory":
        return lambda t: mpmath.cos(2 * mpmath.pi * w + c * t)
    if name == "product peak":
        return lambda t: 1 / (c ** -2 + (t - w) ** 2)
    if name == "corner peak":
        return lambda t: (1 + c * t) ** -2
    if name == "gaussian":
        return lambda t: mpmath.exp(-c * c * (t - w) ** 2)
    if name == "continuous":
        return lambda t: mpmath.exp(-c * abs(t - w))
    if name == "discontinuous":
        return lambda t: mpmath.exp(c * t) if t <= w else mpmath.mpf(0)
    raise ValueError(name)


def hankel_cond1(moments, n):
    mpmath.mp.dps = 300
    H = mpmath.matrix(n, n)
    for i in range(n):
        for j in range(n):
            H[i, j] = mpmath.mpf(moments[i + j].numerator) / moments[i + j].denominator
    Hi = mpmath.inverse(H)
    norm = lambda A: max(sum(abs(A[i, j]) for i in range(n)) for j in range(n))
    r = norm(H) * norm(Hi)
    mpmath.mp.dps = 60
    return r


def main():
    out = {
        "provenance": "generated %s by testdata/audit/gen_audit.py with /usr/bin/python3 %s, mpmath %s"
        % (datetime.date.today().isoformat(), ".".join(map(str, __import__("sys").version_info[:3])), mpmath.__version__),
        "genz": [],
        "hankel": [],
    }
    for name, c, w in GENZ:
        f = genz_f(name, c, w)
        I = mpmath.quad(f, [0, mpmath.mpf(w), 1])
        out["genz"].append({"name": name, "c": c, "w": float(w), "integral": mpmath.nstr(I, 40)})
    leg = [Fraction(2, k + 1) if k % 2 == 0 else Fraction(0) for k in range(64)]
    lag = [Fraction(math.factorial(k)) for k in range(64)]
    for fam, mom, orders in (("legendre", leg, range(1, 16)), ("laguerre", lag, range(1, 11))):
        for n in orders:
            r = hankel_cond1(mom, n)
            out["hankel"].append({"family": fam, "order": n, "log10_cond1": mpmath.nstr(mpmath.log10(r), 20)})
    with open(__file__.rsplit("/", 1)[0] + "/reference.json", "w") as fh:
        json.dump(out, fh, indent=1)
        fh.write("\n")


if __name__ == "__main__":
    main()
