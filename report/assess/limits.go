package assess

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// ErrLimitValue is the cause of a Site item that names a limit but whose value cannot be used.
var ErrLimitValue = errors.New("unusable limit value")

// ErrUnknownSiteItem is the cause of a Site item that is neither a site field nor a known limit.
var ErrUnknownSiteItem = errors.New("unknown Site item")

// LimitKey is one Site-sheet item that overrides a limit.
type LimitKey struct {
	Name string // item name without unit, lower case, as matched
	Unit string // unit the value is in when the item and value give none
	Note string // what it sets
	set  func(l *model.Limits, v float64)
	dim  unitDim
}

type unitDim uint8

const (
	dimNone unitDim = iota
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

// unitScale returns the factor from the unit to SI, or false for a unit the dimension does not take.
func unitScale(d unitDim, unit string) (float64, bool) {
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

// LimitKeys returns the Site-sheet items that override limits, in documentation order.
// An item is written "name [unit]" (the unit optional, the Unit below when absent);
// the value may carry its own unit ("400 mJ"). Group-indexed limits take the group
// at the end of the name ("transferred charge IIB [nC]").
func LimitKeys() []LimitKey {
	keys := []LimitKey{
		{Name: "shock energy", Unit: "mJ", Note: "ShockEnergy: shock hazard to people above it", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.ShockEnergy = v }},
		{Name: "conductor earthing limit", Unit: "Ω", Note: "ConductorEarthing: conductors to earth", dim: dimResistance, set: func(l *model.Limits, v float64) { l.ConductorEarthing = v }},
		{Name: "person earthing limit", Unit: "Ω", Note: "PersonEarthing: person to earth", dim: dimResistance, set: func(l *model.Limits, v float64) { l.PersonEarthing = v }},
		{Name: "person earthing mie", Unit: "mJ", Note: "PersonEarthingMIE: the person limit applies at or below this MIE", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.PersonEarthingMIE = v }},
		{Name: "brush energy", Unit: "mJ", Note: "BrushEnergy: equivalent energy of a brush discharge", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.BrushEnergy = v }},
		{Name: "brush area", Unit: "cm²", Note: "BrushArea: area one brush discharge drains", dim: dimArea, set: func(l *model.Limits, v float64) { l.BrushArea = v }},
		{Name: "zone 0 charge factor", Unit: "", Note: "ZoneZeroChargeFactor: zone 0 transferred-charge limit = factor x zone 1 limit", dim: dimNone, set: func(l *model.Limits, v float64) { l.ZoneZeroChargeFactor = v }},
		{Name: "propagating charge density", Unit: "µC/m²", Note: "PropagatingDensity: density a propagating brush needs", dim: dimDensity, set: func(l *model.Limits, v float64) { l.PropagatingDensity = v }},
		{Name: "propagating breakdown voltage", Unit: "kV", Note: "PropagatingBreakdown: layer breakdown at or below which none is possible", dim: dimPotential, set: func(l *model.Limits, v float64) { l.PropagatingBreakdown = v }},
		{Name: "propagating thickness", Unit: "mm", Note: "PropagatingThickness: layer thickness above which none is expected", dim: dimLength, set: func(l *model.Limits, v float64) { l.PropagatingThickness = v }},
		{Name: "propagating maximum energy", Unit: "mJ", Note: "PropagatingMaxEnergy: upper bound of a propagating brush's energy", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.PropagatingMaxEnergy = v }},
		{Name: "safe potential", Unit: "V", Note: "SafePotential: a conductor below it is safe", dim: dimPotential, set: func(l *model.Limits, v float64) { l.SafePotential = v }},
		{Name: "spark minimum potential", Unit: "V", Note: "SparkMinPotential: no spark below it", dim: dimPotential, set: func(l *model.Limits, v float64) { l.SparkMinPotential = v }},
		{Name: "air breakdown field", Unit: "kV/m", Note: "AirBreakdown", dim: dimField, set: func(l *model.Limits, v float64) { l.AirBreakdown = v }},
		{Name: "not earthed resistance", Unit: "Ω", Note: "NotEarthed: resistance taken for an unknown one", dim: dimResistance, set: func(l *model.Limits, v float64) { l.NotEarthed = v }},
		{Name: "person maximum potential", Unit: "kV", Note: "PersonMaxPotential: cap on an estimated body potential", dim: dimPotential, set: func(l *model.Limits, v float64) { l.PersonMaxPotential = v }},
		{Name: "low conductivity", Unit: "pS/m", Note: "LowConductivity: at or below it a liquid is low-conductivity", dim: dimConductivity, set: func(l *model.Limits, v float64) { l.LowConductivity = v }},
		{Name: "high conductivity", Unit: "pS/m", Note: "HighConductivity: above it a liquid is high-conductivity", dim: dimConductivity, set: func(l *model.Limits, v float64) { l.HighConductivity = v }},
		{Name: "filling vd limit", Unit: "m²/s", Note: "VesselVDHigh[road tanker]: v d limit above the v d conductivity (see the per-class items)", dim: dimVD, set: func(l *model.Limits, v float64) { l.VesselVDHigh[model.VesselRoadTanker] = v }},
		{Name: "filling vd limit low conductivity", Unit: "m²/s", Note: "VesselVDLow[road tanker]: v d limit at or below the v d conductivity or when unknown (see the per-class items)", dim: dimVD, set: func(l *model.Limits, v float64) { l.VesselVDLow[model.VesselRoadTanker] = v }},
		{Name: "filling vd conductivity", Unit: "pS/m", Note: "VDKappa: conductivity that selects the v d limit", dim: dimConductivity, set: func(l *model.Limits, v float64) { l.VDKappa = v }},
		{Name: "maximum filling velocity", Unit: "m/s", Note: "VesselMaxVelocity[every class]: ceiling on filling velocity", dim: dimVelocity, set: func(l *model.Limits, v float64) {
			for c := model.VesselRoadTanker; c < model.NumVesselClasses; c++ {
				l.VesselMaxVelocity[c] = v
			}
		}},
		{Name: "slow start velocity", Unit: "m/s", Note: "SlowStartVelocity: until the inlet is submerged", dim: dimVelocity, set: func(l *model.Limits, v float64) { l.SlowStartVelocity = v }},
		{Name: "bag c point to tab", Unit: "Ω", Note: "BagCToTab: type C bag, any point to its earthing tab", dim: dimResistance, set: func(l *model.Limits, v float64) { l.BagCToTab = v }},
		{Name: "bag c tab to earth", Unit: "Ω", Note: "BagTabToEarth: type C bag, tab to plant earth", dim: dimResistance, set: func(l *model.Limits, v float64) { l.BagTabToEarth = v }},
		{Name: "bag minimum mie", Unit: "mJ", Note: "BagMinMIE: MIE the qualification of types C and D assumes", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.BagMinMIE = v }},
		{Name: "bag maximum current", Unit: "µA", Note: "BagMaxCurrent: charging current the qualification assumes", dim: dimCurrent, set: func(l *model.Limits, v float64) { l.BagMaxCurrent = v }},
		{Name: "conductor maximum potential", Unit: "kV", Note: "ConductorMaxPotential: cap on an unmeasured conductor potential (a measured one is never capped)", dim: dimPotential, set: func(l *model.Limits, v float64) { l.ConductorMaxPotential = v }},
		{Name: "small part capacitance", Unit: "pF", Note: "SmallPartCapacitance: a metal part of measured capacitance below it need not be earthed (IIA, IIB, Group III)", dim: dimCapacitance, set: func(l *model.Limits, v float64) { l.SmallPartCapacitance = v }},
		{Name: "small part capacitance iic", Unit: "pF", Note: "SmallPartCapacitanceIIC: the same for IIC and zone 0", dim: dimCapacitance, set: func(l *model.Limits, v float64) { l.SmallPartCapacitanceIIC = v }},
		{Name: "earthing contradiction factor", Unit: "", Note: "EarthingContradictionFactor: a measured conductor potential above this many times the earthing bound (worst-case current x resistance) contradicts the earthing", dim: dimNone, set: func(l *model.Limits, v float64) { l.EarthingContradictionFactor = v }},
		{Name: "spark surface resistance", Unit: "Ω", Note: "SparkSurface: an unearthed surface below it (or of dissipative class) sparks as a conductor", dim: dimResistance, set: func(l *model.Limits, v float64) { l.SparkSurface = v }},
		{Name: "corona energy", Unit: "mJ", Note: "CoronaEnergy: corona's equivalent energy bound, compared only with an MIE below it", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.CoronaEnergy = v }},
		{Name: "dust brush mie", Unit: "mJ", Note: "DustBrushMIE: a dust below this MIE is screened for brush discharges", dim: dimEnergy, set: func(l *model.Limits, v float64) { l.DustBrushMIE = v }},
		{Name: "transferred charge group iii", Unit: "nC", Note: "TransferredCharge[IIIA-IIIC]: against propagating brush discharges", dim: dimCharge, set: func(l *model.Limits, v float64) {
			l.TransferredCharge[model.IIIA], l.TransferredCharge[model.IIIB], l.TransferredCharge[model.IIIC] = v, v, v
		}},
	}
	for _, g := range []model.Group{model.IIA, model.IIB, model.IIC} {
		g := g
		gs := strings.ToLower(g.String())
		keys = append(keys,
			LimitKey{Name: "transferred charge " + gs, Unit: "nC", Note: "TransferredCharge[" + g.String() + "]: zones 1 and 2", dim: dimCharge, set: func(l *model.Limits, v float64) { l.TransferredCharge[g] = v }},
			LimitKey{Name: "brush charge density " + gs, Unit: "µC/m²", Note: "BrushChargeDensity[" + g.String() + "]: brush screen", dim: dimDensity, set: func(l *model.Limits, v float64) { l.BrushChargeDensity[g] = v }},
			LimitKey{Name: "insulating area zone 0 " + gs, Unit: "cm²", Note: "AreaGa[" + g.String() + "]: EPL Ga", dim: dimArea, set: func(l *model.Limits, v float64) { l.AreaGa[g] = v }},
			LimitKey{Name: "insulating area zone 1 " + gs, Unit: "cm²", Note: "AreaGb[" + g.String() + "]: EPL Gb/Gc (zones 1 and 2)", dim: dimArea, set: func(l *model.Limits, v float64) { l.AreaGb[g] = v }},
		)
	}
	keys = append(keys, liquidLimitKeys()...)
	return keys
}

