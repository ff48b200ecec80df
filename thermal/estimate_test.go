package thermal

import (
	"errors"
	"math"
	"testing"

	"thzdrive/caution"
	"thzdrive/units"
)

// filmInputs is a film whose heating is known by hand (derived):
// u = F·A/d = 10 J/m^2 · 0.5 / 100 nm = 5e7 J/m^3, and with C = 2.5e6
// J/(m^3 K) the single-pulse rise is u/C = 20 K.
func filmInputs(t testing.TB) Inputs {
	return Inputs{
		FluenceJPerM2:    10,
		AbsorbedFraction: 0.5,
		Geometry:         Film,
		ThicknessM:       100e-9,
		HeatCapacity:     mustConstant(t, 2.5e6),
		BaseTemperatureK: 300,
	}
}

func codes(b Budget) []caution.Code {
	var out []caution.Code
	for _, c := range b.Cautions {
		out = append(out, c.Code)
	}
	return out
}

func hasCode(b Budget, code caution.Code) bool {
	for _, c := range b.Cautions {
		if c.Code == code {
			return true
		}
	}
	return false
}

// Temperatures and energies through Estimate, each case derived by hand from
// the formulas named beside it; tolerance 1e-12 relative unless stated.
func TestEstimateNumbers(t *testing.T) {
	laxIncropera := 0.45 / (2 * math.Sqrt(math.Pi) * 27 * 0.1e-3) // Lax (1977) with Incropera 4.16 inputs

	for _, tc := range []struct {
		name     string
		mutate   func(*Inputs)
		peakK    float64 // expected PeakTemperatureK
		steadyK  float64 // expected SteadyStateTemperatureK
		uJPerM3  float64 // expected PeakEnergyDensityJPerM3
		fluence  float64 // expected IncidentFluenceJPerM2
		absorbed float64 // expected AbsorbedFluenceJPerM2
	}{
		{
			name:   "film, constant C: u = F A/d, ΔT = u/C (derived)",
			mutate: func(*Inputs) {},
			peakK:  320, steadyK: 300, uJPerM3: 5e7, fluence: 10, absorbed: 5,
		},
		{
			name: "bulk by α: u(0) = F A α (Beer–Lambert, derived)",
			mutate: func(in *Inputs) {
				in.Geometry, in.ThicknessM, in.AbsorptionCoefficientPerM = Bulk, 0, 1e7
			},
			peakK: 320, steadyK: 300, uJPerM3: 5e7, fluence: 10, absorbed: 5,
		},
		{
			name: "bulk by depth δ = 1/α gives the same (derived)",
			mutate: func(in *Inputs) {
				in.Geometry, in.ThicknessM, in.AbsorptionDepthM = Bulk, 0, 100e-9
			},
			peakK: 320, steadyK: 300, uJPerM3: 5e7, fluence: 10, absorbed: 5,
		},
		{
			name: "optical pump: absorbed fluence and depth in, u = F_abs/δ (derived)",
			mutate: func(in *Inputs) {
				in.FluenceJPerM2, in.AbsorbedFraction, in.AbsorbedFluenceJPerM2 = 0, 0, 20
				in.Geometry, in.ThicknessM, in.AbsorptionDepthM = Bulk, 0, 20e-9
			},
			peakK: 300 + 1e9/2.5e6, steadyK: 300, uJPerM3: 1e9, fluence: 0, absorbed: 20,
		},
		{
			name: "fluence from pulse energy, F0 = 2W/(πw^2) (Gaussian beam, derived)",
			mutate: func(in *Inputs) {
				in.FluenceJPerM2, in.PulseEnergyJ, in.SpotRadiusM = 0, 1e-6, 100e-6
			},
			peakK:   300 + 2e-6/(math.Pi*1e-8)*0.5/100e-9/2.5e6,
			steadyK: 300, uJPerM3: 2e-6 / (math.Pi * 1e-8) * 0.5 / 100e-9,
			fluence: 2e-6 / (math.Pi * 1e-8), absorbed: 2e-6 / (math.Pi * 1e-8) * 0.5,
		},
		{
			name: "pulse train: P = W A f = 0.45 W, Lax rise with Incropera 4.16 inputs; pulse from the steady state",
			mutate: func(in *Inputs) {
				in.PulseEnergyJ, in.RepetitionRateHz = 9e-5, 1e4 // 9e-5 J × 0.5 × 1e4 Hz = 0.45 W
				in.SpotRadiusM, in.ConductivityWPerMK = math.Sqrt2*0.1e-3, 27
			},
			peakK: 300 + laxIncropera + 20, steadyK: 300 + laxIncropera, uJPerM3: 5e7, fluence: 10, absorbed: 5,
		},
	} {
		in := filmInputs(t)
		tc.mutate(&in)
		b, err := Estimate(in)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		for _, chk := range []struct {
			what      string
			got, want float64
		}{
			{"PeakTemperatureK", b.PeakTemperatureK, tc.peakK},
			{"SteadyStateTemperatureK", b.SteadyStateTemperatureK, tc.steadyK},
			{"PeakEnergyDensityJPerM3", b.PeakEnergyDensityJPerM3, tc.uJPerM3},
			{"IncidentFluenceJPerM2", b.IncidentFluenceJPerM2, tc.fluence},
			{"AbsorbedFluenceJPerM2", b.AbsorbedFluenceJPerM2, tc.absorbed},
			{"SinglePulseRiseK", b.SinglePulseRiseK, tc.peakK - tc.steadyK},
		} {
			if e := relErr(chk.got, chk.want); e > 1e-12 {
				t.Errorf("%s: %s = %.15g, want %.15g", tc.name, chk.what, chk.got, chk.want)
			}
		}
	}
}

