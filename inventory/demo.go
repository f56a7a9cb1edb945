package inventory

// Regenerate testdata/demo/demo-survey.xlsx and testdata/broken/*.xlsx from
// the Go source (the broken surveys' .golden files are written by hand):
//go:generate go test -run "TestDemoSurveyFile|TestBrokenSurveyFiles" -update

import (
	"bytes"
	"fmt"
	"io"
	"time"

	"github.com/xuri/excelize/v2"
)

// SheetRows is one sheet of a survey workbook as cells: Rows[0] is the header
// row, and each cell is a string, a float64, an int, a time.Time or nil (blank).
type SheetRows struct {
	Name string
	Rows [][]any
}

// SurveySheets is a whole survey workbook as cells, sheets in workbook order.
// WriteSurvey writes it; the demo survey and the broken test surveys are built as
// SurveySheets so that each .xlsx is reproducible from Go source.
type SurveySheets []SheetRows

// Sheet returns the sheet with the given name, or nil.
func (s SurveySheets) Sheet(name string) *SheetRows {
	for i := range s {
		if s[i].Name == name {
			return &s[i]
		}
	}
	return nil
}

// Clone returns a deep copy whose rows can be changed without touching s.
func (s SurveySheets) Clone() SurveySheets {
	out := make(SurveySheets, len(s))
	for i, sh := range s {
		out[i].Name = sh.Name
		out[i].Rows = make([][]any, len(sh.Rows))
		for j, r := range sh.Rows {
			out[i].Rows[j] = append([]any(nil), r...)
		}
	}
	return out
}

// WriteSurvey writes the sheets as a survey workbook to w: bold frozen header
// rows, readable widths, dates as spreadsheet dates shown yyyy-mm-dd, fixed
// document properties. The same sheets always give the same bytes.
func WriteSurvey(w io.Writer, sheets SurveySheets) error {
	f := excelize.NewFile()
	defer f.Close()
	if err := writeSurvey(f, sheets); err != nil {
		return fmt.Errorf("survey: %w", err)
	}
	if _, err := f.WriteTo(w); err != nil {
		return fmt.Errorf("survey: writing the workbook: %w", err)
	}
	return nil
}

func writeSurvey(f *excelize.File, sheets SurveySheets) error {
	if len(sheets) == 0 {
		return fmt.Errorf("no sheets to write")
	}
	if err := setWorkbookProps(f); err != nil {
		return err
	}
	st, err := newSheetStyles(f)
	if err != nil {
		return err
	}
	for i, sh := range sheets {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", sh.Name); err != nil {
				return err
			}
		} else if _, err := f.NewSheet(sh.Name); err != nil {
			return err
		}
		if err := writeSheetRows(f, st, sh); err != nil {
			return fmt.Errorf("sheet %s: %w", sh.Name, err)
		}
	}
	f.SetActiveSheet(0)
	return nil
}

func writeSheetRows(f *excelize.File, st sheetStyles, sh SheetRows) error {
	width := 0
	for r, row := range sh.Rows {
		if len(row) > width {
			width = len(row)
		}
		for c, v := range row {
			if v == nil {
				continue
			}
			cell, err := excelize.CoordinatesToCellName(c+1, r+1)
			if err != nil {
				return err
			}
			switch x := v.(type) {
			case string:
				err = f.SetCellStr(sh.Name, cell, x)
			case time.Time:
				if err = f.SetCellValue(sh.Name, cell, x); err == nil {
					err = f.SetCellStyle(sh.Name, cell, cell, st.date)
				}
			case float64, int:
				err = f.SetCellValue(sh.Name, cell, x)
			default:
				return fmt.Errorf("cell %s: unsupported value type %T", cell, v)
			}
			if err != nil {
				return fmt.Errorf("cell %s: %w", cell, err)
			}
		}
	}
	if width == 0 {
		return nil
	}
	last, err := excelize.ColumnNumberToName(width)
	if err != nil {
		return err
	}
	if err := f.SetCellStyle(sh.Name, "A1", last+"1", st.header); err != nil {
		return err
	}
	for c := 0; c < width; c++ {
		col, _ := excelize.ColumnNumberToName(c + 1)
		w := 12.0
		if len(sh.Rows) > 0 && c < len(sh.Rows[0]) {
			if h, ok := sh.Rows[0][c].(string); ok {
				w = columnWidth(Column{Name: h})
			}
		}
		if sh.Name == SheetSite {
			w = 26
			if c == 1 {
				w = 50
			}
		}
		if err := f.SetColWidth(sh.Name, col, col, w); err != nil {
			return err
		}
	}
	return freezeHeader(f, sh.Name, 0)
}

