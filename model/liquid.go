package model

import (
	"fmt"
	"math"
	"strings"
)

// ConductivityClass is a liquid's conductivity class for static electricity.
type ConductivityClass uint8

// Conductivity classes; ConductivityUnknown is screened as low.
const (
	ConductivityUnknown ConductivityClass = iota
	ConductivityLow                       // <= 50 pS/m
	ConductivityMedium                    // 50 pS/m to 1e4 pS/m
	ConductivityHigh                      // > 1e4 pS/m
)

// String returns low, medium, high or unknown.
func (c ConductivityClass) String() string {
	switch c {
	case ConductivityLow:
		return "low"
	case ConductivityMedium:
		return "medium"
	case ConductivityHigh:
		return "high"
	}
	return "unknown"
}

// ClassifyConductivity returns the class of conductivity kappa (S/m): low at or
// below lim.LowConductivity (50 pS/m, IEC TS 60079-32-1), high above
// lim.HighConductivity (1e4 pS/m, from memory), medium between; NaN gives unknown.
func ClassifyConductivity(kappa float64, lim Limits) ConductivityClass {
	switch {
	case math.IsNaN(kappa):
		return ConductivityUnknown
	case kappa <= lim.LowConductivity:
		return ConductivityLow
	case kappa > lim.HighConductivity:
		return ConductivityHigh
	}
	return ConductivityMedium
}

// StreamingCurrent returns the saturated streaming current of fully developed
// turbulent flow in a long earthed pipe: I = 3.75e-6 v^2 d^2 A (v in m/s, d in m;
// correlation from memory, roughly independent of conductivity; 5 m/s in 0.1 m
// gives 0.94 uA, consistent with 1-6 uA measured, NBS J. Res. 69C (1965)).
// It assumes a plain pipe: LiquidChargeFactor gives the factor for a filter,
// strainer or second phase upstream.
func StreamingCurrent(v, d float64) float64 { return 3.75e-6 * v * v * d * d }

// ResidenceFactor is the number of relaxation times a charged liquid is given to
// relax (3 tau leaves 5 % of the charge) (common practice, no source).
// Limits.FilterResidenceFactor is the overridable value the filter clause uses.
const ResidenceFactor = 3.0

// VesselMaterial is the material of the vessel a liquid is filled into.
type VesselMaterial uint8

// Vessel materials; VesselMaterialUnknown is assessed as the stricter of metal
// and insulating for each rule (see the package documentation).
const (
	VesselMaterialUnknown VesselMaterial = iota
	VesselMetal                          // conductive metal shell
	VesselInsulating                     // plastic (e.g. an HDPE IBC or can)
	VesselLined                          // metal with an insulating lining or coating
	VesselGlass                          // glass (insulating)
)

// String returns the survey spelling: metal, insulating, lined, glass or unknown.
func (m VesselMaterial) String() string {
	switch m {
	case VesselMetal:
		return "metal"
	case VesselInsulating:
		return "insulating"
	case VesselLined:
		return "lined"
	case VesselGlass:
		return "glass"
	}
	return "unknown"
}

// Insulating reports whether the vessel wall keeps a liquid apart from earth:
// insulating, glass or lined.
func (m VesselMaterial) Insulating() bool {
	return m == VesselInsulating || m == VesselGlass || m == VesselLined
}

// VesselClass is the class of the receiving vessel, which selects the filling limits.
type VesselClass uint8

// Vessel classes; VesselUnknown takes the strictest value of every class.
const (
	VesselUnknown VesselClass = iota
	VesselRoadTanker
	VesselRailCar
	VesselFixedTank
	VesselIBC
	VesselDrum
	VesselCan
	NumVesselClasses
)

// String returns the survey spelling of the class.
func (c VesselClass) String() string {
	switch c {
	case VesselRoadTanker:
		return "road tanker"
	case VesselRailCar:
		return "rail tank car"
	case VesselFixedTank:
		return "fixed tank"
	case VesselIBC:
		return "IBC"
	case VesselDrum:
		return "drum"
	case VesselCan:
		return "can"
	}
	return "unknown"
}

// Filter is a charge generator upstream of the vessel.
type Filter uint8

