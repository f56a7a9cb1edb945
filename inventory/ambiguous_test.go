package inventory

import (
	"errors"
	"strings"
	"testing"
)

// An ambiguous unit in an Objects cell rejects the row with a problem at the
// cell (sheet, row, column) that spells out both readings (issue 16).
func TestAmbiguousUnitInObjectsCell(t *testing.T) {
	for _, c := range []struct{ value, want string }{
		{"1M", "mega, with its unit left out (write MΩ), or metres (write m)"},
		{"1 mohm", "milliohm (write mΩ), or megohm (write MΩ or Mohm)"},
		{"1K", "kilo, with its unit left out (write kΩ), or kelvin"},
	} {
		s := utReadBook(t, utValidBook().set(SheetObjects, "OP-1", "Resistance to earth", c.value))
		var p *Problem
		for _, r := range s.Rejected {
			for i := range r.Problems {
				if r.Sheet == SheetObjects && r.Problems[i].Field == "Resistance to earth" {
					p = &r.Problems[i]
				}
			}
		}
		if p == nil {
			t.Fatalf("%q: OP-1 not rejected at Resistance to earth\n%s", c.value, utDump(s))
		}
		if !errors.Is(p, ErrAmbiguousUnit) || p.Row == 0 || p.Column == "" || !strings.Contains(p.Error(), c.want) || !strings.Contains(p.Error(), "Objects!") {
			t.Errorf("%q: problem %v (row %d, column %q), want it at the cell and saying %q", c.value, p, p.Row, p.Column, c.want)
		}
	}
}

// FuzzParseChange: any change line parses or gives a *ChangeProblem naming
// one of the sheet's columns; never a panic.
func FuzzParseChange(f *testing.F) {
	for _, k := range changeKinds() {
		f.Add(k.Code, "ST-1", k.Example)
	}
	f.Add("earth", "station:", "1M")
	f.Add("rh", "", "1 mohm")
	f.Add("station-rh", "station:ST-DRY", "40,5 %")
	f.Fuzz(func(t *testing.T, code, target, value string) {
		p, err := ParseChange(code, target, value)
		if err != nil {
			var cp *ChangeProblem
			if !errors.As(err, &cp) || (cp.Field != "Change" && cp.Field != "Target" && cp.Field != "Value") {
				t.Fatalf("ParseChange(%q, %q, %q) error %v is not a *ChangeProblem at a column", code, target, value, err)
			}
			return
		}
		if p.Kind.Dim != Text && p.Number != p.Number {
			t.Fatalf("ParseChange(%q, %q, %q) accepted without a number", code, target, value)
		}
	})
}
