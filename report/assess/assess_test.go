package assess

import (
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/gonum/floats/scalar"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/templates"
)

// The surveys below are built in memory (no workbook): an invented plant whose
// rows are chosen so that each result can be worked by hand. Each expected number
// names its source: the reference values of ../../shared/reference/electrostatics.md
// (section numbers given), the standards they quote, or "derived" arithmetic.

const relTol = 1e-3

func known(v float64) inventory.Quantity { return inventory.Known(v) }

// site returns a Site sheet with 50 % RH, 20 °C and the required margin 10.
func site() inventory.Site {
	return inventory.Site{
		Name:             "Invented coating plant", // invented for the demo
		SurveyDate:       time.Date(2026, 3, 14, 0, 0, 0, 0, time.UTC),
		RelativeHumidity: known(50),
		AirTemperature:   known(293.15),
		RequiredMargin:   known(10),
	}
}

// Atmospheres of the invented plant.
var (
	// Toluene vapour: MIE 0.24 mJ, IIA (reference section 4, MIE from memory).
	atmToluene = inventory.Atmosphere{ID: "A-TOL", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "1"}
	// An organic dust of MIE 10 mJ in zone 21 (invented for the demo).
	atmDust10 = inventory.Atmosphere{ID: "A-DUST", Kind: "dust", MIE: known(10e-3), Group: "IIIB", Zone: "21"}
	// Ethyl acetate vapour: MIE 0.46 mJ, IIA (reference section 4, from memory).
	atmEthylAcetate = inventory.Atmosphere{ID: "A-ETAC", Substance: "ethyl acetate", Kind: "vapour", MIE: known(0.46e-3), Group: "IIA", Zone: "1"}
)

func newSurvey(atms []inventory.Atmosphere, stations []inventory.Station, objs []inventory.Object, mats []inventory.Material) *inventory.Survey {
	return &inventory.Survey{Site: site(), Atmospheres: atms, Stations: stations, Objects: objs, Materials: mats}
}

// PET film: insulating, hydrophobic (invented for the demo, typical of the class).
var matPET = inventory.Material{Name: "PET film", Class: "insulating", Permittivity: 3.2, SurfaceResistivity: 1e15, HumiditySlope: 0, VolumeResistivity: 1e16, BreakdownStrength: 100e6, Source: "invented for the demo"}

// An insulating polymer powder (invented for the demo).
var matPowder = inventory.Material{Name: "polymer powder", Class: "insulating", Permittivity: 2.5, SurfaceResistivity: math.NaN(), VolumeResistivity: 1e13, BreakdownStrength: math.NaN(), Source: "invented for the demo"}

// one assesses a single object at a single station and returns its result.
func one(t *testing.T, atm *inventory.Atmosphere, o inventory.Object, mats ...inventory.Material) ObjectResult {
	t.Helper()
	st := inventory.Station{ID: "ST-1", Name: "Station 1"}
	var atms []inventory.Atmosphere
	if atm != nil {
		st.Atmosphere = atm.ID
		atms = append(atms, *atm)
	}
	o.Station = st.ID
	if o.ID == "" {
		o.ID = "OBJ-1"
	}
	a := Assess(newSurvey(atms, []inventory.Station{st}, []inventory.Object{o}, mats), Options{})
	if len(a.Objects) != 1 {
		t.Fatalf("got %d object results, want 1", len(a.Objects))
	}
	return a.Objects[0]
}

func hasCheck(r ObjectResult, check string) bool {
	for _, f := range r.Findings {
		if f.Check == check {
			return true
		}
	}
	return false
}

func checks(r ObjectResult) []string {
	var out []string
	for _, f := range r.Findings {
		out = append(out, f.Check)
	}
	return out
}

func wantRel(t *testing.T, what string, got, want float64) {
	t.Helper()
	if !scalar.EqualWithinRel(got, want, relTol) {
		t.Errorf("%s = %g, want %g", what, got, want)
	}
}

