package rerun

// Thin workbook helpers. Package report keeps its cell styles, table writer and
// Method/Cautions/Rejected sheet writers unexported; these are small equivalents
// (same verdict colours, fonts and number formats) so that the rerun workbooks
// look like the audit's. They can be merged into report's exported API later.

import (
	"fmt"
	"io"
	"math"
	"strings"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/templates"
	"github.com/xuri/excelize/v2"
)

// RunInfo identifies the run for the Method sheet.
type RunInfo struct {
	ToolVersion string
	CommandLine string
}

// xc is one cell before styling.
type xc struct {
	v       any // string, float64, int or nil
	numFmt  string
	verdict string // a verdict spelling: coloured
	wrap    bool
	bold    bool
	center  bool
}

func tx(s string) xc { return xc{v: s} }
func ct(s string) xc { return xc{v: s, center: true} }
func wr(s string) xc { return xc{v: s, wrap: true} }
func in(n int) xc    { return xc{v: n, numFmt: "0"} }
func vd(v string) xc {
	if v == "" {
		return xc{}
	}
	return xc{v: v, verdict: v}
}

// ratioCell is a ratio E/MIE in the audit's wide format; nil is an empty cell.
func ratioCell(r *float64) xc {
	if r == nil || math.IsNaN(*r) || math.IsInf(*r, 0) {
		return xc{}
	}
	return xc{v: *r, numFmt: report.UnitRatio.NumFmt()}
}

func numCell(v float64, u report.Unit) xc {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return xc{}
	}
	return xc{v: u.Cell(v), numFmt: u.NumFmt()}
}

type book struct {
	f     *excelize.File
	cache map[string]int
	err   error
	site  string
	date  string
}

func newBook(s *inventory.Survey, first string) *book {
	b := &book{f: excelize.NewFile(), cache: map[string]int{}, site: "site not named", date: "not given"}
	if s != nil && s.Site.Name != "" {
		b.site = s.Site.Name
	}
	when := time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)
	if s != nil && !s.Site.SurveyDate.IsZero() {
		when = s.Site.SurveyDate.UTC()
		b.date = when.Format("2006-01-02")
	}
	b.f.SetSheetName("Sheet1", first)
	stamp := when.Format(time.RFC3339)
	b.check(b.f.SetDocProps(&excelize.DocProperties{Creator: "sparkmargin", Created: stamp, Modified: stamp, Title: b.site}))
	return b
}

func (b *book) check(err error) {
	if err != nil && b.err == nil {
		b.err = err
	}
}

func verdictColours(v string) (fill, font string) {
	switch v {
	case assess.Incendive.String():
		return "C8102E", "FFFFFF"
	case assess.Marginal.String():
		return "FFD100", "000000"
	case assess.NonIncendive.String():
		return "00843D", "FFFFFF"
	}
	return "BFBFBF", "000000"
}

// style returns a cached style: kind is "", "header", "title", "section", "caution".
func (b *book) style(kind string, c xc) int {
	key := fmt.Sprintf("%s|%s|%s|%v|%v|%v", kind, c.numFmt, c.verdict, c.wrap, c.bold, c.center)
	if id, ok := b.cache[key]; ok {
		return id
	}
	st := &excelize.Style{Alignment: &excelize.Alignment{Vertical: "top", WrapText: c.wrap}}
	if c.center {
		st.Alignment.Horizontal = "center"
	}
	font := &excelize.Font{Family: "Liberation Sans", Size: 10, Bold: c.bold}
	if c.numFmt != "" {
		nf := c.numFmt
		st.CustomNumFmt = &nf
	}
	if c.verdict != "" {
		fill, fc := verdictColours(c.verdict)
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fill}}
		font.Color, font.Bold = fc, true
		st.Alignment.Horizontal = "center"
	}
	switch kind {
	case "header":
		font.Bold = true
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"E7E6E6"}}
		st.Alignment.WrapText, st.Alignment.Vertical, st.Alignment.Horizontal = true, "bottom", "center"
		st.Border = []excelize.Border{{Type: "bottom", Color: "404040", Style: 2}}
	case "title":
		font.Size, font.Bold = 16, true
	case "section":
		font.Size, font.Bold = 12, true
		st.Border = []excelize.Border{{Type: "bottom", Color: "404040", Style: 1}}
	case "caution":
		font.Bold = true
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"FFF2CC"}}
		st.Alignment.WrapText = true
	}
	st.Font = font
	id, err := b.f.NewStyle(st)
	b.check(err)
	b.cache[key] = id
	return id
}

