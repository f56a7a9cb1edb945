package inventory

import (
	"fmt"
	"os"
	"regexp"
	"sort"
	"strings"
	"testing"
)

// SURVEY.md is the survey contract the README points to. Its tables are
// generated from the tables the reader uses (the Site items, the columns of
// every sheet, the drop-down lists, what each kind needs, the Change codes,
// the Site items that override limits and uncertainties), between the lines
// "<!-- generated: NAME -->" and "<!-- end: NAME -->"; the prose around them
// is written by hand. TestSurveyDocMatchesCode fails when a column, item or
// kind exists in the code but not in the document (or the other way round);
// go test ./inventory -run SurveyDoc -update rewrites the generated parts.

const surveyDoc = "SURVEY.md"

// surveyDocSections renders every generated part of SURVEY.md, by name.
func surveyDocSections() map[string]string {
	out := map[string]string{}
	out["site"] = columnTable(SiteItems(), "Item")
	for _, sh := range []string{SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials, SheetChanges} {
		out["columns "+sh] = columnTable(SheetColumns(sh), "Column")
	}
	var req strings.Builder
	req.WriteString("| Sheet | Columns its header must have (without them every row is rejected) |\n|---|---|\n")
	for _, sh := range []string{SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials, SheetChanges} {
		fmt.Fprintf(&req, "| %s | %s |\n", sh, strings.Join(requiredColumns(sh), ", "))
	}
	out["required columns"] = req.String()
	out["header rows"] = fmt.Sprintf("The header row may stand anywhere in the first %d rows (a title row or two above it are fine).\n", headerScanRows)
	var al strings.Builder
	al.WriteString("| Header written | Read as |\n|---|---|\n")
	aliases := headerAliases()
	keys := make([]string, 0, len(aliases))
	for k := range aliases {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		fmt.Fprintf(&al, "| %s | %s |\n", mdCell(k), mdCell(contractName(aliases[k])))
	}
	out["header aliases"] = al.String()
	out["change codes"] = "`" + strings.Join(ChangeKinds(), "`, `") + "`\n"
	out["kind needs"] = kindNeedsTable()
	out["limit items"] = limitItemsTable()
	out["uncertainty items"] = uncertaintyItemsTable()
	return out
}

// listText is what a column's drop-down offers, in words.
func listText(list string) string {
	if list == "" {
		return ""
	}
	if vals, ok := FixedLists()[list]; ok {
		return strings.Join(vals, ", ")
	}
	switch list {
	case ListStation:
		return "the IDs of the Stations sheet"
	case ListAtmosphere:
		return "the IDs of the Atmospheres sheet"
	case ListMaterial:
		return "the built-in materials and the Materials sheet's names"
	case ListSubstance:
		return "the built-in substances"
	}
	return "list " + list
}

// mdCell escapes a table cell.
func mdCell(s string) string { return strings.ReplaceAll(s, "|", "\\|") }

func columnTable(cols []Column, first string) string {
	var b strings.Builder
	fmt.Fprintf(&b, "| %s | Unit (header) | Values | What it is |\n|---|---|---|---|\n", first)
	for _, c := range cols {
		unit := c.Unit
		switch {
		case unit != "":
			unit = "[" + unit + "]"
		case c.Dim == Dimensionless:
			unit = "plain number"
		case c.Dim == Date:
			unit = "date"
		}
		fmt.Fprintf(&b, "| %s | %s | %s | %s |\n", mdCell(c.Name), mdCell(unit), mdCell(listText(c.List)), mdCell(c.Hint))
	}
	return b.String()
}

func kindNeedsTable() string {
	var b strings.Builder
	b.WriteString("| Kind | Required | One of | In a case | Optional | The rule, as check says it |\n|---|---|---|---|---|---|\n")
	for _, k := range KindNeeds() {
		by := map[Need][]string{}
		for _, c := range k.Columns {
			by[c.Need] = append(by[c.Need], c.Column)
		}
		cell := func(n Need) string {
			if len(by[n]) == 0 {
				return "–"
			}
			return strings.Join(by[n], ", ")
		}
		fmt.Fprintf(&b, "| %s | %s | %s | %s | %s | %s |\n", k.Kind, cell(Required), cell(OneOf), cell(Conditional), cell(Optional), mdCell(k.Summary))
	}
	return b.String()
}