// Filters; FilterUnknown (not stated) is assessed as a fine filter with no
// residence time after it, the stricter case, and recorded as an assumption
// (state "none" for a plain line).
const (
	FilterUnknown  Filter = iota
	FilterNone            // stated: no filter or strainer
	FilterStrainer        // coarse strainer
	FilterFine            // fine or micro-filter
)

// String returns the survey spelling: none, strainer, filter or unknown.
func (f Filter) String() string {
	switch f {
	case FilterNone:
		return "none"
	case FilterStrainer:
		return "strainer"
	case FilterFine:
		return "filter"
	}
	return "unknown"
}

// SecondPhase is a second phase carried by the liquid.
type SecondPhase uint8

// Second phases; PhaseUnknown (not stated) is assessed as present, the stricter
// case, and recorded as an assumption (state "none" when there is none).
const (
	PhaseUnknown SecondPhase = iota
	PhaseNone
	PhaseWater      // free (undissolved) water
	PhaseSolids     // suspended solids
	PhaseImmiscible // an immiscible second liquid
)

// String returns the survey spelling.
func (p SecondPhase) String() string {
	switch p {
	case PhaseNone:
		return "none"
	case PhaseWater:
		return "free water"
	case PhaseSolids:
		return "suspended solids"
	case PhaseImmiscible:
		return "immiscible liquid"
	}
	return "unknown"
}

// Present reports whether a second phase is stated.
func (p SecondPhase) Present() bool { return p >= PhaseWater }

// Assessed reports whether the rules take a second phase as present: stated, or
// not stated (unknown means the stricter case).
func (p SecondPhase) Assessed() bool { return p == PhaseUnknown || p.Present() }

// Assessed returns the filter the rules take: a fine filter when none is stated
// (unknown means the stricter case).
func (f Filter) Assessed() Filter {
	if f == FilterUnknown {
		return FilterFine
	}
	return f
}

func parseWord[T ~uint8](what, s string, first, last T, str func(T) string, aliases map[string]T) (T, error) {
	t := strings.Join(strings.Fields(strings.ToLower(strings.NewReplacer("-", " ", "_", " ").Replace(s))), " ")
	if t == "" || t == "unknown" {
		return 0, nil
	}
	for v := first; v <= last; v++ {
		if t == strings.ToLower(str(v)) {
			return v, nil
		}
	}
	if v, ok := aliases[t]; ok {
		return v, nil
	}
	names := make([]string, 0, int(last-first)+1)
	for v := first; v <= last; v++ {
		names = append(names, str(v))
	}
	return 0, fmt.Errorf("model: unknown %s %q (want %s or blank)", what, s, strings.Join(names, ", "))
}

// ParseVesselMaterial reads metal, insulating, lined or glass ("plastic",
// "coated", "steel" accepted); blank or "unknown" give VesselMaterialUnknown.
func ParseVesselMaterial(s string) (VesselMaterial, error) {
	return parseWord("vessel material", s, VesselMetal, VesselGlass, VesselMaterial.String,
		map[string]VesselMaterial{"plastic": VesselInsulating, "coated": VesselLined, "lined or coated": VesselLined, "steel": VesselMetal, "stainless steel": VesselMetal, "conductive": VesselMetal})
}

// ParseVesselClass reads a vessel class ("rail car", "tank", "container" for a
// can... accepted); blank or "unknown" give VesselUnknown.
func ParseVesselClass(s string) (VesselClass, error) {
	return parseWord("vessel class", s, VesselRoadTanker, VesselCan, VesselClass.String,
		map[string]VesselClass{"rail car": VesselRailCar, "rail tanker": VesselRailCar, "storage tank": VesselFixedTank, "fixed storage tank": VesselFixedTank, "tank": VesselFixedTank,
			"ibc": VesselIBC, "road tank car": VesselRoadTanker, "tanker": VesselRoadTanker, "small container": VesselCan, "can or small container": VesselCan, "barrel": VesselDrum})
}

// ParseFilter reads none, strainer or filter ("micro filter", "fine filter" accepted).
func ParseFilter(s string) (Filter, error) {
	return parseWord("filter", s, FilterNone, FilterFine, Filter.String,
		map[string]Filter{"micro filter": FilterFine, "microfilter": FilterFine, "fine filter": FilterFine, "no": FilterNone, "coarse strainer": FilterStrainer})
}

