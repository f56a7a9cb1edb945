package audit

import (
	"bytes"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
	"github.com/xuri/excelize/v2"
)

// TestCappedPotentialMarkedEstimate: on the demo, an unmeasured conductor's
// potential capped at the plant maximum (50 kV, a screening choice) is an
// estimate and its Objects cell carries est., as a person's estimated body
// potential does; the RH used, entered on the Site or Stations sheet, is
// marked ent., never est.
func TestCappedPotentialMarkedEstimate(t *testing.T) {
	a := demoAudit(t, 0)
	var b bytes.Buffer
	if err := WriteWorkbook(&b, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, b.Bytes())
	rows := rowsOf(t, f, SheetObjects)
	pot, rh := colIndex(t, rows[0], "Potential [kV]"), colIndex(t, rows[0], "RH used [%]")
	capped := 0
	for i := range a.Objects {
		o := &a.Objects[i]
		if o.Eval.Flags&model.FlagCappedConductor == 0 {
			continue
		}
		for r, row := range rows {
			if len(row) == 0 || row[0] != o.Object.ID {
				continue
			}
			capped++
			cell, _ := excelize.CoordinatesToCellName(pot+1, r+1)
			if got := numFmtOf(t, f, SheetObjects, cell); !strings.Contains(got, "est.") {
				t.Errorf("%s: capped potential %s shown with format %q, want est.", o.Object.ID, row[pot], got)
			}
			rc, _ := excelize.CoordinatesToCellName(rh+1, r+1)
			if got := numFmtOf(t, f, SheetObjects, rc); strings.Contains(got, "est.") {
				t.Errorf("%s: entered RH shown as an estimate (%q)", o.Object.ID, got)
			}
		}
	}
	if capped == 0 {
		t.Skip("the demo has no capped conductor")
	}
}

func numFmtOf(t *testing.T, f *excelize.File, sheet, cell string) string {
	t.Helper()
	id, err := f.GetCellStyle(sheet, cell)
	if err != nil {
		t.Fatal(err)
	}
	st, err := f.GetStyle(id)
	if err != nil {
		t.Fatal(err)
	}
	if st.CustomNumFmt != nil {
		return *st.CustomNumFmt
	}
	return ""
}
