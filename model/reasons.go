package model

import (
	"fmt"
	"math"
	"strings"
)

// Reason codes of Discharge.Code and Evaluation.BagCode. Text formats each as one
// sentence quoting the numbers A and B of the result.
const (
	ReasonNone Reason = iota
	ReasonNotApplicable
	ReasonNotEvaluated

	ReasonSparkInsulator
	ReasonSparkPossible     // A potential (V), B energy (J)
	ReasonSparkBelowPaschen // A potential (V), B floor (V)
	ReasonSparkNoContainer
	ReasonSparkBagEarthed // A resistance (ohm), B limit (ohm)
	ReasonSparkBagNoConductor
	ReasonSparkBagD

	ReasonBrushConductor
	ReasonBrushLeaks         // A surface resistivity (ohm/sq)
	ReasonBrushBelowScreen   // A density, B screen (C/m^2)
	ReasonBrushPossible      // A density, B screen (C/m^2)
	ReasonBrushLiquidSurface // A conductivity, B low limit (S/m)
	ReasonBrushLiquidUnknown
	ReasonBrushLiquidRelaxes // A conductivity, B low limit (S/m)
	ReasonBrushBagFabric
	ReasonBrushBagProtected

	ReasonPropNoLayer
	ReasonPropThick        // A thickness, B limit (m)
	ReasonPropLowBreakdown // A breakdown voltage, B limit (V)
	ReasonPropBelowDensity // A density, B needed (C/m^2)
	ReasonPropPossible     // A density (C/m^2), B energy (J)
	ReasonPropBagA         // A energy (J)
	ReasonPropBagB         // A fabric breakdown (V)

	ReasonCoronaOnset      // A onset potential (V), B radius (m)
	ReasonCoronaBelowOnset // A potential, B onset (V)
	ReasonCoronaBagD

	ReasonConeLowResistivity // A resistivity, B limit (ohm m)
	ReasonConeLowCharge      // A q/m, B limit (C/kg)
	ReasonConeSmallVessel    // A volume, B limit (m^3)
	ReasonConeLowField       // A field, B limit (V/m)
	ReasonConePossible       // A silo diameter, B particle size (m)
	ReasonConeOutsideRange   // A silo diameter, B particle size (m)
	ReasonConeSizeUnknown

	ReasonBagAllowed
	ReasonBagCAllowedIfEarthed
	ReasonBagUnknownAllowed
	ReasonBagUnknownNotAllowed
	ReasonBagNotForBand
	ReasonBagNotForGas
	ReasonBagNeverIIC
	ReasonBagNeverZone0or20
	ReasonBagBelowQualifiedMIE

	// Insulating surfaces (appended).
	ReasonSparkSurface             // A potential (V), B energy (J)
	ReasonSparkSurfaceEarthed      // A resistance (ohm, NaN: earthed backing), B limit (ohm)
	ReasonBrushReadingOverHumidity // A density, B screen (C/m^2)
	ReasonPropReadingOverHumidity  // A density, B needed (C/m^2)
	ReasonPropCurrentDensity       // A charging current density, B threshold (A/m^2)
	ReasonPropPneumatic            // A energy (J)
	// Added with the rules of issue 11 (codes only appended).
	ReasonSparkEarthedBound   // A bound on the potential (V), B resistance (ohm)
	ReasonBrushPowder         // A equivalent energy (J)
	ReasonBrushPowderNoCharge //
	ReasonConeFieldAndVessel  // A field (V/m), B volume (m^3)
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	ReasonSparkInsulatingVessel
	ReasonSparkLiquidIsolated // A potential (V), B energy (J)
	ReasonBrushLiquidCompliant
	ReasonBrushLiquidBreach // A conductivity (S/m; NaN unknown)
	ReasonBrushLiquidNoSafeLimits
	// Added with the review fixes (codes only appended).
	ReasonPropReadingOverBreakdown // A voltage across the layer, B measured breakdown (V)
	ReasonCoronaIgnites            // A corona equivalent energy bound (J), B MIE (J)
	ReasonConeAboveRange           // A silo diameter, B particle size (m)
	ReasonSparkReadingAboveMaximum // A measured potential, B realistic maximum used (V)
	ReasonCoronaBagC               // A corona equivalent energy bound (J)

	numReasons
)

