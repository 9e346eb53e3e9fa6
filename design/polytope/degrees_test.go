//go:build !heavy

package polytope

// Without the heavy tag, and without -short, the sweeps stop here.
const heavyPolygonDegree, heavyPolyhedronDegree = 8, 4
