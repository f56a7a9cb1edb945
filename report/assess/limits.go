package assess

import (
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// limitSetters sets, for each Site limit item (inventory.LimitItems, which
// owns the names, units and validation), the limit it overrides.
func limitSetters() map[string]func(l *model.Limits, v float64) {
	m := map[string]func(l *model.Limits, v float64){
		"shock energy":                      func(l *model.Limits, v float64) { l.ShockEnergy = v },
		"conductor earthing limit":          func(l *model.Limits, v float64) { l.ConductorEarthing = v },
		"person earthing limit":             func(l *model.Limits, v float64) { l.PersonEarthing = v },
		"person earthing mie":               func(l *model.Limits, v float64) { l.PersonEarthingMIE = v },
		"brush energy":                      func(l *model.Limits, v float64) { l.BrushEnergy = v },
		"brush area":                        func(l *model.Limits, v float64) { l.BrushArea = v },
		"zone 0 charge factor":              func(l *model.Limits, v float64) { l.ZoneZeroChargeFactor = v },
		"propagating charge density":        func(l *model.Limits, v float64) { l.PropagatingDensity = v },
		"propagating breakdown voltage":     func(l *model.Limits, v float64) { l.PropagatingBreakdown = v },
		"propagating thickness":             func(l *model.Limits, v float64) { l.PropagatingThickness = v },
		"propagating maximum energy":        func(l *model.Limits, v float64) { l.PropagatingMaxEnergy = v },
		"safe potential":                    func(l *model.Limits, v float64) { l.SafePotential = v },
		"spark minimum potential":           func(l *model.Limits, v float64) { l.SparkMinPotential = v },
		"air breakdown field":               func(l *model.Limits, v float64) { l.AirBreakdown = v },
		"not earthed resistance":            func(l *model.Limits, v float64) { l.NotEarthed = v },
		"person maximum potential":          func(l *model.Limits, v float64) { l.PersonMaxPotential = v },
		"low conductivity":                  func(l *model.Limits, v float64) { l.LowConductivity = v },
		"high conductivity":                 func(l *model.Limits, v float64) { l.HighConductivity = v },
		"filling vd limit":                  func(l *model.Limits, v float64) { l.VesselVDHigh[model.VesselRoadTanker] = v },
		"filling vd limit low conductivity": func(l *model.Limits, v float64) { l.VesselVDLow[model.VesselRoadTanker] = v },
		"filling vd conductivity":           func(l *model.Limits, v float64) { l.VDKappa = v },
		"maximum filling velocity": func(l *model.Limits, v float64) {
			for c := model.VesselRoadTanker; c < model.NumVesselClasses; c++ {
				l.VesselMaxVelocity[c] = v
			}
		},
		"slow start velocity":           func(l *model.Limits, v float64) { l.SlowStartVelocity = v },
		"bag c point to tab":            func(l *model.Limits, v float64) { l.BagCToTab = v },
		"bag c tab to earth":            func(l *model.Limits, v float64) { l.BagTabToEarth = v },
		"bag minimum mie":               func(l *model.Limits, v float64) { l.BagMinMIE = v },
		"bag maximum current":           func(l *model.Limits, v float64) { l.BagMaxCurrent = v },
		"conductor maximum potential":   func(l *model.Limits, v float64) { l.ConductorMaxPotential = v },
		"small part capacitance":        func(l *model.Limits, v float64) { l.SmallPartCapacitance = v },
		"small part capacitance iic":    func(l *model.Limits, v float64) { l.SmallPartCapacitanceIIC = v },
		"earthing contradiction factor": func(l *model.Limits, v float64) { l.EarthingContradictionFactor = v },
		"spark surface resistance":      func(l *model.Limits, v float64) { l.SparkSurface = v },
		"corona energy":                 func(l *model.Limits, v float64) { l.CoronaEnergy = v },
		"dust brush mie":                func(l *model.Limits, v float64) { l.DustBrushMIE = v },
		"transferred charge group iii": func(l *model.Limits, v float64) {
			l.TransferredCharge[model.IIIA], l.TransferredCharge[model.IIIB], l.TransferredCharge[model.IIIC] = v, v, v
		},
		"large tank diameter":        func(l *model.Limits, v float64) { l.LargeTankDiameter = v },
		"second phase velocity":      func(l *model.Limits, v float64) { l.SecondPhaseVelocity = v },
		"second phase conductivity":  func(l *model.Limits, v float64) { l.SecondPhaseConductivity = v },
		"filter residence factor":    func(l *model.Limits, v float64) { l.FilterResidenceFactor = v },
		"filter residence time":      func(l *model.Limits, v float64) { l.FilterResidenceMax = v },
		"filter charge factor":       func(l *model.Limits, v float64) { l.FilterChargeFactor = v },
		"strainer charge factor":     func(l *model.Limits, v float64) { l.StrainerChargeFactor = v },
		"second phase charge factor": func(l *model.Limits, v float64) { l.SecondPhaseChargeFactor = v },
	}
	for _, g := range []model.Group{model.IIA, model.IIB, model.IIC} {
		gs := strings.ToLower(g.String())
		m["transferred charge "+gs] = func(l *model.Limits, v float64) { l.TransferredCharge[g] = v }
		m["brush charge density "+gs] = func(l *model.Limits, v float64) { l.BrushChargeDensity[g] = v }
		m["insulating area zone 0 "+gs] = func(l *model.Limits, v float64) { l.AreaGa[g] = v }
		m["insulating area zone 1 "+gs] = func(l *model.Limits, v float64) { l.AreaGb[g] = v }
	}
	for c := model.VesselRoadTanker; c < model.NumVesselClasses; c++ {
		cs := strings.ToLower(c.String())
		m["filling vd limit "+cs] = func(l *model.Limits, v float64) { l.VesselVDHigh[c] = v }
		m["filling vd limit low conductivity "+cs] = func(l *model.Limits, v float64) { l.VesselVDLow[c] = v }
		m["maximum filling velocity "+cs] = func(l *model.Limits, v float64) { l.VesselMaxVelocity[c] = v }
	}
	return m
}

// LimitsFromSite returns base with the limits the Site sheet overrides. The
// inventory reader validated the items (a value that cannot be used rejected
// its row and is not in site.Limits), so this only applies them, in sheet order.
func LimitsFromSite(site inventory.Site, base model.Limits) model.Limits {
	lim := base
	if len(site.Limits) == 0 {
		return lim
	}
	set := limitSetters()
	for _, sl := range site.Limits {
		if f := set[sl.Name]; f != nil {
			f(&lim, sl.Value)
		}
	}
	return lim
}

// siteItemSentinel is a value no default limit holds, set through each Site
// item to find the limits it overrides.
const siteItemSentinel = 1.234567890123e-31

// LimitOverrides maps each default limit's name (model.Citation.Limit) to the
// Site item that overrides it, found by setting every item to a sentinel
// value and seeing which limits change: the join is by the setters
// themselves, not by their names. Where several items set a limit (a general
// item and a per-class one), the one that sets the fewest limits is named,
// the later one on a tie (the per-class item after its general alias).
func LimitOverrides() map[string]inventory.LimitItem {
	base := model.DefaultLimits()
	before := model.CitationsOf(base)
	set := limitSetters()
	out := map[string]inventory.LimitItem{}
	width := map[string]int{} // limits set by the item named in out
	for _, k := range inventory.LimitItems() {
		f := set[k.Name]
		if f == nil {
			continue
		}
		l := base
		f(&l, siteItemSentinel)
		var changed []string
		for i, c := range model.CitationsOf(l) {
			if c.Value != before[i].Value {
				changed = append(changed, c.Limit)
			}
		}
		for _, name := range changed {
			if w, seen := width[name]; !seen || len(changed) <= w { // on a tie the later, per-class item
				out[name], width[name] = k, len(changed)
			}
		}
	}
	return out
}
