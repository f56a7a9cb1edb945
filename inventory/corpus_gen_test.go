package inventory

import (
	"archive/zip"
	"bufio"
	"bytes"
	"compress/flate"
	"fmt"
	"hash/crc32"
	"io"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode/utf16"

	"github.com/xuri/excelize/v2"
)

// corpusCase is one odd or hostile workbook of the corpus in testdata/corpus.
// Its expected outcome is in testdata/corpus/<name>.golden, written by hand
// from the fault (see testdata/corpus/README.md), never by -update.
//
// A case is built in one of three ways: the demo survey with mutate (and then
// post, which edits the written workbook with excelize, and raw, which edits the
// zip's parts); or bytes alone (file, for files that are no workbook). Cases
// marked transient are too big or too odd to check in (a deflate bomb, a file
// over the size cap) and are generated into a temporary folder by the test;
// frozen ones are not byte-reproducible (encryption salts, another program's
// output) and are checked in once and only regenerated with -update.
type corpusCase struct {
	name   string
	fault  string
	mutate func(s *SurveySheets)
	post   func(f *excelize.File) error
	raw    func(name string, part []byte) []byte // edits a zip part; return part unchanged to keep it
	file   func() []byte
	// write makes the file at path itself (transient cases).
	write     func(t testing.TB, path string)
	transient bool
	frozen    bool
	opts      ReadOptions // read options of the inventory-level run (zero: defaults)
}

