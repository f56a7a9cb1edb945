package audit

import (
	"errors"
	"fmt"
	"hash/fnv"
	"io"
	"strings"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
	"github.com/xuri/excelize/v2"
)

// Sheet names of the audit workbook, in order (SheetReport, first, is in report_sheet.go).
const (
	SheetSummary  = "Summary"
	SheetStations = "Stations"
	SheetObjects  = "Objects"
	SheetFindings = "Findings"
	SheetMethod   = "Method"
	SheetCautions = "Cautions"
	SheetRejected = "Rejected"
)

// Sheets returns the audit workbook's sheet names in order.
func Sheets() []string {
	return []string{SheetReport, SheetSummary, SheetStations, SheetObjects, SheetFindings, SheetMethod, SheetCautions, SheetRejected}
}

// RunInfo identifies the run that produced an audit, so an auditor can tie the
// audit to its input and to the tool that made it.
type RunInfo struct {
	ToolName     string // "sparkmargin" when empty
	ToolVersion  string // e.g. "0.4.0" or a VCS revision
	SurveyFile   string // the survey's file name as given on the command line
	SurveySHA256 string // hex SHA-256 of the survey file; "" takes Survey.SHA256
	CommandLine  string // the command as run, for the Method sheet
	// Workbook and WorkbookSHA256 name the audit workbook written with the
	// JSON and its hex SHA-256, recorded in the JSON ("workbook") so that a
	// reader can tell a JSON from a workbook of another run; empty: no record.
	Workbook       string
	WorkbookSHA256 string
	// TmpDir is the folder for the writers' temporary files (the run's
	// private folder; "" for the system's). It is written nowhere.
	TmpDir string
}

func (ri RunInfo) tool() string {
	if ri.ToolName == "" {
		return "sparkmargin"
	}
	return ri.ToolName
}

func (ri RunInfo) sha(a *assess.Audit) string {
	if ri.SurveySHA256 != "" {
		return ri.SurveySHA256
	}
	if a.Survey != nil {
		return a.Survey.SHA256
	}
	return ""
}

func (ri RunInfo) file(a *assess.Audit) string {
	if ri.SurveyFile != "" {
		return ri.SurveyFile
	}
	if a.Survey != nil {
		return a.Survey.Path
	}
	return ""
}

// surveyDate returns the survey date, or a fixed date when the survey has
// none, so that the document properties never depend on the clock.
func surveyDate(a *assess.Audit) time.Time {
	if a.Survey != nil && !a.Survey.Site.SurveyDate.IsZero() {
		return a.Survey.Site.SurveyDate.UTC()
	}
	return time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)
}

func dateText(a *assess.Audit) string {
	if a.Survey == nil || a.Survey.Site.SurveyDate.IsZero() {
		return "not given"
	}
	return a.Survey.Site.SurveyDate.UTC().Format("2006-01-02")
}

func siteName(a *assess.Audit) string {
	if a.Survey == nil || a.Survey.Site.Name == "" {
		return "site not named"
	}
	return a.Survey.Site.Name
}

// verdictOrder is the order verdicts are listed in: most severe first.
func verdictOrder() []assess.Verdict {
	return []assess.Verdict{assess.Incendive, assess.Marginal, assess.NonIncendive, assess.NotAssessed}
}

// WriteWorkbook writes the audit workbook of a to w: the sheets Summary,
// Stations, Objects, Findings, Method, Cautions and Rejected, in that order.
// Values are in engineering units with the unit in every header, stored as
// numbers with number formats; a quantity that is not defined is an empty
// cell; a value fed by an assumed default reads "est." in its cell and the
// default is listed in the object's "Defaults applied" column. Every sheet is
// set up to print: landscape, fitted to the page width (the wide Objects sheet
// to a few pages across, with its ID column repeated), header rows repeated,
// and a footer with site, survey date and page number. The document
// properties come from the survey date and the package parts are written in a
// fixed order, so the same audit gives the same cells and the same bytes.
func WriteWorkbook(w io.Writer, a *assess.Audit, info RunInfo) error {
	if a == nil || a.Survey == nil {
		return errors.New("write workbook: no audit or no survey")
	}
	f := excelize.NewFile(excelize.Options{TmpDir: info.TmpDir})
	defer func() { _ = f.Close() }()
	st := book.NewStyles(f)
	wb := &workbook{f: f, st: st, a: a, info: info, direct: true, rowsDir: info.TmpDir}
	defer wb.closeRows()

	if err := f.SetSheetName("Sheet1", Sheets()[0]); err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	for _, s := range Sheets()[1:] {
		if _, err := f.NewSheet(s); err != nil {
			return fmt.Errorf("write workbook: sheet %s: %w", s, err)
		}
	}
	if err := wb.writeSheets(true); err != nil {
		return err
	}
	if st.Err() != nil {
		return fmt.Errorf("write workbook: %w", st.Err())
	}
	f.SetActiveSheet(0)
	if err := setDocProps(f, a, info); err != nil {
		return err
	}
	rows, err := wb.finishRows()
	if err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	if err := book.WriteCanonicalRows(f, w, info.TmpDir, rows); err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	return nil
}

