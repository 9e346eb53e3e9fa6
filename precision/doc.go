// Package precision is for working precision, constants, special functions and
// rounding used by every other quadwright package.
//
// Everything here operates on math/big values. Precision is a property of
// values, never of the package: a function of x returns its result at
// x.Prec() (for several arguments, the largest of their precisions) unless it
// takes an explicit prec argument. Internally each function works with guard
// bits and rounds once at the end, and its doc comment states the accuracy
// guaranteed at the result's precision. An ulp ("unit in the last place") of
// a result r at p bits is 2^(e-p), where 2^(e-1) <= |r| < 2^e.
//
// The package holds three kinds of code:
//
//   - working precision: DigitsToBits, WorkingPrec, RaisePrec;
//   - constants and special functions: Pi, Ln2, Exp, Log, Pow (and ExpTo,
//     LogTo, PowTo at a given precision: argument reduction and series up
//     to 8192 bits, bigfloat beyond), Sqrt, Sin, Cos, Atan, LogGamma, Gamma
//     and their rational-argument variants;
//   - exact conversion between decimal text and binary values: ParseNumber,
//     ParseExact, DecimalULP, FormatSig, FormatFloat64, NearestFloat64.
//
// Caches (of pi, ln 2, inverse factorials and Bernoulli numbers) are guarded by mutexes, so all
// functions are safe for concurrent use.
package precision