func TestHandWorkedCases(t *testing.T) {
	tests := []struct {
		name        string
		atm         *inventory.Atmosphere
		obj         inventory.Object
		mats        []inventory.Material
		verdict     Verdict
		energy      float64 // J, effective energy; NaN: not checked
		potential   float64 // V; NaN: not checked
		ratio       float64 // NaN: nil ratio expected
		wantChecks  []string
		avoidChecks []string
	}{
		{
			// Source: reference section 10.1 [C]: person 100 pF at 10 kV -> 5 mJ;
			// vs toluene 0.24 mJ: ratio 20.8 (derived: 5 / 0.24).
			name:       "person at a measured potential near toluene",
			atm:        &atmToluene,
			obj:        inventory.Object{Kind: "person", Capacitance: known(100e-12), SurfacePotential: known(10e3)},
			verdict:    Incendive,
			energy:     5e-3,
			potential:  10e3,
			ratio:      5e-3 / 0.24e-3,
			wantChecks: []string{"energy-vs-mie", "person-earthing"},
		},
		{
			// Source: reference section 10.6 (derived): 0.5 kg/s x 10 uC/kg = 5 uA into
			// R 1e11 ohm, C 100 pF (tau 10 s) for 1 s: V = I R (1 - e^-0.1) = 47.6 kV,
			// W = C V^2 / 2 = 113 mJ; vs a dust of 10 mJ: ratio 11.3 (derived).
			name:       "powder fill into an unearthed drum",
			atm:        &atmDust10,
			obj:        inventory.Object{Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6), Resistance: known(1e11), Capacitance: known(100e-12), ChargingTime: known(1)},
			verdict:    Incendive,
			energy:     0.5 * 100e-12 * math.Pow(5e-6*1e11*(1-math.Exp(-0.1)), 2),
			potential:  5e-6 * 1e11 * (1 - math.Exp(-0.1)),
			ratio:      0.5 * 100e-12 * math.Pow(5e-6*1e11*(1-math.Exp(-0.1)), 2) / 10e-3,
			wantChecks: []string{"energy-vs-mie", "conductor-earthing"},
			// 113 mJ is below the 350 mJ shock limit (TRGS 727 Annex D).
			avoidChecks: []string{"shock-energy"},
		},
		{
			// Source: brush equivalent energy 4 mJ (reference section 3, CLC/TR 50404
			// summaries, upper end of 3-4 mJ) vs toluene 0.24 mJ: ratio 16.7 (derived).
			// The film's density from 500 kV/m at 0.1 m over a free 1 m x 1 m sheet is
			// 1.08e-5 C/m^2 (derived, reference section 1 rectangle formula), above the
			// 5 uC/m^2 IIA screen; 100 cm^2 of it carries 108 nC > 60 nC (IIA, from memory),
			// and 1 m^2 exceeds the 100 cm^2 zone 1 IIA area limit (IEC 60079-0, from memory).
			name:       "charged film near a solvent atmosphere",
			atm:        &atmToluene,
			obj:        inventory.Object{Kind: "sheet", Material: matPET.Name, Length: known(1), Width: known(1), Thickness: known(50e-6), Backing: "none", Field: known(500e3), FieldDistance: known(0.1)},
			mats:       []inventory.Material{matPET},
			verdict:    Incendive,
			energy:     4e-3,
			potential:  math.NaN(),
			ratio:      4e-3 / 0.24e-3,
			wantChecks: []string{"energy-vs-mie", "transferred-charge", "insulating-area"},
		},
		{
			// Source: reference section 10.7: cone discharge D 1 m, d 1 mm -> 5.22 mJ
			// (Glor's formula, from memory); vs a dust of 10 mJ: 0.522, above
			// MIE / 10 = 1 mJ, so marginal (derived).
			name:        "cone discharge in a silo",
			atm:         &atmDust10,
			obj:         inventory.Object{Kind: "powder", Material: matPowder.Name, Diameter: known(1), Length: known(4), ParticleSize: known(1e-3), MassFlow: known(5), ChargeToMass: known(10e-6)},
			mats:        []inventory.Material{matPowder},
			verdict:     Marginal,
			energy:      5.22e-3,
			potential:   math.NaN(),
			ratio:       0.522,
			wantChecks:  []string{"energy-vs-margin"},
			avoidChecks: []string{"energy-vs-mie", "conductor-earthing"},
		},
		{
			// Source: reference section 10.6 (derived): the same 5 uA through 1e6 ohm
			// gives 5 V, far below the ~300 V any gap needs (Paschen, reference section 3):
			// no spark, non-incendive.
			name:        "earthed drum",
			atm:         &atmDust10,
			obj:         inventory.Object{Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6), Resistance: known(1e6), Capacitance: known(100e-12), ChargingTime: known(1)},
			verdict:     NonIncendive,
			energy:      0,
			potential:   5e-6 * 1e6 * (1 - math.Exp(-1/(1e6*100e-12))),
			ratio:       0,
			avoidChecks: []string{"conductor-earthing", "energy-vs-mie", "energy-vs-margin"},
		},
		{
			// Source: reference section 10.2 [C]: 400 pF at 50 kV -> 500 mJ, above the
			// 350 mJ shock limit (TRGS 727 Annex D); no atmosphere: nil ratio, marginal.
			name:        "no atmosphere, shock",
			atm:         nil,
			obj:         inventory.Object{Kind: "part", Capacitance: known(400e-12), SurfacePotential: known(50e3)},
			verdict:     Marginal,
			energy:      math.NaN(),
			potential:   50e3,
			ratio:       math.NaN(),
			wantChecks:  []string{"shock-energy"},
			avoidChecks: []string{"conductor-earthing", "energy-vs-mie"},
		},
		{
			// Source: TRGS 727 7.2 [C]: person-to-earth <= 1e8 ohm in zone 1 when MIE <=
			// 10 mJ; 1e9 ohm footwear fails. Walking charges at about 1 uA (Jonassen,
			// reference section 7 [C]): 1 uA x 1e9 ohm = 1 kV at steady state; with the
			// typical 200 pF (Saito 1963; default from memory) W = 0.1 mJ (derived),
			// ratio 0.417 vs toluene: below the MIE, above MIE / 10: marginal. Its spark
			// charge, 200 nC, is not held against the 60 nC brush-discharge limit.
			name:        "person in zone 1 on 1e9 ohm footwear, walking",
			atm:         &atmToluene,
			obj:         inventory.Object{Kind: "person", Resistance: known(1e9)},
			verdict:     Marginal,
			energy:      0.5 * 200e-12 * 1e3 * 1e3,
			potential:   1e3,
			ratio:       0.1e-3 / 0.24e-3,
			wantChecks:  []string{"person-earthing", "energy-vs-margin"},
			avoidChecks: []string{"energy-vs-mie", "transferred-charge"},
		},
		{
			// Source: TRGS 727 7.2 [C], as above. A measured 200 V is below the ~300 V spark
			// floor (reference section 3), so only the requirement decides: marginal.
			name:        "person in zone 1 on 1e9 ohm footwear, at rest",
			atm:         &atmToluene,
			obj:         inventory.Object{Kind: "person", Resistance: known(1e9), SurfacePotential: known(200)},
			verdict:     Marginal,
			energy:      0,
			potential:   200,
			ratio:       0,
			wantChecks:  []string{"person-earthing"},
			avoidChecks: []string{"energy-vs-mie", "energy-vs-margin"},
		},
		{
			// A sheet with neither a field reading nor a surface potential cannot be judged.
			// 5 cm x 5 cm is 25 cm^2, within the 100 cm^2 zone 1 IIA area limit (IEC 60079-0, from memory).
			name:      "not assessed: no reading",
			atm:       &atmToluene,
			obj:       inventory.Object{Kind: "sheet", Material: matPET.Name, Length: known(0.05), Width: known(0.05)},
			mats:      []inventory.Material{matPET},
			verdict:   NotAssessed,
			energy:    math.NaN(),
			potential: math.NaN(),
			ratio:     math.NaN(),
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r := one(t, tc.atm, tc.obj, tc.mats...)
			if r.Verdict != tc.verdict {
				t.Errorf("verdict = %v, want %v (reason: %s; findings %v)", r.Verdict, tc.verdict, r.Reason, checks(r))
			}
			if !math.IsNaN(tc.energy) {
				wantRel(t, "effective energy", r.Eval.EffectiveEnergy, tc.energy)
			}
			if !math.IsNaN(tc.potential) {
				wantRel(t, "potential", r.Eval.Potential, tc.potential)
			}
			switch {
			case math.IsNaN(tc.ratio) && r.Ratio != nil:
				t.Errorf("ratio = %g, want nil", *r.Ratio)
			case !math.IsNaN(tc.ratio) && r.Ratio == nil:
				t.Errorf("ratio = nil, want %g", tc.ratio)
			case !math.IsNaN(tc.ratio):
				if !scalar.EqualWithinAbsOrRel(*r.Ratio, tc.ratio, 1e-12, relTol) {
					t.Errorf("ratio = %g, want %g", *r.Ratio, tc.ratio)
				}
			}
			for _, c := range tc.wantChecks {
				if !hasCheck(r, c) {
					t.Errorf("missing finding %q (findings %v)", c, checks(r))
				}
			}
			for _, c := range tc.avoidChecks {
				if hasCheck(r, c) {
					t.Errorf("unexpected finding %q (findings %v)", c, checks(r))
				}
			}
			if tc.verdict == NotAssessed && !strings.Contains(r.Reason, "needs") {
				t.Errorf("not-assessed reason %q does not say what is missing", r.Reason)
			}
			if r.Reason == "" || !strings.HasSuffix(r.Reason, ".") {
				t.Errorf("reason %q is not a sentence", r.Reason)
			}
			for _, f := range r.Findings {
				if f.Message == "" || f.Mitigation == "" {
					t.Errorf("finding %s has an empty message or mitigation: %+v", f.Check, f)
				}
				if f.Severity != Incendive && f.Severity != Marginal {
					t.Errorf("finding %s severity %v", f.Check, f.Severity)
				}
			}
		})
	}
}

