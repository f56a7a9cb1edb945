package assess

import (
	"cmp"
	"fmt"
	"math"
	"slices"
)

// Uncertainty made readable: which objects are borderline, and which input
// drives each the most (from the Monte Carlo draws already made).
//
// Choices (screening choices of this tool, not standard):
//   - An object is borderline when its point verdict differs from its most
//     likely sampled verdict, or when the verdicts more severe than its point
//     verdict together have a sampled probability above BorderlineThreshold
//     (10 %). A not-assessed object is never borderline: nothing was sampled.
//   - The driver of a borderline object is the drawn input whose draws have
//     the largest absolute Spearman rank correlation with the outcome of the
//     draw, the outcome ranked by verdict first (non-incendive < marginal <
//     incendive) and by the ratio E/MIE within a verdict (draws not assessed
//     are left out). Inputs are drawn independently (montecarlo.go), so the
//     rank correlation orders them by how much of the spread of the outcome
//     each carries; measuring the driver narrows the outcome the most.

// BorderlineThreshold is the sampled probability of a more severe verdict
// above which an object is flagged borderline (a screening choice of this
// tool: one draw in ten).
const BorderlineThreshold = 0.10

// MostLikely returns the verdict with the highest sampled probability; a tie
// goes to the more severe verdict.
func (p *Probability) MostLikely() Verdict {
	best, bp := NotAssessed, p.NotAssessed
	for _, c := range []struct {
		v Verdict
		p float64
	}{{Incendive, p.Incendive}, {Marginal, p.Marginal}, {NonIncendive, p.NonIncendive}} {
		if c.p > bp {
			best, bp = c.v, c.p
		}
	}
	return best
}

// MoreSevere returns the sampled probability of a verdict more severe than v:
// incendive for marginal, marginal or incendive for non-incendive, 0 otherwise.
func (p *Probability) MoreSevere(v Verdict) float64 {
	switch v {
	case NonIncendive:
		return p.Marginal + p.Incendive
	case Marginal:
		return p.Incendive
	}
	return 0
}

// Borderline reports whether a point verdict v is borderline given the draws
// (see the package's choices above).
func (p *Probability) Borderline(v Verdict) bool {
	if p == nil || p.Samples == 0 || v == NotAssessed || p.NotAssessed >= 1 {
		return false
	}
	return p.MostLikely() != v || p.MoreSevere(v) > BorderlineThreshold
}

// Alternative returns the verdict a borderline object may really have: its most
// likely sampled verdict when that differs from v, else the more severe
// verdict with the higher probability.
func (p *Probability) Alternative(v Verdict) Verdict {
	if m := p.MostLikely(); m != v && m != NotAssessed {
		return m
	}
	if v == NonIncendive && p.Marginal >= p.Incendive {
		return Marginal
	}
	return Incendive
}

// Borderline reports whether the object's sampled verdicts make its point
// verdict borderline (false without sampling).
func (r *ObjectResult) Borderline() bool {
	return r.Probability != nil && r.Probability.Borderline(r.Verdict)
}

// Driver is the input that drives a borderline object's outcome most; the
// zero Driver (Input "") is none.
type Driver struct {
	Input       string  // the input, in words ("resistance to earth")
	Item        Item    // its typed item where the audit shows one (ItemNone for a row size, flow, ...)
	Correlation float64 // Spearman rank correlation of its draws with the outcome, -1..1
}

// MeasureText says what measuring the driver would settle for the object:
// "measure the resistance to earth (now estimated): it drives the outcome most
// (rank correlation +0.82); a reading settles marginal or incendive".
func (r *ObjectResult) MeasureText() string {
	p := r.Probability
	if p == nil || p.Driver.Input == "" {
		return ""
	}
	d := &p.Driver
	settles := fmt.Sprintf("%s or %s", r.Verdict, p.Alternative(r.Verdict))
	if math.Abs(d.Correlation) < WeakDriver {
		return fmt.Sprintf("no drawn input stands out (the largest rank correlation, %+.2f, is the %s's): the verdict hangs on several inputs together or on one not drawn (see Defaults applied); "+
			"measure the inputs of the effective discharge to settle %s", d.Correlation, d.Input, settles)
	}
	verb, now := "measure", ""
	switch pv := r.Provenance(d.Item); pv {
	case ProvMeasured:
		verb = "re-measure"
	case ProvEntered:
		now = " (now entered for the station or site, not read at the object)"
	case ProvLibrary:
		now = " (now from the built-in library)"
	case ProvEstimated:
		now = " (now estimated)"
	case ProvOverride:
		now = " (now a Site sheet override)"
	}
	return fmt.Sprintf("%s the %s%s: it drives the outcome most (rank correlation %+.2f over the draws); a reading settles %s",
		verb, d.Input, now, d.Correlation, settles)
}

// WeakDriver is the absolute rank correlation below which no drawn input is
// named as the driver (a screening choice of this tool: below 0.3 an input
// explains under a tenth of the spread of the outcome's ranks).
const WeakDriver = 0.3

// driverRecorder keeps, for one object, each draw's inputs and outcome, so
// that the driver of a borderline object is found from the draws already
// made. Its buffers are reused object after object (one per sampler).
type driverRecorder struct {
	n int       // inputs per draw
	x []float64 // draw-major: x[k*n+j] is input j of draw k
	y []float64 // the outcome score of each draw; NaN: not assessed
	// Scratch buffers of driver, reused so that the sample loop stays
	// free of allocations once warm.
	keep   []int
	ys, xs []float64
	ry, rx []float64
	idx    []int
}

