package main

import (
	"io"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

func renderString(s string) func(w *strings.Builder) error {
	return func(w *strings.Builder) error { w.WriteString(s); return nil }
}

// TestOutputOntoFIFO: a FIFO is written in place: the reader at its other
// end gets the bytes and the FIFO is still a FIFO afterwards (issue 19,
// item 7; never tried on /dev/null itself).
func TestOutputOntoFIFO(t *testing.T) {
	p := filepath.Join(t.TempDir(), "pipe")
	if err := syscall.Mkfifo(p, 0o644); err != nil {
		t.Skipf("no FIFO here: %v", err)
	}
	got := make(chan string)
	go func() {
		f, err := os.Open(p)
		if err != nil {
			got <- "open: " + err.Error()
			return
		}
		b, _ := io.ReadAll(f)
		f.Close()
		got <- string(b)
	}()
	if err := writeOutput(p, nil, renderString("through the pipe\n")); err != nil {
		t.Fatal(err)
	}
	if s := <-got; s != "through the pipe\n" {
		t.Errorf("reader got %q", s)
	}
	if st, err := os.Lstat(p); err != nil || st.Mode()&os.ModeNamedPipe == 0 {
		t.Errorf("the FIFO was replaced: %v %v", st.Mode(), err)
	}
}

// TestOutputOntoSymlink: the link is followed and its target replaced;
// the link stays a link. A dangling link creates its target; a loop is an
// error naming -o.
func TestOutputOntoSymlink(t *testing.T) {
	dir := t.TempDir()
	sub := filepath.Join(dir, "rules")
	os.Mkdir(sub, 0o755)
	target := filepath.Join(sub, "g.txt")
	os.WriteFile(target, []byte("old\n"), 0o640)
	link := filepath.Join(dir, "latest")
	if err := os.Symlink("rules/g.txt", link); err != nil {
		t.Skipf("no symbolic links here: %v", err)
	}
	if err := writeOutput(link, nil, renderString("new\n")); err != nil {
		t.Fatal(err)
	}
	if st, err := os.Lstat(link); err != nil || st.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the link was replaced: %v %v", st.Mode(), err)
	}
	if b, _ := os.ReadFile(target); string(b) != "new\n" {
		t.Errorf("target holds %q", b)
	}
	if st, _ := os.Stat(target); st.Mode().Perm() != 0o640 {
		t.Errorf("target mode %v, want 0640 kept", st.Mode().Perm())
	}
	if left, _ := filepath.Glob(filepath.Join(dir, ".*tmp-*")); len(left) > 0 {
		t.Errorf("temporary files left: %v", left)
	}
	dangling := filepath.Join(dir, "next")
	os.Symlink(filepath.Join(sub, "h.txt"), dangling)
	if err := writeOutput(dangling, nil, renderString("h\n")); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(filepath.Join(sub, "h.txt")); string(b) != "h\n" {
		t.Errorf("dangling link's target holds %q", b)
	}
	loop := filepath.Join(dir, "loop")
	os.Symlink("loop", loop)
	if err := writeOutput(loop, nil, renderString("x")); err == nil || !strings.Contains(err.Error(), "-o ") {
		t.Errorf("link loop: %v", err)
	}
}

// TestOutputOntoReadOnlyFile: an existing file keeps its permission bits;
// a read-only one is replaced atomically (the folder is writable) and
// stays read-only.
func TestOutputOntoReadOnlyFile(t *testing.T) {
	p := filepath.Join(t.TempDir(), "ro.txt")
	os.WriteFile(p, []byte("old\n"), 0o444)
	os.Chmod(p, 0o444)
	if err := writeOutput(p, nil, renderString("new\n")); err != nil {
		t.Fatal(err)
	}
	st, err := os.Stat(p)
	if err != nil || st.Mode().Perm() != 0o444 || !st.Mode().IsRegular() {
		t.Errorf("mode %v %v, want a regular file at 0444", st.Mode(), err)
	}
	if b, _ := os.ReadFile(p); string(b) != "new\n" {
		t.Errorf("file holds %q", b)
	}
	// A new file is 0644; a folder is refused.
	q := filepath.Join(filepath.Dir(p), "fresh.txt")
	if err := writeOutput(q, nil, renderString("x")); err != nil {
		t.Fatal(err)
	}
	if st, _ := os.Stat(q); st.Mode().Perm() != 0o644 {
		t.Errorf("new file mode %v", st.Mode().Perm())
	}
	if err := writeOutput(filepath.Dir(p), nil, renderString("x")); err == nil || !strings.Contains(err.Error(), "folder") {
		t.Errorf("folder: %v", err)
	}
}
