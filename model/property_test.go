package model

import (
	"math"
	"math/rand/v2"
	"testing"
)

// Property tests: a few hundred seeded random cases each (no outside values:
// monotonicity the physics requires, derived). The atmosphere is toluene vapour,
// MIE 0.24 mJ, group IIA: from memory (reference section 4), used only as a setting.

func logUniform(r *rand.Rand, lo, hi float64) float64 {
	return math.Pow(10, math.Log10(lo)+r.Float64()*(math.Log10(hi)-math.Log10(lo)))
}

func TestPropertyEnergyGrowsWithPotential(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 1))
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	for n := 0; n < 400; n++ {
		c := logUniform(r, 1e-12, 1e-9)
		v1 := logUniform(r, 10, 1e5)
		v2 := v1 * (1 + r.Float64())
		if SparkEnergy(c, v2) < SparkEnergy(c, v1) {
			t.Fatalf("SparkEnergy(%g, %g) < SparkEnergy(%g, %g)", c, v2, c, v1)
		}
		in := blank(Container)
		in.Capacitance, in.SurfacePotential = c, v1
		e1 := Evaluate(in, env, lim).EffectiveEnergy
		in.SurfacePotential = v2
		if e2 := Evaluate(in, env, lim).EffectiveEnergy; e2 < e1 {
			t.Fatalf("effective energy fell from %g to %g as V rose from %g to %g", e1, e2, v1, v2)
		}
	}
}

func TestPropertyEarthingLowersPotential(t *testing.T) {
	r := rand.New(rand.NewPCG(2, 2))
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	for n := 0; n < 400; n++ {
		in := blank(Part)
		in.ChargingCurrent = logUniform(r, 1e-9, 1e-4)
		in.Capacitance = logUniform(r, 5e-12, 1e-9)
		in.ChargingTime = logUniform(r, 1e-3, 1e3)
		if r.IntN(2) == 0 {
			in.Diameter = logUniform(r, 1e-3, 1)
		}
		unearthed := Evaluate(in, env, lim).Potential
		r1 := logUniform(r, 1e3, 1e14)
		r2 := r1 * r.Float64()
		in.Resistance = r1
		v1 := Evaluate(in, env, lim).Potential
		in.Resistance = r2
		v2 := Evaluate(in, env, lim).Potential
		if v2 > v1*(1+1e-12) {
			t.Fatalf("R %g -> %g raised V %g -> %g", r1, r2, v1, v2)
		}
		if r1 <= lim.NotEarthed && v1 > unearthed*(1+1e-12) {
			t.Fatalf("R %g gave %g above the unearthed %g", r1, v1, unearthed)
		}
	}
}

func TestPropertyHumidityNeverRaisesResistivity(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 3))
	for n := 0; n < 500; n++ {
		rho := logUniform(r, 1e3, 1e17)
		slope := r.Float64() * 2
		rh1 := r.Float64() * 100
		rh2 := rh1 + r.Float64()*(100-rh1)
		a, b := SurfaceResistivityAt(rho, slope, rh1), SurfaceResistivityAt(rho, slope, rh2)
		if b > a {
			t.Fatalf("rho %g slope %g: RH %g -> %g raised %g -> %g", rho, slope, rh1, rh2, a, b)
		}
	}
}

func TestPropertyCappingNeverRaises(t *testing.T) {
	r := rand.New(rand.NewPCG(4, 4))
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	for n := 0; n < 400; n++ {
		in := blank(Container)
		in.ChargingCurrent = logUniform(r, 1e-9, 1e-4)
		in.Resistance = logUniform(r, 1e6, 1e14)
		in.Capacitance = logUniform(r, 5e-12, 1e-9)
		in.Diameter = logUniform(r, 1e-3, 2)
		raw := ConductorPotential(in.ChargingCurrent, in.Resistance, in.Capacitance, math.NaN())
		ev := Evaluate(in, env, lim)
		if ev.Potential > raw*(1+1e-12) {
			t.Fatalf("cap raised %g to %g", raw, ev.Potential)
		}
		if ev.Flags&FlagCappedCorona != 0 && ev.Potential != ev.CoronaOnset {
			t.Fatalf("capped at %g, onset %g", ev.Potential, ev.CoronaOnset)
		}
		p := blank(Person)
		p.Resistance = in.Resistance
		if pv := Evaluate(p, env, lim).Potential; pv > math.Min(WalkingCurrent*p.Resistance, lim.PersonMaxPotential)*(1+1e-12) {
			t.Fatalf("person cap raised to %g", pv)
		}
		sigma, area, th := logUniform(r, 1e-5, 1e-3), logUniform(r, 1e-3, 10), logUniform(r, 1e-5, 8e-3)
		raw = sigma * sigma * area * th / (2 * Eps0 * 3)
		if w := PropagatingBrushEnergy(sigma, area, th, 3, lim.PropagatingMaxEnergy); w > raw || w > lim.PropagatingMaxEnergy {
			t.Fatalf("propagating cap raised %g to %g", raw, w)
		}
	}
}