// BagFabricBreakdown is the fabric breakdown voltage below which a type B bag is
// made (6 kV, IEC 61340-4-4:2018), which prevents propagating brush discharges.
const BagFabricBreakdown = 6e3

// Reason returns the one-sentence reason of the screening result.
func (d Discharge) Reason() string { return d.Code.Text(d.A, d.B) }

// Text formats the reason as one sentence quoting the numbers a and b (their
// meaning per code is given beside the Reason constants).
func (r Reason) Text(a, b float64) string {
	switch r {
	case ReasonNone:
		return ""
	case ReasonNotApplicable:
		return "Does not arise for this kind of object."
	case ReasonNotEvaluated:
		return "Not evaluated: the inputs it needs are missing."
	case ReasonSparkInsulator:
		return "An insulating surface holds no free charge that could spark."
	case ReasonSparkPossible:
		return fmt.Sprintf("An isolated conductor at %s can spark with W = C V²/2 = %s.", Quantity(a, "V"), Quantity(b, "J"))
	case ReasonSparkBelowPaschen:
		return fmt.Sprintf("The potential %s is below the %s any air gap needs to break down.", Quantity(a, "V"), Quantity(b, "V"))
	case ReasonSparkNoContainer:
		return "The receiving container's Resistance to earth and Capacitance are not on this row: assess the container as its own row."
	case ReasonSparkBagEarthed:
		return fmt.Sprintf("The type C bag is earthed through %s (limit %s): no spark.", Quantity(a, "ohm"), Quantity(b, "ohm"))
	case ReasonSparkBagNoConductor:
		return "A type A or B bag has no conductive parts that could spark."
	case ReasonSparkBagD:
		return "A type D bag has no earthed parts and sheds its charge by corona: no spark."
	case ReasonBrushConductor:
		return "A conductor discharges by spark, not by brush."
	case ReasonBrushLeaks:
		return fmt.Sprintf("The surface is dissipative at this humidity (%s per square) and earthed, so it does not keep its charge.", Quantity(a, "ohm"))
	case ReasonBrushBelowScreen:
		return fmt.Sprintf("The charge density %s is at or below the brush screen %s of the group.", Quantity(a, "C/m^2"), Quantity(b, "C/m^2"))
	case ReasonBrushPossible:
		return fmt.Sprintf("The charge density %s exceeds the brush screen %s; the brush equivalent energy applies.", Quantity(a, "C/m^2"), Quantity(b, "C/m^2"))
	case ReasonBrushLiquidSurface:
		return fmt.Sprintf("A low-conductivity liquid (%s, class limit %s) keeps charge on its surface: brush discharges to the fittings are possible.", Quantity(a, "S/m"), Quantity(b, "S/m"))
	case ReasonBrushLiquidUnknown:
		return "The conductivity is not given, so the liquid is taken as low-conductivity: brush discharges from its surface are possible."
	case ReasonBrushLiquidRelaxes:
		return fmt.Sprintf("The conductivity %s is above %s: the liquid's charge relaxes to the container.", Quantity(a, "S/m"), Quantity(b, "S/m"))
	case ReasonBrushBagFabric:
		return "The insulating fabric of a type A or B bag can give brush discharges."
	case ReasonBrushBagProtected:
		return "Type C and D fabrics are made so that brush discharges are not expected."
	case ReasonPropNoLayer:
		return "No earthed backing and no charging process that builds a double layer (pneumatic conveying, or a charging current density above about 1 mA/m²): no propagating brush."
	case ReasonPropThick:
		return fmt.Sprintf("The layer thickness %s is at or above %s: no propagating brush expected.", Quantity(a, "m"), Quantity(b, "m"))
	case ReasonPropLowBreakdown:
		return fmt.Sprintf("The layer breakdown voltage %s is at or below %s: the layer breaks down before a propagating brush can build.", Quantity(a, "V"), Quantity(b, "V"))
	case ReasonPropBelowDensity:
		return fmt.Sprintf("The layer could support a propagating brush, but the charge density %s is below the %s it needs.", Quantity(a, "C/m^2"), Quantity(b, "C/m^2"))
	case ReasonPropPossible:
		return fmt.Sprintf("A charge density of %s on a thin backed or double-charged layer can discharge as a propagating brush (upper estimate %s).", Quantity(a, "C/m^2"), Quantity(b, "J"))
	case ReasonPropBagA:
		return fmt.Sprintf("Type A fabric has no breakdown-voltage limit: propagating brush discharges are possible at high charging rates (taken as %s).", Quantity(a, "J"))
	case ReasonPropBagB:
		return fmt.Sprintf("Type B fabric breaks down below %s: no propagating brush.", Quantity(a, "V"))
	case ReasonCoronaOnset:
		return fmt.Sprintf("The potential is capped at the corona onset %s for a radius of %s; corona, well below 1 mJ, ignites only the most sensitive gases.", Quantity(a, "V"), Quantity(b, "m"))
	case ReasonCoronaBelowOnset:
		if b > coronaShownMax {
			// A smooth body of large radius: its onset (MV) is no potential a plant
			// conductor reaches, so it is not quoted.
			return fmt.Sprintf("The potential %s stays below the corona onset of the object's radius (above %s: the body itself does not go into corona; its edges and bolts may).", Quantity(a, "V"), Quantity(coronaShownMax, "V"))
		}
		return fmt.Sprintf("The potential %s stays below the corona onset %s.", Quantity(a, "V"), Quantity(b, "V"))
	case ReasonCoronaBagD:
		return "Type D bags discharge by corona, well below 1 mJ; keep the surface dry and clean and earthed conductors nearby."
	case ReasonConeLowResistivity:
		return fmt.Sprintf("The bulk resistivity %s is below %s: the heap leaks its charge.", Quantity(a, "ohm m"), Quantity(b, "ohm m"))
	case ReasonConeLowCharge:
		return fmt.Sprintf("The charge-to-mass ratio %s is below %s: no cone discharge expected.", Quantity(a, "C/kg"), Quantity(b, "C/kg"))
	case ReasonConeSmallVessel:
		return fmt.Sprintf("The container volume %s is below %s: no cone discharge expected.", Quantity(a, "m^3"), Quantity(b, "m^3"))
	case ReasonConeLowField:
		return fmt.Sprintf("The measured heap-surface field %s is at or below %s: no cone discharge expected.", Quantity(a, "V/m"), Quantity(b, "V/m"))
	case ReasonConePossible:
		return fmt.Sprintf("Cone discharge energy by Glor's formula W = 5.22 D^3.36 d^1.462 mJ with D = %s and d = %s.", Quantity(a, "m"), Quantity(b, "m"))
	case ReasonConeOutsideRange:
		return fmt.Sprintf("Glor's formula is outside its range (D 0.5-3 m, d 0.1-3 mm) for D = %s and d = %s: the energy is taken at the nearest edge of the range, never less.", Quantity(a, "m"), Quantity(b, "m"))
	case ReasonConeAboveRange:
		return fmt.Sprintf("Glor's formula is not valid beyond D = 3 m or d = 3 mm (here D = %s, d = %s): the energy shown is the value at the edge of the range, a lower bound (the energy rises with D and d), so it never clears on its own.", Quantity(a, "m"), Quantity(b, "m"))
	case ReasonConeSizeUnknown:
		return "A cone discharge is possible, but the silo diameter or the particle size is missing: its energy is unknown."
	case ReasonBagAllowed:
		return "This bag type may be used with this product in these surroundings."
	case ReasonBagCAllowedIfEarthed:
		return "Type C may be used here only while earthed: tab to earth below 1 MΩ, every point to the tab below 100 MΩ."
	case ReasonBagUnknownAllowed:
		return "The bag type is not given: assessed as type A, which may be used here (non-flammable surroundings, product above 1000 mJ)."
	case ReasonBagUnknownNotAllowed:
		return "The bag type is not given: assessed as type A, which may not be used here."
	case ReasonBagNotForBand:
		return "This bag type may not be used with a product of this MIE in these surroundings."
	case ReasonBagNotForGas:
		return "Only types C and D may be used with flammable gas or vapour (zones 1 and 2, groups IIA and IIB)."
	case ReasonBagNeverIIC:
		return "No bag type is qualified for group IIC gases."
	case ReasonBagNeverZone0or20:
		return "No bag type is qualified for zone 0 or zone 20."
	case ReasonBagBelowQualifiedMIE:
		return "Types C and D are qualified only for an MIE at or above 0.14 mJ."
	case ReasonSparkSurface:
		return fmt.Sprintf("The surface conducts (dissipative or conductive) but is not earthed: as an isolated conductor at %s it can spark with W = C V²/2 = %s.", Quantity(a, "V"), Quantity(b, "J"))
	case ReasonSparkSurfaceEarthed:
		if math.IsNaN(a) {
			return "The conducting surface lies on earthed metal: no spark."
		}
		return fmt.Sprintf("The conducting surface is earthed through %s (limit %s): no spark.", Quantity(a, "ohm"), Quantity(b, "ohm"))
	case ReasonBrushReadingOverHumidity:
		return fmt.Sprintf("The reading gives %s, above the brush screen %s, although the humidity model finds the surface dissipative and earthed: the reading stands (a measurement beats the model).", Quantity(a, "C/m^2"), Quantity(b, "C/m^2"))
	case ReasonPropReadingOverHumidity:
		return fmt.Sprintf("The reading gives %s, at or above the %s a propagating brush needs, although the humidity model finds the surface dissipative and earthed: the reading stands.", Quantity(a, "C/m^2"), Quantity(b, "C/m^2"))
	case ReasonPropCurrentDensity:
		return fmt.Sprintf("The charging current density %s exceeds about %s: the process can charge the layer to a propagating brush whatever a field meter reads (BG RCI FAQ 1.12).", Quantity(a, "A/m^2"), Quantity(b, "A/m^2"))
	case ReasonPropPneumatic:
		return fmt.Sprintf("Pneumatic conveying through or over an insulating pipe, hose or liner can build a double layer that gives propagating brush discharges (from memory; taken at its upper estimate %s).", Quantity(a, "J"))
	case ReasonSparkEarthedBound:
		return fmt.Sprintf("No charging mechanism is on the row; earthed through %s, even the worst-case industrial 100 µA would hold it at %s, below the spark floor.", Quantity(b, "ohm"), Quantity(a, "V"))
	case ReasonBrushPowder:
		return fmt.Sprintf("The charged powder, its cloud and its sack or liner can give brush discharges (equivalent energy %s); they ignite gases, vapours and hybrid mixtures (IEC TS 60079-32-1).", Quantity(a, "J"))
	case ReasonBrushPowderNoCharge:
		return "The row shows the powder does not charge (charge-to-mass or charging current of zero): no brush discharge from it."
	case ReasonConeFieldAndVessel:
		return fmt.Sprintf("The measured heap-surface field %s is at or below 500 kV/m and the container (%s) is below 0.25 m³: no cone discharge expected (JNIOSH-TR, both conditions together).", Quantity(a, "V/m"), Quantity(b, "m^3"))
	case ReasonSparkReadingAboveMaximum:
		return fmt.Sprintf("The reading of %s is beyond what air lets a plant conductor or body hold (it goes into corona first; common practice, no source: plant conductors go into corona from edges and bolts at tens of kV): the spark is taken at the realistic maximum of %s, W = C V²/2, so that the energy and ranking do not rest on an artefact; check the meter, its range and unit.", Quantity(a, "V"), Quantity(b, "V"))
	case ReasonCoronaBagC:
		return fmt.Sprintf("The conductive threads of a type C bag are sharp electrodes that go into corona as the fabric charges (earthed, that is how the bag sheds its charge, IEC 61340-4-4): corona is counted at its equivalent energy bound of %s; it ignites only very sensitive gases such as hydrogen (below 1 mJ confirmed, hydrogen only from memory), for which no bag type is qualified.", Quantity(a, "J"))
	case ReasonSparkInsulatingVessel:
		return "A low-conductivity liquid in an insulating vessel is no conductor: no spark from it (its surface is judged by the filling rules)."
	case ReasonSparkLiquidIsolated:
		return fmt.Sprintf("The conductive liquid in an insulating, lined or unearthed vessel is an isolated conductor at %s and can spark with W = C V²/2 = %s.", Quantity(a, "V"), Quantity(b, "J"))
	case ReasonBrushLiquidCompliant:
		return "The fill meets every applicable filling clause of IEC TS 60079-32-1 for its vessel: no incendive brush from the liquid surface is expected (earthing still applies)."
	case ReasonBrushLiquidBreach:
		if math.IsNaN(a) {
			return "The conductivity is not given, so the liquid is taken as low-conductivity, and a filling clause is not met: brush discharges from its surface are possible."
		}
		return fmt.Sprintf("A low-conductivity liquid (%s for the filling rules) keeps charge on its surface and a filling clause is not met: brush discharges from its surface are possible.", Quantity(a, "S/m"))
	case ReasonPropReadingOverBreakdown:
		return fmt.Sprintf("The reading shows the layer holding %s, above its measured breakdown of %s: the reading is kept (a measurement beats the other value), so the propagating brush stays counted (possible once the layer holds more than about 4 kV, BG RCI FAQ 1.12); check the breakdown measurement and the reading.", Quantity(a, "V"), Quantity(b, "V"))
	case ReasonCoronaIgnites:
		return fmt.Sprintf("Corona (from a sharp point or edge, or a type D bag), taken at its equivalent energy bound of %s (a screening choice: corona is below about 0.1-1 mJ), can ignite this atmosphere of MIE %s: only very sensitive gases such as hydrogen are ignited by corona.", Quantity(a, "J"), Quantity(b, "J"))
	case ReasonBrushLiquidNoSafeLimits:
		return "A low-conductivity liquid filled into an insulating vessel: the standard gives no safe filling limits for it, so brush discharges from its surface are counted."
	}
	return "Unknown reason."
}

