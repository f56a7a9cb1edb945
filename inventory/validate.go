package inventory

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// Sentinels of validation problems (Problem.Err wraps one of them, or a
// *QuantityError, or one of the header sentinels).
var (
	// ErrRequired: a value the row needs is blank.
	ErrRequired = errors.New("required value missing")
	// ErrOutOfRange: a value is outside what is physically possible or plausible.
	ErrOutOfRange = errors.New("value out of range")
	// ErrUnitSlip: a reading exceeds what air can hold or a plant object can have: likely a unit slip.
	ErrUnitSlip = errors.New("likely unit slip")
	// ErrUnknownReference: an ID or name refers to nothing in the survey or the built-in lists.
	ErrUnknownReference = errors.New("unknown reference")
	// ErrRejectedReference: a row refers to a row that was itself rejected.
	ErrRejectedReference = errors.New("reference to a rejected row")
	// ErrDuplicateID: an ID or name is used twice.
	ErrDuplicateID = errors.New("duplicate ID")
	// ErrNotInList: a value is not one of the allowed codes.
	ErrNotInList = errors.New("value not in the list")
	// ErrInconsistent: values of one row contradict each other.
	ErrInconsistent = errors.New("inconsistent values")
	// ErrMissingSheet: a sheet the survey needs is missing.
	ErrMissingSheet = errors.New("missing sheet")
	// ErrFormulaWithoutValue: a formula cell holds no stored result (the
	// reader never calculates formulas).
	ErrFormulaWithoutValue = errors.New("formula without a stored result")
)

// Plausibility limits used by validation. Air breaks down at about 3 MV/m over
// centimetre gaps (reference section 3, AMS Glossary); the others are common
// practice, no source: no plant object comes near them, so a value beyond is a
// unit slip.
const (
	MaxAirField         = 3e6   // V/m
	MaxSurfacePotential = 250e3 // V, common practice, no source
	MaxCapacitance      = 1e-6  // F; a road tanker is about 1 nF (reference section 2)
	MaxSize             = 100.0 // m for Length, Width, Diameter
	MaxSpeed            = 50.0  // m/s; webs run up to a few tens of m/s
	MaxParticleSize     = 0.1   // m (100 mm)
	MaxMIE              = 10.0  // J; dust MIEs reach about 1 J
	MaxChargingCurrent  = 1e-3  // A; industrial currents rarely exceed 100 µA (reference section 7)
	ThinLayer           = 10e-3 // m; propagating brush possible on layers thinner than about 8-10 mm (reference section 3)
)

// rowState collects the problems of one input row.
type rowState struct {
	sheet string
	row   int
	id    string
	// station is the Station an Objects row names, when that reference was
	// readable and resolved (a rejected row still marks its station).
	station string
	probs   []Problem // reported in Survey.Problems
	shared  []Problem // reasons reported once elsewhere (a header problem), listed in Rejected only
}

func (r *rowState) rejected() bool {
	if len(r.shared) > 0 {
		return true
	}
	for _, p := range r.probs {
		if p.Severity == Error {
			return true
		}
	}
	return false
}

// validator holds the state of one validation pass.
type validator struct {
	s      *Survey
	rows   map[string][]*rowState
	tables map[string]*table
	quiet  map[string]int // rows accepted without any problem whose row state was dropped
	// builtins remembers built-in material look-ups by reference (builtinMaterial).
	builtins map[string]builtinHit
}

func (v *validator) newRow(sheet string, row int) *rowState {
	r := &rowState{sheet: sheet, row: row}
	v.rows[sheet] = append(v.rows[sheet], r)
	return r
}

// field reads cells of one table row and records their problems.
type field struct {
	v  *validator
	t  *table
	rr rawRow
	st *rowState
	// refs holds the A1 references of the row's cells in the header's
	// columns, one after the other, built once per row (see ref).
	refs string
}

