package assess

import (
	"math"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// Hand-worked cases of the second plant-engineer review's row items (N2, N5):
// rows check now keeps with a warning are judged as the stricter case
// (principle 2: unknown means the stricter case), never milder than the same
// object measured.

// Review 2 item N2: a steel drum in toluene (zone 1, IIA, MIE 0.24 mJ, reference
// section 4) with no reading, no charging and no Resistance to earth is an
// isolated conductor for all anyone knows (reference section 12: "an isolated
// conductor sparks"). It is judged on its earthing (conductor-earthing, TRGS
// 727:2016 cl. 8.3: below 1 Mohm), marginal, with its spark not evaluated and
// said so; no charging current is invented (issue 11). The same drum measured at
// 1e12 ohm gets the same verdict: not measuring is never milder than measuring.
func TestReview2IsolatedConductorWithoutReading(t *testing.T) {
	tol := inventory.Atmosphere{ID: "A-TOL", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "1"} // invented for the demo
	h2 := inventory.Atmosphere{ID: "A-H2", Substance: "hydrogen", Kind: "gas", MIE: known(0.017e-3), Group: "IIC", Zone: "1"}    // invented for the demo
	cases := []struct {
		name string
		atm  *inventory.Atmosphere
		o    inventory.Object
	}{
		{"drum in toluene", &tol, inventory.Object{Kind: "container", Diameter: known(0.6)}},
		// A 5 pF part in hydrogen is above the 3 pF IIC exemption (IEC 60079-0:2017,
		// reference section 12): it must be earthed.
		{"5 pF part in hydrogen", &h2, inventory.Object{Kind: "part", Capacitance: known(5e-12)}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			blank := one(t, tc.atm, tc.o)
			measured := tc.o
			measured.Resistance = known(1e12)
			isolated := one(t, tc.atm, measured)
			for _, r := range []ObjectResult{blank, isolated} {
				if r.Verdict != Marginal || !hasCheck(r, CheckConductorEarthing.Name()) {
					t.Errorf("verdict %v, findings %v; want marginal with conductor-earthing", r.Verdict, checks(r))
				}
				if r.Eval.NotAssessed&model.MissingConductorCharging == 0 || !math.IsNaN(r.Eval.Discharges[model.Spark].Energy) {
					t.Errorf("spark %s: want not evaluated (MissingConductorCharging)", r.Eval.Discharges[model.Spark].Reason())
				}
				if r.Eval.ChargingCurrent > 0 {
					t.Errorf("charging current %g A invented", r.Eval.ChargingCurrent)
				}
				if !strings.Contains(r.Reason, "Surface potential") {
					t.Errorf("reason %q does not name what to measure", r.Reason)
				}
			}
			if blank.Verdict.Severity() < isolated.Verdict.Severity() {
				t.Errorf("R blank %v milder than R 1e12 %v", blank.Verdict, isolated.Verdict)
			}
			if !hasDefault(blank, "Resistance to earth") {
				t.Errorf("blank resistance: no 'not earthed' default recorded; defaults %+v", blank.Marks)
			}
		})
	}
}

// Review 2 item N5: a person with neither a reading nor a resistance in hydrogen
// (zone 1, MIE 0.017 mJ <= 10 mJ) is taken as not earthed: person-earthing (TRGS
// 727:2016 cl. 7.2, at most 1e8 ohm) applies. The walking charge with no leakage
// reaches the person cap of 15 kV (reference section 10.3: body 200 pF typical;
// the 15 kV cap is the model's documented default), W = 200 pF x (15 kV)^2 / 2 =
// 22.5 mJ (derived, python3), ratio 22.5 / 0.017 = 1324: incendive, marked as
// resting on the assumed resistance.
func TestReview2PersonWithoutReadingOrResistance(t *testing.T) {
	h2 := inventory.Atmosphere{ID: "A-H2", Substance: "hydrogen", Kind: "gas", MIE: known(0.017e-3), Group: "IIC", Zone: "1"} // invented for the demo
	r := one(t, &h2, inventory.Object{Kind: "person"})
	if r.Verdict != Incendive || !hasCheck(r, CheckPersonEarthing.Name()) {
		t.Fatalf("verdict %v, findings %v; want incendive with person-earthing", r.Verdict, checks(r))
	}
	wantRel(t, "person spark energy", r.Eval.EffectiveEnergy, 22.5e-3)
	if r.Eval.Flags&model.FlagAssumedResistance == 0 {
		t.Errorf("flags %v: the estimate must be marked as resting on the assumed resistance", r.Eval.Flags.Texts())
	}
	if !hasDefault(r, "Resistance to earth") {
		t.Errorf("no 'not earthed' default recorded; defaults %+v", r.Marks)
	}
}

