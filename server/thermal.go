package server

import (
	"context"
	"errors"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/thermal"
	"thzdrive/units"
)

// EstimateHeating returns the heating estimate and transition budget.
func (s *Service) EstimateHeating(ctx context.Context, req *thzdrivev1.EstimateHeatingRequest) (*thzdrivev1.EstimateHeatingResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.EstimateHeatingRequest)
	var v violations
	in := heatingInputs(&v, "", resolved)
	if err := v.err(); err != nil {
		return nil, err
	}
	b, err := thermal.Estimate(in)
	if err != nil {
		return nil, thermalError("", err)
	}
	fillHeatingDefaults(resolved, b.Inputs)
	return &thzdrivev1.EstimateHeatingResponse{Budget: budgetToWire(b), Cautions: cautionsToWire(b.Cautions, ""), Resolved: resolved}, nil
}

// heatingInputs translates the wire request; thermal.Estimate validates the
// values themselves (thermalError maps its field names back to wire paths).
// Only what the wire adds is checked here: finiteness of every number and
// the heat-capacity message.
func heatingInputs(v *violations, prefix string, r *thzdrivev1.EstimateHeatingRequest) thermal.Inputs {
	for _, f := range []struct {
		name string
		x    float64
	}{
		{"incident_fluence_uj_per_cm2", r.IncidentFluenceUjPerCm2}, {"absorbed_fraction", r.AbsorbedFraction},
		{"absorbed_fluence_uj_per_cm2", r.AbsorbedFluenceUjPerCm2}, {"pulse_energy_uj", r.PulseEnergyUj},
		{"spot_radius_um", r.SpotRadiusUm}, {"repetition_rate_khz", r.RepetitionRateKhz},
		{"thickness_um", r.ThicknessUm}, {"absorption_coefficient_per_cm", r.AbsorptionCoefficientPerCm},
		{"absorption_depth_um", r.AbsorptionDepthUm}, {"thermal_conductivity_w_per_m_k", r.ThermalConductivityWPerMK},
		{"base_temperature_k", r.BaseTemperatureK}, {"transition_temperature_k", r.TransitionTemperatureK},
		{"z_nu", r.ZNu}, {"margin_fraction", r.MarginFraction}, {"large_rise_fraction", r.LargeRiseFraction},
		{"damage_threshold_mj_per_cm2", r.DamageThresholdMjPerCm2},
	} {
		v.nonNegative(prefix+f.name, f.x)
	}
	in := thermal.Inputs{
		FluenceJPerM2:             r.IncidentFluenceUjPerCm2 * units.UJPerCm2,
		AbsorbedFraction:          r.AbsorbedFraction,
		AbsorbedFluenceJPerM2:     r.AbsorbedFluenceUjPerCm2 * units.UJPerCm2,
		PulseEnergyJ:              r.PulseEnergyUj * units.UJ,
		SpotRadiusM:               r.SpotRadiusUm * units.Um,
		RepetitionRateHz:          r.RepetitionRateKhz * 1e3,
		ThicknessM:                r.ThicknessUm * units.Um,
		AbsorptionCoefficientPerM: r.AbsorptionCoefficientPerCm * units.PerCm,
		AbsorptionDepthM:          r.AbsorptionDepthUm * units.Um,
		ConductivityWPerMK:        r.ThermalConductivityWPerMK,
		BaseTemperatureK:          r.BaseTemperatureK,
		TransitionTemperatureK:    r.TransitionTemperatureK,
		ZNu:                       r.ZNu,
		MarginFraction:            r.MarginFraction,
		LargeRiseFraction:         r.LargeRiseFraction,
		DamageThresholdJPerM2:     r.DamageThresholdMjPerCm2 * units.MJPerCm2,
	}
	switch r.Geometry {
	case thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM:
		in.Geometry = thermal.Film
	case thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK:
		in.Geometry = thermal.Bulk
	case thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_UNSPECIFIED:
	default:
		v.add(prefix+"geometry", "unknown geometry %d", r.Geometry)
	}
	switch r.DamageClass {
	case thzdrivev1.DamageClass_DAMAGE_CLASS_DIELECTRIC:
		in.DamageClass = thermal.Dielectric
	case thzdrivev1.DamageClass_DAMAGE_CLASS_METAL_OR_SEMICONDUCTOR:
		in.DamageClass = thermal.MetalOrSemiconductor
	case thzdrivev1.DamageClass_DAMAGE_CLASS_UNSPECIFIED:
	default:
		v.add(prefix+"damage_class", "unknown damage class %d", r.DamageClass)
	}
	in.HeatCapacity = heatCapacity(v, prefix+"heat_capacity", r.HeatCapacity)
	return in
}

