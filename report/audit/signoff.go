package audit

import (
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/xuri/excelize/v2"
)

// The sign-off block, on the Summary and at the end of the Report sheet: the
// revision and scope, then who prepared, reviewed and approved the audit and
// when, filled from the Site sheet's optional items (inventory.SignOff) where
// given and left as ruled lines to sign by hand where not. The signature is
// always a line: a typed name is not a signature.

// signoffNote says what a signature here means (and does not).
const signoffNote = "Signing confirms that the screening was reviewed as a screening: its figures are estimates that " +
	"defer to local codes, the site's hazardous-area classification and a competent person (see the Cautions)."

// signoffRole is one row of the block.
type signoffRole struct {
	role, name string
	on         time.Time
}

func signoffRoles(s inventory.SignOff) []signoffRole {
	return []signoffRole{
		{"Prepared by", s.PreparedBy, s.PreparedOn},
		{"Reviewed by", s.ReviewedBy, s.ReviewedOn},
		{"Approved by", s.ApprovedBy, s.ApprovedOn},
	}
}

// signoffSpans are the sheet columns (1-based, first and last) of the
// block's four fields: role, name, signature, date.
type signoffSpans [4][2]int

// signoff writes the sign-off block into sheet from row r and returns the
// next free row; the block ends at the date's last column.
func (wb *workbook) signoff(sheet string, r int, sp signoffSpans) (int, error) {
	f := wb.f
	so := wb.a.Survey.Site.SignOff
	line, err := f.NewStyle(&excelize.Style{
		Border:    []excelize.Border{{Type: "bottom", Color: "000000", Style: 1}},
		Alignment: &excelize.Alignment{Vertical: "bottom", WrapText: true},
		Font:      &excelize.Font{Size: 10, Family: "Liberation Sans"},
	})
	if err != nil {
		return r, err
	}
	// Signature and date fields also ruled on their left, so that the three
	// lines of a row read as three fields, not one.
	field, err := f.NewStyle(&excelize.Style{
		Border:    []excelize.Border{{Type: "bottom", Color: "000000", Style: 1}, {Type: "left", Color: "000000", Style: 1}},
		Alignment: &excelize.Alignment{Vertical: "bottom", WrapText: true, Indent: 1},
		Font:      &excelize.Font{Size: 10, Family: "Liberation Sans"},
	})
	if err != nil {
		return r, err
	}
	label, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true, Size: 10, Family: "Liberation Sans"}, Alignment: &excelize.Alignment{Vertical: "bottom"}})
	if err != nil {
		return r, err
	}
	cell := func(col, row int) string { ref, _ := excelize.CoordinatesToCellName(col, row); return ref }
	// put writes v over the span from column a to b of row, merged, in style st.
	put := func(row, a, b int, v string, st int) error {
		from, to := cell(a, row), cell(b, row)
		if b > a {
			if err := f.MergeCell(sheet, from, to); err != nil {
				return err
			}
		}
		if v != "" {
			if err := f.SetCellValue(sheet, from, v); err != nil {
				return err
			}
		}
		return f.SetCellStyle(sheet, from, to, st)
	}
	last := sp[3][1]
	// The block starts a printed page of its own, so that it is never cut in two.
	if err := f.InsertPageBreak(sheet, cell(1, r)); err != nil {
		return r, err
	}
	ref := cell(1, r)
	if err := f.SetCellValue(sheet, ref, "Sign-off"); err != nil {
		return r, err
	}
	if err := f.SetCellStyle(sheet, ref, cell(last, r), wb.st.Section()); err != nil {
		return r, err
	}
	r++
	for _, kv := range [][2]string{{"Revision", so.Revision}, {"Scope", so.Scope}} {
		if err := put(r, sp[0][0], sp[0][1], kv[0], label); err != nil {
			return r, err
		}
		if err := put(r, sp[1][0], last, kv[1], line); err != nil {
			return r, err
		}
		if err := f.SetRowHeight(sheet, r, rowCap(wrappedHeight(kv[1], colsWidth(f, sheet, sp[1][0], last))+6)); err != nil {
			return r, err
		}
		r++
	}
	r++
	for i, h := range []string{"Role", "Name", "Signature", "Date"} {
		if err := put(r, sp[i][0], sp[i][1], h, label); err != nil {
			return r, err
		}
	}
	r++
	for _, ro := range signoffRoles(so) {
		date := ""
		if !ro.on.IsZero() {
			date = ro.on.UTC().Format("2006-01-02")
		}
		for i, v := range []string{ro.role, ro.name, "", date} {
			st := line
			switch i {
			case 0:
				st = label
			case 2, 3:
				st = field
			}
			if err := put(r, sp[i][0], sp[i][1], v, st); err != nil {
				return r, err
			}
		}
		if err := f.SetRowHeight(sheet, r, 30); err != nil { // room to sign
			return r, err
		}
		r++
	}
	r++
	if err := put(r, 1, last, signoffNote, wb.st.Of(book.WrapText(""))); err != nil {
		return r, err
	}
	if err := f.SetRowHeight(sheet, r, rowCap(wrappedHeight(signoffNote, colsWidth(f, sheet, 1, last)))); err != nil {
		return r, err
	}
	return r + 1, nil
}

// colsWidth is the width of columns a to b of sheet, in characters.
func colsWidth(f *excelize.File, sheet string, a, b int) float64 {
	w := 0.0
	for c := a; c <= b; c++ {
		name, _ := excelize.ColumnNumberToName(c)
		x, err := f.GetColWidth(sheet, name)
		if err != nil {
			x = 9
		}
		w += x
	}
	return w
}

// summarySignoff is the block's place on the Summary: role A, name B-C,
// signature D-F, date G-H.
var summarySignoff = signoffSpans{{1, 1}, {2, 3}, {4, 6}, {7, 8}}

// jsonSignOff is the sign-off block in the JSON: every field, "" when the
// Site sheet leaves it to be signed by hand.
type jsonSignOff struct {
	PreparedBy string `json:"prepared_by"`
	PreparedOn string `json:"prepared_on"`
	ReviewedBy string `json:"reviewed_by"`
	ReviewedOn string `json:"reviewed_on"`
	ApprovedBy string `json:"approved_by"`
	ApprovedOn string `json:"approved_on"`
	Revision   string `json:"revision"`
	Scope      string `json:"scope"`
}

func signoffJSON(s inventory.SignOff) jsonSignOff {
	d := func(t time.Time) string {
		if t.IsZero() {
			return ""
		}
		return t.UTC().Format("2006-01-02")
	}
	return jsonSignOff{s.PreparedBy, d(s.PreparedOn), s.ReviewedBy, d(s.ReviewedOn), s.ApprovedBy, d(s.ApprovedOn), s.Revision, s.Scope}
}
