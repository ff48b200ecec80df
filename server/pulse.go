package server

import (
	"context"
	"fmt"
	"math"
	"math/cmplx"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/caution"
	"thzdrive/pulse"
	"thzdrive/units"
)

// Defaults of a model pulse (common practice for a table-top source: a 1 THz
// single cycle sampled every 10 fs over 20 ps).
const (
	defaultPeakFrequencyTHz = 1.0
	defaultPeakFieldKVPerCm = 100.0
	defaultModelStepFs      = 10.0
	defaultModelSpanPs      = 20.0
	defaultTukeyAlpha       = 0.2
	defaultProbeNm          = 800.0
	minTraceSamples         = 8
)

// AnalyzePulse returns the spectrum, metrics and cautions of a waveform.
func (s *Service) AnalyzePulse(ctx context.Context, req *thzdrivev1.AnalyzePulseRequest) (*thzdrivev1.AnalyzePulseResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.AnalyzePulseRequest)
	var v violations
	tr, isModel := s.resolveWaveform(&v, "waveform", resolved.GetWaveform())
	if resolved.Processing == nil {
		resolved.Processing = &thzdrivev1.Processing{}
	}
	proc := s.resolveProcessing(&v, "processing", resolved.Processing, isModel)
	if err := v.err(); err != nil {
		return nil, err
	}
	an, err := pulse.Analyze(tr, proc)
	if err != nil {
		return nil, invalid("waveform", err)
	}
	return &thzdrivev1.AnalyzePulseResponse{
		Metrics:        metricsToWire(an.Metrics, tr.Absolute),
		Spectrum:       spectrumToWire(an.Spectrum, tr.Absolute),
		ProcessedTrace: traceToWire(an.Processed),
		Cautions:       cautionsToWire(an.Cautions, ""),
		Resolved:       resolved,
	}, nil
}

// resolveWaveform validates a wire waveform, fills its defaults in place and
// returns it as a uniform trace. isModel tells whether it was a model pulse.
func (s *Service) resolveWaveform(v *violations, path string, w *thzdrivev1.Waveform) (tr pulse.Trace, isModel bool) {
	switch src := w.GetSource().(type) {
	case *thzdrivev1.Waveform_Model:
		return s.resolveModel(v, path+".model", src.Model), true
	case *thzdrivev1.Waveform_Trace:
		return s.resolveTrace(v, path+".trace", src.Trace), false
	default:
		v.add(path, "a waveform is required: give a model or a trace")
		return pulse.Trace{}, false
	}
}

