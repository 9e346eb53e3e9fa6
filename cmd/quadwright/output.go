package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"syscall"
)

// writeOutput renders with render and sends the result to stdout, or, when
// path is set, to path through a temporary file in the same folder that is
// renamed into place only once everything was written: a failure leaves no
// partial file behind.
func writeOutput(path string, stdout io.Writer, render func(w *strings.Builder) error) error {
	var b strings.Builder
	if err := render(&b); err != nil {
		return err
	}
	if path == "" {
		_, err := io.WriteString(stdout, b.String())
		return err
	}
	return writeFileAtomic(path, []byte(b.String()))
}

// writeFileAtomic writes data to path by way of a temporary file and a rename.
func writeFileAtomic(path string, data []byte) error {
	return writeAtomic(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// writeAtomic calls write on a temporary file in path's folder and renames
// it to path once write and the close succeeded; otherwise it removes it.
//
// What path already is decides where the bytes go. A symbolic link is
// followed (resolveLinks) and its final target replaced, so the link stays
// a link. A device, FIFO or socket is written in place, as a shell's
// redirection would: renaming over it would replace, say, a terminal with a
// regular file. An existing regular file is replaced with its permission
// bits (and, where allowed, its owner and group) kept: a read-only file
// stays read-only. The rename needs write permission on the folder only,
// as for any atomic save.
func writeAtomic(path string, write func(w io.Writer) error) error {
	target, err := resolveLinks(path)
	if err != nil {
		return fmt.Errorf("-o %s: %v", path, err)
	}
	// CreateTemp makes the file private (0600); a rule file is ordinary
	// output, readable like any file the user's tools write.
	mode := os.FileMode(0o644)
	var owner *syscall.Stat_t
	if st, err := os.Stat(target); err == nil {
		switch {
		case st.IsDir():
			return fmt.Errorf("-o %s: is a folder; name a file", path)
		case !st.Mode().IsRegular():
			return writeInPlace(path, target, write)
		}
		mode = st.Mode().Perm()
		owner, _ = st.Sys().(*syscall.Stat_t)
	}
	dir := filepath.Dir(target)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(target)+".tmp-*")
	if err != nil {
		return fmt.Errorf("-o %s: cannot write there (%v)", path, unwrapPathError(err))
	}
	name := tmp.Name()
	werr := tmp.Chmod(mode)
	if owner != nil {
		// Best effort: only root may give a file away; anyone else keeps
		// their own ownership, as any editor's save would.
		tmp.Chown(int(owner.Uid), int(owner.Gid))
	}
	if werr == nil {
		werr = write(tmp)
	}
	cerr := tmp.Close()
	if werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Rename(name, target)
	}
	if werr != nil {
		os.Remove(name)
		return fmt.Errorf("-o %s: writing failed (%v)", path, unwrapPathError(werr))
	}
	return nil
}

// writeInPlace writes to a device, FIFO or socket as it stands (no
// truncation, no rename). Nothing can be taken back from such a target, so
// the render already happened before: only the write itself can fail here.
func writeInPlace(path, target string, write func(w io.Writer) error) error {
	f, err := os.OpenFile(target, os.O_WRONLY, 0)
	if err != nil {
		return fmt.Errorf("-o %s: cannot write there (%v)", path, unwrapPathError(err))
	}
	werr := write(f)
	if cerr := f.Close(); werr == nil {
		werr = cerr
	}
	if werr != nil {
		return fmt.Errorf("-o %s: writing failed (%v)", path, unwrapPathError(werr))
	}
	return nil
}

// maxLinkHops bounds a chain of symbolic links (the kernel's own limit is 40).
const maxLinkHops = 40

// resolveLinks follows path while it is a symbolic link and returns the
// final name, which need not exist yet (a dangling link names the file to
// create). A relative target is taken from the link's own folder.
func resolveLinks(path string) (string, error) {
	for hops := 0; ; hops++ {
		st, err := os.Lstat(path)
		if err != nil || st.Mode()&os.ModeSymlink == 0 {
			return path, nil
		}
		if hops == maxLinkHops {
			return "", fmt.Errorf("more than %d symbolic links in a row (a loop?)", maxLinkHops)
		}
		to, err := os.Readlink(path)
		if err != nil {
			return "", fmt.Errorf("cannot read the symbolic link (%v)", unwrapPathError(err))
		}
		if !filepath.IsAbs(to) {
			to = filepath.Join(filepath.Dir(path), to)
		}
		path = to
	}
}

func unwrapPathError(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	if le, ok := err.(*os.LinkError); ok {
		return le.Err
	}
	return err
}
