package rerun

import (
	"encoding/json"
	"fmt"
	"slices"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Side is one survey (or audit) as compare sees it.
type Side struct {
	Label    string // file name
	Objects  []SideObject
	Stations []SideStation // ranked, worst first
}

// SideObject is one object with the fields compare looks at.
type SideObject struct {
	ID, Station string
	Verdict     string
	Ratio       *float64
	Fields      []Field // in column order
}

// Field is one named value of an object, as text (SI value with its unit), so
// any two can be compared and shown.
type Field struct{ Name, Value string }

// SideStation is one station's rank and verdict.
type SideStation struct {
	ID, Name   string
	Rank       int
	Verdict    string
	WorstRatio *float64
}

// Changed is one object found in both with different fields.
type Changed struct {
	ID, Station                 string
	Fields                      []string // names of the fields that differ, column order
	Before, After               []string // their values, aligned with Fields
	VerdictBefore, VerdictAfter string
	RatioBefore, RatioAfter     *float64
}

// RankMove is one station whose rank moved (or that is only on one side: rank 0).
type RankMove struct {
	ID, Name                    string
	RankBefore, RankAfter       int // 0: not on that side
	VerdictBefore, VerdictAfter string
}

// Comparison is the difference between two surveys of the same floor.
type Comparison struct {
	Old, New       *Side
	Added, Removed []string // object IDs, in the order of their side
	Changed        []Changed
	Stations       []RankMove // new side's ranking order, then removed stations
}

// SideFromAudit takes an audit of a survey: every reading and setting of the
// Objects sheet is a field, then the verdict and the ratio.
func SideFromAudit(label string, a *assess.Audit) *Side {
	s := &Side{Label: label}
	for i := range a.Objects {
		r := &a.Objects[i]
		o := SideObject{ID: r.Object.ID, Station: r.Object.Station, Verdict: r.Verdict.String(), Ratio: r.Ratio}
		o.Fields = objectFields(&r.Object)
		o.Fields = append(o.Fields, Field{"Verdict", o.Verdict}, Field{"Ratio", ratioText(r.Ratio)})
		s.Objects = append(s.Objects, o)
	}
	for _, st := range a.Stations {
		s.Stations = append(s.Stations, SideStation{ID: st.Station.ID, Name: st.Station.Name, Rank: st.Rank, Verdict: st.Verdict.String(), WorstRatio: st.WorstRatio})
	}
	return s
}

func objectFields(o *inventory.Object) []Field {
	q := func(name string, v inventory.Quantity, unit string) Field {
		if !v.Known {
			return Field{name, ""}
		}
		return Field{name, fmtSig(v.Value) + " " + unit}
	}
	return []Field{
		{"Station", o.Station}, {"Kind", o.Kind}, {"Material", o.Material},
		q("Length", o.Length, "m"), q("Width", o.Width, "m"), q("Diameter", o.Diameter, "m"), q("Thickness", o.Thickness, "m"),
		{"Backing", o.Backing}, q("Distance to earth", o.DistanceToEarth, "m"),
		q("Field", o.Field, "V/m"), q("Field distance", o.FieldDistance, "m"), q("Surface potential", o.SurfacePotential, "V"),
		q("Speed", o.Speed, "m/s"), q("Mass flow", o.MassFlow, "kg/s"), q("Charge-to-mass", o.ChargeToMass, "C/kg"),
		q("Charging current", o.ChargingCurrent, "A"), q("Charging time", o.ChargingTime, "s"), q("Particle size", o.ParticleSize, "m"),
		q("Resistance to earth", o.Resistance, "Ω"), q("Capacitance", o.Capacitance, "F"),
		q("Conductivity", o.Conductivity, "S/m"), q("Relative permittivity", o.Permittivity, ""),
		{"Bag type", o.BagType}, {"Filling", o.Filling},
		q("Layer breakdown", o.LayerBreakdown, "V"), {"Process", o.Process},
		{"Vessel material", o.VesselMaterial}, {"Vessel class", o.VesselClass}, q("Vessel diameter", o.VesselDiameter, "m"),
		{"Filter", o.Filter}, q("Residence time", o.Residence, "s"), {"Second phase", o.SecondPhase}, q("Inlet velocity", o.InletVelocity, "m/s"),
	}
}

func ratioText(r *float64) string {
	if r == nil {
		return ""
	}
	return fmtSig(*r)
}

// auditJSON is the part of audit.WriteJSON's document compare reads.
type auditJSON struct {
	Survey struct {
		File string `json:"file"`
	} `json:"survey"`
	Stations []struct {
		ID         string   `json:"id"`
		Name       string   `json:"name"`
		Rank       int      `json:"rank"`
		Verdict    string   `json:"verdict"`
		WorstRatio *float64 `json:"worst_ratio"`
	} `json:"stations"`
	Objects []map[string]json.RawMessage `json:"objects"`
}

// jsonFields are the object keys of an audit JSON compared, in order; the JSON
// carries the model's results, not the survey's readings.
func jsonFields() [][2]string {
	return [][2]string{
		{"station", "Station"}, {"kind", "Kind"}, {"potential_V", "Potential [V]"}, {"capacitance_F", "Capacitance [F]"},
		{"charge_density_C_per_m2", "Charge density [C/m²]"}, {"surface_field_V_per_m", "Surface field [V/m]"},
		{"charging_current_A", "Charging current [A]"}, {"surface_resistivity_ohm", "Surface resistivity [Ω]"},
		{"energy_J", "Energy [J]"}, {"effective_discharge", "Effective discharge"}, {"verdict", "Verdict"}, {"ratio", "Ratio"},
	}
}

// SideFromJSON reads an audit JSON as written by audit.WriteJSON. Its objects
// carry results, not readings, so the fields compared are the model's
// quantities (potential, capacitance, charge density...), the verdict and the ratio.
func SideFromJSON(label string, data []byte) (*Side, error) {
	var d auditJSON
	if err := json.Unmarshal(data, &d); err != nil {
		return nil, fmt.Errorf("%s: not an audit JSON: %w", label, err)
	}
	if d.Objects == nil && d.Stations == nil {
		return nil, fmt.Errorf("%s: not an audit JSON: no \"objects\" nor \"stations\"", label)
	}
	s := &Side{Label: label}
	for i, m := range d.Objects {
		var id string
		if err := json.Unmarshal(m["id"], &id); err != nil || id == "" {
			return nil, fmt.Errorf("%s: objects[%d] has no \"id\"", label, i)
		}
		o := SideObject{ID: id}
		for _, k := range jsonFields() {
			raw, ok := m[k[0]]
			val := ""
			if ok && string(raw) != "null" {
				var str string
				var f float64
				switch {
				case json.Unmarshal(raw, &str) == nil:
					val = str
				case json.Unmarshal(raw, &f) == nil:
					val = fmtSig(f)
					if k[0] == "ratio" {
						o.Ratio = &f
					}
				default:
					val = string(raw)
				}
			}
			switch k[0] {
			case "station":
				o.Station = val
			case "verdict":
				o.Verdict = val
			}
			o.Fields = append(o.Fields, Field{k[1], val})
		}
		s.Objects = append(s.Objects, o)
	}
	for _, st := range d.Stations {
		s.Stations = append(s.Stations, SideStation{ID: st.ID, Name: st.Name, Rank: st.Rank, Verdict: st.Verdict, WorstRatio: st.WorstRatio})
	}
	return s, nil
}

// Compare finds the objects added, removed and changed between two sides, and
// the stations whose rank moved.
func Compare(old, new *Side) *Comparison {
	c := &Comparison{Old: old, New: new}
	oldByID := map[string]*SideObject{}
	for i := range old.Objects {
		oldByID[old.Objects[i].ID] = &old.Objects[i]
	}
	newIDs := map[string]bool{}
	for i := range new.Objects {
		n := &new.Objects[i]
		newIDs[n.ID] = true
		o, ok := oldByID[n.ID]
		if !ok {
			c.Added = append(c.Added, n.ID)
			continue
		}
		ch := Changed{ID: n.ID, Station: n.Station, VerdictBefore: o.Verdict, VerdictAfter: n.Verdict, RatioBefore: o.Ratio, RatioAfter: n.Ratio}
		ov := map[string]string{}
		for _, f := range o.Fields {
			ov[f.Name] = f.Value
		}
		for _, f := range n.Fields {
			if b, ok := ov[f.Name]; ok && b != f.Value {
				ch.Fields = append(ch.Fields, f.Name)
				ch.Before = append(ch.Before, b)
				ch.After = append(ch.After, f.Value)
			}
		}
		if len(ch.Fields) > 0 {
			c.Changed = append(c.Changed, ch)
		}
	}
	for _, o := range old.Objects {
		if !newIDs[o.ID] {
			c.Removed = append(c.Removed, o.ID)
		}
	}
	oldSt := map[string]SideStation{}
	for _, s := range old.Stations {
		oldSt[s.ID] = s
	}
	seen := map[string]bool{}
	for _, n := range new.Stations {
		seen[n.ID] = true
		o, ok := oldSt[n.ID]
		if ok && o.Rank == n.Rank {
			continue
		}
		m := RankMove{ID: n.ID, Name: n.Name, RankAfter: n.Rank, VerdictAfter: n.Verdict}
		if ok {
			m.RankBefore, m.VerdictBefore = o.Rank, o.Verdict
		}
		c.Stations = append(c.Stations, m)
	}
	for _, o := range old.Stations {
		if !seen[o.ID] {
			c.Stations = append(c.Stations, RankMove{ID: o.ID, Name: o.Name, RankBefore: o.Rank, VerdictBefore: o.Verdict})
		}
	}
	return c
}

// VerdictChanged reports whether the object's verdict differs between the sides.
func (c Changed) VerdictChanged() bool { return c.VerdictBefore != c.VerdictAfter }

// hasField reports whether name is among the changed fields.
func (c Changed) hasField(name string) bool { return slices.Contains(c.Fields, name) }
