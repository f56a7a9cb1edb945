package inventory

import (
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"
)

// SheetLists is the hidden sheet of the template that holds the values of the
// drop-down lists. It is not part of the survey contract: the reader ignores it.
const SheetLists = "Lists"

// SheetKindNeeds is the template's help sheet: object kinds as rows, the
// Objects columns they need as columns. It is not part of the survey contract:
// the reader ignores it.
const SheetKindNeeds = "What each kind needs"

// TemplateRows is how many data rows of each table sheet get the template's
// drop-down lists, input hints and highlights: every row a sheet can hold
// below its header (rows 2 to 1,048,576). A data validation or conditional
// format names its range once, so the whole column costs no more than 500 rows.
const TemplateRows = excelize.TotalRows - 1

// Fills of the Objects sheet's per-kind highlight. Pale blues, chosen to be
// unlike any verdict colour of the audit (red, amber, green, grey) so that a
// highlighted cell is never read as a judgement: darker for a column the
// row's kind requires, lighter for one of its alternatives.
const (
	fillRequired = "BDD7EE"
	fillOneOf    = "DDEBF7"
)

// fixedWorkbookTime is the creation and modification time written into the
// document properties of every workbook this package writes, so that the same
// input always gives the same file.
var fixedWorkbookTime = time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC)

// WorkbookTitle is the Title document property of the template and of surveys
// written by WriteSurvey.
const WorkbookTitle = "sparkmargin line survey"

// TemplateOptions says what the blank survey workbook offers in its drop-down lists.
type TemplateOptions struct {
	// Materials are the built-in material names offered by the Material drop-down,
	// ahead of the names the user enters on the Materials sheet.
	Materials []string
	// Substances are the built-in substance names offered by the Substance drop-down.
	Substances []string
	// Cautions are written on the Site sheet, in column D below the items
	// (templates.Cautions() in the command). Column D of the Site sheet is not
	// read as data: only columns A and B hold items.
	Cautions []string
}

// WriteTemplate writes the blank survey workbook to w: the five sheets of the
// contract (Site, Atmospheres, Stations, Objects, Materials) with the headers of
// Column.Header, an input hint on every header and data cell (a data-validation
// input message, which spreadsheet programs show when the cell is selected),
// drop-down lists, frozen header rows and bold headers. The Site sheet is
// pre-filled with its items, values left empty, and carries the cautions in
// column D below the items. The drop-down values live on the hidden Lists sheet.
// Hints and drop-downs cover every row a sheet can hold (TemplateRows). The
// "What each kind needs" sheet and the Objects sheet's per-kind highlight of
// needed cells are drawn from kindNeedTable, the table check's per-kind needs use.
// The output is deterministic: the same options give the same bytes.
func WriteTemplate(w io.Writer, opts TemplateOptions) error {
	f := excelize.NewFile()
	defer f.Close()
	if err := writeTemplate(f, opts); err != nil {
		return fmt.Errorf("template: %w", err)
	}
	if _, err := f.WriteTo(w); err != nil {
		return fmt.Errorf("template: writing the workbook: %w", err)
	}
	return nil
}

func writeTemplate(f *excelize.File, opts TemplateOptions) error {
	if err := setWorkbookProps(f); err != nil {
		return err
	}
	st, err := newSheetStyles(f)
	if err != nil {
		return err
	}
	sheets := Sheets()
	if err := f.SetSheetName("Sheet1", sheets[0]); err != nil {
		return err
	}
	for _, s := range sheets[1:] {
		if _, err := f.NewSheet(s); err != nil {
			return err
		}
	}
	if _, err := f.NewSheet(SheetKindNeeds); err != nil {
		return err
	}
	if _, err := f.NewSheet(SheetLists); err != nil {
		return err
	}
	lists, err := writeLists(f, opts)
	if err != nil {
		return err
	}
	if err := writeSiteTemplate(f, st, opts.Cautions); err != nil {
		return err
	}
	for _, s := range sheets[1:] {
		if err := writeTableTemplate(f, st, s, lists); err != nil {
			return fmt.Errorf("sheet %s: %w", s, err)
		}
	}
	if err := writeKindNeedsSheet(f, st); err != nil {
		return fmt.Errorf("sheet %s: %w", SheetKindNeeds, err)
	}
	if err := highlightKindNeeds(f); err != nil {
		return fmt.Errorf("sheet %s: highlights: %w", SheetObjects, err)
	}
	if err := f.SetSheetVisible(SheetLists, false); err != nil {
		return err
	}
	f.SetActiveSheet(0)
	return nil
}

