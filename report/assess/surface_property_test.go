package assess

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// Property tests over thousands of seeded random insulating-surface rows (issue
// 11, part A). No outside values: these are the monotonicity the safety
// principles require (derived). Each row is drawn over the ranges a survey can
// give, with every input blank about a third of the time.

func maybeBlank(r *rand.Rand, v float64) float64 {
	if r.IntN(3) == 0 {
		return math.NaN()
	}
	return v
}

func logU(r *rand.Rand, lo, hi float64) float64 {
	return math.Pow(10, math.Log10(lo)+r.Float64()*(math.Log10(hi)-math.Log10(lo)))
}

// randomSurface draws a sheet, belt or insulating roller row with a reading. The
// ranges are invented for the test: plausible plant sizes, thicknesses, speeds,
// currents and capacitances spanning a few decades each, blanks included.
func randomSurface(r *rand.Rand) model.Input {
	nan := math.NaN()
	in := model.Input{
		Kind:     []model.Kind{model.Sheet, model.Belt, model.Roller}[r.IntN(3)],
		Material: model.Material{Name: "random", Permittivity: maybeBlank(r, 1.5+3*r.Float64()), SurfaceResistivity: maybeBlank(r, logU(r, 1e6, 1e16)), HumiditySlope: []float64{0, 0.3, 0.8, 1}[r.IntN(4)], VolumeResistivity: nan, BreakdownStrength: maybeBlank(r, logU(r, 5e6, 600e6))},
		Length:   maybeBlank(r, logU(r, 0.05, 20)), Width: maybeBlank(r, logU(r, 0.05, 3)), Diameter: nan,
		Thickness:       maybeBlank(r, logU(r, 10e-6, 20e-3)),
		EarthedBacking:  r.IntN(3) == 0,
		DistanceToEarth: maybeBlank(r, logU(r, 1e-3, 5)),
		Field:           nan, FieldDistance: logU(r, 0.01, 0.5), SurfacePotential: nan,
		Speed:    maybeBlank(r, logU(r, 0.01, 10)),
		MassFlow: nan, ChargeToMass: nan,
		ChargingCurrent: maybeBlank(r, logU(r, 1e-9, 1e-3)),
		ChargingTime:    maybeBlank(r, logU(r, 0.01, 100)),
		ParticleSize:    nan,
		Resistance:      maybeBlank(r, logU(r, 1e3, 1e14)),
		Capacitance:     maybeBlank(r, logU(r, 5e-12, 1e-9)),
		Conductivity:    nan, Permittivity: nan, ProductMIE: nan,
		LayerBreakdown: maybeBlank(r, logU(r, 1e3, 50e3)),
		Process:        model.Process(r.IntN(5)),
	}
	switch r.IntN(4) {
	case 0:
		in.Material.Dissipative = true
	case 1:
		in.Material.Conductive = r.IntN(4) == 0
	}
	if in.Kind == model.Roller {
		in.Diameter = logU(r, 0.02, 1)
	}
	if in.EarthedBacking && math.IsNaN(in.Thickness) {
		in.Thickness = logU(r, 10e-6, 20e-3)
	}
	if r.IntN(2) == 0 {
		in.Field = logU(r, 1e2, 3e6)
	} else {
		in.SurfacePotential = logU(r, 10, 100e3)
	}
	return in
}

func randomSurfaceEnv(r *rand.Rand) model.Environment {
	atm := []model.AtmosphereKind{model.Gas, model.Vapour, model.Mist, model.Hybrid, model.Dust, model.NoAtmosphere}[r.IntN(6)]
	env := model.Environment{RelativeHumidity: 10 + 80*r.Float64(), Temperature: 293.15, Atmosphere: atm, MIE: logU(r, 0.017e-3, 1)}
	switch atm {
	case model.Dust:
		env.Group, env.Zone = []model.Group{model.IIIA, model.IIIB, model.IIIC}[r.IntN(3)], []model.Zone{model.Zone20, model.Zone21, model.Zone22}[r.IntN(3)]
	case model.NoAtmosphere:
		env.MIE = math.NaN()
	default:
		env.Group, env.Zone = []model.Group{model.IIA, model.IIB, model.IIC}[r.IntN(3)], []model.Zone{model.Zone0, model.Zone1, model.Zone2}[r.IntN(3)]
	}
	return env
}

