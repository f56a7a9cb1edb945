package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/sparkmargin/sparkmargin/templates"
)

type templateOptions struct {
	ws    *outfile.Workspace
	path  string
	force bool
}

func newTemplateCmd(ws *outfile.Workspace) *cobra.Command {
	o := templateOptions{ws: ws}
	c := &cobra.Command{
		Use:   "template FILE.xlsx",
		Short: "Write a blank survey workbook to fill in on the floor",
		Long: "template writes a blank line-survey workbook: the sheets Site, Atmospheres, Stations, Objects and\n" +
			"Materials, with units in the headers, an input hint on every header and drop-down lists.",
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.path = args[0]
			return runTemplate(c.OutOrStdout(), o)
		},
	}
	c.Flags().BoolVarP(&o.force, "force", "f", false, "overwrite FILE if it exists")
	return c
}

func runTemplate(out io.Writer, o templateOptions) error {
	if err := refuseExisting(o.path, o.force); err != nil {
		return err
	}
	var mats, subs []string
	for _, m := range inventory.BuiltinMaterials() {
		mats = append(mats, m.Name)
	}
	for _, s := range inventory.BuiltinSubstances() {
		subs = append(subs, s.Name)
	}
	err := o.ws.WriteFile(o.path, func(w io.Writer) error {
		return inventory.WriteTemplate(w, inventory.TemplateOptions{Materials: mats, Substances: subs, Cautions: templates.Cautions()})
	})
	if err != nil {
		return withCode(exitUsage, err)
	}
	fmt.Fprintf(out, "Wrote the blank survey %s: fill in Site, Atmospheres, Stations and Objects, then run 'sparkmargin check %s'.\n", o.path, o.path)
	return nil
}