type workbook struct {
	f    *excelize.File
	st   *book.Styles
	a    *assess.Audit
	info RunInfo
	// stationRows is the last data row of the Stations sheet, for the chart.
	stationRows int
	// chartLabelCol and chartValueCol are the Stations columns the Summary chart reads.
	chartLabelCol, chartValueCol string
	// heading is the page-header text before the sheet name; "" is the audit's.
	heading string
	// footerDate is the page footer's centre text; "" is "Survey date " and the
	// audit's date (a portfolio gives its surveys' dates).
	footerDate string
	// methodNotes are extra sections of the Method sheet (a Book's); none in the audit.
	methodNotes []MethodNotes
	// actions are the site's actions carried from the previous audit (nil: a first run).
	actions *ActionPlan
	// direct says the streamed table sheets' data rows go through a
	// book.RowWriter (into rowsDir) and are spliced into the package when
	// it is written (finishRows, book.WriteCanonicalRows); excelize writes
	// the rest of those sheets. Off, excelize's StreamWriter writes them.
	direct  bool
	rowsDir string
	rows    map[string]*book.RowWriter
	// findingRatios is each object's ratio of energy to MIE for the objects
	// with a finding, kept by the streamed writer (which holds no objects)
	// so that the Report leads each group with its worst; nil: from a.Objects.
	findingRatios map[string]float64
}

// finishRows ends the direct rows of every streamed sheet.
func (wb *workbook) finishRows() (map[string]*book.Rows, error) {
	out := map[string]*book.Rows{}
	for sheet, rw := range wb.rows {
		rs, err := rw.Finish()
		if err != nil {
			return nil, fmt.Errorf("sheet %s: %w", sheet, err)
		}
		out[sheet] = rs
	}
	return out, nil
}

// closeRows removes the direct rows' temporary files.
func (wb *workbook) closeRows() {
	for _, rw := range wb.rows {
		_ = rw.Close()
	}
}

// footerEscape doubles '&', the header/footer control character.
func footerEscape(s string) string { return strings.ReplaceAll(s, "&", "&&") }

// printSetup makes a sheet print-ready: landscape A4, fitted to pagesWide
// pages across (1 = the page width), the given rows (and columns) repeated on
// every page, and a footer with site, survey date and page number.
func (wb *workbook) printSetup(sheet string, pagesWide int, titleRows, titleCols string) error {
	f := wb.f
	landscape := "landscape"
	a4 := 9
	tall := 0
	if err := f.SetPageLayout(sheet, &excelize.PageLayoutOptions{
		Size: &a4, Orientation: &landscape, FitToWidth: &pagesWide, FitToHeight: &tall,
	}); err != nil {
		return err
	}
	fit := true
	if err := f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
		return err
	}
	m := 0.5
	if err := f.SetPageMargins(sheet, &excelize.PageLayoutMarginsOptions{Left: &m, Right: &m, Top: &m, Bottom: &m}); err != nil {
		return err
	}
	site := footerEscape(siteName(wb.a))
	if len([]rune(site)) > 80 {
		site = string([]rune(site)[:80]) + "…"
	}
	date := "Survey date " + dateText(wb.a)
	if wb.footerDate != "" {
		date = wb.footerDate
	}
	heading := "Electrostatic screening audit"
	if wb.heading != "" {
		heading = footerEscape(wb.heading)
	}
	if err := f.SetHeaderFooter(sheet, &excelize.HeaderFooterOptions{
		OddHeader: "&L&8" + heading + ": &A&R&8" + footerEscape(wb.info.tool()+" "+wb.info.ToolVersion),
		OddFooter: "&L&8" + site + "&C&8" + footerEscape(date) + "&R&8Page &P of &N",
	}); err != nil {
		return err
	}
	var refs []string
	q := "'" + strings.ReplaceAll(sheet, "'", "''") + "'"
	if titleCols != "" {
		refs = append(refs, q+"!"+titleCols)
	}
	if titleRows != "" {
		refs = append(refs, q+"!"+titleRows)
	}
	if len(refs) > 0 {
		if err := f.SetDefinedName(&excelize.DefinedName{
			Name: "_xlnm.Print_Titles", RefersTo: strings.Join(refs, ","), Scope: sheet,
		}); err != nil {
			return err
		}
	}
	return nil
}

