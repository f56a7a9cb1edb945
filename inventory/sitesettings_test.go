package inventory

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func relClose(got, want float64) bool { return math.Abs(got-want) <= 1e-12*math.Abs(want) }

// TestSiteSettingsNumbersAsCells: a Site limit or uncertainty value is read
// with the number grammar of a survey cell, so "1,5 mJ" is 1.5 mJ on the Site
// sheet as in an Objects cell (derived: unit arithmetic, 1.5 mJ = 1.5e-3 J).
func TestSiteSettingsNumbersAsCells(t *testing.T) {
	cell, err := ParseQuantity("1,5 mJ", "", Energy)
	if err != nil || !relClose(cell.Value, 1.5e-3) {
		t.Fatalf("cell 1,5 mJ: %v, %v", cell.Value, err)
	}
	// The values are invented for the test; the expected ones are unit arithmetic
	// (derived): "12,5" % is a spread of 0.125.
	items := []SiteItem{
		{Key: "brush energy", Item: "Brush energy", Value: "1,5 mJ", Row: 8},
		{Key: "shock energy [mj]", Item: "Shock energy [mJ]", Value: "1,5", Row: 9},
		{Key: "uncertainty field [%]", Item: "Uncertainty field [%]", Value: "12,5", Row: 10},
		{Key: "safe potential [v]", Item: "Safe potential [V]", Value: "1,5,0", Row: 11}, // two commas: not a number
	}
	lims, uncs, probs := SiteSettings(items)
	got := map[string]float64{}
	for _, l := range lims {
		got[l.Name] = l.Value
	}
	if !relClose(got["brush energy"], cell.Value) || !relClose(got["shock energy"], cell.Value) {
		t.Errorf("limits %v, want both %v J as the cell", got, cell.Value)
	}
	if len(uncs) != 1 || !relClose(uncs[0].Spread, 0.125) {
		t.Errorf("uncertainties %+v, want the field spread 0.125", uncs)
	}
	if len(probs) != 1 || probs[0].Row != 11 || probs[0].Severity != Error || !errors.Is(probs[0].Err, ErrLimitValue) {
		t.Errorf("problems %+v, want one error on row 11", probs)
	}
}

// TestSiteSettingsRejectRow: each unusable value is an Error at its value
// (column B) and gives no override; an unknown item is one Warning at its
// name (column A).
func TestSiteSettingsRejectRow(t *testing.T) {
	cases := []struct {
		item, value string
		col         string
		sev         Severity
		err         error
	}{
		{"Shock energy [mJ]", "abc", "B", Error, ErrLimitValue},
		{"Shock energy [mJ]", "", "B", Error, ErrLimitValue},
		{"Safe potential [kV]", "-1", "B", Error, ErrLimitValue},
		{"Brush area [kV]", "5", "B", Error, ErrLimitValue},
		{"Uncertainty speed [mm]", "5", "B", Error, ErrUncertaintyValue},
		{"Uncertainty MIE gas [factor]", "0.5", "B", Error, ErrUncertaintyValue},
		{"Uncertainty of everything", "5", "A", Warning, ErrUnknownSiteItem},
		{"Colour of the door", "red", "A", Warning, ErrUnknownSiteItem},
	}
	for _, c := range cases {
		lims, uncs, probs := SiteSettings([]SiteItem{{Key: NormalizeName(c.item), Item: c.item, Value: c.value, Row: 7}})
		if len(lims)+len(uncs) != 0 {
			t.Errorf("%s = %q: an override was kept: %+v %+v", c.item, c.value, lims, uncs)
		}
		if len(probs) != 1 || probs[0].Column != c.col || probs[0].Severity != c.sev || !errors.Is(probs[0].Err, c.err) || probs[0].Row != 7 || probs[0].Sheet != SheetSite {
			t.Errorf("%s = %q: problems %+v, want one %v at column %s (%v)", c.item, c.value, probs, c.sev, c.col, c.err)
		}
	}
}

// TestSiteLimitItemsReadAsCells: every Site limit item reads "1,5 <its unit>"
// exactly as ParseQuantity reads a survey cell of its dimension (one grammar
// for cells and Site items), and the new Site-only dimensions convert by unit
// arithmetic (derived: 1 µC/m² = 1e-6 C/m², 1 cm² = 1e-4 m², 1 nC = 1e-9 C).
func TestSiteLimitItemsReadAsCells(t *testing.T) {
	for i, k := range LimitItems() {
		if k.Dim == Dimensionless {
			continue
		}
		value := "1,5 " + k.Unit
		cell, err := ParseQuantity(value, "", k.Dim)
		if err != nil {
			t.Errorf("%s: cell %q: %v", k.Name, value, err)
			continue
		}
		lims, _, probs := SiteSettings([]SiteItem{{Key: k.Name, Item: k.Name, Value: value, Row: 10 + i}})
		if len(probs) != 0 || len(lims) != 1 || lims[0].Value != cell.Value {
			t.Errorf("%s = %q: limits %+v problems %+v, want %g as the cell", k.Name, value, lims, probs, cell.Value)
		}
	}
	cases := []struct {
		key, value string
		want       float64
	}{
		{"brush charge density iib", "1,5 µC/m²", 1.5e-6},
		{"brush charge density iib [uC/m^2]", "2", 2e-6},
		{"brush area", "0,01 m²", 0.01},
		{"brush area [cm2]", "50", 50e-4},
		{"transferred charge iic", "12 nC", 12e-9},
		{"filling vd limit drum", "0,38", 0.38},
		{"zone 0 charge factor", "0,4", 0.4},
	}
	for _, c := range cases {
		name, unit := splitItemUnit(c.key)
		lims, _, probs := SiteSettings([]SiteItem{{Key: c.key, Item: name + " [" + unit + "]", Value: c.value, Row: 5}})
		if len(probs) != 0 || len(lims) != 1 || !relClose(lims[0].Value, c.want) {
			t.Errorf("%s = %q: %+v %+v, want %g", c.key, c.value, lims, probs, c.want)
		}
	}
}

// TestSiteLimitItemMisspelt: a misspelt limit item is a warning that names
// the limit item meant (invented example).
func TestSiteLimitItemMisspelt(t *testing.T) {
	_, _, probs := SiteSettings([]SiteItem{{Key: "shock enrgy [mj]", Item: "Shock enrgy [mJ]", Value: "400", Row: 7}})
	if len(probs) != 1 || probs[0].Severity != Warning || !strings.Contains(probs[0].Fix, "shock energy") {
		t.Errorf("problems %+v, want one warning suggesting \"shock energy\"", probs)
	}
}
