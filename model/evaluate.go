package model

import "math"

// Evaluate runs the recipe of the object's kind (see the package documentation)
// and returns what it computed, which discharges are possible with their energies
// and charges, the defaults it assumed and what it noticed. It is pure and does
// not allocate, so it can be called thousands of times per object.
//
// Kinds: sheet, belt and insulating roller follow the insulating-surface recipe;
// conductive roller, container, part and person the conductor recipe; powder the
// powder recipe (cone discharge, plus the receiving container as a conductor when
// Resistance or Capacitance is on the row); liquid the liquid recipe (the
// filling clauses of the vessel class, the receiving vessel or a conductive
// liquid in an insulating vessel as a conductor charged by the streaming current,
// and a brush from the liquid surface where a clause is not met);
// bag the bag rules (BagTypeAllowed) and the discharges of its type.
func Evaluate(in Input, env Environment, lim Limits) Evaluation {
	ev := newEvaluation(in.Kind)
	switch in.Kind {
	case Sheet, Belt:
		evalSurface(&ev, &in, &env, &lim)
	case Roller:
		if RollerIsConductor(in) {
			evalConductor(&ev, &in, &env, &lim, math.NaN())
		} else {
			evalSurface(&ev, &in, &env, &lim)
		}
	case Container, Part, Person:
		evalConductor(&ev, &in, &env, &lim, math.NaN())
	case Powder:
		evalPowder(&ev, &in, &env, &lim)
	case Liquid:
		evalLiquid(&ev, &in, &env, &lim)
	case Bag:
		evalBag(&ev, &in, &env, &lim)
	default:
		ev.NotAssessed |= MissingKind
		for i := range ev.Discharges {
			ev.Discharges[i].Code = ReasonNotEvaluated
		}
	}
	finish(&ev, &env)
	return ev
}

// RollerIsConductor reports whether a roller row is assessed as a conductor: its
// material is conductive, or no material is named, no insulating layer thickness
// is given and a Resistance to earth or Capacitance is. Any other roller (an
// insulating or dissipative material, or a layer on the roller) is an insulating surface.
func RollerIsConductor(in Input) bool {
	if in.Material.Conductive {
		return true
	}
	return in.Material.Name == "" && !given(in.Thickness) && (given(in.Resistance) || given(in.Capacitance))
}

func newEvaluation(k Kind) Evaluation {
	nan := math.NaN()
	ev := Evaluation{
		Kind:               k,
		Capacitance:        nan,
		Potential:          nan,
		ChargeDensity:      nan,
		SurfaceField:       nan,
		ChargingCurrent:    nan,
		StoredEnergy:       nan,
		TransferredCharge:  nan,
		Effective:          NoDischarge,
		InsulatingArea:     nan,
		SurfaceResistivity: nan,
		DecayTime:          nan,
		TimeTo100V:         nan,
		RelaxationTime:     nan,
		StreamingCurrent:   nan,
		VelocityDiameter:   nan,
		Resistance:         nan,
		CoronaOnset:        nan,
		ResidenceTime:      nan,
		VelocityLimit:      nan,
		VDLimit:            nan,
		VelocityCeiling:    nan,
		InletVelocity:      nan,
		FilterResidence:    nan,
		ChargeFactor:       nan,
		VesselCapacitance:  nan,
	}
	for i := range ev.Discharges {
		ev.Discharges[i] = Discharge{Type: DischargeType(i), Energy: nan, Charge: nan, Code: ReasonNotApplicable, A: nan, B: nan}
	}
	return ev
}

func setReason(d *Discharge, code Reason, a, b float64) { d.Code, d.A, d.B = code, a, b }

// finish picks the effective discharge and the largest transferred charge.
func finish(ev *Evaluation, env *Environment) {
	ev.EffectiveEnergy = 0
	for i := range ev.Discharges {
		d := &ev.Discharges[i]
		if !d.Possible {
			continue
		}
		if finite(d.Charge) && !(ev.TransferredCharge >= d.Charge) {
			ev.TransferredCharge = d.Charge
		}
		if !finite(d.Energy) {
			continue
		}
		if d.Type == Brush && env.Atmosphere == Dust {
			continue // never incendive to a pure dust cloud
		}
		if d.Energy > ev.EffectiveEnergy {
			ev.EffectiveEnergy, ev.Effective = d.Energy, d.Type
		}
	}
}

