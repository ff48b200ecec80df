package server

import (
	"context"
	"fmt"
	"math"
	"math/cmplx"
	"sort"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/optics"
	"thzdrive/units"
)

// Propagate carries a waveform through the optical train into the sample.
func (s *Service) Propagate(ctx context.Context, req *thzdrivev1.PropagateRequest) (*thzdrivev1.PropagateResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.PropagateRequest)
	var v violations
	tr, _ := s.resolveWaveform(&v, "waveform", resolved.GetWaveform())
	if resolved.Target == nil {
		resolved.Target = &thzdrivev1.Target{}
	}
	train := s.resolveTrain(&v, resolved)
	padTo := s.resolvePad(&v, "pad_to_samples", &resolved.PadToSamples, tr.Len())
	if err := v.err(); err != nil {
		return nil, err
	}
	ev, err := optics.NewEvaluator(train)
	if err != nil {
		return nil, invalid("sample", err)
	}
	p, err := optics.Propagate(ev, tr, padTo)
	if err != nil {
		return nil, invalid("sample", err)
	}
	fieldScale := 1.0
	if tr.Absolute {
		fieldScale = 1 / units.KVPerCm
	}
	return &thzdrivev1.PropagateResponse{
		Transfer:                 transferToWire(p),
		FieldAtTarget:            traceToWire(p.Target),
		IncidentPeakFieldKvPerCm: p.IncidentPeakVPerM * fieldScale,
		TargetPeakFieldKvPerCm:   p.TargetPeakVPerM * fieldScale,
		AbsorbedFraction:         p.AbsorbedFraction,
		Cautions:                 cautionsToWire(p.Cautions, ""),
		Resolved:                 resolved,
	}, nil
}

// resolvePad fills the default padding (twice the trace, so that the delays
// of windows and the tail of the response do not wrap around) and checks it.
func (s *Service) resolvePad(v *violations, path string, pad *int32, samples int) int {
	if *pad == 0 && samples > 0 {
		n := 2 * samples
		if n > s.limits.MaxSamples {
			n = max(samples, s.limits.MaxSamples)
		}
		*pad = int32(n)
	}
	switch {
	case *pad < 0:
		v.add(path, "must be >= 0, got %d", *pad)
	case int(*pad) > s.limits.MaxSamples:
		v.add(path, "%d samples, over the limit of %d", *pad, s.limits.MaxSamples)
	}
	return int(*pad)
}

// resolveTrain validates the train, sample and target of a request that
// carries them (Propagate, DriveMode, PlanExperiment) and builds the physics
// train. Defaults are filled in place.
func (s *Service) resolveTrain(v *violations, m interface {
	GetTrain() []*thzdrivev1.TrainElement
	GetSample() *thzdrivev1.SampleStack
	GetTarget() *thzdrivev1.Target
}) optics.Train {
	var out optics.Train
	elements := m.GetTrain()
	sample := m.GetSample()
	if n := len(elements) + len(sample.GetLayers()); n > s.limits.MaxLayers {
		v.add("sample.layers", "%d layers and train elements, over the limit of %d", n, s.limits.MaxLayers)
		return out
	}
	for i, e := range elements {
		path := fmt.Sprintf("train[%d]", i)
		if el := resolveElement(v, path, e); el != nil {
			out.Elements = append(out.Elements, el)
		}
	}
	out.Sample = resolveSample(v, "sample", sample)
	out.Target = resolveTarget(v, "target", m.GetTarget(), sample)
	return out
}

