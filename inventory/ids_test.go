package inventory

import (
	"errors"
	"strings"
	"testing"
)

// TestIDCharacters: the characters refused in an ID, each named by code
// point and Unicode name. Names: Unicode Character Database, UnicodeData.txt
// (U+200B ZERO WIDTH SPACE, U+202E RIGHT-TO-LEFT OVERRIDE, U+00A0 NO-BREAK
// SPACE, U+FEFF ZERO WIDTH NO-BREAK SPACE, U+200E LEFT-TO-RIGHT MARK, U+2066
// LEFT-TO-RIGHT ISOLATE, U+00AD SOFT HYPHEN, U+2028 LINE SEPARATOR, U+FE0F
// VARIATION SELECTOR-16, U+3164 HANGUL FILLER); controls have no name there.
func TestIDCharacters(t *testing.T) {
	tests := []struct {
		id   string
		want string // "" accepted; else part of the fault
	}{
		{"ST-1", ""},
		{"ST 1", ""},
		{"BAHN-Ø1-µ", ""},
		{"ST-BESCHICHTUNG-Ü", ""},
		{"ST\u200b-1", "U+200B ZERO WIDTH SPACE at character 3, a zero-width character"},
		{"ST-\u202e1", "U+202E RIGHT-TO-LEFT OVERRIDE at character 4, a bidirectional control"},
		{"\u200eST-1", "U+200E LEFT-TO-RIGHT MARK at character 1, a bidirectional control"},
		{"ST-\u20661", "U+2066 LEFT-TO-RIGHT ISOLATE at character 4, a bidirectional control"},
		{"ST\ufeff1", "U+FEFF ZERO WIDTH NO-BREAK SPACE at character 3, a zero-width character"},
		{"ST\u00a01", "U+00A0 NO-BREAK SPACE at character 3, a space other than the ordinary space"},
		{"ST\u00ad1", "U+00AD SOFT HYPHEN at character 3, an invisible formatting character"},
		{"ST\t1", "U+0009 at character 3, a control character"},
		{"ST\x071", "U+0007 at character 3, a control character"},
		{"ST\u00851", "U+0085 at character 3, a control character"},
		{"ST\u20281", "U+2028 LINE SEPARATOR at character 3, a line or paragraph separator"},
		{"ST1\ufe0f", "U+FE0F VARIATION SELECTOR-16 at character 4, an invisible character"},
		{"ST\u31641", "U+3164 HANGUL FILLER at character 3, an invisible character"},
		{"ST\ufffd1", "U+FFFD REPLACEMENT CHARACTER at character 3"},
	}
	for _, tc := range tests {
		got, bad := idFault(tc.id)
		switch {
		case tc.want == "" && bad:
			t.Errorf("%q refused: %s", tc.id, got)
		case tc.want != "" && !strings.Contains(got, tc.want):
			t.Errorf("%q: got %q, want %q", tc.id, got, tc.want)
		}
	}
	if got, want := VisibleText("ST\u200b-\u202e1"), "ST<U+200B>-<U+202E>1"; got != want {
		t.Errorf("VisibleText = %q, want %q", got, want)
	}
}

// TestSpreadsheetErrorValues: the error values a spreadsheet shows (ECMA-376
// Part 1, 18.17.2, from memory) are no IDs; text that merely starts with #
// is.
func TestSpreadsheetErrorValues(t *testing.T) {
	for _, s := range []string{"#N/A", "#REF!", "#VALUE!", "#DIV/0!", "#NAME?", "#NULL!", "#NUM!", " #n/a ", "#SPILL!"} {
		if !IsSpreadsheetError(s) {
			t.Errorf("%q not recognised as an error value", s)
		}
	}
	for _, s := range []string{"#1", "N/A", "n/a", "#REF", "REF!", "#12-A"} {
		if IsSpreadsheetError(s) {
			t.Errorf("%q taken for an error value", s)
		}
	}
}

// TestDidYouMeanNeverEchoes: a suggestion never reads exactly as what was
// typed: where they differ in look-alike or invisible characters, those are
// named; a plain ASCII difference is left to show itself.
func TestDidYouMeanNeverEchoes(t *testing.T) {
	tests := []struct {
		typed, near, want string
	}{
		{"ST-12", "ST-1", `did you mean "ST-1"?`},
		{"ST-\u04221", "ST-T1", `did you mean "ST-T1"? (what was typed has U+0422 CYRILLIC CAPITAL LETTER TE at character 4 where the suggestion has U+0054 LATIN CAPITAL LETTER T)`},
		{"ST-1\u3164", "ST-1", `did you mean "ST-1"? (what was typed also holds U+3164 HANGUL FILLER at character 5)`},
		{"ST1", "ST-1", `did you mean "ST-1"?`},
	}
	for _, tc := range tests {
		if got := didYouMean(tc.typed, tc.near); got != tc.want {
			t.Errorf("didYouMean(%q, %q) = %q, want %q", tc.typed, tc.near, got, tc.want)
		}
	}
}

// TestIDsValidated: IDs and references go through the checks on every
// sheet: an invisible character in a Stations ID, an error value as an
// Atmospheres ID, a bidirectional control in a Materials name, a Cyrillic
// look-alike in a Station reference (the suggestion names it), and two
// normalisation forms of one station ID (a duplicate).
func TestIDsValidated(t *testing.T) {
	s := DemoSurvey().Clone()
	setCell(s, SheetStations, "ST-DRY", "ID", "ST\u200b-DRY")
	atm := s.Sheet(SheetAtmospheres).Rows[1]
	atm[0] = "#REF!"
	setCell(s, SheetMaterials, cellText(s.Sheet(SheetMaterials).Rows[1], 0), "Name", "PE\u202e-X")
	setObjectCell(s, "REW-BELT", "Station", "ST-R\u0415W") // U+0415 CYRILLIC CAPITAL LETTER IE for E
	sv, err := Read(mustSurveyBytes(t, s), "ids.xlsx", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]error{
		"Stations ID":    ErrIDCharacter,
		"Atmospheres ID": ErrErrorValueID,
		"Materials Name": ErrIDCharacter,
	}
	found := map[string]bool{}
	for _, p := range sv.Problems {
		key := p.Sheet + " " + p.Field
		if w, ok := want[key]; ok && errors.Is(p.Err, w) {
			found[key] = true
		}
		if p.Sheet == SheetObjects && p.Field == "Station" && errors.Is(p.Err, ErrUnknownReference) {
			found["look-alike"] = true
			if !strings.Contains(p.Fix, "U+0415 CYRILLIC CAPITAL LETTER IE") {
				t.Errorf("the suggestion for a look-alike does not name it: %s", p.Fix)
			}
		}
	}
	for k := range want {
		if !found[k] {
			t.Errorf("no %v problem on %s", want[k], k)
		}
	}
	if !found["look-alike"] {
		t.Error("the look-alike station reference was not refused")
	}
}