// tableSheetNormal writes a whole normal-mode table: header row 1, rows from 2,
// frozen header, autofilter and print setup.
func tableSheetNormal[T any](wb *workbook, sheet string, cols []book.Column[T], rows []T) error {
	return tableSheetPrinted(wb, sheet, cols, rows, 1, "")
}

// tableSheetPrinted is tableSheetNormal printed pagesWide pages across with
// titleCols ("" none) repeated on each page.
func tableSheetPrinted[T any](wb *workbook, sheet string, cols []book.Column[T], rows []T, pagesWide int, titleCols string) error {
	sink := book.NormalSink{F: wb.f, Sheet: sheet, St: wb.st}
	if err := book.SetWidths(wb.f, sheet, book.WidthsOf(cols)); err != nil {
		return err
	}
	if err := sink.Header(1, book.Headers(cols)); err != nil {
		return err
	}
	if err := wb.f.SetRowHeight(sheet, 1, 42); err != nil {
		return err
	}
	widths := book.WidthsOf(cols)
	for i, r := range rows {
		cells := book.RowCells(cols, r)
		if err := sink.Row(i+2, cells, book.RowHeight(widths, cells)); err != nil {
			return err
		}
	}
	if err := wb.f.SetPanes(sheet, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	last := len(rows) + 1
	if err := wb.f.AutoFilter(sheet, fmt.Sprintf("A1:%s%d", book.LastCol(len(cols)), last), nil); err != nil {
		return err
	}
	return wb.printSetup(sheet, pagesWide, "$1:$1", titleCols)
}

// tableSheetStream writes a table through a StreamWriter; the autofilter and
// print setup are made on the empty sheet first, which the stream keeps.
func tableSheetStream[T any](wb *workbook, sheet string, cols []book.Column[T], n int, row func(i int) T, pagesWide int, titleCols string, freezeCols int) error {
	ts, err := openTableStream(wb, sheet, cols, n, pagesWide, titleCols, freezeCols)
	if err != nil {
		return err
	}
	for i := 0; i < n; i++ {
		if err := ts.Row(row(i)); err != nil {
			return err
		}
	}
	return ts.sw.Flush()
}

// tableStream is a table sheet being written through a StreamWriter: the
// header row always, the data rows too unless direct is set (book.RowWriter).
type tableStream[T any] struct {
	sw     *excelize.StreamWriter
	sink   book.StreamSink
	direct *book.RowWriter
	cells  []book.Cell // the row being written, reused
	cols   []book.Column[T]
	widths []float64
	next   int // sheet row of the next data row
}

// openTableStream sets up a streamed table sheet for n data rows (the
// autofilter range; see the WorkbookWriter for a count known only at the end)
// and writes its header row.
func openTableStream[T any](wb *workbook, sheet string, cols []book.Column[T], n int, pagesWide int, titleCols string, freezeCols int) (*tableStream[T], error) {
	last := n + 1
	if err := wb.f.AutoFilter(sheet, fmt.Sprintf("A1:%s%d", book.LastCol(len(cols)), last), nil); err != nil {
		return nil, err
	}
	if err := wb.printSetup(sheet, pagesWide, "$1:$1", titleCols); err != nil {
		return nil, err
	}
	sw, err := wb.f.NewStreamWriter(sheet)
	if err != nil {
		return nil, err
	}
	for i, c := range cols {
		if err := sw.SetColWidth(i+1, i+1, c.Width); err != nil {
			return nil, err
		}
	}
	top, _ := excelize.CoordinatesToCellName(freezeCols+1, 2)
	pane := "bottomLeft"
	if freezeCols > 0 {
		pane = "bottomRight"
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, XSplit: freezeCols, YSplit: 1, TopLeftCell: top, ActivePane: pane}); err != nil {
		return nil, err
	}
	ts := &tableStream[T]{sw: sw, sink: book.StreamSink{SW: sw, St: wb.st}, cols: cols, widths: book.WidthsOf(cols), next: 2}
	if err := ts.sink.Header(1, book.Headers(cols)); err != nil {
		return nil, err
	}
	if wb.direct {
		rw, err := book.NewRowWriter(wb.rowsDir, wb.st)
		if err != nil {
			return nil, err
		}
		if wb.rows == nil {
			wb.rows = map[string]*book.RowWriter{}
		}
		wb.rows[sheet] = rw
		ts.direct = rw
	}
	return ts, nil
}