// unitSpelling writes a unit code ("ohm", "C/m^2") as the audit spells it
// ("Ω", "C/m²"): one spelling of Ω, µ, ² and ³ in every output.
var unitSpelling = strings.NewReplacer("ohm m", "Ω·m", "ohm", "Ω", "^2", "²", "^3", "³")

// Quantity formats an SI value with an engineering prefix and its unit, three
// significant figures: Quantity(4e-3, "J") is "4 mJ", Quantity(2.5e-4,
// "C/m^2") is "250 µC/m²"; NaN is "unknown". The unit may be given in ASCII
// ("ohm", "^2"); it is written as the audit spells it.
func Quantity(v float64, unit string) string {
	if math.IsNaN(v) {
		return "unknown"
	}
	code := unit
	unit = unitSpelling.Replace(unit)
	if v == 0 || math.IsInf(v, 0) {
		return fmt.Sprintf("%g %s", v, unit)
	}
	prefixes := []struct {
		f float64
		p string
	}{{1e12, "T"}, {1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1, ""}, {1e-3, "m"}, {1e-6, "µ"}, {1e-9, "n"}, {1e-12, "p"}, {1e-15, "f"}}
	if code == "m" || code == "m^3" || code == "ohm m" {
		// Lengths, volumes and resistivities read better without prefixes
		// (mm is fine, but Mohm m and km are rare in the trade).
		if code == "m" && math.Abs(v) < 1 {
			return fmt.Sprintf("%.3g mm", v*1e3)
		}
		return fmt.Sprintf("%.3g %s", v, unit)
	}
	a := math.Abs(v)
	for _, p := range prefixes {
		if a >= p.f*0.9995 {
			return fmt.Sprintf("%.3g %s%s", v/p.f, p.p, unit)
		}
	}
	return fmt.Sprintf("%.3g %s", v, unit)
}