func groupIndex(g Group) Group {
	if g >= numGroups {
		return GroupNone
	}
	return g
}

// surfaceArea is Length x Width, or the face pi D L of a roller; NaN when unknown.
func surfaceArea(in *Input) float64 {
	if positive(in.Length) && positive(in.Width) {
		return in.Length * in.Width
	}
	if in.Kind == Roller && positive(in.Diameter) && positive(in.Length) {
		return math.Pi * in.Diameter * in.Length
	}
	return math.NaN()
}

// evalSurface is the insulating-surface recipe (sheet, belt, insulating roller).
func evalSurface(ev *Evaluation, in *Input, env *Environment, lim *Limits) {
	ev.InsulatingArea = surfaceArea(in)
	setReason(&ev.Discharges[Spark], ReasonSparkInsulator, math.NaN(), math.NaN())

	// Humidity: surface resistivity at the station's RH.
	dissipative := false
	if given(in.Material.SurfaceResistivity) {
		ev.SurfaceResistivity = SurfaceResistivityAt(in.Material.SurfaceResistivity, in.Material.HumiditySlope, env.RelativeHumidity)
		dissipative = ev.SurfaceResistivity < lim.DissipativeSurface
	} else if in.Material.Dissipative {
		ev.Assumed |= AssumedDissipativeClass
		dissipative = !(env.RelativeHumidity < 30)
	}
	ev.Dissipative = dissipative

	epsr := in.Material.Permittivity
	backed := in.EarthedBacking
	if backed && !positive(epsr) {
		epsr = 3
		ev.Assumed |= AssumedLayerPermittivity
	}
	if backed && !positive(in.Thickness) {
		ev.NotAssessed |= MissingThickness
		markNotEvaluated(ev, Brush, PropagatingBrush)
		return
	}
	h := in.DistanceToEarth
	overEarth := !backed && positive(h)

	var sigma float64
	switch {
	case given(in.Field):
		z := in.FieldDistance
		if !positive(z) {
			ev.NotAssessed |= MissingFieldDistance
			markNotEvaluated(ev, Brush, PropagatingBrush)
			return
		}
		e := math.Abs(in.Field)
		switch {
		case backed:
			sigma = DensityBacked(e, z, in.Thickness, epsr)
		case overEarth:
			sigma = DensityOverEarth(e, z, h)
		default:
			a, b := in.Length/2, in.Width/2
			if !positive(a) {
				a = math.Inf(1)
			}
			if !positive(b) {
				b = math.Inf(1)
			}
			if math.IsInf(a, 1) || math.IsInf(b, 1) {
				ev.Assumed |= AssumedInfiniteSheet
			}
			sigma = DensityFreeRectangle(e, a, b, z)
		}
		if e > lim.AirBreakdown {
			ev.Flags |= FlagSuspectReading
		}
		ev.Potential, ev.PotentialSource = e*z, PotentialFromField
	case given(in.SurfacePotential):
		v := math.Abs(in.SurfacePotential)
		switch {
		case backed:
			sigma = DensityFromPotentialBacked(v, in.Thickness, epsr)
		case overEarth:
			sigma = DensityFromPotentialOverEarth(v, h)
		default:
			ev.NotAssessed |= MissingSurfaceGeometry
			markNotEvaluated(ev, Brush, PropagatingBrush)
			return
		}
		ev.Potential, ev.PotentialSource = v, PotentialMeasured
	default:
		ev.NotAssessed |= MissingSurfaceReading
		markNotEvaluated(ev, Brush, PropagatingBrush)
		return
	}
	ev.ChargeDensity = sigma

	// Surface field and the breakdown cap on the density.
	maxSigma := MaxDensityTwoSided(lim.AirBreakdown)
	ev.SurfaceField = IsolatedSheetField(sigma)
	if backed || overEarth {
		maxSigma = MaxDensityOneSided(lim.AirBreakdown)
		ev.SurfaceField = OneSidedField(sigma)
	}
	thinBacked := backed && in.Thickness < lim.PropagatingThickness
	if sigma > maxSigma && !thinBacked {
		ev.Flags |= FlagSuspectReading
	}

	// Charging current of a belt.
	if in.Kind == Belt && positive(in.Speed) && positive(in.Width) {
		ev.ChargingCurrent = BeltCurrent(sigma, in.Speed, in.Width)
	} else if given(in.ChargingCurrent) {
		ev.ChargingCurrent = in.ChargingCurrent
	}

	// Decay of a strip to its earthed edges.
	cPerArea := math.NaN()
	switch {
	case backed:
		cPerArea = Eps0 * epsr / in.Thickness
	case overEarth:
		cPerArea = Eps0 / h
	}
	if given(ev.SurfaceResistivity) && positive(in.Width) && finite(cPerArea) {
		ev.DecayTime = StripRelaxationTime(ev.SurfaceResistivity, cPerArea, in.Width)
	}
	earthed := backed || (given(in.Resistance) && in.Resistance <= lim.DissipativeEarthing)
	leaks := dissipative && earthed
	travel := in.ChargingTime
	if !positive(travel) && positive(in.Length) && positive(in.Speed) {
		travel = in.Length / in.Speed
	}
	if leaks && finite(ev.DecayTime) && positive(travel) && ev.DecayTime > travel {
		leaks = false
		ev.Flags |= FlagSlowDecay
	}

	// Brush.
	br := &ev.Discharges[Brush]
	screen := lim.BrushChargeDensity[groupIndex(env.Group)]
	switch {
	case leaks:
		setReason(br, ReasonBrushLeaks, ev.SurfaceResistivity, math.NaN())
	case !(sigma > screen):
		setReason(br, ReasonBrushBelowScreen, sigma, screen)
	default:
		br.Possible, br.Energy, br.Charge = true, lim.BrushEnergy, sigma*lim.BrushArea
		setReason(br, ReasonBrushPossible, sigma, screen)
	}

	// Propagating brush.
	pb := &ev.Discharges[PropagatingBrush]
	if leaks {
		setReason(pb, ReasonBrushLeaks, ev.SurfaceResistivity, math.NaN())
		return
	}
	if !backed && !in.DoubleLayer {
		setReason(pb, ReasonPropNoLayer, math.NaN(), math.NaN())
		return
	}
	t := in.Thickness
	if !positive(t) {
		ev.Assumed |= AssumedThinLayer
	} else if t >= lim.PropagatingThickness {
		setReason(pb, ReasonPropThick, t, lim.PropagatingThickness)
		return
	}
	bd := in.Material.BreakdownStrength * t
	if given(bd) && bd <= lim.PropagatingBreakdown {
		setReason(pb, ReasonPropLowBreakdown, bd, lim.PropagatingBreakdown)
		return
	}
	if !given(bd) {
		ev.Assumed |= AssumedBreakdownUnknown
	}
	if sigma < lim.PropagatingDensity {
		ev.Flags |= FlagPropagatingLayer
		setReason(pb, ReasonPropBelowDensity, sigma, lim.PropagatingDensity)
		return
	}
	w := lim.PropagatingMaxEnergy
	if positive(ev.InsulatingArea) && positive(t) {
		pe := epsr
		if !positive(pe) {
			pe = 3
			ev.Assumed |= AssumedLayerPermittivity
		}
		w = PropagatingBrushEnergy(sigma, ev.InsulatingArea, t, pe, lim.PropagatingMaxEnergy)
		pb.Charge = sigma * ev.InsulatingArea
	} else {
		ev.Assumed |= AssumedPropagatingArea
	}
	pb.Possible, pb.Energy = true, w
	setReason(pb, ReasonPropPossible, sigma, w)
}

