package inventory

import (
	"archive/zip"
	"bytes"
	"testing"
)

// Number format codes: dates and times, and numbers whose codes hold the same
// letters only inside quotes, brackets or escapes. Source: ECMA-376 Part 1,
// 18.8.31 (numFmt) and the usual spreadsheet custom formats.
func TestDateFormatCode(t *testing.T) {
	tests := []struct {
		code string
		date bool
	}{
		{"yyyy-mm-dd", true},
		{"d/m/yy", true},
		{"[$-409]mmmm d, yyyy", true},
		{"h:mm:ss AM/PM", true},
		{"0.00", false},
		{`0.0 "days"`, false},
		{`0.00\d`, false},
		{"[Red]0.00", false},
		{"#,##0 _s", false},
		{"General", false},
		{"0.00E+00", false},
	}
	for _, tc := range tests {
		if got := dateFormatCode(tc.code); got != tc.date {
			t.Errorf("dateFormatCode(%q) = %v, want %v", tc.code, got, tc.date)
		}
	}
}

// A shared-strings part with no strings may be a self-closed root: complete.
func TestCheckPartsSelfClosedRoot(t *testing.T) {
	data, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	empty := []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
		`<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" count="0" uniqueCount="0"/>`)
	b := rewriteZip(t, data, func(name string, part []byte) []byte {
		if name == "xl/sharedStrings.xml" {
			return empty
		}
		return part
	})
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := openPkg(zr, int64(len(b)), ReadOptions{}.withDefaults()); err != nil {
		t.Errorf("openPkg: %v", err)
	}
}
