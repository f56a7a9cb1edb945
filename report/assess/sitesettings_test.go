package assess

import (
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// siteWith validates Site items as the inventory reader does and returns the
// Site with its overrides, and the problems the reader would report.
func siteWith(items []inventory.SiteItem) (inventory.Site, []inventory.Problem) {
	lims, uncs, probs := inventory.SiteSettings(items)
	return inventory.Site{Items: items, Limits: lims, Uncertainties: uncs}, probs
}

// TestUncertaintyItemsMatchTable: inventory's uncertainty items are the
// table's Site keys, in order, with the table's units and a scale that fits
// the row's distribution.
func TestUncertaintyItemsMatchTable(t *testing.T) {
	items, tab := inventory.UncertaintyItems(), DefaultUncertainties()
	if len(items) != len(tab) {
		t.Fatalf("%d uncertainty items, %d table rows", len(items), len(tab))
	}
	for i, u := range tab {
		it := items[i]
		want := map[Distribution]inventory.SpreadScale{NormalRelative: inventory.SpreadRelative, LogNormal: inventory.SpreadLog}[u.Dist]
		if u.Dist == NormalAbsolute {
			want = inventory.SpreadLength
			if u.Unit == "%RH" {
				want = inventory.SpreadRH
			}
		}
		if it.Name != u.SiteKey || it.Unit != u.Unit || it.Scale != want {
			t.Errorf("row %d: item %+v, table key %q unit %q distribution %v", i, it, u.SiteKey, u.Unit, u.Dist)
		}
	}
}
