package inventory

import (
	"errors"
	"testing"
)

func TestMatchHeader(t *testing.T) {
	obj := SheetColumns(SheetObjects)
	mat := SheetColumns(SheetMaterials)
	cases := []struct {
		name    string
		header  string
		cols    []Column
		col     string // "" for no match
		unit    string
		errIs   error
		ownUnit bool
	}{
		{name: "template header", header: "Field [kV/m]", cols: obj, col: "Field", unit: "kV/m"},
		{name: "parentheses", header: "Field (kV/m)", cols: obj, col: "Field", unit: "kV/m"},
		{name: "unit after space", header: "Field kV/m", cols: obj, col: "Field", unit: "kV/m"},
		{name: "no unit", header: "field", cols: obj, col: "Field", unit: "kV/m"},
		{name: "upper case and spaces", header: "  FIELD   DISTANCE  [m] ", cols: obj, col: "Field distance", unit: "m"},
		{name: "own unit replaces default", header: "Field [V/m]", cols: obj, col: "Field", unit: "V/m", ownUnit: true},
		{name: "own unit MV/m", header: "Field (MV/m)", cols: obj, col: "Field", unit: "MV/m", ownUnit: true},
		{name: "unit after space own", header: "Capacitance nF", cols: obj, col: "Capacitance", unit: "nF", ownUnit: true},
		{name: "wrong dimension in header", header: "Capacitance [Ω]", cols: obj, col: "Capacitance", unit: "pF", errIs: ErrHeaderUnit},
		{name: "unknown unit in header", header: "Field [furlongs]", cols: obj, col: "Field", unit: "kV/m", errIs: ErrHeaderUnit},
		{name: "hyphen and space", header: "charge to mass [µC/kg]", cols: obj, col: "Charge-to-mass", unit: "µC/kg"},
		{name: "underscore", header: "Resistance_to_earth", cols: obj, col: "Resistance to earth", unit: "Ω"},
		{name: "ohm word in header", header: "Resistance to earth [ohm]", cols: obj, col: "Resistance to earth", unit: "ohm", ownUnit: true},
		{name: "alias epsr", header: "epsr", cols: obj, col: "Relative permittivity"},
		{name: "dimensionless with dash", header: "Relative permittivity [-]", cols: obj, col: "Relative permittivity"},
		{name: "text column with unit", header: "ID [m]", cols: obj, col: "ID", errIs: ErrHeaderUnit},
		{name: "multi-word unit", header: "Volume resistivity ohm m", cols: mat, col: "Volume resistivity", unit: "ohm m", ownUnit: true},
		{name: "slope header", header: "Humidity slope [decades per 10 %RH]", cols: mat, col: "Humidity slope", unit: "decades per 10 %RH"},
		{name: "surface resistivity template header", header: "Surface resistivity [Ω/sq]", cols: mat, col: "Surface resistivity", unit: "Ω/sq"},
		{name: "surface resistivity older header in Ω", header: "Surface resistivity [Ω]", cols: mat, col: "Surface resistivity", unit: "Ω", ownUnit: true},
		{name: "surface resistivity no unit", header: "Surface resistivity", cols: mat, col: "Surface resistivity", unit: "Ω/sq"},
		{name: "unknown", header: "Colour", cols: obj, errIs: ErrUnknownColumn},
		{name: "blank", header: "  ", cols: obj, errIs: ErrUnknownColumn},
		{name: "bracket only", header: "[kV/m]", cols: obj, errIs: ErrUnknownColumn},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			m, ok, err := MatchHeader(tc.header, tc.cols)
			if tc.col == "" {
				if ok {
					t.Fatalf("MatchHeader(%q) matched %s, want no match", tc.header, m.Column.Name)
				}
				if !errors.Is(err, tc.errIs) {
					t.Fatalf("error %v, want %v", err, tc.errIs)
				}
				return
			}
			if !ok || m.Column.Name != tc.col {
				t.Fatalf("MatchHeader(%q) = %q ok=%v, want %q", tc.header, m.Column.Name, ok, tc.col)
			}
			if tc.errIs != nil {
				if !errors.Is(err, tc.errIs) {
					t.Fatalf("error %v, want %v", err, tc.errIs)
				}
			} else if err != nil {
				t.Fatalf("unexpected error %v", err)
			}
			if tc.unit != "" && m.Unit != tc.unit {
				t.Errorf("unit = %q, want %q", m.Unit, tc.unit)
			}
			if m.Own != tc.ownUnit {
				t.Errorf("Own = %v, want %v", m.Own, tc.ownUnit)
			}
		})
	}
}

