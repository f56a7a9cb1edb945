package model

import (
	"math"
	"testing"
)

func TestRollerConductorRule(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	bare := blank(Roller)
	bare.Resistance, bare.SurfacePotential = 1e9, 2e3
	if !RollerIsConductor(bare) {
		t.Error("unnamed roller with a resistance and no layer is not a conductor")
	}
	// derived: 20 pF typical at 2 kV -> 40 uJ.
	near(t, "bare roller", Evaluate(bare, env, lim).StoredEnergy, 0.5*20e-12*2e3*2e3, 1e-12)

	rubber := blank(Roller)
	rubber.Material.Name, rubber.Material.Permittivity = "rubber", 3
	rubber.Diameter, rubber.Length = 0.2, 1
	rubber.DistanceToEarth, rubber.SurfacePotential = 0.02, 10e3
	if RollerIsConductor(rubber) {
		t.Error("insulating roller taken as a conductor")
	}
	ev := Evaluate(rubber, env, lim)
	// derived: sigma = eps0 V / h = 8.854e-12 x 1e4 / 0.02 = 4.43 uC/m^2; face pi D L = 0.628 m^2.
	near(t, "roller density", ev.ChargeDensity, Eps0*1e4/0.02, 1e-12)
	near(t, "roller area", ev.InsulatingArea, math.Pi*0.2, 1e-12)
	near(t, "roller field", ev.SurfaceField, 1e4/0.02, 1e-12)
	if ev.Discharges[Spark].Code != ReasonSparkInsulator || ev.Discharges[Brush].Possible {
		t.Errorf("roller: spark %s; brush %s", ev.Discharges[Spark].Reason(), ev.Discharges[Brush].Reason())
	}
	// derived: 4.43 uC/m^2 is above the IIB screen of 3 uC/m^2.
	if ev := Evaluate(rubber, gasEnv(IIB, Zone1, 0.07e-3), lim); !ev.Discharges[Brush].Possible {
		t.Errorf("IIB: %s", ev.Discharges[Brush].Reason())
	}
	// An out-of-range group on a gas is an unknown gas group: IIC, the strictest
	// screen (1 uC/m^2), so 4.43 uC/m^2 gives a brush (reference section 12).
	if ev := Evaluate(rubber, Environment{Atmosphere: Gas, Group: Group(200)}, lim); !ev.Discharges[Brush].Possible {
		t.Error("out-of-range gas group did not take the IIC screen")
	}
}

func TestSurfaceReadingPaths(t *testing.T) {
	lim := DefaultLimits()
	env := gasEnv(IIA, Zone1, 0.24e-3)
	in := blank(Sheet)
	in.DistanceToEarth, in.Field, in.FieldDistance = 0.05, 100e3, 0.05
	ev := Evaluate(in, env, lim)
	// derived: over earth, z = h: sigma = 2 eps0 E = 1.77 uC/m^2, field one-sided.
	near(t, "over earth density", ev.ChargeDensity, 2*Eps0*1e5, 1e-12)
	near(t, "over earth potential", ev.Potential, 5e3, 1e-12)
	// derived: backed with a surface potential: eps0 epsr V / t, 1 kV on 50 um epsr 3 -> 531 uC/m^2.
	b := blank(Sheet)
	b.EarthedBacking, b.Thickness, b.Material.Permittivity, b.SurfacePotential = true, 50e-6, 3, 1e3
	ev = Evaluate(b, env, lim)
	near(t, "backed potential density", ev.ChargeDensity, Eps0*3*1e3/50e-6, 1e-12)
	if ev.Flags&FlagSuspectReading != 0 || !ev.Discharges[PropagatingBrush].Possible || ev.Assumed&AssumedBreakdownUnknown == 0 || ev.Assumed&AssumedPropagatingArea == 0 {
		t.Errorf("backed thin film: flags %b, assumed %b, %s", ev.Flags, ev.Assumed, ev.Discharges[PropagatingBrush].Reason())
	}
	// from memory: the upper bound 1 J with no area.
	near(t, "propagating bound", ev.Discharges[PropagatingBrush].Energy, 1, 1e-12)
	// Source: CCPS glossary [C]: a free sheet above 5.3e-5 C/m^2 is a suspect reading (3 MV/m reading).
	f := blank(Sheet)
	f.Field, f.FieldDistance = 4e6, 0.01
	if ev := Evaluate(f, env, lim); ev.Flags&FlagSuspectReading == 0 {
		t.Error("4 MV/m reading not flagged")
	}
	// Double layer without a thickness: taken as thin, default permittivity.
	d := blank(Sheet)
	d.DoubleLayer, d.Length, d.Width, d.Field, d.FieldDistance = true, 1, 1, 2.9e6, 0.001
	ev = Evaluate(d, env, lim)
	if ev.Assumed&AssumedThinLayer == 0 {
		t.Errorf("double layer: assumed %b", ev.Assumed)
	}
	// Dissipative class without a resistivity, on an earthed backing at 50 %RH: leaks.
	c := blank(Belt)
	c.Material.Dissipative, c.EarthedBacking, c.Thickness, c.Field, c.FieldDistance = true, true, 1e-3, 1e5, 0.05
	ev = Evaluate(c, Environment{RelativeHumidity: 50, Atmosphere: Gas, Group: IIA, Zone: Zone1}, lim)
	if ev.Discharges[Brush].Possible || ev.Discharges[PropagatingBrush].Code != ReasonBrushLeaks || ev.Assumed&AssumedDissipativeClass == 0 {
		t.Errorf("dissipative belt: %s", ev.Discharges[Brush].Reason())
	}
	// The same below 30 %RH keeps its charge (Paasi et al. 2001 [C]: dissipative materials may become insulating).
	ev = Evaluate(c, Environment{RelativeHumidity: 20, Atmosphere: Gas, Group: IIA, Zone: Zone1}, lim)
	if !ev.Discharges[Brush].Possible {
		t.Errorf("dry dissipative belt: %s", ev.Discharges[Brush].Reason())
	}
}