// TestMessagesQuoteNumbers checks that findings carry the hand-worked numbers in engineering units.
func TestMessagesQuoteNumbers(t *testing.T) {
	// Source: reference section 10.1 [C]: 100 pF at 10 kV -> 5 mJ; toluene 0.24 mJ (from memory).
	r := one(t, &atmToluene, inventory.Object{Kind: "person", Capacitance: known(100e-12), SurfacePotential: known(10e3)})
	msg := r.Findings[0].Message
	for _, want := range []string{"5 mJ", "0.24 mJ", "20.8"} {
		if !strings.Contains(msg, want) {
			t.Errorf("message %q lacks %q", msg, want)
		}
	}
	if !strings.Contains(r.Findings[0].Mitigation, "footwear") {
		t.Errorf("person mitigation %q does not speak of footwear", r.Findings[0].Mitigation)
	}
	// Source: reference section 10.6 (derived): R 1e11 ohm against the 1e6 ohm limit (TRGS 727 8.3).
	r = one(t, &atmDust10, inventory.Object{Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6), Resistance: known(1e11), Capacitance: known(100e-12), ChargingTime: known(1)})
	var earth string
	for _, f := range r.Findings {
		if f.Check == "conductor-earthing" {
			earth = f.Message
		}
	}
	for _, want := range []string{"1.0e11 Ω", "1.0e6 Ω"} {
		if !strings.Contains(earth, want) {
			t.Errorf("earthing message %q lacks %q", earth, want)
		}
	}
}

func TestNoAtmosphereShock(t *testing.T) {
	// Source: reference section 10.2 [C]: 400 pF at 50 kV -> 500 mJ > 350 mJ (TRGS 727 Annex D).
	r := one(t, nil, inventory.Object{Kind: "part", Capacitance: known(400e-12), SurfacePotential: known(50e3)})
	wantRel(t, "stored energy", r.Eval.StoredEnergy, 0.5)
	if r.Atmosphere != nil || r.Ratio != nil {
		t.Fatalf("atmosphere %v ratio %v, want nil and nil", r.Atmosphere, r.Ratio)
	}
	if len(r.Findings) != 1 || !strings.Contains(r.Findings[0].Message, "500 mJ") || !strings.Contains(r.Findings[0].Message, "350 mJ") {
		t.Errorf("findings %+v, want one shock finding quoting 500 mJ and 350 mJ", r.Findings)
	}
	// Source: reference section 10.1 [C]: 100 pF at 10 kV -> 5 mJ: no shock, non-incendive.
	r = one(t, nil, inventory.Object{Kind: "part", Capacitance: known(100e-12), SurfacePotential: known(10e3)})
	if r.Verdict != NonIncendive || len(r.Findings) != 0 {
		t.Errorf("verdict %v findings %v, want non-incendive, none", r.Verdict, checks(r))
	}
}

