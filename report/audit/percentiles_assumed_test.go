package audit

import (
	"bytes"
	"encoding/json"
	"testing"
)

// Review item 5, --samples: an object whose energy rests on an assumed
// resistance to earth (the demo has such objects: an unmeasured resistance
// taken as no leakage, reference section 12) gets no energy percentiles: the
// spread would be the spread of the assumption. The JSON leaves them out
// (the ratio_assumed_resistance flag says why); the Objects sheet says
// "withheld: assumed R"; an object resting on readings keeps its percentiles.
func TestPercentilesWithheldForAssumedResistance(t *testing.T) {
	a := demoAudit(t, 200)
	assumed, plain := "", ""
	for i := range a.Objects {
		o := &a.Objects[i]
		if o.Probability == nil || !sampled(o) {
			continue
		}
		if o.RatioAssumed() && assumed == "" {
			assumed = o.Object.ID
		}
		if !o.RatioAssumed() && plain == "" && o.Probability.EnergyP95 > 0 {
			plain = o.Object.ID
		}
	}
	if assumed == "" || plain == "" {
		t.Fatalf("the demo has no sampled object on an assumed resistance (%q) or on readings (%q)", assumed, plain)
	}
	var js bytes.Buffer
	if err := WriteJSON(&js, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	var d struct {
		Objects []map[string]json.RawMessage `json:"objects"`
	}
	if err := json.Unmarshal(js.Bytes(), &d); err != nil {
		t.Fatal(err)
	}
	for _, o := range d.Objects {
		var id string
		json.Unmarshal(o["id"], &id)
		_, has := o["energy_J_p95"]
		switch id {
		case assumed:
			if has || string(o["ratio_assumed_resistance"]) != "true" {
				t.Errorf("%s: energy_J_p95 given (%v) or no ratio_assumed_resistance flag", id, has)
			}
		case plain:
			if !has {
				t.Errorf("%s: its percentiles were dropped", id)
			}
		}
	}
	var wb bytes.Buffer
	if err := WriteWorkbook(&wb, a, testInfo()); err != nil {
		t.Fatal(err)
	}
	f := openWorkbook(t, wb.Bytes())
	rows := rowsOf(t, f, SheetObjects)
	idc, p95 := colIndex(t, rows[0], "Object"), colIndex(t, rows[0], "Energy P95 [mJ]")
	for _, r := range rows[1:] {
		if len(r) <= p95 {
			continue
		}
		if r[idc] == assumed && r[p95] != PercentilesWithheldText {
			t.Errorf("%s: P95 cell %q, want %q", assumed, r[p95], PercentilesWithheldText)
		}
		if r[idc] == plain && r[p95] == PercentilesWithheldText {
			t.Errorf("%s: P95 withheld though it rests on readings", plain)
		}
	}
}
