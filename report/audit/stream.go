package audit

import (
	"archive/zip"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/xuri/excelize/v2"
)

// WorkbookWriter writes an audit workbook while the survey is assessed: each
// object's row goes to the Objects sheet's StreamWriter as soon as it is
// assessed, so the workbook never holds the objects; the other sheets are
// written by Finish from the audit's aggregates (assess.Streamer). The cells
// are those WriteWorkbook writes for the same audit (the part order and
// therefore the style numbering may differ, not the cells nor their formats).
//
// Every temporary file (excelize's stream spill files and the package before
// it is put in canonical order) goes into a private folder made in tmpDir
// ("" for the system's) and removed by Close.
type WorkbookWriter struct {
	wb      *workbook
	tmp     string
	sampled bool
	objects *tableStream[objRow]
	cols    []book.Column[objRow]
	n       int
	// materials used by the objects, for the Method sheet, first use first.
	materials []assess.ObjectResult
	matSeen   map[string]bool
	prob      *assess.Probability
	closed    bool
}

// NewWorkbookWriter starts the audit workbook of survey s (Site, Stations,
// Atmospheres known; Problems may still grow). sampled says whether the
// assessment runs a Monte Carlo (the Objects sheet's probability columns).
func NewWorkbookWriter(s *inventory.Survey, info RunInfo, sampled bool, tmpDir string) (*WorkbookWriter, error) {
	if s == nil {
		return nil, errors.New("write workbook: no survey")
	}
	tmp, err := os.MkdirTemp(tmpDir, "sparkmargin-write-")
	if err != nil {
		return nil, fmt.Errorf("write workbook: temporary folder: %w", err)
	}
	f := excelize.NewFile(excelize.Options{TmpDir: tmp})
	w := &WorkbookWriter{tmp: tmp, sampled: sampled, matSeen: map[string]bool{}}
	w.wb = &workbook{f: f, st: book.NewStyles(f), a: &assess.Audit{Survey: s}, info: info, direct: true, rowsDir: tmp}
	if err := f.SetSheetName("Sheet1", Sheets()[0]); err != nil {
		w.Close()
		return nil, fmt.Errorf("write workbook: %w", err)
	}
	for _, sh := range Sheets()[1:] {
		if _, err := f.NewSheet(sh); err != nil {
			w.Close()
			return nil, fmt.Errorf("write workbook: sheet %s: %w", sh, err)
		}
	}
	return w, nil
}

// open starts the Objects sheet; its autofilter range is set again by Finish.
func (w *WorkbookWriter) open(withProbability bool, first []assess.ObjectResult) error {
	w.cols = objectColumns(withProbability)
	fitObjectIDs(w.cols, first)
	pagesWide := (len(w.cols) + 13) / 14
	ts, err := openTableStream(w.wb, SheetObjects, w.cols, 1, pagesWide, "$A:$A", 1)
	if err != nil {
		return fmt.Errorf("write workbook: sheet %s: %w", SheetObjects, err)
	}
	w.objects = ts
	return nil
}

// Add writes the rows of a batch of assessed objects, in survey order.
func (w *WorkbookWriter) Add(rs []assess.ObjectResult) error {
	for i := range rs {
		r := &rs[i]
		if w.objects == nil {
			if err := w.open(w.sampled, rs); err != nil {
				return err
			}
		}
		if err := w.objects.Row(r); err != nil {
			return fmt.Errorf("write workbook: sheet %s: %w", SheetObjects, err)
		}
		w.n++
		w.wb.findingRatios = objectRatios(rs[i:i+1], w.wb.findingRatios)
		if m := r.Material; m != nil && !w.matSeen[strings.ToLower(m.Name)] {
			w.matSeen[strings.ToLower(m.Name)] = true
			mm := *m
			w.materials = append(w.materials, assess.ObjectResult{Material: &mm})
		}
		if r.Probability != nil && w.prob == nil {
			p := *r.Probability
			w.prob = &p
		}
	}
	return nil
}

