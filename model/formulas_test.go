package model

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/unit/constant"
)

func near(t *testing.T, name string, got, want, tol float64) {
	t.Helper()
	if !scalar.EqualWithinRel(got, want, tol) {
		t.Errorf("%s = %.6g, want %.6g (rel tol %g)", name, got, want, tol)
	}
}

func TestEps0MatchesGonum(t *testing.T) {
	// Source: CODATA 2018 through gonum unit/constant.ElectricConstant.
	near(t, "Eps0", Eps0, float64(constant.ElectricConstant), 1e-9)
}

func TestFormulaCheckValues(t *testing.T) {
	lim := DefaultLimits()
	cases := []struct {
		name      string
		got, want float64
		tol       float64
	}{
		// Source: reference section 10.1 [C]: person 100 pF at 10 kV -> 5 mJ.
		{"person 100 pF 10 kV", SparkEnergy(100e-12, 10e3), 5e-3, 1e-12},
		// Source: reference section 10.2 [C]: 300 pF at 20 kV -> 60 mJ; 400 pF at 50 kV -> 500 mJ.
		{"300 pF 20 kV", SparkEnergy(300e-12, 20e3), 60e-3, 1e-12},
		{"400 pF 50 kV", SparkEnergy(400e-12, 50e3), 0.5, 1e-12},
		// derived: reference section 10.4: drum 70 pF at 10 kV -> 3.5 mJ; on film 35 nF -> 1.75 J.
		{"drum 70 pF", SparkEnergy(70e-12, 10e3), 3.5e-3, 1e-12},
		{"drum on film", SparkEnergy(35e-9, 10e3), 1.75, 1e-12},
		// derived: Q = C V, 100 pF at 10 kV -> 1 uC.
		{"spark charge", SparkCharge(100e-12, -10e3), 1e-6, 1e-12},
		// derived: C_max = 2 MIE / V^2: 0.2 mJ at 1 kV -> 400 pF.
		{"max unearthed C", MaxUnearthedCapacitance(0.2e-3, 1e3), 400e-12, 1e-12},
		// Source: reference section 10.5 [C] JNIOSH-TR: 100 uA through 1 Mohm -> 100 V.
		{"100 uA 1 Mohm", ConductorPotential(100e-6, 1e6, 100e-12, math.NaN()), 100, 1e-12},
		// derived: reference section 10.6: 5 uA, 1e11 ohm, 100 pF, 1 s -> 47.6 kV.
		{"powder drum V(1 s)", ConductorPotential(MassFlowCurrent(0.5, 10e-6), 1e11, 100e-12, 1), 47.58e3, 1e-3},
		{"powder drum W", SparkEnergy(100e-12, ConductorPotential(5e-6, 1e11, 100e-12, 1)), 113.2e-3, 1e-3},
		// derived: with R 1e6 ohm the same drum stays at 5 V.
		{"powder drum earthed", ConductorPotential(5e-6, 1e6, 100e-12, 1), 5, 1e-9},
		// Source: reference section 10.8 (textbook): sphere of radius 1 m -> 111.3 pF.
		{"sphere 1 m", SphereCapacitance(1), 111.3e-12, 1e-3},
		// derived: reference section 2: h = 1 m, r = 0.5 mm -> 6.71 pF/m.
		{"cylinder over plane", CylinderOverPlaneCapacitance(1, 0.5e-3, 1), 6.71e-12, 1e-3},
		// derived: reference section 2: 600 mm drum on 70 mm pallet, epsr 2 -> 71.5 pF (BG RCI FAQ 7.15 measured ~70 pF).
		{"drum on pallet", ParallelPlateCapacitance(math.Pi*0.3*0.3, 0.07, 2), 71.5e-12, 1e-3},
		// derived (textbook): coaxial, b/a = e, epsr 1 -> 2 pi eps0 = 55.63 pF/m.
		{"coaxial", CoaxialCapacitance(1, 1, math.E, 1), 55.63e-12, 1e-3},
		// Source: Peek 1929 via reference section 3 [C]: r = 0.1 cm -> 58.6 kV/cm.
		{"Peek 1 mm", PeekOnsetField(1e-3, 1, 1), 5.86e6, 1e-3},
		// derived: sphere of radius 1 mm holds g_v r = 5.86 kV.
		{"corona onset sphere", CoronaOnsetPotential(1e-3, math.NaN(), 1), 5.86e3, 1e-3},
		// derived: cylinder 1 mm at h = 1 m: g_v r arcosh(1000) = 5.855 kV x 7.6009.
		{"corona onset cylinder", CoronaOnsetPotential(1e-3, 1, 1), 5.8552e3 * 7.6009, 1e-3},
		// derived: Peek's delta is 1 at 25 C.
		{"air density 25 C", RelativeAirDensity(298.15), 1, 1e-12},
		// Source: CCPS glossary [C]: one-sided breakdown density 2.65e-5 C/m^2; two-sided 5.3e-5 (derived).
		{"max density one-sided", MaxDensityOneSided(3e6), 2.65e-5, 3e-3},
		{"max density two-sided", MaxDensityTwoSided(3e6), 5.3e-5, 3e-3},
		// derived: reference section 8: epsr 2 -> 1 pS/m 17.7 s; 50 pS/m 0.35 s; 0.01 pS/m 1770 s.
		{"relaxation 1 pS/m", LiquidRelaxationTime(2, 1e-12), 17.7, 1e-3},
		{"relaxation 50 pS/m", LiquidRelaxationTime(2, 50e-12), 0.354, 1e-2},
		{"relaxation 0.01 pS/m", LiquidRelaxationTime(2, 0.01e-12), 1770, 1e-3},
		// from memory (correlation), reference section 8: 5 m/s in 0.1 m -> 0.94 uA.
		{"streaming current", StreamingCurrent(5, 0.1), 0.94e-6, 3e-3},
		// Source: IEC TS 60079-32-1 via reference section 8 [C v d]: v d <= 0.38 at <= 10 pS/m, 0.5 above; 7 m/s [M].
		{"filling limit low", FillingVelocityLimit(1e-12, 0.1, VesselRoadTanker, math.NaN(), &lim), 3.8, 1e-12},
		{"filling limit unknown", FillingVelocityLimit(math.NaN(), 0.1, VesselRoadTanker, math.NaN(), &lim), 3.8, 1e-12},
		{"filling limit high", FillingVelocityLimit(20e-12, 0.1, VesselRoadTanker, math.NaN(), &lim), 5, 1e-12},
		{"filling limit ceiling", FillingVelocityLimit(20e-12, 0.05, VesselRoadTanker, math.NaN(), &lim), 7, 1e-12},
		// derived: I = sigma v w: 10 uC/m^2 at 2 m/s over 0.5 m -> 10 uA.
		{"belt current", BeltCurrent(10e-6, 2, 0.5), 10e-6, 1e-12},
		// derived: time from 10 kV to 100 V at tau 1 s is ln(100) s.
		{"time to 100 V", TimeToPotential(10e3, 100, 1), math.Log(100), 1e-12},
		// derived: strip rho_s 1e10, c = eps0/h with h 1 cm, w 1 m -> 1e10 x 8.854e-10 / pi^2.
		{"strip relaxation", StripRelaxationTime(1e10, Eps0/0.01, 1), 1e10 * 8.8541878128e-10 / (math.Pi * math.Pi), 1e-12},
	}
	for _, c := range cases {
		near(t, c.name, c.got, c.want, c.tol)
	}
	// derived: below 100 V no decay time is needed.
	if got := TimeToPotential(50, 100, 1); got != 0 {
		t.Errorf("TimeToPotential(50, 100, 1) = %g, want 0", got)
	}
	// derived: tau = R C, 1e11 ohm x 100 pF -> 10 s.
	near(t, "decay", DecayTime(1e11, 100e-12), 10, 1e-12)
}

