package audit

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// The fixture sampled 1000 draws with seed 7: the Method sheet lists the
// uncertainty table and the draws, the JSON records the options.
func TestMethodUncertaintyAndJSONOptions(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	flat := ""
	for _, r := range rowsOf(t, f, SheetMethod) {
		flat += strings.Join(r, "|") + "\n"
	}
	for _, want := range []string{
		"Uncertainty (Monte Carlo)",
		// The default table's documented choices (report/assess DefaultUncertainties;
		// screening choices of this tool, the person's band from memory, Saito 1963);
		// the 95 % bands are derived (z = 1.96).
		"Field reading|±10 %|normal (relative)|Uncertainty field [%]",
		"Resistance to earth|±0.5 decade|log-normal|Uncertainty resistance [decades]",
		"MIE, dust or hybrid|×/÷ 2 (95 % band ×/÷ 3.89)|log-normal|Uncertainty MIE dust [factor]", // derived: 2^1.96
		// Review item 10: the vessel's ×/÷ 3 as a 95 % band (reference section 12), the
		// person's own 100-300 pF band (reference section 2, Saito 1963).
		"Capacitance, estimated|×/÷ 1.75 (95 % band ×/÷ 3)|log-normal|Uncertainty estimated capacitance [factor]",            // derived: 3^(1/1.96)
		"Capacitance of a person, estimated|×/÷ 1.23 (95 % band ×/÷ 1.5)|log-normal|Uncertainty person capacitance [factor]", // derived: 1.5^(1/1.96)
		"Draws|1000 per object, seed 7",
	} {
		if !strings.Contains(flat, want) {
			t.Errorf("Method lacks %q", want)
		}
	}
	var b bytes.Buffer
	if err := WriteJSON(&b, testAudit(), testInfo()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Options *struct {
			Samples       int    `json:"samples"`
			Seed          uint64 `json:"seed"`
			Uncertainties []struct {
				Input string `json:"input"`
				Text  string `json:"text"`
			} `json:"uncertainties"`
		} `json:"options"`
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Options == nil || doc.Options.Samples != 1000 || doc.Options.Seed != 7 || len(doc.Options.Uncertainties) == 0 {
		t.Fatalf("options %+v, want 1000 samples, seed 7 and the table", doc.Options)
	}
}
