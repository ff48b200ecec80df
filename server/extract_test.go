package server

import (
	"context"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"google.golang.org/protobuf/proto"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/tdsfit"
	"thzdrive/units"
)

// The traces of these tests come from the project's own forward model: a
// model pulse carried through an optical train by optics.Propagate. Each is
// computed on a grid four times longer than the window, so that the periodic
// transform wraps nothing (delays, echoes, the ring of a phonon) back into
// it, and then cut to the window, as a measurement is.

// tdsPulse is the pulse of the extraction tests: a 1 THz single cycle of
// unit peak (arbitrary units; only ratios of spectra matter).
var tdsPulse = pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1}

// tdsGrid is a time window: n samples of stepS from startS.
type tdsGrid struct {
	startS, stepS float64
	n             int
}

// through returns the model pulse m on the grid after the train (nil: the
// pulse itself), with seeded Gaussian noise of standard deviation noise.
func through(t *testing.T, m pulse.Model, g tdsGrid, train *optics.Train, noise float64, seed uint64) pulse.Trace {
	t.Helper()
	long := pulse.NextFastLength(4 * g.n)
	in := pulse.Trace{StartS: g.startS, StepS: g.stepS, Field: make([]float64, long)}
	for i := range in.Field {
		in.Field[i] = m.At(in.TimeS(i))
	}
	out := in
	if train != nil {
		ev, err := optics.NewEvaluator(*train)
		if err != nil {
			t.Fatal(err)
		}
		p, err := optics.Propagate(ev, in, 0)
		if err != nil {
			t.Fatal(err)
		}
		out = p.Target
	}
	rng := rand.New(rand.NewPCG(seed, seed^0x5bd1e995))
	tr := pulse.Trace{StartS: g.startS, StepS: g.stepS, Field: make([]float64, g.n)}
	for i := range tr.Field {
		tr.Field[i] = out.Field[i] + noise*rng.NormFloat64()
	}
	return tr
}

// slabTrain holds one slab in air; the field is taken behind it.
func slabTrain(s optics.Slab) *optics.Train {
	return &optics.Train{Elements: []optics.Element{s}, Target: optics.Target{Layer: optics.ExitMedium}}
}

// toWire is a trace as a lab sends it: arbitrary units on a uniform grid.
func toWire(tr pulse.Trace) *thzdrivev1.SampledTrace {
	return &thzdrivev1.SampledTrace{StartPs: tr.StartS / units.Ps, StepFs: tr.StepS / units.Fs, Field: append([]float64(nil), tr.Field...)}
}

func slabRequest(ref, sam pulse.Trace, thicknessUm float64, echoes thzdrivev1.EchoModel, maxStd float64) *thzdrivev1.ExtractMediumRequest {
	return &thzdrivev1.ExtractMediumRequest{
		Reference: toWire(ref), Sample: toWire(sam),
		Specimen: &thzdrivev1.ExtractMediumRequest_Slab{Slab: &thzdrivev1.SlabSpecimen{ThicknessUm: thicknessUm, Echoes: echoes, MaxIndexStd: maxStd}},
	}
}

func hasCaution(cs []*thzdrivev1.Caution, code thzdrivev1.CautionCode) bool {
	for _, c := range cs {
		if c.Code == code {
			return true
		}
	}
	return false
}

// siliconN is high-resistivity silicon, n = 3.4175 (Grischkowsky et al.,
// JOSA B 7, 2006 (1990), from memory; physics.md §4).
const siliconN = 3.4175

// 500 µm of silicon, lossless and non-dispersive, first pass only: the
// window (−3 to 13 ps) closes before the first echo, which follows the main
// pulse by 2nd/c = 11.40 ps (physics.md §4: 22.80 ps for 1 mm; derived).
// ExtractMedium must give n back within 1e-3 over the band trimmed to a noise
// of 2e-4, κ ≈ 0, ε = n² and α = 2ωκ/c. The same slab in a window that does
// hold the echo must be cautioned ECHO_IN_WINDOW.
func TestExtractMediumSiliconSlab(t *testing.T) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{}))
	ctx := ctxTimeout(t)
	const d = 500 * units.Um
	slab := optics.Slab{Medium: optics.Constant{N: siliconN}, ThicknessM: d, Incoherent: true}
	g := tdsGrid{startS: -3 * units.Ps, stepS: 20 * units.Fs, n: 800}
	ref := through(t, tdsPulse, g, nil, 1e-4, 1)
	sam := through(t, tdsPulse, g, slabTrain(slab), 1e-4, 2)

	resp, err := c.ExtractMedium(ctx, slabRequest(ref, sam, 500, thzdrivev1.EchoModel_ECHO_MODEL_UNSPECIFIED, 2e-4))
	if err != nil {
		t.Fatal(err)
	}
	oc := resp.OpticalConstants
	if oc == nil || len(oc.N) != len(resp.FrequencyThz) || len(oc.Kappa) != len(oc.N) || len(oc.AbsorptionPerCm) != len(oc.N) {
		t.Fatalf("arrays missing or of unequal length: %d frequencies, constants %v", len(resp.FrequencyThz), oc)
	}
	b := resp.ReportedBand
	if b.LowThz > 0.3 || b.HighThz < 1.5 || int(b.Bins) != len(oc.N) {
		t.Errorf("reported band %.3f–%.3f THz (%d bins), want it to cover 0.3–1.5 THz, where a 1 THz pulse is strong", b.LowThz, b.HighThz, b.Bins)
	}
	for i, f := range resp.FrequencyThz {
		if dn := math.Abs(oc.N[i] - siliconN); dn > 1e-3 {
			t.Errorf("%.3f THz: n = %.5f ± %.1g, want %.4f within 1e-3", f, oc.N[i], oc.IndexStd[i], siliconN)
		}
		if math.Abs(oc.Kappa[i]) > 1e-3 {
			t.Errorf("%.3f THz: κ = %.2g, want 0 within 1e-3 (lossless slab)", f, oc.Kappa[i])
		}
		// ε = ñ² (definition).
		if e := math.Abs(oc.EpsReal[i] - (oc.N[i]*oc.N[i] - oc.Kappa[i]*oc.Kappa[i])); e > 1e-12 {
			t.Errorf("%.3f THz: Re ε = %.6f is not n² − κ²", f, oc.EpsReal[i])
		}
		// α = 2ωκ/c in 1/cm (definition, physics.md §4).
		if want := 2 * 2 * math.Pi * f * units.THz * oc.Kappa[i] / units.SpeedOfLight * units.Cm; math.Abs(oc.AbsorptionPerCm[i]-want) > 1e-9*math.Abs(want)+1e-15 {
			t.Errorf("%.3f THz: α = %g /cm, 2ωκ/c = %g /cm", f, oc.AbsorptionPerCm[i], want)
		}
	}
	if hasCaution(resp.Cautions, thzdrivev1.CautionCode_CAUTION_CODE_ECHO_IN_WINDOW) {
		t.Errorf("the window ends before the echo, yet: %v", resp.Cautions)
	}
	r := resp.Resolved
	if r.GetSlab().GetEchoes() != thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS || r.MarginDb != 20 ||
		r.GetProcessing().GetBaseline() != thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_PRE_PULSE {
		t.Errorf("resolved request lacks its defaults: %v", r)
	}

	// A window to 20 ps holds the echo at 4.03 + 11.40 ps.
	long := tdsGrid{startS: -3 * units.Ps, stepS: 20 * units.Fs, n: 1150}
	resp, err = c.ExtractMedium(ctx, slabRequest(through(t, tdsPulse, long, nil, 1e-4, 3),
		through(t, tdsPulse, long, slabTrain(optics.Slab{Medium: slab.Medium, ThicknessM: d}), 1e-4, 4), 500, thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS, 0))
	if err != nil {
		t.Fatal(err)
	}
	if !hasCaution(resp.Cautions, thzdrivev1.CautionCode_CAUTION_CODE_ECHO_IN_WINDOW) {
		t.Errorf("no ECHO_IN_WINDOW caution for a window that holds the echo: %v", resp.Cautions)
	}
	t.Logf("band %.3f–%.3f THz, %d bins", b.LowThz, b.HighThz, b.Bins)
}

