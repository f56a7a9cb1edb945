package audit

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"github.com/sparkmargin/sparkmargin/model"
)

func testInfo() RunInfo {
	return RunInfo{ToolVersion: "0.0.0-test", SurveyFile: "demo-plant.xlsx", CommandLine: "sparkmargin assess demo-plant.xlsx"}
}

func TestWriteJSONGolden(t *testing.T) {
	var b bytes.Buffer
	if err := WriteJSON(&b, testAudit(), testInfo()); err != nil {
		t.Fatal(err)
	}
	golden(t, "audit.golden.json", b.Bytes())

	var again bytes.Buffer
	if err := WriteJSON(&again, testAudit(), testInfo()); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(b.Bytes(), again.Bytes()) {
		t.Error("two writes of the same audit differ")
	}
}

func TestWriteJSONNulls(t *testing.T) {
	var b bytes.Buffer
	if err := WriteJSON(&b, testAudit(), testInfo()); err != nil {
		t.Fatal(err)
	}
	if s := b.String(); strings.Contains(s, "NaN") || strings.Contains(s, "Inf") {
		t.Fatal("JSON holds NaN or Inf")
	}
	var doc struct {
		Stations []map[string]any `json:"stations"`
		Objects  []map[string]any `json:"objects"`
		Rejected []map[string]any `json:"rejected"`
		Warnings []map[string]any `json:"warnings"`
		Cautions []string         `json:"cautions"`
		Counts   struct {
			Rows []struct{ Read, Accepted, Rejected int } `json:"rows"`
		} `json:"counts"`
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	obj := map[string]map[string]any{}
	for _, o := range doc.Objects {
		obj[o["id"].(string)] = o
	}
	if len(obj) != 9 {
		t.Fatalf("objects = %d, want every accepted object (9)", len(obj))
	}
	// Keys present and null where the kind has no such quantity.
	nulls := []struct{ id, key string }{
		{"O7", "ratio"},         // no atmosphere
		{"O9", "ratio"},         // no atmosphere
		{"O9", "energy_J"},      // not assessed
		{"O1", "capacitance_F"}, // a sheet has no capacitance
		{"O3", "charge_density_C_per_m2"},
		{"O8", "potential_V"},
	}
	for _, n := range nulls {
		v, ok := obj[n.id][n.key]
		if !ok || v != nil {
			t.Errorf("%s.%s = %v (present %v), want null", n.id, n.key, v, ok)
		}
	}
	// SI values: 200 pF typical body (Saito 1963); 10 mJ derived 200 pF x (10 kV)^2 / 2.
	checks := []struct {
		id, key string
		want    float64
	}{
		{"O3", "capacitance_F", 200e-12},
		{"O3", "energy_J", 10e-3},
		{"O3", "ratio", 10e-3 / 0.24e-3}, // derived: 10 mJ over toluene 0.24 mJ (from memory)
		{"O5", "potential_V", 47.6e3},    // Source: electrostatics.md §10 case 6, derived
		{"O4", "ratio", 0},               // a defined zero stays 0
	}
	for _, c := range checks {
		got, ok := obj[c.id][c.key].(float64)
		if !ok || !scalar.EqualWithinAbsOrRel(got, c.want, 1e-15, 1e-12) {
			t.Errorf("%s.%s = %v, want %v", c.id, c.key, obj[c.id][c.key], c.want)
		}
	}
	if p, ok := obj["O1"]["probability"].(map[string]any); !ok || p["incendive"] != 0.93 {
		t.Errorf("O1 probability = %v, want incendive 0.93", obj["O1"]["probability"])
	}
	if _, ok := obj["O3"]["probability"]; ok {
		t.Error("O3 has no Monte Carlo result: probability must be absent")
	}
	if doc.Stations[2]["worst_ratio"] != nil {
		t.Errorf("S3 worst_ratio = %v, want null", doc.Stations[2]["worst_ratio"])
	}
	if len(doc.Rejected) != 2 || len(doc.Warnings) != 1 {
		t.Errorf("rejected %d, warnings %d; want 2 and 1", len(doc.Rejected), len(doc.Warnings))
	}
	for _, r := range doc.Counts.Rows {
		if r.Read != r.Accepted+r.Rejected {
			t.Errorf("rows %+v: accepted + rejected != read", r)
		}
	}
	if len(doc.Cautions) == 0 {
		t.Error("no cautions")
	}
	ds, _ := obj["O2"]["discharges"].([]any)
	if len(ds) != 5 || ds[0].(map[string]any)["type"] != "spark" || ds[2].(map[string]any)["type"] != "propagating_brush" {
		t.Errorf("discharges = %v, want the five types in contract order", ds)
	}
}

// TestEnergyAtLeastMIE: a spark energy set by an unknown resistance (no leakage
// assumed) that reaches the MIE is shown as "at least the MIE (assumed resistance
// dominates)" beside the number in the JSON and instead of it on the Objects sheet,
// not as the estimate (issue 11: no kilojoule sparks nobody would sign).
func TestEnergyAtLeastMIE(t *testing.T) {
	a := testAudit()
	o := a.Objects[4] // O5: the drum sparking 113 mJ against 10 mJ (ratio 11.3)
	o.Eval.Flags |= model.FlagAssumedResistance
	jo := objectJSON(&o)
	if jo.EnergyNote != EnergyAtLeastMIE {
		t.Errorf("energy_note %q, want %q", jo.EnergyNote, EnergyAtLeastMIE)
	}
	o.Eval.Flags &^= model.FlagAssumedResistance
	if jo := objectJSON(&o); jo.EnergyNote != "" {
		t.Errorf("measured resistance: energy_note %q, want none", jo.EnergyNote)
	}
}

// TestWriteJSONSources: the JSON carries the References list and the limits
// to verify: the IEC 60079-0 transferred charge for IIB (25 nC, from memory)
// is listed with the value applied, the TRGS 727 shock energy (confirmed,
// Annex D) is not; every source cites a listed reference by its key.
func TestWriteJSONSources(t *testing.T) {
	var b bytes.Buffer
	if err := WriteJSON(&b, testAudit(), testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		References []struct{ Key, Edition string } `json:"references"`
		Verify     []struct {
			What    string   `json:"what"`
			Limit   string   `json:"limit"`
			ValueSI *float64 `json:"value_si"`
			Source  string   `json:"source"`
		} `json:"verify"`
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	keys := map[string]string{}
	for _, r := range doc.References {
		keys[r.Key] = r.Edition
	}
	if keys["TRGS 727"] != "2016" || keys["IEC 60079-0"] != "2017" {
		t.Errorf("references %v: want TRGS 727:2016 and IEC 60079-0:2017", keys)
	}
	got := map[string]float64{}
	for _, v := range doc.Verify {
		if v.ValueSI != nil {
			got[v.Limit] = *v.ValueSI
		}
		if v.What != "limit" {
			continue // a built-in material or substance, from memory: its source says so
		}
		r, ok := model.ReferenceOf(v.Source)
		if _, listed := keys[r.Key]; !ok || !listed {
			t.Errorf("verify %s: source %q cites no listed reference", v.Limit, v.Source)
		}
	}
	if !scalar.EqualWithinRel(got["TransferredCharge[IIB]"], 25e-9, 1e-12) { // Source: IEC 60079-0 7.4.2, 25 nC for IIB (from memory)
		t.Errorf("verify list: TransferredCharge[IIB] = %g, want 25 nC", got["TransferredCharge[IIB]"])
	}
	if _, ok := got["ShockEnergy"]; ok {
		t.Error("the confirmed shock energy (TRGS 727 Annex D) is in the verify list")
	}
}
