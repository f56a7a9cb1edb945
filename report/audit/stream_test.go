package audit

import (
	"bytes"
	"fmt"
	"os"
	"reflect"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/xuri/excelize/v2"
)

// streamedOutputs writes an audit through WorkbookWriter and JSONWriter, the
// objects in batches of three, the other sheets from the audit without its objects.
func streamedOutputs(t *testing.T, a *assess.Audit, tmp string) (xlsx, js []byte) {
	t.Helper()
	sampled := a.Options.Samples > 0
	w, err := NewWorkbookWriter(a.Survey, testInfo(), sampled, tmp)
	if err != nil {
		t.Fatal(err)
	}
	defer w.Close()
	j, err := NewJSONWriter(tmp)
	if err != nil {
		t.Fatal(err)
	}
	defer j.Close()
	for i := 0; i < len(a.Objects); i += 3 {
		batch := a.Objects[i:min(i+3, len(a.Objects))]
		if err := w.Add(batch); err != nil {
			t.Fatal(err)
		}
		if err := j.Add(batch); err != nil {
			t.Fatal(err)
		}
	}
	agg := *a
	agg.Objects = nil
	var xb, jb bytes.Buffer
	if err := w.Finish(&agg, &xb); err != nil {
		t.Fatal(err)
	}
	if err := j.Finish(&agg, testInfo(), &jb); err != nil {
		t.Fatal(err)
	}
	return xb.Bytes(), jb.Bytes()
}

// sameCells fails when two workbooks differ in sheets, cell values, cell
// styles (number format, fill, font, alignment), autofilter or defined names.
func sameCells(t *testing.T, got, want []byte) {
	t.Helper()
	g, w := openWorkbook(t, got), openWorkbook(t, want)
	if !reflect.DeepEqual(g.GetSheetList(), w.GetSheetList()) {
		t.Fatalf("sheets %v, want %v", g.GetSheetList(), w.GetSheetList())
	}
	for _, sh := range w.GetSheetList() {
		gr, wr := rowsOf(t, g, sh), rowsOf(t, w, sh)
		if !reflect.DeepEqual(gr, wr) {
			t.Errorf("sheet %s: cells differ (%d rows, want %d)", sh, len(gr), len(wr))
			continue
		}
		for r, row := range wr {
			for c := range row {
				ref, _ := excelize.CoordinatesToCellName(c+1, r+1)
				gs, _ := g.GetCellStyle(sh, ref)
				ws, _ := w.GetCellStyle(sh, ref)
				gst, _ := g.GetStyle(gs)
				wst, _ := w.GetStyle(ws)
				if !reflect.DeepEqual(gst, wst) {
					t.Errorf("%s!%s: style differs", sh, ref)
				}
			}
		}
	}
	names := func(f *excelize.File) string {
		var s []string
		for _, d := range f.GetDefinedName() {
			s = append(s, fmt.Sprintf("%s|%s|%s", d.Name, d.Scope, d.RefersTo))
		}
		return fmt.Sprint(s)
	}
	if gn, wn := names(g), names(w); len(gn) != len(wn) {
		t.Errorf("defined names %s, want %s", gn, wn)
	}
}

func demoAudit(t *testing.T, samples int) *assess.Audit {
	t.Helper()
	b, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	s, err := inventory.Read(b, "demo-survey.xlsx", inventory.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return assess.Assess(s, assess.Options{Samples: samples})
}

// TestStreamedOutputsMatch: the streamed workbook has the cells of
// WriteWorkbook's and the streamed JSON its bytes, on the fixture and on the
// demo with and without sampling; no temporary file is left behind.
func TestStreamedOutputsMatch(t *testing.T) {
	empty := testAudit()
	empty.Objects, empty.Findings = nil, nil
	for _, c := range []struct {
		name string
		a    *assess.Audit
	}{{"fixture", testAudit()}, {"no objects", empty}, {"demo", demoAudit(t, 0)}, {"demo sampled", demoAudit(t, 100)}} {
		t.Run(c.name, func(t *testing.T) {
			tmp := t.TempDir()
			var want, wantJSON bytes.Buffer
			if err := WriteWorkbook(&want, c.a, testInfo()); err != nil {
				t.Fatal(err)
			}
			if err := WriteJSON(&wantJSON, c.a, testInfo()); err != nil {
				t.Fatal(err)
			}
			got, gotJSON := streamedOutputs(t, c.a, tmp)
			sameCells(t, got, want.Bytes())
			if g := openWorkbook(t, got); g.GetActiveSheetIndex() != 0 {
				t.Errorf("active sheet %d, want 0 (Summary)", g.GetActiveSheetIndex())
			}
			if !bytes.Equal(gotJSON, wantJSON.Bytes()) {
				t.Errorf("streamed JSON differs from WriteJSON's (%d bytes, want %d)", len(gotJSON), wantJSON.Len())
				_ = os.WriteFile("/tmp/got.json", gotJSON, 0o600)
				_ = os.WriteFile("/tmp/want.json", wantJSON.Bytes(), 0o600)
			}
			if left, _ := os.ReadDir(tmp); len(left) != 0 {
				t.Errorf("temporary files left: %v", left)
			}
		})
	}
}