func (b *book) put(sheet string, col, row int, c xc, kind string) {
	ref, err := excelize.CoordinatesToCellName(col, row)
	b.check(err)
	if c.v != nil {
		b.check(b.f.SetCellValue(sheet, ref, c.v))
	}
	b.check(b.f.SetCellStyle(sheet, ref, ref, b.style(kind, c)))
}

// sheet creates a sheet (the first exists already).
func (b *book) sheet(name string) {
	if idx, _ := b.f.GetSheetIndex(name); idx < 0 {
		_, err := b.f.NewSheet(name)
		b.check(err)
	}
}

// lines estimates how many lines a wrapped text takes in a column of width w characters.
func lines(s string, w float64) int {
	n := 0
	for _, part := range strings.Split(s, "\n") {
		l := len([]rune(part))
		n += max(1, int(math.Ceil(float64(l)/math.Max(1, 1.1*w-2))))
	}
	return n
}

// table writes a header row at row `at` and the rows under it, sets widths, row
// heights for wrapped text, freezes the header when at is 1, and returns the next free row.
func (b *book) table(sheet string, at int, headers []string, widths []float64, rows [][]xc) int {
	b.sheet(sheet)
	for i, w := range widths {
		col, _ := excelize.ColumnNumberToName(i + 1)
		b.check(b.f.SetColWidth(sheet, col, col, w))
	}
	hl := 1
	for i, h := range headers {
		b.put(sheet, i+1, at, tx(h), "header")
		hl = max(hl, lines(h, widths[i]))
	}
	b.check(b.f.SetRowHeight(sheet, at, 13*float64(hl)+4))
	for r, row := range rows {
		nl := 1
		for i, c := range row {
			b.put(sheet, i+1, at+1+r, c, "")
			if s, ok := c.v.(string); ok && c.wrap && i < len(widths) {
				nl = max(nl, lines(s, widths[i]))
			}
		}
		if nl > 1 {
			b.check(b.f.SetRowHeight(sheet, at+1+r, 12.75*float64(nl)+2))
		}
	}
	if at == 1 {
		b.check(b.f.SetPanes(sheet, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}))
	}
	return at + 1 + len(rows)
}

// print sets landscape, one page wide, header row repeated, and the footer.
func (b *book) print(sheet string, repeatHeader bool) {
	orient := "landscape"
	one := 1
	zero := 0
	fit := true
	b.check(b.f.SetPageLayout(sheet, &excelize.PageLayoutOptions{Orientation: &orient, FitToWidth: &one, FitToHeight: &zero}))
	b.check(b.f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}))
	if repeatHeader {
		b.check(b.f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", RefersTo: "'" + sheet + "'!$1:$1", Scope: sheet}))
	}
	foot := strings.ReplaceAll(b.site, "&", "&&") + " · survey " + b.date
	b.check(b.f.SetHeaderFooter(sheet, &excelize.HeaderFooterOptions{OddFooter: "&L" + foot + "&RPage &P of &N"}))
}

// cautions writes the Cautions sheet from templates.Cautions().
func (b *book) cautions() {
	var rows [][]xc
	for i, c := range templates.Cautions() {
		rows = append(rows, []xc{in(i + 1), wr(c)})
	}
	b.table("Cautions", 1, []string{"#", "Caution"}, []float64{5, 120}, rows)
	b.print("Cautions", true)
}

