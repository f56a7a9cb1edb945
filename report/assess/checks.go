package assess

import (
	"math"
	"sync"

	"github.com/sparkmargin/sparkmargin/model"
)

// Check is one check of the assessment. Each failed check becomes a Finding;
// Classify reports the failed ones as a CheckSet without allocating.
type Check uint8

// The checks, in the order an object's findings are listed.
const (
	// CheckEnergyMIE: the effective discharge energy reaches the atmosphere's MIE.
	CheckEnergyMIE Check = iota
	// CheckEnergyMargin: the energy is below the MIE but reaches MIE / required margin.
	CheckEnergyMargin
	// CheckTransferredCharge: the charge one brush or propagating brush discharge transfers exceeds the gas group's limit.
	CheckTransferredCharge
	// CheckInsulatingArea: the insulating surface exceeds the zone's and group's area limit.
	CheckInsulatingArea
	// CheckConductorEarthing: a conductor's resistance to earth is above the limit or unknown.
	CheckConductorEarthing
	// CheckPersonEarthing: a person's resistance to earth is above the limit in zones 0, 1, 20, 21.
	CheckPersonEarthing
	// CheckShockEnergy: a discharge from the object to a person carries more than the shock energy.
	CheckShockEnergy
	// CheckFillingVelocity: a low-conductivity liquid's v d exceeds the limit of its vessel class (model.ClauseVD).
	CheckFillingVelocity
	// CheckVelocityCeiling: a liquid's flow velocity exceeds the vessel class's ceiling, 7 m/s (model.ClauseCeiling).
	CheckVelocityCeiling
	// CheckSlowStart: a bottom or dip-pipe fill of a low-conductivity liquid faster than 1 m/s until the inlet is submerged (model.ClauseSlowStart).
	CheckSlowStart
	// CheckLowConductivity: a low-conductivity liquid (or one of unknown conductivity) filled into an
	// insulating or glass vessel (or one of unknown material), which the standard gives no safe limits for
	// (model.ClauseInsulatingVessel).
	CheckLowConductivity
	// CheckBagType: the bulk bag's type is not allowed for the atmosphere (IEC 61340-4-4).
	CheckBagType
	// CheckBagEarthing: a type C bag whose earthing is above the limit or unknown.
	CheckBagEarthing
	// CheckBagQualification: conditions outside the qualification of types C and D.
	CheckBagQualification
	// CheckLayerBreakdown: a backed layer holds a voltage above its measured breakdown voltage, or above the thin-film upper strength x thickness: a contradiction to check.
	CheckLayerBreakdown
	// CheckReadingVsHumidity: a reading shows charge above the screen on a surface the humidity model finds dissipative and earthed.
	CheckReadingVsHumidity
	// CheckMeasuredAboveMaximum: a measured conductor or body potential above the
	// realistic maximum, a contradiction between reading and model (the spark is
	// kept, its energy taken at the maximum).
	CheckMeasuredAboveMaximum
	// CheckSplashFilling: top (splash) filling of a low-conductivity liquid (model.ClauseSplash).
	CheckSplashFilling
	// CheckSecondPhase: a liquid with a second phase flows faster than 1 m/s (model.ClauseSecondPhase).
	CheckSecondPhase
	// CheckFilterResidence: too short a residence time after a fine filter (model.ClauseResidence).
	CheckFilterResidence
	// CheckIsolatedLiquid: a conductive liquid in an insulating, lined or unearthed vessel is not
	// earthed through a dip pipe or rod (model.ClauseIsolatedLiquid).
	CheckIsolatedLiquid
	// CheckReadingVsEarthing: a measured conductor potential far above what its measured
	// earthing allows under the worst-case charging current (model.FlagEarthingContradiction).
	CheckReadingVsEarthing
	// CheckReadingAboveBreakdown: a reading above what air lets the surface hold
	// (model.FlagReadingAboveBreakdown); the density used is capped at the breakdown limit.
	CheckReadingAboveBreakdown
	// CheckConeAboveRange: a cone discharge whose silo diameter or particle size lies
	// above Glor's range: the edge value used is a lower bound, never a clearance
	// (principle 3; model.FlagConeAboveRange).
	CheckConeAboveRange
	// CheckConeExtrapolated: above Glor's range the formula, not valid there, reaches
	// the MIE: the cone is taken as able to ignite (the stricter case, principle 2).
	CheckConeExtrapolated
	// NumChecks is the number of checks.
	NumChecks
)