// Object rows of the demo used below (row 1 is the header): COAT-WEB 5 (a web
// with Width G5 1.32 m, Field L5 400 kV/m, Description D5), DRY-TC 13,
// REW-BELT 21, BAG-X 38. Values put in are invented for the tests.
func corpusCases() []corpusCase {
	objects := func(s SurveySheets) *SheetRows { return s.Sheet(SheetObjects) }
	cell := func(id, col string, v any) func(*SurveySheets) {
		return func(s *SurveySheets) { setObjectCell(*s, id, col, v) }
	}
	rawCell := func(ref, xml string) func(string, []byte) []byte {
		re := regexp.MustCompile(`<c r="` + ref + `"[^>]*>.*?</c>`)
		return func(name string, b []byte) []byte {
			if name != "xl/worksheets/sheet4.xml" {
				return b
			}
			if !re.Match(b) {
				panic("corpus: no cell " + ref)
			}
			return re.ReplaceAll(b, []byte(xml))
		}
	}
	demoBytes := func() []byte {
		b, err := DemoSurveyBytes()
		if err != nil {
			panic(err)
		}
		return b
	}
	return []corpusCase{
		// Formulas and error cells.
		{name: "formula-cached", fault: "COAT-WEB Field is the formula =200*2 with its cached value 400 (read as 400: no problem)",
			post: func(f *excelize.File) error {
				if err := f.SetCellFormula(SheetObjects, "L5", "200*2"); err != nil {
					return err
				}
				if err := f.SetCellValue(SheetObjects, "L5", 400); err != nil {
					return err
				}
				return f.SetCellFormula(SheetObjects, "L5", "200*2")
			}},
		{name: "formula-no-cache", fault: "COAT-WEB Field is the formula =200*2 with no cached value (formulas are never calculated)",
			mutate: cell("COAT-WEB", "Field", nil),
			post:   func(f *excelize.File) error { return f.SetCellFormula(SheetObjects, "L5", "200*2") }},
		{name: "formula-like-text", fault: "COAT-WEB and DRY-TC descriptions are text starting with = (=HYPERLINK(...), =1+1): kept as text, no problem",
			mutate: func(s *SurveySheets) {
				setObjectCell(*s, "COAT-WEB", "Description", `=HYPERLINK("http://example.invalid/x","open")`)
				setObjectCell(*s, "DRY-TC", "Description", "=1+1")
			}},
		{name: "error-cell-div0", fault: "COAT-WEB Field is the formula =1/0 whose cached value is the error #DIV/0!",
			raw: rawCell("L5", `<c r="L5" t="e"><f>1/0</f><v>#DIV/0!</v></c>`)},
		{name: "error-text-na", fault: "COAT-WEB Field is the text #N/A, as pasted from another workbook",
			mutate: cell("COAT-WEB", "Field", "#N/A")},
		// Types in numeric columns.
		{name: "boolean-in-number", fault: "COAT-WEB Width is the boolean TRUE",
			post: func(f *excelize.File) error { return f.SetCellBool(SheetObjects, "G5", true) }},
		{name: "date-in-number", fault: "COAT-WEB Width is a date (2026-01-03, as a spreadsheet makes of a typed 1.3 in some locales)",
			mutate: cell("COAT-WEB", "Width", time.Date(2026, 1, 3, 0, 0, 0, 0, time.UTC))},
		{name: "date-in-resistance", fault: "DRM-DRUM Resistance to earth is a date (2026-01-03, whose serial 46025 would pass for a plausible 46 kΩ)",
			mutate: cell("DRM-DRUM", "Resistance to earth", time.Date(2026, 1, 3, 0, 0, 0, 0, time.UTC))},
		{name: "nan-text", fault: "COAT-WEB Field is the text NaN",
			mutate: cell("COAT-WEB", "Field", "NaN")},
		{name: "inf-text", fault: "COAT-WEB Field is the text Inf and REW-BELT Field the text -infinity",
			mutate: func(s *SurveySheets) {
				setObjectCell(*s, "COAT-WEB", "Field", "Inf")
				setObjectCell(*s, "REW-BELT", "Field", "-infinity")
			}},
		{name: "nan-number", fault: "COAT-WEB Field is a numeric cell whose stored value is NaN (written by a program, not a spreadsheet)",
			raw: rawCell("L5", `<c r="L5"><v>NaN</v></c>`)},
		{name: "overflow-number", fault: "COAT-WEB Field is a numeric cell whose stored value 1e999 overflows a float64",
			raw: rawCell("L5", `<c r="L5"><v>1e999</v></c>`)},
		{name: "huge-number", fault: "COAT-WEB Field is 1e300 kV/m, far beyond what air can hold",
			mutate: cell("COAT-WEB", "Field", 1e300)},
		{name: "tiny-number", fault: "COAT-WEB Field is 1e-300 kV/m, a reading of practically nothing (accepted: no problem)",
			mutate: cell("COAT-WEB", "Field", 1e-300)},
		{name: "negative-zero", fault: "COAT-WEB Field is stored as -0 (accepted as zero: no problem)",
			raw: rawCell("L5", `<c r="L5"><v>-0</v></c>`)},
		// Text and IDs.
		{name: "long-text", fault: "COAT-WEB Description is 32767 characters, the most a cell holds (accepted: no problem)",
			mutate: cell("COAT-WEB", "Description", strings.Repeat("Coated web, ", 32767/12)+strings.Repeat("x", 32767%12))},
		{name: "long-id", fault: "COAT-WEB ID is 1000 characters long (accepted: no problem)",
			mutate: cell("COAT-WEB", "ID", strings.Repeat("COATWEB-", 125))},
		{name: "blank-id", fault: "COAT-WEB ID left blank",
			mutate: cell("COAT-WEB", "ID", nil)},
		{name: "whitespace-id", fault: "COAT-WEB ID is three spaces and a tab",
			mutate: cell("COAT-WEB", "ID", "   \t")},
		{name: "numeric-id", fault: "COAT-WEB ID is the number 12345 (accepted as the ID 12345: no problem)",
			mutate: cell("COAT-WEB", "ID", 12345)},
		{name: "non-ascii-ids", fault: "station ST-COAT renamed ST-BESCHICHTUNG-Ü (and its objects' references), COAT-WEB renamed BAHN-Ø1-µ (accepted: no problem)",
			mutate: func(s *SurveySheets) {
				renameStation(*s, "ST-COAT", "ST-BESCHICHTUNG-Ü")
				setObjectCell(*s, "COAT-WEB", "ID", "BAHN-Ø1-µ")
			}},
		{name: "id-zero-width-space", fault: "DRY-TC ID is COAT-WEB with a zero-width space (U+200B) after COAT, looking the same as COAT-WEB",
			mutate: cell("DRY-TC", "ID", "COAT\u200b-WEB")},
		{name: "id-bidi-override", fault: "DRY-TC ID holds a right-to-left override (U+202E) before TC, so it shows as DRY-CT",
			mutate: cell("DRY-TC", "ID", "DRY-\u202eTC")},
		{name: "id-control-character", fault: "COAT-WEB ID holds the control character BEL (U+0007) between COAT and WEB, stored as the escape _x0007_ of an inline string",
			raw: rawCell("A5", `<c r="A5" t="inlineStr"><is><t>COAT_x0007_WEB</t></is></c>`)},
		{name: "id-normalisation-forms", fault: "station ST-COAT renamed ST-BESCHICHTUNG-\u00dc in composed form (NFC) and its objects' references written decomposed (NFD, U followed by U+0308); COAT-WEB renamed BAHN-\u00dc (NFC) and DRY-TC renamed the same in NFD",
			mutate: func(s *SurveySheets) {
				nfc, nfd := "ST-BESCHICHTUNG-\u00dc", "ST-BESCHICHTUNG-U\u0308"
				renameStation(*s, "ST-COAT", nfc)
				for _, r := range objects(*s).Rows[1:] {
					if cellText(r, 1) == nfc {
						r[1] = nfd
					}
				}
				setObjectCell(*s, "COAT-WEB", "ID", "BAHN-\u00dc")
				setObjectCell(*s, "DRY-TC", "ID", "BAHN-U\u0308")
			}},
		{name: "id-error-value", fault: "COAT-WEB ID is the text #N/A and DRY-TC ID the error cell #REF! (a formula whose reference was deleted)",
			mutate: cell("COAT-WEB", "ID", "#N/A"),
			raw:    rawCell("A13", `<c r="A13" t="e"><f>#REF!</f><v>#REF!</v></c>`)},
		{name: "reference-zero-width-space", fault: "DRY-TC Station written ST-DRY followed by a zero-width space (U+200B)",
			mutate: cell("DRY-TC", "Station", "ST-DRY\u200b")},
		{name: "trailing-space-references", fault: "DRY-TC station written \"ST-DRY  \" and COAT-WEB material with a leading and trailing space (accepted: no problem)",
			mutate: func(s *SurveySheets) {
				setObjectCell(*s, "DRY-TC", "Station", "ST-DRY  ")
				id := "COAT-WEB"
				m := objectCell(*s, id, "Material")
				setObjectCell(*s, id, "Material", " "+m+" ")
			}},
		// Sheet and header layout.
		{name: "case-changed-sheet-names", fault: "sheets named SITE, atmospheres, STATIONS, objects, MATERIALS (accepted: no problem)",
			mutate: func(s *SurveySheets) {
				for i, n := range []string{"SITE", "atmospheres", "STATIONS", "objects", "MATERIALS"} {
					(*s)[i].Name = n
				}
			}},
		{name: "case-changed-headers", fault: "Objects headers ID, Station, Kind, Field written id, STATION, kind, FIELD [kV/m] (accepted: no problem)",
			mutate: func(s *SurveySheets) {
				h := objects(*s).Rows[0]
				h[0], h[1], h[2], h[11] = "id", "STATION", "kind", "FIELD [kV/m]"
			}},
		{name: "title-row", fault: "a title row above the Objects header (the header is on row 2)",
			mutate: func(s *SurveySheets) {
				o := objects(*s)
				o.Rows = append([][]any{{"Objects surveyed on line C2, February"}}, o.Rows...)
			}},
		{name: "merged-title-row", fault: "a title row above the Stations header, merged across A1:F1",
			mutate: func(s *SurveySheets) {
				st := s.Sheet(SheetStations)
				st.Rows = append([][]any{{"Stations of line C2"}}, st.Rows...)
			},
			post: func(f *excelize.File) error { return f.MergeCell(SheetStations, "A1", "F1") }},
		{name: "merged-header-cells", fault: "the Objects Notes header merged across AH1:AI1 (accepted: no problem)",
			post: func(f *excelize.File) error { return f.MergeCell(SheetObjects, "AH1", "AI1") }},
		{name: "duplicate-column", fault: "a second Field [kV/m] column at AI with other values",
			mutate: func(s *SurveySheets) {
				addObjectColumn(*s, "Field [kV/m]", map[string]any{"COAT-WEB": 999.0})
				// addObjectColumn puts the column at AI (after AH Notes).
			}},
		{name: "extra-columns", fault: "three extra Objects columns Shift, Operator, Checked at AI, AJ, AK",
			mutate: func(s *SurveySheets) {
				addObjectColumn(*s, "Shift", map[string]any{"COAT-WEB": "early"})
				addObjectColumn(*s, "Operator", map[string]any{"COAT-WEB": "J. Doe"})
				addObjectColumn(*s, "Checked", map[string]any{"DRY-TC": "yes"})
			}},
		{name: "blank-rows-between", fault: "two blank rows inserted in Objects after row 10 (COAT-OP), so BAG-X moves to row 40",
			mutate: func(s *SurveySheets) {
				o := objects(*s)
				rows := append([][]any{}, o.Rows[:10]...)
				rows = append(rows, []any{}, []any{nil, "  "})
				o.Rows = append(rows, o.Rows[10:]...)
			}},
		{name: "header-only-objects", fault: "the Objects sheet holds its header row only",
			mutate: func(s *SurveySheets) { objects(*s).Rows = objects(*s).Rows[:1] }},
		{name: "header-only-changes", fault: "an optional Changes sheet with its header row only (no problem)",
			mutate: func(s *SurveySheets) {
				*s = append(*s, SheetRows{Name: SheetChanges, Rows: [][]any{headerRow(SheetColumns(SheetChanges))}})
			}},
		{name: "missing-site", fault: "the Site sheet is missing",
			mutate: func(s *SurveySheets) { dropSheet(s, SheetSite) }},
		{name: "copied-sheet", fault: "an extra sheet Objects (2), a copy of Objects, is not read",
			mutate: func(s *SurveySheets) {
				c := s.Clone()
				*s = append(*s, SheetRows{Name: "Objects (2)", Rows: c.Sheet(SheetObjects).Rows})
			}},
		{name: "hidden-rows", fault: "Objects rows 5 (COAT-WEB) and 13 (DRY-TC) hidden",
			post: func(f *excelize.File) error {
				if err := f.SetRowVisible(SheetObjects, 5, false); err != nil {
					return err
				}
				return f.SetRowVisible(SheetObjects, 13, false)
			}},
		{name: "hidden-sheet", fault: "the Materials sheet hidden",
			post: func(f *excelize.File) error { return f.SetSheetVisible(SheetMaterials, false) }},
		{name: "very-hidden-sheet", fault: "the Materials sheet very hidden (not listed by the spreadsheet's unhide menu)",
			post: func(f *excelize.File) error { return f.SetSheetVisible(SheetMaterials, false, true) }},
		{name: "far-column", fault: "5000 extra Stations rows S11 to S5010, each with a stray 1 in column XFD (the last a sheet has)",
			raw: func(name string, b []byte) []byte {
				if name != "xl/worksheets/sheet3.xml" {
					return b
				}
				var rows strings.Builder
				for r := 11; r <= 5010; r++ {
					fmt.Fprintf(&rows, `<row r="%d"><c r="A%d" t="inlineStr"><is><t>S%d</t></is></c><c r="XFD%d"><v>1</v></c></row>`, r, r, r, r)
				}
				s := string(b)
				i := strings.Index(s, "</sheetData>")
				return []byte(s[:i] + rows.String() + s[i:])
			}},
		{name: "far-column-stray", fault: "COAT-WEB and DRY-TC each have a stray value in column XFD (the last a sheet has)",
			raw: func(name string, b []byte) []byte {
				if name != "xl/worksheets/sheet4.xml" {
					return b
				}
				s := string(b)
				for _, r := range []string{"5", "13"} {
					i := strings.Index(s, `<row r="`+r+`"`)
					j := i + strings.Index(s[i:], "</row>")
					s = s[:j] + `<c r="XFD` + r + `" t="inlineStr"><is><t>stray</t></is></c>` + s[j:]
				}
				return []byte(s)
			}},
		// Damaged parts inside a good zip.
		{name: "truncated-sheet-xml", fault: "the Objects sheet's XML part ends after row 10 (cut mid-file, no closing tags)",
			raw: func(name string, b []byte) []byte {
				if name != "xl/worksheets/sheet4.xml" {
					return b
				}
				i := bytes.Index(b, []byte(`<row r="11"`))
				if i < 0 {
					panic("corpus: no row 11")
				}
				return b[:i]
			}},
		{name: "xml-external-entity", fault: "the Objects sheet's XML declares an external entity (file:///etc/passwd) and uses it in COAT-WEB Description",
			raw: func(name string, b []byte) []byte {
				if name != "xl/worksheets/sheet4.xml" {
					return b
				}
				s := string(b)
				decl := `<!DOCTYPE worksheet [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>`
				j := strings.Index(s, "?>")
				s = s[:j+2] + decl + s[j+2:]
				re := regexp.MustCompile(`<c r="D5"[^>]*>.*?</c>`)
				return []byte(re.ReplaceAllString(s, `<c r="D5" t="inlineStr"><is><t>&xxe;</t></is></c>`))
			}},
		// Misread sheet XML: every cell where its reference says, every row
		// where its number says (or a located problem).
		{name: "cell-out-of-order", fault: "COAT-WEB's cells written in the order L5, A5, B5, ... (out of column order, as some programs write them): read by their references, no problem",
			raw: objectsXML(func(s string) string {
				row := rowXML(s, "5")
				l := regexp.MustCompile(`<c r="L5"[^>]*>.*?</c>`).FindString(row)
				moved := strings.Replace(strings.Replace(row, l, "", 1), `<row r="5">`, `<row r="5">`+l, 1)
				return strings.Replace(s, row, moved, 1)
			})},
		{name: "shared-string-index-text", fault: "COAT-WEB Station and DRY-TC Kind refer to shared strings by the texts abc and #REF! instead of numbers",
			raw: objectsXML(func(s string) string {
				s = replaceCell(s, "B5", `<c r="B5" t="s"><v>abc</v></c>`)
				return replaceCell(s, "C13", `<c r="C13" t="s"><v>#REF!</v></c>`)
			})},
		{name: "shared-string-index-range", fault: "COAT-WEB Kind refers to shared string 99999 (there are about 200) and DRY-TC Station to shared string -1",
			raw: objectsXML(func(s string) string {
				s = replaceCell(s, "C5", `<c r="C5" t="s"><v>99999</v></c>`)
				return replaceCell(s, "B13", `<c r="B13" t="s"><v>-1</v></c>`)
			})},
		{name: "bad-style", fault: "COAT-WEB Field has the style s=\"abc\" and REW-BELT Field the style s=\"9999\", neither in the style table",
			raw: objectsXML(func(s string) string {
				s = replaceCell(s, "L5", `<c r="L5" s="abc"><v>400</v></c>`)
				return replaceCell(s, "L21", `<c r="L21" s="9999"><v>10</v></c>`)
			})},
		{name: "rows-out-of-order", fault: "Objects rows 12 and 13 written in the order 13, 12 in the sheet's XML",
			raw: objectsXML(func(s string) string {
				r12, r13 := rowXML(s, "12"), rowXML(s, "13")
				return strings.Replace(s, r12+r13, r13+r12, 1)
			})},
		{name: "row-repeated", fault: "Objects row 13 (DRY-TC) written twice in the sheet's XML, one after the other",
			raw: objectsXML(func(s string) string {
				r13 := rowXML(s, "13")
				return strings.Replace(s, r13, r13+r13, 1)
			})},
		{name: "row-number-invalid", fault: "two rows numbered 0 and -3 after the last Objects row, each with an ID in a cell A0 and A-3",
			raw: objectsXML(func(s string) string {
				extra := `<row r="0"><c r="A0" t="inlineStr"><is><t>EXTRA-0</t></is></c></row>` +
					`<row r="-3"><c r="A-3" t="inlineStr"><is><t>EXTRA-3</t></is></c></row>`
				return strings.Replace(s, "</sheetData>", extra+"</sheetData>", 1)
			})},
		{name: "cell-ref-bad", fault: "the Description cells of COAT-WEB, DRY-TC and REW-BELT referenced as D0, ZZZZZ13 and D1048577",
			raw: objectsXML(func(s string) string {
				s = strings.Replace(s, `<c r="D5" `, `<c r="D0" `, 1)
				s = strings.Replace(s, `<c r="D13" `, `<c r="ZZZZZ13" `, 1)
				return strings.Replace(s, `<c r="D21" `, `<c r="D1048577" `, 1)
			})},
		{name: "sheet-part-elsewhere", fault: "the Objects sheet's part stored as xl/data/objects.xml (its relationship says where): read as usual, no problem",
			file: moveObjectsPart(demoBytes, "xl/data/objects.xml", nil)},
		{name: "sheet-part-elsewhere-truncated", fault: "the Objects sheet's part stored as xl/data/objects.xml and cut after row 10",
			file: moveObjectsPart(demoBytes, "xl/data/objects.xml", func(b []byte) []byte {
				return b[:bytes.Index(b, []byte(`<row r="11"`))]
			})},
		{name: "sheet-names-case-twice", fault: "a second sheet named OBJECTS beside Objects, showing the same part",
			raw: func(name string, b []byte) []byte {
				if name != "xl/workbook.xml" {
					return b
				}
				return bytes.Replace(b, []byte("</sheets>"), []byte(`<sheet name="OBJECTS" sheetId="6" r:id="rId7"></sheet></sheets>`), 1)
			}},
		{name: "sheet-names-space-twice", fault: "a second sheet named \"Obj ects\" beside Objects, showing the same part",
			raw: func(name string, b []byte) []byte {
				if name != "xl/workbook.xml" {
					return b
				}
				return bytes.Replace(b, []byte("</sheets>"), []byte(`<sheet name="Obj ects" sheetId="6" r:id="rId7"></sheet></sheets>`), 1)
			}},
		{name: "boolean-with-far-stray", fault: "COAT-WEB Width is the boolean TRUE and COAT-WEB has a stray value in column XFD",
			post: func(f *excelize.File) error {
				if err := f.SetCellBool(SheetObjects, "G5", true); err != nil {
					return err
				}
				return f.SetCellValue(SheetObjects, "XFD5", "stray")
			}},
		{name: "styles-long-text", fault: "the style part holds 1 MiB of text in an extension element (read as usual, no problem)",
			raw: func(name string, b []byte) []byte {
				if name != "xl/styles.xml" {
					return b
				}
				ext := `<extLst><ext uri="x">` + strings.Repeat("styles ", (1<<20)/7) + `</ext></extLst>`
				return bytes.Replace(b, []byte("</styleSheet>"), []byte(ext+"</styleSheet>"), 1)
			}},
		{name: "shared-strings-flood", fault: "2,000,000 empty shared strings appended to the shared-strings part",
			raw: func(name string, b []byte) []byte {
				if name != "xl/sharedStrings.xml" {
					return b
				}
				return bytes.Replace(b, []byte("</sst>"), append(bytes.Repeat([]byte("<si/>"), 2000000), "</sst>"...), 1)
			}},
		{name: "media-zeros", fault: "a media part xl/media/image1.png of 1 GiB of zeros, declared honestly (never unpacked: read as usual, no problem)", transient: true,
			write: func(t testing.TB, path string) { writeExtraBomb(t, demoBytes(), path, "xl/media/image1.png", 1<<30) }},
		// Package faults: refused with a sentence that says what the file is.
		{name: "zip-duplicate-entry", fault: "the zip holds the Objects sheet's part twice under one name, the second copy without COAT-WEB",
			file: func() []byte {
				return editZip(demoBytes(), func(zw *zip.Writer, name string, b []byte) {
					if name == "xl/worksheets/sheet4.xml" {
						writeZipPart(zw, name, regexp.MustCompile(`<row r="5".*?</row>`).ReplaceAll(b, nil))
					}
				}, nil)
			}},
		{name: "part-shorter-than-declared", fault: "the zip header of the Objects sheet's part declares 100 bytes more than it holds",
			file: func() []byte {
				return editZip(demoBytes(), nil, func(name string, h *zip.FileHeader, b []byte) []byte {
					if name == "xl/worksheets/sheet4.xml" {
						h.UncompressedSize64 = uint64(len(b) + 100)
					}
					return b
				})
			}},
		{name: "utf16-sheet", fault: "the Objects sheet's part re-encoded as UTF-16 (little-endian with a byte-order mark), which is valid XML",
			raw: objectsXMLBytes(func(b []byte) []byte {
				s := strings.Replace(string(b), `encoding="UTF-8"`, `encoding="UTF-16"`, 1)
				out := []byte{0xFF, 0xFE}
				for _, r := range utf16.Encode([]rune(s)) {
					out = append(out, byte(r), byte(r>>8))
				}
				return out
			})},
		{name: "compression-unsupported", fault: "the Objects sheet's part stored with compression method 12 (bzip2), which the zip format allows",
			file: func() []byte {
				return editZip(demoBytes(), nil, func(name string, h *zip.FileHeader, b []byte) []byte {
					if name == "xl/worksheets/sheet4.xml" {
						h.Method = 12
					}
					return b
				})
			}},
		{name: "relationship-outside", fault: "the workbook's relationship for the Objects sheet points to ../../../etc/passwd",
			raw: func(name string, b []byte) []byte {
				if name != "xl/_rels/workbook.xml.rels" {
					return b
				}
				return bytes.Replace(b, []byte(`Target="worksheets/sheet4.xml"`), []byte(`Target="../../../etc/passwd"`), 1)
			}},
		{name: "workbook-xml-malformed", fault: "the workbook part xl/workbook.xml has a sheet element closed by the wrong tag",
			raw: func(name string, b []byte) []byte {
				if name != "xl/workbook.xml" {
					return b
				}
				return bytes.Replace(b, []byte("</sheets>"), []byte("</sheet>"), 1)
			}},
		{name: "styles-xml-malformed", fault: "the style part xl/styles.xml cut in half",
			raw: func(name string, b []byte) []byte {
				if name != "xl/styles.xml" {
					return b
				}
				return b[:len(b)/2]
			}},
		// Files that are no survey workbook.
		{name: "empty", fault: "an empty file", file: func() []byte { return []byte{} }},
		{name: "random-bytes", fault: "8 KiB of random bytes", file: func() []byte {
			rng := rand.New(rand.NewPCG(7, 7))
			b := make([]byte, 8192)
			for i := range b {
				b[i] = byte(rng.UintN(256))
			}
			b[0] = 0x01 // no zip or OLE signature by chance
			return b
		}},
		{name: "truncated-zip", fault: "the demo survey cut to its first half (as by an interrupted download)",
			file: func() []byte { b := demoBytes(); return b[:len(b)/2] }},
		{name: "csv-renamed", fault: "a CSV file saved with the .xlsx extension",
			file: func() []byte { return []byte("ID,Station,Kind,Field [kV/m]\nCOAT-WEB,ST-COAT,sheet,400\n") }},
		{name: "old-xls-signature", fault: "a file with the signature of an old binary .xls (or an encrypted workbook) and nothing more",
			file: func() []byte {
				return append([]byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}, make([]byte, 1016)...)
			}},
		{name: "zip-without-workbook", fault: "a valid zip holding one text file and no workbook",
			file: func() []byte {
				var buf bytes.Buffer
				zw := zip.NewWriter(&buf)
				w, _ := zw.CreateHeader(&zip.FileHeader{Name: "notes.txt", Method: zip.Deflate, Modified: time.Date(2026, 2, 10, 0, 0, 0, 0, time.UTC)})
				io.WriteString(w, "survey notes, not a workbook\n")
				zw.Close()
				return buf.Bytes()
			}},
		{name: "docx-renamed", fault: "a minimal word-processor document (.docx) saved with the .xlsx extension",
			file: func() []byte {
				var buf bytes.Buffer
				zw := zip.NewWriter(&buf)
				for _, part := range [][2]string{
					{"[Content_Types].xml", `<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"/>`},
					{"word/document.xml", `<?xml version="1.0" encoding="UTF-8"?><w:document xmlns:w="http://schemas.openxmlformats.org/wordprocessingml/2006/main"><w:body/></w:document>`},
				} {
					w, _ := zw.CreateHeader(&zip.FileHeader{Name: part[0], Method: zip.Deflate, Modified: time.Date(2026, 2, 10, 0, 0, 0, 0, time.UTC)})
					io.WriteString(w, part[1])
				}
				zw.Close()
				return buf.Bytes()
			}},
		{name: "ods-renamed", fault: "the demo survey saved by LibreOffice as OpenDocument (.ods) and renamed .xlsx", frozen: true,
			write: func(t testing.TB, path string) { writeWithLibreOfficeAs(t, demoBytes(), path, "ods") }},
		{name: "password-protected", fault: "the demo survey saved with the password site (encrypted)", frozen: true,
			file: func() []byte {
				f, err := excelize.OpenReader(bytes.NewReader(demoBytes()))
				if err != nil {
					panic(err)
				}
				defer f.Close()
				var buf bytes.Buffer
				if err := f.Write(&buf, excelize.Options{Password: "site"}); err != nil {
					panic(err)
				}
				return buf.Bytes()
			}},
		{name: "libreoffice-saved", fault: "the demo survey opened and saved again by LibreOffice (soffice --headless --convert-to xlsx)", frozen: true,
			write: func(t testing.TB, path string) { writeWithLibreOffice(t, demoBytes(), path) }},
		// Transient: generated by the test, never checked in.
		{name: "deflate-bomb", fault: "the demo survey whose Objects sheet is replaced by zeros unpacking to twice the default unzip limit (4 GiB), compressed to about 4 MiB, its size declared honestly", transient: true,
			write: func(t testing.TB, path string) {
				writeBomb(t, demoBytes(), path, 2*DefaultUnzipSizeLimit, 2*DefaultUnzipSizeLimit)
			}},
		{name: "deflate-bomb-under-limit", fault: "the demo survey whose Objects sheet is 1 GiB of zeros compressed to about 1 MiB, under the unzip limit, its size declared honestly", transient: true,
			write: func(t testing.TB, path string) { writeBomb(t, demoBytes(), path, 1<<30, 1<<30) }},
		{name: "deflate-bomb-lying", fault: "the same 1 GiB of zeros, but the zip declares the part as 64 KiB", transient: true,
			write: func(t testing.TB, path string) { writeBomb(t, demoBytes(), path, 1<<30, 64<<10) }},
		{name: "over-size-cap", fault: "a sparse file one byte over the default size cap, starting with a zip signature", transient: true,
			write: func(t testing.TB, path string) {
				f, err := os.Create(path)
				if err != nil {
					t.Fatal(err)
				}
				defer f.Close()
				if _, err := f.Write([]byte("PK\x03\x04")); err != nil {
					t.Fatal(err)
				}
				if err := f.Truncate(DefaultMaxFileSize + 1); err != nil {
					t.Fatal(err)
				}
			}},
	}
}