// liquidLimitKeys returns the Site items of the liquid filling rules
// (model.LiquidRules): the per-vessel-class limits, then the rest.
func liquidLimitKeys() []LimitKey {
	var keys []LimitKey
	for c := model.VesselRoadTanker; c < model.NumVesselClasses; c++ {
		c := c
		cs := strings.ToLower(c.String())
		keys = append(keys,
			LimitKey{Name: "filling vd limit " + cs, Unit: "m²/s", Note: "VesselVDHigh[" + c.String() + "]: v d limit above the v d conductivity", dim: dimVD, set: func(l *model.Limits, v float64) { l.VesselVDHigh[c] = v }},
			LimitKey{Name: "filling vd limit low conductivity " + cs, Unit: "m²/s", Note: "VesselVDLow[" + c.String() + "]: v d limit at or below the v d conductivity or unknown", dim: dimVD, set: func(l *model.Limits, v float64) { l.VesselVDLow[c] = v }},
			LimitKey{Name: "maximum filling velocity " + cs, Unit: "m/s", Note: "VesselMaxVelocity[" + c.String() + "]: velocity ceiling", dim: dimVelocity, set: func(l *model.Limits, v float64) { l.VesselMaxVelocity[c] = v }},
		)
	}
	return append(keys,
		LimitKey{Name: "large tank diameter", Unit: "m", Note: "LargeTankDiameter: a fixed tank at or above it has no v d limit", dim: dimLength, set: func(l *model.Limits, v float64) { l.LargeTankDiameter = v }},
		LimitKey{Name: "second phase velocity", Unit: "m/s", Note: "SecondPhaseVelocity: velocity ceiling with a second phase", dim: dimVelocity, set: func(l *model.Limits, v float64) { l.SecondPhaseVelocity = v }},
		LimitKey{Name: "second phase conductivity", Unit: "pS/m", Note: "SecondPhaseConductivity: below it a liquid with a second phase is low-conductivity", dim: dimConductivity, set: func(l *model.Limits, v float64) { l.SecondPhaseConductivity = v }},
		LimitKey{Name: "filter residence factor", Unit: "", Note: "FilterResidenceFactor: relaxation times of residence after a fine filter", dim: dimNone, set: func(l *model.Limits, v float64) { l.FilterResidenceFactor = v }},
		LimitKey{Name: "filter residence time", Unit: "s", Note: "FilterResidenceMax: residence after a fine filter that always suffices", dim: dimTime, set: func(l *model.Limits, v float64) { l.FilterResidenceMax = v }},
		LimitKey{Name: "filter charge factor", Unit: "", Note: "FilterChargeFactor: streaming current factor after a fine filter", dim: dimNone, set: func(l *model.Limits, v float64) { l.FilterChargeFactor = v }},
		LimitKey{Name: "strainer charge factor", Unit: "", Note: "StrainerChargeFactor: streaming current factor after a strainer", dim: dimNone, set: func(l *model.Limits, v float64) { l.StrainerChargeFactor = v }},
		LimitKey{Name: "second phase charge factor", Unit: "", Note: "SecondPhaseChargeFactor: streaming current factor with a second phase", dim: dimNone, set: func(l *model.Limits, v float64) { l.SecondPhaseChargeFactor = v }},
	)
}