func (s *Service) resolveModel(v *violations, path string, m *thzdrivev1.ModelPulse) pulse.Trace {
	if m.Shape == thzdrivev1.PulseShape_PULSE_SHAPE_UNSPECIFIED {
		m.Shape = thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE
	}
	if m.PeakFieldKvPerCm == 0 {
		m.PeakFieldKvPerCm = defaultPeakFieldKVPerCm
	}
	if m.StepFs == 0 {
		m.StepFs = defaultModelStepFs
	}
	if m.SpanPs == 0 {
		m.SpanPs = defaultModelSpanPs
	}
	model := pulse.Model{PeakFieldVPerM: m.PeakFieldKvPerCm * units.KVPerCm}
	switch m.Shape {
	case thzdrivev1.PulseShape_PULSE_SHAPE_SINGLE_CYCLE, thzdrivev1.PulseShape_PULSE_SHAPE_CENTRAL_LOBE:
		model.Shape = pulse.SingleCycle
		if m.Shape == thzdrivev1.PulseShape_PULSE_SHAPE_CENTRAL_LOBE {
			model.Shape = pulse.CentralLobe
		}
		if m.PeakFrequencyThz == 0 {
			m.PeakFrequencyThz = defaultPeakFrequencyTHz
		}
		v.positive(path+".peak_frequency_thz", m.PeakFrequencyThz)
		model.PeakFrequencyHz = m.PeakFrequencyThz * units.THz
	case thzdrivev1.PulseShape_PULSE_SHAPE_CARRIER:
		model.Shape = pulse.Carrier
		v.positive(path+".carrier_frequency_thz", m.CarrierFrequencyThz)
		v.positive(path+".envelope_fwhm_ps", m.EnvelopeFwhmPs)
		v.finite(path+".carrier_phase_rad", m.CarrierPhaseRad)
		model.CarrierFrequencyHz = m.CarrierFrequencyThz * units.THz
		model.EnvelopeFWHMS = m.EnvelopeFwhmPs * units.Ps
		model.CarrierPhaseRad = m.CarrierPhaseRad
	default:
		v.add(path+".shape", "unknown pulse shape %d", m.Shape)
	}
	v.positive(path+".peak_field_kv_per_cm", m.PeakFieldKvPerCm)
	stepOK := v.positive(path+".step_fs", m.StepFs)
	spanOK := v.positive(path+".span_ps", m.SpanPs)
	if !v.ok() || !stepOK || !spanOK {
		return pulse.Trace{}
	}
	n := math.Round(m.SpanPs * units.Ps / (m.StepFs * units.Fs))
	switch {
	case n < minTraceSamples:
		v.add(path+".span_ps", "span %g ps at step %g fs gives %.0f samples; need at least %d", m.SpanPs, m.StepFs, n, minTraceSamples)
		return pulse.Trace{}
	case n > float64(s.limits.MaxSamples):
		v.add(path+".span_ps", "span %g ps at step %g fs gives %.0f samples, over the limit of %d", m.SpanPs, m.StepFs, n, s.limits.MaxSamples)
		return pulse.Trace{}
	}
	if err := model.Validate(); err != nil {
		v.add(path, "%v", err)
		return pulse.Trace{}
	}
	tr, err := model.Sample(m.StepFs*units.Fs, m.SpanPs*units.Ps)
	if err != nil {
		v.add(path, "%v", err)
	}
	return tr
}

func (s *Service) resolveTrace(v *violations, path string, t *thzdrivev1.SampledTrace) pulse.Trace {
	if t.FieldUnit == thzdrivev1.FieldUnit_FIELD_UNIT_UNSPECIFIED {
		t.FieldUnit = thzdrivev1.FieldUnit_FIELD_UNIT_ARBITRARY
	}
	absolute := false
	scale := 1.0
	switch t.FieldUnit {
	case thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM:
		absolute, scale = true, units.KVPerCm
	case thzdrivev1.FieldUnit_FIELD_UNIT_ARBITRARY:
	default:
		v.add(path+".field_unit", "unknown field unit %d", t.FieldUnit)
	}
	n := len(t.Field)
	switch {
	case n < minTraceSamples:
		v.add(path+".field", "a trace needs at least %d samples, got %d", minTraceSamples, n)
		return pulse.Trace{}
	case n > s.limits.MaxSamples:
		v.add(path+".field", "%d samples, over the limit of %d", n, s.limits.MaxSamples)
		return pulse.Trace{}
	}
	finite := v.allFinite(path+".field", t.Field)
	field := make([]float64, n)
	for i, x := range t.Field {
		field[i] = x * scale
	}
	if len(t.TimePs) > 0 {
		if t.StepFs != 0 || t.StartPs != 0 {
			v.add(path+".time_ps", "give either time_ps or start_ps and step_fs, not both")
		}
		if len(t.TimePs) != n {
			v.add(path+".time_ps", "has %d times for %d field values", len(t.TimePs), n)
			return pulse.Trace{}
		}
		if !v.allFinite(path+".time_ps", t.TimePs) || !finite {
			return pulse.Trace{}
		}
		for i := 1; i < n; i++ {
			if t.TimePs[i] <= t.TimePs[i-1] {
				v.add(fmt.Sprintf("%s.time_ps[%d]", path, i), "times must be strictly increasing: %g after %g", t.TimePs[i], t.TimePs[i-1])
				return pulse.Trace{}
			}
		}
		times := make([]float64, n)
		for i, x := range t.TimePs {
			times[i] = x * units.Ps
		}
		tr, err := pulse.Resample(times, field, absolute)
		if err != nil {
			v.add(path+".time_ps", "%v", err)
			return pulse.Trace{}
		}
		if tr.Len() > s.limits.MaxSamples {
			v.add(path+".time_ps", "resampling at the median spacing gives %d samples, over the limit of %d", tr.Len(), s.limits.MaxSamples)
			return pulse.Trace{}
		}
		return tr
	}
	v.finite(path+".start_ps", t.StartPs)
	v.positive(path+".step_fs", t.StepFs)
	return pulse.Trace{StartS: t.StartPs * units.Ps, StepS: t.StepFs * units.Fs, Field: field, Absolute: absolute}
}

