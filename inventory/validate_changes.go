package inventory

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// The Changes sheet and the whatif flags speak one grammar: a change kind
// (the table below), a target (none, a station, or an object or station:ID)
// and a value with its unit. ParseChange reads it for both, so a line that
// works as a flag works as a sheet row and fails the same way.

// Sentinel errors of a change, usable with errors.Is on a *ChangeProblem (and
// on report/rerun's ChangeError, which wraps the same sentinels).
var (
	// ErrChangeSyntax: the change is not written as it needs (a target where
	// none is taken, none where one is needed, TARGET=VALUE malformed).
	ErrChangeSyntax = errors.New("bad change syntax")
	// ErrUnknownChange: the change code is not in the change table.
	ErrUnknownChange = errors.New("unknown change")
	// ErrBadChangeValue: the value is not usable for the change (unit, range, word).
	ErrBadChangeValue = errors.New("bad change value")
)

// ChangeTarget says what a change kind takes as its target.
type ChangeTarget int

// Change targets.
const (
	// TargetSite: no target, the change applies to the whole site.
	TargetSite ChangeTarget = iota
	// TargetStation: a station ID ("ST-DRY" or "station:ST-DRY").
	TargetStation
	// TargetObject: an object ID, or station:ID for every matching row of a station.
	TargetObject
)

// ChangeKind is one kind of planned change. This table is the one place a
// change kind is defined: the Changes sheet's codes and hint, the whatif flags
// and their help, and the whatif Method text derive from it; report/rerun
// applies each kind under its Code (TestChangeKindsAllApplied there fails
// when a kind has no apply step).
type ChangeKind struct {
	Code    string    // the flag without dashes and the Changes sheet's Change cell
	Dim     Dimension // Text for a word value (material, bag type...)
	Unit    string    // the unit of a bare number ("%", "Ω"); "" for plain numbers and words
	Choices []string  // the words a Text value takes (canonical spelling); nil: any name
	Noun    string    // what a Choices word is, for messages ("bag type")
	Aliases map[string]string
	Targets ChangeTarget
	// Check refuses a parsed number outside the kind's range: message and fix, "" when fine.
	Check   func(v float64) (msg, fix string)
	Example string // the value part as a flag takes it: "DRM-DRUM=1e6" or "55"
	Help    string // what the change sets, one line
}

func rhRange(v float64) (string, string) {
	if v < 0 || v > 100 {
		return fmt.Sprintf("%g %% is not a relative humidity", v), "relative humidity is 0-100 %"
	}
	return "", ""
}

func above0(what, fix string) func(float64) (string, string) {
	return func(v float64) (string, string) {
		if !(v > 0) {
			return fmt.Sprintf("%g is not %s", v, what), fix
		}
		return "", ""
	}
}

