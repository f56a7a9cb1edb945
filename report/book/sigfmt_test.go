package book

import (
	"testing"

	"github.com/xuri/excelize/v2"
)

// Expected texts worked by hand from three significant figures (see the comment below);
// the values are invented for the test.

// TestSigNumFmtMatchesTerminal: a ratio cell shows the figures the terminal
// prints (three significant digits, no scientific format for everyday
// magnitudes). Expected texts worked by hand: 0.3333 -> 0.333; 25 -> 25.0;
// 407.61 -> 408; 0.0065 -> 0.00650; 9.996 rounds to 10.0; 2.5e-4 -> 2.50E-04.
// The formatted text is read back through excelize's own number formatting.
func TestSigNumFmtMatchesTerminal(t *testing.T) {
	cases := []struct {
		v    float64
		want string
	}{
		{0.3333, "0.333"}, {25, "25.0"}, {407.61, "408"}, {0.0065, "0.00650"}, {9.996, "10.0"}, {1562, "1562"}, {2.5e-4, "2.50E-04"},
	}
	f := excelize.NewFile()
	defer f.Close()
	for i, c := range cases {
		fmtCode := SigNumFmt(c.v, 3)
		st, err := f.NewStyle(&excelize.Style{CustomNumFmt: &fmtCode})
		if err != nil {
			t.Fatal(err)
		}
		ref, _ := excelize.CoordinatesToCellName(1, i+1)
		if err := f.SetCellValue("Sheet1", ref, c.v); err != nil {
			t.Fatal(err)
		}
		if err := f.SetCellStyle("Sheet1", ref, ref, st); err != nil {
			t.Fatal(err)
		}
		got, err := f.GetCellValue("Sheet1", ref)
		if err != nil {
			t.Fatal(err)
		}
		if got != c.want {
			t.Errorf("%g: cell shows %q (format %q), want %q", c.v, got, fmtCode, c.want)
		}
		if c.v >= 1e-3 {
			if term := FormatSig(c.v, 3); term != got {
				t.Errorf("%g: cell %q, terminal %q", c.v, got, term)
			}
		}
	}
	// Charge-to-mass in µC/kg is no longer scientific: 5 µC/kg shows 5.0.
	if UnitUCPerKg.NumFmt() == fmtSci {
		t.Errorf("charge-to-mass format %q is scientific", UnitUCPerKg.NumFmt())
	}
}
