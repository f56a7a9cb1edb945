package book

import (
	"archive/zip"
	"fmt"
	"io"
	"os"
	"regexp"
	"sort"
	"time"

	"github.com/xuri/excelize/v2"
)

// CanonicalZip copies the zip package in r to w with its entries in a fixed
// order ([Content_Types].xml, then _rels/.rels, then by name) and a fixed
// modification time, so that the same cells give the same bytes: excelize
// writes its parts in map order.
func CanonicalZip(r io.ReaderAt, size int64, w io.Writer) error {
	return CanonicalZipRows(r, size, w, nil)
}

// CanonicalZipRows is CanonicalZip that also splices into the worksheet of
// each named sheet its data rows written by a RowWriter, after the rows
// excelize wrote (the header) and before </sheetData>, and widens the
// sheet's dimension to them.
func CanonicalZipRows(r io.ReaderAt, size int64, w io.Writer, rows map[string]*Rows) error {
	zr, err := zip.NewReader(r, size)
	if err != nil {
		return err
	}
	spliced := map[string]*Rows{}
	if len(rows) > 0 {
		paths, err := sheetParts(zr)
		if err != nil {
			return err
		}
		for name, rs := range rows {
			p, ok := paths[name]
			if !ok {
				return fmt.Errorf("sheet %s: not in the workbook", name)
			}
			spliced[p] = rs
		}
	}
	files := append([]*zip.File(nil), zr.File...)
	rank := func(n string) int {
		switch n {
		case "[Content_Types].xml":
			return 0
		case "_rels/.rels":
			return 1
		}
		return 2
	}
	sort.SliceStable(files, func(i, j int) bool {
		ri, rj := rank(files[i].Name), rank(files[j].Name)
		if ri != rj {
			return ri < rj
		}
		return files[i].Name < files[j].Name
	})
	zw := zip.NewWriter(w)
	stamp := time.Date(1980, 1, 1, 0, 0, 0, 0, time.UTC)
	for _, f := range files {
		if rs := spliced[f.Name]; rs != nil {
			if err := spliceRows(zw, f, stamp, rs); err != nil {
				return fmt.Errorf("part %s: %w", f.Name, err)
			}
			continue
		}
		if f.Name == "[Content_Types].xml" {
			if err := rewritePart(zw, f, stamp, sortContentTypes); err != nil {
				return err
			}
			continue
		}
		// Copy the compressed bytes as they are: deflate output is the same
		// for the same input, and recompressing would double the work.
		hdr := f.FileHeader
		hdr.Modified = stamp
		hdr.ModifiedTime, hdr.ModifiedDate = 0, 1<<5|1 // MS-DOS date of 1980-01-01 (CreateRaw does not convert Modified)
		hdr.Extra = nil
		out, err := zw.CreateRaw(&hdr)
		if err != nil {
			return err
		}
		in, err := f.OpenRaw()
		if err != nil {
			return fmt.Errorf("part %s: %w", f.Name, err)
		}
		if _, err := io.Copy(out, in); err != nil {
			return fmt.Errorf("part %s: %w", f.Name, err)
		}
	}
	return zw.Close()
}

// rewritePart writes the part f through edit, recompressed.
func rewritePart(zw *zip.Writer, f *zip.File, stamp time.Time, edit func([]byte) []byte) error {
	in, err := f.Open()
	if err != nil {
		return fmt.Errorf("part %s: %w", f.Name, err)
	}
	b, err := io.ReadAll(in)
	_ = in.Close()
	if err != nil {
		return fmt.Errorf("part %s: %w", f.Name, err)
	}
	out, err := zw.CreateHeader(&zip.FileHeader{Name: f.Name, Method: zip.Deflate, Modified: stamp})
	if err != nil {
		return err
	}
	_, err = out.Write(edit(b))
	return err
}

// sortContentTypes sorts the entries of [Content_Types].xml (excelize writes
// its Default entries in map order); any other content stays as it is.
func sortContentTypes(b []byte) []byte {
	entry := regexp.MustCompile(`<(Default|Override) [^>]*(/>|></(Default|Override)>)`)
	locs := entry.FindAllIndex(b, -1)
	if len(locs) < 2 {
		return b
	}
	entries := make([]string, len(locs))
	for i, l := range locs {
		entries[i] = string(b[l[0]:l[1]])
	}
	sort.Strings(entries)
	var out []byte
	prev := 0
	for i, l := range locs {
		out = append(out, b[prev:l[0]]...)
		out = append(out, entries[i]...)
		prev = l[1]
	}
	return append(out, b[prev:]...)
}

// WriteCanonical writes the workbook package through a temporary file (big
// audits stay out of memory) in tmpDir ("" for the system's temporary
// folder) and copies it to w in canonical order.
func WriteCanonical(f *excelize.File, w io.Writer, tmpDir string) error {
	return WriteCanonicalRows(f, w, tmpDir, nil)
}

// WriteCanonicalRows is WriteCanonical with the data rows of the named sheets
// spliced in (CanonicalZipRows).
func WriteCanonicalRows(f *excelize.File, w io.Writer, tmpDir string, rows map[string]*Rows) error {
	tmp, err := os.CreateTemp(tmpDir, "sparkmargin-audit-*.xlsx")
	if err != nil {
		return err
	}
	defer func() {
		_ = tmp.Close()
		_ = os.Remove(tmp.Name())
	}()
	n, err := f.WriteTo(tmp)
	if err != nil {
		return err
	}
	return CanonicalZipRows(tmp, n, w, rows)
}
