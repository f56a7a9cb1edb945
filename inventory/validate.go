package inventory

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"
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
	sheet  string
	row    int
	id     string
	probs  []Problem // reported in Survey.Problems
	shared []Problem // reasons reported once elsewhere (a header problem), listed in Rejected only
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
				rej := Rejected{Sheet: sh, Row: r.row, ID: r.id}
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
		f.errorf(col, ErrDuplicateID, "give each row its own "+col,
			"%s %q is already used in row %d; this row is rejected", col, short(id, 60), first)
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

// applySite validates the Site sheet into Survey.Site.
func (v *validator) applySite(ss *siteSheet) {
	s := v.s
	s.Problems = append(s.Problems, ss.Problem...)
	if !ss.Present {
		s.Problems = append(s.Problems, Problem{Sheet: SheetSite, Severity: Error, Err: ErrMissingSheet,
			Message: "the workbook has no Site sheet (site name, survey date and relative humidity)", Fix: "add it from the template (sparkmargin template)"})
		return
	}
	site := &s.Site
	seen := map[string]int{}
	for _, r := range ss.Rows {
		st := v.newRow(SheetSite, r.Row)
		st.id = r.Item
		add := func(sev Severity, err error, msg, fix string) {
			st.probs = append(st.probs, Problem{Sheet: SheetSite, Row: r.Row, Column: "B", Field: r.Match.Column.Name, ID: r.Item,
				Severity: sev, Message: msg, Fix: fix, Err: err})
		}
		if r.Hidden {
			add(Warning, nil, "the row is hidden; it is read like any other", "")
		}
		if !r.Known {
			site.Items = append(site.Items, SiteItem{Key: NormalizeName(r.Item), Item: r.Item, Value: r.Value, Row: r.Row})
			if near := Nearest(splitName(r.Item), columnNames(SiteItems())); near != "" && r.Item != "" {
				st.probs = append(st.probs, Problem{Sheet: SheetSite, Row: r.Row, Column: "A", ID: r.Item, Severity: Warning, Err: ErrUnknownColumn,
					Message: fmt.Sprintf("item %q is not a known Site item; it is kept as a site setting", short(r.Item, 60)),
					Fix:     didYouMean(splitName(r.Item), near)})
			}
			continue
		}
		name := r.Match.Column.Name
		if first, dup := seen[name]; dup {
			add(Error, ErrDuplicateID, fmt.Sprintf("item %s is given twice (rows %d and %d)", name, first, r.Row), "delete one of the two rows")
			continue
		}
		seen[name] = r.Row
		switch r.Match.Column.Dim {
		case Text:
			switch name {
			case "Site":
				site.Name = r.Value
			case "Surveyed by":
				site.SurveyedBy = r.Value
			}
		case Date:
			if r.Value == "" {
				continue
			}
			d, err := parseDate(r.Value, ss.Date1904)
			if err != nil {
				add(Error, err, fmt.Sprintf("%q is not a date", short(r.Value, 60)), "write the date as 2026-03-14, or enter it as a spreadsheet date")
				continue
			}
			site.SurveyDate = d
		default:
			p, err := ParseQuantity(r.Value, r.Match.Unit, r.Match.Column.Dim)
			if err != nil {
				var qe *QuantityError
				msg := err.Error()
				if errors.As(err, &qe) {
					msg = qe.Describe(name)
				}
				add(Error, err, "enter a number, e.g. "+siteExample(name), msg)
				continue
			}
			if p.Note != "" {
				add(Warning, nil, p.Note, "")
			}
			q := Quantity{Value: p.Value, Known: p.Known, RelUncertainty: p.RelUncertainty, Cell: fmt.Sprintf("B%d", r.Row)}
			switch name {
			case "Relative humidity":
				for _, pr := range checkRH(q) {
					add(pr.Severity, pr.Err, pr.Message, pr.Fix)
				}
				site.RelativeHumidity = q
			case "Air temperature":
				if q.Known && (q.Value < 223.15 || q.Value > 353.15) {
					fix := "enter the air temperature in °C"
					if c := q.Value - 273.15; c-273.15 >= -50 && c-273.15 <= 80 {
						fix = fmt.Sprintf("did you mean %.4g °C? (the value looks like kelvin)", c-273.15)
					}
					add(Error, ErrOutOfRange, fmt.Sprintf("air temperature %s is outside -50 to 80 °C", r.Value), fix)
					continue
				}
				site.AirTemperature = q
			case "Required margin":
				if q.Known && q.Value < 1 {
					add(Error, ErrOutOfRange, fmt.Sprintf("required margin %s is below 1: energies above MIE would count as non-incendive", r.Value), "enter a margin of 1 or more (10 is usual)")
					continue
				}
				site.RequiredMargin = q
			}
		}
	}
	var missing []string
	if site.Name == "" {
		missing = append(missing, "Site")
	}
	if site.SurveyDate.IsZero() {
		missing = append(missing, "Survey date")
	}
	if !site.RelativeHumidity.Known {
		missing = append(missing, "Relative humidity")
	}
	for _, m := range missing {
		if row, given := seen[m]; given {
			// given but blank or rejected: the row's own problem says why
			s.Problems = append(s.Problems, Problem{Sheet: SheetSite, Row: row, Column: "B", Field: m, Severity: Error, Err: ErrRequired,
				Message: fmt.Sprintf("%s is required", m), Fix: "enter it, e.g. " + siteExample(m)})
			continue
		}
		s.Problems = append(s.Problems, Problem{Sheet: SheetSite, Field: m, Severity: Error, Err: ErrRequired,
			Message: fmt.Sprintf("the Site sheet needs the item %s", m), Fix: fmt.Sprintf("add a row %q with its value, e.g. %s", itemHeader(m), siteExample(m))})
	}
	if !site.AirTemperature.Known {
		site.AirTemperature = Quantity{Value: 293.15, Known: true}
		site.Defaults = append(site.Defaults, "Air temperature 20 °C (default)")
	}
	if !site.RequiredMargin.Known {
		site.RequiredMargin = Quantity{Value: 10, Known: true}
		site.Defaults = append(site.Defaults, "Required margin 10 (default, a site choice)")
	}
}

