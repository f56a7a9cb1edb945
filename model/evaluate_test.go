package model

import (
	"math"
	"strings"
	"testing"
)

// blank returns an Input of the kind with every measurement not given.
func blank(k Kind) Input {
	n := math.NaN()
	return Input{
		Kind:     k,
		Material: Material{Permittivity: n, SurfaceResistivity: n, VolumeResistivity: n, BreakdownStrength: n},
		Length:   n, Width: n, Diameter: n, Thickness: n, DistanceToEarth: n,
		Field: n, FieldDistance: n, SurfacePotential: n,
		Speed: n, MassFlow: n, ChargeToMass: n, ChargingCurrent: n, ChargingTime: n, ParticleSize: n,
		Resistance: n, Capacitance: n, Conductivity: n, Permittivity: n, ProductMIE: n, LayerBreakdown: n,
		VesselDiameter: n, FilterResidence: n, InletVelocity: n,
	}
}

func gasEnv(g Group, z Zone, mie float64) Environment {
	return Environment{RelativeHumidity: 40, Temperature: 293.15, Atmosphere: Vapour, Group: g, Zone: z, MIE: mie}
}

// Hand-worked objects, one per kind (worked check values of reference section 10).
func samples() map[string]Input {
	m := map[string]Input{}

	p := blank(Person) // Source: reference 10.1 [C]: 100 pF at 10 kV -> 5 mJ.
	p.Capacitance, p.SurfacePotential = 100e-12, 10e3
	m["person"] = p

	d := blank(Container) // derived: reference 10.4: drum 70 pF at 10 kV -> 3.5 mJ.
	d.Capacitance, d.SurfacePotential = 70e-12, 10e3
	m["drum"] = d

	pw := blank(Powder) // derived: reference 10.6: 5 uA, 1e11 ohm, 100 pF, 1 s -> 47.6 kV, 113 mJ.
	pw.MassFlow, pw.ChargeToMass, pw.Resistance, pw.Capacitance, pw.ChargingTime = 0.5, 10e-6, 1e11, 100e-12, 1
	m["powder"] = pw

	s := blank(Sheet) // derived: infinite free sheet, 500 kV/m -> sigma = 2 eps0 E = 8.85 uC/m^2.
	s.Field, s.FieldDistance = 500e3, 0.1
	m["sheet"] = s

	b := blank(Belt) // derived: backed belt, see TestEvaluateBackedBelt.
	b.EarthedBacking, b.Thickness, b.Material.Permittivity, b.Material.BreakdownStrength = true, 1e-4, 3, 100e6
	b.Length, b.Width, b.Speed = 1, 0.5, 2
	b.Field, b.FieldDistance = 10e3, 0.1
	m["belt"] = b

	l := blank(Liquid) // derived: 5 m/s in 0.1 m, 1 pS/m, receiving tank 1e11 ohm, 100 pF.
	l.Speed, l.Diameter, l.Conductivity, l.Resistance, l.Capacitance = 5, 0.1, 1e-12, 1e11, 100e-12
	l.Filter, l.SecondPhase = FilterNone, PhaseNone // a plain pipe, single phase
	m["liquid"] = l

	bg := blank(Bag)
	bg.BagType = BagC
	m["bag"] = bg

	r := blank(Roller)
	r.Material = Material{Name: "steel", Conductive: true, Permittivity: math.NaN(), SurfaceResistivity: math.NaN(), VolumeResistivity: math.NaN(), BreakdownStrength: math.NaN()}
	r.Diameter, r.ChargingCurrent = 0.1, 1e-6
	m["roller"] = r

	pt := blank(Part)
	pt.ChargingCurrent, pt.Resistance = 100e-6, 1e6
	m["part"] = pt
	return m
}

