package assess

import (
	"math"
	"math/rand/v2"
	"unsafe"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// DefaultSeed is the Monte Carlo seed when Options.Seed is 0 (a fixed,
// documented value, so two runs of the same survey give the same probabilities).
const DefaultSeed uint64 = 1

// Monte Carlo propagation of the uncertainty table (Options.Samples > 0).
//
// For each object, N input sets are drawn: every input the row (or its station
// and atmosphere) gives, and the capacitance the model estimated for a
// conductor, is drawn from its row of the uncertainty table (or from the cell's
// own "±x%", which wins), then model.Evaluate and Classify run on the draw. The
// object's Probability holds the share of draws giving each verdict and the
// 5th, 50th and 95th percentiles of the effective energy (over the draws where
// it could be judged; NaN when none could).
//
// Choices (documented, not standard):
//   - Inputs are drawn independently of one another. Material properties from the
//     built-in list or the Materials sheet (permittivity, resistivities, slope,
//     breakdown strength), the limits and the margin are not drawn; values the
//     assessment filled from a built-in list (a liquid's conductivity from its
//     substance, an atmosphere's MIE) are drawn like measured ones. Values not
//     given at all stay at their defaults (a default is not a reading).
//   - Normal draws are reflected to stay physical: a reading keeps its sign, a
//     distance stays positive, humidity stays within 0-100 %RH. Log-normal draws
//     have the reading as their median.
//   - An object the assessment could not judge at all (unknown station, atmosphere
//     or kind) is "not assessed" in every draw.
//   - Draws are those of gonum's distuv.Normal{Mu, Sigma} and
//     distuv.LogNormal{Mu, Sigma} on the object's stream (mu + sigma z, exp(mu +
//     sigma z), z from the generator's NormFloat64), written out so that the
//     sample loop makes no interface call to a distribution and no rand.Rand per draw.
//   - The sizes, readings, flows, speed and conductivity of a row that feed
//     nothing for it (probed once per object, see prune) are not drawn; this
//     saves work and leaves the distribution of the results unchanged.
//   - Reproducible: each object has its own stream, a PCG generator seeded with
//     (seed, FNV-1a 64 of the object ID), so its result depends neither on the
//     number of workers nor on the row order. Two rows with the same ID get the
//     same stream.
//   - The station's probability that any object is incendive is
//     1 - prod(1 - P_i(incendive)) over its objects: the objects are taken as
//     independent. They share the station's MIE and humidity, which makes their
//     verdicts positively correlated, so this is an upper bound of the
//     correlated value (a conservative choice).

// sampleTarget is one input field a draw sets.
type sampleTarget uint8

const (
	tField sampleTarget = iota
	tFieldDistance
	tSurfacePotential
	tResistance
	tCapacitance
	tChargingCurrent
	tMassFlow
	tChargeToMass
	tLength
	tWidth
	tDiameter
	tThickness
	tDistanceToEarth
	tParticleSize
	tSpeed
	tChargingTime
	tConductivity
	tMIE
	tRelativeHumidity
	numTargets
)

// field returns the address of the target's value in the draw's input or environment.
func (t sampleTarget) field(in *model.Input, env *model.Environment) *float64 {
	switch t {
	case tField:
		return &in.Field
	case tFieldDistance:
		return &in.FieldDistance
	case tSurfacePotential:
		return &in.SurfacePotential
	case tResistance:
		return &in.Resistance
	case tCapacitance:
		return &in.Capacitance
	case tChargingCurrent:
		return &in.ChargingCurrent
	case tMassFlow:
		return &in.MassFlow
	case tChargeToMass:
		return &in.ChargeToMass
	case tLength:
		return &in.Length
	case tWidth:
		return &in.Width
	case tDiameter:
		return &in.Diameter
	case tThickness:
		return &in.Thickness
	case tDistanceToEarth:
		return &in.DistanceToEarth
	case tParticleSize:
		return &in.ParticleSize
	case tSpeed:
		return &in.Speed
	case tChargingTime:
		return &in.ChargingTime
	case tConductivity:
		return &in.Conductivity
	case tMIE:
		return &env.MIE
	}
	return &env.RelativeHumidity
}

// drawSpec is how one target is drawn.
type drawSpec struct {
	target sampleTarget
	dist   Distribution
	mu     float64 // normal: the value; log-normal: ln |value|
	sigma  float64 // normal: SI standard deviation; log-normal: of ln
	sign   float64 // log-normal: the value's sign
	upper  float64 // normal: reflect above this (humidity 100 %RH); 0 none
}

// samplePlan lists the draws of one object; a fixed array, so building it does not allocate.
type samplePlan struct {
	n     int
	draws [numTargets]drawSpec
}

func (p *samplePlan) add(t sampleTarget, u *Uncertainty, v, rel float64) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return
	}
	dist, sp, _ := u.CellSpread(rel)
	if !(sp > 0) {
		return
	}
	d := drawSpec{target: t, dist: dist}
	switch dist {
	case LogNormal:
		if v == 0 {
			return
		}
		d.mu, d.sigma, d.sign = math.Log(math.Abs(v)), sp, math.Copysign(1, v)
	case NormalRelative:
		d.mu, d.sigma = v, sp*math.Abs(v)
	default:
		d.mu, d.sigma = v, sp
	}
	if d.sigma == 0 {
		return
	}
	if t == tRelativeHumidity {
		d.upper = 100
	}
	p.draws[p.n] = d
	p.n++
}