func (s *Service) resolveProcessing(v *violations, path string, p *thzdrivev1.Processing, isModel bool) pulse.Processing {
	if p.Baseline == thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_UNSPECIFIED {
		p.Baseline = thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_PRE_PULSE
		if isModel {
			p.Baseline = thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_NONE
		}
	}
	if p.Window == thzdrivev1.TimeWindow_TIME_WINDOW_UNSPECIFIED {
		p.Window = thzdrivev1.TimeWindow_TIME_WINDOW_NONE
	}
	var out pulse.Processing
	switch p.Baseline {
	case thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_NONE:
		out.Baseline = pulse.BaselineNone
	case thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_PRE_PULSE:
		out.Baseline = pulse.BaselinePrePulse
	case thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_LINEAR:
		out.Baseline = pulse.BaselineLinear
	default:
		v.add(path+".baseline", "unknown baseline removal %d", p.Baseline)
	}
	switch p.Window {
	case thzdrivev1.TimeWindow_TIME_WINDOW_NONE:
		out.Window = pulse.WindowNone
	case thzdrivev1.TimeWindow_TIME_WINDOW_HANN:
		out.Window = pulse.WindowHann
	case thzdrivev1.TimeWindow_TIME_WINDOW_BLACKMAN:
		out.Window = pulse.WindowBlackman
	case thzdrivev1.TimeWindow_TIME_WINDOW_TUKEY:
		out.Window = pulse.WindowTukey
		if p.TukeyAlpha == 0 {
			p.TukeyAlpha = defaultTukeyAlpha
		}
		if v.finite(path+".tukey_alpha", p.TukeyAlpha) && (p.TukeyAlpha <= 0 || p.TukeyAlpha > 1) {
			v.add(path+".tukey_alpha", "must be in (0, 1], got %g", p.TukeyAlpha)
		}
		out.TukeyAlpha = p.TukeyAlpha
	default:
		v.add(path+".window", "unknown window %d", p.Window)
	}
	switch {
	case p.PadToSamples < 0:
		v.add(path+".pad_to_samples", "must be >= 0, got %d", p.PadToSamples)
	case int(p.PadToSamples) > s.limits.MaxSamples:
		v.add(path+".pad_to_samples", "%d samples, over the limit of %d", p.PadToSamples, s.limits.MaxSamples)
	}
	out.PadToSamples = int(p.PadToSamples)
	return out
}

// CalibrateField scales a waveform to absolute field.
func (s *Service) CalibrateField(ctx context.Context, req *thzdrivev1.CalibrateFieldRequest) (*thzdrivev1.CalibrateFieldResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.CalibrateFieldRequest)
	var v violations
	switch m := resolved.GetMethod().(type) {
	case *thzdrivev1.CalibrateFieldRequest_Energy:
		shape, _ := s.resolveWaveform(&v, "waveform", resolved.GetWaveform())
		return s.calibrateByEnergy(&v, "energy", m.Energy, shape, resolved)
	case *thzdrivev1.CalibrateFieldRequest_ElectroOptic:
		return s.calibrateEO(&v, "electro_optic", m.ElectroOptic, resolved)
	default:
		v.add("method", "give a calibration: energy or electro_optic")
		return nil, v.err()
	}
}

