package assess

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// TestPractitionerCases is the acceptance test of the judging stage against the
// 27 screening cases an electrostatics reviewer worked by hand, without the
// tool's code, in testdata/handworked.md (and HW-28, worked by hand by the
// developers for review 3 item 4, its numbers from the reference). Each entry gives the survey inputs of
// one case (an invented plant), the verdict the reviewer would sign and the key
// numbers the case derives; the expected values come from that file, never from
// the tool's output.
//
// Three marks keep the test green where the tool and the case differ:
//
//   - needs: the case uses a survey input that does not exist yet (a measured
//     layer breakdown voltage, the receiving vessel's class...). The entry says
//     what to fill in; the case logs today's result and is skipped. When the
//     input lands, fill it in and delete the mark (then, if the case fails,
//     it is a knownGap or a defect).
//   - knownGap: the inputs exist but today's verdict or numbers differ from the
//     hand-worked ones. The case runs, logs every difference, and is skipped;
//     once it passes, the mark fails the test, so that it is removed and the
//     case guards the fix from then on.
//   - stricter: the tool's verdict is stricter than the reviewer's on a point of
//     judgement where the case does not itself accept the stricter verdict
//     (alsoAccept is for those it does). The case passes only when the tool is
//     stricter, never milder, asserts everything else, and logs the reason;
//     once the verdicts agree, the mark fails the test.
//
// Run `go test ./report/assess -run TestPractitionerCases -v` to see, per case,
// today's verdict against the hand-worked one.
func TestPractitionerCases(t *testing.T) {
	for _, tc := range practitionerCases() {
		t.Run(tc.id, func(t *testing.T) {
			r := assessCase(t, tc)
			t.Logf("%s: today %v (%s), findings %v; hand-worked %v", tc.id, r.Verdict, r.Reason, checks(r), tc.verdict)
			for _, todo := range tc.todoChecks {
				t.Logf("TODO %s: expected check %s (no such check yet: only the verdict is asserted)", tc.id, todo)
			}
			if tc.needs != "" {
				t.Skipf("%s needs an input that does not exist yet: %s", tc.id, tc.needs)
			}
			diffs := tc.differences(r)
			if tc.stricter != "" {
				if r.Verdict == tc.verdict {
					t.Errorf("%s: the verdicts agree (%v): remove its stricter mark", tc.id, r.Verdict)
				} else {
					t.Logf("%s: verdict %v is stricter than the reviewer's %v, not accepted by the case: %s", tc.id, r.Verdict, tc.verdict, tc.stricter)
				}
			}
			if r.Verdict != tc.verdict && slices.Contains(tc.alsoAccept, r.Verdict) {
				t.Logf("%s: verdict %v is not the reviewer's %v but one the case accepts (see its comment)", tc.id, r.Verdict, tc.verdict)
			}
			if tc.knownGap != "" {
				if len(diffs) == 0 {
					t.Fatalf("%s: known gap %q is closed (the case passes): remove its knownGap mark", tc.id, tc.knownGap)
				}
				for _, d := range diffs {
					t.Logf("%s known gap (%s): %s", tc.id, tc.knownGap, d)
				}
				t.Skipf("%s: known gap, %s", tc.id, tc.knownGap)
			}
			for _, d := range diffs {
				t.Error(d)
			}
		})
	}
}

// practitionerCase is one hand-worked case.
type practitionerCase struct {
	id   string // "HW-nn" and a short title, as in handworked.md
	atm  *inventory.Atmosphere
	rh   float64 // station RH in %; 0: the site's (50 %)
	obj  inventory.Object
	mats []inventory.Material

	verdict Verdict // the verdict the reviewer signs
	// alsoAccept lists verdicts the case itself calls acceptable besides its
	// own (each with its condition in the entry's comment and in accept).
	alsoAccept []Verdict
	// accept, when set, is checked whenever the tool gives an alsoAccept
	// verdict: it returns why that verdict is not acceptable here ("" if it is).
	accept func(r ObjectResult) string

	// Key numbers (zero value: not checked).
	sigma     hwSpan // C/m^2, Evaluation.ChargeDensity
	energy    hwSpan // J, Evaluation.EffectiveEnergy
	charge    hwSpan // C, Evaluation.TransferredCharge
	potential hwSpan // V, Evaluation.Potential
	mie       hwSpan // J, the screening MIE the environment used (Environment.MIE)
	// numbersOf, when set, names the discharge whose energy and charge the
	// case's numbers are (the case's own deciding discharge), where the tool
	// decides by a stricter one; nil: the effective discharge
	// (Evaluation.EffectiveEnergy, TransferredCharge).
	numbersOf *model.DischargeType

	wantChecks  []string              // findings that must be present (checks that exist today)
	avoidChecks []string              // findings that must not be present
	todoChecks  []string              // findings the case names but no check exists for yet (logged, not asserted)
	possible    []model.DischargeType // discharges that must be possible
	impossible  []model.DischargeType // discharges that must not be possible
	flags       model.Flag            // model flags that must be set

	needs    string // missing survey input: what to fill in after the merge
	knownGap string // "issue 11: <rule>": fails on main today
	// stricter, when set, says why the tool's verdict is stricter than the
	// reviewer's on a point of judgement the case does not itself accept: the
	// case then passes with a verdict more severe than its own (never milder),
	// logs the difference, and asserts everything else. The difference is
	// reported for a decision; the mark fails once the verdicts agree.
	stricter string
}

// hwSpan is an expected value: lo == hi is a single value within the case's
// relative tolerance; lo < hi a range the value must fall in.
type hwSpan struct {
	lo, hi float64
	tol    float64 // relative; 0 takes hwTol
}

// hwTol is the tolerance on the hand-worked numbers, whose python3 values are
// quoted in full below.
const hwTol = 2e-3

func hwNear(v float64) hwSpan         { return hwSpan{lo: v, hi: v} }
func hwNearTol(v, tol float64) hwSpan { return hwSpan{lo: v, hi: v, tol: tol} }
func hwBetween(lo, hi float64) hwSpan { return hwSpan{lo: lo, hi: hi} }
func (s hwSpan) set() bool            { return s.lo != 0 || s.hi != 0 }

func (s hwSpan) tolerance() float64 {
	if s.tol > 0 {
		return s.tol
	}
	return hwTol
}

func (s hwSpan) holds(got float64) bool {
	return s.lo*(1-s.tolerance()) <= got && got <= s.hi*(1+s.tolerance())
}

func (s hwSpan) String() string {
	if s.lo == s.hi {
		return fmt.Sprintf("%.4g (±%.2g%%)", s.lo, 100*s.tolerance())
	}
	return fmt.Sprintf("[%.4g, %.4g]", s.lo, s.hi)
}

