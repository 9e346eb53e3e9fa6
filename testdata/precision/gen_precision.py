#!/usr/bin/python3
"""Generate reference values for the Go tests of package quadwright/precision.

Run from the repository root with Debian's python3-mpmath:

    /usr/bin/python3 testdata/precision/gen_precision.py > testdata/precision/reference.json

Every argument that the Go side feeds to a function taking a *big.Float is
written as an exact binary value {"man": M, "exp": E} meaning M * 2**E with
|M| < 2**bits, so both sides evaluate the function at the same number; the
reference value is computed by mpmath at bits + 400 bits and printed with
digits + 20 significant digits.  Arguments of the rational entry points are
written as exact fractions "p/q" and evaluated by mpmath on the exact
fraction at the same raised precision.
"""

import datetime
import json
import sys
from fractions import Fraction

import mpmath
from mpmath import mp, mpf

EXTRA_BITS = 400
EXTRA_DIGITS = 20


def digits_to_bits(d):
    """ceil(d * log2(10)), evaluated at 200 bits (far more than needed)."""
    mp.prec = 200
    return int(mpmath.ceil(d * mpmath.log(10, 2)))


def binary(value, bits):
    """value (a Fraction) rounded to nearest at `bits` bits, as {man, exp}."""
    mp.prec = bits
    x = mpf(value.numerator) / value.denominator
    man, exp = mpmath.frexp(x)  # x = man * 2**exp, 0.5 <= |man| < 1
    if x == 0:
        return {"man": "0", "exp": 0}, x
    m = int(mpmath.ldexp(man, bits))
    return {"man": str(m), "exp": int(exp) - bits}, x


def decimal(v, digits):
    return mpmath.nstr(v, digits + EXTRA_DIGITS, min_fixed=1, max_fixed=0)


def frac(s):
    """The exact value of s: a decimal, "p/q", or "a+2^-k"."""
    if "+2^-" in s:
        a, k = s.split("+2^-")
        return Fraction(a) + Fraction(1, 2 ** int(k))
    return Fraction(s)


ELEMENTARY = {
    "exp": ["1e-30", "0.5", "-0.7", "1", "10", "100.25", "-1000", "1e6"],
    "log": ["1e-30", "0.5", "2", "10", "1e6", "1e300", "1.000000000000000000000000000001"],
    "sqrt": ["2", "0.3", "1e-300", "1e6", "123456789.123"],
    "sin": ["1e-30", "0.5", "-0.7", "1.5707963267948966", "3.141592653589793",
            "355", "1e6", "1e22"],
    "cos": ["1e-30", "0.5", "-0.7", "1.5707963267948966", "3.141592653589793",
            "355", "1e6", "1e22"],
    "atan": ["1e-30", "0.5", "1", "-2", "0.9999", "1e6", "1e30"],
}
POW = [("2", "0.5"), ("0.3", "7.5"), ("10", "-3.3"), ("1e6", "1.5"),
       ("1.0001", "12345.5"), ("7", "-0.001")]
GAMMA = ["1/2", "1/3", "0.3", "1.7", "2.3", "-0.7", "-2.5", "10.5", "101",
         "12345.678", "1e-5", "-1000.5", "1000000.25", "1+2^-100", "2+2^-100",
         "-2.457"]
GAMMA_1000 = ["1/3", "-0.7", "12345.678", "1000000.25", "2+2^-100"]


def elementary(out):
    funcs = {"exp": mpmath.exp, "log": mpmath.log, "sqrt": mpmath.sqrt,
             "sin": mpmath.sin, "cos": mpmath.cos, "atan": mpmath.atan}
    for digits in (50, 200, 1000):
        bits = digits_to_bits(digits)
        for name, args in ELEMENTARY.items():
            for a in args:
                xb, _ = binary(frac(a), bits)
                mp.prec = bits + EXTRA_BITS
                x = mpmath.ldexp(int(xb["man"]), xb["exp"])
                v = funcs[name](x)
                out.append({"func": name, "digits": digits, "bits": bits,
                            "arg": a, "x": xb, "value": decimal(v, digits)})
        for a, b in POW:
            xb, _ = binary(frac(a), bits)
            yb, _ = binary(frac(b), bits)
            mp.prec = bits + EXTRA_BITS
            x = mpmath.ldexp(int(xb["man"]), xb["exp"])
            y = mpmath.ldexp(int(yb["man"]), yb["exp"])
            v = mpmath.power(x, y)
            out.append({"func": "pow", "digits": digits, "bits": bits,
                        "arg": a + "^" + b, "x": xb, "y": yb,
                        "value": decimal(v, digits)})


def gamma(out):
    for digits, args in ((40, GAMMA), (200, GAMMA), (1000, GAMMA_1000)):
        bits = digits_to_bits(digits)
        for a in args:
            f = frac(a)
            xb, _ = binary(f, bits)
            mp.prec = bits + EXTRA_BITS
            xbin = mpmath.ldexp(int(xb["man"]), xb["exp"])
            xrat = mpf(f.numerator) / f.denominator
            entry = {"digits": digits, "bits": bits, "arg": a,
                     "rat": "%d/%d" % (f.numerator, f.denominator), "x": xb}
            for key, x in (("bin", xbin), ("rat", xrat)):
                g = mpmath.gamma(x)
                entry[key + "_lgamma"] = decimal(mpmath.log(abs(g)), digits)
                entry[key + "_sign"] = 1 if g > 0 else -1
                entry[key + "_gamma"] = decimal(g, digits)
            out.append(entry)


def main():
    mp.prec = digits_to_bits(1100)
    ref = {
        "provenance": "mpmath %s, %s, /usr/bin/python3 testdata/precision/gen_precision.py "
                      "> testdata/precision/reference.json"
                      % (mpmath.__version__, datetime.date.today().isoformat()),
        "pi": mpmath.nstr(mp.pi, 1050),
        "ln2": mpmath.nstr(mp.ln2, 1050),
    }
    el = []
    elementary(el)
    ref["elementary"] = el
    ga = []
    gamma(ga)
    ref["gamma"] = ga
    json.dump(ref, sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