// checkDef is one row of the check table: the stable name, the verdict the
// check alone implies when it fails, and the ground it rests on (standard, clause
// or table and edition, or a screening choice of this tool).
type checkDef struct {
	name     string
	severity Verdict
	basis    string
	// basisOf, where set, gives the ground of a finding from the discharge it
	// judges (the energy checks: each discharge rests on its own source).
	basisOf func(model.DischargeType) string
}

// dischargeGround is the source each discharge's energy rests on, for the
// energy checks' basis.
func dischargeGround(d model.DischargeType) string {
	switch d {
	case model.Spark:
		return "spark energy W = C V²/2 (textbook; JNIOSH-TR)"
	case model.Brush:
		return "brush discharge equivalent energy 3-4 mJ (CLC/TR 50404 summaries; CCPS glossary), the 4 mJ upper end a screening choice of this tool"
	case model.PropagatingBrush:
		return "propagating brush discharge: 2.5e-4 C/m² and the 4 kV layer breakdown criterion (TRGS 727:2016 Annex C; JNIOSH-TR); its energy the layer's stored energy, bounded at 1 J (published range hundreds of mJ to J, from memory)"
	case model.Cone:
		return "cone discharge energy by Glor's formula W = 5.22 D^3.36 d^1.462 mJ (from memory), valid for silo diameters 0.5-3 m and particle sizes 0.1-3 mm, the edge value outside it; preconditions BG RCI FAQ 5.10, TRGS 727:2016 6.2.3, JNIOSH-TR"
	case model.Corona:
		return "corona equivalent energy bound 0.1 mJ, a screening choice of this tool (corona below about 0.1-1 mJ ignites only very sensitive gases such as hydrogen; below 1 mJ confirmed, the rest from memory)"
	}
	return "IEC TS 60079-32-1:2013+A1:2017"
}

// checkTable is the one table that defines each check; adding a check touches it
// and the constant list above.
// checkDefs returns the check table, built once: Severity runs for every
// finding of every Monte Carlo draw, and building the table there was about a
// third of a draw's time. The table is never written after it is built.
var checkDefs = sync.OnceValue(func() *[NumChecks]checkDef {
	t := checkTable()
	return &t
})