// coronaShownMax is the largest corona onset (V) a reason quotes: above it the
// onset of a large smooth body is far beyond the potentials plant conductors
// reach (reference section 12: tens of kV), and only the bound is said.
const coronaShownMax = 100e3

// Potential sources, as recorded in Evaluation.PotentialSource.
const (
	PotentialNone       PotentialSource = iota // no potential
	PotentialMeasured                          // Surface potential on the row
	PotentialFromField                         // V = E z from the field reading
	PotentialCharging                          // V(t) = I R (1 - exp(-t/RC))
	PotentialFromCharge                        // V = sigma A / C, an unearthed conducting surface (appended)
)

// String says where the potential came from.
func (p PotentialSource) String() string {
	switch p {
	case PotentialMeasured:
		return "measured"
	case PotentialFromField:
		return "from the field reading between the earthed meter and the earthed backing or floor (V = E z, parallel-plate split)"
	case PotentialFromCharge:
		return "from the charge the reading shows on the conducting surface (V = sigma A / C)"
	case PotentialCharging:
		return "from charging (V = I R (1 - exp(-t/RC)))"
	}
	return "none"
}

// Assumptions: the defaults the model applied.
const (
	AssumedCapacitance Assumption = 1 << iota
	AssumedNotEarthed
	AssumedSteadyState
	AssumedWalkingCurrent
	AssumedMaxCurrent
	AssumedTemperature
	AssumedNoCoronaCap
	AssumedLayerPermittivity
	AssumedPlatePermittivity
	AssumedInfiniteSheet
	AssumedDissipativeClass
	AssumedBreakdownUnknown
	AssumedPropagatingArea
	AssumedThinLayer
	AssumedHighResistivity
	AssumedConeCharge
	AssumedLowConductivity
	AssumedLiquidPermittivity
	AssumedBagTypeA
	AssumedBagCurrent
	AssumedProductMIE
	AssumedProductMIEUnknown
	AssumedEquipmentSurface
	AssumedOverEarthFree
	AssumedStricterGeometry
	AssumedSurfaceCapacitanceFree
	AssumedGroupIIC
	AssumedVesselSize
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	AssumedVesselMaterial
	AssumedVesselClass
	AssumedVesselCapacitance
	AssumedNoFilter
	AssumedNoSecondPhase
	AssumedInletVelocity
	AssumedFilterResidence
	AssumedElectrodeDraw
	AssumedFreeSheetLowerBound
	numAssumptions = iota
)

