package server

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strings"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/tdsfit"
	"thzdrive/units"
)

// Bounds of the requests that package tdsfit answers, beyond the shared
// limits: each keeps one call's work and memory proportionate.
const (
	// maxThicknessUm is tdsfit.MaxThicknessM in µm.
	maxThicknessUm = tdsfit.MaxThicknessM / units.Um
	// maxMarginDB bounds a noise margin: 300 dB of amplitude is a ratio of
	// 1e15, about what the round-off of a float64 transform (1e-16 of the
	// peak) leaves as the widest possible dynamic range.
	maxMarginDB = 300
	// maxEchoCount bounds ECHO_MODEL_COUNT; a window that holds 10000 echoes
	// holds all that matter (use ECHO_MODEL_ALL).
	maxEchoCount = 10000
	// maxFitIterations bounds FitDielectricModelRequest.max_iterations (the
	// fit takes no deadline; a converging fit needs tens).
	maxFitIterations = 10000
	// maxFitOscillators bounds the oscillators of a fitted model.
	maxFitOscillators = 32
	// maxFitJacobian bounds residuals × parameters, the size of the fit's
	// Jacobian (8M doubles, 64 MB).
	maxFitJacobian = 1 << 23
)

// ExtractMedium returns the optical constants of a slab, or the sheet
// conductance of a film, from a reference and a sample trace.
func (s *Service) ExtractMedium(ctx context.Context, req *thzdrivev1.ExtractMediumRequest) (*thzdrivev1.ExtractMediumResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.ExtractMediumRequest)
	var v violations
	in := s.resolveExtraction(&v, "", resolved)
	if err := v.err(); err != nil {
		return nil, err
	}
	out, _, err := in.run("")
	if err != nil {
		return nil, err
	}
	out.Resolved = resolved
	return out, nil
}

// extraction is a validated ExtractMediumRequest in tdsfit's terms. prefix
// is the path of the request inside the message that carries it ("" or
// "extraction."), for the field paths of errors found while computing.
type extraction struct {
	prefix         string
	ref, sam       pulse.Trace
	to             tdsfit.TransmissionOptions
	slab           *tdsfit.ExtractOptions // nil for a film
	substrate      optics.Medium
	mismatchM      float64
	filmThicknessM float64
}

// resolveExtraction validates an ExtractMediumRequest, fills its defaults in
// place, and returns it in tdsfit's terms. Violations are recorded under
// prefix.
func (s *Service) resolveExtraction(v *violations, prefix string, r *thzdrivev1.ExtractMediumRequest) extraction {
	in := extraction{prefix: prefix}
	v = v.under(prefix)
	if r.Reference == nil {
		v.add("reference", "the reference trace is required (the pulse without the sample; for a film, through the bare substrate)")
	} else {
		in.ref = s.resolveTrace(v, "reference", r.Reference)
	}
	if r.Sample == nil {
		v.add("sample", "the sample trace is required")
	} else {
		in.sam = s.resolveTrace(v, "sample", r.Sample)
	}
	if r.Processing == nil {
		r.Processing = &thzdrivev1.Processing{}
	}
	in.to.Processing = s.resolveProcessing(v, "processing", r.Processing, false)
	if r.MarginDb == 0 {
		r.MarginDb = tdsfit.DefaultMarginDB
	}
	v.within("margin_db", r.MarginDb, 0, maxMarginDB)
	in.to.MarginDB = r.MarginDb
	// Both traces on one grid: the start may differ, not the step or the
	// number of samples.
	if in.ref.Len() > 0 && in.sam.Len() > 0 {
		stepField := "sample.step_fs"
		if len(r.Sample.TimePs) > 0 {
			stepField = "sample.time_ps"
		}
		if math.Abs(in.ref.StepS-in.sam.StepS) > tdsfit.StepRelTolerance*in.ref.StepS {
			v.add(stepField, "the sample step %.6g fs differs from the reference's %.6g fs: record both traces on the same grid", in.sam.StepS/units.Fs, in.ref.StepS/units.Fs)
		}
		if in.ref.Len() != in.sam.Len() {
			v.add("sample.field", "%d samples, the reference has %d: record both traces on the same grid", in.sam.Len(), in.ref.Len())
		}
	}
	switch sp := r.Specimen.(type) {
	case *thzdrivev1.ExtractMediumRequest_Slab:
		if sp.Slab == nil {
			sp.Slab = &thzdrivev1.SlabSpecimen{}
		}
		o := resolveSlabSpecimen(v, "slab", sp.Slab)
		in.slab = &o
	case *thzdrivev1.ExtractMediumRequest_Film:
		if sp.Film == nil {
			sp.Film = &thzdrivev1.FilmSpecimen{}
		}
		f := sp.Film
		if f.Substrate == nil {
			v.add("film.substrate", "the substrate is required (a catalogue material such as \"silicon-hr\", or an inline medium)")
		} else {
			in.substrate = resolveMedium(v, "film.substrate", f.Substrate)
		}
		v.within("film.substrate_mismatch_um", f.SubstrateMismatchUm, -maxThicknessUm, maxThicknessUm)
		v.within("film.film_thickness_um", f.FilmThicknessUm, 0, maxThicknessUm)
		in.mismatchM = f.SubstrateMismatchUm * units.Um
		in.filmThicknessM = f.FilmThicknessUm * units.Um
	default:
		v.add("specimen", "say what the sample is: slab (with its thickness_um) or film (with its substrate)")
	}
	return in
}