func checkTable() [NumChecks]checkDef {
	return [NumChecks]checkDef{
		CheckEnergyMIE: {"energy-vs-mie", Incendive, "effective energy against the atmosphere's MIE: IEC TS 60079-32-1:2013+A1:2017; the discharge's energy on its own ground",
			func(d model.DischargeType) string {
				return "effective energy against the atmosphere's MIE (IEC TS 60079-32-1:2013+A1:2017); " + dischargeGround(d)
			}},
		CheckEnergyMargin: {"energy-vs-margin", Marginal, "the site's required margin below the MIE: a site choice (default 10), not a standard value",
			func(d model.DischargeType) string {
				return "the site's required margin below the MIE: a site choice (default 10), not a standard value; " + dischargeGround(d)
			}},
		CheckTransferredCharge:     {"transferred-charge", Incendive, "IEC 60079-0:2017 cl. 7.4.2 transferred-charge limits (gas groups 60/25/10 nC; Group III 200 nC against propagating brush discharges; from memory), test method IEC 60079-32-2:2015", nil},
		CheckInsulatingArea:        {"insulating-area", Marginal, "IEC 60079-0:2017 cl. 7.4 insulating surface area limits by EPL and group (from memory)", nil},
		CheckConductorEarthing:     {"conductor-earthing", Marginal, "TRGS 727:2016 cl. 8.3 and IEC TS 60079-32-1:2013+A1:2017: conductors to earth below 1 MΩ; small parts below the IEC 60079-0:2017 capacitance exemption excepted", nil},
		CheckPersonEarthing:        {"person-earthing", Marginal, "TRGS 727:2016 cl. 7.2: person to earth at most 100 MΩ in zones 0, 1, 20, 21 where the MIE is at most 10 mJ", nil},
		CheckShockEnergy:           {"shock-energy", Marginal, "TRGS 727:2016 Annex D: shock hazard to people above 350 mJ", nil},
		CheckFillingVelocity:       {"filling-velocity", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), v d limits by vessel class (road tanker 0.38/0.5 m²/s at 10 pS/m confirmed; other classes from memory)", nil},
		CheckVelocityCeiling:       {"velocity-ceiling", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), velocity ceiling 7 m/s (from memory)", nil},
		CheckSlowStart:             {"slow-start", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), initial filling velocity 1 m/s until the inlet is submerged (from memory)", nil},
		CheckLowConductivity:       {"low-conductivity", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), insulating containers: no safe filling limits for a low-conductivity liquid (<= 50 pS/m) (from memory)", nil},
		CheckBagType:               {"bag-type", Marginal, "IEC 61340-4-4:2018 usage table of bulk bag types", nil},
		CheckBagEarthing:           {"bag-earthing", Marginal, "IEC 61340-4-4:2018: type C bag tab to earth below 1 MΩ while filling and emptying", nil},
		CheckBagQualification:      {"bag-qualification", Marginal, "IEC 61340-4-4:2018: type C and D qualification assumes MIE >= 0.14 mJ and charging current <= 3 µA", nil},
		CheckLayerBreakdown:        {"layer-breakdown-contradiction", Marginal, "TRGS 727:2016 Annex C (4 kV layer breakdown criterion, measured on the layer); thin films hold at most about 600 kV/mm (secondary sources; a bulk strength x thickness does not apply to films and is not used); a layer holding more than its measured breakdown or that bound is a contradiction between reading and model, the reading kept (a screening choice of this tool)", nil},
		CheckReadingVsHumidity:     {"reading-vs-humidity", Marginal, "a screening choice of this tool: a measurement beats the humidity model (the reading's hazard is kept until the reading is checked)", nil},
		CheckSplashFilling:         {"splash-filling", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), top and splash filling of low-conductivity liquids (from memory)", nil},
		CheckSecondPhase:           {"second-phase-velocity", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), two-phase flow: 1 m/s (from memory; 1000 pS/m confirmed)", nil},
		CheckFilterResidence:       {"filter-residence", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), filters: residence time after a fine filter (from memory)", nil},
		CheckIsolatedLiquid:        {"isolated-liquid", Marginal, "IEC TS 60079-32-1:2013+A1:2017 clause 7 (liquids), conductive liquids in insulating containers: earth through a dip pipe or rod", nil},
		CheckReadingVsEarthing:     {"reading-vs-earthing", Marginal, "a screening choice of this tool: a measurement beats the model (a measured potential more than \"earthing contradiction factor\" (10) times the I R its measured earthing allows under the worst-case charging current, 1 µA walking for a person (Jonassen), 100 µA otherwise (JNIOSH-TR), contradicts the earthing path; the reading's hazard is kept)", nil},
		CheckReadingAboveBreakdown: {"reading-above-breakdown", Marginal, "air breaks down at about 3 MV/m, so a surface holds at most eps0 x 3 MV/m with its field on one side, twice that as a free sheet (CCPS glossary; AMS Glossary of Meteorology); a reading above it is a bad reading or unit: the charge density used is capped at that limit, a screening choice of this tool (the reading's hazard is kept)", nil},
		CheckConeAboveRange:        {"cone-above-range", Marginal, "Glor's cone discharge formula (from memory), valid for silo diameters 0.5-3 m and median particle sizes 0.1-3 mm; outside its range the formula is not valid (BG RCI FAQ 5.10, TRGS 727:2016 6.2.3): the value at the edge of the range is used and, above the range, is a lower bound, so it never clears (a screening choice of this tool)", nil},
		CheckConeExtrapolated:      {"cone-extrapolated-reaches-mie", Incendive, "Glor's cone discharge formula (from memory) evaluated beyond its range (D 0.5-3 m, d 0.1-3 mm), where it is not valid, reaches the MIE: as the energy rises with D and d, the discharge is taken as able to ignite (unknown means the stricter case; a screening choice of this tool)", nil},
		CheckMeasuredAboveMaximum:  {"measured-potential-above-maximum", Marginal, "a screening choice of this tool: a measured potential above the realistic maximum (a plant conductor about 50 kV, common practice, no source; a body the walking-test maximum) contradicts what air lets it hold (conductors go into corona from edges and bolts at tens of kV); the spark is kept, its energy taken at the maximum", nil},
	}
}

// Name returns the stable kebab-case name of the check, used in findings, JSON and mitigation keys.
func (c Check) Name() string {
	if c >= NumChecks {
		return "unknown"
	}
	return checkDefs()[c].name
}

// Severity returns the verdict the check alone implies when it fails: Incendive
// for the energy reaching the MIE and for transferred charge, Marginal for the rest.
func (c Check) Severity() Verdict {
	if c >= NumChecks {
		return Marginal
	}
	return checkDefs()[c].severity
}

// Basis returns the ground the check rests on: the standard, clause or table and
// edition, or "a screening choice of this tool". Findings carry it.
func (c Check) Basis() string {
	if c >= NumChecks {
		return ""
	}
	return checkDefs()[c].basis
}

