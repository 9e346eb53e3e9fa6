package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
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
func writeAtomic(path string, write func(w io.Writer) error) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("-o %s: cannot write there (%v)", path, unwrapPathError(err))
	}
	name := tmp.Name()
	// CreateTemp makes the file private (0600); a rule file is ordinary
	// output, readable like any file the user's tools write.
	werr := tmp.Chmod(0o644)
	if werr == nil {
		werr = write(tmp)
	}
	cerr := tmp.Close()
	if werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Rename(name, path)
	}
	if werr != nil {
		os.Remove(name)
		return fmt.Errorf("-o %s: writing failed (%v)", path, unwrapPathError(werr))
	}
	return nil
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
