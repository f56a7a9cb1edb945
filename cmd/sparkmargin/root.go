package main

import (
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// version is set at build time with -ldflags "-X main.version=..."; the default names the source tree.
var version = "0.1.0-dev"

// Exit codes.
const (
	exitOK       = 0
	exitProblems = 1 // the survey has problems (or nothing could be assessed)
	exitUsage    = 2 // usage error or unreadable input
	// exitInterrupted: stopped by SIGINT or SIGTERM; temporary files removed,
	// the outputs not yet renamed into place keep their previous files.
	exitInterrupted = 130
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

// exitCodeOf maps the report pipeline's failure classes to exit codes.
func exitCodeOf(k report.Failure) int {
	if k == report.Problems {
		return exitProblems
	}
	return exitUsage
}

// silentExit asks for an exit code without printing anything more (the command printed its own report).
func silentExit(code int) error { return &exitError{code: code} }

func newRootCmd(stdout, stderr io.Writer, ws *outfile.Workspace) *cobra.Command {
	return newRootCmdASCII(stdout, stderr, ws, nil)
}

// newRootCmdASCII is newRootCmd with the --ascii flag bound to ascii (nil:
// the flag is accepted and ignored, for tests that build the commands alone).
func newRootCmdASCII(stdout, stderr io.Writer, ws *outfile.Workspace, ascii *bool) *cobra.Command {
	if ascii == nil {
		ascii = new(bool)
	}
	root := &cobra.Command{
		Use:           "sparkmargin",
		Short:         "Screen static-electricity ignition hazards from a line-survey workbook",
		Long:          "sparkmargin reads a line-survey workbook of charged objects, estimates fields, potentials and discharge energies,\ncompares them with the site's ignition limits and writes a ranked audit workbook.\nAll figures are screening estimates: defer to local codes, the site's hazardous-area classification and a competent person.",
		Version:       version,
		SilenceErrors: true,
		SilenceUsage:  true,
	}
	root.PersistentFlags().BoolVar(ascii, "ascii", false,
		"spell µ, Ω, ², ° as u, ohm, ^2, deg on the terminal (also "+asciiEnv+"=1; workbooks and JSON keep the signs)")
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.AddCommand(newTemplateCmd(ws), newCheckCmd(ws), newAssessCmd(ws), newDemoCmd(ws), newLibraryCmd(), newWhatifCmd(ws), newSweepCmd(ws), newCompareCmd(ws))
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return withCode(exitUsage, fmt.Errorf("%w\nrun '%s --help' for usage", err, c.CommandPath()))
	})
	return root
}

// run executes the command line and returns the process exit code, printing
// any error once. Every temporary file of the run belongs to one workspace,
// removed on the way out and on SIGINT or SIGTERM (onInterrupt).
func run(args []string, stdout, stderr io.Writer) int {
	ws := outfile.NewWorkspace("")
	ws.SetStdout(stdout) // outputs given as "-": JSON, written as it is
	// The terminal text, in ASCII where the console cannot show µ and Ω.
	var ascii bool
	env := os.Getenv(asciiEnv)
	outASCII := asciiMode(false, env, func() bool { return nativeASCIIFor(stdout) })
	errASCII := asciiMode(false, env, func() bool { return nativeASCIIFor(stderr) })
	stdout = &asciiWriter{w: stdout, on: func() bool { return ascii || outASCII }}
	stderr = &asciiWriter{w: stderr, on: func() bool { return ascii || errASCII }}
	stop := onInterrupt(ws, stderr)
	defer stop()     // second: the handler stays until the workspace is gone
	defer ws.Close() // first
	root := newRootCmdASCII(stdout, stderr, ws, &ascii)
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
	var re *report.Error
	if errors.As(err, &re) {
		fmt.Fprintln(stderr, "sparkmargin:", err)
		return exitCodeOf(re.Kind)
	}
	// cobra's own errors (unknown command, bad args) are usage errors.
	fmt.Fprintln(stderr, "sparkmargin:", err)
	return exitUsage
}
