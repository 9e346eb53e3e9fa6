//go:build heavy

package polytope

// With -tags heavy the sweeps run through the degrees of the issue.
const heavyPolygonDegree, heavyPolyhedronDegree = 20, 10
