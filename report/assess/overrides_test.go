package assess

import (
	"math"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// TestLimitOverrides: the Site items found for a few limits, and each
// default converted to the item's practical unit. Expected values: the
// defaults listed by 'sparkmargin library' in SI, converted by hand
// (1 mJ = 1e-3 J, 1 nC = 1e-9 C, 1 cm² = 1e-4 m², 1 pS/m = 1e-12 S/m).
func TestLimitOverrides(t *testing.T) {
	ov := LimitOverrides()
	def := map[string]float64{}
	for _, c := range model.LimitSources() {
		def[c.Limit] = c.Value
	}
	cases := []struct {
		limit, item, unit string
		practical         float64 // the default in the item's unit
	}{
		{"ShockEnergy", "shock energy", "mJ", def["ShockEnergy"] * 1e3},
		{"BrushEnergy", "brush energy", "mJ", 4},                       // 0.004 J, CLC/TR 50404 summaries (upper end of 3-4 mJ)
		{"BrushArea", "brush area", "cm²", 100},                        // 0.01 m², screening choice of this tool
		{"TransferredCharge[IIB]", "transferred charge iib", "nC", 25}, // 2.5e-8 C, IEC 60079-0:2017 7.4.2 (from memory)
		{"AreaGa[IIC]", "insulating area zone 0 iic", "cm²", 4},        // 4e-4 m², IEC 60079-0:2017 (from memory)
		{"VesselVDHigh[road tanker]", "filling vd limit road tanker", "m²/s", def["VesselVDHigh[road tanker]"]},
	}
	for _, c := range cases {
		k, ok := ov[c.limit]
		if !ok {
			t.Errorf("%s: no Site item found", c.limit)
			continue
		}
		if k.Name != c.item || k.Unit != c.unit {
			t.Errorf("%s: item %q [%s], want %q [%s]", c.limit, k.Name, k.Unit, c.item, c.unit)
		}
		v, ok := k.FromSI(def[c.limit])
		if !ok || math.Abs(v-c.practical) > 1e-9*math.Abs(c.practical) {
			t.Errorf("%s: %g %s, want %g", c.limit, v, k.Unit, c.practical)
		}
	}
	// Every Site item overrides at least one listed limit.
	named := map[string]bool{}
	for _, k := range ov {
		named[k.Name] = true
	}
	for name := range limitSetters() {
		if !named[name] && name != "filling vd limit" && name != "filling vd limit low conductivity" && name != "maximum filling velocity" {
			t.Errorf("Site item %q is named for no limit", name)
		}
	}
}
