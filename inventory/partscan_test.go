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

// Relationship targets resolve against the folder of their part, absolute
// ones against the package root; a URL or a path above the root is outside.
// Source: ECMA-376 Part 2, 9.3 (relationships) and RFC 3986, 5.2 (resolving
// a relative reference).
func TestResolveTarget(t *testing.T) {
	tests := []struct {
		dir, target, want string
		outside           bool
	}{
		{"xl", "worksheets/sheet1.xml", "xl/worksheets/sheet1.xml", false},
		{"xl", "/xl/data/objects.xml", "xl/data/objects.xml", false},
		{"xl", "../data/s.xml", "data/s.xml", false},
		{"xl", "worksheets/sheet%201.xml", "xl/worksheets/sheet 1.xml", false},
		{"", "xl/workbook.xml", "xl/workbook.xml", false},
		{"xl", "../../etc/passwd", "../../etc/passwd", true},
		{"xl", "file:///etc/passwd", "file:///etc/passwd", true},
		{"xl", "http://example.invalid/s.xml", "http://example.invalid/s.xml", true},
	}
	for _, tc := range tests {
		got, outside := resolveTarget(tc.dir, tc.target)
		if got != tc.want || outside != tc.outside {
			t.Errorf("resolveTarget(%q, %q) = %q, %v; want %q, %v", tc.dir, tc.target, got, outside, tc.want, tc.outside)
		}
	}
}

// Cell references: columns A to XFD, rows 1 to 1,048,576. Source: ECMA-376
// Part 1, 18.18.62 (ST_Ref) and the sheet limits of 18.3.1.
func TestParseCellRef(t *testing.T) {
	tests := []struct {
		ref      string
		col, row int
		ok       bool
	}{
		{"A1", 0, 1, true}, {"L5", 11, 5, true}, {"XFD1048576", 16383, 1048576, true}, {"aa10", 26, 10, true},
		{"A0", 0, 0, false}, {"ZZZZZ5", 0, 0, false}, {"XFE1", 0, 0, false}, {"A1048577", 0, 0, false},
		{"5", 0, 0, false}, {"A", 0, 0, false}, {"A-3", 0, 0, false}, {"A1B", 0, 0, false}, {"", 0, 0, false},
	}
	for _, tc := range tests {
		col, row, ok := parseCellRef([]byte(tc.ref))
		if ok != tc.ok || ok && (col != tc.col || row != tc.row) {
			t.Errorf("parseCellRef(%q) = %d, %d, %v; want %d, %d, %v", tc.ref, col, row, ok, tc.col, tc.row, tc.ok)
		}
	}
}

// Shared and inline strings decode the _xHHHH_ escapes of ST_Xstring.
// Source: ECMA-376 Part 1, 22.9.2.19 (ST_Xstring).
func TestUnescapeXString(t *testing.T) {
	for in, want := range map[string]string{
		"plain": "plain", "a_x000D_b": "a\rb", "_x005F_x000D_": "_x000D_", "_x00e9_": "é", "_x12_": "_x12_", "_xZZZZ_": "_xZZZZ_",
	} {
		if got := string(unescapeXString([]byte(in))); got != want {
			t.Errorf("unescapeXString(%q) = %q, want %q", in, got, want)
		}
	}
}
