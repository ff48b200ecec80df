package thermal

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"errors"
	"math"
	"reflect"
	"testing"
)

// FuzzEstimate: for any inputs, Estimate returns either an *InputError that
// names a field, or a Budget whose every number is finite and whose
// temperatures are ordered base <= steady state <= peak. It never panics.
//
//	go test -fuzz FuzzEstimate ./thermal/
func FuzzEstimate(f *testing.F) {
	// Seeds: the film of the tests, a Debye pulse train, a table, and
	// boundary values.
	f.Add(10.0, 0.5, 0.0, 0.0, 0.0, 0.0, uint8(1), 100e-9, 0.0, 0.0, uint8(0), 2.5e6, 0.0, 300.0, 0.0, 0.0, 0.0, 0.0, 0.0, uint8(0), 0.0)
	f.Add(0.0, 0.3, 0.0, 1e-6, 1e-4, 1e3, uint8(2), 0.0, 1e7, 0.0, uint8(1), 343.0, 8.5e28, 10.0, 40.0, 1.28, 20.0, 0.05, 0.1, uint8(2), 0.0)
	f.Add(0.0, 0.0, 20.0, 0.0, 0.0, 0.0, uint8(2), 0.0, 0.0, 20e-9, uint8(2), 0.0, 0.0, 150.0, 160.0, 0.0, 0.0, 0.0, 0.0, uint8(1), 1e4)
	f.Add(1e300, 1.0, 0.0, 1e300, 1e-300, 1e300, uint8(1), 1e-300, 0.0, 0.0, uint8(1), 1e-300, 1e-300, 1e-300, 1e300, 1e300, 1e-300, 0.99, 1e-300, uint8(9), 1e300)
	f.Add(math.NaN(), math.Inf(1), -1.0, 0.0, 0.0, 0.0, uint8(0), 0.0, 0.0, 0.0, uint8(3), 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, uint8(0), 0.0)
	f.Fuzz(func(t *testing.T, fluence, fraction, absorbed, energy, spot, rate float64, geometry uint8,
		thickness, alpha, depth float64, model uint8, p1, p2, base, tc, zNu, kappa, margin, large float64,
		class uint8, threshold float64) {
		var hc HeatCapacity
		switch model % 4 {
		case 0:
			if c, err := NewConstant(p1); err == nil {
				hc = c
			}
		case 1:
			if d, err := NewDebye(p1, p2); err == nil {
				hc = d
			}
		case 2:
			if tab, err := NewTable([]float64{1, 50, 150, 155, 400}, []float64{1e3, 8e5, 2e6, 4e6, 2.5e6}); err == nil {
				hc = tab
			}
		}
		in := Inputs{
			FluenceJPerM2: fluence, AbsorbedFraction: fraction, AbsorbedFluenceJPerM2: absorbed,
			PulseEnergyJ: energy, SpotRadiusM: spot, RepetitionRateHz: rate,
			Geometry: Geometry(geometry % 4), ThicknessM: thickness, AbsorptionCoefficientPerM: alpha,
			AbsorptionDepthM: depth, HeatCapacity: hc, ConductivityWPerMK: kappa,
			BaseTemperatureK: base, TransitionTemperatureK: tc, ZNu: zNu, MarginFraction: margin,
			LargeRiseFraction: large, DamageClass: MaterialClass(class % 4), DamageThresholdJPerM2: threshold,
		}
		b, err := Estimate(in)
		if err != nil {
			var ie *InputError
			if !errors.As(err, &ie) || len(ie.Violations) == 0 {
				t.Fatalf("error is not an *InputError with violations: %v", err)
			}
			for _, v := range ie.Violations {
				if v.Field == "" || v.Reason == "" {
					t.Fatalf("violation without field or reason: %+v", v)
				}
			}
			return
		}
		if name, ok := nonFiniteField(reflect.ValueOf(b), "Budget"); !ok {
			t.Fatalf("non-finite %s in %+v", name, b)
		}
		if !temperaturesOrdered(b) {
			t.Fatalf("temperatures out of order: base %g, steady %g, peak %g",
				b.Inputs.BaseTemperatureK, b.SteadyStateTemperatureK, b.PeakTemperatureK)
		}
	})
}

// temperaturesOrdered reports base <= steady state <= peak.
func temperaturesOrdered(b Budget) bool {
	return b.Inputs.BaseTemperatureK <= b.SteadyStateTemperatureK && b.SteadyStateTemperatureK <= b.PeakTemperatureK
}

// nonFiniteField walks v and returns the path of the first NaN or Inf
// float64 it finds, skipping interface values (the heat-capacity model).
func nonFiniteField(v reflect.Value, path string) (string, bool) {
	switch v.Kind() {
	case reflect.Float64:
		if math.IsNaN(v.Float()) || math.IsInf(v.Float(), 0) {
			return path, false
		}
	case reflect.Struct:
		for i := 0; i < v.NumField(); i++ {
			if name, ok := nonFiniteField(v.Field(i), path+"."+v.Type().Field(i).Name); !ok {
				return name, false
			}
		}
	case reflect.Slice:
		for i := 0; i < v.Len(); i++ {
			if name, ok := nonFiniteField(v.Index(i), path+"[]"); !ok {
				return name, false
			}
		}
	}
	return "", true
}