// renameStation renames a station and every reference to it.
func renameStation(s SurveySheets, from, to string) {
	setCell(s, SheetStations, from, "ID", to)
	o := s.Sheet(SheetObjects)
	for _, r := range o.Rows[1:] {
		if cellText(r, 1) == from {
			r[1] = to
		}
	}
}

// objectCell returns the text of a cell of the object row with the given ID.
func objectCell(s SurveySheets, id, column string) string {
	j := columnIndex(SheetColumns(SheetObjects), column)
	for _, r := range s.Sheet(SheetObjects).Rows[1:] {
		if cellText(r, 0) == id {
			return cellText(r, j)
		}
	}
	panic("corpus: no object " + id)
}

// corpusDir is testdata/corpus from the inventory package.
func corpusDir() string { return filepath.Join("..", "testdata", "corpus") }

// build makes the case's bytes (not for transient or write cases).
func (c corpusCase) build(t testing.TB) []byte {
	t.Helper()
	if c.file != nil {
		return c.file()
	}
	s := DemoSurvey().Clone()
	if c.mutate != nil {
		c.mutate(&s)
	}
	var buf bytes.Buffer
	if err := WriteSurvey(&buf, s); err != nil {
		t.Fatal(err)
	}
	data := buf.Bytes()
	if c.post != nil {
		f, err := excelize.OpenReader(bytes.NewReader(data))
		if err != nil {
			t.Fatal(err)
		}
		if err := c.post(f); err != nil {
			t.Fatal(err)
		}
		var out bytes.Buffer
		if _, err := f.WriteTo(&out); err != nil {
			t.Fatal(err)
		}
		f.Close()
		data = out.Bytes()
	}
	if c.raw != nil {
		data = rewriteZip(t, data, c.raw)
	}
	return data
}