func TestEvaluateWorkedRows(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	s := samples()

	ev := Evaluate(s["person"], env, lim)
	// Source: reference 10.1 [C].
	near(t, "person energy", ev.EffectiveEnergy, 5e-3, 1e-12)
	if ev.Effective != Spark || ev.CapacitanceModel != CapMeasured || ev.PotentialSource != PotentialMeasured {
		t.Errorf("person: effective %v, cap model %v, source %v", ev.Effective, ev.CapacitanceModel, ev.PotentialSource)
	}
	// derived: Q = C V = 1 uC.
	near(t, "person charge", ev.TransferredCharge, 1e-6, 1e-12)

	ev = Evaluate(s["drum"], env, lim)
	// derived: reference 10.4.
	near(t, "drum energy", ev.StoredEnergy, 3.5e-3, 1e-12)
	if ev.Assumed&AssumedNotEarthed == 0 {
		t.Error("drum without resistance: not-earthed assumption missing")
	}

	ev = Evaluate(s["powder"], env, lim)
	// derived: reference 10.6.
	near(t, "powder potential", ev.Potential, 47.58e3, 1e-3)
	near(t, "powder energy", ev.Discharges[Spark].Energy, 113.2e-3, 1e-3)
	near(t, "powder current", ev.ChargingCurrent, 5e-6, 1e-12)
	if !ev.Discharges[Cone].Possible || ev.NotAssessed&MissingConeSize == 0 {
		t.Errorf("powder without size: cone %+v, missing %b", ev.Discharges[Cone], ev.NotAssessed)
	}
	pw := s["powder"]
	pw.Resistance = 1e6
	ev = Evaluate(pw, env, lim)
	// derived: reference 10.6, with R 1e6 ohm the drum stays at 5 V.
	near(t, "powder earthed", ev.Potential, 5, 1e-6)
	if ev.Discharges[Spark].Possible {
		t.Error("5 V drum: spark should not be possible")
	}

	ev = Evaluate(s["part"], env, lim)
	// Source: reference 10.5 [C] JNIOSH-TR: 100 uA through 1 Mohm -> 100 V, below the Paschen floor.
	near(t, "part potential", ev.Potential, 100, 1e-9)
	if ev.Discharges[Spark].Possible || ev.EffectiveEnergy != 0 || ev.Effective != NoDischarge {
		t.Errorf("part at 100 V: %+v, effective %v %g", ev.Discharges[Spark], ev.Effective, ev.EffectiveEnergy)
	}
	// derived: at 100 V no decay to 100 V is needed.
	if ev.TimeTo100V != 0 {
		t.Errorf("TimeTo100V = %g, want 0", ev.TimeTo100V)
	}

	ev = Evaluate(s["sheet"], env, lim)
	// derived: sigma = 2 eps0 E = 8.854 uC/m^2 above the IIA screen 5 uC/m^2 -> brush 4 mJ, 88.5 nC.
	near(t, "sheet density", ev.ChargeDensity, 2*Eps0*500e3, 1e-12)
	near(t, "sheet field", ev.SurfaceField, 500e3, 1e-12)
	near(t, "sheet brush charge", ev.TransferredCharge, 2*Eps0*500e3*0.01, 1e-12)
	near(t, "sheet brush energy", ev.EffectiveEnergy, 4e-3, 1e-12)
	if ev.Effective != Brush || ev.Assumed&AssumedInfiniteSheet == 0 {
		t.Errorf("sheet: effective %v, assumed %b", ev.Effective, ev.Assumed)
	}
	// Source: CCPS glossary [C]: brush does not ignite a pure dust cloud.
	dust := Environment{RelativeHumidity: 40, Temperature: 293.15, Atmosphere: Dust, Group: IIIB, Zone: Zone21, MIE: 1e-3}
	ev = Evaluate(s["sheet"], dust, lim)
	if !ev.Discharges[Brush].Possible || ev.EffectiveEnergy != 0 {
		t.Errorf("dust: brush possible %v, effective %g, want possible and 0", ev.Discharges[Brush].Possible, ev.EffectiveEnergy)
	}
	hyb := dust
	hyb.Atmosphere = Hybrid
	ev = Evaluate(s["sheet"], hyb, lim)
	near(t, "hybrid brush", ev.EffectiveEnergy, 4e-3, 1e-12)
	// derived: the same sheet below the IIA screen at 200 kV/m (3.5 uC/m^2) but above IIB's 3 uC/m^2.
	sh := s["sheet"]
	sh.Field = 200e3
	if ev := Evaluate(sh, env, lim); ev.Discharges[Brush].Possible {
		t.Error("3.5 uC/m^2 in IIA: brush should be screened out")
	}
	if ev := Evaluate(sh, gasEnv(IIB, Zone1, 0.07e-3), lim); !ev.Discharges[Brush].Possible {
		t.Error("3.5 uC/m^2 in IIB: brush should be possible")
	}

	ev = Evaluate(s["liquid"], env, lim)
	// derived: 3.75e-6 x 25 x 0.01 = 0.9375 uA; steady state x 1e11 ohm = 93.75 kV, above the
	// realistic plant maximum of 50 kV (common practice, no source): capped there; W = 100 pF x
	// (50 kV)^2 / 2 = 0.125 J.
	near(t, "liquid current", ev.StreamingCurrent, 0.9375e-6, 1e-12)
	near(t, "liquid potential", ev.Potential, 50e3, 1e-9)
	near(t, "liquid energy", ev.EffectiveEnergy, 0.5*100e-12*50e3*50e3, 1e-9)
	if ev.Flags&FlagCappedConductor == 0 || ev.Flags&FlagAssumedResistance != 0 {
		t.Errorf("liquid: flags %b, want capped at the plant maximum, resistance measured", ev.Flags)
	}
	near(t, "liquid vd", ev.VelocityDiameter, 0.5, 1e-12)
	// Source: IEC TS 60079-32-1 via reference 8: v d <= 0.38 at 1 pS/m -> 3.8 m/s in 0.1 m.
	near(t, "liquid limit", ev.VelocityLimit, 3.8, 1e-12)
	// derived: epsr 2 (assumed), 1 pS/m -> 17.7 s, residence 3 tau.
	near(t, "liquid relaxation", ev.RelaxationTime, 17.7, 1e-3)
	near(t, "liquid residence", ev.ResidenceTime, 53.1, 1e-3)
	if ev.Flags&FlagVelocityAboveLimit == 0 || !ev.Discharges[Brush].Possible || ev.ConductivityClass != ConductivityLow {
		t.Errorf("liquid: flags %b, brush %v, class %v", ev.Flags, ev.Discharges[Brush].Possible, ev.ConductivityClass)
	}

	ev = Evaluate(s["roller"], env, lim)
	// derived: resistance unknown, so no leakage: the steady state is unbounded and the
	// estimate is capped at the realistic plant maximum of 50 kV (common practice, no
	// source), below the corona onset of r = 5 cm: Peek 3 MV/m x 1.01705 x
	// (1 + 0.301/sqrt(1.01705 x 5)) = 3.46 MV/m, x 0.05 m = 172.9 kV.
	delta := 298.15 / 293.15
	wantOnset := 3e6 * delta * (1 + 0.301/math.Sqrt(delta*5)) * 0.05
	near(t, "roller onset", ev.CoronaOnset, wantOnset, 1e-9)
	near(t, "roller potential", ev.Potential, 50e3, 1e-12)
	if ev.Flags&FlagCappedConductor == 0 || ev.Flags&FlagAssumedResistance == 0 || ev.Discharges[Corona].Possible || ev.CapacitanceModel != CapTypical {
		t.Errorf("roller: flags %b, corona %v, cap %v", ev.Flags, ev.Discharges[Corona].Possible, ev.CapacitanceModel)
	}
}