// DemoSurveyBytes returns the demo survey workbook (see DemoSurvey), generated in
// memory; the demo command writes these bytes.
func DemoSurveyBytes() ([]byte, error) {
	var buf bytes.Buffer
	if err := WriteSurvey(&buf, DemoSurvey()); err != nil {
		return nil, fmt.Errorf("demo survey: %w", err)
	}
	return buf.Bytes(), nil
}

// DemoSurvey returns the survey of the invented demo plant (templates/demo-plant.md):
// the coating and converting line C2 of an invented works, its mixing room and its
// filling hall, surveyed on a dry winter day. Every value is invented for the demo;
// the mix of outcomes is deliberate (some stations clearly incendive, some
// marginal, some non-incendive), so that the audit shows each kind of result.
func DemoSurvey() SurveySheets {
	return SurveySheets{
		{Name: SheetSite, Rows: demoSite()},
		{Name: SheetAtmospheres, Rows: demoAtmospheres()},
		{Name: SheetStations, Rows: demoStations()},
		{Name: SheetObjects, Rows: demoObjects()},
		{Name: SheetMaterials, Rows: demoMaterials()},
	}
}

func headerRow(cols []Column) []any {
	row := make([]any, len(cols))
	for i, c := range cols {
		row[i] = c.Header()
	}
	return row
}

// rowOf builds a row of the given columns from name/value pairs; names are
// column names without unit. A wrong name is a programming mistake: it panics.
func rowOf(cols []Column, kv ...any) []any {
	if len(kv)%2 != 0 {
		panic("inventory: rowOf needs name/value pairs")
	}
	row := make([]any, len(cols))
	for i := 0; i < len(kv); i += 2 {
		name, ok := kv[i].(string)
		if !ok {
			panic(fmt.Sprintf("inventory: rowOf: column name %v is not a string", kv[i]))
		}
		j := columnIndex(cols, name)
		if j < 0 {
			panic("inventory: rowOf: no column " + name)
		}
		row[j] = kv[i+1]
	}
	// Drop trailing blanks so rows look as a spreadsheet program would store them.
	n := len(row)
	for n > 0 && row[n-1] == nil {
		n--
	}
	return row[:n]
}

// columnIndex returns the index of the column with the given name, or -1.
func columnIndex(cols []Column, name string) int {
	for i, c := range cols {
		if c.Name == name {
			return i
		}
	}
	return -1
}

func demoSite() [][]any {
	items := SiteItems()
	values := map[string]any{
		"Site":              "Ostmere Coatings works, line C2 (invented plant)", // invented for the demo
		"Survey date":       time.Date(2026, 2, 10, 0, 0, 0, 0, time.UTC),       // invented for the demo
		"Surveyed by":       "Site static survey team",                          // invented for the demo
		"Relative humidity": 35.0,                                               // invented for the demo: dry winter day
		"Air temperature":   21.0,                                               // invented for the demo
		"Required margin":   10.0,                                               // invented for the demo (the usual site choice)
		// Sign-off: revision and scope given, names and dates left to sign by hand.
		SiteItemRevision: "A (first issue)",                                                        // invented for the demo
		SiteItemScope:    "Line C2: mixing, coating, drying, rewind, drum filling and loading bay", // invented for the demo
	}
	rows := [][]any{{"Item", "Value"}}
	for _, it := range items {
		if values[it.Name] == nil {
			continue // an optional item the demo leaves out (Site ID)
		}
		rows = append(rows, []any{it.Header(), values[it.Name]})
	}
	return rows
}