func markNotEvaluated(ev *Evaluation, types ...DischargeType) {
	for _, t := range types {
		ev.Discharges[t].Code = ReasonNotEvaluated
	}
}

// estimateCapacitance returns the measured capacitance or the documented estimate.
func estimateCapacitance(ev *Evaluation, in *Input) (float64, CapModel) {
	if positive(in.Capacitance) {
		return in.Capacitance, CapMeasured
	}
	ev.Assumed |= AssumedCapacitance
	k := in.Kind
	r := in.Diameter / 2
	if k == Container && positive(in.Thickness) && positive(in.Diameter) {
		epsr := in.Permittivity
		if !positive(epsr) {
			epsr = 2
			ev.Assumed |= AssumedPlatePermittivity
		}
		return ParallelPlateCapacitance(math.Pi*r*r, in.Thickness, epsr), CapParallelPlate
	}
	if k != Person && k != Liquid && positive(in.Diameter) && positive(in.Length) && positive(in.DistanceToEarth) {
		return CylinderOverPlaneCapacitance(in.Length, r, in.DistanceToEarth+r), CapCylinderPlane
	}
	typ := TypicalCapacitance(k)
	if k != Person && k != Liquid && positive(in.Diameter) {
		size := in.Diameter
		if positive(in.Length) && in.Length > size {
			size = in.Length
		}
		if s := SphereCapacitance(size / 2); s > typ {
			return s, CapSphere
		}
	}
	return typ, CapTypical
}