// LimitsFromSite returns base with the limits the Site sheet's extra items
// override (see LimitKeys for the names and units). An item that names a limit
// but whose value is not a positive number in a unit of the right dimension is an
// Error (the limit keeps its base value); an item that names no limit is a Warning.
// Items starting with "Uncertainty" are left to UncertaintiesFromSite.
func LimitsFromSite(site inventory.Site, base model.Limits) (model.Limits, []inventory.Problem) {
	lim := base
	keys := LimitKeys()
	var probs []inventory.Problem
	for _, it := range site.Items {
		name, keyUnit := siteItemName(it)
		if isUncertaintyItem(name) {
			continue // UncertaintiesFromSite reads these
		}
		var key *LimitKey
		for i := range keys {
			if keys[i].Name == name {
				key = &keys[i]
				break
			}
		}
		if key == nil {
			probs = append(probs, siteItemProblem(it, "A", inventory.Warning, fmt.Sprintf("item %q is not a site setting or a known limit; it is ignored", it.Item), "check the spelling against the limit items that sparkmargin library lists (e.g. \"Shock energy [mJ]\")", ErrUnknownSiteItem))
			continue
		}
		v, err := parseLimitValue(it.Value, keyUnit, key)
		if err != nil {
			probs = append(probs, siteItemProblem(it, "B", inventory.Error, fmt.Sprintf("limit %q: %v; the built-in value is kept", it.Item, err), fmt.Sprintf("give a positive number in %s, e.g. \"%s\"", unitOrPlain(key.Unit), exampleValue(key)), fmt.Errorf("%w: %w", ErrLimitValue, err)))
			continue
		}
		key.set(&lim, v)
	}
	return lim, probs
}