func resolveSlabSpecimen(v *violations, path string, sl *thzdrivev1.SlabSpecimen) tdsfit.ExtractOptions {
	var o tdsfit.ExtractOptions
	if v.positive(path+".thickness_um", sl.ThicknessUm) && sl.ThicknessUm > maxThicknessUm {
		v.add(path+".thickness_um", "must be at most %g µm (1 m), got %g", maxThicknessUm, sl.ThicknessUm)
	}
	o.ThicknessM = sl.ThicknessUm * units.Um
	switch sl.Echoes {
	case thzdrivev1.EchoModel_ECHO_MODEL_UNSPECIFIED:
		sl.Echoes = thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS
		o.Echoes = tdsfit.NoEchoes
	case thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS:
		o.Echoes = tdsfit.NoEchoes
	case thzdrivev1.EchoModel_ECHO_MODEL_ALL:
		o.Echoes = tdsfit.AllEchoes
	case thzdrivev1.EchoModel_ECHO_MODEL_COUNT:
		if sl.EchoCount < 1 || sl.EchoCount > maxEchoCount {
			v.add(path+".echo_count", "ECHO_MODEL_COUNT needs the number of echoes the window holds, 1 to %d, got %d", maxEchoCount, sl.EchoCount)
		}
		o.Echoes = tdsfit.Echoes(sl.EchoCount)
	default:
		v.add(path+".echoes", "unknown echo model %d", sl.Echoes)
	}
	if sl.Echoes != thzdrivev1.EchoModel_ECHO_MODEL_COUNT && sl.EchoCount != 0 {
		v.add(path+".echo_count", "is only for ECHO_MODEL_COUNT; got %d with %v", sl.EchoCount, sl.Echoes)
	}
	v.nonNegative(path+".max_index_std", sl.MaxIndexStd)
	o.MaxStdIndex = sl.MaxIndexStd
	return o
}

// run computes a validated extraction. stage tags its cautions. It returns
// the response (without resolved) and, for a slab, the extraction itself.
func (in extraction) run(stage string) (*thzdrivev1.ExtractMediumResponse, tdsfit.Extraction, error) {
	tr, err := tdsfit.NewTransmission(in.ref, in.sam, in.to)
	if err != nil {
		return nil, tdsfit.Extraction{}, in.fail(err)
	}
	out := &thzdrivev1.ExtractMediumResponse{
		UsableBand:          bandToWire(tr.Band),
		PhaseOffsetRad:      tr.PhaseOffsetRad,
		ReferencePeakTimePs: tr.ReferencePeakTimeS / units.Ps,
		SamplePeakTimePs:    tr.SamplePeakTimeS / units.Ps,
	}
	if in.slab == nil {
		sh, err := tdsfit.ExtractSheet(tr, in.substrate, in.mismatchM)
		if err != nil {
			return nil, tdsfit.Extraction{}, in.fail(err)
		}
		out.ReportedBand = bandToWire(sh.Band)
		transmissionToWire(out, tr, sh.Band)
		out.SheetConductance = sheetToWire(sh, in.filmThicknessM)
		out.Cautions = cautionsToWire(sh.Cautions, stage)
		return out, tdsfit.Extraction{}, in.finite(out)
	}
	ex, err := tdsfit.ExtractSlab(tr, *in.slab)
	if err != nil {
		return nil, tdsfit.Extraction{}, in.fail(err)
	}
	out.ReportedBand = bandToWire(ex.Band)
	out.UnconvergedBins = int32(ex.Unconverged)
	transmissionToWire(out, tr, ex.Band)
	out.OpticalConstants = constantsToWire(ex)
	out.Cautions = cautionsToWire(ex.Cautions, stage)
	return out, ex, in.finite(out)
}

// finite refuses a result that holds a number the wire cannot promise:
// input that is valid field by field can still make the extraction
// overflow (a sample trace 1e-100 of the reference, say).
func (in extraction) finite(out *thzdrivev1.ExtractMediumResponse) error {
	if allFinite(out.ProtoReflect()) {
		return nil
	}
	return invalid(in.prefix+"sample", errors.New("the traces give no finite optical constants: the sample spectrum is beyond the range of double precision relative to the reference"))
}