// BasisFor returns the ground a finding of the check rests on when it judges
// discharge d: the energy checks name the discharge's own source (a spark's W =
// C V^2/2, a brush's 3-4 mJ, a propagating brush's TRGS 727 criterion and its
// energy bound from memory, Glor's formula and its range for a cone, the corona
// bound); the others their fixed basis.
func (c Check) BasisFor(d model.DischargeType) string {
	if c >= NumChecks {
		return ""
	}
	def := checkDefs()[c]
	if def.basisOf != nil {
		return def.basisOf(d)
	}
	return def.basis
}

// CheckSet is a bit set of checks.
type CheckSet uint32

// Has reports whether c is in the set.
func (s CheckSet) Has(c Check) bool { return s&(1<<c) != 0 }

// Add returns the set with c added.
func (s CheckSet) Add(c Check) CheckSet { return s | 1<<c }

// Cause says why an object is not assessed.
type Cause uint8

// Causes of a "not assessed" verdict.
const (
	// CauseNone: the object was assessed.
	CauseNone Cause = iota
	// CauseMissingInputs: the model lacked inputs its kind needs (Evaluation.NotAssessed).
	CauseMissingInputs
	// CauseNoMIE: the station has an atmosphere whose MIE is not known.
	CauseNoMIE
	// CauseNoEnergy: the model gave no usable energy (NaN) though it reported no missing input.
	CauseNoEnergy
	// CauseUnknownStation: the object's station, or the station's atmosphere, is not in the survey.
	CauseUnknownStation
	// CauseUnknownKind: the object's kind is not one the model knows.
	CauseUnknownKind
)

// Classification is the verdict of one object and what led to it. Classify fills it
// without allocating, so it can run once per Monte Carlo sample.
type Classification struct {
	Verdict Verdict
	Failed  CheckSet
	// Ratio is Energy / MIE; NaN where there is no atmosphere or its MIE is unknown.
	Ratio float64
	// Energy is the effective discharge energy compared with the MIE (J), and
	// Discharge the discharge that gives it (meaningful when Energy > 0).
	Energy    float64
	Discharge model.DischargeType
	// Cause says why the energy could not be judged (CauseNone when it could).
	Cause Cause
}

