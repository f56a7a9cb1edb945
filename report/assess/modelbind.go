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

// assumptionItem is the typed item a model assumption stands for: the
// charging current and the group have their own, the rest are ItemModel.
func assumptionItem(a model.Assumption) Item {
	switch a {
	case model.AssumedWalkingCurrent, model.AssumedMaxCurrent, model.AssumedBagCurrent:
		return ItemChargingCurrent
	case model.AssumedGroupIIC:
		return ItemGroup
	case model.AssumedLiquidPermittivity:
		return ItemPermittivity
	}
	return ItemModel
}

// assumptionField names the quantity each model assumption stands for.
func assumptionField(a model.Assumption) string {
	switch a {
	case model.AssumedSteadyState:
		return "Charging time"
	case model.AssumedWalkingCurrent, model.AssumedMaxCurrent, model.AssumedBagCurrent:
		return "Charging current"
	case model.AssumedNoCoronaCap:
		return "Corona-onset cap"
	case model.AssumedLayerPermittivity, model.AssumedPlatePermittivity:
		return "Relative permittivity"
	case model.AssumedLiquidPermittivity:
		return "Liquid permittivity"
	case model.AssumedInfiniteSheet:
		return "Sheet size"
	case model.AssumedDissipativeClass:
		return "Surface resistivity"
	case model.AssumedBreakdownUnknown:
		return "Breakdown strength"
	case model.AssumedPropagatingArea:
		return "Propagating brush area"
	case model.AssumedThinLayer:
		return "Layer thickness"
	case model.AssumedHighResistivity:
		return "Volume resistivity"
	case model.AssumedConeCharge:
		return "Charge-to-mass"
	case model.AssumedProductMIE, model.AssumedProductMIEUnknown:
		return "Product MIE"
	case model.AssumedGroupIIC:
		return "Group"
	case model.AssumedVesselSize:
		return "Vessel size"
	}
	return "Model assumption"
}

// modelAssumptions turns the model's own assumption bits into defaults. The bits
// the assessment records itself with their values (capacitance estimate, unknown
// resistance, bag type, conductivity, temperature) are skipped so each shows once,
// and so are the charging assumptions of a conductor whose potential was measured
// (they fed nothing).
func modelAssumptions(ev *model.Evaluation) []Mark {
	rest := ev.Assumed &^ (model.AssumedCapacitance | model.AssumedNotEarthed | model.AssumedBagTypeA |
		model.AssumedLowConductivity | model.AssumedTemperature)
	if ev.PotentialSource == model.PotentialMeasured {
		rest &^= model.AssumedWalkingCurrent | model.AssumedMaxCurrent | model.AssumedSteadyState
	}
	var out []Mark
	for bit := model.Assumption(1); bit != 0 && bit <= rest; bit <<= 1 {
		if rest&bit == 0 {
			continue
		}
		texts := bit.Texts()
		if len(texts) == 0 {
			continue
		}
		value := texts[0]
		if _, after, ok := strings.Cut(value, ": "); ok {
			value = after
		}
		out = append(out, Mark{Item: assumptionItem(bit), Prov: ProvEstimated, Label: assumptionField(bit), Value: value, Reason: "model default: " + texts[0]})
	}
	return out
}