// The same silicon slab with every echo in a 120 ps window (the tenth echo,
// r^20 = 0.2995^10 ≈ 6e-6 of the pulse, arrives at 118 ps; R from
// physics.md §4): the Fabry–Pérot model must recover n within 1e-3.
func TestExtractMediumAllEchoes(t *testing.T) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{}))
	slab := optics.Slab{Medium: optics.Constant{N: siliconN}, ThicknessM: 500 * units.Um}
	g := tdsGrid{startS: -3 * units.Ps, stepS: 20 * units.Fs, n: 6150}
	ref := through(t, tdsPulse, g, nil, 1e-4, 5)
	sam := through(t, tdsPulse, g, slabTrain(slab), 1e-4, 6)
	resp, err := c.ExtractMedium(ctxTimeout(t), slabRequest(ref, sam, 500, thzdrivev1.EchoModel_ECHO_MODEL_ALL, 2e-4))
	if err != nil {
		t.Fatal(err)
	}
	// The echoes amplify the noise of n near the fringes' minima, by up to
	// (1 − r²)/(1 + r²) = 1.9 for r² = 0.2995 (derived from dlnT/dñ, see
	// tdsfit.ExtractSlab), most at low frequency: the band trimmed to 2e-4
	// starts higher than with the first pass alone.
	if resp.ReportedBand.LowThz > 0.8 || resp.ReportedBand.HighThz < 1.5 {
		t.Errorf("reported band %.3f–%.3f THz, want 0.8–1.5 THz covered", resp.ReportedBand.LowThz, resp.ReportedBand.HighThz)
	}
	for i, f := range resp.FrequencyThz {
		if dn := math.Abs(resp.OpticalConstants.N[i] - siliconN); dn > 1e-3 {
			t.Fatalf("%.3f THz: n = %.5f, want %.4f within 1e-3", f, resp.OpticalConstants.N[i], siliconN)
		}
	}
}