// setWorkbookProps sets the fixed document properties and asks the spreadsheet
// program to compute the Lists formulas when it opens the file.
func setWorkbookProps(f *excelize.File) error {
	ts := fixedWorkbookTime.Format(time.RFC3339)
	if err := f.SetDocProps(&excelize.DocProperties{
		Title:          WorkbookTitle,
		Creator:        "sparkmargin",
		LastModifiedBy: "sparkmargin",
		Created:        ts,
		Modified:       ts,
		Description:    "Line survey of charged objects for the sparkmargin electrostatic screening tool.",
	}); err != nil {
		return err
	}
	full := true
	return f.SetCalcProps(&excelize.CalcPropsOptions{FullCalcOnLoad: &full})
}

type sheetStyles struct {
	header int // bold, wrapped, bottom border
	note   int // italic, wrapped
	title  int // bold
	date   int // ISO date
}

func newSheetStyles(f *excelize.File) (sheetStyles, error) {
	var st sheetStyles
	var err error
	if st.header, err = f.NewStyle(&excelize.Style{
		Font:      &excelize.Font{Bold: true},
		Fill:      excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"E7E6E6"}},
		Border:    []excelize.Border{{Type: "bottom", Color: "000000", Style: 1}},
		Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"},
	}); err != nil {
		return st, err
	}
	if st.note, err = f.NewStyle(&excelize.Style{
		Font:      &excelize.Font{Italic: true},
		Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"},
	}); err != nil {
		return st, err
	}
	if st.title, err = f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}}); err != nil {
		return st, err
	}
	fmtISO := "yyyy-mm-dd"
	if st.date, err = f.NewStyle(&excelize.Style{CustomNumFmt: &fmtISO}); err != nil {
		return st, err
	}
	return st, nil
}

// listRanges maps a drop-down list name to its source: either an absolute cell
// range on the Lists sheet or on a contract sheet.
type listRanges map[string]string

// materialListRows is how many Materials sheet rows the Material drop-down follows.
const materialListRows = 200

// writeLists fills the hidden Lists sheet: one column per list, the list name in
// row 1, the values from row 2. The Material column holds the built-in names and
// then formulas that follow the Materials sheet's Name column, so names a user
// adds there appear in the Objects drop-down.
func writeLists(f *excelize.File, opts TemplateOptions) (listRanges, error) {
	fixed := FixedLists()
	names := []string{ListKind, ListBacking, ListZone, ListGroup, ListAtmosphereKind,
		ListMaterialClass, ListBagType, ListFilling, ListSubstance, ListMaterial,
		ListVesselMaterial, ListVesselClass, ListFilter, ListSecondPhase, ListProcess}
	r := listRanges{
		ListStation:    fmt.Sprintf("'%s'!$A$2:$A$%d", SheetStations, TemplateRows+1),
		ListAtmosphere: fmt.Sprintf("'%s'!$A$2:$A$%d", SheetAtmospheres, TemplateRows+1),
	}
	for i, name := range names {
		col, err := excelize.ColumnNumberToName(i + 1)
		if err != nil {
			return nil, err
		}
		if err := f.SetCellStr(SheetLists, col+"1", name); err != nil {
			return nil, err
		}
		var values []string
		switch name {
		case ListSubstance:
			values = opts.Substances
		case ListMaterial:
			values = opts.Materials
		default:
			values = fixed[name]
		}
		for j, v := range values {
			if err := f.SetCellStr(SheetLists, fmt.Sprintf("%s%d", col, j+2), v); err != nil {
				return nil, err
			}
		}
		last := len(values) + 1
		if name == ListMaterial {
			for k := 0; k < materialListRows; k++ {
				cell := fmt.Sprintf("%s%d", col, len(values)+2+k)
				src := fmt.Sprintf("%s!A%d", SheetMaterials, k+2)
				if err := f.SetCellFormula(SheetLists, cell, fmt.Sprintf(`IF(%s="","",%s)`, src, src)); err != nil {
					return nil, err
				}
			}
			last += materialListRows
		}
		if last < 2 {
			last = 2 // an empty list still needs a valid range
		}
		r[name] = fmt.Sprintf("'%s'!$%s$2:$%s$%d", SheetLists, col, col, last)
	}
	if err := f.SetColWidth(SheetLists, "A", "J", 18); err != nil {
		return nil, err
	}
	return r, nil
}