func demoAtmospheres() [][]any {
	cols := SheetColumns(SheetAtmospheres)
	a := func(kv ...any) []any { return rowOf(cols, kv...) }
	return [][]any{
		headerRow(cols),
		// Every value below is invented for the demo.
		a("ID", "A-TOL1", "Description", "Toluene vapour at the coating head, drum filling and the loading bay", "Substance", "toluene",
			"Kind", "vapour", "MIE", 0.24, "Group", "IIA", "Zone", "1", "Notes", "Site classification drawing HA-C2-01"), // invented for the demo
		a("ID", "A-TOL2", "Description", "Toluene vapour around the drying tunnel, interleaf and rewind", "Substance", "toluene",
			"Kind", "vapour", "Zone", "2", "Notes", "MIE and group left blank: taken from the built-in substance"), // invented for the demo
		a("ID", "A-MIX", "Description", "Toluene vapour inside mixer M1", "Substance", "toluene",
			"Kind", "vapour", "MIE", 0.24, "Group", "IIA", "Zone", "0", "Notes", "Vessel interior; manway area is zone 1"), // invented for the demo
		a("ID", "A-RES", "Description", "Acrylic resin dust cloud at powder charging and bag emptying",
			"Kind", "dust", "MIE", 10.0, "Group", "IIIB", "Zone", "21", "Notes", "MIE from the site's powder test report"), // invented for the demo
	}
}

func demoStations() [][]any {
	cols := SheetColumns(SheetStations)
	s := func(kv ...any) []any { return rowOf(cols, kv...) }
	return [][]any{
		headerRow(cols),
		// Every value below is invented for the demo.
		s("ID", "ST-UNW", "Name", "Unwind", "Line", "Coating line C2", "Notes", "Outside the classified area"), // invented for the demo
		s("ID", "ST-COAT", "Name", "Coating head", "Line", "Coating line C2", "Atmosphere", "A-TOL1"),          // invented for the demo
		s("ID", "ST-DRY", "Name", "Drying tunnel exit", "Line", "Coating line C2", "Atmosphere", "A-TOL2"),     // invented for the demo
		s("ID", "ST-LAM", "Name", "Paper interleaf", "Line", "Coating line C2", "Atmosphere", "A-TOL2", "Relative humidity", 65.0, // invented for the demo
			"Notes", "Humidified enclosure"), // invented for the demo
		s("ID", "ST-REW", "Name", "Rewind", "Line", "Coating line C2", "Atmosphere", "A-TOL2"),                   // invented for the demo
		s("ID", "ST-MIX", "Name", "Solvent charging, mixer M1", "Line", "Mixing room", "Atmosphere", "A-MIX"),    // invented for the demo
		s("ID", "ST-PWD", "Name", "Powder charging", "Line", "Mixing room", "Atmosphere", "A-RES"),               // invented for the demo
		s("ID", "ST-BAG", "Name", "Bulk-bag emptying", "Line", "Mixing room", "Atmosphere", "A-RES"),             // invented for the demo
		s("ID", "ST-DRM", "Name", "Drum filling", "Line", "Filling hall", "Atmosphere", "A-TOL1"),                // invented for the demo
		s("ID", "ST-BAY", "Name", "Loading bay and IBC filling", "Line", "Filling hall", "Atmosphere", "A-TOL1"), // invented for the demo
	}
}