func TestEvaluateBackedBelt(t *testing.T) {
	lim := DefaultLimits()
	in := samples()["belt"]
	ev := Evaluate(in, gasEnv(IIA, Zone1, 0.24e-3), lim)
	// derived: sigma = eps0 E (1 + epsr z / t) = eps0 x 1e4 x 3001 = 2.657e-4 C/m^2.
	sigma := 8.8541878128e-12 * 1e4 * 3001
	near(t, "belt density", ev.ChargeDensity, sigma, 1e-9)
	// derived: I = sigma v w = 2.657e-4 x 2 x 0.5.
	near(t, "belt current", ev.ChargingCurrent, sigma, 1e-9)
	// derived: W = sigma^2 A t / (2 eps0 epsr), A = 0.5 m^2, t = 0.1 mm, epsr 3 -> 66.5 mJ.
	w := sigma * sigma * 0.5 * 1e-4 / (2 * 8.8541878128e-12 * 3)
	pb := ev.Discharges[PropagatingBrush]
	if !pb.Possible {
		t.Fatalf("propagating brush not possible: %s", pb.Reason())
	}
	near(t, "belt propagating energy", pb.Energy, w, 1e-9)
	near(t, "belt effective", ev.EffectiveEnergy, w, 1e-9)
	// derived: the layer's whole stored energy (66.5 mJ < 1 J bound), so the bound
	// Q = 2 W / V equals sigma A: the propagating brush's charge, the largest.
	near(t, "belt charge", ev.TransferredCharge, sigma*0.5, 1e-9)
	if ev.Flags&FlagSuspectReading != 0 {
		t.Error("thin backed layer flagged as suspect")
	}

	// Source: reference section 12 [C]: a bulk strength (30 kV/mm x 0.1 mm = 3 kV)
	// says nothing of a thin film, which holds 100-600 kV/mm: it never clears.
	in.Material.BreakdownStrength = 30e6
	if ev := Evaluate(in, gasEnv(IIA, Zone1, 0.24e-3), lim); !ev.Discharges[PropagatingBrush].Possible || ev.BreakdownSource != BreakdownThinFilm || ev.Assumed&AssumedBreakdownUnknown == 0 {
		t.Errorf("bulk 3 kV layer cleared: %s", ev.Discharges[PropagatingBrush].Reason())
	}
	// Source: TRGS 727 Annex C [C]: a measured layer breakdown <= 4 kV prevents it.
	in.LayerBreakdown = 3e3
	if ev := Evaluate(in, gasEnv(IIA, Zone1, 0.24e-3), lim); ev.Discharges[PropagatingBrush].Possible || ev.Discharges[PropagatingBrush].Code != ReasonPropLowBreakdown {
		t.Errorf("measured 3 kV layer: %s", ev.Discharges[PropagatingBrush].Reason())
	}
	// Source: TRGS 727 Annex C [C]: above 4 kV measured, still possible.
	in.LayerBreakdown = 5e3
	if ev := Evaluate(in, gasEnv(IIA, Zone1, 0.24e-3), lim); !ev.Discharges[PropagatingBrush].Possible {
		t.Errorf("measured 5 kV layer: %s", ev.Discharges[PropagatingBrush].Reason())
	}
	in.LayerBreakdown = math.NaN()
	// from memory: 8 mm and thicker: none expected.
	in.Material.BreakdownStrength, in.Thickness = 100e6, 10e-3
	if ev := Evaluate(in, gasEnv(IIA, Zone1, 0.24e-3), lim); ev.Discharges[PropagatingBrush].Code != ReasonPropThick {
		t.Errorf("10 mm layer: %s", ev.Discharges[PropagatingBrush].Reason())
	}
	// derived: a weaker reading leaves the layer able to hold one: flagged.
	in.Thickness, in.Field = 1e-4, 1e3
	ev = Evaluate(in, gasEnv(IIA, Zone1, 0.24e-3), lim)
	if ev.Discharges[PropagatingBrush].Code != ReasonPropBelowDensity || ev.Flags&FlagPropagatingLayer == 0 {
		t.Errorf("weak reading: %s, flags %b", ev.Discharges[PropagatingBrush].Reason(), ev.Flags)
	}
}