func itemHeader(name string) string {
	for _, c := range SiteItems() {
		if c.Name == name {
			return c.Header()
		}
	}
	return name
}

func siteExample(name string) string {
	switch name {
	case "Site":
		return "Plant 2 coating hall"
	case "Survey date":
		return "2026-03-14"
	case "Relative humidity":
		return "45"
	case "Air temperature":
		return "20"
	case "Required margin":
		return "10"
	}
	return "a value"
}

// parseDate reads an ISO date (2026-03-14, optionally with a time) or a
// spreadsheet date serial (days since 1899-12-30, or 1904 dates) into UTC midnight.
func parseDate(s string, date1904 bool) (time.Time, error) {
	s = strings.TrimSpace(s)
	for _, layout := range []string{"2006-01-02", "2006-01-02T15:04:05Z", "2006-01-02T15:04:05", "2006-01-02 15:04:05", "2006/01/02", "2006-01-02T15:04:05.999Z"} {
		if t, err := time.Parse(layout, s); err == nil {
			return time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC), nil
		}
	}
	f, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(f) || f < 1 || f > 2958465 {
		return time.Time{}, ErrNotANumber
	}
	t, err := excelize.ExcelDateToTime(f, date1904)
	if err != nil {
		return time.Time{}, err
	}
	return time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC), nil
}

// checkRH checks a relative humidity in percent.
func checkRH(q Quantity) []Problem {
	if !q.Known {
		return nil
	}
	switch {
	case q.Value < 0 || q.Value > 100:
		return []Problem{{Severity: Error, Err: ErrOutOfRange, Message: fmt.Sprintf("relative humidity %.4g %% is outside 0-100 %%", q.Value), Fix: "enter the RH in percent, e.g. 45"}}
	case q.Value > 0 && q.Value < 1:
		return []Problem{{Severity: Warning, Message: fmt.Sprintf("relative humidity %.4g %% is very low: a cell formatted as a percentage stores 45 %% as 0.45", q.Value), Fix: fmt.Sprintf("did you mean %.4g %%?", q.Value*100)}}
	}
	return nil
}

// ---- Materials ----

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

// ---- Atmospheres ----

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

