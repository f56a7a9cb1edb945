package assess

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// compliantFill is toluene (1 pS/m, epsr 2.4: reference section 8, from memory)
// filled from the bottom into an earthed metal road tanker at 3 m/s in 100 mm
// (v d 0.3 m^2/s, derived), 0.9 m/s until the inlet is submerged, no filter, no
// second phase: every clause of the road-tanker rules is met.
func compliantFill() inventory.Object {
	return inventory.Object{Kind: "liquid", Speed: known(3), Diameter: known(0.1), Conductivity: known(1e-12), Permittivity: known(2.4),
		Filling: "bottom", VesselMaterial: "metal", VesselClass: "road tanker", Filter: "none", SecondPhase: "none",
		InletVelocity: known(0.9), Resistance: known(1e3)}
}

func TestLiquidVerdicts(t *testing.T) {
	// A compliant fill clears: no brush from the liquid surface, the earthed tanker
	// (1 kohm) cannot spark. Source: IEC TS 60079-32-1 via reference section 12 [C]: a
	// fill that meets the applicable limits is expected to be acceptably low risk.
	r := one(t, &atmToluene, compliantFill())
	if r.Verdict != NonIncendive || len(r.Findings) != 0 {
		t.Fatalf("compliant bottom fill: verdict %v findings %v (%s)", r.Verdict, checks(r), r.Reason)
	}
	if r.Eval.Discharges[model.Brush].Code != model.ReasonBrushLiquidCompliant {
		t.Errorf("brush reason %q", r.Eval.Discharges[model.Brush].Reason())
	}

	// The same fill from the top: splash filling breaks a clause, the brush (4 mJ,
	// reference section 3) is counted against toluene's 0.24 mJ: incendive, and the
	// finding names the clause it rests on.
	top := compliantFill()
	top.Filling = "top"
	r = one(t, &atmToluene, top)
	if r.Verdict != Incendive || !hasCheck(r, "splash-filling") || !hasCheck(r, "energy-vs-mie") {
		t.Fatalf("top fill: verdict %v findings %v", r.Verdict, checks(r))
	}
	for _, f := range r.Findings {
		if f.Check == "splash-filling" && !strings.Contains(f.Message, "IEC TS 60079-32-1:2013") {
			t.Errorf("splash finding does not name its clause: %s", f.Message)
		}
	}

	// v d just outside the road-tanker limit: 3.804 m/s x 0.1 m = 0.3804 > 0.38 m^2/s
	// (derived; the limit [C] reference section 8). Just inside, 3.796 m/s, clears.
	fast := compliantFill()
	fast.Speed = known(3.804)
	r = one(t, &atmToluene, fast)
	if r.Verdict != Incendive || !hasCheck(r, "filling-velocity") {
		t.Errorf("v d 0.3804: verdict %v findings %v", r.Verdict, checks(r))
	}
	for _, f := range r.Findings {
		if f.Check == "filling-velocity" && (!strings.Contains(f.Message, "road tanker") || !strings.Contains(f.Message, "0.38")) {
			t.Errorf("v d finding: %s", f.Message)
		}
	}
	fast.Speed = known(3.796)
	if r = one(t, &atmToluene, fast); r.Verdict != NonIncendive {
		t.Errorf("v d 0.3796: verdict %v findings %v", r.Verdict, checks(r))
	}

	// A solvent (ethyl acetate 4.6e5 pS/m, epsr 6, reference section 8 from memory)
	// pumped through a fine filter into a plastic IBC with no earthing of the liquid: an
	// isolated conductor, spark energy far above the 0.46 mJ MIE: incendive, with the
	// isolated-liquid finding and the current case in the energy finding.
	ibc := inventory.Object{Kind: "liquid", Speed: known(2), Diameter: known(0.05), Conductivity: known(4.6e5 * 1e-12), Permittivity: known(6),
		Filling: "top", VesselMaterial: "insulating", VesselClass: "IBC", Filter: "filter", Residence: known(0), SecondPhase: "none", ChargingTime: known(60)}
	r = one(t, &atmEthylAcetate, ibc)
	if r.Verdict != Incendive || !hasCheck(r, "isolated-liquid") || hasCheck(r, "conductor-earthing") {
		t.Fatalf("plastic IBC: verdict %v findings %v", r.Verdict, checks(r))
	}
	for _, f := range r.Findings {
		if f.Check == "energy-vs-mie" && !strings.Contains(f.Message, "fine filter") {
			t.Errorf("energy finding does not say which current was taken: %s", f.Message)
		}
	}
	// Earthed through a dip pipe (1e5 ohm): no spark, no finding. derived: 3.75 uA x 1e5 ohm = 0.375 V.
	ibc.Filling, ibc.Resistance = "dip pipe", known(1e5)
	if r = one(t, &atmEthylAcetate, ibc); r.Verdict != NonIncendive || len(r.Findings) != 0 {
		t.Errorf("earthed IBC: verdict %v findings %v", r.Verdict, checks(r))
	}
}

