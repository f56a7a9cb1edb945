package book

import (
	"bytes"
	"hash/crc32"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// The numbers and texts are invented for the test (edge cases); the expected cells are what
// excelize's StreamWriter writes for the same cells (Source: excelize, the outside oracle).

func TestCRC32Combine(t *testing.T) {
	// Expected: the CRC of the concatenation computed directly (hash/crc32).
	parts := [][]byte{[]byte("<worksheet>"), bytes.Repeat([]byte("<row r=\"2\"/>"), 10000), []byte(""), []byte("</sheetData></worksheet>")}
	var all []byte
	crc := uint32(0)
	for _, p := range parts {
		all = append(all, p...)
		crc = crc32Combine(crc, crc32.ChecksumIEEE(p), int64(len(p)))
	}
	if want := crc32.ChecksumIEEE(all); crc != want {
		t.Fatalf("combined CRC %08x, direct %08x", crc, want)
	}
}

// oddTexts are the texts the row writer must write as excelize does: every
// text of the inventory corpus (hostile and odd survey files) and texts made
// for the escaping rules (ECMA-376 Part 1, 22.9.2.19 for _xHHHH_; XML 1.0
// section 2.2 for the characters XML cannot hold; 32,767 characters a cell).
func oddTexts(t *testing.T) []string {
	texts := []string{
		"", "plain", " leading", "trailing ", "\ttab", "line\nbreak", "cr\r\nlf", "\n",
		`quotes " and ' and <tags> & amps`, "=SUM(A1:A3)", "=1+1", "+12", "-3", "@x",
		"_x0041_", "a_x0041_b", "_x005F_", "_x005F_x0041_", "_x005f_x00e9_", "_xD800_x0041_",
		"_x12_", "_X0041_", "__x0041__", "_x0041_x0042_", "_x0000_",
		"bell\x07 nul\x00 esc\x1b del\x7f", "bad utf8 \xff\xfe end", "\uFFFE\uFFFF", "\u00e9\u4e2d\U0001F600",
		"\u200b zero width \u202e bidi",
		strings.Repeat("x", 32767), strings.Repeat("y", 32768), strings.Repeat("ü", 40000),
		strings.Repeat("\U0001F600", 16384), // 32,768 UTF-16 units: the last emoji does not fit whole
		strings.Repeat("ab_x0041_", 5000),
	}
	files, err := filepath.Glob("../../testdata/corpus/*.xlsx")
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	for _, fn := range files {
		switch filepath.Base(fn) {
		case "far-column.xlsx", "shared-strings-flood.xlsx":
			continue // built to be slow for a reader that expands them (over a minute in excelize); their texts are plain
		}
		f, err := excelize.OpenFile(fn)
		if err != nil {
			continue // the corpus holds files that are no workbook at all
		}
		for _, sh := range f.GetSheetList() {
			rows, err := f.GetRows(sh, excelize.Options{RawCellValue: true})
			if err != nil {
				continue
			}
			for _, r := range rows {
				for _, c := range r {
					if !seen[c] && len(seen) < 1200 {
						seen[c] = true
					}
				}
			}
		}
		_ = f.Close()
	}
	var fromCorpus []string
	for s := range seen {
		fromCorpus = append(fromCorpus, s)
	}
	sort.Strings(fromCorpus)
	if len(fromCorpus) < 50 {
		t.Fatalf("only %d texts read from the corpus", len(fromCorpus))
	}
	return append(texts, fromCorpus...)
}

// oddRows makes rows of cells of every kind and style from the texts.
func oddRows(texts []string) [][]Cell {
	nums := []float64{0, math.Copysign(0, -1), 1, -1, 0.1 + 0.2, 1.0 / 3, 350e-3 / 1e-3, 1e13, 1.2345678901234567e20,
		123456789012345678, 1e-300, 5e-324, math.MaxFloat64, -math.MaxFloat64, math.NaN(), math.Inf(1), math.Inf(-1), 2.5e-7}
	var rows [][]Cell
	for i, s := range texts {
		n := nums[i%len(nums)]
		rows = append(rows, []Cell{
			Text(s),
			WrapText(s),
			Code(s),
			{}, // unstyled: no cell
			{V: n, NumFmt: "0.00"},
			{V: n, NumFmt: `[=0]0;[<0.001]0.0E+00;0.000`, Mark: map[bool]string{true: "est.", false: ""}[i%2 == 0]},
			{NumFmt: "0.0"}, // an empty styled cell
			Integer(i),
			{V: s, Fill: "FF0000", Color: "FFFFFF"},
			{},
			{V: i%3 == 0},
			BoldText(s),
			{V: s, Align: "right", Wrap: i%2 == 1},
		})
	}
	return rows
}

// TestRowWriterReadsAsStreamWriter writes the same rows through excelize's
// StreamWriter and through the RowWriter (spliced by CanonicalZipRows) and
// reads both back with excelize: every cell's value, type and style, and every
// row's height, must be the same.
func TestRowWriterReadsAsStreamWriter(t *testing.T) {
	rows := oddRows(oddTexts(t))
	heights := func(i int) float64 {
		if i%4 == 1 {
			return 12.75*float64(i%8) + 2
		}
		return 0
	}
	dir := t.TempDir()
	write := func(direct bool) []byte {
		f := excelize.NewFile()
		defer f.Close()
		st := NewStyles(f)
		sw, err := f.NewStreamWriter("Sheet1")
		if err != nil {
			t.Fatal(err)
		}
		sink := StreamSink{SW: sw, St: st}
		if err := sink.Header(1, []string{"A", "B", "C"}); err != nil {
			t.Fatal(err)
		}
		var rw *RowWriter
		if direct {
			if rw, err = NewRowWriter(dir, st); err != nil {
				t.Fatal(err)
			}
			defer rw.Close()
		}
		for i, cells := range rows {
			if direct {
				err = rw.Row(i+2, cells, heights(i))
			} else {
				err = sink.Row(i+2, cells, heights(i))
			}
			if err != nil {
				t.Fatal(err)
			}
		}
		if err := sw.Flush(); err != nil {
			t.Fatal(err)
		}
		var spliced map[string]*Rows
		if direct {
			rs, err := rw.Finish()
			if err != nil {
				t.Fatal(err)
			}
			spliced = map[string]*Rows{"Sheet1": rs}
		}
		var out bytes.Buffer
		if err := WriteCanonicalRows(f, &out, dir, spliced); err != nil {
			t.Fatal(err)
		}
		return out.Bytes()
	}
	want, got := write(false), write(true)
	t.Logf("sheet package: StreamWriter %d bytes, direct rows %d bytes", len(want), len(got))
	fw, err := excelize.OpenReader(bytes.NewReader(want))
	if err != nil {
		t.Fatal(err)
	}
	fg, err := excelize.OpenReader(bytes.NewReader(got))
	if err != nil {
		t.Fatalf("direct rows: the package does not open: %v", err)
	}
	dw, _ := fw.GetSheetDimension("Sheet1")
	dg, _ := fg.GetSheetDimension("Sheet1")
	// excelize's StreamWriter leaves the dimension at its first row ("A1");
	// the direct rows give the true range.
	if want := "A1:M" + strconv.Itoa(len(rows)+1); dg != want {
		t.Errorf("dimension %q, want %q (StreamWriter %q)", dg, want, dw)
	}
	bad := 0
	rw, _ := fw.GetRows("Sheet1", excelize.Options{RawCellValue: true})
	rg, err := fg.GetRows("Sheet1", excelize.Options{RawCellValue: true})
	if err != nil || len(rw) != len(rg) {
		t.Fatalf("direct rows: %d rows (%v), StreamWriter %d", len(rg), err, len(rw))
	}
	for r := 1; r <= len(rows)+1 && bad < 20; r++ {
		hw, _ := fw.GetRowHeight("Sheet1", r)
		hg, _ := fg.GetRowHeight("Sheet1", r)
		if hw != hg {
			t.Errorf("row %d: height %v, StreamWriter %v", r, hg, hw)
			bad++
		}
		for c := 1; c <= 13; c++ {
			ref, _ := excelize.CoordinatesToCellName(c, r)
			var vw, vg string
			if c <= len(rw[r-1]) {
				vw = rw[r-1][c-1]
			}
			if c <= len(rg[r-1]) {
				vg = rg[r-1][c-1]
			}
			if vw != vg {
				t.Errorf("%s: value %.60q, StreamWriter %.60q", ref, vg, vw)
				bad++
			}
			tw, _ := fw.GetCellType("Sheet1", ref)
			tg, _ := fg.GetCellType("Sheet1", ref)
			if tw != tg {
				t.Errorf("%s: type %v, StreamWriter %v", ref, tg, tw)
				bad++
			}
			sw, _ := fw.GetCellStyle("Sheet1", ref)
			sg, _ := fg.GetCellStyle("Sheet1", ref)
			if sw != sg {
				t.Errorf("%s: style %d, StreamWriter %d", ref, sg, sw)
				bad++
				continue
			}
			if sw != 0 {
				a, _ := fw.GetStyle(sw)
				b, _ := fg.GetStyle(sg)
				if a.CustomNumFmt != nil && b.CustomNumFmt != nil && *a.CustomNumFmt != *b.CustomNumFmt || a.Fill.Pattern != b.Fill.Pattern {
					t.Errorf("%s: style %d differs in content", ref, sg)
					bad++
				}
			}
		}
	}
	if os.Getenv("ROWWRITER_KEEP") != "" {
		_ = os.WriteFile(os.Getenv("ROWWRITER_KEEP"), got, 0o644)
	}
}

// wrappedLinesSplit is the first form of WrappedLines (split into paragraphs
// and fields): the one-pass form must count the same lines.
func wrappedLinesSplit(s string, width float64) int {
	capacity := int(width*1.4) - 1
	if capacity < 4 {
		capacity = 4
	}
	n := 0
	for _, para := range strings.Split(s, "\n") {
		n++
		used := 0
		for _, w := range strings.Fields(para) {
			l := len([]rune(w))
			switch {
			case used == 0:
				used = l
			case used+1+l <= capacity:
				used += 1 + l
			default:
				n++
				used = l
			}
			for used > capacity {
				n++
				used -= capacity
			}
		}
	}
	return n
}

func TestWrappedLinesOnePass(t *testing.T) {
	texts := append(oddTexts(t), "", "\n\n", "a  b\u00a0c\u2003d", "word "+strings.Repeat("long", 40)+" end\n\nnext para", "ü ü ü ü ü ü ü ü ü ü ü ü ü ü ü ü ü ü ü ü")
	for _, s := range texts {
		for _, w := range []float64{3, 9, 24, 50} {
			if got, want := WrappedLines(s, w), wrappedLinesSplit(s, w); got != want {
				t.Fatalf("WrappedLines(%.40q, %v) = %d, split form %d", s, w, got, want)
			}
		}
	}
}

func FuzzWrappedLines(f *testing.F) {
	f.Add("a b c\nd", 9.0)
	f.Fuzz(func(t *testing.T, s string, w float64) {
		if w < 0 || w > 500 || w != w {
			return
		}
		if got, want := WrappedLines(s, w), wrappedLinesSplit(s, w); got != want {
			t.Fatalf("WrappedLines(%q, %v) = %d, split form %d", s, w, got, want)
		}
	})
}
