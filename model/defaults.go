package model

import (
	"math"
	"strings"
	"sync"
)

// LimitSpec is one row of the limit table, the one place a limit is defined:
// every view derives from it (DefaultLimits, LimitSources, the
// Site sheet items inventory validates, SetLimitItem, the Method sheet's
// limits, references and verify list, and `library`). A per-group or
// per-vessel-class limit has one row per group or class.
type LimitSpec struct {
	Key      string // Limits field, the group or class in brackets: "TransferredCharge[IIB]"
	Label    string // in words, as the Method sheet shows it
	Unit     string // SI unit of the value, ASCII: "J", "C/m²", "Ω", "1" for a plain number
	Display  string // unit the audit shows it in: "mJ", "µC/m²", "Ω", "" for a plain number
	SiteItem string // Site sheet item that overrides it (lower case, no unit), "" when none
	SiteUnit string // the Site item's practical unit, "" for a plain number
	// Also lists general Site items that set this limit together with others
	// ("maximum filling velocity" sets the ceiling of every vessel class).
	Also       []string
	Default    float64 // SI
	Ref        string  // key of the reference in References
	Clause     string  // clause, table or annex, and the note on how the value is taken
	FromMemory bool    // recalled, not confirmed against the reference's text ([M])
	at         func(*Limits) []*float64
}

// Source is the row's citation: the reference with its edition, then the
// clause ("TRGS 727:2016 Annex D").
func (s LimitSpec) Source() string {
	cite := reference(s.Ref).Cite()
	switch {
	case s.Clause == "":
		return cite
	case strings.IndexAny(s.Clause[:1], ",;:") == 0:
		return cite + s.Clause
	}
	return cite + " " + s.Clause
}

// Edition is the edition of the row's reference ("" when none is named).
func (s LimitSpec) Edition() string { return reference(s.Ref).Edition }

// Value returns the row's limit in l (SI).
func (s LimitSpec) Value(l Limits) float64 { return *s.at(&l)[0] }

// set sets the row's limit (every entry it stands for) in l.
func (s LimitSpec) set(l *Limits, v float64) {
	for _, p := range s.at(l) {
		*p = v
	}
}

// Sets reports whether the Site item name sets this row's limit.
func (s LimitSpec) Sets(item string) bool {
	if item == "" {
		return false
	}
	if s.SiteItem == item {
		return true
	}
	for _, a := range s.Also {
		if a == item {
			return true
		}
	}
	return false
}

var (
	limitTableOnce sync.Once
	limitTableRows []LimitSpec
)

// LimitTable returns the rows of the limit table, in the order the Method
// sheet and `library` list them. The slice is shared: do not modify it.
func LimitTable() []LimitSpec {
	limitTableOnce.Do(func() { limitTableRows = limitTable() })
	return limitTableRows
}

// DefaultLimits returns the built-in limits and screening choices (the Default
// of every LimitTable row). Array entries no row covers (the no-group
// transferred charge and areas, the unknown vessel class) are NaN: no limit.
func DefaultLimits() Limits {
	var l Limits
	nan := math.NaN()
	for i := range l.TransferredCharge {
		l.TransferredCharge[i], l.AreaGa[i], l.AreaGb[i] = nan, nan, nan
	}
	for i := range l.VesselVDLow {
		l.VesselVDLow[i], l.VesselVDHigh[i], l.VesselMaxVelocity[i] = nan, nan, nan
	}
	for _, s := range LimitTable() {
		s.set(&l, s.Default)
	}
	return l
}

// SetLimitItem sets in l every limit the Site item name (lower case, without
// unit, as inventory.LimitItems names it) overrides, to v (SI); false when the
// item sets none.
func SetLimitItem(l *Limits, item string, v float64) bool {
	ok := false
	for _, s := range LimitTable() {
		if s.Sets(item) {
			s.set(l, v)
			ok = true
		}
	}
	return ok
}

