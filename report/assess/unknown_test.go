package assess

import (
	"math"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// TestOneTextForUnknown: an unknown value reads "unknown" in every sentence
// the audit writes, whether worded here (findings, defaults) or by the model
// (discharge reasons); tables leave the cell blank or show "–" (report/book).
func TestOneTextForUnknown(t *testing.T) {
	nan := math.NaN()
	for name, got := range map[string]string{
		"model.Quantity": model.Quantity(nan, "J"),
		"mJ":             mJ(nan),
		"ohm":            ohm(nan),
		"uCm2":           uCm2(nan),
		"kV":             kV(nan),
	} {
		if got != "unknown" {
			t.Errorf("%s(NaN) = %q, want \"unknown\" (no unit after it)", name, got)
		}
	}
}
