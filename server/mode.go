package server

import (
	"context"
	"errors"
	"math"

	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/phononmode"
	"thzdrive/plan"
	"thzdrive/pulse"
	"thzdrive/units"
)

// Edge units of the mode's optional terms, in SI. The equation of motion is
// written in Q (Å·sqrt(amu)) and t (ps) at the edges.
var (
	a3Unit    = 1 / (units.Ps * units.Ps * units.AngstromSqrtAmu)
	a4Unit    = 1 / (units.Ps * units.Ps * units.AngstromSqrtAmu * units.AngstromSqrtAmu)
	ramanUnit = 1 / units.AngstromSqrtAmu
)

// DriveMode returns the response of a mode to the field inside the sample.
func (s *Service) DriveMode(ctx context.Context, req *thzdrivev1.DriveModeRequest) (*thzdrivev1.DriveModeResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.DriveModeRequest)
	var v violations
	incident, chain := s.resolveDrive(&v, resolved, false)
	if err := v.err(); err != nil {
		return nil, err
	}
	d, err := plan.DriveMode(incident, chain)
	if err != nil {
		return nil, driveError("", err)
	}
	return &thzdrivev1.DriveModeResponse{
		Drive:    modeDriveToWire(chain.Mode, d),
		Cautions: stagedToWire(d.Cautions),
		Resolved: resolved,
	}, nil
}

// resolveDrive validates a DriveModeRequest and builds the incident trace
// and the chain. Defaults are filled in place. With shapeOnly the waveform
// may be in arbitrary units (sizing scales it).
func (s *Service) resolveDrive(v *violations, r *thzdrivev1.DriveModeRequest, shapeOnly bool) (pulse.Trace, plan.Chain) {
	var c plan.Chain
	incident, _ := s.resolveWaveform(v, "waveform", r.GetWaveform())
	if v.ok() && !incident.Absolute && !shapeOnly {
		v.add("waveform", "a mode needs an absolute field: give the trace in kV/cm, or calibrate it first")
	}
	if r.Sample != nil {
		if r.Target == nil {
			r.Target = &thzdrivev1.Target{}
		}
		train := s.resolveTrain(v, r)
		c.Train = &train
		c.PadToSamples = s.resolvePad(v, "pad_to_samples", &r.PadToSamples, incident.Len())
	} else {
		if len(r.Train) > 0 || r.Target != nil {
			v.add("sample", "a train or target needs a sample; without one the waveform is the field inside")
		}
	}
	if v.nonNegative("probe_depth_nm", r.ProbeDepthNm) && r.ProbeDepthNm > 0 && r.Sample == nil {
		v.add("probe_depth_nm", "a probe depth needs a sample (the depth average uses its index)")
	}
	c.ProbeDepthM = r.ProbeDepthNm * units.Nm
	switch r.Method {
	case thzdrivev1.DriveMethod_DRIVE_METHOD_UNSPECIFIED:
		c.Options.Method = phononmode.Auto
	case thzdrivev1.DriveMethod_DRIVE_METHOD_EXACT:
		c.Options.Method = phononmode.Exact
	case thzdrivev1.DriveMethod_DRIVE_METHOD_TIME_DOMAIN:
		c.Options.Method = phononmode.TimeDomain
	default:
		v.add("method", "unknown method %d", r.Method)
	}
	c.Options.MaxSamples = 4 * s.limits.MaxSamples
	if v.ok() {
		c.Mode = resolveMode(v, "mode", r.GetMode(), c.Train)
	}
	return incident, c
}

