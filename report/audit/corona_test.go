package audit

import (
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/templates"
)

// TestCoronaNoteFollowsTheRule: the Method sheet's corona note says what the
// model does (model.CoronaIgnites: judged on corona when the MIE is below the
// corona energy, whatever the group), so it names no gas group as exempt when a
// built-in substance of that group has an MIE below the corona energy (ethylene,
// IIB, 0.07 mJ; Source: published MIE tables as the library cites them).
func TestCoronaNoteFollowsTheRule(t *testing.T) {
	lim := model.DefaultLimits()
	var note string
	for _, n := range templates.MethodNotes() {
		if n.Quantity == "Corona" {
			note = n.Formula
		}
	}
	if note == "" {
		t.Fatal("no Corona note on the Method sheet")
	}
	groups := map[string]model.Group{"IIA": model.IIA, "IIB": model.IIB}
	for _, s := range inventory.BuiltinSubstances() {
		g, ok := groups[s.Group]
		if !ok || !(s.MIE < lim.CoronaEnergy) {
			continue
		}
		env := model.Environment{Atmosphere: model.Gas, Group: g, MIE: s.MIE}
		if !model.CoronaIgnites(env, lim) {
			t.Errorf("%s (%s, MIE %g J): not judged on corona though below the corona energy", s.Name, s.Group, s.MIE)
		}
		if strings.Contains(note, s.Group+" atmospheres") || strings.Contains(note, "IIA and IIB atmospheres") {
			t.Errorf("the corona note exempts %s by group, yet %s (MIE %g mJ) is judged on corona:\n%s", s.Group, s.Name, s.MIE*1e3, note)
		}
		if !strings.Contains(note, s.Name) {
			t.Errorf("the corona note does not name %s, a %s gas judged on corona", s.Name, s.Group)
		}
	}
}
