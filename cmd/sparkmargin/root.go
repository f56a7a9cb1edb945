package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"
)

// version is set at build time with -ldflags "-X main.version=..."; the default names the source tree.
var version = "0.1.0-dev"

// Exit codes.
const (
	exitOK       = 0
	exitProblems = 1 // the survey has problems (or nothing could be assessed)
	exitUsage    = 2 // usage error or unreadable input
)

// exitError carries an exit code with the error message printed once.
type exitError struct {
	code int
	err  error
}

func (e *exitError) Error() string { return e.err.Error() }
func (e *exitError) Unwrap() error { return e.err }

// withCode wraps err so that the command exits with code.
func withCode(code int, err error) error {
	if err == nil {
		return nil
	}
	return &exitError{code: code, err: err}
}

// silentExit asks for an exit code without printing anything more (the command printed its own report).
func silentExit(code int) error { return &exitError{code: code} }

func newRootCmd(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:           "sparkmargin",
		Short:         "Screen static-electricity ignition hazards from a line-survey workbook",
		Long:          "sparkmargin reads a line-survey workbook of charged objects, estimates fields, potentials and discharge energies,\ncompares them with the site's ignition limits and writes a ranked audit workbook.\nAll figures are screening estimates: defer to local codes, the site's hazardous-area classification and a competent person.",
		Version:       version,
		SilenceErrors: true,
		SilenceUsage:  true,
	}
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.AddCommand(newTemplateCmd(), newCheckCmd(), newAssessCmd(), newDemoCmd(), newLibraryCmd(), newWhatifCmd(), newSweepCmd(), newCompareCmd())
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return withCode(exitUsage, fmt.Errorf("%w\nrun '%s --help' for usage", err, c.CommandPath()))
	})
	return root
}

// run executes the command line and returns the process exit code, printing any error once.
func run(args []string, stdout, stderr io.Writer) int {
	root := newRootCmd(stdout, stderr)
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return exitOK
	}
	var ee *exitError
	if errors.As(err, &ee) {
		if ee.err != nil {
			fmt.Fprintln(stderr, "sparkmargin:", ee.err)
		}
		return ee.code
	}
	// cobra's own errors (unknown command, bad args) are usage errors.
	fmt.Fprintln(stderr, "sparkmargin:", err)
	return exitUsage
}