// A thin Drude film on 500 µm of silicon, film and substrate carried by the
// transfer matrices of package optics (the reference is the bare substrate).
// The film: 1 nm with ε = 1 − ωp²/(ω² + iΓω), i.e. σ(ω) = ε0ωp²/(Γ − iω)
// (Drude; Ashcroft & Mermin, Solid State Physics (1976), ch. 1), with
// Z0·σ(0)·d = 1 and Γ/2π = 1 THz (inputs). The Tinkham inversion must return
// σd within 1e-3 of the Drude value plus five times its stated noise: the
// formula's own error is 1.4e-4 at 1 THz for such a film (tdsfit's
// SheetConductance, derived). With the film's thickness the conductivity
// σ = σd/d comes back in S/cm.
func TestExtractMediumFilm(t *testing.T) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{}))
	const filmM = 1 * units.Nm
	gamma := 2 * math.Pi * units.THz
	wp2 := gamma / (units.VacuumImpedance * filmM * units.VacuumPermittiv) // ε0ωp²/Γ·d = 1/Z0
	film := optics.Dielectric{EpsInf: 1, PlasmaHz: math.Sqrt(wp2) / (2 * math.Pi), ScatteringHz: units.THz}
	si, err := optics.Lookup("silicon-hr")
	if err != nil {
		t.Fatal(err)
	}
	substrate := optics.Layer{Medium: si, ThicknessM: 500 * units.Um, Incoherent: true}
	stack := func(layers ...optics.Layer) *optics.Train {
		return &optics.Train{Sample: optics.Stack{Layers: layers}, Target: optics.Target{Layer: optics.ExitMedium}}
	}
	g := tdsGrid{startS: -3 * units.Ps, stepS: 20 * units.Fs, n: 800}
	ref := through(t, tdsPulse, g, stack(substrate), 1e-5, 7)
	sam := through(t, tdsPulse, g, stack(optics.Layer{Medium: film, ThicknessM: filmM}, substrate), 1e-5, 8)
	resp, err := c.ExtractMedium(ctxTimeout(t), &thzdrivev1.ExtractMediumRequest{
		Reference: toWire(ref), Sample: toWire(sam),
		Specimen: &thzdrivev1.ExtractMediumRequest_Film{Film: &thzdrivev1.FilmSpecimen{
			Substrate: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "silicon-hr"}}, FilmThicknessUm: filmM / units.Um}},
	})
	if err != nil {
		t.Fatal(err)
	}
	sc := resp.SheetConductance
	if sc == nil || resp.OpticalConstants != nil || len(sc.RealSiemens) != len(resp.FrequencyThz) || len(sc.ConductivityRealSiemensPerCm) != len(sc.RealSiemens) {
		t.Fatalf("want the sheet conductance (and the conductivity) only: %v", resp)
	}
	if resp.ReportedBand.LowThz > 0.3 || resp.ReportedBand.HighThz < 1.5 {
		t.Errorf("band %.3f–%.3f THz, want 0.3–1.5 THz covered", resp.ReportedBand.LowThz, resp.ReportedBand.HighThz)
	}
	for i, f := range resp.FrequencyThz {
		w := 2 * math.Pi * f * units.THz
		want := complex(units.VacuumPermittiv*wp2*filmM, 0) / complex(gamma, -w)
		got := complex(sc.RealSiemens[i], sc.ImagSiemens[i])
		if e := cmplx.Abs(got - want); e > 1e-3*cmplx.Abs(want)+5*sc.StdSiemens[i] {
			t.Errorf("%.3f THz: σd = %.6g S, Drude %.6g S (noise %.2g S)", f, got, want, sc.StdSiemens[i])
		}
		// σ = σd/d; 1 S/m = 0.01 S/cm (definition).
		if e := math.Abs(sc.ConductivityRealSiemensPerCm[i] - sc.RealSiemens[i]/filmM*0.01); e > 1e-9*math.Abs(sc.ConductivityRealSiemensPerCm[i]) {
			t.Errorf("%.3f THz: σ = %g S/cm is not σd/d", f, sc.ConductivityRealSiemensPerCm[i])
		}
	}
}

// gaAs is the test's Lorentz crystal: ε∞ = 10.89 and one TO phonon at
// 273.3 cm⁻¹ with Δε = 2.00 (Hass & Henvis, J. Phys. Chem. Solids 23, 1099
// (1962), low temperature, as in physics.md §4) and a linewidth of 0.07 THz
// (an input).
var gaAs = optics.Dielectric{EpsInf: 10.89, Oscillators: []optics.Oscillator{{FreqHz: 273.3 * units.InvCm, WidthHz: 0.07 * units.THz, DeltaEps: 2.00}}}

