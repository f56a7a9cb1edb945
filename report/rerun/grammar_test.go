package rerun

import (
	"bytes"
	"errors"
	"fmt"
	"slices"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// One change grammar: the same line as a whatif flag and as a row of the
// survey's Changes sheet gives the same applied change or the same error
// (issue 16). Targets and values are the invented demo plant's.
func TestChangeSyntaxSharedByFlagsAndSheet(t *testing.T) {
	lines := []struct {
		kind, target, value string
		sentinel            error // nil: applies
		want                string
	}{
		{"station-rh", "ST-LAM", "40", nil, ""},
		{"station-rh", "station:ST-LAM", "40 %", nil, ""},
		{"station-rh", "ST-LAM", "40%RH", nil, ""},
		{"rh", "", "55,5", nil, ""},
		{"earth", "PWD-DRU1", "1 MΩ", nil, ""},
		{"earth", "station:ST-PWD", "1e6 ohm", nil, ""},
		{"footwear", "station:ST-MIX", "1e7", nil, ""},
		{"bag-type", "BAG-A", "type C", nil, ""},
		{"filling", "MIX-TOL1", "dip tube", nil, ""},
		{"vessel-material", "BAY-IBC", "steel", nil, ""},
		{"material", "COAT-WEB", "PE", nil, ""},
		{"margin", "", "20", nil, ""},
		{"conductivity", "MIX-TOL1", "500 pS/m", nil, ""},
		{"speed", "MIX-TOL1", "1 m/s", nil, ""},
		{"earth", "PWD-DRU1", "5 kV", ErrBadValue, "dimension of potential"},
		{"earth", "PWD-DRU1", "1M", inventory.ErrAmbiguousUnit, "mega, with its unit left out (write MΩ), or metres"},
		{"earth", "PWD-DRU1", "1 mohm", inventory.ErrAmbiguousUnit, "milliohm (write mΩ), or megohm"},
		{"footwear", "MIX-OP", "1K", inventory.ErrAmbiguousUnit, "kilo, with its unit left out (write kΩ), or kelvin"},
		{"earth", "PWD-DRU1", "-5", ErrBadValue, "not a resistance to earth"},
		{"rh", "", "120", ErrBadValue, "not a relative humidity"},
		{"station-rh", "ST-LAM", "wet", ErrBadValue, "not a number"},
		{"margin", "", "0.5", ErrBadValue, "below 1"},
		{"bag-type", "BAG-A", "E", ErrBadValue, "not a bag type"},
		{"filling", "MIX-TOL1", "sideways", ErrBadValue, "not a filling method"},
		{"hover", "X", "1", ErrUnknownChange, "not known"},
		{"earth", "ST-PWD", "1e6", nil, "is a station, not an object"}, // sentinel differs by side; message is the same
	}
	// The sheet side: every line a row of a Changes sheet on the demo survey.
	sh := inventory.DemoSurvey().Clone()
	var hdr []any
	for _, c := range inventory.SheetColumns(inventory.SheetChanges) {
		hdr = append(hdr, c.Header())
	}
	rows := [][]any{hdr}
	for _, l := range lines {
		rows = append(rows, []any{l.kind, l.target, l.value, ""})
	}
	sh = append(sh, inventory.SheetRows{Name: inventory.SheetChanges, Rows: rows})
	var buf bytes.Buffer
	if err := inventory.WriteSurvey(&buf, sh); err != nil {
		t.Fatal(err)
	}
	s, err := inventory.Read(buf.Bytes(), "planned.xlsx", inventory.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	sheetChange := map[int]Change{}
	for _, c := range FromSheet(s) {
		var row int
		fmt.Sscanf(c.Source, inventory.SheetChanges+"!%d", &row)
		sheetChange[row] = c
	}
	sheetProblem := map[int]inventory.Problem{}
	for _, r := range s.Rejected {
		if r.Sheet == inventory.SheetChanges && len(r.Problems) > 0 {
			sheetProblem[r.Row] = r.Problems[0]
		}
	}
	clean := CloneSurvey(s)
	clean.Changes = nil
	before := assess.Assess(clean, assess.Options{Limits: Limits(clean)})

	for i, l := range lines {
		row := i + 2
		arg := l.value
		if l.target != "" {
			arg = l.target + "=" + l.value
		}
		t.Run(fmt.Sprintf("%s %s", l.kind, arg), func(t *testing.T) {
			// The flag side.
			var flagApplied []Applied
			fc, ferr := ParseFlag(l.kind, arg)
			if ferr == nil {
				_, flagApplied, ferr = Apply(clean, before, []Change{fc})
			}
			// The sheet side.
			sc, accepted := sheetChange[row]
			var sheetApplied []Applied
			var serr error
			if accepted {
				_, sheetApplied, serr = Apply(clean, before, []Change{sc})
			} else if p, ok := sheetProblem[row]; ok {
				serr = p
			} else {
				t.Fatalf("row %d is neither accepted nor rejected", row)
			}

			if l.want == "" {
				if ferr != nil || serr != nil {
					t.Fatalf("flag: %v; sheet: %v; want both applied", ferr, serr)
				}
				f, g := flagApplied[0], sheetApplied[0]
				if f.SI != g.SI && !(f.SI != f.SI && g.SI != g.SI) || f.SIText != g.SIText || f.Description != g.Description ||
					!slices.Equal(f.Objects, g.Objects) || !slices.Equal(f.Stations, g.Stations) {
					t.Errorf("flag applied %+v\nsheet applied %+v", f, g)
				}
				return
			}
			if ferr == nil || serr == nil {
				t.Fatalf("flag: %v; sheet: %v; want both to fail saying %q", ferr, serr, l.want)
			}
			for side, err := range map[string]error{"flag": ferr, "sheet": serr} {
				if !strings.Contains(err.Error(), l.want) {
					t.Errorf("%s error %q does not say %q", side, err, l.want)
				}
				if l.sentinel != nil && !errors.Is(err, l.sentinel) {
					t.Errorf("%s error %v does not wrap %v", side, err, l.sentinel)
				}
			}
			var ce *ChangeError
			if errors.As(ferr, &ce) {
				if p, ok := serr.(inventory.Problem); ok && p.Message != ce.Message {
					t.Errorf("messages differ:\n flag:  %s\n sheet: %s", ce.Message, p.Message)
				}
			}
		})
	}
}

// Every kind of the change table has an apply step, and its example applies
// to the demo survey (so the help's examples work as written).
func TestChangeKindsAllApplied(t *testing.T) {
	s := demo(t)
	for _, k := range inventory.ChangeKindTable() {
		c, err := ParseFlag(k.Code, k.Example)
		if err != nil {
			t.Errorf("%s example %q: %v", k.Code, k.Example, err)
			continue
		}
		if _, err := Run(s, []Change{c}); err != nil {
			t.Errorf("%s example %q: %v", k.Code, k.Example, err)
		}
		if h := FlagHelp(k.Code); !strings.Contains(h, k.Example) || !strings.Contains(KindsNote(), k.Code+": ") {
			t.Errorf("%s: help %q or the Method note does not derive from the table", k.Code, h)
		}
	}
}
