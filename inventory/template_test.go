package inventory

import (
	"bytes"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// testTemplateOptions are made-up list contents: the test checks that the
// template offers what it is given, not the built-in library.
func testTemplateOptions() TemplateOptions {
	return TemplateOptions{
		Materials:  []string{"PET", "steel", "paper"},
		Substances: []string{"toluene", "hydrogen", "ethyl acetate"},
		Cautions:   []string{"First caution sentence.", "Second caution sentence."},
	}
}

// writeTestTemplate writes a template into a temp dir and opens it again.
func writeTestTemplate(t *testing.T, opts TemplateOptions) (*excelize.File, string) {
	t.Helper()
	path := filepath.Join(t.TempDir(), "template.xlsx")
	var buf bytes.Buffer
	if err := WriteTemplate(&buf, opts); err != nil {
		t.Fatalf("WriteTemplate: %v", err)
	}
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatalf("open the written template: %v", err)
	}
	t.Cleanup(func() { f.Close() })
	return f, path
}

func TestTemplateSheetsAndHeaders(t *testing.T) {
	f, _ := writeTestTemplate(t, testTemplateOptions())
	want := append(Sheets(), SheetKindNeeds, SheetLists)
	if got := f.GetSheetList(); !slices.Equal(got, want) {
		t.Fatalf("sheets = %v, want %v (no default Sheet1 left)", got, want)
	}
	if v, err := f.GetSheetVisible(SheetLists); err != nil || v {
		t.Errorf("Lists sheet visible = %v (err %v), want hidden", v, err)
	}
	for _, s := range Sheets() {
		v, err := f.GetSheetVisible(s)
		if err != nil || !v {
			t.Errorf("sheet %s visible = %v (err %v), want visible", s, v, err)
		}
	}
	for _, s := range Sheets()[1:] {
		rows, err := f.GetRows(s)
		if err != nil {
			t.Fatal(err)
		}
		if len(rows) != 1 {
			t.Errorf("%s: %d rows, want the header row only", s, len(rows))
			continue
		}
		var want []string
		for _, c := range SheetColumns(s) {
			want = append(want, c.Header())
		}
		if !slices.Equal(rows[0], want) {
			t.Errorf("%s header = %q, want %q", s, rows[0], want)
		}
	}
}

func TestTemplateSiteSheet(t *testing.T) {
	opts := testTemplateOptions()
	f, _ := writeTestTemplate(t, opts)
	rows, err := f.GetRows(SheetSite)
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) == 0 || !slices.Equal(rows[0], []string{"Item", "Value"}) {
		t.Fatalf("Site header = %q, want [Item Value]", rows[0])
	}
	items := SiteItems()
	for i, it := range items {
		r := rows[i+1]
		if r[0] != it.Header() {
			t.Errorf("Site!A%d = %q, want %q", i+2, r[0], it.Header())
		}
		if len(r) > 1 && r[1] != "" {
			t.Errorf("Site!B%d = %q, want empty", i+2, r[1])
		}
	}
	// Cautions in column D below the items, columns A and B of those rows empty.
	first := len(items) + 3
	for i, c := range opts.Cautions {
		row := first + 1 + i
		got, _ := f.GetCellValue(SheetSite, "D"+itoa(row))
		if got != c {
			t.Errorf("Site!D%d = %q, want caution %q", row, got, c)
		}
		for _, col := range []string{"A", "B"} {
			if v, _ := f.GetCellValue(SheetSite, col+itoa(row)); v != "" {
				t.Errorf("Site!%s%d = %q, want empty beside the cautions", col, row, v)
			}
		}
	}
	// Every item's value cell has an input hint mentioning its default or need.
	dvs, err := f.GetDataValidations(SheetSite)
	if err != nil {
		t.Fatal(err)
	}
	for i, it := range items {
		cell := "B" + itoa(i+2)
		dv := findValidation(dvs, cell)
		if dv == nil || dv.Prompt == nil || !strings.Contains(*dv.Prompt, strings.TrimSuffix(it.Hint, ".")) {
			t.Errorf("Site!%s: no input hint with %q", cell, it.Hint)
		}
	}
}

func TestTemplateHintsAndDropDowns(t *testing.T) {
	f, _ := writeTestTemplate(t, testTemplateOptions())
	wantSource := map[string]string{
		ListStation:    "Stations!$A$2",
		ListAtmosphere: "Atmospheres!$A$2",
	}
	for _, s := range Sheets()[1:] {
		dvs, err := f.GetDataValidations(s)
		if err != nil {
			t.Fatal(err)
		}
		for i, c := range SheetColumns(s) {
			col, _ := excelize.ColumnNumberToName(i + 1)
			head := findValidation(dvs, col+"1")
			if head == nil || head.Prompt == nil || !strings.Contains(*head.Prompt, strings.TrimSuffix(c.Hint, ".")) {
				t.Errorf("%s!%s1 (%s): no input hint", s, col, c.Name)
			}
			if c.Unit != "" && (head == nil || !strings.Contains(*head.Prompt, c.Unit)) {
				t.Errorf("%s!%s1 (%s): hint does not give the unit %s", s, col, c.Name, c.Unit)
			}
			data := findValidation(dvs, col+"2")
			if data == nil || !strings.Contains(data.Sqref, itoa(TemplateRows+1)) {
				t.Errorf("%s!%s2 (%s): no validation over the data rows", s, col, c.Name)
				continue
			}
			if c.List == "" {
				if data.Type == "list" {
					t.Errorf("%s!%s (%s): drop-down on a column without a list", s, col, c.Name)
				}
				continue
			}
			if data.Type != "list" {
				t.Errorf("%s!%s (%s): type %q, want a list drop-down", s, col, c.Name, data.Type)
				continue
			}
			src := strings.ReplaceAll(data.Formula1, "'", "")
			if w, ok := wantSource[c.List]; ok {
				if !strings.HasPrefix(src, w) {
					t.Errorf("%s!%s (%s): list source %q, want %s...", s, col, c.Name, src, w)
				}
			} else if !strings.HasPrefix(src, SheetLists+"!") {
				t.Errorf("%s!%s (%s): list source %q, want a range on %s", s, col, c.Name, src, SheetLists)
			}
		}
	}
}