// Finish writes the other sheets from the audit (assess.Streamer.Finish, its
// Survey the completed survey) and the whole workbook to out, in the same
// canonical part order as WriteWorkbook.
func (w *WorkbookWriter) Finish(a *assess.Audit, out io.Writer) error {
	if a == nil || a.Survey == nil {
		return errors.New("write workbook: no audit or no survey")
	}
	wb, f := w.wb, w.wb.f
	// The sheets written from the aggregates see, in place of every object,
	// one per material used (the Method sheet lists them) carrying a
	// probability when the assessment sampled (the Stations sheet's column).
	stand := *a
	stand.Objects = append([]assess.ObjectResult(nil), w.materials...)
	if w.prob != nil {
		if len(stand.Objects) == 0 {
			stand.Objects = append(stand.Objects, assess.ObjectResult{})
		}
		for i := range stand.Objects {
			stand.Objects[i].Probability = w.prob
		}
	}
	wb.a = &stand
	if w.objects == nil {
		if err := w.open(false, nil); err != nil {
			return err
		}
	}
	if err := f.AutoFilter(SheetObjects, fmt.Sprintf("A1:%s%d", book.LastCol(len(w.cols)), w.n+1), nil); err != nil {
		return fmt.Errorf("write workbook: sheet %s: %w", SheetObjects, err)
	}
	if err := w.objects.sw.Flush(); err != nil {
		return fmt.Errorf("write workbook: sheet %s: %w", SheetObjects, err)
	}
	if err := wb.writeSheets(false); err != nil {
		return err
	}
	if wb.st.Err() != nil {
		return fmt.Errorf("write workbook: %w", wb.st.Err())
	}
	// No SetActiveSheet: the Report (the new file's first sheet, renamed) is
	// already the active one, and SetActiveSheet would load every sheet,
	// the whole streamed Objects sheet among them, back into memory.
	info := wb.info
	if err := setDocProps(f, a, info); err != nil {
		return err
	}
	tmp, err := os.CreateTemp(w.tmp, "audit-*.xlsx")
	if err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	defer tmp.Close()
	// The package goes straight into the temporary file: File.WriteTo would
	// build the whole zip in memory first (hundreds of MB for a full sheet).
	// (excelize's zip64 header fix-up works on that in-memory copy only; the
	// canonical copy below writes its own headers, as for WriteWorkbook.)
	f.SetZipWriter(func(io.Writer) excelize.ZipWriter { return zip.NewWriter(tmp) })
	if _, err := f.WriteTo(io.Discard); err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	n, err := tmp.Seek(0, io.SeekEnd)
	if err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	rows, err := wb.finishRows()
	if err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	if err := book.CanonicalZipRows(tmp, n, out, rows); err != nil {
		return fmt.Errorf("write workbook: %w", err)
	}
	return nil
}

// Close removes the temporary files; it may be called more than once.
func (w *WorkbookWriter) Close() error {
	if w.closed {
		return nil
	}
	w.closed = true
	w.wb.closeRows()
	err := w.wb.f.Close()
	if rerr := os.RemoveAll(w.tmp); err == nil {
		err = rerr
	}
	return err
}

// JSONWriter writes the audit JSON while the survey is assessed: each
// object is appended as it comes (appendObjectJSON, no reflection) into a
// temporary file, and Finish writes the document around them. The bytes are
// those WriteJSON writes for the same audit.
type JSONWriter struct {
	tmp  *os.File
	out  jsonOut
	n    int
	done bool
	used map[string]bool // built-in materials used by the objects (the verify list)
}

// NewJSONWriter starts an audit JSON; its temporary file is made in tmpDir
// ("" for the system's) and removed by Close.
func NewJSONWriter(tmpDir string) (*JSONWriter, error) {
	f, err := os.CreateTemp(tmpDir, "sparkmargin-objects-*.json")
	if err != nil {
		return nil, fmt.Errorf("write JSON: %w", err)
	}
	// the objects array's elements sit two levels deep
	return &JSONWriter{tmp: f, out: jsonOut{prefix: "    "}}, nil
}

// Add appends a batch of assessed objects, in survey order.
func (j *JSONWriter) Add(rs []assess.ObjectResult) error {
	o := &j.out
	o.b = o.b[:0]
	for i := range rs {
		if j.n > 0 {
			o.b = append(o.b, ",\n    "...)
		} else {
			o.b = append(o.b, "\n    "...)
		}
		if m := rs[i].Material; m != nil {
			if j.used == nil {
				j.used = map[string]bool{}
			}
			j.used[m.Name] = true
		}
		o.depth, o.first = 0, true
		appendObjectJSON(o, &rs[i])
		j.n++
	}
	if _, err := j.tmp.Write(o.b); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	return nil
}

// Finish writes the whole document of a (assess.Streamer.Finish) to out.
func (j *JSONWriter) Finish(a *assess.Audit, info RunInfo, out io.Writer) error {
	if a == nil || a.Survey == nil {
		return errors.New("write JSON: no audit or no survey")
	}
	var doc bytes.Buffer
	enc := json.NewEncoder(&doc)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(jsonDoc(a, info, j.used)); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	const mark = "\n  \"objects\": [],\n"
	b := doc.Bytes()
	at := bytes.Index(b, []byte(mark))
	if at < 0 {
		return errors.New("write JSON: no objects key in the document")
	}
	if _, err := out.Write(b[:at+len("\n  \"objects\": [")]); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	if j.n > 0 {
		if _, err := j.tmp.Seek(0, io.SeekStart); err != nil {
			return fmt.Errorf("write JSON: %w", err)
		}
		if _, err := io.Copy(out, j.tmp); err != nil {
			return fmt.Errorf("write JSON: %w", err)
		}
		if _, err := io.WriteString(out, "\n  "); err != nil {
			return fmt.Errorf("write JSON: %w", err)
		}
	}
	if _, err := out.Write(b[at+len("\n  \"objects\": ["):]); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	return nil
}

// Close removes the temporary file; it may be called more than once.
func (j *JSONWriter) Close() error {
	if j.done {
		return nil
	}
	j.done = true
	_ = j.tmp.Close()
	return os.Remove(j.tmp.Name())
}
