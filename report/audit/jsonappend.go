package audit

import (
	"math"
	"sort"
	"strconv"
	"unicode/utf8"

	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
)

// jsonOut appends JSON as encoding/json's Encoder with SetIndent(prefix,
// "  ") and SetEscapeHTML(false) writes it, without reflection or the
// intermediate jsonObject: the streamed JSON's objects (JSONWriter) are
// appended field by field. TestStreamedOutputsMatch holds its bytes to
// WriteJSON's (encoding/json over objectJSON) on the demo; a field added to
// jsonObject is one line in appendObjectJSON.
type jsonOut struct {
	b      []byte
	prefix string
	depth  int
	first  bool // no member written yet in the open object or array
}

func (j *jsonOut) newline() {
	j.b = append(j.b, '\n')
	j.b = append(j.b, j.prefix...)
	for i := 0; i < j.depth; i++ {
		j.b = append(j.b, "  "...)
	}
}

// key starts a member of the open object.
func (j *jsonOut) key(k string) {
	if !j.first {
		j.b = append(j.b, ',')
	}
	j.first = false
	j.newline()
	j.b = appendJSONString(j.b, k)
	j.b = append(j.b, ": "...)
}

// elem starts an element of the open array.
func (j *jsonOut) elem() {
	if !j.first {
		j.b = append(j.b, ',')
	}
	j.first = false
	j.newline()
}

func (j *jsonOut) open(c byte) {
	j.b = append(j.b, c)
	j.depth++
	j.first = true
}

func (j *jsonOut) close(c byte) {
	j.depth--
	if !j.first { // an empty object or array stays "{}" / "[]"
		j.newline()
	}
	j.first = false
	j.b = append(j.b, c)
}

func (j *jsonOut) str(k, v string) { j.key(k); j.b = appendJSONString(j.b, v) }

func (j *jsonOut) strOrNull(k string, v *string) {
	j.key(k)
	if v == nil {
		j.b = append(j.b, "null"...)
		return
	}
	j.b = appendJSONString(j.b, *v)
}

func (j *jsonOut) boolean(k string, v bool) { j.key(k); j.b = strconv.AppendBool(j.b, v) }

// num writes a finite value, or null for NaN and infinities (book.Finite).
func (j *jsonOut) num(k string, v float64) {
	j.key(k)
	if math.IsNaN(v) || math.IsInf(v, 0) {
		j.b = append(j.b, "null"...)
		return
	}
	j.b = appendJSONFloat(j.b, v)
}

// numOmit writes a finite value and leaves the member out otherwise (omitempty on a nil pointer).
func (j *jsonOut) numOmit(k string, v float64) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return
	}
	j.num(k, v)
}

// appendJSONFloat formats as encoding/json does a float64.
func appendJSONFloat(b []byte, f float64) []byte {
	abs := math.Abs(f)
	format := byte('f')
	if abs != 0 && (abs < 1e-6 || abs >= 1e21) {
		format = 'e'
	}
	b = strconv.AppendFloat(b, f, format, -1, 64)
	if format == 'e' {
		// clean up e-09 to e-9
		n := len(b)
		if n >= 4 && b[n-4] == 'e' && b[n-3] == '-' && b[n-2] == '0' {
			b[n-2] = b[n-1]
			b = b[:n-1]
		}
	}
	return b
}

const hexDigits = "0123456789abcdef"

// appendJSONString quotes s as encoding/json does with HTML escaping off.
func appendJSONString(b []byte, s string) []byte {
	b = append(b, '"')
	start := 0
	for i := 0; i < len(s); {
		if c := s[i]; c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' {
				i++
				continue
			}
			b = append(b, s[start:i]...)
			switch c {
			case '\\', '"':
				b = append(b, '\\', c)
			case '\b':
				b = append(b, '\\', 'b')
			case '\f':
				b = append(b, '\\', 'f')
			case '\n':
				b = append(b, '\\', 'n')
			case '\r':
				b = append(b, '\\', 'r')
			case '\t':
				b = append(b, '\\', 't')
			default:
				b = append(b, '\\', 'u', '0', '0', hexDigits[c>>4], hexDigits[c&0xF])
			}
			i++
			start = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, s[start:i]...)
			b = append(b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if r == '\u2028' || r == '\u2029' {
			b = append(b, s[start:i]...)
			b = append(b, '\\', 'u', '2', '0', '2', hexDigits[r&0xF])
			i += size
			start = i
			continue
		}
		i += size
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}

