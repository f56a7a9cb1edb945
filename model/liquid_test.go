package model

import (
	"math"
	"testing"
)

// fill is a liquid row filled into an earthed metal vessel of class c by the
// bottom, slow start kept, no filter, no second phase: a fill that meets every
// clause unless the case changes it.
func fill(c VesselClass, kappa, v, d float64) Input {
	in := blank(Liquid)
	in.Conductivity, in.Permittivity = kappa, 2
	in.Speed, in.Diameter = v, d
	in.VesselMaterial, in.VesselClass = VesselMetal, c
	in.Filling, in.InletVelocity = FillBottom, 0.9
	in.Filter, in.SecondPhase = FilterNone, PhaseNone
	in.Resistance, in.Capacitance = 1e3, 100e-12
	return in
}

// TestLiquidRulesByVesselAndClass: one hand-worked fill per vessel class and
// conductivity class, each just inside and just outside its limit (v d relative
// 1e-3 from it).
func TestLiquidRulesByVesselAndClass(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3) // toluene vapour (reference section 4: 0.24 mJ)
	const low, lowHigh, medium, high = 5e-12, 20e-12, 500e-12, 1e-6
	tests := []struct {
		name     string
		in       Input
		want     LiquidClause // clauses broken
		vdLimit  float64      // m^2/s; NaN: not applicable
		brushNow bool
	}{
		// Source: IEC TS 60079-32-1 road tankers, via reference section 8 [C v d]: 0.38 m^2/s
		// at or below 10 pS/m, 0.5 above. derived: 3.796 x 0.1 = 0.3796; 3.804 x 0.1 = 0.3804.
		{"road tanker low inside", fill(VesselRoadTanker, low, 3.796, 0.1), 0, 0.38, false},
		{"road tanker low outside", fill(VesselRoadTanker, low, 3.804, 0.1), ClauseVD, 0.38, true},
		{"road tanker 10-50 pS/m inside", fill(VesselRoadTanker, lowHigh, 4.995, 0.1), 0, 0.5, false},
		{"road tanker 10-50 pS/m outside", fill(VesselRoadTanker, lowHigh, 5.005, 0.1), ClauseVD, 0.5, true},
		{"road tanker unknown conductivity", fill(VesselRoadTanker, math.NaN(), 3.804, 0.1), ClauseVD, 0.38, true},
		// from memory: rail tank cars 0.75 m^2/s. derived: 4.995 x 0.15 = 0.74925; 5.005 x 0.15 = 0.75075.
		{"rail tank car inside", fill(VesselRailCar, low, 4.995, 0.15), 0, 0.75, false},
		{"rail tank car outside", fill(VesselRailCar, low, 5.005, 0.15), ClauseVD, 0.75, true},
		// from memory, a screening choice: fixed tanks below 10 m, IBCs, drums and cans take
		// the road-tanker values; a fixed tank of 10 m or more has velocity limits only.
		{"fixed tank 5 m outside", func() Input { in := fill(VesselFixedTank, low, 3.804, 0.1); in.VesselDiameter = 5; return in }(), ClauseVD, 0.38, true},
		{"fixed tank 12 m no v d", func() Input { in := fill(VesselFixedTank, low, 6.99, 0.2); in.VesselDiameter = 12; return in }(), 0, math.Inf(1), false},
		{"fixed tank 12 m ceiling", func() Input { in := fill(VesselFixedTank, low, 7.01, 0.2); in.VesselDiameter = 12; return in }(), ClauseCeiling, math.Inf(1), true},
		{"fixed tank no diameter", fill(VesselFixedTank, low, 3.804, 0.1), ClauseVD, 0.38, true},
		// The large-tank boundary (10 m, a screening choice): 9.99 m keeps the v d limit, 10 m drops it.
		{"fixed tank 9.99 m", func() Input { in := fill(VesselFixedTank, low, 3.804, 0.1); in.VesselDiameter = 9.99; return in }(), ClauseVD, 0.38, true},
		{"fixed tank 10 m", func() Input { in := fill(VesselFixedTank, low, 3.804, 0.1); in.VesselDiameter = 10; return in }(), 0, math.Inf(1), false},
		{"IBC inside", fill(VesselIBC, low, 3.796, 0.1), 0, 0.38, false},
		{"IBC outside", fill(VesselIBC, low, 3.804, 0.1), ClauseVD, 0.38, true},
		// derived: 7.608 m/s in 50 mm breaks the v d limit (0.3804) and the 7 m/s ceiling.
		{"IBC outside both", fill(VesselIBC, low, 7.608, 0.05), ClauseVD | ClauseCeiling, 0.38, true},
		// derived: 1.518 x 0.25 = 0.3795; 1.522 x 0.25 = 0.3805; 1.998 x 0.25 = 0.4995; 2.002 x 0.25 = 0.5005.
		{"drum inside", fill(VesselDrum, low, 1.518, 0.25), 0, 0.38, false},
		{"drum outside", fill(VesselDrum, low, 1.522, 0.25), ClauseVD, 0.38, true},
		{"can inside", fill(VesselCan, lowHigh, 1.998, 0.25), 0, 0.5, false},
		{"can outside", fill(VesselCan, lowHigh, 2.002, 0.25), ClauseVD, 0.5, true},
		// An unknown class takes the strictest class: 0.38 m^2/s (derived from the table).
		{"unknown class", fill(VesselUnknown, low, 3.804, 0.1), ClauseVD, 0.38, true},
		// from memory, reference section 12: medium and high conductivity in an earthed
		// metal vessel need earthing and the 7 m/s ceiling only (6.99 x 0.2 = 1.4 m^2/s is fine).
		{"medium inside ceiling", fill(VesselRoadTanker, medium, 6.99, 0.2), 0, math.NaN(), false},
		{"medium outside ceiling", fill(VesselRoadTanker, medium, 7.01, 0.2), ClauseCeiling, math.NaN(), false},
		{"high inside ceiling", fill(VesselDrum, high, 6.99, 0.2), 0, math.NaN(), false},
		{"high outside ceiling", fill(VesselDrum, high, 7.01, 0.2), ClauseCeiling, math.NaN(), false},
	}
	for _, tc := range tests {
		ev := Evaluate(tc.in, env, lim)
		if ev.LiquidBreaches != tc.want {
			t.Errorf("%s: clauses broken %b, want %b", tc.name, ev.LiquidBreaches, tc.want)
		}
		if math.IsNaN(tc.vdLimit) != math.IsNaN(ev.VDLimit) || (!math.IsNaN(tc.vdLimit) && ev.VDLimit != tc.vdLimit) {
			t.Errorf("%s: v d limit %g, want %g", tc.name, ev.VDLimit, tc.vdLimit)
		}
		if b := ev.Discharges[Brush]; b.Possible != tc.brushNow {
			t.Errorf("%s: brush possible %v, want %v (%s)", tc.name, b.Possible, tc.brushNow, b.Reason())
		}
		// Earthed through 1 kohm: the vessel's potential stays far below the spark floor.
		if ev.Discharges[Spark].Possible {
			t.Errorf("%s: spark possible from an earthed vessel", tc.name)
		}
		if tc.want == 0 && ev.EffectiveEnergy != 0 {
			t.Errorf("%s: a compliant fill has an effective energy %g", tc.name, ev.EffectiveEnergy)
		}
	}
}