// ---- Stations ----

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

// ---- Objects ----

// KindRequirement says in words what an object kind needs on its row.
type KindRequirement struct {
	Kind  string
	Needs string // the rule in words, as check reports it
}

// KindRequirements returns the per-kind requirements validation applies, for
// the README and the check command.
func KindRequirements() []KindRequirement {
	out := make([]KindRequirement, len(kindNeedTable))
	for i, k := range kindNeedTable {
		out[i] = KindRequirement{Kind: k.Kind, Needs: k.Summary}
	}
	return out
}

func (v *validator) objects(t *table, stations map[string]refState, mats map[string]matState) map[string]refState {
	p := v.newObjectPass(stations, mats)
	if len(t.Rows) > 0 {
		v.s.Objects = make([]Object, 0, len(t.Rows)) // an Object is large: no regrowing
	}
	for _, rr := range t.Rows {
		_ = p.row(t, rr)
	}
	return p.out
}

// objectPass holds the state of validating the Objects sheet row by row.
type objectPass struct {
	v         *validator
	out       map[string]refState // nil: not kept (no Changes rows refer to objects)
	ids       idRegistry
	seen      map[int]bool
	lists     map[string][]string
	hints     map[string]string // kindHints, built once
	matRefs   map[string]matHit // Materials sheet look-ups (sheetMaterial)
	stPresent bool
	stations  map[string]refState
	mats      map[string]matState
	// quiet drops the row state of rows without problems (they are only counted),
	// and each receives every accepted object instead of Survey.Objects.
	quiet bool
	each  func(Object) error
}

func (v *validator) newObjectPass(stations map[string]refState, mats map[string]matState) *objectPass {
	return &objectPass{v: v, out: map[string]refState{}, ids: idRegistry{}, seen: map[int]bool{}, lists: FixedLists(), hints: kindHints(), matRefs: map[string]matHit{},
		stPresent: v.tables[SheetStations].Present, stations: stations, mats: mats}
}