func TestLiquids(t *testing.T) {
	// Toluene fill: 1 pS/m, epsr 2 (reference section 8, from memory for toluene's values).
	lowFill := inventory.Object{Kind: "liquid", Speed: known(8), Diameter: known(0.05), Conductivity: known(1e-12), Permittivity: known(2),
		Filling: "top", Resistance: known(1e3), Capacitance: known(100e-12)}
	r := one(t, &atmToluene, lowFill)
	// Source: reference section 8 (derived): tau = eps0 epsr / kappa = 8.854e-12 x 2 / 1e-12 = 17.7 s.
	wantRel(t, "relaxation time", r.Eval.RelaxationTime, 8.8541878128e-12*2/1e-12)
	// Source: IEC 60079-32-1 via reference section 8: v d <= 0.38 m^2/s at <= 10 pS/m;
	// 8 m/s x 0.05 m = 0.4 (derived) fails, 8 m/s > 7 m/s fails; top filling of a
	// low-conductivity liquid (1 pS/m <= 50 pS/m) is splash filling; the vessel material is
	// not given, so it is taken as insulating, which has no safe limits (low-conductivity).
	for _, c := range []string{"filling-velocity", "velocity-ceiling", "splash-filling", "low-conductivity"} {
		if !hasCheck(r, c) {
			t.Errorf("toluene fill: missing %q (findings %v)", c, checks(r))
		}
	}
	if hasCheck(r, "conductor-earthing") {
		t.Errorf("earthed receiving container (1e3 ohm) flagged: %v", checks(r))
	}
	// The liquid surface of a low-conductivity liquid gives a brush discharge (4 mJ,
	// reference section 3) against toluene's 0.24 mJ: incendive.
	if r.Verdict != Incendive {
		t.Errorf("toluene fill verdict %v, want incendive (%s)", r.Verdict, r.Reason)
	}

	// Ethyl acetate, 4.6e5 pS/m (reference section 8, from memory), dip pipe, 1 m/s in
	// 50 mm (v d 0.05, derived), earthed container: no liquid finding, non-incendive.
	good := inventory.Object{Kind: "liquid", Speed: known(1), Diameter: known(0.05), Conductivity: known(4.6e5 * 1e-12), Permittivity: known(6),
		Filling: "dip pipe", Resistance: known(1e3), Capacitance: known(100e-12)}
	r = one(t, &atmEthylAcetate, good)
	if r.Verdict != NonIncendive || len(r.Findings) != 0 {
		t.Errorf("ethyl acetate fill: verdict %v findings %v, want non-incendive and none (%s)", r.Verdict, checks(r), r.Reason)
	}

	// Filling not given: assessed as top filling, and recorded as a default; a
	// high-conductivity liquid in an earthed vessel needs only the ceiling (reference
	// section 12, from memory), so no finding.
	noFill := good
	noFill.Filling = ""
	r = one(t, &atmEthylAcetate, noFill)
	if len(r.Findings) != 0 {
		t.Errorf("unknown filling, high conductivity: findings %v, want none", checks(r))
	}
	if !hasDefault(r, "Filling") {
		t.Errorf("unknown filling not recorded as a default: %+v", r.Marks)
	}
}

func TestLiquidFromSubstance(t *testing.T) {
	// Ethyl acetate, 4.6e5 pS/m and epsr 6 in the built-in list (reference section 8,
	// from memory): a row without conductivity takes them, so the fill at 1 m/s in
	// 50 mm through a dip pipe is not flagged low-conductivity.
	o := inventory.Object{Kind: "liquid", Speed: known(1), Diameter: known(0.05), Filling: "dip pipe", Resistance: known(1e3), Capacitance: known(100e-12)}
	r := one(t, &atmEthylAcetate, o)
	wantRel(t, "conductivity", r.Input.Conductivity, 4.6e5*1e-12)
	wantRel(t, "permittivity", r.Input.Permittivity, 6)
	if hasCheck(r, "low-conductivity") || !hasDefault(r, "Conductivity") {
		t.Errorf("findings %v defaults %+v", checks(r), r.Marks)
	}
	// Without a substance the conductivity stays unknown and is assessed as low.
	atm := atmEthylAcetate
	atm.Substance = ""
	r = one(t, &atm, o)
	if !math.IsNaN(r.Input.Conductivity) || !hasCheck(r, "low-conductivity") {
		t.Errorf("no substance: conductivity %g, findings %v", r.Input.Conductivity, checks(r))
	}
}

func hasDefault(r ObjectResult, field string) bool {
	for _, d := range r.Defaults() {
		if d.Label == field {
			return true
		}
	}
	return false
}

func TestFillingVDLimit(t *testing.T) {
	lim := model.DefaultLimits()
	tests := []struct {
		kappa, want float64
	}{
		// Source: IEC 60079-32-1 (road-tanker filling) via reference section 8 [C v*d]:
		// v d <= 0.5 m^2/s above 10 pS/m, <= 0.38 m^2/s at or below it or unknown.
		{1e-12, 0.38},
		{10e-12, 0.38},
		{11e-12, 0.5},
		{4.6e-7, 0.5},
		{math.NaN(), 0.38},
	}
	for _, tc := range tests {
		if got := model.FillingVDLimit(tc.kappa, model.VesselRoadTanker, math.NaN(), &lim); got != tc.want {
			t.Errorf("FillingVDLimit(%g) = %g, want %g", tc.kappa, got, tc.want)
		}
	}
}

