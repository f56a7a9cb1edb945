package assess

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// ErrUncertaintyValue is the cause of a Site item that names an uncertainty but
// whose value cannot be used.
var ErrUncertaintyValue = errors.New("unusable uncertainty value")

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
		{UncCapacitanceEstimated, "Capacitance, estimated", "uncertainty estimated capacitance", "factor", LogNormal, ln(3) / z95, "size-table and typical values against real surroundings, a factor of about 3 either way (reference section 12), read as a range: about 95 % of draws within ×/÷ 3, so the standard deviation of ln C is ln 3 / 1.96: " + documentedChoice, false},
		{UncCapacitancePerson, "Capacitance of a person, estimated", "uncertainty person capacitance", "factor", LogNormal, ln(1.5) / z95, "the human body is 100-300 pF (reference section 2, Saito 1963, from memory) about the 200 pF used: about 95 % of draws within ×/÷ 1.5 (133-300 pF), so at most about 15 mJ at 10 kV (TRGS 727, reference section 10.3): " + documentedChoice, false},
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

// UncertaintiesFromSite returns base with the rows the Site sheet's items
// override. An item is written "Uncertainty field [%]" (the unit optional: the
// row's Unit when absent; the value may carry its own, "0.5 decades"). A normal
// relative row takes %; an absolute length row mm, cm or m; humidity %RH; a
// log-normal row % (a standard uncertainty of ±x % is a factor 1 + x/100),
// decades or factor. 0 turns the row off (so does a factor of 1). An item that names a row but whose
// value cannot be used is an Error and the row keeps its base value. Items
// that start with "uncertainty" but name no row are Warnings. Other items are
// left to LimitsFromSite.
func UncertaintiesFromSite(site inventory.Site, base []Uncertainty) ([]Uncertainty, []inventory.Problem) {
	out := append([]Uncertainty(nil), base...)
	var probs []inventory.Problem
	for _, it := range site.Items {
		name, keyUnit := siteItemName(it)
		if !isUncertaintyItem(name) {
			continue
		}
		var u *Uncertainty
		for i := range out {
			if out[i].SiteKey == name {
				u = &out[i]
				break
			}
		}
		if u == nil {
			probs = append(probs, siteItemProblem(it, "A", inventory.Warning, fmt.Sprintf("item %q names no uncertainty; it is ignored", it.Item), "use one of the uncertainty items listed on the Method sheet (e.g. \"Uncertainty field [%]\")", ErrUnknownSiteItem))
			continue
		}
		v, err := parseSpread(it.Value, keyUnit, u)
		if err != nil {
			probs = append(probs, siteItemProblem(it, "B", inventory.Error, fmt.Sprintf("uncertainty %q: %v; the default %s is kept", it.Item, err, u.Text()), fmt.Sprintf("give a number >= 0 in %s, e.g. \"%s [%s] = 10\"", u.Unit, it.Item, u.Unit), fmt.Errorf("%w: %w", ErrUncertaintyValue, err)))
			continue
		}
		u.Spread, u.Overridden = v, true
		if unit := spreadUnit(it.Value, keyUnit); u.Dist == LogNormal && unit != "" {
			u.Unit = unit // shown in the unit it was written in
		}
	}
	return out, probs
}

// isUncertaintyItem reports whether a normalised Site item name is an uncertainty item.
func isUncertaintyItem(name string) bool {
	return name == "uncertainty" || strings.HasPrefix(name, "uncertainty ")
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

// spreadUnit is the canonical unit the value or the item names ("%", "decades", "factor").
func spreadUnit(raw, keyUnit string) string {
	_, u := splitValue(raw)
	if u == "" {
		u = keyUnit
	}
	switch canonSpreadUnit(u) {
	case "%":
		return "%"
	case "dec":
		return "decades"
	case "x":
		return "factor"
	}
	return ""
}

func canonSpreadUnit(u string) string {
	u = strings.ToLower(strings.TrimSpace(u))
	switch u {
	case "%", "percent", "pct":
		return "%"
	case "decade", "decades", "dec":
		return "dec"
	case "factor", "x", "×":
		return "x"
	case "mm", "cm", "m":
		return u
	case "%rh", "% rh", "rh":
		return "%rh"
	}
	return u
}

func splitValue(raw string) (string, string) {
	raw = strings.TrimSpace(raw)
	if i := strings.IndexFunc(raw, func(r rune) bool {
		return !(r >= '0' && r <= '9' || r == '.' || r == 'e' || r == 'E' || r == '+' || r == '-')
	}); i >= 0 {
		return strings.TrimSpace(raw[:i]), strings.TrimSpace(raw[i:])
	}
	return raw, ""
}

// parseSpread reads a Site value into the row's internal spread.
func parseSpread(raw, keyUnit string, u *Uncertainty) (float64, error) {
	num, valUnit := splitValue(raw)
	if num == "" {
		return 0, errors.New("no value given")
	}
	v, err := strconv.ParseFloat(num, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", raw)
	}
	if !(v >= 0) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a finite value >= 0", raw)
	}
	unit := u.Unit
	switch {
	case valUnit != "":
		unit = valUnit
	case keyUnit != "":
		unit = keyUnit
	}
	cu := canonSpreadUnit(unit)
	bad := fmt.Errorf("unit %q does not fit %s (want %s)", unit, strings.ToLower(u.Name), u.Unit)
	switch u.Dist {
	case NormalRelative:
		if cu != "%" {
			return 0, bad
		}
		return v / 100, nil
	case NormalAbsolute:
		if u.Unit == "%RH" {
			if cu != "%rh" && cu != "%" {
				return 0, bad
			}
			return v, nil
		}
		f, ok := map[string]float64{"mm": 1e-3, "cm": 1e-2, "m": 1}[cu]
		if !ok {
			return 0, bad
		}
		return v * f, nil
	}
	switch cu {
	case "%":
		return math.Log1p(v / 100), nil
	case "dec":
		return v * math.Ln10, nil
	case "x":
		if v == 0 {
			return 0, nil // off, as for the other units
		}
		if v < 1 {
			return 0, fmt.Errorf("a factor must be at least 1, got %q", raw)
		}
		return math.Log(v), nil
	}
	return 0, bad
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
