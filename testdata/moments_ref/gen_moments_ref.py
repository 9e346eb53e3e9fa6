#!/usr/bin/python3
"""Generate testdata/moments_ref/rules.json: reference Gauss rules (40 digits)
and recurrence coefficients for non-classical weights.

Run (from the repository root):

    /usr/bin/python3 testdata/moments_ref/gen_moments_ref.py

Uses Debian python3-mpmath only.  Route, for every weight (independent of
quadwright and of any Gauss-rule generator):

  moments   raw moments m_k = integral of x^k w(x), k = 0..2*NMAX*2-1, from
            closed forms (integral tables, quoted from memory, see MOMENTS),
            each of the first few cross-checked against mpmath.quad
            (tanh-sinh) at 40 digits;
  pairs     the plain Chebyshev algorithm on the raw moments in mpmath
            arithmetic at DPS decimal digits, rerun at DPS2 digits; the two
            must agree to 60 digits (the moment map loses many digits, so
            the working precision is far above the 40 printed);
  rule      nodes = eigenvalues of the symmetric Jacobi matrix
            (mpmath.eigsy at 80 digits), each polished by Newton on the
            three-term recurrence; weights = beta_0 * (first component of
            the normalised eigenvector)^2 and, independently, the
            Christoffel numbers from the recurrence; the two weight formulas
            must agree to 60 digits;
  checks    every rule integrates the raw moments 0..2N-1 to 50 digits
            (relative to sum |w_i x_i^k|).

Output: {"provenance": ..., "weights": [{"name", "weight", "interval",
"alpha": [...], "beta": [...], "rules": {"N": {"nodes", "weights"}}}]}
with every number a decimal string of 40 significant digits.
"""

import datetime
import json
import os
import sys

import mpmath
from mpmath import mp, mpf

NMAX = 40          # largest rule
NPAIRS = 2 * NMAX  # recurrence pairs written (enough to verify N = 40)
DPS = 700
DPS2 = 900
DIGITS = 40
RULES = [1, 2, 3, 5, 10, 15, 20, 25, 30, 35, 40]

# Raw moments m_k, k >= 0, as functions of k at the current precision.
#   -log(x) on [0,1]:           1/(k+1)^2                      [G&R 4.272]
#   exp(-x^2) on [0,inf):       Gamma((k+1)/2)/2               [G&R 3.326]
#   x/(exp(x)-1) on [0,inf):    Gamma(k+2) zeta(k+2)           [G&R 3.411.1]
#   1/cosh(x) on (-inf,inf):    0 for odd k,
#                               4 k! beta(k+1) for even k, beta the Dirichlet
#                               beta function, since integral_0^inf x^k/cosh x
#                               = 2 k! beta(k+1) [G&R 3.523, from memory]
#   sqrt(x)*exp(-x)*(1+x) on [0,inf): Gamma(k+3/2) + Gamma(k+5/2)
MOMENTS = {
    "log": lambda k: 1 / mpf(k + 1) ** 2,
    "halfhermite": lambda k: mpmath.gamma(mpf(k + 1) / 2) / 2,
    "bose": lambda k: mpmath.gamma(k + 2) * mpmath.zeta(k + 2),
    "sech": lambda k: mpf(0) if k % 2 else 4 * mpmath.factorial(k) * dirichlet_beta(k + 1),
    "laguerremix": lambda k: mpmath.gamma(k + mpf(3) / 2) + mpmath.gamma(k + mpf(5) / 2),
}

WEIGHTS = [
    ("log", "-log(x)", ["0", "1"], lambda x: -mpmath.log(x), [0, 1]),
    ("halfhermite", "exp(-x^2)", ["0", "inf"], lambda x: mpmath.exp(-x * x), [0, mpmath.inf]),
    ("bose", "x/(exp(x)-1)", ["0", "inf"], lambda x: x / mpmath.expm1(x), [0, mpmath.inf]),
    ("sech", "1/cosh(x)", ["-inf", "inf"], lambda x: mpmath.sech(x), [-mpmath.inf, 0, mpmath.inf]),
    ("laguerremix", "sqrt(x)*exp(-x)*(1+x)", ["0", "inf"], lambda x: mpmath.sqrt(x) * mpmath.exp(-x) * (1 + x), [0, mpmath.inf]),
]


def dirichlet_beta(s):
    # beta(s) = sum_{n>=0} (-1)^n (2n+1)^-s = 4^-s (zeta(s,1/4) - zeta(s,3/4)),
    # beta(1) = pi/4 (Leibniz).
    if s == 1:
        return mpmath.pi / 4
    return (mpmath.zeta(s, mpf(1) / 4) - mpmath.zeta(s, mpf(3) / 4)) / mpf(4) ** s