// TestLiquidClauseBoundaries: the slow start, the second phase, the residence time
// after a filter, splash filling and the insulating vessel, each just inside and
// just outside.
func TestLiquidClauseBoundaries(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	base := fill(VesselRoadTanker, 5e-12, 3, 0.1) // v d 0.3: compliant
	with := func(f func(*Input)) Input { in := base; f(&in); return in }
	tests := []struct {
		name string
		in   Input
		want LiquidClause
	}{
		{"compliant", base, 0},
		// from memory (reference section 8 [M]): 1 m/s until the inlet is submerged.
		{"slow start 0.99", with(func(in *Input) { in.InletVelocity = 0.99 }), 0},
		{"slow start 1.01", with(func(in *Input) { in.InletVelocity = 1.01 }), ClauseSlowStart},
		{"slow start not given: not shown met", with(func(in *Input) { in.InletVelocity = math.NaN() }), ClauseSlowStart},
		{"slow start not given, line at 0.5 m/s: still not shown met", with(func(in *Input) { in.InletVelocity, in.Speed = math.NaN(), 0.5 }), ClauseSlowStart},
		{"dip pipe 1.01", with(func(in *Input) { in.Filling, in.InletVelocity = FillDipPipe, 1.01 }), ClauseSlowStart},
		// IEC TS 60079-32-1 (from memory): no splash filling of low-conductivity liquids.
		{"top fill", with(func(in *Input) { in.Filling = FillTop }), ClauseSplash},
		{"filling unknown", with(func(in *Input) { in.Filling = FillUnknown }), ClauseSplash},
		// from memory (reference section 12 [M]): 1 m/s with a second phase.
		{"second phase 0.99", with(func(in *Input) { in.SecondPhase, in.Speed = PhaseWater, 0.99 }), 0},
		{"second phase 1.01", with(func(in *Input) { in.SecondPhase, in.Speed = PhaseWater, 1.01 }), ClauseSecondPhase},
		// Residence after a fine filter: min(3 tau, 100 s) (from memory). derived: 5 pS/m, epsr 2:
		// tau = 8.854e-12 x 2 / 5e-12 = 3.5417 s, 3 tau = 10.625 s.
		{"residence 10.7 s", with(func(in *Input) { in.Filter, in.FilterResidence = FilterFine, 10.7 }), 0},
		{"residence 10.5 s", with(func(in *Input) { in.Filter, in.FilterResidence = FilterFine, 10.5 }), ClauseResidence},
		{"residence not given", with(func(in *Input) { in.Filter = FilterFine }), ClauseResidence},
		// derived: 0.1 pS/m: tau = 177.08 s, 3 tau = 531 s, so the fixed 100 s applies.
		{"residence 100.1 s at 0.1 pS/m", with(func(in *Input) { in.Conductivity, in.Filter, in.FilterResidence = 0.1e-12, FilterFine, 100.1 }), 0},
		{"residence 99.9 s at 0.1 pS/m", with(func(in *Input) { in.Conductivity, in.Filter, in.FilterResidence = 0.1e-12, FilterFine, 99.9 }), ClauseResidence},
		{"strainer needs no residence", with(func(in *Input) { in.Filter = FilterStrainer }), 0},
		// No safe limits for a low-conductivity liquid in an insulating vessel (from memory);
		// an unknown material is taken as insulating for this rule.
		{"insulating vessel", with(func(in *Input) { in.VesselMaterial = VesselInsulating }), ClauseInsulatingVessel},
		{"glass vessel", with(func(in *Input) { in.VesselMaterial = VesselGlass }), ClauseInsulatingVessel},
		{"unknown material", with(func(in *Input) { in.VesselMaterial = VesselMaterialUnknown }), ClauseInsulatingVessel},
		{"lined vessel: metal rules", with(func(in *Input) { in.VesselMaterial = VesselLined }), 0},
		{"flow not given", with(func(in *Input) { in.Speed = math.NaN(); in.InletVelocity = 0.9 }), ClauseVD},
	}
	for _, tc := range tests {
		ev := Evaluate(tc.in, env, lim)
		if ev.LiquidBreaches != tc.want {
			t.Errorf("%s: clauses broken %b, want %b", tc.name, ev.LiquidBreaches, tc.want)
		}
		wantBrush := tc.want != 0
		if b := ev.Discharges[Brush]; b.Possible != wantBrush {
			t.Errorf("%s: brush possible %v, want %v (%s)", tc.name, b.Possible, wantBrush, b.Reason())
		}
	}
	// derived: 5 pS/m, epsr 2: 3 tau = 10.625 s needed after the filter.
	ev := Evaluate(with(func(in *Input) { in.Filter, in.FilterResidence = FilterFine, 10.7 }), env, lim)
	near(t, "filter residence", ev.FilterResidence, 3*Eps0*2/5e-12, 1e-12)
	// A medium-conductivity liquid (500 pS/m) with free water is low for the rules below
	// 1000 pS/m (reference section 8 [C]); not above it.
	m := with(func(in *Input) { in.Conductivity, in.SecondPhase, in.Speed = 500e-12, PhaseWater, 1.01 })
	if ev := Evaluate(m, env, lim); ev.RuleClass != ConductivityLow || ev.Flags&FlagSecondPhaseLow == 0 || !ev.LiquidBreaches.Has(ClauseSecondPhase) {
		t.Errorf("500 pS/m with water: rule class %v flags %b clauses %b", ev.RuleClass, ev.Flags, ev.LiquidBreaches)
	}
	m.Conductivity = 2000e-12
	if ev := Evaluate(m, env, lim); ev.RuleClass != ConductivityMedium || ev.LiquidBreaches != 0 {
		t.Errorf("2000 pS/m with water: rule class %v clauses %b", ev.RuleClass, ev.LiquidBreaches)
	}
	// The 1000 pS/m boundary (reference section 8 [C]): 999 pS/m with water is low, 1000 is not.
	m.Conductivity = 999e-12
	if ev := Evaluate(m, env, lim); ev.RuleClass != ConductivityLow {
		t.Errorf("999 pS/m with water: rule class %v", ev.RuleClass)
	}
	m.Conductivity = 1000e-12
	if ev := Evaluate(m, env, lim); ev.RuleClass != ConductivityMedium {
		t.Errorf("1000 pS/m with water: rule class %v", ev.RuleClass)
	}
	// The 50 pS/m class boundary (IEC TS 60079-32-1 [C]): 50 pS/m is low, 51 pS/m medium
	// (no second phase: the 7 m/s ceiling only, so 5 m/s in 100 mm, v d 0.5, clears).
	h := with(func(in *Input) { in.Conductivity, in.Speed = 50e-12, 5.01 })
	if ev := Evaluate(h, env, lim); ev.RuleClass != ConductivityLow || !ev.LiquidBreaches.Has(ClauseVD) {
		t.Errorf("50 pS/m: rule class %v clauses %b", ev.RuleClass, ev.LiquidBreaches)
	}
	h.Conductivity = 51e-12
	if ev := Evaluate(h, env, lim); ev.RuleClass != ConductivityMedium || ev.LiquidBreaches != 0 {
		t.Errorf("51 pS/m: rule class %v clauses %b", ev.RuleClass, ev.LiquidBreaches)
	}
}

