package main

import (
	"errors"
	"fmt"
	"os"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// loadSurvey reads and validates a survey; an unreadable file is a usage-class error (exit 2).
func loadSurvey(ws *outfile.Workspace, path string) (*inventory.Survey, error) {
	if err := report.RequireRegular(path); err != nil {
		return nil, err
	}
	tmp, err := ws.Dir()
	if err != nil {
		return nil, withCode(exitUsage, err)
	}
	s, err := inventory.ReadFile(path, inventory.ReadOptions{TmpDir: tmp})
	if err != nil {
		if errors.Is(err, inventory.ErrUnreadable) {
			return nil, withCode(exitUsage, err)
		}
		return nil, withCode(exitUsage, fmt.Errorf("reading %s: %w", path, err))
	}
	return s, nil
}

// refuseExisting refuses to replace an existing file unless force is set.
func refuseExisting(path string, force bool) error {
	if force {
		return nil
	}
	if _, err := os.Stat(path); err == nil {
		return withCode(exitUsage, fmt.Errorf("%s already exists; choose another name or pass --force", path))
	}
	return nil
}

// commandLine rebuilds the command as run, for the Method sheet: the command path,
// the flags that were set and the arguments.
func commandLine(c *cobra.Command, args []string) []string {
	out := strings.Fields(c.CommandPath())
	c.Flags().Visit(func(f *pflag.Flag) {
		out = append(out, "--"+f.Name+"="+f.Value.String())
	})
	return append(out, args...)
}
