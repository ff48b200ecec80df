package server

import (
	"context"
	"errors"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/plan"
	"thzdrive/thermal"
	"thzdrive/units"
)

// PlanExperiment runs the whole chain: source, train, sample, mode, heating.
func (s *Service) PlanExperiment(ctx context.Context, req *thzdrivev1.PlanExperimentRequest) (*thzdrivev1.PlanExperimentResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.PlanExperimentRequest)
	exp, err := s.resolvePlan(resolved)
	if err != nil {
		return nil, err
	}
	r, err := plan.Run(exp)
	if err != nil {
		return nil, planError(err)
	}
	return planToWire(exp, r, resolved), nil
}

// resolvePlan validates a plan request (filling its defaults in place) and
// builds the physics experiment. The source, train, sample and mode are
// resolved exactly as DriveMode resolves them, so the two cannot drift.
func (s *Service) resolvePlan(r *thzdrivev1.PlanExperimentRequest) (plan.Experiment, error) {
	var v violations
	var exp plan.Experiment
	drive := &thzdrivev1.DriveModeRequest{
		Waveform: r.Waveform, Train: r.Train, Sample: r.Sample, Target: r.Target, Mode: r.Mode,
		ProbeDepthNm: r.ProbeDepthNm, Method: r.Method, PadToSamples: r.PadToSamples,
	}
	incident, chain := s.resolveDrive(&v, drive, r.Calibration != nil)
	r.Target, r.PadToSamples = drive.Target, drive.PadToSamples
	exp.Chain = chain
	exp.Source.Waveform = incident
	if c := r.Calibration; c != nil {
		exp.Source.EnergyJ = s.resolveEnergy(&v, "calibration", c)
		exp.Source.Spot = spotFrom(v.under("calibration."), c.SpotX, c.SpotY)
		if c.FocusScaling {
			v.add("calibration.focus_scaling", "a plan uses the collimated waveform; compute the diffraction-limited focus with CalibrateField")
		}
	}
	if h := r.Heating; h != nil {
		exp.Heating = heatingConditions(v.under("heating."), h, r.Sample == nil)
	}
	return exp, v.err()
}

// heatingConditions translates the sample's thermal facts; thermal.Estimate
// validates their values (planError maps its fields back under "heating.").
func heatingConditions(v *violations, h *thzdrivev1.HeatingConditions, noSample bool) *thermal.Inputs {
	req := &thzdrivev1.EstimateHeatingRequest{
		HeatCapacity:              h.HeatCapacity,
		ThermalConductivityWPerMK: h.ThermalConductivityWPerMK,
		RepetitionRateKhz:         h.RepetitionRateKhz,
		BaseTemperatureK:          h.BaseTemperatureK,
		TransitionTemperatureK:    h.TransitionTemperatureK,
		ZNu:                       h.ZNu,
		MarginFraction:            h.MarginFraction,
		LargeRiseFraction:         h.LargeRiseFraction,
		DamageClass:               h.DamageClass,
		DamageThresholdMjPerCm2:   h.DamageThresholdMjPerCm2,
		AbsorbedFraction:          h.AbsorbedFraction,
		ThicknessUm:               h.ThicknessUm,
	}
	if noSample {
		req.Geometry = thzdrivev1.SampleGeometry_SAMPLE_GEOMETRY_FILM
		if h.AbsorbedFraction == 0 || h.ThicknessUm == 0 {
			v.add("absorbed_fraction", "without a sample stack give the absorbed fraction and the film thickness_um")
		}
	} else if h.AbsorbedFraction != 0 || h.ThicknessUm != 0 {
		v.add("absorbed_fraction", "with a sample stack the absorbed fraction and thickness come from its optics; leave them unset")
	}
	in := heatingInputs(v, "", req)
	return &in
}

// planError maps a stage's error to a status naming the stage's fields.
func planError(err error) error {
	var se *plan.StageError
	if !errors.As(err, &se) {
		return driveError("", err)
	}
	switch se.Stage {
	case plan.StageSource:
		return invalid("calibration", se.Err)
	case plan.StageHeating:
		var ie *thermal.InputError
		if errors.As(se.Err, &ie) {
			return thermalError("heating.", se.Err)
		}
		return invalid("heating", se.Err)
	}
	return driveError("", se.Err)
}

func planToWire(exp plan.Experiment, r plan.Report, resolved *thzdrivev1.PlanExperimentRequest) *thzdrivev1.PlanExperimentResponse {
	out := &thzdrivev1.PlanExperimentResponse{
		Source: &thzdrivev1.PlanSource{
			PeakFieldKvPerCm:    r.IncidentMetrics.PeakFieldVPerM / units.KVPerCm,
			PeakFluenceUjPerCm2: r.PeakFluenceJPerM2 / units.UJPerCm2,
			PulseEnergyUj:       r.PulseEnergyJ / units.UJ,
			SpectralPeakThz:     r.IncidentMetrics.SpectralPeakHz / units.THz,
			Incident:            traceToWire(r.Incident),
		},
		Mode:     modeDriveToWire(exp.Chain.Mode, r.Drive),
		Cautions: stagedToWire(r.Cautions),
		Resolved: resolved,
	}
	if p := r.Drive.Propagation; p != nil {
		ratio := 0.0
		if p.IncidentPeakVPerM > 0 {
			ratio = p.TargetPeakVPerM / p.IncidentPeakVPerM
		}
		out.Optics = &thzdrivev1.PlanOptics{
			TargetPeakFieldKvPerCm: p.TargetPeakVPerM / units.KVPerCm,
			FieldRatio:             ratio,
			AbsorbedFraction:       p.AbsorbedFraction,
			Transfer:               transferToWire(*p),
		}
	}
	if b := r.Heating; b != nil {
		out.Heating = budgetToWire(*b)
	}
	return out
}

// headline picks the numbers a sweep streams for each point.
func headline(p *thzdrivev1.PlanExperimentResponse) *thzdrivev1.SweepHeadline {
	h := &thzdrivev1.SweepHeadline{
		IncidentPeakFieldKvPerCm: p.GetSource().GetPeakFieldKvPerCm(),
		PulseEnergyUj:            p.GetSource().GetPulseEnergyUj(),
		PeakFieldInsideKvPerCm:   p.GetMode().GetPeakFieldInsideKvPerCm(),
		MaxQASqrtAmu:             p.GetMode().GetMaxQASqrtAmu(),
		DisplacementPm:           p.GetMode().GetDisplacementPm(),
		Quanta:                   p.GetMode().GetQuanta(),
		Overlap:                  p.GetMode().GetOverlap(),
		AbsorbedFraction:         p.GetOptics().GetAbsorbedFraction(),
		PeakTemperatureK:         p.GetHeating().GetPeakTemperatureK(),
		SteadyStateTemperatureK:  p.GetHeating().GetSteadyStateTemperatureK(),
	}
	for _, c := range p.Cautions {
		h.CautionCodes = append(h.CautionCodes, c.Code)
	}
	return h
}