// assumptionTexts returns the texts of the set's bits, in bit order (a table, not state).
func assumptionTexts() [numAssumptions]string {
	return [numAssumptions]string{
		"capacitance not measured: estimated (see the capacitance model)",
		"resistance to earth not given: taken as not earthed (no leakage)",
		"charging time not given: steady-state potential I R",
		"charging current of a walking person taken as 1 µA (Jonassen)",
		"charging current not given: the worst-case industrial 100 µA (JNIOSH-TR)",
		"air temperature not given: 20 °C",
		"size not given: potential not capped at corona onset",
		"layer permittivity not given: 3 (common polymers)",
		"permittivity of the layer under the container not given: 2 (dry wood)",
		"sheet size not given: taken as infinite (sigma = 2 eps0 E, a lower bound)",
		"surface resistivity not given: the material's dissipative class does not count as dissipative for clearing (give the surface resistivity at 50 %RH); a spark is assessed if it is not earthed",
		"layer breakdown voltage not measured: taken above 4 kV (thin films hold 100-600 kV/mm; a bulk strength never clears)",
		"insulating area not given: propagating brush energy taken at its upper bound",
		"double-layer thickness not given: taken as thin",
		"powder volume resistivity not given: taken as high (>= 1e10 Ω·m)",
		"powder charge not given: cone discharge taken as possible",
		"liquid conductivity not given: taken as low",
		"liquid permittivity not given: 2",
		"bag type not given: assessed as type A, the most restrictive case",
		"charging current not given: the 3 µA the bag qualification assumes",
		"product MIE not given: the station's dust MIE",
		"product MIE not given: the most sensitive band (<= 3 mJ)",
		"not recognised as process material (no Process, no Speed): a fixed equipment surface, held to the insulating-area limit (the stricter reading)",
		"distance to earth not small against the sheet: the parallel-plate split is outside its range, the free finite sheet is used",
		"two geometries are plausible: the stricter (larger charge density) is used",
		"capacitance of the conducting surface not measured: the isolated disc of equal area (8 eps0 r), the smaller and so stricter estimate for a charge read on it",
		"gas group not given: assessed as IIC, the strictest group",
		"vessel size not given: the largest class of the size table (1000 pF)",
		"vessel material not given: the stricter of metal (unearthed, can spark) and insulating (no safe filling limits) taken",
		"vessel class not given: the strictest class's filling limits, and the typical capacitance of the class that gives the largest spark energy",
		"capacitance not measured: the typical value of the vessel class (from memory)",
		"filter not stated: a fine filter with no residence time after it taken (the stricter case; write none for a plain line)",
		"second phase not stated: taken as present (the stricter case; write none when there is none)",
		"inlet velocity until submerged not given: the slow start is not shown met",
		"residence time after the filter not given: none taken",
		"layer on earthed metal read by field: its brush screened on the most an earthed electrode could draw before air breaks down, min(sigma, eps0 Eb), not on the air-side charge the meter sees (the electrode's approach is unknown: the stricter case; the same as for the surface potential E z)", "distance to earth not given: the free sheet of the object's size taken, the lowest charge density the Surface potential can mean (sigma >= V C_free / A, C_free = 8 eps0 r of the disc of equal area, textbook): it can show a brush, never clear one",
	}
}

