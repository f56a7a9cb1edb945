package assess

import (
	"bytes"
	"flag"
	"fmt"
	"go/format"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

var updateLimitItems = flag.Bool("update", false, "rewrite inventory/limititems_gen.go from model's limit table")

// limitItemsFile is the generated view of model's limit table that inventory
// validates Site limit items with (inventory and model import neither each
// other, so the view is generated source, checked here).
const limitItemsFile = "../../inventory/limititems_gen.go"

// dimensionOfSI names the inventory dimension of a limit table SI unit.
var dimensionOfSI = map[string]string{
	"1": "Dimensionless", "J": "Energy", "Ω": "Resistance", "C": "Charge", "m²": "Area",
	"C/m²": "ChargeDensity", "V": "Potential", "m": "Length", "V/m": "ElectricField", "m/s": "Speed",
	"m²/s": "SpeedDiameter", "S/m": "Conductivity", "A": "Current", "F": "Capacitance", "s": "Time",
}

// limitItemsSource is the source of inventory/limititems_gen.go: every Site
// item of the limit table (a row's own item, then the general items that set
// it with others), in table order, with its practical unit, dimension and what it sets.
func limitItemsSource() ([]byte, error) {
	type item struct {
		name, unit, si string
		keys           []string
		label          string
	}
	var items []*item
	byName := map[string]*item{}
	for _, s := range model.LimitTable() {
		for _, name := range append([]string{s.SiteItem}, s.Also...) {
			if name == "" {
				continue
			}
			it := byName[name]
			if it == nil {
				it = &item{name: name, unit: s.SiteUnit, si: s.Unit, label: s.Label}
				byName[name] = it
				items = append(items, it)
			}
			if it.unit != s.SiteUnit || it.si != s.Unit {
				return nil, fmt.Errorf("Site item %q sets limits of different units", name)
			}
			it.keys = append(it.keys, s.Key)
		}
	}
	var b bytes.Buffer
	b.WriteString("// Code generated from model.LimitTable by `go test ./report/assess -run TestLimitItemsFile -update`; DO NOT EDIT.\n\n")
	b.WriteString("package inventory\n\n")
	b.WriteString("// limitItems are the Site sheet's limit items, a view of model's limit table\n// (model/defaults.go): name, practical unit, dimension and what each sets.\n")
	b.WriteString("var limitItems = []LimitItem{\n")
	for _, it := range items {
		dim, ok := dimensionOfSI[it.si]
		if !ok {
			return nil, fmt.Errorf("Site item %q: no inventory dimension for SI unit %q", it.name, it.si)
		}
		label := it.label
		if i := strings.LastIndex(label, ", "); len(it.keys) > 1 && i > 0 {
			label = label[:i] // a family's label without the group or class of its first row
		}
		note := strings.Join(it.keys, ", ") + ": " + label
		fmt.Fprintf(&b, "\t{Name: %q, Unit: %q, Dim: %s, Note: %q},\n", it.name, it.unit, dim, note)
	}
	b.WriteString("}\n")
	return format.Source(b.Bytes())
}

// TestLimitItemsFile: inventory's Site limit items are the current view of
// model's limit table; -update rewrites them.
func TestLimitItemsFile(t *testing.T) {
	want, err := limitItemsSource()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.FromSlash(limitItemsFile)
	if *updateLimitItems {
		if err := os.WriteFile(path, want, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	got, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Fatalf("%s is not the view of model.LimitTable: run go test ./report/assess -run TestLimitItemsFile -update", limitItemsFile)
	}
}

// TestLimitItemsSetTheirLimits: every Site item inventory accepts sets at
// least one limit through model.SetLimitItem, and its practical unit is one
// its dimension takes, so check and assess accept and apply the same rows.
func TestLimitItemsSetTheirLimits(t *testing.T) {
	for _, k := range inventory.LimitItems() {
		l := model.DefaultLimits()
		if !model.SetLimitItem(&l, k.Name, 1) {
			t.Errorf("Site item %q sets no limit", k.Name)
		}
		if _, ok := k.FromSI(1); !ok {
			t.Errorf("Site item %q: unit %q does not fit its dimension %s", k.Name, k.Unit, k.Dim)
		}
	}
}
