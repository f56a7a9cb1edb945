package assess

import (
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"math"
	"testing"
)

// TestBorderline: the flag worked out by hand from the rule (point verdict
// differs from the most likely sampled one, or the more severe verdicts
// together above 10 %; a screening choice of this tool).
func TestBorderline(t *testing.T) {
	for _, c := range []struct {
		name string
		v    Verdict
		p    Probability
		want bool
		alt  Verdict // Alternative, when borderline
	}{
		// 51 % marginal beats 49 % non-incendive: the most likely verdict differs.
		{"non-incendive, 51 % marginal", NonIncendive, Probability{Samples: 100, NonIncendive: 0.49, Marginal: 0.51}, true, Marginal},
		// Marginal is the most likely, but incendive's 48 % > 10 %.
		{"marginal, 48 % incendive", Marginal, Probability{Samples: 100, Marginal: 0.52, Incendive: 0.48}, true, Incendive},
		// 5 % marginal <= 10 %: not borderline.
		{"non-incendive, 5 % marginal", NonIncendive, Probability{Samples: 100, NonIncendive: 0.95, Marginal: 0.05}, false, 0},
		// Exactly 10 % is not above the threshold.
		{"non-incendive, 10 % marginal", NonIncendive, Probability{Samples: 100, NonIncendive: 0.90, Marginal: 0.10}, false, 0},
		// 6 % marginal + 5 % incendive = 11 % > 10 %; marginal the likelier of the two.
		{"non-incendive, 6 % + 5 %", NonIncendive, Probability{Samples: 100, NonIncendive: 0.89, Marginal: 0.06, Incendive: 0.05}, true, Marginal},
		// Incendive most likely, nothing more severe.
		{"incendive, 60 %", Incendive, Probability{Samples: 100, Incendive: 0.6, Marginal: 0.4}, false, 0},
		// Incendive at the point but marginal most likely (60 %): flagged, the alternative is marginal.
		{"incendive, 60 % marginal", Incendive, Probability{Samples: 100, Incendive: 0.4, Marginal: 0.6}, true, Marginal},
		// Not assessed: nothing was sampled.
		{"not assessed", NotAssessed, Probability{Samples: 100, NotAssessed: 1}, false, 0},
	} {
		p := c.p
		if got := p.Borderline(c.v); got != c.want {
			t.Errorf("%s: borderline %v, want %v", c.name, got, c.want)
		}
		if c.want {
			if got := p.Alternative(c.v); got != c.alt {
				t.Errorf("%s: alternative %v, want %v", c.name, got, c.alt)
			}
		}
	}
}

// TestRanks: average ranks for ties and the rank correlation, by hand.
func TestRanks(t *testing.T) {
	r, _ := ranks([]float64{3, 1, 2, 2}, nil, nil)
	want := []float64{4, 1, 2.5, 2.5} // 1 is first, the two 2s share ranks 2 and 3, 3 is fourth
	for i := range want {
		if r[i] != want[i] {
			t.Fatalf("ranks %v, want %v", r, want)
		}
	}
	// A monotone but non-linear relation has rank correlation 1; reversed, -1.
	x, _ := ranks([]float64{1, 2, 3, 4}, nil, nil)
	y, _ := ranks([]float64{1, 8, 27, 64}, nil, nil)
	if got := pearson(x, y); math.Abs(got-1) > 1e-12 {
		t.Errorf("rho %v, want 1", got)
	}
	z, _ := ranks([]float64{9, 4, 1, 0}, nil, nil)
	if got := pearson(x, z); math.Abs(got+1) > 1e-12 {
		t.Errorf("rho %v, want -1", got)
	}
}

// TestDriverOfBorderlineObjects: with sampling, every borderline object of
// the demo plant names the input that drives it and what measuring it
// settles, and no object that is not borderline carries a driver.
func TestDriverOfBorderlineObjects(t *testing.T) {
	a := Assess(demoSurvey(t), Options{Samples: 400, Seed: 3})
	borderline := 0
	for i := range a.Objects {
		r := &a.Objects[i]
		switch {
		case r.Borderline():
			borderline++
			if r.Probability.Driver.Input == "" || r.MeasureText() == "" {
				t.Errorf("%s: borderline without a driver (%+v)", r.Object.ID, r.Probability)
			}
			if c := r.Probability.Driver.Correlation; !(math.Abs(c) > 0 && math.Abs(c) <= 1) {
				t.Errorf("%s: correlation %v", r.Object.ID, c)
			}
		case r.Probability != nil && r.Probability.Driver.Input != "":
			t.Errorf("%s: a driver on an object not borderline", r.Object.ID)
		}
	}
	if borderline == 0 {
		t.Log("no borderline object in the demo at this seed")
	}
}

// TestDriverNearTheMIE: a conductor whose measured spark energy is just below
// the MIE is marginal at the point and incendive in a good share of the draws:
// borderline, and its driver is an input that moves the energy or the MIE.
// By hand: E = C V^2 / 2 = 100 pF x (2.1 kV)^2 / 2 = 0.2205 mJ, ratio 0.919 to
// toluene's 0.24 mJ (invented for the demo): between MIE / 10 and the MIE.
func TestDriverNearTheMIE(t *testing.T) {
	s := newSurvey([]inventory.Atmosphere{atmToluene}, []inventory.Station{{ID: "S", Atmosphere: "A-TOL"}},
		[]inventory.Object{{ID: "CAN", Station: "S", Kind: "part", Capacitance: known(100e-12), SurfacePotential: known(2.1e3), Resistance: known(1e12)}}, nil)
	a := Assess(s, Options{Samples: 2000, Seed: 5})
	r := &a.Objects[0]
	if r.Verdict != Marginal || r.Probability == nil {
		t.Fatalf("verdict %v, probability %+v; want marginal, sampled", r.Verdict, r.Probability)
	}
	if !r.Borderline() {
		t.Fatalf("not borderline: %+v", *r.Probability)
	}
	switch d := r.Probability.Driver; d.Input {
	case "capacitance", "surface potential", "MIE of the atmosphere":
	default:
		t.Errorf("driver %+v, want an input of the energy or the MIE", d)
	}
	if got := r.MeasureText(); !strings.Contains(got, "marginal or incendive") {
		t.Errorf("measure text %q", got)
	}
}
