package inventory

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// The Site sheet's settings beyond its own items: limit overrides ("Shock
// energy [mJ] | 400") and uncertainty overrides ("Uncertainty field [%] |
// 15"). inventory owns their names, units and validation, so that check and
// assess see the same rows: a setting whose value cannot be used rejects its
// row (an Error), one that names nothing known is a Warning and is ignored.
// The validated values cross to report/assess typed (Site.Limits,
// Site.Uncertainties), in SI units.

// ErrLimitValue is the cause of a Site item that names a limit but whose value cannot be used.
var ErrLimitValue = errors.New("unusable limit value")

// ErrUncertaintyValue is the cause of a Site item that names an uncertainty but
// whose value cannot be used.
var ErrUncertaintyValue = errors.New("unusable uncertainty value")

// ErrUnknownSiteItem is the cause of a Site item that is neither a site field nor a known limit.
var ErrUnknownSiteItem = errors.New("unknown Site item")

// LimitItem is one Site-sheet item that overrides a limit of the screening.
type LimitItem struct {
	Name string // item name without unit, lower case, as matched: "shock energy"
	Unit string // unit the value is in when the item and value give none
	Note string // what it sets
	dim  limitDim
}

// FromSI converts an SI value of the limit k sets into k's Unit (the Site
// sheet's practical unit); false when k's Unit is not one its dimension takes.
func (k LimitItem) FromSI(v float64) (float64, bool) {
	f, ok := limitScale(k.dim, k.Unit)
	if !ok || f == 0 {
		return 0, false
	}
	return v / f, true
}

// SiteLimit is a validated limit override of the Site sheet.
type SiteLimit struct {
	Name  string  // the LimitItem's Name
	Value float64 // SI units
	Row   int
}

// SpreadScale is how an uncertainty item's value reads.
type SpreadScale uint8

const (
	// SpreadRelative: a relative standard uncertainty in % (0.10 for "10").
	SpreadRelative SpreadScale = iota
	// SpreadLength: an absolute standard uncertainty of a length, mm, cm or m (SI).
	SpreadLength
	// SpreadRH: an absolute standard uncertainty of humidity in %RH.
	SpreadRH
	// SpreadLog: the standard deviation of ln(value), given in % (a factor
	// 1 + x/100), decades or as a factor.
	SpreadLog
)

// UncertaintyItem is one Site-sheet item that overrides a row of the
// uncertainty table (report/assess.DefaultUncertainties).
type UncertaintyItem struct {
	Name  string // item name without unit, lower case: "uncertainty field"
	Unit  string // unit of the value when none is written: "%", "mm", "%RH", "decades" or "factor"
	Scale SpreadScale
}

// SiteUncertainty is a validated uncertainty override of the Site sheet.
type SiteUncertainty struct {
	Name   string  // the UncertaintyItem's Name
	Spread float64 // relative (SpreadRelative), SI (SpreadLength), %RH, or of ln (SpreadLog); 0 turns sampling off
	// Unit is the unit the value was written in, for a SpreadLog row: "%",
	// "decades" or "factor"; "" when the row's default unit applies.
	Unit string
	Row  int
}

type limitDim uint8

const (
	dimNone limitDim = iota
	dimEnergy
	dimResistance
	dimCharge
	dimArea
	dimDensity
	dimPotential
	dimLength
	dimField
	dimVelocity
	dimVD
	dimConductivity
	dimCurrent
	dimCapacitance
	dimTime
)

// limitScale returns the factor from the unit to SI, or false for a unit the dimension does not take.
func limitScale(d limitDim, unit string) (float64, bool) {
	u := strings.NewReplacer("µ", "u", "μ", "u", "²", "2", "^2", "2", " ", "", "·", "").Replace(strings.ToLower(unit))
	var t map[string]float64
	switch d {
	case dimNone:
		t = map[string]float64{"": 1, "x": 1}
	case dimEnergy:
		t = map[string]float64{"mj": 1e-3, "j": 1, "uj": 1e-6}
	case dimResistance:
		t = map[string]float64{"ω": 1, "ohm": 1, "ohms": 1}
	case dimCharge:
		t = map[string]float64{"nc": 1e-9, "uc": 1e-6, "pc": 1e-12, "c": 1}
	case dimArea:
		t = map[string]float64{"cm2": 1e-4, "m2": 1, "mm2": 1e-6}
	case dimDensity:
		t = map[string]float64{"uc/m2": 1e-6, "nc/m2": 1e-9, "c/m2": 1}
	case dimPotential:
		t = map[string]float64{"v": 1, "kv": 1e3}
	case dimLength:
		t = map[string]float64{"mm": 1e-3, "m": 1, "cm": 1e-2}
	case dimField:
		t = map[string]float64{"v/m": 1, "kv/m": 1e3, "mv/m": 1e6, "kv/mm": 1e6, "kv/cm": 1e5}
	case dimVelocity:
		t = map[string]float64{"m/s": 1}
	case dimVD:
		t = map[string]float64{"m2/s": 1}
	case dimConductivity:
		t = map[string]float64{"ps/m": 1e-12, "ns/m": 1e-9, "us/m": 1e-6, "s/m": 1}
	case dimCurrent:
		t = map[string]float64{"ua": 1e-6, "na": 1e-9, "ma": 1e-3, "a": 1}
	case dimCapacitance:
		t = map[string]float64{"pf": 1e-12, "nf": 1e-9, "f": 1}
	case dimTime:
		t = map[string]float64{"s": 1, "min": 60, "ms": 1e-3}
	}
	f, ok := t[u]
	return f, ok
}

