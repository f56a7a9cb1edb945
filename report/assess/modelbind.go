package assess

import (
	"strings"

	"github.com/sparkmargin/sparkmargin/model"
)

// missingText names the inputs the model lacked, from model.Missing.Texts.
func missingText(m model.Missing) string {
	t := m.Texts()
	if len(t) == 0 {
		return "inputs missing"
	}
	return strings.Join(t, "; ")
}

// modelAssumptions turns the model's own assumption bits into defaults. The bits
// the assessment records itself with their values (capacitance estimate, unknown
// resistance, bag type, conductivity, temperature) are skipped so each shows once.
func modelAssumptions(ev *model.Evaluation) []Default {
	const own = model.AssumedCapacitance | model.AssumedNotEarthed | model.AssumedBagTypeA |
		model.AssumedLowConductivity | model.AssumedTemperature
	rest := ev.Assumed &^ own
	if rest == 0 {
		return nil
	}
	var out []Default
	for _, t := range rest.Texts() {
		field, value, ok := strings.Cut(t, ":")
		if !ok {
			field, value = "Model assumption", t
		}
		out = append(out, Default{Field: capitalise(strings.TrimSpace(field)), Value: strings.TrimSpace(value), Reason: "model default (see the Method sheet)"})
	}
	return out
}