// Classify judges one evaluated object against its environment and limits.
// margin is the site's required margin (energy must stay below MIE / margin).
// It is pure and allocation-free: the Monte Carlo sampler calls it per sample.
//
// Verdict logic: the worst severity among the failed checks (incendive: energy
// reaches the MIE, or the transferred charge exceeds the group's limit; marginal:
// energy reaches MIE / margin, a requirement is not met, or the shock energy is
// exceeded). With no failed check it is non-incendive, unless the energy could
// not be judged (missing inputs, unknown MIE), when it is not assessed. A failed
// requirement outranks "not assessed": a person on insulating footwear in zone 1
// is marginal even when the body potential could not be computed.
//
// Where the station has no atmosphere only the shock check applies (the earthing,
// area, liquid and bag requirements are explosion-protection requirements).
func Classify(in *model.Input, env *model.Environment, ev *model.Evaluation, lim *model.Limits, margin float64) Classification {
	c := Classification{Verdict: NonIncendive, Ratio: math.NaN(), Energy: math.NaN()}
	hasAtm := env.Atmosphere != model.NoAtmosphere

	// With inputs missing, the discharges the model could evaluate still give a
	// lower bound on the effective energy: one that reaches the MIE (or the margin)
	// is a finding whatever the missing inputs would add (a known hazard is never
	// hidden behind "not assessed").
	lowerBound := math.NaN()
	if ev.NotAssessed != 0 {
		c.Cause = CauseMissingInputs
		if e, _ := EffectiveEnergy(env, ev, lim); e > 0 {
			lowerBound = e
		}
	} else {
		c.Energy, c.Discharge = EffectiveEnergy(env, ev, lim)
		if math.IsNaN(c.Energy) {
			c.Cause = CauseNoEnergy
		}
	}

	if hasAtm {
		mie := env.MIE
		switch {
		case c.Cause == CauseNone && (!(mie > 0) || math.IsInf(mie, 0)):
			c.Cause = CauseNoMIE
		case c.Cause == CauseNone:
			c.Ratio = c.Energy / mie
			switch {
			case c.Energy >= mie:
				c.Failed = c.Failed.Add(CheckEnergyMIE)
			case margin > 0 && c.Energy >= mie/margin:
				c.Failed = c.Failed.Add(CheckEnergyMargin)
			}
		case lowerBound > 0 && mie > 0:
			switch {
			case lowerBound >= mie:
				c.Failed = c.Failed.Add(CheckEnergyMIE)
			case margin > 0 && lowerBound >= mie/margin:
				c.Failed = c.Failed.Add(CheckEnergyMargin)
			}
			if c.Failed.Has(CheckEnergyMIE) || c.Failed.Has(CheckEnergyMargin) {
				c.Energy, c.Discharge = EffectiveEnergy(env, ev, lim)
				c.Ratio = c.Energy / mie
			}
		}
		if q, limQ := ChargeAgainstLimit(env, ev), TransferredChargeLimit(env, lim); q > limQ {
			c.Failed = c.Failed.Add(CheckTransferredCharge)
		}
		// Type C and D bags are qualified by their own test, not by an area limit.
		qualifiedBag := in.Kind == model.Bag && (in.BagType == model.BagC || in.BagType == model.BagD)
		// The area limits are equipment-construction limits (IEC 60079-0): process
		// material (moving webs, belts) is judged by its charge (IEC TS 60079-32-1),
		// and only a dissipative surface that is also earthed is exempt (not when its reading contradicts the humidity model).
		if a, limA := ev.InsulatingArea, InsulatingAreaLimit(env, lim); !(ev.Dissipative && ev.Earthed && ev.Flags&model.FlagHumidityContradiction == 0) && !ev.ProcessMaterial && !qualifiedBag && !CoatingExempt(in, env, ev, lim) && a > limA {
			c.Failed = c.Failed.Add(CheckInsulatingArea)
		}
		isolatedLiquid := in.Kind == model.Liquid && ev.LiquidBreaches.Has(model.ClauseIsolatedLiquid)
		if IsConductorRow(in, ev) && !(in.Resistance <= lim.ConductorEarthing) && !SmallPartExempt(in, env, lim) && !isolatedLiquid {
			c.Failed = c.Failed.Add(CheckConductorEarthing)
		}
		if PersonEarthingApplies(in, env, lim) && !(in.Resistance <= lim.PersonEarthing) {
			c.Failed = c.Failed.Add(CheckPersonEarthing)
		}
		if in.Kind == model.Liquid {
			// model.Evaluate judges the filling clauses of the vessel class; each clause not met is a check.
			for _, lc := range liquidChecks {
				if ev.LiquidBreaches.Has(lc.clause) {
					c.Failed = c.Failed.Add(lc.check)
				}
			}
		}
		// Contradictions between a reading and a model or a breakdown value
		// (principle 1: the reading's hazard is kept, the contradiction reported).
		if ev.Flags&model.FlagBreakdownContradiction != 0 {
			c.Failed = c.Failed.Add(CheckLayerBreakdown)
		}
		if ev.Flags&model.FlagHumidityContradiction != 0 {
			c.Failed = c.Failed.Add(CheckReadingVsHumidity)
		}
		if in.Kind == model.Bag {
			// model.Evaluate applies the IEC 61340-4-4 usage table (model.BagTypeAllowed); a
			// refusal only for an MIE below the C/D qualification is CheckBagQualification's.
			if !ev.BagAllowed && ev.BagCode != model.ReasonBagBelowQualifiedMIE {
				c.Failed = c.Failed.Add(CheckBagType)
			}
			if in.BagType == model.BagC && !(in.Resistance <= lim.BagTabToEarth) {
				c.Failed = c.Failed.Add(CheckBagEarthing)
			}
			if (in.BagType == model.BagC || in.BagType == model.BagD) &&
				(env.MIE < lim.BagMinMIE || BagChargingCurrent(in, ev) > lim.BagMaxCurrent) {
				c.Failed = c.Failed.Add(CheckBagQualification)
			}
		}
	}
	if ShockEnergy(in, ev) > lim.ShockEnergy {
		c.Failed = c.Failed.Add(CheckShockEnergy)
	}
	// Readings that contradict the model or physics (principle 1: the reading's
	// hazard is kept, the contradiction reported wherever the object is).
	if ev.Flags&model.FlagMeasuredAboveMaximum != 0 {
		c.Failed = c.Failed.Add(CheckMeasuredAboveMaximum)
	}
	// The earthing contradiction only where an unknown resistance would itself be a
	// finding (an earthing requirement applies), so that an unknown resistance is
	// never milder than a measured one.
	if ev.Flags&model.FlagEarthingContradiction != 0 && EarthingRequired(in, env, ev, lim) {
		c.Failed = c.Failed.Add(CheckReadingVsEarthing)
	}
	if ev.Flags&model.FlagReadingAboveBreakdown != 0 {
		c.Failed = c.Failed.Add(CheckReadingAboveBreakdown)
	}
	// Above Glor's range the cone's edge value is a lower bound: never a clearance.
	if hasAtm && ev.Flags&model.FlagConeAboveRange != 0 && ev.Discharges[model.Cone].Possible {
		c.Failed = c.Failed.Add(CheckConeAboveRange)
		if env.MIE > 0 && ev.ConeExtrapolated >= env.MIE {
			c.Failed = c.Failed.Add(CheckConeExtrapolated)
		}
	}

	worst := -1
	for k := Check(0); k < NumChecks; k++ {
		if c.Failed.Has(k) && k.Severity().Severity() > worst {
			worst = k.Severity().Severity()
			c.Verdict = k.Severity()
		}
	}
	if worst < 0 && c.Cause != CauseNone {
		c.Verdict = NotAssessed
	}
	return c
}