// limitGroups and vesselClasses name the gas groups and receiving-vessel
// classes of the group- and class-indexed limits, as the model names them
// (report/assess's test checks that every item sets a limit).
var (
	limitGroups   = []string{"IIA", "IIB", "IIC"}
	vesselClasses = []string{"road tanker", "rail tank car", "fixed tank", "IBC", "drum", "can"}
)

// LimitItems returns the Site-sheet items that override limits, in documentation order.
// An item is written "name [unit]" (the unit optional, the Unit below when absent);
// the value may carry its own unit ("400 mJ"). Group-indexed limits take the group
// at the end of the name ("transferred charge IIB [nC]").
func LimitItems() []LimitItem {
	items := []LimitItem{
		{"shock energy", "mJ", "ShockEnergy: shock hazard to people above it", dimEnergy},
		{"conductor earthing limit", "Ω", "ConductorEarthing: conductors to earth", dimResistance},
		{"person earthing limit", "Ω", "PersonEarthing: person to earth", dimResistance},
		{"person earthing mie", "mJ", "PersonEarthingMIE: the person limit applies at or below this MIE", dimEnergy},
		{"brush energy", "mJ", "BrushEnergy: equivalent energy of a brush discharge", dimEnergy},
		{"brush area", "cm²", "BrushArea: area one brush discharge drains", dimArea},
		{"zone 0 charge factor", "", "ZoneZeroChargeFactor: zone 0 transferred-charge limit = factor x zone 1 limit", dimNone},
		{"propagating charge density", "µC/m²", "PropagatingDensity: density a propagating brush needs", dimDensity},
		{"propagating breakdown voltage", "kV", "PropagatingBreakdown: layer breakdown at or below which none is possible", dimPotential},
		{"propagating thickness", "mm", "PropagatingThickness: layer thickness above which none is expected", dimLength},
		{"propagating maximum energy", "mJ", "PropagatingMaxEnergy: upper bound of a propagating brush's energy", dimEnergy},
		{"safe potential", "V", "SafePotential: a conductor below it is safe", dimPotential},
		{"spark minimum potential", "V", "SparkMinPotential: no spark below it", dimPotential},
		{"air breakdown field", "kV/m", "AirBreakdown", dimField},
		{"not earthed resistance", "Ω", "NotEarthed: resistance taken for an unknown one", dimResistance},
		{"person maximum potential", "kV", "PersonMaxPotential: cap on an estimated body potential", dimPotential},
		{"low conductivity", "pS/m", "LowConductivity: at or below it a liquid is low-conductivity", dimConductivity},
		{"high conductivity", "pS/m", "HighConductivity: above it a liquid is high-conductivity", dimConductivity},
		{"filling vd limit", "m²/s", "VesselVDHigh[road tanker]: v d limit above the v d conductivity (see the per-class items)", dimVD},
		{"filling vd limit low conductivity", "m²/s", "VesselVDLow[road tanker]: v d limit at or below the v d conductivity or when unknown (see the per-class items)", dimVD},
		{"filling vd conductivity", "pS/m", "VDKappa: conductivity that selects the v d limit", dimConductivity},
		{"maximum filling velocity", "m/s", "VesselMaxVelocity[every class]: ceiling on filling velocity", dimVelocity},
		{"slow start velocity", "m/s", "SlowStartVelocity: until the inlet is submerged", dimVelocity},
		{"bag c point to tab", "Ω", "BagCToTab: type C bag, any point to its earthing tab", dimResistance},
		{"bag c tab to earth", "Ω", "BagTabToEarth: type C bag, tab to plant earth", dimResistance},
		{"bag minimum mie", "mJ", "BagMinMIE: MIE the qualification of types C and D assumes", dimEnergy},
		{"bag maximum current", "µA", "BagMaxCurrent: charging current the qualification assumes", dimCurrent},
		{"conductor maximum potential", "kV", "ConductorMaxPotential: cap on an unmeasured conductor potential (a measured one is never capped)", dimPotential},
		{"small part capacitance", "pF", "SmallPartCapacitance: a metal part of measured capacitance below it need not be earthed (IIA, IIB, Group III)", dimCapacitance},
		{"small part capacitance iic", "pF", "SmallPartCapacitanceIIC: the same for IIC and zone 0", dimCapacitance},
		{"earthing contradiction factor", "", "EarthingContradictionFactor: a measured conductor potential above this many times the earthing bound (worst-case current x resistance) contradicts the earthing", dimNone},
		{"spark surface resistance", "Ω", "SparkSurface: an unearthed surface below it (or of dissipative class) sparks as a conductor", dimResistance},
		{"corona energy", "mJ", "CoronaEnergy: corona's equivalent energy bound, compared only with an MIE below it", dimEnergy},
		{"dust brush mie", "mJ", "DustBrushMIE: a dust below this MIE is screened for brush discharges", dimEnergy},
		{"transferred charge group iii", "nC", "TransferredCharge[IIIA-IIIC]: against propagating brush discharges", dimCharge},
	}
	for _, g := range limitGroups {
		gs := strings.ToLower(g)
		items = append(items,
			LimitItem{"transferred charge " + gs, "nC", "TransferredCharge[" + g + "]: zones 1 and 2", dimCharge},
			LimitItem{"brush charge density " + gs, "µC/m²", "BrushChargeDensity[" + g + "]: brush screen", dimDensity},
			LimitItem{"insulating area zone 0 " + gs, "cm²", "AreaGa[" + g + "]: EPL Ga", dimArea},
			LimitItem{"insulating area zone 1 " + gs, "cm²", "AreaGb[" + g + "]: EPL Gb/Gc (zones 1 and 2)", dimArea},
		)
	}
	// The liquid filling rules: the per-vessel-class limits, then the rest.
	for _, c := range vesselClasses {
		cs := strings.ToLower(c)
		items = append(items,
			LimitItem{"filling vd limit " + cs, "m²/s", "VesselVDHigh[" + c + "]: v d limit above the v d conductivity", dimVD},
			LimitItem{"filling vd limit low conductivity " + cs, "m²/s", "VesselVDLow[" + c + "]: v d limit at or below the v d conductivity or unknown", dimVD},
			LimitItem{"maximum filling velocity " + cs, "m/s", "VesselMaxVelocity[" + c + "]: velocity ceiling", dimVelocity},
		)
	}
	return append(items,
		LimitItem{"large tank diameter", "m", "LargeTankDiameter: a fixed tank at or above it has no v d limit", dimLength},
		LimitItem{"second phase velocity", "m/s", "SecondPhaseVelocity: velocity ceiling with a second phase", dimVelocity},
		LimitItem{"second phase conductivity", "pS/m", "SecondPhaseConductivity: below it a liquid with a second phase is low-conductivity", dimConductivity},
		LimitItem{"filter residence factor", "", "FilterResidenceFactor: relaxation times of residence after a fine filter", dimNone},
		LimitItem{"filter residence time", "s", "FilterResidenceMax: residence after a fine filter that always suffices", dimTime},
		LimitItem{"filter charge factor", "", "FilterChargeFactor: streaming current factor after a fine filter", dimNone},
		LimitItem{"strainer charge factor", "", "StrainerChargeFactor: streaming current factor after a strainer", dimNone},
		LimitItem{"second phase charge factor", "", "SecondPhaseChargeFactor: streaming current factor with a second phase", dimNone},
	)
}