func TestEvaluateHumidity(t *testing.T) {
	lim := DefaultLimits()
	in := blank(Sheet)
	in.EarthedBacking, in.Thickness, in.Material.Permittivity = true, 1e-3, 3
	in.Material.SurfaceResistivity, in.Material.HumiditySlope = 1e12, 1
	in.Width, in.Field, in.FieldDistance = 0.5, 1e6, 0.05
	// derived: sigma = eps0 1e6 (1 + 3 x 50) = 1.337 mC/m^2; the air side a brush
	// drains, eps0 x 1 MV/m = 8.85 uC/m^2, is above every brush screen.
	dry := Evaluate(in, Environment{RelativeHumidity: 40, Atmosphere: Gas, Group: IIA, Zone: Zone1, MIE: 0.24e-3}, lim)
	if !dry.Discharges[Brush].Possible || dry.Dissipative {
		t.Fatalf("dry sheet: brush %s, dissipative %v", dry.Discharges[Brush].Reason(), dry.Dissipative)
	}
	// derived: one decade per 10 %RH: 1e8 ohm/sq at 90 % -> dissipative and earthed by its backing.
	wet := Evaluate(in, Environment{RelativeHumidity: 90, Atmosphere: Gas, Group: IIA, Zone: Zone1, MIE: 0.24e-3}, lim)
	near(t, "wet resistivity", wet.SurfaceResistivity, 1e8, 1e-9)
	// Principle 1 (issue 11): the reading of 8.85 uC/m^2 (air side) stands against the
	// humidity model; the contradiction is flagged.
	if !wet.Discharges[Brush].Possible || wet.Discharges[Brush].Code != ReasonBrushReadingOverHumidity || !wet.Dissipative || wet.Flags&FlagHumidityContradiction == 0 {
		t.Errorf("wet sheet: %s", wet.Discharges[Brush].Reason())
	}
	// derived: a reading of 1 kV/m gives eps0 1e3 = 8.85 nC/m^2 on the air side, below the
	// IIA screen 5 uC/m^2: cleared, and the humidity model says why.
	low := in
	low.Field = 1e3
	lowEv := Evaluate(low, Environment{RelativeHumidity: 90, Atmosphere: Gas, Group: IIA, Zone: Zone1, MIE: 0.24e-3}, lim)
	if lowEv.Discharges[Brush].Possible || lowEv.Discharges[Brush].Code != ReasonBrushLeaks || lowEv.Flags&FlagHumidityContradiction != 0 {
		t.Errorf("wet sheet, low reading: %s", lowEv.Discharges[Brush].Reason())
	}
	// derived: tau = rho_s (eps0 epsr / t) w^2 / pi^2.
	near(t, "strip decay", wet.DecayTime, 1e8*Eps0*3/1e-3*0.25/(math.Pi*math.Pi), 1e-9)
	// derived: a web that reaches the hazard faster than it decays keeps its charge.
	in.ChargingTime = wet.DecayTime / 10
	fast := Evaluate(in, Environment{RelativeHumidity: 90, Atmosphere: Gas, Group: IIA, Zone: Zone1, MIE: 0.24e-3}, lim)
	if !fast.Discharges[Brush].Possible || fast.Flags&FlagSlowDecay == 0 {
		t.Errorf("fast web: %s, flags %b", fast.Discharges[Brush].Reason(), fast.Flags)
	}
}

