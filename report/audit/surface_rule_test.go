package audit

import (
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// Review N7: the Objects sheet's surface column agrees with the spark rule.
// DRX-PAP at 1.6e11 Ω/sq (survey row, invented for the review) is below the
// spark bound (1e12 Ω/sq; Source: IEC TS 60079-32-1, dissipative range, as the reference
// file gives it) but above the area-exemption bound (1e9 Ω/sq): the
// column must not read "not dissipative" beside "unearthed conducting
// surface: yes"; it says the spark rule counts it as a conductor.
func TestSurfaceColumnAgreesWithSparkRule(t *testing.T) {
	in := model.NewInput(model.Sheet)
	in.Length, in.Width = 1, 1
	in.Material.SurfaceResistivity = 1.6e11
	ev := model.Evaluate(in, model.Environment{RelativeHumidity: 50, MIE: 1e-3}, model.DefaultLimits())
	if !ev.ConductingSurface || ev.Dissipative {
		t.Fatalf("1.6e11 Ω/sq: conducting %v, dissipative %v; want a conductor for the spark rule that does not leak", ev.ConductingSurface, ev.Dissipative)
	}
	if got := surfaceRuleText(&in, &ev); !strings.Contains(got, "a conductor for the spark rule") {
		t.Errorf("column %q, want it to say the spark rule counts it a conductor", got)
	}
	in.Material.SurfaceResistivity = 1e14
	ev = model.Evaluate(in, model.Environment{RelativeHumidity: 50, MIE: 1e-3}, model.DefaultLimits())
	if got := surfaceRuleText(&in, &ev); ev.ConductingSurface || !strings.HasPrefix(got, "insulating") {
		t.Errorf("1e14 Ω/sq: conducting %v, column %q; want insulating", ev.ConductingSurface, got)
	}
}