// rewriteZip copies a zip, passing every part through edit (same order and names).
func rewriteZip(t testing.TB, data []byte, edit func(name string, b []byte) []byte) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, zf := range zr.File {
		rc, err := zf.Open()
		if err != nil {
			t.Fatal(err)
		}
		b, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			t.Fatal(err)
		}
		b = edit(zf.Name, b)
		w, err := zw.CreateHeader(&zip.FileHeader{Name: zf.Name, Method: zip.Deflate, Modified: zf.Modified})
		if err != nil {
			t.Fatal(err)
		}
		if _, err := w.Write(b); err != nil {
			t.Fatal(err)
		}
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// writeBomb writes the demo survey with its Objects sheet replaced by size
// zero bytes (a multiple of 1 MiB), deflated to about size/1000 without
// compressing it all: one flushed 1 MiB block of zeros is repeated (its
// back-references reach only zeros). The zip's headers declare the part's
// unpacked size as declared.
func writeBomb(t testing.TB, demo []byte, path string, size, declared uint64) {
	t.Helper()
	const chunk = 1 << 20
	zeros := make([]byte, chunk)
	var both bytes.Buffer
	fw, _ := flate.NewWriter(&both, flate.BestCompression)
	fw.Write(zeros)
	fw.Flush()
	n1 := both.Len()
	fw.Write(zeros) // a second block, which refers back to zeros only
	fw.Flush()
	block := append([]byte(nil), both.Bytes()[n1:]...)
	fw.Close() // an empty final block
	tail := append([]byte(nil), both.Bytes()[n1+len(block):]...)
	var stream bytes.Buffer
	stream.Write(both.Bytes()[:n1])
	for i := uint64(1); i < size/chunk; i++ {
		stream.Write(block)
	}
	stream.Write(tail)
	var crc uint32
	if size <= 1<<30 { // the larger bomb is refused from its declared size; its CRC is never reached
		h := crc32.NewIEEE()
		for i := uint64(0); i < size/chunk; i++ {
			h.Write(zeros)
		}
		crc = h.Sum32()
	}
	zr, err := zip.NewReader(bytes.NewReader(demo), int64(len(demo)))
	if err != nil {
		t.Fatal(err)
	}
	out, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	defer out.Close()
	zw := zip.NewWriter(out)
	for _, zf := range zr.File {
		if zf.Name == "xl/worksheets/sheet4.xml" {
			w, err := zw.CreateRaw(&zip.FileHeader{Name: zf.Name, Method: zip.Deflate, CRC32: crc,
				CompressedSize64: uint64(stream.Len()), UncompressedSize64: declared, Modified: zf.Modified})
			if err != nil {
				t.Fatal(err)
			}
			w.Write(stream.Bytes())
			continue
		}
		if err := zw.Copy(zf); err != nil {
			t.Fatal(err)
		}
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
}

// writeWithLibreOffice saves data through LibreOffice into path; it skips when
// soffice is not on PATH.
func writeWithLibreOffice(t testing.TB, data []byte, path string) {
	t.Helper()
	writeWithLibreOfficeAs(t, data, path, "xlsx")
}

// writeWithLibreOfficeAs saves data through LibreOffice in the format ext
// (xlsx, ods) into path.
func writeWithLibreOfficeAs(t testing.TB, data []byte, path, ext string) {
	t.Helper()
	soffice, err := exec.LookPath("soffice")
	if err != nil {
		t.Skip("soffice is not installed; the checked-in libreoffice-saved.xlsx is used")
	}
	dir := t.TempDir()
	in := filepath.Join(dir, "in", "libreoffice-saved.xlsx")
	os.MkdirAll(filepath.Dir(in), 0o755)
	if err := os.WriteFile(in, data, 0o644); err != nil {
		t.Fatal(err)
	}
	outDir := filepath.Join(dir, "out")
	cmd := exec.Command(soffice, "-env:UserInstallation=file://"+filepath.Join(dir, "profile"), "--headless",
		"--convert-to", ext, "--outdir", outDir, in)
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("soffice: %v\n%s", err, out)
	}
	b, err := os.ReadFile(filepath.Join(outDir, "libreoffice-saved."+ext))
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

// corpusGolden is a hand-written expected outcome.
type corpusGolden struct {
	Fault      string
	Exit       int               // exit code of check: 0, 1 or 2
	Unreadable string            // part of the one-sentence message when Exit is 2
	Rows       map[string][3]int // sheet -> read, accepted, rejected
	RowOrder   []string
	Problems   []expectedProblem
}

// readCorpusGolden reads a corpus golden: "# fault: ..." and comment lines,
// "exit N", "unreadable TEXT", "rows SHEET READ ACCEPTED REJECTED" and
// problem lines as in the broken goldens (CELL (FIELD) SEVERITY).
func readCorpusGolden(path string) (*corpusGolden, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	g := &corpusGolden{Exit: -1, Rows: map[string][3]int{}}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		key, rest, _ := strings.Cut(line, " ")
		switch {
		case line == "":
		case strings.HasPrefix(line, "# fault:"):
			g.Fault = strings.TrimSpace(strings.TrimPrefix(line, "# fault:"))
		case strings.HasPrefix(line, "#"):
		case key == "exit":
			g.Exit, err = strconv.Atoi(rest)
		case key == "unreadable":
			g.Unreadable = rest
		case key == "rows":
			var sh string
			var n [3]int
			if _, err = fmt.Sscanf(rest, "%s %d %d %d", &sh, &n[0], &n[1], &n[2]); err == nil {
				g.Rows[sh] = n
				g.RowOrder = append(g.RowOrder, sh)
			}
		default:
			e, ok := parseProblemLine(line)
			if !ok {
				return nil, fmt.Errorf("%s: bad golden line %q", path, line)
			}
			g.Problems = append(g.Problems, e)
		}
		if err != nil {
			return nil, fmt.Errorf("%s: line %q: %w", path, line, err)
		}
	}
	if g.Exit < 0 || g.Exit > 2 {
		return nil, fmt.Errorf("%s: no exit line", path)
	}
	return g, sc.Err()
}

