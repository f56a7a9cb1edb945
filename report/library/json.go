package library

import (
	"encoding/json"
	"io"
	"math"
	"strconv"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/templates"
)

// finite is v to 12 significant digits (no unit-conversion noise such as
// 5.000000000000001), or nil (JSON null) when v is unknown (NaN) or infinite.
func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	return &r
}

// WriteJSON writes the library as one JSON document: materials and
// substances in SI (their field names carry the unit), every limit with its
// SI value, the Site item that overrides it and the value in that item's unit.
func WriteJSON(out io.Writer) error {
	type jm map[string]any
	var mats, subs, lims, items []jm
	for _, m := range inventory.BuiltinMaterials() {
		mats = append(mats, jm{"name": m.Name, "class": m.Class, "relative_permittivity": finite(m.Permittivity),
			"surface_resistivity_ohm": finite(m.SurfaceResistivity), "humidity_slope_decades_per_10_rh": finite(m.HumiditySlope),
			"volume_resistivity_ohm_m": finite(m.VolumeResistivity), "breakdown_strength_kv_per_mm": finite(m.BreakdownStrength / 1e6), "source": m.Source})
	}
	for _, s := range inventory.BuiltinSubstances() {
		subs = append(subs, jm{"name": s.Name, "kind": s.Kind, "mie_mj": finite(s.MIE * 1e3), "group": s.Group,
			"conductivity_ps_per_m": finite(s.Conductivity * 1e12), "relative_permittivity": finite(s.Permittivity), "source": s.Source})
	}
	for _, r := range model.LimitTable() {
		l := jm{"limit": r.Key, "label": r.Label, "value_si": finite(r.Default), "unit_si": r.Unit, "source": r.Source(), "reference": r.Ref,
			"edition": r.Edition(), "from_memory": r.FromMemory, "site_item": nil, "value": finite(r.Default), "unit": r.Unit}
		if k, ok := inventory.LimitItemNamed(r.SiteItem); ok {
			l["site_item"] = k.Name
			if v, ok := k.FromSI(r.Default); ok {
				l["value"], l["unit"] = finite(v), k.Unit
			}
		}
		lims = append(lims, l)
	}
	for _, k := range inventory.LimitItems() {
		items = append(items, jm{"item": k.Name, "unit": k.Unit, "sets": k.Note})
	}
	var refs []jm
	for _, r := range model.References() {
		refs = append(refs, jm{"key": r.Key, "edition": r.Edition, "kind": r.Kind, "title": r.Title, "note": r.Note})
	}
	enc := json.NewEncoder(out)
	enc.SetIndent("", "  ")
	return enc.Encode(jm{"materials": mats, "substances": subs, "limits": lims, "site_items": items, "references": refs, "cautions": templates.CautionLine})
}
