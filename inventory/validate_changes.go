package inventory

import (
	"strings"
)

// Validation of the Changes sheet.

// ChangeKinds lists the Change codes of the Changes sheet.
func ChangeKinds() []string {
	return []string{"rh", "station-rh", "earth", "material", "footwear", "margin", "speed", "conductivity", "bag-type", "filling", "vessel-material"}
}

func (v *validator) changes(t *table, stations, objs map[string]refState) {
	seen := map[int]bool{}
	for _, rr := range t.Rows {
		f := v.beginRow(t, rr, "Change", seen)
		c := Change{Row: rr.Row, Target: f.text("Target"), Value: f.text("Value"), Note: f.text("Notes")}
		c.Change = f.enumValue("Change", ChangeKinds(), nil)
		if f.text("Change") == "" {
			f.errorf("Change", ErrRequired, "use one of: "+strings.Join(ChangeKinds(), ", "), "Change is blank")
		}
		if c.Value == "" {
			f.errorf("Value", ErrRequired, "enter the new value with its unit, e.g. 60 %", "Value is blank")
		}
		if c.Target != "" {
			lt := strings.ToLower(c.Target)
			if strings.HasPrefix(lt, "station:") {
				id := strings.TrimSpace(c.Target[len("station:"):])
				if rid, ok := f.resolve("Target", id, stations, SheetStations, v.tables[SheetStations].Present); ok {
					c.Target = "station:" + rid
				}
			} else if rid, ok := f.resolve("Target", c.Target, objs, SheetObjects, v.tables[SheetObjects].Present); ok {
				c.Target = rid
			}
		}
		if !f.st.rejected() {
			v.s.Changes = append(v.s.Changes, c)
		}
	}
}
