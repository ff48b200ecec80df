package server

import (
	"math"
	"testing"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

func constantCapacity(jPerCm3K float64) *thzdrivev1.HeatCapacityModel {
	return &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_ConstantJPerCm3K{ConstantJPerCm3K: jPerCm3K}}
}

// TestEstimateHeatingConstantCapacity: with a constant heat capacity one
// pulse raises the temperature by exactly u/C (∫C dT = u), where u is the
// absorbed energy density at the hottest point: F·A/d uniform over a film,
// F·A·α at the surface of a bulk sample (physics.md §6, Beer–Lambert), and
// F = 2W/(πw²) when the fluence comes from pulse energy and spot
// (physics.md §3). All derived; the service does the same few
// multiplications and one root solve (to 1e-13), so 1e-12 relative.
func TestEstimateHeatingConstantCapacity(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	film := thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM
	bulk := thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK
	fromSpot := 2 * 5.0 / (math.Pi * 0.02 * 0.02) // uJ/cm², W = 5 uJ, w = 200 um = 0.02 cm
	cases := []struct {
		name  string
		req   *thzdrivev1.EstimateHeatingRequest
		u     float64 // J/cm³, derived
		capJ  float64 // J/(cm³ K)
		fluen float64 // incident fluence, uJ/cm²
	}{
		{"film", &thzdrivev1.EstimateHeatingRequest{IncidentFluenceUjPerCm2: 1000, AbsorbedFraction: 0.5, Geometry: film, ThicknessUm: 0.1},
			1000e-6 * 0.5 / 0.1e-4, 2, 1000},
		{"film from energy and spot", &thzdrivev1.EstimateHeatingRequest{PulseEnergyUj: 5, SpotRadiusUm: 200, AbsorbedFraction: 0.2, Geometry: film, ThicknessUm: 2},
			fromSpot * 1e-6 * 0.2 / 2e-4, 1.7, fromSpot},
		{"film, absorbed fluence given", &thzdrivev1.EstimateHeatingRequest{AbsorbedFluenceUjPerCm2: 300, Geometry: film, ThicknessUm: 0.05},
			300e-6 / 0.05e-4, 2.5, 0},
		{"bulk by coefficient", &thzdrivev1.EstimateHeatingRequest{IncidentFluenceUjPerCm2: 1000, AbsorbedFraction: 0.7, Geometry: bulk, AbsorptionCoefficientPerCm: 1e4},
			1000e-6 * 0.7 * 1e4, 1.5, 1000},
		{"bulk by depth", &thzdrivev1.EstimateHeatingRequest{IncidentFluenceUjPerCm2: 400, AbsorbedFraction: 0.3, Geometry: bulk, AbsorptionDepthUm: 2},
			400e-6 * 0.3 / 2e-4, 0.9, 400},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tc.req.HeatCapacity = constantCapacity(tc.capJ)
			tc.req.BaseTemperatureK = 10
			resp, err := c.EstimateHeating(ctxTimeout(t), tc.req)
			if err != nil {
				t.Fatal(err)
			}
			b := resp.Budget
			if e := relErr(b.PeakEnergyDensityJPerCm3, tc.u); e > 1e-12 {
				t.Errorf("energy density %.15g J/cm³, want %.15g", b.PeakEnergyDensityJPerCm3, tc.u)
			}
			if e := relErr(b.SinglePulseRiseK, tc.u/tc.capJ); e > 1e-12 {
				t.Errorf("rise %.15g K, want u/C = %.15g K", b.SinglePulseRiseK, tc.u/tc.capJ)
			}
			if e := relErr(b.PeakTemperatureK, 10+tc.u/tc.capJ); e > 1e-12 {
				t.Errorf("peak %.15g K, want base + u/C = %.15g K", b.PeakTemperatureK, 10+tc.u/tc.capJ)
			}
			if b.SteadyStateRiseK != 0 || b.SteadyStateTemperatureK != 10 {
				t.Errorf("single shot, yet steady rise %g K, steady temperature %g K", b.SteadyStateRiseK, b.SteadyStateTemperatureK)
			}
			if tc.fluen > 0 && relErr(b.IncidentFluenceUjPerCm2, tc.fluen) > 1e-12 {
				t.Errorf("incident fluence %.15g uJ/cm², want %.15g", b.IncidentFluenceUjPerCm2, tc.fluen)
			}
		})
	}
}