// extractFields maps the fields that tdsfit's errors name (tdsfit.InputError
// and the pulse.InputError it wraps) to the paths of ExtractMediumRequest.
var extractFields = map[string]string{
	"Reference":                    "reference",
	"Reference.Field":              "reference.field",
	"Reference.StepS":              "reference.step_fs",
	"Reference.StartS":             "reference.start_ps",
	"Sample":                       "sample",
	"Sample.Field":                 "sample.field",
	"Sample.StepS":                 "sample.step_fs",
	"Sample.StartS":                "sample.start_ps",
	"Processing.Baseline":          "processing.baseline",
	"Processing.Window":            "processing.window",
	"Processing.TukeyAlpha":        "processing.tukey_alpha",
	"Processing.PadToSamples":      "processing.pad_to_samples",
	"TransmissionOptions.MarginDB": "margin_db",
	"Transmission":                 "sample",
	"Transmission.Band":            "sample",
	"Transmission.StepHz":          "sample",
	"Transmission.WindowEndS":      "sample",
	"ExtractOptions":               "slab",
	"ExtractOptions.ThicknessM":    "slab.thickness_um",
	"ExtractOptions.Echoes":        "slab.echoes",
	"ExtractOptions.MaxStdIndex":   "slab.max_index_std",
	"ExtractOptions.MaxIterations": "slab",
	"substrate":                    "film.substrate",
	"mismatchM":                    "film.substrate_mismatch_um",
}

// fail turns an error of tdsfit into INVALID_ARGUMENT naming the field.
func (in extraction) fail(err error) error {
	p := wirePath(err, extractFields, "sample")
	if p == "slab" && in.slab != nil && in.slab.MaxStdIndex > 0 && errors.Is(err, tdsfit.ErrNoBand) {
		p = "slab.max_index_std" // no frequency meets the accuracy asked for
	}
	return invalid(in.prefix+p, reason(err))
}

// wirePath maps the field an *tdsfit.InputError names to a wire path through
// table: an exact match, or a match of the part before an index
// ("Sample.Field[12]" -> "sample.field[12]"). Anything else, and errors that
// are not InputErrors, name fallback.
func wirePath(err error, table map[string]string, fallback string) string {
	var ie *tdsfit.InputError
	if !errors.As(err, &ie) {
		return fallback
	}
	if p, ok := table[ie.Field]; ok {
		return p
	}
	if i := strings.IndexByte(ie.Field, '['); i > 0 {
		if p, ok := table[ie.Field[:i]]; ok {
			return p + ie.Field[i:]
		}
	}
	return fallback
}

// reason is what a person reads: the InputError's reason without the Go
// names of the package's own fields.
func reason(err error) error {
	var ie *tdsfit.InputError
	if errors.As(err, &ie) {
		return errors.New(ie.Reason)
	}
	return err
}

func bandToWire(b tdsfit.Band) *thzdrivev1.FrequencyBand {
	if b.Len() == 0 {
		return &thzdrivev1.FrequencyBand{}
	}
	return &thzdrivev1.FrequencyBand{LowThz: b.LoHz / units.THz, HighThz: b.HiHz / units.THz, Bins: int32(b.Len())}
}

// transmissionToWire fills the frequencies and the transmission over band.
func transmissionToWire(out *thzdrivev1.ExtractMediumResponse, tr tdsfit.Transmission, b tdsfit.Band) {
	n := b.Len()
	out.FrequencyThz = make([]float64, n)
	out.TransmissionAmplitude = make([]float64, n)
	out.TransmissionPhaseRad = make([]float64, n)
	out.LogTransmissionStd = make([]float64, n)
	for i := range n {
		k := b.Lo + i
		out.FrequencyThz[i] = tr.FreqHz[k] / units.THz
		out.TransmissionAmplitude[i] = cmplx.Abs(tr.T[k])
		out.TransmissionPhaseRad[i] = tr.PhaseRad[k]
		out.LogTransmissionStd[i] = tr.SigmaLog[k]
	}
}

func constantsToWire(ex tdsfit.Extraction) *thzdrivev1.OpticalConstants {
	n := len(ex.Index)
	eps, epsStd, alpha := ex.Epsilon(), ex.StdEpsilon(), ex.AbsorptionPerM()
	out := &thzdrivev1.OpticalConstants{
		N: make([]float64, n), Kappa: make([]float64, n), IndexStd: make([]float64, n),
		EpsReal: make([]float64, n), EpsImag: make([]float64, n), EpsStd: make([]float64, n),
		AbsorptionPerCm: make([]float64, n), AbsorptionStdPerCm: make([]float64, n),
		Iterations: make([]int32, n),
	}
	for i, z := range ex.Index {
		out.N[i], out.Kappa[i], out.IndexStd[i] = real(z), imag(z), ex.StdIndex[i]
		out.EpsReal[i], out.EpsImag[i], out.EpsStd[i] = real(eps[i]), imag(eps[i]), epsStd[i]
		// α = 2ωκ/c, so its noise is 2ω·σ_κ/c (the same map, linear in κ).
		out.AbsorptionPerCm[i] = alpha[i] * units.Cm
		out.AbsorptionStdPerCm[i] = 2 * (2 * math.Pi * ex.FreqHz[i]) * ex.StdIndex[i] / units.SpeedOfLight * units.Cm
		out.Iterations[i] = int32(ex.Iterations[i])
	}
	return out
}