// Every header the template writes matches its own column, with its own unit.
func TestHeaderRoundTrip(t *testing.T) {
	for _, sh := range []string{SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials, SheetChanges} {
		cols := SheetColumns(sh)
		for _, c := range cols {
			m, ok, err := MatchHeader(c.Header(), cols)
			if !ok || err != nil || m.Column.Name != c.Name || m.Unit != c.Unit {
				t.Errorf("%s: MatchHeader(%q) = %+v, %v, %v", sh, c.Header(), m, ok, err)
			}
		}
	}
	for _, c := range SiteItems() {
		m, ok, err := MatchHeader(c.Header(), SiteItems())
		if !ok || err != nil || m.Column.Name != c.Name {
			t.Errorf("Site: MatchHeader(%q) = %+v, %v, %v", c.Header(), m, ok, err)
		}
	}
}

func TestNearest(t *testing.T) {
	cases := []struct {
		s    string
		list []string
		want string
	}{
		{"Feild", []string{"Field", "Speed"}, "Field"},
		{"pet", []string{"PET", "PE"}, "PET"},
		{"stainles steel", []string{"steel", "stainless steel"}, "stainless steel"},
		{"toluol", []string{"toluene", "xylene"}, "toluene"},
		{"zzzz", []string{"sheet", "belt"}, ""},
		{"roler", Kinds(), "roller"},
	}
	for _, tc := range cases {
		if got := Nearest(tc.s, tc.list); got != tc.want {
			t.Errorf("Nearest(%q) = %q, want %q", tc.s, got, tc.want)
		}
	}
}

func TestColumnLetter(t *testing.T) {
	for i, want := range map[int]string{0: "A", 25: "Z", 26: "AA", 27: "AB", 701: "ZZ", 702: "AAA", 16383: "XFD"} {
		if got := ColumnLetter(i); got != want {
			t.Errorf("ColumnLetter(%d) = %q, want %q", i, got, want)
		}
	}
}

// FuzzMatchHeader: never panics; a match names a column of the sheet; a
// header built from a matched column's name and unit matches it again.
func FuzzMatchHeader(f *testing.F) {
	for _, c := range SheetColumns(SheetObjects) {
		f.Add(c.Header())
		f.Add(c.Name + " (" + c.Unit + ")")
	}
	for _, s := range []string{"", "[", "]", "()", "Field [", "Field ]", "Field [[kV/m]]", "  FIELD  ", "Field kV", "x [kV/m] [m]", "Field\u00a0[kV/m]"} {
		f.Add(s)
	}
	cols := SheetColumns(SheetObjects)
	f.Fuzz(func(t *testing.T, h string) {
		m, ok, err := MatchHeader(h, cols)
		if !ok {
			if !errors.Is(err, ErrUnknownColumn) {
				t.Fatalf("no match without ErrUnknownColumn: %v", err)
			}
			return
		}
		found := false
		for _, c := range cols {
			if c.Name == m.Column.Name {
				found = true
			}
		}
		if !found {
			t.Fatalf("matched unknown column %q", m.Column.Name)
		}
		if err != nil {
			return
		}
		again := m.Column.Name
		if m.Unit != "" {
			again += " [" + m.Unit + "]"
		}
		m2, ok2, err2 := MatchHeader(again, cols)
		if !ok2 || err2 != nil || m2.Column.Name != m.Column.Name {
			t.Fatalf("%q matched %s, but %q gives %+v %v %v", h, m.Column.Name, again, m2, ok2, err2)
		}
	})
}