// TestCorpusFiles checks that each checked-in corpus file holds what its Go
// source generates (-update rewrites them; frozen files only with -update) and
// that each case has a hand-written golden whose fault line matches the table.
func TestCorpusFiles(t *testing.T) {
	cases := corpusCases()
	if len(cases) < 40 {
		t.Errorf("%d corpus cases, want at least 40", len(cases)) // Source: issue 7, item 1
	}
	seen := map[string]bool{}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if seen[c.name] {
				t.Fatal("name used twice")
			}
			seen[c.name] = true
			defer func() {
				g, err := readCorpusGolden(filepath.Join(corpusDir(), c.name+".golden"))
				if err != nil {
					t.Fatalf("golden: %v (goldens are written by hand, never by -update)", err)
				}
				if g.Fault != c.fault {
					t.Errorf("golden fault line %q, table says %q", g.Fault, c.fault)
				}
			}()
			if c.transient || (raceEnabled && !*update) {
				return // the files are compared in the plain go test
			}
			path := filepath.Join(corpusDir(), c.name+".xlsx")
			switch {
			case c.frozen && *update:
				if c.write != nil {
					c.write(t, path)
				} else if err := os.WriteFile(path, c.build(t), 0o644); err != nil {
					t.Fatal(err)
				}
			case c.frozen:
				if _, err := os.Stat(path); err != nil {
					t.Fatalf("%v (run go test ./inventory -run TestCorpusFiles -update)", err)
				}
			case c.file != nil || c.raw != nil:
				checkGeneratedBytes(t, path, c.build(t))
			default:
				checkGeneratedWorkbook(t, path, c.build(t))
			}
		})
	}
}