func TestConeDischargeEnergy(t *testing.T) {
	// from memory (Glor's formula), reference section 10.7: D 1 m, d 1 mm -> 5.22 mJ.
	w, ok := ConeDischargeEnergy(1, 1e-3)
	near(t, "cone 1 m 1 mm", w, 5.22e-3, 1e-9)
	if !ok {
		t.Error("D 1 m, d 1 mm reported outside the range")
	}
	// derived: 5.22 x 2^3.36 x 2^1.462 mJ = 5.22 x 2^4.822 mJ.
	w, _ = ConeDischargeEnergy(2, 2e-3)
	near(t, "cone 2 m 2 mm", w, 5.22e-3*math.Pow(2, 4.822), 1e-9)
	for _, c := range []struct{ d, p float64 }{{0.4, 1e-3}, {4, 1e-3}, {1, 0.05e-3}, {1, 4e-3}} {
		if _, ok := ConeDischargeEnergy(c.d, c.p); ok {
			// Source: validity range D 0.5-3 m, d 0.1-3 mm (reference section 3).
			t.Errorf("D %g m, d %g m reported inside the range", c.d, c.p)
		}
	}
}

func TestFieldTextbookLimits(t *testing.T) {
	sigma := 1e-6
	// Source: textbook (Gauss's law): an infinite sheet's field is sigma/(2 eps0) at any distance.
	for _, z := range []float64{1e-3, 0.1, 10} {
		near(t, "infinite rectangle", RectangleAxisField(sigma, math.Inf(1), math.Inf(1), z), sigma/(2*Eps0), 1e-12)
	}
	// Source: textbook: disc and rectangle tend to sigma/(2 eps0) close in.
	near(t, "disc close in", DiscAxisField(sigma, 1, 1e-7), sigma/(2*Eps0), 1e-6)
	near(t, "rectangle close in", RectangleAxisField(sigma, 1, 0.5, 1e-7), sigma/(2*Eps0), 1e-6)
	// Source: textbook: far away both fall to the point charge Q/(4 pi eps0 z^2).
	near(t, "disc far", DiscAxisField(sigma, 0.01, 100), SphereField(sigma*math.Pi*1e-4, 100), 1e-4)
	near(t, "rectangle far", RectangleAxisField(sigma, 0.01, 0.02, 100), SphereField(sigma*8e-4, 100), 1e-4)
	// Source: textbook: the line field falls as 1/r.
	near(t, "line 1/r", LineField(1e-9, 2)/LineField(1e-9, 1), 0.5, 1e-12)
	// Source: textbook: no field inside a conducting cylinder; outside it is the line field.
	if got := CylinderField(1e-9, 0.1, 0.05); got != 0 {
		t.Errorf("field inside the cylinder = %g, want 0", got)
	}
	near(t, "cylinder outside", CylinderField(1e-9, 0.1, 0.2), LineField(1e-9, 0.2), 1e-12)
	// Source: textbook: one-sided surface E = sigma/eps0, twice the isolated sheet.
	near(t, "one-sided", OneSidedField(sigma), 2*IsolatedSheetField(sigma), 1e-12)
	// derived: a strip (one side infinite) is the limit of the rectangle formula.
	near(t, "strip limit", RectangleAxisField(sigma, math.Inf(1), 0.3, 0.1), RectangleAxisField(sigma, 1e6, 0.3, 0.1), 1e-6)
}