// TestLiquidChargeFactor: the documented factors on the plain-pipe streaming current.
func TestLiquidChargeFactor(t *testing.T) {
	lim := DefaultLimits()
	tau := Eps0 * 2 / 5e-12 // derived: 3.5417 s
	tests := []struct {
		name  string
		f     Filter
		t     float64
		phase SecondPhase
		want  float64
	}{
		{"plain", FilterNone, math.NaN(), PhaseNone, 1},
		// from memory (reference section 12): micro-filters 10-100 x; the upper end taken.
		{"filter, no residence", FilterFine, math.NaN(), PhaseNone, 100},
		// derived: 100 exp(-10 / 3.5417) = 5.9396.
		{"filter, 10 s", FilterFine, 10, PhaseNone, 5.939634013310482},
		// derived: after 30 s, 100 exp(-8.47) < 1: the pipe after the filter charges it again (1).
		{"filter, 30 s", FilterFine, 30, PhaseNone, 1},
		{"strainer", FilterStrainer, math.NaN(), PhaseNone, 1},
		// a screening choice: x 10 for a second phase.
		{"water", FilterNone, math.NaN(), PhaseWater, 10},
		{"filter and solids", FilterFine, math.NaN(), PhaseSolids, 1000},
	}
	for _, tc := range tests {
		near(t, tc.name, LiquidChargeFactor(tc.f, tc.t, tau, tc.phase, &lim), tc.want, 1e-9)
	}
}

