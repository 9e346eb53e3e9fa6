// Package levelset builds quadrature rules on cut elements: the part of a
// rectangle, box, quadrilateral, hexahedron, triangle or tetrahedron where
// a level-set function phi is negative (inside) or positive (outside), and
// the interface phi = 0 itself with its area (in 2-D, length) measure.
//
// The method is R. I. Saye, "High-order quadrature methods for implicitly
// defined surfaces and volumes in hyperrectangles", SIAM J. Sci. Comput.
// 37 (2015), A993-A1019: a height direction is chosen from the gradient of
// phi; where interval arithmetic confirms that phi is monotone along it
// over the whole box (so the implicit function theorem makes the interface
// a graph over the other coordinates) the problem reduces by one dimension
// to the faces, with Saye's sign rules; elsewhere the box is split into
// halves across its widest side (also where the height function may be
// steep, or its square-root branch point near against the width of the
// next level, either of which would slow the convergence). Along each line the roots of
// phi are bracketed and polished by safeguarded Newton steps, and every
// piece gets a Gauss-Legendre rule of the requested order Q (from package
// design/fast in float64). With Request.Digits the float64 plan (boxes,
// height directions, which roots cut each line and which pieces are kept)
// is recorded and replayed at two extended working precisions: the roots
// by Newton steps from the float64 root, kept inside its float64 bracket
// (whose ends' signs are confirmed), on phi compiled to a
// moments.GradTape (value and directional derivative in reused storage);
// the Gauss-Legendre rules from design.Gauss, cached by order and
// precision; every printed digit must agree between the two (refine.go,
// extended.go, tape.go). Every weight and coordinate prints D significant
// digits. A rule file of more than 17 digits is audited at its own digits
// (audit_digits.go). Triangles and
// tetrahedra are reached from the unit square and cube through the
// collapsed (Duffy) map, its Jacobian folded into the weights.
//
// The gradient of phi comes from forward-mode automatic differentiation
// of the parsed expression (moments.Expr.Grad64, GradSpan; in the float64
// inner loops the same operations compiled once, moments.Prog64), not
// from differences. Weights are positive by construction (products of
// Gauss-Legendre weights, lengths and Jacobians), and every node lies
// strictly on the side asked. Rules are not exact for any polynomial
// space, so no degree is claimed; the estimated error compares the rule
// with the one of order Q+4 (Rule.EstimatedError).
package levelset
