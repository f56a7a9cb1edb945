package assess

import (
	"math"

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
	// CheckSplashFilling: top (splash) filling of a low-conductivity liquid (model.ClauseSplash).
	CheckSplashFilling
	// CheckSecondPhase: a liquid with a second phase flows faster than 1 m/s (model.ClauseSecondPhase).
	CheckSecondPhase
	// CheckFilterResidence: too short a residence time after a fine filter (model.ClauseResidence).
	CheckFilterResidence
	// CheckIsolatedLiquid: a conductive liquid in an insulating, lined or unearthed vessel is not
	// earthed through a dip pipe or rod (model.ClauseIsolatedLiquid).
	CheckIsolatedLiquid
	// NumChecks is the number of checks.
	NumChecks
)

// Name returns the stable kebab-case name of the check, used in findings, JSON and mitigation keys.
func (c Check) Name() string {
	switch c {
	case CheckEnergyMIE:
		return "energy-vs-mie"
	case CheckEnergyMargin:
		return "energy-vs-margin"
	case CheckTransferredCharge:
		return "transferred-charge"
	case CheckInsulatingArea:
		return "insulating-area"
	case CheckConductorEarthing:
		return "conductor-earthing"
	case CheckPersonEarthing:
		return "person-earthing"
	case CheckShockEnergy:
		return "shock-energy"
	case CheckFillingVelocity:
		return "filling-velocity"
	case CheckVelocityCeiling:
		return "velocity-ceiling"
	case CheckSlowStart:
		return "slow-start"
	case CheckLowConductivity:
		return "low-conductivity"
	case CheckBagType:
		return "bag-type"
	case CheckBagEarthing:
		return "bag-earthing"
	case CheckBagQualification:
		return "bag-qualification"
	case CheckSplashFilling:
		return "splash-filling"
	case CheckSecondPhase:
		return "second-phase-velocity"
	case CheckFilterResidence:
		return "filter-residence"
	case CheckIsolatedLiquid:
		return "isolated-liquid"
	}
	return "unknown"
}

// Severity returns the verdict the check alone implies when it fails: Incendive
// for the energy reaching the MIE and for transferred charge, Marginal for the rest.
func (c Check) Severity() Verdict {
	switch c {
	case CheckEnergyMIE, CheckTransferredCharge:
		return Incendive
	}
	return Marginal
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

	if ev.NotAssessed != 0 {
		c.Cause = CauseMissingInputs
	} else {
		c.Energy, c.Discharge = EffectiveEnergy(env, ev)
		if math.IsNaN(c.Energy) {
			c.Cause = CauseNoEnergy
		}
	}

	if hasAtm {
		if c.Cause == CauseNone {
			mie := env.MIE
			if !(mie > 0) || math.IsInf(mie, 0) {
				c.Cause = CauseNoMIE
			} else {
				c.Ratio = c.Energy / mie
				switch {
				case c.Energy >= mie:
					c.Failed = c.Failed.Add(CheckEnergyMIE)
				case margin > 0 && c.Energy >= mie/margin:
					c.Failed = c.Failed.Add(CheckEnergyMargin)
				}
			}
		}
		if q, limQ := InsulatorCharge(ev), TransferredChargeLimit(env, lim); q > limQ {
			c.Failed = c.Failed.Add(CheckTransferredCharge)
		}
		// Type C and D bags are qualified by their own test, not by an area limit.
		qualifiedBag := in.Kind == model.Bag && (in.BagType == model.BagC || in.BagType == model.BagD)
		if a, limA := ev.InsulatingArea, InsulatingAreaLimit(env, lim); !ev.Dissipative && !qualifiedBag && a > limA {
			c.Failed = c.Failed.Add(CheckInsulatingArea)
		}
		isolatedLiquid := in.Kind == model.Liquid && ev.LiquidBreaches.Has(model.ClauseIsolatedLiquid)
		if IsConductorRow(in, ev) && !(in.Resistance <= lim.ConductorEarthing) && !isolatedLiquid {
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
// cloud (it does not ignite one: CCPS glossary, reference section 3); should the model
// offer one there, the next largest discharge is taken instead. 0 when none is possible.
func EffectiveEnergy(env *model.Environment, ev *model.Evaluation) (float64, model.DischargeType) {
	if env.Atmosphere != model.Dust || ev.Effective != model.Brush || !(ev.EffectiveEnergy > 0) {
		return ev.EffectiveEnergy, ev.Effective
	}
	e, t := 0.0, model.Spark
	for i := range ev.Discharges {
		d := &ev.Discharges[i]
		if d.Type == model.Brush || !d.Possible {
			continue
		}
		if d.Energy > e {
			e, t = d.Energy, d.Type
		}
	}
	return e, t
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
// atmosphere's gas group: the EPL Gb/Gc value in zones 1 and 2 (and unzoned), times
// ZoneZeroChargeFactor in zone 0; +Inf where none applies (dust groups, no group).
func TransferredChargeLimit(env *model.Environment, lim *model.Limits) float64 {
	if env.Atmosphere == model.NoAtmosphere || !isGasGroup(env.Group) {
		return math.Inf(1)
	}
	q := lim.TransferredCharge[env.Group]
	if !(q > 0) {
		return math.Inf(1)
	}
	if env.Zone == model.Zone0 && lim.ZoneZeroChargeFactor > 0 {
		q *= lim.ZoneZeroChargeFactor
	}
	return q
}

// InsulatingAreaLimit returns the insulating-surface area limit (m^2) for the
// zone and gas group: EPL Ga in zone 0, Gb/Gc in zones 1 and 2; +Inf elsewhere
// (dust zones have no area limit, since brush discharges do not ignite dust clouds).
func InsulatingAreaLimit(env *model.Environment, lim *model.Limits) float64 {
	if env.Atmosphere == model.NoAtmosphere || !isGasGroup(env.Group) {
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
		return model.RollerIsConductor(*in)
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
	case model.Person, model.Part, model.Container, model.Roller, model.Liquid, model.Powder, model.Bag:
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
