package main

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/rulefile"
	"quadwright/stability"
)

// fastChoice decides whether build takes the fast float64 path: only in
// float64 mode, for a classical family without --fixed or --nodes, for a
// kind the path serves, and when N reaches design.FastThreshold (or
// --engine fast). It returns a reason when the fast path is needed (N above
// design.MaxPoints, or --engine fast) but cannot serve the request.
func (o *buildOptions) fastChoice(fam *moments.Family, kind string, req design.Request) (use bool, err error) {
	engine := o.engine
	if engine == "" {
		engine = "auto"
	}
	switch engine {
	case "auto", "fast", "extended":
	default:
		return false, fmt.Errorf("--engine %q: choose auto, fast or extended", o.engine)
	}
	n := req.Points
	need := engine == "fast" || n > design.MaxPoints
	if engine == "extended" {
		if n > design.MaxPoints {
			return false, fmt.Errorf("--points %d: the extended-precision engine builds at most %d points (the fast path, --engine auto or fast, goes to %d)", n, design.MaxPoints, design.FastMaxPoints)
		}
		return false, nil
	}
	var why string
	switch {
	case req.Digits != 0 || req.Auto:
		why = "it works in float64 mode only (leave --digits out)"
	case fam == nil:
		why = "it serves the classical families only (--family)"
	case o.fixed != "" || o.nodesFile != "":
		why = "it takes no --fixed or --nodes (radau fixes the left end, lobatto both)"
	default:
		why = design.FastServes(*fam, kind)
	}
	if why != "" {
		if need {
			return false, fmt.Errorf("--points %d: only the fast float64 path builds this many points, and %s", n, why)
		}
		return false, nil
	}
	return need || n >= design.FastThreshold, nil
}

// runFastBuild builds with design.BuildFast and streams the rule out.
func (o *buildOptions) runFastBuild(ctx context.Context, fam moments.Family, kind string, n int, format string, stdout io.Writer) error {
	var opt design.FastOptions
	switch o.verify {
	case "", "budget":
	case "full":
		opt.FullCheck = true
	default:
		return fmt.Errorf("--verify %q: choose budget or full", o.verify)
	}
	rule, err := design.BuildFast(ctx, fam, kind, n, opt)
	if err != nil {
		return err
	}
	o.fastFacts = ptr(fastFacts(rule))
	return streamOutput(o.output, stdout, func(w io.Writer) error {
		return writeFastRule(w, rule, &fam, format)
	})
}

// streamOutput writes through a buffer to stdout or, with a path, to a
// temporary file in the same folder renamed into place only once all was
// written: a failure leaves no partial file behind, and a rule of any size
// is written without being held as text in memory.
func streamOutput(path string, stdout io.Writer, write func(w io.Writer) error) error {
	if path == "" {
		bw := bufio.NewWriterSize(stdout, 1<<16)
		if err := write(bw); err != nil {
			return err
		}
		return bw.Flush()
	}
	return writeAtomic(path, func(f io.Writer) error {
		bw := bufio.NewWriterSize(f, 1<<20)
		if err := write(bw); err != nil {
			return err
		}
		return bw.Flush()
	})
}

// fastSummary is the stability summary of a fast rule, in the keys of
// stability.Summary.
func fastSummary(r *design.FastRule) stability.Summary {
	s := r.Stability()
	return stability.Summary{
		Points: r.Points(), Degree: r.Degree, NegativeWeights: s.NegativeWeights,
		StabilityFactor: stability.Float(s.Factor), LostDigits: stability.Float(math.Log10(s.Factor)),
		NodesOutside: s.NodesOutside, NodesOnBoundary: s.NodesOnBoundary,
		MinGap: stability.Float(s.MinGap), MinGapAfter: s.MinGapAfter,
	}
}

