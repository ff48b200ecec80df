package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"google.golang.org/protobuf/encoding/protojson"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/units"
)

// The commands that close the loop from measured traces back to the
// sample: extract (n, κ, ε, α of a slab, or the sheet conductance of a
// film), fit (a dielectric model to ε) and correct (the field behind an
// electro-optic detector's response).

// tdsHelp explains the measurement that extract and fit take apart.
const tdsHelp = `The two traces are a time-domain measurement: REF without the sample (for a
film: through the bare substrate), SAMPLE through it, recorded on the same
time grid. Each file has two columns, time in ps and field in any unit (only
the ratio of the spectra matters); '#' starts a comment. The ratio of their
spectra is the sample's transmission T(f), relative to the same thickness of
air; where both spectra stand 20 dB (--margin) above their noise floors, the
slab's complex index n + iκ is solved from T frequency by frequency, with the
echoes the window holds:

  --echoes first   the window ends before the slab's first echo, which
                   follows the pulse by 2nd/c (11.4 ps for 500 um of silicon)
  --echoes all     the window holds every echo (thin slabs, whose echoes
                   overlap the pulse)
  --echoes N       the pulse and its first N echoes

The thickness sets the scale of n: an error δd biases n by (n-1)δd/d.
`

// extractFlags are the flags of a measurement that extract and fit share.
type extractFlags struct {
	fs            *flag.FlagSet
	thickness     *quantity
	echoes        *string
	maxStd        *float64
	film          *bool
	substrate     *string
	mismatch      *quantity
	filmThickness *quantity
	margin        *float64
	window        *string
	tukey         *float64
	baseline      *string
	pad           *int
}

func addExtractFlags(fs *flag.FlagSet) *extractFlags {
	return &extractFlags{
		fs:            fs,
		thickness:     newQuantity(fs, "thickness", units.Length, "um", units.Um, "slab thickness, e.g. 500um or 0.5mm"),
		echoes:        fs.String("echoes", "first", "echoes the window holds: first (none), all, or a number N"),
		maxStd:        fs.Float64("max-index-std", 0, "report only frequencies where the noise of n and κ is at most this (0: all that converged)"),
		film:          fs.Bool("film", false, "the sample is a thin conducting film on a substrate (REF through the bare substrate): report its sheet conductance"),
		substrate:     fs.String("substrate", "", "with --film: the substrate, a catalogue material ('thzdrive materials') or a real index such as 3.42"),
		mismatch:      newQuantity(fs, "substrate-mismatch", units.Length, "um", units.Um, "with --film: substrate under the film minus the reference substrate"),
		filmThickness: newQuantity(fs, "film-thickness", units.Length, "um", units.Um, "with --film: film thickness, to report the conductivity σ = σd/d too"),
		margin:        fs.Float64("margin", 0, "dB by which both spectra must exceed their noise floors (default 20)"),
		window:        fs.String("window", "none", "window applied to both traces before the transform: none, hann, tukey or blackman"),
		tukey:         fs.Float64("tukey-alpha", 0, "taper fraction of the Tukey window, (0, 1] (default 0.2)"),
		baseline:      fs.String("baseline", "pre-pulse", "offset removal of both traces: none, pre-pulse or linear"),
		pad:           fs.Int("pad-to", 0, "zero-pad both traces to at least this many samples (keep 0 for fits: padding correlates the bins)"),
	}
}

// request builds the ExtractMediumRequest of two trace files.
func (f *extractFlags) request(refPath, samPath string) (*thzdrivev1.ExtractMediumRequest, error) {
	set := setFlags(f.fs)
	ref, err := readTraceFile(refPath, "arb")
	if err != nil {
		return nil, err
	}
	sam, err := readTraceFile(samPath, "arb")
	if err != nil {
		return nil, err
	}
	proc, err := processingFlags(*f.window, *f.baseline, *f.tukey, *f.pad)
	if err != nil {
		return nil, err
	}
	req := &thzdrivev1.ExtractMediumRequest{Reference: ref, Sample: sam, Processing: proc, MarginDb: *f.margin}
	if *f.film {
		if set["thickness"] || set["echoes"] || set["max-index-std"] {
			return nil, usagef("--thickness, --echoes and --max-index-std describe a slab; a film takes --substrate, --substrate-mismatch and --film-thickness")
		}
		if *f.substrate == "" {
			return nil, usagef("--film needs --substrate: a catalogue material such as silicon-hr, or a real index such as 3.42")
		}
		req.Specimen = &thzdrivev1.ExtractMediumRequest_Film{Film: &thzdrivev1.FilmSpecimen{
			Substrate: mediumArg(*f.substrate), SubstrateMismatchUm: f.mismatch.value, FilmThicknessUm: f.filmThickness.value}}
		return req, nil
	}
	if set["substrate"] || set["substrate-mismatch"] || set["film-thickness"] {
		return nil, usagef("--substrate, --substrate-mismatch and --film-thickness need --film")
	}
	if !f.thickness.set {
		return nil, usagef("give the slab's --thickness (e.g. 500um), or --film for a film on a substrate")
	}
	slab := &thzdrivev1.SlabSpecimen{ThicknessUm: f.thickness.value, MaxIndexStd: *f.maxStd}
	switch e := strings.ToLower(*f.echoes); e {
	case "first", "none", "0":
		slab.Echoes = thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS
	case "all":
		slab.Echoes = thzdrivev1.EchoModel_ECHO_MODEL_ALL
	default:
		n, err := strconv.Atoi(e)
		if err != nil || n < 1 {
			return nil, usagef("--echoes %q: use first, all, or the number of echoes the window holds", *f.echoes)
		}
		slab.Echoes, slab.EchoCount = thzdrivev1.EchoModel_ECHO_MODEL_COUNT, int32(n)
	}
	req.Specimen = &thzdrivev1.ExtractMediumRequest_Slab{Slab: slab}
	return req, nil
}

