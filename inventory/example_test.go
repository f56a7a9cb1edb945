package inventory_test

import (
	"fmt"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// A cell's own unit wins over the header's; values come back in SI units.
// Source: SI prefixes (SI Brochure, 9th ed.), derived: 2.5 MV/m = 2.5e6 V/m; 150 pF = 1.5e-10 F.
func ExampleParseQuantity() {
	p, _ := inventory.ParseQuantity("2.5 MV/m", "kV/m", inventory.ElectricField)
	fmt.Println(p.Value, p.Known)
	p, _ = inventory.ParseQuantity("12 ±10%", "kV/m", inventory.ElectricField)
	fmt.Println(p.Value, p.RelUncertainty)
	p, _ = inventory.ParseQuantity("n/a", "pF", inventory.Capacitance)
	fmt.Println(p.Known, p.Note)
	_, err := inventory.ParseQuantity("150 pF", "Ω", inventory.Resistance)
	fmt.Println(err)
	// Output:
	// 2.5e+06 true
	// 12000 0.1
	// false "n/a" read as not measured
	// "150 pF" has the dimension of capacitance but the column needs a resistance (Ω)
}

// Headers match with or without their unit; a unit in the header replaces the default.
func ExampleMatchHeader() {
	cols := inventory.SheetColumns(inventory.SheetObjects)
	for _, h := range []string{"Field [kV/m]", "field", "FIELD (V/m)", "Resistance to earth ohm"} {
		m, ok, err := inventory.MatchHeader(h, cols)
		fmt.Println(m.Column.Name, m.Unit, ok, err)
	}
	// Output:
	// Field kV/m true <nil>
	// Field kV/m true <nil>
	// Field V/m true <nil>
	// Resistance to earth ohm true <nil>
}