// FitDielectricModel on ε(f) of the crystal with seeded Gaussian noise σ =
// 0.02 on Re ε and Im ε, from a start 5–15 % off: every parameter must come
// back within 3σ of its reported uncertainty (a fit with correct noise has
// 99.7 % of its parameters there), the reduced χ² near 1 (for 596 degrees of
// freedom its spread is sqrt(2/596) = 0.058, derived: 0.75–1.3 is more than
// four of them), and the model must be usable at once as a sample medium.
func TestFitDielectricModelLorentz(t *testing.T) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{}))
	ctx := ctxTimeout(t)
	rng := rand.New(rand.NewPCG(11, 12))
	const sigma = 0.02
	data := &thzdrivev1.PermittivitySpectrum{}
	for i := range 300 {
		f := (0.5 + 11.5*float64(i)/299) * units.THz
		e := gaAs.Epsilon(f)
		data.FrequencyThz = append(data.FrequencyThz, f/units.THz)
		data.EpsReal = append(data.EpsReal, real(e)+sigma*rng.NormFloat64())
		data.EpsImag = append(data.EpsImag, imag(e)+sigma*rng.NormFloat64())
		data.EpsStd = append(data.EpsStd, sigma)
	}
	truth := gaAs.Oscillators[0]
	resp, err := c.FitDielectricModel(ctx, &thzdrivev1.FitDielectricModelRequest{
		Data: &thzdrivev1.FitDielectricModelRequest_Permittivity{Permittivity: data},
		Initial: &thzdrivev1.DielectricModel{EpsInf: 10, Oscillators: []*thzdrivev1.LorentzOscillator{{
			FrequencyThz: 0.95 * truth.FreqHz / units.THz, LinewidthThz: 0.08, DeltaEps: 1.8}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]float64{
		"eps_inf":                      gaAs.EpsInf,
		"oscillators[0].frequency_thz": truth.FreqHz / units.THz,
		"oscillators[0].linewidth_thz": truth.WidthHz / units.THz,
		"oscillators[0].delta_eps":     truth.DeltaEps,
	}
	if len(resp.Parameters) != len(want) {
		t.Fatalf("%d parameters, want %d: %v", len(resp.Parameters), len(want), resp.Parameters)
	}
	for _, p := range resp.Parameters {
		w, ok := want[p.Name]
		if !ok {
			t.Errorf("unexpected parameter %q", p.Name)
			continue
		}
		if !(p.Std > 0) || math.Abs(p.Value-w) > 3*p.Std {
			t.Errorf("%s = %.6g ± %.2g, true %.6g: not within 3σ", p.Name, p.Value, p.Std, w)
		}
		t.Logf("%s = %.6g ± %.2g (true %.6g, %+.2f σ)", p.Name, p.Value, p.Std, w, (p.Value-w)/p.Std)
	}
	if m := resp.Model.Oscillators[0]; m.FrequencyThz != resp.Parameters[1].Value || resp.ModelStd.Oscillators[0].FrequencyThz != resp.Parameters[1].Std {
		t.Errorf("model and parameter list disagree: %v vs %v", m, resp.Parameters[1])
	}
	if resp.DegreesOfFreedom != 596 || resp.ReducedChiSquare < 0.75 || resp.ReducedChiSquare > 1.3 {
		t.Errorf("reduced χ² %.3f with %d DOF, want ≈ 1 with 596", resp.ReducedChiSquare, resp.DegreesOfFreedom)
	}
	np := len(resp.Parameters)
	for i := range np {
		for j := range np {
			if c := resp.Correlation[i*np+j]; (i == j && c != 1) || math.Abs(c) > 1+1e-12 || c != resp.Correlation[j*np+i] {
				t.Errorf("correlation[%d,%d] = %g: not a correlation matrix", i, j, c)
			}
		}
	}
	for _, cc := range resp.Cautions {
		t.Errorf("unexpected caution %v", cc)
	}
	// The fitted model drops into a sample as it is.
	if _, err := c.Propagate(ctx, &thzdrivev1.PropagateRequest{Waveform: singleCycle(1, 100),
		Sample: &thzdrivev1.SampleStack{ExitMedium: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Dielectric{Dielectric: resp.Model}}}}); err != nil {
		t.Errorf("the fitted model is not accepted as a medium: %v", err)
	}
}

// From the two traces straight to the mode: 20 µm of ZnTe (the catalogue's
// model: ε∞ = 7.44, Δε = 2.58, TO 5.32 THz, width 25 GHz; Gallot et al., APL
// 74, 3450 (1999), from memory), all echoes, a 2 THz pulse in a 150 ps window
// and noise at 1e-5 of the peak. The fitted phonon must lie within 3σ of its
// reported uncertainty of the catalogue's, and the extraction must come back
// beside it.
func TestFitDielectricModelFromTraces(t *testing.T) {
	if testing.Short() {
		t.Skip("a 15000-sample round trip")
	}
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{}))
	znte, err := optics.Lookup("znte")
	if err != nil {
		t.Fatal(err)
	}
	truth, _ := optics.DielectricOf(znte)
	m := pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 2 * units.THz, PeakFieldVPerM: 1}
	g := tdsGrid{startS: -10 * units.Ps, stepS: 10 * units.Fs, n: 15000}
	ref := through(t, m, g, nil, 1e-5, 21)
	sam := through(t, m, g, slabTrain(optics.Slab{Medium: znte, ThicknessM: 20 * units.Um}), 1e-5, 22)
	resp, err := c.FitDielectricModel(ctxTimeout(t), &thzdrivev1.FitDielectricModelRequest{
		Data: &thzdrivev1.FitDielectricModelRequest_Extraction{Extraction: slabRequest(ref, sam, 20, thzdrivev1.EchoModel_ECHO_MODEL_ALL, 0)},
		Initial: &thzdrivev1.DielectricModel{EpsInf: 7, Oscillators: []*thzdrivev1.LorentzOscillator{{
			FrequencyThz: 5.1, LinewidthThz: 0.05, DeltaEps: 2}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	if resp.Extraction == nil || len(resp.Extraction.FrequencyThz) != len(resp.FrequencyThz) || resp.Extraction.ReportedBand.HighThz < 5 {
		t.Fatalf("the extraction behind the fit is missing or short: %v", resp.Extraction.GetReportedBand())
	}
	got, sd := resp.Model.Oscillators[0], resp.ModelStd.Oscillators[0]
	want := truth.Oscillators[0]
	for _, x := range []struct {
		name          string
		got, sd, want float64
	}{
		{"eps_inf", resp.Model.EpsInf, resp.ModelStd.EpsInf, truth.EpsInf},
		{"frequency_thz", got.FrequencyThz, sd.FrequencyThz, want.FreqHz / units.THz},
		{"linewidth_thz", got.LinewidthThz, sd.LinewidthThz, want.WidthHz / units.THz},
		{"delta_eps", got.DeltaEps, sd.DeltaEps, want.DeltaEps},
	} {
		if !(x.sd > 0) || math.Abs(x.got-x.want) > 3*x.sd {
			t.Errorf("%s = %.6g ± %.2g, catalogue %.6g: not within 3σ", x.name, x.got, x.sd, x.want)
		}
	}
	if resp.ReducedChiSquare < 0.8 || resp.ReducedChiSquare > 1.25 {
		t.Errorf("reduced χ² %.3f, want ≈ 1: the extraction's noise weights the fit", resp.ReducedChiSquare)
	}
	t.Logf("TO %.5f ± %.1g THz, reduced χ² %.3f over %.2f–%.2f THz", got.FrequencyThz, sd.FrequencyThz, resp.ReducedChiSquare,
		resp.FrequencyThz[0], resp.FrequencyThz[len(resp.FrequencyThz)-1])
}

// convolveDetector is what an electro-optic detector records of the field
// tr: its spectrum multiplied by the response G(f) (tdsfit.Detector), on
// a grid four times longer than the window, then cut to the window.
func convolveDetector(t *testing.T, d tdsfit.Detector, m pulse.Model, g tdsGrid) (truth, measured pulse.Trace) {
	t.Helper()
	n := pulse.NextFastLength(4 * g.n)
	in := through(t, m, tdsGrid{startS: g.startS, stepS: g.stepS, n: n}, nil, 0, 0)
	tf := pulse.NewTransform(n)
	spec := tf.Forward(nil, in.Field, g.stepS)
	for k := range spec {
		spec[k] *= d.Response(tf.FrequencyHz(k, g.stepS))
	}
	field := tf.Inverse(nil, spec, g.stepS)
	truth = pulse.Trace{StartS: g.startS, StepS: g.stepS, Field: in.Field[:g.n]}
	measured = pulse.Trace{StartS: g.startS, StepS: g.stepS, Field: field[:g.n]}
	return truth, measured
}

// CorrectDetector of a 1 THz single cycle seen through 500 µm of ZnTe at
// 800 nm: within the trusted band the corrected spectrum must be the
// original's, to 1e-6 of its peak (no noise: only the regularisation's
// floor, 1e-30 of max|G|², biases it); the response divided out must be
// tdsfit's G, which at the lowest frequency is the entrance transmission
// 2/(1 + sqrt(ε(0))) = 0.48014 of the catalogue's ZnTe (Planken et al., JOSA
// B 18, 313 (2001): t_THz = 2/(1 + n); ε(0) = 7.44 + 2.58, from memory;
// derived). A trace given in kV/cm was calibrated with the flat 2/(1 + n_THz)
// of CalibrateField, n_THz = 3.17 for ZnTe: its correction is the
// arbitrary-unit one times 2/(1 + 3.17) (the definition of the calibration).
func TestCorrectDetectorRoundTrip(t *testing.T) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{}))
	ctx := ctxTimeout(t)
	det, err := tdsfit.NewDetector(pulse.EOSetup{Crystal: pulse.ZnTe, ThicknessM: 500 * units.Um, ProbeWavelengthM: 800 * units.Nm}, 0)
	if err != nil {
		t.Fatal(err)
	}
	g := tdsGrid{startS: -10 * units.Ps, stepS: 20 * units.Fs, n: 2048}
	truth, meas := convolveDetector(t, det, tdsPulse, g)
	req := &thzdrivev1.CorrectDetectorRequest{Trace: toWire(meas), Detector: &thzdrivev1.ElectroOpticDetector{ThicknessUm: 500}}
	resp, err := c.CorrectDetector(ctx, req)
	if err != nil {
		t.Fatal(err)
	}
	if resp.TrustBand.Bins < 50 {
		t.Fatalf("trust band %v too narrow", resp.TrustBand)
	}
	// Compare spectra on the grid the server used (its default padding:
	// twice the trace).
	n := 2 * g.n
	tf := pulse.NewTransform(n)
	pad := func(x []float64) []float64 { return append(append([]float64(nil), x...), make([]float64, n-len(x))...) }
	E := tf.Forward(nil, pad(truth.Field), g.stepS)
	X := tf.Forward(nil, pad(resp.CorrectedTrace.Field), g.stepS)
	peak := 0.0
	for _, e := range E {
		peak = math.Max(peak, cmplx.Abs(e))
	}
	if len(resp.FrequencyThz) != len(E) {
		t.Fatalf("%d response bins, want %d", len(resp.FrequencyThz), len(E))
	}
	for k := 1; k < len(E); k++ {
		f := resp.FrequencyThz[k]
		if f <= resp.TrustBand.HighThz && cmplx.Abs(X[k]-E[k]) > 1e-6*peak {
			t.Fatalf("%.3f THz: corrected %.6g, original %.6g", f, X[k], E[k])
		}
		gk := det.Response(f * units.THz)
		if math.Abs(resp.ResponseAmplitude[k]-cmplx.Abs(gk)) > 1e-12 || math.Abs(resp.ResponsePhaseRad[k]-cmplx.Phase(gk)) > 1e-9 {
			t.Fatalf("%.3f THz: response %g ∠%g, tdsfit's G %v", f, resp.ResponseAmplitude[k], resp.ResponsePhaseRad[k], gk)
		}
	}
	if a := resp.ResponseAmplitude[1]; math.Abs(a-0.48014) > 1e-3 {
		t.Errorf("|G| at %.3f THz = %.5f, want the entrance transmission 0.48014", resp.FrequencyThz[1], a)
	}
	r := resp.Resolved
	if r.Detector.GetCrystal() != thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_ZNTE || r.Detector.GetProbeGroupIndex() != tdsfit.ZnTeGroupIndex800nm ||
		r.Detector.GetThzMedium().GetMaterial() != "znte" || r.CalibrationNThz == nil || *r.CalibrationNThz != 0 || r.PadToSamples != int32(n) {
		t.Errorf("resolved request lacks its defaults: %v", r)
	}
	// 1 mm of ZnTe: |G| vanishes at 2.3167 THz, where the crystal is two
	// coherence lengths thick (L = 2·l_c; tdsfit's example, derived), so the
	// trusted band ends below it, and a 3 THz pulse, which carries signal
	// beyond, is cautioned DETECTOR_BAND_LIMIT.
	_, meas3 := convolveDetector(t, det, pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 3 * units.THz, PeakFieldVPerM: 1}, g)
	thick, err := c.CorrectDetector(ctx, &thzdrivev1.CorrectDetectorRequest{Trace: toWire(meas3), Detector: &thzdrivev1.ElectroOpticDetector{ThicknessUm: 1000}})
	if err != nil {
		t.Fatal(err)
	}
	if thick.TrustBand.HighThz >= 2.3167 || !hasCaution(thick.Cautions, thzdrivev1.CautionCode_CAUTION_CODE_DETECTOR_BAND_LIMIT) {
		t.Errorf("1 mm: trusted band to %.3f THz, cautions %v; want it below 2.3167 THz and DETECTOR_BAND_LIMIT", thick.TrustBand.HighThz, thick.Cautions)
	}

	cal := proto.Clone(req).(*thzdrivev1.CorrectDetectorRequest)
	cal.Trace.FieldUnit = thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM
	calResp, err := c.CorrectDetector(ctx, cal)
	if err != nil {
		t.Fatal(err)
	}
	if got := calResp.Resolved.GetCalibrationNThz(); got != 3.17 {
		t.Errorf("calibration index %g, want ZnTe's n_THz 3.17", got)
	}
	tcal := 2 / (1 + 3.17)
	for i, x := range calResp.CorrectedTrace.Field {
		if y := resp.CorrectedTrace.Field[i] * tcal; math.Abs(x-y) > 1e-9*resp.CorrectedPeakFieldKvPerCm {
			t.Fatalf("sample %d: calibrated correction %g, want %g", i, x, y)
		}
	}
	if calResp.CorrectedTrace.FieldUnit != thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM {
		t.Errorf("corrected trace in %v, want the input's kV/cm", calResp.CorrectedTrace.FieldUnit)
	}
}