// demoObjects lists the objects station by station. Units are the headers'
// (m, mm, kV/m, kV, m/s, kg/s, µC/kg, µA, s, Ω, pF, pS/m) unless a cell gives
// its own. Every value is invented for the demo.
func demoObjects() [][]any {
	cols := SheetColumns(SheetObjects)
	o := func(id, station, kind, desc, material string, kv ...any) []any {
		kv = append([]any{"ID", id, "Station", station, "Kind", kind, "Description", desc}, kv...)
		if material != "" {
			kv = append(kv, "Material", material)
		}
		return rowOf(cols, kv...)
	}
	return [][]any{
		headerRow(cols),

		// Unwind: no flammable atmosphere; a strongly charged web, judged on shock and requirements only.
		o("UNW-WEB", "ST-UNW", KindSheet, "PET film web, free span after the unwind roll", "PET",
			"Length", 1.8, "Width", 1.32, "Thickness", "23 µm", "Backing", "none", "Field", 180.0, "Field distance", 0.05, "Speed", 3.5), // invented for the demo
		o("UNW-IDL", "ST-UNW", KindRoller, "Aluminium idler roller, earthed through its bearings", "aluminium",
			"Length", 1.4, "Diameter", 0.12, "Surface potential", 0.0, "Speed", 3.5, "Resistance to earth", 50.0), // invented for the demo
		o("UNW-OP", "ST-UNW", KindPerson, "Operator at the splice table, ESD shoes on plain concrete", "",
			"Resistance to earth", 5e7, "Capacitance", 200.0), // invented for the demo

		// Coating head (toluene, zone 1): the web and an isolated blade holder are incendive.
		o("COAT-WEB", "ST-COAT", KindSheet, "PET web entering the coating head, free span, no neutraliser", "PET",
			"Length", 1.5, "Width", 1.32, "Thickness", 0.023, "Backing", "none", "Field", 400.0, "Field distance", 0.05, "Speed", 3.5), // invented for the demo
		o("COAT-APP", "ST-COAT", KindRoller, "Steel applicator roll, earthed", "steel",
			"Length", 1.4, "Diameter", 0.25, "Surface potential", 0.0, "Speed", 3.5, "Resistance to earth", 10.0), // invented for the demo
		o("COAT-BLD", "ST-COAT", KindPart, "Doctor blade holder on PTFE bushings", "stainless steel",
			"Surface potential", 6.0, "Resistance to earth", "1 TΩ", "Capacitance", "15 pF"), // invented for the demo
		o("COAT-PAN", "ST-COAT", KindContainer, "Coating pan, stainless, bonded to the frame", "stainless steel",
			"Length", 1.5, "Width", 0.3, "Charging current", 0.05, "Resistance to earth", 5.0, "Capacitance", 150.0), // invented for the demo
		o("COAT-HOSE", "ST-COAT", KindPart, "Metal coupling on the solvent feed hose, no bond wire", "stainless steel",
			"Charging current", 0.01, "Resistance to earth", 1e9, "Capacitance", 10.0), // invented for the demo
		o("COAT-OP", "ST-COAT", KindPerson, "Coater operator, ESD shoes on the conductive floor", "",
			"Resistance to earth", 2e7, "Capacitance", 200.0), // invented for the demo

		// Drying tunnel exit (zone 2): web neutralised; an isolated probe is marginal.
		o("DRY-WEB", "ST-DRY", KindSheet, "Coated PET web at the tunnel exit, after the ionising bar", "PET",
			"Length", 2.0, "Width", 1.32, "Thickness", 0.025, "Backing", "none", "Field", 6.0, "Field distance", 0.05, "Speed", 3.5), // invented for the demo
		o("DRY-IDL", "ST-DRY", KindRoller, "Aluminium idler roller, earthed", "aluminium",
			"Length", 1.4, "Diameter", 0.1, "Surface potential", 0.0, "Speed", 3.5, "Resistance to earth", 20.0), // invented for the demo
		o("DRY-TC", "ST-DRY", KindPart, "Web temperature probe on an insulating bracket", "stainless steel",
			"Surface potential", "2.5 kV", "Resistance to earth", 1e12, "Capacitance", 12.0), // invented for the demo

		// Paper interleaf (zone 2, humidified to 65 %): the paper is dissipative, but the
		// web's resistance to earth was not measured, so it is assessed as an isolated
		// conductor and sparks (incendive); earthing it through the nip would clear it.
		o("LAM-PAP", "ST-LAM", KindSheet, "Paper interleaf web, free span before the nip", "paper",
			"Length", 1.0, "Width", 1.32, "Thickness", 0.08, "Backing", "none", "Field", 8.0, "Field distance", 0.05, "Speed", 3.5), // invented for the demo
		o("LAM-NIP", "ST-LAM", KindRoller, "Steel nip roll, earthed", "steel",
			"Length", 1.4, "Diameter", 0.2, "Surface potential", 0.0, "Speed", 3.5, "Resistance to earth", 10.0), // invented for the demo
		o("LAM-OP", "ST-LAM", KindPerson, "Interleaf operator, ESD shoes", "",
			"Resistance to earth", 3e7, "Capacitance", 200.0), // invented for the demo
		o("LAM-KNF", "ST-LAM", KindPart, "Slitter knife holder, earthed through the frame", "steel",
			"Surface potential", 0.0, "Resistance to earth", 1e4, "Capacitance", 20.0), // invented for the demo

		// Rewind (zone 2): low fields, but the site film is of dissipative class and not
		// earthed: the web and the wound roll are isolated conductors that spark (incendive);
		// the rewind shaft fails the earthing requirement.
		o("REW-WEB", "ST-REW", KindSheet, "Coated web into the rewind nip", "Coated PET C2",
			"Length", 1.2, "Width", 1.32, "Thickness", 0.025, "Backing", "none", "Field", 25.0, "Field distance", 0.1, "Speed", 3.5), // invented for the demo
		o("REW-ROLL", "ST-REW", KindRoller, "Wound roll of coated film on the rewind shaft", "Coated PET C2",
			"Length", 1.32, "Diameter", 0.6, "Field", 15.0, "Field distance", 0.1, "Speed", 3.5), // invented for the demo
		o("REW-SHAFT", "ST-REW", KindPart, "Rewind shaft on insulated bearings", "steel",
			"Charging current", 1.0, "Resistance to earth", 2e8, "Capacitance", 40.0), // invented for the demo
		o("REW-BELT", "ST-REW", KindBelt, "Core-feed conveyor belt", "rubber belt",
			"Length", 3.0, "Width", 0.3, "Thickness", 3.0, "Backing", "none", "Field", 10.0, "Field distance", 0.05, "Speed", 0.5), // invented for the demo
		o("REW-OP", "ST-REW", KindPerson, "Rewind operator, ESD shoes", "",
			"Resistance to earth", 8e7, "Capacitance", 200.0), // invented for the demo

		// Solvent charging of mixer M1 (zone 0): top filling of low-conductivity toluene,
		// an unearthed wash tank and an operator on the painted floor are incendive.
		o("MIX-TOL1", "ST-MIX", KindLiquid, "Toluene through the top nozzle (free fall), no additive", "",
			"Diameter", 0.05, "Speed", 4.0, "Charging time", 600.0, "Resistance to earth", 50.0, "Capacitance", 1000.0,
			"Conductivity", 1.0, "Relative permittivity", 2.4, "Filling", "top",
			"Vessel material", "metal", "Vessel class", "fixed tank", "Vessel diameter", 1.6, "Filter", "none", "Second phase", "none"), // invented for the demo
		o("MIX-TOL2", "ST-MIX", KindLiquid, "Toluene with conductivity additive through the dip pipe", "",
			"Diameter", 0.05, "Speed", 2.0, "Charging time", 900.0, "Resistance to earth", 50.0, "Capacitance", 1000.0,
			"Conductivity", 150.0, "Relative permittivity", 2.4, "Filling", "dip pipe",
			"Vessel material", "metal", "Vessel class", "fixed tank", "Vessel diameter", 1.6, "Filter", "none", "Second phase", "none"), // invented for the demo
		o("MIX-EA", "ST-MIX", KindLiquid, "Ethyl acetate into the mobile wash tank on plastic castors", "",
			"Diameter", "25 mm", "Speed", 3.0, "Charging time", 120.0, "Resistance to earth", 1e11, "Capacitance", 300.0,
			"Conductivity", 4.6e5, "Relative permittivity", 6.0, "Filling", "dip pipe",
			"Vessel material", "metal", "Vessel class", "IBC", "Filter", "none", "Second phase", "none"), // invented for the demo
		o("MIX-VES", "ST-MIX", KindContainer, "Mixer vessel M1, 2 m³, stainless", "stainless steel",
			"Diameter", 1.6, "Charging current", 0.15, "Resistance to earth", 50.0, "Capacitance", 1000.0), // invented for the demo
		o("MIX-OP", "ST-MIX", KindPerson, "Operator at the manway, ordinary shoes on the painted floor", "",
			"Surface potential", 9.0, "Resistance to earth", 1e12, "Capacitance", 200.0), // invented for the demo

		// Powder charging (resin dust, zone 21): the unearthed drum and the liner on the
		// earthed drum are incendive; the earthed drum is not.
		o("PWD-POW", "ST-PWD", KindPowder, "Acrylic resin powder, pneumatic transfer into 200 L drums", "Resin powder AR-7",
			"Diameter", 0.6, "Mass flow", 0.5, "Charge-to-mass", 10.0, "Charging time", 60.0, "Particle size", 0.08), // invented for the demo
		o("PWD-DRU1", "ST-PWD", KindContainer, "200 L steel drum on a plastic pallet, earth clamp not fitted", "steel",
			"Diameter", 0.6, "Mass flow", 0.5, "Charge-to-mass", 10.0, "Charging current", 5.0, "Charging time", 60.0,
			"Resistance to earth", 1e10, "Capacitance", 100.0), // invented for the demo
		o("PWD-DRU2", "ST-PWD", KindContainer, "200 L steel drum, earth clamp fitted", "steel",
			"Diameter", 0.6, "Mass flow", 0.5, "Charge-to-mass", 10.0, "Charging current", 5.0, "Charging time", 60.0,
			"Resistance to earth", 10.0, "Capacitance", 100.0), // invented for the demo
		o("PWD-LIN", "ST-PWD", KindSheet, "PE liner lying on the wall of the earthed drum", "PE",
			"Length", 1.9, "Width", 0.9, "Thickness", 0.1, "Backing", "earthed", "Surface potential", 5.0), // invented for the demo
		o("PWD-OP", "ST-PWD", KindPerson, "Operator, conductive shoes on the conductive floor", "",
			"Resistance to earth", 1e6, "Capacitance", 200.0), // invented for the demo

		// Bulk-bag emptying (resin dust 10 mJ, zone 21): types B, C earthed and D are
		// permitted; type A, an unearthed type C and an unlabelled bag are not.
		o("BAG-A", "ST-BAG", KindBag, "Type A bag of resin powder, plain PP fabric", "woven PP fabric",
			"Diameter", 0.9, "Mass flow", 0.8, "Charge-to-mass", 0.1, "Charging time", 900.0, "Bag type", "A"), // invented for the demo
		o("BAG-B", "ST-BAG", KindBag, "Type B bag of resin powder", "woven PP fabric",
			"Diameter", 0.9, "Mass flow", 0.8, "Charge-to-mass", 0.1, "Charging time", 900.0, "Bag type", "B"), // invented for the demo
		o("BAG-CE", "ST-BAG", KindBag, "Type C bag, earth tab clamped to the frame", "woven PP fabric",
			"Diameter", 0.9, "Mass flow", 0.8, "Charge-to-mass", 0.1, "Charging time", 900.0,
			"Resistance to earth", "100 kΩ", "Bag type", "C"), // invented for the demo
		o("BAG-CU", "ST-BAG", KindBag, "Type C bag, earth clamp left off", "woven PP fabric",
			"Diameter", 0.9, "Mass flow", 0.8, "Charge-to-mass", 0.1, "Charging time", 900.0,
			"Resistance to earth", 1e12, "Bag type", "C"), // invented for the demo
		o("BAG-D", "ST-BAG", KindBag, "Type D bag of resin powder", "woven PP fabric",
			"Diameter", 0.9, "Mass flow", 0.8, "Charge-to-mass", 0.1, "Charging time", 900.0, "Bag type", "D"), // invented for the demo
		o("BAG-X", "ST-BAG", KindBag, "Bag with no type label (supplier unknown)", "woven PP fabric",
			"Diameter", 0.9, "Mass flow", 0.8, "Charge-to-mass", 0.1, "Charging time", 900.0,
			"Notes", "Type not known: assessed as the most restrictive case"), // invented for the demo
		o("BAG-FRM", "ST-BAG", KindPart, "Bag discharge frame and spout, earthed", "steel",
			"Charging current", 0.08, "Resistance to earth", 10.0, "Capacitance", 50.0), // invented for the demo
		o("BAG-OP", "ST-BAG", KindPerson, "Operator cutting the bag spout, ESD shoes", "",
			"Resistance to earth", 2e7, "Capacitance", 200.0), // invented for the demo

		// Drum filling (toluene, zone 1): everything earthed; non-incendive.
		o("DRM-DRUM", "ST-DRM", KindContainer, "200 L steel drum on the filling scale, interlocked earth clamp", "steel",
			"Diameter", 0.6, "Charging current", 0.5, "Charging time", 180.0, "Resistance to earth", 10.0, "Capacitance", 100.0), // invented for the demo
		o("DRM-LNC", "ST-DRM", KindPart, "Stainless filling lance, bonded to the filler", "stainless steel",
			"Charging current", 0.5, "Resistance to earth", 1e3, "Capacitance", 20.0), // invented for the demo
		o("DRM-BELT", "ST-DRM", KindBelt, "Conveyor belt to the filling scale", "conductive rubber",
			"Length", 4.0, "Width", 0.6, "Thickness", 5.0, "Backing", "none", "Field", 0.5, "Field distance", 0.05, "Speed", 0.2, "Resistance to earth", 1e5), // invented for the demo
		o("DRM-SCL", "ST-DRM", KindPart, "Weigh-scale platform, bonded", "steel",
			"Surface potential", 0.0, "Resistance to earth", 2.0, "Capacitance", 120.0), // invented for the demo
		o("DRM-OP", "ST-DRM", KindPerson, "Filling operator, ESD shoes on the conductive floor", "",
			"Resistance to earth", 1e7, "Capacitance", 200.0), // invented for the demo

		// Loading bay and IBC filling (toluene, zone 1): a bottom-loaded tanker compartment
		// that meets every clause clears; a compartment top-loaded through the drop tube too
		// fast breaks the road-tanker v·d limit; toluene with conductivity additive pumped
		// through a cartridge filter into a plastic IBC with no earthed dip pipe is an
		// isolated conductor.
		o("BAY-BOT", "ST-BAY", KindLiquid, "Toluene bottom-loaded into compartment 1, earth and overfill interlock", "",
			"Diameter", 0.1, "Speed", 3.0, "Charging time", 1200.0, "Resistance to earth", 10.0,
			"Conductivity", 1.0, "Relative permittivity", 2.4, "Filling", "bottom",
			"Vessel material", "metal", "Vessel class", "road tanker", "Filter", "strainer", "Second phase", "none", "Inlet velocity", 0.8), // invented for the demo
		o("BAY-TOP", "ST-BAY", KindLiquid, "Toluene top-loaded into compartment 2 through the swing-arm drop tube", "",
			"Diameter", 0.1, "Speed", 4.5, "Charging time", 900.0, "Resistance to earth", 10.0,
			"Conductivity", 1.0, "Relative permittivity", 2.4, "Filling", "dip pipe",
			"Vessel material", "metal", "Vessel class", "road tanker", "Filter", "strainer", "Second phase", "none", "Inlet velocity", 1.0), // invented for the demo
		o("BAY-IBC", "ST-BAY", KindLiquid, "Toluene with additive through a 10 µm cartridge filter into a plastic IBC, no earthing rod", "",
			"Diameter", 0.05, "Speed", 2.0, "Charging time", 250.0,
			"Conductivity", 150.0, "Relative permittivity", 2.4, "Filling", "top",
			"Vessel material", "insulating", "Vessel class", "IBC", "Filter", "filter", "Residence time", 0.3, "Second phase", "none"), // invented for the demo
	}
}

func demoMaterials() [][]any {
	cols := SheetColumns(SheetMaterials)
	m := func(kv ...any) []any { return rowOf(cols, kv...) }
	return [][]any{
		headerRow(cols),
		// Every value below is invented for the demo.
		m("Name", "Coated PET C2", "Class", "dissipative", "Relative permittivity", 3.2, "Surface resistivity", 1e10,
			"Humidity slope", 0.5, "Volume resistivity", 1e14, "Breakdown strength", 150.0,
			"Notes", "Site film: PET with an antistatic topcoat (supplier data sheet)"), // invented for the demo
		m("Name", "Resin powder AR-7", "Class", "insulating", "Relative permittivity", 2.5,
			"Humidity slope", 0.0, "Volume resistivity", 1e13,
			"Notes", "Acrylic resin powder, site test report"), // invented for the demo
		m("Name", "PE", "Class", "insulating", "Relative permittivity", 2.3, "Surface resistivity", "1e14 ohm",
			"Humidity slope", 0.0, "Volume resistivity", 1e15, "Breakdown strength", 50.0,
			"Notes", "Overrides the built-in PE with the drum-liner supplier's figures"), // invented for the demo
	}
}