func fmtF(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// accuracyLine says how the fast rule's accuracy was measured (the
// contract: in float64 mode the fast path's report states it in ulps).
func accuracyLine(r *design.FastRule) string {
	a := r.Accuracy
	return fmt.Sprintf("measured at %d sampled nodes against Newton's method on the recurrence in double-double: nodes within %.3g ulp (%.2g of the bound), weights within %.3g ulp (%.2g of the bound)",
		a.Samples, a.NodeULP, a.NodeShare, a.WeightULP, a.WeightShare)
}

// writeFastRule renders a fast rule in the given format, point by point.
func writeFastRule(w io.Writer, r *design.FastRule, fam *moments.Family, format string) error {
	switch format {
	case "csv":
		if _, err := io.WriteString(w, "node,weight\n"); err != nil {
			return err
		}
		return writeLines(w, len(r.X), func(buf []byte, i int) []byte {
			buf = appendFloat(buf, r.X[i])
			buf = append(buf, ',')
			buf = appendFloat(buf, r.W[i])
			return append(buf, '\n')
		})
	case "json":
		return writeFastJSON(w, r, fam)
	}
	return writeFastText(w, r)
}

func writeFastText(w io.Writer, r *design.FastRule) error {
	fmt.Fprintf(w, "# quadwright %s rule\n", r.Kind)
	fmt.Fprintf(w, "# measure:  %s, weight %s on %s\n", r.Measure, r.Weight, r.Domain)
	fmt.Fprintf(w, "# points:   %d\n", r.Points())
	fmt.Fprintf(w, "# degree:   %d (verified on the printed values; largest residual %.2g times the tolerance; built for degree %d)\n", r.Degree, r.WorstShare, r.ConstructionDegree)
	fmt.Fprintf(w, "# digits:   float64 (fast path: each value computed in float64 and double-double, not necessarily the nearest double)\n")
	fmt.Fprintf(w, "# method:   %s\n", r.Method)
	fmt.Fprintf(w, "# check:    %s\n", r.DegreeCheck)
	fmt.Fprintf(w, "# accuracy: %s\n", accuracyLine(r))
	io.WriteString(w, fastSummary(r).TextBlock())
	for _, note := range r.Notes {
		fmt.Fprintf(w, "# note:     %s\n", note)
	}
	iw := len(fmt.Sprint(r.Points()))
	fmt.Fprintf(w, "%*s  %-24s  %s\n", iw, "i", " node", " weight")
	return writeLines(w, len(r.X), func(buf []byte, i int) []byte {
		return appendTextLine(buf, iw, i, r.X[i], r.W[i])
	})
}

// writeFastJSON writes the rule file (the keys of rulefile.File, in its
// order, and the fast path's own: construction_degree, accuracy and the
// provenance's degree_check), the nodes and weights streamed.
func writeFastJSON(w io.Writer, r *design.FastRule, fam *moments.Family) error {
	js := func(v any) string {
		b, err := json.Marshal(v)
		if err != nil {
			panic(err) // plain strings, numbers and structs of them
		}
		return string(b)
	}
	fmt.Fprintf(w, "{\n  \"format\": \"quadwright-rule/1\",\n  \"kind\": %s,\n", js(r.Kind))
	fmt.Fprintf(w, "  \"domain\": {\"shape\": \"interval\", \"interval\": %s},\n", js(r.Domain.Strings()))
	fmt.Fprintf(w, "  \"weight\": %s,\n  \"points\": %d,\n  \"degree\": %d,\n  \"digits\": 0,\n", js(r.Weight), r.Points(), r.Degree)
	list := func(key string, v []float64, last bool) error {
		fmt.Fprintf(w, "  %q: [", key)
		if err := writeLines(w, len(v), func(buf []byte, i int) []byte {
			if i > 0 {
				buf = append(buf, ',')
			}
			buf = append(buf, "\n    \""...)
			buf = appendFloat(buf, v[i])
			return append(buf, '"')
		}); err != nil {
			return err
		}
		_, err := io.WriteString(w, "\n  ],\n")
		return err
	}
	if err := list("nodes", r.X, false); err != nil {
		return err
	}
	if err := list("weights", r.W, false); err != nil {
		return err
	}
	fmt.Fprintf(w, "  \"measure\": %s,\n", js(r.Measure))
	if fam != nil {
		f := map[string]string{"name": fam.Name}
		if fam.Alpha != nil {
			f["alpha"] = moments.RatString(fam.Alpha)
		}
		if fam.Beta != nil {
			f["beta"] = moments.RatString(fam.Beta)
		}
		fmt.Fprintf(w, "  \"family\": %s,\n", js(f))
	}
	prov := struct {
		rulefile.Provenance
		DegreeCheck string `json:"degree_check"`
	}{rulefile.Provenance{Program: "quadwright " + version, Method: r.Method, WorkingPrecision: 53, CheckPrecision: 106,
		ExactnessTested: r.Degree, ResidualShare: fmt.Sprintf("%.2g", r.WorstShare)}, r.DegreeCheck}
	fmt.Fprintf(w, "  \"provenance\": %s,\n", js(prov))
	fmt.Fprintf(w, "  \"construction_degree\": %d,\n", r.ConstructionDegree)
	a := r.Accuracy
	acc := struct {
		Samples     int     `json:"samples"`
		NodeULP     float64 `json:"node_ulp"`
		WeightULP   float64 `json:"weight_ulp"`
		NodeShare   float64 `json:"node_share_of_bound"`
		WeightShare float64 `json:"weight_share_of_bound"`
		How         string  `json:"how"`
	}{a.Samples, round3(a.NodeULP), round3(a.WeightULP), round3(a.NodeShare), round3(a.WeightShare), accuracyLine(r)}
	fmt.Fprintf(w, "  \"accuracy\": %s,\n", js(acc))
	_, err := fmt.Fprintf(w, "  \"report\": %s\n}\n", js(fastSummary(r)))
	return err
}

// round3 keeps three significant digits of a measured figure.
func round3(v float64) float64 {
	f, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 3, 64), 64)
	return f
}
