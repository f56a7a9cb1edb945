package model

import (
	"strings"
	"testing"
)

func TestParseRoundTrip(t *testing.T) {
	for k := Sheet; k <= Bag; k++ {
		if got, err := ParseKind(" " + strings.ToUpper(k.String()) + " "); err != nil || got != k {
			t.Errorf("ParseKind(%q) = %v, %v", k.String(), got, err)
		}
	}
	for g := IIA; g <= IIIC; g++ {
		if got, err := ParseGroup(strings.ToLower(g.String())); err != nil || got != g {
			t.Errorf("ParseGroup(%q) = %v, %v", g.String(), got, err)
		}
	}
	for z := Zone0; z <= Zone22; z++ {
		if got, err := ParseZone(z.String()); err != nil || got != z {
			t.Errorf("ParseZone(%q) = %v, %v", z.String(), got, err)
		}
		if got, err := ParseZone("Zone " + z.String()); err != nil || got != z {
			t.Errorf("ParseZone(Zone %q) = %v, %v", z.String(), got, err)
		}
	}
	for a := Gas; a <= Hybrid; a++ {
		if got, err := ParseAtmosphereKind(a.String()); err != nil || got != a {
			t.Errorf("ParseAtmosphereKind(%q) = %v, %v", a.String(), got, err)
		}
	}
	for b := BagA; b <= BagD; b++ {
		if got, err := ParseBagType("type " + strings.ToLower(b.String())); err != nil || got != b {
			t.Errorf("ParseBagType(%q) = %v, %v", b.String(), got, err)
		}
	}
	for f := FillTop; f <= FillDipPipe; f++ {
		if got, err := ParseFilling(f.String()); err != nil || got != f {
			t.Errorf("ParseFilling(%q) = %v, %v", f.String(), got, err)
		}
	}
}

func TestParseBlanksAndAliases(t *testing.T) {
	if g, err := ParseGroup(" "); err != nil || g != GroupNone {
		t.Errorf("blank group: %v %v", g, err)
	}
	if z, err := ParseZone("none"); err != nil || z != ZoneNone {
		t.Errorf("zone none: %v %v", z, err)
	}
	if a, err := ParseAtmosphereKind("Vapor"); err != nil || a != Vapour {
		t.Errorf("vapor: %v %v", a, err)
	}
	if a, err := ParseAtmosphereKind(""); err != nil || a != NoAtmosphere {
		t.Errorf("blank atmosphere: %v %v", a, err)
	}
	if b, err := ParseBagType(""); err != nil || b != BagUnknown {
		t.Errorf("blank bag: %v %v", b, err)
	}
	if f, err := ParseFilling("Dip-Pipe"); err != nil || f != FillDipPipe {
		t.Errorf("dip-pipe: %v %v", f, err)
	}
	if f, err := ParseFilling(""); err != nil || f != FillUnknown {
		t.Errorf("blank filling: %v %v", f, err)
	}
}

func TestParseErrors(t *testing.T) {
	errs := []error{}
	_, e := ParseKind("drum")
	errs = append(errs, e)
	_, e = ParseGroup("IID")
	errs = append(errs, e)
	_, e = ParseZone("3")
	errs = append(errs, e)
	_, e = ParseAtmosphereKind("smoke")
	errs = append(errs, e)
	_, e = ParseBagType("E")
	errs = append(errs, e)
	_, e = ParseFilling("side")
	errs = append(errs, e)
	for i, e := range errs {
		if e == nil {
			t.Errorf("case %d: no error for unknown text", i)
		}
	}
}

func TestStringsOfUnknowns(t *testing.T) {
	cases := [][2]string{
		{KindUnknown.String(), "unknown"},
		{GroupNone.String(), "none"},
		{ZoneNone.String(), "none"},
		{NoAtmosphere.String(), "none"},
		{BagUnknown.String(), "unknown"},
		{FillUnknown.String(), "unknown"},
		{NoDischarge.String(), "none"},
		{DischargeType(99).String(), "unknown"},
		{PropagatingBrush.String(), "propagating_brush"},
		{CapModel(99).String(), "none"},
		{PotentialSource(99).String(), "none"},
		{(Spark).String() + Brush.String(), "sparkbrush"},
		{Corona.String() + "," + Cone.String(), "corona,cone"},
	}
	for _, c := range cases {
		if c[0] != c[1] {
			t.Errorf("got %q, want %q", c[0], c[1])
		}
	}
	if !IIIA.Dust() || IIA.Dust() || !Zone21.Dust() || !Zone1.Gas() || Zone21.Gas() {
		t.Error("Dust/Gas predicates wrong")
	}
}

func FuzzParseKind(f *testing.F) {
	for _, s := range []string{"sheet", " Bag ", "", "drum", "ROLLER"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		k, err := ParseKind(s)
		if err == nil && !strings.EqualFold(strings.TrimSpace(s), k.String()) {
			t.Errorf("ParseKind(%q) = %v without matching text", s, k)
		}
		if err != nil && k != KindUnknown {
			t.Errorf("ParseKind(%q) returned %v with an error", s, k)
		}
	})
}

func FuzzParseZone(f *testing.F) {
	for _, s := range []string{"0", "zone 21", "none", "", "x"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		z, err := ParseZone(s)
		if err != nil && z != ZoneNone {
			t.Errorf("ParseZone(%q) returned %v with an error", s, z)
		}
		if err == nil && z != ZoneNone {
			if back, err := ParseZone(z.String()); err != nil || back != z {
				t.Errorf("round trip of %v failed", z)
			}
		}
	})
}
