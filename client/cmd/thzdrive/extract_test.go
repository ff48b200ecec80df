package main

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"google.golang.org/protobuf/encoding/protojson"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/tdsfit"
	"thzdrive/units"
)

// The traces of these tests are written to two-column files as a lab
// exports them and come from the project's own forward model: a 1 THz
// single cycle carried through an optical train by optics.Propagate, on a
// grid four times the window (nothing wraps round), then cut to the window,
// with seeded noise.

var cliPulse = pulse.Model{Shape: pulse.SingleCycle, PeakFrequencyHz: 1 * units.THz, PeakFieldVPerM: 1}

// siliconN is high-resistivity silicon, n = 3.4175 (Grischkowsky et al.,
// JOSA B 7, 2006 (1990), from memory; physics.md §4).
const siliconN = 3.4175

// forward returns the pulse after the train (nil: the pulse itself) on n
// samples of stepS from startS, with noise.
func forward(t *testing.T, m pulse.Model, train *optics.Train, startS, stepS float64, n int, noise float64, seed uint64) pulse.Trace {
	t.Helper()
	long := pulse.NextFastLength(4 * n)
	in := pulse.Trace{StartS: startS, StepS: stepS, Field: make([]float64, long)}
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
	rng := rand.New(rand.NewPCG(seed, 77))
	tr := pulse.Trace{StartS: startS, StepS: stepS, Field: make([]float64, n)}
	for i := range tr.Field {
		tr.Field[i] = out.Field[i] + noise*rng.NormFloat64()
	}
	return tr
}

// writeTrace writes a two-column file: time in ps, field.
func writeTrace(t *testing.T, name string, tr pulse.Trace) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("# time (ps)\tfield (arb. u.)\n")
	for i, x := range tr.Field {
		fmt.Fprintf(&b, "%.10g\t%.12g\n", tr.TimeS(i)/units.Ps, x)
	}
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(b.String()), 0o600); err != nil {
		t.Fatal(err)
	}
	return p
}

// tdsFiles writes a reference trace and the trace through 500 µm of
// silicon (first pass; the window closes before the echo at 15.4 ps).
func tdsFiles(t *testing.T) (ref, sam string) {
	t.Helper()
	slab := optics.Slab{Medium: optics.Constant{N: siliconN}, ThicknessM: 500 * units.Um, Incoherent: true}
	train := &optics.Train{Elements: []optics.Element{slab}, Target: optics.Target{Layer: optics.ExitMedium}}
	r := forward(t, cliPulse, nil, -3*units.Ps, 20*units.Fs, 800, 1e-4, 1)
	s := forward(t, cliPulse, train, -3*units.Ps, 20*units.Fs, 800, 1e-4, 2)
	return writeTrace(t, "ref.txt", r), writeTrace(t, "si.txt", s)
}

// leadingNumber parses the first field of a report value ("3.41750 ± ...").
func leadingNumber(t *testing.T, s string) float64 {
	t.Helper()
	f := strings.Fields(s)
	if len(f) == 0 {
		t.Fatalf("no value in %q", s)
	}
	x, err := strconv.ParseFloat(f[0], 64)
	if err != nil {
		t.Fatalf("%q: %v", s, err)
	}
	return x
}

// reportValue returns the whole value text of the report row with label.
func reportValue(report, label string) string {
	for _, line := range strings.Split(report, "\n") {
		if rest, ok := strings.CutPrefix(line, "  "+label+"  "); ok {
			return strings.TrimSpace(rest)
		}
	}
	return ""
}