// checkGeneratedBytes compares the bytes of a checked-in file with data, or
// rewrites it with -update (for files excelize cannot open or that differ from
// a plain workbook only below the cell level).
func checkGeneratedBytes(t *testing.T, path string, data []byte) {
	t.Helper()
	old, ok := readGenerated(t, path, data)
	if ok && !bytes.Equal(old, data) {
		t.Errorf("%s is out of date with its Go source (run go test ./inventory -update)", path)
	}
}

// objectsXML edits the demo's Objects sheet part (xl/worksheets/sheet4.xml) as text.
func objectsXML(edit func(s string) string) func(string, []byte) []byte {
	return objectsXMLBytes(func(b []byte) []byte { return []byte(edit(string(b))) })
}

// objectsXMLBytes edits the demo's Objects sheet part.
func objectsXMLBytes(edit func(b []byte) []byte) func(string, []byte) []byte {
	return func(name string, b []byte) []byte {
		if name != "xl/worksheets/sheet4.xml" {
			return b
		}
		return edit(b)
	}
}

// rowXML returns the <row> element of row r in a sheet part.
func rowXML(s, r string) string {
	row := regexp.MustCompile(`<row r="` + r + `".*?</row>`).FindString(s)
	if row == "" {
		panic("corpus: no row " + r)
	}
	return row
}

