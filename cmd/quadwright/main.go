// Command quadwright designs, verifies and audits quadrature rules.
//
// The command layer only parses flags into plain option structs, calls the
// library packages and prints; see DEVELOPERS.md for the architecture.
package main

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/signal"
	"syscall"
)

// version is the program version printed by --version and stamped into
// every rule file.
const version = "0.1.0"

// Exit statuses (../shared/CONTRACT.md): 0 success, 1 usage or input
// error, 2 a computed result failed a threshold the user asked to enforce.
const (
	exitInput     = 1
	exitThreshold = 2
)

// thresholdError marks a failure that exits with status 2.
type thresholdError struct{ msg string }

func (e *thresholdError) Error() string { return e.msg }

func main() {
	// Ctrl-C cancels the context; the library stops at its next check and
	// no output file is written (files are renamed into place only when
	// complete).
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	root := newRootCommand()
	if err := root.ExecuteContext(ctx); err != nil {
		if errors.Is(err, context.Canceled) {
			err = errors.New("interrupted; nothing was written")
		}
		fmt.Fprintln(os.Stderr, "quadwright: "+err.Error())
		var te *thresholdError
		if errors.As(err, &te) {
			os.Exit(exitThreshold)
		}
		os.Exit(exitInput)
	}
}