// Energy bookkeeping through Estimate with a Debye C: the enthalpy from the
// steady state to the peak equals the deposited u within 1e-9 relative
// (the brief's round-trip tolerance), and the steady rise is the Lax value.
func TestEstimateDebyeBookkeeping(t *testing.T) {
	d := mustDebye(t, 343, 8.5e28)
	for _, base := range []float64{4, 10, 77, 300} {
		in := filmInputs(t)
		in.HeatCapacity = d
		in.BaseTemperatureK = base
		in.PulseEnergyJ, in.RepetitionRateHz, in.SpotRadiusM, in.ConductivityWPerMK = 1e-6, 1e3, 200e-6, 50
		b, err := Estimate(in)
		if err != nil {
			t.Fatal(err)
		}
		h, err := d.EnthalpyJPerM3(b.SteadyStateTemperatureK, b.PeakTemperatureK)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(h, b.PeakEnergyDensityJPerM3); e > 1e-9 {
			t.Errorf("base %g K: ∫C dT = %g, u = %g (rel err %.2g)", base, h, b.PeakEnergyDensityJPerM3, e)
		}
		wantRise := 1e-6 * 0.5 * 1e3 / (math.Sqrt(2*math.Pi) * 50 * 200e-6) // Lax (1977), a = w/√2
		if e := relErr(b.SteadyStateRiseK, wantRise); e > 1e-12 {
			t.Errorf("base %g K: steady rise %g, want %g", base, b.SteadyStateRiseK, wantRise)
		}
	}
}

// Properties: the peak rises with fluence; the steady state with repetition
// rate; a colder base heats more for the same u with Debye C.
func TestEstimateMonotone(t *testing.T) {
	d := mustDebye(t, 300, 6e28)
	prev := 0.0
	for f := 0.1; f < 1e4; f *= 1.6 {
		in := filmInputs(t)
		in.HeatCapacity, in.FluenceJPerM2 = d, f
		b, err := Estimate(in)
		if err != nil {
			t.Fatal(err)
		}
		if !(b.PeakTemperatureK > prev) {
			t.Fatalf("peak not increasing with fluence at %g J/m^2", f)
		}
		prev = b.PeakTemperatureK
	}
	prev = 0
	for rate := 1.0; rate < 1e8; rate *= 3 {
		in := filmInputs(t)
		in.PulseEnergyJ, in.SpotRadiusM, in.ConductivityWPerMK, in.RepetitionRateHz = 1e-6, 1e-4, 10, rate
		b, err := Estimate(in)
		if err != nil {
			t.Fatal(err)
		}
		if !(b.SteadyStateTemperatureK > prev) {
			t.Fatalf("steady state not increasing with rate at %g Hz", rate)
		}
		prev = b.SteadyStateTemperatureK
	}
	prevRise := math.Inf(1)
	for base := 2.0; base < 2000; base *= 2 {
		in := filmInputs(t)
		in.HeatCapacity, in.BaseTemperatureK = d, base
		b, err := Estimate(in)
		if err != nil {
			t.Fatal(err)
		}
		if !(b.SinglePulseRiseK < prevRise) {
			t.Fatalf("rise not decreasing with base at %g K", base)
		}
		prevRise = b.SinglePulseRiseK
	}
}