// processingFlags turns the processing flags into the wire message.
func processingFlags(window, baseline string, tukey float64, pad int) (*thzdrivev1.Processing, error) {
	p := &thzdrivev1.Processing{TukeyAlpha: tukey, PadToSamples: int32(pad)}
	windows := map[string]thzdrivev1.TimeWindow{"none": thzdrivev1.TimeWindow_TIME_WINDOW_NONE, "hann": thzdrivev1.TimeWindow_TIME_WINDOW_HANN, "tukey": thzdrivev1.TimeWindow_TIME_WINDOW_TUKEY, "blackman": thzdrivev1.TimeWindow_TIME_WINDOW_BLACKMAN}
	var ok bool
	if p.Window, ok = windows[window]; !ok {
		return nil, usagef("--window %q: use none, hann, tukey or blackman", window)
	}
	baselines := map[string]thzdrivev1.BaselineRemoval{"none": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_NONE, "pre-pulse": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_PRE_PULSE, "linear": thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_LINEAR}
	if p.Baseline, ok = baselines[baseline]; !ok {
		return nil, usagef("--baseline %q: use none, pre-pulse or linear", baseline)
	}
	return p, nil
}

// mediumArg is a catalogue material, or a constant real index when the
// argument is a number.
func mediumArg(s string) *thzdrivev1.Medium {
	if n, err := strconv.ParseFloat(s, 64); err == nil {
		return &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Constant{Constant: &thzdrivev1.ConstantIndex{N: n}}}
	}
	return &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: strings.ToLower(s)}}
}