// evalConductor is the conductor recipe; current, when not NaN, is the charging
// current supplied by the caller (powder stream, streaming current, bag filling).
func evalConductor(ev *Evaluation, in *Input, env *Environment, lim *Limits, current float64) {
	setReason(&ev.Discharges[Brush], ReasonBrushConductor, math.NaN(), math.NaN())
	c, m := estimateCapacitance(ev, in)
	ev.Capacitance, ev.CapacitanceModel = c, m

	r := in.Resistance
	if !given(r) {
		r = lim.NotEarthed
		ev.Assumed |= AssumedNotEarthed
	}
	ev.Resistance = r

	i := current
	measured := given(in.SurfacePotential)
	switch {
	case given(i):
	case given(in.ChargingCurrent):
		i = in.ChargingCurrent
	case given(in.MassFlow) && given(in.ChargeToMass):
		i = MassFlowCurrent(in.MassFlow, in.ChargeToMass)
	case measured:
		// The potential is measured: no charging current is assumed.
	case in.Kind == Person:
		i = WalkingCurrent
		ev.Assumed |= AssumedWalkingCurrent
	case given(in.Resistance):
		i = lim.MaxChargingCurrent
		ev.Assumed |= AssumedMaxCurrent
	}
	i = math.Abs(i)
	ev.ChargingCurrent = i

	var v float64
	switch {
	case measured:
		v, ev.PotentialSource = math.Abs(in.SurfacePotential), PotentialMeasured
	case in.Kind == Person && !given(in.Resistance) && !given(in.ChargingCurrent):
		ev.NotAssessed |= MissingPersonPotential
		markNotEvaluated(ev, Spark, Corona)
		return
	case given(i):
		t := in.ChargingTime
		if !given(t) {
			ev.Assumed |= AssumedSteadyState
		}
		v, ev.PotentialSource = ConductorPotential(i, r, c, t), PotentialCharging
	default:
		ev.NotAssessed |= MissingConductorCharging
		markNotEvaluated(ev, Spark, Corona)
		return
	}

	// Caps: a person's estimated potential at the walking-test maximum; any other
	// conductor at the corona onset of its radius.
	capped := false
	if in.Kind == Person {
		if ev.PotentialSource != PotentialMeasured && v > lim.PersonMaxPotential {
			v = lim.PersonMaxPotential
			ev.Flags |= FlagCappedPerson
		}
	} else if positive(in.Diameter) && in.Kind != Liquid {
		rad := in.Diameter / 2
		temp := env.Temperature
		if !positive(temp) {
			temp = DefaultTemperature
			ev.Assumed |= AssumedTemperature
		}
		h := math.NaN()
		if positive(in.DistanceToEarth) {
			h = in.DistanceToEarth + rad
		}
		ev.CoronaOnset = CoronaOnsetPotential(rad, h, RelativeAirDensity(temp))
		if v > ev.CoronaOnset {
			if ev.PotentialSource == PotentialMeasured {
				ev.Flags |= FlagSuspectReading
			}
			v, capped = ev.CoronaOnset, true
			ev.Flags |= FlagCappedCorona
		}
	} else {
		ev.Assumed |= AssumedNoCoronaCap
	}
	ev.Potential = v

	w := SparkEnergy(c, v)
	ev.StoredEnergy = w
	sp := &ev.Discharges[Spark]
	sp.Energy, sp.Charge = w, SparkCharge(c, v)
	if v >= lim.SparkMinPotential {
		sp.Possible = true
		setReason(sp, ReasonSparkPossible, v, w)
	} else {
		setReason(sp, ReasonSparkBelowPaschen, v, lim.SparkMinPotential)
	}

	co := &ev.Discharges[Corona]
	switch {
	case capped:
		co.Possible = true
		setReason(co, ReasonCoronaOnset, ev.CoronaOnset, in.Diameter/2)
	case finite(ev.CoronaOnset):
		setReason(co, ReasonCoronaBelowOnset, v, ev.CoronaOnset)
	}

	ev.DecayTime = DecayTime(r, c)
	ev.TimeTo100V = TimeToPotential(v, lim.SafePotential, ev.DecayTime)
	if w > lim.ShockEnergy {
		ev.Flags |= FlagShock
	}
}