// contractName is the column name as the template writes it for a normalised name.
func contractName(n string) string {
	for _, sh := range []string{SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials, SheetChanges} {
		for _, c := range SheetColumns(sh) {
			if NormalizeName(c.Name) == n {
				return c.Name
			}
		}
	}
	return n
}

// itemText writes a Site item's matched name as a surveyor types it:
// "transferred charge iib" -> "Transferred charge IIB".
func itemText(name string) string {
	words := strings.Fields(name)
	for i, w := range words {
		switch w {
		case "iia", "iib", "iic", "iii", "ibc", "mie", "vd", "c":
			words[i] = strings.ToUpper(w)
		}
	}
	s := strings.Join(words, " ")
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// leadingName strips an internal field name ("ShockEnergy: ") from a note.
var leadingName = regexp.MustCompile(`^[A-Z][A-Za-z]*(\[[^\]]*\])?(: |$)`)

func limitItemsTable() string {
	var b strings.Builder
	b.WriteString("| Site item | Default unit | What it sets |\n|---|---|---|\n")
	for _, k := range LimitItems() {
		note := leadingName.ReplaceAllString(k.Note, "")
		if note == "" { // the note is only the field's name
			note = "the " + k.Name
		}
		unit := k.Unit
		if unit == "" {
			unit = "plain number"
		}
		fmt.Fprintf(&b, "| %s | %s | %s |\n", mdCell(itemText(k.Name)), mdCell(unit), mdCell(note))
	}
	return b.String()
}

func uncertaintyItemsTable() string {
	var b strings.Builder
	b.WriteString("| Site item | Unit of the value when none is written | Reads as |\n|---|---|---|\n")
	for _, u := range UncertaintyItems() {
		var reads string
		switch u.Scale {
		case SpreadRelative:
			reads = "one standard deviation, relative"
		case SpreadLength:
			reads = "one standard deviation of the distance"
		case SpreadRH:
			reads = "one standard deviation, in %RH"
		case SpreadLog:
			reads = "one standard deviation of the logarithm (%, decades or a factor)"
		}
		fmt.Fprintf(&b, "| %s | %s | %s |\n", mdCell(itemText(u.Name)), mdCell(u.Unit), reads)
	}
	return b.String()
}

var docSection = regexp.MustCompile(`(?s)<!-- generated: ([^>]+?) -->\n(.*?)<!-- end: ([^>]+?) -->`)

func TestSurveyDocMatchesCode(t *testing.T) {
	raw, err := os.ReadFile(surveyDoc)
	if err != nil {
		t.Fatal(err)
	}
	doc := string(raw)
	want := surveyDocSections()
	seen := map[string]bool{}
	var bad []string
	doc2 := docSection.ReplaceAllStringFunc(doc, func(m string) string {
		g := docSection.FindStringSubmatch(m)
		name, body, end := g[1], g[2], g[3]
		if name != end {
			t.Errorf("%s: section %q ends as %q", surveyDoc, name, end)
			return m
		}
		w, ok := want[name]
		if !ok {
			t.Errorf("%s: section %q is generated from nothing in the code; remove it", surveyDoc, name)
			return m
		}
		seen[name] = true
		if body != w {
			bad = append(bad, name)
		}
		return "<!-- generated: " + name + " -->\n" + w + "<!-- end: " + name + " -->"
	})
	for name := range want {
		if !seen[name] {
			t.Errorf("%s has no section %q: add the lines <!-- generated: %s --> and <!-- end: %s --> where it belongs, then run with -update", surveyDoc, name, name, name)
		}
	}
	if len(bad) == 0 {
		return
	}
	if *update {
		if err := os.WriteFile(surveyDoc, []byte(doc2), 0o644); err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: rewrote %v", surveyDoc, bad)
		return
	}
	t.Errorf("%s does not say what the code reads in section(s) %v: run go test ./inventory -run SurveyDoc -update and read the diff", surveyDoc, bad)
}
