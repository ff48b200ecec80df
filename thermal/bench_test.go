package thermal

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import "testing"

func benchInputs(b *testing.B) Inputs {
	return Inputs{
		FluenceJPerM2:          50,
		AbsorbedFraction:       0.3,
		PulseEnergyJ:           2e-6,
		SpotRadiusM:            150e-6,
		RepetitionRateHz:       1e3,
		Geometry:               Film,
		ThicknessM:             50e-9,
		HeatCapacity:           mustDebye(b, 343, 8.5e28),
		ConductivityWPerMK:     30,
		BaseTemperatureK:       10,
		TransitionTemperatureK: 120,
		ZNu:                    ZNuIsing3DModelA,
	}
}

func BenchmarkEstimateDebye(b *testing.B) {
	in := benchInputs(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Estimate(in); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkEstimateConstant(b *testing.B) {
	in := benchInputs(b)
	in.HeatCapacity = mustConstant(b, 3.4e6)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Estimate(in); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDebyeCapacity(b *testing.B) {
	d := mustDebye(b, 343, 8.5e28)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := d.CapacityJPerM3K(77); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFinalTemperatureDebye(b *testing.B) {
	d := mustDebye(b, 343, 8.5e28)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := FinalTemperatureK(d, 10, 3e8); err != nil {
			b.Fatal(err)
		}
	}
}