func unitOrPlain(u string) string {
	if u == "" {
		return "a plain number"
	}
	return u
}

func exampleValue(k *LimitKey) string {
	if k.Unit == "" {
		return "0.5"
	}
	return "1 " + k.Unit
}

// splitUnit splits "shock energy [mj]" or "shock energy (mJ)" into name and unit.
func splitUnit(s string) (name, unit string) {
	s = strings.TrimSpace(s)
	for _, br := range [][2]string{{"[", "]"}, {"(", ")"}} {
		if i := strings.LastIndex(s, br[0]); i >= 0 && strings.HasSuffix(s, br[1]) {
			return strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+1 : len(s)-1])
		}
	}
	return s, ""
}

func normaliseName(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	s = strings.NewReplacer("-", " ", "_", " ", "·", "", ".", "", ":", "").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}

// parseLimitValue reads "400", "400 mJ" or "1e6" in the value's unit, else the item's, else the key's.
func parseLimitValue(raw, keyUnit string, key *LimitKey) (float64, error) {
	raw = strings.TrimSpace(raw)
	if raw == "" {
		return 0, errors.New("no value given")
	}
	num, valUnit := raw, ""
	if i := strings.IndexFunc(raw, func(r rune) bool {
		return !(r >= '0' && r <= '9' || r == '.' || r == 'e' || r == 'E' || r == '+' || r == '-')
	}); i >= 0 {
		num, valUnit = strings.TrimSpace(raw[:i]), strings.TrimSpace(raw[i:])
	}
	v, err := strconv.ParseFloat(num, 64)
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
	f, ok := unitScale(key.dim, unit)
	if !ok {
		return 0, fmt.Errorf("unit %q does not fit (want %s)", unit, unitOrPlain(key.Unit))
	}
	v *= f
	if !(v > 0) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a positive finite value", raw)
	}
	return v, nil
}

// siteItemName returns a Site item's normalised name and the unit written in it
// ("Shock energy [mJ]" gives "shock energy", "mJ").
func siteItemName(it inventory.SiteItem) (name, unit string) {
	name, unit = splitUnit(it.Key)
	if name == "" {
		name, unit = splitUnit(it.Item)
	}
	return normaliseName(name), unit
}

// siteItemProblem is a problem at a Site sheet item: column A for the item's
// name, column B for its value.
func siteItemProblem(it inventory.SiteItem, column string, sev inventory.Severity, message, fix string, err error) inventory.Problem {
	return inventory.Problem{
		Sheet: inventory.SheetSite, Row: it.Row, Column: column, Field: it.Item, Severity: sev,
		Message: message, Fix: fix, Err: err,
	}
}