// TestLiquidSiteOverrides: the per-class limits are Site items like the others.
func TestLiquidSiteOverrides(t *testing.T) {
	st := inventory.Site{Items: []inventory.SiteItem{
		{Key: "filling vd limit low conductivity road tanker [m²/s]", Item: "Filling vd limit low conductivity road tanker [m²/s]", Value: "0.3", Row: 8},
		{Key: "maximum filling velocity ibc", Item: "Maximum filling velocity IBC", Value: "5 m/s", Row: 9},
		{Key: "filter residence time [s]", Item: "Filter residence time [s]", Value: "30", Row: 10},
		{Key: "second phase conductivity [ps/m]", Item: "Second phase conductivity [pS/m]", Value: "2000", Row: 11},
		{Key: "filter charge factor", Item: "Filter charge factor", Value: "50", Row: 12},
	}}
	st, probs := siteWith(st.Items)
	lim := LimitsFromSite(st, model.DefaultLimits())
	if len(probs) != 0 {
		t.Fatalf("problems %+v", probs)
	}
	// derived: unit arithmetic.
	wantRel(t, "VesselVDLow[road tanker]", lim.VesselVDLow[model.VesselRoadTanker], 0.3)
	wantRel(t, "VesselMaxVelocity[IBC]", lim.VesselMaxVelocity[model.VesselIBC], 5)
	wantRel(t, "FilterResidenceMax", lim.FilterResidenceMax, 30)
	wantRel(t, "SecondPhaseConductivity", lim.SecondPhaseConductivity, 2000e-12)
	wantRel(t, "FilterChargeFactor", lim.FilterChargeFactor, 50)
	if lim.VesselVDLow[model.VesselRailCar] != 0.75 {
		t.Errorf("rail tank car changed by a road-tanker override")
	}

	// The override reaches the verdict: 3 m/s in 100 mm (0.3 m^2/s) is just at a 0.3
	// limit; 3.01 m/s (0.301, derived) is outside it.
	s := newSurvey([]inventory.Atmosphere{atmToluene}, []inventory.Station{{ID: "ST-1", Atmosphere: atmToluene.ID}}, nil, nil)
	o := compliantFill()
	o.ID, o.Station, o.Speed = "F-1", "ST-1", known(3.01)
	s.Objects = []inventory.Object{o}
	ss, _ := siteWith(st.Items[:1])
	s.Site.Items, s.Site.Limits, s.Site.Uncertainties = ss.Items, ss.Limits, ss.Uncertainties
	if a := Assess(s, Options{}); !hasCheck(a.Objects[0], "filling-velocity") {
		t.Errorf("v d 0.301 against a 0.3 override: findings %v", checks(a.Objects[0]))
	}
}