// planFor builds the draws of one assessed object.
func planFor(r *ObjectResult, tab *[NumUncertainInputs]Uncertainty, siteRH inventory.Quantity) samplePlan {
	var p samplePlan
	in, o := &r.Input, &r.Object
	p.add(tField, &tab[UncField], in.Field, o.Field.RelUncertainty)
	p.add(tFieldDistance, &tab[UncFieldDistance], in.FieldDistance, o.FieldDistance.RelUncertainty)
	p.add(tSurfacePotential, &tab[UncSurfacePotential], in.SurfacePotential, o.SurfacePotential.RelUncertainty)
	p.add(tResistance, &tab[UncResistance], in.Resistance, o.Resistance.RelUncertainty)
	if !math.IsNaN(in.Capacitance) {
		p.add(tCapacitance, &tab[UncCapacitanceMeasured], in.Capacitance, o.Capacitance.RelUncertainty)
	} else if cm := r.Eval.CapacitanceModel; cm != model.CapNone && cm != model.CapMeasured && r.Eval.Capacitance > 0 {
		// The estimate is fixed from the point evaluation and drawn about it: the
		// model takes a given capacitance as measured, which changes nothing else
		// for a conductor row (it is one already).
		row := &tab[UncCapacitanceEstimated]
		if in.Kind == model.Person && cm == model.CapTypical {
			row = &tab[UncCapacitancePerson] // the body's own 100-300 pF band
		}
		p.add(tCapacitance, row, r.Eval.Capacitance, 0)
	}
	p.add(tChargingCurrent, &tab[UncChargingCurrent], in.ChargingCurrent, o.ChargingCurrent.RelUncertainty)
	p.add(tMassFlow, &tab[UncMassFlow], in.MassFlow, o.MassFlow.RelUncertainty)
	p.add(tChargeToMass, &tab[UncChargeToMass], in.ChargeToMass, o.ChargeToMass.RelUncertainty)
	p.add(tLength, &tab[UncSize], in.Length, o.Length.RelUncertainty)
	p.add(tWidth, &tab[UncSize], in.Width, o.Width.RelUncertainty)
	p.add(tDiameter, &tab[UncSize], in.Diameter, o.Diameter.RelUncertainty)
	p.add(tThickness, &tab[UncSize], in.Thickness, o.Thickness.RelUncertainty)
	p.add(tDistanceToEarth, &tab[UncSize], in.DistanceToEarth, o.DistanceToEarth.RelUncertainty)
	p.add(tParticleSize, &tab[UncSize], in.ParticleSize, o.ParticleSize.RelUncertainty)
	p.add(tSpeed, &tab[UncSpeed], in.Speed, o.Speed.RelUncertainty)
	p.add(tChargingTime, &tab[UncChargingTime], in.ChargingTime, o.ChargingTime.RelUncertainty)
	p.add(tConductivity, &tab[UncConductivity], in.Conductivity, o.Conductivity.RelUncertainty)
	if env := &r.Environment; env.Atmosphere != model.NoAtmosphere && env.MIE > 0 {
		u := &tab[UncMIEGas]
		if env.Atmosphere == model.Dust || env.Atmosphere == model.Hybrid {
			u = &tab[UncMIEDust]
		}
		rel := 0.0
		if r.Atmosphere != nil {
			rel = r.Atmosphere.MIE.RelUncertainty
		}
		p.add(tMIE, u, env.MIE, rel)
	}
	// Humidity is drawn only where it was given (station, else site), not the dry-day default.
	switch {
	case r.Station.RelativeHumidity.Known:
		p.add(tRelativeHumidity, &tab[UncRelativeHumidity], r.Environment.RelativeHumidity, r.Station.RelativeHumidity.RelUncertainty)
	case siteRH.Known:
		p.add(tRelativeHumidity, &tab[UncRelativeHumidity], r.Environment.RelativeHumidity, siteRH.RelUncertainty)
	}
	return p
}

