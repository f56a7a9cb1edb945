package rerun

import (
	"fmt"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// flagHelp is the whatif flag's help text of each change kind.
var flagHelp = map[string]string{
	ChangeRH:             "site relative humidity in %, e.g. 55 (stations without their own RH)",
	ChangeStationRH:      "a station's relative humidity, e.g. ST-LAM=60",
	ChangeEarth:          "resistance to earth of an object or of every conductor at a station, e.g. DRM-DRUM=1e6, station:ST-PWD=1MΩ",
	ChangeMaterial:       "material swap, e.g. COAT-WEB=PE",
	ChangeFootwear:       "a person's resistance to earth through footwear and floor, e.g. MIX-OP=1e7 or station:ST-MIX=1e7",
	ChangeMargin:         "required margin (energy below MIE / margin), e.g. 20",
	ChangeSpeed:          "speed (liquid: flow velocity in the line), e.g. MIX-TOL1=1 or 1 m/s",
	ChangeConductivity:   "liquid conductivity (e.g. with an additive), e.g. MIX-TOL1=500pS/m",
	ChangeBagType:        "bulk bag type A, B, C or D, e.g. BAG-A=C",
	ChangeFilling:        "liquid filling method top, bottom or dip pipe, e.g. MIX-TOL1=\"dip pipe\"",
	ChangeVesselMaterial: "receiving vessel material metal, insulating, lined or glass, e.g. BAY-IBC=metal",
}

// FlagHelp is the help text of the whatif flag of a change kind.
func FlagHelp(kind string) string { return flagHelp[kind] }

// FlagArg is one change flag as given on the command line.
type FlagArg struct{ Kind, Arg string }

// CollectChanges gathers a what-if plan: the survey's Changes sheet first
// (unless useSheet is false), then the flags in their order. A rejected
// Changes row stops the run: a plan must not be half applied without notice.
func CollectChanges(s *inventory.Survey, useSheet bool, flags []FlagArg) ([]Change, error) {
	var out []Change
	if useSheet {
		for _, r := range s.Rejected {
			if r.Sheet == inventory.SheetChanges && len(r.Problems) > 0 {
				return nil, fmt.Errorf("the survey's Changes sheet has a rejected row: %s (fix it or pass --no-sheet-changes)", r.Problems[0].Error())
			}
		}
		out = append(out, FromSheet(s)...)
	}
	for _, f := range flags {
		c, err := ParseFlag(f.Kind, f.Arg)
		if err != nil {
			return nil, err
		}
		out = append(out, c)
	}
	return out, nil
}