// replaceCell replaces the cell element ref of a sheet part.
func replaceCell(s, ref, xml string) string {
	re := regexp.MustCompile(`<c r="` + ref + `"[^>]*>.*?</c>`)
	if !re.MatchString(s) {
		panic("corpus: no cell " + ref)
	}
	return re.ReplaceAllLiteralString(s, xml)
}

// moveObjectsPart returns the demo survey with the Objects sheet's part
// stored under the name to (edited by edit when not nil), its relationship
// and content type pointing there.
func moveObjectsPart(demo func() []byte, to string, edit func([]byte) []byte) func() []byte {
	return func() []byte {
		zr, err := zip.NewReader(bytes.NewReader(demo()), int64(len(demo())))
		if err != nil {
			panic(err)
		}
		var buf bytes.Buffer
		zw := zip.NewWriter(&buf)
		for _, zf := range zr.File {
			rc, err := zf.Open()
			if err != nil {
				panic(err)
			}
			b, _ := io.ReadAll(rc)
			rc.Close()
			name := zf.Name
			switch name {
			case "xl/worksheets/sheet4.xml":
				name = to
				if edit != nil {
					b = edit(b)
				}
			case "xl/_rels/workbook.xml.rels":
				b = bytes.Replace(b, []byte(`Target="worksheets/sheet4.xml"`), []byte(`Target="/`+to+`"`), 1)
			case "[Content_Types].xml":
				b = bytes.Replace(b, []byte(`/xl/worksheets/sheet4.xml`), []byte(`/`+to), 1)
			}
			writeZipPart(zw, name, b)
		}
		if err := zw.Close(); err != nil {
			panic(err)
		}
		return buf.Bytes()
	}
}

