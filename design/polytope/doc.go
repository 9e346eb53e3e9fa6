// Package polytope builds verified quadrature rules on the user's own
// cells: simple polygons (convex or not) and closed polyhedra, as the
// cells of polygonal and polyhedral methods (virtual elements, polytopal
// discontinuous Galerkin, agglomerated or cut meshes) need them, one rule
// per cell, with positive weights, nodes in the cell and few points.
//
// The route, for a cell and a degree D:
//
//  1. The geometry is read exactly (decimals and fractions as big.Rat) and
//     validated: a simple polygon with non-zero area, or a closed
//     polyhedron whose every edge lies in exactly two faces traversed in
//     opposite directions, with planar faces and non-zero volume.
//  2. Its moments, the integrals of every monomial of total degree <= D,
//     are computed exactly by the divergence theorem in rational
//     arithmetic (moments.go): the reference every printed rule is
//     verified against.
//  3. The cell is subdivided into simplices, a collapsed Gauss-Jacobi rule
//     is placed on each, and the resulting positive rule is compressed by
//     nonnegative least squares to at most dim P_D points (Tchakaloff's
//     theorem: V. Tchakaloff, Bull. Sci. Math. 81, 1957; A. Sommariva and
//     M. Vianello, "Compression of multivariate discrete measures and
//     applications", Numer. Funct. Anal. Optim. 36, 2015), then thinned by
//     point elimination with Gauss-Newton keeping the weights positive and
//     the points inside (H. Xiao and Z. Gimbutas, "A numerical algorithm
//     for the construction of efficient quadrature rules in two and higher
//     dimensions", Comput. Math. Appl. 59, 2010), and solved at two
//     extended precisions whose agreement confirms every printed digit:
//     the engine of design/element (element.SolveRegion), not a copy.
//  4. The printed rule is read back exactly and tested on every monomial
//     through D against the exact moments, its weights for positivity and
//     its nodes for lying in the closed cell; a rule that fails is an
//     error, never a result.
//
// The rule is always built on a canonical form of the cell's similarity
// class (a polygon up to translation, rotation and uniform scaling; a
// polyhedron up to translation and uniform scaling) and carried to the
// cell by an exact affine map, so that a batch (Batch) computes each class
// once and every cell's rule is the same whatever came before it.
package polytope