// writeSiteTemplate writes the Item | Value sheet with the items pre-filled and
// the cautions in column D below them.
func writeSiteTemplate(f *excelize.File, st sheetStyles, cautions []string) error {
	s := SheetSite
	if err := f.SetSheetRow(s, "A1", &[]any{"Item", "Value"}); err != nil {
		return err
	}
	if err := f.SetCellStyle(s, "A1", "B1", st.header); err != nil {
		return err
	}
	items := SiteItems()
	for i, it := range items {
		row := i + 2
		a := fmt.Sprintf("A%d", row)
		b := fmt.Sprintf("B%d", row)
		if err := f.SetCellStr(s, a, it.Header()); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, a, a, st.title); err != nil {
			return err
		}
		dv := excelize.NewDataValidation(true)
		dv.SetSqref(a + ":" + b)
		dv.SetInput(inputTitle(it.Name), inputMessage(it))
		if err := f.AddDataValidation(s, dv); err != nil {
			return err
		}
		if it.Dim == Date {
			if err := f.SetCellStyle(s, b, b, st.date); err != nil {
				return err
			}
		}
	}
	if len(cautions) > 0 {
		row := len(items) + 3
		cell := fmt.Sprintf("D%d", row)
		if err := f.SetCellStr(s, cell, "Cautions (not read as survey data)"); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, cell, cell, st.title); err != nil {
			return err
		}
		for i, c := range cautions {
			cell := fmt.Sprintf("D%d", row+1+i)
			if err := f.SetCellStr(s, cell, c); err != nil {
				return err
			}
			if err := f.SetCellStyle(s, cell, cell, st.note); err != nil {
				return err
			}
			// Wrapped rows do not grow by themselves in every program.
			lines := (len([]rune(c)) + cautionLineChars - 1) / cautionLineChars
			if err := f.SetRowHeight(s, row+1+i, 15*float64(max(lines, 1))); err != nil {
				return err
			}
		}
	}
	if err := fitToPageWidth(f, s, "landscape"); err != nil {
		return err
	}
	if err := f.SetColWidth(s, "A", "A", 26); err != nil {
		return err
	}
	if err := f.SetColWidth(s, "B", "B", 30); err != nil {
		return err
	}
	if err := f.SetColWidth(s, "C", "C", 4); err != nil {
		return err
	}
	if err := f.SetColWidth(s, "D", "D", cautionColumnWidth); err != nil {
		return err
	}
	return freezeHeader(f, s, 0)
}

// cautionColumnWidth is the width of the Site sheet's caution column, and
// cautionLineChars about how many characters of italic text a line of it holds.
const (
	cautionColumnWidth = 90
	cautionLineChars   = 95
)

// fitToPageWidth prints the sheet one page wide in the given orientation.
func fitToPageWidth(f *excelize.File, sheet, orientation string) error {
	fit := true
	if err := f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
		return err
	}
	one, any := 1, 0
	return f.SetPageLayout(sheet, &excelize.PageLayoutOptions{Orientation: &orientation, FitToWidth: &one, FitToHeight: &any})
}

