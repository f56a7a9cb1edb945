package model

import "math"

// DefaultLimits returns the built-in limits and screening choices; the sources and
// editions are listed by LimitSources. A survey may override any of them.
func DefaultLimits() Limits {
	nan := math.NaN()
	return Limits{
		BrushChargeDensity: [numGroups]float64{GroupNone: 5e-6, IIA: 5e-6, IIB: 3e-6, IIC: 1e-6, IIIA: 5e-6, IIIB: 5e-6, IIIC: 5e-6},
		BrushEnergy:        4e-3,
		BrushArea:          100e-4,

		TransferredCharge:    [numGroups]float64{GroupNone: nan, IIA: 60e-9, IIB: 25e-9, IIC: 10e-9, IIIA: 200e-9, IIIB: 200e-9, IIIC: 200e-9},
		ZoneZeroChargeFactor: 0.4,

		AreaGa: [numGroups]float64{GroupNone: nan, IIA: 50e-4, IIB: 25e-4, IIC: 4e-4, IIIA: nan, IIIB: nan, IIIC: nan},
		AreaGb: [numGroups]float64{GroupNone: nan, IIA: 100e-4, IIB: 100e-4, IIC: 20e-4, IIIA: nan, IIIB: nan, IIIC: nan},

		PropagatingDensity:   2.5e-4,
		PropagatingBreakdown: 4e3,
		PropagatingThickness: 8e-3,

		ConductorEarthing:  1e6,
		PersonEarthing:     1e8,
		PersonEarthingMIE:  10e-3,
		ShockEnergy:        350e-3,
		SafePotential:      100,
		SparkMinPotential:  300,
		AirBreakdown:       AirBreakdownField,
		NotEarthed:         1e13,
		PersonMaxPotential: 15e3,

		LowConductivity:   50e-12,
		HighConductivity:  1e4 * 1e-12,
		VDKappa:           10e-12,
		SlowStartVelocity: 1,

		BagCToTab:     1e8,
		BagTabToEarth: 1e6,
		BagMinMIE:     0.14e-3,
		BagMaxCurrent: 3e-6,

		PropagatingMaxEnergy: 1,
		MaxChargingCurrent:   100e-6,
		DissipativeSurface:   1e9,
		DissipativeEarthing:  1e8,
		ConeResistivity:      1e10,
		ConeChargeToMass:     1e-6,
		ConeField:            500e3,
		ConeMinVolume:        0.25,
		BagDustLow:           3e-3,
		BagDustHigh:          1000e-3,

		ConductorMaxPotential:   50e3,
		SmallPartCapacitance:    10e-12,
		SmallPartCapacitanceIIC: 3e-12,
		DustBrushMIE:            1e-3,
		// Liquid transfer by vessel class: unknown, road tanker, rail tank car, fixed tank, IBC, drum, can.
		VesselVDLow:             [NumVesselClasses]float64{nan, 0.38, 0.75, 0.38, 0.38, 0.38, 0.38},
		VesselVDHigh:            [NumVesselClasses]float64{nan, 0.5, 0.75, 0.5, 0.5, 0.5, 0.5},
		VesselMaxVelocity:       [NumVesselClasses]float64{nan, 7, 7, 7, 7, 7, 7},
		LargeTankDiameter:       10,
		SecondPhaseVelocity:     1,
		SecondPhaseConductivity: 1000e-12,
		FilterResidenceFactor:   ResidenceFactor,
		FilterResidenceMax:      100,
		FilterChargeFactor:      100,
		StrainerChargeFactor:    1,
		SecondPhaseChargeFactor: 10,

		EarthingContradictionFactor: 10,

		SparkSurface: 1e12,
		CoronaEnergy: 0.1e-3,

		CoatingThickness:    2e-3,
		CoatingThicknessIIC: 0.2e-3,
	}
}

// Citation is one built-in limit with its value and where it comes from.
type Citation struct {
	Limit      string  // Limits field, with the group in brackets for per-group values
	Value      float64 // SI
	Unit       string  // SI unit of Value
	Source     string  // document and edition (or the reason for a screening choice)
	FromMemory bool    // recalled, not confirmed in a published source here ([M])
}

// Source documents, with editions.
const (
	srcTS32      = "IEC TS 60079-32-1:2013+A1:2017"
	src0         = "IEC 60079-0:2017"
	srcTRGS      = "TRGS 727:2016"
	srcBags      = "IEC 61340-4-4:2018"
	srcJNIOSH    = "JNIOSH-TR (secondary summary); documented, overridable screen"
	srcChoice    = "screening choice of this tool, not a standard value"
	srcCCPS      = "CCPS glossary; AMS Glossary of Meteorology"
	srcPaschen   = "Paschen minimum of air, about 327 V"
	srcWalking   = "ESD Association body-voltage table (vinyl floor 12 kV at low RH), rounded up"
	srcBGRCI     = "BG RCI FAQ 5.10; " + srcTRGS + " 6.2.3"
	srcPersonMIE = srcTRGS + " 7.2"
)