func verdictOf(in model.Input, env model.Environment, lim *model.Limits) (Classification, model.Evaluation) {
	ev := model.Evaluate(in, env, *lim)
	return Classify(&in, &env, &ev, lim, DefaultMargin), ev
}

// Raising a reading (field, potential, charging current) never lowers the verdict.
func TestPropertySurfaceReadingRaisesVerdict(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 1))
	lim := model.DefaultLimits()
	for n := 0; n < 5000; n++ {
		in, env := randomSurface(r), randomSurfaceEnv(r)
		k := 1 + 9*r.Float64()
		hi := in
		switch r.IntN(3) {
		case 0:
			hi.Field *= k
		case 1:
			hi.SurfacePotential *= k
		default:
			if math.IsNaN(hi.ChargingCurrent) {
				hi.ChargingCurrent = logU(r, 1e-9, 1e-3)
				in.ChargingCurrent = hi.ChargingCurrent / k
			} else {
				hi.ChargingCurrent *= k
			}
		}
		c1, ev1 := verdictOf(in, env, &lim)
		c2, ev2 := verdictOf(hi, env, &lim)
		if c2.Verdict.Severity() < c1.Verdict.Severity() {
			t.Fatalf("row %d: raising the reading x%.3g lowered %s to %s\nlow:  %+v\nhigh: %+v\nlow eval: %+v\nhigh eval: %+v", n, k, c1.Verdict, c2.Verdict, in, hi, ev1, ev2)
		}
		if c1.Energy > 0 && c2.Energy < c1.Energy*(1-1e-12) {
			t.Fatalf("row %d: raising the reading lowered the energy %g -> %g\n%+v", n, c1.Energy, c2.Energy, in)
		}
	}
}

// The humidity model never lowers the verdict of a row whose reading is above
// its brush screen: against the same row with the material's humidity response
// taken away (no surface resistivity, not of dissipative class), the verdict at
// any RH is at least as severe.
func TestPropertyHumidityNeverLowersMeasuredHazard(t *testing.T) {
	r := rand.New(rand.NewPCG(12, 1))
	lim := model.DefaultLimits()
	tested := 0
	for n := 0; n < 20000 && tested < 4000; n++ {
		in, env := randomSurface(r), randomSurfaceEnv(r)
		in.Material.Conductive = false
		in.Material.SurfaceResistivity = logU(r, 1e6, 1e13)
		in.Material.HumiditySlope = []float64{0.3, 0.8, 1.2}[r.IntN(3)]
		off := in
		off.Material.SurfaceResistivity, off.Material.Dissipative = math.NaN(), false
		cOff, evOff := verdictOf(off, env, &lim)
		screen := lim.BrushChargeDensity[env.Group]
		// The screen applies to the density a brush drains (a backed layer's air side).
		if env.Group == model.GroupNone || !(evOff.BrushDensity > screen) {
			continue
		}
		tested++
		cOn, evOn := verdictOf(in, env, &lim)
		if cOn.Verdict.Severity() < cOff.Verdict.Severity() {
			t.Fatalf("row %d: the humidity model lowered %s to %s (RH %.0f %%, rho_s %g)\n%+v\n%+v", n, cOff.Verdict, cOn.Verdict, env.RelativeHumidity, evOn.SurfaceResistivity, in, evOn)
		}
		if !evOn.Discharges[model.Brush].Possible {
			t.Fatalf("row %d: brush cleared though the reading %g is above the screen %g", n, evOn.BrushDensity, screen)
		}
	}
	if tested < 1000 {
		t.Fatalf("only %d rows above the screen drawn", tested)
	}
}
