package audit

import (
	"testing"

	"github.com/sparkmargin/sparkmargin/report/book"
)

// Review item 19: the "Verify before relying on these" table shows the
// large-tank diameter in its Site item's unit (m), as the Limits table does:
// the review saw "10000 mm" beside a Site item given in m, i.e. 10 m.
func TestVerifyRowsInSiteItemUnit(t *testing.T) {
	a := demoAudit(t, 0)
	for _, r := range verifyRows(a, nil) {
		if r.key != "LargeTankDiameter" {
			continue
		}
		if r.unit != book.UnitMetre || r.unit.Text(r.value) != "10.0 m" && r.unit.Text(r.value) != "10 m" {
			t.Errorf("large-tank diameter shown as %q, want 10 m", r.unit.Text(r.value))
		}
		return
	}
	t.Skip("the large-tank diameter is not listed as recalled")
}