// appendObjectJSON appends one object of the audit JSON as WriteJSON writes
// it (objectJSON's fields in jsonObject's order): one line per field.
func appendObjectJSON(j *jsonOut, o *assess.ObjectResult) {
	e := &o.Eval
	j.open('{')
	j.str("id", o.Object.ID)
	j.str("station", o.Object.Station)
	j.str("kind", o.Object.Kind)
	j.str("verdict", o.Verdict.String())
	j.str("reason", o.Reason)
	ratio := math.NaN()
	if o.Ratio != nil {
		ratio = *o.Ratio
	}
	j.num("ratio", ratio)
	energy, discharge, note := math.NaN(), (*string)(nil), false
	if o.EnergyStated() {
		energy = e.EffectiveEnergy
		if book.Finite(energy) != nil && energy > 0 {
			s := e.Effective.String()
			discharge = &s
		}
		note = assess.AssumedInputDominates(e, e.Effective) && o.Ratio != nil && *o.Ratio >= 1
	}
	j.num("energy_J", energy)
	j.strOrNull("effective_discharge", discharge)
	j.num("potential_V", e.Potential)
	j.num("capacitance_F", e.Capacitance)
	j.boolean("capacitance_measured", o.Object.Capacitance.Known)
	j.num("charge_density_C_per_m2", e.ChargeDensity)
	j.num("surface_field_V_per_m", e.SurfaceField)
	j.num("charging_current_A", e.ChargingCurrent)
	j.num("stored_energy_J", e.StoredEnergy)
	j.num("transferred_charge_C", e.TransferredCharge)
	j.num("insulating_area_m2", e.InsulatingArea)
	j.num("surface_resistivity_ohm", e.SurfaceResistivity)
	j.num("decay_time_s", e.DecayTime)
	j.num("time_to_100V_s", e.TimeTo100V)
	j.num("relaxation_time_s", e.RelaxationTime)
	j.num("streaming_current_A", e.StreamingCurrent)
	j.num("velocity_diameter_m2_per_s", e.VelocityDiameter)
	j.num("air_field_V_per_m", e.AirField)
	j.num("layer_field_V_per_m", e.LayerField)
	j.num("layer_voltage_V", e.LayerVoltage)
	j.num("layer_breakdown_V", e.LayerBreakdown)
	var source *string
	if book.Finite(e.LayerBreakdown) != nil {
		s := e.BreakdownSource.String()
		source = &s
	}
	j.strOrNull("layer_breakdown_source", source)
	j.num("charging_current_density_A_per_m2", e.ChargingDensity)
	j.key("process_material")
	switch {
	case (e.Kind == model.Sheet || e.Kind == model.Belt || e.Kind == model.Roller) && (!math.IsNaN(e.InsulatingArea) || e.Kind != model.Roller):
		j.b = strconv.AppendBool(j.b, e.ProcessMaterial)
	default:
		j.b = append(j.b, "null"...)
	}
	j.boolean("isolated_conductor", e.IsolatedConductor)
	if e.Kind == model.Liquid {
		j.numOmit("vd_limit_m2_per_s", e.VDLimit)
		j.numOmit("velocity_limit_m_per_s", e.VelocityLimit)
		j.numOmit("charge_factor", e.ChargeFactor)
		j.numOmit("filter_residence_needed_s", e.FilterResidence)
		if t := e.LiquidBreaches.Texts(); len(t) > 0 {
			j.key("filling_clauses_not_met")
			j.open('[')
			for _, s := range t {
				j.elem()
				j.b = appendJSONString(j.b, s)
			}
			j.close(']')
		}
	}
	j.key("discharges")
	j.open('[')
	for i, d := range e.Discharges {
		j.elem()
		j.open('{')
		j.str("type", model.DischargeType(i).String())
		j.boolean("possible", d.Possible)
		j.num("energy_J", d.Energy)
		j.num("charge_C", d.Charge)
		j.str("reason", dischargeReason(d))
		j.close('}')
	}
	j.close(']')
	j.key("findings")
	j.open('[')
	for _, f := range o.Findings {
		j.elem()
		j.open('{')
		j.str("check", f.Check)
		j.str("severity", f.Severity.String())
		j.str("message", f.Message)
		j.str("mitigation", f.Mitigation)
		j.str("basis", f.Basis)
		j.close('}')
	}
	j.close(']')
	j.key("defaults")
	j.open('[')
	for _, d := range o.Defaults() {
		j.elem()
		j.open('{')
		j.str("field", d.Label)
		j.str("value", d.Value)
		j.str("reason", d.Reason)
		j.str("provenance", d.Prov.String())
		j.close('}')
	}
	j.close(']')
	// provenance: a map in encoding/json, so its keys in sorted order.
	prov := map[string]string{}
	for _, m := range o.Marks {
		if k := m.Item.Key(); k != "" {
			prov[k] = o.Provenance(m.Item).String()
		}
	}
	keys := make([]string, 0, len(prov))
	for k := range prov {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	j.key("provenance")
	j.open('{')
	for _, k := range keys {
		j.str(k, prov[k])
	}
	j.close('}')
	rt := assess.RatioText(o.Ratio)
	if rt == "" && o.RatioAssumed() {
		rt = assess.RatioAssumedText
	}
	if rt != "" {
		j.str("ratio_text", rt)
	}
	if p := o.Probability; p != nil {
		j.key("probability")
		j.open('{')
		j.num("incendive", p.Incendive)
		j.num("marginal", p.Marginal)
		j.num("non-incendive", p.NonIncendive)
		j.num("not assessed", p.NotAssessed)
		j.boolean("borderline", o.Borderline())
		if d := p.Driver; d.Input != "" {
			j.key("driver")
			j.open('{')
			j.str("input", d.Input)
			j.num("rank_correlation", d.Correlation)
			j.str("advice", o.MeasureText())
			j.close('}')
		}
		j.close('}')
		if !o.RatioAssumed() { // withheld: they would be the spread of an assumption (PercentilesWithheldText)
			j.numOmit("energy_J_p05", p.EnergyP05)
			j.numOmit("energy_J_p50", p.EnergyP50)
			j.numOmit("energy_J_p95", p.EnergyP95)
		}
	}
	if note {
		j.str("energy_note", EnergyAtLeastMIE)
		j.boolean("ratio_assumed_resistance", true)
	}
	j.close('}')
}
