package inventory

import (
	"fmt"
	"math"
	"strings"
)

// Validation of the Materials sheet.

// matState is a material name's outcome for references.
type matState struct {
	m        Material
	row      int
	accepted bool
}

func (v *validator) materials(t *table) map[string]matState {
	out := map[string]matState{}
	s := v.s
	builtins := BuiltinMaterials()
	ids := idRegistry{}
	seen := map[int]bool{}
	var extra []Material
	overridden := map[string]Material{}
	for _, rr := range t.Rows {
		f := v.beginRow(t, rr, "Name", seen)
		name := f.st.id
		if name == "" {
			f.errorf("Name", ErrRequired, "give the material a name", "Name is blank")
			continue
		}
		if !ids.check(f, "Name", name) {
			continue
		}
		var base Material
		isBuiltin := false
		for _, b := range builtins {
			if sameName(b.Name, name) {
				base, isBuiltin = b, true
				name = b.Name
			}
		}
		if !isBuiltin {
			base = Material{Name: name, Permittivity: math.NaN(), SurfaceResistivity: math.NaN(), VolumeResistivity: math.NaN(), BreakdownStrength: math.NaN()}
			if isAlias(name) {
				bm, _ := LookupMaterial(name)
				f.warnf("Name", nil, "", "%q is also a name of the built-in %s; this row defines a separate material", short(name, 60), bm.Name)
			}
		}
		m := base
		m.BuiltIn = false
		m.Row = rr.Row
		class := f.enumValue("Class", FixedLists()[ListMaterialClass], map[string]string{"insulative": ClassInsulating, "static dissipative": ClassDissipative, "antistatic": ClassDissipative, "metal": ClassConductive})
		eps, _ := f.qty("Relative permittivity")
		rs, _ := f.qty("Surface resistivity")
		slope, _ := f.qty("Humidity slope")
		rv, _ := f.qty("Volume resistivity")
		eb, _ := f.qty("Breakdown strength")
		if eps.Known {
			if eps.Value < 1 || eps.Value > 100 {
				f.errorf("Relative permittivity", ErrOutOfRange, "enter epsr, e.g. 2.3 for PE", "relative permittivity %.4g is outside 1-100", eps.Value)
			}
			m.Permittivity = eps.Value
		}
		f.positive("Surface resistivity", rs)
		if rs.Known {
			m.SurfaceResistivity = rs.Value
		}
		if slope.Known {
			if slope.Value < 0 || slope.Value > 5 {
				f.errorf("Humidity slope", ErrOutOfRange, "enter decades per 10 %RH: 0 for hydrophobic plastics, about 0.8 for paper", "humidity slope %.4g is outside 0-5 decades per 10 %%RH", slope.Value)
			}
			m.HumiditySlope = slope.Value
		}
		f.positive("Volume resistivity", rv)
		if rv.Known {
			m.VolumeResistivity = rv.Value
		}
		f.positive("Breakdown strength", eb)
		if eb.Known {
			if eb.Value > 1e9 {
				f.errorf("Breakdown strength", ErrUnitSlip, "check the unit: the column is in kV/mm", "breakdown strength %s is above 1000 kV/mm", f.text("Breakdown strength"))
			}
			m.BreakdownStrength = eb.Value
		}
		if class != "" {
			if c := ClassFromSurfaceResistivity(m.SurfaceResistivity); rs.Known && c != "" && c != class {
				f.warnf("Class", ErrInconsistent, "check the class or the surface resistivity",
					"class %s does not match the surface resistivity %s, which is %s by ESD definitions", class, f.text("Surface resistivity"), c)
			}
			m.Class = class
		} else if f.text("Class") == "" && !isBuiltin {
			if c := ClassFromSurfaceResistivity(m.SurfaceResistivity); c != "" {
				m.Class = c
			} else {
				f.errorf("Class", ErrRequired, "enter the class (conductive, dissipative, insulating) or the surface resistivity", "material %s needs a Class or a Surface resistivity", short(name, 60))
			}
		}
		notes := f.text("Notes")
		src := fmt.Sprintf("survey Materials sheet row %d", rr.Row)
		if isBuiltin {
			src += fmt.Sprintf(" (overrides the built-in %s; blank cells keep its values)", base.Name)
		}
		if notes != "" {
			src += ": " + notes
		}
		m.Source = src
		accepted := !f.st.rejected()
		out[strings.ToLower(name)] = matState{m: m, row: rr.Row, accepted: accepted}
		if !accepted {
			continue
		}
		if isBuiltin {
			overridden[base.Name] = m
			f.warnf("Name", nil, "", "%s overrides the built-in material of the same name", base.Name)
		} else {
			extra = append(extra, m)
		}
	}
	for _, b := range builtins {
		if o, ok := overridden[b.Name]; ok {
			s.Materials = append(s.Materials, o)
		} else {
			s.Materials = append(s.Materials, b)
		}
	}
	s.Materials = append(s.Materials, extra...)
	return out
}
