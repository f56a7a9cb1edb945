package assess

import (
	"fmt"
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// DefaultMargin is the required margin when the Site sheet gives none: energy must
// stay below MIE / 10 to count as non-incendive (a site choice, not a standard value).
const DefaultMargin = 10.0

// DefaultTemperature is the air temperature (K) when the Site sheet gives none: 20 °C.
const DefaultTemperature = 293.15

// DryDayHumidity is the relative humidity (%) taken when neither the station nor
// the site gives one: a dry-day screening value, lower (worse) than the 50 % at
// which material data are quoted (a documented choice).
const DryDayHumidity = 30.0

// Assess judges every accepted object of the survey and ranks its stations.
//
// For each object (none is dropped) it maps the row, its material, its station
// and the station's atmosphere to model.Input and model.Environment (the station's
// RH, else the site's; NaN for every quantity not given), calls model.Evaluate,
// classifies the result with Classify and writes a Finding for each failed check,
// the one-sentence Reason and every Default that fed the result. Stations are
// then ranked (worst first, see compareStations) and the findings ordered by
// severity, station rank, object order and check order.
//
// With opts.Samples > 0 it also propagates the uncertainty table by Monte Carlo
// (see montecarlo.go): every object gets a Probability and every station its
// ProbabilityAnyIncendive; the seed (DefaultSeed when 0) and the table used are
// recorded in Audit.Options.
//
// opts.Limits are used as given; a zero Limits takes model.DefaultLimits with the
// Site sheet's overrides (LimitsFromSite) merged, and Audit.Options records them.
//
// Assess is the Streamer with every result collected: there is one engine,
// whether the objects are held in memory or stream through.
func Assess(s *inventory.Survey, opts Options) *Audit {
	st := NewStreamer(s, opts)
	objs := make([]ObjectResult, 0, len(s.Objects))
	for i := 0; i < len(s.Objects); i += AssessBatch {
		objs = append(objs, st.Add(s.Objects[i:min(i+AssessBatch, len(s.Objects))])...)
	}
	a := st.Finish()
	a.Objects = objs
	return a
}

// AssessBatch is the number of objects assessed (and sampled in parallel) at a
// time by Assess; the streaming pipeline uses the same size. Results do not
// depend on it.
const AssessBatch = 1024

// prepare resolves the options (limits from the Site sheet when none are
// given) and the site-wide values every object is assessed with; it returns
// the empty audit and the object context (shared by Assess and Streamer).
func prepare(s *inventory.Survey, opts Options) (*Audit, objectContext) {
	if opts.Limits == (model.Limits{}) {
		opts.Limits = LimitsFromSite(s.Site, model.DefaultLimits())
	}
	a := &Audit{Survey: s, Options: opts, Counts: map[Verdict]int{}}
	for _, v := range []Verdict{Incendive, Marginal, NotAssessed, NonIncendive} {
		a.Counts[v] = 0
	}
	// Site values the reader defaulted (Site.Defaults) or that are still unknown.
	var site []Mark
	margin := DefaultMargin
	if m := s.Site.RequiredMargin; m.Known && m.Value > 0 {
		margin = m.Value
	}
	if m := s.Site.RequiredMargin; !(m.Known && m.Value > 0) || s.Site.Defaulted(inventory.SiteItemRequiredMargin) {
		site = append(site, Mark{Item: ItemRequiredMargin, Prov: ProvEstimated, Label: "Required margin", Value: plain(margin), Reason: "not given on the Site sheet: default site choice (energy must stay below MIE / margin)"})
	} else {
		site = append(site, Mark{Item: ItemRequiredMargin, Prov: ProvOverride, Label: "Required margin", Value: plain(margin), Reason: fmt.Sprintf("Site sheet: replaces the tool's default of %s", plain(DefaultMargin))})
	}
	temperature := DefaultTemperature
	if t := s.Site.AirTemperature; t.Known && t.Value > 0 {
		temperature = t.Value
	}
	if t := s.Site.AirTemperature; !(t.Known && t.Value > 0) || s.Site.Defaulted(inventory.SiteItemAirTemperature) {
		site = append(site, Mark{Item: ItemAirTemperature, Prov: ProvEstimated, Label: "Air temperature", Value: celsius(temperature), Reason: "not given on the Site sheet: default"})
	} else {
		site = append(site, Mark{Item: ItemAirTemperature, Prov: ProvEntered, Label: "Air temperature", Value: celsius(temperature)})
	}
	for _, d := range s.Site.Defaults {
		if d.Item != inventory.SiteItemRequiredMargin && d.Item != inventory.SiteItemAirTemperature {
			site = append(site, Mark{Item: ItemSite, Prov: ProvEstimated, Label: "Site", Value: d.Text, Reason: "Site sheet default"})
		}
	}
	return a, objectContext{survey: s, lim: &opts.Limits, defLim: model.DefaultLimits(), margin: margin, temperature: temperature, siteMarks: site}
}

type objectContext struct {
	survey      *inventory.Survey
	lim         *model.Limits
	defLim      model.Limits // the built-in limits, to tell a Site override from them
	margin      float64
	temperature float64
	siteMarks   []Mark
}

// limitProv is the provenance of a limit used as a value: an override when the
// Site sheet changed it from the built-in value, else the tool's estimate.
func (x *objectContext) limitProv(used, builtIn float64) Provenance {
	if used != builtIn {
		return ProvOverride
	}
	return ProvEstimated
}

// assess judges one object.
func (x *objectContext) assess(o *inventory.Object) ObjectResult {
	r := ObjectResult{Object: *o}
	var defs []Mark
	cause := CauseNone
	causeText := ""

	st, ok := x.survey.Station(o.Station)
	if !ok {
		st = inventory.Station{ID: o.Station}
		cause, causeText = CauseUnknownStation, fmt.Sprintf("station %q is not on the Stations sheet", o.Station)
	}
	r.Station = st
	env, atm, envDefs, envCause, envText := x.environment(&st)
	defs = append(defs, envDefs...)
	if cause == CauseNone && envCause != CauseNone {
		cause, causeText = envCause, envText
	}
	r.Atmosphere = atm
	r.Environment = env

	in, mat, inDefs := x.input(o)
	defs = append(defs, inDefs...)
	if in.Kind == model.Liquid {
		defs = append(defs, liquidFromSubstance(&in, atm)...)
	}
	r.Material = mat
	r.Input = in
	if in.Kind == model.KindUnknown && cause == CauseNone {
		cause, causeText = CauseUnknownKind, fmt.Sprintf("kind %q is not one the model knows", o.Kind)
	}

	r.Eval = model.Evaluate(in, env, *x.lim)
	c := Classify(&r.Input, &r.Environment, &r.Eval, x.lim, x.margin)
	if cause != CauseNone {
		// The station or kind is unusable: nothing is judged, whatever the model says.
		c = Classification{Verdict: NotAssessed, Ratio: math.NaN(), Energy: math.NaN(), Cause: cause}
	} else {
		switch c.Cause {
		case CauseMissingInputs:
			causeText = "the model lacked inputs its kind needs: " + missingText(r.Eval.NotAssessed)
		case CauseNoMIE:
			causeText = "the MIE of the station's atmosphere is not given"
			if atm != nil {
				causeText = fmt.Sprintf("the MIE of atmosphere %s is not given", atm.ID)
			}
		case CauseNoEnergy:
			causeText = "the model gave no discharge energy"
		}
	}
	r.Verdict = c.Verdict
	if !math.IsNaN(c.Ratio) {
		ratio := c.Ratio
		r.Ratio = &ratio
	}
	r.Findings = x.findings(&r, &c)
	defs = append(defs, x.evalDefaults(&r)...)
	r.Marks = dedupeMarks(append(append([]Mark(nil), x.siteMarks...), defs...))
	r.Reason = x.reason(&r, &c, causeText)
	return r
}

// environment builds the model environment of a station.
func (x *objectContext) environment(st *inventory.Station) (model.Environment, *inventory.Atmosphere, []Mark, Cause, string) {
	var defs []Mark
	env := model.Environment{Temperature: x.temperature, MIE: math.NaN()}
	switch {
	case st.RelativeHumidity.Known:
		env.RelativeHumidity = st.RelativeHumidity.Value
		defs = append(defs, Mark{Item: ItemRelativeHumidity, Prov: ProvEntered, Label: "Relative humidity", Value: percent(env.RelativeHumidity), Reason: "the station's RH"})
	case x.survey.Site.RelativeHumidity.Known:
		env.RelativeHumidity = x.survey.Site.RelativeHumidity.Value
		defs = append(defs, Mark{Item: ItemRelativeHumidity, Prov: ProvEntered, Label: "Relative humidity", Value: percent(env.RelativeHumidity), Reason: "the station gives none: the site's RH is used"})
	default:
		env.RelativeHumidity = DryDayHumidity
		defs = append(defs, Mark{Item: ItemRelativeHumidity, Prov: ProvEstimated, Label: "Relative humidity", Value: percent(DryDayHumidity), Reason: "neither the station nor the site gives one: dry-day screening value (documented choice)"})
	}
	if st.Atmosphere == "" {
		return env, nil, defs, CauseNone, ""
	}
	a, ok := x.survey.Atmosphere(st.Atmosphere)
	if !ok {
		return env, nil, defs, CauseUnknownStation, fmt.Sprintf("atmosphere %q of station %s is not on the Atmospheres sheet", st.Atmosphere, st.ID)
	}
	kind, err := model.ParseAtmosphereKind(a.Kind)
	if err != nil {
		return env, &a, defs, CauseUnknownStation, fmt.Sprintf("atmosphere %s has an unknown kind %q", a.ID, a.Kind)
	}
	if kind == model.NoAtmosphere {
		return env, nil, defs, CauseNone, ""
	}
	env.Atmosphere = kind
	env.Group, _ = model.ParseGroup(a.Group)
	env.MIE = a.MIE.OrNaN()
	if a.MIEFromSubstance && a.MIE.Known {
		defs = append(defs, Mark{Item: ItemMIE, Prov: ProvLibrary, Label: "MIE", Value: mJ(a.MIE.Value), Reason: fmt.Sprintf("atmosphere %s: from the built-in substance list (%s)", a.ID, a.Substance)})
	} else if a.MIE.Known {
		defs = append(defs, Mark{Item: ItemMIE, Prov: ProvEntered, Label: "MIE", Value: mJ(a.MIE.Value), Reason: fmt.Sprintf("atmosphere %s", a.ID)})
	}
	if a.GroupFromSubstance && a.Group != "" {
		defs = append(defs, Mark{Item: ItemGroup, Prov: ProvLibrary, Label: "Group", Value: a.Group, Reason: fmt.Sprintf("atmosphere %s: from the built-in substance list (%s)", a.ID, a.Substance)})
	} else if a.Group != "" {
		defs = append(defs, Mark{Item: ItemGroup, Prov: ProvEntered, Label: "Group", Value: a.Group, Reason: fmt.Sprintf("atmosphere %s", a.ID)})
	}
	if e, assumed := env.WithStrictGroup(); assumed {
		// Unknown means the stricter case: the brush screen, transferred charge and area limits of IIC.
		env = e
		defs = append(defs, Mark{Item: ItemGroup, Prov: ProvEstimated, Label: "Group", Value: env.Group.String(), Reason: fmt.Sprintf("atmosphere %s (%s) gives no gas group: assessed as IIC, the strictest group (common practice, no source)", a.ID, kind)})
		if a.Group != "" {
			defs[len(defs)-1].Reason = fmt.Sprintf("atmosphere %s (%s) gives only the dust group %s: its gas is assessed as IIC, the strictest group (common practice, no source)", a.ID, kind, a.Group)
		}
	}
	if strings.TrimSpace(a.Zone) == "" {
		// An unclassified area may have to be treated as the strictest zone (TRGS 723, reference section 11).
		env.Zone = model.Zone0
		if kind == model.Dust {
			env.Zone = model.Zone20
		}
		defs = append(defs, Mark{Item: ItemZone, Prov: ProvEstimated, Label: "Zone", Value: env.Zone.String(), Reason: fmt.Sprintf("atmosphere %s gives no zone: the strictest zone is assumed", a.ID)})
	} else {
		env.Zone, _ = model.ParseZone(a.Zone)
		defs = append(defs, Mark{Item: ItemZone, Prov: ProvEntered, Label: "Zone", Value: a.Zone, Reason: fmt.Sprintf("atmosphere %s", a.ID)})
	}
	return env, &a, defs, CauseNone, ""
}

// input maps a survey row and its material to the model's input.
func (x *objectContext) input(o *inventory.Object) (model.Input, *inventory.Material, []Mark) {
	var defs []Mark
	kind, _ := model.ParseKind(o.Kind)
	in := model.NewInput(kind) // every quantity not given until read from the row
	in.Length = o.Length.OrNaN()
	in.Width = o.Width.OrNaN()
	in.Diameter = o.Diameter.OrNaN()
	in.Thickness = o.Thickness.OrNaN()
	in.EarthedBacking = strings.EqualFold(strings.TrimSpace(o.Backing), "earthed")
	in.DistanceToEarth = o.DistanceToEarth.OrNaN()
	in.Field = o.Field.OrNaN()
	in.FieldDistance = o.FieldDistance.OrNaN()
	in.SurfacePotential = o.SurfacePotential.OrNaN()
	in.Speed = o.Speed.OrNaN()
	in.MassFlow = o.MassFlow.OrNaN()
	in.ChargeToMass = o.ChargeToMass.OrNaN()
	in.ChargingCurrent = o.ChargingCurrent.OrNaN()
	in.ChargingTime = o.ChargingTime.OrNaN()
	in.ParticleSize = o.ParticleSize.OrNaN()
	in.Resistance = o.Resistance.OrNaN()
	in.Capacitance = o.Capacitance.OrNaN()
	in.Conductivity = o.Conductivity.OrNaN()
	in.Permittivity = o.Permittivity.OrNaN()
	in.LayerBreakdown = o.LayerBreakdown.OrNaN()
	// ProductMIE stays NaN: no survey column, the model takes the station's dust MIE.
	in.Process, _ = model.ParseProcess(o.Process)
	in.BagType, _ = model.ParseBagType(o.BagType)
	in.Filling, _ = model.ParseFilling(o.Filling)
	in.VesselMaterial, _ = model.ParseVesselMaterial(o.VesselMaterial)
	in.VesselClass, _ = model.ParseVesselClass(o.VesselClass)
	in.VesselDiameter = o.VesselDiameter.OrNaN()
	in.Filter, _ = model.ParseFilter(o.Filter)
	in.FilterResidence = o.Residence.OrNaN()
	in.SecondPhase, _ = model.ParseSecondPhase(o.SecondPhase)
	in.InletVelocity = o.InletVelocity.OrNaN()
	defs = append(defs, measuredMarks(o)...)
	// Double-layer charge is judged from the process (Process column, charging
	// current density), never from words in the Notes.
	var mat *inventory.Material
	if o.Material != "" {
		if m, ok := x.survey.Material(o.Material); ok {
			mat = &m
			in.Material = model.Material{
				Name:               m.Name,
				Conductive:         strings.EqualFold(m.Class, "conductive"),
				Dissipative:        strings.EqualFold(m.Class, "dissipative"),
				Permittivity:       m.Permittivity,
				SurfaceResistivity: m.SurfaceResistivity,
				HumiditySlope:      m.HumiditySlope,
				VolumeResistivity:  m.VolumeResistivity,
				BreakdownStrength:  m.BreakdownStrength,
			}
			if m.BuiltIn {
				defs = append(defs, Mark{Item: ItemMaterial, Prov: ProvLibrary, Label: "Material", Value: m.Name, Reason: "properties from the built-in list (" + m.Source + ")"})
			} else {
				defs = append(defs, Mark{Item: ItemMaterial, Prov: ProvEntered, Label: "Material", Value: m.Name, Reason: "properties from the survey's Materials sheet"})
			}
		} else {
			in.Material.Name = o.Material
			defs = append(defs, Mark{Item: ItemMaterial, Prov: ProvEstimated, Label: "Material", Value: o.Material, Reason: "not in the built-in list nor the Materials sheet: its properties are unknown"})
		}
	}
	switch kind {
	case model.Bag:
		if in.BagType == model.BagUnknown {
			defs = append(defs, Mark{Item: ItemBagType, Prov: ProvEstimated, Label: "Bag type", Value: "A", Reason: "not given: assessed as the most restrictive case (type A, usable only where every type is)"})
		}
	case model.Liquid:
		if in.Filling == model.FillUnknown {
			defs = append(defs, Mark{Item: ItemFilling, Prov: ProvEstimated, Label: "Filling", Value: "top", Reason: "not given: assessed as top filling without a dip pipe (the most restrictive case)"})
		}
		defs = append(defs, liquidDefaults(&in)...)
	}
	return in, mat, defs
}

// measuredMarks records the values read on the object's row that the audit
// shows with a provenance (the others are plainly the row's columns).
func measuredMarks(o *inventory.Object) []Mark {
	var out []Mark
	add := func(it Item, label string, q inventory.Quantity, text func(float64) string) {
		if q.Known {
			out = append(out, Mark{Item: it, Prov: ProvMeasured, Label: label, Value: text(q.Value)})
		}
	}
	add(ItemCapacitance, "Capacitance", o.Capacitance, pF)
	add(ItemResistance, "Resistance to earth", o.Resistance, ohm)
	add(ItemPotential, "Surface potential", o.SurfacePotential, kV)
	add(ItemChargingCurrent, "Charging current", o.ChargingCurrent, func(v float64) string { return plain(v*1e6) + " µA" })
	add(ItemConductivity, "Conductivity", o.Conductivity, pSm)
	add(ItemPermittivity, "Liquid permittivity", o.Permittivity, plain)
	return out
}

// liquidDefaults records the liquid transfer inputs left blank and the stricter
// case each is assessed as.
func liquidDefaults(in *model.Input) []Mark {
	var defs []Mark
	if in.VesselMaterial == model.VesselMaterialUnknown {
		defs = append(defs, Mark{Item: ItemVesselMaterial, Prov: ProvEstimated, Label: "Vessel material", Value: "unknown", Reason: "not given: the stricter of metal (unearthed, can spark) and insulating (no safe filling limits) for each rule"})
	}
	if in.VesselClass == model.VesselUnknown {
		defs = append(defs, Mark{Item: ItemVesselClass, Prov: ProvEstimated, Label: "Vessel class", Value: "strictest", Reason: "not given: the strictest class's filling limits, and the typical capacitance of the class that gives the largest spark energy"})
	}
	if in.Filter == model.FilterUnknown {
		defs = append(defs, Mark{Item: ItemFilter, Prov: ProvEstimated, Label: "Filter", Value: "fine filter", Reason: "not stated: a fine filter with no residence time after it taken (the stricter case; write none for a plain line)"})
	}
	if in.SecondPhase == model.PhaseUnknown {
		defs = append(defs, Mark{Item: ItemSecondPhase, Prov: ProvEstimated, Label: "Second phase", Value: "present", Reason: "not stated: taken as present (the stricter case; write none when there is none)"})
	}
	// The residence time and the inlet velocity matter only where the model applies
	// their clause: it records them as assumptions when it does.
	return defs
}

// liquidFromSubstance fills a liquid row's unknown conductivity and permittivity
// from the built-in substance of the station's atmosphere, taking the liquid
// filled as the one whose vapour the atmosphere is (a documented choice; a
// contaminated or two-phase liquid can be far less conductive: measure it).
// A conductivity still unknown is assessed as low.
func liquidFromSubstance(in *model.Input, atm *inventory.Atmosphere) []Mark {
	var defs []Mark
	sub, ok := inventory.Substance{}, false
	if atm != nil && atm.Substance != "" {
		sub, ok = inventory.LookupSubstance(atm.Substance)
	}
	if math.IsNaN(in.Conductivity) {
		if ok && sub.Conductivity > 0 {
			in.Conductivity = sub.Conductivity
			in.ConductivityAssumed = true
			defs = append(defs, Mark{Item: ItemConductivity, Prov: ProvLibrary, Label: "Conductivity", Value: pSm(sub.Conductivity) + " (typical) for the filling clauses; conductive for a spark of the liquid", Reason: fmt.Sprintf("not measured: typical value of %s from the built-in substance list (%s); a value not on the row never clears the spark of an isolated conductive liquid (principle 2)", sub.Name, sub.Source)})
		} else {
			defs = append(defs, Mark{Item: ItemConductivity, Prov: ProvEstimated, Label: "Conductivity", Value: "unknown: low (≤ 50 pS/m) for the filling clauses, conductive for a spark of the liquid", Reason: "not given: the stricter case of each (principle 2): the low-conductivity filling limits and liquid-surface brush, and, in an insulating, lined, glass or unknown vessel not earthed, the spark of an isolated conductive liquid"})
		}
	}
	if math.IsNaN(in.Permittivity) && !(in.Material.Permittivity > 0) && ok && sub.Permittivity > 0 {
		in.Permittivity = sub.Permittivity
		defs = append(defs, Mark{Item: ItemPermittivity, Prov: ProvLibrary, Label: "Liquid permittivity", Value: plain(sub.Permittivity), Reason: fmt.Sprintf("not given: typical value of %s from the built-in substance list (%s)", sub.Name, sub.Source)})
	}
	return defs
}

func unknownMaterial() model.Material { return model.UnknownMaterial() }

// evalDefaults lists the defaults the model's result rests on.
func (x *objectContext) evalDefaults(r *ObjectResult) []Mark {
	var defs []Mark
	in, ev := &r.Input, &r.Eval
	if math.IsNaN(in.Capacitance) && ev.Capacitance > 0 && ev.CapacitanceModel != model.CapNone && ev.CapacitanceModel != model.CapMeasured {
		defs = append(defs, Mark{Item: ItemCapacitance, Prov: ProvEstimated, Label: "Capacitance", Value: pF(ev.Capacitance), Reason: "not measured: estimated, " + ev.CapacitanceModel.String()})
	}
	earthingMatters := IsConductorRow(in, ev) || in.Kind == model.Person || (in.Kind == model.Bag && in.BagType == model.BagC)
	if math.IsNaN(in.Resistance) && earthingMatters {
		defs = append(defs, Mark{Item: ItemResistance, Prov: ProvEstimated, Label: "Resistance to earth", Value: "not earthed", Reason: "not measured: taken as not earthed, with no leakage (the stricter case for any measured resistance)"})
	}
	if IsConductorRow(in, ev) && SmallPartExempt(in, &r.Environment, x.lim) && !(in.Resistance <= x.lim.ConductorEarthing) {
		defs = append(defs, Mark{Item: ItemEarthing, Prov: ProvLibrary, Label: "Earthing requirement", Value: "exempt", Reason: fmt.Sprintf("measured capacitance %s below the %s small-part exemption of IEC 60079-0 (from memory): it need not be earthed; its spark energy is still judged", pF(in.Capacitance), pF(SmallPartLimit(&r.Environment, x.lim)))})
	}
	if ev.Flags&model.FlagReadingAboveBreakdown != 0 && !math.IsNaN(ev.ReadingDensity) {
		defs = append(defs, Mark{Item: ItemChargeDensity, Prov: ProvEstimated, Label: "Charge density", Value: uCm2(ev.ChargeDensity), Reason: fmt.Sprintf("the reading inverts to %s, more than air lets the surface hold: capped at the breakdown limit (CCPS glossary; a screening choice of this tool), the reading to be checked", uCm2(ev.ReadingDensity))})
	}
	if ev.Flags&model.FlagMeasuredAboveMaximum != 0 && !math.IsNaN(ev.UncappedPotential) {
		defs = append(defs, Mark{Item: ItemPotential, Prov: ProvEstimated, Label: "Potential used", Value: kV(ev.Potential), Reason: fmt.Sprintf("the reading of %s is beyond what air lets a plant conductor or body hold before it goes into corona (common practice, no source: plant conductors go into corona from edges and bolts at tens of kV): the spark energy and the ranking are taken at the realistic maximum, the reading kept as a contradiction finding", kV(ev.UncappedPotential))})
	}
	if ev.Flags&model.FlagCappedConductor != 0 {
		defs = append(defs, Mark{Item: ItemPotential, Prov: ProvEstimated, Label: "Conductor potential", Value: kV(ev.Potential), Reason: "not measured: the estimate is capped at the realistic plant maximum (corona from edges and bolts; common practice, no source)"})
	}
	if ev.Discharges[model.Brush].Possible {
		defs = append(defs, Mark{Item: ItemBrushEnergy, Prov: x.limitProv(x.lim.BrushEnergy, x.defLim.BrushEnergy), Label: "Brush discharge energy", Value: mJ(x.lim.BrushEnergy), Reason: "equivalent energy of a brush discharge: the upper end of the published 3-4 mJ (documented choice)"})
	}
	if ev.Discharges[model.PropagatingBrush].Possible {
		defs = append(defs, Mark{Item: ItemPropagatingEnergy, Prov: x.limitProv(x.lim.PropagatingMaxEnergy, x.defLim.PropagatingMaxEnergy), Label: "Propagating brush energy", Value: "upper estimate", Reason: fmt.Sprintf("at most %s, the upper end of the published range (hundreds of mJ to J)", mJ(x.lim.PropagatingMaxEnergy))})
	}
	if in.Kind == model.Person && math.IsNaN(in.SurfacePotential) && !math.IsNaN(ev.Potential) {
		defs = append(defs, Mark{Item: ItemPotential, Prov: ProvEstimated, Label: "Body potential", Value: kV(ev.Potential), Reason: "not measured: estimated by the model from the charging current and resistance to earth"})
	}
	if ev.IsolatedConductor && ev.PotentialSource == model.PotentialFromCharge {
		why := "not measured: from the charge the reading shows on the unearthed conducting surface, V = sigma A / C"
		if ev.Flags&model.FlagCappedConductor != 0 && !math.IsNaN(ev.UncappedPotential) {
			why += fmt.Sprintf(" = %s, capped at the realistic plant maximum", kV(ev.UncappedPotential))
		}
		defs = append(defs, Mark{Item: ItemPotential, Prov: ProvEstimated, Label: "Potential", Value: kV(ev.Potential), Reason: why})
	}
	defs = append(defs, modelAssumptions(ev)...)
	return defs
}

// dedupeMarks keeps the first of each Label+Provenance+Reason.
func dedupeMarks(ds []Mark) []Mark {
	out := ds[:0]
	for _, d := range ds {
		dup := false
		for _, o := range out {
			if o.Label == d.Label && o.Prov == d.Prov && o.Reason == d.Reason {
				dup = true
				break
			}
		}
		if !dup {
			out = append(out, d)
		}
	}
	if len(out) == 0 {
		return nil
	}
	return out
}
