package assess

import (
	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// GroupText is the gas or dust group an atmosphere is assessed with, as every
// sheet shows it: the group entered; with "lib." when it came from the built-in
// substance list ("IIA lib."); the strictest gas group when a gas, vapour, mist
// or hybrid atmosphere gives none ("IIC est.", principle 2); and both for a
// hybrid that gives only its dust group ("IIIB / gas IIC est."), since the
// brush, charge and area screens use the gas group. "" without an atmosphere.
func GroupText(a *inventory.Atmosphere) string {
	if a == nil {
		return ""
	}
	kind, err := model.ParseAtmosphereKind(a.Kind)
	if err != nil || kind == model.NoAtmosphere {
		return a.Group
	}
	env := model.Environment{Atmosphere: kind}
	env.Group, _ = model.ParseGroup(a.Group)
	if e, assumed := env.WithStrictGroup(); assumed {
		if a.Group != "" {
			return a.Group + " / gas " + e.Group.String() + " est."
		}
		return e.Group.String() + " est."
	}
	if a.GroupFromSubstance && a.Group != "" {
		return a.Group + " lib."
	}
	return a.Group
}