func (s *Service) calibrateByEnergy(v *violations, path string, e *thzdrivev1.EnergyCalibration, shape pulse.Trace, resolved *thzdrivev1.CalibrateFieldRequest) (*thzdrivev1.CalibrateFieldResponse, error) {
	energyJ := s.resolveEnergy(v, path, e)
	spot := spotFrom(v.under(path+"."), e.SpotX, e.SpotY)
	if e.FocusScaling && e.FocusReferenceFrequencyThz != 0 {
		v.positive(path+".focus_reference_frequency_thz", e.FocusReferenceFrequencyThz)
	}
	if err := v.err(); err != nil {
		return nil, err
	}
	focus := pulse.FocusOption{Enabled: e.FocusScaling}
	if e.FocusScaling {
		if e.FocusReferenceFrequencyThz == 0 {
			an, err := pulse.Analyze(shape, pulse.Processing{})
			if err != nil {
				return nil, invalid("waveform", err)
			}
			e.FocusReferenceFrequencyThz = an.Metrics.SpectralPeakHz / units.THz
		}
		focus.ReferenceFrequencyHz = e.FocusReferenceFrequencyThz * units.THz
	}
	cal, err := pulse.CalibrateByEnergy(shape, energyJ, spot, focus)
	if err != nil {
		return nil, invalid(path, err)
	}
	out := &thzdrivev1.CalibrateFieldResponse{
		PeakFieldKvPerCm:    cal.PeakFieldVPerM / units.KVPerCm,
		PeakFluenceUjPerCm2: cal.PeakFluenceJPerM2 / units.UJPerCm2,
		CalibratedTrace:     traceToWire(cal.Trace),
		Cautions:            cautionsToWire(cal.Cautions, ""),
		Resolved:            resolved,
	}
	if e.FocusScaling {
		out.FocusedPeakFieldKvPerCm = cal.FocusedPeakFieldVPerM / units.KVPerCm
		out.FocusedTrace = traceToWire(cal.Focused)
	}
	return out, nil
}

func (s *Service) resolveEnergy(v *violations, path string, e *thzdrivev1.EnergyCalibration) float64 {
	switch en := e.GetEnergy().(type) {
	case *thzdrivev1.EnergyCalibration_PulseEnergyUj:
		if v.positive(path+".pulse_energy_uj", en.PulseEnergyUj) {
			return en.PulseEnergyUj * units.UJ
		}
	case *thzdrivev1.EnergyCalibration_AveragePower:
		p := path + ".average_power"
		okP := v.positive(p+".average_power_mw", en.AveragePower.GetAveragePowerMw())
		okR := v.positive(p+".repetition_rate_khz", en.AveragePower.GetRepetitionRateKhz())
		if okP && okR {
			return en.AveragePower.AveragePowerMw * units.MW / (en.AveragePower.RepetitionRateKhz * 1e3)
		}
	default:
		v.add(path+".energy", "give pulse_energy_uj or average_power")
	}
	return 0
}

// spotFrom resolves a focal spot from its x and optional y axis.
func spotFrom(v *violations, x, y *thzdrivev1.SpotSize) pulse.Spot {
	if x == nil {
		v.add("spot_x", "the spot size is required")
		return pulse.Spot{}
	}
	wx := spotRadius(v, "spot_x", x)
	wy := wx
	if y != nil {
		wy = spotRadius(v, "spot_y", y)
	}
	return pulse.Spot{RadiusXM: wx, RadiusYM: wy}
}

// spotRadius returns the 1/e² intensity radius, m.
func spotRadius(v *violations, path string, sz *thzdrivev1.SpotSize) float64 {
	switch s := sz.GetSize().(type) {
	case *thzdrivev1.SpotSize_RadiusUm:
		if v.positive(path+".radius_um", s.RadiusUm) {
			return s.RadiusUm * units.Um
		}
	case *thzdrivev1.SpotSize_FwhmUm:
		if v.positive(path+".fwhm_um", s.FwhmUm) {
			return pulse.RadiusFromFWHM(s.FwhmUm * units.Um)
		}
	case *thzdrivev1.SpotSize_KnifeEdge_10_90Um:
		if v.positive(path+".knife_edge_10_90_um", s.KnifeEdge_10_90Um) {
			return pulse.RadiusFromKnifeEdge(s.KnifeEdge_10_90Um * units.Um)
		}
	default:
		v.add(path, "give radius_um, fwhm_um or knife_edge_10_90_um")
	}
	return 0
}