// TestEstimateHeatingLax: the steady-state rise at the centre of a Gaussian
// spot on a half-space is P/(2√π κ a), a the 1/e intensity radius (Lax,
// J. Appl. Phys. 48, 3919 (1977)). Worked example, Incropera et al.,
// Fundamentals of Heat and Mass Transfer, problem 4.16: 0.45 W absorbed,
// a = 0.1 mm, κ = 27 W/(m K) -> 47.0158 K by the formula; the book prints
// 47.1 K, having rounded on the way (so 0.1 K against the book, 1e-12
// against the formula). The request gives the 1/e² radius w = a·√2 and
// 0.45 W as 4.5 uJ × 0.1 absorbed × 1 MHz.
func TestEstimateHeatingLax(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	const aM, kappa, p = 0.1e-3, 27.0, 0.45
	resp, err := c.EstimateHeating(ctxTimeout(t), &thzdrivev1.EstimateHeatingRequest{
		PulseEnergyUj: 4.5, AbsorbedFraction: 0.1, RepetitionRateKhz: 1000,
		SpotRadiusUm: aM * math.Sqrt2 * 1e6, ThermalConductivityWPerMK: kappa,
		Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM, ThicknessUm: 1,
		HeatCapacity: constantCapacity(2), BaseTemperatureK: 295,
	})
	if err != nil {
		t.Fatal(err)
	}
	b := resp.Budget
	if e := relErr(b.AbsorbedPowerMw, p*1e3); e > 1e-12 {
		t.Errorf("absorbed power %.15g mW, want W·A·f = 450 mW", b.AbsorbedPowerMw)
	}
	want := p / (2 * math.Sqrt(math.Pi) * kappa * aM)
	if e := relErr(b.SteadyStateRiseK, want); e > 1e-12 {
		t.Errorf("steady-state rise %.15g K, want P/(2√π κ a) = %.15g K", b.SteadyStateRiseK, want)
	}
	if math.Abs(b.SteadyStateRiseK-47.1) > 0.1 {
		t.Errorf("steady-state rise %.4f K, Incropera et al. problem 4.16 gives 47.1 K", b.SteadyStateRiseK)
	}
	if e := relErr(b.SteadyStateTemperatureK, 295+want); e > 1e-12 {
		t.Errorf("steady-state temperature %.12g K, want 295 K + rise", b.SteadyStateTemperatureK)
	}
	// Each pulse starts from the steady state (thermal.Estimate's stated
	// convention): peak = steady state + u/C.
	u := 2 * 4.5 / (math.Pi * (aM * math.Sqrt2 * 100) * (aM * math.Sqrt2 * 100)) * 1e-6 * 0.1 / 1e-4 // J/cm³
	if e := relErr(b.PeakTemperatureK, 295+want+u/2); e > 1e-12 {
		t.Errorf("peak %.12g K, want steady state + u/C = %.12g K", b.PeakTemperatureK, 295+want+u/2)
	}
}