// row writes the next data row.
func (ts *tableStream[T]) Row(v T) error {
	if cap(ts.cells) < len(ts.cols) {
		ts.cells = make([]book.Cell, len(ts.cols))
	}
	cells := ts.cells[:len(ts.cols)]
	for i := range ts.cols {
		cells[i] = ts.cols[i].Value(v)
	}
	h := book.RowHeight(ts.widths, cells)
	var err error
	if ts.direct != nil {
		err = ts.direct.Row(ts.next, cells, h)
	} else {
		err = ts.sink.Row(ts.next, cells, h)
	}
	if err != nil {
		return err
	}
	ts.next++
	return nil
}

// Note writes a closing row that is no table row: "note" in the first
// column and the text, wrapped, in the second.
func (ts *tableStream[T]) Note(text string) error {
	cells := make([]book.Cell, len(ts.cols))
	cells[0] = book.Code("note")
	if len(cells) > 1 {
		cells[1] = book.WrapText(text)
	}
	h := book.RowHeight(ts.widths, cells)
	var err error
	if ts.direct != nil {
		err = ts.direct.Row(ts.next, cells, h)
	} else {
		err = ts.sink.Row(ts.next, cells, h)
	}
	ts.next++
	return err
}

// ---- Stations ----

type stationRow = *assess.StationResult

func stationColumns(site inventory.Site, withProbability bool) []book.Column[stationRow] {
	count := func(v assess.Verdict) func(stationRow) book.Cell {
		return func(s stationRow) book.Cell { return book.Integer(s.Counts[v]) }
	}
	cols := []book.Column[stationRow]{
		{Header: "Rank", Width: 6, Value: func(s stationRow) book.Cell { return book.Integer(s.Rank) }},
		{Header: "Station", Width: 10, Value: func(s stationRow) book.Cell { return book.Text(s.Station.ID) }},
		{Header: "Name", Width: 24, Value: func(s stationRow) book.Cell { return book.WrapText(s.Station.Name) }},
		{Header: "Line", Width: 14, Value: func(s stationRow) book.Cell { return book.WrapText(s.Station.Line) }},
		{Header: "Atmosphere", Width: 24, Value: func(s stationRow) book.Cell { return book.WrapText(atmosphereText(s.Atmosphere)) }},
		{Header: book.UnitMJ.Header("MIE"), Width: 9, Value: func(s stationRow) book.Cell {
			p := assess.ProvEntered
			if s.Atmosphere != nil && s.Atmosphere.MIEFromSubstance {
				p = assess.ProvLibrary
			}
			return marked(book.Quantity(book.UnitMJ, atmosphereMIE(s.Atmosphere)), p)
		}},
		{Header: "Zone", Width: 7, Value: func(s stationRow) book.Cell {
			if s.Atmosphere == nil {
				return book.Cell{}
			}
			if s.Atmosphere.Zone == "" {
				return book.Code("strictest " + assess.ProvEstimated.Mark()) // as assessed: unknown means the strictest zone
			}
			return marked(book.Code(s.Atmosphere.Zone), assess.ProvEntered)
		}},
		{Header: "Group", Width: 7, Value: func(s stationRow) book.Cell {
			return groupCell(s.Atmosphere) // as on Objects: the assessed group with its mark
		}},
		{Header: book.UnitPercentRH.Header("RH used"), Width: 9, Value: func(s stationRow) book.Cell {
			if s.Station.RelativeHumidity.Known {
				return marked(inQ(book.UnitPercentRH, s.Station.RelativeHumidity), assess.ProvEntered)
			}
			// The station gives none: the site's RH is used (entered on the
			// Site sheet), or the dry-day value when the site gives none either.
			return siteHumidityCell(site)
		}},
		{Header: "Verdict", Width: 14, Value: func(s stationRow) book.Cell { return verdictCell(s.Verdict) }},
		{Header: book.UnitRatio.Header("Worst ratio E/MIE"), Width: ratioTextWidth, Value: func(s stationRow) book.Cell { return stationRatioCell(s) }},
		{Header: "Main reason", Width: 40, Value: func(s stationRow) book.Cell { return book.WrapText(s.Main.String()) }},
		{Header: "Objects [count]", Width: 9, Value: func(s stationRow) book.Cell { return book.Integer(len(s.Objects)) }},
		{Header: "Incendive [count]", Width: 10, Value: count(assess.Incendive)},
		{Header: "Marginal [count]", Width: 10, Value: count(assess.Marginal)},
		{Header: "Non-incendive [count]", Width: 11, Value: count(assess.NonIncendive)},
		{Header: "Not assessed [count]", Width: 10, Value: count(assess.NotAssessed)},
		{Header: "Note", Width: 30, Value: func(s stationRow) book.Cell { return book.WrapText(strings.Join(s.Notes(), "; ")) }},
	}
	if withProbability {
		cols = append(cols, book.Column[stationRow]{Header: book.UnitProbability.Header("P(any incendive)"), Width: 11, Value: func(s stationRow) book.Cell {
			if s.ProbabilityAnyIncendive == nil {
				return book.Cell{NumFmt: book.UnitProbability.NumFmt()}
			}
			return book.Quantity(book.UnitProbability, *s.ProbabilityAnyIncendive)
		}})
	}
	// The Summary chart's data: every station with its verdict and, where
	// the ratio is no number, why; the bar value (1 for an assumed resistance).
	cols = append(cols,
		book.Column[stationRow]{Header: chartLabelHeader, Width: 26, Value: func(s stationRow) book.Cell { return book.Text(chartLabel(s)) }},
		book.Column[stationRow]{Header: chartValueHeader, Width: 10, Value: func(s stationRow) book.Cell { return ratioCell(chartValue(s)) }},
	)
	return cols
}

