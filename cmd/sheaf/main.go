// Command sheaf turns a folder of Markdown calculation sheets into a
// reviewable calculation package.
//
// Exit codes: 0 all good; 1 a check failed; 2 errors in sheets or usage.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime/debug"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/internal/version"
)

// Exit codes, as the README documents them.
const (
	exitOK          = 0
	exitCheckFailed = 1
	exitErrors      = 2
)

// exitCode carries a command's exit status out of cobra.
type exitCode int

func (e exitCode) Error() string { return fmt.Sprintf("exit status %d", int(e)) }

// gcPercent is the garbage collector's target that sheaf sets unless GOGC
// says otherwise: the heap may grow to one and a half times what is live
// rather than twice, at the cost of collecting about twice as often. sheaf sets no limit
// on the heap: a fixed soft limit (240 MiB until 2026-12-02) made the
// collector run without pause once a package's live data passed it, and
// a package of 4,000 sheets cost ten times one of 1,000 (BENCHMARKS.md).
const gcPercent = 50

func main() {
	if os.Getenv("GOGC") == "" {
		debug.SetGCPercent(gcPercent)
	}
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// run executes the command line and returns the exit code; tests call it
// directly.
func run(args []string, stdout, stderr io.Writer) int {
	root := newRoot(stdout, stderr)
	root.SetArgs(args)
	err := root.Execute()
	var code exitCode
	switch {
	case err == nil:
		return exitOK
	case errors.As(err, &code):
		return int(code)
	default:
		fmt.Fprintln(stderr, "sheaf:", err)
		return exitErrors
	}
}

func newRoot(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:           "sheaf",
		Short:         "Turn Markdown calculation sheets into a reviewable, unit-checked calculation package",
		Version:       version.Version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.CompletionOptions.DisableDefaultCmd = true
	root.AddCommand(buildCmd(stdout, stderr), checkCmd(stdout, stderr), auditCmd(stdout, stderr),
		diffCmd(stdout, stderr), verifyCmd(stdout, stderr), templatesCmd(stdout), unitsCmd(stdout),
		printCmd(stdout, stderr), previewCmd(stdout, stderr))
	return root
}