// row validates one Objects row; the error is each's.
func (op *objectPass) row(t *table, rr rawRow) error {
	v := op.v
	f := v.beginRow(t, rr, "ID", op.seen)
	o := Object{ID: f.st.id, Row: rr.Row, Description: f.text("Description"), Notes: f.text("Notes")}
	dup := false
	if o.ID == "" {
		f.errorf("ID", ErrRequired, "give every object a unique ID", "ID is blank")
	} else if !op.ids.check(f, "ID", o.ID) {
		dup = true
	}
	if raw := f.text("Kind"); raw != "" {
		if k, ok := op.hints[NormalizeName(raw)]; ok {
			// A word of the trade for a kind: the surveyor chooses, since the kind picks the model.
			f.errorf("Kind", ErrNotInList, fmt.Sprintf("did you mean %q? (use one of: %s)", k, strings.Join(Kinds(), ", ")),
				"%q is not one of the Kind values", short(raw, 60))
		} else {
			o.Kind = f.enumValue("Kind", op.lists[ListKind], nil)
		}
	}
	if o.Kind == "" && f.text("Kind") == "" {
		f.errorf("Kind", ErrRequired, "use one of: "+strings.Join(Kinds(), ", "), "Kind is blank")
	}
	who := strings.TrimSpace(o.Kind + " " + short(o.ID, 60))
	if ref := f.text("Station"); ref == "" {
		f.errorf("Station", ErrRequired, "enter the ID of the station the object is at", "%s needs a Station", who)
	} else if id, ok := f.resolve("Station", ref, op.stations, SheetStations, op.stPresent); ok {
		o.Station = id
	}
	if mref := f.text("Material"); mref != "" {
		o.Material = v.resolveMaterial(f, mref, op.mats, op.matRefs)
	}
	o.Backing = f.enumValue("Backing", op.lists[ListBacking], map[string]string{"grounded": "earthed", "earth": "earthed", "on earthed metal": "earthed", "no": "none", "free": "none"})
	o.BagType = bagTypeValue(f, op.lists[ListBagType])
	o.Filling = f.enumValue("Filling", op.lists[ListFilling], map[string]string{"dip tube": "dip pipe", "diptube": "dip pipe", "top fill": "top", "bottom fill": "bottom", "splash": "top"})
	o.VesselMaterial = f.enumValue("Vessel material", op.lists[ListVesselMaterial], map[string]string{"plastic": "insulating", "steel": "metal", "stainless steel": "metal", "coated": "lined", "lined or coated": "lined", "conductive": "metal"})
	o.VesselClass = f.enumValue("Vessel class", op.lists[ListVesselClass], map[string]string{"rail car": "rail tank car", "rail tanker": "rail tank car", "storage tank": "fixed tank", "fixed storage tank": "fixed tank", "tank": "fixed tank", "tanker": "road tanker", "small container": "can", "can or small container": "can", "barrel": "drum"})
	o.Filter = f.enumValue("Filter", op.lists[ListFilter], map[string]string{"micro filter": "filter", "microfilter": "filter", "micro-filter": "filter", "fine filter": "filter", "coarse strainer": "strainer", "no": "none"})
	o.SecondPhase = f.enumValue("Second phase", op.lists[ListSecondPhase], map[string]string{"water": "free water", "solids": "suspended solids", "immiscible": "immiscible liquid", "no": "none"})

	// The cells are parsed in the order of the columns below (their problems
	// come in that order); the Parsed of those checked for slips is kept.
	var pLength, pWidth, pDiameter, pField, pSurface, pSpeed, pParticle, pCapacitance Parsed
	o.Length, pLength = f.qty("Length")
	o.Width, pWidth = f.qty("Width")
	o.Diameter, pDiameter = f.qty("Diameter")
	o.Thickness, _ = f.qty("Thickness")
	o.DistanceToEarth, _ = f.qty("Distance to earth")
	o.Field, pField = f.qty("Field")
	o.FieldDistance, _ = f.qty("Field distance")
	o.SurfacePotential, pSurface = f.qty("Surface potential")
	o.Speed, pSpeed = f.qty("Speed")
	o.MassFlow, _ = f.qty("Mass flow")
	o.ChargeToMass, _ = f.qty("Charge-to-mass")
	o.ChargingCurrent, _ = f.qty("Charging current")
	o.ChargingTime, _ = f.qty("Charging time")
	o.ParticleSize, pParticle = f.qty("Particle size")
	o.Resistance, _ = f.qty("Resistance to earth")
	o.Capacitance, pCapacitance = f.qty("Capacitance")
	o.Conductivity, _ = f.qty("Conductivity")
	o.Permittivity, _ = f.qty("Relative permittivity")
	var pBreakdown Parsed
	o.LayerBreakdown, pBreakdown = f.qty("Layer breakdown")
	o.Process = f.enumValue("Process", op.lists[ListProcess], map[string]string{"web": "moving web", "film": "moving web", "moving film": "moving web", "conveyor belt": "belt", "pneumatic": "pneumatic conveying", "equipment": "fixed equipment"})
	o.VesselDiameter, _ = f.qty("Vessel diameter")
	o.Residence, _ = f.qty("Residence time")
	o.InletVelocity, _ = f.qty("Inlet velocity")

	// physical ranges
	for _, n := range []struct {
		name string
		q    Quantity
	}{{"Length", o.Length}, {"Width", o.Width}, {"Diameter", o.Diameter}, {"Thickness", o.Thickness},
		{"Distance to earth", o.DistanceToEarth}, {"Field distance", o.FieldDistance}, {"Particle size", o.ParticleSize},
		{"Charging time", o.ChargingTime}, {"Resistance to earth", o.Resistance}, {"Capacitance", o.Capacitance},
		{"Conductivity", o.Conductivity}, {"Layer breakdown", o.LayerBreakdown}, {"Vessel diameter", o.VesselDiameter}} {
		f.positive(n.name, n.q)
	}
	f.nonNegative("Residence time", o.Residence)
	f.nonNegative("Inlet velocity", o.InletVelocity)
	f.slip("Length", o.Length, pLength, MaxSize, "larger than any plant object")
	f.slip("Width", o.Width, pWidth, MaxSize, "larger than any plant object")
	f.slip("Diameter", o.Diameter, pDiameter, MaxSize, "larger than any plant object")
	f.slip("Particle size", o.ParticleSize, pParticle, MaxParticleSize, "above 100 mm, no powder")
	f.nonNegative("Speed", o.Speed)
	f.slip("Speed", o.Speed, pSpeed, MaxSpeed, "faster than any web, belt or line flow")
	f.nonNegative("Mass flow", o.MassFlow)
	f.slip("Field", o.Field, pField, MaxAirField, "more than air can hold (it breaks down at about 3 MV/m)")
	thinBacked := o.Backing == "earthed" && o.Thickness.Known && o.Thickness.Value < ThinLayer
	if !thinBacked {
		f.slip("Surface potential", o.SurfacePotential, pSurface, MaxSurfacePotential, "beyond what a plant object holds in air")
	}
	f.slip("Capacitance", o.Capacitance, pCapacitance, MaxCapacitance, "above 1 µF (a person is about 200 pF, a road tanker about 1 nF)")
	f.slip("Layer breakdown", o.LayerBreakdown, pBreakdown, MaxSurfacePotential, "above what a plant layer holds (films hold 100-600 kV/mm)")
	if o.ChargingCurrent.Known && math.Abs(o.ChargingCurrent.Value) > MaxChargingCurrent {
		f.warnf("Charging current", ErrUnitSlip, "check the unit: the column is in µA", "charging current %s is above 1 mA; industrial charging currents rarely exceed 100 µA", f.text("Charging current"))
	}
	if o.Permittivity.Known && (o.Permittivity.Value < 1 || o.Permittivity.Value > 100) {
		f.errorf("Relative permittivity", ErrOutOfRange, "enter epsr, e.g. 2.4 for toluene", "relative permittivity %.4g is outside 1-100", o.Permittivity.Value)
	}
	if o.Field.Known && !o.FieldDistance.Known && f.text("Field distance") == "" {
		f.errorf("Field distance", ErrRequired, "enter the meter-to-surface distance of the reading", "%s: a Field reading needs its Field distance", who)
	}
	v.kindNeeds(f, &o, who)
	if o.LayerBreakdown.Known && o.Kind != "" && o.Kind != KindSheet && o.Kind != KindBelt && o.Kind != KindRoller {
		f.warnf("Layer breakdown", nil, "leave it blank, or give the layer its own sheet, belt or roller row", "%s: a Layer breakdown is read only on sheet, belt and roller rows", who)
	}
	o.BagType = strings.ToUpper(o.BagType)
	if o.Kind == KindBag && o.BagType == "" && f.text("Bag type") == "" {
		f.warnf("Bag type", ErrRequired, "enter the bag type (A, B, C or D) from its label", "%s: no Bag type; assessed as the most restrictive case", who)
	}
	if o.Kind == KindBag && o.Station != "" {
		if st, ok := v.s.Station(o.Station); ok && st.Atmosphere == "" {
			f.errorf("Station", ErrRequired, "give the station an Atmosphere (kind dust with the product's MIE, or kind none for a non-combustible product)",
				"%s: station %s has no Atmosphere; the product's MIE decides which bag types may be used", who, o.Station)
		}
	}
	if o.Kind == KindLiquid {
		liquidNeeds(f, &o, who)
	}
	if (o.Kind == KindSheet || o.Kind == KindBelt) && o.Material == "" && f.text("Material") == "" {
		f.warnf("Material", nil, "enter the material", "%s: no Material; the model takes default material properties", who)
	}
	accepted := !f.st.rejected()
	if o.ID != "" && !dup && op.out != nil {
		op.out[o.ID] = refState{ID: o.ID, Row: rr.Row, Accepted: accepted}
	}
	if op.quiet && len(f.st.probs) == 0 && len(f.st.shared) == 0 {
		// A row with no problem needs no row state: it is counted.
		rows := v.rows[t.Sheet]
		v.rows[t.Sheet] = rows[:len(rows)-1]
		v.quiet[t.Sheet]++
	}
	if !accepted {
		return nil
	}
	if op.each != nil {
		return op.each(o)
	}
	v.s.Objects = append(v.s.Objects, o)
	return nil
}