// changeKinds is the change table, in the order flags and help list them.
func changeKinds() []ChangeKind {
	return []ChangeKind{
		{Code: "rh", Dim: Percent, Unit: "%", Targets: TargetSite, Check: rhRange, Example: "55",
			Help: "site relative humidity in %: reaches the stations that give no RH of their own"},
		{Code: "station-rh", Dim: Percent, Unit: "%", Targets: TargetStation, Check: rhRange, Example: "ST-UNW=60",
			Help: "a station's relative humidity in %"},
		{Code: "earth", Dim: Resistance, Unit: "Ω", Targets: TargetObject, Check: above0("a resistance to earth", "a resistance to earth is above 0 Ω"),
			Example: "DRM-DRUM=1e6", Help: "resistance to earth of an object, or of every conductor at a station (station:ID), in Ω"},
		{Code: "material", Dim: Text, Targets: TargetObject, Example: "COAT-WEB=PE",
			Help: "material swap: a built-in name or one on the Materials sheet"},
		{Code: "footwear", Dim: Resistance, Unit: "Ω", Targets: TargetObject, Check: above0("a resistance to earth", "a resistance to earth is above 0 Ω"),
			Example: "MIX-OP=1e7", Help: "a person's resistance to earth through footwear and floor, in Ω (a person, or every person at station:ID)"},
		{Code: "margin", Dim: Dimensionless, Targets: TargetSite, Example: "20",
			Check: func(v float64) (string, string) {
				if v < 1 {
					return fmt.Sprintf("margin %g is below 1", v), "a margin is a factor of at least 1 (energy below MIE / margin), e.g. 10"
				}
				return "", ""
			},
			Help: "required margin: the energy must stay below MIE / margin"},
		{Code: "speed", Dim: Speed, Unit: "m/s", Targets: TargetObject, Example: "MIX-TOL1=1",
			Check: func(v float64) (string, string) {
				if v < 0 {
					return fmt.Sprintf("%g m/s is negative", v), "a speed is 0 or more"
				}
				return "", ""
			},
			Help: "speed in m/s (a liquid: flow velocity in the line)"},
		{Code: "conductivity", Dim: Conductivity, Unit: "pS/m", Targets: TargetObject, Check: above0("a conductivity", "a conductivity is above 0, e.g. 500 pS/m"),
			Example: "MIX-TOL1=500pS/m", Help: "liquid conductivity in pS/m (e.g. with a conductivity additive)"},
		{Code: "bag-type", Dim: Text, Noun: "bag type", Choices: []string{"A", "B", "C", "D"}, Aliases: map[string]string{"type a": "A", "type b": "B", "type c": "C", "type d": "D"},
			Targets: TargetObject, Example: "BAG-A=C", Help: "bulk bag type A, B, C or D (IEC 61340-4-4)"},
		{Code: "filling", Dim: Text, Noun: "filling method", Choices: FixedLists()[ListFilling], Aliases: map[string]string{"dip tube": "dip pipe", "diptube": "dip pipe", "top fill": "top", "bottom fill": "bottom", "splash": "top"},
			Targets: TargetObject, Example: `MIX-TOL1="dip pipe"`, Help: "liquid filling method: top, bottom or dip pipe"},
		{Code: "vessel-material", Dim: Text, Noun: "vessel material", Choices: FixedLists()[ListVesselMaterial], Aliases: map[string]string{"plastic": "insulating", "steel": "metal", "stainless steel": "metal", "coated": "lined", "conductive": "metal"},
			Targets: TargetObject, Example: "BAY-IBC=metal", Help: "receiving vessel material: metal, insulating, lined or glass"},
	}
}

// ChangeKindTable returns the change table (a fresh copy).
func ChangeKindTable() []ChangeKind { return changeKinds() }

// ChangeKinds lists the change codes, in table order.
func ChangeKinds() []string {
	var out []string
	for _, k := range changeKinds() {
		out = append(out, k.Code)
	}
	return out
}

// LookupChangeKind finds a change kind by its code (letter case and spaces ignored).
func LookupChangeKind(code string) (ChangeKind, bool) {
	code = strings.ToLower(strings.TrimSpace(code))
	for _, k := range changeKinds() {
		if k.Code == code {
			return k, true
		}
	}
	return ChangeKind{}, false
}

// FlagArg is the change as a flag takes it: "55" or "TARGET=VALUE".
func (k ChangeKind) FlagArg() string { return k.Example }

// exampleFor is the flag example an error hint gives: on the user's own target
// when there is one, else on a placeholder (OBJECT-ID, STATION-ID), never on the
// demo survey's IDs of the table's Example, which a user's survey does not have.
func (k ChangeKind) exampleFor(target string) string {
	ex := k.Example
	if _, value, ok := strings.Cut(ex, "="); ok && k.Targets != TargetSite {
		if target == "" {
			target = "OBJECT-ID"
			if k.Targets == TargetStation {
				target = "STATION-ID"
			}
		}
		ex = target + "=" + value
	}
	return "--" + k.Code + " " + ex
}

// Usage is the kind's help line with its example: "a station's relative humidity in %, e.g. --station-rh ST-UNW=60".
func (k ChangeKind) Usage() string {
	return fmt.Sprintf("%s, e.g. --%s %s", k.Help, k.Code, k.Example)
}

// PlannedChange is a change read by ParseChange: its kind, its target's shape,
// and its value parsed in the kind's unit or word list. Whether the target
// exists is checked against the survey by the caller.
type PlannedChange struct {
	Kind    ChangeKind
	Station string  // the station named (TargetStation, or station:ID)
	Object  string  // the object named (TargetObject without station:)
	Value   string  // as written, trimmed
	Number  float64 // the value in SI (percent for RH, plain for margin); NaN for words
	Word    string  // the canonical word (Choices), or the name as written (material)
	// Warning is a value read but likely meant otherwise (an RH below 1 %,
	// LowRHWarning: a fraction of 1 meant as a percentage), with its fix; "" none.
	Warning, WarningFix string
}

