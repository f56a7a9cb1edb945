package audit

import (
	"fmt"
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// enumText returns the text of a model enum or bit set: its String method when
// it has one, "" for the zero value, else the number (until the model names it).
// finiteOrNaN returns v, or NaN for an infinite v (a limit that does not apply shows blank).
func finiteOrNaN(v float64) float64 {
	if math.IsInf(v, 0) {
		return math.NaN()
	}
	return v
}

func enumText(v any) string {
	if t, ok := v.(interface{ Texts() []string }); ok {
		return strings.Join(t.Texts(), "; ")
	}
	if s, ok := v.(fmt.Stringer); ok {
		return s.String()
	}
	switch x := v.(type) {
	case model.CapModel:
		if x == 0 {
			return ""
		}
		return fmt.Sprintf("model %d", x)
	case model.PotentialSource:
		if x == 0 {
			return ""
		}
		return fmt.Sprintf("source %d", x)
	case model.Assumption, model.Flag, model.Missing:
		if fmt.Sprint(x) == "0" {
			return ""
		}
		return fmt.Sprintf("code %#x", x)
	}
	return fmt.Sprint(v)
}

// dischargeReason returns the one-sentence reason of a discharge screening
// result when the model provides one (Discharge.Reason), else "".
func dischargeReason(d model.Discharge) string {
	if r, ok := any(d).(interface{ Reason() string }); ok {
		return r.Reason()
	}
	return ""
}

// hasDefault reports whether one of the object's assumed defaults stands for
// the named quantity (case-insensitive, "Capacitance" matches "capacitance of the drum").
// EnergyAtLeastMIE is how the audit shows an energy set by an assumed (unknown)
// resistance to earth that reaches the MIE: not as the estimate's kilojoules.
const EnergyAtLeastMIE = "at least the MIE (assumed resistance dominates)"

func hasDefault(o *assess.ObjectResult, names ...string) bool {
	for _, d := range o.Defaults {
		f := strings.ToLower(d.Field)
		for _, n := range names {
			if strings.HasPrefix(f, strings.ToLower(n)) {
				return true
			}
		}
	}
	return false
}

// defaultsText lists an object's defaults compactly, "Capacitance = 200 pF;
// Resistance to earth = 1e13 Ω": the reasons are on the Method sheet (and in
// the JSON), so that a row stays a few lines high in print.
func defaultsText(ds []assess.Default) string {
	parts := make([]string, 0, len(ds))
	for _, d := range ds {
		parts = append(parts, d.Field+" = "+d.Value)
	}
	return strings.Join(parts, "; ")
}

// possibleDischarges lists the possible discharges with their energies: "spark 12.3 mJ; brush 4 mJ".
func possibleDischarges(e *model.Evaluation) string {
	var parts []string
	for i, d := range e.Discharges {
		if !d.Possible {
			continue
		}
		s := model.DischargeType(i).String()
		if !math.IsNaN(d.Energy) && !math.IsInf(d.Energy, 0) {
			s += " " + UnitMJ.Text(d.Energy)
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

// inQ returns the cell of a surveyed input quantity: empty when not measured.
func inQ(u Unit, q inventory.Quantity) cell {
	if !q.Known {
		return cell{numFmt: u.NumFmt()}
	}
	return quantity(u, q.Value)
}

// est marks a cell as fed by an assumed default.
func est(c cell, assumed bool) cell {
	c.est = assumed && c.v != nil
	return c
}

func boolText(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func atmosphereText(a *inventory.Atmosphere) string {
	if a == nil {
		return "none"
	}
	if a.Description != "" {
		return a.ID + " – " + a.Description
	}
	if a.Substance != "" {
		return a.ID + " – " + a.Substance
	}
	return a.ID
}

func atmosphereMIE(a *inventory.Atmosphere) float64 {
	if a == nil {
		return math.NaN()
	}
	return a.MIE.OrNaN()
}

func ratioCell(r *float64) cell {
	if r == nil {
		return cell{numFmt: UnitRatio.NumFmt()}
	}
	return quantity(UnitRatio, *r)
}

type objRow = *assess.ObjectResult

// objectColumns returns the columns of the Objects sheet: identity and verdict
// first, then every surveyed input, the environment and every computed
// quantity; the probability columns when the assessment sampled.
func objectColumns(withProbability bool) []column[objRow] {
	ev := func(f func(e *model.Evaluation) float64, u Unit) func(objRow) cell {
		return func(o objRow) cell { return quantity(u, f(&o.Eval)) }
	}
	// liq is ev for the liquid-only results: blank on other rows.
	liq := func(f func(e *model.Evaluation) float64, u Unit) func(objRow) cell {
		return func(o objRow) cell {
			if o.Eval.Kind != model.Liquid {
				return cell{numFmt: u.NumFmt()}
			}
			return quantity(u, f(&o.Eval))
		}
	}
	cols := []column[objRow]{
		{"Object", 12, func(o objRow) cell { return text(o.Object.ID) }},
		{"Station", 10, func(o objRow) cell { return text(o.Object.Station) }},
		{"Kind", 10, func(o objRow) cell { return text(o.Object.Kind) }},
		{"Description", 26, func(o objRow) cell { return wrapText(o.Object.Description) }},
		{"Verdict", 14, func(o objRow) cell { return verdictCell(o.Verdict) }},
		{UnitRatio.Header("Ratio E/MIE"), 10, func(o objRow) cell { return ratioCell(o.Ratio) }},
		{UnitMJ.Header("Effective energy"), 11, func(o objRow) cell {
			if o.Eval.NotAssessed != 0 {
				return cell{numFmt: UnitMJ.NumFmt()}
			}
			if assess.AssumedResistanceDominates(&o.Eval, o.Eval.Effective) && o.Ratio != nil && *o.Ratio >= 1 {
				return wrapText(EnergyAtLeastMIE)
			}
			c := quantity(UnitMJ, o.Eval.EffectiveEnergy)
			switch {
			case o.Eval.EffectiveEnergy <= 0:
			case o.Eval.Effective == model.Brush:
				c = est(c, hasDefault(o, "brush"))
			case o.Eval.Effective == model.PropagatingBrush:
				c = est(c, hasDefault(o, "propagating"))
			case o.Eval.Effective == model.Spark:
				c = est(c, hasDefault(o, "capacitance", "body potential"))
			}
			return c
		}},
		{"Effective discharge", 12, func(o objRow) cell {
			if o.Eval.NotAssessed != 0 || o.Eval.EffectiveEnergy == 0 || math.IsNaN(o.Eval.EffectiveEnergy) {
				return cell{}
			}
			return text(o.Eval.Effective.String())
		}},
		{"Reason", 48, func(o objRow) cell { return wrapText(o.Reason) }},
		{"Findings [count]", 9, func(o objRow) cell { return integer(len(o.Findings)) }},
		{"Defaults applied (values marked est.; reasons on Method)", 48, func(o objRow) cell { return wrapText(defaultsText(o.Defaults)) }},

		// Surveyed inputs.
		{"Material", 14, func(o objRow) cell { return optText(o.Object.Material) }},
		{UnitMetre.Header("Length"), 9, func(o objRow) cell { return inQ(UnitMetre, o.Object.Length) }},
		{UnitMetre.Header("Width"), 9, func(o objRow) cell { return inQ(UnitMetre, o.Object.Width) }},
		{UnitMetre.Header("Diameter"), 9, func(o objRow) cell { return inQ(UnitMetre, o.Object.Diameter) }},
		{UnitMillimetre.Header("Thickness"), 9, func(o objRow) cell { return inQ(UnitMillimetre, o.Object.Thickness) }},
		{"Backing", 9, func(o objRow) cell { return optText(o.Object.Backing) }},
		{UnitMetre.Header("Distance to earth"), 9, func(o objRow) cell { return inQ(UnitMetre, o.Object.DistanceToEarth) }},
		{UnitKVPerM.Header("Field reading"), 10, func(o objRow) cell { return inQ(UnitKVPerM, o.Object.Field) }},
		{UnitMetre.Header("Reading distance"), 9, func(o objRow) cell { return inQ(UnitMetre, o.Object.FieldDistance) }},
		{UnitKV.Header("Surface potential reading"), 10, func(o objRow) cell { return inQ(UnitKV, o.Object.SurfacePotential) }},
		{UnitMPerS.Header("Speed"), 9, func(o objRow) cell { return inQ(UnitMPerS, o.Object.Speed) }},
		{UnitKgPerS.Header("Mass flow"), 9, func(o objRow) cell { return inQ(UnitKgPerS, o.Object.MassFlow) }},
		{UnitUCPerKg.Header("Charge-to-mass"), 10, func(o objRow) cell { return inQ(UnitUCPerKg, o.Object.ChargeToMass) }},
		{UnitUA.Header("Charging current given"), 10, func(o objRow) cell { return inQ(UnitUA, o.Object.ChargingCurrent) }},
		{UnitSecond.Header("Charging time"), 9, func(o objRow) cell { return inQ(UnitSecond, o.Object.ChargingTime) }},
		{UnitMillimetre.Header("Particle size"), 9, func(o objRow) cell { return inQ(UnitMillimetre, o.Object.ParticleSize) }},
		{UnitOhm.Header("Resistance to earth"), 11, func(o objRow) cell { return inQ(UnitOhm, o.Object.Resistance) }},
		{UnitPF.Header("Capacitance given"), 10, func(o objRow) cell { return inQ(UnitPF, o.Object.Capacitance) }},
		{UnitPSPerM.Header("Conductivity"), 10, func(o objRow) cell { return inQ(UnitPSPerM, o.Object.Conductivity) }},
		{UnitDimless.Header("Liquid permittivity"), 9, func(o objRow) cell { return inQ(UnitDimless, o.Object.Permittivity) }},
		{"Bag type", 7, func(o objRow) cell { return code(o.Object.BagType) }},
		{"Filling", 9, func(o objRow) cell { return optText(o.Object.Filling) }},
		{"Vessel material", 10, func(o objRow) cell { return optText(o.Object.VesselMaterial) }},
		{"Vessel class", 10, func(o objRow) cell { return optText(o.Object.VesselClass) }},
		{UnitMetre.Header("Vessel diameter"), 9, func(o objRow) cell { return inQ(UnitMetre, o.Object.VesselDiameter) }},
		{"Filter", 8, func(o objRow) cell { return optText(o.Object.Filter) }},
		{UnitSecond.Header("Residence time"), 9, func(o objRow) cell { return inQ(UnitSecond, o.Object.Residence) }},
		{"Second phase", 10, func(o objRow) cell { return optText(o.Object.SecondPhase) }},
		{UnitMPerS.Header("Inlet velocity"), 9, func(o objRow) cell { return inQ(UnitMPerS, o.Object.InletVelocity) }},
		{"Survey notes", 24, func(o objRow) cell { return wrapText(o.Object.Notes) }},

		// Environment.
		{UnitPercentRH.Header("RH used"), 8, func(o objRow) cell {
			return est(quantity(UnitPercentRH, o.Environment.RelativeHumidity), hasDefault(o, "relative humidity", "rh"))
		}},
		{"Atmosphere", 18, func(o objRow) cell { return wrapText(atmosphereText(o.Atmosphere)) }},
		{UnitMJ.Header("MIE"), 9, func(o objRow) cell {
			c := quantity(UnitMJ, atmosphereMIE(o.Atmosphere))
			return est(c, o.Atmosphere != nil && o.Atmosphere.MIEFromSubstance || hasDefault(o, "mie"))
		}},
		{"Zone", 7, func(o objRow) cell {
			if o.Atmosphere == nil {
				return cell{}
			}
			if o.Atmosphere.Zone == "" && hasDefault(o, "zone") {
				return code(o.Environment.Zone.String() + " est.")
			}
			return code(o.Atmosphere.Zone)
		}},
		{"Group", 7, func(o objRow) cell {
			if o.Atmosphere == nil {
				return cell{}
			}
			if o.Atmosphere.GroupFromSubstance {
				return code(o.Atmosphere.Group + " est.")
			}
			if o.Atmosphere.Group == "" && hasDefault(o, "group") {
				return code(o.Environment.Group.String() + " est.")
			}
			return code(o.Atmosphere.Group)
		}},

		// Computed quantities.
		{UnitPF.Header("Capacitance"), 10, func(o objRow) cell {
			c := quantity(UnitPF, o.Eval.Capacitance)
			return est(c, !o.Object.Capacitance.Known || hasDefault(o, "capacitance"))
		}},
		{"Capacitance basis", 14, func(o objRow) cell {
			if math.IsNaN(o.Eval.Capacitance) {
				return cell{}
			}
			if o.Object.Capacitance.Known {
				return text("measured")
			}
			return text("est.: " + enumText(o.Eval.CapacitanceModel))
		}},
		{UnitKV.Header("Potential"), 10, func(o objRow) cell {
			return est(quantity(UnitKV, o.Eval.Potential), hasDefault(o, "body potential", "potential"))
		}},
		{"Potential source", 14, func(o objRow) cell {
			if math.IsNaN(o.Eval.Potential) {
				return cell{}
			}
			return optText(enumText(o.Eval.PotentialSource))
		}},
		{UnitUCPerM2.Header("Charge density"), 10, ev(func(e *model.Evaluation) float64 { return e.ChargeDensity }, UnitUCPerM2)},
		{UnitKVPerM.Header("Surface field"), 10, ev(func(e *model.Evaluation) float64 { return e.SurfaceField }, UnitKVPerM)},
		{UnitUA.Header("Charging current"), 10, func(o objRow) cell {
			return est(quantity(UnitUA, o.Eval.ChargingCurrent), hasDefault(o, "charging current"))
		}},
		{UnitMJ.Header("Stored energy"), 10, ev(func(e *model.Evaluation) float64 { return e.StoredEnergy }, UnitMJ)},
		{UnitNC.Header("Transferred charge"), 10, ev(func(e *model.Evaluation) float64 { return e.TransferredCharge }, UnitNC)},
		{"Possible discharges", 22, func(o objRow) cell { return wrapText(possibleDischarges(&o.Eval)) }},
		{UnitCM2.Header("Insulating area"), 10, ev(func(e *model.Evaluation) float64 { return e.InsulatingArea }, UnitCM2)},
		{UnitOhmSq.Header("Surface resistivity at RH"), 11, ev(func(e *model.Evaluation) float64 { return e.SurfaceResistivity }, UnitOhmSq)},
		{"Dissipative at RH", 9, func(o objRow) cell {
			if math.IsNaN(o.Eval.SurfaceResistivity) {
				return cell{}
			}
			return text(boolText(o.Eval.Dissipative))
		}},
		{UnitSecond.Header("Decay time"), 10, ev(func(e *model.Evaluation) float64 { return e.DecayTime }, UnitSecond)},
		{UnitSecond.Header("Time to 100 V"), 10, ev(func(e *model.Evaluation) float64 { return e.TimeTo100V }, UnitSecond)},
		{UnitSecond.Header("Relaxation time"), 10, ev(func(e *model.Evaluation) float64 { return e.RelaxationTime }, UnitSecond)},
		{UnitUA.Header("Streaming current"), 10, ev(func(e *model.Evaluation) float64 { return e.StreamingCurrent }, UnitUA)},
		{UnitM2PerS.Header("Velocity × diameter"), 10, ev(func(e *model.Evaluation) float64 { return e.VelocityDiameter }, UnitM2PerS)},
		{UnitM2PerS.Header("v·d limit"), 10, liq(func(e *model.Evaluation) float64 { return finiteOrNaN(e.VDLimit) }, UnitM2PerS)},
		{UnitMPerS.Header("Velocity limit"), 10, liq(func(e *model.Evaluation) float64 { return finiteOrNaN(e.VelocityLimit) }, UnitMPerS)},
		{UnitDimless.Header("Charge factor"), 9, liq(func(e *model.Evaluation) float64 { return e.ChargeFactor }, UnitDimless)},
		{UnitSecond.Header("Residence needed after filter"), 10, liq(func(e *model.Evaluation) float64 { return e.FilterResidence }, UnitSecond)},
		{"Filling clauses not met", 24, func(o objRow) cell { return wrapText(enumText(o.Eval.LiquidBreaches)) }},
		{"Model assumptions", 40, func(o objRow) cell { return wrapText(enumText(o.Eval.Assumed)) }},
		{"Model notes", 36, func(o objRow) cell { return wrapText(enumText(o.Eval.Flags)) }},
		{"Missing inputs", 24, func(o objRow) cell { return wrapText(enumText(o.Eval.NotAssessed)) }},

		// Insulating surfaces (appended): the backed layer's fields apart, the
		// breakdown it is compared with, and how the row was read.
		{UnitKV.Header("Layer breakdown given"), 10, func(o objRow) cell { return inQ(UnitKV, o.Object.LayerBreakdown) }},
		{"Process given", 12, func(o objRow) cell { return optText(o.Object.Process) }},
		{UnitKVPerM.Header("Air-side field of the backed layer"), 11, ev(func(e *model.Evaluation) float64 { return e.AirField }, UnitKVPerM)},
		{UnitKVPerM.Header("Field inside the backed layer"), 11, ev(func(e *model.Evaluation) float64 { return e.LayerField }, UnitKVPerM)},
		{UnitKV.Header("Voltage across the layer"), 10, ev(func(e *model.Evaluation) float64 { return e.LayerVoltage }, UnitKV)},
		{UnitKV.Header("Layer breakdown used"), 10, ev(func(e *model.Evaluation) float64 { return e.LayerBreakdown }, UnitKV)},
		{"Layer breakdown basis", 16, func(o objRow) cell {
			if o.Eval.Kind != model.Sheet && o.Eval.Kind != model.Belt && o.Eval.Kind != model.Roller {
				return cell{}
			}
			if math.IsNaN(o.Eval.LayerBreakdown) && math.IsNaN(o.Eval.LayerVoltage) {
				return cell{}
			}
			return wrapText(o.Eval.BreakdownSource.String())
		}},
		{"Surface judged as", 14, func(o objRow) cell {
			switch {
			case math.IsNaN(o.Eval.InsulatingArea) && o.Eval.Kind != model.Sheet && o.Eval.Kind != model.Belt:
				return cell{}
			case o.Eval.Kind == model.Bag || o.Eval.Kind == model.Liquid || o.Eval.Kind == model.Powder:
				return cell{}
			case o.Eval.ProcessMaterial:
				return text("process material (charge screens, no area limit)")
			}
			return text("fixed equipment (area limit)")
		}},
		{"Unearthed conducting surface", 10, func(o objRow) cell {
			if !o.Eval.IsolatedConductor {
				return cell{}
			}
			return text("yes: assessed for a spark")
		}},
	}
	if withProbability {
		p := func(f func(*assess.Probability) float64, u Unit) func(objRow) cell {
			return func(o objRow) cell {
				if o.Probability == nil {
					return cell{numFmt: u.NumFmt()}
				}
				return quantity(u, f(o.Probability))
			}
		}
		cols = append(cols,
			column[objRow]{"Samples [count]", 9, func(o objRow) cell {
				if o.Probability == nil {
					return cell{}
				}
				return integer(o.Probability.Samples)
			}},
			column[objRow]{UnitProbability.Header("P(incendive)"), 10, p(func(q *assess.Probability) float64 { return q.Incendive }, UnitProbability)},
			column[objRow]{UnitProbability.Header("P(marginal)"), 10, p(func(q *assess.Probability) float64 { return q.Marginal }, UnitProbability)},
			column[objRow]{UnitProbability.Header("P(non-incendive)"), 10, p(func(q *assess.Probability) float64 { return q.NonIncendive }, UnitProbability)},
			column[objRow]{UnitMJ.Header("Energy P05"), 10, p(func(q *assess.Probability) float64 { return q.EnergyP05 }, UnitMJ)},
			column[objRow]{UnitMJ.Header("Energy P50"), 10, p(func(q *assess.Probability) float64 { return q.EnergyP50 }, UnitMJ)},
			column[objRow]{UnitMJ.Header("Energy P95"), 10, p(func(q *assess.Probability) float64 { return q.EnergyP95 }, UnitMJ)},
		)
	}
	return cols
}

// anyProbability reports whether the audit carries Monte Carlo results.
func anyProbability(a *assess.Audit) bool {
	for i := range a.Objects {
		if a.Objects[i].Probability != nil {
			return true
		}
	}
	return false
}
