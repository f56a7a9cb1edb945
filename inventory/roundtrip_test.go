package inventory

import (
	"bytes"
	"fmt"
	"testing"

	"github.com/xuri/excelize/v2"
)

// The blank template, filled with one valid row per sheet, reads without
// errors: the reader reads exactly what the template writes. Values invented
// for the test.
func TestTemplateFillRead(t *testing.T) {
	var buf bytes.Buffer
	opts := TemplateOptions{Materials: []string{"PET"}, Substances: []string{"toluene"}, Cautions: []string{"A caution."}}
	if err := WriteTemplate(&buf, opts); err != nil {
		t.Fatal(err)
	}
	blank, err := Read(buf.Bytes(), "blank.xlsx", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	utAccounted(t, blank)
	f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	site := map[string]any{"Site": "Round trip plant", "Survey date": "2026-03-14", "Relative humidity": 40}
	for i, it := range SiteItems() {
		if v, ok := site[it.Name]; ok {
			f.SetCellValue(SheetSite, fmt.Sprintf("B%d", i+2), v)
		}
	}
	fill := func(sheet string, vals map[string]any) {
		for i, c := range SheetColumns(sheet) {
			if v, ok := vals[c.Name]; ok {
				cell, _ := excelize.CoordinatesToCellName(i+1, 2)
				f.SetCellValue(sheet, cell, v)
			}
		}
	}
	fill(SheetAtmospheres, map[string]any{"ID": "A-1", "Substance": "toluene", "Kind": "vapour", "Zone": "1"})
	fill(SheetStations, map[string]any{"ID": "ST-1", "Atmosphere": "A-1"})
	fill(SheetObjects, map[string]any{"ID": "OP-1", "Station": "ST-1", "Kind": "person", "Resistance to earth": 1e7})
	fill(SheetMaterials, map[string]any{"Name": "board", "Class": "dissipative"})
	var out bytes.Buffer
	if _, err := f.WriteTo(&out); err != nil {
		t.Fatal(err)
	}
	s, err := Read(out.Bytes(), "filled.xlsx", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	utAccounted(t, s)
	if len(s.Errors()) != 0 || len(s.Objects) != 1 || len(s.Stations) != 1 || len(s.Atmospheres) != 1 {
		t.Fatalf("filled template: %d objects\n%s", len(s.Objects), utDump(s))
	}
	for _, p := range s.Problems {
		t.Logf("%s %s", p.Severity, p.Error())
	}
}