// writeTableTemplate writes a table sheet's header row, its hints and drop-downs.
func writeTableTemplate(f *excelize.File, st sheetStyles, sheet string, lists listRanges) error {
	cols := SheetColumns(sheet)
	if err := writeHeader(f, st, sheet, cols); err != nil {
		return err
	}
	for i, c := range cols {
		col, err := excelize.ColumnNumberToName(i + 1)
		if err != nil {
			return err
		}
		title, msg := inputTitle(c.Name), inputMessage(c)
		head := excelize.NewDataValidation(true)
		head.SetSqref(col + "1")
		head.SetInput(title, msg)
		if err := f.AddDataValidation(sheet, head); err != nil {
			return err
		}
		data := excelize.NewDataValidation(true)
		data.SetSqref(fmt.Sprintf("%s2:%s%d", col, col, TemplateRows+1))
		data.SetInput(title, msg)
		if c.List != "" {
			src, ok := lists[c.List]
			if !ok {
				return fmt.Errorf("column %s: no drop-down list %q", c.Name, c.List)
			}
			data.SetSqrefDropList(src)
			// A warning, not a stop: a surveyor may need a value the list
			// lacks; check reports it with its cell.
			data.SetError(excelize.DataValidationErrorStyleWarning, title,
				"Not in the list. Keep it only if you mean it: check will report values it does not know.")
		}
		if err := f.AddDataValidation(sheet, data); err != nil {
			return err
		}
	}
	if err := fitToPageWidth(f, sheet, "landscape"); err != nil {
		return err
	}
	xsplit := 0
	if sheet == SheetObjects {
		xsplit = 1 // keep the object ID in view
	}
	return freezeHeader(f, sheet, xsplit)
}

// writeHeader writes the bold header row and sets the column widths.
func writeHeader(f *excelize.File, st sheetStyles, sheet string, cols []Column) error {
	row := make([]any, len(cols))
	for i, c := range cols {
		row[i] = c.Header()
	}
	if err := f.SetSheetRow(sheet, "A1", &row); err != nil {
		return err
	}
	last, err := excelize.ColumnNumberToName(len(cols))
	if err != nil {
		return err
	}
	if err := f.SetCellStyle(sheet, "A1", last+"1", st.header); err != nil {
		return err
	}
	for i, c := range cols {
		col, err := excelize.ColumnNumberToName(i + 1)
		if err != nil {
			return err
		}
		if err := f.SetColWidth(sheet, col, col, columnWidth(c)); err != nil {
			return err
		}
	}
	return f.SetRowHeight(sheet, 1, 32)
}

// columnWidth is a width in characters that shows the header on at most two lines.
func columnWidth(c Column) float64 {
	switch c.Name {
	case "Description", "Notes":
		return 36
	case "Name", "Line":
		return 20
	}
	h := c.Header()
	n := float64(len([]rune(h)))
	w := n/2 + 3 // two lines
	if n <= 12 {
		w = n + 2
	}
	for _, word := range strings.Fields(h) {
		if l := float64(len([]rune(word))) + 2; l > w {
			w = l // never break a word
		}
	}
	if w < 10 {
		w = 10
	}
	return w
}

// freezeHeader freezes the first row (and xsplit columns).
func freezeHeader(f *excelize.File, sheet string, xsplit int) error {
	col, err := excelize.ColumnNumberToName(xsplit + 1)
	if err != nil {
		return err
	}
	pane := "bottomLeft"
	if xsplit > 0 {
		pane = "bottomRight"
	}
	return f.SetPanes(sheet, &excelize.Panes{
		Freeze:      true,
		XSplit:      xsplit,
		YSplit:      1,
		TopLeftCell: col + "2",
		ActivePane:  pane,
	})
}

// inputTitle shortens a name to the 32 characters an input-message title may have.
func inputTitle(name string) string {
	r := []rune(name)
	if len(r) > 32 {
		r = r[:32]
	}
	return string(r)
}

