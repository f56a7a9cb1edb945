package audit

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// TestLimitsInTheSiteItemsUnit: the Method sheet's "Limits applied" shows each
// limit in the practical unit of the Site item that overrides it, so the value
// applied reads as the item is typed (4 kV, not 4000 V; 10 m, not 10000 mm).
func TestLimitsInTheSiteItemsUnit(t *testing.T) {
	for _, s := range model.LimitTable() {
		if s.SiteUnit == "" {
			continue
		}
		if got := limitUnit(s).Label(); got != s.SiteUnit {
			t.Errorf("%s: Method unit %q, Site item %q in %q", s.Key, got, s.SiteItem, s.SiteUnit)
		}
	}
	// Check values: defaults in SI from the table, shown in the Site item's unit.
	// Source: hand conversion (1 kV = 1000 V; 1 m = 1000 mm).
	want := map[string]float64{
		"PropagatingBreakdown":  4,  // 4e3 V
		"PersonMaxPotential":    15, // 15e3 V
		"ConductorMaxPotential": 50, // 50e3 V
		"LargeTankDiameter":     10, // 10 m
	}
	rows := limitRows(model.DefaultLimits())
	for _, s := range model.LimitTable() {
		w, ok := want[s.Key]
		if !ok {
			continue
		}
		for _, r := range rows {
			if r.name == s.Label {
				got := r.unit.Text(r.value)
				f, err := strconv.ParseFloat(strings.Fields(got)[0], 64)
				if err != nil || math.Abs(f-w) > 1e-9*w {
					t.Errorf("%s shown as %q, want %g %s", s.Key, got, w, s.SiteUnit)
				}
			}
		}
	}
}