// kindHints maps words surveyors use for things to the kind that models them,
// for suggestions only.
func kindHints() map[string]string {
	return map[string]string{
		"web": KindSheet, "film": KindSheet, "foil": KindSheet, "liner": KindSheet, "plate": KindSheet,
		"conveyor": KindBelt, "conveyor belt": KindBelt, "drive belt": KindBelt,
		"roll": KindRoller, "drum roller": KindRoller, "idler": KindRoller, "shaft": KindPart,
		"drum": KindContainer, "tank": KindContainer, "vessel": KindContainer, "bucket": KindContainer, "ibc": KindContainer, "can": KindContainer, "tote": KindContainer,
		"operator": KindPerson, "worker": KindPerson, "human": KindPerson, "people": KindPerson,
		"dust": KindPowder, "granulate": KindPowder, "granules": KindPowder, "pellets": KindPowder,
		"solvent": KindLiquid, "fluid": KindLiquid,
		"fibc": KindBag, "big bag": KindBag, "bulk bag": KindBag, "sack": KindBag,
		"nozzle": KindPart, "flange": KindPart, "tool": KindPart, "probe": KindPart,
	}
}

// kindNeeds checks the per-kind requirements (see KindRequirements).
func (v *validator) kindNeeds(f *field, o *Object, who string) {
	// A value given but unreadable has its own problem: it is not reported missing as well.
	given := func(name string, q Quantity) bool { return q.Known || f.text(name) != "" }
	reading := (given("Field", o.Field) && given("Field distance", o.FieldDistance)) || given("Surface potential", o.SurfacePotential)
	const readingText = "a reading (Field with Field distance, or Surface potential)"
	var need []string
	// The plain requirements come from the one table (kindNeedTable); the
	// alternatives and conditions below are the table's "one of" and "if" columns.
	for _, name := range kindRequiredColumns(o.Kind) {
		if !given(name, objectQuantity(o, name)) {
			need = append(need, name)
		}
	}
	switch o.Kind {
	case KindSheet, KindBelt:
		// A conductive or dissipative layer with a measured resistance to earth is
		// judged on its earthing; an insulating one needs a reading.
		m, known := v.s.Material(o.Material)
		cond := known && m.Class != ClassInsulating
		if !reading && !(cond && given("Resistance to earth", o.Resistance)) {
			if known && !cond {
				need = append(need, readingText)
			} else {
				need = append(need, readingText+" (or, for a conductive or dissipative material, Resistance to earth)")
			}
		}
		if o.Backing == "earthed" && !given("Thickness", o.Thickness) {
			need = append(need, "Thickness (the layer lies on earthed metal)")
		}
		potentialGeometryNeed(f, o, who, given)
	case KindRoller:
		if !reading && !given("Resistance to earth", o.Resistance) {
			need = append(need, "a reading (Field with Field distance, or Surface potential) or its Resistance to earth")
		}
		if m, known := v.s.Material(o.Material); !(known && m.Class == ClassConductive) && !given("Resistance to earth", o.Resistance) {
			potentialGeometryNeed(f, o, who, given)
		}
	case KindContainer, KindPart:
		// A conductor's potential comes from a Surface potential or from its
		// charging; a field reading near a conductor does not give it.
		charging := (given("Mass flow", o.MassFlow) && given("Charge-to-mass", o.ChargeToMass)) || given("Charging current", o.ChargingCurrent)
		if !given("Surface potential", o.SurfacePotential) && !charging && !given("Resistance to earth", o.Resistance) {
			need = append(need, "Surface potential, its charging (Charging current, or Mass flow with Charge-to-mass) or its Resistance to earth")
		}
		if !given("Surface potential", o.SurfacePotential) && !charging && o.Resistance.Known && o.Resistance.Value > ConductorEarthingLimit {
			f.warnf("Resistance to earth", nil, "measure its Surface potential in operation, or its Charging current (or Mass flow and Charge-to-mass)",
				"%s: not earthed within 1 Mohm and no charging on the row: its spark is not evaluated, only its earthing is judged", who)
		}
	case KindPerson:
		if !given("Surface potential", o.SurfacePotential) && !given("Resistance to earth", o.Resistance) {
			need = append(need, "Surface potential or Resistance to earth")
		}
	}
	if len(need) == 0 {
		return
	}
	// Only report what is missing, not what was given but unreadable (that has its own problem).
	f.st.probs = append(f.st.probs, Problem{Sheet: f.t.Sheet, Row: f.rr.Row, Column: f.idLetter(), ID: o.ID, Severity: Error, Err: ErrRequired,
		Message: fmt.Sprintf("%s: needs %s", who, joinAnd(need)),
		Fix:     "measure and enter them, or delete the row if the object is not part of the survey"})
}

