package assess

import (
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// UncertainInput names one group of measured inputs that share a default uncertainty.
type UncertainInput uint8

// The uncertain inputs, in the order of the uncertainty table.
const (
	// UncField: field-meter reading (Field).
	UncField UncertainInput = iota
	// UncFieldDistance: distance of the field reading (FieldDistance).
	UncFieldDistance
	// UncSurfacePotential: measured surface or body potential (SurfacePotential).
	UncSurfacePotential
	// UncResistance: resistance to earth (Resistance).
	UncResistance
	// UncCapacitanceMeasured: capacitance given on the row (Capacitance).
	UncCapacitanceMeasured
	// UncCapacitanceEstimated: capacitance the model estimated for a conductor
	// other than a person.
	UncCapacitanceEstimated
	// UncCapacitancePerson: a person's typical capacitance (200 pF) when not measured.
	UncCapacitancePerson
	// UncMIEDust: MIE of a dust or hybrid atmosphere.
	UncMIEDust
	// UncMIEGas: MIE of a gas, vapour or mist atmosphere.
	UncMIEGas
	// UncChargingCurrent: charging current (ChargingCurrent).
	UncChargingCurrent
	// UncMassFlow: mass flow (MassFlow).
	UncMassFlow
	// UncChargeToMass: charge-to-mass ratio (ChargeToMass).
	UncChargeToMass
	// UncSize: Length, Width, Diameter, Thickness, DistanceToEarth and ParticleSize.
	UncSize
	// UncSpeed: belt, web or liquid flow speed (Speed).
	UncSpeed
	// UncChargingTime: charging time (ChargingTime).
	UncChargingTime
	// UncConductivity: liquid conductivity (Conductivity).
	UncConductivity
	// UncRelativeHumidity: relative humidity of the station or site (absolute, %RH).
	UncRelativeHumidity
	// NumUncertainInputs is the number of uncertain inputs.
	NumUncertainInputs
)

// Distribution is the shape a sampled input is drawn from.
type Distribution uint8

// Distributions of the uncertainty table.
const (
	// NormalRelative: normal about the value, standard deviation Spread x |value|;
	// a draw of the wrong sign is reflected (a reading never changes sign).
	NormalRelative Distribution = iota
	// NormalAbsolute: normal about the value, standard deviation Spread in SI units
	// (%RH for humidity); a draw below zero is reflected (no negative distance),
	// humidity is also reflected at 100 %RH.
	NormalAbsolute
	// LogNormal: median the value, standard deviation of ln(value) Spread; the
	// value's sign is kept.
	LogNormal
)

// String names the distribution as on the Method sheet.
func (d Distribution) String() string {
	switch d {
	case NormalRelative:
		return "normal (relative)"
	case NormalAbsolute:
		return "normal (absolute)"
	}
	return "log-normal"
}

// Uncertainty is one row of the uncertainty table: the default spread of one
// group of inputs, used unless the survey cell gives its own ("12 kV ±10%").
type Uncertainty struct {
	Input UncertainInput
	Name  string // what it applies to, e.g. "Field reading"
	// SiteKey is the Site-sheet item that overrides it, without unit ("uncertainty field").
	SiteKey string
	// Unit is the unit of the Site item's value when none is written: "%",
	// "mm", "%RH", "decades" or "factor".
	Unit string
	Dist Distribution
	// Spread is the standard deviation: relative (NormalRelative), SI or %RH
	// (NormalAbsolute), or of the natural log (LogNormal). 0: not sampled.
	Spread float64
	// Note says why the default is what it is; every default is a documented
	// choice of this tool, not a standard value.
	Note string
	// Overridden records that the Site sheet set it.
	Overridden bool
}

// Text returns the spread in the row's unit: "±10 %", "±10 mm", "±0.5 decade", "×/÷ 2".
func (u Uncertainty) Text() string {
	switch u.Dist {
	case NormalRelative:
		return "±" + plain(u.Spread*100) + " %"
	case NormalAbsolute:
		if u.Unit == "%RH" {
			return "±" + plain(u.Spread) + " %RH"
		}
		return "±" + plain(u.Spread*1e3) + " mm"
	}
	switch u.Unit {
	case "decades":
		return "±" + plain(u.Spread/math.Ln10) + " decade"
	case "%":
		return "±" + plain((math.Exp(u.Spread)-1)*100) + " % (×/÷ " + plain(math.Exp(u.Spread)) + ")"
	}
	return "×/÷ " + plain(math.Exp(u.Spread)) + " (95 % band ×/÷ " + plain(math.Exp(z95*u.Spread)) + ")"
}

// CellSpread returns the spread a cell's relative standard uncertainty rel
// (0.10 for "±10%") stands for in this row's distribution: rel itself for a
// normal (an absolute row then becomes relative to the cell's value), ln(1 + rel)
// for a log-normal. It reports false when rel is not positive (no cell uncertainty).
func (u Uncertainty) CellSpread(rel float64) (Distribution, float64, bool) {
	if !(rel > 0) {
		return u.Dist, u.Spread, false
	}
	if u.Dist == LogNormal {
		return LogNormal, math.Log1p(rel), true
	}
	return NormalRelative, rel, true
}

const documentedChoice = "documented choice of this tool, not a standard value"

// z95 is the two-sided 95 % point of the normal distribution: a spread read
// as a range ("×/÷ 3") is taken as about a 95 % band, sigma = ln(factor) / z95.
const z95 = 1.959963984540054

// DefaultUncertainties returns the default uncertainty table, one row per
// UncertainInput in order. Every value is a documented choice (a typical
// field-survey spread), not a standard value; the Site sheet overrides any row.
func DefaultUncertainties() []Uncertainty {
	ln := math.Log
	return []Uncertainty{
		{UncField, "Field reading", "uncertainty field", "%", NormalRelative, 0.10, "hand-held field meter, calibration and placement: " + documentedChoice, false},
		{UncFieldDistance, "Reading distance", "uncertainty field distance", "mm", NormalAbsolute, 10e-3, "placing the meter by hand or by its spacer: " + documentedChoice, false},
		{UncSurfacePotential, "Surface or body potential", "uncertainty surface potential", "%", NormalRelative, 0.10, "electrostatic voltmeter reading: " + documentedChoice, false},
		{UncResistance, "Resistance to earth", "uncertainty resistance", "decades", LogNormal, 0.5 * math.Ln10, "contact, humidity and test voltage move a resistance by decades: " + documentedChoice, false},
		{UncCapacitanceMeasured, "Capacitance, measured", "uncertainty measured capacitance", "%", LogNormal, ln(1.10), "capacitance meter in place: " + documentedChoice, false},
		{UncCapacitanceEstimated, "Capacitance, estimated", "uncertainty estimated capacitance", "factor", LogNormal, ln(3) / z95, "size-table and typical values against real surroundings, a factor of about 3 either way (derived from the size table's spread), read as a range: about 95 % of draws within ×/÷ 3, so the standard deviation of ln C is ln 3 / 1.96: " + documentedChoice, false},
		{UncCapacitancePerson, "Capacitance of a person, estimated", "uncertainty person capacitance", "factor", LogNormal, ln(1.5) / z95, "the human body is 100-300 pF (Saito 1963; the 200 pF used from memory): about 95 % of draws within ×/÷ 1.5 (133-300 pF), so at most about 15 mJ at 10 kV (TRGS 727:2016 7.1: a person stores at most about 15 mJ): " + documentedChoice, false},
		{UncMIEDust, "MIE, dust or hybrid", "uncertainty mie dust", "factor", LogNormal, ln(2), "dust MIE varies with particle size, moisture and the test apparatus: " + documentedChoice, false},
		{UncMIEGas, "MIE, gas, vapour or mist", "uncertainty mie gas", "%", LogNormal, ln(1.20), "tabulated gas MIE at the most easily ignited mixture; spread between sources: " + documentedChoice, false},
		{UncChargingCurrent, "Charging current", "uncertainty charging current", "factor", LogNormal, ln(2), "charging currents are known to within a factor: " + documentedChoice, false},
		{UncMassFlow, "Mass flow", "uncertainty mass flow", "%", NormalRelative, 0.10, "process flow reading: " + documentedChoice, false},
		{UncChargeToMass, "Charge-to-mass ratio", "uncertainty charge to mass", "factor", LogNormal, ln(3), "powder charge varies by a factor with moisture and throughput: " + documentedChoice, false},
		{UncSize, "Sizes (length, width, diameter, thickness, distance to earth, particle size)", "uncertainty size", "%", NormalRelative, 0.05, "tape or drawing dimensions: " + documentedChoice, false},
		{UncSpeed, "Speed", "uncertainty speed", "%", NormalRelative, 0.05, "line or flow speed from the control system: " + documentedChoice, false},
		{UncChargingTime, "Charging time", "uncertainty charging time", "%", NormalRelative, 0.10, "duration of the operation: " + documentedChoice, false},
		{UncConductivity, "Liquid conductivity", "uncertainty conductivity", "factor", LogNormal, ln(2), "liquid conductivity changes with traces of water and additives: " + documentedChoice, false},
		{UncRelativeHumidity, "Relative humidity", "uncertainty relative humidity", "%RH", NormalAbsolute, 5, "hygrometer and day-to-day drift at the station: " + documentedChoice, false},
	}
}

// UncertaintiesFromSite returns base with the rows the Site sheet overrides
// (site.Uncertainties, validated by the inventory reader: an item is written
// "Uncertainty field [%]", see inventory.UncertaintyItems for the units each
// row takes; 0 turns the row off).
func UncertaintiesFromSite(site inventory.Site, base []Uncertainty) []Uncertainty {
	out := append([]Uncertainty(nil), base...)
	for _, su := range site.Uncertainties {
		for i := range out {
			u := &out[i]
			if u.SiteKey != su.Name {
				continue
			}
			u.Spread, u.Overridden = su.Spread, true
			if u.Dist == LogNormal && su.Unit != "" {
				u.Unit = su.Unit // shown in the unit it was written in
			}
			break
		}
	}
	return out
}

// UncertaintyKeys returns the Site-sheet items that override the uncertainty
// table, written as on the sheet: "Uncertainty field [%]".
func UncertaintyKeys() []string {
	var out []string
	for _, u := range DefaultUncertainties() {
		out = append(out, u.SiteItem())
	}
	return out
}

// SiteItem returns the Site-sheet item that overrides the row, as written on
// the sheet with its default unit: "Uncertainty field [%]".
func (u Uncertainty) SiteItem() string {
	if u.SiteKey == "" {
		return ""
	}
	name := strings.ReplaceAll(" "+u.SiteKey+" ", " mie ", " MIE ")
	return strings.ToUpper(name[1:2]) + strings.TrimSpace(name[2:]) + " [" + u.Unit + "]"
}

// uncertaintyTable indexes a table by input; rows missing from t take the default.
func uncertaintyTable(t []Uncertainty) [NumUncertainInputs]Uncertainty {
	var out [NumUncertainInputs]Uncertainty
	for _, u := range DefaultUncertainties() {
		out[u.Input] = u
	}
	for _, u := range t {
		if u.Input < NumUncertainInputs {
			out[u.Input] = u
		}
	}
	return out
}