func TestEvaluateMissingInputs(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	sheetNoZ := blank(Sheet)
	sheetNoZ.Field = 1e5
	backedNoT := blank(Belt)
	backedNoT.EarthedBacking, backedNoT.Field, backedNoT.FieldDistance = true, 1e4, 0.1
	freeV := blank(Sheet)
	freeV.SurfacePotential = 5e3
	liquid := blank(Liquid)
	cases := []struct {
		name string
		in   Input
		want Missing
		text string
	}{
		{"unknown kind", blank(KindUnknown), MissingKind, "Kind"},
		{"part", blank(Part), MissingConductorCharging, "Charging current"},
		{"sheet", blank(Sheet), MissingSurfaceReading, "Field"},
		{"sheet no distance", sheetNoZ, MissingFieldDistance, "Field distance"},
		{"backed no thickness", backedNoT, MissingThickness, "Thickness"},
		{"free sheet potential", freeV, MissingSurfaceGeometry, "Distance to earth"},
		{"liquid", liquid, MissingLiquidFlow, "Speed and Diameter"},
	}
	for _, c := range cases {
		ev := Evaluate(c.in, env, lim)
		if ev.NotAssessed&c.want == 0 {
			t.Errorf("%s: NotAssessed %b lacks %b", c.name, ev.NotAssessed, c.want)
			continue
		}
		if txt := strings.Join(ev.NotAssessed.Texts(), "; "); !strings.Contains(txt, c.text) {
			t.Errorf("%s: texts %q lack %q", c.name, txt, c.text)
		}
	}
}

