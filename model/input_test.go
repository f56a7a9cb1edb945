package model

import (
	"math"
	"reflect"
	"testing"
)

// TestNewInputNothingGiven: every float64 quantity of NewInput, and of its
// material, is NaN ("not given"), so that no field added later defaults to 0
// (a zero resistance would read as earthed, a zero capacitance as none).
func TestNewInputNothingGiven(t *testing.T) {
	in := NewInput(Person)
	if in.Kind != Person {
		t.Errorf("kind %v", in.Kind)
	}
	check := func(v reflect.Value, what string) {
		for i := 0; i < v.NumField(); i++ {
			f := v.Field(i)
			if f.Kind() == reflect.Float64 && !math.IsNaN(f.Float()) && v.Type().Field(i).Name != "HumiditySlope" {
				t.Errorf("%s.%s = %v, want NaN", what, v.Type().Field(i).Name, f.Float())
			}
		}
	}
	check(reflect.ValueOf(in), "Input")
	check(reflect.ValueOf(in.Material), "Material")
}