// reset prepares the recorder for an object with n drawn inputs.
func (d *driverRecorder) reset(n int) {
	d.n, d.x, d.y = n, d.x[:0], d.y[:0]
}

// add records one draw: the drawn inputs and the outcome's score, the verdict
// first (non-incendive 0, marginal 1, incendive 2) and the ratio within it
// (r/(1+r), below 1).
func (d *driverRecorder) add(fields *[numTargets]*float64, c *Classification) {
	for j := 0; j < d.n; j++ {
		d.x = append(d.x, *fields[j])
	}
	score := math.NaN()
	switch c.Verdict {
	case NonIncendive:
		score = 0
	case Marginal:
		score = 1
	case Incendive:
		score = 2
	}
	if r := c.Ratio; !math.IsNaN(score) && r > 0 && !math.IsNaN(r) {
		if math.IsInf(r, 1) {
			score += 1
		} else {
			score += r / (1 + r)
		}
	}
	d.y = append(d.y, score)
}

// driver returns the input of the plan whose draws correlate most (by rank)
// with the outcome; the zero Driver when no input moves it.
func (d *driverRecorder) driver(plan *samplePlan) Driver {
	keep := d.keep[:0]
	for k, y := range d.y {
		if !math.IsNaN(y) {
			keep = append(keep, k)
		}
	}
	d.keep = keep
	if len(keep) < 3 || d.n == 0 {
		return Driver{}
	}
	ys := d.ys[:0]
	for _, k := range keep {
		ys = append(ys, d.y[k])
	}
	d.ys = ys
	d.ry, d.idx = ranks(ys, d.ry, d.idx)
	var best Driver
	found := false
	for j := 0; j < d.n && j < plan.n; j++ {
		xs := d.xs[:0]
		for _, k := range keep {
			xs = append(xs, d.x[k*d.n+j])
		}
		d.xs = xs
		d.rx, d.idx = ranks(xs, d.rx, d.idx)
		rho := pearson(d.rx, d.ry)
		if math.IsNaN(rho) || rho == 0 {
			continue
		}
		if !found || math.Abs(rho) > math.Abs(best.Correlation) {
			t := plan.draws[j].target
			best, found = Driver{Input: t.words(), Item: t.item(), Correlation: rho}, true
		}
	}
	if !found {
		return Driver{}
	}
	return best
}

// ranks returns the ranks of x (1-based) in r, ties given their average
// rank; r and idx are scratch buffers reused (and returned grown).
func ranks(x, r []float64, idx []int) ([]float64, []int) {
	idx = idx[:0]
	for i := range x {
		idx = append(idx, i)
	}
	slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(x[a], x[b]) })
	r = r[:0]
	for range x {
		r = append(r, 0)
	}
	for i := 0; i < len(idx); {
		j := i
		for j+1 < len(idx) && x[idx[j+1]] == x[idx[i]] {
			j++
		}
		avg := float64(i+j)/2 + 1
		for k := i; k <= j; k++ {
			r[idx[k]] = avg
		}
		i = j + 1
	}
	return r, idx
}

// pearson returns the correlation coefficient of a and b; NaN when either is constant.
func pearson(a, b []float64) float64 {
	n := float64(len(a))
	var ma, mb float64
	for i := range a {
		ma += a[i]
		mb += b[i]
	}
	ma, mb = ma/n, mb/n
	var sab, saa, sbb float64
	for i := range a {
		da, db := a[i]-ma, b[i]-mb
		sab += da * db
		saa += da * da
		sbb += db * db
	}
	if saa == 0 || sbb == 0 {
		return math.NaN()
	}
	return sab / math.Sqrt(saa*sbb)
}

// words names a drawn input as the advice says it.
func (t sampleTarget) words() string {
	switch t {
	case tField:
		return "field reading"
	case tFieldDistance:
		return "reading distance"
	case tSurfacePotential:
		return "surface potential"
	case tResistance:
		return "resistance to earth"
	case tCapacitance:
		return "capacitance"
	case tChargingCurrent:
		return "charging current"
	case tMassFlow:
		return "mass flow"
	case tChargeToMass:
		return "charge-to-mass ratio"
	case tLength:
		return "length"
	case tWidth:
		return "width"
	case tDiameter:
		return "diameter"
	case tThickness:
		return "thickness"
	case tDistanceToEarth:
		return "distance to earth"
	case tParticleSize:
		return "particle size"
	case tSpeed:
		return "speed"
	case tChargingTime:
		return "charging time"
	case tConductivity:
		return "conductivity"
	case tMIE:
		return "MIE of the atmosphere"
	case tRelativeHumidity:
		return "relative humidity"
	}
	return "input"
}

// item is the typed item of a drawn input where the audit shows a provenance.
func (t sampleTarget) item() Item {
	switch t {
	case tSurfacePotential:
		return ItemPotential
	case tResistance:
		return ItemResistance
	case tCapacitance:
		return ItemCapacitance
	case tChargingCurrent:
		return ItemChargingCurrent
	case tConductivity:
		return ItemConductivity
	case tMIE:
		return ItemMIE
	case tRelativeHumidity:
		return ItemRelativeHumidity
	}
	return ItemNone
}