func runExtract(a *app, args []string) error {
	fs := flag.NewFlagSet("extract", flag.ContinueOnError)
	ef := addExtractFlags(fs)
	csvPath := fs.String("csv", "", "write the spectra to FILE as CSV (frequency (THz), n, kappa, ..., Re eps, Im eps, eps std, alpha (1/cm), ...); '-' is standard output. 'thzdrive fit FILE' reads it back")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive extract REF SAMPLE --thickness D [flags]
       thzdrive extract REF SAMPLE --film --substrate MATERIAL [flags]

The sample's optical constants from a reference and a sample trace: the
refractive index n, the extinction coefficient κ, the permittivity ε = (n+iκ)²
and the power absorption coefficient α = 2ωκ/c of a slab, each with its noise,
over the band where the traces carry signal. For a thin conducting film on a
substrate (--film) the sheet conductance σd instead, by the Tinkham formula
t_film/t_substrate = (1 + n_s)/(1 + n_s + Z0·σd).

%s
Examples:
  thzdrive extract ref.txt si.txt --thickness 500um
  thzdrive extract ref.txt znte.txt --thickness 20um --echoes all --csv znte.csv
  thzdrive extract bare.txt film.txt --film --substrate silicon-hr --film-thickness 10nm

Flags:
`, tdsHelp)
		fs.PrintDefaults()
	}
	pos, err := a.parseFlags(fs, args)
	if err != nil {
		return err
	}
	if len(pos) != 2 {
		return usagef("extract takes two trace files, REF and SAMPLE, got %d arguments (see 'thzdrive help extract')", len(pos))
	}
	req, err := ef.request(pos[0], pos[1])
	if err != nil {
		return err
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.ExtractMedium(ctx, req)
	if err != nil {
		return err
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	if *csvPath != "" {
		if err := a.writeExtractionCSV(*csvPath, resp); err != nil {
			return err
		}
	}
	r := &report{title: "thzdrive: optical constants from two traces", cautions: resp.Cautions}
	extractionSections(r, resp, pos[0], pos[1])
	r.print(a.reportWriter(*csvPath))
	return nil
}

// bandText is a band as "0.25 – 3.25 THz (49 frequencies)".
func bandText(b *thzdrivev1.FrequencyBand) string {
	if b.GetBins() == 0 {
		return "empty"
	}
	return fmt.Sprintf("%s – %s THz (%d frequencies)", num(b.LowThz), num(b.HighThz), b.Bins)
}

// sampleIndices picks up to five frequencies spread over the band.
func sampleIndices(n int) []int {
	if n <= 5 {
		out := make([]int, n)
		for i := range out {
			out[i] = i
		}
		return out
	}
	return []int{0, n / 4, n / 2, 3 * n / 4, n - 1}
}

// weightedMean is the noise-weighted mean Σx/σ² / Σ1/σ² and its standard
// error 1/sqrt(Σ1/σ²) (equal weights where a σ is 0).
func weightedMean(x, sd []float64) (mean, se float64) {
	var sw, swx float64
	for i, v := range x {
		w := 1.0
		if i < len(sd) && sd[i] > 0 {
			w = 1 / (sd[i] * sd[i])
		}
		sw += w
		swx += w * v
	}
	if sw == 0 {
		return 0, 0
	}
	return swx / sw, 1 / math.Sqrt(sw)
}

func minMax(x []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range x {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return lo, hi
}

// pm prints x ± sd with the digits the uncertainty supports (two
// significant digits of sd).
func pm(x, sd float64) string {
	if !(sd > 0) || math.IsInf(sd, 0) {
		return num(x)
	}
	d := max(0, 1-int(math.Floor(math.Log10(sd))))
	return fmt.Sprintf("%.*f ± %.*f", d, x, d, sd)
}

func extractionSections(r *report, resp *thzdrivev1.ExtractMediumResponse, refPath, samPath string) {
	s := r.section("Measurement")
	s.text("reference trace", refPath)
	s.text("sample trace", samPath)
	s.text("usable band", bandText(resp.UsableBand))
	s.text("reported band", bandText(resp.ReportedBand))
	if resp.UnconvergedBins > 0 {
		s.add("frequencies not extracted", float64(resp.UnconvergedBins), "")
	}
	if oc := resp.OpticalConstants; oc != nil {
		slab := resp.Resolved.GetSlab()
		s = r.section("Slab")
		s.add("thickness", slab.GetThicknessUm(), "um")
		echo := map[thzdrivev1.EchoModel]string{thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS: "first pass only", thzdrivev1.EchoModel_ECHO_MODEL_ALL: "all echoes",
			thzdrivev1.EchoModel_ECHO_MODEL_COUNT: fmt.Sprintf("pulse and %d echoes", slab.GetEchoCount())}[slab.GetEchoes()]
		s.text("model", echo)
		s = r.section("Optical constants")
		if len(oc.N) == 0 {
			return
		}
		n, nse := weightedMean(oc.N, oc.IndexStd)
		k, kse := weightedMean(oc.Kappa, oc.IndexStd)
		lo, hi := minMax(oc.N)
		s.text("n, noise-weighted mean over the band", pm(n, nse))
		s.text("n, lowest – highest", fmt.Sprintf("%.5g – %.5g", lo, hi))
		s.text("κ, noise-weighted mean over the band", pm(k, kse))
		for _, i := range sampleIndices(len(oc.N)) {
			s.text(fmt.Sprintf("at %.3f THz", resp.FrequencyThz[i]), fmt.Sprintf("n %s   κ %s   α %s 1/cm", pm(oc.N[i], oc.IndexStd[i]), pm(oc.Kappa[i], oc.IndexStd[i]), pm(oc.AbsorptionPerCm[i], oc.AbsorptionStdPerCm[i])))
		}
	}
	if sc := resp.SheetConductance; sc != nil {
		film := resp.Resolved.GetFilm()
		s = r.section("Film")
		s.text("substrate", describeMedium(film.GetSubstrate()))
		if film.GetSubstrateMismatchUm() != 0 {
			s.add("substrate mismatch", film.GetSubstrateMismatchUm(), "um")
		}
		if film.GetFilmThicknessUm() > 0 {
			s.add("film thickness", film.GetFilmThicknessUm(), "um")
		}
		s = r.section("Sheet conductance σd (siemens)")
		for _, i := range sampleIndices(len(sc.RealSiemens)) {
			v := fmt.Sprintf("Re %s   Im %s   Z0·|σd| %.4g", pm(sc.RealSiemens[i], sc.StdSiemens[i]), pm(sc.ImagSiemens[i], sc.StdSiemens[i]),
				units.VacuumImpedance*math.Hypot(sc.RealSiemens[i], sc.ImagSiemens[i]))
			s.text(fmt.Sprintf("at %.3f THz", resp.FrequencyThz[i]), v)
		}
		if len(sc.ConductivityRealSiemensPerCm) > 0 {
			s = r.section("Conductivity σ = σd/d (S/cm)")
			for _, i := range sampleIndices(len(sc.RealSiemens)) {
				s.text(fmt.Sprintf("at %.3f THz", resp.FrequencyThz[i]), fmt.Sprintf("Re %s   Im %s",
					pm(sc.ConductivityRealSiemensPerCm[i], sc.ConductivityStdSiemensPerCm[i]), pm(sc.ConductivityImagSiemensPerCm[i], sc.ConductivityStdSiemensPerCm[i])))
			}
		}
	}
}

func (a *app) writeExtractionCSV(path string, resp *thzdrivev1.ExtractMediumResponse) error {
	if oc := resp.OpticalConstants; oc != nil {
		return a.writeColumns(path,
			[]string{"frequency (THz)", "n", "kappa", "n and kappa std", "Re eps", "Im eps", "eps std", "alpha (1/cm)", "alpha std (1/cm)", "|T|", "arg T (rad)"},
			[][]float64{resp.FrequencyThz, oc.N, oc.Kappa, oc.IndexStd, oc.EpsReal, oc.EpsImag, oc.EpsStd, oc.AbsorptionPerCm, oc.AbsorptionStdPerCm, resp.TransmissionAmplitude, resp.TransmissionPhaseRad})
	}
	sc := resp.SheetConductance
	header := []string{"frequency (THz)", "|T|", "arg T (rad)", "Re sigma*d (S)", "Im sigma*d (S)", "sigma*d std (S)"}
	cols := [][]float64{resp.FrequencyThz, resp.TransmissionAmplitude, resp.TransmissionPhaseRad, sc.GetRealSiemens(), sc.GetImagSiemens(), sc.GetStdSiemens()}
	if len(sc.GetConductivityRealSiemensPerCm()) > 0 {
		header = append(header, "Re sigma (S/cm)", "Im sigma (S/cm)", "sigma std (S/cm)")
		cols = append(cols, sc.ConductivityRealSiemensPerCm, sc.ConductivityImagSiemensPerCm, sc.ConductivityStdSiemensPerCm)
	}
	return a.writeColumns(path, header, cols)
}

// oscillatorFlags is a repeatable --oscillator FREQUENCY:LINEWIDTH:STRENGTH.
type oscillatorFlags []*thzdrivev1.LorentzOscillator

func (o *oscillatorFlags) String() string { return "" }

func (o *oscillatorFlags) Set(s string) error {
	parts := strings.Split(s, ":")
	if len(parts) != 3 {
		return fmt.Errorf("%q: want FREQUENCY:LINEWIDTH:STRENGTH, e.g. 5.3THz:0.1THz:2.5", s)
	}
	f, err := frequencyTHz(parts[0])
	if err != nil {
		return err
	}
	w, err := frequencyTHz(parts[1])
	if err != nil {
		return err
	}
	d, err := strconv.ParseFloat(strings.TrimSpace(parts[2]), 64)
	if err != nil {
		return fmt.Errorf("%q: the strength Δε is a number", parts[2])
	}
	*o = append(*o, &thzdrivev1.LorentzOscillator{FrequencyThz: f, LinewidthThz: w, DeltaEps: d})
	return nil
}

// frequencyTHz reads a frequency with its unit (THz when bare).
func frequencyTHz(s string) (float64, error) {
	q := &quantity{kind: units.Frequency, wireUnit: "THz", wireSI: units.THz}
	if err := q.Set(strings.TrimSpace(s)); err != nil {
		return 0, err
	}
	return q.value, nil
}

// drudeFlag is --drude PLASMA:SCATTERING.
type drudeFlag struct {
	set                 bool
	plasmaTHz, gammaTHz float64
}

func (d *drudeFlag) String() string { return "" }

func (d *drudeFlag) Set(s string) error {
	parts := strings.Split(s, ":")
	if len(parts) != 2 {
		return fmt.Errorf("%q: want PLASMA:SCATTERING, e.g. 20THz:2THz", s)
	}
	var err error
	if d.plasmaTHz, err = frequencyTHz(parts[0]); err != nil {
		return err
	}
	if d.gammaTHz, err = frequencyTHz(parts[1]); err != nil {
		return err
	}
	d.set = true
	return nil
}

func runFit(a *app, args []string) error {
	fs := flag.NewFlagSet("fit", flag.ContinueOnError)
	ef := addExtractFlags(fs)
	epsInf := fs.Float64("eps-inf", 0, "start value of ε∞, the permittivity above the resonances (required)")
	var oscs oscillatorFlags
	fs.Var(&oscs, "oscillator", "a Lorentz oscillator's start values FREQUENCY:LINEWIDTH:STRENGTH, e.g. 5.3THz:0.1THz:2.5 (repeatable; units THz, GHz, cm-1, meV)")
	var drude drudeFlag
	fs.Var(&drude, "drude", "a Drude term's start values PLASMA:SCATTERING (frequencies over 2π), e.g. 20THz:2THz")
	from := newQuantity(fs, "fit-from", units.Frequency, "THz", units.THz, "fit only frequencies at or above this")
	to := newQuantity(fs, "fit-to", units.Frequency, "THz", units.THz, "fit only frequencies at or below this")
	maxIter := fs.Int("max-iterations", 0, "bound on the iterations (default 200)")
	csvPath := fs.String("csv", "", "write data and model to FILE as CSV: frequency (THz), Re eps, Im eps, eps std, model Re eps, model Im eps; '-' is standard output")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive fit REF SAMPLE --thickness D --eps-inf E [--oscillator F:W:S ...] [flags]
       thzdrive fit EPS.csv --eps-inf E [--oscillator F:W:S ...] [flags]

Fits the dielectric model
  ε(ω) = ε∞ + Σ Δε·Ω²/(Ω² - ω² - iγω) - ωp²/(ω² + iΓω)
to the sample's permittivity by least squares (Levenberg-Marquardt), each
frequency weighted by its noise, and reports every parameter with its
one-sigma uncertainty. The fitted oscillator is the phonon a pump drives: the
model is printed ready to paste into a scenario as a medium (a layer, or
sample.exit_medium), where 'drive' and 'plan' use its oscillators.

The permittivity comes from two traces (extracted as by 'thzdrive extract',
same flags) or from a CSV file: columns frequency (THz), Re eps, Im eps and
optionally eps std, by header name (as 'thzdrive extract --csv' writes) or,
without a header, in that order.

The flags give the model's shape and starting point: one --oscillator near
each resonance the data show (a peak of Im ε of height h and width w at f has
Δε ≈ h·w/f), --drude for free carriers, --eps-inf always. A transmission
measurement stops short of a strong phonon, where the slab turns opaque: the
fit then places it from the dispersion below it.

%s
Examples:
  thzdrive fit ref.txt znte.txt --thickness 20um --echoes all --eps-inf 7 --oscillator 5.1THz:50GHz:2
  thzdrive extract ref.txt znte.txt --thickness 20um --echoes all --csv eps.csv
  thzdrive fit eps.csv --eps-inf 7 --oscillator 170cm-1:2cm-1:2 --fit-from 0.3THz

Flags:
`, tdsHelp)
		fs.PrintDefaults()
	}
	pos, err := a.parseFlags(fs, args)
	if err != nil {
		return err
	}
	if !setFlags(fs)["eps-inf"] {
		return usagef("give the start value --eps-inf (and an --oscillator near each resonance); see 'thzdrive help fit'")
	}
	req := &thzdrivev1.FitDielectricModelRequest{
		Initial:         &thzdrivev1.DielectricModel{EpsInf: *epsInf, Oscillators: oscs},
		MinFrequencyThz: from.value, MaxFrequencyThz: to.value, MaxIterations: int32(*maxIter),
	}
	if drude.set {
		req.Initial.PlasmaFrequencyThz, req.Initial.ScatteringRateThz = drude.plasmaTHz, drude.gammaTHz
	}
	source := ""
	switch len(pos) {
	case 1:
		eps, err := readPermittivityFile(pos[0])
		if err != nil {
			return err
		}
		req.Data = &thzdrivev1.FitDielectricModelRequest_Permittivity{Permittivity: eps}
		source = pos[0]
	case 2:
		ex, err := ef.request(pos[0], pos[1])
		if err != nil {
			return err
		}
		req.Data = &thzdrivev1.FitDielectricModelRequest_Extraction{Extraction: ex}
		source = pos[0] + " and " + pos[1]
	default:
		return usagef("fit takes two trace files (REF SAMPLE) or one permittivity CSV, got %d arguments (see 'thzdrive help fit')", len(pos))
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.FitDielectricModel(ctx, req)
	if err != nil {
		return err
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	if *csvPath != "" {
		if err := a.writeColumns(*csvPath, []string{"frequency (THz)", "Re eps", "Im eps", "eps std", "model Re eps", "model Im eps"},
			[][]float64{resp.FrequencyThz, resp.DataEpsReal, resp.DataEpsImag, resp.DataEpsStd, resp.ModelEpsReal, resp.ModelEpsImag}); err != nil {
			return err
		}
	}
	r := &report{title: "thzdrive: dielectric model fitted to the permittivity", cautions: resp.Cautions}
	if ex := resp.Extraction; ex != nil {
		s := r.section("Extraction")
		s.text("reported band", bandText(ex.ReportedBand))
	}
	s := r.section("Data")
	s.text("from", source)
	if n := len(resp.FrequencyThz); n > 0 {
		s.text("frequencies fitted", fmt.Sprintf("%d, %s – %s THz", n, num(resp.FrequencyThz[0]), num(resp.FrequencyThz[n-1])))
	}
	if len(resp.DataEpsStd) > 0 {
		s.text("weights", "the noise of each point")
	} else {
		s.text("weights", "equal (no noise given): uncertainties from the scatter")
	}
	s = r.section("Fitted model (value ± one sigma)")
	for _, p := range resp.Parameters {
		label, unit := parameterLabel(p.Name)
		s.text(label, strings.TrimSpace(pm(p.Value, p.Std)+" "+unit))
	}
	s = r.section("Fit quality")
	s.add("reduced chi-square", resp.ReducedChiSquare, "")
	s.add("degrees of freedom", float64(resp.DegreesOfFreedom), "")
	s.add("iterations", float64(resp.Iterations), "")
	if strongest := maxCorrelation(resp); strongest != "" {
		s.text("strongest correlation", strongest)
	}
	raw, err := protojson.Marshal(&thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Dielectric{Dielectric: resp.Model}})
	if err != nil {
		return err
	}
	// protojson varies its spacing on purpose; print it compact and stable.
	var medium bytes.Buffer
	if err := json.Compact(&medium, raw); err != nil {
		return err
	}
	s = r.section("As a medium (paste into a scenario: sample.exit_medium or a layer's medium)")
	s.text("medium", medium.String())
	r.print(a.reportWriter(*csvPath))
	return nil
}

