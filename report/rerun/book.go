package rerun

// Workbook plumbing of the rerun workbooks. Cell styles, tables, print setup
// and the Method, Cautions and Rejected sheets are package report's (audit.Book),
// so the rerun workbooks look like the audit's and carry the audit's sheets.

import (
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/xuri/excelize/v2"
)

// RunInfo identifies the run for the Method sheet.
type RunInfo struct {
	ToolVersion string
	CommandLine string
	// TmpDir is the folder of the temporary file the workbook is written
	// through before its canonical copy ("" for the system's).
	TmpDir string
}

// Short names of report's cell constructors, so the sheet code reads as rows.
func tx(s string) audit.Cell { return audit.TextCell(s) }
func ct(s string) audit.Cell { return audit.CodeCell(s) }
func wr(s string) audit.Cell { return audit.WrapCell(s) }
func in(n int) audit.Cell    { return audit.CountCell(n) }

// vd is a verdict cell from the verdict's spelling ("" is an empty cell).
func vd(v string) audit.Cell {
	for _, x := range []assess.Verdict{assess.Incendive, assess.Marginal, assess.NonIncendive, assess.NotAssessed} {
		if v == x.String() {
			return audit.VerdictCell(x)
		}
	}
	return audit.TextCell(v)
}

// rerunBook is one rerun workbook: report's Book plus the document properties.
type rerunBook struct {
	*audit.Book
	f      *excelize.File
	err    error
	site   string
	date   string
	tmpDir string
}

// newBook starts a workbook whose first sheet is first. Audit a gives the site,
// the survey date and the Method sheet; heading is the page-header text.
func newBook(a *assess.Audit, info RunInfo, first, heading string) *rerunBook {
	if a == nil {
		a = &assess.Audit{}
	}
	if a.Survey == nil {
		a = &assess.Audit{Survey: &inventory.Survey{}}
	}
	s := a.Survey
	b := &rerunBook{f: excelize.NewFile(), site: "site not named", date: "not given", tmpDir: info.TmpDir}
	b.Book = audit.NewBook(b.f, a, audit.RunInfo{ToolVersion: info.ToolVersion, CommandLine: info.CommandLine,
		SurveyFile: s.Path, SurveySHA256: s.SHA256}, heading)
	if s.Site.Name != "" {
		b.site = s.Site.Name
	}
	when := time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)
	if !s.Site.SurveyDate.IsZero() {
		when = s.Site.SurveyDate.UTC()
		b.date = when.Format("2006-01-02")
	}
	b.check(b.f.SetSheetName("Sheet1", first))
	stamp := when.Format(time.RFC3339)
	b.check(b.f.SetDocProps(&excelize.DocProperties{Creator: "sparkmargin", Created: stamp, Modified: stamp, Title: b.site}))
	return b
}

func (b *rerunBook) check(err error) {
	if err != nil && b.err == nil {
		b.err = err
	}
}

func (b *rerunBook) write(w io.Writer) error {
	defer b.f.Close()
	if b.err == nil {
		b.err = b.Err()
	}
	if b.err != nil {
		return fmt.Errorf("workbook: %w", b.err)
	}
	b.f.SetActiveSheet(0)
	// Canonical order, as the audit: the same rerun gives the same bytes.
	if err := book.WriteCanonical(b.f, w, b.tmpDir); err != nil {
		return fmt.Errorf("workbook: %w", err)
	}
	return nil
}

func quoteSheet(s string) string { return "'" + strings.ReplaceAll(s, "'", "''") + "'" }

func chartTitle(s string, size float64) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s, Font: &excelize.Font{Size: size, Bold: size > 10, Color: "000000"}}}}
}