func TestInverseDensities(t *testing.T) {
	e, z := 50e3, 0.1
	// derived: the inverses recover the density of the forward field models.
	sigma := 2e-6
	near(t, "free rectangle inverse", DensityFreeRectangle(RectangleAxisField(sigma, 0.5, 0.3, z), 0.5, 0.3, z), sigma, 1e-12)
	near(t, "infinite sheet inverse", DensityFreeRectangle(e, math.Inf(1), math.Inf(1), z), 2*Eps0*e, 1e-12)
	// derived: backed, epsr 3, z 0.1 m, t 0.1 mm: sigma = eps0 E (1 + 3000).
	near(t, "backed", DensityBacked(e, z, 1e-4, 3), Eps0*e*3001, 1e-12)
	// derived: over earth at h = z: sigma = 2 eps0 E.
	near(t, "over earth", DensityOverEarth(e, z, z), 2*Eps0*e, 1e-12)
	// derived: parallel plate: 1 kV on 1 mm epsr 2 -> 17.7 uC/m^2; 10 kV at 1 m over earth -> 88.5 nC/m^2.
	near(t, "potential backed", DensityFromPotentialBacked(1e3, 1e-3, 2), 17.708e-6, 1e-4)
	near(t, "potential over earth", DensityFromPotentialOverEarth(10e3, 1), 88.54e-9, 1e-4)
}

// coulombAxialField integrates Coulomb's law for the axial field component of a
// charge distribution, f giving the integrand over the source.
func legendre(f func(float64) float64, a, b float64, n int) float64 {
	return quad.Fixed(f, a, b, n, quad.Legendre{}, 0)
}