// inputMessage is the hint of a column with its unit, within the 255 characters
// an input message may have.
func inputMessage(c Column) string {
	msg := strings.TrimSuffix(c.Hint, ".")
	if c.Unit != "" {
		msg += ". Unit: " + c.Unit
		if ex := exampleWithUnit(c.Dim); ex != "" {
			msg += ", unless the cell gives its own (e.g. " + ex + ")"
		}
	}
	msg += "."
	r := []rune(msg)
	if len(r) > 255 {
		r = r[:255]
	}
	return string(r)
}

// exampleWithUnit gives a cell written with its own unit (an SI prefix on the
// column's unit), for the hints; "" where none is commonly used.
func exampleWithUnit(d Dimension) string {
	switch d {
	case Length:
		return "3 mm"
	case ElectricField:
		return "2.5 MV/m"
	case Potential:
		return "800 V"
	case Resistance:
		return "1 GΩ"
	case Capacitance:
		return "150 pF"
	case Current:
		return "200 nA"
	case Time:
		return "500 ms"
	case Energy:
		return "240 µJ"
	case Percent:
		return "45 %"
	case Conductivity:
		return "1 nS/m"
	}
	return ""
}

// kindNeedColumns are the Objects columns some kind needs or uses (the columns
// of the help sheet), in Objects column order.
func kindNeedColumns() []Column {
	named := map[string]bool{}
	for _, k := range kindNeedTable {
		for _, c := range k.Columns {
			named[c.Column] = true
		}
	}
	var out []Column
	for _, c := range SheetColumns(SheetObjects) {
		if named[c.Name] {
			out = append(out, c)
		}
	}
	return out
}

// writeKindNeedsSheet writes the help sheet from kindNeedTable: a row per kind,
// a column per Objects column some kind names (required, one of, if, optional,
// or not needed), and the rule in words as check reports it.
func writeKindNeedsSheet(f *excelize.File, st sheetStyles) error {
	s := SheetKindNeeds
	cols := kindNeedColumns()
	header := []any{"Kind"}
	for _, c := range cols {
		header = append(header, c.Name)
	}
	header = append(header, "In words (as check reports a missing input)")
	if err := f.SetSheetRow(s, "A1", &header); err != nil {
		return err
	}
	last, err := excelize.ColumnNumberToName(len(header))
	if err != nil {
		return err
	}
	if err := f.SetCellStyle(s, "A1", last+"1", st.header); err != nil {
		return err
	}
	top := &excelize.Alignment{Vertical: "top"}
	req, err := f.NewStyle(&excelize.Style{Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillRequired}}, Font: &excelize.Font{Bold: true}, Alignment: top})
	if err != nil {
		return err
	}
	one, err := f.NewStyle(&excelize.Style{Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillOneOf}}, Alignment: top})
	if err != nil {
		return err
	}
	plain, err := f.NewStyle(&excelize.Style{Alignment: top})
	if err != nil {
		return err
	}
	kindStyle, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}, Alignment: top})
	if err != nil {
		return err
	}
	for i, k := range kindNeedTable {
		row := i + 2
		vals := []any{k.Kind}
		for _, c := range cols {
			vals = append(vals, kindColumnNeed(k.Kind, c.Name).String())
		}
		vals = append(vals, k.Summary)
		if err := f.SetSheetRow(s, fmt.Sprintf("A%d", row), &vals); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, fmt.Sprintf("A%d", row), fmt.Sprintf("A%d", row), kindStyle); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, fmt.Sprintf("B%d", row), fmt.Sprintf("%s%d", last, row), plain); err != nil {
			return err
		}
		for j, c := range cols {
			cell, err := excelize.CoordinatesToCellName(j+2, row)
			if err != nil {
				return err
			}
			switch kindColumnNeed(k.Kind, c.Name) {
			case Required:
				err = f.SetCellStyle(s, cell, cell, req)
			case OneOf:
				err = f.SetCellStyle(s, cell, cell, one)
			}
			if err != nil {
				return err
			}
		}
		if err := f.SetCellStyle(s, last+fmt.Sprint(row), last+fmt.Sprint(row), st.note); err != nil {
			return err
		}
		if err := f.SetRowHeight(s, row, 15*float64(max(1, (len(k.Summary)+69)/70))); err != nil {
			return err
		}
	}
	notes := []string{
		"required: needed on every row of the kind; check reports the row when it is blank.",
		"one of: one of the kind's alternatives is needed (see In words): a reading, its charging or its earthing.",
		"if: needed in the case In words names (e.g. Thickness when Backing is earthed).",
		"optional: used when given; blank is assessed as the stricter case or a documented estimate, said beside the value.",
		"– (not needed): check does not ask for it for this kind; a value given may still be used by the assessment.",
		"On the Objects sheet the cells a row's Kind requires are filled dark pale blue, its alternatives light pale blue (a reading aid, not a verdict).",
		"This sheet is help only: check and assess do not read it.",
	}
	base := len(kindNeedTable) + 3
	for i, n := range notes {
		cell := fmt.Sprintf("A%d", base+i)
		if err := f.SetCellStr(s, cell, n); err != nil {
			return err
		}
	}
	if err := f.SetColWidth(s, "A", "A", 12); err != nil {
		return err
	}
	for j, c := range cols {
		col, err := excelize.ColumnNumberToName(j + 2)
		if err != nil {
			return err
		}
		w := max(9, float64(len(c.Name))/2+2)
		for _, word := range strings.Fields(c.Name) {
			w = max(w, float64(len([]rune(word)))+3) // never break a word
		}
		if err := f.SetColWidth(s, col, col, w); err != nil {
			return err
		}
	}
	if err := f.SetColWidth(s, last, last, 70); err != nil {
		return err
	}
	if err := f.SetRowHeight(s, 1, 32); err != nil {
		return err
	}
	if err := fitToPageWidth(f, s, "landscape"); err != nil {
		return err
	}
	return freezeHeader(f, s, 1)
}

