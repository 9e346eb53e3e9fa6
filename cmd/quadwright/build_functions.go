package main

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"sort"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/design/systems"
	"quadwright/moments"
	"quadwright/rulefile"
	"quadwright/stability"
)

// functionFlags are build's flags for rules exact for a function system
// (CONTRACT.md, "Function systems").
type functionFlags struct {
	list, file, moments string
}

func addFunctionFlags(cmd *cobra.Command, ff *functionFlags) {
	f := cmd.Flags()
	f.StringVar(&ff.list, "functions", "", "build a rule exact for these functions of x times the weight: comma-separated expressions, optionally followed by \"; k=A..B\" to repeat each for the integer k (e.g. \"x^k, x^k*log(x); k=0..7\"); 2N functions give the N-point generalized Gauss rule")
	f.StringVar(&ff.file, "functions-file", "", "file of function lists, one per line as for --functions ('#' starts a comment), in order")
	f.StringVar(&ff.moments, "function-moments", "", "file of the integrals of the functions times the weight, one decimal or p/q per line in the expanded order, instead of computing them (their digits limit the rule's)")
}

func (ff functionFlags) given() bool {
	return strings.TrimSpace(ff.list) != "" || strings.TrimSpace(ff.file) != "" || strings.TrimSpace(ff.moments) != ""
}

// parse returns the expanded functions of --functions or --functions-file.
func (ff functionFlags) parse() ([]systems.Function, error) {
	hasList, hasFile := strings.TrimSpace(ff.list) != "", strings.TrimSpace(ff.file) != ""
	switch {
	case hasList && hasFile:
		return nil, fmt.Errorf("--functions and --functions-file: give the system one way, not both")
	case hasList:
		fs, err := systems.ParseFunctions(ff.list)
		if err != nil {
			return nil, fmt.Errorf("--functions: %v", err)
		}
		return fs, nil
	case hasFile:
		return systems.ReadFunctionsFile(ff.file)
	}
	return nil, fmt.Errorf("--function-moments needs the functions: give them with --functions or --functions-file")
}

// problem builds the system and its weight from build's or audit's flags:
// --weight (default 1) on --interval, with --breaks.
func (ff functionFlags) problem(mf measureFlags, fallbackInterval string) (systems.Problem, error) {
	fs, err := ff.parse()
	if err != nil {
		return systems.Problem{}, err
	}
	if mf.family != "" || mf.momentsFile != "" || mf.measure != "" {
		return systems.Problem{}, fmt.Errorf("--functions integrates against --weight on --interval; --family, --moments and --measure do not apply")
	}
	if strings.TrimSpace(mf.interval) == "" {
		mf.interval = fallbackInterval
	}
	iv, err := mf.optionalInterval()
	if err != nil {
		return systems.Problem{}, err
	}
	if iv == nil {
		return systems.Problem{}, fmt.Errorf("--functions: give the interval of integration with --interval A,B")
	}
	if strings.TrimSpace(mf.weight) == "" {
		mf.weight = "1"
	}
	w, err := mf.weightFunction(iv)
	if err != nil {
		return systems.Problem{}, err
	}
	pr := systems.Problem{Functions: fs, Weight: w}
	if p := strings.TrimSpace(ff.moments); p != "" {
		if pr.Moments, err = moments.ReadMomentFile(p); err != nil {
			return systems.Problem{}, fmt.Errorf("--function-moments: %v", err)
		}
	}
	return pr, nil
}

// runBuildFunctions is build with --functions: the generalized Gauss rule
// (or, with --nodes, the interpolatory weights) of the system, verified
// against every function, written as the other rules are with the keys
// functions and exact_for added.
func runBuildFunctions(ctx context.Context, o *buildOptions, format string, stdout io.Writer) error {
	pr, err := o.functions.problem(o.measure, "")
	if err != nil {
		return err
	}
	req := design.Request{}
	if req.Digits, req.Auto, err = parseDigits(o.digits); err != nil {
		return err
	}
	if s := strings.TrimSpace(o.points); s != "" {
		if req.Points, err = strconv.Atoi(s); err != nil || req.Points < 1 {
			return fmt.Errorf("--points %q: not a whole number of points", o.points)
		}
	}
	switch k := strings.ToLower(strings.TrimSpace(o.kind)); {
	case o.nodesFile != "" && k != "gauss" && k != "interpolatory":
		return fmt.Errorf("--kind %s: with --functions and --nodes the rule is interpolatory", o.kind)
	case o.nodesFile == "" && k != "gauss" && k != "generalized-gauss":
		return fmt.Errorf("--kind %s: with --functions the rule is generalized-gauss (or interpolatory with --nodes)", o.kind)
	case o.fixed != "":
		return fmt.Errorf("--fixed does not apply to --functions; give all the nodes with --nodes")
	}
	var res *systems.Result
	if o.nodesFile != "" {
		nodes, err := readNodeFile(o.nodesFile)
		if err != nil {
			return err
		}
		if req.Points != 0 && req.Points != len(nodes) {
			return fmt.Errorf("--points %d: the --nodes file %s lists %d nodes", req.Points, o.nodesFile, len(nodes))
		}
		sort.Slice(nodes, func(i, j int) bool { return nodes[i].Cmp(nodes[j]) < 0 })
		res, err = systems.Interpolatory(ctx, pr, nodes, req)
		if err != nil {
			return err
		}
	} else if res, err = systems.GeneralizedGauss(ctx, pr, req); err != nil {
		return err
	}
	return writeOutput(o.output, stdout, func(w *strings.Builder) error {
		return writeFunctionRule(w, res, format)
	})
}

// writeFunctionRule renders a function-system rule: text and csv as for
// any rule (the notes name the system's verification), json with the
// functions and exact_for keys.
func writeFunctionRule(w *strings.Builder, res *systems.Result, format string) error {
	if format != "json" {
		if format == "text" {
			fmt.Fprintf(w, "# functions: %d (%s)\n", len(res.Functions), summarizeFunctions(res.Functions))
		}
		return writeRule(w, res.Rule, nil, format)
	}
	f := rulefile.FromRule(res.Rule, nil, "quadwright "+version)
	s, err := stability.Summarize(res.Rule)
	if err != nil {
		return err
	}
	if f.Report, err = json.Marshal(s); err != nil {
		return err
	}
	f.Functions = res.Functions
	exact := res.ExactFor
	f.ExactFor = &exact
	b, err := f.MarshalIndent()
	if err != nil {
		return err
	}
	w.Write(b)
	return nil
}

// summarizeFunctions lists the first few functions and the last.
func summarizeFunctions(fs []string) string {
	if len(fs) <= 6 {
		return strings.Join(fs, ", ")
	}
	return strings.Join(fs[:4], ", ") + ", ..., " + fs[len(fs)-1]
}
