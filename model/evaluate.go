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
// receiving container as a conductor charged by the streaming current when
// Resistance or Capacitance is on the row, and a brush screen for its surface);
// bag the bag rules (BagTypeAllowed) and the discharges of its type.
func Evaluate(in Input, env Environment, lim Limits) Evaluation {
	ev := newEvaluation(in.Kind)
	if e, assumed := env.WithStrictGroup(); assumed {
		env = e
		ev.Assumed |= AssumedGroupIIC
	}
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
	finish(&ev, &env, &lim)
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
	}
	for i := range ev.Discharges {
		ev.Discharges[i] = Discharge{Type: DischargeType(i), Energy: nan, Charge: nan, Code: ReasonNotApplicable, A: nan, B: nan}
	}
	return ev
}

func setReason(d *Discharge, code Reason, a, b float64) { d.Code, d.A, d.B = code, a, b }

// finish picks the effective discharge and the largest transferred charge.
func finish(ev *Evaluation, env *Environment, lim *Limits) {
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
		if d.Type == Brush && !BrushIgnites(*env, *lim) {
			continue // not incendive to a pure dust cloud of MIE at or above Limits.DustBrushMIE
		}
		if d.Energy > ev.EffectiveEnergy {
			ev.EffectiveEnergy, ev.Effective = d.Energy, d.Type
		}
	}
}

// WithStrictGroup returns the environment with group IIC when a gas, vapour,
// mist or hybrid atmosphere gives no gas group (blank, or only a dust group for a
// hybrid), and whether it did so: an unknown gas group is assessed as the
// strictest (common practice, no source; it is what the survey check promises).
func (e Environment) WithStrictGroup() (Environment, bool) {
	gasGroup := e.Group == IIA || e.Group == IIB || e.Group == IIC
	if !gasGroup && e.Atmosphere.IgnitedByBrush() {
		e.Group = IIC
		return e, true
	}
	return e, false
}

