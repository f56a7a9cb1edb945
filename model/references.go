package model

import "strings"

// Reference is one document (or declared choice) that the limits, defaults,
// formulas and findings rest on. Texts cite it by Key, the short name a reader
// finds in the References list of the Method sheet ("TRGS 727:2016 Annex D"
// points to the entry "TRGS 727", edition 2016, clause Annex D).
type Reference struct {
	Key     string // short name the texts cite: "TRGS 727"
	Edition string // edition or year the texts use; "" when none is named
	Kind    string // standard, technical rule, guidance, glossary, book or paper, constant, choice
	Title   string // what it is, in words
	Note    string // how it was consulted and what to watch
}

// Cite is the reference as texts cite it: the key with its edition
// ("IEC 60079-0:2017"), or the key alone.
func (r Reference) Cite() string {
	if r.Edition == "" {
		return r.Key
	}
	return r.Key + ":" + r.Edition
}

// Reference keys used by the limit table (limitTable) and the other tables of
// this package. The keys are the documents' short names.
const (
	refTS32     = "IEC TS 60079-32-1"
	ref0        = "IEC 60079-0"
	refTRGS727  = "TRGS 727"
	refBags     = "IEC 61340-4-4"
	refJNIOSH   = "JNIOSH-TR"
	refCLC50404 = "CLC/TR 50404"
	refBGRCI    = "BG RCI FAQ"
	refCCPS     = "CCPS glossary"
	refAMS      = "AMS Glossary of Meteorology"
	refESDA     = "ESD Association"
	refPaschen  = "Paschen's law"
	refChoice   = "screening choice of this tool"
	refPractice = "common practice, no source"
)

// References returns the documents the tool's texts cite, in the order the
// Method sheet lists them: standards and technical rules, guidance,
// glossaries, books and papers, then the tool's own choices. Editions and
// clauses are those of the tool's reference notes; where a value was recalled
// and not confirmed against the document's text, the limit or default says
// "from memory" and is listed under "Verify before relying on these".
func References() []Reference {
	return []Reference{
		{refTS32, "2013+A1:2017", "standard", "Explosive atmospheres – Part 32-1: Electrostatic hazards, guidance (clause 7: liquids)",
			"the filling rules' clause numbers finer than clause 7 are not confirmed here"},
		{ref0, "2017", "standard", "Explosive atmospheres – Part 0: Equipment – General requirements (7.4: electrostatic charges on non-metallic parts; 26.13: surface resistance)",
			"transferred-charge, area, coating and small-part values recalled; the 4 kV coating condition confirmed in the 2017 foreword"},
		{refTRGS727, "2016", "technical rule", "TRGS 727, Technical Rules for Hazardous Substances: avoidance of ignition hazards due to electrostatic charges (7.1, 7.2 persons; 8.3 conductors; Annex C propagating brush; Annex D shock; Annex H floors)",
			"confirmed through published summaries"},
		{refBags, "2018", "standard", "Electrostatics – Part 4-4: Standard test methods for specific applications – Electrostatic classification of flexible intermediate bulk containers (FIBC)",
			"usage table as quoted by trade summaries; type C point-to-tab 1e7 Ω in the earlier edition"},
		{"IEC 60079-20-1", "", "standard", "Explosive atmospheres – Part 20-1: Material characteristics for gas and vapour classification (gas groups by MESG)", ""},
		{"IEC 60079-32-2", "", "standard", "Explosive atmospheres – Part 32-2: Electrostatics hazards – Tests (transferred-charge test method)", ""},
		{"IEC 60243-1", "", "standard", "Electric strength of insulating materials – Test methods (the method for a layer's measured breakdown voltage)", ""},
		{"TRGS 723", "", "technical rule", "TRGS 723, hazardous explosive atmospheres: an unclassified area may have to be treated as the strictest zone", ""},
		{"NFPA 77", "", "standard", "Recommended Practice on Static Electricity (bonding practice)", ""},
		{refJNIOSH, "", "guidance", "JNIOSH Technical Recommendations for the avoidance of electrostatic hazards in industry",
			"cited through a secondary summary; the brush charge-density screen was found there only, not in IEC text"},
		{refCLC50404, "", "guidance", "CENELEC report on avoidance of hazards due to static electricity (brush discharge energy 3-4 mJ)",
			"cited through summaries"},
		{refBGRCI, "", "guidance", "BG RCI guidance on static electricity, questions and answers (FAQ 1.12 propagating brush onset; 5.10 cone discharges; 7.15 drum capacitance)", ""},
		{refESDA, "", "guidance", "ESD Association definitions (material classes by surface resistivity) and body-voltage table (as reproduced in trade pages)", ""},
		{refCCPS, "", "glossary", "CCPS process-safety glossary (breakdown-limited charge density 2.65e-5 C/m²; brush discharges and dust clouds)", ""},
		{refAMS, "", "glossary", "American Meteorological Society, Glossary of Meteorology (breakdown field of air about 3 MV/m)", ""},
		{"CODATA", "2018", "constant", "CODATA recommended values of the fundamental physical constants (vacuum permittivity)", ""},
		{"textbook", "", "book or paper", "textbook electrostatics: Gauss's and Coulomb's laws, capacitance of spheres, cylinders and plates, stored energy W = C V²/2, decay τ = R C", ""},
		{refPaschen, "", "book or paper", "Paschen's law, textbook physics: minimum sparking potential of air about 327 V", ""},
		{"Peek", "1929", "book or paper", "F. W. Peek, Dielectric phenomena in high-voltage engineering: corona onset on smooth cylinders", ""},
		{"Saito", "1963", "book or paper", "Saito: capacitance of the human body, 100-300 pF", "the 200 pF default from memory"},
		{"Jonassen", "", "book or paper", "N. Jonassen, Electrostatics: charging by walking (about 1 µA at two steps a second)", ""},
		{"NBS J. Res. 69C", "1965", "book or paper", "Journal of Research of the National Bureau of Standards 69C: measured streaming currents of 1-6 µA", ""},
		{"Paasi et al.", "2001", "book or paper", "Paasi et al., Journal of Electrostatics 51-52: dissipative materials turning insulating below 20-30 % RH", ""},
		{"Glor", "", "book or paper", "Glor: energy of cone discharges in silos, W = 5.22 D^3.36 d^1.462 mJ", "the formula from memory"},
		{"derived", "", "choice", "arithmetic on the textbook formulas, not a published example", ""},
		{refChoice, "", "choice", "a value or rule this tool chose where no standard gives one; each says why beside it, and the Site sheet overrides every limit", ""},
		{refPractice, "", "choice", "a rule of thumb of the trade with no published source here", ""},
	}
}

// ReferenceOf returns the reference a text cites: the entry whose key the text
// starts with (the longest such key), or false.
func ReferenceOf(text string) (Reference, bool) {
	var best Reference
	found := false
	for _, r := range References() {
		if strings.HasPrefix(text, r.Key) && len(r.Key) > len(best.Key) {
			best, found = r, true
		}
	}
	return best, found
}

// reference returns the entry of key; it panics on a key not in References
// (a programming error the tests catch).
func reference(key string) Reference {
	for _, r := range References() {
		if r.Key == key {
			return r
		}
	}
	panic("model: no reference " + key)
}
