# Reference collapsed-coordinate rules on the tetrahedron and the pyramid,
# by an independent route: the 1-D nodes are the zeros of the Jacobi
# polynomials P_n^(a,0) located by sign changes on a fine grid and refined
# by bisection on their explicit sum (mpmath's own quadrature generators are not used);
# the 1-D weights solve the moment (Vandermonde) system for the exact
# moments B(k+1, a+1) of (1-v)^a on [0,1]. The 3-D rule is the conical
# product x = u(1-v)(1-w), y = v(1-w), z = w (tetrahedron) and
# x = u(1-z), y = v(1-z) (pyramid, u, v Gauss-Legendre on [-1,1]).
#
# Run: /usr/bin/python3 testdata/element/gen_collapsed.py > testdata/element/collapsed.json
import datetime
import json
import mpmath as mp

mp.mp.dps = 80
DIGITS = 40


def zeros01(n, a):
    """Zeros of P_n^(a,0)(2v-1) in (0,1)."""
    # Explicit sum (Abramowitz and Stegun 22.3.2), x = 2v - 1:
    # P_n^(a,0)(x) = 2^-n sum_m C(n+a, m) C(n, n-m) (x-1)^(n-m) (x+1)^m.
    def f(v):
        x = 2 * v - 1
        return sum(mp.binomial(n + a, m) * mp.binomial(n, n - m) * (x - 1) ** (n - m) * (x + 1) ** m for m in range(n + 1)) / 2**n
    # The grid is offset so that no grid point is a zero (the middle zero
    # of an odd Legendre polynomial is 1/2).
    grid = [(mp.mpf(i) + mp.mpf("0.3137")) / 4001 for i in range(4001)]
    vals = [f(g) for g in grid]
    out = []
    for lo, hi, flo, fhi in zip(grid, grid[1:], vals, vals[1:]):
        if flo * fhi < 0:
            for _ in range(300):  # bisection to far below 80 digits
                mid = (lo + hi) / 2
                fm = f(mid)
                if fm == 0:
                    lo = hi = mid
                    break
                if (fm < 0) == (flo < 0):
                    lo, flo = mid, fm
                else:
                    hi = mid
            out.append((lo + hi) / 2)
    assert len(out) == n, (n, a, len(out))
    return out


def rule01(n, a):
    x = zeros01(n, a)
    A = mp.matrix(n, n)
    b = mp.matrix(n, 1)
    for k in range(n):
        for i in range(n):
            A[k, i] = x[i] ** k
        b[k] = mp.beta(k + 1, a + 1)
    w = mp.lu_solve(A, b)
    return x, [w[i] for i in range(n)]


def fmt(v):
    return mp.nstr(v, DIGITS, strip_zeros=False, min_fixed=-mp.inf, max_fixed=mp.inf)


def tetrahedron(n):
    u, wu = rule01(n, 0)
    v, wv = rule01(n, 1)
    z, wz = rule01(n, 2)
    nodes, weights = [], []
    for i in range(n):
        for j in range(n):
            for k in range(n):
                nodes.append([fmt(u[i] * (1 - v[j]) * (1 - z[k])), fmt(v[j] * (1 - z[k])), fmt(z[k])])
                weights.append(fmt(wu[i] * wv[j] * wz[k]))
    return nodes, weights


def pyramid(n):
    u, wu = rule01(n, 0)
    u = [2 * t - 1 for t in u]
    wu = [2 * t for t in wu]
    z, wz = rule01(n, 2)
    nodes, weights = [], []
    for i in range(n):
        for j in range(n):
            for k in range(n):
                nodes.append([fmt(u[i] * (1 - z[k])), fmt(u[j] * (1 - z[k])), fmt(z[k])])
                weights.append(fmt(wu[i] * wu[j] * wz[k]))
    return nodes, weights


out = {"provenance": "%s: /usr/bin/python3 testdata/element/gen_collapsed.py > testdata/element/collapsed.json (mpmath %s, 80-digit arithmetic, %d digits printed; zeros by bisection, weights by the moment system)" % (datetime.date.today(), mp.__version__, DIGITS), "rules": []}
for shape, n, fn in (("tetrahedron", 3, tetrahedron), ("pyramid", 4, pyramid)):
    nodes, weights = fn(n)
    out["rules"].append({"shape": shape, "degree": 2 * n - 1, "nodes": nodes, "weights": weights})
print(json.dumps(out, indent=1))