// extract on 500 µm of silicon: the report, --json and --csv agree and give
// n = 3.4175 back within 1e-3 over the band trimmed to a noise of 2e-4; the
// CSV is what 'fit' reads, and a model of ε∞ alone fitted to it is n²
// (definition, within 2n·1e-3).
func TestExtractCommand(t *testing.T) {
	ref, sam := tdsFiles(t)
	args := []string{"extract", ref, sam, "--thickness", "0.5 mm", "--max-index-std", "2e-4"}
	var resp thzdrivev1.ExtractMediumResponse
	report := reportAndJSON(t, args, &resp)
	if !strings.Contains(report, safetyLine) {
		t.Errorf("no laser-safety line in:\n%s", report)
	}
	if n := leadingNumber(t, reportValue(report, "n, noise-weighted mean over the band")); math.Abs(n-siliconN) > 1e-3 {
		t.Errorf("report: mean n %.5f, want %.4f within 1e-3\n%s", n, siliconN, report)
	}
	oc := resp.GetOpticalConstants()
	if len(oc.GetN()) < 10 || resp.Resolved.GetSlab().GetThicknessUm() != 500 || resp.Resolved.GetSlab().GetEchoes() != thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS {
		t.Fatalf("--json: %d frequencies, resolved %v", len(oc.GetN()), resp.Resolved.GetSlab())
	}
	for i, n := range oc.N {
		if math.Abs(n-siliconN) > 1e-3 {
			t.Errorf("%.3f THz: n = %.5f, want %.4f within 1e-3", resp.FrequencyThz[i], n, siliconN)
		}
	}
	for _, want := range []string{"usable band", "reported band", "at " + fmt.Sprintf("%.3f", resp.FrequencyThz[0]) + " THz"} {
		if !strings.Contains(report, want) {
			t.Errorf("report lacks %q:\n%s", want, report)
		}
	}

	csvPath := filepath.Join(t.TempDir(), "si.csv")
	code, stdout, stderr := runCLI(t, append(args, "--csv", csvPath)...)
	if code != exitOK || !strings.Contains(stdout, safetyLine) {
		t.Fatalf("--csv: exit %d, stdout:\n%s\nstderr:\n%s", code, stdout, stderr)
	}
	rows := readCSV(t, csvPath)
	for i, h := range []string{"frequency (THz)", "n", "kappa", "n and kappa std", "Re eps", "Im eps", "eps std", "alpha (1/cm)"} {
		if rows[0][i] != h {
			t.Fatalf("header %q, want %q in column %d", rows[0], h, i)
		}
	}
	if len(rows)-1 != len(oc.N) {
		t.Errorf("%d data rows, the response has %d frequencies", len(rows)-1, len(oc.N))
	}

	var fit thzdrivev1.FitDielectricModelResponse
	report = reportAndJSON(t, []string{"fit", csvPath, "--eps-inf", "11"}, &fit)
	if e := math.Abs(fit.Model.GetEpsInf() - siliconN*siliconN); e > 2*siliconN*1e-3 {
		t.Errorf("ε∞ fitted to the extract CSV = %.5f, want n² = %.5f", fit.Model.GetEpsInf(), siliconN*siliconN)
	}
	if len(fit.DataEpsStd) != len(oc.N) || !strings.Contains(report, "the noise of each point") {
		t.Errorf("the CSV's noise column was not read: %d values for %d points", len(fit.DataEpsStd), len(oc.N))
	}
}