func sheetToWire(sh tdsfit.Sheet, filmM float64) *thzdrivev1.SheetConductance {
	n := len(sh.ConductanceS)
	out := &thzdrivev1.SheetConductance{RealSiemens: make([]float64, n), ImagSiemens: make([]float64, n), StdSiemens: make([]float64, n)}
	for i, s := range sh.ConductanceS {
		out.RealSiemens[i], out.ImagSiemens[i], out.StdSiemens[i] = real(s), imag(s), sh.StdS[i]
	}
	if filmM > 0 {
		// σ = (σd)/d in S/m; S/cm = (S/m)·(m/cm).
		f := units.Cm / filmM
		out.ConductivityRealSiemensPerCm = make([]float64, n)
		out.ConductivityImagSiemensPerCm = make([]float64, n)
		out.ConductivityStdSiemensPerCm = make([]float64, n)
		for i, s := range sh.ConductanceS {
			out.ConductivityRealSiemensPerCm[i] = real(s) * f
			out.ConductivityImagSiemensPerCm[i] = imag(s) * f
			out.ConductivityStdSiemensPerCm[i] = sh.StdS[i] * f
		}
	}
	return out
}

// FitDielectricModel fits ε∞ + Lorentz oscillators (+ Drude) to a measured
// permittivity, given inline or extracted from two traces first.
func (s *Service) FitDielectricModel(ctx context.Context, req *thzdrivev1.FitDielectricModelRequest) (*thzdrivev1.FitDielectricModelResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.FitDielectricModelRequest)
	var v violations
	var data fitData
	var ext *extraction
	switch d := resolved.Data.(type) {
	case *thzdrivev1.FitDielectricModelRequest_Permittivity:
		if d.Permittivity == nil {
			d.Permittivity = &thzdrivev1.PermittivitySpectrum{}
		}
		data = s.resolvePermittivity(&v, "permittivity", d.Permittivity)
	case *thzdrivev1.FitDielectricModelRequest_Extraction:
		if d.Extraction == nil {
			d.Extraction = &thzdrivev1.ExtractMediumRequest{}
		}
		in := s.resolveExtraction(&v, "extraction.", d.Extraction)
		if d.Extraction.GetFilm() != nil {
			v.add("extraction.film", "a film gives a sheet conductance, not a permittivity to fit: extract it with ExtractMedium")
		}
		ext = &in
	default:
		v.add("data", "give the data: permittivity (eps(f) inline) or extraction (a reference and a sample trace of a slab)")
	}
	var initial optics.Dielectric
	if resolved.Initial == nil {
		v.add("initial", "the starting model is required: eps_inf, and one oscillator near each resonance of the data")
	} else {
		if n := len(resolved.Initial.Oscillators); n > maxFitOscillators {
			v.add("initial.oscillators", "%d oscillators, over the limit of %d", n, maxFitOscillators)
		} else if m, ok := resolveDielectric(&v, "initial", resolved.Initial).(optics.Dielectric); ok {
			initial = m
		}
	}
	v.nonNegative("min_frequency_thz", resolved.MinFrequencyThz)
	if v.nonNegative("max_frequency_thz", resolved.MaxFrequencyThz) && resolved.MaxFrequencyThz > 0 && resolved.MaxFrequencyThz < resolved.MinFrequencyThz {
		v.add("max_frequency_thz", "%g THz lies below min_frequency_thz %g THz", resolved.MaxFrequencyThz, resolved.MinFrequencyThz)
	}
	if resolved.MaxIterations == 0 {
		resolved.MaxIterations = tdsfit.DefaultFitIterations
	}
	if resolved.MaxIterations < 0 || resolved.MaxIterations > maxFitIterations {
		v.add("max_iterations", "must be in [0, %d], got %d", maxFitIterations, resolved.MaxIterations)
	}
	if err := v.err(); err != nil {
		return nil, err
	}

	out := &thzdrivev1.FitDielectricModelResponse{Resolved: resolved}
	if ext != nil {
		er, ex, err := ext.run("")
		if err != nil {
			return nil, err
		}
		out.Extraction = er
		out.Cautions = append(out.Cautions, cautionsToWire(ex.Cautions, "extraction")...)
		data = fitData{path: "extraction", freqHz: ex.FreqHz, eps: ex.Epsilon(), sigma: ex.StdEpsilon()}
	}
	data = data.within(resolved.MinFrequencyThz*units.THz, resolved.MaxFrequencyThz*units.THz)
	if len(data.freqHz) == 0 {
		return nil, invalid("min_frequency_thz", fmt.Errorf("no frequency of the data lies in [%g, %g] THz", resolved.MinFrequencyThz, resolved.MaxFrequencyThz))
	}
	nParams := 1 + 3*len(initial.Oscillators)
	if initial.PlasmaHz > 0 {
		nParams += 2
	}
	if work := 2 * len(data.freqHz) * nParams; work > maxFitJacobian {
		return nil, invalid(data.path, fmt.Errorf("%d frequencies with %d parameters make a Jacobian of %d entries, over the limit of %d: fit fewer frequencies (min_frequency_thz, max_frequency_thz) or fewer oscillators", len(data.freqHz), nParams, work, maxFitJacobian))
	}
	fit, err := tdsfit.FitDielectric(data.freqHz, data.eps, data.sigma, tdsfit.FitOptions{Initial: initial, MaxIterations: int(resolved.MaxIterations)})
	if err != nil {
		return nil, data.fail(err)
	}
	fitToWire(out, fit, data)
	out.Cautions = append(out.Cautions, cautionsToWire(fit.Cautions, "fit")...)
	if !allFinite(out.ProtoReflect()) {
		return nil, invalid("initial", errors.New("the fit gave no finite model: start closer to the data"))
	}
	return out, nil
}

