// Package fast computes classical Gauss rules in float64 in O(N) time, for
// rules far larger than the extended-precision engine of package design
// can build (N up to 10^6 and beyond): Gauss-Legendre (Bogaert 2014, the
// node angle formed in double-double), Gauss-Jacobi and its Radau and Lobatto
// rules (Hale and Townsend 2013: interior asymptotics, with the nodes next
// to the ends from the hypergeometric series), and generalized
// Gauss-Laguerre and Gauss-Hermite (Glaser, Liu and Rokhlin 2007: Taylor
// series of the differential equation, zero to zero, in double-double),
// with scaled weights where the plain ones underflow.
//
// Nodes are returned in ascending order. Weights are formed from products,
// quotients and double-double logarithms of positive factors, never as
// differences, so they keep their relative accuracy however small they
// are. The Legendre and Jacobi nodes are computed independently of one
// another and spread over runtime.GOMAXPROCS goroutines, so the output
// does not depend on the number of cores; the Hermite and Laguerre marches
// are sequential.
//
// The package imports only precision and gonum; design imports it to pick
// this path for large N in float64 mode. Its accuracy is measured, not
// assumed: the external tests compare sampled nodes and weights with
// Newton's method on the three-term recurrence in extended precision
// (Measured returns the figures).
package fast