// ParseSecondPhase reads none, free water, suspended solids or immiscible liquid
// ("water", "solids" accepted).
func ParseSecondPhase(s string) (SecondPhase, error) {
	return parseWord("second phase", s, PhaseNone, PhaseImmiscible, SecondPhase.String,
		map[string]SecondPhase{"water": PhaseWater, "solids": PhaseSolids, "immiscible": PhaseImmiscible, "no": PhaseNone})
}

// VesselCapacitance returns the typical capacitance (F) of a vessel class, used
// when the row gives none; VesselUnknown takes the largest (the stricter case for
// a steady-state potential I R). All from memory (reference section 2 size
// table, upper ends): road tanker about 1000 pF; rail tank car taken as a road
// tanker; fixed tank the upper end of 100-1000 pF for vessels; IBC the upper end
// of 50-300 pF for 250-500 L containers; drum 100 pF (70 pF measured for a 200 L
// drum on a dry pallet, BG RCI FAQ 7.15); can 50 pF, between a small part
// (10-20 pF) and a bucket (10-100 pF).
func VesselCapacitance(c VesselClass) float64 {
	switch c {
	case VesselIBC:
		return 300e-12 // from memory
	case VesselDrum:
		return DrumCapacitance // from memory; 70 pF measured, BG RCI FAQ 7.15
	case VesselCan:
		return 50e-12 // from memory
	}
	return 1000e-12 // road tanker, rail tank car, fixed tank, unknown; from memory
}

// LiquidClause is a bit set of the filling clauses of IEC TS 60079-32-1 that the
// model judges; Evaluation.LiquidBreaches holds those not met (or not shown met).
type LiquidClause uint16

// The clauses; LiquidRules gives each its reference, edition and source mark.
const (
	// ClauseVD: v d at or below the vessel class's limit (low-conductivity liquids).
	ClauseVD LiquidClause = 1 << iota
	// ClauseCeiling: flow velocity at or below the vessel class's ceiling (7 m/s).
	ClauseCeiling
	// ClauseSlowStart: inlet velocity at or below 1 m/s until the inlet is submerged.
	ClauseSlowStart
	// ClauseSplash: no top (splash) filling of a low-conductivity liquid.
	ClauseSplash
	// ClauseSecondPhase: at most 1 m/s while a second phase is carried.
	ClauseSecondPhase
	// ClauseResidence: residence time after a fine filter.
	ClauseResidence
	// ClauseInsulatingVessel: a low-conductivity liquid into an insulating vessel,
	// an operation the standard gives no safe filling limits for.
	ClauseInsulatingVessel
	// ClauseIsolatedLiquid: a conductive liquid in an insulating, lined or
	// unearthed vessel must be earthed (earthed dip pipe or rod).
	ClauseIsolatedLiquid
	numLiquidClauses = iota
)

// LiquidRule is one row of the liquid filling rules: the clause it judges, the
// vessel class it is for (VesselUnknown: every class), its reference with edition,
// and its source mark.
type LiquidRule struct {
	Clause     LiquidClause
	Vessel     VesselClass
	Rule       string // what it requires, in words, with the limit's Site item
	Ref        string // document, edition and clause
	FromMemory bool   // recalled, not confirmed in a published source here ([M])
}

// Edition of IEC TS 60079-32-1 the liquid rules cite.
var srcLiquids = reference(refTS32).Cite() + ", clause 7 (liquids)"