// Headers of the Stations columns the Summary chart points at.
const (
	chartLabelHeader = "Chart label"
	chartValueHeader = "Chart ratio [–]"
)

// chartLabel is a station's category on the Summary chart: "S1 marginal
// (no discharge)", so that every station with a verdict is listed with it.
func chartLabel(s *assess.StationResult) string {
	l := s.Station.ID + " " + s.Verdict.String()
	if t := stationRatioText(s); t != "" {
		l += " (" + t + ")"
	}
	return l
}

// chartValue is the bar of a station: its worst ratio, 1 when it is an
// artefact of an assumed resistance (read as at least 1), none when there is
// no ratio or it is 0.
func chartValue(s *assess.StationResult) *float64 {
	if s.WorstRatioAssumed {
		one := 1.0
		return &one
	}
	r := book.FinitePtr(s.WorstRatio)
	if r == nil || *r <= 0 {
		return nil
	}
	return r
}

// columnLetter returns the letter of the column with the given header in cols.
func columnLetter[T any](cols []book.Column[T], header string) string {
	for i, c := range cols {
		if c.Header == header {
			name, _ := excelize.ColumnNumberToName(i + 1)
			return name
		}
	}
	return ""
}

func (wb *workbook) stations() error {
	rows := make([]stationRow, len(wb.a.Stations))
	for i := range wb.a.Stations {
		rows[i] = &wb.a.Stations[i]
	}
	wb.stationRows = len(rows) + 1
	cols := stationColumns(wb.a.Survey.Site, anyProbability(wb.a))
	wb.chartLabelCol, wb.chartValueCol = columnLetter(cols, chartLabelHeader), columnLetter(cols, chartValueHeader)
	if err := tableSheetPrinted(wb, SheetStations, cols, rows, 2, "$A:$B"); err != nil {
		return err
	}
	// The chart's helper columns are hidden: they are no figures to read
	// ("Chart ratio 1" for an assumed station) and need no paper; the Summary
	// chart still reads them (excelize writes plotVisOnly off). The sheet's
	// 20-odd columns print landscape on two pages wide, rank and station
	// repeated on each, instead of one unreadable page.
	for _, c := range []string{wb.chartLabelCol, wb.chartValueCol} {
		if err := wb.f.SetColVisible(SheetStations, c, false); err != nil {
			return err
		}
	}
	return nil
}

// ---- Objects ----

func (wb *workbook) objects() error {
	cols := objectColumns(anyProbability(wb.a))
	fitObjectIDs(cols, wb.a.Objects)
	pagesWide := (len(cols) + 13) / 14 // about 14 columns a landscape page stays readable
	return tableSheetStream(wb, SheetObjects, cols, len(wb.a.Objects),
		func(i int) objRow { return &wb.a.Objects[i] }, pagesWide, "$A:$A", 1)
}

// ---- Findings ----

type findingRow struct {
	n   int // the finding's number; 0 for a closed finding
	f   *assess.Finding
	act Action // what the site typed (carried from the previous audit)
}