// Citation is one built-in limit with its value and where it comes from.
type Citation struct {
	Limit      string  // Limits field, with the group in brackets for per-group values
	Value      float64 // SI
	Unit       string  // SI unit of Value
	Source     string  // document and edition (or the reason for a screening choice)
	FromMemory bool    // recalled, not confirmed in a published source here ([M])
}

// LimitSources returns every default limit with its value, unit and source, in
// the order of the limit table.
func LimitSources() []Citation {
	rows := LimitTable()
	out := make([]Citation, len(rows))
	for i, s := range rows {
		out[i] = Citation{Limit: s.Key, Value: s.Default, Unit: s.Unit, Source: s.Source(), FromMemory: s.FromMemory}
	}
	return out
}

// field adapts an accessor of one Limits entry to a row's at.
func field(f func(*Limits) *float64) func(*Limits) []*float64 {
	return func(l *Limits) []*float64 { return []*float64{f(l)} }
}

// limitTable builds the rows. To add a limit: its field in Limits, one row
// here (label, units, Site item, default, reference, clause, source mark), a
// test of the value against its source, and, when it has a Site item, the
// inventory view regenerated (go test ./report/assess -run TestLimitItemsFile -update).
func limitTable() []LimitSpec {
	var t []LimitSpec
	add := func(s LimitSpec) { t = append(t, s) }
	low := strings.ToLower
	groups := []Group{IIA, IIB, IIC}

	for _, g := range groups {
		add(LimitSpec{Key: "BrushChargeDensity[" + g.String() + "]", Label: "Brush discharge: charge-density screen, " + g.String(),
			Unit: "C/m²", Display: "µC/m²", SiteItem: "brush charge density " + low(g.String()), SiteUnit: "µC/m²",
			Default: map[Group]float64{IIA: 5e-6, IIB: 3e-6, IIC: 1e-6}[g], Ref: refJNIOSH, Clause: "(secondary summary); documented, overridable screen",
			at: field(func(l *Limits) *float64 { return &l.BrushChargeDensity[g] })})
	}
	add(LimitSpec{Key: "BrushChargeDensity[other]", Label: "Brush discharge: charge-density screen, no group, dusts",
		Unit: "C/m²", Display: "µC/m²", Default: 5e-6, Ref: refChoice, Clause: ": the IIA screen for no group and for dusts",
		at: func(l *Limits) []*float64 {
			return []*float64{&l.BrushChargeDensity[GroupNone], &l.BrushChargeDensity[IIIA], &l.BrushChargeDensity[IIIB], &l.BrushChargeDensity[IIIC]}
		}})
	add(LimitSpec{Key: "BrushEnergy", Label: "Brush discharge: equivalent energy", Unit: "J", Display: "mJ", SiteItem: "brush energy", SiteUnit: "mJ",
		Default: 4e-3, Ref: refCLC50404, Clause: "summaries (3-4 mJ); upper end taken",
		at: field(func(l *Limits) *float64 { return &l.BrushEnergy })})
	add(LimitSpec{Key: "BrushArea", Label: "Brush discharge: area one discharge drains", Unit: "m²", Display: "cm²", SiteItem: "brush area", SiteUnit: "cm²",
		Default: 100e-4, Ref: refChoice, Clause: ": area one brush drains",
		at: field(func(l *Limits) *float64 { return &l.BrushArea })})
	for _, g := range groups {
		add(LimitSpec{Key: "TransferredCharge[" + g.String() + "]", Label: "Transferred charge, EPL Gb/Gc (zones 1, 2), " + g.String(),
			Unit: "C", Display: "nC", SiteItem: "transferred charge " + low(g.String()), SiteUnit: "nC",
			Default: map[Group]float64{IIA: 60e-9, IIB: 25e-9, IIC: 10e-9}[g], Ref: ref0, Clause: "7.4.2 / " + reference(refTS32).Cite(), FromMemory: true,
			at: field(func(l *Limits) *float64 { return &l.TransferredCharge[g] })})
	}
	for _, g := range []Group{IIIA, IIIB, IIIC} {
		add(LimitSpec{Key: "TransferredCharge[" + g.String() + "]", Label: "Transferred charge, dust (against propagating brush discharges), " + g.String(),
			Unit: "C", Display: "nC", SiteItem: "transferred charge group iii", SiteUnit: "nC",
			Default: 200e-9, Ref: ref0, Clause: "(Group III, against propagating brush discharges)", FromMemory: true,
			at: field(func(l *Limits) *float64 { return &l.TransferredCharge[g] })})
	}
	add(LimitSpec{Key: "ZoneZeroChargeFactor", Label: "Zone 0 factor on the transferred charge", Unit: "1", SiteItem: "zone 0 charge factor",
		Default: 0.4, Ref: refChoice, Clause: ": EPL Ga values not confirmed (about 25/10/4 nC recalled)", FromMemory: true,
		at: field(func(l *Limits) *float64 { return &l.ZoneZeroChargeFactor })})
	for _, g := range groups {
		add(LimitSpec{Key: "AreaGa[" + g.String() + "]", Label: "Insulating area, EPL Ga (zone 0), " + g.String(),
			Unit: "m²", Display: "cm²", SiteItem: "insulating area zone 0 " + low(g.String()), SiteUnit: "cm²",
			Default: map[Group]float64{IIA: 50e-4, IIB: 25e-4, IIC: 4e-4}[g], Ref: ref0, FromMemory: true,
			at: field(func(l *Limits) *float64 { return &l.AreaGa[g] })})
	}
	for _, g := range groups {
		add(LimitSpec{Key: "AreaGb[" + g.String() + "]", Label: "Insulating area, EPL Gb/Gc (zones 1, 2), " + g.String(),
			Unit: "m²", Display: "cm²", SiteItem: "insulating area zone 1 " + low(g.String()), SiteUnit: "cm²",
			Default: map[Group]float64{IIA: 100e-4, IIB: 100e-4, IIC: 20e-4}[g], Ref: ref0, FromMemory: true,
			at: field(func(l *Limits) *float64 { return &l.AreaGb[g] })})
	}
	scalar := func(key, label, unit, display, item, itemUnit string, def float64, ref, clause string, mem bool, f func(*Limits) *float64) {
		add(LimitSpec{Key: key, Label: label, Unit: unit, Display: display, SiteItem: item, SiteUnit: itemUnit, Default: def,
			Ref: ref, Clause: clause, FromMemory: mem, at: field(f)})
	}
	scalar("PropagatingDensity", "Propagating brush: charge density it needs", "C/m²", "µC/m²", "propagating charge density", "µC/m²", 2.5e-4,
		refTRGS727, "Annex C; JNIOSH-TR", false, func(l *Limits) *float64 { return &l.PropagatingDensity })
	scalar("PropagatingBreakdown", "Propagating brush: layer breakdown below which it is prevented", "V", "V", "propagating breakdown voltage", "kV", 4e3,
		refTRGS727, "Annex C; "+reference(ref0).Cite()+" foreword", false, func(l *Limits) *float64 { return &l.PropagatingBreakdown })
	scalar("PropagatingThickness", "Propagating brush: thickness above which it is not expected", "m", "mm", "propagating thickness", "mm", 8e-3,
		refTS32, "(layers thinner than about 8-10 mm)", true, func(l *Limits) *float64 { return &l.PropagatingThickness })
	scalar("ConductorEarthing", "Conductor resistance to earth", "Ω", "Ω", "conductor earthing limit", "Ω", 1e6,
		refTRGS727, "8.3", false, func(l *Limits) *float64 { return &l.ConductorEarthing })
	scalar("PersonEarthing", "Person-to-earth resistance", "Ω", "Ω", "person earthing limit", "Ω", 1e8,
		refTRGS727, "7.2", false, func(l *Limits) *float64 { return &l.PersonEarthing })
	scalar("PersonEarthingMIE", "Person-to-earth limit applies at MIE up to", "J", "mJ", "person earthing mie", "mJ", 10e-3,
		refTRGS727, "7.2", false, func(l *Limits) *float64 { return &l.PersonEarthingMIE })
	scalar("ShockEnergy", "Shock energy to people", "J", "mJ", "shock energy", "mJ", 350e-3,
		refTRGS727, "Annex D", false, func(l *Limits) *float64 { return &l.ShockEnergy })
	scalar("SafePotential", "Safe conductor potential", "V", "V", "safe potential", "V", 100,
		refPaschen, "(minimum of air about 327 V); 100 V counts as safe", false, func(l *Limits) *float64 { return &l.SafePotential })
	scalar("SparkMinPotential", "Spark minimum potential (Paschen)", "V", "V", "spark minimum potential", "V", 300,
		refPaschen, "(minimum of air about 327 V; no gap breaks down below about 300 V)", false, func(l *Limits) *float64 { return &l.SparkMinPotential })
	scalar("AirBreakdown", "Air breakdown field", "V/m", "kV/m", "air breakdown field", "kV/m", AirBreakdownField,
		refAMS, "(about 3 MV/m for centimetre gaps); "+refCCPS, false, func(l *Limits) *float64 { return &l.AirBreakdown })
	scalar("NotEarthed", "Resistance shown when not measured (the potential is computed with no leakage)", "Ω", "Ω", "not earthed resistance", "Ω", 1e13,
		refChoice, ": unknown resistance taken as not earthed", false, func(l *Limits) *float64 { return &l.NotEarthed })
	scalar("PersonMaxPotential", "Cap on an estimated body potential", "V", "V", "person maximum potential", "kV", 15e3,
		refESDA, "body-voltage table (vinyl floor 12 kV at low RH), rounded up", false, func(l *Limits) *float64 { return &l.PersonMaxPotential })
	scalar("LowConductivity", "Liquid: low conductivity at or below", "S/m", "pS/m", "low conductivity", "pS/m", 50e-12,
		refTS32, "", false, func(l *Limits) *float64 { return &l.LowConductivity })
	scalar("HighConductivity", "Liquid: high conductivity above", "S/m", "pS/m", "high conductivity", "pS/m", 1e4*1e-12,
		refTS32, "", true, func(l *Limits) *float64 { return &l.HighConductivity })
	scalar("VDKappa", "Liquid filling: conductivity bound of the v·d limits", "S/m", "pS/m", "filling vd conductivity", "pS/m", 10e-12,
		refTS32, "", false, func(l *Limits) *float64 { return &l.VDKappa })
	scalar("SlowStartVelocity", "Liquid filling: velocity until the inlet is submerged", "m/s", "m/s", "slow start velocity", "m/s", 1,
		refTS32, "", true, func(l *Limits) *float64 { return &l.SlowStartVelocity })
	scalar("BagCToTab", "Bag type C: any point to the earthing tab", "Ω", "Ω", "bag c point to tab", "Ω", 1e8,
		refBags, "(1e7 Ω in the earlier edition and in "+reference(refTRGS727).Cite()+")", false, func(l *Limits) *float64 { return &l.BagCToTab })
	scalar("BagTabToEarth", "Bag type C: tab to plant earth", "Ω", "Ω", "bag c tab to earth", "Ω", 1e6,
		refBags, "", false, func(l *Limits) *float64 { return &l.BagTabToEarth })
	scalar("BagMinMIE", "Bags C and D: lowest MIE of their qualification", "J", "mJ", "bag minimum mie", "mJ", 0.14e-3,
		refBags, "", false, func(l *Limits) *float64 { return &l.BagMinMIE })
	scalar("BagMaxCurrent", "Bags C and D: charging current of their qualification", "A", "µA", "bag maximum current", "µA", 3e-6,
		refBags, "", false, func(l *Limits) *float64 { return &l.BagMaxCurrent })
	scalar("PropagatingMaxEnergy", "Propagating brush: upper bound of the energy", "J", "mJ", "propagating maximum energy", "mJ", 1,
		refJNIOSH, "(propagating brush energies of hundreds of mJ to J; the range from memory)", true, func(l *Limits) *float64 { return &l.PropagatingMaxEnergy })
	scalar("MaxChargingCurrent", "Largest charging current taken when none is known", "A", "µA", "", "", 100e-6,
		refJNIOSH, ": industrial charging currents rarely exceed 100 µA", false, func(l *Limits) *float64 { return &l.MaxChargingCurrent })
	scalar("DissipativeSurface", "Surface resistance counted as dissipative", "Ω", "Ω", "", "", 1e9,
		ref0, "cl. 26.13 (1e9 Ω at 50 %RH)", false, func(l *Limits) *float64 { return &l.DissipativeSurface })
	scalar("DissipativeEarthing", "Earthing of a dissipative surface", "Ω", "Ω", "", "", 1e8,
		refTRGS727, "", true, func(l *Limits) *float64 { return &l.DissipativeEarthing })
	scalar("ConeResistivity", "Cone discharge: bulk resistivity needed", "Ω·m", "Ω·m", "", "", 1e10,
		refBGRCI, "5.10; "+reference(refTRGS727).Cite()+" 6.2.3", false, func(l *Limits) *float64 { return &l.ConeResistivity })
	scalar("ConeChargeToMass", "Cone discharge: charge-to-mass needed", "C/kg", "µC/kg", "", "", 1e-6,
		refJNIOSH, "", false, func(l *Limits) *float64 { return &l.ConeChargeToMass })
	scalar("ConeField", "Cone discharge: heap field below which none is expected", "V/m", "kV/m", "", "", 500e3,
		refJNIOSH, "; "+refBGRCI+" 5.10", false, func(l *Limits) *float64 { return &l.ConeField })
	scalar("ConeMinVolume", "Cone discharge: container volume below which none is expected", "m³", "m³", "", "", 0.25,
		refJNIOSH, "", false, func(l *Limits) *float64 { return &l.ConeMinVolume })
	scalar("BagDustLow", "Bags: MIE band boundary (low)", "J", "mJ", "", "", 3e-3,
		refBags, "", false, func(l *Limits) *float64 { return &l.BagDustLow })
	scalar("BagDustHigh", "Bags: MIE band boundary (high)", "J", "mJ", "", "", 1000e-3,
		refBags, "", false, func(l *Limits) *float64 { return &l.BagDustHigh })
	scalar("ConductorMaxPotential", "Cap on an unmeasured conductor potential", "V", "V", "conductor maximum potential", "kV", 50e3,
		refPractice, ": plant conductors go into corona from edges and bolts at tens of kV; an unmeasured estimate above it is an artefact of an assumed resistance", false,
		func(l *Limits) *float64 { return &l.ConductorMaxPotential })
	scalar("SmallPartCapacitance", "Small metal part exempt from earthing below", "F", "pF", "small part capacitance", "pF", 10e-12,
		ref0, "(small isolated metal parts exempt from earthing, IIA/IIB/Group III)", true, func(l *Limits) *float64 { return &l.SmallPartCapacitance })
	scalar("SmallPartCapacitanceIIC", "Small metal part exempt from earthing below (IIC, zone 0)", "F", "pF", "small part capacitance iic", "pF", 3e-12,
		ref0, "(small isolated metal parts exempt from earthing, IIC or EPL Ga)", true, func(l *Limits) *float64 { return &l.SmallPartCapacitanceIIC })
	scalar("DustBrushMIE", "Dust screened for brush discharges below MIE", "J", "mJ", "dust brush mie", "mJ", 1e-3,
		refChoice, ": dusts below about 1 mJ behave like hybrids for brush discharges", true, func(l *Limits) *float64 { return &l.DustBrushMIE })

	classes := []VesselClass{VesselRoadTanker, VesselRailCar, VesselFixedTank, VesselIBC, VesselDrum, VesselCan}
	for _, c := range classes {
		r, _ := ClauseVD.Rule(c)
		ref, clause := splitRuleRef(r.Ref)
		lowItem := "filling vd limit low conductivity " + low(c.String())
		highItem := "filling vd limit " + low(c.String())
		var lowAlso, highAlso []string
		if c == VesselRoadTanker { // the general items name the road tanker's values
			lowAlso, highAlso = []string{"filling vd limit low conductivity"}, []string{"filling vd limit"}
		}
		lowDef, highDef := 0.38, 0.5 // road tankers, and the other classes that take their values
		if c == VesselRailCar {
			lowDef, highDef = 0.75, 0.75
		}
		add(LimitSpec{Key: "VesselVDLow[" + c.String() + "]", Label: "Liquid filling: v·d limit at or below the conductivity bound, or unknown, " + c.String(),
			Unit: "m²/s", Display: "m²/s", SiteItem: lowItem, SiteUnit: "m²/s", Also: lowAlso,
			Default: lowDef, Ref: ref, Clause: clause, FromMemory: r.FromMemory,
			at: field(func(l *Limits) *float64 { return &l.VesselVDLow[c] })})
		add(LimitSpec{Key: "VesselVDHigh[" + c.String() + "]", Label: "Liquid filling: v·d limit above the conductivity bound (low-conductivity liquids), " + c.String(),
			Unit: "m²/s", Display: "m²/s", SiteItem: highItem, SiteUnit: "m²/s", Also: highAlso,
			Default: highDef, Ref: ref, Clause: clause, FromMemory: r.FromMemory,
			at: field(func(l *Limits) *float64 { return &l.VesselVDHigh[c] })})
	}
	for _, c := range classes {
		add(LimitSpec{Key: "VesselMaxVelocity[" + c.String() + "]", Label: "Liquid filling: velocity ceiling, " + c.String(),
			Unit: "m/s", Display: "m/s", SiteItem: "maximum filling velocity " + low(c.String()), SiteUnit: "m/s", Also: []string{"maximum filling velocity"},
			Default: 7, Ref: refTS32, Clause: ", velocity ceiling", FromMemory: true,
			at: field(func(l *Limits) *float64 { return &l.VesselMaxVelocity[c] })})
	}
	scalar("LargeTankDiameter", "Liquid filling: fixed tank diameter with no v·d limit", "m", "mm", "large tank diameter", "m", 10,
		refTS32, ", large fixed tanks: velocity limits only (the diameter a screening choice)", true, func(l *Limits) *float64 { return &l.LargeTankDiameter })
	scalar("SecondPhaseVelocity", "Liquid filling: velocity ceiling with a second phase", "m/s", "m/s", "second phase velocity", "m/s", 1,
		refTS32, ", two-phase flow", true, func(l *Limits) *float64 { return &l.SecondPhaseVelocity })
	scalar("SecondPhaseConductivity", "Liquid: with a second phase, low conductivity below", "S/m", "pS/m", "second phase conductivity", "pS/m", 1000e-12,
		refTS32, ", a second phase makes a liquid below it chargeable", false, func(l *Limits) *float64 { return &l.SecondPhaseConductivity })
	scalar("FilterResidenceFactor", "Liquid: relaxation times of residence after a fine filter", "1", "", "filter residence factor", "", ResidenceFactor,
		refTS32, ", filters (3 relaxation times leave 5 % of the charge)", true, func(l *Limits) *float64 { return &l.FilterResidenceFactor })
	scalar("FilterResidenceMax", "Liquid: residence after a fine filter that always suffices", "s", "s", "filter residence time", "s", 100,
		refTS32, ", filters", true, func(l *Limits) *float64 { return &l.FilterResidenceMax })
	scalar("FilterChargeFactor", "Liquid: streaming current factor after a fine filter", "1", "", "filter charge factor", "", 100,
		refTS32, ", filters: micro-filters raise the charge 10-100 times; upper end taken", true, func(l *Limits) *float64 { return &l.FilterChargeFactor })
	scalar("StrainerChargeFactor", "Liquid: streaming current factor after a strainer", "1", "", "strainer charge factor", "", 1,
		refPractice, ": coarse strainers add little charge to a pipe's", true, func(l *Limits) *float64 { return &l.StrainerChargeFactor })
	scalar("SecondPhaseChargeFactor", "Liquid: streaming current factor with a second phase", "1", "", "second phase charge factor", "", 10,
		refChoice, ": an order of magnitude for free water, solids or a second liquid", true, func(l *Limits) *float64 { return &l.SecondPhaseChargeFactor })
	scalar("EarthingContradictionFactor", "Measured potential above this many times the earthing bound I R: a contradiction", "1", "", "earthing contradiction factor", "", 10,
		refChoice, ": a measured potential more than an order of magnitude above what the measured earthing allows under the worst-case charging current (I R) contradicts the earthing path", false,
		func(l *Limits) *float64 { return &l.EarthingContradictionFactor })
	scalar("SparkSurface", "Surface resistance below which an unearthed surface sparks as a conductor", "Ω", "Ω", "spark surface resistance", "Ω", 1e12,
		refESDA, "material classes: dissipative 1e5 to < 1e12 Ω/sq; a surface below it, or of dissipative class, sparks when not earthed ("+reference(refTS32).Cite()+" principle: conductors must be earthed)", false,
		func(l *Limits) *float64 { return &l.SparkSurface })
	scalar("CoronaEnergy", "Corona: equivalent energy bound (counted only against an MIE below it)", "J", "mJ", "corona energy", "mJ", 0.1e-3,
		refChoice, ": corona is below about 0.1-1 mJ and ignites only very sensitive gases such as hydrogen (below 1 mJ confirmed in the trade literature, the 0.1 mJ end and the hydrogen-only ignition from memory); the lower end is taken as its equivalent energy and compared only with an MIE below it, so only an atmosphere whose MIE is below it is judged on corona, whatever its group (ethylene, IIB, 0.07 mJ, is; most IIA and IIB gases and vapours are not)", true,
		func(l *Limits) *float64 { return &l.CoronaEnergy })
	scalar("CoatingThickness", "Coating on earthed metal exempt from the area limit up to (with breakdown at most 4 kV)", "m", "mm", "", "", 2e-3,
		ref0, "coatings on earthed metal (IIA, IIB), with a breakdown voltage of at most 4 kV measured on the layer (the 4 kV condition confirmed in the 2017 foreword)", true,
		func(l *Limits) *float64 { return &l.CoatingThickness })
	scalar("CoatingThicknessIIC", "Coating on earthed metal exempt from the area limit up to, IIC (with breakdown at most 4 kV)", "m", "mm", "", "", 0.2e-3,
		ref0, "coatings on earthed metal (IIC), with a breakdown voltage of at most 4 kV measured on the layer", true,
		func(l *Limits) *float64 { return &l.CoatingThicknessIIC })
	return t
}

// splitRuleRef splits a liquid rule's reference ("IEC TS 60079-32-1:2013+A1:2017,
// clause 7 ...") into the reference key and the rest.
func splitRuleRef(s string) (key, clause string) {
	r, ok := ReferenceOf(s)
	if !ok {
		panic("model: liquid rule cites no reference: " + s)
	}
	return r.Key, strings.TrimPrefix(s, r.Cite())
}