// ref returns the A1 reference of the row's cell in column i. The
// references of a row are built in one string, so a row's quantities cost
// one allocation for their cell references, not one each.
func (f *field) ref(i int) string {
	t := f.t
	if t.refEnd == nil {
		n := 0
		for _, j := range t.Index {
			n = max(n, j+1)
		}
		t.refEnd = make([]int, n)
		end := 0
		for j := range n {
			end += len(ColumnLetter(j))
			t.refEnd[j] = end
		}
	}
	if i >= len(t.refEnd) {
		return ColumnLetter(i) + strconv.Itoa(f.rr.Row)
	}
	var digits [20]byte
	d := strconv.AppendInt(digits[:0], int64(f.rr.Row), 10)
	if f.refs == "" {
		var b strings.Builder
		b.Grow(t.refEnd[len(t.refEnd)-1] + len(t.refEnd)*len(d))
		for j := range t.refEnd {
			b.WriteString(ColumnLetter(j))
			b.Write(d)
		}
		f.refs = b.String()
	}
	start := i * len(d)
	if i > 0 {
		start += t.refEnd[i-1]
	}
	return f.refs[start : t.refEnd[i]+(i+1)*len(d)]
}

func (f *field) letter(name string) string {
	if i, ok := f.t.Index[name]; ok {
		return ColumnLetter(i)
	}
	return ""
}

func (f *field) idLetter() string {
	for _, n := range []string{"ID", "Name", "Change"} {
		if l := f.letter(n); l != "" {
			return l
		}
	}
	return ""
}

func (f *field) add(sev Severity, name string, err error, msg, fix string) {
	if f.t.cellFaulted(f.rr, name) {
		return // the cell cannot be read, and its own problem says why
	}
	f.st.probs = append(f.st.probs, Problem{Sheet: f.t.Sheet, Row: f.rr.Row, Column: f.letter(name), Field: name,
		ID: f.st.id, Severity: sev, Message: msg, Fix: fix, Err: err})
}

func (f *field) errorf(name string, err error, fix, format string, args ...any) {
	f.add(Error, name, err, fmt.Sprintf(format, args...), fix)
}

func (f *field) warnf(name string, err error, fix, format string, args ...any) {
	f.add(Warning, name, err, fmt.Sprintf(format, args...), fix)
}

// text returns the trimmed text of the row's cell in column name, in Unicode
// normalisation form C (ids.go), so that IDs and references typed in either
// form match.
func (f *field) text(name string) string {
	return NormalizeText(f.t.cellText(f.rr, name))
}

// qty parses a numeric cell; the returned Parsed keeps the written number for suggestions.
func (f *field) qty(name string) (Quantity, Parsed) {
	text, ref, ok := "", "", false
	if i, in := f.t.Index[name]; in {
		text, ref, ok = f.t.cellText(f.rr, name), f.ref(i), true
	}
	if fm, isFormula := f.t.Formula[ref]; ok && isFormula {
		f.errorf(name, ErrFormulaWithoutValue, "open the workbook in a spreadsheet program so that it calculates, save it and check again; or type the value",
			"the cell holds the formula =%s but no stored result, and formulas are never calculated here", short(fm, 60))
		return Quantity{Cell: ref}, Parsed{}
	}
	if !ok || text == "" {
		return Quantity{Cell: ref}, Parsed{}
	}
	if p, bad := f.t.BadUnit[name]; bad {
		f.st.shared = append(f.st.shared, p)
		return Quantity{Cell: ref}, Parsed{}
	}
	m := f.t.Cols[f.t.Index[name]]
	if shown, ok := f.t.Dated[ref]; ok {
		f.errorf(name, &QuantityError{Text: text, Want: m.Column.Dim, Err: ErrNotANumber},
			"format the cell as a number and type the value again",
			"the cell holds a date (it shows %s), not a number; a spreadsheet may have turned the typed value into a date", shown)
		return Quantity{Cell: ref}, Parsed{}
	}
	if f.t.Bool[ref] {
		f.errorf(name, &QuantityError{Text: text, Want: m.Column.Dim, Err: ErrNotANumber},
			"enter the number, or leave the cell blank if it was not measured",
			"the cell holds a yes/no value (TRUE or FALSE), not a number")
		return Quantity{Cell: ref}, Parsed{}
	}
	p, err := parseQuantity(text, m.Unit, m.Column.Dim, f.t, f.t.Index[name])
	if err != nil {
		msg, fix := err.Error(), ""
		var qe *QuantityError
		if errors.As(err, &qe) {
			msg = qe.Describe(name)
			fix = quantityFix(qe, m, f.t.Sheet)
		}
		f.errorf(name, err, fix, "%s", msg)
		return Quantity{Cell: ref}, Parsed{}
	}
	if p.Note != "" {
		f.warnf(name, nil, "", "%s", p.Note)
	}
	return Quantity{Value: p.Value, Known: p.Known, RelUncertainty: p.RelUncertainty, Cell: ref}, p
}

