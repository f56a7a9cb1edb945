package book

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestUnitDisplay(t *testing.T) {
	tests := []struct {
		name string
		unit Unit
		si   float64
		want float64
	}{
		{"person capacitance", UnitPF, 200e-12, 200},      // Saito 1963: 200 pF typical body
		{"body potential", UnitKV, 10e3, 10},              // derived: 10 kV
		{"spark energy", UnitMJ, 5e-3, 5},                 // Source: electrostatics.md §10.1, 100 pF at 10 kV -> 5 mJ
		{"breakdown density", UnitUCPerM2, 2.65e-5, 26.5}, // Source: CCPS glossary, eps0 x 3 MV/m
		{"air breakdown", UnitKVPerM, 3e6, 3000},          // Source: AMS Glossary, about 3 MV/m
		{"group IIA charge", UnitNC, 60e-9, 60},           // from memory: IEC 60079-0, 60 nC for IIA
		{"walking current", UnitUA, 1e-6, 1},              // Source: Jonassen, about 1 uA walking
		{"IIC area", UnitCM2, 20e-4, 20},                  // from memory: IEC 60079-0, 20 cm^2 EPL Gb IIC
		{"low conductivity", UnitPSPerM, 50e-12, 50},      // Source: IEC TS 60079-32-1, 50 pS/m
		{"layer thickness", UnitMillimetre, 8e-3, 8},      // from memory: 8 mm propagating-brush bound
		{"q/m", UnitUCPerKg, 10e-6, 10},                   // derived: 10 uC/kg
		{"room temperature", UnitCelsius, 293.15, 20},     // derived: 293.15 K = 20 °C
		{"resistance", UnitOhm, 1e6, 1e6},                 // Source: TRGS 727 8.3, 1 Mohm
		{"shock energy", UnitMJ, 350e-3, 350},             // Source: TRGS 727 Annex D, 350 mJ
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, ok := tc.unit.Display(tc.si)
			if !ok || !scalar.EqualWithinRel(got, tc.want, 1e-12) {
				t.Errorf("%s: got %v (ok %v), want %v", tc.unit.Label(), got, ok, tc.want)
			}
		})
	}
}

func TestUnitUndefined(t *testing.T) {
	for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		if c := UnitKV.Cell(v); c != nil {
			t.Errorf("Cell(%v) = %v, want nil (empty cell)", v, c)
		}
		if s := UnitKV.Text(v); s != "–" {
			t.Errorf("Text(%v) = %q, want –", v, s)
		}
		if p := Finite(v); p != nil {
			t.Errorf("Finite(%v) = %v, want nil", v, *p)
		}
	}
	if c := UnitMJ.Cell(0); c != 0.0 {
		t.Errorf("a defined zero must stay 0, got %v", c)
	}
}

func TestFormatSig(t *testing.T) {
	tests := []struct {
		v    float64
		want string
	}{
		{0, "0"},
		{41.6666, "41.7"},   // derived: 10 mJ / 0.24 mJ
		{16.6666, "16.7"},   // derived: 4 mJ / 0.24 mJ
		{11.3288, "11.3"},   // derived: 113.288 mJ / 10 mJ
		{1.5625, "1.56"},    // derived: 0.375 mJ / 0.24 mJ
		{9.996, "10.0"},     // rounding carries into a new digit
		{0.0042, "0.00420"}, // three significant digits
		{2.65e-5, "2.65e-5"},
		{1.2e7, "1.20e7"},
		{-3.14159, "-3.14"},
		{math.NaN(), "–"},
		{123456, "123456"},
	}
	for _, tc := range tests {
		if got := FormatSig(tc.v, 3); got != tc.want {
			t.Errorf("FormatSig(%v, 3) = %q, want %q", tc.v, got, tc.want)
		}
	}
}

func TestHeaders(t *testing.T) {
	tests := []struct {
		u    Unit
		name string
		want string
	}{
		{UnitKV, "Potential", "Potential [kV]"},
		{UnitRatio, "Ratio E/MIE", "Ratio E/MIE [–]"},
		{UnitProbability, "P(incendive)", "P(incendive) [%]"},
		{UnitOhm, "Resistance to earth", "Resistance to earth [Ω]"},
	}
	for _, tc := range tests {
		if got := tc.u.Header(tc.name); got != tc.want {
			t.Errorf("Header = %q, want %q", got, tc.want)
		}
	}
	if got := UnitMJ.Text(10e-3); got != "10.0 mJ" { // derived: 200 pF at 10 kV
		t.Errorf("Text = %q, want 10.0 mJ", got)
	}
}

func TestEstFormat(t *testing.T) {
	if got, want := EstFormat("0.0"), `0.0" est."`; got != want {
		t.Errorf("estFormat = %q, want %q", got, want)
	}
	if got, want := EstFormat(fmtWide2), `[=0]0" est.";[<0.01]0.0E+00" est.";0.00" est."`; got != want {
		t.Errorf("estFormat = %q, want %q", got, want)
	}
}

func TestUnitDisplayExact(t *testing.T) {
	// Source: TRGS 727 Annex D, 350 mJ: the cell must hold 350 exactly, not 349.99999999999994.
	if v, _ := UnitMJ.Display(350e-3); v != 350 {
		t.Errorf("350e-3 J in mJ = %v, want exactly 350", v)
	}
}