// editZip copies a zip: add may write extra entries after each part (it is
// called with each part's name and bytes), and header may change a part's
// header and bytes, which are then written raw (stored, not compressed),
// so that a header may declare what the bytes are not.
func editZip(data []byte, add func(zw *zip.Writer, name string, b []byte), header func(name string, h *zip.FileHeader, b []byte) []byte) []byte {
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		panic(err)
	}
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, zf := range zr.File {
		rc, err := zf.Open()
		if err != nil {
			panic(err)
		}
		b, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			panic(err)
		}
		if header != nil {
			h := &zip.FileHeader{Name: zf.Name, Method: zip.Store, Modified: zf.Modified, CRC32: crc32.ChecksumIEEE(b), UncompressedSize64: uint64(len(b))}
			b = header(zf.Name, h, b)
			h.CompressedSize64 = uint64(len(b))
			w, err := zw.CreateRaw(h)
			if err != nil {
				panic(err)
			}
			w.Write(b)
		} else {
			writeZipPart(zw, zf.Name, b)
		}
		if add != nil {
			add(zw, zf.Name, b)
		}
	}
	if err := zw.Close(); err != nil {
		panic(err)
	}
	return buf.Bytes()
}

// writeZipPart writes one deflated entry.
func writeZipPart(zw *zip.Writer, name string, b []byte) {
	w, err := zw.CreateHeader(&zip.FileHeader{Name: name, Method: zip.Deflate, Modified: time.Date(2026, 2, 10, 0, 0, 0, 0, time.UTC)})
	if err != nil {
		panic(err)
	}
	w.Write(b)
}

// writeExtraBomb writes the demo survey with an extra part of size zero
// bytes (a multiple of 1 MiB), deflated as writeBomb does, its size declared
// honestly.
func writeExtraBomb(t testing.TB, demo []byte, path, part string, size uint64) {
	t.Helper()
	const chunk = 1 << 20
	zeros := make([]byte, chunk)
	var both bytes.Buffer
	fw, _ := flate.NewWriter(&both, flate.BestCompression)
	fw.Write(zeros)
	fw.Flush()
	n1 := both.Len()
	fw.Write(zeros)
	fw.Flush()
	block := append([]byte(nil), both.Bytes()[n1:]...)
	fw.Close()
	tail := append([]byte(nil), both.Bytes()[n1+len(block):]...)
	var stream bytes.Buffer
	stream.Write(both.Bytes()[:n1])
	for i := uint64(1); i < size/chunk; i++ {
		stream.Write(block)
	}
	stream.Write(tail)
	h := crc32.NewIEEE()
	for i := uint64(0); i < size/chunk; i++ {
		h.Write(zeros)
	}
	zr, err := zip.NewReader(bytes.NewReader(demo), int64(len(demo)))
	if err != nil {
		t.Fatal(err)
	}
	out, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	defer out.Close()
	zw := zip.NewWriter(out)
	for _, zf := range zr.File {
		if err := zw.Copy(zf); err != nil {
			t.Fatal(err)
		}
	}
	w, err := zw.CreateRaw(&zip.FileHeader{Name: part, Method: zip.Deflate, CRC32: h.Sum32(),
		CompressedSize64: uint64(stream.Len()), UncompressedSize64: size, Modified: time.Date(2026, 2, 10, 0, 0, 0, 0, time.UTC)})
	if err != nil {
		t.Fatal(err)
	}
	w.Write(stream.Bytes())
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
}