// quantityFix suggests how to repair a cell that did not parse.
func quantityFix(qe *QuantityError, m HeaderMatch, sheet string) string {
	unit := m.Unit
	switch {
	case errors.Is(qe, ErrWrongDimension):
		var others []string
		for _, c := range SheetColumns(sheet) {
			if c.Dim == qe.UnitDim {
				others = append(others, c.Name)
			}
		}
		fix := fmt.Sprintf("write a %s", m.Column.Dim)
		if unit != "" {
			fix += fmt.Sprintf(" (a bare number is read in %s)", unit)
		}
		if len(others) > 0 {
			fix += fmt.Sprintf(", or move the value to %s", strings.Join(others, " or "))
		}
		return fix
	case errors.Is(qe, ErrUnknownUnit):
		if unit != "" {
			return fmt.Sprintf("write a unit such as %s, or a bare number in %s", unit, unit)
		}
		return "write a bare number"
	case errors.Is(qe, ErrAmbiguousUnit):
		// The message gives both readings (QuantityError.Describe): the fix
		// does not repeat them.
		return "write the unit in full, as one of the two readings says"
	case errors.Is(qe, ErrNotFinite):
		return "enter the measured value, or leave the cell blank if it was not measured"
	case errors.Is(qe, ErrUncertainty):
		return "write the uncertainty as a percentage, e.g. 12 ±10%"
	default:
		return "enter a number (with a unit if not in the header's), or leave the cell blank if it was not measured"
	}
}

// enumValue reads a code from a list, case-insensitively, with aliases; it
// returns the canonical code, "" when blank, and records an error with the
// nearest code when the value is not in the list.
func (f *field) enumValue(name string, allowed []string, aliases map[string]string) string {
	raw := f.text(name)
	if raw == "" {
		return ""
	}
	n := NormalizeName(raw)
	for _, a := range allowed {
		if NormalizeName(a) == n {
			return a
		}
	}
	if a, ok := aliases[n]; ok {
		return a
	}
	fix := "use one of: " + strings.Join(allowed, ", ")
	if near := Nearest(raw, allowed); near != "" {
		fix = fmt.Sprintf("%s (%s)", didYouMean(raw, near), fix)
	}
	f.errorf(name, ErrNotInList, fix, "%q is not one of the %s values", short(raw, 60), name)
	return ""
}

// positive records an error when a known quantity is not above zero.
func (f *field) positive(name string, q Quantity) {
	if q.Known && q.Value <= 0 {
		f.errorf(name, ErrOutOfRange, "enter the measured value, or leave the cell blank if it was not measured",
			"%s must be greater than zero", name)
	}
}

func (f *field) nonNegative(name string, q Quantity) {
	if q.Known && q.Value < 0 {
		f.errorf(name, ErrOutOfRange, "enter the value without a sign", "%s cannot be negative", name)
	}
}

// slip records a likely unit slip when |value| exceeds limit (in SI), with a
// suggested reading that stays within the limit.
func (f *field) slip(name string, q Quantity, p Parsed, limit float64, why string) {
	if !q.Known || math.Abs(q.Value) <= limit {
		return
	}
	m := f.t.Cols[f.t.Index[name]]
	fix := "check the unit"
	if s := suggestReading(p, m, limit); s != "" {
		fix = fmt.Sprintf("check the unit: did you mean %s?", s)
	}
	f.errorf(name, ErrUnitSlip, fix, "%s %s is %s; a likely unit slip", name, strings.TrimSpace(f.text(name)), why)
}