// TestLiquidProperties: over thousands of random liquid rows, a blank transfer input
// is never milder than any value it could have (unknown means the stricter case), and
// raising the flow velocity never lowers the verdict.
func TestLiquidProperties(t *testing.T) {
	lim := model.DefaultLimits()
	env := model.Environment{RelativeHumidity: 40, Temperature: 293.15, Atmosphere: model.Vapour, Group: model.IIA, Zone: model.Zone1, MIE: 0.24e-3}
	rng := rand.New(rand.NewPCG(13, 13))
	nan := math.NaN()
	pick := func(xs ...float64) float64 { return xs[rng.IntN(len(xs))] }
	verdict := func(in model.Input) int {
		ev := model.Evaluate(in, env, lim)
		return Classify(&in, &env, &ev, &lim, 10).Verdict.Severity()
	}
	for n := 0; n < 3000; n++ {
		in := model.Input{Kind: model.Liquid, Material: model.Material{Permittivity: nan, SurfaceResistivity: nan, VolumeResistivity: nan, BreakdownStrength: nan},
			Length: nan, Width: nan, Thickness: nan, DistanceToEarth: nan, Field: nan, FieldDistance: nan, SurfacePotential: nan,
			MassFlow: nan, ChargeToMass: nan, ChargingCurrent: nan, ParticleSize: nan, ProductMIE: nan}
		in.Speed = 0.2 + 8*rng.Float64()
		in.Diameter = pick(0.025, 0.05, 0.1, 0.15, 0.2)
		in.Conductivity = pick(nan, 0.1e-12, 5e-12, 20e-12, 200e-12, 2000e-12, 1e-6)
		in.Permittivity = pick(nan, 2, 2.4, 6)
		in.ChargingTime = pick(nan, 1, 60, 600)
		in.Resistance = pick(nan, 10, 1e5, 1e9, 1e12)
		in.Capacitance = pick(nan, nan, 100e-12)
		in.VesselMaterial = model.VesselMaterial(rng.IntN(5))
		in.VesselClass = model.VesselClass(rng.IntN(int(model.NumVesselClasses)))
		in.VesselDiameter = pick(nan, 2, 15)
		in.Filling = model.Filling(rng.IntN(4))
		in.Filter = model.Filter(rng.IntN(4))
		in.FilterResidence = pick(nan, 0.5, 20, 200)
		in.SecondPhase = model.SecondPhase(rng.IntN(5))
		in.InletVelocity = pick(nan, 0.5, 1.5)

		// Each blank input against every value it could take.
		blanks := []struct {
			name   string
			blank  func(*model.Input)
			values []func(*model.Input)
		}{
			{"vessel material", func(x *model.Input) { x.VesselMaterial = 0 }, nil},
			{"vessel class", func(x *model.Input) { x.VesselClass = 0 }, nil},
			{"filling", func(x *model.Input) { x.Filling = 0 }, nil},
			{"filter", func(x *model.Input) { x.Filter = 0; x.FilterResidence = nan }, nil},
			{"second phase", func(x *model.Input) { x.SecondPhase = 0 }, nil},
			{"inlet velocity", func(x *model.Input) { x.InletVelocity = nan }, nil},
		}
		setters := map[string][]func(*model.Input){
			"vessel material": {func(x *model.Input) { x.VesselMaterial = model.VesselMetal }, func(x *model.Input) { x.VesselMaterial = model.VesselInsulating },
				func(x *model.Input) { x.VesselMaterial = model.VesselLined }, func(x *model.Input) { x.VesselMaterial = model.VesselGlass }},
			"filling": {func(x *model.Input) { x.Filling = model.FillTop }, func(x *model.Input) { x.Filling = model.FillBottom }, func(x *model.Input) { x.Filling = model.FillDipPipe }},
			"filter": {func(x *model.Input) { x.Filter = model.FilterNone }, func(x *model.Input) { x.Filter = model.FilterStrainer },
				func(x *model.Input) { x.Filter = model.FilterFine; x.FilterResidence = 200 }},
			"second phase":   {func(x *model.Input) { x.SecondPhase = model.PhaseNone }, func(x *model.Input) { x.SecondPhase = model.PhaseWater }},
			"inlet velocity": {func(x *model.Input) { x.InletVelocity = 0.5 }, func(x *model.Input) { x.InletVelocity = 1.5 }},
		}
		for c := model.VesselRoadTanker; c < model.NumVesselClasses; c++ {
			c := c
			setters["vessel class"] = append(setters["vessel class"], func(x *model.Input) { x.VesselClass = c })
		}
		for _, b := range blanks {
			u := in
			b.blank(&u)
			vu := verdict(u)
			for _, set := range setters[b.name] {
				k := u
				set(&k)
				if vk := verdict(k); vk > vu {
					t.Fatalf("row %d: blank %s gives severity %d, a value gives %d (%+v)", n, b.name, vu, vk, k)
				}
			}
		}
		// Raising the flow velocity never lowers the verdict.
		faster := in
		faster.Speed *= 1.5
		if v0, v1 := verdict(in), verdict(faster); v1 < v0 {
			t.Fatalf("row %d: speed %g -> %g lowers severity %d -> %d (%+v)", n, in.Speed, faster.Speed, v0, v1, in)
		}
	}
}
