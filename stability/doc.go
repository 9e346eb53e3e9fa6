// Package stability audits a one-dimensional quadrature rule against the
// measure it claims to integrate, and says how far it can be trusted.
//
// It is the report stop on the road measure -> recurrence -> rule -> report
// -> writer. Its input is the rule as printed (decimal strings, read as exact
// rationals, or exact fractions p/q) and a design.Measure; it never rebuilds
// the rule it audits. Two reports are made:
//
//   - Summarize: the short block that build attaches to every rule. It costs
//     O(N) exact-decimal operations (counts of negative weights and of nodes
//     outside the interval, the stability factor and the digits it costs, the
//     smallest gap between nodes), far below the cost of building the rule.
//   - Audit: the full report of `quadwright audit`: the degree of exactness
//     with the residual at every degree (tested in the orthogonal basis of the
//     measure by design.CheckExactness at extended precision), the same test
//     on the rule rounded to float64, the condition of the monomial and
//     orthonormal Vandermonde matrices, the Hankel conditioning that predicts
//     the digits a construction from raw moments loses, and the errors on
//     Genz's six test integrands beside the Gauss rule of the same size.
//
// Reports render as text (WriteText), JSON (the struct tags of Report) and a
// self-contained HTML page with inline SVG plots (WriteHTML).
package stability
