package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// writeDemoTypo writes the demo survey with the first Objects row that gives
// a material spelt "Steal" (a typing error, invented for the demo): that row
// is rejected, as assess rejects it. It returns the path and the object's ID.
func writeDemoTypo(t *testing.T, path string) string {
	t.Helper()
	sh := inventory.DemoSurvey().Clone()
	objs := sh.Sheet(inventory.SheetObjects)
	mat, id := -1, -1
	for i, h := range objs.Rows[0] {
		s, _ := h.(string)
		switch {
		case strings.HasPrefix(s, "Material"):
			mat = i
		case s == "ID" || strings.HasPrefix(s, "ID "):
			id = i
		}
	}
	if mat < 0 || id < 0 {
		t.Fatalf("no Material or ID column in %v", objs.Rows[0])
	}
	var typo string
	for _, r := range objs.Rows[1:] {
		if m, _ := r[mat].(string); m != "" {
			r[mat] = "Steal"
			typo, _ = r[id].(string)
			break
		}
	}
	var buf bytes.Buffer
	if err := inventory.WriteSurvey(&buf, sh); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return typo
}

// Review items 2 and 15: a rejected Objects row makes whatif, sweep and
// compare exit 1 as assess does, after writing their outputs; compare lists
// it as rejected, never removed; whatif and sweep JSON name the tool and
// the workbook written with them (its SHA-256).
func TestRerunsExitOnRejectedRow(t *testing.T) {
	dir := t.TempDir()
	good := writeDemo(t, dir)
	typo := filepath.Join(dir, "typo.xlsx")
	id := writeDemoTypo(t, typo)
	if code, _, errOut := runCLI(t, "assess", typo, "-o", filepath.Join(dir, "a.xlsx")); code != exitProblems {
		t.Fatalf("assess of the typo survey: exit %d (%s), want %d: the reruns follow its rule", code, errOut, exitProblems)
	}
	wx, wj := filepath.Join(dir, "w.xlsx"), filepath.Join(dir, "w.json")
	code, out, errOut := runCLI(t, "whatif", typo, "--rh", "55", "-o", wx, "--json", wj)
	if code != exitProblems || !strings.Contains(errOut, "rejected") || !strings.Contains(out, "incomplete: 1 object row rejected") {
		t.Errorf("whatif: exit %d, stderr %q, out:\n%s", code, errOut, out)
	}
	var d struct {
		Tool     struct{ Name, Version string } `json:"tool"`
		Workbook *struct {
			File   string `json:"file"`
			SHA256 string `json:"sha256"`
		} `json:"workbook"`
	}
	data, _ := os.ReadFile(wj)
	book, _ := os.ReadFile(wx)
	if err := json.Unmarshal(data, &d); err != nil {
		t.Fatal(err)
	}
	if d.Tool.Name != "sparkmargin" || d.Workbook == nil || d.Workbook.File != "w.xlsx" || d.Workbook.SHA256 != sha256Hex(book) {
		t.Errorf("whatif JSON tool %+v workbook %+v (workbook SHA-256 %s)", d.Tool, d.Workbook, sha256Hex(book))
	}
	sx, sj := filepath.Join(dir, "s.xlsx"), filepath.Join(dir, "s.json")
	if code, _, errOut := runCLI(t, "sweep", typo, "--rh", "30:70:40", "-o", sx, "--json", sj); code != exitProblems {
		t.Errorf("sweep: exit %d (%s), want %d", code, errOut, exitProblems)
	}
	data, _ = os.ReadFile(sj)
	book, _ = os.ReadFile(sx)
	d.Workbook = nil
	if err := json.Unmarshal(data, &d); err != nil || d.Workbook == nil || d.Workbook.SHA256 != sha256Hex(book) || d.Tool.Name != "sparkmargin" {
		t.Errorf("sweep JSON tool %+v workbook %+v (%v)", d.Tool, d.Workbook, err)
	}
	cj := filepath.Join(dir, "c.json")
	code, out, errOut = runCLI(t, "compare", good, typo, "--json", cj)
	if code != exitProblems || !strings.Contains(out, "Removed (0): none") || !strings.Contains(out, "Rejected in NEW (1") || !strings.Contains(out, id) {
		t.Errorf("compare: exit %d, stderr %q, out:\n%s", code, errOut, out)
	}
}

func sha256Hex(b []byte) string {
	s := sha256.Sum256(b)
	return hex.EncodeToString(s[:])
}
