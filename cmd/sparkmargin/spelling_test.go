package main

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// No numeric check values: the numbers in comments name formulas (common practice, no source).

// asciiUnits are unit spellings the outputs must not use: the audit writes µ,
// Ω, ² and ³ (issue 14 found "uJ" and "uC/m^2" in discharge reasons beside
// "µC/m²" and "Ω" elsewhere). A power with a decimal exponent (Glor's
// D^3.36) has no superscript and is allowed.
var asciiUnits = regexp.MustCompile(`\d ?u(J|C|A|F)\b|\d ?[kMG]?[Oo]hms?\b|\bohm\b|\^[23]([^.\d]|$)`)

// TestOutputsSpellUnitsOnce: the demo audit's workbook (every sheet), its JSON,
// the terminal summary and library spell units one way.
func TestOutputsSpellUnitsOnce(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	xlsx, js := filepath.Join(dir, "audit.xlsx"), filepath.Join(dir, "audit.json")
	code, out, errOut := runCLI(t, "assess", survey, "-o", xlsx, "--json", js)
	if code != exitOK {
		t.Fatalf("assess: exit %d: %s", code, errOut)
	}
	texts := map[string]string{"terminal": out}
	data, err := os.ReadFile(js)
	if err != nil {
		t.Fatal(err)
	}
	texts["JSON"] = string(data)
	_, lib, _ := runCLI(t, "library")
	_, libJSON, _ := runCLI(t, "library", "--json")
	texts["library"], texts["library --json"] = lib, libJSON
	f, err := excelize.OpenFile(xlsx)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	for _, sheet := range f.GetSheetList() {
		var b strings.Builder
		for _, r := range sheetRows(t, xlsx, sheet) {
			b.WriteString(strings.Join(r, " | "))
			b.WriteByte('\n')
		}
		texts["sheet "+sheet] = b.String()
	}
	for where, s := range texts {
		for _, line := range strings.Split(s, "\n") {
			if m := asciiUnits.FindString(line); m != "" {
				t.Errorf("%s spells a unit %q: %s", where, m, line)
			}
		}
	}
}
