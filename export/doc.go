// Package export writes a finished quadrature rule as source code (C, C++,
// Fortran, Go, Python, Julia) or as a plain table (CSV) or a normalised rule
// file (JSON), so that it can be pasted into the program that uses it.
//
// It is a writer at the end of the road measure -> recurrence -> rule ->
// report -> writer: it takes a *rulefile.File (from rulefile.Read or
// rulefile.FromRule) and never recomputes the rule. Every literal carries
// every significant digit of the rule's decimal strings; the float64 arrays
// hold the float64 nearest to each exact decimal (the rounding is done here,
// exactly, not left to the target compiler), and when the rule has more than
// 17 digits the extended-precision variants of each language carry the full
// strings.
package export
