// Package moments describes the measures that quadwright builds rules for:
// the classical weight families, and the interval a measure lives on.
//
// It is the first stop on the road measure -> recurrence -> rule -> report:
// a value of this package says what the measure is, exactly (parameters are
// exact rationals), and nothing about how its recurrence or rule is computed.
package moments