// LiquidRules returns the rows of the liquid filling rules, in clause order. The
// values are Limits fields, overridable on the Site sheet (the item names are in
// the Rule text); a clause number finer than clause 7 is not given because it
// was not confirmed here.
func LiquidRules() []LiquidRule {
	vd := func(c VesselClass, where string, mem bool) LiquidRule {
		return LiquidRule{Clause: ClauseVD, Vessel: c, FromMemory: mem,
			Rule: "low-conductivity liquid: v·d ≤ \"filling vd limit low conductivity " + c.String() + "\" at or below 10 pS/m or unknown, ≤ \"filling vd limit " + c.String() + "\" above",
			Ref:  srcLiquids + ", " + where}
	}
	return []LiquidRule{
		vd(VesselRoadTanker, "road tankers (0.38 / 0.5 m²/s)", false),
		vd(VesselRailCar, "rail tank cars (0.75 m²/s)", true),
		vd(VesselFixedTank, "fixed tanks below the \"large tank diameter\": the road-tanker values taken (a screening choice); larger tanks: velocity limits only", true),
		vd(VesselIBC, "IBCs: the road-tanker values taken (a screening choice)", true),
		vd(VesselDrum, "drums: the road-tanker values taken (a screening choice)", true),
		vd(VesselCan, "cans and small containers: the road-tanker values taken (a screening choice)", true),
		{Clause: ClauseCeiling, Rule: "flow velocity ≤ \"maximum filling velocity <class>\" (7 m/s) for every liquid and vessel", Ref: srcLiquids + ", velocity ceiling", FromMemory: true},
		{Clause: ClauseSlowStart, Rule: "low-conductivity liquid: inlet velocity ≤ \"slow start velocity\" (1 m/s) until the inlet is submerged", Ref: srcLiquids + ", initial filling velocity", FromMemory: true},
		{Clause: ClauseSplash, Rule: "low-conductivity liquid: no top (splash) filling; fill from the bottom or through a dip pipe to the bottom", Ref: srcLiquids + ", top and splash filling", FromMemory: true},
		{Clause: ClauseSecondPhase, Rule: "a second phase (free water, solids, an immiscible liquid) makes a liquid below \"second phase conductivity\" (1000 pS/m) low-conductivity, and limits the velocity to \"second phase velocity\" (1 m/s)", Ref: srcLiquids + ", two-phase flow (1000 pS/m confirmed; 1 m/s from memory)", FromMemory: true},
		{Clause: ClauseResidence, Rule: "after a fine filter, a residence time of at least the smaller of \"filter residence factor\" (3) relaxation times and \"filter residence time\" (100 s) before the vessel", Ref: srcLiquids + ", filters", FromMemory: true},
		{Clause: ClauseInsulatingVessel, Rule: "low-conductivity liquid into an insulating or glass vessel: the standard gives no safe filling limits, so brush discharges are counted", Ref: srcLiquids + ", insulating containers", FromMemory: true},
		{Clause: ClauseIsolatedLiquid, Rule: "conductive liquid in an insulating, lined or unearthed vessel: an isolated conductor; earth it through an earthed dip pipe or rod (resistance to earth ≤ \"conductor earthing limit\")", Ref: srcLiquids + ", conductive liquids in insulating containers", FromMemory: false},
	}
}

// Rule returns the rule row of one clause for a vessel class (the class's own
// row, else the row for every class); ok false when there is none.
func (c LiquidClause) Rule(v VesselClass) (LiquidRule, bool) {
	var any LiquidRule
	found := false
	for _, r := range LiquidRules() {
		if r.Clause != c {
			continue
		}
		if r.Vessel == v {
			return r, true
		}
		if r.Vessel == VesselUnknown || !found {
			any, found = r, true
		}
	}
	return any, found
}

// Texts names the clauses in the set, in clause order (allocates; call on demand).
func (c LiquidClause) Texts() []string {
	names := [numLiquidClauses]string{"v·d limit", "velocity ceiling", "slow start until submerged", "no splash filling",
		"second-phase velocity", "residence after a filter", "no safe limits in an insulating vessel", "conductive liquid not earthed"}
	return bitTexts(uint64(c), names[:])
}

// Has reports whether the set holds c.
func (c LiquidClause) Has(x LiquidClause) bool { return c&x != 0 }

// vesselLimit returns the vessel class's value of a per-class limit; for
// VesselUnknown the smallest over the classes (the strictest).
func vesselLimit(a *[NumVesselClasses]float64, c VesselClass) float64 {
	if c != VesselUnknown && c < NumVesselClasses {
		return a[c]
	}
	m := math.Inf(1)
	for k := VesselRoadTanker; k < NumVesselClasses; k++ {
		if a[k] < m {
			m = a[k]
		}
	}
	return m
}

// FillingVDLimit returns the v d limit (m^2/s) for filling a low-conductivity
// liquid of conductivity kappa (S/m) into a vessel of class c and diameter D
// (fixed tanks): the class's VDHigh above lim.VDKappa (10 pS/m), its VDLow at or
// below it or when kappa is unknown (IEC TS 60079-32-1: road tankers 0.5 and
// 0.38 m^2/s); +Inf for a fixed tank of diameter at or above
// lim.LargeTankDiameter (velocity limits only; from memory). An unknown class
// takes the strictest class.
func FillingVDLimit(kappa float64, c VesselClass, diameter float64, lim *Limits) float64 {
	if c == VesselFixedTank && diameter >= lim.LargeTankDiameter {
		return math.Inf(1)
	}
	if kappa > lim.VDKappa {
		return vesselLimit(&lim.VesselVDHigh, c)
	}
	return vesselLimit(&lim.VesselVDLow, c)
}