// highlightKindNeeds adds, to each Objects column some kind requires or offers
// as an alternative, a conditional format over all data rows that fills the
// cell when the row's Kind is one of those kinds.
func highlightKindNeeds(f *excelize.File) error {
	ocols := SheetColumns(SheetObjects)
	kindCol := ""
	for i, c := range ocols {
		if c.Name == "Kind" {
			kindCol, _ = excelize.ColumnNumberToName(i + 1)
		}
	}
	if kindCol == "" {
		return fmt.Errorf("no Kind column")
	}
	req, err := f.NewConditionalStyle(&excelize.Style{Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillRequired}}})
	if err != nil {
		return err
	}
	one, err := f.NewConditionalStyle(&excelize.Style{Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillOneOf}}})
	if err != nil {
		return err
	}
	for i, c := range ocols {
		col, err := excelize.ColumnNumberToName(i + 1)
		if err != nil {
			return err
		}
		var rules []excelize.ConditionalFormatOptions
		for _, lv := range []struct {
			need  Need
			style int
		}{{Required, req}, {OneOf, one}} {
			var kinds []string
			for _, k := range kindNeedTable {
				if kindColumnNeed(k.Kind, c.Name) == lv.need {
					kinds = append(kinds, fmt.Sprintf(`TRIM($%s2)="%s"`, kindCol, k.Kind))
				}
			}
			if len(kinds) == 0 {
				continue
			}
			style := lv.style
			rules = append(rules, excelize.ConditionalFormatOptions{Type: "formula", Criteria: "OR(" + strings.Join(kinds, ",") + ")", Format: &style, StopIfTrue: true})
		}
		if len(rules) == 0 {
			continue
		}
		if err := f.SetConditionalFormat(SheetObjects, fmt.Sprintf("%s2:%s%d", col, col, TemplateRows+1), rules); err != nil {
			return err
		}
	}
	return nil
}