// readingSlip records a reading above what air or a plant object allows as a
// WARNING: the row is kept and assessed (principle 1: a measurement beats a
// default, and every row is assessed or listed). A field above air breakdown
// is assessed at the breakdown limit with the reading-above-breakdown finding;
// a potential or layer breakdown above the plausible maximum is used as read,
// the stricter case. The fix names what to check and, when a smaller unit
// brings the value within limit, says by how much it would shrink, without
// offering it as the reading: following a unit suggestion blindly can clear
// a charged object.
func (f *field) readingSlip(name string, q Quantity, p Parsed, limit float64, why, kept string) {
	if !q.Known || math.Abs(q.Value) <= limit {
		return
	}
	m := f.t.Cols[f.t.Index[name]]
	u, factor := smallerUnitFor(p, m, limit)
	if u == "" {
		// Not a reading in any unit a meter shows (e.g. 1e300 kV/m, or a
		// number too large even in V/m): it cannot be assessed as a reading,
		// so the row is rejected and listed with why.
		f.errorf(name, ErrUnitSlip, "enter the reading as shown on the meter, with its unit, or leave the cell blank if it was not measured",
			"%s %s is %s in every unit a meter shows: not a reading", name, short(strings.TrimSpace(f.text(name)), 40), why)
		return
	}
	fix := fmt.Sprintf("check the meter distance, its range and the unit: if it was %s, the reading is %s times smaller", u, strconv.FormatFloat(factor, 'f', -1, 64))
	f.warnf(name, ErrUnitSlip, fix, "%s %s is %s: a bad reading or a unit slip; %s", name, strings.TrimSpace(f.text(name)), why, kept)
}

// smallerUnitFor returns the first smaller unit of the column's dimension that
// would bring the written number within limit, and how many times smaller the
// reading would then be; "" when none does.
func smallerUnitFor(p Parsed, m HeaderMatch, limit float64) (string, float64) {
	written := p.Unit
	if written == "" {
		written = m.Unit
	}
	wu, err := ParseUnit(written, m.Column.Dim)
	if err != nil || wu.Factor <= 0 {
		return "", 0
	}
	for _, c := range smallerUnits(m.Column.Dim) {
		u, err := ParseUnit(c, m.Column.Dim)
		if err != nil || u.Factor >= wu.Factor {
			continue
		}
		if v := math.Abs(p.Number * u.Factor); v <= limit && v > 0 {
			return c, math.Round(wu.Factor / u.Factor)
		}
	}
	return "", 0
}

// suggestReading proposes the written number in another unit of the column's
// dimension that brings it within limit: the column's default unit first, then
// the number divided by 1000 or 1e6 in the unit written.
func suggestReading(p Parsed, m HeaderMatch, limit float64) string {
	num := p.Number
	fmtNum := func(x float64) string {
		if a := math.Abs(x); a >= 1e-3 && a < 1e7 {
			return strconv.FormatFloat(x, 'f', -1, 64)
		}
		return strconv.FormatFloat(x, 'g', 4, 64)
	}
	type cand struct {
		num  float64
		unit string
	}
	written := p.Unit
	if written == "" {
		written = m.Unit
	}
	var cands []cand
	if m.Column.Unit != "" && p.Unit != "" {
		cands = append(cands, cand{num, m.Column.Unit})
	}
	for _, u := range smallerUnits(m.Column.Dim) {
		cands = append(cands, cand{num, u})
	}
	cands = append(cands, cand{num / 1e3, written}, cand{num / 1e6, written})
	for _, c := range cands {
		u, err := ParseUnit(c.unit, m.Column.Dim)
		if err != nil && c.unit != "" {
			continue
		}
		factor := 1.0
		if err == nil {
			factor = u.Factor
		}
		if v := math.Abs(c.num * factor); v <= limit && v > 0 {
			return strings.TrimSpace(fmtNum(c.num) + " " + c.unit)
		}
	}
	return ""
}