func resolveMode(v *violations, path string, m *thzdrivev1.PhononMode, train *optics.Train) phononmode.Mode {
	if m == nil {
		v.add(path, "the mode is required")
		return phononmode.Mode{}
	}
	var mode phononmode.Mode
	v.positive(path+".cell_volume_a3", m.CellVolumeA3)
	volume := m.CellVolumeA3 * units.CubicAngstrom
	if m.TargetOscillator != nil {
		if m.FrequencyThz != 0 || m.LinewidthThz != 0 || m.Strength != nil {
			v.add(path+".target_oscillator", "the oscillator gives frequency, linewidth and strength: leave those unset")
		}
		if train == nil {
			v.add(path+".target_oscillator", "refers to the target layer's dielectric model, but there is no sample")
		}
		if !v.ok() {
			return mode
		}
		var err error
		mode, err = plan.ModeFromTarget(train, int(*m.TargetOscillator), volume)
		if err != nil {
			v.add(path+".target_oscillator", "%v", err)
			return mode
		}
	} else {
		okF := v.positive(path+".frequency_thz", m.FrequencyThz)
		okW := v.nonNegative(path+".linewidth_thz", m.LinewidthThz)
		if !okF || !okW || !v.ok() {
			return mode
		}
		switch st := m.Strength.(type) {
		case *thzdrivev1.PhononMode_DeltaEps:
			if !v.positive(path+".delta_eps", st.DeltaEps) {
				return mode
			}
			var err error
			mode, err = phononmode.FromOscillatorStrength(st.DeltaEps, m.FrequencyThz*units.THz, m.LinewidthThz*units.THz, volume)
			if err != nil {
				v.add(path+".delta_eps", "%v", err)
				return mode
			}
		case *thzdrivev1.PhononMode_EffectiveChargeEPerSqrtAmu:
			if !v.positive(path+".effective_charge_e_per_sqrt_amu", st.EffectiveChargeEPerSqrtAmu) {
				return mode
			}
			mode = phononmode.Mode{FreqHz: m.FrequencyThz * units.THz, LinewidthHz: m.LinewidthThz * units.THz,
				ZStarCPerSqrtKg: st.EffectiveChargeEPerSqrtAmu * units.ESqrtAmu, CellVolumeM3: volume}
		default:
			if m.RamanDepsDqPerASqrtAmu == 0 {
				v.add(path+".strength", "give delta_eps or effective_charge_e_per_sqrt_amu (or a Raman coupling for a mode driven by E²)")
				return mode
			}
			mode = phononmode.Mode{FreqHz: m.FrequencyThz * units.THz, LinewidthHz: m.LinewidthThz * units.THz, CellVolumeM3: volume}
		}
	}
	v.nonNegative(path+".effective_mass_amu", m.EffectiveMassAmu)
	v.nonNegative(path+".bond_length_a", m.BondLengthA)
	v.finite(path+".anharmonic_a3_per_ps2_per_a_sqrt_amu", m.AnharmonicA3PerPs2PerASqrtAmu)
	v.finite(path+".anharmonic_a4_per_ps2_per_a2_amu", m.AnharmonicA4PerPs2PerA2Amu)
	v.finite(path+".raman_deps_dq_per_a_sqrt_amu", m.RamanDepsDqPerASqrtAmu)
	v.within(path+".polarization_angle_deg", m.PolarizationAngleDeg, -360, 360)
	mode.EffectiveMassKg = m.EffectiveMassAmu * units.Amu
	mode.BondLengthM = m.BondLengthA * units.Angstrom
	mode.A3PerMSqrtKgS2 = m.AnharmonicA3PerPs2PerASqrtAmu * a3Unit
	mode.A4PerM2KgS2 = m.AnharmonicA4PerPs2PerA2Amu * a4Unit
	mode.DEpsDQPerMSqrtKg = m.RamanDepsDqPerASqrtAmu * ramanUnit
	mode.PolarAngleRad = m.PolarizationAngleDeg * math.Pi / 180
	if v.ok() {
		if err := mode.Validate(); err != nil {
			v.add(path+"."+modeField(err), "%v", err)
		}
	}
	return mode
}

// modeFields maps phononmode's Go field names to wire names under "mode".
var modeFields = map[string]string{
	"Mode.FreqHz": "frequency_thz", "Mode.LinewidthHz": "linewidth_thz",
	"Mode.ZStarCPerSqrtKg": "effective_charge_e_per_sqrt_amu", "Mode.CellVolumeM3": "cell_volume_a3",
	"Mode.EffectiveMassKg": "effective_mass_amu", "Mode.BondLengthM": "bond_length_a",
	"Mode.A3PerMSqrtKgS2": "anharmonic_a3_per_ps2_per_a_sqrt_amu", "Mode.A4PerM2KgS2": "anharmonic_a4_per_ps2_per_a2_amu",
	"Mode.DEpsDQPerMSqrtKg": "raman_deps_dq_per_a_sqrt_amu", "Mode.PolarAngleRad": "polarization_angle_deg",
}