// objectQuantity is the quantity of o in the Objects column name; a zero
// Quantity for a column that is not a quantity (its cell text decides then).
func objectQuantity(o *Object, name string) Quantity {
	switch name {
	case "Length":
		return o.Length
	case "Width":
		return o.Width
	case "Diameter":
		return o.Diameter
	case "Mass flow":
		return o.MassFlow
	case "Particle size":
		return o.ParticleSize
	case "Speed":
		return o.Speed
	case "Conductivity":
		return o.Conductivity
	}
	return Quantity{}
}

// ConductorEarthingLimit is the resistance to earth (ohm) above which check
// warns that a conductor with no charging on its row is judged on its earthing
// only (TRGS 727:2016 8.3; the assessment's limit may be overridden on the Site sheet).
const ConductorEarthingLimit = 1e6

// potentialGeometryNeed warns when a Surface potential reading on an insulating
// surface lacks what it needs to give a charge density: the layer on earthed
// metal with its Thickness, or a Distance to earth. The row is kept (it is listed
// as not assessed with the same words); nothing is said when a Field reading with
// its distance is on the row (it is used instead) or no Surface potential is.
func potentialGeometryNeed(f *field, o *Object, who string, given func(string, Quantity) bool) {
	if !given("Surface potential", o.SurfacePotential) || (given("Field", o.Field) && given("Field distance", o.FieldDistance)) {
		return
	}
	if o.Backing == "earthed" || given("Distance to earth", o.DistanceToEarth) {
		return
	}
	f.warnf("Surface potential", ErrRequired, "enter Backing earthed with the layer's Thickness, or the Distance to earth, or a Field reading with its distance",
		"%s: a Surface potential on a free surface gives no charge density: needs Backing earthed with Thickness, or Distance to earth; not assessed until then", who)
}

