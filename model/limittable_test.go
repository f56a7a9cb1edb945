package model

import (
	"math"
	"reflect"
	"strings"
	"testing"
)

// TestLimitTableCoversLimits: every float of Limits is set by some row of the
// limit table, except the array entries documented as no limit (NaN): the
// no-group transferred charge and areas, Group III areas, the unknown vessel
// class. Reflection is used here only, to check the table against the struct.
func TestLimitTableCoversLimits(t *testing.T) {
	var l Limits
	for _, s := range LimitTable() {
		s.set(&l, 1)
	}
	noLimit := map[string]bool{
		"TransferredCharge[0]": true,
		"AreaGa[0]":            true, "AreaGa[4]": true, "AreaGa[5]": true, "AreaGa[6]": true,
		"AreaGb[0]": true, "AreaGb[4]": true, "AreaGb[5]": true, "AreaGb[6]": true,
		"VesselVDLow[0]": true, "VesselVDHigh[0]": true, "VesselMaxVelocity[0]": true,
	}
	def := DefaultLimits()
	rv, dv := reflect.ValueOf(l), reflect.ValueOf(def)
	for i := 0; i < rv.NumField(); i++ {
		name := rv.Type().Field(i).Name
		f, d := rv.Field(i), dv.Field(i)
		check := func(key string, v, dflt float64) {
			if noLimit[key] {
				if v != 0 || !math.IsNaN(dflt) {
					t.Errorf("%s: no row should set it and its default should be NaN, got %g, %g", key, v, dflt)
				}
				return
			}
			if v != 1 {
				t.Errorf("%s: no row of the limit table sets it", key)
			}
			if math.IsNaN(dflt) || dflt <= 0 {
				t.Errorf("%s: default %g, want a positive value", key, dflt)
			}
		}
		switch f.Kind() {
		case reflect.Float64:
			check(name, f.Float(), d.Float())
		case reflect.Array:
			for j := 0; j < f.Len(); j++ {
				check(name+"["+string(rune('0'+j))+"]", f.Index(j).Float(), d.Index(j).Float())
			}
		default:
			t.Errorf("%s: a Limits field of kind %s", name, f.Kind())
		}
	}
}

// TestLimitTableRows: keys unique, every row cites a reference of the list by
// its key, carries a label and an SI unit, and a Site item has a practical
// unit exactly when the limit has a dimension.
func TestLimitTableRows(t *testing.T) {
	seen := map[string]bool{}
	for _, s := range LimitTable() {
		if seen[s.Key] {
			t.Errorf("%s: repeated", s.Key)
		}
		seen[s.Key] = true
		if s.Label == "" || s.Unit == "" {
			t.Errorf("%s: no label or unit", s.Key)
		}
		r, ok := ReferenceOf(s.Source())
		if !ok || r.Key != s.Ref {
			t.Errorf("%s: source %q does not start with its reference %q", s.Key, s.Source(), s.Ref)
		}
		if s.SiteItem != "" && (s.SiteUnit == "") != (s.Unit == "1") {
			t.Errorf("%s: Site unit %q for SI unit %q", s.Key, s.SiteUnit, s.Unit)
		}
		if s.SiteItem != strings.ToLower(s.SiteItem) {
			t.Errorf("%s: Site item %q not lower case", s.Key, s.SiteItem)
		}
		if strings.Contains(s.Source(), "reference section") {
			t.Errorf("%s: source %q points to no document a user has", s.Key, s.Source())
		}
	}
	keys := map[string]bool{}
	for _, r := range References() {
		if keys[r.Key] || r.Title == "" || r.Kind == "" {
			t.Errorf("reference %+v repeated or incomplete", r)
		}
		keys[r.Key] = true
	}
}

// TestSetLimitItem: a general item sets its family, a per-class or per-group
// item its own entry, an unknown item nothing.
func TestSetLimitItem(t *testing.T) {
	l := DefaultLimits()
	if !SetLimitItem(&l, "maximum filling velocity", 5) {
		t.Fatal("maximum filling velocity sets nothing")
	}
	for c := VesselRoadTanker; c < NumVesselClasses; c++ {
		if l.VesselMaxVelocity[c] != 5 {
			t.Errorf("velocity ceiling of %s: %g, want 5", c, l.VesselMaxVelocity[c])
		}
	}
	SetLimitItem(&l, "maximum filling velocity drum", 2)
	if l.VesselMaxVelocity[VesselDrum] != 2 || l.VesselMaxVelocity[VesselCan] != 5 {
		t.Errorf("per-class item: drum %g, can %g", l.VesselMaxVelocity[VesselDrum], l.VesselMaxVelocity[VesselCan])
	}
	SetLimitItem(&l, "transferred charge group iii", 100e-9)
	for _, g := range []Group{IIIA, IIIB, IIIC} {
		if l.TransferredCharge[g] != 100e-9 {
			t.Errorf("transferred charge %s: %g", g, l.TransferredCharge[g])
		}
	}
	if l.TransferredCharge[IIA] != 60e-9 { // Source: IEC 60079-0 7.4.2, 60 nC for IIA (from memory)
		t.Errorf("group iii item changed IIA: %g", l.TransferredCharge[IIA])
	}
	if SetLimitItem(&l, "no such limit", 1) {
		t.Error("an unknown item set a limit")
	}
	SetLimitItem(&l, "filling vd limit", 0.4)
	if l.VesselVDHigh[VesselRoadTanker] != 0.4 || l.VesselVDHigh[VesselDrum] != 0.5 {
		t.Errorf("general v d item: road tanker %g, drum %g", l.VesselVDHigh[VesselRoadTanker], l.VesselVDHigh[VesselDrum])
	}
}
