// Package design turns a measure into a verified quadrature rule: it holds
// the three-term recurrence of a measure's orthogonal polynomials, the
// closed-form recurrences of the classical families, the Gauss rule of a
// recurrence (Golub-Welsch start, Newton refinement in extended precision,
// Sturm-bisection fallback), the exactness check, and the Rule type that
// carries a rule and its provenance to the rest of the program.
package design
