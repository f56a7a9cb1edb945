package assess

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// Property tests over seeded random rows of conductors, powders and bags (issue
// 11): a blank gas group is never milder than any filled group; an unknown
// resistance to earth is never milder than any known one; raising a reading
// (potential, charge-to-mass, charging current) never lowers the verdict.
// "Milder" compares Verdict.Severity (incendive > marginal > not assessed >
// non-incendive). The rows are random draws over plant-like ranges (invented for
// the test), not survey data.

const propertyRows = 4000

type propRow struct {
	in  model.Input
	env model.Environment
}

func (r propRow) String() string {
	return fmt.Sprintf("%v in %v %v zone %v MIE %g: C %g V %g R %g I %g mflow %g q/m %g t %g D %g L %g d %g rho %g bag %v field %g",
		r.in.Kind, r.env.Atmosphere, r.env.Group, r.env.Zone, r.env.MIE, r.in.Capacitance, r.in.SurfacePotential, r.in.Resistance,
		r.in.ChargingCurrent, r.in.MassFlow, r.in.ChargeToMass, r.in.ChargingTime, r.in.Diameter, r.in.Length, r.in.ParticleSize,
		r.in.Material.VolumeResistivity, r.in.BagType, r.in.Field)
}

func logUniform(rng *rand.Rand, lo, hi float64) float64 {
	return math.Exp(math.Log(lo) + rng.Float64()*(math.Log(hi)-math.Log(lo)))
}

// maybe returns v with probability p, else NaN (not given).
func maybe(rng *rand.Rand, p, v float64) float64 {
	if rng.Float64() < p {
		return v
	}
	return math.NaN()
}

func randomEnv(rng *rand.Rand) model.Environment {
	env := model.Environment{RelativeHumidity: 10 + 80*rng.Float64(), Temperature: 293.15, MIE: logUniform(rng, 0.01e-3, 100e-3)}
	switch rng.IntN(6) {
	case 0:
		env.Atmosphere = model.Gas
	case 1:
		env.Atmosphere = model.Vapour
	case 2:
		env.Atmosphere = model.Mist
	case 3:
		env.Atmosphere = model.Dust
	case 4:
		env.Atmosphere = model.Hybrid
	default:
		env.Atmosphere, env.MIE = model.NoAtmosphere, math.NaN()
	}
	gasZones := []model.Zone{model.Zone0, model.Zone1, model.Zone2, model.ZoneNone}
	dustZones := []model.Zone{model.Zone20, model.Zone21, model.Zone22, model.ZoneNone}
	gasGroups := []model.Group{model.IIA, model.IIB, model.IIC}
	dustGroups := []model.Group{model.IIIA, model.IIIB, model.IIIC}
	switch env.Atmosphere {
	case model.Dust:
		env.Zone, env.Group = dustZones[rng.IntN(4)], dustGroups[rng.IntN(3)]
	case model.Hybrid:
		env.Zone, env.Group = append(gasZones, dustZones...)[rng.IntN(8)], gasGroups[rng.IntN(3)]
	case model.NoAtmosphere:
	default:
		env.Zone, env.Group = gasZones[rng.IntN(4)], gasGroups[rng.IntN(3)]
	}
	return env
}

func randomRow(rng *rand.Rand) propRow {
	nan := math.NaN()
	kinds := []model.Kind{model.Container, model.Part, model.Person, model.Roller, model.Powder, model.Bag}
	in := model.Input{
		Kind:     kinds[rng.IntN(len(kinds))],
		Material: model.Material{Permittivity: nan, SurfaceResistivity: nan, VolumeResistivity: nan, BreakdownStrength: nan},
		Length:   maybe(rng, 0.5, logUniform(rng, 0.1, 5)), Width: nan,
		Diameter:  maybe(rng, 0.6, logUniform(rng, 0.01, 5)),
		Thickness: nan, DistanceToEarth: maybe(rng, 0.3, logUniform(rng, 0.01, 2)),
		Field: nan, FieldDistance: nan,
		SurfacePotential: maybe(rng, 0.3, logUniform(rng, 10, 100e3)),
		Speed:            nan,
		MassFlow:         maybe(rng, 0.5, logUniform(rng, 0.01, 5)),
		ChargeToMass:     maybe(rng, 0.5, logUniform(rng, 1e-9, 1e-3)),
		ChargingCurrent:  maybe(rng, 0.3, logUniform(rng, 1e-10, 1e-3)),
		ChargingTime:     maybe(rng, 0.4, logUniform(rng, 0.1, 1000)),
		ParticleSize:     maybe(rng, 0.7, logUniform(rng, 0.01e-3, 5e-3)),
		Resistance:       maybe(rng, 0.6, logUniform(rng, 1e3, 1e16)),
		Capacitance:      maybe(rng, 0.5, logUniform(rng, 1e-12, 2e-9)),
		Conductivity:     nan, Permittivity: nan, ProductMIE: maybe(rng, 0.3, logUniform(rng, 0.1e-3, 2)),
	}
	switch in.Kind {
	case model.Roller:
		in.Material.Name, in.Material.Conductive = "steel", true
	case model.Powder:
		in.Material.VolumeResistivity = maybe(rng, 0.6, logUniform(rng, 1e6, 1e15))
		in.Field = maybe(rng, 0.3, logUniform(rng, 10e3, 2e6))
	case model.Bag:
		in.BagType = model.BagType(rng.IntN(5))
	}
	return propRow{in: in, env: randomEnv(rng)}
}