// differences lists every way r differs from the hand-worked case.
func (tc practitionerCase) differences(r ObjectResult) []string {
	var out []string
	energy, charge := r.Eval.EffectiveEnergy, r.Eval.TransferredCharge
	if tc.numbersOf != nil {
		d := r.Eval.Discharges[*tc.numbersOf]
		energy, charge = d.Energy, d.Charge
		if !d.Possible {
			out = append(out, fmt.Sprintf("discharge %v the case's numbers are for is not possible", *tc.numbersOf))
		}
		if r.Eval.EffectiveEnergy < d.Energy {
			out = append(out, fmt.Sprintf("effective energy %.4g J below the case's %v energy %.4g J", r.Eval.EffectiveEnergy, *tc.numbersOf, d.Energy))
		}
	}
	switch {
	case r.Verdict == tc.verdict:
	case tc.stricter != "" && r.Verdict.Severity() > tc.verdict.Severity():
	case slices.Contains(tc.alsoAccept, r.Verdict):
		if tc.accept != nil {
			if why := tc.accept(r); why != "" {
				out = append(out, fmt.Sprintf("verdict %v accepted by the case only %s", r.Verdict, why))
			}
		}
	default:
		out = append(out, fmt.Sprintf("verdict = %v, hand-worked %v (reason: %s; findings %v)", r.Verdict, tc.verdict, r.Reason, checks(r)))
	}
	for _, n := range []struct {
		what string
		want hwSpan
		got  float64
	}{
		{"charge density [C/m²]", tc.sigma, r.Eval.ChargeDensity},
		{"energy [J]", tc.energy, energy},
		{"transferred charge [C]", tc.charge, charge},
		{"potential [V]", tc.potential, r.Eval.Potential},
		{"screening MIE [J]", tc.mie, r.Environment.MIE},
	} {
		if n.want.set() && !n.want.holds(n.got) {
			out = append(out, fmt.Sprintf("%s = %.4g, hand-worked %v", n.what, n.got, n.want))
		}
	}
	for _, c := range tc.wantChecks {
		if !hasCheck(r, c) {
			out = append(out, fmt.Sprintf("missing finding %q (findings %v)", c, checks(r)))
		}
	}
	for _, c := range tc.avoidChecks {
		if hasCheck(r, c) {
			out = append(out, fmt.Sprintf("unexpected finding %q (findings %v)", c, checks(r)))
		}
	}
	for _, d := range tc.possible {
		if !r.Eval.Discharges[d].Possible {
			out = append(out, fmt.Sprintf("discharge %v not possible, hand-worked possible", d))
		}
	}
	for _, d := range tc.impossible {
		if r.Eval.Discharges[d].Possible {
			out = append(out, fmt.Sprintf("discharge %v possible, hand-worked not possible", d))
		}
	}
	if tc.flags != 0 && r.Eval.Flags&tc.flags != tc.flags {
		out = append(out, fmt.Sprintf("model flags %v lack %v", r.Eval.Flags.Texts(), (tc.flags&^r.Eval.Flags).Texts()))
	}
	// Principle 4: a verdict above non-incendive rests on at least one finding.
	if (r.Verdict == Incendive || r.Verdict == Marginal) && len(r.Findings) == 0 {
		out = append(out, fmt.Sprintf("verdict %v with no finding", r.Verdict))
	}
	return out
}

// assessCase assesses the case's single object at a single station, as the
// helper one does, but with the station's own relative humidity when the case
// gives one (one leaves it to the site's 50 %).
func assessCase(t *testing.T, tc practitionerCase) ObjectResult {
	t.Helper()
	st := inventory.Station{ID: "ST-HW", Name: "Hand-worked station"}
	if tc.rh > 0 {
		st.RelativeHumidity = known(tc.rh)
	}
	var atms []inventory.Atmosphere
	if tc.atm != nil {
		st.Atmosphere = tc.atm.ID
		atms = append(atms, *tc.atm)
	}
	o := tc.obj
	o.Station = st.ID
	o.ID = strings.Fields(tc.id)[0]
	a := Assess(newSurvey(atms, []inventory.Station{st}, []inventory.Object{o}, tc.mats), Options{})
	if len(a.Objects) != 1 {
		t.Fatalf("got %d object results, want 1", len(a.Objects))
	}
	return a.Objects[0]
}

// hwAluminium is the built-in aluminium (conductive: its class is all HW-28 uses).
func hwAluminium() inventory.Material {
	m, ok := inventory.LookupMaterial("aluminium")
	if !ok {
		panic("built-in aluminium missing")
	}
	return m
}

// Materials of the hand-worked cases (handworked.md, "Materials used"). A
// resistivity written "> 1e14" is entered as its bound; a blank value is NaN.
var (
	hwNaN = math.NaN()
	// PE film: epsr 2.3, rho_s > 1e14 ohm, slope 0 (from memory, handworked.md).
	hwPE = inventory.Material{Name: "PE film", Class: "insulating", Permittivity: 2.3, SurfaceResistivity: 1e14, HumiditySlope: 0, VolumeResistivity: hwNaN, BreakdownStrength: hwNaN, Source: "hand-worked cases, from memory"}
	// PET film, breakdown strength blank (HW-02): epsr 3.2, rho_s > 1e14 ohm, slope 0 (from memory).
	hwPET = inventory.Material{Name: "PET film", Class: "insulating", Permittivity: 3.2, SurfaceResistivity: 1e14, HumiditySlope: 0, VolumeResistivity: hwNaN, BreakdownStrength: hwNaN, Source: "hand-worked cases, from memory"}
	// PTFE: epsr 2.1, rho_s > 1e15 ohm, slope 0 (from memory).
	hwPTFE = inventory.Material{Name: "PTFE", Class: "insulating", Permittivity: 2.1, SurfaceResistivity: 1e15, HumiditySlope: 0, VolumeResistivity: hwNaN, BreakdownStrength: hwNaN, Source: "hand-worked cases, from memory"}
	// Paper: epsr 2.5 (from memory); rho_s 7.4e6 ohm at 50 % and 0.79 decades per
	// 10 %RH, derived in handworked.md from 1e9 ohm at 23 % and 1e6 ohm at 61 %
	// (confirmed, weak secondary). The case writes its class "(hygroscopic)", not a
	// class of the survey; at 50 % RH its resistivity is dissipative, so it is
	// entered as dissipative (the model judges the surface by its resistivity).
	hwPaper = inventory.Material{Name: "Paper", Class: "dissipative", Permittivity: 2.5, SurfaceResistivity: 7.36e6, HumiditySlope: 0.79, VolumeResistivity: hwNaN, BreakdownStrength: hwNaN, Source: "hand-worked cases"}
	// Dissipative PP: epsr 2.3 (from memory); rho_s 1e8 ohm, slope 0.3 (invented for the demo).
	hwDissPP = inventory.Material{Name: "Dissipative PP", Class: "dissipative", Permittivity: 2.3, SurfaceResistivity: 1e8, HumiditySlope: 0.3, VolumeResistivity: hwNaN, BreakdownStrength: hwNaN, Source: "invented for the demo"}
	// Granulates G-10 and G-500: volume resistivity 1e13 ohm m (invented for the demo).
	hwGranulate = inventory.Material{Name: "granulate", Class: "insulating", Permittivity: hwNaN, SurfaceResistivity: hwNaN, VolumeResistivity: 1e13, BreakdownStrength: hwNaN, Source: "invented for the demo"}
)