// TestIsolatedConductiveLiquid: a solvent of medium or high conductivity pumped
// through a fine filter into a plastic IBC is an isolated conductor.
func TestIsolatedConductiveLiquid(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	in := blank(Liquid)
	// Ethyl acetate 4.6e5 pS/m, epsr 6 (reference section 8, from memory), 2 m/s in 50 mm.
	in.Conductivity, in.Permittivity = 4.6e5*1e-12, 6
	in.Speed, in.Diameter = 2, 0.05
	in.VesselMaterial, in.VesselClass = VesselInsulating, VesselIBC
	in.Filling, in.Filter, in.FilterResidence, in.SecondPhase = FillTop, FilterFine, 0, PhaseNone
	ev := Evaluate(in, env, lim)
	// derived: 3.75e-6 x 2^2 x 0.05^2 = 3.75e-8 A plain pipe; x 100 after the filter with
	// no residence = 3.75e-6 A. Capacitance the IBC's typical 300 pF (from memory).
	near(t, "plain current", ev.StreamingCurrent, 3.75e-8, 1e-9)
	near(t, "charging current", ev.ChargingCurrent, 3.75e-6, 1e-9)
	near(t, "IBC capacitance", ev.Capacitance, 300e-12, 1e-12)
	if !ev.LiquidBreaches.Has(ClauseIsolatedLiquid) || ev.LiquidBreaches&^ClauseIsolatedLiquid != 0 {
		t.Errorf("clauses broken %b, want the isolated liquid only", ev.LiquidBreaches)
	}
	if sp := ev.Discharges[Spark]; !sp.Possible || sp.Code != ReasonSparkLiquidIsolated {
		t.Errorf("spark %+v: want possible, isolated liquid", sp)
	}
	if ev.Discharges[Brush].Possible || ev.Assumed&AssumedVesselCapacitance == 0 || ev.Assumed&AssumedNotEarthed == 0 {
		t.Errorf("brush %v assumed %b", ev.Discharges[Brush].Possible, ev.Assumed)
	}
	if got := CurrentCase(&in, &ev); got != "plain-pipe streaming current × 100 for a fine filter upstream" {
		t.Errorf("current case %q", got)
	}
	// Earthed through a dip pipe: 1e5 ohm. derived: V = 3.75e-6 x 1e5 = 0.375 V, no spark.
	in.Filling, in.Resistance = FillDipPipe, 1e5
	ev = Evaluate(in, env, lim)
	near(t, "earthed potential", ev.Potential, 0.375, 1e-9)
	if ev.Discharges[Spark].Possible || ev.LiquidBreaches != 0 {
		t.Errorf("earthed liquid: spark %v clauses %b", ev.Discharges[Spark].Possible, ev.LiquidBreaches)
	}
	// A low-conductivity liquid in the same IBC is no conductor, and has no safe limits.
	in.Conductivity = 1e-12
	ev = Evaluate(in, env, lim)
	if ev.Discharges[Spark].Code != ReasonSparkInsulatingVessel || ev.Discharges[Brush].Code != ReasonBrushLiquidNoSafeLimits {
		t.Errorf("toluene in a plastic IBC: %s / %s", ev.Discharges[Spark].Reason(), ev.Discharges[Brush].Reason())
	}
	// A vessel class left blank takes the largest typical capacitance (1000 pF, from memory).
	in.Conductivity, in.VesselClass, in.Resistance = 4.6e5*1e-12, VesselUnknown, math.NaN()
	ev = Evaluate(in, env, lim)
	near(t, "unknown class capacitance", ev.Capacitance, 1000e-12, 1e-12)
	// With a 1 s charging time a small vessel charges higher. derived: an unknown
	// resistance leaks nothing, V = I t / C with I = 3.75 uA, capped at the 50 kV
	// realistic maximum of an unmeasured potential (common practice, no source);
	// can 50 pF: 75 kV -> 50 kV, W = 62.5 mJ; drum 100 pF: 37.5 kV, W = 70.3 mJ;
	// 1000 pF: 3.75 kV, W = 7.0 mJ: the drum's 100 pF gives the largest spark.
	in.ChargingTime = 1
	ev = Evaluate(in, env, lim)
	near(t, "unknown class, 1 s: capacitance", ev.Capacitance, 100e-12, 1e-12)
	near(t, "unknown class, 1 s: energy", ev.StoredEnergy, 0.5*100e-12*37.5e3*37.5e3, 1e-9)
}