func modeField(err error) string {
	var ie *phononmode.InputError
	if errors.As(err, &ie) {
		if f, ok := modeFields[ie.Field]; ok {
			return f
		}
	}
	return "frequency_thz"
}

// driveError maps an error of the chain to a status: bad input to
// INVALID_ARGUMENT naming the stage's field, too much work to
// RESOURCE_EXHAUSTED, a diverging solution to FAILED_PRECONDITION.
func driveError(prefix string, err error) error {
	var oe *optics.InputError
	var me *phononmode.InputError
	switch {
	case errors.Is(err, phononmode.ErrTooLarge):
		return status.Errorf(codes.ResourceExhausted, "%v (raise the server's --max-samples, or shorten the trace)", err)
	case errors.Is(err, phononmode.ErrDiverged), errors.Is(err, phononmode.ErrDepthQuadrature):
		return status.Errorf(codes.FailedPrecondition, "%v", err)
	case errors.As(err, &me):
		if f, ok := modeFields[me.Field]; ok {
			return invalid(prefix+"mode."+f, err)
		}
		switch me.Field {
		case "Options.Depth.ProbeDepthM":
			return invalid(prefix+"probe_depth_nm", err)
		case "Options.Method":
			// The method asked for cannot solve this mode (EXACT for a
			// nonlinear one): the request's method field is at fault.
			return invalid(prefix+"method", err)
		}
		return invalid(prefix+"mode", err)
	case errors.As(err, &oe):
		return invalid(prefix+"sample", err)
	}
	return invalid(prefix+"waveform", err)
}

func modeDriveToWire(m phononmode.Mode, d plan.Drive) *thzdrivev1.ModeDrive {
	r := d.Mode
	q := &thzdrivev1.ModeTrace{StartPs: r.StartS / units.Ps, StepFs: r.StepS / units.Fs, QASqrtAmu: scaled(r.QMSqrtKg, 1/units.AngstromSqrtAmu)}
	if r.DepthAvgQMSqrtKg != nil {
		q.DepthAverageQASqrtAmu = scaled(r.DepthAvgQMSqrtKg, 1/units.AngstromSqrtAmu)
	}
	method := thzdrivev1.DriveMethod_DRIVE_METHOD_EXACT
	if r.Method == phononmode.TimeDomain {
		method = thzdrivev1.DriveMethod_DRIVE_METHOD_TIME_DOMAIN
	}
	peakInside := d.Inside.PeakAbs()
	return &thzdrivev1.ModeDrive{
		PeakFieldInsideKvPerCm:       peakInside / units.KVPerCm,
		MaxQASqrtAmu:                 r.MaxAbsQMSqrtKg / units.AngstromSqrtAmu,
		MaxQTimePs:                   r.MaxAbsQTimeS / units.Ps,
		DepthAverageMaxQASqrtAmu:     r.DepthAvgMaxAbsQMSqrtKg / units.AngstromSqrtAmu,
		DisplacementPm:               r.DisplacementM / units.Pm,
		LindemannRatio:               r.LindemannRatio,
		ModeEnergyMev:                r.ModeEnergyJ / units.MilliEV,
		Quanta:                       r.Quanta,
		AbsorbedEnergyDensityJPerCm3: r.AbsorbedJPerM3 / units.JPerCm3,
		Overlap:                      r.Overlap,
		RelativeAmplitudeAtMode:      r.RelAmplitudeAtMode,
		AnharmonicShiftThz:           r.AnharmonicShiftHz / units.THz,
		DeltaEps:                     m.OscillatorStrength(),
		EffectiveChargeEPerSqrtAmu:   m.ZStarCPerSqrtKg / units.ESqrtAmu,
		Method:                       method,
		Q:                            q,
		FieldInside:                  traceToWire(d.Inside),
	}
}

