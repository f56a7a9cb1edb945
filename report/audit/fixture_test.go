package audit

import (
	"math"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// The hand-made audit of these tests describes an invented plant (invented for
// the demo). Its numbers are inputs to the report, chosen so that the unit
// conversions and the ratios can be worked by hand; each carries its origin.

var nan = math.NaN()

func ptr(v float64) *float64 { return &v }

// blankEval returns an evaluation with every quantity "not defined" (NaN).
func blankEval(k model.Kind) model.Evaluation {
	e := model.Evaluation{
		Kind: k, Capacitance: nan, Potential: nan, ChargeDensity: nan, SurfaceField: nan,
		ChargingCurrent: nan, StoredEnergy: nan, TransferredCharge: nan,
		InsulatingArea: nan, SurfaceResistivity: nan, DecayTime: nan, TimeTo100V: nan,
		RelaxationTime: nan, StreamingCurrent: nan, VelocityDiameter: nan,
		AirField: nan, LayerField: nan, LayerVoltage: nan, LayerBreakdown: nan, ChargingDensity: nan,
		ResidenceTime: nan, VelocityLimit: nan, Resistance: nan, CoronaOnset: nan,
		VDLimit: nan, VelocityCeiling: nan, InletVelocity: nan, FilterResidence: nan, ChargeFactor: nan, VesselCapacitance: nan,
	}
	for i := range e.Discharges {
		e.Discharges[i] = model.Discharge{Type: model.DischargeType(i), Energy: nan, Charge: nan}
	}
	return e
}

func testAudit() *assess.Audit {
	date := time.Date(2026, 3, 17, 0, 0, 0, 0, time.UTC)
	atmTol := inventory.Atmosphere{ID: "A1", Description: "Toluene vapour at the coater", Substance: "toluene", Kind: "vapour",
		MIE:   inventory.Known(0.24e-3), // toluene 0.24 mJ, from memory (electrostatics.md §4)
		Group: "IIA", Zone: "1", MIEFromSubstance: true, Row: 2}
	atmDust := inventory.Atmosphere{ID: "A2", Description: "Starch dust cloud", Kind: "dust",
		MIE:   inventory.Known(10e-3), // invented for the demo
		Group: "IIIB", Zone: "21", Row: 3}
	st1 := inventory.Station{ID: "S1", Name: "Coater unwind", Line: "L1", Atmosphere: "A1", RelativeHumidity: inventory.Known(35), Row: 2}
	st2 := inventory.Station{ID: "S2", Name: "Powder charging", Line: "L2", Atmosphere: "A2", Row: 3}
	st3 := inventory.Station{ID: "S3", Name: "Warehouse & dispatch", Line: "", Row: 4}
	pet := inventory.Material{Name: "PET film", Class: "insulating", Permittivity: 3.2, SurfaceResistivity: 1e14, HumiditySlope: 0.1,
		VolumeResistivity: nan, BreakdownStrength: nan, Source: "from memory", BuiltIn: true}

	survey := &inventory.Survey{
		Path:   "testdata/demo-plant.xlsx",
		SHA256: "5b1f0c0e6a8f2d9e3c4b7a6d5e4f3a2b1c0d9e8f7a6b5c4d3e2f1a0b9c8d7e6f", // invented for the demo
		Site: inventory.Site{Name: "Riverside Films Works", SurveyDate: date, SurveyedBy: "J. Okafor",
			RelativeHumidity: inventory.Known(40), AirTemperature: inventory.Known(293.15),
			RequiredMargin: inventory.Known(10), Defaults: []inventory.SiteDefault{{Item: inventory.SiteItemAirTemperature, Text: "Air temperature (20 °C)"}}},
		Atmospheres: []inventory.Atmosphere{atmTol, atmDust},
		Stations:    []inventory.Station{st1, st2, st3},
		Materials:   []inventory.Material{pet},
		Problems: []inventory.Problem{
			{Sheet: "Objects", Row: 6, Column: "M", Field: "Field", ID: "O1", Severity: inventory.Warning,
				Message: "value read as 85 kV/m from \"85 kv/m\" (unit case)", Fix: "write the unit as kV/m"},
			{Sheet: "Objects", Row: 12, Column: "C", Field: "Kind", ID: "O10", Severity: inventory.Error,
				Message: "kind \"hose\" is not a known kind", Fix: "use one of sheet, belt, roller, container, part, person, powder, liquid, bag"},
			{Sheet: "Objects", Row: 12, Column: "T", Field: "Resistance", ID: "O10", Severity: inventory.Error,
				Message: "\"10 kg\" is not a resistance", Fix: "give ohms, e.g. 1e6 or 1 MΩ"},
		},
		Counts: []inventory.SheetCount{
			{Sheet: "Site", Read: 6, Accepted: 6},
			{Sheet: "Atmospheres", Read: 2, Accepted: 2},
			{Sheet: "Stations", Read: 3, Accepted: 3},
			{Sheet: "Objects", Read: 10, Accepted: 9, Rejected: 1},
			{Sheet: "Materials", Read: 0, Accepted: 0},
		},
	}
	survey.Rejected = []inventory.Rejected{{Sheet: "Objects", Row: 12, ID: "O10", Problems: survey.Problems[1:3]}}

	envTol := model.Environment{RelativeHumidity: 35, Temperature: 293.15, Atmosphere: model.Vapour, Group: model.IIA, Zone: model.Zone1, MIE: 0.24e-3}
	envDust := model.Environment{RelativeHumidity: 40, Temperature: 293.15, Atmosphere: model.Dust, Group: model.IIIB, Zone: model.Zone21, MIE: 10e-3}
	envNone := model.Environment{RelativeHumidity: 40, Temperature: 293.15, Atmosphere: model.NoAtmosphere, MIE: nan}

	// O1: PET web on the unwind, brush discharge 4 mJ (the documented brush
	// energy, CLC/TR 50404 summaries) against 0.24 mJ: ratio 16.67 (derived: 4/0.24).
	o1 := blankEval(model.Sheet)
	o1.ChargeDensity = 12e-6 // invented for the demo
	o1.Assumed = model.AssumedInfiniteSheet
	o1.Flags = model.FlagSlowDecay
	o1.SurfaceField = 12e-6 / (2 * 8.8541878128e-12) // derived: sigma/(2 eps0) = 677.6 kV/m
	o1.Discharges[model.Brush] = model.Discharge{Type: model.Brush, Possible: true, Energy: 4e-3, Charge: 120e-9}
	o1.EffectiveEnergy, o1.Effective = 4e-3, model.Brush
	o1.TransferredCharge = 120e-9                        // derived: 12 uC/m^2 x 100 cm^2
	o1.InsulatingArea = 1.2 * 3                          // invented for the demo: 1.2 m wide, 3 m free span
	o1.SurfaceResistivity = 1e14 * math.Pow(10, 0.1*1.5) // derived: slope 0.1 dec per 10 %RH, 15 %RH below 50 %
	o1.ChargingCurrent = 12e-6 * 2.5 * 1.2               // derived: I = sigma v w

	// O2: isolated idler roller, 30 pF at 5 kV: W = 0.375 mJ (derived: C V^2/2).
	o2 := blankEval(model.Roller)
	o2.Capacitance, o2.Potential = 30e-12, 5e3
	o2.CapacitanceModel, o2.PotentialSource = model.CapCylinderPlane, model.PotentialMeasured
	o2.Assumed = model.AssumedCapacitance | model.AssumedNotEarthed
	o2.StoredEnergy = 0.5 * 30e-12 * 5e3 * 5e3
	o2.Discharges[model.Spark] = model.Discharge{Type: model.Spark, Possible: true, Energy: o2.StoredEnergy, Charge: 30e-12 * 5e3}
	o2.EffectiveEnergy, o2.Effective = o2.StoredEnergy, model.Spark
	o2.TransferredCharge = 150e-9 // derived: Q = C V
	o2.DecayTime = 1e13 * 30e-12  // derived: tau = R C with R taken as 1e13 ohm
	o2.TimeTo100V = o2.DecayTime * math.Log(5e3/100)

	// O3: operator, 200 pF (Saito 1963 typical body) at 10 kV: 10 mJ (derived).
	o3 := blankEval(model.Person)
	o3.Capacitance, o3.Potential = 200e-12, 10e3
	o3.CapacitanceModel, o3.PotentialSource = model.CapTypical, model.PotentialMeasured
	o3.Assumed = model.AssumedCapacitance
	o3.StoredEnergy = 10e-3
	o3.Discharges[model.Spark] = model.Discharge{Type: model.Spark, Possible: true, Energy: 10e-3, Charge: 2e-6}
	o3.EffectiveEnergy, o3.Effective = 10e-3, model.Spark
	o3.TransferredCharge = 2e-6
	o3.ChargingCurrent = 1e-6 // walking, Jonassen

	// O4: powder fill; cone discharge not possible (fine powder), no energy.
	o4 := blankEval(model.Powder)
	o4.ChargingCurrent = 0.5 * 10e-6 // electrostatics.md §10 case 6: 0.5 kg/s x 10 uC/kg = 5 uA
	o4.EffectiveEnergy = 0

	// O5: unearthed drum taking that current: 100 pF, R 1e11 ohm, after 1 s
	// V = 47.6 kV, W = 113 mJ (electrostatics.md §10 case 6, derived).
	o5 := blankEval(model.Container)
	o5.Capacitance, o5.Potential = 100e-12, 47.6e3
	o5.CapacitanceModel, o5.PotentialSource = model.CapMeasured, model.PotentialCharging
	o5.StoredEnergy = 0.5 * 100e-12 * 47.6e3 * 47.6e3
	o5.Discharges[model.Spark] = model.Discharge{Type: model.Spark, Possible: true, Energy: o5.StoredEnergy, Charge: 4.76e-6}
	o5.EffectiveEnergy, o5.Effective = o5.StoredEnergy, model.Spark
	o5.TransferredCharge = 4.76e-6
	o5.ChargingCurrent = 5e-6
	o5.DecayTime = 10 // derived: 1e11 x 100e-12

	// O6: type C bag, earthed: no discharge possible.
	o6 := blankEval(model.Bag)
	o6.EffectiveEnergy = 0

	// O7: conveyor belt in the warehouse, no atmosphere: ratio null.
	o7 := blankEval(model.Belt)
	o7.ChargeDensity = 5e-6
	o7.SurfaceField = 5e-6 / (2 * 8.8541878128e-12)
	o7.Discharges[model.Brush] = model.Discharge{Type: model.Brush, Possible: true, Energy: 4e-3, Charge: 50e-9}
	o7.EffectiveEnergy, o7.Effective = 4e-3, model.Brush

	// O8: toluene transfer line; relaxation time 21.2 s (derived: eps0 2.4 / 1 pS/m).
	o8 := blankEval(model.Liquid)
	o8.RelaxationTime = 8.8541878128e-12 * 2.4 / 1e-12
	o8.StreamingCurrent = 3.75e-6 * 2 * 2 * 0.05 * 0.05 // derived: 3.75e-6 v^2 d^2 at 2 m/s, 50 mm
	o8.VelocityDiameter = 2 * 0.05
	o8.EffectiveEnergy = 0

	// O9: a part with nothing measured: not assessed.
	o9 := blankEval(model.Part)
	o9.NotAssessed = model.MissingConductorCharging
	o9.EffectiveEnergy = nan

	obj := func(id, station, kind string, row int) inventory.Object {
		u := inventory.Quantity{}
		return inventory.Object{ID: id, Station: station, Kind: kind, Row: row,
			Length: u, Width: u, Diameter: u, Thickness: u, DistanceToEarth: u, Field: u, FieldDistance: u, SurfacePotential: u,
			Speed: u, MassFlow: u, ChargeToMass: u, ChargingCurrent: u, ChargingTime: u, ParticleSize: u,
			Resistance: u, Capacitance: u, Conductivity: u, Permittivity: u}
	}
	in1 := obj("O1", "S1", "sheet", 6)
	in1.Description, in1.Material = "PET web leaving the unwind", "PET film"
	in1.Width, in1.Thickness, in1.Backing = inventory.Known(1.2), inventory.Known(50e-6), "none"
	in1.Field, in1.FieldDistance, in1.Speed = inventory.Known(85e3), inventory.Known(0.1), inventory.Known(2.5)
	in2 := obj("O2", "S1", "roller", 7)
	in2.Description, in2.Diameter, in2.Length = "Idler roller on plastic bearings", inventory.Known(0.08), inventory.Known(1.4)
	in2.SurfacePotential = inventory.Known(5e3)
	in3 := obj("O3", "S1", "person", 8)
	in3.Description, in3.SurfacePotential = "Operator splicing the web", inventory.Known(10e3)
	in4 := obj("O4", "S2", "powder", 9)
	in4.Description, in4.MassFlow, in4.ChargeToMass, in4.ParticleSize = "Starch into drum", inventory.Known(0.5), inventory.Known(10e-6), inventory.Known(0.05e-3)
	in5 := obj("O5", "S2", "container", 10)
	in5.Description, in5.Resistance, in5.Capacitance, in5.ChargingTime = "200 L steel drum on a plastic pallet", inventory.Known(1e11), inventory.Known(100e-12), inventory.Known(1)
	in6 := obj("O6", "S2", "bag", 11)
	in6.Description, in6.BagType, in6.Resistance = "FIBC type C, earthed", "C", inventory.Known(1e5)
	in7 := obj("O7", "S3", "belt", 13)
	in7.Description, in7.Width, in7.Speed = "Rubber conveyor belt", inventory.Known(0.6), inventory.Known(1.5)
	in8 := obj("O8", "S1", "liquid", 14)
	in8.Description, in8.Conductivity, in8.Permittivity, in8.Speed, in8.Diameter = "Toluene transfer line", inventory.Known(1e-12), inventory.Known(2.4), inventory.Known(2), inventory.Known(0.05)
	in8.Filling = "bottom"
	in9 := obj("O9", "S3", "part", 15)
	in9.Description = "Loose metal chute"

	atm1, atm2 := atmTol, atmDust
	personDefault := assess.Mark{Item: assess.ItemCapacitance, Prov: assess.ProvEstimated, Label: "Capacitance", Value: "200 pF", Reason: "typical human body (Saito 1963)"}
	notEarthed := assess.Mark{Item: assess.ItemResistance, Prov: assess.ProvEstimated, Label: "Resistance to earth", Value: "1.0e13 Ω", Reason: "not measured: taken as not earthed"}
	rollerCap := assess.Mark{Item: assess.ItemCapacitance, Prov: assess.ProvEstimated, Label: "Capacitance", Value: "30 pF", Reason: "cylinder over an earthed plane, 2 π ε0 L / arcosh(h/r)"}

	f := []assess.Finding{
		{ObjectID: "O5", StationID: "S2", Check: "energy-vs-mie", Severity: assess.Incendive,
			Message: "spark energy 113 mJ ≥ MIE 10 mJ (ratio 11.3)", Mitigation: "Bond the drum to the filling pipe and earth it (≤ 1 MΩ) before filling."},
		{ObjectID: "O5", StationID: "S2", Check: "conductor-earthing", Severity: assess.Marginal,
			Message: "resistance to earth 1e11 Ω > 1e6 Ω", Mitigation: "Earth the drum with a clamp and a monitored earthing point."},
		{ObjectID: "O3", StationID: "S1", Check: "energy-vs-mie", Severity: assess.Incendive,
			Message: "spark energy 10 mJ ≥ MIE 0.24 mJ (ratio 41.7)", Mitigation: "Dissipative footwear and flooring; check person-to-earth resistance at the entrance."},
		{ObjectID: "O1", StationID: "S1", Check: "energy-vs-mie", Severity: assess.Incendive,
			Message: "brush discharge 4 mJ ≥ MIE 0.24 mJ (ratio 16.7)", Mitigation: "Fit a static eliminator after the unwind & keep earthed metal away from the web."},
		{ObjectID: "O2", StationID: "S1", Check: "conductor-earthing", Severity: assess.Marginal,
			Message: "resistance to earth unknown, taken as 1e13 Ω > 1e6 Ω", Mitigation: "Bond the roller shaft to the frame with a brush or spring contact."},
		{ObjectID: "O7", StationID: "S3", Check: "insulating-area", Severity: assess.Marginal,
			Message: "belt charge density 5 µC/m²; no atmosphere, requirement checked only", Mitigation: "Use a belt of dissipative rubber."},
	}
	for i := range f {
		// Each finding carries the basis of its check, as the assessment writes it.
		for k := assess.Check(0); k < assess.NumChecks; k++ {
			if k.Name() == f[i].Check {
				f[i].Basis = k.Basis()
			}
		}
	}
	byObj := func(id string) []assess.Finding {
		var out []assess.Finding
		for _, x := range f {
			if x.ObjectID == id {
				out = append(out, x)
			}
		}
		return out
	}
	objects := []assess.ObjectResult{
		{Object: in1, Material: &pet, Station: st1, Atmosphere: &atm1, Environment: envTol, Eval: o1, Verdict: assess.Incendive,
			Ratio: ptr(4e-3 / 0.24e-3), Reason: "brush discharge 4 mJ reaches the MIE 0.24 mJ", Findings: byObj("O1"),
			Probability: &assess.Probability{Samples: 1000, Incendive: 0.93, Marginal: 0.07, EnergyP05: 4e-3, EnergyP50: 4e-3, EnergyP95: 4e-3}},
		{Object: in2, Station: st1, Atmosphere: &atm1, Environment: envTol, Eval: o2, Verdict: assess.Incendive,
			Ratio: ptr(0.375e-3 / 0.24e-3), Reason: "spark 0.375 mJ reaches the MIE 0.24 mJ", Findings: byObj("O2"), Marks: []assess.Mark{rollerCap, notEarthed}},
		{Object: in3, Station: st1, Atmosphere: &atm1, Environment: envTol, Eval: o3, Verdict: assess.Incendive,
			Ratio: ptr(10e-3 / 0.24e-3), Reason: "spark 10 mJ reaches the MIE 0.24 mJ", Findings: byObj("O3"), Marks: []assess.Mark{personDefault}},
		{Object: in4, Station: st2, Atmosphere: &atm2, Environment: envDust, Eval: o4, Verdict: assess.NonIncendive,
			Ratio: ptr(0), Reason: "no discharge possible"},
		{Object: in5, Station: st2, Atmosphere: &atm2, Environment: envDust, Eval: o5, Verdict: assess.Incendive,
			Ratio: ptr(o5.StoredEnergy / 10e-3), Reason: "spark 113 mJ reaches the MIE 10 mJ", Findings: byObj("O5"),
			Probability: &assess.Probability{Samples: 1000, Incendive: 1, EnergyP05: 60e-3, EnergyP50: 113e-3, EnergyP95: 190e-3}},
		{Object: in6, Station: st2, Atmosphere: &atm2, Environment: envDust, Eval: o6, Verdict: assess.NonIncendive,
			Ratio: ptr(0), Reason: "type C bag earthed below 1e6 Ω"},
		{Object: in7, Station: st3, Environment: envNone, Eval: o7, Verdict: assess.Marginal,
			Ratio: nil, Reason: "no flammable atmosphere; insulating belt", Findings: byObj("O7")},
		{Object: in8, Station: st1, Atmosphere: &atm1, Environment: envTol, Eval: o8, Verdict: assess.NonIncendive,
			Ratio: ptr(0), Reason: "v d 0.10 m²/s within 0.38 m²/s"},
		{Object: in9, Station: st3, Environment: envNone, Eval: o9, Verdict: assess.NotAssessed,
			Ratio: nil, Reason: "not assessed: give a potential, a charging current or a capacitance"},
	}
	return &assess.Audit{
		Survey:  survey,
		Options: assess.Options{Samples: 1000, Seed: 7, Limits: testLimits()},
		Objects: objects,
		Stations: []assess.StationResult{
			{Station: st1, Atmosphere: &atm1, Rank: 1, Verdict: assess.Incendive, WorstRatio: ptr(10e-3 / 0.24e-3),
				Objects: []string{"O1", "O2", "O3", "O8"}, Counts: map[assess.Verdict]int{assess.Incendive: 3, assess.NonIncendive: 1},
				ProbabilityAnyIncendive: ptr(0.995), Main: assess.MainReason{ObjectID: "O3", Check: "energy-vs-mie", Text: f[2].Message}},
			{Station: st2, Atmosphere: &atm2, Rank: 2, Verdict: assess.Incendive, WorstRatio: ptr(o5.StoredEnergy / 10e-3),
				Objects: []string{"O4", "O5", "O6"}, Counts: map[assess.Verdict]int{assess.Incendive: 1, assess.NonIncendive: 2},
				ProbabilityAnyIncendive: ptr(1), Main: assess.MainReason{ObjectID: "O5", Check: "energy-vs-mie", Text: f[0].Message}},
			{Station: st3, Rank: 3, Verdict: assess.Marginal, WorstRatio: nil,
				Objects: []string{"O7", "O9"}, Counts: map[assess.Verdict]int{assess.Marginal: 1, assess.NotAssessed: 1},
				Main: assess.MainReason{ObjectID: "O7", Check: "insulating-area", Text: f[5].Message}},
		},
		Findings:       f,
		Counts:         map[assess.Verdict]int{assess.Incendive: 4, assess.Marginal: 1, assess.NonIncendive: 3, assess.NotAssessed: 1},
		MethodDefaults: []assess.Mark{personDefault, rollerCap, notEarthed},
	}
}

// testLimits are the model's default limits (with their sources in
// model.LimitSources) with one survey override, as a Site sheet may give:
// conductors to earth at 1e8 ohm instead of 1e6 (invented for the demo).
func testLimits() model.Limits {
	l := model.DefaultLimits()
	l.ConductorEarthing = 1e8
	return l
}