// smallerUnits lists units a surveyor may have meant instead of the header's.
func smallerUnits(d Dimension) []string {
	switch d {
	case ElectricField:
		return []string{"kV/m", "V/m"}
	case Potential:
		return []string{"V"}
	case Length:
		return []string{"mm", "µm"}
	case Speed:
		return []string{"m/min"}
	case Capacitance:
		return []string{"pF"}
	case Energy:
		return []string{"mJ"}
	}
	return nil
}

// ---- the pass ----

// validate turns the read sheets into the Survey: every row accepted or
// rejected with its reasons, references resolved, problems sorted, counts kept.
func validate(s *Survey, site *siteSheet, tables map[string]*table) {
	v := newValidator(s, tables)
	v.tableProblems(SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials, SheetChanges)
	mats, stations := v.begin(site)
	t := tables[SheetObjects]
	objs := v.objects(t, stations, mats)
	v.end(stations, objs, len(t.Rows))
}

func newValidator(s *Survey, tables map[string]*table) *validator {
	return &validator{s: s, rows: map[string][]*rowState{}, tables: tables, quiet: map[string]int{}}
}

// tableProblems adds the sheet and header problems of the given tables.
func (v *validator) tableProblems(sheets ...string) {
	for _, sh := range sheets {
		v.s.Problems = append(v.s.Problems, v.tables[sh].Problems...)
	}
}

// begin checks the required sheets and validates every sheet the Objects rows
// refer to: Site, Materials, Atmospheres and Stations.
func (v *validator) begin(site *siteSheet) (map[string]matState, map[string]refState) {
	for _, sh := range []string{SheetStations, SheetObjects} {
		if !v.tables[sh].Present {
			v.s.Problems = append(v.s.Problems, Problem{Sheet: sh, Severity: Error, Err: ErrMissingSheet,
				Message: fmt.Sprintf("the workbook has no %s sheet", sh), Fix: "add it from the template (sparkmargin template)"})
		}
	}
	v.applySite(site)
	mats := v.materials(v.tables[SheetMaterials])
	atms := v.atmospheres(v.tables[SheetAtmospheres])
	return mats, v.stations(v.tables[SheetStations], atms)
}

// end validates the Changes sheet against the objects and finishes the survey;
// objectRows is the number of data rows of the Objects sheet.
func (v *validator) end(stations, objs map[string]refState, objectRows int) {
	v.changes(v.tables[SheetChanges], stations, objs)
	if t := v.tables[SheetObjects]; t.Present && t.HeaderRow > 0 && objectRows == 0 {
		v.s.Problems = append(v.s.Problems, Problem{Sheet: SheetObjects, Row: t.HeaderRow, Severity: Warning,
			Message: "the sheet has no object rows; nothing will be assessed"})
	}
	v.finish()
}

// finish moves row problems into the survey, builds Rejected and Counts, and sorts.
func (v *validator) finish() {
	s := v.s
	order := []string{SheetSite, SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials}
	if v.tables[SheetChanges].Present {
		order = append(order, SheetChanges)
	}
	for _, sh := range order {
		c := SheetCount{Sheet: sh, Read: v.quiet[sh], Accepted: v.quiet[sh]}
		for _, r := range v.rows[sh] {
			s.Problems = append(s.Problems, r.probs...)
			c.Read++
			if r.rejected() {
				c.Rejected++
				rej := Rejected{Sheet: sh, Row: r.row, ID: r.id, Station: r.station}
				rej.Problems = append(rej.Problems, r.shared...)
				for _, p := range r.probs {
					if p.Severity == Error {
						rej.Problems = append(rej.Problems, p)
					}
				}
				s.Rejected = append(s.Rejected, rej)
			} else {
				c.Accepted++
			}
		}
		s.Counts = append(s.Counts, c)
	}
	SortProblems(s.Problems)
	sort.SliceStable(s.Rejected, func(i, j int) bool {
		a, b := s.Rejected[i], s.Rejected[j]
		if sheetRank(a.Sheet) != sheetRank(b.Sheet) {
			return sheetRank(a.Sheet) < sheetRank(b.Sheet)
		}
		return a.Row < b.Row
	})
}

func sheetRank(sh string) int {
	for i, n := range append(Sheets(), SheetChanges) {
		if n == sh {
			return i
		}
	}
	return 100
}