func TestExtractFlags(t *testing.T) {
	ref, sam := tdsFiles(t)
	for _, c := range []struct {
		echoes string
		want   thzdrivev1.EchoModel
		count  int32
	}{{"all", thzdrivev1.EchoModel_ECHO_MODEL_ALL, 0}, {"2", thzdrivev1.EchoModel_ECHO_MODEL_COUNT, 2}, {"first", thzdrivev1.EchoModel_ECHO_MODEL_FIRST_PASS, 0}} {
		code, stdout, stderr := runCLI(t, "--json", "extract", ref, sam, "--thickness", "500um", "--echoes", c.echoes)
		if code != exitOK {
			t.Fatalf("--echoes %s: exit %d: %s", c.echoes, code, stderr)
		}
		var resp thzdrivev1.ExtractMediumResponse
		if err := protojson.Unmarshal([]byte(stdout), &resp); err != nil {
			t.Fatal(err)
		}
		if s := resp.Resolved.GetSlab(); s.GetEchoes() != c.want || s.GetEchoCount() != c.count {
			t.Errorf("--echoes %s: resolved %v", c.echoes, s)
		}
	}
	usage := []struct {
		args []string
		want string
	}{
		{[]string{"extract", ref, sam}, "--thickness"},
		{[]string{"extract", ref, "--thickness", "500um"}, "two trace files"},
		{[]string{"extract", ref, sam, "--thickness", "500um", "--echoes", "two"}, "--echoes"},
		{[]string{"extract", ref, sam, "--thickness", "500 kV/cm"}, "um"},
		{[]string{"extract", ref, sam, "--film"}, "--substrate"},
		{[]string{"extract", ref, sam, "--film", "--substrate", "silicon-hr", "--thickness", "1mm"}, "describe a slab"},
		{[]string{"extract", ref, sam, "--thickness", "1mm", "--substrate", "silicon-hr"}, "need --film"},
		{[]string{"extract", ref, "no-such-file.txt", "--thickness", "1mm"}, "no-such-file.txt"},
		{[]string{"fit", ref, sam, "--thickness", "500um"}, "--eps-inf"},
		{[]string{"fit", ref, "--eps-inf", "11", "--oscillator", "5THz:1"}, "FREQUENCY:LINEWIDTH:STRENGTH"},
		{[]string{"fit", ref, sam, ref, "--eps-inf", "11"}, "two trace files"},
		{[]string{"fit", ref, "--eps-inf", "11"}, "Re eps"}, // a trace is no permittivity file
		{[]string{"correct", ref}, "--crystal-thickness"},
		{[]string{"correct", ref, "--crystal-thickness", "1mm", "--crystal", "quartz"}, "znte, gap or custom"},
	}
	for _, c := range usage {
		t.Run(strings.Join(c.args[:1], " ")+" "+c.want, func(t *testing.T) {
			code, _, stderr := runCLI(t, c.args...)
			if code != exitUsage || !strings.Contains(stderr, c.want) {
				t.Errorf("exit %d, want %d with %q in:\n%s", code, exitUsage, c.want, stderr)
			}
		})
	}
	// What only the service can judge comes back with its field path.
	refused := []struct {
		args []string
		path string
	}{
		{[]string{"extract", ref, sam, "--thickness", "0um"}, "slab.thickness_um"},
		{[]string{"extract", ref, sam, "--film", "--substrate", "unobtainium"}, "film.substrate.material"},
		{[]string{"fit", ref, sam, "--thickness", "500um", "--eps-inf", "-1"}, "initial.eps_inf"},
		{[]string{"correct", ref, "--crystal", "custom", "--crystal-thickness", "1mm", "--crystal-medium", "3.2"}, "detector.probe_group_index"},
		{[]string{"correct", ref, "--crystal-thickness", "1mm", "--probe-wavelength", "1550nm"}, "detector.probe_group_index"},
	}
	for _, c := range refused {
		t.Run(c.path, func(t *testing.T) {
			code, _, stderr := runCLI(t, c.args...)
			if code != exitRefused || !strings.Contains(stderr, c.path) {
				t.Errorf("exit %d, want %d naming %q:\n%s", code, exitRefused, c.path, stderr)
			}
		})
	}
}

