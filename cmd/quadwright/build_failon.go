package main

import (
	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/stability"
)

// addBuildFailOn registers build's --fail-on: the conditions and exit
// status of audit's (parseFailOn, checkThresholds), looked at on the rule
// just built and written.
func addBuildFailOn(cmd *cobra.Command, o *buildOptions) {
	cmd.Flags().StringVar(&o.failOn, "fail-on", "", "comma-separated conditions that make the exit status 2 once the rule is written: negative, outside, degree<K, lost>L (L in decimal digits), as for audit")
}

// ruleFacts are the facts --fail-on looks at in a rule of the extended
// engine: its verified degree and the stability summary of its printed
// values.
func ruleFacts(r *design.Rule) (auditFacts, error) {
	s, err := stability.Summarize(r)
	if err != nil {
		return auditFacts{}, err
	}
	return auditFacts{s.NegativeWeights, s.NodesOutside, s.Degree, float64(s.LostDigits), "interval"}, nil
}

// fastFacts are the same for a rule of the fast path; its degree is the one
// the exactness test established (FastRule.Degree).
func fastFacts(r *design.FastRule) auditFacts {
	s := fastSummary(r)
	return auditFacts{s.NegativeWeights, s.NodesOutside, s.Degree, float64(s.LostDigits), "interval"}
}

// checkBuilt applies the --fail-on checks to the built rule's facts.
func checkBuilt(checks []failCheck, facts func() (auditFacts, error)) error {
	if len(checks) == 0 {
		return nil
	}
	f, err := facts()
	if err != nil {
		return err
	}
	return checkThresholds(checks, f)
}

func ptr[T any](v T) *T { return &v }