// EffectiveEnergy returns the largest energy among the possible discharges and its
// type, from the model's result. A brush discharge is not compared with a pure dust
// cloud of MIE at or above Limits.DustBrushMIE (it does not ignite one: CCPS
// glossary, reference sections 3 and 12); should the model offer one there, the
// next largest discharge is taken instead. 0 when none is possible.
func EffectiveEnergy(env *model.Environment, ev *model.Evaluation, lim *model.Limits) (float64, model.DischargeType) {
	if model.BrushIgnites(*env, *lim) || ev.Effective != model.Brush || !(ev.EffectiveEnergy > 0) {
		return ev.EffectiveEnergy, ev.Effective
	}
	e, t := 0.0, model.Spark
	for i := range ev.Discharges {
		d := &ev.Discharges[i]
		if d.Type == model.Brush || !d.Possible || (d.Type == model.Corona && !model.CoronaIgnites(*env, *lim)) {
			continue
		}
		if d.Energy > e {
			e, t = d.Energy, d.Type
		}
	}
	return e, t
}

// ChargeAgainstLimit returns the charge compared with the transferred-charge
// limit: in a gas, vapour, mist or hybrid atmosphere the largest charge of a
// possible brush or propagating brush discharge (InsulatorCharge); in a dust
// atmosphere that of a possible propagating brush discharge only, the discharge
// the Group III limit of IEC 60079-0 is set against (brush discharges do not ignite
// dust clouds). NaN when none.
func ChargeAgainstLimit(env *model.Environment, ev *model.Evaluation) float64 {
	if env.Atmosphere != model.Dust {
		return InsulatorCharge(ev)
	}
	if d := &ev.Discharges[model.PropagatingBrush]; d.Possible {
		return d.Charge
	}
	return math.NaN()
}

// EarthingRequired reports whether an earthing requirement applies to the row, so
// that an unknown resistance to earth is itself a finding: a conductor row (not a
// small part exempt by its measured capacitance) or a type C bag where the station
// has an atmosphere, or a person where PersonEarthingApplies.
func EarthingRequired(in *model.Input, env *model.Environment, ev *model.Evaluation, lim *model.Limits) bool {
	if env.Atmosphere == model.NoAtmosphere {
		return false
	}
	switch {
	case PersonEarthingApplies(in, env, lim):
		return true
	case in.Kind == model.Bag:
		return in.BagType == model.BagC
	}
	return IsConductorRow(in, ev) && !SmallPartExempt(in, env, lim)
}

// CoatingExempt reports whether an insulating layer on an earthed backing is a
// coating that IEC 60079-0 does not hold to the insulating-area limit: no thicker
// than Limits.CoatingThickness (2 mm, IIA and IIB) or CoatingThicknessIIC (0.2 mm,
// IIC; from memory), and of breakdown voltage measured on the layer at most
// Limits.PropagatingBreakdown (4 kV, IEC 60079-0:2017 foreword, confirmed). An
// unmeasured breakdown never exempts (principle 2), nor one the row's reading
// contradicts (principle 1). Its charge is still judged (brush, propagating brush).
func CoatingExempt(in *model.Input, env *model.Environment, ev *model.Evaluation, lim *model.Limits) bool {
	if !in.EarthedBacking || ev.BreakdownSource != model.BreakdownMeasured || ev.Flags&model.FlagBreakdownContradiction != 0 {
		return false
	}
	limT := lim.CoatingThickness
	if e, _ := env.WithStrictGroup(); e.Group == model.IIC {
		limT = lim.CoatingThicknessIIC
	}
	return in.Thickness > 0 && in.Thickness <= limT && ev.LayerBreakdown <= lim.PropagatingBreakdown
}