// LimitSources returns every default limit with its value, unit and source, in
// the order of the Limits fields; per-group values are listed for the groups
// that have one.
func LimitSources() []Citation { return CitationsOf(DefaultLimits()) }

// CitationsOf is LimitSources with the values of l: the same limits, in the
// same order, with the same sources (which describe the defaults).
func CitationsOf(l Limits) []Citation {
	var out []Citation
	add := func(name string, v float64, unit, src string, mem bool) {
		out = append(out, Citation{Limit: name, Value: v, Unit: unit, Source: src, FromMemory: mem})
	}
	for _, g := range []Group{IIA, IIB, IIC} {
		add("BrushChargeDensity["+g.String()+"]", l.BrushChargeDensity[g], "C/m^2", srcJNIOSH, false)
	}
	add("BrushChargeDensity[other]", l.BrushChargeDensity[GroupNone], "C/m^2", srcChoice+": the IIA screen for no group and for dusts", false)
	add("BrushEnergy", l.BrushEnergy, "J", "CLC/TR 50404 summaries (3-4 mJ); upper end taken", false)
	add("BrushArea", l.BrushArea, "m^2", srcChoice+": area one brush drains", false)
	for _, g := range []Group{IIA, IIB, IIC} {
		add("TransferredCharge["+g.String()+"]", l.TransferredCharge[g], "C", src0+" 7.4.2 / "+srcTS32, true)
	}
	for _, g := range []Group{IIIA, IIIB, IIIC} {
		add("TransferredCharge["+g.String()+"]", l.TransferredCharge[g], "C", src0+" (Group III, against propagating brush discharges)", true)
	}
	add("ZoneZeroChargeFactor", l.ZoneZeroChargeFactor, "1", srcChoice+": EPL Ga values not confirmed (about 25/10/4 nC recalled)", true)
	for _, g := range []Group{IIA, IIB, IIC} {
		add("AreaGa["+g.String()+"]", l.AreaGa[g], "m^2", src0, true)
	}
	for _, g := range []Group{IIA, IIB, IIC} {
		add("AreaGb["+g.String()+"]", l.AreaGb[g], "m^2", src0, true)
	}
	add("PropagatingDensity", l.PropagatingDensity, "C/m^2", srcTRGS+" Annex C; JNIOSH-TR", false)
	add("PropagatingBreakdown", l.PropagatingBreakdown, "V", srcTRGS+" Annex C; "+src0+" foreword", false)
	add("PropagatingThickness", l.PropagatingThickness, "m", srcTS32, true)
	add("ConductorEarthing", l.ConductorEarthing, "ohm", srcTRGS+" 8.3", false)
	add("PersonEarthing", l.PersonEarthing, "ohm", srcPersonMIE, false)
	add("PersonEarthingMIE", l.PersonEarthingMIE, "J", srcPersonMIE, false)
	add("ShockEnergy", l.ShockEnergy, "J", srcTRGS+" Annex D", false)
	add("SafePotential", l.SafePotential, "V", srcPaschen+"; 100 V counts as safe", false)
	add("SparkMinPotential", l.SparkMinPotential, "V", srcPaschen, false)
	add("AirBreakdown", l.AirBreakdown, "V/m", srcCCPS, false)
	add("NotEarthed", l.NotEarthed, "ohm", srcChoice+": unknown resistance taken as not earthed", false)
	add("PersonMaxPotential", l.PersonMaxPotential, "V", srcWalking, false)
	add("LowConductivity", l.LowConductivity, "S/m", srcTS32, false)
	add("HighConductivity", l.HighConductivity, "S/m", srcTS32, true)
	add("VDKappa", l.VDKappa, "S/m", srcTS32, false)
	add("SlowStartVelocity", l.SlowStartVelocity, "m/s", srcTS32, true)
	add("BagCToTab", l.BagCToTab, "ohm", srcBags+" (1e7 ohm in the earlier edition and in "+srcTRGS+")", false)
	add("BagTabToEarth", l.BagTabToEarth, "ohm", srcBags, false)
	add("BagMinMIE", l.BagMinMIE, "J", srcBags, false)
	add("BagMaxCurrent", l.BagMaxCurrent, "A", srcBags, false)
	add("PropagatingMaxEnergy", l.PropagatingMaxEnergy, "J", "published range hundreds of mJ to J", true)
	add("MaxChargingCurrent", l.MaxChargingCurrent, "A", "JNIOSH-TR: industrial charging currents rarely exceed 100 uA", false)
	add("DissipativeSurface", l.DissipativeSurface, "ohm", src0+" cl. 26.13 (1e9 ohm at 50 %RH)", false)
	add("DissipativeEarthing", l.DissipativeEarthing, "ohm", srcTRGS, true)
	add("ConeResistivity", l.ConeResistivity, "ohm m", srcBGRCI, false)
	add("ConeChargeToMass", l.ConeChargeToMass, "C/kg", "JNIOSH-TR", false)
	add("ConeField", l.ConeField, "V/m", "JNIOSH-TR; BG RCI FAQ 5.10", false)
	add("ConeMinVolume", l.ConeMinVolume, "m^3", "JNIOSH-TR", false)
	add("BagDustLow", l.BagDustLow, "J", srcBags, false)
	add("BagDustHigh", l.BagDustHigh, "J", srcBags, false)
	add("ConductorMaxPotential", l.ConductorMaxPotential, "V", "common practice, no source: plant conductors go into corona from edges and bolts at tens of kV; an unmeasured estimate above it is an artefact of an assumed resistance", false)
	add("SmallPartCapacitance", l.SmallPartCapacitance, "F", src0+" (small isolated metal parts exempt from earthing, IIA/IIB/Group III)", true)
	add("SmallPartCapacitanceIIC", l.SmallPartCapacitanceIIC, "F", src0+" (small isolated metal parts exempt from earthing, IIC or EPL Ga)", true)
	add("DustBrushMIE", l.DustBrushMIE, "J", srcChoice+": dusts below about 1 mJ behave like hybrids for brush discharges", true)
	for c := VesselRoadTanker; c < NumVesselClasses; c++ {
		r, _ := ClauseVD.Rule(c)
		add("VesselVDLow["+c.String()+"]", l.VesselVDLow[c], "m^2/s", r.Ref, r.FromMemory)
		add("VesselVDHigh["+c.String()+"]", l.VesselVDHigh[c], "m^2/s", r.Ref, r.FromMemory)
	}
	for c := VesselRoadTanker; c < NumVesselClasses; c++ {
		add("VesselMaxVelocity["+c.String()+"]", l.VesselMaxVelocity[c], "m/s", srcTS32+", velocity ceiling", true)
	}
	add("LargeTankDiameter", l.LargeTankDiameter, "m", srcTS32+", large fixed tanks: velocity limits only (the diameter a screening choice)", true)
	add("SecondPhaseVelocity", l.SecondPhaseVelocity, "m/s", srcTS32+", two-phase flow", true)
	add("SecondPhaseConductivity", l.SecondPhaseConductivity, "S/m", srcTS32+", a second phase makes a liquid below it chargeable", false)
	add("FilterResidenceFactor", l.FilterResidenceFactor, "1", srcTS32+", filters (3 relaxation times leave 5 % of the charge)", true)
	add("FilterResidenceMax", l.FilterResidenceMax, "s", srcTS32+", filters", true)
	add("FilterChargeFactor", l.FilterChargeFactor, "1", "micro-filters raise the charge 10-100 times; upper end taken", true)
	add("StrainerChargeFactor", l.StrainerChargeFactor, "1", "coarse strainers add little charge to a pipe's", true)
	add("SecondPhaseChargeFactor", l.SecondPhaseChargeFactor, "1", srcChoice+": an order of magnitude for free water, solids or a second liquid", true)
	add("EarthingContradictionFactor", l.EarthingContradictionFactor, "1", srcChoice+": a measured potential more than an order of magnitude above what the measured earthing allows under the worst-case charging current (I R) contradicts the earthing path", false)
	add("SparkSurface", l.SparkSurface, "ohm", "ESD Association material classes: dissipative 1e5 to < 1e12 ohm/sq (reference section 6); a surface below it, or of dissipative class, sparks when not earthed (IEC TS 60079-32-1 principle: conductors must be earthed)", false)
	add("CoronaEnergy", l.CoronaEnergy, "J", "screening choice of this tool: corona is below about 0.1-1 mJ and ignites only very sensitive gases such as hydrogen (reference section 3, < 1 mJ confirmed, the rest from memory); the lower end is taken as its equivalent energy and compared only with an MIE below it, so IIA and IIB atmospheres (MIE >= 0.14 mJ for the usual gases) are not judged on corona", true)
	add("CoatingThickness", l.CoatingThickness, "m", src0+" coatings on earthed metal (IIA, IIB), with a breakdown voltage of at most 4 kV measured on the layer (the 4 kV condition confirmed in the 2017 foreword)", true)
	add("CoatingThicknessIIC", l.CoatingThicknessIIC, "m", src0+" coatings on earthed metal (IIC), with a breakdown voltage of at most 4 kV measured on the layer", true)
	return out
}