// parameterLabel names a fitted parameter for a person, with its unit.
func parameterLabel(path string) (label, unit string) {
	switch path {
	case "eps_inf":
		return "ε∞", ""
	case "plasma_frequency_thz":
		return "Drude plasma frequency ωp/2π", "THz"
	case "scattering_rate_thz":
		return "Drude scattering rate Γ/2π", "THz"
	}
	var j int
	var field string
	if _, err := fmt.Sscanf(strings.Replace(path, "].", "] ", 1), "oscillators[%d] %s", &j, &field); err == nil {
		switch field {
		case "frequency_thz":
			return fmt.Sprintf("oscillator %d: TO frequency", j+1), "THz"
		case "linewidth_thz":
			return fmt.Sprintf("oscillator %d: linewidth γ/2π", j+1), "THz"
		case "delta_eps":
			return fmt.Sprintf("oscillator %d: strength Δε", j+1), ""
		}
	}
	return path, ""
}

// maxCorrelation names the most correlated pair of parameters.
func maxCorrelation(resp *thzdrivev1.FitDielectricModelResponse) string {
	n := len(resp.Parameters)
	if len(resp.Correlation) != n*n {
		return ""
	}
	best, bi, bj := 0.0, -1, -1
	for i := range n {
		for j := i + 1; j < n; j++ {
			if c := resp.Correlation[i*n+j]; math.Abs(c) > math.Abs(best) {
				best, bi, bj = c, i, j
			}
		}
	}
	if bi < 0 {
		return ""
	}
	li, _ := parameterLabel(resp.Parameters[bi].Name)
	lj, _ := parameterLabel(resp.Parameters[bj].Name)
	return fmt.Sprintf("%+.3f between %s and %s", best, li, lj)
}