// UncertaintyItems returns the Site-sheet items that override the uncertainty
// table, in the table's order (report/assess's test checks that the two agree).
func UncertaintyItems() []UncertaintyItem {
	return []UncertaintyItem{
		{"uncertainty field", "%", SpreadRelative},
		{"uncertainty field distance", "mm", SpreadLength},
		{"uncertainty surface potential", "%", SpreadRelative},
		{"uncertainty resistance", "decades", SpreadLog},
		{"uncertainty measured capacitance", "%", SpreadLog},
		{"uncertainty estimated capacitance", "factor", SpreadLog},
		{"uncertainty person capacitance", "factor", SpreadLog},
		{"uncertainty mie dust", "factor", SpreadLog},
		{"uncertainty mie gas", "%", SpreadLog},
		{"uncertainty charging current", "factor", SpreadLog},
		{"uncertainty mass flow", "%", SpreadRelative},
		{"uncertainty charge to mass", "factor", SpreadLog},
		{"uncertainty size", "%", SpreadRelative},
		{"uncertainty speed", "%", SpreadRelative},
		{"uncertainty charging time", "%", SpreadRelative},
		{"uncertainty conductivity", "factor", SpreadLog},
		{"uncertainty relative humidity", "%RH", SpreadRH},
	}
}

// SiteSettings validates Site items that are not the sheet's own items: it
// returns the limit and uncertainty overrides they give and the problems of
// the others (each at its row; an Error means the row is not used).
func SiteSettings(items []SiteItem) ([]SiteLimit, []SiteUncertainty, []Problem) {
	var (
		lims  []SiteLimit
		uncs  []SiteUncertainty
		probs []Problem
	)
	for _, it := range items {
		l, u, p := siteSetting(it)
		if l != nil {
			lims = append(lims, *l)
		}
		if u != nil {
			uncs = append(uncs, *u)
		}
		probs = append(probs, p...)
	}
	return lims, uncs, probs
}