def chebyshev(mom, n):
    """Plain Chebyshev algorithm (Gautschi 2004, Algorithm 2.1 with a = b = 0)."""
    L = 2 * n
    sig_prev = [mpf(0)] * (L + 1)
    sig = list(mom[:L]) + [mpf(0)]
    alpha = [sig[1] / sig[0]]
    beta = [sig[0]]
    for k in range(1, n):
        new = [mpf(0)] * (L + 1)
        for l in range(k, L - k):
            new[l] = sig[l + 1] - alpha[k - 1] * sig[l] - beta[k - 1] * sig_prev[l]
        if new[k] <= 0:
            raise ValueError("beta_%d <= 0" % k)
        alpha.append(new[k + 1] / new[k] - sig[k] / sig[k - 1])
        beta.append(new[k] / sig[k - 1])
        sig_prev, sig = sig, new
    return alpha, beta


def pairs(key, n, dps):
    with mpmath.workdps(dps):
        mom = [MOMENTS[key](k) for k in range(2 * n)]
        a, b = chebyshev(mom, n)
        return [+x for x in a], [+x for x in b]


def rule(alpha, beta, n):
    with mpmath.workdps(80):
        J = mpmath.zeros(n, n)
        for i in range(n):
            J[i, i] = alpha[i]
            if i + 1 < n:
                J[i, i + 1] = J[i + 1, i] = mpmath.sqrt(beta[i + 1])
        E, Q = mpmath.eigsy(J)
        order = sorted(range(n), key=lambda i: E[i])
        nodes, wts = [], []
        for i in order:
            x = E[i]
            for _ in range(6):  # Newton on pi_n by the recurrence
                p0, p1, d0, d1 = mpf(0), mpf(1), mpf(0), mpf(0)
                for k in range(n):
                    p0, p1, d0, d1 = p1, (x - alpha[k]) * p1 - (beta[k] * p0 if k else 0), d1, (x - alpha[k]) * d1 + p1 - (beta[k] * d0 if k else 0)
                x = x - p1 / d1
            nodes.append(x)
            w_eig = beta[0] * Q[0, i] ** 2
            # Christoffel number: prod beta / (pi_{n-1}(x) pi_n'(x))
            p0, p1, d0, d1 = mpf(0), mpf(1), mpf(0), mpf(0)
            for k in range(n):
                p0, p1, d0, d1 = p1, (x - alpha[k]) * p1 - (beta[k] * p0 if k else 0), d1, (x - alpha[k]) * d1 + p1 - (beta[k] * d0 if k else 0)
            w_chr = mpmath.fprod(beta[:n]) / (p0 * d1)
            assert abs(w_eig - w_chr) <= mpf(10) ** -60 * abs(w_chr), (w_eig, w_chr)
            wts.append(w_chr)
        return nodes, wts


def main():
    out = {
        "provenance": "generated by testdata/moments_ref/gen_moments_ref.py with mpmath %s, Python %s, on %s (command: /usr/bin/python3 testdata/moments_ref/gen_moments_ref.py)" % (
            mpmath.__version__, sys.version.split()[0], datetime.date.today().isoformat()),
        "digits": DIGITS,
        "weights": [],
    }
    for key, expr, interval, f, pts in WEIGHTS:
        mp.dps = 40
        for k in range(4):
            q = mpmath.quad(lambda x: x ** k * f(x), pts)
            m = MOMENTS[key](k)
            assert abs(q - m) <= mpf(10) ** -30 * (abs(m) + 1), (key, k, q, m)
        a1, b1 = pairs(key, NPAIRS, DPS)
        a2, b2 = pairs(key, NPAIRS, DPS2)
        mp.dps = 100
        for k in range(NPAIRS):
            scale = abs(a2[k]) + mpmath.sqrt(b2[k])
            assert abs(a1[k] - a2[k]) <= mpf(10) ** -60 * scale, (key, "alpha", k)
            assert abs(b1[k] - b2[k]) <= mpf(10) ** -60 * b2[k], (key, "beta", k)
        entry = {"name": key, "weight": expr, "interval": interval,
                 "alpha": [mpmath.nstr(x, DIGITS, strip_zeros=False) if x != 0 else "0" for x in a2],
                 "beta": [mpmath.nstr(x, DIGITS, strip_zeros=False) for x in b2],
                 "rules": {}}
        with mpmath.workdps(100):
            mom = [MOMENTS[key](k) for k in range(2 * NMAX)]
        for n in RULES:
            nodes, wts = rule(a2, b2, n)
            with mpmath.workdps(100):
                for k in range(2 * n):
                    s = mpmath.fsum(w * x ** k for x, w in zip(nodes, wts))
                    sa = mpmath.fsum(abs(w * x ** k) for x, w in zip(nodes, wts))
                    assert abs(s - mom[k]) <= mpf(10) ** -50 * sa, (key, n, k)
            entry["rules"][str(n)] = {
                "nodes": [mpmath.nstr(x, DIGITS, strip_zeros=False) if abs(x) > mpf(10) ** -70 else "0" for x in nodes],
                "weights": [mpmath.nstr(w, DIGITS, strip_zeros=False) for w in wts],
            }
        out["weights"].append(entry)
        print(key, "done", file=sys.stderr)
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "rules.json")
    with open(path, "w") as fh:
        json.dump(out, fh, indent=1)
        fh.write("\n")


if __name__ == "__main__":
    main()