// TestBagTypeTable checks each bag type against each atmosphere band.
// Source: IEC 61340-4-4:2018 usage table as quoted in trade summaries (reference section 8b):
// dust zone 21/22: > 1000 mJ B, C, D; 3-1000 mJ B, C, D; <= 3 mJ C, D; gas or vapour zone 1/2
// (IIA, IIB): C, D; never IIC, zone 0 or zone 20. Type C counts as allowed when earthed
// (earthed here through 1e5 ohm, below the 1e6 ohm tab-to-earth limit).
func TestBagTypeTable(t *testing.T) {
	dust := func(zone string, mie float64) *inventory.Atmosphere {
		return &inventory.Atmosphere{ID: "A", Kind: "dust", MIE: known(mie), Group: "IIIB", Zone: zone}
	}
	gas := func(zone, group string) *inventory.Atmosphere {
		return &inventory.Atmosphere{ID: "A", Kind: "vapour", MIE: known(0.24e-3), Group: group, Zone: zone}
	}
	bands := []struct {
		name    string
		atm     *inventory.Atmosphere
		allowed string // types allowed
	}{
		{"dust zone 22, MIE 2000 mJ", dust("22", 2), "BCD"},
		{"dust zone 21, MIE 100 mJ", dust("21", 0.1), "BCD"},
		{"dust zone 21, MIE 2 mJ", dust("21", 2e-3), "CD"},
		{"dust zone 22, MIE 3 mJ (band edge)", dust("22", 3e-3), "CD"},
		{"dust zone 20", dust("20", 0.1), ""},
		{"vapour IIA zone 1", gas("1", "IIA"), "CD"},
		{"vapour IIB zone 2", gas("2", "IIB"), "CD"},
		{"vapour IIC zone 1", gas("1", "IIC"), ""},
		{"vapour IIA zone 0", gas("0", "IIA"), ""},
		// No atmosphere at the station: the product is taken as non-combustible, every
		// type allowed (a documented choice of this package, not from the table).
		{"no atmosphere", nil, "ABCD"},
	}
	for _, b := range bands {
		for _, typ := range []string{"A", "B", "C", "D", ""} {
			name := b.name + ", type " + typ
			if typ == "" {
				name = b.name + ", type not given"
			}
			t.Run(name, func(t *testing.T) {
				o := inventory.Object{Kind: "bag", BagType: typ, Resistance: known(1e5), Length: known(1), Width: known(1)}
				r := one(t, b.atm, o)
				eff := typ
				if eff == "" {
					eff = "A" // assessed as the most restrictive case
				}
				want := strings.Contains(b.allowed, eff)
				if got := !hasCheck(r, "bag-type"); got != want {
					t.Errorf("allowed = %v, want %v (findings %v)", got, want, checks(r))
				}
				if typ == "" && !hasDefault(r, "Bag type") {
					t.Errorf("unknown bag type not recorded as a default")
				}
			})
		}
	}
}

func TestBagEarthing(t *testing.T) {
	tests := []struct {
		name string
		r    inventory.Quantity
		want bool // finding expected
	}{
		// Source: IEC 61340-4-4:2018 via reference section 8b: tab to plant earth < 1e6 ohm.
		{"earthed 1e5 ohm", known(1e5), false},
		{"1e8 ohm", known(1e8), true},
		{"not measured", inventory.Quantity{}, true},
	}
	atm := &inventory.Atmosphere{ID: "A", Kind: "dust", MIE: known(0.1), Group: "IIIB", Zone: "21"} // invented for the demo
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			r := one(t, atm, inventory.Object{Kind: "bag", BagType: "C", Resistance: tc.r, Length: known(1), Width: known(1)})
			if got := hasCheck(r, "bag-earthing"); got != tc.want {
				t.Errorf("bag-earthing finding = %v, want %v (findings %v)", got, tc.want, checks(r))
			}
		})
	}
	// Source: IEC 61340-4-4:2018 via reference section 8b: types C and D are qualified for
	// charging currents up to 3 uA; 0.5 kg/s x 10 uC/kg = 5 uA (derived) is beyond.
	r := one(t, atm, inventory.Object{Kind: "bag", BagType: "D", MassFlow: known(0.5), ChargeToMass: known(10e-6)})
	if !hasCheck(r, "bag-qualification") {
		t.Errorf("5 uA into a type D bag: findings %v, want bag-qualification", checks(r))
	}
}