func TestFieldsAgainstCoulombIntegration(t *testing.T) {
	sigma, k := 1e-6, 1/(4*math.Pi*Eps0)
	// Disc of radius a: E_z = k sigma z ∫ 2 pi rho / (rho^2 + z^2)^1.5 drho.
	for _, c := range []struct{ a, z float64 }{{0.5, 0.1}, {0.2, 0.3}, {1, 1}} {
		num := k * sigma * c.z * legendre(func(r float64) float64 {
			return 2 * math.Pi * r / math.Pow(r*r+c.z*c.z, 1.5)
		}, 0, c.a, 100)
		// Source: numerical integration of Coulomb's law (gonum integrate/quad).
		near(t, "disc vs Coulomb", DiscAxisField(sigma, c.a, c.z), num, 1e-6)
	}
	// Rectangle of half-sides a, b: double integral over x and y.
	for _, c := range []struct{ a, b, z float64 }{{0.5, 0.3, 0.2}, {0.1, 0.1, 0.1}, {1, 0.2, 0.5}} {
		num := k * sigma * c.z * 4 * legendre(func(x float64) float64 {
			return legendre(func(y float64) float64 {
				return 1 / math.Pow(x*x+y*y+c.z*c.z, 1.5)
			}, 0, c.b, 60)
		}, 0, c.a, 60)
		// Source: numerical integration of Coulomb's law (gonum integrate/quad).
		near(t, "rectangle vs Coulomb", RectangleAxisField(sigma, c.a, c.b, c.z), num, 1e-6)
	}
	// Long line: integrate over |x| <= 1e4 r in decades; the truncation is 5e-9 relative.
	lambda, r := 1e-9, 0.01
	num := 0.0
	edges := []float64{0, r, 10 * r, 100 * r, 1000 * r, 1e4 * r}
	for i := 0; i+1 < len(edges); i++ {
		num += legendre(func(x float64) float64 { return r / math.Pow(r*r+x*x, 1.5) }, edges[i], edges[i+1], 60)
	}
	num *= 2 * k * lambda
	// Source: numerical integration of Coulomb's law (gonum integrate/quad).
	near(t, "line vs Coulomb", LineField(lambda, r), num, 1e-6)
}

func TestSurfaceResistivityAt(t *testing.T) {
	cases := []struct {
		name             string
		rho50, slope, rh float64
		want             float64
	}{
		// derived: one decade per 10 %RH from 1e12 at 50 %: 1e10 at 70 %, 1e14 at 30 %.
		{"wetter", 1e12, 1, 70, 1e10},
		{"drier", 1e12, 1, 30, 1e14},
		// derived: hydrophobic (slope 0) does not respond.
		{"hydrophobic", 1e14, 0, 90, 1e14},
		// derived: clipped at the floor 1e5 and the ceiling 1e16.
		{"floor", 1e9, 2, 90, 1e5},
		{"ceiling", 1e14, 2, 10, 1e16},
		// derived: a value already below the floor stays where it is.
		{"below floor", 1e3, 1, 90, 1e3},
		// Source: paper 1e9 -> 1e6 between 23 % and 61 % RH (about 0.8 decade per 10 %RH, weak secondary).
		{"paper", 1e9 * math.Pow(10, -0.8*2.7), 0.8, 23, 1e9},
		// derived: unknown RH leaves the 50 % value.
		{"unknown RH", 1e11, 1, math.NaN(), 1e11},
	}
	for _, c := range cases {
		near(t, c.name, SurfaceResistivityAt(c.rho50, c.slope, c.rh), c.want, 1e-9)
	}
}

func TestClassifyConductivity(t *testing.T) {
	lim := DefaultLimits()
	// Source: IEC TS 60079-32-1 via reference section 8: low <= 50 pS/m [C]; high > 1e4 pS/m [M].
	cases := []struct {
		kappa float64
		want  ConductivityClass
	}{
		{1e-12, ConductivityLow}, {50e-12, ConductivityLow}, {51e-12, ConductivityMedium},
		{1e4 * 1e-12, ConductivityMedium}, {2e4 * 1e-12, ConductivityHigh}, {math.NaN(), ConductivityUnknown},
	}
	for _, c := range cases {
		if got := ClassifyConductivity(c.kappa, lim); got != c.want {
			t.Errorf("ClassifyConductivity(%g) = %v, want %v", c.kappa, got, c.want)
		}
	}
	for c, want := range map[ConductivityClass]string{ConductivityLow: "low", ConductivityMedium: "medium", ConductivityHigh: "high", ConductivityUnknown: "unknown"} {
		if c.String() != want {
			t.Errorf("%d.String() = %q, want %q", c, c.String(), want)
		}
	}
}

func TestPropagatingBrushEnergy(t *testing.T) {
	// derived: 2.5e-4 C/m^2 on 0.1 m^2 of 0.1 mm film epsr 2.5: W = sigma^2 A t / (2 eps0 epsr).
	want := 2.5e-4 * 2.5e-4 * 0.1 * 1e-4 / (2 * 8.8541878128e-12 * 2.5)
	near(t, "propagating", PropagatingBrushEnergy(2.5e-4, 0.1, 1e-4, 2.5, 1), want, 1e-12)
	// derived: the bound applies: 1 m^2 of 5 mm film would store more than 1 J.
	near(t, "propagating bound", PropagatingBrushEnergy(2.5e-4, 1, 5e-3, 2.5, 1), 1, 1e-12)
}