func severityOf(in model.Input, env model.Environment, lim *model.Limits) int {
	ev := model.Evaluate(in, env, *lim)
	return Classify(&in, &env, &ev, lim, DefaultMargin).Verdict.Severity()
}

func TestPropertyBlankGroupNeverMilder(t *testing.T) {
	lim := model.DefaultLimits()
	rng := rand.New(rand.NewPCG(11, 1))
	checked := 0
	for n := 0; n < propertyRows; n++ {
		r := randomRow(rng)
		if !r.env.Atmosphere.IgnitedByBrush() {
			continue
		}
		blank := r.env
		blank.Group = model.GroupNone
		sb := severityOf(r.in, blank, &lim)
		for _, g := range []model.Group{model.IIA, model.IIB, model.IIC, model.IIIA, model.IIIB, model.IIIC} {
			filled := r.env
			filled.Group = g
			if sf := severityOf(r.in, filled, &lim); sb < sf {
				t.Fatalf("blank group severity %d < %d with %v: %v", sb, sf, g, r)
			}
			checked++
		}
	}
	if checked < propertyRows {
		t.Fatalf("only %d comparisons", checked)
	}
}

func TestPropertyUnknownResistanceNeverMilder(t *testing.T) {
	lim := model.DefaultLimits()
	rng := rand.New(rand.NewPCG(11, 2))
	for n := 0; n < propertyRows; n++ {
		r := randomRow(rng)
		if r.in.Kind == model.Powder && math.IsNaN(r.in.Capacitance) {
			// A powder row without its container's Resistance or Capacitance judges
			// the powder alone; the container is then its own row (a documented choice).
			r.in.Capacitance = logUniform(rng, 10e-12, 1e-9)
		}
		unknown := r.in
		unknown.Resistance = math.NaN()
		su := severityOf(unknown, r.env, &lim)
		for _, R := range []float64{1e3, 1e6, 3e6, 1e8, 1e10, 1e12, 1e13, 1e15, 1e17} {
			known := r.in
			known.Resistance = R
			if sk := severityOf(known, r.env, &lim); su < sk {
				t.Fatalf("unknown resistance severity %d < %d with R = %g: %v", su, sk, R, r)
			}
		}
	}
}

func TestPropertyRaisingAReadingNeverLowers(t *testing.T) {
	lim := model.DefaultLimits()
	rng := rand.New(rand.NewPCG(11, 3))
	readings := []struct {
		name string
		f    func(*model.Input) *float64
	}{
		{"potential", func(in *model.Input) *float64 { return &in.SurfacePotential }},
		{"charge-to-mass", func(in *model.Input) *float64 { return &in.ChargeToMass }},
		{"charging current", func(in *model.Input) *float64 { return &in.ChargingCurrent }},
	}
	compared := 0
	for n := 0; n < propertyRows; n++ {
		r := randomRow(rng)
		base := severityOf(r.in, r.env, &lim)
		for _, rd := range readings {
			v := *rd.f(&r.in)
			if math.IsNaN(v) {
				continue
			}
			for _, factor := range []float64{1.5, 3, 10, 100} {
				up := r.in
				*rd.f(&up) = v * factor
				if s := severityOf(up, r.env, &lim); s < base {
					t.Fatalf("raising %s x%g lowered the severity %d -> %d: %v", rd.name, factor, base, s, r)
				}
				compared++
			}
		}
	}
	if compared < propertyRows {
		t.Fatalf("only %d comparisons", compared)
	}
}