// Texts lists the assumptions in the set, in a fixed order (allocates; call on demand).
func (a Assumption) Texts() []string {
	t := assumptionTexts()
	return bitTexts(uint64(a), t[:])
}

// Flags: what the model noticed.
const (
	FlagSuspectReading Flag = 1 << iota
	FlagCappedCorona
	FlagCappedPerson
	FlagConeOutsideRange
	FlagPropagatingLayer
	FlagSlowDecay
	FlagShock
	FlagVelocityAboveLimit
	FlagSplashFilling
	FlagBagNotEarthed
	FlagBagCurrentAboveQualified
	FlagBreakdownContradiction
	FlagHumidityContradiction
	FlagCappedConductor
	FlagAssumedResistance
	FlagMeasuredAboveMaximum
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	FlagSecondPhaseLow
	// Contradictions (appended with the follow-up checks).
	FlagEarthingContradiction
	FlagReadingAboveBreakdown
	// Review fixes (appended).
	FlagConeAboveRange
	// Review 3 (appended).
	FlagAssumedCurrent
	numFlags = iota
)

// flagTexts returns the texts of the set's bits, in bit order (a table, not state).
func flagTexts() [numFlags]string {
	return [numFlags]string{
		"reading beyond what air can hold: check the reading and its unit",
		"potential capped at the corona onset of the conductor's radius",
		"body potential capped at the documented walking-test maximum",
		"Glor's formula outside its validity range (D 0.5-3 m, d 0.1-3 mm): the value at the nearest edge of the range used",
		"the layer can support a propagating brush if charged to 2.5e-4 C/m²",
		"the dissipative surface decays more slowly than it reaches the hazard",
		"stored energy above the shock threshold",
		"flow velocity above the filling limit",
		"top (splash) filling of a low-conductivity liquid",
		"type C bag not earthed (tab to earth unknown or above the limit)",
		"charging current above the 3 µA the type C/D qualification assumes",
		"the layer holds a voltage above its measured breakdown voltage, or above what any film of its thickness holds: check the reading and its unit, the thickness and the breakdown value",
		"the reading shows charge above the screen although the humidity model finds the surface dissipative and earthed: the reading stands; check the surface resistivity at this RH, the earthing and the reading",
		"unmeasured potential capped at the realistic plant maximum (corona from edges and bolts; common practice, no source)",
		"potential estimated with the resistance to earth unknown (no leakage): the energy is set by that assumption; measure the resistance or the potential",
		"measured potential above the realistic plant maximum: check the reading, its unit and the object",
		"a second phase (stated, or not stated and so taken as present) below 1000 pS/m: the filling rules for low-conductivity liquids apply",
		"measured potential far above what the measured earthing allows under the worst-case charging current: the earthing path or the reading is wrong; the reading is kept",
		"reading above what air can hold at the surface: the charge density is capped at the breakdown limit; check the meter's distance, unit and range",
		"silo diameter or particle size above Glor's range: formula not valid there, the edge value is a lower bound (never a clearance)",
		"conductor not earthed within the limit with no charging current and no potential on its row: the worst-case industrial charging current taken through its resistance to earth (the stricter case): the energy is set by that assumption; measure the potential in operation or the charging current",
	}
}