// TestUnstatedFilterAndPhaseAreStricter: a filter or second phase not stated is
// taken as present (unknown means the stricter case), and never gives a milder result.
func TestUnstatedFilterAndPhaseAreStricter(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	base := fill(VesselRoadTanker, 5e-12, 3, 0.1) // compliant with none stated as none
	blankFilter, blankPhase := base, base
	blankFilter.Filter = FilterUnknown
	blankPhase.SecondPhase = PhaseUnknown
	// derived: a fine filter with no residence: 3 tau = 10.6 s not met; a second phase at 3 m/s > 1 m/s.
	if ev := Evaluate(blankFilter, env, lim); ev.LiquidBreaches != ClauseResidence || ev.ChargeFactor != 100 || ev.Assumed&AssumedNoFilter == 0 {
		t.Errorf("filter not stated: clauses %b factor %g", ev.LiquidBreaches, ev.ChargeFactor)
	}
	if ev := Evaluate(blankPhase, env, lim); ev.LiquidBreaches != ClauseSecondPhase || ev.ChargeFactor != 10 || ev.Assumed&AssumedNoSecondPhase == 0 {
		t.Errorf("second phase not stated: clauses %b factor %g", ev.LiquidBreaches, ev.ChargeFactor)
	}
	// A medium liquid (500 pS/m) with no second phase stated is low for the rules (below 1000 pS/m).
	m := blankPhase
	m.Conductivity = 500e-12
	if ev := Evaluate(m, env, lim); ev.RuleClass != ConductivityLow {
		t.Errorf("500 pS/m, phase not stated: rule class %v", ev.RuleClass)
	}
	for _, f := range []Filter{FilterNone, FilterStrainer, FilterFine} {
		for _, p := range []SecondPhase{PhaseNone, PhaseWater, PhaseSolids, PhaseImmiscible} {
			k := LiquidChargeFactor(f, math.NaN(), 3.54, p, &lim)
			if u := LiquidChargeFactor(FilterUnknown, math.NaN(), 3.54, PhaseUnknown, &lim); u < k {
				t.Errorf("unknown factor %g below %v/%v's %g", u, f, p, k)
			}
		}
	}
}

