package assess

// This file fixes the assessment's result types, the contract the audit workbook,
// JSON and terminal writers (package report) are written against. Fields may be
// added; existing names and meanings stay.

import (
	"fmt"
	"math"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// Verdict is the judgement on an object or station.
type Verdict uint8

// Verdicts, ordered from least to most severe except NotAssessed, which sorts by Severity.
const (
	NonIncendive Verdict = iota
	Marginal
	Incendive
	NotAssessed
)

// String returns the contract spelling: "non-incendive", "marginal", "incendive", "not assessed".
func (v Verdict) String() string {
	switch v {
	case NonIncendive:
		return "non-incendive"
	case Marginal:
		return "marginal"
	case Incendive:
		return "incendive"
	}
	return "not assessed"
}

// Severity orders verdicts for ranking: incendive 3, marginal 2, not assessed 1, non-incendive 0.
func (v Verdict) Severity() int {
	switch v {
	case Incendive:
		return 3
	case Marginal:
		return 2
	case NotAssessed:
		return 1
	}
	return 0
}

// Finding is one failed check on one object.
type Finding struct {
	ObjectID   string
	StationID  string
	Check      string  // stable check name, e.g. "energy-vs-mie", "conductor-earthing"
	Severity   Verdict // the verdict this check alone implies (Incendive or Marginal); shock findings are Marginal
	Message    string  // one line with the numbers
	Mitigation string  // in words of the trade, from templates
	Basis      string  // the ground the check rests on: standard, clause or table and edition, or a screening choice (Check.Basis)
}

// ObjectResult is the assessment of one accepted object.
type ObjectResult struct {
	Object      inventory.Object
	Material    *inventory.Material // nil when none given
	Station     inventory.Station
	Atmosphere  *inventory.Atmosphere // nil: no flammable atmosphere at the station
	Environment model.Environment
	Input       model.Input
	Eval        model.Evaluation

	Verdict Verdict
	// Ratio is EffectiveEnergy / MIE; nil where there is no atmosphere.
	Ratio    *float64
	Reason   string // one sentence: why this verdict (or why not assessed)
	Findings []Finding
	// Marks gives the provenance of the values that fed the result (the
	// tool's choices with their reasons: Defaults).
	Marks []Mark

	// Uncertainty, filled only when Options.Samples > 0.
	Probability *Probability
}

// Probability is the Monte Carlo outcome for one object.
type Probability struct {
	Samples      int
	Incendive    float64
	Marginal     float64
	NonIncendive float64
	NotAssessed  float64
	EnergyP05    float64 // J
	EnergyP50    float64 // J
	EnergyP95    float64 // J
	// Driver is, for a borderline object (Borderline), the drawn input that
	// drives its outcome most (drivers.go); the zero Driver otherwise.
	Driver Driver
}

// StationResult is one station's ranked result.
type StationResult struct {
	Station    inventory.Station
	Atmosphere *inventory.Atmosphere
	Rank       int     // 1 = worst
	Verdict    Verdict // the worst object's
	WorstRatio *float64
	Objects    []string // object IDs at the station, in survey order
	Counts     map[Verdict]int
	// RejectedRows counts the Objects rows naming this station that were
	// rejected (inventory.Rejected.Station): the verdict and rank rest on the
	// objects assessed only, so the station is marked incomplete (IncompleteText).
	RejectedRows int
	// WorstRatioAssumed: the worst ratio is a spark energy dominated by an
	// assumed (unmeasured) resistance to earth (ObjectResult.RatioAssumed): it
	// says "at least 1", not its size, and the rank rests on that assumption.
	WorstRatioAssumed bool
	// ProbabilityAnyIncendive, filled only when Options.Samples > 0.
	ProbabilityAnyIncendive *float64
	// Main is the reason for the station's verdict: the finding that set it
	// (the first object with the station's verdict, its first finding of that
	// severity), or that object's reason where no finding did.
	Main MainReason
}

// MainReason is the finding (or object reason) that set a station's verdict.
type MainReason struct {
	ObjectID string
	Check    string // the check's name; "" when no finding set the verdict (non-incendive, not assessed)
	Text     string // the object's one-sentence reason, or the finding's message
}

// String is the reason as the audit shows it: "O-12 energy-vs-mie: spark 12 mJ reaches ...".
func (m MainReason) String() string {
	if m.ObjectID == "" {
		return ""
	}
	s := m.ObjectID
	if m.Check != "" {
		s += " " + m.Check
	}
	return s + ": " + m.Text
}

// RatioText is what the audit shows for a ratio beside a verdict, where it is
// not a number to read: "n/a" when none was computed (no atmosphere, not
// assessed), "no discharge" when it is 0 (no discharge possible: a zero beside
// a hazard verdict would read as "no risk"); "" for a ratio to show as a number.
func RatioText(r *float64) string {
	switch {
	case r == nil || math.IsNaN(*r):
		return "n/a"
	case *r == 0:
		return "no discharge"
	}
	return ""
}

// RatioAssumedText is shown instead of a ratio whose size is an artefact of an
// assumed input: an unmeasured resistance to earth (the energy "at least the
// MIE") or the worst-case charging current of an unearthed conductor with no
// current on its row (AssumedInputDominates). The object's findings and marks
// say which.
const RatioAssumedText = ">= 1 (assumed)"

// RatioAssumed reports whether the object's ratio is at least 1 only because no
// leakage was assumed for an unmeasured resistance to earth: its size (the 50 kV
// cap times the capacitance) is no figure to read or rank by (reference section 12).
// EnergyStated reports whether the effective energy is a stated result: every
// input was there, or some were missing but the discharges that could be
// evaluated already reach the margin, so their energy is judged as a lower bound
// and carries the ratio (Classify). The energy, the ratio and the words agree.
func (r *ObjectResult) EnergyStated() bool {
	return r.Eval.NotAssessed == 0 || (r.Ratio != nil && !math.IsNaN(*r.Ratio))
}

func (r *ObjectResult) RatioAssumed() bool {
	return r.Ratio != nil && *r.Ratio >= 1 && AssumedInputDominates(&r.Eval, r.Eval.Effective)
}

// Notes returns the station's marks for the terminal and the Stations sheet:
// incomplete (rejected object rows) and a rank resting on an assumed resistance
// or charging current.
func (s StationResult) Notes() []string {
	var out []string
	if t := s.IncompleteText(); t != "" {
		out = append(out, t)
	}
	if s.WorstRatioAssumed {
		out = append(out, "rank rests on an assumed resistance to earth or charging current (worst ratio at least 1, its size not a figure)")
	}
	return out
}

// IncompleteText is the station's mark when object rows naming it were
// rejected ("incomplete: 2 object rows rejected, see Rejected"); "" otherwise.
func (s StationResult) IncompleteText() string {
	switch {
	case s.RejectedRows == 1:
		return "incomplete: 1 object row rejected, see Rejected"
	case s.RejectedRows > 1:
		return fmt.Sprintf("incomplete: %d object rows rejected, see Rejected", s.RejectedRows)
	}
	return ""
}

// Options control an assessment.
type Options struct {
	Limits  model.Limits // the limits applied (survey overrides already merged)
	Samples int          // Monte Carlo samples per object; 0 = point estimate only
	Seed    uint64       // Monte Carlo seed; 0 takes DefaultSeed (Audit.Options records the seed used)
	Workers int          // 0 = all cores (runtime.GOMAXPROCS); results do not depend on it

	// Uncertainties is the uncertainty table the Monte Carlo samples with; nil
	// takes DefaultUncertainties with the Site sheet's overrides
	// (UncertaintiesFromSite). Audit.Options records the table used.
	Uncertainties []Uncertainty
}

// Audit is the whole assessment of one survey.
type Audit struct {
	Survey   *inventory.Survey
	Options  Options
	Objects  []ObjectResult  // every accepted object, survey order
	Stations []StationResult // ranked, worst first
	Findings []Finding       // all findings, ordered by severity, then station rank, then object
	Counts   map[Verdict]int // objects by verdict
	// MethodDefaults lists, once each, every value the tool chose (estimated,
	// library, override: Provenance.IsDefault) across objects, with its reason.
	MethodDefaults []Mark
	// Borderline lists the borderline objects (ObjectResult.Borderline) in
	// survey order, with what to measure next; filled only when sampling.
	Borderline []BorderlineObject
}

// BorderlineObject is one borderline object as the Summary lists it.
type BorderlineObject struct {
	ObjectID    string
	StationID   string
	Verdict     Verdict
	Probability Probability
	Measure     string // ObjectResult.MeasureText
}
