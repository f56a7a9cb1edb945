package assess

import (
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// TestProvenancePerValue checks the provenance mark of each value against
// where the survey row, station and atmosphere put it: the expected mark is
// read off the inputs of each case (what the surveyor typed where), not off
// the assessment's output.
func TestProvenancePerValue(t *testing.T) {
	pe, ok := inventory.LookupMaterial("PE")
	if !ok {
		t.Fatal("PE not in the built-in list")
	}
	// A Materials sheet row typed by the surveyor (invented for the demo).
	typed := matPET
	// Toluene vapour whose MIE and group the reader filled from the substance list.
	libAtm := atmToluene
	libAtm.MIEFromSubstance, libAtm.GroupFromSubstance = true, true
	// An atmosphere with no zone and no group: both assessed as the strictest (estimated).
	bare := inventory.Atmosphere{ID: "A-X", Kind: "vapour", MIE: known(0.2e-3)}

	cases := []struct {
		name    string
		atm     inventory.Atmosphere
		station inventory.Station // its RH, when given
		siteRH  bool              // the Site sheet gives an RH
		obj     inventory.Object
		mats    []inventory.Material
		want    map[Item]Provenance
	}{
		{
			name: "measured capacitance and resistance, station RH typed, atmosphere typed",
			atm:  atmToluene, station: inventory.Station{RelativeHumidity: known(40)}, siteRH: true,
			obj: inventory.Object{Kind: "part", Capacitance: known(50e-12), Resistance: known(1e12), SurfacePotential: known(5e3)},
			want: map[Item]Provenance{
				ItemCapacitance: ProvMeasured, ItemResistance: ProvMeasured, ItemPotential: ProvMeasured,
				ItemRelativeHumidity: ProvEntered, ItemMIE: ProvEntered, ItemGroup: ProvEntered, ItemZone: ProvEntered,
				ItemRequiredMargin: ProvOverride, ItemAirTemperature: ProvEntered,
			},
		},
		{
			name: "site RH taken for a station without one is entered, not estimated",
			atm:  atmToluene, siteRH: true,
			obj:  inventory.Object{Kind: "person", Resistance: known(1e10)},
			want: map[Item]Provenance{ItemRelativeHumidity: ProvEntered, ItemResistance: ProvMeasured, ItemCapacitance: ProvEstimated, ItemPotential: ProvEstimated},
		},
		{
			name: "no RH anywhere: the dry-day value is estimated",
			atm:  atmToluene,
			obj:  inventory.Object{Kind: "part", Capacitance: known(50e-12), SurfacePotential: known(5e3)},
			want: map[Item]Provenance{ItemRelativeHumidity: ProvEstimated, ItemResistance: ProvEstimated},
		},
		{
			name: "built-in material and substance values are library",
			atm:  libAtm, siteRH: true,
			obj:  inventory.Object{Kind: "sheet", Material: "PE", Length: known(1), Width: known(1), Field: known(100e3), FieldDistance: known(0.1)},
			mats: []inventory.Material{pe},
			want: map[Item]Provenance{ItemMaterial: ProvLibrary, ItemMIE: ProvLibrary, ItemGroup: ProvLibrary, ItemZone: ProvEntered},
		},
		{
			name: "a Materials sheet row is entered",
			atm:  atmToluene, siteRH: true,
			obj:  inventory.Object{Kind: "sheet", Material: typed.Name, Length: known(1), Width: known(1), Field: known(100e3), FieldDistance: known(0.1)},
			mats: []inventory.Material{typed},
			want: map[Item]Provenance{ItemMaterial: ProvEntered},
		},
		{
			name: "blank zone and group are estimated as the strictest",
			atm:  bare, siteRH: true,
			obj:  inventory.Object{Kind: "part", Capacitance: known(50e-12), Resistance: known(1e12), SurfacePotential: known(5e3)},
			want: map[Item]Provenance{ItemZone: ProvEstimated, ItemGroup: ProvEstimated, ItemMIE: ProvEntered, ItemCapacitance: ProvMeasured},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			st := c.station
			st.ID, st.Atmosphere = "ST-1", c.atm.ID
			o := c.obj
			o.ID, o.Station = "OBJ-1", st.ID
			s := newSurvey([]inventory.Atmosphere{c.atm}, []inventory.Station{st}, []inventory.Object{o}, c.mats)
			if !c.siteRH {
				s.Site.RelativeHumidity = inventory.Quantity{}
			}
			r := Assess(s, Options{}).Objects[0]
			for it, want := range c.want {
				if got := r.Provenance(it); got != want {
					t.Errorf("%s: provenance %q, want %q (marks %+v)", it.Key(), got, want, r.Marks)
				}
			}
			// "est." only on estimates: no measured or entered value is listed among the defaults.
			for _, d := range r.Defaults() {
				if d.Prov == ProvMeasured || d.Prov == ProvEntered {
					t.Errorf("default %+v is the surveyor's value", d)
				}
			}
		})
	}
}