// TestEstimateHeatingTransition: the budget around Tc (physics.md §6):
// margin Tc - T_peak, reduced temperatures (T - Tc)/Tc, the relaxation-time
// factor (|t_peak|/|t_base|)^(-zν) of dynamic scaling (Hohenberg & Halperin,
// Rev. Mod. Phys. 49, 435 (1977)), CROSSES_TRANSITION when the pump carries
// the spot from below Tc to Tc or above, SMALL_MARGIN when it stops within
// the margin fraction (5 % of Tc by default) below Tc, and neither when the
// base is already above Tc. One pulse heats by u/C = 25 K (50 J/cm³ on
// 2 J/(cm³ K), derived as in TestEstimateHeatingConstantCapacity). 1e-12.
func TestEstimateHeatingTransition(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	const rise = 25.0
	crosses := thzdrivev1.CautionCode_CAUTION_CODE_CROSSES_TRANSITION
	small := thzdrivev1.CautionCode_CAUTION_CODE_SMALL_MARGIN
	cases := []struct {
		name     string
		base, tc float64
		zNu      float64
		want     thzdrivev1.CautionCode // 0: neither caution
	}{
		{"crosses", 10, 30, 0, crosses},
		{"small margin", 10, 36, 1.28, small}, // peak 35 K, 1 K below, inside 1.8 K
		{"comfortable, 3D Ising", 10, 100, 1.28, 0},
		{"above Tc already", 40, 30, 2.17, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			resp, err := c.EstimateHeating(ctxTimeout(t), &thzdrivev1.EstimateHeatingRequest{
				IncidentFluenceUjPerCm2: 1000, AbsorbedFraction: 0.5, Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM, ThicknessUm: 0.1,
				HeatCapacity: constantCapacity(2), BaseTemperatureK: tc.base, TransitionTemperatureK: tc.tc, ZNu: tc.zNu,
			})
			if err != nil {
				t.Fatal(err)
			}
			b := resp.Budget
			peak := tc.base + rise
			checks := []struct {
				what      string
				got, want float64
			}{
				{"margin_k", b.MarginK, tc.tc - peak},
				{"margin_fraction_of_tc", b.MarginFractionOfTc, (tc.tc - peak) / tc.tc},
				{"reduced_temperature_base", b.ReducedTemperatureBase, (tc.base - tc.tc) / tc.tc},
				{"reduced_temperature_peak", b.ReducedTemperaturePeak, (peak - tc.tc) / tc.tc},
			}
			zNu := tc.zNu
			if zNu == 0 {
				zNu = 1 // mean field, the documented default
			}
			if (peak-tc.tc)*(tc.base-tc.tc) > 0 { // same side of Tc: the factor is defined
				f := math.Pow(math.Abs(peak-tc.tc)/math.Abs(tc.base-tc.tc), -zNu)
				checks = append(checks, struct {
					what      string
					got, want float64
				}{"relaxation_factor_peak", b.RelaxationFactorPeak, f})
			}
			for _, ch := range checks {
				if math.Abs(ch.got-ch.want) > 1e-12*math.Max(1, math.Abs(ch.want)) {
					t.Errorf("%s = %.15g, want %.15g", ch.what, ch.got, ch.want)
				}
			}
			if resp.Resolved.ZNu != zNu {
				t.Errorf("resolved z_nu %g, want %g", resp.Resolved.ZNu, zNu)
			}
			gotCrosses := findCaution(resp.Cautions, crosses) != nil
			gotSmall := findCaution(resp.Cautions, small) != nil
			if gotCrosses != (tc.want == crosses) || gotSmall != (tc.want == small) {
				t.Errorf("CROSSES_TRANSITION %v, SMALL_MARGIN %v; want %v", gotCrosses, gotSmall, tc.want)
			}
		})
	}
	// The steady state alone carries the spot across: 0.45 W on a = 0.1 mm
	// of κ = 27 W/(m K) gives 47 K (the Lax example above) from a 10 K base,
	// past Tc = 40 K, while one pulse adds little.
	resp, err := c.EstimateHeating(ctxTimeout(t), &thzdrivev1.EstimateHeatingRequest{
		PulseEnergyUj: 4.5, AbsorbedFraction: 0.1, RepetitionRateKhz: 1000,
		SpotRadiusUm: 0.1e-3 * math.Sqrt2 * 1e6, ThermalConductivityWPerMK: 27,
		Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM, ThicknessUm: 1,
		HeatCapacity: constantCapacity(2), BaseTemperatureK: 10, TransitionTemperatureK: 40,
	})
	if err != nil {
		t.Fatal(err)
	}
	if resp.Budget.SteadyStateTemperatureK < 40 || findCaution(resp.Cautions, crosses) == nil {
		t.Errorf("steady state %.3g K past Tc = 40 K, cautions %v: want CROSSES_TRANSITION", resp.Budget.SteadyStateTemperatureK, resp.Cautions)
	}
}

// TestEstimateHeatingDebye: at T = Θ the Debye heat capacity is
// 3nkB·0.95173214 (physics.md §6 table, C/(3nkB) at Θ/T = 1). A pulse that
// deposits a tiny u there heats by u/C(Θ) to first order; the second-order
// error, ½·(dC/dT)·ΔT/C, is below 1e-6 for ΔT ≈ 1 mK (derived), which is
// the tolerance. n = 44.2 nm⁻³ (GaAs, the example in thermal.proto) and
// Θ = 345 K are inputs only.
func TestEstimateHeatingDebye(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	const n, theta = 44.2e27, 345.0 // m⁻³, K
	const kB = 1.380649e-23         // J/K, CODATA 2018 (exact)
	capJPerCm3K := 3 * n * kB * 0.95173214 * 1e-6
	u := 1e-3 * capJPerCm3K // J/cm³: a 1 mK rise
	resp, err := c.EstimateHeating(ctxTimeout(t), &thzdrivev1.EstimateHeatingRequest{
		AbsorbedFluenceUjPerCm2: u * 1e-4 * 1e6, // u·d with d = 1 um = 1e-4 cm, in uJ/cm²
		Geometry:                thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM, ThicknessUm: 1,
		HeatCapacity:     &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_Debye{Debye: &thzdrivev1.DebyeModel{DebyeTemperatureK: theta, AtomsPerNm3: 44.2}}},
		BaseTemperatureK: theta,
	})
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(resp.Budget.SinglePulseRiseK, 1e-3); e > 1e-6 {
		t.Errorf("rise %.9g K at T = Θ, want u/C(Θ) = 1 mK within 1e-6 (rel err %.2g)", resp.Budget.SinglePulseRiseK, e)
	}
}

