// Package moments describes the measures that quadwright builds rules for,
// and computes what can be known of them before any rule exists: the
// classical families and their intervals, weight expressions (parsed and
// evaluated in float64 and at any precision), their raw and modified
// moments by double-exponential quadrature with error estimates, positive
// discretisations of them, and moment lists and discrete measures read from
// files.
//
// It is the first stop on the road measure -> recurrence -> rule -> report:
// parameters and file values are exact rationals, and nothing here decides
// how a recurrence or a rule is computed from them.
package moments