// Texts lists the flags in the set, in a fixed order (allocates; call on demand).
func (f Flag) Texts() []string {
	t := flagTexts()
	return bitTexts(uint64(f), t[:])
}

// Missing inputs.
const (
	MissingKind Missing = 1 << iota
	MissingSurfaceReading
	MissingFieldDistance
	MissingThickness
	MissingSurfaceGeometry
	MissingConductorCharging
	MissingPersonPotential
	MissingConeSize
	MissingLiquidFlow
	MissingSurfaceSpark
	MissingDistanceToEarth
	numMissing = iota
)

// missingTexts returns the texts of the set's bits, in bit order (a table, not state).
func missingTexts() [numMissing]string {
	return [numMissing]string{
		"needs a known Kind",
		"needs Field with Field distance, or Surface potential",
		"needs Field distance for the Field reading",
		"needs Thickness of the layer on its earthed backing",
		"needs Backing earthed with Thickness, or Distance to earth, to use a Surface potential",
		"no charging mechanism on the row and not earthed within the limit: measure its Surface potential in operation, or its Charging current (or Mass flow and Charge-to-mass), and its Resistance to earth",
		"needs Surface potential or Resistance to earth",
		"needs Diameter and Particle size for the cone discharge energy",
		"needs Speed and Diameter of the line, or Charging current",
		"needs Surface potential, Length and Width, or Charging current to judge the spark of the unearthed conducting surface",
		"the free sheet's charge density, the lowest the Surface potential can mean, is below the brush screen, which a lower bound cannot clear: measure the Distance to earth (or give Backing earthed with Thickness) to judge the brush",
	}
}

// Texts lists what the object lacks, in a fixed order (allocates; call on demand).
func (m Missing) Texts() []string {
	t := missingTexts()
	return bitTexts(uint64(m), t[:])
}

func bitTexts(set uint64, texts []string) []string {
	var out []string
	for i, t := range texts {
		if set&(1<<i) != 0 {
			out = append(out, t)
		}
	}
	return out
}