func ptr[T any](v T) *T { return &v }

// hwListedMIE returns the MIE (J) the built-in substance list gives name, the
// value the reader fills into a blank MIE; it panics on a name the list lacks.
func hwListedMIE(name string) float64 {
	s, ok := inventory.LookupSubstance(name)
	if !ok {
		panic("hand-worked cases: substance " + name + " not in the built-in list")
	}
	return s.MIE
}

// Atmospheres of the hand-worked cases (handworked.md, "Atmospheres").
var (
	// MIE invented for the demo; group blank.
	hwAtmX = &inventory.Atmosphere{ID: "A-X", Description: "solvent blend S-4", Kind: "vapour", MIE: known(0.30e-3), Zone: "1"}
	// Toluene: MIE 0.24 mJ, IIA (from memory).
	hwAtmTol1 = &inventory.Atmosphere{ID: "A-TOL1", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "1"}
	hwAtmTol0 = &inventory.Atmosphere{ID: "A-TOL0", Description: "inside a tanker compartment", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "0"}
	// Ethyl acetate: MIE 0.46 mJ, IIA (from memory).
	hwAtmEA = &inventory.Atmosphere{ID: "A-EA", Substance: "ethyl acetate", Kind: "vapour", MIE: known(0.46e-3), Group: "IIA", Zone: "1"}
	// Zone 2 for HW-28 (invented for the test; ethyl acetate 0.46 mJ, reference section 4, from memory).
	hwAtmEA2 = &inventory.Atmosphere{ID: "A-EA2", Substance: "ethyl acetate", Kind: "vapour", MIE: known(0.46e-3), Group: "IIA", Zone: "2"}
	// Diethyl ether: MIE 0.19 mJ, IIB (from memory); A-DEEn has its zone blank.
	hwAtmDEE  = &inventory.Atmosphere{ID: "A-DEE", Substance: "diethyl ether", Kind: "vapour", MIE: known(0.19e-3), Group: "IIB", Zone: "1"}
	hwAtmDEEn = &inventory.Atmosphere{ID: "A-DEEn", Substance: "diethyl ether", Kind: "vapour", MIE: known(0.19e-3), Group: "IIB"}
	// Acetone: MIE blank on the sheet, filled from the built-in list as the reader
	// does (the list's screening value, not a number copied here; the case names the
	// recalled 1.15 mJ at stoichiometric); IIA (from memory).
	hwAtmACE = &inventory.Atmosphere{ID: "A-ACE", Substance: "acetone", Kind: "vapour", MIE: known(hwListedMIE("acetone")), MIEFromSubstance: true, Group: "IIA", Zone: "1"}
	// Methanol: MIE 0.14 mJ, IIA (from memory), zone 0 inside and around an IBC.
	hwAtmMeOH = &inventory.Atmosphere{ID: "A-MEOH", Substance: "methanol", Kind: "vapour", MIE: known(0.14e-3), Group: "IIA", Zone: "0"}
	// Hydrogen: MIE 0.017 mJ, IIC (confirmed).
	hwAtmH2 = &inventory.Atmosphere{ID: "A-H2", Substance: "hydrogen", Kind: "gas", MIE: known(0.017e-3), Group: "IIC", Zone: "0"}
	// Dusts: MIEs invented for the demo.
	hwAtmD10  = &inventory.Atmosphere{ID: "A-D10", Description: "granulate G-10, inside a silo", Kind: "dust", MIE: known(10e-3), Group: "IIIB", Zone: "20"}
	hwAtmD500 = &inventory.Atmosphere{ID: "A-D500", Description: "coarse granulate G-500, inside a silo", Kind: "dust", MIE: known(500e-3), Group: "IIIB", Zone: "20"}
	hwAtmD08  = &inventory.Atmosphere{ID: "A-D08", Description: "fine pigment P-08", Kind: "dust", MIE: known(0.8e-3), Group: "IIIB", Zone: "21"}
	hwAtmD5   = &inventory.Atmosphere{ID: "A-D5", Description: "flour-like dust F-5", Kind: "dust", MIE: known(5e-3), Group: "IIIB", Zone: "21"}
	// Hybrid: resin powder (dust MIE 30 mJ, invented) wet with toluene; MIE
	// toluene's 0.24 mJ (from memory, HW-11), IIA, zone 21.
	hwAtmHyb = &inventory.Atmosphere{ID: "A-HYB", Description: "resin powder wet with toluene", Kind: "hybrid", MIE: known(0.24e-3), Group: "IIA", Zone: "21"}
)