// Bad requests name the offending field, for each new method.
func TestExtractBadRequests(t *testing.T) {
	c := thzdrivev1.NewPumpPlannerClient(startServer(t, Config{Limits: Limits{MaxSamples: 1 << 14, MaxLayers: 64, MaxSweepPoints: 10, MaxMessageBytes: 4 << 20, MaxConcurrentStreams: 16}}))
	ctx := ctxTimeout(t)
	g := tdsGrid{startS: -3 * units.Ps, stepS: 20 * units.Fs, n: 800}
	ref := through(t, tdsPulse, g, nil, 1e-4, 31)
	sam := through(t, tdsPulse, g, slabTrain(optics.Slab{Medium: optics.Constant{N: siliconN}, ThicknessM: 500 * units.Um, Incoherent: true}), 1e-4, 32)
	good := func() *thzdrivev1.ExtractMediumRequest {
		return slabRequest(ref, sam, 500, thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS, 0)
	}
	with := func(f func(r *thzdrivev1.ExtractMediumRequest)) *thzdrivev1.ExtractMediumRequest {
		r := good()
		f(r)
		return r
	}
	film := func(r *thzdrivev1.ExtractMediumRequest, f *thzdrivev1.FilmSpecimen) {
		r.Specimen = &thzdrivev1.ExtractMediumRequest_Film{Film: f}
	}
	extract := []struct {
		name  string
		req   *thzdrivev1.ExtractMediumRequest
		field string
	}{
		{"no reference", with(func(r *thzdrivev1.ExtractMediumRequest) { r.Reference = nil }), "reference"},
		{"NaN sample", with(func(r *thzdrivev1.ExtractMediumRequest) { r.Sample.Field[5] = math.NaN() }), "sample.field[5]"},
		{"mismatched steps", with(func(r *thzdrivev1.ExtractMediumRequest) { r.Sample.StepFs = 25 }), "sample.step_fs"},
		{"mismatched lengths", with(func(r *thzdrivev1.ExtractMediumRequest) { r.Sample.Field = r.Sample.Field[:700] }), "sample.field"},
		{"too short", with(func(r *thzdrivev1.ExtractMediumRequest) { r.Reference.Field = r.Reference.Field[:4] }), "reference.field"},
		{"constant sample", with(func(r *thzdrivev1.ExtractMediumRequest) {
			for i := range r.Sample.Field {
				r.Sample.Field[i] = 1
			}
		}), "sample.field"},
		{"zero thickness", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().ThicknessUm = 0 }), "slab.thickness_um"},
		{"negative thickness", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().ThicknessUm = -500 }), "slab.thickness_um"},
		{"thicker than a metre", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().ThicknessUm = 2e6 }), "slab.thickness_um"},
		{"echo count without COUNT", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().EchoCount = 2 }), "slab.echo_count"},
		{"COUNT without a count", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().Echoes = thzdrivev1.EchoModel_ECHO_MODEL_COUNT }), "slab.echo_count"},
		{"unknown echo model", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().Echoes = 9 }), "slab.echoes"},
		{"accuracy no frequency meets", with(func(r *thzdrivev1.ExtractMediumRequest) { r.GetSlab().MaxIndexStd = 1e-12 }), "slab.max_index_std"},
		{"negative margin", with(func(r *thzdrivev1.ExtractMediumRequest) { r.MarginDb = -3 }), "margin_db"},
		{"no specimen", with(func(r *thzdrivev1.ExtractMediumRequest) { r.Specimen = nil }), "specimen"},
		{"film without substrate", with(func(r *thzdrivev1.ExtractMediumRequest) { film(r, &thzdrivev1.FilmSpecimen{}) }), "film.substrate"},
		{"unknown substrate", with(func(r *thzdrivev1.ExtractMediumRequest) {
			film(r, &thzdrivev1.FilmSpecimen{Substrate: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "unobtainium"}}})
		}), "film.substrate.material"},
		{"NaN mismatch", with(func(r *thzdrivev1.ExtractMediumRequest) {
			film(r, &thzdrivev1.FilmSpecimen{Substrate: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "silicon-hr"}}, SubstrateMismatchUm: math.NaN()})
		}), "film.substrate_mismatch_um"},
	}
	for _, tc := range extract {
		t.Run("ExtractMedium/"+tc.name, func(t *testing.T) {
			_, err := c.ExtractMedium(ctx, tc.req)
			if fields := badRequestFields(t, err); !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}

	spectrum := func() *thzdrivev1.PermittivitySpectrum {
		p := &thzdrivev1.PermittivitySpectrum{}
		for i := range 40 {
			f := 0.5 + 0.25*float64(i)
			e := gaAs.Epsilon(f * units.THz)
			p.FrequencyThz, p.EpsReal, p.EpsImag, p.EpsStd = append(p.FrequencyThz, f), append(p.EpsReal, real(e)), append(p.EpsImag, imag(e)), append(p.EpsStd, 0.01)
		}
		return p
	}
	initial := func() *thzdrivev1.DielectricModel {
		return &thzdrivev1.DielectricModel{EpsInf: 10, Oscillators: []*thzdrivev1.LorentzOscillator{{FrequencyThz: 8, LinewidthThz: 0.1, DeltaEps: 2}}}
	}
	fitWith := func(f func(r *thzdrivev1.FitDielectricModelRequest)) *thzdrivev1.FitDielectricModelRequest {
		r := &thzdrivev1.FitDielectricModelRequest{Data: &thzdrivev1.FitDielectricModelRequest_Permittivity{Permittivity: spectrum()}, Initial: initial()}
		f(r)
		return r
	}
	fits := []struct {
		name  string
		req   *thzdrivev1.FitDielectricModelRequest
		field string
	}{
		{"no data", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.Data = nil }), "data"},
		{"no initial model", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.Initial = nil }), "initial"},
		{"negative eps_inf", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.Initial.EpsInf = -1 }), "initial.eps_inf"},
		{"oscillator at 0 THz", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.Initial.Oscillators[0].FrequencyThz = 0 }), "initial.oscillators[0].frequency_thz"},
		{"twin oscillators", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) {
			r.Initial.Oscillators = append(r.Initial.Oscillators, proto.Clone(r.Initial.Oscillators[0]).(*thzdrivev1.LorentzOscillator))
		}), "initial"},
		{"unequal arrays", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { p := r.GetPermittivity(); p.EpsImag = p.EpsImag[:10] }), "permittivity.eps_imag"},
		{"NaN eps", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.GetPermittivity().EpsReal[3] = math.NaN() }), "permittivity.eps_real[3]"},
		{"zero noise", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.GetPermittivity().EpsStd[2] = 0 }), "permittivity.eps_std[2]"},
		{"negative frequency", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.GetPermittivity().FrequencyThz[7] = -1 }), "permittivity.frequency_thz[7]"},
		{"range upside down", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.MinFrequencyThz, r.MaxFrequencyThz = 5, 2 }), "max_frequency_thz"},
		{"range without data", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.MinFrequencyThz = 50 }), "min_frequency_thz"},
		{"negative iterations", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) { r.MaxIterations = -1 }), "max_iterations"},
		{"film extraction", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) {
			x := good()
			film(x, &thzdrivev1.FilmSpecimen{Substrate: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "silicon-hr"}}})
			r.Data = &thzdrivev1.FitDielectricModelRequest_Extraction{Extraction: x}
		}), "extraction.film"},
		{"extraction without thickness", fitWith(func(r *thzdrivev1.FitDielectricModelRequest) {
			x := good()
			x.GetSlab().ThicknessUm = 0
			r.Data = &thzdrivev1.FitDielectricModelRequest_Extraction{Extraction: x}
		}), "extraction.slab.thickness_um"},
	}
	for _, tc := range fits {
		t.Run("FitDielectricModel/"+tc.name, func(t *testing.T) {
			_, err := c.FitDielectricModel(ctx, tc.req)
			if fields := badRequestFields(t, err); !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}

	corrWith := func(f func(r *thzdrivev1.CorrectDetectorRequest)) *thzdrivev1.CorrectDetectorRequest {
		r := &thzdrivev1.CorrectDetectorRequest{Trace: toWire(ref), Detector: &thzdrivev1.ElectroOpticDetector{ThicknessUm: 1000}}
		f(r)
		return r
	}
	g1 := 3.2
	corrections := []struct {
		name  string
		req   *thzdrivev1.CorrectDetectorRequest
		field string
	}{
		{"no detector", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.Detector = nil }), "detector"},
		{"no trace", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.Trace = nil }), "trace"},
		{"NaN sample", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.Trace.Field[3] = math.NaN() }), "trace.field[3]"},
		{"zero thickness", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.Detector.ThicknessUm = 0 }), "detector.thickness_um"},
		{"1550 nm without group index", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.Detector.ProbeWavelengthNm = 1550 }), "detector.probe_group_index"},
		{"custom without THz index", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) {
			r.Detector.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM
			r.Detector.ProbeGroupIndex = &g1
		}), "detector.thz_medium"},
		{"custom without group index", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) {
			r.Detector.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM
			r.Detector.ThzMedium = &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Constant{Constant: &thzdrivev1.ConstantIndex{N: 3.2}}}
		}), "detector.probe_group_index"},
		{"Faust–Henry without a phonon", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) {
			r.Detector.ThzMedium = &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Constant{Constant: &thzdrivev1.ConstantIndex{N: 3.2}}}
			r.Detector.FaustHenryCoefficient = -0.07
		}), "detector.faust_henry_coefficient"},
		{"kV/cm from a custom crystal", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) {
			r.Trace.FieldUnit = thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM
			r.Detector.Crystal = thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_CUSTOM
			r.Detector.ProbeGroupIndex = &g1
			r.Detector.ThzMedium = &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Constant{Constant: &thzdrivev1.ConstantIndex{N: 3.2}}}
		}), "calibration_n_thz"},
		{"trust fraction 1", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.TrustFraction = 1 }), "trust_fraction"},
		{"negative regularisation", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.Regularization = -1 }), "regularization"},
		{"padding over the limit", corrWith(func(r *thzdrivev1.CorrectDetectorRequest) { r.PadToSamples = 1 << 20 }), "pad_to_samples"},
	}
	for _, tc := range corrections {
		t.Run("CorrectDetector/"+tc.name, func(t *testing.T) {
			_, err := c.CorrectDetector(ctx, tc.req)
			if fields := badRequestFields(t, err); !contains(fields, tc.field) {
				t.Errorf("violations %v do not name %q", fields, tc.field)
			}
		})
	}
}