// fitData are the points a fit sees; index maps each back to its place in
// the request's arrays (nil: the identity), for the field paths of errors.
type fitData struct {
	path   string // "permittivity" or "extraction"
	freqHz []float64
	eps    []complex128
	sigma  []float64 // nil: unit weights
	index  []int
}

func (s *Service) resolvePermittivity(v *violations, path string, p *thzdrivev1.PermittivitySpectrum) fitData {
	n := len(p.FrequencyThz)
	switch {
	case n == 0:
		v.add(path+".frequency_thz", "no data: give eps_real and eps_imag at each frequency")
		return fitData{}
	case n > s.limits.MaxSamples:
		v.add(path+".frequency_thz", "%d frequencies, over the limit of %d", n, s.limits.MaxSamples)
		return fitData{}
	}
	ok := true
	for _, c := range []struct {
		name string
		xs   []float64
	}{{"eps_real", p.EpsReal}, {"eps_imag", p.EpsImag}} {
		if len(c.xs) != n {
			v.add(path+"."+c.name, "has %d values for %d frequencies", len(c.xs), n)
			ok = false
		}
	}
	if len(p.EpsStd) != 0 && len(p.EpsStd) != n {
		v.add(path+".eps_std", "has %d values for %d frequencies (give one per frequency, or none)", len(p.EpsStd), n)
		ok = false
	}
	if !ok {
		return fitData{}
	}
	ok = v.allFinite(path+".frequency_thz", p.FrequencyThz)
	ok = v.allFinite(path+".eps_real", p.EpsReal) && ok
	ok = v.allFinite(path+".eps_imag", p.EpsImag) && ok
	ok = v.allFinite(path+".eps_std", p.EpsStd) && ok
	if !ok {
		return fitData{}
	}
	d := fitData{path: path, freqHz: make([]float64, n), eps: make([]complex128, n)}
	bad := 0
	for i, f := range p.FrequencyThz {
		if f <= 0 {
			if bad < maxReported {
				v.add(fmt.Sprintf("%s.frequency_thz[%d]", path, i), "must be > 0, got %g", f)
			}
			bad++
		}
		d.freqHz[i] = f * units.THz
		d.eps[i] = complex(p.EpsReal[i], p.EpsImag[i])
	}
	if len(p.EpsStd) > 0 {
		d.sigma = make([]float64, n)
		for i, x := range p.EpsStd {
			if x <= 0 {
				if bad < maxReported {
					v.add(fmt.Sprintf("%s.eps_std[%d]", path, i), "must be > 0, got %g", x)
				}
				bad++
			}
			d.sigma[i] = x
		}
	}
	if bad > maxReported {
		v.add(path, "%d more values out of range not listed", bad-maxReported)
	}
	return d
}

// within keeps the points with lo <= f <= hi (a bound of 0 is none).
func (d fitData) within(lo, hi float64) fitData {
	if lo == 0 && hi == 0 {
		return d
	}
	out := fitData{path: d.path}
	for i, f := range d.freqHz {
		if f < lo || (hi > 0 && f > hi) {
			continue
		}
		out.freqHz = append(out.freqHz, f)
		out.eps = append(out.eps, d.eps[i])
		if d.sigma != nil {
			out.sigma = append(out.sigma, d.sigma[i])
		}
		out.index = append(out.index, d.at(i))
	}
	return out
}

// at is the place of point i in the request's arrays.
func (d fitData) at(i int) int {
	if d.index == nil {
		return i
	}
	return d.index[i]
}

