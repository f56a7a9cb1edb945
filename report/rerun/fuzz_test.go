package rerun

import (
	"errors"
	"testing"
)

// FuzzParseFlag: any flag argument either parses or gives a *ChangeError; applying
// it to a small survey never panics and never changes the input survey.
func FuzzParseFlag(f *testing.F) {
	for _, s := range []string{"DRUM=1e6", "station:ST-DRUM=1 MΩ", "55", "PAPER=60 %", "=", "a=b=c", "PTFE=PE", "DRUM=-0", "DRUM=1e999"} {
		f.Add("earth", s)
		f.Add("rh", s)
		f.Add("material", s)
	}
	base := goldenSurvey()
	f.Fuzz(func(t *testing.T, kind, arg string) {
		c, err := ParseFlag(kind, arg)
		if err != nil {
			var ce *ChangeError
			if !errors.As(err, &ce) {
				t.Fatalf("ParseFlag error %v is not a *ChangeError", err)
			}
			return
		}
		before := base.Objects[2].Resistance
		if _, err := Run(base, []Change{c}); err != nil {
			var ce *ChangeError
			if !errors.As(err, &ce) {
				t.Fatalf("Run error %v is not a *ChangeError", err)
			}
		}
		if base.Objects[2].Resistance != before || base.Site.RelativeHumidity.Value != 30 {
			t.Fatal("the input survey was modified")
		}
	})
}

// FuzzParseRange: a range parses to steps within 0-100 %, ascending, or to an error.
func FuzzParseRange(f *testing.F) {
	for _, s := range []string{"10:90:5", "55", "0:100:0.1", "90:10:5", "1e2:1e2:1", "::", "10:90:-1"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		steps, err := ParseRange(s)
		if err != nil {
			return
		}
		if len(steps) == 0 || len(steps) > 1001 {
			t.Fatalf("%q gave %d steps", s, len(steps))
		}
		for i, v := range steps {
			if v < 0 || v > 100+1e-6 || (i > 0 && v <= steps[i-1]) {
				t.Fatalf("%q gave steps %v", s, steps)
			}
		}
	})
}

// TestParseRangeDecimalComma: --rh reads numbers as a survey cell does
// ("55,5" is 55.5 %RH).
func TestParseRangeDecimalComma(t *testing.T) {
	steps, err := ParseRange("55,5")
	if err != nil || len(steps) != 1 || steps[0] != 55.5 {
		t.Errorf("ParseRange(55,5) = %v, %v; want [55.5]", steps, err)
	}
}
