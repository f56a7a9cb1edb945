package assess

import (
	"math"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// Hand-worked cases of the plant-engineer review's items at the assessment level.

// Review item 1: an unearthed 1 m x 1 m sheet of the built-in "antistatic PE"
// (dissipative class, 1e10 ohm at 50 % RH, from memory) read at 100 kV/m at
// 0.05 m in toluene (zone 1, IIA, MIE 0.24 mJ) sparks: derived (python3) sigma =
// 1.945 uC/m^2 (free finite sheet), C = 8 eps0 sqrt(1/pi) = 39.96 pF, V = 48.7 kV,
// W = 47.3 mJ, ratio 197 (the review's hand value); reference section 12:
// "dissipative but unearthed is an isolated conductor: it sparks".
func TestReviewLibraryDissipativeSheetSparks(t *testing.T) {
	atm := inventory.Atmosphere{ID: "A-TOL", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "1"} // invented for the demo
	o := inventory.Object{Kind: "sheet", Material: "antistatic PE", Length: known(1), Width: known(1), Speed: known(1), Field: known(100e3), FieldDistance: known(0.05)}
	lib, ok := inventory.LookupMaterial("antistatic PE")
	if !ok {
		t.Fatal("built-in antistatic PE missing")
	}
	r := one(t, &atm, o, lib)
	if r.Verdict != Incendive || r.Eval.Effective != model.Spark {
		t.Fatalf("verdict %v, effective %v, findings %v; want incendive on the spark", r.Verdict, r.Eval.Effective, checks(r))
	}
	if e := r.Eval.EffectiveEnergy; e < 0.0473*0.999 || e > 0.0474*1.001 {
		t.Errorf("spark energy %g J, want 47.3 mJ", e)
	}
	// A still sheet of the same material (fixed equipment): the area finding says
	// to earth the dissipative material, not to replace it by one.
	o.Speed = inventory.Quantity{}
	r = one(t, &atm, o, lib)
	if !hasCheck(r, CheckInsulatingArea.Name()) {
		t.Errorf("still sheet: findings %v, want insulating-area", checks(r))
	}
	for _, f := range r.Findings {
		if f.Check == CheckInsulatingArea.Name() && strings.Contains(f.Mitigation, "replace it by a dissipative") {
			t.Errorf("mitigation of a dissipative material: %q", f.Mitigation)
		}
	}
}

// Review item 2: a 50 um PET liner on an earthed wall in starch dust (IIIB, zone
// 21, MIE 10 mJ), read at 200 kV/m at 0.05 m (10 kV across the layer, derived)
// with a measured layer breakdown of 3 kV: the reading beats the breakdown value
// (principle 1; BG RCI FAQ 1.12: a propagating brush is possible once the layer
// holds more than about 4 kV), so the propagating brush stays (energy bound 1 J,
// from memory) and the verdict is incendive, with the contradiction finding.
func TestReviewReadingAboveMeasuredBreakdownKeepsPropagatingBrush(t *testing.T) {
	atm := inventory.Atmosphere{ID: "A-ST", Substance: "starch", Kind: "dust", MIE: known(10e-3), Group: "IIIB", Zone: "21"} // invented for the demo
	o := inventory.Object{Kind: "sheet", Material: "PET film", Backing: "earthed", Thickness: known(50e-6), Length: known(1), Width: known(1),
		Field: known(200e3), FieldDistance: known(0.05), LayerBreakdown: known(3e3)}
	r := one(t, &atm, o, matPET)
	if r.Verdict != Incendive || !hasCheck(r, CheckLayerBreakdown.Name()) || !r.Eval.Discharges[model.PropagatingBrush].Possible {
		t.Errorf("verdict %v, findings %v, propagating brush %s; want incendive with the contradiction", r.Verdict, checks(r), r.Eval.Discharges[model.PropagatingBrush].Reason())
	}
	// Item 8: with no measured breakdown, 10 kV on 50 um (200 kV/mm) is within
	// what films hold (600 kV/mm x 50 um = 30 kV, reference section 12): no contradiction.
	o.LayerBreakdown = inventory.Quantity{}
	if r := one(t, &atm, o, matPET); hasCheck(r, CheckLayerBreakdown.Name()) || r.Verdict != Incendive {
		t.Errorf("no breakdown given: verdict %v, findings %v", r.Verdict, checks(r))
	}
}

// Review item 3: a type D bag in hydrogen (zone 1, IIC, MIE 0.017 mJ, reference
// section 4) discharges by corona; corona taken at its 0.1 mJ bound (screening
// choice: reference section 3, corona below about 0.1-1 mJ ignites hydrogen) gives
// ratio 0.1 / 0.017 = 5.9 (derived): incendive. In toluene (IIA, 0.24 mJ) corona
// is not counted, and the bag keeps its verdict (no energy finding).
func TestReviewCoronaInHydrogen(t *testing.T) {
	h2 := inventory.Atmosphere{ID: "A-H2", Substance: "hydrogen", Kind: "gas", MIE: known(0.017e-3), Group: "IIC", Zone: "1"} // invented for the demo
	r := one(t, &h2, inventory.Object{Kind: "bag", BagType: "D"})
	if r.Verdict != Incendive || !hasCheck(r, CheckEnergyMIE.Name()) || r.Eval.Effective != model.Corona {
		t.Errorf("bag D in hydrogen: verdict %v, findings %v, effective %v", r.Verdict, checks(r), r.Eval.Effective)
	}
	if r.Ratio == nil || *r.Ratio < 5.88*0.999 || *r.Ratio > 5.89*1.001 {
		t.Errorf("ratio %v, want 0.1/0.017 = 5.88", r.Ratio)
	}
	tol := inventory.Atmosphere{ID: "A-TOL", Substance: "toluene", Kind: "vapour", MIE: known(0.24e-3), Group: "IIA", Zone: "1"} // invented for the demo
	r = one(t, &tol, inventory.Object{Kind: "bag", BagType: "D"})
	if hasCheck(r, CheckEnergyMIE.Name()) || hasCheck(r, CheckEnergyMargin.Name()) || r.Eval.EffectiveEnergy != 0 {
		t.Errorf("bag D in toluene: verdict %v, findings %v, energy %g", r.Verdict, checks(r), r.Eval.EffectiveEnergy)
	}
}

// Review item 14: an energy finding names the ground of its own discharge.
// Sources as cited in the check table: spark W = C V^2/2 (JNIOSH-TR); cone,
// Glor's formula (from memory) and its range; propagating brush, TRGS 727 Annex C
// and the 1 J bound from memory; corona, the 0.1 mJ screening choice.
func TestReviewEnergyBasisPerDischarge(t *testing.T) {
	want := map[model.DischargeType][]string{
		model.Spark:            {"C V²/2", "JNIOSH-TR"},
		model.Brush:            {"3-4 mJ", "CLC/TR 50404", "screening choice"},
		model.PropagatingBrush: {"TRGS 727:2016 Annex C", "from memory"},
		model.Cone:             {"Glor", "from memory", "0.5-3 m", "0.1-3 mm"},
		model.Corona:           {"0.1 mJ", "screening choice"},
	}
	for d, words := range want {
		for _, k := range []Check{CheckEnergyMIE, CheckEnergyMargin} {
			b := k.BasisFor(d)
			for _, w := range words {
				if !strings.Contains(b, w) {
					t.Errorf("%s for %v: basis %q lacks %q", k.Name(), d, b, w)
				}
			}
		}
	}
	// In a finding: the cone of HW-10 (silo D 4 m, d 1.5 mm, MIE 500 mJ) reaches MIE / 10.
	atm := inventory.Atmosphere{ID: "A-D500", Substance: "coarse granulate", Kind: "dust", MIE: known(500e-3), Group: "IIIB", Zone: "20"} // invented for the demo
	r := one(t, &atm, inventory.Object{Kind: "powder", Material: "granulate", Diameter: known(4.0), ParticleSize: known(1.5e-3), MassFlow: known(10), ChargeToMass: known(1.0e-6), Length: known(12), Resistance: known(5)},
		inventory.Material{Name: "granulate", Class: "insulating", Permittivity: 2.5, SurfaceResistivity: math.NaN(), VolumeResistivity: 1e13, BreakdownStrength: math.NaN(), Source: "invented for the demo"})
	found := false
	for _, f := range r.Findings {
		if f.Check == CheckEnergyMargin.Name() {
			found = strings.Contains(f.Basis, "Glor")
		}
	}
	if !found {
		t.Errorf("cone energy finding without Glor's formula in its basis: %+v", r.Findings)
	}
}