// SmallPartExempt reports whether a conductor row is exempt from earthing as a
// small isolated metal part: its measured capacitance is below the IEC 60079-0
// exemption (Limits.SmallPartCapacitanceIIC, about 3 pF, for group IIC or zone 0
// (EPL Ga); Limits.SmallPartCapacitance, about 10 pF, otherwise; from memory). Only
// a measured capacitance exempts: an estimate may not clear a requirement. The
// spark energy is still judged against the MIE.
func SmallPartExempt(in *model.Input, env *model.Environment, lim *model.Limits) bool {
	limC := SmallPartLimit(env, lim)
	return in.Capacitance > 0 && !in.CapacitanceEstimated && in.Capacitance < limC
}

// SmallPartLimit returns the capacitance below which an isolated metal part need
// not be earthed in the environment (see SmallPartExempt).
func SmallPartLimit(env *model.Environment, lim *model.Limits) float64 {
	if e, _ := env.WithStrictGroup(); e.Group == model.IIC || env.Zone == model.Zone0 {
		return lim.SmallPartCapacitanceIIC
	}
	return lim.SmallPartCapacitance
}

// InsulatorCharge returns the largest charge (C) that a possible brush or
// propagating brush discharge transfers, the discharges of insulating surfaces
// the transferred-charge limits of IEC 60079-0 were set for (their test, IEC
// 60079-32-2, is made on non-metallic materials); NaN when none is possible.
// A spark from a conductor is judged by its energy instead: applied to sparks the
// charge limit would call a 100 pF body at 1 kV (50 µJ, a fifth of a solvent's MIE)
// incendive. The charge of a spark is still shown (Evaluation.TransferredCharge).
// This departs from design/model.md (conductors, step 4), on purpose.
func InsulatorCharge(ev *model.Evaluation) float64 {
	q := math.NaN()
	for _, t := range [...]model.DischargeType{model.Brush, model.PropagatingBrush} {
		if d := &ev.Discharges[t]; d.Possible && !math.IsNaN(d.Charge) && (math.IsNaN(q) || d.Charge > q) {
			q = d.Charge
		}
	}
	return q
}

// TransferredChargeLimit returns the transferred-charge limit (C) for the
// atmosphere's group: the EPL Gb/Gc value of the gas group in zones 1 and 2 (and
// unzoned), times ZoneZeroChargeFactor in zone 0; for a dust atmosphere the Group
// III value (200 nC, compared with propagating brush charges only, see
// ChargeAgainstLimit); +Inf where none applies. A gas, vapour, mist or hybrid
// atmosphere with no group is taken as IIC (model.Environment.WithStrictGroup).
func TransferredChargeLimit(env *model.Environment, lim *model.Limits) float64 {
	if env.Atmosphere == model.NoAtmosphere {
		return math.Inf(1)
	}
	e, _ := env.WithStrictGroup()
	g := e.Group
	if e.Atmosphere == model.Dust && !g.Dust() {
		g = model.IIIA // the Group III limit is the same for IIIA, IIIB and IIIC
	}
	if !isGasGroup(g) && !g.Dust() {
		return math.Inf(1)
	}
	q := lim.TransferredCharge[g]
	if !(q > 0) {
		return math.Inf(1)
	}
	if isGasGroup(g) && e.Zone == model.Zone0 && lim.ZoneZeroChargeFactor > 0 {
		q *= lim.ZoneZeroChargeFactor
	}
	return q
}

// InsulatingAreaLimit returns the insulating-surface area limit (m^2) for the
// zone and gas group: EPL Ga in zone 0, Gb/Gc in zones 1 and 2; +Inf elsewhere
// (dust zones have no area limit, since brush discharges do not ignite dust clouds).
func InsulatingAreaLimit(env *model.Environment, lim *model.Limits) float64 {
	if env.Atmosphere == model.NoAtmosphere {
		return math.Inf(1)
	}
	if e, assumed := env.WithStrictGroup(); assumed {
		env = &e // a blank gas group is assessed as IIC
	}
	if !isGasGroup(env.Group) {
		return math.Inf(1)
	}
	var a float64
	switch env.Zone {
	case model.Zone0:
		a = lim.AreaGa[env.Group]
	case model.Zone1, model.Zone2:
		a = lim.AreaGb[env.Group]
	default:
		return math.Inf(1)
	}
	if !(a > 0) {
		return math.Inf(1)
	}
	return a
}

func isGasGroup(g model.Group) bool { return g == model.IIA || g == model.IIB || g == model.IIC }