// liquidNeeds warns about a liquid row's transfer inputs that are blank and so
// assessed as the stricter case (the assessment says the same beside the value).
func liquidNeeds(f *field, o *Object, who string) {
	blank := func(name, v string) bool { return v == "" && f.text(name) == "" }
	if blank("Vessel material", o.VesselMaterial) {
		f.warnf("Vessel material", ErrRequired, "enter metal, insulating, lined or glass", "%s: no Vessel material; assessed as the stricter of metal (unearthed) and insulating (no safe filling limits)", who)
	}
	if blank("Vessel class", o.VesselClass) {
		f.warnf("Vessel class", ErrRequired, "enter road tanker, rail tank car, fixed tank, IBC, drum or can", "%s: no Vessel class; the strictest class's filling limits and the largest typical capacitance are taken", who)
	}
	if blank("Filling", o.Filling) {
		f.warnf("Filling", ErrRequired, "enter top, bottom or dip pipe", "%s: no Filling; assessed as top (splash) filling", who)
	}
	if o.VesselClass == "fixed tank" && !o.VesselDiameter.Known && f.text("Vessel diameter") == "" {
		f.warnf("Vessel diameter", ErrRequired, "enter the tank's diameter", "%s: a fixed tank with no Vessel diameter is not taken as a large tank (the v·d limit applies)", who)
	}
	if blank("Filter", o.Filter) {
		f.warnf("Filter", ErrRequired, "enter none, strainer or filter", "%s: no Filter; assessed as a fine filter with no residence time after it (the stricter case)", who)
	}
	if blank("Second phase", o.SecondPhase) {
		f.warnf("Second phase", ErrRequired, "enter none, free water, suspended solids or immiscible liquid", "%s: no Second phase; assessed as present (the stricter case)", who)
	}
	if o.Filter == "filter" && !o.Residence.Known && f.text("Residence time") == "" {
		f.warnf("Residence time", ErrRequired, "enter the time the liquid takes from the filter to the vessel", "%s: a fine filter with no Residence time; taken as none", who)
	}
	// The slow start concerns low-conductivity liquids; a second phase makes a liquid
	// below 1000 pS/m one (IEC TS 60079-32-1, reference section 8 [C]).
	twoPhase := o.SecondPhase != "none" // not stated: taken as present
	chargeable := !o.Conductivity.Known || o.Conductivity.Value <= 50e-12 || (twoPhase && o.Conductivity.Value < 1000e-12)
	if chargeable && (o.Filling == "bottom" || o.Filling == "dip pipe") && !o.InletVelocity.Known && f.text("Inlet velocity") == "" {
		f.warnf("Inlet velocity", ErrRequired, "enter the velocity at the inlet until it is submerged (at most 1 m/s for low-conductivity liquids)", "%s: no Inlet velocity; the slow start until the inlet is submerged is not shown met", who)
	}
}