// Review 2 item N5: powder tipped into a vessel holding toluene vapour (zone 1,
// MIE 0.24 mJ), nothing but the kind known: reference section 12 calls it the
// textbook static ignition case. The brush discharges of the charged powder, its
// cloud and its sack (equivalent 4 mJ, the upper end of 3-4 mJ: CLC/TR 50404
// summaries, CCPS glossary) do not depend on flow or sizes: ratio 4 / 0.24 =
// 16.7 (derived), incendive. The cone is possible but not evaluated (no sizes).
func TestReview2PowderKindOnlyIntoVapour(t *testing.T) {
	tol := inventory.Atmosphere{ID: "A-TOL", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "1"} // invented for the demo
	r := one(t, &tol, inventory.Object{Kind: "powder"})
	if r.Verdict != Incendive || !hasCheck(r, CheckEnergyMIE.Name()) || r.Ratio == nil {
		t.Fatalf("verdict %v, findings %v, ratio %v; want incendive on the brush", r.Verdict, checks(r), r.Ratio)
	}
	wantRel(t, "ratio", *r.Ratio, 4.0/0.24)
	// The reason states the ratio as a lower bound, not "energy not assessed" beside a ratio.
	if !strings.Contains(r.Reason, "a lower bound, not every discharge could be evaluated") || strings.Contains(r.Reason, "the discharge energy was not assessed") {
		t.Errorf("reason %q", r.Reason)
	}
	if r.Eval.NotAssessed&model.MissingConeSize == 0 {
		t.Errorf("cone %s: want not evaluated for want of its sizes", r.Eval.Discharges[model.Cone].Reason())
	}
}

// Review 2 item N5: powder into a silo in a dust atmosphere (starch, IIIB, zone
// 20, MIE 10 mJ; invented for the demo), D 2 m. Brush discharges do not ignite a
// dust cloud of MIE >= 1 mJ (CCPS glossary, reference sections 3, 12), so only
// the cone decides:
//   - particle size blank: not assessed, said so, and no ratio (no NaN reaches a verdict);
//   - d = 1 mm with Mass flow blank: Glor (from memory, reference table) W = 5.22 x
//     2^3.36 x 1^1.462 mJ = 53.6 mJ (derived, python3), ratio 5.36: incendive.
func TestReview2PowderConeSizes(t *testing.T) {
	dust := inventory.Atmosphere{ID: "A-ST", Substance: "starch", Kind: "dust", MIE: known(10e-3), Group: "IIIB", Zone: "20"} // invented for the demo
	r := one(t, &dust, inventory.Object{Kind: "powder", Diameter: known(2)})
	if r.Verdict != NotAssessed || r.Ratio != nil || !strings.Contains(r.Reason, "Particle size") {
		t.Errorf("no particle size: verdict %v, ratio %v, reason %q; want not assessed naming Particle size", r.Verdict, r.Ratio, r.Reason)
	}
	r = one(t, &dust, inventory.Object{Kind: "powder", Diameter: known(2), ParticleSize: known(1e-3)})
	if r.Verdict != Incendive || r.Ratio == nil || r.Eval.Effective != model.Cone {
		t.Fatalf("verdict %v, ratio %v, effective %v; want incendive on the cone", r.Verdict, r.Ratio, r.Eval.Effective)
	}
	wantRel(t, "cone energy", r.Eval.EffectiveEnergy, 53.6e-3)
}