func (s *Service) calibrateEO(v *violations, path string, eo *thzdrivev1.ElectroOpticCalibration, resolved *thzdrivev1.CalibrateFieldRequest) (*thzdrivev1.CalibrateFieldResponse, error) {
	setup := resolveEOSetup(v, path, eo)
	var shape pulse.Trace
	useTrace := eo.ModulationTrace != nil
	if useTrace {
		if eo.PeakModulation != 0 {
			v.add(path+".peak_modulation", "give peak_modulation or modulation_trace, not both")
		}
		if resolved.Waveform != nil {
			v.add("waveform", "a modulation_trace replaces the waveform; give only one")
		}
		shape = s.resolveTrace(v, path+".modulation_trace", eo.ModulationTrace)
		shape.Absolute = false
	} else {
		shape, _ = s.resolveWaveform(v, "waveform", resolved.GetWaveform())
		if v.finite(path+".peak_modulation", eo.PeakModulation) && (eo.PeakModulation == 0 || math.Abs(eo.PeakModulation) >= 1) {
			v.add(path+".peak_modulation", "|dI/I| must be in (0, 1), got %g: a balanced detector cannot exceed 1", eo.PeakModulation)
		}
	}
	if err := v.err(); err != nil {
		return nil, err
	}
	modulation := shape
	if !useTrace {
		if peak := shape.PeakAbs(); peak > 0 {
			modulation = shape.Scaled(math.Abs(eo.PeakModulation) / peak)
		}
	}
	cal, err := pulse.CalibrateEO(setup, modulation)
	if err != nil {
		field := path + ".peak_modulation"
		if useTrace {
			field = path + ".modulation_trace.field"
		}
		return nil, invalid(field, err)
	}
	an, err := pulse.Analyze(cal.Trace, pulse.Processing{})
	if err != nil {
		return nil, invalid(path, err)
	}
	return &thzdrivev1.CalibrateFieldResponse{
		PeakFieldKvPerCm:              cal.PeakFieldVPerM / units.KVPerCm,
		PeakFluenceUjPerCm2:           an.Metrics.FluenceJPerM2 / units.UJPerCm2,
		CalibratedTrace:               traceToWire(cal.Trace),
		FieldPerUnitModulationKvPerCm: setup.FieldPerModulation() / units.KVPerCm,
		HalfWaveFieldKvPerCm:          setup.HalfWaveField() / units.KVPerCm,
		Cautions:                      cautionsToWire(cal.Cautions, ""),
		Resolved:                      resolved,
	}, nil
}

func resolveEOSetup(v *violations, path string, eo *thzdrivev1.ElectroOpticCalibration) pulse.EOSetup {
	var c pulse.Crystal
	switch eo.Crystal {
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_UNSPECIFIED:
		eo.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE
		c = pulse.ZnTe
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE:
		c = pulse.ZnTe
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP:
		c = pulse.GaP
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM:
		c = pulse.Crystal{Name: "custom"}
		for _, f := range []struct {
			name string
			set  bool
		}{{"n_probe", eo.NProbe != nil}, {"r41_pm_per_v", eo.R41PmPerV != nil}, {"n_thz", eo.NThz != nil}} {
			if !f.set {
				v.add(path+"."+f.name, "a custom crystal needs every constant; %s is missing", f.name)
			}
		}
	default:
		v.add(path+".crystal", "unknown crystal %d", eo.Crystal)
	}
	override := func(field string, p **float64, dst *float64, scale float64) {
		if *p == nil {
			if *dst != 0 {
				x := *dst / scale
				*p = &x
			}
			return
		}
		if v.positive(path+"."+field, **p) {
			*dst = **p * scale
		}
	}
	override("n_probe", &eo.NProbe, &c.NProbe, 1)
	override("r41_pm_per_v", &eo.R41PmPerV, &c.R41MPerV, units.PmPerV)
	override("n_thz", &eo.NThz, &c.NTHz, 1)
	override("to_phonon_thz", &eo.ToPhononThz, &c.TOPhononHz, units.THz)
	if eo.ProbeWavelengthNm == 0 {
		eo.ProbeWavelengthNm = defaultProbeNm
	}
	v.positive(path+".thickness_um", eo.ThicknessUm)
	v.positive(path+".probe_wavelength_nm", eo.ProbeWavelengthNm)
	return pulse.EOSetup{Crystal: c, ThicknessM: eo.ThicknessUm * units.Um, ProbeWavelengthM: eo.ProbeWavelengthNm * units.Nm}
}