func TestEvaluatePersonWalking(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	in := blank(Person)
	in.Resistance = 1e10
	ev := Evaluate(in, env, lim)
	// Source: Jonassen [C] 1 uA walking; derived: 1 uA x 1e10 ohm = 10 kV; 200 pF -> 10 mJ,
	// the typical stored energy of a person (TRGS 727 7.1 [C]).
	near(t, "walking potential", ev.Potential, 10e3, 1e-9)
	near(t, "walking energy", ev.StoredEnergy, 10e-3, 1e-9)
	in.Resistance = 1e12
	ev = Evaluate(in, env, lim)
	// derived: capped at PersonMaxPotential 15 kV.
	near(t, "capped person", ev.Potential, 15e3, 1e-12)
	if ev.Flags&FlagCappedPerson == 0 {
		t.Error("person cap not flagged")
	}
	in.Resistance = math.NaN()
	ev = Evaluate(in, env, lim)
	// derived: resistance unknown, so no leakage: the walking current charges the body
	// without bound, capped at PersonMaxPotential 15 kV; 200 pF -> 22.5 mJ (the stricter
	// case: never below any known resistance's estimate).
	near(t, "person unknown resistance", ev.Potential, 15e3, 1e-12)
	near(t, "person unknown resistance energy", ev.StoredEnergy, 22.5e-3, 1e-12)
	if ev.NotAssessed != 0 || ev.Flags&FlagAssumedResistance == 0 {
		t.Errorf("person unknown resistance: missing %b, flags %b", ev.NotAssessed, ev.Flags)
	}
	in.Resistance = 1e7
	ev = Evaluate(in, env, lim)
	// derived: 1 uA x 1e7 ohm = 10 V: no spark.
	if ev.Discharges[Spark].Possible {
		t.Error("earthed person sparks")
	}
}

func TestEvaluateCapacitanceModels(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	c := blank(Container)
	c.Diameter, c.Thickness, c.Permittivity, c.SurfacePotential = 0.6, 0.07, 2, 1e3
	ev := Evaluate(c, env, lim)
	// derived: reference 2: 600 mm drum on 70 mm pallet epsr 2 -> 71.5 pF (BG RCI FAQ 7.15: about 70 pF).
	near(t, "pallet", ev.Capacitance, 71.5e-12, 1e-3)
	if ev.CapacitanceModel != CapParallelPlate {
		t.Errorf("model %v", ev.CapacitanceModel)
	}
	r := blank(Part)
	r.Diameter, r.Length, r.DistanceToEarth, r.SurfacePotential = 1e-3, 1, 1-0.5e-3, 1e3
	ev = Evaluate(r, env, lim)
	// derived: reference 2: r 0.5 mm, axis 1 m over earth, 1 m long -> 6.71 pF.
	near(t, "cylinder", ev.Capacitance, 6.71e-12, 1e-3)
	// Vessel size table (reference sections 2 and 12, from memory): never the isolated
	// sphere for a floor-standing vessel.
	vessels := []struct {
		name string
		d, l float64
		want float64
	}{
		// A 4 m vessel: the sphere would give 222.6 pF (textbook); the table's vessel class 1000 pF.
		{"vessel by diameter", 4, math.NaN(), 1000e-12},
		// 200 L drum, 0.57 m x 0.88 m: pi/4 x 0.57^2 x 0.88 = 0.2246 m^3 <= 0.25: 100 pF.
		{"drum by volume", 0.57, 0.88, 100e-12},
		// 0.8 m x 0.9 m: 0.452 m^3, container of 250-500 L: 300 pF.
		{"container by volume", 0.8, 0.9, 300e-12},
		// IBC about 1.0 m x 1.2 m: 0.94 m^3: 1000 pF (IBC, vessel or tanker).
		{"IBC by volume", 1.0, 1.2, 1000e-12},
		// Only the diameter, 0.6 m: drum class by diameter (<= 0.65 m): 100 pF.
		{"drum by diameter", 0.6, math.NaN(), 100e-12},
		// No size: the largest class, the stricter case.
		{"size unknown", math.NaN(), math.NaN(), 1000e-12},
		// A 30 m tank: the sphere of radius 15 m (1669.6 pF, textbook) exceeds 1000 pF and is taken as a lower bound.
		{"very large tank", 30, math.NaN(), 4 * math.Pi * Eps0 * 15},
	}
	for _, v := range vessels {
		big := blank(Container)
		big.Diameter, big.Length, big.SurfacePotential = v.d, v.l, 1e3
		ev = Evaluate(big, env, lim)
		near(t, v.name, ev.Capacitance, v.want, 1e-3)
		if ev.CapacitanceModel != CapSizeTable {
			t.Errorf("%s: model %v", v.name, ev.CapacitanceModel)
		}
		if v.name == "size unknown" && ev.Assumed&AssumedVesselSize == 0 {
			t.Errorf("%s: vessel-size assumption not recorded", v.name)
		}
	}
}