// practitionerCases returns the 27 cases of testdata/handworked.md. Each
// number's source is the case named; "derived" is the reviewer's arithmetic,
// redone with python3 (eps0 = 8.8541878128e-12 F/m, CODATA 2018).
func practitionerCases() []practitionerCase {
	return []practitionerCase{
		{
			id:  "HW-01 blank gas group, free PE film",
			atm: hwAtmX, rh: 40,
			obj:  inventory.Object{Kind: "sheet", Material: "PE film", Length: known(1.0), Width: known(0.5), Backing: "none", Field: known(120e3), FieldDistance: known(0.10)},
			mats: []inventory.Material{hwPE},
			// Source: hand-worked case HW-01 (report/assess/testdata/handworked.md), derived from
			// the free finite sheet a = 0.5 m, b = 0.25 m, z = 0.1 m: sigma = 2.917 uC/m^2;
			// a 100 cm^2 brush transfers 29.2 nC > 10 nC (IIC, the blank group assessed as IIC,
			// reference section 12); brush 4 mJ >= 0.30 mJ.
			verdict:    Incendive,
			sigma:      hwNear(2.9168661819e-6),
			energy:     hwNear(4e-3),
			charge:     hwNear(2.9168661819e-8),
			wantChecks: []string{"energy-vs-mie", "transferred-charge", "insulating-area"},
			possible:   []model.DischargeType{model.Brush},
		},
		{
			id:  "HW-02 thin PET film on an earthed roller, breakdown unknown",
			atm: hwAtmEA, rh: 35,
			obj:  inventory.Object{Kind: "sheet", Material: "PET film", Length: known(0.6), Width: known(1.2), Diameter: known(0.4), Thickness: known(0.05e-3), Backing: "earthed", Field: known(100e3), FieldDistance: known(0.025)},
			mats: []inventory.Material{hwPET},
			// Source: hand-worked case HW-02 (report/assess/testdata/handworked.md), derived from
			// the parallel-plate split sigma = eps0 E (1 + epsr z / t) = 1.418e-3 C/m^2; the case
			// treats the 0.2 m roller as flat and accepts an error of order z/R = 12 %, hence the
			// 15 % tolerance. Breakdown unknown: taken as above 4 kV (reference section 12,
			// TRGS 727 Annex C), so a propagating brush is possible: incendive.
			verdict:    Incendive,
			sigma:      hwNearTol(1.4175554688e-3, 0.15),
			wantChecks: []string{"energy-vs-mie"},
			possible:   []model.DischargeType{model.PropagatingBrush},
		},
		{
			id:  "HW-03 the same film, breakdown voltage measured 3 kV",
			atm: hwAtmEA, rh: 35,
			obj:  inventory.Object{Kind: "sheet", Material: "PET film (measured)", Length: known(0.6), Width: known(1.2), Diameter: known(0.4), Thickness: known(0.05e-3), Backing: "earthed", Field: known(100e3), FieldDistance: known(0.025), SurfacePotential: known(2.5e3), LayerBreakdown: known(3e3)},
			mats: []inventory.Material{{Name: "PET film (measured)", Class: "insulating", Permittivity: 3.2, SurfaceResistivity: 1e14, VolumeResistivity: hwNaN, BreakdownStrength: 60e6, Source: "breakdown measured on this film: 3 kV at 50 um (invented for the demo)"}},
			// Source: hand-worked case HW-03 (report/assess/testdata/handworked.md): measured
			// breakdown 3 kV <= 4 kV excludes the propagating brush (TRGS 727 Annex C); the outward
			// density eps0 E = 0.885 uC/m^2 is below the IIA screen (the reviewer's choice 1: thin
			// backed layer, IEC 60079-0 coating thickness, from memory): non-incendive. The
			// measured 2.5 kV is below the 3 kV breakdown: no contradiction.
			//
			// The case itself accepts incendive: "If a tool gives incendive here (brush
			// screened on sigma_total), it is too strict, not dangerous. Record it as a
			// known difference." The tool does so since the second review (N1): the row
			// also carries a 2.5 kV surface potential, and the same layer state must give
			// the same verdict whichever instrument read it, so a backed layer's brush
			// is screened on min(sigma, eps0 Eb) = 26.6 uC/m^2 for either reading (an
			// earthed electrode closer than the meter draws more than the air side):
			// brush 4 mJ >= 0.46 mJ. The propagating brush stays excluded by the measured
			// 3 kV, and the 50 um coating is still not held to the area limit (IEC 60079-0).
			verdict:     NonIncendive,
			alsoAccept:  []Verdict{Incendive},
			sigma:       hwNearTol(1.4175554688e-3, 0.15),
			impossible:  []model.DischargeType{model.PropagatingBrush},
			avoidChecks: []string{"layer-breakdown-contradiction"},
		},
		{
			id:  "HW-04 humid paper web, field reading above the brush screen",
			atm: hwAtmEA, rh: 65,
			obj:  inventory.Object{Kind: "sheet", Material: "Paper", Description: "web leaving a drying oven", Length: known(2.0), Width: known(1.2), Backing: "none", DistanceToEarth: known(0.5), Field: known(400e3), FieldDistance: known(0.10), Speed: known(3), Resistance: known(1e8)},
			mats: []inventory.Material{hwPaper},
			// Source: hand-worked case HW-04 (report/assess/testdata/handworked.md), derived from
			// the free finite sheet a = 1.0 m, b = 0.6 m, z = 0.1 m (the reviewer's geometry):
			// sigma = 8.074 uC/m^2 > 5 (IIA), 80.7 nC > 60 nC, brush 4 mJ >= 0.46 mJ. The reading
			// beats the humidity model (principle 1): incendive.
			//
			// The tool is stricter on one point, with the same verdict: the reviewer calls the
			// web earthed at 1e8 ohm, but issue 11 takes a dissipative object above the 1e6 ohm
			// conductor limit (TRGS 727 8.3) as not earthed, an isolated conductor that can
			// spark; the tool then also finds a spark (the reading's charge on the disc of equal
			// area, potential capped at the 50 kV realistic maximum, reference section 12: no MV,
			// no kJ). The case's numbers are the brush's (numbersOf), the spark must not be
			// below them, and the estimated potential stays at or below the cap.
			verdict:   Incendive,
			sigma:     hwNear(8.0735774504e-6),
			energy:    hwNear(4e-3),
			charge:    hwNear(8.0735774504e-8),
			numbersOf: ptr(model.Brush),
			potential: hwBetween(0, 50e3),
			// The disagreement between the humidity model and the reading is the
			// reading-vs-humidity finding.
			wantChecks: []string{"energy-vs-mie", "transferred-charge", "reading-vs-humidity"},
			possible:   []model.DischargeType{model.Brush},
		},
		{
			id:  "HW-05 dissipative but unearthed tray",
			atm: hwAtmTol1, rh: 40,
			obj:  inventory.Object{Kind: "part", Material: "Dissipative PP", Description: "tray on a PVC bench top", Length: known(0.4), Width: known(0.3), SurfacePotential: known(6e3), Resistance: known(1e12), Capacitance: known(30e-12)},
			mats: []inventory.Material{hwDissPP},
			// Source: hand-worked case HW-05 (report/assess/testdata/handworked.md), derived from
			// W = C V^2 / 2 = 30 pF x (6 kV)^2 / 2 = 0.54 mJ >= 0.24 mJ; R 1e12 > 1e6 ohm
			// (TRGS 727 8.3): an isolated conductor, incendive.
			verdict:    Incendive,
			energy:     hwNear(0.54e-3),
			potential:  hwNear(6e3),
			wantChecks: []string{"energy-vs-mie", "conductor-earthing"},
		},
		{
			id:  "HW-06 insulating roller, field read at a distance",
			atm: hwAtmDEE, rh: 30,
			obj:  inventory.Object{Kind: "roller", Material: "PTFE", Description: "solid idler", Diameter: known(0.10), Length: known(1.0), Backing: "none", Field: known(130e3), FieldDistance: known(0.10)},
			mats: []inventory.Material{hwPTFE},
			// Source: hand-worked case HW-06 (report/assess/testdata/handworked.md), derived from
			// the cylinder sigma = eps0 E (R + z) / R (reference section 12) = 3.453 uC/m^2 > 3
			// (IIB); 34.5 nC > 25 nC; area pi D L = 0.314 m^2 > 100 cm^2.
			verdict:    Incendive,
			sigma:      hwNear(3.453133247e-6),
			energy:     hwNear(4e-3),
			charge:     hwNear(3.453133247e-8),
			wantChecks: []string{"energy-vs-mie", "transferred-charge", "insulating-area"},
			possible:   []model.DischargeType{model.Brush},
		},
		{
			id:  "HW-07 free sheet hung far above the floor",
			atm: hwAtmDEE, rh: 30,
			obj:  inventory.Object{Kind: "sheet", Material: "PE film", Description: "hanging cover sheet", Length: known(0.30), Width: known(0.20), Backing: "none", DistanceToEarth: known(2.0), Field: known(150e3), FieldDistance: known(0.05)},
			mats: []inventory.Material{hwPE},
			// Source: hand-worked case HW-07 (report/assess/testdata/handworked.md), derived from
			// the free finite sheet a = 0.15 m, b = 0.10 m, z = 0.05 m (earth 2 m away, outside the
			// over-earth split's validity, reference section 12): sigma = 4.118 uC/m^2 > 3 (IIB);
			// 41.2 nC > 25 nC; 600 cm^2 > 100 cm^2.
			verdict:    Incendive,
			sigma:      hwNear(4.11808922499e-6),
			energy:     hwNear(4e-3),
			charge:     hwNear(4.11808922499e-8),
			wantChecks: []string{"energy-vs-mie", "transferred-charge", "insulating-area"},
			possible:   []model.DischargeType{model.Brush},
		},
		{
			id:  "HW-08 powder poured from a sack into a vessel holding toluene vapour",
			atm: hwAtmTol1, rh: 40,
			obj: inventory.Object{Kind: "powder", Description: "organic pigment from a 25 kg PE sack through the manway into a stirred vessel", Diameter: known(1.5), MassFlow: known(0.5), ParticleSize: known(0.05e-3), Resistance: known(10), ChargingTime: known(50)},
			// Source: hand-worked case HW-08 (report/assess/testdata/handworked.md): powder added
			// to a vessel holding flammable vapour, brush discharges from the powder, its cloud
			// and the sack ignite the vapour (IEC TS 60079-32-1, reference section 12):
			// brush 4 mJ >= 0.24 mJ, incendive.
			verdict:    Incendive,
			energy:     hwNear(4e-3),
			wantChecks: []string{"energy-vs-mie"},
		},
		{
			id:  "HW-09 cone discharge, silo below Glor's range",
			atm: hwAtmD10, rh: 40,
			obj:  inventory.Object{Kind: "powder", Material: "granulate", Diameter: known(0.40), ParticleSize: known(2.0e-3), MassFlow: known(2.0), ChargeToMass: known(1.0e-6), Length: known(3.0), Resistance: known(5)},
			mats: []inventory.Material{hwGranulate},
			// Source: hand-worked case HW-09 (report/assess/testdata/handworked.md), derived from
			// Glor's W = 5.22 D^3.36 d^1.462 (from memory) at the range's edge D = 0.5 m:
			// 1.4006 mJ >= MIE/10 = 1 mJ, < 10 mJ: marginal (principle 3, never less than the
			// edge; the extrapolated 0.66 mJ would clear it). Outside the range is flagged.
			verdict:    Marginal,
			energy:     hwNear(1.4006046737e-3),
			wantChecks: []string{"energy-vs-margin"},
			possible:   []model.DischargeType{model.Cone},
			flags:      model.FlagConeOutsideRange,
		},
		{
			id:   "HW-10 cone discharge, silo above Glor's range",
			atm:  hwAtmD500,
			obj:  inventory.Object{Kind: "powder", Material: "granulate", Diameter: known(4.0), ParticleSize: known(1.5e-3), MassFlow: known(10), ChargeToMass: known(1.0e-6), Length: known(12), Resistance: known(5)},
			mats: []inventory.Material{hwGranulate},
			// Source: hand-worked case HW-10 (report/assess/testdata/handworked.md), derived from
			// Glor's formula extrapolated to D = 4 m: 995.5 mJ >= 500 mJ (the reviewer's choice 2:
			// the energy rises with D, so the edge value 378.7 mJ is only a floor; principle 2 on
			// top of principle 3): incendive. Clamping to the edge gives marginal, milder than
			// the reviewer would sign.
			//
			// Changed with the plant-engineer review (item 9): the energy shown is now the value
			// the words beside it name, the edge value at D = 3 m, 5.22 x 3^3.36 x 1.5^1.462 =
			// 378.7 mJ (the case's own figure), marked a lower bound ("formula not valid beyond
			// D = 3 m"); the case's verdict is kept by a finding of its own: the formula beyond
			// its range gives 995.5 mJ >= 500 mJ, so the cone is taken as able to ignite
			// (cone-extrapolated-reaches-mie, incendive). The edge value alone reaches only
			// MIE / 10 (energy-vs-margin).
			verdict:    Incendive,
			energy:     hwNear(378.6546893e-3),
			wantChecks: []string{"cone-extrapolated-reaches-mie", "cone-above-range", "energy-vs-margin"},
			possible:   []model.DischargeType{model.Cone},
			flags:      model.FlagConeOutsideRange,
		},
		{
			id:  "HW-11 bulk bag type B in a dust zone with solvent vapour present",
			atm: hwAtmHyb, rh: 40,
			obj: inventory.Object{Kind: "bag", Description: "woven PP, type B fabric (breakdown < 6 kV), discharging into a mixer", BagType: "B", MassFlow: known(1.0)},
			// Source: hand-worked case HW-11 (report/assess/testdata/handworked.md): with vapour
			// present (hybrid) the gas column of the IEC 61340-4-4 usage table applies, where
			// type B is not allowed (reference sections 8b, 12); the fabric's brush, 4 mJ, against
			// toluene's 0.24 mJ: incendive (reviewer's choice 3). The case calls the README's
			// marginal for a broken bag rule the minimum acceptable result: accepted.
			verdict:    Incendive,
			alsoAccept: []Verdict{Marginal},
			wantChecks: []string{"bag-type"},
		},
		{
			id:  "HW-12 unearthed drum, measured 8 kV",
			atm: hwAtmTol1, rh: 30,
			obj: inventory.Object{Kind: "container", Description: "200 L steel drum on a dry wooden pallet", Diameter: known(0.6), SurfacePotential: known(8e3)},
			// Source: hand-worked case HW-12 (report/assess/testdata/handworked.md), derived from
			// W = C V^2 / 2 at 8 kV over the plausible capacitances 70 pF (BG RCI FAQ 7.15,
			// confirmed) to 300 pF (size table 100 pF x 3, reference section 12): 2.24 to 9.6 mJ,
			// all >= 0.24 mJ; R blank counts as not earthed.
			verdict:    Incendive,
			energy:     hwBetween(2.24e-3, 9.6e-3),
			potential:  hwNear(8e3),
			wantChecks: []string{"energy-vs-mie", "conductor-earthing"},
		},
		{
			id:  "HW-13 unearthed drum, no reading and no charging mechanism",
			atm: hwAtmTol1,
			obj: inventory.Object{Kind: "container", Description: "200 L steel drum, closed, in storage", Diameter: known(0.6)},
			// Source: hand-worked case HW-13 (report/assess/testdata/handworked.md): R blank counts
			// as not earthed; a conductor in zone 1 needs R <= 1e6 ohm (TRGS 727 8.3): marginal.
			// The case accepts "not assessed" for the energy only with the earthing finding
			// (wantChecks holds in every case).
			verdict:     Marginal,
			alsoAccept:  []Verdict{NotAssessed},
			wantChecks:  []string{"conductor-earthing"},
			avoidChecks: []string{"energy-vs-mie"},
		},
		{
			id:  "HW-14 person on insulating footwear, zone 1",
			atm: hwAtmTol1, rh: 25,
			obj: inventory.Object{Kind: "person", Resistance: known(1e11), ChargingTime: known(10)},
			// Source: hand-worked case HW-14 (report/assess/testdata/handworked.md), derived from
			// 1 uA walking (Jonassen) into 1e11 ohm and 200 pF for 10 s: 39 kV, unrealistic, capped
			// at TRGS 727's "at most about 15 mJ" or at the README's 15 kV (22.5 mJ): either is
			// >= 0.24 mJ; R 1e11 > 1e8 ohm (TRGS 727 7.2): incendive.
			verdict:    Incendive,
			energy:     hwBetween(15e-3, 22.5e-3),
			wantChecks: []string{"energy-vs-mie", "person-earthing"},
		},
		{
			id:  "HW-15 person on dissipative footwear (control case)",
			atm: hwAtmTol1, rh: 25,
			obj: inventory.Object{Kind: "person", Resistance: known(1e7)},
			// Source: hand-worked case HW-15 (report/assess/testdata/handworked.md), derived from
			// V = I R = 1 uA x 1e7 ohm = 10 V, below the ~300 V Paschen minimum: no spark;
			// R <= 1e8 ohm meets TRGS 727 7.2: non-incendive. (The case's 1e-5 mJ is the
			// stored energy "in any case"; with no spark the effective energy is not pinned.)
			verdict:     NonIncendive,
			potential:   hwNear(10),
			avoidChecks: []string{"energy-vs-mie", "energy-vs-margin", "person-earthing"},
		},
		{
			id:  "HW-16 person on dissipative footwear, measured 4 kV (contradiction)",
			atm: hwAtmTol1, rh: 25,
			obj: inventory.Object{Kind: "person", Description: "operator in insulating gloves holding a plastic scoop", Resistance: known(1e7), SurfacePotential: known(4e3)},
			// Source: hand-worked case HW-16 (report/assess/testdata/handworked.md), derived from
			// the measured 4 kV at 200 pF: W = 1.6 mJ >= 0.24 mJ (principle 1, the measurement
			// wins over the 10 V the resistance predicts): incendive.
			verdict:   Incendive,
			energy:    hwNear(1.6e-3),
			potential: hwNear(4e3),
			// The contradiction (the earthing path predicts at most 1 uA x 1e7 ohm = 10 V, the
			// reading is 4 kV) is the reading-vs-earthing finding.
			wantChecks: []string{"energy-vs-mie", "reading-vs-earthing"},
		},
		{
			id:  "HW-17 small unearthed flange, 5 pF, IIA zone 1",
			atm: hwAtmTol1,
			obj: inventory.Object{Kind: "part", Description: "flange between glass-lined pipe sections, no flow of low-conductivity liquid", Capacitance: known(5e-12)},
			// Source: hand-worked case HW-17 (report/assess/testdata/handworked.md): 5 pF is below
			// the ~10 pF small-part exemption outside IIC / EPL Ga (IEC 60079-0, from memory,
			// reference section 12) and no charging mechanism is recorded: non-incendive.
			verdict:     NonIncendive,
			avoidChecks: []string{"conductor-earthing", "energy-vs-mie", "energy-vs-margin"},
			stricter:    "the exemption is applied (no earthing finding), but with no charging mechanism and no reading the tool does not clear the energy: 'not assessed', saying what to measure (issue 11: do not invent a charging current for an object with no charging mechanism); not a clearance, so not milder",
		},
		{
			id:  "HW-18 the same flange, IIC zone 0",
			atm: hwAtmH2,
			obj: inventory.Object{Kind: "part", Description: "flange between glass-lined pipe sections, no flow of low-conductivity liquid", Capacitance: known(5e-12)},
			// Source: hand-worked case HW-18 (report/assess/testdata/handworked.md): 5 pF is above
			// the ~3 pF exemption for IIC / EPL Ga (from memory, reference section 12), so the
			// flange must be earthed and R is blank: marginal (TRGS 727 8.3).
			verdict:     Marginal,
			wantChecks:  []string{"conductor-earthing"},
			avoidChecks: []string{"energy-vs-mie"},
		},
		{
			id:  "HW-19 dust with MIE 0.8 mJ and a charged insulating liner",
			atm: hwAtmD08, rh: 35,
			obj:  inventory.Object{Kind: "sheet", Material: "PE film", Description: "0.1 mm liner pulled from a fibre drum", Length: known(1.0), Width: known(0.8), Thickness: known(0.1e-3), Backing: "none", Field: known(500e3), FieldDistance: known(0.10)},
			mats: []inventory.Material{hwPE},
			// Source: hand-worked case HW-19 (report/assess/testdata/handworked.md), derived from
			// the free finite sheet a = 0.5 m, b = 0.4 m, z = 0.1 m: sigma = 11.06 uC/m^2, 110.6 nC
			// over 100 cm^2; a dust below ~1 mJ counts brush discharges (reference section 12,
			// from memory; reviewer's choice 4: IIA screen): brush 4 mJ >= 0.8 mJ, incendive.
			verdict:    Incendive,
			sigma:      hwNear(1.106070578611e-5),
			energy:     hwNear(4e-3),
			charge:     hwNear(1.106070578611e-7),
			wantChecks: []string{"energy-vs-mie"},
			possible:   []model.DischargeType{model.Brush},
		},
		{
			id:  "HW-20 acetone vapour, stoichiometric MIE against minimum MIE",
			atm: hwAtmACE,
			obj: inventory.Object{Kind: "part", Description: "steel funnel on a plastic drum", SurfacePotential: known(8e3), Capacitance: known(15e-12)},
			// Source: hand-worked case HW-20 (report/assess/testdata/handworked.md), derived from
			// W = 15 pF x (8 kV)^2 / 2 = 0.48 mJ against the screening MIE min(1.15 mJ listed at
			// stoichiometric, IIA reference propane 0.25 mJ, confirmed) = 0.25 mJ (reviewer's
			// choice 5): ratio 1.9, incendive; the funnel's earthing fails too. The screening
			// MIE must not exceed the reviewer's 0.25 mJ.
			verdict:    Incendive,
			energy:     hwNear(0.48e-3),
			potential:  hwNear(8e3),
			mie:        hwBetween(0, 0.25e-3),
			wantChecks: []string{"energy-vs-mie", "conductor-earthing"},
		},
		{
			id:  "HW-21 road-tanker top (splash) fill, v d within the limit",
			atm: hwAtmTol0,
			obj: inventory.Object{Kind: "liquid", Speed: known(2.0), Diameter: known(0.10), Conductivity: known(1e-12), Permittivity: known(2.4), Filling: "top", Resistance: known(10), VesselClass: "road tanker", VesselMaterial: "metal"},
			// Source: hand-worked case HW-21 (report/assess/testdata/handworked.md): v d = 0.20
			// <= 0.38 m^2/s (IEC TS 60079-32-1, confirmed), but a top inlet is never submerged, so
			// the 1 m/s start limit (from memory) holds for the whole fill and 2 m/s breaks it;
			// splash filling is not acceptable: marginal.
			//
			// The filter and second phase are not in the case's table and are left blank: the
			// tool takes them as present (principle 2), which adds findings but cannot change a
			// verdict already set by the splash clause.
			//
			// Findings: the case's "splash filling not acceptable" is the splash-filling finding.
			// Its "slow start for the whole fill" (reviewer's choice 6) is not a finding of the
			// tool: issue 13 lists "the slow start to every top fill" as a fault and applies the
			// slow start to inlets that get submerged (bottom, dip pipe); a top splash fill of a
			// low-conductivity liquid breaks the splash clause at any velocity, the stricter rule.
			//
			// Verdict: see the stricter mark.
			verdict:     Marginal,
			wantChecks:  []string{"splash-filling"},
			avoidChecks: []string{"filling-velocity", "velocity-ceiling"},
			stricter:    "issue 13 (verdict rule 3) counts the liquid-surface brush, 4 mJ >= 0.24 mJ, wherever a filling clause is not met; the reviewer signs a broken filling limit as marginal",
		},
		{
			id:  "HW-22 road-tanker bottom fill, within the limits",
			atm: hwAtmTol0,
			obj: inventory.Object{Kind: "liquid", Speed: known(3.5), Diameter: known(0.10), Conductivity: known(1e-12), Permittivity: known(2.4), Filling: "bottom", Resistance: known(10), VesselClass: "road tanker", VesselMaterial: "metal", InletVelocity: known(1.0), Filter: "none", SecondPhase: "none"},
			// Source: hand-worked case HW-22 (report/assess/testdata/handworked.md): v d = 0.35
			// <= 0.38 m^2/s, 3.5 <= 7 m/s, earthed at 10 ohm: "expected to be acceptably low"
			// (IEC TS 60079-32-1, confirmed): non-incendive.
			verdict:     NonIncendive,
			avoidChecks: []string{"filling-velocity", "velocity-ceiling", "slow-start", "conductor-earthing", "energy-vs-mie"},
		},
		{
			id:  "HW-23 road-tanker bottom fill, v d beyond the limit, conductivity blank",
			atm: hwAtmTol0,
			obj: inventory.Object{Kind: "liquid", Speed: known(4.5), Diameter: known(0.10), Filling: "bottom", Resistance: known(10), VesselClass: "road tanker", VesselMaterial: "metal"},
			// The conductivity is left blank: the case is about the unknown conductivity. (The station's
			// substance, toluene, has a built-in 1 pS/m, which gives the same 0.38 limit.)
			// Source: hand-worked case HW-23 (report/assess/testdata/handworked.md): conductivity
			// unknown takes the stricter v d <= 0.38 m^2/s (IEC TS 60079-32-1, confirmed);
			// 4.5 x 0.10 = 0.45 > 0.38: marginal.
			// The inlet velocity, filter and second phase are not in the case's table and are
			// left blank: the tool takes the stricter case for each (principle 2), which adds
			// findings (slow start not shown met...) but not a milder verdict.
			verdict:    Marginal,
			wantChecks: []string{"filling-velocity"},
			stricter:   "issue 13 (verdict rule 3) counts the liquid-surface brush, 4 mJ >= 0.24 mJ, wherever a filling clause is not met; the reviewer signs a broken v d limit as marginal",
		},
		{
			id:  "HW-24 conductive solvent into a plastic IBC",
			atm: hwAtmMeOH,
			obj: inventory.Object{Kind: "liquid", Description: "methanol into a free-standing 1000 L HDPE IBC through a plastic hose with a drop, no earthed dip pipe", Speed: known(2.0), Diameter: known(0.05), Conductivity: known(4.4e-5), Permittivity: known(33), Filling: "top", ChargingTime: known(255), VesselClass: "IBC", VesselMaterial: "insulating"},
			// Source: hand-worked case HW-24 (report/assess/testdata/handworked.md): a conductive
			// liquid (tau 6.6 us) in an insulating container is an isolated conductor (reference
			// section 12, confirmed); even at 3 kV and 100 pF, W = 0.45 mJ >= 0.14 mJ, and the
			// plausible range reaches 5-15 mJ at 10 kV: incendive.
			// The energy is not pinned: the case shows only that every plausible value
			// (0.45 mJ at 3 kV and 100 pF up to 5-15 mJ at 10 kV) reaches the MIE.
			// The case's "it needs an earthed dip pipe or rod" is the isolated-liquid finding
			// (IEC TS 60079-32-1 clause 7, conductive liquids in insulating containers), which
			// on a liquid row stands in place of the general conductor-earthing finding.
			// The filter and second phase are not stated in the case and are left blank.
			verdict:     Incendive,
			wantChecks:  []string{"energy-vs-mie", "isolated-liquid"},
			avoidChecks: []string{"low-conductivity"},
		},
		{
			id:   "HW-25 field reading above air breakdown (bad reading)",
			atm:  hwAtmTol1,
			obj:  inventory.Object{Kind: "sheet", Material: "PE film", Description: "sight-glass cover", Length: known(0.09), Width: known(0.09), Backing: "none", Field: known(5000e3), FieldDistance: known(0.05)},
			mats: []inventory.Material{hwPE},
			// Source: hand-worked case HW-25 (report/assess/testdata/handworked.md): 5 MV/m is above
			// the ~3 MV/m air breakdown (confirmed), a bad reading: the object cannot be cleared,
			// re-measure: marginal (reviewer's choice 7). Also acceptable: incendive if the density
			// is capped at the breakdown limit and flagged. Not acceptable: the raw 299.8 uC/m^2
			// (derived) reported as a result.
			//
			// The cap: the case compares the raw value with the one-sided limit eps0 x 3 MV/m =
			// 26.56 uC/m^2 (CCPS glossary, confirmed). The sheet is free (no backing, no earth
			// given), and a free sheet sends its field to both sides, so air breaks down at its
			// surface only at 2 eps0 x 3 MV/m = 53.13 uC/m^2 (reference section 3, derived);
			// capping a free sheet at the one-sided value would understate what air lets it hold
			// (a free sheet at 40 uC/m^2 has a surface field of 2.3 MV/m). The accepted cap is
			// therefore the breakdown limit of the geometry: 53.13 uC/m^2 here (derived), an
			// order of magnitude below the raw value. The reading-above-breakdown finding says
			// what to check and the density used.
			verdict:    Marginal,
			alsoAccept: []Verdict{Incendive},
			accept: func(r ObjectResult) string {
				if limit := 5.31251268768e-5; r.Eval.ChargeDensity > limit*(1+hwTol) {
					return fmt.Sprintf("with the density capped at %.4g C/m² (got %.4g)", limit, r.Eval.ChargeDensity)
				}
				return ""
			},
			flags:      model.FlagSuspectReading | model.FlagReadingAboveBreakdown,
			wantChecks: []string{"reading-above-breakdown"},
		},
		{
			id:  "HW-26 belt charging an isolated pulley",
			atm: hwAtmD5,
			obj: inventory.Object{Kind: "part", Description: "head pulley on insulated bearings, charged by a PVC belt (free run 3.0 x 0.5 m, 200 kV/m at 0.10 m, 2 m/s)", ChargingCurrent: known(4.7e-6), Resistance: known(1e9), Capacitance: known(50e-12)},
			// Source: hand-worked case HW-26 (report/assess/testdata/handworked.md), derived from
			// the belt's sigma v w = 4.70 uC/m^2 x 2 m/s x 0.5 m = 4.7 uA (the row's value); tau
			// R C = 0.05 s so steady state: V = I R = 4.7 kV, W = 50 pF x (4.7 kV)^2 / 2 = 0.552 mJ
			// >= MIE/10 = 0.5 mJ, < 5 mJ; R 1e9 > 1e6 ohm: marginal.
			verdict:     Marginal,
			energy:      hwNear(0.552250e-3),
			potential:   hwNear(4.7e3),
			wantChecks:  []string{"energy-vs-margin", "conductor-earthing"},
			avoidChecks: []string{"energy-vs-mie"},
		},
		{
			id:   "HW-27 zone left blank, small insulating label",
			atm:  hwAtmDEEn,
			obj:  inventory.Object{Kind: "sheet", Material: "PE film", Description: "label on a pump hood", Length: known(0.10), Width: known(0.06), Backing: "none", Field: known(20e3), FieldDistance: known(0.05)},
			mats: []inventory.Material{hwPE},
			// Source: hand-worked case HW-27 (report/assess/testdata/handworked.md), derived from
			// the free finite sheet a = 0.05 m, b = 0.03 m, z = 0.05 m: sigma = 1.494 uC/m^2 < 3
			// (IIB), no brush; the blank zone is assessed as zone 0 (README; TRGS 723), where IIB
			// allows 25 cm^2 (IEC 60079-0, from memory) and the label is 60 cm^2: marginal.
			// The case's 9 nC over the label is context only: with no brush possible, no
			// transferred charge is asserted.
			verdict:     Marginal,
			sigma:       hwNear(1.4941001118e-6),
			wantChecks:  []string{"insulating-area"},
			avoidChecks: []string{"energy-vs-mie", "transferred-charge"},
			impossible:  []model.DischargeType{model.Brush},
		},
		{
			id:   "HW-28 unearthed aluminium idler against a moving web, no charging current",
			atm:  hwAtmEA2,
			obj:  inventory.Object{Kind: "roller", Material: "aluminium", Description: "idler on worn bearings, running against the web", Length: known(1.3), Diameter: known(0.10), Resistance: known(1e9)},
			mats: []inventory.Material{hwAluminium()},
			// Source: hand-worked case HW-28 (report/assess/testdata/handworked.md; added
			// with review 3 item 4 by the developers, not by the original reviewer).
			// Capacitance not measured: the model's estimate, the isolated sphere of the
			// object's largest size, r = 1.3 / 2 = 0.65 m, C = 4 pi eps0 r = 72.32 pF
			// (reference section 2, textbook). No current on the row: the worst-case
			// industrial 100 uA (reference sections 6-7, JNIOSH-TR) through the measured
			// 1e9 ohm, V = I R = 100 kV, capped at the realistic plant maximum 50 kV
			// (reference section 12, common practice, no source); the corona onset of a
			// 50 mm radius far from earth lies above it. W = C V^2 / 2 = 0.5 x 72.32e-12 x
			// (5e4)^2 = 90.40 mJ (python3), >= MIE 0.46 mJ: incendive, at the assumed
			// worst case (ratio 196.5, shown as at least 1). R 1e9 > 1e6 ohm: the earthing
			// requirement fails too (TRGS 727 cl. 8.3). Before review 3 the tool said
			// "marginal, energy not assessed": this case is stricter, as principle 2 asks.
			verdict:    Incendive,
			energy:     hwNear(90.4028170e-3), // python3: 0.5 * 4*pi*8.8541878128e-12*0.65 * 5e4**2
			potential:  hwNear(5e4),
			wantChecks: []string{"energy-vs-mie", "conductor-earthing"},
			possible:   []model.DischargeType{model.Spark},
			flags:      model.FlagAssumedCurrent | model.FlagCappedConductor,
		},
	}
}
