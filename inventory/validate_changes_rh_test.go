package inventory

import "testing"

// An RH change below 1 % is read and warned about with the words of an RH
// cell's warning (checkRH); 0.4 as a fraction is 40 % (arithmetic).
func TestChangeLowRHWarnsAsACell(t *testing.T) {
	cell := checkRH(Known(0.4))
	if len(cell) != 1 || cell[0].Severity != Warning {
		t.Fatalf("checkRH(0.4) = %v", cell)
	}
	for _, c := range [][2]string{{"rh", ""}, {"station-rh", "ST-1"}} {
		p, err := ParseChange(c[0], c[1], "0.4")
		if err != nil {
			t.Fatalf("%s 0.4: %v", c[0], err)
		}
		if p.Number != 0.4 || p.Warning != cell[0].Message || p.WarningFix != cell[0].Fix || p.WarningFix != "did you mean 40 %?" {
			t.Errorf("%s 0.4: %v %q %q, want the cell's %q %q", c[0], p.Number, p.Warning, p.WarningFix, cell[0].Message, cell[0].Fix)
		}
	}
	for _, v := range []string{"40", "0", "1"} {
		if p, _ := ParseChange("rh", "", v); p.Warning != "" {
			t.Errorf("rh %s warns %q", v, p.Warning)
		}
	}
}

// A Changes row's target is kept as the user wrote it: station-rh takes a
// bare station ID and shows it bare; station:ID stays so. An RH of 0.4 on a
// row is read, with the RH cell's warning on its Value cell.
func TestChangesSheetTargetAsWritten(t *testing.T) {
	b := append(utValidBook(), utSheet{SheetChanges, [][]any{
		utHeader(SheetChanges),
		utRow(SheetChanges, map[string]any{"Change": "station-rh", "Target": "ST-2", "Value": "40"}),
		utRow(SheetChanges, map[string]any{"Change": "station-rh", "Target": "station:ST-2", "Value": "55"}),
		utRow(SheetChanges, map[string]any{"Change": "rh", "Value": "0.4"}),
	}})
	s := utReadBook(t, b)
	if len(s.Changes) != 3 || s.Changes[0].Target != "ST-2" || s.Changes[1].Target != "station:ST-2" {
		t.Fatalf("changes %+v\n%s", s.Changes, utDump(s))
	}
	cell := checkRH(Known(0.4))[0]
	ps := utProblemsAt(s, "Changes!C4")
	if len(ps) != 1 || ps[0].Severity != Warning || ps[0].Message != cell.Message || ps[0].Fix != cell.Fix {
		t.Errorf("Changes!C4: %+v, want the RH cell's warning %q", ps, cell.Message)
	}
}