// The transition budget: margin, reduced temperatures and relaxation
// factors, derived from t = (T - Tc)/Tc and τ ∝ |t|^(-zν).
func TestEstimateTransitionBudget(t *testing.T) {
	// Base 360 K, peak 380 K (20 K rise), Tc = 400 K: t_base = -0.1,
	// t_peak = -0.05; default zν = 1 → factor 2; margin 20 K = 0.05 Tc.
	in := filmInputs(t)
	in.BaseTemperatureK, in.TransitionTemperatureK = 360, 400
	b, err := Estimate(in)
	if err != nil {
		t.Fatal(err)
	}
	for _, chk := range []struct {
		what      string
		got, want float64
	}{
		{"MarginK", b.MarginK, 20},
		{"MarginFractionOfTc", b.MarginFractionOfTc, 0.05},
		{"ReducedBase", b.ReducedBase, -0.1},
		{"ReducedPeak", b.ReducedPeak, -0.05},
		{"RelaxationFactorPeak", b.RelaxationFactorPeak, 2},
		{"RelaxationFactorSteadyState", b.RelaxationFactorSteadyState, 1},
		{"Inputs.ZNu (default)", b.Inputs.ZNu, ZNuMeanField},
	} {
		if e := relErr(chk.got, chk.want); e > 1e-12 {
			t.Errorf("%s = %.15g, want %.15g", chk.what, chk.got, chk.want)
		}
	}
	if !b.HasTransition || !b.RelaxationPeakDefined || !b.RelaxationSteadyStateDefined {
		t.Errorf("flags: %v %v %v", b.HasTransition, b.RelaxationPeakDefined, b.RelaxationSteadyStateDefined)
	}

	// Caller's zν = 1.28: factor 2^1.28 (derived).
	in.ZNu = 1.28
	b, _ = Estimate(in)
	if e := relErr(b.RelaxationFactorPeak, math.Pow(2, 1.28)); e > 1e-12 {
		t.Errorf("zν = 1.28: factor %g, want %g", b.RelaxationFactorPeak, math.Pow(2, 1.28))
	}

	// Peak exactly at Tc: the factor is undefined and reported as such.
	in = filmInputs(t)
	in.TransitionTemperatureK = 320
	b, _ = Estimate(in)
	if b.RelaxationPeakDefined || b.RelaxationFactorPeak != 0 {
		t.Errorf("peak at Tc: factor %g defined %v; want undefined, 0", b.RelaxationFactorPeak, b.RelaxationPeakDefined)
	}

	// No Tc: nothing assessed.
	b, _ = Estimate(filmInputs(t))
	if b.HasTransition || b.MarginK != 0 || b.ReducedPeak != 0 || b.RelaxationPeakDefined {
		t.Errorf("no Tc: %+v", b)
	}
}

