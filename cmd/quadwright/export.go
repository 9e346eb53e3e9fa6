package main

import (
	"fmt"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/export"
	"quadwright/rulefile"
)

// exportOptions holds the flags of `quadwright export` as typed.
type exportOptions struct {
	to, name, pkg, output string
}

func newExportCommand() *cobra.Command {
	o := &exportOptions{}
	cmd := &cobra.Command{
		Use:   "export RULE",
		Short: "Write a rule as C, C++, Fortran, Go, Python, Julia, CSV or JSON",
		Long: `Write the rule in RULE (a rule file, or a table of node/weight lines) as source
code that compiles or parses as it stands, under a header comment with the
rule's provenance. Float64 arrays hold the double nearest to each value; when
the rule has more than 17 digits, the extended variants carry every digit:
C long double and __float128, C++ long double, Fortran real128, Go and Python
strings (and Python Decimal), Julia BigFloat. csv is the table of build
--format csv; json is the rule file itself, normalised.`,
		Example: `  quadwright build --family legendre --points 5 --digits 30 --format json -o gauss5.json
  quadwright export gauss5.json --to c -o gauss5.h
  quadwright export gauss5.json --to fortran --name legendre5 -o legendre5.f90
  quadwright export gauss5.json --to go --package quad --name legendre5`,
		Args: exactArgs(1, "export needs one rule file: quadwright export RULE --to LANG"),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runExport(o, args[0], cmd)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.to, "to", "", "target language: "+strings.Join(export.Languages, ", ")+" (required)")
	f.StringVar(&o.name, "name", "", "identifier prefix of the arrays, NAME_nodes and NAME_weights (Go: NameNodes); default: the rule's kind, e.g. gauss")
	f.StringVar(&o.pkg, "package", "rules", "Go package name of the generated file (--to go only)")
	f.StringVarP(&o.output, "output", "o", "", "write to this file (atomically) instead of standard output")
	cmd.RegisterFlagCompletionFunc("to", cobra.FixedCompletions(export.Languages, cobra.ShellCompDirectiveNoFileComp))
	return cmd
}

// exactArgs is cobra.ExactArgs with an error message of our own.
func exactArgs(n int, msg string) cobra.PositionalArgs {
	return func(cmd *cobra.Command, args []string) error {
		if len(args) != n {
			return fmt.Errorf("%s", msg)
		}
		return nil
	}
}

func runExport(o *exportOptions, path string, cmd *cobra.Command) error {
	lang := strings.ToLower(strings.TrimSpace(o.to))
	if lang == "" {
		return fmt.Errorf("--to is required: name the language, one of %s", strings.Join(export.Languages, ", "))
	}
	if !slices.Contains(export.Languages, lang) {
		return fmt.Errorf("--to %q: choose one of %s", o.to, strings.Join(export.Languages, ", "))
	}
	if cmd.Flags().Changed("name") {
		if err := export.ValidateName("--name", o.name); err != nil {
			return err
		}
	}
	if err := export.ValidatePackage("--package", o.pkg); err != nil {
		return err
	}
	f, err := rulefile.Read(path)
	if err != nil {
		return err
	}
	opt := export.Options{Name: o.name, Package: o.pkg, Program: "quadwright " + version, Source: path}
	return writeOutput(o.output, cmd.OutOrStdout(), func(w *strings.Builder) error {
		if err := export.Write(w, f, lang, opt); err != nil {
			return fmt.Errorf("rule file %s: %v", path, err)
		}
		return nil
	})
}
