package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"quadwright/stability"
)

// writeResidualCSV writes audit --format csv: the exactness residual by
// degree, one line per degree tested, for plotting. residual is the
// relative residual |Q(p_j) - I(p_j)| / sum |w_i| (|p_j(x_i)| + |x_i
// p_j'(x_i)|) with p_j the degree-j orthogonal polynomial of the measure,
// share_of_tolerance the same divided by 10u (a degree passes at <= 1), and
// passes says whether it did. Values are float64 in shortest form; an
// infinite share (a tolerance of zero) is written "inf". For an element
// rule p_j runs over the monomials of total degree j and each line holds
// the largest of their residuals.
func writeResidualCSV(w *strings.Builder, r *stability.Report) error {
	return residualTable(w, r.Residual, r.RelResidual)
}

func residualTable(w *strings.Builder, shares, rel []stability.Float) error {
	w.WriteString("degree,residual,share_of_tolerance,passes\n")
	for j, share := range shares {
		res := "nan"
		if j < len(rel) {
			res = csvFloat(float64(rel[j]))
		}
		fmt.Fprintf(w, "%d,%s,%s,%t\n", j, res, csvFloat(float64(share)), float64(share) <= 1)
	}
	return nil
}

func csvFloat(v float64) string {
	switch {
	case math.IsInf(v, 1):
		return "inf"
	case math.IsNaN(v):
		return "nan"
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}