func scaled(xs []float64, f float64) []float64 {
	out := make([]float64, len(xs))
	for i, x := range xs {
		out[i] = x * f
	}
	return out
}

func stagedToWire(cs []plan.Staged) []*thzdrivev1.Caution {
	out := make([]*thzdrivev1.Caution, 0, len(cs))
	for _, c := range cs {
		out = append(out, cautionsToWire([]caution.Caution{c.Caution}, c.Stage)...)
	}
	return out
}

// defaultMaxPeakFieldKVPerCm bounds a sizing search: 50 MV/cm, beyond which
// physics.md §8 asks the caller to confirm any field.
const defaultMaxPeakFieldKVPerCm = 50000

// SizeField returns the incident field that reaches a target amplitude.
func (s *Service) SizeField(ctx context.Context, req *thzdrivev1.SizeFieldRequest) (*thzdrivev1.SizeFieldResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.SizeFieldRequest)
	var v violations
	if resolved.Drive == nil {
		v.add("drive", "the chain (waveform, sample, mode) is required")
		return nil, v.err()
	}
	shape, chain := s.resolveDrive(v.under("drive."), resolved.Drive, true)
	var goal plan.Goal
	switch t := resolved.Target.(type) {
	case *thzdrivev1.SizeFieldRequest_MaxQASqrtAmu:
		v.positive("max_q_a_sqrt_amu", t.MaxQASqrtAmu)
		goal.Quantity, goal.Target = phononmode.MaxQ, t.MaxQASqrtAmu*units.AngstromSqrtAmu
	case *thzdrivev1.SizeFieldRequest_DisplacementPm:
		if v.positive("displacement_pm", t.DisplacementPm) && resolved.Drive.GetMode().GetEffectiveMassAmu() == 0 {
			v.add("drive.mode.effective_mass_amu", "a displacement target needs the mode's effective mass")
		}
		goal.Quantity, goal.Target = phononmode.IonDisplacement, t.DisplacementPm*units.Pm
	case *thzdrivev1.SizeFieldRequest_Quanta:
		v.positive("quanta", t.Quanta)
		goal.Quantity, goal.Target = phononmode.QuantaPerCell, t.Quanta
	default:
		v.add("target", "give the target: max_q_a_sqrt_amu, displacement_pm or quanta")
	}
	goal.Spot = spotFrom(&v, resolved.SpotX, resolved.SpotY)
	if v.nonNegative("source_limit_uj", resolved.SourceLimitUj) {
		goal.SourceLimitJ = resolved.SourceLimitUj * units.UJ
	}
	if resolved.MaxPeakFieldKvPerCm == 0 {
		resolved.MaxPeakFieldKvPerCm = defaultMaxPeakFieldKVPerCm
	}
	v.positive("max_peak_field_kv_per_cm", resolved.MaxPeakFieldKvPerCm)
	goal.MaxPeakFieldVPerM = resolved.MaxPeakFieldKvPerCm * units.KVPerCm
	if err := v.err(); err != nil {
		return nil, err
	}
	sz, err := plan.Size(shape, chain, goal)
	if err != nil {
		return nil, driveError("drive.", err)
	}
	return &thzdrivev1.SizeFieldResponse{
		Reachable:                sz.Reachable,
		IncidentPeakFieldKvPerCm: sz.PeakFieldVPerM / units.KVPerCm,
		PulseEnergyUj:            sz.PulseEnergyJ / units.UJ,
		PeakFluenceUjPerCm2:      sz.PeakFluenceJPerM2 / units.UJPerCm2,
		Achieved:                 achievedToWire(goal.Quantity, sz.Achieved),
		SourceMargin:             sz.SourceMargin,
		Drive:                    modeDriveToWire(chain.Mode, sz.Drive),
		Cautions:                 stagedToWire(sz.Cautions),
		Resolved:                 resolved,
	}, nil
}

// achievedToWire expresses the achieved quantity in the target's wire unit.
func achievedToWire(q phononmode.Quantity, x float64) float64 {
	switch q {
	case phononmode.MaxQ:
		return x / units.AngstromSqrtAmu
	case phononmode.IonDisplacement:
		return x / units.Pm
	}
	return x
}
