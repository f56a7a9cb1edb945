package inventory

import (
	"bytes"
	"errors"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// TestKindNeedsTableMatchesCheck ties the one table to check: on each kind's
// valid row of utValidBook, blanking a column the table marks required, or all
// the columns it marks "one of", makes check name the row as needing inputs;
// the valid row itself needs nothing. Every kind has a row in the table.
func TestKindNeedsTableMatchesCheck(t *testing.T) {
	ids := map[string]string{KindSheet: "W-1", KindBelt: "B-1", KindRoller: "R-1", KindContainer: "C-1", KindPart: "P-1",
		KindPerson: "OP-1", KindPowder: "PW-1", KindLiquid: "L-1", KindBag: "BG-1"}
	if len(kindNeedTable) != len(Kinds()) {
		t.Fatalf("kindNeedTable has %d kinds, Kinds() %d", len(kindNeedTable), len(Kinds()))
	}
	objCols := map[string]bool{}
	for _, c := range SheetColumns(SheetObjects) {
		objCols[c.Name] = true
	}
	needs := func(s *Survey, id string) []Problem {
		var out []Problem
		for _, p := range s.Problems {
			if p.ID == id && errors.Is(p.Err, ErrRequired) && strings.Contains(p.Message, "needs ") && p.Severity == Error {
				out = append(out, p)
			}
		}
		return out
	}
	base := utReadBook(t, utValidBook())
	for _, k := range kindNeedTable {
		id, ok := ids[k.Kind]
		if !ok {
			t.Fatalf("kind %s: no row in utValidBook", k.Kind)
		}
		for _, c := range k.Columns {
			if !objCols[c.Column] {
				t.Errorf("kind %s: column %q is not an Objects column", k.Kind, c.Column)
			}
		}
		if p := needs(base, id); len(p) != 0 {
			t.Errorf("kind %s: valid row %s needs %v", k.Kind, id, p)
		}
		var oneOf []string
		for _, c := range k.Columns {
			switch c.Need {
			case Required:
				s := utReadBook(t, utValidBook().set(SheetObjects, id, c.Column, nil))
				p := needs(s, id)
				if len(p) != 1 || !strings.Contains(p[0].Message, c.Column) {
					t.Errorf("kind %s: %s blank: check says %v, want it to need %s", k.Kind, c.Column, p, c.Column)
				}
			case OneOf:
				oneOf = append(oneOf, c.Column)
			}
		}
		if len(oneOf) > 0 {
			b := utValidBook()
			for _, c := range oneOf {
				b = b.set(SheetObjects, id, c, nil)
			}
			if p := needs(utReadBook(t, b), id); len(p) != 1 {
				t.Errorf("kind %s: all of %v blank: check says %v, want one need", k.Kind, oneOf, p)
			}
		}
	}
	// KindRequirements (README, check) are the table's words.
	for i, r := range KindRequirements() {
		if r.Kind != kindNeedTable[i].Kind || r.Needs != kindNeedTable[i].Summary {
			t.Errorf("KindRequirements[%d] = %+v, not the table's", i, r)
		}
	}
}

// TestTemplateKindNeedsSheet reads the help sheet back: a row per kind, a
// column per Objects column the table names, each cell the table's word.
func TestTemplateKindNeedsSheet(t *testing.T) {
	f, _ := writeTestTemplate(t, testTemplateOptions())
	rows, err := f.GetRows(SheetKindNeeds)
	if err != nil {
		t.Fatal(err)
	}
	cols := kindNeedColumns()
	if len(rows) < len(kindNeedTable)+1 || len(rows[0]) != len(cols)+2 {
		t.Fatalf("help sheet: %d rows, header %v", len(rows), rows[0])
	}
	for j, c := range cols {
		if rows[0][j+1] != c.Name {
			t.Errorf("header %d = %q, want %q", j+1, rows[0][j+1], c.Name)
		}
	}
	for i, k := range kindNeedTable {
		r := rows[i+1]
		if r[0] != k.Kind {
			t.Errorf("row %d kind = %q, want %q", i+2, r[0], k.Kind)
		}
		for j, c := range cols {
			if want := kindColumnNeed(k.Kind, c.Name).String(); r[j+1] != want {
				t.Errorf("%s / %s = %q, want %q", k.Kind, c.Name, r[j+1], want)
			}
		}
		if r[len(cols)+1] != k.Summary {
			t.Errorf("%s: words %q, want %q", k.Kind, r[len(cols)+1], k.Summary)
		}
	}
	// Hand-checked spots against check's rules (validate_objects.go kindNeeds: a blank
	// Particle size or Conductivity is a warning, the row assessed as the stricter case).
	for _, c := range []struct{ kind, col, want string }{
		{KindSheet, "Length", "required"}, {KindSheet, "Thickness", "if"}, {KindSheet, "Field", "one of"},
		{KindPowder, "Particle size", "optional"}, {KindLiquid, "Conductivity", "optional"}, {KindLiquid, "Speed", "required"}, {KindPerson, "Length", "–"},
	} {
		if got := kindColumnNeed(c.kind, c.col).String(); got != c.want {
			t.Errorf("%s / %s = %q, want %q", c.kind, c.col, got, c.want)
		}
	}
}

// TestTemplateHighlightsAndWholeColumns: the Objects highlights and every data
// validation reach the sheet's last row, and the file stays small and quick.
func TestTemplateHighlightsAndWholeColumns(t *testing.T) {
	start := time.Now()
	var buf bytes.Buffer
	if err := WriteTemplate(&buf, testTemplateOptions()); err != nil {
		t.Fatal(err)
	}
	took := time.Since(start)
	// Bounds chosen well above the measured 22 kB and 0.1 s so the test is not flaky.
	if buf.Len() > 64<<10 {
		t.Errorf("template is %d bytes, want under 64 kB", buf.Len())
	}
	if took > 5*time.Second {
		t.Errorf("template took %v to write", took)
	}
	f, err := excelize.OpenReader(&buf)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	last := "1048576"
	for _, s := range Sheets()[1:] {
		dvs, err := f.GetDataValidations(s)
		if err != nil {
			t.Fatal(err)
		}
		n := 0
		for _, dv := range dvs {
			if strings.HasSuffix(dv.Sqref, last) {
				n++
			}
		}
		if n != len(SheetColumns(s)) {
			t.Errorf("%s: %d validations reach row %s, want one per column (%d)", s, n, last, len(SheetColumns(s)))
		}
	}
	cfs, err := f.GetConditionalFormats(SheetObjects)
	if err != nil {
		t.Fatal(err)
	}
	lengthCol := ""
	for i, c := range SheetColumns(SheetObjects) {
		if c.Name == "Length" {
			lengthCol, _ = excelize.ColumnNumberToName(i + 1)
		}
	}
	rules, ok := cfs[lengthCol+"2:"+lengthCol+last]
	if !ok || len(rules) != 1 {
		t.Fatalf("Length column highlight: %v (all: %v)", rules, cfs)
	}
	for _, k := range []string{`"sheet"`, `"belt"`} {
		if !strings.Contains(rules[0].Criteria, k) {
			t.Errorf("Length highlight %q lacks kind %s", rules[0].Criteria, k)
		}
	}
	if strings.Contains(rules[0].Criteria, `"roller"`) {
		t.Errorf("Length highlight %q names roller, which does not need it", rules[0].Criteria)
	}
}

// TestKindNeedsNameWhatTheModelReads: the table marks as used the columns the
// model reads for each kind. Source: model/evaluate.go (evalLiquid reads the
// receiving vessel's Resistance and Capacitance, the liquid's Permittivity and a
// measured ChargingCurrent; evalSurface reads ChargingTime, LayerBreakdown and
// Process; evalConductor, for containers and parts, ChargingTime; the plate
// capacitance of a container its layer's Permittivity).
func TestKindNeedsNameWhatTheModelReads(t *testing.T) {
	used := map[string][]string{
		KindLiquid:    {"Resistance to earth", "Capacitance", "Relative permittivity", "Charging current"},
		KindSheet:     {"Charging time", "Layer breakdown", "Process"},
		KindBelt:      {"Charging time", "Layer breakdown", "Process"},
		KindRoller:    {"Charging time", "Layer breakdown", "Process", "Capacitance"},
		KindContainer: {"Charging time", "Relative permittivity", "Capacitance"},
		KindPart:      {"Charging time"},
	}
	for kind, columns := range used {
		for _, c := range columns {
			if n := kindColumnNeed(kind, c); n == NotNeeded {
				t.Errorf("%s: %s marked not needed, but the model reads it", kind, c)
			}
		}
	}
	// Each of the four columns appears on the help sheet.
	on := map[string]bool{}
	for _, c := range kindNeedColumns() {
		on[c.Name] = true
	}
	for _, c := range []string{"Charging time", "Relative permittivity", "Layer breakdown", "Process"} {
		if !on[c] {
			t.Errorf("the kind-needs sheet has no %s column", c)
		}
	}
}