func resolveElement(v *violations, path string, e *thzdrivev1.TrainElement) optics.Element {
	switch k := e.GetKind().(type) {
	case *thzdrivev1.TrainElement_Slab:
		med := resolveMedium(v, path+".slab.medium", k.Slab.GetMedium())
		v.positive(path+".slab.thickness_um", k.Slab.ThicknessUm)
		return optics.Slab{Name: elementName(e.Name, path), Medium: med, ThicknessM: k.Slab.ThicknessUm * units.Um, Incoherent: k.Slab.Incoherent}
	case *thzdrivev1.TrainElement_Attenuator:
		v.within(path+".attenuator.angle_deg", k.Attenuator.AngleDeg, 0, 90)
		return optics.Attenuator{Name: elementName(e.Name, path), AngleRad: k.Attenuator.AngleDeg * math.Pi / 180}
	case *thzdrivev1.TrainElement_FieldFactor:
		v.nonNegative(path+".field_factor.amplitude", k.FieldFactor.Amplitude)
		v.finite(path+".field_factor.phase_rad", k.FieldFactor.PhaseRad)
		return optics.FieldFactor{Name: elementName(e.Name, path), Factor: cmplx.Rect(k.FieldFactor.Amplitude, k.FieldFactor.PhaseRad)}
	case *thzdrivev1.TrainElement_Gap:
		v.nonNegative(path+".gap.length_mm", k.Gap.LengthMm)
		return optics.Gap{Name: elementName(e.Name, path), LengthM: k.Gap.LengthMm * units.Mm}
	default:
		v.add(path, "give the element's kind: slab, attenuator, field_factor or gap")
		return nil
	}
}

func elementName(name, path string) string {
	if name != "" {
		return name
	}
	return path
}

func resolveSample(v *violations, path string, st *thzdrivev1.SampleStack) optics.Stack {
	if st == nil {
		return optics.Stack{}
	}
	out := optics.Stack{Pol: optics.PolS}
	switch st.Polarization {
	case thzdrivev1.Polarization_POLARIZATION_UNSPECIFIED:
		st.Polarization = thzdrivev1.Polarization_POLARIZATION_S
	case thzdrivev1.Polarization_POLARIZATION_S:
	case thzdrivev1.Polarization_POLARIZATION_P:
		out.Pol = optics.PolP
	default:
		v.add(path+".polarization", "unknown polarization %d", st.Polarization)
	}
	if v.finite(path+".incidence_angle_deg", st.IncidenceAngleDeg) && (st.IncidenceAngleDeg < 0 || st.IncidenceAngleDeg >= 90) {
		v.add(path+".incidence_angle_deg", "must be in [0, 90), got %g", st.IncidenceAngleDeg)
	}
	out.AngleRad = st.IncidenceAngleDeg * math.Pi / 180
	for i, l := range st.Layers {
		p := fmt.Sprintf("%s.layers[%d]", path, i)
		med := resolveMedium(v, p+".medium", l.GetMedium())
		v.nonNegative(p+".thickness_um", l.ThicknessUm)
		out.Layers = append(out.Layers, optics.Layer{Name: elementName(l.Name, p), Medium: med, ThicknessM: l.ThicknessUm * units.Um, Incoherent: l.Incoherent})
	}
	if st.ExitMedium != nil {
		out.Exit = resolveMedium(v, path+".exit_medium", st.ExitMedium)
	}
	return out
}

func resolveTarget(v *violations, path string, t *thzdrivev1.Target, st *thzdrivev1.SampleStack) optics.Target {
	nLayers := len(st.GetLayers())
	var out optics.Target
	if t == nil {
		return defaultTarget(nLayers)
	}
	if t.Layer == nil {
		l := int32(0)
		if nLayers == 0 {
			l = -1
		}
		t.Layer = &l
	}
	layer := int(*t.Layer)
	switch {
	case layer == -1:
		out.Layer = optics.ExitMedium
	case layer < 0 || layer >= nLayers:
		v.add(path+".layer", "no layer %d: the sample has %d layers (use -1 for the exit medium)", layer, nLayers)
	default:
		out.Layer = layer
	}
	switch t.Placement {
	case thzdrivev1.TargetPlacement_TARGET_PLACEMENT_UNSPECIFIED:
		t.Placement = thzdrivev1.TargetPlacement_TARGET_PLACEMENT_FRONT_SURFACE
		out.Placement = optics.FrontSurface
	case thzdrivev1.TargetPlacement_TARGET_PLACEMENT_FRONT_SURFACE:
		out.Placement = optics.FrontSurface
	case thzdrivev1.TargetPlacement_TARGET_PLACEMENT_DEPTH:
		out.Placement = optics.AtDepth
		if v.nonNegative(path+".depth_um", t.DepthUm) && layer >= 0 && layer < nLayers && t.DepthUm > st.Layers[layer].ThicknessUm {
			v.add(path+".depth_um", "depth %g µm lies beyond layer %d, which is %g µm thick", t.DepthUm, layer, st.Layers[layer].ThicknessUm)
		}
		out.DepthM = t.DepthUm * units.Um
	case thzdrivev1.TargetPlacement_TARGET_PLACEMENT_LAYER_AVERAGE:
		out.Placement = optics.LayerAverage
		if layer == -1 {
			v.add(path+".placement", "the exit medium is semi-infinite: it has no layer average")
		}
	default:
		v.add(path+".placement", "unknown placement %d", t.Placement)
	}
	return out
}

