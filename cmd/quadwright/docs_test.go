package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/spf13/cobra"
)

// TestDocsCurrent regenerates the command reference into a temporary
// folder and compares it with docs/. When it fails, rerun
//
//	go run ./cmd/quadwright docs --out docs/
//
// from the repository root and commit the result.
func TestDocsCurrent(t *testing.T) {
	tmp := t.TempDir()
	if _, errs, code := run(t, tmp, "docs", "--out", "ref"); code != 0 {
		t.Fatalf("docs: exit %d: %s", code, errs)
	}
	fresh := mdFiles(t, filepath.Join(tmp, "ref"))
	committed := mdFiles(t, filepath.Join("..", "..", "docs"))
	for name, data := range fresh {
		old, ok := committed[name]
		switch {
		case !ok:
			t.Errorf("docs/%s is missing (run: go run ./cmd/quadwright docs --out docs/)", name)
		case !bytes.Equal(old, data):
			t.Errorf("docs/%s is out of date (run: go run ./cmd/quadwright docs --out docs/)", name)
		}
	}
	for name := range committed {
		if _, ok := fresh[name]; !ok {
			t.Errorf("docs/%s documents a command that no longer exists (run: go run ./cmd/quadwright docs --out docs/)", name)
		}
	}
	if _, ok := fresh["quadwright_export.md"]; !ok {
		t.Error("no page for export")
	}
}

func mdFiles(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	out := map[string][]byte{}
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), docsPrefix) && strings.HasSuffix(e.Name(), ".md") {
			data, err := os.ReadFile(filepath.Join(dir, e.Name()))
			if err != nil {
				t.Fatal(err)
			}
			out[e.Name()] = data
		}
	}
	return out
}

func TestDocsKeepsOtherFilesAndDropsStalePages(t *testing.T) {
	dir := t.TempDir()
	os.MkdirAll(filepath.Join(dir, "ref"), 0o755)
	os.WriteFile(filepath.Join(dir, "ref", "quadwright_gone.md"), []byte("old"), 0o644)
	os.WriteFile(filepath.Join(dir, "ref", "notes.md"), []byte("mine"), 0o644)
	out, errs, code := run(t, dir, "docs", "--out", "ref")
	if code != 0 || !strings.Contains(out, "pages of the command reference") {
		t.Fatalf("exit %d: %s %s", code, out, errs)
	}
	if _, err := os.Stat(filepath.Join(dir, "ref", "quadwright_gone.md")); err == nil {
		t.Error("stale page kept")
	}
	if _, err := os.Stat(filepath.Join(dir, "ref", "notes.md")); err != nil {
		t.Error("a file that is not a page was removed")
	}
	entries, _ := os.ReadDir(filepath.Join(dir, "ref"))
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".") {
			t.Errorf("temporary %s left behind", e.Name())
		}
	}
}

// exitNote lets an example line say that it exits with a status other than
// 0, as in "quadwright audit poor.txt --fail-on negative   # exits 2".
var exitNote = regexp.MustCompile(`#\s*exits\s+(\d+)\s*$`)

// TestHelpExamplesRun runs every line of every command's Example block, in
// order, in a fresh folder per command, with the program under test first
// on PATH: an example in the help must really run. Lines of one command
// share the folder, so an example may use a file that an earlier line of
// the same block wrote; the folder starts with a copy of the repository's
// specs/, so that examples may name the shipped spec files as a user in a
// clone would.
func TestHelpExamplesRun(t *testing.T) {
	bin := filepath.Dir(binary)
	var visit func(c *cobra.Command)
	var cmds []*cobra.Command
	visit = func(c *cobra.Command) {
		cmds = append(cmds, c)
		for _, s := range c.Commands() {
			visit(s)
		}
	}
	visit(newRootCommand())
	ran := 0
	for _, c := range cmds {
		if strings.TrimSpace(c.Example) == "" {
			continue
		}
		dir := t.TempDir()
		if err := os.CopyFS(filepath.Join(dir, "specs"), os.DirFS(filepath.Join("..", "..", "specs"))); err != nil && !os.IsNotExist(err) {
			t.Fatal(err)
		}
		for _, line := range strings.Split(c.Example, "\n") {
			line = strings.TrimSpace(line)
			if line == "" || strings.HasPrefix(line, "#") {
				continue
			}
			want := 0
			if m := exitNote.FindStringSubmatch(line); m != nil {
				want, _ = strconv.Atoi(m[1])
			}
			sh := exec.Command("sh", "-c", line)
			sh.Dir = dir
			sh.Env = append(os.Environ(), "PATH="+bin+string(os.PathListSeparator)+os.Getenv("PATH"), "TMPDIR="+dir)
			out, err := sh.CombinedOutput()
			code := 0
			if ee, ok := err.(*exec.ExitError); ok {
				code = ee.ExitCode()
			} else if err != nil {
				t.Fatal(err)
			}
			if code != want {
				t.Errorf("%s: example %q exited %d, want %d:\n%s", c.CommandPath(), line, code, want, out)
			}
			ran++
		}
	}
	if ran < 5 {
		t.Errorf("only %d example lines found", ran)
	}
}

func TestCompletionVersionHelp(t *testing.T) {
	dir := t.TempDir()
	for shell, marker := range map[string]string{"bash": "bash completion", "zsh": "#compdef quadwright", "fish": "complete -c quadwright", "powershell": "Register-ArgumentCompleter"} {
		out, errs, code := run(t, dir, "completion", shell)
		if code != 0 || !strings.Contains(out, marker) {
			t.Errorf("completion %s: exit %d %s, output lacks %q", shell, code, errs, marker)
		}
	}
	out, _, code := run(t, dir, "--version")
	if code != 0 || strings.TrimSpace(out) != "quadwright version "+version {
		t.Errorf("--version: exit %d %q", code, out)
	}
	out, _, code = run(t, dir, "help", "export")
	if code != 0 || !strings.Contains(out, "quadwright export gauss5.json --to c -o gauss5.h") || !strings.Contains(out, "--to string") {
		t.Errorf("help export: exit %d\n%s", code, out)
	}
	out, _, code = run(t, dir, "--help")
	for _, name := range []string{"build", "export", "demo", "docs", "completion"} {
		if code != 0 || !regexp.MustCompile(`(?m)^  `+name+` `).MatchString(out) {
			t.Errorf("--help does not list %s:\n%s", name, out)
		}
	}
	// Completion of flag values: --to offers the languages.
	out, _, _ = run(t, dir, "__complete", "export", "r.json", "--to", "")
	for _, lang := range []string{"c", "fortran", "julia"} {
		if !regexp.MustCompile(`(?m)^` + lang + `$`).MatchString(out) {
			t.Errorf("completion of --to lacks %s:\n%s", lang, out)
		}
	}
}