func joinAnd(s []string) string {
	switch len(s) {
	case 0:
		return ""
	case 1:
		return s[0]
	}
	return strings.Join(s[:len(s)-1], ", ") + " and " + s[len(s)-1]
}

// bagTypeValue reads "C", "type C", "Type-C".
// types is the list of bag types (FixedLists()[ListBagType]).
func bagTypeValue(f *field, types []string) string {
	raw := f.text("Bag type")
	if raw == "" {
		return ""
	}
	n := strings.ToUpper(strings.TrimSpace(strings.TrimPrefix(NormalizeName(raw), "type")))
	for _, b := range types {
		if n == b {
			return b
		}
	}
	return f.enumValue("Bag type", types, nil)
}

// resolveMaterial finds a material by name: the survey's Materials sheet
// first, then the built-ins and their aliases.
// cache remembers the look-ups on mats (see sheetMaterial).
func (v *validator) resolveMaterial(f *field, ref string, mats map[string]matState, cache map[string]matHit) string {
	if !f.checkID("Material", "material", ref) {
		return ""
	}
	if m, ok := sheetMaterial(ref, mats, cache); ok {
		if !m.accepted {
			f.errorf("Material", ErrRejectedReference, fmt.Sprintf("fix Materials!%d first", m.row),
				"material %q was rejected (Materials!%d), so this row cannot be assessed", short(ref, 60), m.row)
			return ""
		}
		return m.m.Name
	}
	if name, ok := v.builtinMaterial(ref); ok {
		return name
	}
	var names []string
	for _, m := range v.s.Materials {
		names = append(names, m.Name)
	}
	fix := "use a built-in material (sparkmargin library) or add it to the Materials sheet"
	if near := Nearest(ref, names); near != "" {
		fix = didYouMean(ref, near) + " (or add the material to the Materials sheet)"
	}
	f.errorf("Material", ErrUnknownReference, fix, "material %q is neither built in nor on the Materials sheet", short(ref, 60))
	return ""
}

// sheetMaterial finds ref on the Materials sheet: the same name lower-cased,
// else the first name that matches once normalised (in the map's order, as
// it always was), remembered in cache per reference (mats does not change
// while the objects are read).
func sheetMaterial(ref string, mats map[string]matState, cache map[string]matHit) (matState, bool) {
	if h, ok := cache[ref]; ok {
		return h.m, h.ok
	}
	m, ok := mats[strings.ToLower(ref)]
	if !ok {
		for k, km := range mats {
			if sameName(k, ref) {
				m, ok = km, true
				break
			}
		}
	}
	cache[ref] = matHit{m, ok}
	return m, ok
}

type matHit struct {
	m  matState
	ok bool
}

// builtinMaterial is LookupMaterial(ref)'s name, remembered per reference
// for the pass (a survey names the same few materials on many rows).
func (v *validator) builtinMaterial(ref string) (string, bool) {
	if hit, ok := v.builtins[ref]; ok {
		return hit.name, hit.ok
	}
	bm, ok := LookupMaterial(ref)
	if v.builtins == nil {
		v.builtins = map[string]builtinHit{}
	}
	v.builtins[ref] = builtinHit{bm.Name, ok}
	return bm.Name, ok
}

type builtinHit struct {
	name string
	ok   bool
}

// ---- Changes ----

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