// Cautions, each case's expectation derived from the film's 20 K rise from
// 300 K and the thresholds documented in Estimate.
func TestEstimateCautions(t *testing.T) {
	for _, tc := range []struct {
		name   string
		mutate func(*Inputs)
		want   []caution.Code
	}{
		{"no Tc, small rise, low fluence: none", func(*Inputs) {}, nil},
		{"pulse carries 300 K to 320 K past Tc = 310 K", func(in *Inputs) { in.TransitionTemperatureK = 310 },
			[]caution.Code{caution.CrossesTransition}},
		{"peak exactly at Tc counts as reaching it", func(in *Inputs) { in.TransitionTemperatureK = 320 },
			[]caution.Code{caution.CrossesTransition}},
		{"10 K below Tc = 330 K is 3 % < 5 %", func(in *Inputs) { in.TransitionTemperatureK = 330 },
			[]caution.Code{caution.SmallMargin}},
		{"25 K below Tc = 345 K is 7 % > 5 %", func(in *Inputs) { in.TransitionTemperatureK = 345 }, nil},
		{"caller's 10 % margin catches 25 K below 345 K", func(in *Inputs) {
			in.TransitionTemperatureK, in.MarginFraction = 345, 0.1
		}, []caution.Code{caution.SmallMargin}},
		{"base above Tc: heating moves away, nothing crossed", func(in *Inputs) { in.TransitionTemperatureK = 250 }, nil},
		{"base at Tc: already there, nothing crossed by heating", func(in *Inputs) { in.TransitionTemperatureK = 300 }, nil},
		{"20 K rise from 100 K is 20 % > 10 %", func(in *Inputs) { in.BaseTemperatureK = 100 },
			[]caution.Code{caution.HeatingLarge}},
		{"caller's 5 % threshold: 20 K of 300 K is 6.7 %", func(in *Inputs) { in.LargeRiseFraction = 0.05 },
			[]caution.Code{caution.HeatingLarge}},
		{"0.2 J/cm^2 on a metal (0.1 J/cm^2 rule)", func(in *Inputs) {
			in.FluenceJPerM2, in.AbsorbedFraction, in.ThicknessM = 0.2*units.JPerCm2, 0.01, 1e-3
			in.DamageClass = MetalOrSemiconductor
		}, []caution.Code{caution.OpticalDamage}},
		{"0.2 J/cm^2 with class unspecified uses the lowest rule", func(in *Inputs) {
			in.FluenceJPerM2, in.AbsorbedFraction, in.ThicknessM = 0.2*units.JPerCm2, 0.01, 1e-3
		}, []caution.Code{caution.OpticalDamage}},
		{"0.2 J/cm^2 on a dielectric (1 J/cm^2 rule): none", func(in *Inputs) {
			in.FluenceJPerM2, in.AbsorbedFraction, in.ThicknessM = 0.2*units.JPerCm2, 0.01, 1e-3
			in.DamageClass = Dielectric
		}, nil},
		{"caller's threshold below the fluence", func(in *Inputs) { in.DamageThresholdJPerM2 = 5 },
			[]caution.Code{caution.OpticalDamage}},
		{"absorbed fluence alone, above the threshold", func(in *Inputs) {
			in.FluenceJPerM2, in.AbsorbedFraction, in.AbsorbedFluenceJPerM2 = 0, 0, 0.15*units.JPerCm2
			in.ThicknessM = 1e-3
		}, []caution.Code{caution.OpticalDamage}},
		{"steady state alone past Tc, and a large rise", func(in *Inputs) {
			in.PulseEnergyJ, in.RepetitionRateHz = 9e-5, 1e4 // 0.45 W absorbed: 47 K (Incropera 4.16 inputs)
			in.SpotRadiusM, in.ConductivityWPerMK = math.Sqrt2*0.1e-3, 27
			in.TransitionTemperatureK = 340
		}, []caution.Code{caution.CrossesTransition, caution.HeatingLarge}},
	} {
		in := filmInputs(t)
		tc.mutate(&in)
		b, err := Estimate(in)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		got := codes(b)
		if len(got) != len(tc.want) {
			t.Errorf("%s: cautions %v, want %v", tc.name, got, tc.want)
			continue
		}
		for i := range got {
			if got[i] != tc.want[i] {
				t.Errorf("%s: cautions %v, want %v", tc.name, got, tc.want)
				break
			}
		}
		for _, c := range b.Cautions {
			if c.Message == "" || len(c.Values) == 0 {
				t.Errorf("%s: caution %v lacks a message or numbers", tc.name, c.Code)
			}
		}
	}
}