func TestEvaluateCone(t *testing.T) {
	lim := DefaultLimits()
	env := Environment{RelativeHumidity: 40, Temperature: 293.15, Atmosphere: Dust, Group: IIIB, Zone: Zone20, MIE: 10e-3}
	in := blank(Powder)
	in.Diameter, in.Length, in.ParticleSize = 1, 2, 1e-3
	in.Material.VolumeResistivity = 1e12
	in.MassFlow, in.ChargeToMass = 1, 10e-6
	ev := Evaluate(in, env, lim)
	// from memory (Glor), reference 10.7: D 1 m, d 1 mm -> 5.22 mJ.
	near(t, "cone energy", ev.EffectiveEnergy, 5.22e-3, 1e-9)
	if ev.Effective != Cone || ev.Discharges[Spark].Code != ReasonSparkNoContainer {
		t.Errorf("effective %v, spark %s", ev.Effective, ev.Discharges[Spark].Reason())
	}
	// Source: JNIOSH-TR and BG RCI FAQ 5.10 [C] screens.
	screens := []struct {
		name string
		mod  func(*Input)
		code Reason
	}{
		{"resistivity", func(i *Input) { i.Material.VolumeResistivity = 1e8 }, ReasonConeLowResistivity},
		{"charge", func(i *Input) { i.ChargeToMass = 1e-8 }, ReasonConeLowCharge},
		// JNIOSH-TR [C]: a small container or a low heap field alone does not clear;
		// both together do.
		{"volume alone", func(i *Input) { i.Diameter, i.Length = 0.5, 0.5 }, ReasonConePossible},
		{"field alone", func(i *Input) { i.Field = 300e3 }, ReasonConePossible},
		{"field and volume", func(i *Input) { i.Diameter, i.Length, i.Field = 0.5, 0.5, 300e3 }, ReasonConeFieldAndVessel},
		{"range", func(i *Input) { i.Diameter = 5 }, ReasonConeAboveRange},
		{"below range", func(i *Input) { i.Diameter = 0.3 }, ReasonConeOutsideRange},
	}
	for _, s := range screens {
		x := in
		s.mod(&x)
		d := Evaluate(x, env, lim).Discharges[Cone]
		if d.Code != s.code {
			t.Errorf("%s: %s", s.name, d.Reason())
		}
	}
}

func TestEvaluateBags(t *testing.T) {
	lim := DefaultLimits()
	dust := Environment{RelativeHumidity: 40, Atmosphere: Dust, Group: IIIB, Zone: Zone21, MIE: 10e-3}
	cases := []struct {
		name     string
		typ      BagType
		r        float64
		allowed  bool
		possible DischargeType
	}{
		// Source: IEC 61340-4-4:2018 usage table (reference 8b): 10 mJ dust in zone 21: B, C, D.
		{"A", BagA, math.NaN(), false, PropagatingBrush},
		{"B", BagB, math.NaN(), true, Brush},
		{"C earthed", BagC, 1e5, true, NoDischarge},
		{"C unearthed", BagC, math.NaN(), true, Spark},
		{"D", BagD, math.NaN(), true, Corona},
		{"unknown", BagUnknown, math.NaN(), false, PropagatingBrush},
	}
	for _, c := range cases {
		in := blank(Bag)
		in.BagType, in.Resistance = c.typ, c.r
		ev := Evaluate(in, dust, lim)
		if ev.BagAllowed != c.allowed {
			t.Errorf("%s: allowed %v, want %v (%s)", c.name, ev.BagAllowed, c.allowed, ev.BagCode.Text(0, 0))
		}
		if c.possible != NoDischarge && !ev.Discharges[c.possible].Possible {
			t.Errorf("%s: %v not possible", c.name, c.possible)
		}
		if c.possible == NoDischarge && ev.EffectiveEnergy != 0 {
			t.Errorf("%s: effective %g, want 0", c.name, ev.EffectiveEnergy)
		}
	}
	in := blank(Bag)
	in.BagType = BagC
	ev := Evaluate(in, dust, lim)
	// derived: assumed 3 uA into 1e13 ohm, typical 300 pF: potential far above 300 V, spark energy C V^2 / 2.
	if ev.Flags&FlagBagNotEarthed == 0 || ev.Assumed&AssumedBagCurrent == 0 || ev.Capacitance != BagCapacitance {
		t.Errorf("unearthed C: flags %b, assumed %b, C %g", ev.Flags, ev.Assumed, ev.Capacitance)
	}
	near(t, "unearthed C energy", ev.Discharges[Spark].Energy, 0.5*300e-12*ev.Potential*ev.Potential, 1e-12)
	in.ChargingCurrent = 10e-6
	if ev := Evaluate(in, dust, lim); ev.Flags&FlagBagCurrentAboveQualified == 0 {
		t.Error("10 uA into a type C bag not flagged")
	}
	in = blank(Bag)
	if ev := Evaluate(in, dust, lim); ev.Assumed&AssumedBagTypeA == 0 || ev.Assumed&AssumedProductMIE == 0 {
		t.Errorf("unknown bag: assumed %b", ev.Assumed)
	}
}

