package assess

import (
	"math"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// TestLimitSiteItems: the Site item of a few limits (the limit table's
// SiteItem, found by inventory under the same name), and each default
// converted to the item's practical unit. Expected values: the defaults
// listed by 'sparkmargin library' in SI, converted by hand (1 mJ = 1e-3 J,
// 1 nC = 1e-9 C, 1 cm² = 1e-4 m²).
func TestLimitSiteItems(t *testing.T) {
	rows := map[string]model.LimitSpec{}
	for _, s := range model.LimitTable() {
		rows[s.Key] = s
	}
	cases := []struct {
		limit, item, unit string
		practical         float64 // the default in the item's unit
	}{
		{"ShockEnergy", "shock energy", "mJ", 350},                                 // 0.35 J, TRGS 727 Annex D
		{"BrushEnergy", "brush energy", "mJ", 4},                                   // 0.004 J, CLC/TR 50404 summaries (upper end of 3-4 mJ)
		{"BrushArea", "brush area", "cm²", 100},                                    // 0.01 m², screening choice of this tool
		{"TransferredCharge[IIB]", "transferred charge iib", "nC", 25},             // 2.5e-8 C, IEC 60079-0:2017 7.4.2 (from memory)
		{"AreaGa[IIC]", "insulating area zone 0 iic", "cm²", 4},                    // 4e-4 m², IEC 60079-0:2017 (from memory)
		{"VesselVDHigh[road tanker]", "filling vd limit road tanker", "m²/s", 0.5}, // IEC TS 60079-32-1, road tankers 0.5 m²/s above 10 pS/m
		{"PersonMaxPotential", "person maximum potential", "kV", 15},               // 15e3 V, ESD Association table, 12 kV rounded up
	}
	for _, c := range cases {
		s, ok := rows[c.limit]
		if !ok || s.SiteItem != c.item || s.SiteUnit != c.unit {
			t.Errorf("%s: item %q [%s], want %q [%s]", c.limit, s.SiteItem, s.SiteUnit, c.item, c.unit)
			continue
		}
		k, ok := inventory.LimitItemNamed(s.SiteItem)
		if !ok || k.Unit != c.unit {
			t.Errorf("%s: inventory item %+v", c.limit, k)
			continue
		}
		v, ok := k.FromSI(s.Default)
		if !ok || math.Abs(v-c.practical) > 1e-9*math.Abs(c.practical) {
			t.Errorf("%s: %g %s, want %g", c.limit, v, k.Unit, c.practical)
		}
	}
}