// readPermittivityFile reads ε(f) from a CSV (or whitespace-separated)
// file: columns by header name (frequency (THz), Re eps, Im eps, eps std),
// or, without a header, frequency in THz, Re ε, Im ε[, its noise].
func readPermittivityFile(path string) (*thzdrivev1.PermittivitySpectrum, error) {
	var in io.Reader = os.Stdin
	if path != "-" {
		f, err := os.Open(path)
		if err != nil {
			return nil, usagef("%v", err)
		}
		defer f.Close()
		in = f
	}
	p, err := parsePermittivity(in)
	if err != nil {
		return nil, usagef("%s: %v", path, err)
	}
	return p, nil
}

func parsePermittivity(r io.Reader) (*thzdrivev1.PermittivitySpectrum, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 1<<16), 1<<24)
	col := map[string]int{"f": 0, "re": 1, "im": 2, "std": 3}
	fScale := 1.0 // frequency column unit in THz
	headerSeen, stdCol := false, true
	p := &thzdrivev1.PermittivitySpectrum{}
	line := 0
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") || strings.HasPrefix(text, "%") || strings.HasPrefix(text, "//") {
			continue
		}
		cells := strings.FieldsFunc(text, func(r rune) bool { return r == ',' || r == ';' || r == '\t' })
		if len(cells) < 3 {
			cells = strings.Fields(text)
		}
		if _, err := strconv.ParseFloat(strings.TrimSpace(cells[0]), 64); err != nil {
			if headerSeen || len(p.FrequencyThz) > 0 {
				return nil, fmt.Errorf("line %d: not numbers: %q", line, text)
			}
			headerSeen = true
			col = map[string]int{}
			for i, c := range cells {
				name, unit := headerCell(c)
				switch name {
				case "frequency", "freq", "f":
					col["f"] = i
					if unit != "" {
						v, err := units.Parse("1 "+unit, units.Frequency, "THz")
						if err != nil {
							return nil, fmt.Errorf("line %d: frequency column: %v", line, err)
						}
						fScale = v / units.THz
					}
				case "reeps", "epsreal", "eps1", "eps'":
					col["re"] = i
				case "imeps", "epsimag", "eps2", "eps''":
					col["im"] = i
				case "epsstd", "stdeps", "sigmaeps":
					col["std"] = i
				}
			}
			for _, k := range []string{"f", "re", "im"} {
				if _, ok := col[k]; !ok {
					return nil, fmt.Errorf("line %d: the header names no %s column (want frequency (THz), Re eps, Im eps and optionally eps std)", line, map[string]string{"f": "frequency", "re": "Re eps", "im": "Im eps"}[k])
				}
			}
			_, stdCol = col["std"]
			continue
		}
		get := func(k string) (float64, error) {
			i := col[k]
			if i >= len(cells) {
				return 0, fmt.Errorf("line %d: no column %d in %q (want frequency (THz), Re eps, Im eps and optionally eps std)", line, i+1, text)
			}
			x, err := strconv.ParseFloat(strings.TrimSpace(cells[i]), 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return 0, fmt.Errorf("line %d: %q is not a finite number", line, cells[i])
			}
			return x, nil
		}
		f, err := get("f")
		if err != nil {
			return nil, err
		}
		re, err := get("re")
		if err != nil {
			return nil, err
		}
		im, err := get("im")
		if err != nil {
			return nil, err
		}
		p.FrequencyThz = append(p.FrequencyThz, f*fScale)
		p.EpsReal = append(p.EpsReal, re)
		p.EpsImag = append(p.EpsImag, im)
		if stdCol && col["std"] < len(cells) {
			sd, err := get("std")
			if err != nil {
				return nil, err
			}
			p.EpsStd = append(p.EpsStd, sd)
		}
	}
	if err := sc.Err(); err != nil {
		return nil, err
	}
	if len(p.FrequencyThz) == 0 {
		return nil, fmt.Errorf("no data found")
	}
	if len(p.EpsStd) != 0 && len(p.EpsStd) != len(p.FrequencyThz) {
		return nil, fmt.Errorf("the noise column has %d values for %d frequencies", len(p.EpsStd), len(p.FrequencyThz))
	}
	return p, nil
}