// ChangeProblem is a change that does not read, with the part at fault.
type ChangeProblem struct {
	Field   string // "Change", "Target" or "Value" (the Changes sheet's columns)
	Message string
	Fix     string
	Err     error // ErrChangeSyntax, ErrUnknownChange or ErrBadChangeValue (wrapping a *QuantityError when the number is at fault)
}

func (p *ChangeProblem) Error() string {
	if p.Fix != "" {
		return p.Message + "; " + p.Fix
	}
	return p.Message
}

// Unwrap returns the sentinel (and the quantity error beneath it).
func (p *ChangeProblem) Unwrap() error { return p.Err }

// ParseChange reads one change: the code, the target (blank for a site-wide
// kind; a station ID or station:ID for a station kind; an object ID or
// station:ID otherwise) and the value with its unit (a bare number is in the
// kind's unit). The Changes sheet and the whatif flags both call it.
func ParseChange(code, target, value string) (PlannedChange, error) {
	k, ok := LookupChangeKind(code)
	if !ok {
		fix := "use one of: " + strings.Join(ChangeKinds(), ", ")
		if near := Nearest(code, ChangeKinds()); near != "" {
			fix = didYouMean(code, near) + " (" + fix + ")"
		}
		return PlannedChange{}, &ChangeProblem{Field: "Change", Message: fmt.Sprintf("change %q is not known", strings.TrimSpace(code)), Fix: fix, Err: fmt.Errorf("%w (%w)", ErrUnknownChange, ErrNotInList)}
	}
	p := PlannedChange{Kind: k, Value: strings.TrimSpace(value), Number: math.NaN()}
	fail := func(field string, err error, fix, format string, args ...any) (PlannedChange, error) {
		return p, &ChangeProblem{Field: field, Message: fmt.Sprintf(format, args...), Fix: fix, Err: err}
	}
	t := strings.TrimSpace(target)
	st, isStation := cutStation(t)
	switch k.Targets {
	case TargetSite:
		if t != "" {
			return fail("Target", ErrChangeSyntax, "leave the target blank: it applies to the whole site (use station-rh for one station)", "change %s takes no target", k.Code)
		}
	case TargetStation:
		if t == "" || (isStation && st == "") {
			return fail("Target", ErrChangeSyntax, fmt.Sprintf("give a station ID, e.g. %s", k.exampleFor("")), "change %s needs a station", k.Code)
		}
		p.Station = t
		if isStation {
			p.Station = st
		}
	case TargetObject:
		if t == "" || (isStation && st == "") {
			return fail("Target", ErrChangeSyntax, fmt.Sprintf("give an object ID or station:ID, e.g. %s", k.exampleFor("")), "change %s needs a target", k.Code)
		}
		if isStation {
			p.Station = st
		} else {
			p.Object = t
		}
	}
	if p.Value == "" {
		return fail("Value", ErrChangeSyntax, fmt.Sprintf("write the new value, e.g. %s", k.exampleFor(t)), "the value is blank")
	}
	if k.Dim == Text {
		w := strings.Trim(p.Value, `"'`)
		if k.Choices == nil {
			p.Word = w
			return p, nil
		}
		n := NormalizeName(w)
		for _, c := range k.Choices {
			if NormalizeName(c) == n {
				p.Word = c
				return p, nil
			}
		}
		if a, ok := k.Aliases[n]; ok {
			p.Word = a
			return p, nil
		}
		fix := "use " + strings.Join(k.Choices[:len(k.Choices)-1], ", ") + " or " + k.Choices[len(k.Choices)-1]
		if near := Nearest(w, k.Choices); near != "" {
			fix = didYouMean(w, near) + " (" + fix + ")"
		}
		return fail("Value", ErrBadChangeValue, fix, "%q is not a %s", w, k.Noun)
	}
	q, err := ParseQuantity(p.Value, k.Unit, k.Dim)
	if err != nil {
		msg := err.Error()
		var qe *QuantityError
		if errors.As(err, &qe) {
			msg = qe.DescribeFor("the " + k.Code + " change")
		}
		return p, &ChangeProblem{Field: "Value", Message: msg, Fix: fmt.Sprintf("write e.g. %s", k.exampleFor(t)), Err: fmt.Errorf("%w: %w", ErrBadChangeValue, err)}
	}
	if !q.Known {
		return fail("Value", ErrBadChangeValue, fmt.Sprintf("write e.g. %s", k.exampleFor(t)), "%q gives no value", p.Value)
	}
	if k.Check != nil {
		if msg, fix := k.Check(q.Value); msg != "" {
			return fail("Value", ErrBadChangeValue, fix, "%s", msg)
		}
	}
	p.Number = q.Value
	if k.Dim == Percent {
		p.Warning, p.WarningFix = LowRHWarning(q.Value)
	}
	return p, nil
}