func defaultTarget(nLayers int) optics.Target {
	if nLayers == 0 {
		return optics.Target{Layer: optics.ExitMedium, Placement: optics.FrontSurface}
	}
	return optics.Target{Layer: 0, Placement: optics.FrontSurface}
}

func resolveMedium(v *violations, path string, m *thzdrivev1.Medium) optics.Medium {
	switch k := m.GetKind().(type) {
	case *thzdrivev1.Medium_Material:
		mat, err := optics.Lookup(k.Material)
		if err != nil {
			v.add(path+".material", "%v", err)
			return nil
		}
		return mat
	case *thzdrivev1.Medium_Constant:
		okN := v.positive(path+".constant.n", k.Constant.N)
		okK := v.nonNegative(path+".constant.kappa", k.Constant.Kappa)
		if okN && okK {
			return optics.Constant{N: k.Constant.N, Kappa: k.Constant.Kappa}
		}
	case *thzdrivev1.Medium_Tabulated:
		t := k.Tabulated
		p := path + ".tabulated"
		if len(t.FrequencyThz) < 2 || len(t.N) != len(t.FrequencyThz) || len(t.Kappa) != len(t.FrequencyThz) {
			v.add(p, "needs at least 2 rows and equally many frequency_thz, n and kappa values (got %d, %d, %d)", len(t.FrequencyThz), len(t.N), len(t.Kappa))
			return nil
		}
		ok := v.allFinite(p+".frequency_thz", t.FrequencyThz) && v.allFinite(p+".n", t.N) && v.allFinite(p+".kappa", t.Kappa)
		if !ok {
			return nil
		}
		freqHz := make([]float64, len(t.FrequencyThz))
		for i, f := range t.FrequencyThz {
			if f <= 0 || (i > 0 && f <= t.FrequencyThz[i-1]) {
				v.add(fmt.Sprintf("%s.frequency_thz[%d]", p, i), "frequencies must be > 0 and strictly increasing, got %g", f)
				return nil
			}
			if t.N[i] <= 0 {
				v.add(fmt.Sprintf("%s.n[%d]", p, i), "must be > 0, got %g", t.N[i])
			}
			if t.Kappa[i] < 0 {
				v.add(fmt.Sprintf("%s.kappa[%d]", p, i), "must be >= 0 (a passive medium), got %g", t.Kappa[i])
			}
			freqHz[i] = f * units.THz
		}
		if !v.ok() {
			return nil
		}
		tab, err := optics.NewTabulated(freqHz, t.N, t.Kappa)
		if err != nil {
			v.add(p, "%v", err)
			return nil
		}
		return tab
	case *thzdrivev1.Medium_Dielectric:
		return resolveDielectric(v, path+".dielectric", k.Dielectric)
	default:
		v.add(path, "give the medium: material, constant, tabulated or dielectric")
	}
	return nil
}

// maxOscillators bounds the Lorentz terms of one dielectric model: every
// frequency of every call evaluates them all, and the reststrahlen search
// costs of the order of their square. Fits of real spectra need a handful.
const maxOscillators = 64