// SortProblems sorts problems in sheet (contract order, other sheets after by
// name), row, column order; problems of one cell keep their order.
func SortProblems(ps []Problem) {
	sort.SliceStable(ps, func(i, j int) bool {
		a, b := ps[i], ps[j]
		if ra, rb := sheetRank(a.Sheet), sheetRank(b.Sheet); ra != rb {
			return ra < rb
		}
		if a.Sheet != b.Sheet {
			return a.Sheet < b.Sheet
		}
		if a.Row != b.Row {
			return a.Row < b.Row
		}
		if len(a.Column) != len(b.Column) {
			return len(a.Column) < len(b.Column)
		}
		return a.Column < b.Column
	})
}

// unheaded warns once per column about values under no header.
func (v *validator) unheaded(t *table, st *rowState, rr rawRow, seen map[int]bool) {
	if t.HeaderRow == 0 {
		return
	}
	for i, c := range rr.Cells {
		if strings.TrimSpace(c) == "" || seen[i] {
			continue
		}
		if t.Headed[i] {
			continue // known, or an unknown header already warned about
		}
		seen[i] = true
		st.probs = append(st.probs, Problem{Sheet: t.Sheet, Row: rr.Row, Column: ColumnLetter(i), ID: st.id, Severity: Warning,
			Message: "a value in a column without a known header is not read (this warning is given once per column)",
			Fix:     "give the column a header from the template, or delete the value"})
	}
}

// beginRow starts a table row: ID, hidden-row note, missing-column rejection.
func (v *validator) beginRow(t *table, rr rawRow, idCol string, seen map[int]bool) *field {
	st := v.newRow(t.Sheet, rr.Row)
	f := &field{v: v, t: t, rr: rr, st: st}
	raw := f.text(idCol)
	// A refused character is left out of the row's ID (checkID's message
	// shows where it was), so that rows referring to the ID as it looks are
	// told that it was rejected, and a second row that looks the same is a duplicate.
	st.id = stripIDChars(raw)
	st.shared = append(st.shared, t.Missing...)
	st.probs = append(st.probs, t.rowFaults(rr, st.id)...)
	if what := idWords[idCol]; what != "" && raw != "" {
		f.checkID(idCol, what, raw)
	}
	if rr.Hidden {
		f.warnf("", nil, "", "the row is hidden; it is read like any other")
	}
	// A formula without a stored result in a text or date column (numeric
	// columns report it where the number is parsed).
	for i := 0; len(t.Formula) > 0 && (i < len(rr.Cells) || i < 64); i++ {
		m, ok := t.Cols[i]
		if !ok || (m.Column.Dim != Text && m.Column.Dim != Date) {
			continue
		}
		if fm, ok := t.Formula[fmt.Sprintf("%s%d", ColumnLetter(i), rr.Row)]; ok {
			f.errorf(m.Column.Name, ErrFormulaWithoutValue, "open the workbook in a spreadsheet program so that it calculates, save it and check again; or type the text",
				"the cell holds the formula =%s but no stored result, and formulas are never calculated here", short(fm, 60))
		}
	}
	v.unheaded(t, st, rr, seen)
	return f
}

// idWords names the ID columns whose text is checked as an identifier (checkID).
var idWords = map[string]string{"ID": "ID", "Name": "material name"}

// idRegistry finds duplicate IDs (case-insensitively, spaces trimmed).
type idRegistry map[string]int

func (r idRegistry) check(f *field, col, id string) bool {
	k := strings.ToLower(id)
	if first, dup := r[k]; dup {
		// The first row keeps the ID (the order of the sheet is the only
		// evidence); this one is rejected and listed, and its station marked.
		f.errorf(col, ErrDuplicateID, fmt.Sprintf("give each row its own %s; if this row is the one the %s belongs to, rename row %d instead", col, col, first),
			"%s %q is already used in row %d, which keeps it; this row is rejected and not assessed", col, short(id, 60), first)
		return false
	}
	r[k] = f.rr.Row
	return true
}

// refState is the outcome of one referenced row.
type refState struct {
	ID       string
	Row      int
	Accepted bool
}