// siteSetting validates one Site item that is not one of the sheet's own items.
func siteSetting(it SiteItem) (*SiteLimit, *SiteUncertainty, []Problem) {
	name, keyUnit := siteItemName(it)
	if isUncertaintyItem(name) {
		for _, u := range UncertaintyItems() {
			if u.Name != name {
				continue
			}
			v, unit, err := parseSpread(it.Value, keyUnit, u)
			if err != nil {
				return nil, nil, []Problem{siteItemProblem(it, "B", Error, fmt.Sprintf("uncertainty %q: %v; the default is kept", it.Item, err),
					fmt.Sprintf("give a number >= 0 in %s, e.g. \"%s [%s] = 10\"", u.Unit, it.Item, u.Unit), fmt.Errorf("%w: %w", ErrUncertaintyValue, err))}
			}
			return nil, &SiteUncertainty{Name: name, Spread: v, Unit: unit, Row: it.Row}, nil
		}
		return nil, nil, []Problem{siteItemProblem(it, "A", Warning, fmt.Sprintf("item %q names no uncertainty; it is ignored", it.Item),
			"use one of the uncertainty items listed on the Method sheet (e.g. \"Uncertainty field [%]\")", ErrUnknownSiteItem)}
	}
	for _, k := range LimitItems() {
		if k.Name != name {
			continue
		}
		v, err := parseLimitValue(it.Value, keyUnit, k)
		if err != nil {
			return nil, nil, []Problem{siteItemProblem(it, "B", Error, fmt.Sprintf("limit %q: %v; the built-in value is kept", it.Item, err),
				fmt.Sprintf("give a positive number in %s, e.g. \"%s\"", unitOrPlain(k.Unit), exampleValue(k)), fmt.Errorf("%w: %w", ErrLimitValue, err))}
		}
		return &SiteLimit{Name: name, Value: v, Row: it.Row}, nil, nil
	}
	fix := "check the spelling against the limit items that sparkmargin library lists (e.g. \"Shock energy [mJ]\")"
	if near := Nearest(splitName(it.Item), columnNames(SiteItems())); near != "" && it.Item != "" {
		fix = didYouMean(splitName(it.Item), near)
	}
	return nil, nil, []Problem{siteItemProblem(it, "A", Warning, fmt.Sprintf("item %q is not a site setting or a known limit; it is ignored", it.Item), fix, ErrUnknownSiteItem)}
}

func unitOrPlain(u string) string {
	if u == "" {
		return "a plain number"
	}
	return u
}

func exampleValue(k LimitItem) string {
	if k.Unit == "" {
		return "0.5"
	}
	return "1 " + k.Unit
}

// splitItemUnit splits "shock energy [mj]" or "shock energy (mJ)" into name and unit.
func splitItemUnit(s string) (name, unit string) {
	s = strings.TrimSpace(s)
	for _, br := range [][2]string{{"[", "]"}, {"(", ")"}} {
		if i := strings.LastIndex(s, br[0]); i >= 0 && strings.HasSuffix(s, br[1]) {
			return strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+1 : len(s)-1])
		}
	}
	return s, ""
}

func normaliseItemName(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	s = strings.NewReplacer("-", " ", "_", " ", "·", "", ".", "", ":", "").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}

