package model

import (
	"math"
	"strings"
	"testing"
)

func TestEveryReasonHasASentence(t *testing.T) {
	for r := ReasonNone + 1; r < numReasons; r++ {
		s := r.Text(1e3, 2e-3)
		if s == "" || s == "Unknown reason." || !strings.HasSuffix(s, ".") {
			t.Errorf("reason %d: %q", r, s)
		}
	}
	if numReasons.Text(0, 0) != "Unknown reason." || ReasonNone.Text(0, 0) != "" {
		t.Error("out-of-range reasons")
	}
	d := Discharge{Code: ReasonSparkPossible, A: 10e3, B: 5e-3}
	// derived: 10 kV on 100 pF is 5 mJ (reference 10.1).
	if got := d.Reason(); !strings.Contains(got, "10 kV") || !strings.Contains(got, "5 mJ") {
		t.Errorf("spark reason %q", got)
	}
}

func TestQuantity(t *testing.T) {
	cases := []struct {
		v    float64
		unit string
		want string
	}{
		// derived: engineering prefixes; units spelt as the audit spells them (Ω, µ, ², ³).
		{4e-3, "J", "4 mJ"}, {47.58e3, "V", "47.6 kV"}, {1e13, "ohm", "10 TΩ"}, {50e-12, "S/m", "50 pS/m"},
		{2.5e-4, "C/m^2", "250 µC/m²"}, {1e-3, "m", "1 mm"}, {2, "m", "2 m"}, {1e10, "ohm m", "1e+10 Ω·m"},
		{0.3, "m^3", "0.3 m³"}, {5e-6, "A", "5 µA"}, {1e-3, "A/m^2", "1 mA/m²"},
		{math.NaN(), "V", "unknown"}, {0, "V", "0 V"}, {1e-18, "C", "1e-18 C"}, {-300, "V", "-300 V"},
	}
	for _, c := range cases {
		if got := Quantity(c.v, c.unit); got != c.want {
			t.Errorf("Quantity(%g, %q) = %q, want %q", c.v, c.unit, got, c.want)
		}
	}
}

func TestBitTexts(t *testing.T) {
	all := func(n int) uint64 { return uint64(1)<<n - 1 }
	if got := len(Assumption(all(numAssumptions)).Texts()); got != numAssumptions {
		t.Errorf("assumption texts %d, want %d", got, numAssumptions)
	}
	if got := len(Flag(all(numFlags)).Texts()); got != numFlags {
		t.Errorf("flag texts %d, want %d", got, numFlags)
	}
	if got := len(Missing(all(numMissing)).Texts()); got != numMissing {
		t.Errorf("missing texts %d, want %d", got, numMissing)
	}
	if Assumption(0).Texts() != nil {
		t.Error("empty set has texts")
	}
	for _, s := range append(append(Assumption(all(numAssumptions)).Texts(), Flag(all(numFlags)).Texts()...), Missing(all(numMissing)).Texts()...) {
		if s == "" {
			t.Error("empty text")
		}
	}
	for m := CapNone; m <= CapTypical; m++ {
		if m.String() == "" {
			t.Errorf("CapModel %d has no name", m)
		}
	}
	for p := PotentialNone; p <= PotentialCharging; p++ {
		if p.String() == "" {
			t.Errorf("PotentialSource %d has no name", p)
		}
	}
}

func TestDefaultLimitsAndSources(t *testing.T) {
	l := DefaultLimits()
	// Source: reference section 5 [M] IEC 60079-0 7.4.2: 60, 25, 10 nC.
	near(t, "Q IIA", l.TransferredCharge[IIA], 60e-9, 1e-12)
	near(t, "Q IIC", l.TransferredCharge[IIC], 10e-9, 1e-12)
	// Source: reference section 5 [M] IEC 60079-0: Ga IIC 4 cm^2, Gb IIA 100 cm^2.
	near(t, "Ga IIC", l.AreaGa[IIC], 4e-4, 1e-12)
	near(t, "Gb IIA", l.AreaGb[IIA], 100e-4, 1e-12)
	// Source: TRGS 727 8.3 [C] 1e6 ohm; 7.2 1e8 ohm; Annex D 350 mJ.
	near(t, "conductor earthing", l.ConductorEarthing, 1e6, 1e-12)
	near(t, "person earthing", l.PersonEarthing, 1e8, 1e-12)
	near(t, "shock", l.ShockEnergy, 0.35, 1e-12)
	// Source: IEC 61340-4-4:2018 [C]: 1e8 ohm point to tab.
	near(t, "bag C", l.BagCToTab, 1e8, 1e-12)
	src := LimitSources()
	if len(src) < 40 {
		t.Errorf("only %d citations", len(src))
	}
	seen := map[string]bool{}
	for _, c := range src {
		if c.Source == "" || c.Unit == "" || math.IsNaN(c.Value) || seen[c.Limit] {
			t.Errorf("citation %+v incomplete or repeated", c)
		}
		seen[c.Limit] = true
	}
	if !seen["TransferredCharge[IIB]"] || !seen["BagCToTab"] {
		t.Error("citations lack expected limits")
	}
}

func TestTypicalCapacitance(t *testing.T) {
	// Source: Saito 1963 [C] range, default 200 pF [M]; small parts 10-20 pF [M]; 250-500 L container 50-300 pF [M].
	near(t, "person", TypicalCapacitance(Person), 200e-12, 1e-12)
	near(t, "part", TypicalCapacitance(Part), 20e-12, 1e-12)
	near(t, "bag", TypicalCapacitance(Bag), 300e-12, 1e-12)
	if !math.IsNaN(TypicalCapacitance(Sheet)) {
		t.Error("sheet has a typical capacitance")
	}
}