// A 1 nm Drude film on 500 µm of silicon (the reference: the bare
// substrate), film and substrate carried by the transfer matrices of
// package optics: Z0·σ(0)·d = 1, Γ/2π = 1 THz (inputs), σ(ω) = ε0ωp²/(Γ − iω)
// (Drude; Ashcroft & Mermin (1976), ch. 1). The sheet conductance at each
// reported frequency must match within 1e-3 plus five times its noise (the
// Tinkham formula's own error is 1.4e-4 here, tdsfit's SheetConductance,
// derived).
func TestExtractFilmCommand(t *testing.T) {
	const filmM = 1 * units.Nm
	gamma := 2 * math.Pi * units.THz
	wp2 := gamma / (units.VacuumImpedance * filmM * units.VacuumPermittiv)
	film := optics.Dielectric{EpsInf: 1, PlasmaHz: math.Sqrt(wp2) / (2 * math.Pi), ScatteringHz: units.THz}
	si, err := optics.Lookup("silicon-hr")
	if err != nil {
		t.Fatal(err)
	}
	sub := optics.Layer{Medium: si, ThicknessM: 500 * units.Um, Incoherent: true}
	stack := func(l ...optics.Layer) *optics.Train {
		return &optics.Train{Sample: optics.Stack{Layers: l}, Target: optics.Target{Layer: optics.ExitMedium}}
	}
	bare := writeTrace(t, "bare.txt", forward(t, cliPulse, stack(sub), -3*units.Ps, 20*units.Fs, 800, 1e-5, 3))
	onFilm := writeTrace(t, "film.txt", forward(t, cliPulse, stack(optics.Layer{Medium: film, ThicknessM: filmM}, sub), -3*units.Ps, 20*units.Fs, 800, 1e-5, 4))
	args := []string{"extract", bare, onFilm, "--film", "--substrate", "silicon-hr", "--film-thickness", "1 nm"}
	var resp thzdrivev1.ExtractMediumResponse
	report := reportAndJSON(t, args, &resp)
	for _, want := range []string{"Sheet conductance σd (siemens)", "Conductivity σ = σd/d (S/cm)", "silicon-hr", safetyLine} {
		if !strings.Contains(report, want) {
			t.Errorf("report lacks %q:\n%s", want, report)
		}
	}
	sc := resp.GetSheetConductance()
	if len(sc.GetRealSiemens()) < 10 {
		t.Fatalf("%d frequencies", len(sc.GetRealSiemens()))
	}
	for i, f := range resp.FrequencyThz {
		want := complex(units.VacuumPermittiv*wp2*filmM, 0) / complex(gamma, -2*math.Pi*f*units.THz)
		if e := cmplx.Abs(complex(sc.RealSiemens[i], sc.ImagSiemens[i]) - want); e > 1e-3*cmplx.Abs(want)+5*sc.StdSiemens[i] {
			t.Errorf("%.3f THz: σd = %g + %gi S, Drude %.6g", f, sc.RealSiemens[i], sc.ImagSiemens[i], want)
		}
	}
	csvPath := filepath.Join(t.TempDir(), "film.csv")
	if code, _, stderr := runCLI(t, append(args, "--csv", csvPath)...); code != exitOK {
		t.Fatalf("--csv: exit %d: %s", code, stderr)
	}
	rows := readCSV(t, csvPath)
	if strings.Join(rows[0], ",") != "frequency (THz),|T|,arg T (rad),Re sigma*d (S),Im sigma*d (S),sigma*d std (S),Re sigma (S/cm),Im sigma (S/cm),sigma std (S/cm)" || len(rows)-1 != len(sc.RealSiemens) {
		t.Errorf("CSV header %q with %d rows for %d frequencies", rows[0], len(rows)-1, len(sc.RealSiemens))
	}
}

// gaAs: ε∞ = 10.89, TO 273.3 cm⁻¹, Δε = 2.00 (Hass & Henvis, J. Phys. Chem.
// Solids 23, 1099 (1962), as in physics.md §4), linewidth 0.07 THz (an
// input).
var gaAs = optics.Dielectric{EpsInf: 10.89, Oscillators: []optics.Oscillator{{FreqHz: 273.3 * units.InvCm, WidthHz: 0.07 * units.THz, DeltaEps: 2.00}}}

