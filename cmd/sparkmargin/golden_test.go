package main

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite testdata/demo/demo-audit.golden.json from the current output")

// TestDemoGolden runs the demo end to end and compares its JSON with the golden file,
// numbers within a relative tolerance, everything else exactly. The golden is a
// regression guard: the physics behind its numbers is checked against outside
// values in model's and assess's tests (hand-worked cases with their sources).
func TestDemoGolden(t *testing.T) {
	dir := t.TempDir()
	if code, out, errOut := runCLI(t, "demo", "-o", dir); code != exitOK {
		t.Fatalf("demo: exit %d\n%s%s", code, out, errOut)
	}
	got, err := os.ReadFile(filepath.Join(dir, "demo-survey-audit.json"))
	if err != nil {
		t.Fatal(err)
	}
	// The JSON records its workbook: the file written beside it, by name and SHA-256.
	var rec struct {
		Workbook struct{ File, SHA256 string } `json:"workbook"`
	}
	if err := json.Unmarshal(got, &rec); err != nil {
		t.Fatal(err)
	}
	if wb, err := os.ReadFile(filepath.Join(dir, "demo-survey-audit.xlsx")); err != nil {
		t.Fatal(err)
	} else if sum := sha256.Sum256(wb); rec.Workbook.File != "demo-survey-audit.xlsx" || rec.Workbook.SHA256 != hex.EncodeToString(sum[:]) {
		t.Errorf("the JSON records the workbook %+v, want demo-survey-audit.xlsx with SHA-256 %x", rec.Workbook, sum)
	}
	golden := filepath.Join("..", "..", "testdata", "demo", "demo-audit.golden.json")
	if *update {
		if err := os.WriteFile(golden, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/sparkmargin -run TestDemoGolden -update)", err)
	}
	var g, w any
	if err := json.Unmarshal(got, &g); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(want, &w); err != nil {
		t.Fatal(err)
	}
	var diffs []string
	compareJSON("$", w, g, &diffs)
	if len(diffs) > 0 {
		sort.Strings(diffs)
		if len(diffs) > 20 {
			diffs = append(diffs[:20], fmt.Sprintf("... and %d more", len(diffs)-20))
		}
		t.Errorf("demo audit JSON differs from the golden:\n%s", strings.Join(diffs, "\n"))
	}
}

// compareJSON walks two decoded JSON values; numbers compare within relative 1e-9.
func compareJSON(path string, want, got any, diffs *[]string) {
	const rel = 1e-9
	switch w := want.(type) {
	case map[string]any:
		g, ok := got.(map[string]any)
		if !ok {
			*diffs = append(*diffs, fmt.Sprintf("%s: got %T, want object", path, got))
			return
		}
		for k, wv := range w {
			if k == "version" { // the tool version changes with every release
				continue
			}
			if path == "$.workbook" && k == "sha256" { // checked against the file in TestDemoGolden
				continue
			}
			gv, ok := g[k]
			if !ok {
				*diffs = append(*diffs, fmt.Sprintf("%s.%s: missing", path, k))
				continue
			}
			compareJSON(path+"."+k, wv, gv, diffs)
		}
		for k := range g {
			if _, ok := w[k]; !ok {
				*diffs = append(*diffs, fmt.Sprintf("%s.%s: not in the golden", path, k))
			}
		}
	case []any:
		g, ok := got.([]any)
		if !ok || len(g) != len(w) {
			*diffs = append(*diffs, fmt.Sprintf("%s: got %d elements, want %d", path, len(g), len(w)))
			return
		}
		for i := range w {
			compareJSON(fmt.Sprintf("%s[%d]", path, i), w[i], g[i], diffs)
		}
	case float64:
		g, ok := got.(float64)
		if !ok {
			*diffs = append(*diffs, fmt.Sprintf("%s: got %v, want %v", path, got, w))
			return
		}
		if d := math.Abs(g - w); d > rel*math.Max(math.Abs(w), math.Abs(g)) && d > 1e-300 {
			*diffs = append(*diffs, fmt.Sprintf("%s: got %g, want %g", path, g, w))
		}
	default:
		if fmt.Sprint(want) != fmt.Sprint(got) {
			*diffs = append(*diffs, fmt.Sprintf("%s: got %v, want %v", path, got, want))
		}
	}
}
