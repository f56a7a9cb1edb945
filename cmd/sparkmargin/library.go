package main

import (
	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/report/library"
)

type libraryOptions struct {
	json bool // the library as JSON on standard output
}

func newLibraryCmd() *cobra.Command {
	var o libraryOptions
	c := &cobra.Command{
		Use:   "library [--json]",
		Short: "List the built-in materials, substances and limits with their sources",
		Long: "library lists the built-in materials, substances and limits with their sources, and the Site sheet\n" +
			"items that override a limit. --json writes the same as JSON, each limit in SI and in the practical\n" +
			"unit of the Site item that overrides it.",
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, args []string) error {
			if o.json {
				return library.WriteJSON(rawOut(c.OutOrStdout())) // JSON keeps its signs
			}
			library.WriteText(c.OutOrStdout(), tabbed)
			return nil
		},
	}
	c.Flags().BoolVar(&o.json, "json", false, "write the library as JSON to standard output")
	return c
}
