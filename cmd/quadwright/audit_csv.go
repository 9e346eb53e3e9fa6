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
// infinite share (a tolerance of zero) is written "inf".
func writeResidualCSV(w *strings.Builder, r *stability.Report) error {
	w.WriteString("degree,residual,share_of_tolerance,passes\n")
	for j, share := range r.Residual {
		res := "nan"
		if j < len(r.RelResidual) {
			res = csvFloat(float64(r.RelResidual[j]))
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