// IsConductorRow reports whether the row describes a conductor that must be earthed:
// a part or container, a roller the model assesses as a conductor
// (model.RollerIsConductor), a liquid row (its line and receiving container), or a
// powder row that gives the receiving container's resistance or capacitance.
func IsConductorRow(in *model.Input, ev *model.Evaluation) bool {
	switch in.Kind {
	case model.Part, model.Container, model.Liquid:
		return true
	case model.Roller:
		return model.RollerIsConductor(*in) || ev.IsolatedConductor
	case model.Sheet, model.Belt:
		// A conducting surface that is not earthed (model.Evaluation.IsolatedConductor).
		return ev.IsolatedConductor
	case model.Powder:
		return !math.IsNaN(in.Resistance) || !math.IsNaN(in.Capacitance)
	}
	return false
}

// PersonEarthingApplies reports whether the person-to-earth limit applies: a
// person in zone 0, 1, 20 or 21 where the MIE is at most PersonEarthingMIE
// (10 mJ; TRGS 727 7.2). An unknown MIE is taken as low enough.
func PersonEarthingApplies(in *model.Input, env *model.Environment, lim *model.Limits) bool {
	if in.Kind != model.Person || env.Atmosphere == model.NoAtmosphere {
		return false
	}
	switch env.Zone {
	case model.Zone0, model.Zone1, model.Zone20, model.Zone21:
		return !(env.MIE > lim.PersonEarthingMIE)
	}
	return false
}

// ShockEnergy returns the energy (J) a person touching the object could receive:
// the stored energy C V^2 / 2 of a touchable conductor (person, part, container,
// conductive roller, the receiving container of a liquid or powder row, a bag the
// model treats as a conductor) and the energy of a possible propagating brush
// discharge from an insulating layer (webs and belts are touched too). NaN when
// neither applies. Corona, brush and cone discharges stay far below the shock limit.
func ShockEnergy(in *model.Input, ev *model.Evaluation) float64 {
	e := math.NaN()
	switch in.Kind {
	case model.Person, model.Part, model.Container, model.Roller, model.Liquid, model.Powder, model.Bag, model.Sheet, model.Belt:
		if !math.IsNaN(ev.StoredEnergy) {
			e = ev.StoredEnergy
		}
	}
	if d := &ev.Discharges[model.PropagatingBrush]; d.Possible && !math.IsNaN(d.Energy) && (math.IsNaN(e) || d.Energy > e) {
		e = d.Energy
	}
	return e
}

// liquidChecks maps each liquid filling clause the model judges to its check.
var liquidChecks = [...]struct {
	clause model.LiquidClause
	check  Check
}{
	{model.ClauseVD, CheckFillingVelocity},
	{model.ClauseCeiling, CheckVelocityCeiling},
	{model.ClauseSlowStart, CheckSlowStart},
	{model.ClauseSplash, CheckSplashFilling},
	{model.ClauseSecondPhase, CheckSecondPhase},
	{model.ClauseResidence, CheckFilterResidence},
	{model.ClauseInsulatingVessel, CheckLowConductivity},
	{model.ClauseIsolatedLiquid, CheckIsolatedLiquid},
}

// LiquidClauseOf returns the model clause a liquid check judges; ok false for other checks.
func LiquidClauseOf(k Check) (model.LiquidClause, bool) {
	for _, lc := range liquidChecks {
		if lc.check == k {
			return lc.clause, true
		}
	}
	return 0, false
}

// VelocityDiameter returns a liquid's v d product (m^2/s): the model's, or Speed x Diameter.
func VelocityDiameter(in *model.Input, ev *model.Evaluation) float64 {
	if !math.IsNaN(ev.VelocityDiameter) && ev.VelocityDiameter != 0 {
		return ev.VelocityDiameter
	}
	return in.Speed * in.Diameter
}

// AssessedBagType returns the type a bag is assessed as: its own, or type A (the
// most restrictive case, usable only where every type is) when none is given.
func AssessedBagType(t model.BagType) model.BagType {
	if t == model.BagUnknown {
		return model.BagA
	}
	return t
}

// BagChargingCurrent returns the charging current of a bag row (A): the model's,
// else the row's, else mass flow x charge-to-mass; NaN when unknown.
func BagChargingCurrent(in *model.Input, ev *model.Evaluation) float64 {
	if !math.IsNaN(ev.ChargingCurrent) && ev.ChargingCurrent != 0 {
		return math.Abs(ev.ChargingCurrent)
	}
	if !math.IsNaN(in.ChargingCurrent) {
		return math.Abs(in.ChargingCurrent)
	}
	return math.Abs(in.MassFlow * in.ChargeToMass)
}