func TestEvaluateLiquidBranches(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	in := blank(Liquid)
	in.Speed, in.Diameter, in.Filling = 1, 0.05, FillTop
	ev := Evaluate(in, env, lim)
	// Unknown conductivity, vessel, resistance: top filling breaks the splash clause, the
	// brush is counted, and the vessel is judged as an unearthed conductor.
	if ev.Assumed&AssumedLowConductivity == 0 || ev.Flags&FlagSplashFilling == 0 || ev.Discharges[Brush].Code != ReasonBrushLiquidBreach ||
		!ev.LiquidBreaches.Has(ClauseSplash) || ev.Discharges[Spark].Code != ReasonSparkPossible || ev.Assumed&AssumedVesselCapacitance == 0 {
		t.Errorf("unknown conductivity: assumed %b flags %b brush %s", ev.Assumed, ev.Flags, ev.Discharges[Brush].Reason())
	}
	// Source: reference section 8 (typical values, from memory): acetone 6e6 pS/m, epsr 21: relaxes.
	in.Conductivity, in.Permittivity = 6e6*1e-12, 21
	ev = Evaluate(in, env, lim)
	if ev.Discharges[Brush].Possible || ev.ConductivityClass != ConductivityHigh {
		t.Errorf("acetone: %s", ev.Discharges[Brush].Reason())
	}
	// derived: tau = eps0 x 21 / 6e-6 = 31 us.
	near(t, "acetone relaxation", ev.RelaxationTime, Eps0*21/6e-6, 1e-12)
}

func TestEffectiveExcludesBrushForDust(t *testing.T) {
	// Source: CCPS glossary [C]: brush discharges do not ignite dust clouds, only gases and hybrids.
	for a, want := range map[AtmosphereKind]bool{Gas: true, Vapour: true, Mist: true, Hybrid: true, Dust: false, NoAtmosphere: false} {
		if a.IgnitedByBrush() != want {
			t.Errorf("%v.IgnitedByBrush() = %v, want %v", a, !want, want)
		}
	}
}

func TestEvaluateDoesNotAllocate(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIB, Zone1, 0.2e-3)
	for name, in := range samples() {
		allocs := testing.AllocsPerRun(200, func() { _ = Evaluate(in, env, lim) })
		if allocs != 0 {
			t.Errorf("%s: %v allocs per Evaluate, want 0", name, allocs)
		}
	}
}

func BenchmarkEvaluate(b *testing.B) {
	lim := DefaultLimits()
	env := gasEnv(IIB, Zone1, 0.2e-3)
	s := samples()
	for _, name := range []string{"sheet", "belt", "roller", "container", "part", "person", "powder", "liquid", "bag"} {
		in, ok := s[name]
		if !ok {
			in = s["drum"]
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				_ = Evaluate(in, env, lim)
			}
		})
	}
}
