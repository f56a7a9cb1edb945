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
	ws     *outfile.Workspace
	path   string
	output string // -o, the same file as the positional argument
	force  bool
}

func newTemplateCmd(ws *outfile.Workspace) *cobra.Command {
	o := templateOptions{ws: ws}
	c := &cobra.Command{
		Use:   "template FILE.xlsx | -o FILE.xlsx",
		Short: "Write a blank survey workbook to fill in on the floor",
		Long: "template writes a blank line-survey workbook: the sheets Site, Atmospheres, Stations, Objects and\n" +
			"Materials, with units in the headers, an input hint on every header and drop-down lists.\n" +
			"The file is given as the argument or with -o, as for every other writer; not both.",
		Args: cobra.MaximumNArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			switch {
			case len(args) == 1 && o.output != "":
				return withCode(exitUsage, fmt.Errorf("template: the file is given twice (%s and -o %s): give it once", args[0], o.output))
			case len(args) == 1:
				o.path = args[0]
			case o.output != "":
				o.path = o.output
			default:
				return withCode(exitUsage, fmt.Errorf("template: name the file to write (template FILE.xlsx or template -o FILE.xlsx)"))
			}
			return runTemplate(c.OutOrStdout(), o)
		},
	}
	c.Flags().StringVarP(&o.output, "output", "o", "", "blank survey workbook to write (the same as the FILE argument)")
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