// fit on a permittivity file: ε of the crystal with seeded noise σ = 0.02,
// written without a header (frequency in THz, Re ε, Im ε, σ). Every
// parameter must come back within 3σ of its reported uncertainty; the
// report shows them, the quality and the model as a medium (which parses).
// The same data with a header in cm⁻¹ give the same fit (1 THz = 33.35641
// cm⁻¹, physics.md §0).
func TestFitCommand(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	var plain, header strings.Builder
	header.WriteString("frequency (cm-1),Re eps,Im eps,eps std\n")
	for i := range 300 {
		f := (0.5 + 11.5*float64(i)/299) * units.THz
		e := gaAs.Epsilon(f)
		re, im := real(e)+0.02*rng.NormFloat64(), imag(e)+0.02*rng.NormFloat64()
		fmt.Fprintf(&plain, "%.12g %.12g %.12g 0.02\n", f/units.THz, re, im)
		fmt.Fprintf(&header, "%.12g,%.12g,%.12g,0.02\n", f/units.InvCm, re, im)
	}
	dir := t.TempDir()
	plainPath, headerPath := filepath.Join(dir, "eps.txt"), filepath.Join(dir, "eps.csv")
	if err := os.WriteFile(plainPath, []byte(plain.String()), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(headerPath, []byte(header.String()), 0o600); err != nil {
		t.Fatal(err)
	}
	args := []string{"fit", plainPath, "--eps-inf", "10", "--oscillator", "260cm-1:3cm-1:1.8"}
	var resp thzdrivev1.FitDielectricModelResponse
	report := reportAndJSON(t, args, &resp)
	truth := map[string]float64{"eps_inf": gaAs.EpsInf, "oscillators[0].frequency_thz": gaAs.Oscillators[0].FreqHz / units.THz,
		"oscillators[0].linewidth_thz": 0.07, "oscillators[0].delta_eps": 2.00}
	for _, p := range resp.Parameters {
		if w := truth[p.Name]; math.Abs(p.Value-w) > 3*p.Std {
			t.Errorf("%s = %.6g ± %.2g, true %.6g", p.Name, p.Value, p.Std, w)
		}
	}
	for _, want := range []string{"oscillator 1: TO frequency", "oscillator 1: strength Δε", "ε∞", "reduced chi-square", "As a medium", safetyLine} {
		if !strings.Contains(report, want) {
			t.Errorf("report lacks %q:\n%s", want, report)
		}
	}
	var m thzdrivev1.Medium
	if err := protojson.Unmarshal([]byte(reportValue(report, "medium")), &m); err != nil || m.GetDielectric().GetEpsInf() != resp.Model.EpsInf {
		t.Errorf("the medium row is not the fitted model as a Medium: %v\n%s", err, report)
	}
	if got := leadingNumber(t, reportValue(report, "oscillator 1: TO frequency")); math.Abs(got-resp.Model.Oscillators[0].FrequencyThz) > 1e-5 {
		t.Errorf("report TO frequency %g, JSON %g", got, resp.Model.Oscillators[0].FrequencyThz)
	}

	var again thzdrivev1.FitDielectricModelResponse
	reportAndJSON(t, []string{"fit", headerPath, "--eps-inf", "10", "--oscillator", "7.8THz:90GHz:1.8"}, &again)
	if f0, f1 := resp.Resolved.GetPermittivity().FrequencyThz[10], again.Resolved.GetPermittivity().FrequencyThz[10]; math.Abs(f1-f0) > 1e-9*f0 {
		t.Errorf("cm-1 column read as %.10g THz, the THz file has %.10g", f1, f0)
	}
	if math.Abs(again.Model.Oscillators[0].FrequencyThz-resp.Model.Oscillators[0].FrequencyThz) > 1e-6 {
		t.Errorf("same data, other start: TO %.7g vs %.7g THz", again.Model.Oscillators[0].FrequencyThz, resp.Model.Oscillators[0].FrequencyThz)
	}

	csvPath := filepath.Join(dir, "fit.csv")
	if code, _, stderr := runCLI(t, append(args, "--csv", csvPath)...); code != exitOK {
		t.Fatalf("--csv: exit %d: %s", code, stderr)
	}
	rows := readCSV(t, csvPath)
	if strings.Join(rows[0], ",") != "frequency (THz),Re eps,Im eps,eps std,model Re eps,model Im eps" || len(rows) != 301 {
		t.Errorf("CSV header %q, %d rows", rows[0], len(rows))
	}
}

// correct on a 1 THz single cycle seen through 500 µm of ZnTe at 800 nm
// (the trace is the field convolved with tdsfit's response G, written to a
// file): within the trusted band the corrected spectrum is the original's to
// 1e-6 of its peak (no noise; only the regularisation floor of 1e-30
// max|G|² biases it). Given in kV/cm, the trace counts as calibrated with
// ZnTe's flat 2/(1 + 3.17) (n_THz from memory, physics.md §3), which the
// report names.
func TestCorrectCommand(t *testing.T) {
	det, err := tdsfit.NewDetector(pulse.EOSetup{Crystal: pulse.ZnTe, ThicknessM: 500 * units.Um, ProbeWavelengthM: 800 * units.Nm}, 0)
	if err != nil {
		t.Fatal(err)
	}
	const n, dt = 2048, 20 * units.Fs
	long := forward(t, cliPulse, nil, -10*units.Ps, dt, pulse.NextFastLength(4*n), 0, 0)
	tf := pulse.NewTransform(long.Len())
	spec := tf.Forward(nil, long.Field, dt)
	for k := range spec {
		spec[k] *= det.Response(tf.FrequencyHz(k, dt))
	}
	meas := pulse.Trace{StartS: long.StartS, StepS: dt, Field: tf.Inverse(nil, spec, dt)[:n]}
	path := writeTrace(t, "eo.txt", meas)

	args := []string{"correct", path, "--crystal", "znte", "--crystal-thickness", "500um"}
	var resp thzdrivev1.CorrectDetectorResponse
	report := reportAndJSON(t, args, &resp)
	for _, want := range []string{"trusted band", "probe group index", "znte", safetyLine} {
		if !strings.Contains(report, want) {
			t.Errorf("report lacks %q:\n%s", want, report)
		}
	}
	m := 2 * n
	tm := pulse.NewTransform(m)
	padded := func(x []float64) []float64 { return append(append([]float64(nil), x...), make([]float64, m-len(x))...) }
	E := tm.Forward(nil, padded(long.Field[:n]), dt)
	X := tm.Forward(nil, padded(resp.CorrectedTrace.Field), resp.CorrectedTrace.StepFs*units.Fs)
	peak := 0.0
	for _, e := range E {
		peak = math.Max(peak, cmplx.Abs(e))
	}
	if len(resp.CorrectedTrace.Field) != n || resp.TrustBand.Bins < 50 {
		t.Fatalf("%d samples, trusted band %v", len(resp.CorrectedTrace.Field), resp.TrustBand)
	}
	for k := 1; k < len(E) && resp.FrequencyThz[k] <= resp.TrustBand.HighThz; k++ {
		if cmplx.Abs(X[k]-E[k]) > 1e-6*peak {
			t.Fatalf("%.3f THz: corrected %.6g, original %.6g", resp.FrequencyThz[k], X[k], E[k])
		}
	}

	dir := t.TempDir()
	csvPath, gPath := filepath.Join(dir, "field.csv"), filepath.Join(dir, "g.csv")
	if code, _, stderr := runCLI(t, append(args, "--csv", csvPath, "--response-csv", gPath)...); code != exitOK {
		t.Fatalf("--csv: exit %d: %s", code, stderr)
	}
	rows := readCSV(t, csvPath)
	if strings.Join(rows[0], ",") != "time (ps),measured (arb. u.),corrected field (arb. u.)" || len(rows)-1 != n {
		t.Errorf("CSV header %q, %d rows for %d samples", rows[0], len(rows)-1, n)
	}
	rows = readCSV(t, gPath)
	if strings.Join(rows[0], ",") != "frequency (THz),|G|,arg G (rad)" || len(rows)-1 != len(resp.FrequencyThz) {
		t.Errorf("response CSV header %q, %d rows for %d frequencies", rows[0], len(rows)-1, len(resp.FrequencyThz))
	}

	var cal thzdrivev1.CorrectDetectorResponse
	report = reportAndJSON(t, append(args, "--trace-unit", "kV/cm"), &cal)
	if cal.Resolved.GetCalibrationNThz() != 3.17 || !strings.Contains(report, "flat calibration replaced") || !strings.Contains(report, "kV/cm") {
		t.Errorf("a kV/cm trace: calibration index %g, report:\n%s", cal.Resolved.GetCalibrationNThz(), report)
	}
}