// BrushIgnites reports whether a brush discharge can ignite the environment's
// atmosphere: gases, vapours, mists and hybrid mixtures, and a dust whose MIE is
// below Limits.DustBrushMIE (about 1 mJ: such dusts behave like hybrids for
// screening, reference section 12, from memory); not a pure dust cloud of higher
// MIE. An unknown dust MIE is taken as low enough (the stricter case).
func BrushIgnites(env Environment, lim Limits) bool {
	if env.Atmosphere.IgnitedByBrush() {
		return true
	}
	return env.Atmosphere == Dust && !(env.MIE >= lim.DustBrushMIE)
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
//
// A container (and the receiving vessel of a powder row) takes the
// size table VesselCapacitance: a floor-standing vessel is never estimated as an
// isolated sphere, since the floor raises its capacitance (reference section 12).
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
	vessel := k == Container || k == Powder
	if !vessel && k != Person && k != Liquid && positive(in.Diameter) && positive(in.Length) && positive(in.DistanceToEarth) {
		return CylinderOverPlaneCapacitance(in.Length, r, in.DistanceToEarth+r), CapCylinderPlane
	}
	if vessel {
		c, _ := VesselCapacitance(in.Diameter, in.Length)
		if !positive(in.Diameter) {
			ev.Assumed |= AssumedVesselSize
		}
		return c, CapSizeTable
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
//
// An unknown resistance to earth is taken as no leakage at all (the stricter case
// for any known resistance): the potential then rises as I t / C, or to the cap
// when no charging time is given. No charging current is invented for an object
// with no charging mechanism on its row: its earthing is judged instead (a
// resistance within Limits.ConductorEarthing keeps even the worst-case industrial
// current below the spark floor) and the spark is otherwise not evaluated, with
// what to measure. An unmeasured potential is capped at Limits.ConductorMaxPotential
// (a person's at Limits.PersonMaxPotential) and at the corona onset of the object's
// radius; a measured one is never capped: one above the cap is flagged as a
// contradiction (FlagMeasuredAboveMaximum).
func evalConductor(ev *Evaluation, in *Input, env *Environment, lim *Limits, current float64) {
	setReason(&ev.Discharges[Brush], ReasonBrushConductor, math.NaN(), math.NaN())
	c, m := estimateCapacitance(ev, in)
	ev.Capacitance, ev.CapacitanceModel = c, m

	r := in.Resistance
	if !given(r) {
		r = math.Inf(1)
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
	}
	i = math.Abs(i)
	ev.ChargingCurrent = i

	var v float64
	switch {
	case measured:
		v, ev.PotentialSource = math.Abs(in.SurfacePotential), PotentialMeasured
	case given(i):
		t := in.ChargingTime
		if !given(t) {
			ev.Assumed |= AssumedSteadyState
		}
		v, ev.PotentialSource = ConductorPotential(i, r, c, t), PotentialCharging
	case given(in.Resistance) && lim.MaxChargingCurrent*in.Resistance < lim.SparkMinPotential:
		// No charging mechanism on the row, but earthed well enough that even the
		// worst-case industrial current keeps it below the spark floor (JNIOSH-TR).
		bound := lim.MaxChargingCurrent * in.Resistance
		setReason(&ev.Discharges[Spark], ReasonSparkEarthedBound, bound, in.Resistance)
		ev.DecayTime = DecayTime(r, c)
		return
	case in.Kind == Powder:
		// The receiving container of a powder row with no stream on the row: its
		// spark is not evaluated (its earthing is judged), the powder still is.
		markNotEvaluated(ev, Spark, Corona)
		return
	default:
		ev.NotAssessed |= MissingConductorCharging
		markNotEvaluated(ev, Spark, Corona)
		return
	}

	// Caps on an estimated potential: a person's at the walking-test maximum, any
	// other conductor's at the realistic plant maximum and at the corona onset of
	// its radius. A measured potential is never capped.
	capped := false
	if ev.PotentialSource != PotentialMeasured {
		if !given(in.Resistance) && v > 0 {
			// The assumed (absent) leakage decides the size of the estimate.
			ev.Flags |= FlagAssumedResistance
		}
		if in.Kind == Person {
			if !(v <= lim.PersonMaxPotential) {
				v = lim.PersonMaxPotential
				ev.Flags |= FlagCappedPerson
			}
		} else if !(v <= lim.ConductorMaxPotential) {
			v = lim.ConductorMaxPotential
			ev.Flags |= FlagCappedConductor
		}
	} else if in.Kind != Person && v > lim.ConductorMaxPotential {
		ev.Flags |= FlagMeasuredAboveMaximum
	}
	if in.Kind != Person && positive(in.Diameter) && in.Kind != Liquid {
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
			} else {
				v, capped = ev.CoronaOnset, true
				ev.Flags |= FlagCappedCorona
			}
		}
	} else if in.Kind != Person {
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

	// Brush discharges from the charged powder, its cloud and its sack or liner
	// (IEC TS 60079-32-1 treats powder into a flammable vapour separately;
	// reference section 12): possible unless the row shows the powder does not
	// charge (a measured charge-to-mass or charging current of zero). finish counts
	// it only where a brush can ignite (gas, vapour, mist, hybrid, a dust below
	// Limits.DustBrushMIE).
	br := &ev.Discharges[Brush]
	if (given(in.ChargeToMass) && in.ChargeToMass == 0) || (given(in.ChargingCurrent) && in.ChargingCurrent == 0) {
		setReason(br, ReasonBrushPowderNoCharge, math.NaN(), math.NaN())
	} else {
		br.Possible, br.Energy = true, lim.BrushEnergy
		setReason(br, ReasonBrushPowder, lim.BrushEnergy, math.NaN())
	}

	cone := &ev.Discharges[Cone]
	rho := in.Material.VolumeResistivity
	vol := math.NaN()
	if positive(in.Diameter) && positive(in.Length) {
		vol = math.Pi * in.Diameter * in.Diameter / 4 * in.Length
	}
	// Screens: a bulk resistivity below 1e10 ohm m (BG RCI FAQ 5.10, TRGS 727
	// 6.2.3) or a charge-to-mass below 1 uC/kg (JNIOSH-TR) clears alone; a small
	// container clears only together with a low measured heap field, as JNIOSH-TR
	// states ("none expected if the heap-surface field is at most 500 kV/m and the
	// container is below 0.25 m^3").
	switch {
	case given(rho) && rho < lim.ConeResistivity:
		setReason(cone, ReasonConeLowResistivity, rho, lim.ConeResistivity)
		return
	case given(qm) && qm < lim.ConeChargeToMass:
		setReason(cone, ReasonConeLowCharge, qm, lim.ConeChargeToMass)
		return
	case given(vol) && vol < lim.ConeMinVolume && given(in.Field) && math.Abs(in.Field) <= lim.ConeField:
		setReason(cone, ReasonConeFieldAndVessel, math.Abs(in.Field), vol)
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
	w, ok := ConeEnergyAtRange(in.Diameter, in.ParticleSize)
	cone.Energy = w
	if ok {
		setReason(cone, ReasonConePossible, in.Diameter, in.ParticleSize)
	} else {
		ev.Flags |= FlagConeOutsideRange
		setReason(cone, ReasonConeOutsideRange, in.Diameter, in.ParticleSize)
	}
}

// evalLiquid is the liquid recipe: conductivity class, relaxation, streaming
// current, filling velocity limit, the receiving container as a conductor and the
// brush screen of the liquid's surface.
//
// Brush screen (a conservative choice): a liquid of low (<= 50 pS/m) or unknown
// conductivity keeps charge on its surface, so a brush discharge of the
// equivalent energy Limits.BrushEnergy is taken as possible whatever the flow;
// medium and high conductivity liquids relax to the container and give none.
func evalLiquid(ev *Evaluation, in *Input, env *Environment, lim *Limits) {
	kappa := in.Conductivity
	ev.ConductivityClass = ClassifyConductivity(kappa, *lim)
	if ev.ConductivityClass == ConductivityUnknown {
		ev.Assumed |= AssumedLowConductivity
	}
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
	v, d := in.Speed, in.Diameter
	if positive(v) && positive(d) {
		ev.VelocityDiameter = v * d
		ev.StreamingCurrent = StreamingCurrent(v, d)
		ev.VelocityLimit = FillingVelocityLimit(kappa, d, *lim)
		if v > ev.VelocityLimit {
			ev.Flags |= FlagVelocityAboveLimit
		}
	}
	i := ev.StreamingCurrent
	if given(in.ChargingCurrent) {
		i = math.Abs(in.ChargingCurrent)
	}
	ev.ChargingCurrent = i
	if !given(i) {
		ev.NotAssessed |= MissingLiquidFlow
	}
	low := ev.ConductivityClass == ConductivityLow || ev.ConductivityClass == ConductivityUnknown
	if in.Filling == FillTop && low {
		ev.Flags |= FlagSplashFilling
	}

	switch {
	case !given(i):
		markNotEvaluated(ev, Spark)
	case given(in.Resistance) || given(in.Capacitance):
		evalConductor(ev, in, env, lim, i)
	default:
		setReason(&ev.Discharges[Spark], ReasonSparkNoContainer, math.NaN(), math.NaN())
	}

	br := &ev.Discharges[Brush]
	switch ev.ConductivityClass {
	case ConductivityLow:
		br.Possible, br.Energy = true, lim.BrushEnergy
		setReason(br, ReasonBrushLiquidSurface, kappa, lim.LowConductivity)
	case ConductivityUnknown:
		br.Possible, br.Energy = true, lim.BrushEnergy
		setReason(br, ReasonBrushLiquidUnknown, math.NaN(), lim.LowConductivity)
	default:
		setReason(br, ReasonBrushLiquidRelaxes, kappa, lim.LowConductivity)
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
