package thermal

import (
	"math"
	"testing"

	"thzdrive/units"
)

// Dynamic scaling τ ∝ |t|^(-zν) (Hohenberg & Halperin 1977): the factor is
// (|t_from|/|t_to|)^(zν). Cases derived from that law; tolerance 1e-14
// relative (one exp and two logs).
func TestRelaxationFactor(t *testing.T) {
	for _, tc := range []struct {
		name           string
		from, to, zNu  float64
		want           float64
		sourceOrReason string
	}{
		{"halving |t| with zν = 1 doubles τ", -0.1, -0.05, 1, 2, "derived"},
		{"halving |t|, 3D Ising model A", -0.1, -0.05, ZNuIsing3DModelA, math.Pow(2, 2.03*0.630), "derived"},
		{"|t| from 0.2 to 0.02, 2D Ising", -0.2, -0.02, ZNuIsing2DModelA, math.Pow(10, 2.17), "derived"},
		{"moving away from Tc speeds up", -0.01, -0.04, 1, 0.25, "derived"},
		{"above Tc, only |t| matters", 0.3, 0.1, 1, 3, "derived"},
		{"across Tc, |t| compared", -0.1, 0.05, 1, 2, "derived (order of magnitude only; amplitudes differ)"},
		{"no change", -0.07, -0.07, 1.28, 1, "derived"},
	} {
		got, err := RelaxationFactor(tc.from, tc.to, tc.zNu)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if e := relErr(got, tc.want); e > 1e-14 {
			t.Errorf("%s (%s): got %.16g, want %.16g", tc.name, tc.sourceOrReason, got, tc.want)
		}
	}
}

// Property: the factor from a to b times the factor from b to a is 1
// (derived); tolerance 1e-14.
func TestRelaxationFactorInverse(t *testing.T) {
	for _, p := range [][2]float64{{-0.3, -0.01}, {0.2, 1e-4}, {-1e-5, 0.9}} {
		ab, _ := RelaxationFactor(p[0], p[1], 1.28)
		ba, _ := RelaxationFactor(p[1], p[0], 1.28)
		if e := relErr(ab*ba, 1); e > 1e-14 {
			t.Errorf("%v: %g × %g = %g", p, ab, ba, ab*ba)
		}
	}
}

// The exponents physics.md §6 quotes (from memory there and here): 3D Ising
// model A z ≈ 2.03, ν ≈ 0.630 → zν ≈ 1.28; 2D Ising ≈ 2.17; mean field 1.
// Tolerance: half a unit of the quoted last digit.
func TestZNuConstants(t *testing.T) {
	for _, tc := range []struct {
		name      string
		got, want float64
		tol       float64
	}{
		{"3D Ising model A", ZNuIsing3DModelA, 1.28, 0.005}, // physics.md §6
		{"2D Ising model A", ZNuIsing2DModelA, 2.17, 0.005}, // physics.md §6
		{"mean field", ZNuMeanField, 1, 0},                  // physics.md §6 (z = 2, ν = 1/2)
	} {
		if math.Abs(tc.got-tc.want) > tc.tol {
			t.Errorf("%s: zν = %g, want %g ± %g", tc.name, tc.got, tc.want, tc.tol)
		}
	}
}

func TestRelaxationFactorErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, tc := range []struct {
		name          string
		from, to, zNu float64
	}{
		{"at Tc (to)", -0.1, 0, 1},
		{"at Tc (from)", 0, -0.1, 1},
		{"zero zν", -0.1, -0.05, 0},
		{"negative zν", -0.1, -0.05, -1},
		{"NaN zν", -0.1, -0.05, nan},
		{"Inf zν", -0.1, -0.05, inf},
		{"NaN t", nan, -0.05, 1},
		{"Inf t", -0.1, inf, 1},
		{"overflow", 1, 1e-300, 5},
	} {
		if _, err := RelaxationFactor(tc.from, tc.to, tc.zNu); err == nil {
			t.Errorf("%s: want an error", tc.name)
		}
	}
}

// t = (T - Tc)/Tc (physics.md §6, definition); cases derived.
func TestReducedTemperature(t *testing.T) {
	for _, tc := range []struct{ tK, tcK, want float64 }{
		{50, 100, -0.5}, {100, 100, 0}, {150, 100, 0.5}, {0, 80, -1},
	} {
		got, err := ReducedTemperature(tc.tK, tc.tcK)
		if err != nil || got != tc.want {
			t.Errorf("t(%g K, Tc %g K) = %g, %v; want %g", tc.tK, tc.tcK, got, err, tc.want)
		}
	}
	for _, bad := range [][2]float64{{-1, 100}, {10, 0}, {math.NaN(), 10}, {10, math.Inf(1)}} {
		if _, err := ReducedTemperature(bad[0], bad[1]); err == nil {
			t.Errorf("ReducedTemperature(%g, %g): want an error", bad[0], bad[1])
		}
	}
}

// Rules of thumb of physics.md §8 (from memory/secondary there): dielectrics
// ~1–3 J/cm^2, metals and semiconductors ~0.1–0.3 J/cm^2; the package uses
// the low end. Exact in float64 after the unit conversion.
func TestDamageThresholds(t *testing.T) {
	for _, tc := range []struct {
		class MaterialClass
		want  float64
	}{
		{Dielectric, 1 * units.JPerCm2},             // physics.md §8, low end of 1–3 J/cm^2
		{MetalOrSemiconductor, 0.1 * units.JPerCm2}, // physics.md §8, low end of 0.1–0.3 J/cm^2
		{ClassUnspecified, 0.1 * units.JPerCm2},     // lowest rule, by this package's choice
	} {
		got, err := DamageThresholdJPerM2(tc.class)
		if err != nil || got != tc.want {
			t.Errorf("%v: %g J/m^2, %v; want %g", tc.class, got, err, tc.want)
		}
	}
	if _, err := DamageThresholdJPerM2(MaterialClass(99)); err == nil {
		t.Error("unknown class: want an error")
	}
}