// headerCell splits "Re eps" or "frequency (THz)" into a key without case,
// spaces or underscores ("reeps", "frequency") and the unit in parentheses.
func headerCell(c string) (name, unit string) {
	c = strings.TrimSpace(strings.Trim(strings.TrimSpace(c), `"`))
	if i := strings.IndexByte(c, '('); i >= 0 {
		if j := strings.IndexByte(c[i:], ')'); j > 0 {
			unit = strings.TrimSpace(c[i+1 : i+j])
		}
		c = c[:i]
	}
	c = strings.ToLower(c)
	c = strings.NewReplacer(" ", "", "_", "", "ε", "eps").Replace(c)
	return c, unit
}

func runCorrect(a *app, args []string) error {
	fs := flag.NewFlagSet("correct", flag.ContinueOnError)
	crystal := fs.String("crystal", "znte", "detector crystal: znte, gap or custom")
	thickness := newQuantity(fs, "crystal-thickness", units.Length, "um", units.Um, "detector crystal thickness, e.g. 1mm (required)")
	probe := newQuantity(fs, "probe-wavelength", units.Length, "nm", units.Nm, "probe wavelength (default 800 nm)")
	groupIndex := fs.Float64("group-index", 0, "probe group index in the crystal (default ZnTe 3.13, GaP 3.56 at 800 nm; required at other wavelengths)")
	medium := fs.String("crystal-medium", "", "the crystal's THz index: a catalogue material or a real index (default the catalogue's znte or gap; required for custom)")
	faustHenry := fs.Float64("faust-henry", 0, "Faust-Henry coefficient of r41's dispersion (0: constant r41; ZnTe about -0.07, GaP about -0.53)")
	traceUnit := fs.String("trace-unit", "arb", "field unit of the trace file: arb (the raw signal) or kV/cm (calibrated with a flat response by 'thzdrive calibrate')")
	calN := fs.Float64("calibration-n-thz", 0, "the THz index a kV/cm trace was calibrated with (default the crystal's, as 'thzdrive calibrate' uses; 0: none)")
	reg := fs.Float64("regularization", 0, "regularisation λ of the inverse, in units of |G|^2 (0: from the trace's noise)")
	trust := fs.Float64("trust-fraction", 0, "trust the correction where |G| >= this fraction of max |G| (default 0.1)")
	margin := fs.Float64("margin", 0, "dB above the noise floor that marks signal (default 20)")
	pad := fs.Int("pad-to", 0, "zero-pad the trace to at least this many samples (default twice its length)")
	csvPath := fs.String("csv", "", "write the traces to FILE as CSV: time (ps), measured, corrected field; '-' is standard output")
	responsePath := fs.String("response-csv", "", "write the detector response to FILE as CSV: frequency (THz), |G|, arg G (rad)")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive correct TRACE --crystal-thickness L [flags]

The field that reached an electro-optic detector, from the trace it recorded.
A <110> ZnTe or GaP crystal does not see the THz field itself: the field
enters with t = 2/(1 + n_THz), travels at its phase velocity while the probe
travels at its group velocity, so the probe averages the field over the
crystal with a slip that grows with frequency (the response vanishes where
the crystal is two coherence lengths thick), and the crystal's TO phonon
(ZnTe 5.3 THz, GaP 11 THz) stops it altogether. The measured spectrum is
G(f)·E(f); this divides G out with a regularised (Wiener-type) inverse and
says up to which frequency the result can be trusted, where |G| is at least
a tenth of its best. A thinner crystal reaches higher.

TRACE has two columns, time in ps and the signal. In arbitrary units it is
taken as the raw signal; in kV/cm (--trace-unit kV/cm) as calibrated by
'thzdrive calibrate --eo-crystal' with a flat 2/(1 + n_THz), which is then
replaced by the full response.

Examples:
  thzdrive correct eo.txt --crystal znte --crystal-thickness 1mm
  thzdrive correct eo.txt --crystal gap --crystal-thickness 300um --csv field.csv
  thzdrive correct eo.txt --crystal znte --crystal-thickness 500um --probe-wavelength 1030nm --group-index 3.2

Flags:
`)
		fs.PrintDefaults()
	}
	pos, err := a.parseFlags(fs, args)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("correct takes one trace file, got %d arguments (see 'thzdrive help correct')", len(pos))
	}
	if !thickness.set {
		return usagef("give the detector crystal's --crystal-thickness (e.g. 1mm)")
	}
	set := setFlags(fs)
	det := &thzdrivev1.ElectroOpticDetector{ThicknessUm: thickness.value, ProbeWavelengthNm: probe.value, FaustHenryCoefficient: *faustHenry}
	switch strings.ToLower(*crystal) {
	case "znte":
		det.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE
	case "gap":
		det.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP
	case "custom":
		det.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM
	default:
		return usagef("--crystal %q: use znte, gap or custom", *crystal)
	}
	if set["group-index"] {
		det.ProbeGroupIndex = groupIndex
	}
	if *medium != "" {
		det.ThzMedium = mediumArg(*medium)
	}
	tr, err := readTraceFile(pos[0], *traceUnit)
	if err != nil {
		return err
	}
	req := &thzdrivev1.CorrectDetectorRequest{Trace: tr, Detector: det, Regularization: *reg, TrustFraction: *trust, MarginDb: *margin, PadToSamples: int32(*pad)}
	if set["calibration-n-thz"] {
		req.CalibrationNThz = calN
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.CorrectDetector(ctx, req)
	if err != nil {
		return err
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	unit := fieldUnitLabel(resp.CorrectedTrace)
	if *csvPath != "" {
		cols := [][]float64{traceTimes(resp.CorrectedTrace), nil, resp.CorrectedTrace.Field}
		if m := resp.Resolved.GetTrace().GetField(); len(m) == len(resp.CorrectedTrace.Field) {
			cols[1] = m
		}
		if err := a.writeColumns(*csvPath, []string{"time (ps)", "measured (" + unit + ")", "corrected field (" + unit + ")"}, cols); err != nil {
			return err
		}
	}
	if *responsePath != "" {
		if err := a.writeColumns(*responsePath, []string{"frequency (THz)", "|G|", "arg G (rad)"},
			[][]float64{resp.FrequencyThz, resp.ResponseAmplitude, resp.ResponsePhaseRad}); err != nil {
			return err
		}
	}
	r := &report{title: "thzdrive: field behind the electro-optic detector", cautions: resp.Cautions}
	d := resp.Resolved.GetDetector()
	s := r.section("Detector")
	s.text("crystal", strings.ToLower(strings.TrimPrefix(d.GetCrystal().String(), "ELECTRO_OPTIC_CRYSTAL_")))
	s.add("thickness", d.GetThicknessUm(), "um")
	s.add("probe wavelength", d.GetProbeWavelengthNm(), "nm")
	s.add("probe group index", d.GetProbeGroupIndex(), "")
	s.text("THz index", describeMedium(d.GetThzMedium()))
	if d.GetFaustHenryCoefficient() != 0 {
		s.add("Faust-Henry coefficient", d.GetFaustHenryCoefficient(), "")
	}
	if n := resp.Resolved.GetCalibrationNThz(); n > 0 {
		s.add("flat calibration replaced, n_THz", n, "")
	}
	s = r.section("Correction")
	s.text("trusted band", bandText(resp.TrustBand))
	s.text("band with signal", bandText(resp.SignalBand))
	s.add("regularisation λ", resp.Regularization, "|G|^2")
	s.add("measured peak |E|", resp.MeasuredPeakFieldKvPerCm, unit)
	s.add("corrected peak |E|", resp.CorrectedPeakFieldKvPerCm, unit)
	r.print(a.reportWriter(*csvPath, *responsePath))
	return nil
}