// sampler holds one worker's generator and energy buffer, reused object after
// object. The generator state lives in the sampler, which is padded at both ends
// so that two workers' states never share a cache line.
type sampler struct {
	_        [64]byte
	pcg      rand.PCG
	rng      *rand.Rand // on pcg
	energies []float64
	seed     uint64
	samples  int
	lim      *model.Limits
	margin   float64
	tab      *[NumUncertainInputs]Uncertainty
	siteRH   inventory.Quantity
	rec      driverRecorder // the draws of the object, for its driver (drivers.go)
	_        [64]byte
}

func newSampler(seed uint64, samples int, lim *model.Limits, margin float64, tab *[NumUncertainInputs]Uncertainty, siteRH inventory.Quantity) *sampler {
	s := &sampler{energies: make([]float64, 0, samples), seed: seed, samples: samples,
		lim: lim, margin: margin, tab: tab, siteRH: siteRH}
	s.rng = rand.New(&s.pcg)
	return s
}

// objectStream returns the second PCG seed word of an object: FNV-1a 64 of its ID.
func objectStream(id string) uint64 {
	h := uint64(14695981039346656037)
	for i := 0; i < len(id); i++ {
		h ^= uint64(id[i])
		h *= 1099511628211
	}
	return h
}

// object runs the Monte Carlo of one assessed object. The sample loop does not allocate.
func (s *sampler) object(r *ObjectResult) Probability {
	p := Probability{Samples: s.samples, EnergyP05: math.NaN(), EnergyP50: math.NaN(), EnergyP95: math.NaN()}
	if s.samples <= 0 {
		return p
	}
	point := Classify(&r.Input, &r.Environment, &r.Eval, s.lim, s.margin)
	if point.Verdict != r.Verdict {
		// The assessment overrode the model (unknown station, atmosphere or kind): nothing to sample.
		p.NotAssessed = 1
		return p
	}
	plan := planFor(r, s.tab, s.siteRH)
	var counts [NotAssessed + 1]int
	energies := s.energies[:0]
	// Every draw overwrites the same fields, so the input is copied once.
	in, env := r.Input, r.Environment
	if math.IsNaN(r.Input.Capacitance) {
		// A drawn capacitance stands for the estimate, never for a measurement.
		in.CapacitanceEstimated = true
	}
	var fields [numTargets]*float64
	for j := 0; j < plan.n; j++ {
		fields[j] = plan.draws[j].target.field(&in, &env)
	}
	stream := objectStream(r.Object.ID)
	s.pcg.Seed(s.seed, stream^probeStream)
	s.prune(&plan, &fields, &in, &env)
	s.pcg.Seed(s.seed, stream)
	s.rec.reset(plan.n)
	rng := s.rng
	for k := 0; k < s.samples; k++ {
		for j := 0; j < plan.n; j++ {
			*fields[j] = plan.draws[j].draw(rng)
		}
		ev := model.Evaluate(in, env, *s.lim)
		c := Classify(&in, &env, &ev, s.lim, s.margin)
		counts[c.Verdict]++
		s.rec.add(&fields, &c)
		if !math.IsNaN(c.Energy) {
			energies = append(energies, c.Energy)
		}
	}
	s.energies = energies
	n := float64(s.samples)
	p.Incendive, p.Marginal = float64(counts[Incendive])/n, float64(counts[Marginal])/n
	p.NonIncendive, p.NotAssessed = float64(counts[NonIncendive])/n, float64(counts[NotAssessed])/n
	if len(energies) > 0 {
		p.EnergyP05, p.EnergyP50, p.EnergyP95 = percentiles(energies)
	}
	if p.Borderline(r.Verdict) {
		p.Driver = s.rec.driver(&plan)
	}
	return p
}

// probeStream is XORed into an object's stream word for the draws that find its
// active inputs, so they are reproducible and apart from the sample draws.
const probeStream uint64 = 0x9e3779b97f4a7c15

// probeBases is the number of input sets the active inputs are probed at: the
// point estimate, then joint draws.
const probeBases = 3

// prunable reports whether a target may be left out when the probes find it
// inactive: the sizes, readings, flows, speed and conductivity, which feed the
// model or not according to which inputs the row gives. The resistance, the
// capacitance, the charging time, the MIE and the humidity are always drawn:
// whether they matter can hang on the values of the others (an MIE does not
// change a zero energy, but a draw of the resistance can make the energy
// non-zero; a charging time does not change a body at steady state, but a
// higher resistance can lengthen its time constant).
func (t sampleTarget) prunable() bool {
	switch t {
	case tResistance, tCapacitance, tChargingTime, tMIE, tRelativeHumidity:
		return false
	}
	return true
}