func resolveDielectric(v *violations, path string, d *thzdrivev1.DielectricModel) optics.Medium {
	out := optics.Dielectric{EpsInf: d.EpsInf, PlasmaHz: d.PlasmaFrequencyThz * units.THz, ScatteringHz: d.ScatteringRateThz * units.THz}
	v.positive(path+".eps_inf", d.EpsInf)
	if len(d.Oscillators) > maxOscillators {
		v.add(path+".oscillators", "%d oscillators, over the limit of %d per model", len(d.Oscillators), maxOscillators)
		return nil
	}
	for i, o := range d.Oscillators {
		p := fmt.Sprintf("%s.oscillators[%d]", path, i)
		v.positive(p+".frequency_thz", o.FrequencyThz)
		v.nonNegative(p+".linewidth_thz", o.LinewidthThz)
		v.nonNegative(p+".delta_eps", o.DeltaEps)
		out.Oscillators = append(out.Oscillators, optics.Oscillator{FreqHz: o.FrequencyThz * units.THz, WidthHz: o.LinewidthThz * units.THz, DeltaEps: o.DeltaEps})
	}
	if v.nonNegative(path+".plasma_frequency_thz", d.PlasmaFrequencyThz) && d.PlasmaFrequencyThz > 0 {
		v.positive(path+".scattering_rate_thz", d.ScatteringRateThz)
	}
	if !v.ok() {
		return nil
	}
	if err := out.Validate(); err != nil {
		v.add(path, "%v", err)
		return nil
	}
	// Every number of the model may be finite while its LO frequency is not
	// representable (a tiny eps_inf, a huge oscillator strength or plasma
	// frequency): the reststrahlen band that the RESTSTRAHLEN caution
	// reports would then end at +Inf or NaN. Refuse such a model here.
	for _, b := range out.ReststrahlenBands() {
		if math.IsNaN(b.LoHz) || math.IsInf(b.HiHz, 0) || math.IsNaN(b.HiHz) {
			v.add(path, "the LO frequency that ends the reststrahlen band above %g THz cannot be computed in double precision: eps_inf is too small, or an oscillator strength or the plasma frequency too large", b.LoHz/units.THz)
			return nil
		}
	}
	return out
}

func transferToWire(p optics.Propagation) *thzdrivev1.TransferFunction {
	n := len(p.FreqHz)
	out := &thzdrivev1.TransferFunction{
		FrequencyThz:     make([]float64, n),
		Amplitude:        make([]float64, n),
		PhaseRad:         make([]float64, n),
		AbsorbedFraction: make([]float64, n),
	}
	for k := range p.FreqHz {
		out.FrequencyThz[k] = p.FreqHz[k] / units.THz
		out.Amplitude[k] = cmplx.Abs(p.Transfer[k])
		out.PhaseRad[k] = cmplx.Phase(p.Transfer[k])
		out.AbsorbedFraction[k] = p.Absorbed[k]
	}
	return out
}

// ListMaterials returns the embedded catalogue, sorted by name as
// optics.proto promises (the catalogue itself keeps the file's order).
func (s *Service) ListMaterials(ctx context.Context, req *thzdrivev1.ListMaterialsRequest) (*thzdrivev1.ListMaterialsResponse, error) {
	out := &thzdrivev1.ListMaterialsResponse{}
	for _, m := range optics.Catalogue() {
		n := m.Index(units.THz)
		out.Materials = append(out.Materials, &thzdrivev1.Material{
			Name: m.Name, Description: m.Description, Source: m.Source, TemperatureK: m.TemperatureK,
			ValidFromThz: m.MinHz / units.THz, ValidToThz: finiteOr(m.MaxHz/units.THz, 0),
			NAt_1Thz: real(n), KappaAt_1Thz: imag(n),
		})
	}
	sort.Slice(out.Materials, func(i, j int) bool { return out.Materials[i].Name < out.Materials[j].Name })
	return out, nil
}

// finiteOr returns x, or alt when x is not finite (an unbounded range).
func finiteOr(x, alt float64) float64 {
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return alt
	}
	return x
}