// fail maps an error of tdsfit.FitDielectric to a field path.
func (d fitData) fail(err error) error {
	var ie *tdsfit.InputError
	if !errors.As(err, &ie) {
		return invalid("initial", err)
	}
	field := ie.Field
	var name string
	var i int
	if j := strings.IndexByte(field, '['); j > 0 {
		name = field[:j]
		if _, e := fmt.Sscanf(field[j:], "[%d]", &i); e != nil {
			name = field
		}
	}
	path := "initial"
	switch {
	case field == "FitOptions.MaxIterations":
		path = "max_iterations"
	case field == "FitOptions.Initial", errors.Is(err, tdsfit.ErrNotDetermined) && field == "eps":
		// The data do not determine the model's parameters: its shape (two
		// oscillators where the data show one, say) is at fault.
		path = "initial"
	case d.path == "extraction":
		path = "extraction"
	case field == "freqHz" || field == "eps":
		path = d.path + ".frequency_thz"
	case name == "freqHz":
		path = fmt.Sprintf("%s.frequency_thz[%d]", d.path, d.at(i))
	case name == "eps":
		path = fmt.Sprintf("%s.eps_real[%d]", d.path, d.at(i))
	case name == "sigma":
		path = fmt.Sprintf("%s.eps_std[%d]", d.path, d.at(i))
	}
	if errors.Is(err, tdsfit.ErrNotDetermined) && path == "initial" {
		return invalid(path, fmt.Errorf("the data do not determine every parameter of this model (%v): drop an oscillator the data do not show, or start it where they show it", reason(err)))
	}
	return invalid(path, reason(err))
}

func dielectricToWire(d optics.Dielectric) *thzdrivev1.DielectricModel {
	out := &thzdrivev1.DielectricModel{EpsInf: d.EpsInf, PlasmaFrequencyThz: d.PlasmaHz / units.THz, ScatteringRateThz: d.ScatteringHz / units.THz}
	for _, o := range d.Oscillators {
		out.Oscillators = append(out.Oscillators, &thzdrivev1.LorentzOscillator{FrequencyThz: o.FreqHz / units.THz, LinewidthThz: o.WidthHz / units.THz, DeltaEps: o.DeltaEps})
	}
	return out
}

// fitParameterNames maps tdsfit's parameter names to the field paths of
// DielectricModel and the factor from SI to their unit.
func fitParameterNames(m optics.Dielectric) map[string]struct {
	path  string
	scale float64
} {
	type entry = struct {
		path  string
		scale float64
	}
	out := map[string]entry{
		"eps_inf":       {"eps_inf", 1},
		"plasma_hz":     {"plasma_frequency_thz", 1 / units.THz},
		"scattering_hz": {"scattering_rate_thz", 1 / units.THz},
	}
	for j := range m.Oscillators {
		out[fmt.Sprintf("osc[%d].freq_hz", j)] = entry{fmt.Sprintf("oscillators[%d].frequency_thz", j), 1 / units.THz}
		out[fmt.Sprintf("osc[%d].width_hz", j)] = entry{fmt.Sprintf("oscillators[%d].linewidth_thz", j), 1 / units.THz}
		out[fmt.Sprintf("osc[%d].delta_eps", j)] = entry{fmt.Sprintf("oscillators[%d].delta_eps", j), 1}
	}
	return out
}

func fitToWire(out *thzdrivev1.FitDielectricModelResponse, fit tdsfit.Fit, d fitData) {
	out.Model = dielectricToWire(fit.Model)
	out.ModelStd = dielectricToWire(fit.Std)
	names := fitParameterNames(fit.Model)
	np := len(fit.Params)
	for i, name := range fit.Names {
		e, ok := names[name]
		if !ok {
			e.path, e.scale = name, 1
		}
		out.Parameters = append(out.Parameters, &thzdrivev1.FittedParameter{
			Name: e.path, Value: fit.Params[i] * e.scale, Std: math.Sqrt(fit.Covariance[i][i]) * e.scale,
		})
	}
	out.Correlation = make([]float64, np*np)
	for i := range np {
		for j := range np {
			c := 0.0
			// (C_ij + C_ji)/2: the inverse of JᵀJ is symmetric up to round-off.
			if den := math.Sqrt(fit.Covariance[i][i] * fit.Covariance[j][j]); den > 0 {
				c = math.Max(-1, math.Min(1, (fit.Covariance[i][j]+fit.Covariance[j][i])/2/den))
			}
			if i == j {
				c = 1
			}
			out.Correlation[i*np+j] = c
		}
	}
	out.ChiSquare = fit.ChiSquare
	out.DegreesOfFreedom = int32(fit.DOF)
	out.ReducedChiSquare = fit.ReducedChiSquare
	out.Iterations = int32(fit.Iterations)
	n := len(d.freqHz)
	out.FrequencyThz = make([]float64, n)
	out.DataEpsReal = make([]float64, n)
	out.DataEpsImag = make([]float64, n)
	out.ModelEpsReal = make([]float64, n)
	out.ModelEpsImag = make([]float64, n)
	for i, f := range d.freqHz {
		out.FrequencyThz[i] = f / units.THz
		out.DataEpsReal[i], out.DataEpsImag[i] = real(d.eps[i]), imag(d.eps[i])
		e := fit.Model.Epsilon(f)
		out.ModelEpsReal[i], out.ModelEpsImag[i] = real(e), imag(e)
	}
	if d.sigma != nil {
		out.DataEpsStd = append([]float64(nil), d.sigma...)
	}
}