// The three routes of http.yaml answer over HTTP/JSON with the message gRPC
// gives.
func TestExtractOverHTTP(t *testing.T) {
	s := startHTTP(t, Config{})
	g := tdsGrid{startS: -3 * units.Ps, stepS: 20 * units.Fs, n: 800}
	ref := through(t, tdsPulse, g, nil, 1e-4, 41)
	sam := through(t, tdsPulse, g, slabTrain(optics.Slab{Medium: optics.Constant{N: siliconN}, ThicknessM: 500 * units.Um, Incoherent: true}), 1e-4, 42)
	ex := slabRequest(ref, sam, 500, 0, 2e-4)
	var got thzdrivev1.ExtractMediumResponse
	s.postOK(t, "/v1/medium:extract", ex, &got)
	want, err := s.grpc.ExtractMedium(ctxTimeout(t), ex)
	if err != nil {
		t.Fatal(err)
	}
	if !proto.Equal(&got, want) {
		t.Error("ExtractMedium over HTTP differs from gRPC")
	}
	var fit thzdrivev1.FitDielectricModelResponse
	s.postOK(t, "/v1/dielectric:fit", &thzdrivev1.FitDielectricModelRequest{
		Data:    &thzdrivev1.FitDielectricModelRequest_Extraction{Extraction: ex},
		Initial: &thzdrivev1.DielectricModel{EpsInf: 11},
	}, &fit)
	// A constant index is ε∞ alone: the fit gives back n² (definition).
	if e := math.Abs(fit.Model.EpsInf - siliconN*siliconN); e > 2*siliconN*1e-3 {
		t.Errorf("ε∞ = %.5f, want n² = %.5f", fit.Model.EpsInf, siliconN*siliconN)
	}
	var corr thzdrivev1.CorrectDetectorResponse
	s.postOK(t, "/v1/detector:correct", &thzdrivev1.CorrectDetectorRequest{Trace: toWire(ref),
		Detector: &thzdrivev1.ElectroOpticDetector{Crystal: thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP, ThicknessUm: 300}}, &corr)
	if len(corr.CorrectedTrace.GetField()) != len(ref.Field) {
		t.Errorf("corrected trace of %d samples for %d", len(corr.CorrectedTrace.GetField()), len(ref.Field))
	}
}