// prune keeps in plan only the draws that feed the result. At each probe base
// (the point estimate, then joint draws of every input) each prunable input not
// yet found active is set to a fresh draw on its own; it is active when the model's
// evaluation or the classification changes in any bit (NaN-safe: the comparison
// is of the bytes). An input found inactive feeds nothing for this object (the
// sizes of a part with a measured capacitance and potential, for instance), so
// not drawing it saves the work and leaves the distribution of the results as
// it is. in, env and fields are left at the point estimate.
func (s *sampler) prune(plan *samplePlan, fields *[numTargets]*float64, in *model.Input, env *model.Environment) {
	if plan.n == 0 {
		return
	}
	var point [numTargets]float64
	for j := 0; j < plan.n; j++ {
		point[j] = *fields[j]
	}
	var active [numTargets]bool
	left := plan.n
	for j := 0; j < plan.n; j++ {
		if !plan.draws[j].target.prunable() {
			active[j] = true
			left--
		}
	}
	for b := 0; b < probeBases && left > 0; b++ {
		if b > 0 {
			for j := 0; j < plan.n; j++ {
				*fields[j] = plan.draws[j].draw(s.rng)
			}
		}
		refEv := model.Evaluate(*in, *env, *s.lim)
		refC := Classify(in, env, &refEv, s.lim, s.margin)
		for j := 0; j < plan.n; j++ {
			if active[j] {
				continue
			}
			base := *fields[j]
			*fields[j] = plan.draws[j].draw(s.rng)
			ev := model.Evaluate(*in, *env, *s.lim)
			c := Classify(in, env, &ev, s.lim, s.margin)
			if !sameBytes(&ev, &refEv) || !sameBytes(&c, &refC) {
				active[j] = true
				left--
			}
			*fields[j] = base
		}
	}
	n := 0
	for j := 0; j < plan.n; j++ {
		*fields[j] = point[j]
		if active[j] {
			plan.draws[n], fields[n] = plan.draws[j], fields[j]
			n++
		}
	}
	plan.n = n
}

// sameBytes reports whether *a and *b hold the same bytes. For the plain
// structs of numbers it is used on, this is equality with NaN equal to itself;
// any doubt (a NaN of another payload) only reads as a difference.
func sameBytes[T any](a, b *T) bool {
	n := unsafe.Sizeof(*a)
	return string(unsafe.Slice((*byte)(unsafe.Pointer(a)), n)) == string(unsafe.Slice((*byte)(unsafe.Pointer(b)), n))
}

// percentiles returns the 5th, 50th and 95th percentiles of x by the empirical
// definition of gonum's stat.Quantile (stat.Empirical: the smallest x(i), i
// 1-based, with i >= p n), by selection instead of a full sort. x is reordered.
func percentiles(x []float64) (p05, p50, p95 float64) {
	k05, k50, k95 := empiricalIndex(0.05, len(x)), empiricalIndex(0.50, len(x)), empiricalIndex(0.95, len(x))
	p95 = selectNth(x, k95)
	p50 = selectNth(x[:k95+1], k50)
	p05 = selectNth(x[:k50+1], k05)
	return p05, p50, p95
}

// empiricalIndex is the 0-based index of the p quantile of n sorted values (stat.Empirical).
func empiricalIndex(p float64, n int) int {
	k := int(math.Ceil(p*float64(n))) - 1
	return max(0, min(k, n-1))
}

// selectNth reorders x so that x[k] is the value a sort would put there, every
// x[i] <= x[k] for i < k and >= for i > k (Hoare's selection), and returns x[k].
func selectNth(x []float64, k int) float64 {
	lo, hi := 0, len(x)-1
	for hi > lo {
		// Median of three as the pivot.
		mid := lo + (hi-lo)/2
		if x[mid] < x[lo] {
			x[mid], x[lo] = x[lo], x[mid]
		}
		if x[hi] < x[lo] {
			x[hi], x[lo] = x[lo], x[hi]
		}
		if x[hi] < x[mid] {
			x[hi], x[mid] = x[mid], x[hi]
		}
		pivot := x[mid]
		i, j := lo, hi
		for i <= j {
			for x[i] < pivot {
				i++
			}
			for x[j] > pivot {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return x[k]
		}
	}
	return x[k]
}

// draw draws one value on rng: a standard normal z (the generator's ziggurat),
// then mu + sigma z, or sign exp(mu + sigma z) for a log-normal.
func (d *drawSpec) draw(rng *rand.Rand) float64 {
	z := rng.NormFloat64()
	if d.dist == LogNormal {
		return d.sign * math.Exp(z*d.sigma+d.mu)
	}
	x := z*d.sigma + d.mu
	if (d.mu > 0 && x < 0) || (d.mu < 0 && x > 0) {
		x = -x
	}
	if d.upper > 0 && x > d.upper {
		x = math.Max(2*d.upper-x, 0)
	}
	return x
}