// CorrectDetector divides the electro-optic detector's response out of a
// measured trace.
func (s *Service) CorrectDetector(ctx context.Context, req *thzdrivev1.CorrectDetectorRequest) (*thzdrivev1.CorrectDetectorResponse, error) {
	resolved := proto.Clone(req).(*thzdrivev1.CorrectDetectorRequest)
	var v violations
	var tr pulse.Trace
	if resolved.Trace == nil {
		v.add("trace", "the measured trace is required")
	} else {
		tr = s.resolveTrace(&v, "trace", resolved.Trace)
	}
	var det tdsfit.Detector
	var crystal pulse.Crystal
	if resolved.Detector == nil {
		v.add("detector", "the detector is required: at least its thickness_um")
	} else {
		det, crystal = resolveDetector(&v, "detector", resolved.Detector)
	}
	var o tdsfit.DeconvolveOptions
	switch {
	case resolved.CalibrationNThz != nil:
		if v.nonNegative("calibration_n_thz", *resolved.CalibrationNThz) {
			o.CalibrationIndex = *resolved.CalibrationNThz
		}
	case resolved.Trace.GetFieldUnit() == thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM && resolved.Detector.GetCrystal() == thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM:
		v.add("calibration_n_thz", "a kV/cm trace from a custom crystal: give the THz index it was calibrated with (0 if it was not)")
	case resolved.Trace.GetFieldUnit() == thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM:
		n := crystal.NTHz
		resolved.CalibrationNThz = &n
		o.CalibrationIndex = n
	default:
		zero := 0.0
		resolved.CalibrationNThz = &zero
	}
	v.nonNegative("regularization", resolved.Regularization)
	o.LambdaReg = resolved.Regularization
	if resolved.TrustFraction == 0 {
		resolved.TrustFraction = tdsfit.DefaultTrustFraction
	}
	if v.finite("trust_fraction", resolved.TrustFraction) && (resolved.TrustFraction < 0 || resolved.TrustFraction >= 1) {
		v.add("trust_fraction", "must be in [0, 1), got %g", resolved.TrustFraction)
	}
	o.TrustFraction = resolved.TrustFraction
	if resolved.MarginDb == 0 {
		resolved.MarginDb = tdsfit.DefaultMarginDB
	}
	v.within("margin_db", resolved.MarginDb, 0, maxMarginDB)
	o.MarginDB = resolved.MarginDb
	o.PadToSamples = s.resolvePad(&v, "pad_to_samples", &resolved.PadToSamples, tr.Len())
	if err := v.err(); err != nil {
		return nil, err
	}
	dec, err := tdsfit.Deconvolve(tr, det, o)
	if err != nil {
		return nil, invalid(wirePath(err, detectorFields, "trace"), reason(err))
	}
	out := &thzdrivev1.CorrectDetectorResponse{
		CorrectedTrace:    traceToWire(dec.Field),
		FrequencyThz:      make([]float64, len(dec.FreqHz)),
		ResponseAmplitude: make([]float64, len(dec.FreqHz)),
		ResponsePhaseRad:  make([]float64, len(dec.FreqHz)),
		TrustBand:         bandToWire(dec.TrustBand),
		SignalBand:        bandToWire(dec.SignalBand),
		Regularization:    dec.LambdaReg,
		Cautions:          cautionsToWire(dec.Cautions, ""),
		Resolved:          resolved,
	}
	for k, f := range dec.FreqHz {
		out.FrequencyThz[k] = f / units.THz
		out.ResponseAmplitude[k] = cmplx.Abs(dec.Response[k])
		out.ResponsePhaseRad[k] = cmplx.Phase(dec.Response[k])
	}
	scale := 1.0
	if tr.Absolute {
		scale = 1 / units.KVPerCm
	}
	out.MeasuredPeakFieldKvPerCm = peakAbs(tr.Field) * scale
	out.CorrectedPeakFieldKvPerCm = peakAbs(dec.Field.Field) * scale
	if !allFinite(out.ProtoReflect()) {
		return nil, invalid("trace", errors.New("the correction gave no finite field: the trace is beyond the range of double precision once divided by the response (raise regularization)"))
	}
	return out, nil
}