// siteItemName returns a Site item's normalised name and the unit written in it
// ("Shock energy [mJ]" gives "shock energy", "mJ").
func siteItemName(it SiteItem) (name, unit string) {
	name, unit = splitItemUnit(it.Key)
	if name == "" {
		name, unit = splitItemUnit(it.Item)
	}
	return normaliseItemName(name), unit
}

// isUncertaintyItem reports whether a normalised Site item name is an uncertainty item.
func isUncertaintyItem(name string) bool {
	return name == "uncertainty" || strings.HasPrefix(name, "uncertainty ")
}

// siteItemProblem is a problem at a Site sheet item: column A for the item's
// name, column B for its value.
func siteItemProblem(it SiteItem, column string, sev Severity, message, fix string, err error) Problem {
	return Problem{
		Sheet: SheetSite, Row: it.Row, Column: column, Field: it.Item, ID: it.Item, Severity: sev,
		Message: message, Fix: fix, Err: err,
	}
}

// splitValue splits "400 mJ" into "400" and "mJ" ("1,5 mJ" into "1,5" and
// "mJ": the number is read by ParseNumber, as a survey cell's).
func splitValue(raw string) (string, string) {
	raw = strings.TrimSpace(raw)
	if i := strings.IndexFunc(raw, func(r rune) bool {
		return !(r >= '0' && r <= '9' || r == '.' || r == ',' || r == 'e' || r == 'E' || r == '+' || r == '-')
	}); i >= 0 {
		return strings.TrimSpace(raw[:i]), strings.TrimSpace(raw[i:])
	}
	return raw, ""
}

// parseLimitValue reads "400", "400 mJ" or "1e6" in the value's unit, else the item's, else the key's.
func parseLimitValue(raw, keyUnit string, key LimitItem) (float64, error) {
	raw = strings.TrimSpace(raw)
	if raw == "" {
		return 0, errors.New("no value given")
	}
	num, valUnit := splitValue(raw)
	v, err := parseNumber(num)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", raw)
	}
	unit := key.Unit
	switch {
	case valUnit != "":
		unit = valUnit
	case keyUnit != "":
		unit = keyUnit
	}
	if r, ok := ambiguousUnit(unit, Dimensionless); ok {
		return 0, fmt.Errorf("unit %q is ambiguous: %s, or %s; write the unit in full", unit, r[0], r[1])
	}
	f, ok := limitScale(key.dim, unit)
	if !ok {
		return 0, fmt.Errorf("unit %q does not fit (want %s)", unit, unitOrPlain(key.Unit))
	}
	v *= f
	if !(v > 0) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a positive finite value", raw)
	}
	return v, nil
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

// parseSpread reads a Site value into the row's spread, and, for a SpreadLog
// row, the unit it was written in.
func parseSpread(raw, keyUnit string, u UncertaintyItem) (float64, string, error) {
	num, valUnit := splitValue(raw)
	if num == "" {
		return 0, "", errors.New("no value given")
	}
	v, err := parseNumber(num)
	if err != nil {
		return 0, "", fmt.Errorf("%q is not a number", raw)
	}
	if !(v >= 0) || math.IsInf(v, 0) {
		return 0, "", fmt.Errorf("%q is not a finite value >= 0", raw)
	}
	unit := u.Unit
	switch {
	case valUnit != "":
		unit = valUnit
	case keyUnit != "":
		unit = keyUnit
	}
	cu := canonSpreadUnit(unit)
	bad := fmt.Errorf("unit %q does not fit %s (want %s)", unit, u.Name, u.Unit)
	switch u.Scale {
	case SpreadRelative:
		if cu != "%" {
			return 0, "", bad
		}
		return v / 100, "", nil
	case SpreadRH:
		if cu != "%rh" && cu != "%" {
			return 0, "", bad
		}
		return v, "", nil
	case SpreadLength:
		f, ok := map[string]float64{"mm": 1e-3, "cm": 1e-2, "m": 1}[cu]
		if !ok {
			return 0, "", bad
		}
		return v * f, "", nil
	}
	written := spreadUnit(raw, keyUnit)
	switch cu {
	case "%":
		return math.Log1p(v / 100), written, nil
	case "dec":
		return v * math.Ln10, written, nil
	case "x":
		if v == 0 {
			return 0, written, nil // off, as for the other units
		}
		if v < 1 {
			return 0, "", fmt.Errorf("a factor must be at least 1, got %q", raw)
		}
		return math.Log(v), written, nil
	}
	return 0, "", bad
}