// TestEstimateHeatingBadRequests: wrong or missing heating inputs are
// INVALID_ARGUMENT naming the wire field.
func TestEstimateHeatingBadRequests(t *testing.T) {
	conn := startServer(t, Config{})
	c := thzdrivev1.NewPumpPlannerClient(conn)
	ok := func(edit func(r *thzdrivev1.EstimateHeatingRequest)) *thzdrivev1.EstimateHeatingRequest {
		r := &thzdrivev1.EstimateHeatingRequest{IncidentFluenceUjPerCm2: 1000, AbsorbedFraction: 0.5,
			Geometry: thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM, ThicknessUm: 0.1,
			HeatCapacity: constantCapacity(2), BaseTemperatureK: 10}
		edit(r)
		return r
	}
	debye := func(theta, n float64) *thzdrivev1.HeatCapacityModel {
		return &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_Debye{Debye: &thzdrivev1.DebyeModel{DebyeTemperatureK: theta, AtomsPerNm3: n}}}
	}
	table := func(tk, cap []float64) *thzdrivev1.HeatCapacityModel {
		return &thzdrivev1.HeatCapacityModel{Kind: &thzdrivev1.HeatCapacityModel_Table{Table: &thzdrivev1.HeatCapacityTable{TemperatureK: tk, CapacityJPerCm3K: cap}}}
	}
	cases := []struct {
		name  string
		req   *thzdrivev1.EstimateHeatingRequest
		field string
	}{
		{"no base temperature", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.BaseTemperatureK = 0 }), "base_temperature_k"},
		{"NaN base temperature", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.BaseTemperatureK = math.NaN() }), "base_temperature_k"},
		{"base outside the table", ok(func(r *thzdrivev1.EstimateHeatingRequest) {
			r.HeatCapacity = table([]float64{50, 100, 200}, []float64{1, 1.5, 2})
		}), "base_temperature_k"},
		{"no heat capacity", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.HeatCapacity = nil }), "heat_capacity"},
		{"zero constant capacity", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.HeatCapacity = constantCapacity(0) }), "heat_capacity.constant_j_per_cm3_k"},
		{"Debye without atoms", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.HeatCapacity = debye(345, 0) }), "heat_capacity.debye.atoms_per_nm3"},
		{"negative Debye temperature", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.HeatCapacity = debye(-1, 44.2) }), "heat_capacity.debye.debye_temperature_k"},
		{"unsorted table", ok(func(r *thzdrivev1.EstimateHeatingRequest) {
			r.HeatCapacity = table([]float64{5, 4, 20}, []float64{1, 1.5, 2})
		}), "heat_capacity.table"},
		{"NaN in table", ok(func(r *thzdrivev1.EstimateHeatingRequest) {
			r.HeatCapacity = table([]float64{5, math.NaN(), 20}, []float64{1, 1.5, 2})
		}), "heat_capacity.table.temperature_k[1]"},
		{"negative fluence", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.IncidentFluenceUjPerCm2 = -1 }), "incident_fluence_uj_per_cm2"},
		{"absorbed fraction above 1", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.AbsorbedFraction = 1.5 }), "absorbed_fraction"},
		{"no absorption", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.AbsorbedFraction = 0 }), "absorbed_fraction"},
		{"no geometry", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.Geometry = 0 }), "geometry"},
		{"unknown geometry", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.Geometry = 9 }), "geometry"},
		{"film without thickness", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.ThicknessUm = 0 }), "thickness_um"},
		{"bulk without absorption", ok(func(r *thzdrivev1.EstimateHeatingRequest) {
			r.Geometry, r.ThicknessUm = thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK, 0
		}), "absorption_coefficient_per_cm"},
		{"repetition without conductivity", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.RepetitionRateKhz, r.SpotRadiusUm = 1, 100 }), "thermal_conductivity_w_per_m_k"},
		{"repetition without spot", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.RepetitionRateKhz, r.ThermalConductivityWPerMK = 1, 5 }), "spot_radius_um"},
		{"margin fraction 1", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.MarginFraction = 1 }), "margin_fraction"},
		{"unknown damage class", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.DamageClass = 7 }), "damage_class"},
		{"infinite z_nu", ok(func(r *thzdrivev1.EstimateHeatingRequest) { r.ZNu = math.Inf(1) }), "z_nu"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := c.EstimateHeating(ctxTimeout(t), tc.req)
			if fields := badRequestFields(t, err); !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}
}
