package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/outfile"
)

type demoOptions struct {
	ws  *outfile.Workspace
	dir string
}

func newDemoCmd(ws *outfile.Workspace) *cobra.Command {
	o := demoOptions{ws: ws}
	c := &cobra.Command{
		Use:   "demo",
		Short: "Write the embedded demo survey of an invented plant and its audit",
		Long: "demo writes the demo survey (an invented solvent-based coating and converting line) and its audit\n" +
			"workbook, JSON and HTML report (demo-survey-audit.html, open it in a browser) into DIR (default: the current\n" +
			"folder), prints the ranked stations, and says what to open.",
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, args []string) error {
			return runDemo(c.OutOrStdout(), c.ErrOrStderr(), o)
		},
	}
	c.Flags().StringVarP(&o.dir, "output", "o", ".", "folder to write the demo files into")
	return c
}

func runDemo(out, errOut io.Writer, o demoOptions) error {
	if err := os.MkdirAll(o.dir, 0o755); err != nil {
		return withCode(exitUsage, fmt.Errorf("creating %s: %w", o.dir, err))
	}
	data, err := inventory.DemoSurveyBytes()
	if err != nil {
		return fmt.Errorf("building the demo survey: %w", err)
	}
	survey := filepath.Join(o.dir, "demo-survey.xlsx")
	if err := o.ws.WriteFile(survey, func(w io.Writer) error { _, err := w.Write(data); return err }); err != nil {
		return withCode(exitUsage, fmt.Errorf("writing the demo survey: %w", err))
	}
	xlsx := filepath.Join(o.dir, "demo-survey-audit.xlsx")
	jsonPath := filepath.Join(o.dir, "demo-survey-audit.json")
	htmlPath := filepath.Join(o.dir, "demo-survey-audit.html")
	fmt.Fprintf(out, "Demo survey of an invented plant: %s\n\n", survey)
	return runAssess(out, errOut, assessOptions{ws: o.ws, survey: survey, output: xlsx, json: jsonPath, html: htmlPath,
		args: []string{"sparkmargin", "demo", "-o", o.dir}})
}
