package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// Check values: the demo survey's data are invented for the demo; the verdicts
// expected below follow from the rules named beside each (reference sections of
// ../../shared/reference/electrostatics.md).

// keysOf returns the sorted keys of a JSON object.
func keysOf(t *testing.T, raw json.RawMessage) []string {
	t.Helper()
	var m map[string]json.RawMessage
	if err := json.Unmarshal(raw, &m); err != nil {
		t.Fatalf("not a JSON object: %s", raw)
	}
	var ks []string
	for k := range m {
		ks = append(ks, k)
	}
	sort.Strings(ks)
	return ks
}

func wantKeys(t *testing.T, what string, raw json.RawMessage, want ...string) map[string]json.RawMessage {
	t.Helper()
	sort.Strings(want)
	if got := keysOf(t, raw); !slices.Equal(got, want) {
		t.Errorf("%s keys %v, want exactly %v", what, got, want)
	}
	var m map[string]json.RawMessage
	_ = json.Unmarshal(raw, &m)
	return m
}

func firstOf(t *testing.T, raw json.RawMessage) json.RawMessage {
	t.Helper()
	var a []json.RawMessage
	if err := json.Unmarshal(raw, &a); err != nil || len(a) == 0 {
		t.Fatalf("not a non-empty JSON array: %.200s", raw)
	}
	return a[0]
}

func TestWhatifCommand(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	orig, _ := os.ReadFile(survey)
	xlsx, js := filepath.Join(dir, "whatif.xlsx"), filepath.Join(dir, "whatif.json")
	code, out, errOut := runCLI(t, "whatif", survey, "--rh", "55", "--earth", "BAG-CU=1 MΩ", "--station-rh", "ST-LAM=70", "-o", xlsx, "--json", js)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "cleared") || !strings.Contains(out, "What-if workbook") {
		t.Errorf("terminal output lacks the summary:\n%s", out)
	}
	if now, _ := os.ReadFile(survey); !bytes.Equal(now, orig) {
		t.Error("the survey file was modified")
	}
	data, err := os.ReadFile(js)
	if err != nil {
		t.Fatal(err)
	}
	top := wantKeys(t, "whatif", data, "tool", "survey", "workbook", "changes", "objects", "stations", "cautions")
	wantKeys(t, "whatif survey", top["survey"], "site", "survey_date", "file", "sha256")
	obj := wantKeys(t, "whatif object", firstOf(t, top["objects"]), "id", "station", "before", "after")
	wantKeys(t, "whatif object before", obj["before"], "verdict", "ratio", "ratio_assumed_resistance")
	wantKeys(t, "whatif object after", obj["after"], "verdict", "ratio", "ratio_assumed_resistance")
	st := wantKeys(t, "whatif station", firstOf(t, top["stations"]), "id", "before", "after")
	wantKeys(t, "whatif station before", st["before"], "rank", "verdict", "worst_ratio", "worst_ratio_assumed_resistance", "rejected_rows")
	wantKeys(t, "whatif station after", st["after"], "rank", "verdict", "worst_ratio", "worst_ratio_assumed_resistance", "rejected_rows")

	var doc struct {
		Changes []struct {
			Change  string   `json:"change"`
			SIValue *float64 `json:"si_value"`
		} `json:"changes"`
		Objects []struct {
			ID     string `json:"id"`
			Before struct{ Verdict string }
			After  struct{ Verdict string }
		} `json:"objects"`
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Changes) != 3 || doc.Changes[1].Change != "earth" || doc.Changes[1].SIValue == nil || *doc.Changes[1].SIValue != 1e6 {
		t.Errorf("changes %+v, want rh, earth (1e6 Ω from 1 MΩ), station-rh in flag order", doc.Changes)
	}
	for _, o := range doc.Objects {
		// A type C bag earthed through 1e6 ohm, within the 1e8 ohm limit of IEC 61340-4-4
		// (reference section 8b), holds no charge.
		if o.ID == "BAG-CU" && (o.Before.Verdict != "incendive" || o.After.Verdict != "non-incendive") {
			t.Errorf("BAG-CU %s → %s, want incendive → non-incendive", o.Before.Verdict, o.After.Verdict)
		}
	}
	f, err := excelize.OpenFile(xlsx)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	want := []string{"Summary", "Objects", "Stations", "Changes applied", "Method", "Cautions", "Rejected"}
	if got := f.GetSheetList(); !slices.Equal(got, want) {
		t.Errorf("sheets %v, want %v", got, want)
	}
}