func TestStationRanking(t *testing.T) {
	// Stations built so that each rule of the order decides once (invented for the demo).
	// Person 100 pF at 10 kV: 5 mJ, ratio 20.8 vs toluene (reference section 10.1, derived).
	person := func(id, st string) inventory.Object {
		return inventory.Object{ID: id, Station: st, Kind: "person", Capacitance: known(100e-12), SurfacePotential: known(10e3), Resistance: known(1e7)}
	}
	// Small part 20 pF at 2.5 kV, not earthed: 62.5 uJ, ratio 0.26 vs toluene, above
	// MIE / 10; charge 50 nC, below the 60 nC IIA limit (derived): marginal.
	weak := func(id, st string) inventory.Object {
		return inventory.Object{ID: id, Station: st, Kind: "part", Capacitance: known(20e-12), SurfacePotential: known(2.5e3)}
	}
	stations := []inventory.Station{
		{ID: "S-EMPTY", Atmosphere: "A-TOL"},
		{ID: "S-LOW", Atmosphere: "A-TOL"},
		{ID: "S-TWO", Atmosphere: "A-TOL"},
		{ID: "S-B", Atmosphere: "A-TOL"},
		{ID: "S-A", Atmosphere: "A-TOL"},
		{ID: "S-NOATM"},
		{ID: "S-TIE-M", Atmosphere: "A-TOL"},
	}
	objs := []inventory.Object{
		weak("P1", "S-LOW"),
		person("P2", "S-TWO"), person("P3", "S-TWO"),
		person("P4", "S-B"),
		person("P5", "S-A"),
		{ID: "X1", Station: "S-NOATM", Kind: "part", Capacitance: known(400e-12), SurfacePotential: known(50e3)},
		person("P6", "S-TIE-M"), weak("P7", "S-TIE-M"),
	}
	a := Assess(newSurvey([]inventory.Atmosphere{atmToluene}, stations, objs, nil), Options{})
	var got []string
	for _, s := range a.Stations {
		got = append(got, s.Station.ID)
	}
	// Worst ratio first (20.8 for S-TWO, S-TIE-M, S-A, S-B); among them two incendive
	// objects (S-TWO) before one incendive and one marginal (S-TIE-M) before one
	// incendive (S-A, S-B by ID); then ratio 0.26 (S-LOW); nil ratios last, the one
	// with a marginal object (S-NOATM) before the empty one.
	want := []string{"S-TWO", "S-TIE-M", "S-A", "S-B", "S-LOW", "S-NOATM", "S-EMPTY"}
	if strings.Join(got, " ") != strings.Join(want, " ") {
		t.Fatalf("station order %v, want %v", got, want)
	}
	byID := map[string]StationResult{}
	for i, s := range a.Stations {
		if s.Rank != i+1 {
			t.Errorf("%s rank %d, want %d", s.Station.ID, s.Rank, i+1)
		}
		byID[s.Station.ID] = s
	}
	if v := byID["S-EMPTY"]; v.WorstRatio != nil || len(v.Objects) != 0 || v.Verdict != NotAssessed {
		t.Errorf("empty station: %+v", v)
	}
	if v := byID["S-TIE-M"].Verdict; v != Incendive {
		t.Errorf("S-TIE-M verdict %v, want its worst object's (incendive)", v)
	}
	if v := byID["S-LOW"].Verdict; v != Marginal {
		t.Errorf("S-LOW verdict %v, want marginal", v)
	}
	if v := byID["S-NOATM"]; v.Verdict != Marginal || v.WorstRatio != nil {
		t.Errorf("S-NOATM: verdict %v ratio %v, want marginal and nil", v.Verdict, v.WorstRatio)
	}
	if a.Counts[Incendive] != 5 || a.Counts[Marginal] != 3 || a.Counts[NonIncendive] != 0 {
		t.Errorf("counts %v, want 5 incendive, 3 marginal", a.Counts)
	}
	// Findings: every incendive one before any marginal one; within a severity by station rank.
	prevSev, prevRank := 4, 0
	for _, f := range a.Findings {
		sev, rank := f.Severity.Severity(), byID[f.StationID].Rank
		if sev > prevSev || (sev == prevSev && rank < prevRank) {
			t.Errorf("finding %s/%s (severity %d, station rank %d) out of order", f.ObjectID, f.Check, sev, rank)
		}
		prevSev, prevRank = sev, rank
	}
	if len(a.Findings) == 0 || a.Findings[0].Severity != Incendive {
		t.Errorf("findings do not start with an incendive one: %+v", a.Findings)
	}
	if len(a.Objects) != len(objs) {
		t.Errorf("%d object results, want %d", len(a.Objects), len(objs))
	}
}

func TestUnknownStationKeepsObject(t *testing.T) {
	// 100 pF at 1 kV: values invented for the demo; the station is what matters.
	s := newSurvey(nil, nil, []inventory.Object{{ID: "LOST", Station: "S-NONE", Kind: "part", Capacitance: known(1e-10), SurfacePotential: known(1e3)}}, nil)
	a := Assess(s, Options{})
	if len(a.Objects) != 1 || a.Objects[0].Verdict != NotAssessed || !strings.Contains(a.Objects[0].Reason, "S-NONE") {
		t.Fatalf("got %+v", a.Objects)
	}
	if len(a.Stations) != 1 || a.Stations[0].Station.ID != "S-NONE" {
		t.Errorf("stations %+v, want the unknown station listed", a.Stations)
	}
}

func TestDefaultsRecorded(t *testing.T) {
	// A person with nothing measured but a resistance: capacitance estimated (200 pF typical,
	// Saito 1963, default from memory), walking current 1 uA (Jonassen); the site's
	// RH, taken for a station that gives none, is entered (typed), not a default.
	s := newSurvey([]inventory.Atmosphere{atmToluene}, []inventory.Station{{ID: "S", Atmosphere: "A-TOL"}},
		[]inventory.Object{{ID: "P", Station: "S", Kind: "person", Resistance: known(1e10)}, {ID: "D", Station: "S", Kind: "container", MassFlow: known(0.1), ChargeToMass: known(1e-6)}}, nil)
	s.Site.RequiredMargin = inventory.Quantity{}
	// As the reader leaves it: the temperature filled in and listed as a default.
	s.Site.AirTemperature = known(293.15)
	s.Site.Defaults = []inventory.SiteDefault{{Item: inventory.SiteItemAirTemperature, Text: "Air temperature 20 °C (default)"}}
	a := Assess(s, Options{})
	p := a.Objects[0]
	if got := p.Provenance(ItemRelativeHumidity); got != ProvEntered {
		t.Errorf("person: site RH provenance %v, want entered", got)
	}
	for _, f := range []string{"Capacitance", "Required margin", "Air temperature"} {
		if !hasDefault(p, f) {
			t.Errorf("person: default %q not recorded (%+v)", f, p.Marks)
		}
	}
	if !hasDefault(a.Objects[1], "Resistance to earth") {
		t.Errorf("drum: unknown resistance not recorded as a default (%+v)", a.Objects[1].Marks)
	}
	seen := map[string]int{}
	for _, d := range a.MethodDefaults {
		seen[d.Label+"|"+d.Reason]++
	}
	for k, n := range seen {
		if n != 1 {
			t.Errorf("method default %q listed %d times", k, n)
		}
	}
	if len(a.MethodDefaults) == 0 {
		t.Error("no method defaults")
	}
}