func peakAbs(xs []float64) float64 {
	m := 0.0
	for _, x := range xs {
		m = math.Max(m, math.Abs(x))
	}
	return m
}

// detectorFields maps the fields that tdsfit.NewDetector, Detector.Validate
// and Deconvolve name to the paths of CorrectDetectorRequest.
var detectorFields = map[string]string{
	"Trace":                              "trace",
	"Trace.Field":                        "trace.field",
	"Trace.StepS":                        "trace.step_fs",
	"Trace.StartS":                       "trace.start_ps",
	"EOSetup":                            "detector",
	"EOSetup.Crystal.Name":               "detector.crystal",
	"groupIndex":                         "detector.probe_group_index",
	"Detector.Crystal":                   "detector.thz_medium",
	"Detector.ThicknessM":                "detector.thickness_um",
	"Detector.ProbeGroupIndex":           "detector.probe_group_index",
	"Detector.FaustHenryC":               "detector.faust_henry_coefficient",
	"DeconvolveOptions.PadToSamples":     "pad_to_samples",
	"DeconvolveOptions.LambdaReg":        "regularization",
	"DeconvolveOptions.TrustFraction":    "trust_fraction",
	"DeconvolveOptions.CalibrationIndex": "calibration_n_thz",
	"DeconvolveOptions.MarginDB":         "margin_db",
}

// resolveDetector validates an ElectroOpticDetector, fills its defaults in
// place (crystal, probe wavelength, group index, THz medium) and builds the
// tdsfit.Detector. It also returns the crystal's constants (zero for a
// custom crystal), whose n_THz a flat calibration used.
func resolveDetector(v *violations, path string, d *thzdrivev1.ElectroOpticDetector) (tdsfit.Detector, pulse.Crystal) {
	var crystal pulse.Crystal
	var material string
	custom := false
	switch d.Crystal {
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_UNSPECIFIED, thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE:
		d.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE
		crystal, material = pulse.ZnTe, "znte"
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP:
		crystal, material = pulse.GaP, "gap"
	case thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM:
		custom = true
	default:
		v.add(path+".crystal", "unknown crystal %d", d.Crystal)
	}
	if d.ProbeWavelengthNm == 0 {
		d.ProbeWavelengthNm = defaultProbeNm
	}
	v.positive(path+".probe_wavelength_nm", d.ProbeWavelengthNm)
	if v.positive(path+".thickness_um", d.ThicknessUm) && d.ThicknessUm > maxThicknessUm {
		v.add(path+".thickness_um", "must be at most %g µm (1 m), got %g", maxThicknessUm, d.ThicknessUm)
	}
	if d.ProbeGroupIndex != nil {
		v.positive(path+".probe_group_index", *d.ProbeGroupIndex)
	} else if custom {
		v.add(path+".probe_group_index", "a custom crystal needs the probe's group index in it")
	}
	var medium optics.Medium
	if d.ThzMedium != nil {
		medium = resolveMedium(v, path+".thz_medium", d.ThzMedium)
	} else if custom {
		v.add(path+".thz_medium", "a custom crystal needs its THz index: a dielectric model with its TO phonon, say")
	}
	if v.finite(path+".faust_henry_coefficient", d.FaustHenryCoefficient) && d.FaustHenryCoefficient <= -1 {
		v.add(path+".faust_henry_coefficient", "must be above -1, got %g", d.FaustHenryCoefficient)
	}
	if !v.ok() {
		return tdsfit.Detector{}, crystal
	}
	var det tdsfit.Detector
	if custom {
		det = tdsfit.Detector{Name: "custom", Crystal: medium, ThicknessM: d.ThicknessUm * units.Um, ProbeGroupIndex: *d.ProbeGroupIndex}
	} else {
		g := 0.0
		if d.ProbeGroupIndex != nil {
			g = *d.ProbeGroupIndex
		}
		var err error
		det, err = tdsfit.NewDetector(pulse.EOSetup{Crystal: crystal, ThicknessM: d.ThicknessUm * units.Um, ProbeWavelengthM: d.ProbeWavelengthNm * units.Nm}, g)
		if err != nil {
			v.add(prefixed(path, wirePath(err, detectorFields, "detector")), "%v", reason(err))
			return tdsfit.Detector{}, crystal
		}
		if medium != nil {
			det.Crystal = medium
		} else {
			d.ThzMedium = &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: material}}
		}
		ng := det.ProbeGroupIndex
		d.ProbeGroupIndex = &ng
	}
	det.FaustHenryC = d.FaustHenryCoefficient
	if err := det.Validate(); err != nil {
		v.add(prefixed(path, wirePath(err, detectorFields, "detector")), "%v", reason(err))
	}
	return det, crystal
}

// prefixed re-roots a path of CorrectDetectorRequest ("detector.x") at path.
func prefixed(path, p string) string {
	if rest, ok := strings.CutPrefix(p, "detector"); ok {
		return path + rest
	}
	return p
}