// evalPowder is the bulk powder recipe: cone discharge screen and energy, and the
// receiving container as a conductor when its Resistance or Capacitance is on the row.
func evalPowder(ev *Evaluation, in *Input, env *Environment, lim *Limits) {
	i := math.NaN()
	switch {
	case given(in.ChargingCurrent):
		i = math.Abs(in.ChargingCurrent)
	case given(in.MassFlow) && given(in.ChargeToMass):
		i = math.Abs(MassFlowCurrent(in.MassFlow, in.ChargeToMass))
	}
	ev.ChargingCurrent = i
	qm := math.Abs(in.ChargeToMass)
	if !given(qm) && positive(in.MassFlow) {
		qm = i / in.MassFlow
	}
	if given(in.Resistance) || given(in.Capacitance) {
		evalConductor(ev, in, env, lim, i)
	} else {
		setReason(&ev.Discharges[Spark], ReasonSparkNoContainer, math.NaN(), math.NaN())
	}

	cone := &ev.Discharges[Cone]
	rho := in.Material.VolumeResistivity
	vol := math.NaN()
	if positive(in.Diameter) && positive(in.Length) {
		vol = math.Pi * in.Diameter * in.Diameter / 4 * in.Length
	}
	switch {
	case given(rho) && rho < lim.ConeResistivity:
		setReason(cone, ReasonConeLowResistivity, rho, lim.ConeResistivity)
		return
	case given(qm) && qm < lim.ConeChargeToMass:
		setReason(cone, ReasonConeLowCharge, qm, lim.ConeChargeToMass)
		return
	case given(vol) && vol < lim.ConeMinVolume:
		setReason(cone, ReasonConeSmallVessel, vol, lim.ConeMinVolume)
		return
	case given(in.Field) && math.Abs(in.Field) <= lim.ConeField:
		setReason(cone, ReasonConeLowField, math.Abs(in.Field), lim.ConeField)
		return
	}
	if !given(rho) {
		ev.Assumed |= AssumedHighResistivity
	}
	if !given(qm) {
		ev.Assumed |= AssumedConeCharge
	}
	cone.Possible = true
	if !positive(in.Diameter) || !positive(in.ParticleSize) {
		ev.NotAssessed |= MissingConeSize
		setReason(cone, ReasonConeSizeUnknown, math.NaN(), math.NaN())
		return
	}
	w, ok := ConeDischargeEnergy(in.Diameter, in.ParticleSize)
	cone.Energy = w
	if ok {
		setReason(cone, ReasonConePossible, in.Diameter, in.ParticleSize)
	} else {
		ev.Flags |= FlagConeOutsideRange
		setReason(cone, ReasonConeOutsideRange, in.Diameter, in.ParticleSize)
	}
}