// TestParseLiquidWords: survey spellings and aliases; an unknown word is an error.
func TestParseLiquidWords(t *testing.T) {
	if c, err := ParseVesselClass("Rail tank car"); err != nil || c != VesselRailCar {
		t.Errorf("rail tank car: %v %v", c, err)
	}
	if c, err := ParseVesselClass("ibc"); err != nil || c != VesselIBC {
		t.Errorf("ibc: %v %v", c, err)
	}
	if _, err := ParseVesselClass("barge"); err == nil {
		t.Error("barge: no error")
	}
	if m, err := ParseVesselMaterial("plastic"); err != nil || m != VesselInsulating {
		t.Errorf("plastic: %v %v", m, err)
	}
	if f, err := ParseFilter("micro-filter"); err != nil || f != FilterFine {
		t.Errorf("micro-filter: %v %v", f, err)
	}
	if p, err := ParseSecondPhase("free water"); err != nil || p != PhaseWater {
		t.Errorf("free water: %v %v", p, err)
	}
	if p, err := ParseSecondPhase(""); err != nil || p != PhaseUnknown {
		t.Errorf("blank: %v %v", p, err)
	}
}

// TestLiquidRulesTable: every clause has a rule row for every vessel class, with a reference.
func TestLiquidRulesTable(t *testing.T) {
	for c := LiquidClause(1); c < 1<<numLiquidClauses; c <<= 1 {
		for v := VesselUnknown; v < NumVesselClasses; v++ {
			r, ok := c.Rule(v)
			if !ok || r.Ref == "" || r.Rule == "" {
				t.Errorf("clause %b vessel %v: no rule row", c, v)
			}
		}
	}
	if r, _ := ClauseVD.Rule(VesselRoadTanker); r.FromMemory {
		t.Error("road-tanker v d limits are confirmed (reference section 8 [C])")
	}
}