// rejected writes the Rejected sheet: every problem of the survey, errors of
// rejected rows first, then sheet-level errors, then warnings of accepted rows.
func (b *book) rejected(s *inventory.Survey) {
	var rows [][]xc
	add := func(p inventory.Problem, status string) {
		row := []xc{tx(p.Severity.String()), tx(status), tx(p.Sheet), {}, tx(p.Cell()), tx(p.Field), tx(p.ID), wr(p.Message), wr(p.Fix)}
		if p.Row > 0 {
			row[3] = in(p.Row)
		}
		rows = append(rows, row)
	}
	seen := map[string]bool{}
	key := func(p inventory.Problem) string {
		return fmt.Sprintf("%s\x00%d\x00%s\x00%s\x00%s", p.Sheet, p.Row, p.Column, p.Field, p.Message)
	}
	for _, r := range s.Rejected {
		for _, p := range r.Problems {
			add(p, "row rejected")
			seen[key(p)] = true
		}
	}
	for _, p := range s.Problems {
		if p.Severity == inventory.Error && !seen[key(p)] {
			st := "sheet not read"
			if p.Row > 0 {
				st = "row rejected"
			}
			add(p, st)
		}
	}
	for _, p := range s.Problems {
		if p.Severity == inventory.Warning {
			add(p, "row accepted")
		}
	}
	if len(rows) == 0 {
		rows = append(rows, []xc{tx(""), tx("no problems: every row was accepted")})
	}
	b.table("Rejected", 1, []string{"Severity", "Row status", "Sheet", "Row", "Cell", "Field", "ID", "Message", "Fix"},
		[]float64{9, 16, 12, 6, 14, 16, 12, 50, 40}, rows)
	b.print("Rejected", true)
}

// method writes the Method sheet: the run, the rerun method, then the model's formulas.
func (b *book) method(s *inventory.Survey, info RunInfo, notes [][2]string) {
	const sh = "Method"
	b.sheet(sh)
	b.check(b.f.SetColWidth(sh, "A", "A", 30))
	b.check(b.f.SetColWidth(sh, "B", "B", 70))
	b.check(b.f.SetColWidth(sh, "C", "D", 30))
	r := 1
	b.put(sh, 1, r, tx("Method"), "title")
	r += 2
	file, sha := "", ""
	if s != nil {
		file, sha = s.Path, s.SHA256
	}
	for _, kv := range [][2]string{{"Tool", "sparkmargin " + info.ToolVersion}, {"Command", info.CommandLine}, {"Survey file", file}, {"Survey SHA-256", sha}} {
		b.put(sh, 1, r, tx(kv[0]), "")
		b.put(sh, 2, r, wr(kv[1]), "")
		if n := lines(kv[1], 70); n > 1 {
			b.check(b.f.SetRowHeight(sh, r, 12.75*float64(n)+2))
		}
		r++
	}
	r++
	b.put(sh, 1, r, tx("How this rerun works"), "section")
	r++
	for _, kv := range notes {
		b.put(sh, 1, r, xc{v: kv[0], wrap: true, bold: true}, "")
		b.put(sh, 2, r, wr(kv[1]), "")
		b.check(b.f.SetRowHeight(sh, r, 12.75*float64(max(lines(kv[1], 70), lines(kv[0], 30)))+2))
		r++
	}
	r++
	b.put(sh, 1, r, tx("Formulas of the model"), "section")
	r++
	var rows [][]xc
	for _, m := range templates.MethodNotes() {
		rows = append(rows, []xc{wr(m.Quantity), wr(m.Formula), wr(m.AppliesTo), wr(m.Source)})
	}
	b.table(sh, r, []string{"Quantity", "Formula", "Applies to", "Source"}, []float64{30, 70, 30, 30}, rows)
	b.print(sh, false)
}

func (b *book) write(w io.Writer) error {
	defer b.f.Close()
	if b.err != nil {
		return fmt.Errorf("workbook: %w", b.err)
	}
	b.f.SetActiveSheet(0)
	if _, err := b.f.WriteTo(w); err != nil {
		return fmt.Errorf("workbook: %w", err)
	}
	return nil
}

func quoteSheet(s string) string { return "'" + strings.ReplaceAll(s, "'", "''") + "'" }

func chartTitle(s string, size float64) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s, Font: &excelize.Font{Size: size, Bold: size > 10, Color: "000000"}}}}
}