func heatCapacity(v *violations, path string, m *thzdrivev1.HeatCapacityModel) thermal.HeatCapacity {
	var (
		hc  thermal.HeatCapacity
		err error
	)
	switch k := m.GetKind().(type) {
	case *thzdrivev1.HeatCapacityModel_ConstantJPerCm3K:
		if !v.positive(path+".constant_j_per_cm3_k", k.ConstantJPerCm3K) {
			return nil
		}
		hc, err = thermal.NewConstant(k.ConstantJPerCm3K * units.JPerCm3)
	case *thzdrivev1.HeatCapacityModel_Table:
		t := k.Table
		if !v.allFinite(path+".table.temperature_k", t.TemperatureK) || !v.allFinite(path+".table.capacity_j_per_cm3_k", t.CapacityJPerCm3K) {
			return nil
		}
		c := make([]float64, len(t.CapacityJPerCm3K))
		for i, x := range t.CapacityJPerCm3K {
			c[i] = x * units.JPerCm3
		}
		hc, err = thermal.NewTable(t.TemperatureK, c)
		path += ".table"
	case *thzdrivev1.HeatCapacityModel_Debye:
		d := k.Debye
		okT := v.positive(path+".debye.debye_temperature_k", d.DebyeTemperatureK)
		okN := v.positive(path+".debye.atoms_per_nm3", d.AtomsPerNm3)
		if !okT || !okN {
			return nil
		}
		hc, err = thermal.NewDebye(d.DebyeTemperatureK, d.AtomsPerNm3/(units.Nm*units.Nm*units.Nm))
		path += ".debye"
	default:
		v.add(path, "give the heat capacity: constant_j_per_cm3_k, table or debye")
		return nil
	}
	if err != nil {
		v.add(path, "%v", err)
		return nil
	}
	return hc
}

// thermalFields maps thermal.Inputs field names to wire field names.
var thermalFields = map[string]string{
	"FluenceJPerM2": "incident_fluence_uj_per_cm2", "AbsorbedFraction": "absorbed_fraction",
	"AbsorbedFluenceJPerM2": "absorbed_fluence_uj_per_cm2", "PulseEnergyJ": "pulse_energy_uj",
	"SpotRadiusM": "spot_radius_um", "RepetitionRateHz": "repetition_rate_khz", "Geometry": "geometry",
	"ThicknessM": "thickness_um", "AbsorptionCoefficientPerM": "absorption_coefficient_per_cm",
	"AbsorptionDepthM": "absorption_depth_um", "HeatCapacity": "heat_capacity",
	"ConductivityWPerMK": "thermal_conductivity_w_per_m_k", "BaseTemperatureK": "base_temperature_k",
	"TransitionTemperatureK": "transition_temperature_k", "ZNu": "z_nu", "MarginFraction": "margin_fraction",
	"LargeRiseFraction": "large_rise_fraction", "DamageClass": "damage_class",
	"DamageThresholdJPerM2": "damage_threshold_mj_per_cm2",
}

// thermalError turns thermal's input errors into a BadRequest with wire
// paths under prefix. The reasons keep thermal's words, which name SI units.
func thermalError(prefix string, err error) error {
	var ie *thermal.InputError
	if !errors.As(err, &ie) {
		return invalid(prefix+"heat_capacity", err)
	}
	var v violations
	for _, viol := range ie.Violations {
		name, ok := thermalFields[viol.Field]
		if !ok {
			name = viol.Field
		}
		v.add(prefix+name, "%s", viol.Reason)
	}
	return v.err()
}

// fillHeatingDefaults writes the defaults thermal resolved into the echo.
func fillHeatingDefaults(r *thzdrivev1.EstimateHeatingRequest, in thermal.Inputs) {
	r.IncidentFluenceUjPerCm2 = in.FluenceJPerM2 / units.UJPerCm2
	r.PulseEnergyUj = in.PulseEnergyJ / units.UJ
	r.ZNu = in.ZNu
	r.MarginFraction = in.MarginFraction
	r.LargeRiseFraction = in.LargeRiseFraction
	r.DamageThresholdMjPerCm2 = in.DamageThresholdJPerM2 / units.MJPerCm2
	switch in.Geometry {
	case thermal.Film:
		r.Geometry = thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM
	case thermal.Bulk:
		r.Geometry = thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_BULK
	}
}

func budgetToWire(b thermal.Budget) *thzdrivev1.HeatingBudget {
	return &thzdrivev1.HeatingBudget{
		IncidentFluenceUjPerCm2:       b.IncidentFluenceJPerM2 / units.UJPerCm2,
		AbsorbedFluenceUjPerCm2:       b.AbsorbedFluenceJPerM2 / units.UJPerCm2,
		AbsorbedPulseEnergyUj:         b.AbsorbedPulseEnergyJ / units.UJ,
		AbsorptionDepthUm:             b.AbsorptionDepthM / units.Um,
		PeakEnergyDensityJPerCm3:      b.PeakEnergyDensityJPerM3 / units.JPerCm3,
		AbsorbedPowerMw:               b.AbsorbedPowerW / units.MW,
		SteadyStateRiseK:              b.SteadyStateRiseK,
		SteadyStateTemperatureK:       b.SteadyStateTemperatureK,
		SinglePulseRiseK:              b.SinglePulseRiseK,
		PeakTemperatureK:              b.PeakTemperatureK,
		MarginK:                       b.MarginK,
		MarginFractionOfTc:            b.MarginFractionOfTc,
		ReducedTemperatureBase:        b.ReducedBase,
		ReducedTemperatureSteadyState: b.ReducedSteadyState,
		ReducedTemperaturePeak:        b.ReducedPeak,
		RelaxationFactorSteadyState:   b.RelaxationFactorSteadyState,
		RelaxationFactorPeak:          b.RelaxationFactorPeak,
		DamageThresholdMjPerCm2:       b.DamageThresholdJPerM2 / units.MJPerCm2,
	}
}
