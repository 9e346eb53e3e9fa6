package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/cobra/doc"
	"github.com/spf13/pflag"
)

// docsPrefix is the file-name prefix of the generated reference pages
// (cobra/doc names them after the command path: quadwright_build.md).
const docsPrefix = "quadwright"

func newDocsCommand() *cobra.Command {
	var out string
	cmd := &cobra.Command{
		Use:   "docs",
		Short: "Write the Markdown command reference (one page per command)",
		Long: `Write the command reference, one Markdown page per command, generated from the
commands' own help (github.com/spf13/cobra/doc), into --out. Pages of commands
that no longer exist are removed; other files in the folder are left alone.
The pages are written to a temporary folder first and moved into place, so an
interrupted run leaves the old reference whole.`,
		Example: `  quadwright docs --out docs/`,
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runDocs(out, cmd)
		},
	}
	cmd.Flags().StringVar(&out, "out", "docs", "folder for the Markdown pages (created if missing)")
	return cmd
}

// generateDocs writes the reference pages of a fresh command tree into
// dir, which must exist. Flag defaults inside the machine's temporary folder
// (demo --out) are written as $TMPDIR/..., so that the pages do not depend
// on the machine that generated them.
func generateDocs(dir string) error {
	root := newRootCommand()
	root.DisableAutoGenTag = true // no date line: the pages only change when the help does
	root.InitDefaultCompletionCmd()
	tmp := filepath.Clean(os.TempDir())
	var visit func(c *cobra.Command)
	visit = func(c *cobra.Command) {
		c.Flags().VisitAll(func(f *pflag.Flag) {
			if rest, ok := strings.CutPrefix(f.DefValue, tmp); ok && (rest == "" || rest[0] == filepath.Separator) {
				f.DefValue = "$TMPDIR" + filepath.ToSlash(rest)
			}
		})
		for _, s := range c.Commands() {
			visit(s)
		}
	}
	visit(root)
	return doc.GenMarkdownTree(root, dir)
}

func runDocs(out string, cmd *cobra.Command) error {
	if err := os.MkdirAll(out, 0o755); err != nil {
		return fmt.Errorf("--out %s: cannot create the folder (%v)", out, unwrapPathError(err))
	}
	tmp, err := os.MkdirTemp(out, ".docs-tmp-*")
	if err != nil {
		return fmt.Errorf("--out %s: cannot write there (%v)", out, unwrapPathError(err))
	}
	defer os.RemoveAll(tmp)
	if err := generateDocs(tmp); err != nil {
		return fmt.Errorf("--out %s: generating the pages failed (%v)", out, err)
	}
	fresh, err := os.ReadDir(tmp)
	if err != nil {
		return fmt.Errorf("--out %s: %v", out, unwrapPathError(err))
	}
	keep := map[string]bool{}
	for _, e := range fresh {
		keep[e.Name()] = true
		if err := os.Rename(filepath.Join(tmp, e.Name()), filepath.Join(out, e.Name())); err != nil {
			return fmt.Errorf("--out %s: moving %s into place failed (%v)", out, e.Name(), unwrapPathError(err))
		}
	}
	old, _ := os.ReadDir(out)
	for _, e := range old {
		n := e.Name()
		if !keep[n] && !e.IsDir() && strings.HasPrefix(n, docsPrefix) && strings.HasSuffix(n, ".md") {
			os.Remove(filepath.Join(out, n))
		}
	}
	fmt.Fprintf(cmd.OutOrStdout(), "wrote %d pages of the command reference to %s\n", len(fresh), out)
	return nil
}
