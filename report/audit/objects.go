package audit

import (
	"fmt"
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
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

// EnergyAtLeastMIE is how the audit shows an energy set by an assumed (unknown)
// resistance to earth that reaches the MIE: not as the estimate's kilojoules.
const EnergyAtLeastMIE = "at least the MIE (an assumed resistance to earth or charging current dominates)"

// estimated reports whether any of the items is estimated on the object (a
// computed value resting on it is marked est.).
func estimated(o *assess.ObjectResult, items ...assess.Item) bool {
	for _, it := range items {
		if o.Provenance(it) == assess.ProvEstimated {
			return true
		}
	}
	return false
}

// defaultsText lists the values the tool chose for an object (estimated,
// library, override) compactly with their marks, "Capacitance = 200 pF est.;
// Material = PE lib.": the reasons are on the Method sheet (and in the JSON),
// so that a row stays a few lines high in print. The site's own values
// (margin, temperature) are on the Summary, not repeated on every row.
func defaultsText(o *assess.ObjectResult) string {
	var parts []string
	for _, d := range o.Defaults() {
		switch d.Item {
		case assess.ItemRequiredMargin, assess.ItemAirTemperature, assess.ItemSite:
			continue
		}
		parts = append(parts, d.Label+" = "+d.Value+" "+d.Prov.Mark())
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
			s += " " + book.UnitMJ.Text(d.Energy)
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

// inQ returns the cell of a surveyed input quantity: empty when not measured.
func inQ(u book.Unit, q inventory.Quantity) book.Cell {
	if !q.Known {
		return book.Cell{NumFmt: u.NumFmt()}
	}
	return book.Quantity(u, q.Value)
}

// est marks a cell as fed by an estimate.
func est(c book.Cell, assumed bool) book.Cell {
	if assumed {
		return marked(c, assess.ProvEstimated)
	}
	return c
}

// marked returns the cell with the mark of provenance p: in the number format
// of a number (it stays a number), after the text of a text; a measured value
// and an empty cell carry none.
func marked(c book.Cell, p assess.Provenance) book.Cell {
	m := p.Mark()
	if c.V == nil || m == "" {
		return c
	}
	if s, ok := c.V.(string); ok {
		c.V = s + " " + m
		return c
	}
	c.Mark = m
	return c
}

// groupCell is the assessed group of an atmosphere with its mark: lib. or
// est. from GroupText, ent. for a group the surveyor typed.
func groupCell(a *inventory.Atmosphere) book.Cell {
	if a == nil {
		return book.Cell{}
	}
	g := assess.GroupText(a)
	if g != "" && g == a.Group {
		g += " " + assess.ProvEntered.Mark()
	}
	return book.Code(g)
}

// ratioText is the ratio cell beside a verdict: the ratio, or why there is
// none ("n/a", "no discharge"): never a 0 beside a hazard verdict.
func ratioText(r *float64) book.Cell {
	if t := assess.RatioText(r); t != "" {
		return book.Code(t)
	}
	return ratioCell(r)
}

// surfaceRuleText says what the two surface rules made of the surface at the
// station's RH, so that the column agrees with the spark rule: the spark rule
// counts a surface as a conductor below the spark bound (model
// Limits.SparkSurface, 1e12 Ω/sq) or by its conductive or dissipative class;
// the insulating-area exemption needs the stricter leak bound
// (Limits.DissipativeSurface, 1e9 Ω/sq). "" for an object with no surface
// resistivity and no conducting class.
func surfaceRuleText(in *model.Input, ev *model.Evaluation) string {
	byClass := in.Material.Conductive || in.Material.Dissipative
	switch {
	case ev.Dissipative:
		return "leaks (below the area-exemption bound); a conductor for the spark rule"
	case ev.ConductingSurface && byClass:
		return "a conductor for the spark rule (conductive or dissipative class); does not leak enough for the area exemption"
	case ev.ConductingSurface:
		return "a conductor for the spark rule (below the spark bound); does not leak enough for the area exemption"
	case math.IsNaN(ev.SurfaceResistivity):
		return ""
	}
	return "insulating (at or above the spark bound)"
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

func ratioCell(r *float64) book.Cell {
	if r == nil {
		return book.Cell{NumFmt: book.UnitRatio.NumFmt()}
	}
	return book.Quantity(book.UnitRatio, *r)
}

type objRow = *assess.ObjectResult

// objectColumns returns the columns of the Objects sheet: identity and verdict
// first, then every surveyed input, the environment and every computed
// quantity; the probability columns when the assessment sampled.
func objectColumns(withProbability bool) []book.Column[objRow] {
	ev := func(f func(e *model.Evaluation) float64, u book.Unit) func(objRow) book.Cell {
		return func(o objRow) book.Cell { return book.Quantity(u, f(&o.Eval)) }
	}
	// liq is ev for the liquid-only results: blank on other rows.
	liq := func(f func(e *model.Evaluation) float64, u book.Unit) func(objRow) book.Cell {
		return func(o objRow) book.Cell {
			if o.Eval.Kind != model.Liquid {
				return book.Cell{NumFmt: u.NumFmt()}
			}
			return book.Quantity(u, f(&o.Eval))
		}
	}
	var cols []book.Column[objRow]
	cols = append(cols, []book.Column[objRow]{
		{Header: "Object", Width: 12, Value: func(o objRow) book.Cell { return book.Text(o.Object.ID) }},
		{Header: "Station", Width: 10, Value: func(o objRow) book.Cell { return book.Text(o.Object.Station) }},
		{Header: "Kind", Width: 10, Value: func(o objRow) book.Cell { return book.Text(o.Object.Kind) }},
		{Header: "Description", Width: 26, Value: func(o objRow) book.Cell { return book.WrapText(o.Object.Description) }},
		{Header: "Verdict", Width: 14, Value: func(o objRow) book.Cell { return verdictCell(o.Verdict) }},
	}...)
	if withProbability {
		// The sampled verdicts beside the point verdict; "n/a" where nothing was sampled.
		p := func(f func(*assess.Probability) float64) func(objRow) book.Cell {
			return func(o objRow) book.Cell {
				if !sampled(o) {
					return book.Code("n/a")
				}
				return book.Quantity(book.UnitProbability, f(o.Probability))
			}
		}
		cols = append(cols,
			book.Column[objRow]{Header: "Borderline", Width: 11, Value: func(o objRow) book.Cell {
				if !sampled(o) {
					return book.Code("n/a")
				}
				if o.Borderline() {
					return book.Code("borderline")
				}
				return book.Cell{}
			}},
			book.Column[objRow]{Header: book.UnitProbability.Header("P(incendive)"), Width: 10, Value: p(func(q *assess.Probability) float64 { return q.Incendive })},
			book.Column[objRow]{Header: book.UnitProbability.Header("P(marginal)"), Width: 10, Value: p(func(q *assess.Probability) float64 { return q.Marginal })},
			book.Column[objRow]{Header: book.UnitProbability.Header("P(non-incendive)"), Width: 10, Value: p(func(q *assess.Probability) float64 { return q.NonIncendive })},
		)
	}
	cols = append(cols, []book.Column[objRow]{
		{Header: book.UnitRatio.Header("Ratio E/MIE"), Width: ratioTextWidth, Value: func(o objRow) book.Cell {
			if o.RatioAssumed() {
				return book.Text(assess.RatioAssumedText) // beside "at least the MIE": no figure to read
			}
			return ratioText(o.Ratio)
		}},
		{Header: book.UnitMJ.Header("Effective energy"), Width: 11, Value: func(o objRow) book.Cell {
			if !o.EnergyStated() {
				return book.Cell{NumFmt: book.UnitMJ.NumFmt()}
			}
			if assess.AssumedInputDominates(&o.Eval, o.Eval.Effective) && o.Ratio != nil && *o.Ratio >= 1 {
				return book.WrapText(EnergyAtLeastMIE)
			}
			c := book.Quantity(book.UnitMJ, o.Eval.EffectiveEnergy)
			switch {
			case o.Eval.EffectiveEnergy <= 0:
			case o.Eval.Effective == model.Brush:
				c = marked(c, o.Provenance(assess.ItemBrushEnergy))
			case o.Eval.Effective == model.PropagatingBrush:
				c = marked(c, o.Provenance(assess.ItemPropagatingEnergy))
			case o.Eval.Effective == model.Spark:
				c = est(c, estimated(o, assess.ItemCapacitance, assess.ItemPotential))
			}
			return c
		}},
		{Header: "Effective discharge", Width: 12, Value: func(o objRow) book.Cell {
			if !o.EnergyStated() || o.Eval.EffectiveEnergy == 0 || math.IsNaN(o.Eval.EffectiveEnergy) {
				return book.Cell{}
			}
			return book.Text(o.Eval.Effective.String())
		}},
		{Header: "Reason", Width: 48, Value: func(o objRow) book.Cell { return book.WrapText(o.Reason) }},
		{Header: "Findings [count]", Width: 9, Value: func(o objRow) book.Cell { return book.Integer(len(o.Findings)) }},
		{Header: defaultsHeader, Width: 48, Value: func(o objRow) book.Cell { return book.WrapText(defaultsText(o)) }},

		// Surveyed inputs.
		{Header: "Material", Width: 14, Value: func(o objRow) book.Cell {
			return marked(book.OptText(o.Object.Material), o.Provenance(assess.ItemMaterial)) // the name is the row's; lib./ent. say where its properties come from
		}},
		{Header: book.UnitMetre.Header("Length"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMetre, o.Object.Length) }},
		{Header: book.UnitMetre.Header("Width"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMetre, o.Object.Width) }},
		{Header: book.UnitMetre.Header("Diameter"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMetre, o.Object.Diameter) }},
		{Header: book.UnitMillimetre.Header("Thickness"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMillimetre, o.Object.Thickness) }},
		{Header: "Backing", Width: 9, Value: func(o objRow) book.Cell { return book.OptText(o.Object.Backing) }},
		{Header: book.UnitMetre.Header("Distance to earth"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMetre, o.Object.DistanceToEarth) }},
		{Header: book.UnitKVPerM.Header("Field reading"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitKVPerM, o.Object.Field) }},
		{Header: book.UnitMetre.Header("Reading distance"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMetre, o.Object.FieldDistance) }},
		{Header: book.UnitKV.Header("Surface potential reading"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitKV, o.Object.SurfacePotential) }},
		{Header: book.UnitMPerS.Header("Speed"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMPerS, o.Object.Speed) }},
		{Header: book.UnitKgPerS.Header("Mass flow"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitKgPerS, o.Object.MassFlow) }},
		{Header: book.UnitUCPerKg.Header("Charge-to-mass"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitUCPerKg, o.Object.ChargeToMass) }},
		{Header: book.UnitUA.Header("Charging current given"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitUA, o.Object.ChargingCurrent) }},
		{Header: book.UnitSecond.Header("Charging time"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitSecond, o.Object.ChargingTime) }},
		{Header: book.UnitMillimetre.Header("Particle size"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMillimetre, o.Object.ParticleSize) }},
		{Header: book.UnitOhm.Header("Resistance to earth"), Width: 11, Value: func(o objRow) book.Cell { return inQ(book.UnitOhm, o.Object.Resistance) }},
		{Header: book.UnitPF.Header("Capacitance given"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitPF, o.Object.Capacitance) }},
		{Header: book.UnitPSPerM.Header("Conductivity"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitPSPerM, o.Object.Conductivity) }},
		{Header: book.UnitDimless.Header("Liquid permittivity"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitDimless, o.Object.Permittivity) }},
		{Header: "Bag type", Width: 7, Value: func(o objRow) book.Cell { return book.Code(o.Object.BagType) }},
		{Header: "Filling", Width: 9, Value: func(o objRow) book.Cell { return book.OptText(o.Object.Filling) }},
		{Header: "Vessel material", Width: 10, Value: func(o objRow) book.Cell { return book.OptText(o.Object.VesselMaterial) }},
		{Header: "Vessel class", Width: 10, Value: func(o objRow) book.Cell { return book.OptText(o.Object.VesselClass) }},
		{Header: book.UnitMetre.Header("Vessel diameter"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMetre, o.Object.VesselDiameter) }},
		{Header: "Filter", Width: 8, Value: func(o objRow) book.Cell { return book.OptText(o.Object.Filter) }},
		{Header: book.UnitSecond.Header("Residence time"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitSecond, o.Object.Residence) }},
		{Header: "Second phase", Width: 10, Value: func(o objRow) book.Cell { return book.OptText(o.Object.SecondPhase) }},
		{Header: book.UnitMPerS.Header("Inlet velocity"), Width: 9, Value: func(o objRow) book.Cell { return inQ(book.UnitMPerS, o.Object.InletVelocity) }},
		{Header: "Survey notes", Width: 24, Value: func(o objRow) book.Cell { return book.WrapText(o.Object.Notes) }},

		// Environment.
		{Header: book.UnitPercentRH.Header("RH used"), Width: 8, Value: func(o objRow) book.Cell {
			return marked(book.Quantity(book.UnitPercentRH, o.Environment.RelativeHumidity), o.Provenance(assess.ItemRelativeHumidity))
		}},
		{Header: "Atmosphere", Width: 18, Value: func(o objRow) book.Cell { return book.WrapText(atmosphereText(o.Atmosphere)) }},
		{Header: book.UnitMJ.Header("MIE"), Width: 9, Value: func(o objRow) book.Cell {
			return marked(book.Quantity(book.UnitMJ, atmosphereMIE(o.Atmosphere)), o.Provenance(assess.ItemMIE))
		}},
		{Header: "Zone", Width: 7, Value: func(o objRow) book.Cell {
			if o.Atmosphere == nil {
				return book.Cell{}
			}
			if o.Atmosphere.Zone == "" {
				return marked(book.Code(o.Environment.Zone.String()), o.Provenance(assess.ItemZone))
			}
			return marked(book.Code(o.Atmosphere.Zone), assess.ProvEntered)
		}},
		{Header: "Group", Width: 7, Value: func(o objRow) book.Cell {
			if o.Atmosphere == nil {
				return book.Cell{}
			}
			return groupCell(o.Atmosphere) // the assessed group with its mark
		}},

		// Computed quantities.
		{Header: book.UnitPF.Header("Capacitance"), Width: 10, Value: func(o objRow) book.Cell {
			c := book.Quantity(book.UnitPF, o.Eval.Capacitance)
			return est(c, !o.Object.Capacitance.Known || estimated(o, assess.ItemCapacitance))
		}},
		{Header: "Capacitance basis", Width: 14, Value: func(o objRow) book.Cell {
			if math.IsNaN(o.Eval.Capacitance) {
				return book.Cell{}
			}
			if o.Object.Capacitance.Known {
				return book.Text("measured")
			}
			return book.Text("estimated: " + enumText(o.Eval.CapacitanceModel))
		}},
		{Header: book.UnitKV.Header("Potential"), Width: 10, Value: func(o objRow) book.Cell {
			return est(book.Quantity(book.UnitKV, o.Eval.Potential), estimated(o, assess.ItemPotential))
		}},
		{Header: "Potential source", Width: 14, Value: func(o objRow) book.Cell {
			if math.IsNaN(o.Eval.Potential) {
				return book.Cell{}
			}
			return book.OptText(enumText(o.Eval.PotentialSource))
		}},
		{Header: book.UnitUCPerM2.Header("Charge density"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.ChargeDensity }, book.UnitUCPerM2)},
		{Header: book.UnitKVPerM.Header("Surface field"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.SurfaceField }, book.UnitKVPerM)},
		{Header: book.UnitUA.Header("Charging current"), Width: 10, Value: func(o objRow) book.Cell {
			return est(book.Quantity(book.UnitUA, o.Eval.ChargingCurrent), estimated(o, assess.ItemChargingCurrent))
		}},
		{Header: book.UnitMJ.Header("Stored energy"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.StoredEnergy }, book.UnitMJ)},
		{Header: book.UnitNC.Header("Transferred charge"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.TransferredCharge }, book.UnitNC)},
		{Header: "Possible discharges", Width: 22, Value: func(o objRow) book.Cell { return book.WrapText(possibleDischarges(&o.Eval)) }},
		{Header: book.UnitCM2.Header("Insulating area"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.InsulatingArea }, book.UnitCM2)},
		{Header: book.UnitOhmSq.Header("Surface resistivity at RH"), Width: 11, Value: ev(func(e *model.Evaluation) float64 { return e.SurfaceResistivity }, book.UnitOhmSq)},
		{Header: "Surface at RH (rules used)", Width: 22, Value: func(o objRow) book.Cell {
			if t := surfaceRuleText(&o.Input, &o.Eval); t != "" {
				return book.WrapText(t)
			}
			return book.Cell{}
		}},
		{Header: book.UnitSecond.Header("Decay time"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.DecayTime }, book.UnitSecond)},
		{Header: book.UnitSecond.Header("Time to 100 V"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.TimeTo100V }, book.UnitSecond)},
		{Header: book.UnitSecond.Header("Relaxation time"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.RelaxationTime }, book.UnitSecond)},
		{Header: book.UnitUA.Header("Streaming current"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.StreamingCurrent }, book.UnitUA)},
		{Header: book.UnitM2PerS.Header("Velocity × diameter"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.VelocityDiameter }, book.UnitM2PerS)},
		{Header: book.UnitM2PerS.Header("v·d limit"), Width: 10, Value: liq(func(e *model.Evaluation) float64 { return finiteOrNaN(e.VDLimit) }, book.UnitM2PerS)},
		{Header: book.UnitMPerS.Header("Velocity limit"), Width: 10, Value: liq(func(e *model.Evaluation) float64 { return finiteOrNaN(e.VelocityLimit) }, book.UnitMPerS)},
		{Header: book.UnitDimless.Header("Charge factor"), Width: 9, Value: liq(func(e *model.Evaluation) float64 { return e.ChargeFactor }, book.UnitDimless)},
		{Header: book.UnitSecond.Header("Residence needed after filter"), Width: 10, Value: liq(func(e *model.Evaluation) float64 { return e.FilterResidence }, book.UnitSecond)},
		{Header: "Filling clauses not met", Width: 24, Value: func(o objRow) book.Cell { return book.WrapText(enumText(o.Eval.LiquidBreaches)) }},
		{Header: "Model assumptions", Width: 40, Value: func(o objRow) book.Cell { return book.WrapText(enumText(o.Eval.Assumed)) }},
		{Header: "Model notes", Width: 36, Value: func(o objRow) book.Cell { return book.WrapText(enumText(o.Eval.Flags)) }},
		{Header: "Missing inputs", Width: 24, Value: func(o objRow) book.Cell { return book.WrapText(enumText(o.Eval.NotAssessed)) }},

		// Insulating surfaces (appended): the backed layer's fields apart, the
		// breakdown it is compared with, and how the row was read.
		{Header: book.UnitKV.Header("Layer breakdown given"), Width: 10, Value: func(o objRow) book.Cell { return inQ(book.UnitKV, o.Object.LayerBreakdown) }},
		{Header: "Process given", Width: 12, Value: func(o objRow) book.Cell { return book.OptText(o.Object.Process) }},
		{Header: book.UnitKVPerM.Header("Air-side field of the backed layer"), Width: 11, Value: ev(func(e *model.Evaluation) float64 { return e.AirField }, book.UnitKVPerM)},
		{Header: book.UnitKVPerM.Header("Field inside the backed layer"), Width: 11, Value: ev(func(e *model.Evaluation) float64 { return e.LayerField }, book.UnitKVPerM)},
		{Header: book.UnitKV.Header("Voltage across the layer"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.LayerVoltage }, book.UnitKV)},
		{Header: book.UnitKV.Header("Layer breakdown used"), Width: 10, Value: ev(func(e *model.Evaluation) float64 { return e.LayerBreakdown }, book.UnitKV)},
		{Header: "Layer breakdown basis", Width: 16, Value: func(o objRow) book.Cell {
			if o.Eval.Kind != model.Sheet && o.Eval.Kind != model.Belt && o.Eval.Kind != model.Roller {
				return book.Cell{}
			}
			if math.IsNaN(o.Eval.LayerBreakdown) && math.IsNaN(o.Eval.LayerVoltage) {
				return book.Cell{}
			}
			return book.WrapText(o.Eval.BreakdownSource.String())
		}},
		{Header: "Surface judged as", Width: 14, Value: func(o objRow) book.Cell {
			switch {
			case math.IsNaN(o.Eval.InsulatingArea) && o.Eval.Kind != model.Sheet && o.Eval.Kind != model.Belt:
				return book.Cell{}
			case o.Eval.Kind == model.Bag || o.Eval.Kind == model.Liquid || o.Eval.Kind == model.Powder:
				return book.Cell{}
			case o.Eval.ProcessMaterial:
				return book.Text("process material (charge screens, no area limit)")
			}
			return book.Text("fixed equipment (area limit)")
		}},
		{Header: "Unearthed conducting surface", Width: 10, Value: func(o objRow) book.Cell {
			if !o.Eval.IsolatedConductor {
				return book.Cell{}
			}
			return book.Text("yes: assessed for a spark")
		}},
	}...)
	if withProbability {
		p := func(f func(*assess.Probability) float64, u book.Unit) func(objRow) book.Cell {
			return func(o objRow) book.Cell {
				if o.Probability == nil {
					return book.Cell{NumFmt: u.NumFmt()}
				}
				if o.RatioAssumed() {
					// the sampled energies rest on the assumed resistance: no figure to read
					return book.Code(PercentilesWithheldText)
				}
				return book.Quantity(u, f(o.Probability))
			}
		}
		cols = append(cols,
			book.Column[objRow]{Header: "Samples [count]", Width: 9, Value: func(o objRow) book.Cell {
				if o.Probability == nil {
					return book.Cell{}
				}
				return book.Integer(o.Probability.Samples)
			}},
			book.Column[objRow]{Header: book.UnitMJ.Header("Energy P05"), Width: 10, Value: p(func(q *assess.Probability) float64 { return q.EnergyP05 }, book.UnitMJ)},
			book.Column[objRow]{Header: book.UnitMJ.Header("Energy P50"), Width: 10, Value: p(func(q *assess.Probability) float64 { return q.EnergyP50 }, book.UnitMJ)},
			book.Column[objRow]{Header: book.UnitMJ.Header("Energy P95"), Width: 10, Value: p(func(q *assess.Probability) float64 { return q.EnergyP95 }, book.UnitMJ)},
			book.Column[objRow]{Header: "What to measure next", Width: 40, Value: func(o objRow) book.Cell { return book.WrapText(o.MeasureText()) }},
		)
	}
	return cols
}

// PercentilesWithheldText stands in the energy percentile cells of an object
// whose energy rests on an assumed resistance to earth (assess.ObjectResult.
// RatioAssumed): sampling the other inputs around an assumed "no leakage"
// gives a spread of the assumption, not of the hazard, so no figure is shown
// (the JSON leaves the percentiles out for it).
const PercentilesWithheldText = "withheld: assumed R"

// sampled reports whether the object's verdicts were sampled (it was
// assessed and has a Probability).
func sampled(o *assess.ObjectResult) bool {
	return o.Probability != nil && o.Verdict != assess.NotAssessed && o.Probability.NotAssessed < 1
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

// defaultsHeader is the Objects column listing the values the tool chose.
const defaultsHeader = "Defaults applied (est. estimated, lib. library, ovr. override; reasons on Method)"
