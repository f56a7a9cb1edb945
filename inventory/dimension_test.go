package inventory

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"testing/iotest"
)

// Row numbers in these tests are invented for the test; the dimension grammar is ECMA-376 Part 1,
// 18.3.1.35 (Source: the standard's text as quoted in the test).

// TestDimensionLastRow: the last row of a sheet's declared range, as
// spreadsheet programs write it (ECMA-376 Part 1, 18.3.1.35: ref is a cell
// range "A1:K5001", or one cell "A1" for a sheet of one cell).
func TestDimensionLastRow(t *testing.T) {
	cases := []struct {
		name, xml string
		want      int
	}{
		{"range", `<worksheet><dimension ref="A1:AJ5001"/><sheetData>`, 5001},
		{"single quotes", `<worksheet><dimension ref='A1:C12'/><sheetData>`, 12},
		{"one cell", `<worksheet><dimension ref="A1"/><sheetData>`, 1},
		{"lower case column", `<x:dimension ref="a1:c7"/>`, 7},
		{"none", `<worksheet><sheetData><row r="1"/></sheetData>`, 0},
		{"after sheetData is not it", `<worksheet><sheetData/><dimension ref="A1:C9"/>`, 0},
		{"no ref", `<dimension/>`, 0},
		{"row beyond the sheet", `<dimension ref="A1:C1048577"/>`, 0},
		{"not a reference", `<dimension ref="A1:foo"/>`, 0},
		{"cut short", `<dimension ref="A1:C9`, 0},
	}
	for _, c := range cases {
		if got := dimensionLastRow([]byte(c.xml)); got != c.want {
			t.Errorf("%s: dimensionLastRow(%q) = %d, want %d", c.name, c.xml, got, c.want)
		}
	}
}

// TestDeclaredObjectRows: the demo survey's Objects sheet declares no range
// (its writer leaves "A1"), so its rows are counted when asked; the streamed
// and the whole read agree.
func TestDeclaredObjectRows(t *testing.T) {
	b, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "demo.xlsx")
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	if s, err := ReadFile(path, ReadOptions{}); err != nil || s.DeclaredObjectRows != 0 {
		t.Fatalf("not asked to count: %d declared object rows (%v), want 0", s.DeclaredObjectRows, err)
	}
	s, err := ReadFile(path, ReadOptions{CountObjectRows: true})
	if err != nil {
		t.Fatal(err)
	}
	objects := 0
	for _, c := range s.Counts {
		if c.Sheet == SheetObjects {
			objects = c.Read
		}
	}
	// The demo's Objects rows follow the header straight away, so the rows
	// counted less the header are the rows read.
	if objects == 0 || s.DeclaredObjectRows != objects {
		t.Errorf("demo survey: %d object rows read, %d declared; want the same", objects, s.DeclaredObjectRows)
	}
	st, err := StreamFile(path, ReadOptions{CountObjectRows: true}, nil, func(Object) error { return nil })
	if err != nil {
		t.Fatal(err)
	}
	if st.DeclaredObjectRows != s.DeclaredObjectRows {
		t.Errorf("streamed: %d declared object rows, read whole: %d", st.DeclaredObjectRows, s.DeclaredObjectRows)
	}
}

// TestCountRowTags: row start tags are counted once wherever a chunk of the
// unpacked part ends, with or without a namespace prefix, and not the
// <rowBreaks> element.
func TestCountRowTags(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<worksheet><sheetData>`)
	for i := 1; i <= 5000; i++ {
		if i%2 == 0 {
			fmt.Fprintf(&b, `<x:row r="%d"><c r="A%d"><v>1</v></c></x:row>`, i, i)
		} else {
			fmt.Fprintf(&b, `<row r="%d"><c r="A%d"><v>1</v></c></row>`, i, i)
		}
	}
	b.WriteString(`</sheetData><rowBreaks count="1"/></worksheet>`)
	doc := b.String()
	for _, chunk := range []int{1, 3, 4, 5, 7, 4096} {
		if got := countRowTags(iotest.OneByteReader(strings.NewReader(doc)), int64(len(doc))); chunk == 1 && got != 5000 {
			t.Errorf("one byte at a time: %d rows, want 5000", got)
		}
		if got := countRowTags(&chunked{s: doc, n: chunk}, int64(len(doc))); got != 5000 {
			t.Errorf("chunks of %d bytes: %d rows, want 5000", chunk, got)
		}
	}
	if got := countRowTags(strings.NewReader(doc), int64(len(doc))-1); got != 0 {
		t.Errorf("more bytes than declared: %d rows, want 0", got)
	}
}

// chunked reads s n bytes at a time.
type chunked struct {
	s string
	n int
}

func (c *chunked) Read(p []byte) (int, error) {
	if c.s == "" {
		return 0, io.EOF
	}
	k := copy(p[:min(len(p), c.n)], c.s)
	c.s = c.s[k:]
	return k, nil
}