func traceToWire(tr pulse.Trace) *thzdrivev1.SampledTrace {
	out := &thzdrivev1.SampledTrace{
		StartPs:   tr.StartS / units.Ps,
		StepFs:    tr.StepS / units.Fs,
		Field:     make([]float64, len(tr.Field)),
		FieldUnit: thzdrivev1.FieldUnit_FIELD_UNIT_ARBITRARY,
	}
	scale := 1.0
	if tr.Absolute {
		scale = 1 / units.KVPerCm
		out.FieldUnit = thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM
	}
	for i, x := range tr.Field {
		out.Field[i] = x * scale
	}
	return out
}

// spectrumPerTHz converts a spectrum value (V/m·s) to kV/cm per THz.
const spectrumPerTHz = units.KVPerCm / units.THz

func spectrumToWire(sp pulse.Spectrum, absolute bool) *thzdrivev1.Spectrum {
	n := len(sp.Values)
	out := &thzdrivev1.Spectrum{
		FrequencyThz:           make([]float64, n),
		AmplitudeKvPerCmPerThz: make([]float64, n),
		PhaseRad:               make([]float64, n),
	}
	scale := 1 / units.THz
	if absolute {
		scale = 1 / spectrumPerTHz
	}
	for k, c := range sp.Values {
		out.FrequencyThz[k] = float64(k) * sp.StepHz / units.THz
		out.AmplitudeKvPerCmPerThz[k] = cmplx.Abs(c) * scale
		out.PhaseRad[k] = cmplx.Phase(c)
	}
	return out
}

func metricsToWire(m pulse.Metrics, absolute bool) *thzdrivev1.PulseMetrics {
	field := 1.0
	if absolute {
		field = 1 / units.KVPerCm
	}
	return &thzdrivev1.PulseMetrics{
		PeakFieldKvPerCm:  m.PeakFieldVPerM * field,
		PeakTimePs:        m.PeakTimeS / units.Ps,
		PeakSign:          int32(m.PeakSign),
		PeakToPeakKvPerCm: m.PeakToPeakVPerM * field,
		SpectralPeakThz:   m.SpectralPeakHz / units.THz,
		CentroidThz:       m.CentroidHz / units.THz,
		BandwidthFwhmThz:  m.BandwidthFWHMHz / units.THz,
		BandLowThz:        m.BandLowHz / units.THz,
		BandHighThz:       m.BandHighHz / units.THz,
		DynamicRangeDb:    m.DynamicRangeDB,
		DcAreaRatio:       m.DCAreaRatio,
		FluenceUjPerCm2:   m.FluenceJPerM2 / units.UJPerCm2,
		NyquistThz:        m.NyquistHz / units.THz,
		ResolutionThz:     m.ResolutionHz / units.THz,
		EdgeRatio:         m.EdgeRatio,
	}
}

// cautionsToWire converts cautions, tagging each with the stage that raised it.
func cautionsToWire(cs []caution.Caution, stage string) []*thzdrivev1.Caution {
	out := make([]*thzdrivev1.Caution, 0, len(cs))
	for _, c := range cs {
		w := &thzdrivev1.Caution{Code: thzdrivev1.CautionCode(c.Code), Message: c.Message, Stage: stage}
		for _, val := range c.Values {
			w.Values = append(w.Values, &thzdrivev1.CautionValue{Name: val.Name, Value: val.Number})
		}
		out = append(out, w)
	}
	return out
}