// extractSeeds are real requests, the seed corpus of the wire fuzzers:
// short traces, so that each input is cheap.
func extractSeeds() (ex []*thzdrivev1.ExtractMediumRequest, fit []*thzdrivev1.FitDielectricModelRequest, corr []*thzdrivev1.CorrectDetectorRequest) {
	ref := &thzdrivev1.SampledTrace{StartPs: -3, StepFs: 40, Field: make([]float64, 256)}
	sam := &thzdrivev1.SampledTrace{StartPs: -3, StepFs: 40, Field: make([]float64, 256)}
	for i := range ref.Field {
		t := -3 + 0.04*float64(i)
		ref.Field[i] = tdsPulse.At(t * units.Ps)
		sam.Field[i] = 0.7 * tdsPulse.At((t-2)*units.Ps)
	}
	slab := func(e thzdrivev1.EchoModel, n int32) *thzdrivev1.ExtractMediumRequest {
		return &thzdrivev1.ExtractMediumRequest{Reference: ref, Sample: sam,
			Specimen: &thzdrivev1.ExtractMediumRequest_Slab{Slab: &thzdrivev1.SlabSpecimen{ThicknessUm: 250, Echoes: e, EchoCount: n}}}
	}
	ex = []*thzdrivev1.ExtractMediumRequest{
		slab(thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS, 0),
		slab(thzdrivev1.EchoModel_ECHO_MODEL_ALL, 0),
		slab(thzdrivev1.EchoModel_ECHO_MODEL_COUNT, 2),
		{Reference: ref, Sample: sam, Processing: &thzdrivev1.Processing{Window: thzdrivev1.TimeWindow_TIME_WINDOW_TUKEY},
			Specimen: &thzdrivev1.ExtractMediumRequest_Film{Film: &thzdrivev1.FilmSpecimen{
				Substrate: &thzdrivev1.Medium{Kind: &thzdrivev1.Medium_Material{Material: "silicon-hr"}}, FilmThicknessUm: 0.01}}},
	}
	fit = []*thzdrivev1.FitDielectricModelRequest{
		{Data: &thzdrivev1.FitDielectricModelRequest_Extraction{Extraction: ex[0]}, Initial: &thzdrivev1.DielectricModel{EpsInf: 4}},
		{Data: &thzdrivev1.FitDielectricModelRequest_Permittivity{Permittivity: &thzdrivev1.PermittivitySpectrum{
			FrequencyThz: []float64{1, 2, 3, 4, 5, 6}, EpsReal: []float64{12, 12.5, 13.6, 20, 2, 8}, EpsImag: []float64{0.01, 0.05, 0.2, 9, 3, 0.5}}},
			Initial:         &thzdrivev1.DielectricModel{EpsInf: 10, Oscillators: []*thzdrivev1.LorentzOscillator{{FrequencyThz: 4.2, LinewidthThz: 0.3, DeltaEps: 2}}},
			MinFrequencyThz: 1.5},
	}
	corr = []*thzdrivev1.CorrectDetectorRequest{
		{Trace: ref, Detector: &thzdrivev1.ElectroOpticDetector{ThicknessUm: 500}},
		{Trace: ref, Detector: &thzdrivev1.ElectroOpticDetector{Crystal: thzdrivev1.ElectroOpticCrystal_ELECTRO_OPTIC_CRYSTAL_GAP, ThicknessUm: 200, FaustHenryCoefficient: -0.5}, Regularization: 1e-3},
	}
	return ex, fit, corr
}