// TestUnknownConductivityInInsulatingVessel: a liquid whose conductivity is not
// on the row (blank, or only a list's typical value) filled into a plastic IBC
// takes the conductive case for the spark of the isolated liquid as well as the
// low case for the filling clauses and the surface brush (principle 2)
// (IEC TS 60079-32-1:2013+A1:2017 clause 7, conductive liquids in insulating
// containers; reference section 12: a conductive liquid in an insulating
// container is an isolated conductor).
func TestUnknownConductivityInInsulatingVessel(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	for _, c := range []struct {
		name    string
		kappa   float64
		assumed bool
	}{
		{"blank", math.NaN(), false},
		{"typical 1 pS/m from the list, not measured", 1e-12, true},
	} {
		in := blank(Liquid)
		in.Conductivity, in.ConductivityAssumed, in.Permittivity = c.kappa, c.assumed, 2.4
		in.Speed, in.Diameter = 1, 0.05
		in.VesselMaterial, in.VesselClass = VesselInsulating, VesselIBC
		in.Filling, in.Filter, in.SecondPhase = FillTop, FilterNone, PhaseNone
		ev := Evaluate(in, env, lim)
		// derived: plain pipe 3.75e-6 x 1^2 x 0.05^2 = 9.375e-9 A; not earthed, no
		// charging time: capped at the 50 kV realistic maximum (reference section 12);
		// IBC 300 pF (from memory): W = 0.5 x 300e-12 x (5e4)^2 = 0.375 J.
		near(t, c.name+": current", ev.ChargingCurrent, 9.375e-9, 1e-9)
		want := ClauseSplash | ClauseInsulatingVessel | ClauseIsolatedLiquid
		if ev.LiquidBreaches&want != want {
			t.Errorf("%s: clauses %b, want splash, insulating vessel and isolated liquid", c.name, ev.LiquidBreaches)
		}
		sp := ev.Discharges[Spark]
		if !sp.Possible || sp.Code != ReasonSparkLiquidIsolated {
			t.Errorf("%s: spark %+v, want the isolated liquid's", c.name, sp)
		}
		near(t, c.name+": spark energy", sp.Energy, 0.375, 1e-9)
		if b := ev.Discharges[Brush]; !b.Possible || b.Code != ReasonBrushLiquidNoSafeLimits {
			t.Errorf("%s: brush %+v, want no safe limits", c.name, b)
		}
		if ev.Assumed&AssumedLowConductivity == 0 {
			t.Errorf("%s: conductivity not marked assumed", c.name)
		}
	}
}