// A Changes sheet in the survey is applied first, then the flags; --no-sheet-changes ignores it.
func TestWhatifChangesSheet(t *testing.T) {
	dir := t.TempDir()
	sh := inventory.DemoSurvey().Clone()
	var hdr []any
	for _, c := range inventory.SheetColumns(inventory.SheetChanges) {
		hdr = append(hdr, c.Header())
	}
	sh = append(sh, inventory.SheetRows{Name: inventory.SheetChanges, Rows: [][]any{hdr,
		{"earth", "BAG-CU", "1e6 ohm", "bond the type C bag (invented plan)"}}})
	var buf bytes.Buffer
	if err := inventory.WriteSurvey(&buf, sh); err != nil {
		t.Fatal(err)
	}
	survey := filepath.Join(dir, "planned.xlsx")
	if err := os.WriteFile(survey, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	read := func(extra ...string) []string {
		js := filepath.Join(dir, "w.json")
		args := append([]string{"whatif", survey, "-o", filepath.Join(dir, "w.xlsx"), "--json", js}, extra...)
		if code, _, errOut := runCLI(t, args...); code != 0 {
			t.Fatalf("exit %d: %s", code, errOut)
		}
		var doc struct {
			Changes []struct{ Change, Source string } `json:"changes"`
		}
		data, _ := os.ReadFile(js)
		if err := json.Unmarshal(data, &doc); err != nil {
			t.Fatal(err)
		}
		var out []string
		for _, c := range doc.Changes {
			out = append(out, c.Change+"@"+c.Source)
		}
		return out
	}
	if got := read("--rh", "60"); !slices.Equal(got, []string{"earth@Changes!2", "rh@--rh"}) {
		t.Errorf("changes %v, want the sheet's first, then the flag", got)
	}
	if got := read("--rh", "60", "--no-sheet-changes"); !slices.Equal(got, []string{"rh@--rh"}) {
		t.Errorf("with --no-sheet-changes: %v, want the flag only", got)
	}
}

func TestRerunExitCodes(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	junk := filepath.Join(dir, "junk.xlsx")
	os.WriteFile(junk, []byte("not a workbook"), 0o644)
	out := filepath.Join(dir, "o.xlsx")
	cases := []struct {
		name string
		args []string
		code int
		want string // in stderr
	}{
		{"no change", []string{"whatif", survey, "-o", out}, 2, "no change given"},
		{"unknown ID", []string{"whatif", survey, "--earth", "BAG-CUU=1e6", "-o", out}, 2, `did you mean "BAG-CU"?`},
		{"wrong unit", []string{"whatif", survey, "--earth", "BAG-CU=5 kV", "-o", out}, 2, "dimension of potential"},
		{"bad syntax", []string{"whatif", survey, "--station-rh", "60", "-o", out}, 2, "not TARGET=VALUE"},
		{"value with a space", []string{"whatif", survey, "--earth", "BAG-CU=5", "kV", "-o", out}, 2, `a change value with a space must be quoted, e.g. --earth "OBJECT-ID=5 kV"`},
		{"ambiguous unit", []string{"whatif", survey, "--earth", "BAG-CU=1M", "-o", out}, 2, "mega, with its unit left out (write MΩ), or metres (write m)"},
		{"sweep rh ambiguous", []string{"sweep", survey, "--rh", "10:90:5K"}, 2, "kilo"},
		{"overwrite survey", []string{"whatif", survey, "--rh", "50", "-o", survey}, 2, "it is the survey itself"},
		{"unreadable", []string{"whatif", junk, "--rh", "50", "-o", out}, 2, ""},
		{"sweep bad range", []string{"sweep", survey, "--rh", "90:10:5"}, 2, "FROM must not exceed TO"},
		{"sweep json over survey", []string{"sweep", survey, "--json", survey}, 2, "it is the survey itself"},
		{"compare missing", []string{"compare", survey, filepath.Join(dir, "none.json")}, 2, "none.json"},
		{"compare one arg", []string{"compare", survey}, 2, ""},
		{"sweep ok", []string{"sweep", survey, "--rh", "30:70:20"}, 0, ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			code, _, errOut := runCLI(t, c.args...)
			if code != c.code || !strings.Contains(errOut, c.want) {
				t.Errorf("exit %d, stderr %q; want exit %d and %q", code, errOut, c.code, c.want)
			}
		})
	}
}