// Every caution value carries a unit suffix or names a dimensionless ratio
// (service.md: names carry units).
func TestCautionValueNames(t *testing.T) {
	in := filmInputs(t)
	in.BaseTemperatureK, in.TransitionTemperatureK = 100, 110
	in.FluenceJPerM2, in.ThicknessM = 1e4, 1e-4
	b, err := Estimate(in)
	if err != nil {
		t.Fatal(err)
	}
	if len(b.Cautions) < 3 {
		t.Fatalf("want damage, crossing and large-heating cautions, got %v", codes(b))
	}
	suffixes := []string{"_k", "_j_per_cm2", "_fraction"}
	for _, c := range b.Cautions {
		for _, v := range c.Values {
			ok := false
			for _, s := range suffixes {
				if len(v.Name) > len(s) && v.Name[len(v.Name)-len(s):] == s {
					ok = true
				}
			}
			if !ok {
				t.Errorf("caution %v value %q has no unit suffix", c.Code, v.Name)
			}
		}
	}
}

// Bad inputs: an *InputError naming the field, never a panic.
func TestEstimateInvalidInputs(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tab, err := NewTable([]float64{100, 200}, []float64{1e6, 1e6})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name   string
		mutate func(*Inputs)
		field  string
	}{
		{"NaN fluence", func(in *Inputs) { in.FluenceJPerM2 = nan }, "FluenceJPerM2"},
		{"negative fluence", func(in *Inputs) { in.FluenceJPerM2 = -1 }, "FluenceJPerM2"},
		{"Inf fraction", func(in *Inputs) { in.AbsorbedFraction = inf }, "AbsorbedFraction"},
		{"fraction above 1", func(in *Inputs) { in.AbsorbedFraction = 1.5 }, "AbsorbedFraction"},
		{"neither fraction nor absorbed fluence", func(in *Inputs) { in.AbsorbedFraction = 0 }, "AbsorbedFraction"},
		{"both fraction and absorbed fluence", func(in *Inputs) { in.AbsorbedFluenceJPerM2 = 1 }, "AbsorbedFluenceJPerM2"},
		{"absorbed above incident", func(in *Inputs) { in.AbsorbedFraction, in.AbsorbedFluenceJPerM2 = 0, 11 }, "AbsorbedFluenceJPerM2"},
		{"no fluence with fraction", func(in *Inputs) { in.FluenceJPerM2 = 0 }, "FluenceJPerM2"},
		{"pulse energy without spot", func(in *Inputs) { in.FluenceJPerM2, in.PulseEnergyJ = 0, 1e-6 }, "SpotRadiusM"},
		{"negative pulse energy", func(in *Inputs) { in.PulseEnergyJ = -1 }, "PulseEnergyJ"},
		{"NaN spot", func(in *Inputs) { in.SpotRadiusM = nan }, "SpotRadiusM"},
		{"negative rate", func(in *Inputs) { in.RepetitionRateHz = -1e3 }, "RepetitionRateHz"},
		{"rate without spot", func(in *Inputs) { in.RepetitionRateHz, in.ConductivityWPerMK = 1e3, 10 }, "SpotRadiusM"},
		{"rate without conductivity", func(in *Inputs) { in.RepetitionRateHz, in.SpotRadiusM, in.PulseEnergyJ = 1e3, 1e-4, 1e-6 }, "ConductivityWPerMK"},
		{"no geometry", func(in *Inputs) { in.Geometry = GeometryUnspecified }, "Geometry"},
		{"unknown geometry", func(in *Inputs) { in.Geometry = Geometry(7) }, "Geometry"},
		{"film without thickness", func(in *Inputs) { in.ThicknessM = 0 }, "ThicknessM"},
		{"film with α", func(in *Inputs) { in.AbsorptionCoefficientPerM = 1e6 }, "AbsorptionCoefficientPerM"},
		{"film with depth", func(in *Inputs) { in.AbsorptionDepthM = 1e-6 }, "AbsorptionDepthM"},
		{"bulk with thickness", func(in *Inputs) { in.Geometry, in.AbsorptionCoefficientPerM = Bulk, 1e6 }, "ThicknessM"},
		{"bulk without α or depth", func(in *Inputs) { in.Geometry, in.ThicknessM = Bulk, 0 }, "AbsorptionCoefficientPerM"},
		{"bulk with both α and depth", func(in *Inputs) {
			in.Geometry, in.ThicknessM, in.AbsorptionCoefficientPerM, in.AbsorptionDepthM = Bulk, 0, 1e6, 1e-6
		}, "AbsorptionDepthM"},
		{"Inf thickness", func(in *Inputs) { in.ThicknessM = inf }, "ThicknessM"},
		{"subnormal α", func(in *Inputs) { in.Geometry, in.ThicknessM, in.AbsorptionCoefficientPerM = Bulk, 0, 1e-320 }, "AbsorptionCoefficientPerM"},
		{"subnormal depth", func(in *Inputs) { in.Geometry, in.ThicknessM, in.AbsorptionDepthM = Bulk, 0, 1e-320 }, "AbsorptionDepthM"},
		{"no heat capacity", func(in *Inputs) { in.HeatCapacity = nil }, "HeatCapacity"},
		{"zero base", func(in *Inputs) { in.BaseTemperatureK = 0 }, "BaseTemperatureK"},
		{"NaN base", func(in *Inputs) { in.BaseTemperatureK = nan }, "BaseTemperatureK"},
		{"base outside the table", func(in *Inputs) { in.HeatCapacity = tab }, "BaseTemperatureK"},
		{"heats past the table", func(in *Inputs) { in.HeatCapacity, in.BaseTemperatureK, in.FluenceJPerM2 = tab, 150, 1e3 }, "HeatCapacity"},
		{"negative Tc", func(in *Inputs) { in.TransitionTemperatureK = -5 }, "TransitionTemperatureK"},
		{"NaN zν", func(in *Inputs) { in.ZNu = nan }, "ZNu"},
		{"margin 1", func(in *Inputs) { in.MarginFraction = 1 }, "MarginFraction"},
		{"negative large-rise fraction", func(in *Inputs) { in.LargeRiseFraction = -0.1 }, "LargeRiseFraction"},
		{"unknown damage class", func(in *Inputs) { in.DamageClass = MaterialClass(42) }, "DamageClass"},
		{"Inf damage threshold", func(in *Inputs) { in.DamageThresholdJPerM2 = inf }, "DamageThresholdJPerM2"},
		{"zero-value Debye model", func(in *Inputs) { in.HeatCapacity = Debye{} }, "BaseTemperatureK"},
		{"rise beyond float64", func(in *Inputs) {
			in.HeatCapacity = mustConstant(t, 1e-300)
			in.FluenceJPerM2, in.AbsorbedFraction, in.ThicknessM = 1e300, 1, 1e-9
		}, "FluenceJPerM2"},
	} {
		in := filmInputs(t)
		tc.mutate(&in)
		_, err := Estimate(in)
		var ie *InputError
		if !errors.As(err, &ie) || !errors.Is(err, ErrInvalidInput) {
			t.Errorf("%s: err = %v, want an *InputError", tc.name, err)
			continue
		}
		found := false
		for _, v := range ie.Violations {
			if v.Field == tc.field {
				found = true
			}
			if v.Reason == "" {
				t.Errorf("%s: violation of %s without a reason", tc.name, v.Field)
			}
		}
		if !found {
			t.Errorf("%s: violations %v do not name %s", tc.name, ie.Violations, tc.field)
		}
	}
}

// Several bad fields are reported together.
func TestEstimateReportsAllViolations(t *testing.T) {
	in := filmInputs(t)
	in.Geometry, in.HeatCapacity, in.BaseTemperatureK = GeometryUnspecified, nil, 0
	_, err := Estimate(in)
	var ie *InputError
	if !errors.As(err, &ie) || len(ie.Violations) < 3 {
		t.Fatalf("err = %v, want three violations", err)
	}
}