// resolve looks up a reference among rows of another sheet: exact, then
// case-insensitive (with a warning); records errors for unknown or rejected rows.
func (f *field) resolve(col, ref string, targets map[string]refState, targetSheet string, present bool) (string, bool) {
	if !f.checkID(col, strings.ToLower(col), ref) {
		return "", false
	}
	if t, ok := targets[ref]; ok {
		if !t.Accepted {
			f.errorf(col, ErrRejectedReference, fmt.Sprintf("fix %s!%d first", targetSheet, t.Row),
				"%s %q was rejected (%s!%d), so this row cannot be assessed", strings.ToLower(col), short(ref, 60), targetSheet, t.Row)
			return "", false
		}
		return t.ID, true
	}
	for k, t := range targets {
		if strings.EqualFold(k, ref) {
			if !t.Accepted {
				f.errorf(col, ErrRejectedReference, fmt.Sprintf("fix %s!%d first", targetSheet, t.Row),
					"%s %q was rejected (%s!%d), so this row cannot be assessed", strings.ToLower(col), short(ref, 60), targetSheet, t.Row)
				return "", false
			}
			f.warnf(col, nil, fmt.Sprintf("write it as %q", t.ID), "%q read as %s %q (letter case differs)", short(ref, 60), strings.ToLower(col), t.ID)
			return t.ID, true
		}
	}
	var ids []string
	for k := range targets {
		ids = append(ids, k)
	}
	sort.Strings(ids)
	fix := fmt.Sprintf("use an ID from the %s sheet", targetSheet)
	if near := Nearest(ref, ids); near != "" {
		fix = didYouMean(ref, near)
	}
	where := fmt.Sprintf("is not an ID on the %s sheet", targetSheet)
	if !present {
		where = fmt.Sprintf("cannot be found: the workbook has no %s sheet", targetSheet)
	}
	f.errorf(col, ErrUnknownReference, fix, "%s %q %s", strings.ToLower(col), short(ref, 60), where)
	return "", false
}

// ---- Site ----

// siteSheet is the Site sheet as read.
type siteSheet struct {
	Present  bool
	Date1904 bool // the workbook counts dates from 1904
	Rows     []siteRow
	Problem  []Problem
}

type siteRow struct {
	Row         int
	Item, Value string
	Match       HeaderMatch
	Known       bool
	Hidden      bool
}

// readSite reads the Site sheet: Item | Value rows, with or without the
// header row "Item | Value". Blank rows are skipped.
func (r *reader) readSite(s *Survey) *siteSheet {
	ss := &siteSheet{}
	if p, ok := r.ambiguous[NormalizeName(SheetSite)]; ok {
		ss.Present = true
		ss.Problem = append(ss.Problem, p)
		return ss
	}
	sh, ok := r.sheets[NormalizeName(SheetSite)]
	if !ok {
		return ss
	}
	ss.Present = true
	ss.Date1904 = r.date1904
	items := SiteItems()
	first := true
	r.streamRows(sh, func(rr rawRow) bool {
		row, cells, hidden := rr.Row, rr.Cells, rr.Hidden
		if ps := siteFaults(rr); len(ps) > 0 {
			ss.Problem = append(ss.Problem, ps...)
			return true
		}
		// Only columns A and B are read; notes beside them (the template's
		// cautions in column D) are not survey data.
		if blankRow(cells[:min(2, len(cells))]) {
			return true
		}
		item, value := "", ""
		if len(cells) > 0 {
			item = strings.TrimSpace(cells[0])
		}
		if len(cells) > 1 {
			value = strings.TrimSpace(cells[1])
		}
		if first && NormalizeName(item) == "item" || NormalizeName(item) == "item" && NormalizeName(value) == "value" {
			first = false
			return true // the header row, first or below a title
		}
		first = false
		if len(ss.Rows) >= r.opts.MaxRows {
			return false
		}
		m, known, _ := MatchHeader(item, items)
		ss.Rows = append(ss.Rows, siteRow{Row: row, Item: item, Value: value, Match: m, Known: known, Hidden: hidden})
		return true
	})
	return ss
}