// FillingCeiling returns the velocity ceiling (m/s) for a vessel class (7 m/s,
// from memory); an unknown class takes the strictest.
func FillingCeiling(c VesselClass, lim *Limits) float64 {
	return vesselLimit(&lim.VesselMaxVelocity, c)
}

// FillingVelocityLimit returns the highest flow velocity (m/s) in a line of inner
// diameter d for a low-conductivity liquid: the v d limit over d
// (FillingVDLimit), never above the ceiling (FillingCeiling). Until the inlet is
// submerged the slow start lim.SlowStartVelocity (1 m/s) applies instead, and
// with a second phase lim.SecondPhaseVelocity.
func FillingVelocityLimit(kappa, d float64, c VesselClass, diameter float64, lim *Limits) float64 {
	return math.Min(FillingVDLimit(kappa, c, diameter, lim)/d, FillingCeiling(c, lim))
}

// FilterResidence returns the residence time (s) a liquid of relaxation time tau
// needs after a fine filter: the smaller of lim.FilterResidenceFactor tau and
// lim.FilterResidenceMax (from memory); lim.FilterResidenceMax when tau is
// unknown (NaN).
func FilterResidence(tau float64, lim *Limits) float64 {
	if !(tau > 0) {
		return lim.FilterResidenceMax
	}
	return math.Min(lim.FilterResidenceFactor*tau, lim.FilterResidenceMax)
}

// LiquidChargeFactor returns the factor on the plain-pipe streaming current for
// what lies upstream of the vessel: a fine filter lim.FilterChargeFactor (100,
// the upper end of 10-100, from memory) relaxed over the residence time t after
// it, never below the plain pipe that follows it: max(1, F exp(-t/tau)) (derived;
// no relaxation when tau or t is unknown); a strainer lim.StrainerChargeFactor;
// times lim.SecondPhaseChargeFactor with a second phase (a screening choice).
// A filter or second phase not stated is taken as present (Filter.Assessed,
// SecondPhase.Assessed).
func LiquidChargeFactor(f Filter, t, tau float64, phase SecondPhase, lim *Limits) float64 {
	k := 1.0
	switch f.Assessed() {
	case FilterFine:
		k = lim.FilterChargeFactor
		if t > 0 && tau > 0 {
			k *= math.Exp(-t / tau)
		}
		k = math.Max(1, k)
	case FilterStrainer:
		k = math.Max(1, lim.StrainerChargeFactor)
	}
	if phase.Assessed() {
		k *= math.Max(1, lim.SecondPhaseChargeFactor)
	}
	return k
}

// CurrentCase returns the words for how the charging current of a liquid row was
// found, for reason texts: "measured", or the plain-pipe correlation with the
// factor applied and why.
func CurrentCase(in *Input, ev *Evaluation) string {
	if given(in.ChargingCurrent) {
		return "charging current as measured"
	}
	if !given(ev.StreamingCurrent) {
		return "no charging current"
	}
	var why []string
	switch in.Filter {
	case FilterFine:
		why = append(why, "a fine filter upstream")
	case FilterStrainer:
		why = append(why, "a strainer upstream")
	case FilterUnknown:
		why = append(why, "a fine filter (none stated: the stricter case)")
	}
	switch {
	case in.SecondPhase.Present():
		why = append(why, "a second phase ("+in.SecondPhase.String()+")")
	case in.SecondPhase == PhaseUnknown:
		why = append(why, "a second phase (none stated: the stricter case)")
	}
	if len(why) == 0 {
		return "plain-pipe streaming current"
	}
	if ev.ChargeFactor == 1 {
		return "plain-pipe streaming current: the extra charge of " + strings.Join(why, " and ") + " relaxes before the vessel"
	}
	return fmt.Sprintf("plain-pipe streaming current × %.3g for %s", ev.ChargeFactor, strings.Join(why, " and "))
}