func TestLimitsFromSite(t *testing.T) {
	base := model.DefaultLimits()
	st := inventory.Site{Items: []inventory.SiteItem{
		{Key: "shock energy [mj]", Item: "Shock energy [mJ]", Value: "400", Row: 8},
		{Key: "conductor earthing limit [ω]", Item: "Conductor earthing limit [Ω]", Value: "1e5", Row: 9},
		{Key: "transferred charge iib [nc]", Item: "Transferred charge IIB [nC]", Value: "20", Row: 10},
		{Key: "brush energy", Item: "Brush energy", Value: "3 mJ", Row: 11},
		{Key: "bag c tab to earth [ohm]", Item: "Bag C tab to earth [ohm]", Value: "1e5", Row: 12},
		{Key: "colour of the door", Item: "Colour of the door", Value: "red", Row: 13},
		{Key: "person earthing limit [ω]", Item: "Person earthing limit [Ω]", Value: "abc", Row: 14},
		{Key: "safe potential [kv]", Item: "Safe potential [kV]", Value: "-1", Row: 15},
		{Key: "brush area [kv]", Item: "Brush area [kV]", Value: "5", Row: 16},
	}}
	st, probs := siteWith(st.Items)
	lim := LimitsFromSite(st, base)
	// The overrides, converted to SI (derived: unit arithmetic).
	wantRel(t, "ShockEnergy", lim.ShockEnergy, 0.4)
	wantRel(t, "ConductorEarthing", lim.ConductorEarthing, 1e5)
	wantRel(t, "TransferredCharge[IIB]", lim.TransferredCharge[model.IIB], 20e-9)
	wantRel(t, "BrushEnergy", lim.BrushEnergy, 3e-3)
	wantRel(t, "BagTabToEarth", lim.BagTabToEarth, 1e5)
	// Rejected overrides keep the base values.
	if lim.PersonEarthing != base.PersonEarthing || lim.SafePotential != base.SafePotential || lim.BrushArea != base.BrushArea {
		t.Errorf("a rejected override changed a limit")
	}
	if lim.TransferredCharge[model.IIA] != base.TransferredCharge[model.IIA] {
		t.Errorf("IIA limit changed by an IIB override")
	}
	sev := map[int]inventory.Severity{}
	for _, p := range probs {
		sev[p.Row] = p.Severity
		if p.Sheet != inventory.SheetSite || p.Message == "" {
			t.Errorf("problem without place or message: %+v", p)
		}
	}
	want := map[int]inventory.Severity{13: inventory.Warning, 14: inventory.Error, 15: inventory.Error, 16: inventory.Error}
	if len(sev) != len(want) {
		t.Errorf("problems %+v, want rows 13-16", probs)
	}
	for row, s := range want {
		if got, ok := sev[row]; !ok || got != s {
			t.Errorf("row %d: severity %v (present %v), want %v", row, got, ok, s)
		}
	}
	// The overrides reach the assessment: a 400 pF part at 50 kV (500 mJ, reference
	// section 10.2) stays a shock hazard at 400 mJ but not at 600 mJ.
	s := newSurvey(nil, []inventory.Station{{ID: "S"}}, []inventory.Object{{ID: "X", Station: "S", Kind: "part", Capacitance: known(400e-12), SurfacePotential: known(50e3)}}, nil)
	ss, _ := siteWith([]inventory.SiteItem{{Key: "shock energy [mj]", Item: "Shock energy [mJ]", Value: "600", Row: 8}})
	s.Site.Items, s.Site.Limits, s.Site.Uncertainties = ss.Items, ss.Limits, ss.Uncertainties
	if a := Assess(s, Options{}); a.Objects[0].Verdict != NonIncendive {
		t.Errorf("shock limit 600 mJ: verdict %v, want non-incendive", a.Objects[0].Verdict)
	}
}

func TestClassifyAllocationFree(t *testing.T) {
	lim := model.DefaultLimits()
	// Source: reference section 10.1 [C]: 100 pF at 10 kV -> 5 mJ.
	in := model.Input{Kind: model.Person, Material: unknownMaterial(), Capacitance: 100e-12, SurfacePotential: 10e3,
		Length: math.NaN(), Width: math.NaN(), Diameter: math.NaN(), Thickness: math.NaN(), DistanceToEarth: math.NaN(),
		Field: math.NaN(), FieldDistance: math.NaN(), Speed: math.NaN(), MassFlow: math.NaN(), ChargeToMass: math.NaN(),
		ChargingCurrent: math.NaN(), ChargingTime: math.NaN(), ParticleSize: math.NaN(), Resistance: math.NaN(),
		Conductivity: math.NaN(), Permittivity: math.NaN(), ProductMIE: math.NaN()}
	env := model.Environment{RelativeHumidity: 50, Temperature: 293.15, Atmosphere: model.Vapour, Group: model.IIA, Zone: model.Zone1, MIE: 0.24e-3}
	ev := model.Evaluate(in, env, lim)
	var c Classification
	allocs := testing.AllocsPerRun(100, func() { c = Classify(&in, &env, &ev, &lim, 10) })
	if allocs != 0 {
		t.Errorf("Classify allocates %v times per call, want 0", allocs)
	}
	if c.Verdict != Incendive || !c.Failed.Has(CheckEnergyMIE) || !c.Failed.Has(CheckPersonEarthing) {
		t.Errorf("classification %+v", c)
	}
	wantRel(t, "ratio", c.Ratio, 5e-3/0.24e-3)
}

func TestCheckNamesStable(t *testing.T) {
	// The names are the JSON and workbook contract; each is kebab-case and unique.
	seen := map[string]bool{}
	for k := Check(0); k < NumChecks; k++ {
		n := k.Name()
		if n == "unknown" || seen[n] || strings.ToLower(n) != n || strings.Contains(n, " ") {
			t.Errorf("check %d name %q", k, n)
		}
		seen[n] = true
	}
}