func TestSweepCommand(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	xlsx, js := filepath.Join(dir, "sweep.xlsx"), filepath.Join(dir, "sweep.json")
	code, out, errOut := runCLI(t, "sweep", survey, "--rh", "10:90:40", "-o", xlsx, "--json", js)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "RH %") || !strings.Contains(out, "ST-") {
		t.Errorf("terminal table missing:\n%s", out)
	}
	data, _ := os.ReadFile(js)
	top := wantKeys(t, "sweep", data, "tool", "survey", "workbook", "all_stations", "held_stations", "steps", "clearances", "cautions")
	wantKeys(t, "sweep survey", top["survey"], "site", "survey_date", "file", "sha256")
	wantKeys(t, "sweep clearance", firstOf(t, top["clearances"]), "id", "clears_at_rh_pct", "cause", "missing_inputs", "readings_holding", "text")
	var steps []json.RawMessage
	json.Unmarshal(top["steps"], &steps)
	if len(steps) != 3 { // 10, 50, 90 (derived from the range)
		t.Fatalf("%d steps, want 3", len(steps))
	}
	step := wantKeys(t, "sweep step", steps[0], "rh_pct", "incendive", "marginal", "stations")
	wantKeys(t, "sweep station", firstOf(t, step["stations"]), "id", "verdict", "worst_ratio", "worst_ratio_assumed_resistance", "rejected_rows")
	f, err := excelize.OpenFile(xlsx)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if got := f.GetSheetList(); !slices.Equal(got, []string{"Sweep", "Stations", "Method", "Cautions", "Rejected"}) {
		t.Errorf("sheets %v", got)
	}
}

func TestCompareCommand(t *testing.T) {
	dir := t.TempDir()
	survey := writeDemo(t, dir)
	audit := filepath.Join(dir, "audit.json")
	if code, _, errOut := runCLI(t, "assess", survey, "-o", filepath.Join(dir, "audit.xlsx"), "--json", audit); code != 0 {
		t.Fatalf("assess: exit %d: %s", code, errOut)
	}
	for _, pair := range [][2]string{{survey, survey}, {audit, audit}, {audit, survey}} {
		js := filepath.Join(dir, "compare.json")
		code, out, errOut := runCLI(t, "compare", pair[0], pair[1], "-o", filepath.Join(dir, "compare.xlsx"), "--json", js)
		if code != 0 {
			t.Fatalf("compare %v: exit %d: %s", pair, code, errOut)
		}
		data, _ := os.ReadFile(js)
		top := wantKeys(t, "compare", data, "old", "new", "warnings", "site_changes", "station_changes", "settings_not_compared", "added", "removed", "rejected_old", "rejected_new",
			"changed", "stations", "station_counts", "different_sites", "cautions")
		// the same survey on both sides (an audit JSON is known by its survey's checksum): "same file", not "same survey date"
		if !strings.Contains(string(top["warnings"]), `"same file"`) || strings.Contains(string(top["warnings"]), `"same survey date"`) || !strings.Contains(string(top["old"]), `"survey_date": "2026-02-10"`) {
			t.Errorf("compare %v: warnings %s, old %s", pair, top["warnings"], top["old"])
		}
		for _, k := range []string{"site_changes", "station_changes", "added", "removed", "changed", "stations"} {
			if string(top[k]) != "[]" {
				t.Errorf("compare %v of the same floor and readings: %s = %s, want []", pair, k, top[k])
			}
		}
		if !strings.Contains(out, "Added (0)") {
			t.Errorf("terminal output:\n%s", out)
		}
	}
}
