package inventory

import (
	"strings"
)

// Validation of the Atmospheres sheet.

var dustGroups = map[string]bool{"IIIA": true, "IIIB": true, "IIIC": true}
var gasGroups = map[string]bool{"IIA": true, "IIB": true, "IIC": true}
var dustZones = map[string]bool{"20": true, "21": true, "22": true}
var gasZones = map[string]bool{"0": true, "1": true, "2": true}

func (v *validator) atmospheres(t *table) map[string]refState {
	out := map[string]refState{}
	ids := idRegistry{}
	seen := map[int]bool{}
	lists := FixedLists()
	for _, rr := range t.Rows {
		f := v.beginRow(t, rr, "ID", seen)
		a := Atmosphere{ID: f.st.id, Row: rr.Row, Description: f.text("Description"), Notes: f.text("Notes")}
		if a.ID == "" {
			f.errorf("ID", ErrRequired, "give every atmosphere a short unique ID, e.g. A-TOL", "ID is blank")
		} else if !ids.check(f, "ID", a.ID) {
			continue
		}
		a.Kind = f.enumValue("Kind", lists[ListAtmosphereKind], map[string]string{"vapor": "vapour", "gas/vapour": "vapour", "gas vapour": "vapour", "dust cloud": "dust"})
		a.Group = groupValue(f)
		a.Zone = f.enumValue("Zone", lists[ListZone], map[string]string{"zone 0": "0", "zone 1": "1", "zone 2": "2", "zone 20": "20", "zone 21": "21", "zone 22": "22", "0.0": "0", "1.0": "1", "2.0": "2", "20.0": "20", "21.0": "21", "22.0": "22", "non hazardous": "none", "unclassified": "none"})
		mie, mp := f.qty("MIE")
		f.positive("MIE", mie)
		f.slip("MIE", mie, mp, MaxMIE, "above any MIE (dusts reach about 1 J)")
		if f.text("Kind") == "" {
			f.errorf("Kind", ErrRequired, "use one of: "+strings.Join(lists[ListAtmosphereKind], ", "), "atmosphere %s needs a Kind", short(a.ID, 60))
		}
		if sub := f.text("Substance"); sub != "" {
			if bs, ok := LookupSubstance(sub); ok {
				a.Substance = bs.Name
				if a.Kind == "dust" {
					f.errorf("Substance", ErrInconsistent, "use Kind gas, vapour or hybrid, or remove the substance", "%s is a %s but Kind is dust", bs.Name, bs.Kind)
				}
				if !mie.Known && f.text("MIE") == "" {
					mie = Quantity{Value: bs.MIE, Known: true, Cell: mie.Cell}
					a.MIEFromSubstance = true
				}
				if a.Group == "" && f.text("Group") == "" {
					a.Group = bs.Group
					a.GroupFromSubstance = true
				}
			} else {
				a.Substance = sub
				fix := "give MIE and Group from the site's data"
				if near := Nearest(sub, substanceNames()); near != "" {
					fix = didYouMean(sub, near) + " (or give MIE and Group)"
				}
				if !mie.Known {
					f.errorf("Substance", ErrUnknownReference, fix, "substance %q is not in the built-in list, and MIE is blank", short(sub, 60))
				} else {
					f.warnf("Substance", ErrUnknownReference, fix, "substance %q is not in the built-in list; the MIE as given is used", short(sub, 60))
				}
			}
		}
		a.MIE = mie
		if a.Kind != "" && a.Kind != "none" {
			if !a.MIE.Known && f.text("MIE") == "" && f.text("Substance") == "" {
				f.errorf("MIE", ErrRequired, "enter the MIE in mJ, or a built-in Substance", "atmosphere %s (%s) needs an MIE", short(a.ID, 60), a.Kind)
			}
			if a.Group == "" && f.text("Group") == "" {
				f.warnf("Group", ErrRequired, "enter the group from the site's classification", "Group is blank; the strictest group's limits will have to be assumed")
			}
			if a.Zone == "" && f.text("Zone") == "" {
				f.warnf("Zone", ErrRequired, "enter the zone from the site's hazardous-area classification", "Zone is blank; an unzoned area may have to be treated as the strictest zone")
			}
		}
		switch a.Kind {
		case "dust":
			if gasGroups[a.Group] {
				f.errorf("Group", ErrInconsistent, "use IIIA, IIIB or IIIC for a dust", "group %s is a gas group but Kind is dust", a.Group)
			}
			if gasZones[a.Zone] {
				f.errorf("Zone", ErrInconsistent, "use zone 20, 21 or 22 for a dust", "zone %s is a gas zone but Kind is dust", a.Zone)
			}
		case "gas", "vapour", "mist":
			if dustGroups[a.Group] {
				f.errorf("Group", ErrInconsistent, "use IIA, IIB or IIC, or Kind dust or hybrid", "group %s is a dust group but Kind is %s", a.Group, a.Kind)
			}
			if dustZones[a.Zone] {
				f.errorf("Zone", ErrInconsistent, "use zone 0, 1 or 2, or Kind dust or hybrid", "zone %s is a dust zone but Kind is %s", a.Zone, a.Kind)
			}
		case "none":
			if a.Zone != "" && a.Zone != "none" {
				f.errorf("Zone", ErrInconsistent, "set Kind to the atmosphere's kind, or Zone to none", "Kind none cannot be in zone %s", a.Zone)
			}
		}
		accepted := !f.st.rejected()
		if a.ID != "" {
			out[a.ID] = refState{ID: a.ID, Row: rr.Row, Accepted: accepted}
		}
		if accepted {
			v.s.Atmospheres = append(v.s.Atmospheres, a)
		}
	}
	return out
}

// groupValue reads a gas or dust group, accepting "iia", "II A", "IIa".
func groupValue(f *field) string {
	raw := f.text("Group")
	if raw == "" {
		return ""
	}
	n := strings.ToUpper(strings.NewReplacer(" ", "", "-", "", "_", "").Replace(raw))
	n = strings.TrimPrefix(n, "GROUP")
	for _, g := range FixedLists()[ListGroup] {
		if g == n {
			return g
		}
	}
	return f.enumValue("Group", FixedLists()[ListGroup], nil)
}
