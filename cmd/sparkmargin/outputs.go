package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// withOutputs checks a rerun command's -o and --json (checkOutputs) and runs
// it with its summary on summaryOut.
func withOutputs(c *cobra.Command, inputs []outfile.NamedPath, book, json string, run func(out io.Writer) error) error {
	if err := checkOutputs(inputs, []outputFlag{{"-o", book}}, []outputFlag{{"--json", json}}); err != nil {
		return err
	}
	return run(summaryOut(c.OutOrStdout(), c.ErrOrStderr(), json))
}

// outputFlag is an output path with the flag that gave it, for the checks of
// checkOutputs.
type outputFlag struct {
	flag, path string
}

// workbookExts and jsonExts are the extensions that say a file's format; a
// path with the other format's extension is a usage error, any other
// extension is the user's choice.
var (
	workbookExts = []string{".xlsx", ".xlsm", ".xls"}
	jsonExts     = []string{".json"}
)

// checkOutputs refuses, as a usage error (exit 2) naming the flag, an output
// that reaches an input or another output (outfile.RefuseClashes, said first:
// it is the graver mistake), a workbook path given as "-" (a workbook cannot
// go to standard output), a workbook path with a .json extension, and a JSON
// path with a workbook extension. With no inputs (several surveys, whose -o
// and --json name folders that AssessMany checks file by file) only the
// formats are checked.
func checkOutputs(inputs []outfile.NamedPath, books, jsons []outputFlag) error {
	var outs []outfile.NamedPath
	for _, o := range append(append([]outputFlag(nil), books...), jsons...) {
		outs = append(outs, outfile.NamedPath{Role: o.flag, Path: o.path})
	}
	if inputs != nil {
		if err := outfile.RefuseClashes(inputs, outs); err != nil {
			return err
		}
	}
	for _, b := range books {
		switch {
		case outfile.IsStdout(b.path):
			return withCode(exitUsage, fmt.Errorf("%s -: a workbook cannot be written to standard output; give a .xlsx file name (only --json takes - for standard output)", b.flag))
		case hasExt(b.path, jsonExts):
			return withCode(exitUsage, fmt.Errorf("%s %s: %s writes a workbook (.xlsx), not JSON; give the JSON file to --json and a .xlsx name to %s", b.flag, b.path, b.flag, b.flag))
		}
	}
	for _, j := range jsons {
		if hasExt(j.path, workbookExts) {
			return withCode(exitUsage, fmt.Errorf("%s %s: %s writes JSON, not a workbook; give the workbook file to -o and a .json name (or - for standard output) to %s", j.flag, j.path, j.flag, j.flag))
		}
	}
	return nil
}

// checkHTML refuses, as a usage error, an HTML report path that is standard
// output, has a workbook or JSON extension, or is given with several surveys.
func checkHTML(path string, several bool) error {
	switch {
	case path == "":
		return nil
	case several:
		return withCode(exitUsage, fmt.Errorf("--html %s: the HTML report is written for one survey; assess the surveys one by one to get one report each", path))
	case outfile.IsStdout(path):
		return withCode(exitUsage, fmt.Errorf("--html -: give the HTML report a file name (e.g. report.html)"))
	case hasExt(path, workbookExts) || hasExt(path, jsonExts):
		return withCode(exitUsage, fmt.Errorf("--html %s: --html writes an HTML page, not a workbook or JSON; give it a .html name", path))
	}
	return nil
}

// isJSON: the path names a JSON file (compare takes an audit JSON for a side).
func isJSON(path string) bool { return strings.EqualFold(filepath.Ext(path), ".json") }

func hasExt(path string, exts []string) bool {
	ext := filepath.Ext(path)
	for _, e := range exts {
		if strings.EqualFold(ext, e) {
			return true
		}
	}
	return false
}

// summaryOut is where a command's terminal summary goes: standard error when
// a JSON output goes to standard output (which must then hold the JSON only),
// else standard output.
func summaryOut(out, errOut io.Writer, jsonPaths ...string) io.Writer {
	for _, p := range jsonPaths {
		if outfile.IsStdout(p) {
			return errOut
		}
	}
	return out
}