func TestTemplateListValues(t *testing.T) {
	opts := testTemplateOptions()
	f, _ := writeTestTemplate(t, opts)
	cols, err := f.GetCols(SheetLists)
	if err != nil {
		t.Fatal(err)
	}
	byName := map[string][]string{}
	for _, c := range cols {
		if len(c) > 0 {
			byName[c[0]] = c[1:]
		}
	}
	for name, values := range FixedLists() {
		if got := trimBlank(byName[name]); !slices.Equal(got, values) {
			t.Errorf("Lists %q = %q, want %q", name, got, values)
		}
	}
	if got := trimBlank(byName[ListSubstance]); !slices.Equal(got, opts.Substances) {
		t.Errorf("Lists Substance = %q, want %q", got, opts.Substances)
	}
	if got := byName[ListMaterial]; len(got) < len(opts.Materials) || !slices.Equal(got[:len(opts.Materials)], opts.Materials) {
		t.Errorf("Lists Material starts %q, want %q", got, opts.Materials)
	}
	// The Material list goes on with formulas that follow the Materials sheet.
	col := ""
	for i, c := range cols {
		if len(c) > 0 && c[0] == ListMaterial {
			col, _ = excelize.ColumnNumberToName(i + 1)
		}
	}
	cell := col + itoa(len(opts.Materials)+2)
	formula, err := f.GetCellFormula(SheetLists, cell)
	if err != nil || !strings.Contains(formula, SheetMaterials+"!A2") {
		t.Errorf("Lists!%s formula = %q (err %v), want one following Materials!A2", cell, formula, err)
	}
}

func TestTemplatePanesAndProps(t *testing.T) {
	f, _ := writeTestTemplate(t, testTemplateOptions())
	for _, s := range Sheets() {
		p, err := f.GetPanes(s)
		if err != nil {
			t.Fatal(err)
		}
		if !p.Freeze || p.YSplit != 1 {
			t.Errorf("%s panes = %+v, want the header row frozen", s, p)
		}
	}
	props, err := f.GetDocProps()
	if err != nil {
		t.Fatal(err)
	}
	if props.Title != WorkbookTitle {
		t.Errorf("Title = %q, want %q", props.Title, WorkbookTitle)
	}
	if !strings.HasPrefix(props.Created, "2026-01-01") || !strings.HasPrefix(props.Modified, "2026-01-01") {
		t.Errorf("Created/Modified = %q/%q, want the fixed date", props.Created, props.Modified)
	}
	for _, s := range Sheets() {
		w, err := f.GetColWidth(s, "A")
		if err != nil || w < 8 {
			t.Errorf("%s column A width %v (err %v), want at least 8", s, w, err)
		}
	}
}

func TestTemplateDeterministic(t *testing.T) {
	var a, b bytes.Buffer
	if err := WriteTemplate(&a, testTemplateOptions()); err != nil {
		t.Fatal(err)
	}
	if err := WriteTemplate(&b, testTemplateOptions()); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("two writes of the same template differ")
	}
}

func TestInputMessageLimits(t *testing.T) {
	for _, s := range Sheets()[1:] {
		for _, c := range SheetColumns(s) {
			if n := len([]rune(inputMessage(c))); n > 255 {
				t.Errorf("%s %s: hint of %d characters, over the 255 an input message may have", s, c.Name, n)
			}
			if n := len([]rune(inputTitle(c.Name))); n > 32 {
				t.Errorf("%s %s: title of %d characters", s, c.Name, n)
			}
		}
	}
	long := Column{Name: strings.Repeat("x", 40), Hint: strings.Repeat("y", 300), Unit: "m", Dim: Length}
	if n := len([]rune(inputMessage(long))); n != 255 {
		t.Errorf("long hint cut to %d characters, want 255", n)
	}
	if n := len([]rune(inputTitle(long.Name))); n != 32 {
		t.Errorf("long title cut to %d characters, want 32", n)
	}
}

// findValidation returns the validation whose range holds cell, or nil.
func findValidation(dvs []*excelize.DataValidation, cell string) *excelize.DataValidation {
	c, r, err := excelize.CellNameToCoordinates(cell)
	if err != nil {
		return nil
	}
	for _, dv := range dvs {
		for _, rng := range strings.Fields(dv.Sqref) {
			parts := strings.SplitN(rng, ":", 2)
			c1, r1, err := excelize.CellNameToCoordinates(parts[0])
			if err != nil {
				continue
			}
			c2, r2 := c1, r1
			if len(parts) == 2 {
				if c2, r2, err = excelize.CellNameToCoordinates(parts[1]); err != nil {
					continue
				}
			}
			if c >= c1 && c <= c2 && r >= r1 && r <= r2 {
				return dv
			}
		}
	}
	return nil
}

func trimBlank(s []string) []string {
	for len(s) > 0 && s[len(s)-1] == "" {
		s = s[:len(s)-1]
	}
	return s
}

func itoa(n int) string {
	c, _ := excelize.CoordinatesToCellName(1, n)
	return strings.TrimPrefix(c, "A")
}