// FuzzExtractMediumWire feeds arbitrary wire bytes to ExtractMedium.
func FuzzExtractMediumWire(f *testing.F) {
	seeds, _, _ := extractSeeds()
	for _, m := range seeds {
		b, _ := proto.Marshal(m)
		f.Add(b)
	}
	svc := fuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.ExtractMediumRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.ExtractMedium(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}

// FuzzFitDielectricModelWire feeds arbitrary wire bytes to FitDielectricModel.
func FuzzFitDielectricModelWire(f *testing.F) {
	_, seeds, _ := extractSeeds()
	for _, m := range seeds {
		b, _ := proto.Marshal(m)
		f.Add(b)
	}
	svc := fuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.FitDielectricModelRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.FitDielectricModel(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}

// FuzzCorrectDetectorWire feeds arbitrary wire bytes to CorrectDetector.
func FuzzCorrectDetectorWire(f *testing.F) {
	_, _, seeds := extractSeeds()
	for _, m := range seeds {
		b, _ := proto.Marshal(m)
		f.Add(b)
	}
	svc := fuzzService()
	f.Fuzz(func(t *testing.T, data []byte) {
		req := &thzdrivev1.CorrectDetectorRequest{}
		if proto.Unmarshal(data, req) != nil {
			return
		}
		resp, err := svc.CorrectDetector(context.Background(), req)
		checkOutcome(t, resp, err)
	})
}