// findingColumns are the Findings sheet's columns; the Station and Object
// columns are as wide as the longest ID of fs (and of the closed findings).
// The last four are the site's: blank in a first run, carried over by a rerun.
func findingColumns(fs ...[]assess.Finding) []book.Column[findingRow] {
	var st, ob []string
	for _, l := range fs {
		for i := range l {
			st, ob = append(st, l[i].StationID), append(ob, l[i].ObjectID)
		}
	}
	return []book.Column[findingRow]{
		{Header: "#", Width: 5, Value: func(r findingRow) book.Cell {
			if r.n == 0 {
				return book.Cell{}
			}
			return book.Integer(r.n)
		}},
		{Header: hdrSeverity, Width: 12, Value: func(r findingRow) book.Cell { return verdictCell(r.f.Severity) }},
		{Header: hdrStation, Width: fitWidth(10, st), Value: func(r findingRow) book.Cell { return book.Code(r.f.StationID) }},
		{Header: hdrObject, Width: fitWidth(12, ob), Value: func(r findingRow) book.Cell { return book.Code(r.f.ObjectID) }},
		{Header: hdrCheck, Width: 18, Value: func(r findingRow) book.Cell { return book.Text(r.f.Check) }},
		{Header: hdrFinding, Width: 50, Value: func(r findingRow) book.Cell { return book.WrapText(r.f.Message) }},
		{Header: hdrMitigation, Width: 50, Value: func(r findingRow) book.Cell { return book.WrapText(r.f.Mitigation) }},
		{Header: hdrBasis, Width: 40, Value: func(r findingRow) book.Cell { return book.WrapText(r.f.Basis) }},
		{Header: hdrOwner, Width: 14, Value: func(r findingRow) book.Cell { return book.Cell{V: optString(r.act.Owner), Wrap: true} }},
		{Header: hdrDue, Width: 11, Value: func(r findingRow) book.Cell { return dueCell(r.act) }},
		{Header: hdrStatus, Width: 10, Value: func(r findingRow) book.Cell { return book.Cell{V: optString(r.act.Status), Wrap: true} }},
		{Header: hdrComment, Width: 30, Value: func(r findingRow) book.Cell { return book.Cell{V: optString(r.act.Comment), Wrap: true} }},
	}
}

// findings writes the Findings sheet; past maxRejectedRows (what a sheet
// holds) it ends with a note of how many findings are not listed.
func (wb *workbook) findings() error {
	total := len(wb.a.Findings)
	listed := min(total, maxRejectedRows)
	rows := listed
	if total > listed {
		rows++
	}
	cols := findingColumns(wb.a.Findings, wb.actions.closed())
	ts, err := openTableStream(wb, SheetFindings, cols, rows, 1, "", 0)
	if err != nil {
		return err
	}
	for i := 0; i < listed; i++ {
		if err := ts.Row(findingRow{i + 1, &wb.a.Findings[i], wb.actions.open(i)}); err != nil {
			return err
		}
	}
	if total > listed {
		msg := fmt.Sprintf("%d more findings are not listed here: a sheet holds at most %d rows, and %d of the %d findings are listed above. "+
			"The audit JSON (--json) lists every finding, with its object.", total-listed, book.MaxSheetRows, listed, total)
		if err := ts.Note(msg); err != nil {
			return err
		}
		return ts.sw.Flush() // no room left for the closed part: a sheet this full lists no closed findings (known limit)
	}
	if err := wb.closedFindings(ts); err != nil {
		return err
	}
	return ts.sw.Flush()
}

// ---- Cautions ----

