package main

import (
	"github.com/spf13/cobra"
)

func newRootCommand() *cobra.Command {
	root := &cobra.Command{
		Use:   "quadwright",
		Short: "Design, verify and audit quadrature rules",
		Long: `quadwright builds Gauss-type quadrature rules for classical and unusual weight
functions in extended precision, verifies every rule it prints (degree of
exactness checked on the printed digits, every digit confirmed by an
independent computation at higher precision) and reports how trustworthy a
rule is.`,
		Version:       version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.AddCommand(newBuildCommand(), newDemoCommand())
	return root
}
