package model_test

import (
	"fmt"
	"math"

	"github.com/sparkmargin/sparkmargin/model"
)

// A person of measured 100 pF at 10 kV in a IIA vapour zone (reference
// section 10.1 [C]: 5 mJ).
func ExampleEvaluate() {
	in := model.NewInput(model.Person) // every quantity not given
	in.SurfacePotential, in.Capacitance = 10e3, 100e-12
	env := model.Environment{RelativeHumidity: 35, Temperature: 293.15, Atmosphere: model.Vapour,
		Group: model.IIA, Zone: model.Zone1, MIE: 0.24e-3}
	ev := model.Evaluate(in, env, model.DefaultLimits())
	fmt.Println(ev.Effective, model.Quantity(ev.EffectiveEnergy, "J"))
	fmt.Println(ev.Discharges[model.Spark].Reason())
	for _, a := range ev.Assumed.Texts() {
		fmt.Println("assumed:", a)
	}
	// Output:
	// spark 5 mJ
	// An isolated conductor at 10 kV can spark with W = C V²/2 = 5 mJ.
	// assumed: resistance to earth not given: taken as not earthed (no leakage)
}

// Powder poured into an unearthed drum (derived: reference section 10.6).
func ExampleConductorPotential() {
	i := model.MassFlowCurrent(0.5, 10e-6) // 0.5 kg/s at 10 uC/kg
	v := model.ConductorPotential(i, 1e11, 100e-12, 1)
	fmt.Println(model.Quantity(v, "V"), model.Quantity(model.SparkEnergy(100e-12, v), "J"))
	// Output: 47.6 kV 113 mJ
}

func ExampleFillingVelocityLimit() {
	lim := model.DefaultLimits()
	// Toluene (about 1 pS/m, from memory) through a 100 mm line into a road tanker.
	// Source: IEC TS 60079-32-1 v d <= 0.38 m^2/s at or below 10 pS/m (reference section 8).
	fmt.Printf("%.1f m/s\n", model.FillingVelocityLimit(1e-12, 0.1, model.VesselRoadTanker, math.NaN(), &lim))
	// Output: 3.8 m/s
}

// Source: IEC 61340-4-4:2018 usage table (reference section 8b): only C and D with vapour.
func ExampleBagTypeAllowed() {
	lim := model.DefaultLimits()
	env := model.Environment{Atmosphere: model.Vapour, Group: model.IIA, Zone: model.Zone1}
	for _, t := range []model.BagType{model.BagB, model.BagC} {
		ok, code := model.BagTypeAllowed(t, env, 10e-3, lim)
		fmt.Println(t, ok, code.Text(0, 0))
	}
	// Output:
	// B false Only types C and D may be used with flammable gas or vapour (zones 1 and 2, groups IIA and IIB).
	// C true Type C may be used here only while earthed: tab to earth below 1 MΩ, every point to the tab below 100 MΩ.
}

// From memory (Glor's formula, reference section 10.7): D 1 m, d 1 mm -> 5.22 mJ.
func ExampleConeDischargeEnergy() {
	w, ok := model.ConeDischargeEnergy(1, 1e-3)
	fmt.Println(model.Quantity(w, "J"), ok)
	// Output: 5.22 mJ true
}

func ExampleRectangleAxisField() {
	// 10 uC/m^2 on a 1 m x 0.5 m sheet, read 0.1 m from its centre
	// (derived: 10 uC/m^2 / (pi eps0) x atan(0.125 / (0.1 x 0.5679)) = 411 kV/m).
	fmt.Println(model.Quantity(model.RectangleAxisField(10e-6, 0.5, 0.25, 0.1), "V/m"))
	// Output: 411 kV/m
}