func (wb *workbook) cautions() error {
	f, s := wb.f, SheetCautions
	if err := book.SetWidths(f, s, []float64{5, 120}); err != nil {
		return err
	}
	sink := book.NormalSink{F: f, Sheet: s, St: wb.st}
	if err := sink.Header(1, []string{"#", "Caution"}); err != nil {
		return err
	}
	for i, c := range templates.Cautions() {
		r := i + 2
		cells := []book.Cell{book.Integer(i + 1), book.WrapText(c)}
		if err := sink.Row(r, cells, book.RowHeight([]float64{5, 120}, cells)); err != nil {
			return err
		}
	}
	if err := f.SetPanes(s, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	return wb.printSetup(s, 1, "$1:$1", "")
}

// wrappedHeight returns the row height (points) of a wrapped text in a column
// of the given width (characters).
func wrappedHeight(s string, width float64) float64 {
	return book.LineHeight*float64(book.WrappedLines(s, width)) + 2
}

// ---- Rejected ----

type problemRow struct {
	p      inventory.Problem
	status string
	note   bool // the closing row of a capped sheet (p.Message says what is not listed), or a Changes row (ChangesNotUsed)
}

func problemColumns() []book.Column[problemRow] {
	return []book.Column[problemRow]{
		{Header: "Severity", Width: 9, Value: func(r problemRow) book.Cell {
			if r.note {
				return book.Code("note")
			}
			return book.Code(r.p.Severity.String())
		}},
		{Header: "Row status", Width: 16, Value: func(r problemRow) book.Cell { return book.Text(r.status) }},
		{Header: "Sheet", Width: 12, Value: func(r problemRow) book.Cell { return book.Text(r.p.Sheet) }},
		{Header: "Row", Width: 6, Value: func(r problemRow) book.Cell {
			if r.p.Row <= 0 {
				return book.Cell{}
			}
			return book.Integer(r.p.Row)
		}},
		{Header: "Cell", Width: 14, Value: func(r problemRow) book.Cell { return book.Text(r.p.Cell()) }},
		{Header: "Field", Width: 16, Value: func(r problemRow) book.Cell { return book.OptText(r.p.Field) }},
		{Header: "ID", Width: 12, Value: func(r problemRow) book.Cell { return book.OptText(r.p.ID) }},
		{Header: "Message", Width: 50, Value: func(r problemRow) book.Cell { return book.WrapText(r.p.Message) }},
		{Header: "Fix", Width: 40, Value: func(r problemRow) book.Cell { return book.WrapText(r.p.Fix) }},
	}
}

// problemHash identifies a problem by its place and message, for the set of
// problems already listed (8 bytes a problem, not a built string key).
func problemHash(p *inventory.Problem) uint64 {
	h := fnv.New64a()
	_, _ = io.WriteString(h, p.Sheet)
	_, _ = h.Write([]byte{0, byte(p.Row), byte(p.Row >> 8), byte(p.Row >> 16), byte(p.Row >> 24), 0})
	_, _ = io.WriteString(h, p.Column)
	_, _ = h.Write([]byte{0})
	_, _ = io.WriteString(h, p.Field)
	_, _ = h.Write([]byte{0})
	_, _ = io.WriteString(h, p.Message)
	return h.Sum64()
}

func sameProblem(a, b *inventory.Problem) bool {
	return a.Sheet == b.Sheet && a.Row == b.Row && a.Column == b.Column && a.Field == b.Field && a.Message == b.Message
}

// eachProblem calls fn with every problem of every rejected row, then the
// sheet-level errors not tied to a rejected row, then the warnings (rows
// still accepted), with the row status; it stops when fn returns false.
func eachProblem(s *inventory.Survey, fn func(p *inventory.Problem, status string) bool) {
	// A problem of a rejected row is also in s.Problems: listed once. The set
	// keeps a hash and where the problem is; a hash met twice is compared in
	// full, so a collision lists a problem twice rather than not at all.
	type at struct{ row, i int32 }
	seen := map[uint64]at{}
	for ri := range s.Rejected {
		for pi := range s.Rejected[ri].Problems {
			p := &s.Rejected[ri].Problems[pi]
			if !fn(p, rejectedStatus(p)) {
				return
			}
			seen[problemHash(p)] = at{int32(ri), int32(pi)}
		}
	}
	for i := range s.Problems {
		p := &s.Problems[i]
		if p.Severity != inventory.Error {
			continue
		}
		if a, ok := seen[problemHash(p)]; ok && sameProblem(p, &s.Rejected[a.row].Problems[a.i]) {
			continue
		}
		status := "sheet not read"
		if p.Row > 0 {
			status = rejectedStatus(p)
		}
		if !fn(p, status) {
			return
		}
	}
	for i := range s.Problems {
		if s.Problems[i].Severity == inventory.Warning {
			if !fn(&s.Problems[i], "row accepted") {
				return
			}
		}
	}
}

// ChangesNotUsed is the Rejected sheet's status of a problem on the survey's
// Changes sheet: only whatif uses that sheet, and whatif stops on a rejected
// Changes row (unless --no-sheet-changes), so a workbook that lists one is
// of a command that does not use the sheet: listed as a note, not a rejection.
const ChangesNotUsed = "Changes sheet not used by this command"

// rejectedStatus is the status of a rejected row's problem.
func rejectedStatus(p *inventory.Problem) string {
	if p.Sheet == inventory.SheetChanges {
		return ChangesNotUsed
	}
	return "row rejected"
}

// problemRows lists the problems in the order of eachProblem.
func problemRows(s *inventory.Survey) []problemRow {
	var out []problemRow
	eachProblem(s, func(p *inventory.Problem, status string) bool {
		out = append(out, problemRow{p: *p, status: status, note: status == ChangesNotUsed})
		return true
	})
	return out
}

// maxRejectedRows is the most problems the Rejected sheet lists: a sheet
// holds 1,048,576 rows, less the header and the closing note. A variable so
// that a test can lower it.
var maxRejectedRows = book.MaxSheetRows - 2

// problemBound is at least the number of problems eachProblem lists.
func problemBound(s *inventory.Survey) int {
	n := len(s.Problems)
	for i := range s.Rejected {
		n += len(s.Rejected[i].Problems)
	}
	return n
}

// ProblemsListed returns how many problems the audit lists (every one, in
// the JSON) and how many of them the Rejected sheet holds.
func ProblemsListed(s *inventory.Survey) (total, onSheet int) {
	if s == nil {
		return 0, 0
	}
	eachProblem(s, func(*inventory.Problem, string) bool { total++; return true })
	return total, min(total, maxRejectedRows)
}

// rejectedNote is the closing row's message when the sheet cannot hold every problem.
func rejectedNote(total, listed int) string {
	return fmt.Sprintf("%d more problems are not listed here: a sheet holds at most %d rows, and %d of the %d problems are listed above. "+
		"The audit JSON (--json) and 'sparkmargin check' list every problem.", total-listed, book.MaxSheetRows, listed, total)
}

// rejected writes the Rejected sheet, streamed; past maxRejectedRows it
// ends with a note of how many problems are not listed and where they are.
func (wb *workbook) rejected() error {
	s := wb.a.Survey
	total, listed := ProblemsListed(s)
	rows := listed
	if total > listed {
		rows++
	}
	ts, err := openTableStream(wb, SheetRejected, problemColumns(), rows, 1, "", 0)
	if err != nil {
		return err
	}
	n := 0
	eachProblem(s, func(p *inventory.Problem, status string) bool {
		if n == listed {
			return false
		}
		if err = ts.Row(problemRow{p: *p, status: status, note: status == ChangesNotUsed}); err != nil {
			return false
		}
		n++
		return true
	})
	if err != nil {
		return err
	}
	if total > listed {
		if err := ts.Row(problemRow{p: inventory.Problem{Message: rejectedNote(total, listed)}, status: "not listed", note: true}); err != nil {
			return err
		}
	}
	return ts.sw.Flush()
}

// writeSheets writes the audit's sheets in dependency order (the Summary last,
// since it reads the others' cell ranges); the Objects sheet only when
// withObjects: the streaming writer has written it row by row already.
func (wb *workbook) writeSheets(withObjects bool) error {
	type step struct {
		name string
		fn   func() error
	}
	steps := []step{{SheetStations, wb.stations}}
	if withObjects {
		steps = append(steps, step{SheetObjects, wb.objects})
	}
	steps = append(steps,
		step{SheetFindings, wb.findings},
		step{SheetMethod, wb.method},
		step{SheetCautions, wb.cautions},
		step{SheetRejected, wb.rejected},
		step{SheetSummary, wb.summary},
		step{SheetReport, wb.report},
	)
	for _, s := range steps {
		if err := s.fn(); err != nil {
			return fmt.Errorf("write workbook: sheet %s: %w", s.name, err)
		}
	}
	return nil
}

// setDocProps sets the audit's document properties, dated by the survey date
// (not the clock), so the same survey gives the same file.
func setDocProps(f *excelize.File, a *assess.Audit, info RunInfo) error {
	d := surveyDate(a).Format("2006-01-02T15:04:05Z")
	if err := f.SetDocProps(&excelize.DocProperties{
		Creator:        info.tool() + " " + info.ToolVersion,
		LastModifiedBy: info.tool(),
		Created:        d,
		Modified:       d,
		Title:          "Electrostatic ignition screening audit: " + siteName(a),
		Subject:        "Screening estimates; see the Cautions sheet",
		Description:    "Survey " + info.file(a) + ", SHA-256 " + info.sha(a),
		Language:       "en",
	}); err != nil {
		return fmt.Errorf("write workbook: document properties: %w", err)
	}
	if err := setAuditMark(f); err != nil {
		return fmt.Errorf("write workbook: document properties: %w", err)
	}
	return nil
}

// ratioTextWidth is the width of a ratio column: wide enough for the longest
// ratio text, ">= 1 (assumed R)", printed whole.
const ratioTextWidth = 17
