package inventory

// Validation of the Stations sheet.

func (v *validator) stations(t *table, atms map[string]refState) map[string]refState {
	out := map[string]refState{}
	ids := idRegistry{}
	seen := map[int]bool{}
	atmPresent := v.tables[SheetAtmospheres].Present
	for _, rr := range t.Rows {
		f := v.beginRow(t, rr, "ID", seen)
		st := Station{ID: f.st.id, Row: rr.Row, Name: f.text("Name"), Line: f.text("Line"), Notes: f.text("Notes")}
		dup := false
		if st.ID == "" {
			f.errorf("ID", ErrRequired, "give every station a unique ID, e.g. ST-UNW", "ID is blank")
		} else if !ids.check(f, "ID", st.ID) {
			dup = true
		}
		if ref := f.text("Atmosphere"); ref != "" && NormalizeName(ref) != "none" {
			if id, ok := f.resolve("Atmosphere", ref, atms, SheetAtmospheres, atmPresent); ok {
				st.Atmosphere = id
			}
		}
		rh, _ := f.qty("Relative humidity")
		for _, p := range checkRH(rh) {
			f.add(p.Severity, "Relative humidity", p.Err, p.Message, p.Fix)
		}
		st.RelativeHumidity = rh
		accepted := !f.st.rejected()
		if st.ID != "" && !dup {
			out[st.ID] = refState{ID: st.ID, Row: rr.Row, Accepted: accepted}
		}
		if accepted {
			v.s.Stations = append(v.s.Stations, st)
		}
	}
	return out
}