func TestFormat(t *testing.T) {
	tests := []struct{ got, want string }{
		// derived: unit conversion and rounding to three significant digits.
		{mJ(5e-3), "5 mJ"},
		{mJ(0.1132), "113 mJ"},
		{mJ(0.24e-3), "0.24 mJ"},
		{kV(47581), "47.6 kV"},
		{ohm(1e6), "1.0e6 Ω"},
		{ohm(3.5e-7), "3.5e-7 Ω"},
		{cm2(1), "10000 cm²"},
		{nC(1.08e-7), "108 nC"}, {nC(4e-4), "400 µC"}, // derived: 4e-4 C = 400 µC
		{pF(100e-12), "100 pF"},
	}
	for _, tc := range tests {
		if tc.got != tc.want {
			t.Errorf("got %q, want %q", tc.got, tc.want)
		}
	}
}

func TestEveryCheckHasMitigation(t *testing.T) {
	for k := Check(0); k < NumChecks; k++ {
		if templates.Mitigation(k.Name()) == "" {
			t.Errorf("check %s has no mitigation text", k.Name())
		}
	}
	for _, cls := range []string{"conductor", "person", "insulator", "powder", "liquid", "bag"} {
		if templates.Mitigation("energy."+cls) == "" {
			t.Errorf("energy mitigation for %s missing", cls)
		}
	}
	// A key with no text of its own falls back to its family.
	if got, want := templates.Mitigation("conductor-earthing.person"), templates.Mitigation("conductor-earthing"); got != want {
		t.Errorf("fallback: got %q, want %q", got, want)
	}
}

func TestAtmosphereDefaults(t *testing.T) {
	// A vapour atmosphere with no zone is assessed as zone 0, the strictest (TRGS 723 as
	// summarised in reference section 11), and its MIE from the substance list is recorded.
	atm := inventory.Atmosphere{ID: "A-HEX", Substance: "n-hexane", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", MIEFromSubstance: true}
	// A 10 cm x 6 cm = 60 cm^2 film (derived): above the zone 0 IIA limit of 50 cm^2
	// (EPL Ga) and below the zone 1 limit of 100 cm^2 (IEC 60079-0, from memory).
	film := inventory.Object{Kind: "sheet", Material: matPET.Name, Length: known(0.1), Width: known(0.06), Field: known(1e3), FieldDistance: known(0.1)}
	r := one(t, &atm, film, matPET)
	if r.Environment.Zone != model.Zone0 || !hasDefault(r, "Zone") || !hasDefault(r, "MIE") {
		t.Errorf("zone %v defaults %+v, want zone 0 and Zone, MIE defaults", r.Environment.Zone, r.Marks)
	}
	if !hasCheck(r, "insulating-area") {
		t.Errorf("60 cm² in zone 0 IIA: findings %v, want insulating-area", checks(r))
	}
	atm.Zone = "1"
	if r := one(t, &atm, film, matPET); hasCheck(r, "insulating-area") {
		t.Errorf("60 cm² in zone 1 IIA: unexpected insulating-area finding")
	}
}

func FuzzLimitsFromSite(f *testing.F) {
	// Seeds: invented for the demo (item texts as a surveyor writes them).
	f.Add("shock energy [mj]", "400")
	f.Add("conductor earthing limit [ω]", "1e6 ohm")
	f.Add("brush area", "100 cm²")
	f.Add("transferred charge iic [nc]", "-3")
	f.Add("whatever", "")
	f.Fuzz(func(t *testing.T, key, value string) {
		base := model.DefaultLimits()
		st, probs := siteWith([]inventory.SiteItem{{Key: key, Item: key, Value: value, Row: 9}})
		lim := LimitsFromSite(st, base)
		if len(probs) > 1 {
			t.Fatalf("one item gave %d problems", len(probs))
		}
		// fmt prints NaN alike on both sides, where == on the structs would not.
		same := fmt.Sprint(lim) == fmt.Sprint(base)
		if len(probs) == 1 && !same {
			t.Fatalf("a rejected item %q = %q changed the limits", key, value)
		}
		for _, v := range limitValues(lim) {
			if v <= 0 || math.IsInf(v, 0) {
				t.Fatalf("item %q = %q set a limit to %g", key, value, v)
			}
		}
	})
}

// limitValues lists every float of the limits that is not NaN.
func limitValues(l model.Limits) []float64 {
	var out []float64
	rv := reflect.ValueOf(l)
	for i := 0; i < rv.NumField(); i++ {
		f := rv.Field(i)
		switch f.Kind() {
		case reflect.Float64:
			if !math.IsNaN(f.Float()) {
				out = append(out, f.Float())
			}
		case reflect.Array:
			for j := 0; j < f.Len(); j++ {
				if v := f.Index(j).Float(); !math.IsNaN(v) {
					out = append(out, v)
				}
			}
		}
	}
	return out
}

func BenchmarkClassify(b *testing.B) {
	lim := model.DefaultLimits()
	// Source: reference section 10.6 (derived): 5 uA into 1e11 ohm, 100 pF, 1 s -> 113 mJ.
	in := model.Input{Kind: model.Container, Material: unknownMaterial(), Capacitance: 100e-12, Resistance: 1e11, MassFlow: 0.5, ChargeToMass: 10e-6, ChargingTime: 1,
		Length: math.NaN(), Width: math.NaN(), Diameter: math.NaN(), Thickness: math.NaN(), DistanceToEarth: math.NaN(),
		Field: math.NaN(), FieldDistance: math.NaN(), SurfacePotential: math.NaN(), Speed: math.NaN(),
		ChargingCurrent: math.NaN(), ParticleSize: math.NaN(), Conductivity: math.NaN(), Permittivity: math.NaN(), ProductMIE: math.NaN()}
	env := model.Environment{RelativeHumidity: 50, Temperature: 293.15, Atmosphere: model.Dust, Group: model.IIIB, Zone: model.Zone21, MIE: 10e-3}
	b.ReportAllocs()
	for b.Loop() {
		ev := model.Evaluate(in, env, lim)
		_ = Classify(&in, &env, &ev, &lim, 10)
	}
}