// evalLiquid is the liquid recipe, judged operation by operation as IEC TS
// 60079-32-1 does: conductivity class (and the class the filling rules use),
// relaxation, streaming current with its factor for a filter or second phase,
// the filling clauses of the vessel class (LiquidRules), the receiving vessel or
// the liquid as an isolated conductor, and the brush of the liquid's surface.
//
// Brush: a low-conductivity liquid (or one of unknown conductivity, or below
// Limits.SecondPhaseConductivity with a second phase) gives a brush of the
// equivalent energy Limits.BrushEnergy only where a clause is not met (or not
// shown met for want of an input) or the operation has no safe limits in the
// standard (into an insulating vessel); a fill that meets every applicable
// clause gives none. Medium and high conductivity liquids relax and give none.
//
// Spark: the receiving vessel (or, in an insulating, lined or unearthed vessel,
// a conductive liquid itself) follows the conductor recipe charged by the
// streaming current, with the measured capacitance or the typical one of the
// vessel class (VesselCapacitance); a low-conductivity liquid in an insulating
// or glass vessel is no conductor.
func evalLiquid(ev *Evaluation, in *Input, env *Environment, lim *Limits) {
	kappa := in.Conductivity
	ev.ConductivityClass = ClassifyConductivity(kappa, *lim)
	if ev.ConductivityClass == ConductivityUnknown {
		ev.Assumed |= AssumedLowConductivity
	}
	ev.RuleClass = ev.ConductivityClass
	twoPhase, filter := in.SecondPhase.Assessed(), in.Filter.Assessed()
	if twoPhase && (ev.RuleClass == ConductivityMedium || ev.RuleClass == ConductivityHigh) && kappa < lim.SecondPhaseConductivity {
		ev.RuleClass = ConductivityLow
		ev.Flags |= FlagSecondPhaseLow
	}
	low := ev.RuleClass == ConductivityLow || ev.RuleClass == ConductivityUnknown
	conductive := ev.ConductivityClass == ConductivityMedium || ev.ConductivityClass == ConductivityHigh

	epsr := in.Permittivity
	if !positive(epsr) {
		epsr = in.Material.Permittivity
	}
	if !positive(epsr) {
		epsr = 2
		ev.Assumed |= AssumedLiquidPermittivity
	}
	if positive(kappa) {
		ev.RelaxationTime = LiquidRelaxationTime(epsr, kappa)
		ev.ResidenceTime = ResidenceFactor * ev.RelaxationTime
		ev.DecayTime = ev.RelaxationTime
	}

	mat, class := in.VesselMaterial, in.VesselClass
	if mat == VesselMaterialUnknown {
		ev.Assumed |= AssumedVesselMaterial
	}
	if class == VesselUnknown || class >= NumVesselClasses {
		class = VesselUnknown
		ev.Assumed |= AssumedVesselClass
	}
	if in.Filter == FilterUnknown {
		ev.Assumed |= AssumedNoFilter
	}
	if in.SecondPhase == PhaseUnknown {
		ev.Assumed |= AssumedNoSecondPhase
	}

	// Charging current: the plain-pipe correlation times the factor for what lies upstream.
	v, d := in.Speed, in.Diameter
	ev.ChargeFactor = LiquidChargeFactor(in.Filter, in.FilterResidence, ev.RelaxationTime, in.SecondPhase, lim)
	if positive(v) && positive(d) {
		ev.VelocityDiameter = v * d
		ev.StreamingCurrent = StreamingCurrent(v, d)
	}
	i := ev.StreamingCurrent * ev.ChargeFactor
	if given(in.ChargingCurrent) {
		i = math.Abs(in.ChargingCurrent)
	}
	ev.ChargingCurrent = i

	// The filling clauses.
	var br LiquidClause
	ceiling := FillingCeiling(class, lim)
	ev.VelocityCeiling = ceiling
	if low {
		if twoPhase && lim.SecondPhaseVelocity < ev.VelocityCeiling {
			ev.VelocityCeiling = lim.SecondPhaseVelocity
		}
		ev.VDLimit = FillingVDLimit(kappa, class, in.VesselDiameter, lim)
		if positive(d) {
			ev.VelocityLimit = math.Min(ev.VDLimit/d, ev.VelocityCeiling)
		}
		if !(ev.VelocityDiameter <= ev.VDLimit) {
			br |= ClauseVD
		}
		if v > ceiling {
			br |= ClauseCeiling
		}
		if twoPhase && !(v <= lim.SecondPhaseVelocity) {
			br |= ClauseSecondPhase
		}
		switch in.Filling {
		case FillBottom, FillDipPipe:
			// Not given (0 from a zero Input reads so): the slow start is not shown
			// met; the line's velocity is no bound, a narrower inlet runs faster.
			if positive(in.InletVelocity) {
				ev.InletVelocity = in.InletVelocity
			} else {
				ev.Assumed |= AssumedInletVelocity
			}
			if !(ev.InletVelocity <= lim.SlowStartVelocity) {
				br |= ClauseSlowStart
			}
		default:
			br |= ClauseSplash
			ev.Flags |= FlagSplashFilling
		}
		if filter == FilterFine {
			ev.FilterResidence = FilterResidence(ev.RelaxationTime, lim)
			t := in.FilterResidence
			if !given(t) {
				t = 0
				ev.Assumed |= AssumedFilterResidence
			}
			if t < ev.FilterResidence {
				br |= ClauseResidence
			}
		}
		if mat == VesselInsulating || mat == VesselGlass || mat == VesselMaterialUnknown {
			br |= ClauseInsulatingVessel
		}
	} else {
		ev.VelocityLimit = ceiling
		if !(v <= ceiling) {
			br |= ClauseCeiling
		}
	}
	if conductive && (mat.Insulating() || mat == VesselMaterialUnknown) && !(in.Resistance <= lim.ConductorEarthing) {
		br |= ClauseIsolatedLiquid
	}
	ev.LiquidBreaches = br
	if br&(ClauseVD|ClauseCeiling|ClauseSecondPhase) != 0 && given(v) {
		ev.Flags |= FlagVelocityAboveLimit
	}

	// Spark: the vessel, or a conductive liquid in an insulating vessel.
	sp := &ev.Discharges[Spark]
	switch {
	case !conductive && (mat == VesselInsulating || mat == VesselGlass):
		setReason(sp, ReasonSparkInsulatingVessel, math.NaN(), math.NaN())
	case !given(i):
		ev.NotAssessed |= MissingLiquidFlow
		markNotEvaluated(ev, Spark)
	case positive(in.Capacitance):
		evalConductor(ev, in, env, lim, i)
	default:
		// The typical capacitance of the class; for an unknown class each class's
		// value, keeping the one that gives the largest spark energy: with a short
		// charging time a small vessel charges higher (unknown means the stricter case).
		base := *ev
		cin := *in
		for k := VesselRoadTanker; k < NumVesselClasses; k++ {
			if class != VesselUnknown {
				k = class
			}
			cin.Capacitance = VesselCapacitance(k)
			trial := base
			evalConductor(&trial, &cin, env, lim, i)
			trial.VesselCapacitance = cin.Capacitance
			if k == class || k == VesselRoadTanker || trial.StoredEnergy > ev.StoredEnergy {
				*ev = trial
			}
			if class != VesselUnknown {
				break
			}
		}
		ev.CapacitanceModel = CapTypical
		ev.Assumed |= AssumedCapacitance | AssumedVesselCapacitance
		if sp.Code == ReasonSparkPossible && conductive && (mat.Insulating() || mat == VesselMaterialUnknown) {
			sp.Code = ReasonSparkLiquidIsolated
		}
	}

	b := &ev.Discharges[Brush]
	switch {
	case !low:
		setReason(b, ReasonBrushLiquidRelaxes, kappa, lim.LowConductivity)
	case br&^ClauseIsolatedLiquid == 0:
		setReason(b, ReasonBrushLiquidCompliant, math.NaN(), math.NaN())
	case br.Has(ClauseInsulatingVessel) && mat != VesselMaterialUnknown:
		b.Possible, b.Energy = true, lim.BrushEnergy
		setReason(b, ReasonBrushLiquidNoSafeLimits, math.NaN(), math.NaN())
	default:
		b.Possible, b.Energy = true, lim.BrushEnergy
		setReason(b, ReasonBrushLiquidBreach, kappa, lim.LowConductivity)
	}
}

