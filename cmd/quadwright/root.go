package main

import (
	"github.com/spf13/cobra"
)

func newRootCommand() *cobra.Command {
	root := &cobra.Command{
		Use:   "quadwright",
		Short: "Design, verify and audit quadrature rules",
		Long: `quadwright builds Gauss-type quadrature rules for classical and unusual weight
functions in extended precision, verifies every rule it prints (every digit
computed at two working precisions and printed only where both agree, the
degree of exactness checked on the printed values), audits rules from
elsewhere and reports how trustworthy a rule is.`,
		Version:       version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.PersistentFlags().Bool("quiet", false, "no progress bar on stderr (a bar is shown only on a terminal, for long work)")
	root.AddCommand(newBuildCommand(), newDemoCommand(), newExportCommand(), newDocsCommand(), newElementCommand(), newMomentsCommand(), newRecurrenceCommand(), newAuditCommand())
	return root
}