// cutStation splits "station:ID" (any letter case) into ID and true.
func cutStation(t string) (string, bool) {
	if len(t) >= 8 && strings.EqualFold(t[:8], "station:") {
		return strings.TrimSpace(t[8:]), true
	}
	return "", false
}

// changeKindHint is the Changes sheet's hint for the Change column.
func changeKindHint() string {
	return "One of: " + strings.Join(ChangeKinds(), ", ") + " (run 'sparkmargin whatif --help' for what each sets)"
}

func (v *validator) changes(t *table, stations, objs map[string]refState) {
	seen := map[int]bool{}
	for _, rr := range t.Rows {
		// The row is named by its target (the object or station it changes),
		// as the Rejected sheet's ID column names a row: the kind is in its
		// own column.
		f := v.beginRow(t, rr, "Target", seen)
		c := Change{Row: rr.Row, Target: f.text("Target"), Value: f.text("Value"), Note: f.text("Notes")}
		if f.text("Change") == "" {
			f.errorf("Change", ErrRequired, "use one of: "+strings.Join(ChangeKinds(), ", "), "Change is blank")
		} else if p, err := ParseChange(f.text("Change"), c.Target, c.Value); err != nil {
			var cp *ChangeProblem
			if errors.As(err, &cp) {
				sentinel := cp.Err
				if cp.Field == "Value" && c.Value == "" {
					sentinel = ErrRequired
				}
				f.errorf(cp.Field, sentinel, cp.Fix, "%s", cp.Message)
			}
		} else {
			c.Change = p.Kind.Code
			if p.Warning != "" {
				// As check warns for an RH cell: the value is read, not refused.
				f.warnf("Value", nil, p.WarningFix, "%s", p.Warning)
			}
			switch {
			case p.Station != "":
				if rid, ok := f.resolve("Target", p.Station, stations, SheetStations, v.tables[SheetStations].Present); ok {
					// Kept as the user wrote it: a bare station ID (station-rh
					// takes one) stays bare, station:ID stays so.
					c.Target = rid
					if _, wrote := cutStation(strings.TrimSpace(f.text("Target"))); wrote {
						c.Target = "station:" + rid
					}
				}
			case p.Object != "" && !hasRef(objs, p.Object) && hasRef(stations, p.Object):
				// As the whatif flag says it: a station is reached by station:ID.
				f.errorf("Target", ErrChangeSyntax, fmt.Sprintf("write station:%s to reach its rows", p.Object), "%q is a station, not an object", p.Object)
			case p.Object != "":
				if rid, ok := f.resolve("Target", p.Object, objs, SheetObjects, v.tables[SheetObjects].Present); ok {
					c.Target = rid
				}
			}
		}
		if !f.st.rejected() {
			v.s.Changes = append(v.s.Changes, c)
		}
	}
}

// hasRef reports whether id names a row of targets (letter case ignored).
func hasRef(targets map[string]refState, id string) bool {
	if _, ok := targets[id]; ok {
		return true
	}
	for k := range targets {
		if strings.EqualFold(k, id) {
			return true
		}
	}
	return false
}

// changeTargetHint is the Changes sheet's hint for the Target column, from the change table.
func changeTargetHint() string {
	var site, station []string
	for _, k := range changeKinds() {
		switch k.Targets {
		case TargetSite:
			site = append(site, k.Code)
		case TargetStation:
			station = append(station, k.Code)
		}
	}
	return fmt.Sprintf("An object ID, or station:ID for every matching row of a station; a station ID for %s; blank for %s",
		strings.Join(station, ", "), strings.Join(site, " and "))
}