// evalBag is the flexible bulk container recipe: the type rule of BagTypeAllowed
// and the discharges of the type. BagUnknown is assessed as type A.
func evalBag(ev *Evaluation, in *Input, env *Environment, lim *Limits) {
	ev.InsulatingArea = surfaceArea(in)
	mie := in.ProductMIE
	if !given(mie) {
		if env.Atmosphere == Dust || env.Atmosphere == Hybrid {
			mie = env.MIE
			ev.Assumed |= AssumedProductMIE
		} else {
			ev.Assumed |= AssumedProductMIEUnknown
		}
	}
	ev.BagAllowed, ev.BagCode = BagTypeAllowed(in.BagType, *env, mie, *lim)
	t := in.BagType
	if t == BagUnknown {
		t = BagA
		ev.Assumed |= AssumedBagTypeA
	}

	i := math.NaN()
	switch {
	case given(in.ChargingCurrent):
		i = math.Abs(in.ChargingCurrent)
	case given(in.MassFlow) && given(in.ChargeToMass):
		i = math.Abs(MassFlowCurrent(in.MassFlow, in.ChargeToMass))
	default:
		i = lim.BagMaxCurrent
		ev.Assumed |= AssumedBagCurrent
	}
	ev.ChargingCurrent = i
	if (t == BagC || t == BagD) && i > lim.BagMaxCurrent {
		ev.Flags |= FlagBagCurrentAboveQualified
	}

	br := &ev.Discharges[Brush]
	pb := &ev.Discharges[PropagatingBrush]
	sp := &ev.Discharges[Spark]
	switch t {
	case BagA, BagB:
		br.Possible, br.Energy = true, lim.BrushEnergy
		setReason(br, ReasonBrushBagFabric, math.NaN(), math.NaN())
		setReason(sp, ReasonSparkBagNoConductor, math.NaN(), math.NaN())
		if t == BagA {
			pb.Possible, pb.Energy = true, lim.PropagatingMaxEnergy
			setReason(pb, ReasonPropBagA, lim.PropagatingMaxEnergy, math.NaN())
		} else {
			setReason(pb, ReasonPropBagB, BagFabricBreakdown, math.NaN())
		}
	case BagC:
		setReason(pb, ReasonBrushBagProtected, math.NaN(), math.NaN())
		if given(in.Resistance) && in.Resistance <= lim.BagTabToEarth {
			ev.Resistance = in.Resistance
			setReason(sp, ReasonSparkBagEarthed, in.Resistance, lim.BagTabToEarth)
			setReason(br, ReasonBrushBagProtected, math.NaN(), math.NaN())
			return
		}
		ev.Flags |= FlagBagNotEarthed
		evalConductor(ev, in, env, lim, i)
		setReason(br, ReasonBrushBagProtected, math.NaN(), math.NaN())
	case BagD:
		setReason(br, ReasonBrushBagProtected, math.NaN(), math.NaN())
		setReason(pb, ReasonBrushBagProtected, math.NaN(), math.NaN())
		setReason(sp, ReasonSparkBagD, math.NaN(), math.NaN())
		co := &ev.Discharges[Corona]
		co.Possible = true
		setReason(co, ReasonCoronaBagD, math.NaN(), math.NaN())
	}
}
